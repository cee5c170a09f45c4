// Package materialscmd implements "heatgraph materials".
package materialscmd

import (
	"fmt"
	"sort"
	"text/tabwriter"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/heatgraph/heatgraph/network"
	"github.com/spf13/cobra"
)

// NewCmd returns the materials command.
func NewCmd(ios *iostreams.IOStreams) *cobra.Command {
	return &cobra.Command{
		Use:   "materials",
		Short: "List the built-in materials and where their values come from",
		Long: `List the built-in materials table: conductivity, density and specific heat
near room temperature, with the source of each value. A model's own
materials: entries override these by name.`,
		Args: cobra.NoArgs,
		RunE: func(*cobra.Command, []string) error { return Run(ios) },
	}
}

// Run prints the table.
func Run(ios *iostreams.IOStreams) error {
	mats := network.BuiltinMaterials()
	names := make([]string, 0, len(mats))
	for n := range mats {
		names = append(names, n)
	}
	sort.Strings(names)
	tw := tabwriter.NewWriter(ios.Out, 0, 4, 2, ' ', 0)
	fmt.Fprintln(tw, "name\tk [W/m/K]\tdensity [kg/m3]\tcp [J/kg/K]\tsource")
	for _, n := range names {
		m := mats[n]
		fmt.Fprintf(tw, "%s\t%g\t%s\t%s\t%s\n", n, m.Conductivity, orDash(m.Density), orDash(m.SpecificHeat), m.Source)
	}
	return tw.Flush()
}

func orDash(x float64) string {
	if x == 0 {
		return "-"
	}
	return fmt.Sprintf("%g", x)
}
