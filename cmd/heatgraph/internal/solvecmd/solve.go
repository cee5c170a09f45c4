// Package solvecmd implements "heatgraph solve".
package solvecmd

import (
	"bytes"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
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
	// Cells writes the temperature of every cell of the model's plates to
	// this file, as CSV or JSON by its extension (CellsFormat).
	Cells string
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

--cells FILE writes the temperature of every cell of every plate as well,
as CSV (one row a cell: plate, i, j, k, the cell's centre in mm, °C) or as
JSON (one object a plate with its grid and its temperatures in °C, cell
(i, j, k) at index i + nx·(j + ny·k)), chosen by the file's extension.

Exit status: 0 when every limit holds, 1 when a node is over its limit,
2 for an invalid model or command line (also -o or --cells naming the
model file, and --cells for a model without plates), 3 when the solver
found no solution, 4 when the report or the cells could not be written
or on an internal error.`,
		Example: "  heatgraph solve examples/outdoor-controller.yaml\n  heatgraph solve model.yaml --format json -o result.json\n" +
			"  heatgraph solve examples/camera-board.yaml --cells cells.csv",
		Args: cobra.ExactArgs(1),
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
	cmd.Flags().StringVar(&o.Cells, "cells", "", "also write every plate cell's temperature to this file (.csv or .json)")
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
	net, err := pipeline.Load(o.Model, o.Set...)
	if err != nil {
		return err
	}
	if o.Cells != "" && len(net.Model.Plates) == 0 {
		return exit.With(exit.BadInput, "--cells %s: %s has no plates, so it has no cells to write (--cells is for models with a plates: list)",
			o.Cells, o.Model)
	}
	out := pipeline.SolveNetwork(net, settings)
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
	if o.Cells != "" {
		if err := o.writeCells(out); err != nil {
			return err
		}
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
	if o.Cells != "" {
		if sameFile(o.Cells, o.Model) {
			return exit.With(exit.BadInput, "refusing to write over the input file %s: --cells %s names the same file; choose another file for the cells", o.Model, o.Cells)
		}
		if o.Output != "" && sameFile(o.Cells, o.Output) {
			return exit.With(exit.BadInput, "--cells %s and -o %s name the same file; give the cells a file of their own", o.Cells, o.Output)
		}
		if _, err := CellsFormat(o.Cells); err != nil {
			return &exit.Error{Code: exit.BadInput, Err: err}
		}
	}
	return nil
}

// CellsFormat returns the format of the cells file path from its
// extension: viz.CellsCSV for .csv, viz.CellsJSON for .json.
func CellsFormat(path string) (string, error) {
	switch strings.ToLower(filepath.Ext(path)) {
	case ".csv":
		return viz.CellsCSV, nil
	case ".json":
		return viz.CellsJSON, nil
	}
	return "", fmt.Errorf("--cells %s: cannot tell the format from the name (use a name ending in .csv or .json)", path)
}

// sameFile reports whether a and b name one file: the same path once
// cleaned, or the same existing file by another spelling or link.
func sameFile(a, b string) bool {
	if aa, err := filepath.Abs(a); err == nil {
		if bb, err := filepath.Abs(b); err == nil && aa == bb {
			return true
		}
	}
	fa, erra := os.Stat(a)
	fb, errb := os.Stat(b)
	return erra == nil && errb == nil && os.SameFile(fa, fb)
}

// writeCells streams every plate cell's temperature to the cells file and
// says on standard error what it wrote. Cells without a finite
// temperature are written empty (CSV) or null (JSON) with a warning; the
// CSV report has given the same warning already.
func (o *Options) writeCells(out *pipeline.Outcome) error {
	format, err := CellsFormat(o.Cells)
	if err != nil {
		return &exit.Error{Code: exit.BadInput, Err: err}
	}
	sol := out.Solution
	if err := pipeline.WriteStream(o.Cells, func(w io.Writer) error {
		return viz.WritePlateCells(w, sol, format)
	}, o.Model); err != nil {
		return err
	}
	cells, bad := 0, 0
	for i := range sol.Plates {
		cells += len(sol.Plates[i].T)
		for _, t := range sol.Plates[i].T {
			if math.IsNaN(t) || math.IsInf(t, 0) {
				bad++
			}
		}
	}
	if bad > 0 && o.Format != "csv" {
		fmt.Fprintf(o.IO.ErrOut, "heatgraph: warning: %s: %s without a finite temperature, left %s\n",
			o.Cells, count(bad, "cell"), map[string]string{viz.CellsCSV: "empty", viz.CellsJSON: "null"}[format])
	}
	fmt.Fprintf(o.IO.ErrOut, "wrote %s; %s of %s\n", o.Cells, count(cells, "cell"), count(len(sol.Plates), "plate"))
	return nil
}

// count returns "1 cell", "2 cells".
func count(n int, what string) string {
	if n == 1 {
		return "1 " + what
	}
	return fmt.Sprintf("%d %ss", n, what)
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
