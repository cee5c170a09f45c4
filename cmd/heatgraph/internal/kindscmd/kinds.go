// Package kindscmd implements "heatgraph kinds".
package kindscmd

import (
	"fmt"
	"text/tabwriter"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/heatgraph/heatgraph/network"
	"github.com/spf13/cobra"
)

// NewCmd returns the kinds command.
func NewCmd(ios *iostreams.IOStreams) *cobra.Command {
	return &cobra.Command{
		Use:   "kinds",
		Short: "List the link kinds a model may use",
		Args:  cobra.NoArgs,
		RunE:  func(*cobra.Command, []string) error { return Run(ios) },
	}
}

// Run prints the link kinds with their keys.
func Run(ios *iostreams.IOStreams) error {
	tw := tabwriter.NewWriter(ios.Out, 0, 4, 2, ' ', 0)
	fmt.Fprintln(tw, "kind\tkeys\twhat it models")
	for _, k := range network.LinkKindInfo() {
		fmt.Fprintf(tw, "%s\t%s\t%s\n", k.Name, k.Keys, k.Summary)
	}
	return tw.Flush()
}
