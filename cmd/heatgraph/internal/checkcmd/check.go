// Package checkcmd implements "heatgraph check".
package checkcmd

import (
	"fmt"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/pipeline"
	"github.com/heatgraph/heatgraph/network"
	"github.com/spf13/cobra"
)

// Options are the inputs of the check command.
type Options struct {
	IO    *iostreams.IOStreams
	Model string
}

// NewCmd returns the check command.
func NewCmd(ios *iostreams.IOStreams, runF func(*Options) error) *cobra.Command {
	o := &Options{IO: ios}
	return &cobra.Command{
		Use:   "check MODEL",
		Short: "Check a model file without solving it",
		Long: `Check a model file: syntax, keys, units, names, geometry, and that every
node has a path to a fixed temperature. Every problem is listed as
file:line: field: message. Exit status 0 when the model is valid, 2 when not.`,
		Args: cobra.ExactArgs(1),
		RunE: func(_ *cobra.Command, args []string) error {
			o.Model = args[0]
			if runF != nil {
				return runF(o)
			}
			return Run(o)
		},
	}
}

// Run checks the model and prints a one-line summary when it is valid.
func Run(o *Options) error {
	net, err := pipeline.Load(o.Model)
	if err != nil {
		return err
	}
	fixed := 0
	for _, n := range net.Nodes {
		if n.Kind == network.Fixed {
			fixed++
		}
	}
	_, err = fmt.Fprintf(o.IO.Out, "%s: valid: %d nodes (%d fixed, %d free), %d components, %d links\n",
		o.Model, len(net.Nodes), fixed, net.Unknowns(), len(net.Model.Components), len(net.Links))
	return err
}
