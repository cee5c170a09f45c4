// Package comparecmd implements "heatgraph compare".
package comparecmd

import (
	"bytes"
	"context"
	"encoding/csv"
	"fmt"
	"strconv"
	"strings"
	"text/tabwriter"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/graphcmd"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/pipeline"
	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/solve"
	"github.com/heatgraph/heatgraph/viz"
	"github.com/spf13/cobra"
)

// Options are the inputs of the compare command.
type Options struct {
	IO     *iostreams.IOStreams
	Models []string
	Set    []string // overrides applied to every model
	Format string   // text or csv
	Output string
	// Graph, when set, also draws one diagram: the first model's heat
	// paths with every model's temperature on each node.
	Graph string
}

// NewCmd returns the compare command.
func NewCmd(ios *iostreams.IOStreams, runF func(*Options) error) *cobra.Command {
	o := &Options{IO: ios}
	cmd := &cobra.Command{
		Use:   "compare MODEL MODEL...",
		Short: "Solve two or more models (variants of a design) and show one table",
		Long: `Solve two or more models — typically variants that start from one base
(base: in the model file) — and show one table: every node's temperature
and margin in each, and the change of its temperature against the first.
--set applies to every model.

Exit status: 0 when every limit holds in every model, 1 when a node is
over its limit in any, 2 for an invalid model or command line, 3 when a
model has no solution, 4 when the table could not be written.`,
		Example: "  heatgraph compare examples/outdoor-controller.yaml examples/variants/*.yaml",
		Args:    cobra.MinimumNArgs(2),
		RunE: func(_ *cobra.Command, args []string) error {
			o.Models = args
			if runF != nil {
				return runF(o)
			}
			return Run(o)
		},
	}
	cmd.Flags().StringArrayVar(&o.Set, "set", nil, pipeline.SetHelp)
	cmd.Flags().StringVarP(&o.Format, "format", "f", "text", "table format: text, csv")
	cmd.Flags().StringVarP(&o.Output, "output", "o", "", "write the table to this file instead of standard output")
	cmd.Flags().StringVar(&o.Graph, "graph", "", "also draw one diagram (.dot, .gv, .svg or .png): the first model's heat paths, every model's temperature on each node")
	return cmd
}

// Run solves the models and writes the table.
func Run(o *Options) error {
	if o.Format != "text" && o.Format != "csv" {
		return exit.With(exit.BadInput, "--format %q is not a table format (use text, csv)", o.Format)
	}
	var format viz.ImageFormat
	if o.Graph != "" {
		f, err := viz.FormatFor(o.Graph)
		if err != nil {
			return &exit.Error{Code: exit.BadInput, Err: err}
		}
		format = f
	}
	var sols []*network.Solution
	code := exit.OK
	for _, m := range o.Models {
		out, err := pipeline.Solve(m, solve.Settings{}, o.Set...)
		if err != nil {
			return err
		}
		if out.Solution == nil {
			return out.NotConverged()
		}
		if out.Code() != exit.OK {
			code = out.Code()
		}
		sols = append(sols, out.Solution)
	}
	// The nodes of every model, in the order they first appear.
	var ids []string
	seen := map[string]bool{}
	byID := make([]map[string]network.NodeResult, len(sols))
	for i, s := range sols {
		byID[i] = map[string]network.NodeResult{}
		for _, n := range s.Nodes {
			byID[i][n.ID] = n
			if !seen[n.ID] && n.Kind != network.Fixed {
				seen[n.ID] = true
				ids = append(ids, n.ID)
			}
		}
	}
	var buf bytes.Buffer
	if o.Format == "csv" {
		w := csv.NewWriter(&buf)
		head := []string{"node"}
		for i := range sols {
			head = append(head, fmt.Sprintf("T%d_degC", i+1), fmt.Sprintf("margin%d_K", i+1))
			if i > 0 {
				head = append(head, fmt.Sprintf("dT%d_K", i+1))
			}
		}
		w.Write(head)
		for _, id := range ids {
			line := []string{id}
			for i := range sols {
				n, ok := byID[i][id]
				t, mg, d := "", "", ""
				if ok {
					t = num(n.Temperature - 273.15)
					if n.HasLimit {
						mg = num(n.Margin)
					}
					if first, ok0 := byID[0][id]; ok0 && i > 0 {
						d = num(n.Temperature - first.Temperature)
					}
				}
				line = append(line, t, mg)
				if i > 0 {
					line = append(line, d)
				}
			}
			w.Write(line)
		}
		w.Flush()
	} else {
		for i, s := range sols {
			title := s.Net.Model.Title
			if title == "" {
				title = "(no title)"
			}
			fmt.Fprintf(&buf, "[%d] %s — %s\n", i+1, title, o.Models[i])
		}
		if len(o.Set) > 0 {
			fmt.Fprintf(&buf, "with --set %s\n", strings.Join(o.Set, " --set "))
		}
		fmt.Fprintln(&buf)
		tw := tabwriter.NewWriter(&buf, 0, 0, 2, ' ', tabwriter.AlignRight)
		head := "node\t"
		for i := range sols {
			head += fmt.Sprintf("[%d] °C\tmargin K\t", i+1)
			if i > 0 {
				head += fmt.Sprintf("Δ[%d−1] K\t", i+1)
			}
		}
		fmt.Fprintln(tw, head)
		for _, id := range ids {
			line := id + "\t"
			for i := range sols {
				n, ok := byID[i][id]
				t, mg, d := "-", "", ""
				if ok {
					t = fmt.Sprintf("%.2f", n.Temperature-273.15)
					if n.HasLimit {
						mg = fmt.Sprintf("%+.2f", n.Margin)
						if n.Status == network.Over {
							mg += " OVER"
						} else if n.Status == network.Tight {
							mg += " tight"
						}
					}
					if first, ok0 := byID[0][id]; ok0 {
						d = fmt.Sprintf("%+.2f", n.Temperature-first.Temperature)
					}
				}
				line += t + "\t" + mg + "\t"
				if i > 0 {
					line += d + "\t"
				}
			}
			fmt.Fprintln(tw, line)
		}
		tw.Flush()
		fmt.Fprintf(&buf, "\n%s\n", viz.Caution)
	}
	var err error
	if o.Output != "" {
		err = pipeline.WriteFile(o.Output, buf.Bytes(), o.Models...)
	} else if _, werr := o.IO.Out.Write(buf.Bytes()); werr != nil {
		err = &exit.Error{Code: exit.OutputFailed, Err: fmt.Errorf("writing the table: %w", werr)}
	}
	if err != nil {
		return err
	}
	if o.Graph != "" {
		if err := o.drawGraph(sols, format); err != nil {
			return err
		}
	}
	if code != exit.OK {
		return exit.Silent(code)
	}
	return nil
}

// drawGraph draws the first model's heat paths with every model's
// temperatures on each node.
func (o *Options) drawGraph(sols []*network.Solution, format viz.ImageFormat) error {
	names := make([]string, len(sols))
	for i := range sols {
		names[i] = fmt.Sprintf("[%d]", i+1)
	}
	dot, err := viz.DOTWith(sols[0], viz.DiagramOptions{Compare: sols[1:], Names: names})
	if err != nil {
		return exit.With(exit.Internal, "building the diagram: %v", err)
	}
	ctx, cancel := context.WithTimeout(context.Background(), graphcmd.DefaultTimeout)
	defer cancel()
	data, err := viz.Render(ctx, dot, format)
	if err != nil {
		return exit.With(exit.OutputFailed, "%s: %v", o.Graph, err)
	}
	if err := pipeline.WriteFile(o.Graph, data, o.Models...); err != nil {
		return err
	}
	fmt.Fprintf(o.IO.ErrOut, "wrote %s: the heat paths of [1] with the temperatures of every model\n", o.Graph)
	return nil
}

func num(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }
