// Package mergecmd implements "heatgraph merge".
package mergecmd

import (
	"os"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/sweepcmd"
	"github.com/heatgraph/heatgraph/study"
	"github.com/spf13/cobra"
)

// Options are the inputs of the merge command.
type Options struct {
	IO     *iostreams.IOStreams
	Inputs []string
	Output string
	Points int // the number of points of the whole study; 0: not checked
}

// NewCmd returns the merge command.
func NewCmd(ios *iostreams.IOStreams, runF func(*Options) error) *cobra.Command {
	o := &Options{IO: ios}
	cmd := &cobra.Command{
		Use:   "merge TABLE.csv...",
		Short: "Join the tables of the shards of a sweep or Monte Carlo study",
		Long: `Join the CSV tables that 'heatgraph sweep --shard' or 'heatgraph montecarlo
--shard' wrote for the shards of one study into the table of the whole
study: the same bytes as the study run at once. The tables must have the
same columns; their rows are put in point order. With --points N, every
point from 0 to N−1 must be present.

Exit status: 0, 2 when the tables do not fit together or a point is
missing, 4 when the table could not be written.`,
		Example: "  heatgraph merge shard-*.csv --points 2000 -o samples.csv",
		Args:    cobra.MinimumNArgs(1),
		RunE: func(_ *cobra.Command, args []string) error {
			o.Inputs = args
			if runF != nil {
				return runF(o)
			}
			return Run(o)
		},
	}
	cmd.Flags().StringVarP(&o.Output, "output", "o", "", "write the merged table to this file instead of standard output")
	cmd.Flags().IntVar(&o.Points, "points", 0, "the number of points of the whole study: check that none is missing")
	return cmd
}

// Run merges the tables.
func Run(o *Options) error {
	var tables [][]byte
	for _, in := range o.Inputs {
		data, err := os.ReadFile(in)
		if err != nil {
			return exit.With(exit.BadInput, "%v", err)
		}
		tables = append(tables, data)
	}
	out, err := study.MergeCSV(o.Inputs, tables, o.Points)
	if err != nil {
		return exit.With(exit.BadInput, "%v", err)
	}
	return sweepcmd.Emit(o.IO, o.Output, out, o.Inputs...)
}
