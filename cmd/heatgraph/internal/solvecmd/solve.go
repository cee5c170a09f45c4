// Package solvecmd implements "heatgraph solve".
package solvecmd

import (
	"bytes"
	"fmt"
	"io"
	"strings"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/pipeline"
	"github.com/heatgraph/heatgraph/solve"
	"github.com/heatgraph/heatgraph/viz"
	"github.com/spf13/cobra"
)

// Options are the inputs of the solve command.
type Options struct {
	IO      *iostreams.IOStreams
	Model   string   // model file
	Set     []string // overrides, PATH=VALUE
	Format  string   // text, json or csv
	Order   string   // node order of the text report
	Output  string   // write the report here instead of standard output
	Monitor bool     // print each Newton iteration on standard error
	// Breakdown adds the heat-path breakdown to the text report (JSON
	// always has it).
	Breakdown bool
}

// Formats lists the report formats.
var Formats = []string{"text", "json", "csv"}

// NewCmd returns the solve command. runF, when not nil, replaces Run (for
// tests of flag handling).
func NewCmd(ios *iostreams.IOStreams, runF func(*Options) error) *cobra.Command {
	o := &Options{IO: ios}
	cmd := &cobra.Command{
		Use:   "solve MODEL",
		Short: "Solve a model for its steady state and check every limit",
		Long: `Solve a model for its steady state and report every node's temperature
against its limit, the heat carried by every link, and the energy balance.

Numbers that are not finite are never printed as numbers: they are left
out (JSON: null, or the detail dropped; CSV: an empty cell) with a warning.

Exit status: 0 when every limit holds, 1 when a node is over its limit,
2 for an invalid model or command line (also -o naming the model file),
3 when the solver found no solution, 4 when the report could not be
written or on an internal error.`,
		Example: "  heatgraph solve examples/outdoor-controller.yaml\n  heatgraph solve model.yaml --format json -o result.json",
		Args:    cobra.ExactArgs(1),
		RunE: func(_ *cobra.Command, args []string) error {
			o.Model = args[0]
			if runF != nil {
				return runF(o)
			}
			return Run(o)
		},
	}
	cmd.Flags().StringVarP(&o.Format, "format", "f", "text", "report format: "+strings.Join(Formats, ", "))
	cmd.Flags().StringVar(&o.Order, "sort", string(viz.ByFile), "node order in the text report: file, margin, temperature")
	cmd.Flags().StringVarP(&o.Output, "output", "o", "", "write the report to this file instead of standard output")
	cmd.Flags().BoolVar(&o.Monitor, "monitor", false, "print each Newton iteration on standard error")
	cmd.Flags().BoolVar(&o.Breakdown, "breakdown", false, "add where each source's heat goes, its main paths and the links to improve first (text report)")
	cmd.Flags().StringArrayVar(&o.Set, "set", nil, pipeline.SetHelp)
	return cmd
}

// Run solves the model and writes the report.
func Run(o *Options) error {
	if err := o.check(); err != nil {
		return err
	}
	settings := solve.Settings{}
	if o.Monitor {
		settings.Monitor = func(it solve.Iterate) {
			fmt.Fprintf(o.IO.ErrOut, "newton %3d: step %.3e K (λ = %.3g), largest residual %.3e W (%.2e of the heat flow)\n",
				it.Iteration, it.Step, it.Lambda, it.Residual, it.Scaled)
		}
	}
	out, err := pipeline.Solve(o.Model, settings, o.Set...)
	if err != nil {
		return err
	}
	var buf bytes.Buffer
	switch {
	case out.Solution == nil && o.Format == "json":
		// Scripts get a document that says there is no solution.
		if err := viz.WriteJSON(&buf, viz.NewReport(out.Net.Model, nil, out.Run)); err != nil {
			return err
		}
		if err := o.emit(buf.Bytes()); err != nil {
			return err
		}
		return out.NotConverged()
	case out.Solution == nil:
		return out.NotConverged()
	case o.Format == "json":
		err = viz.WriteJSON(&buf, viz.NewReport(out.Net.Model, out.Solution, out.Run))
	case o.Format == "csv":
		err = viz.WriteCSV(&buf, out.Solution)
		for _, w := range viz.NonFinite(out.Solution) {
			fmt.Fprintf(o.IO.ErrOut, "heatgraph: warning: %s\n", w)
		}
	default:
		err = viz.WriteText(&buf, out.Solution, out.Run, viz.Order(o.Order))
		if err == nil && o.Breakdown {
			err = viz.WriteBreakdownText(&buf, viz.NewBreakdown(out.Solution))
		}
	}
	if err != nil {
		return err
	}
	if err := o.emit(buf.Bytes()); err != nil {
		return err
	}
	if code := out.Code(); code != exit.OK {
		return exit.Silent(code)
	}
	return nil
}

func (o *Options) check() error {
	if !contains(Formats, o.Format) {
		return exit.With(exit.BadInput, "--format %q is not a report format (use %s)", o.Format, strings.Join(Formats, ", "))
	}
	orders := make([]string, len(viz.Orders))
	for i, v := range viz.Orders {
		orders[i] = string(v)
	}
	if !contains(orders, o.Order) {
		return exit.With(exit.BadInput, "--sort %q is not a node order (use %s)", o.Order, strings.Join(orders, ", "))
	}
	return nil
}

// emit writes the finished report to the output file or standard output.
func (o *Options) emit(data []byte) error {
	if o.Output != "" {
		return pipeline.WriteFile(o.Output, data, o.Model)
	}
	return write(o.IO.Out, data)
}

func write(w io.Writer, data []byte) error {
	if _, err := w.Write(data); err != nil {
		return &exit.Error{Code: exit.OutputFailed, Err: fmt.Errorf("writing the report: %w", err)}
	}
	return nil
}

func contains(list []string, s string) bool {
	for _, v := range list {
		if v == s {
			return true
		}
	}
	return false
}
