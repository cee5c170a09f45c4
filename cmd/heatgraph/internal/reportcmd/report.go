// Package reportcmd implements "heatgraph report": one self-contained HTML
// page for a design review.
package reportcmd

import (
	"bytes"
	"context"
	"fmt"
	"strings"
	"time"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/pipeline"
	"github.com/heatgraph/heatgraph/solve"
	"github.com/heatgraph/heatgraph/viz"
	"github.com/spf13/cobra"
)

// Options are the inputs of the report command.
type Options struct {
	IO      *iostreams.IOStreams
	Model   string
	Output  string
	Timeout time.Duration // bound on the diagram's layout
}

// DefaultTimeout bounds the diagram's layout.
const DefaultTimeout = 60 * time.Second

// NewCmd returns the report command.
func NewCmd(ios *iostreams.IOStreams, runF func(*Options) error) *cobra.Command {
	o := &Options{IO: ios}
	cmd := &cobra.Command{
		Use:   "report MODEL -o FILE.html",
		Short: "Write a self-contained HTML review report",
		Long: `Solve a model and write one HTML page for a design review: the model's
assumptions (ambient, pressure or altitude, required margin), warnings,
every node against its limit, the heat-path diagram, where each source's
heat goes, the correlations used and their sources, the energy balance
and the cautions. The page loads nothing from anywhere (inline styles and
diagram, no scripts) and prints on A4 or Letter.

Exit status as for solve; the file is written only when the solve converged.`,
		Example: "  heatgraph report examples/outdoor-controller.yaml -o review.html",
		Args:    cobra.ExactArgs(1),
		RunE: func(_ *cobra.Command, args []string) error {
			o.Model = args[0]
			if runF != nil {
				return runF(o)
			}
			return Run(o)
		},
	}
	cmd.Flags().StringVarP(&o.Output, "output", "o", "", "the HTML file to write")
	cmd.Flags().DurationVar(&o.Timeout, "layout-timeout", DefaultTimeout, "give up drawing a diagram whose layout takes longer than this")
	return cmd
}

// Run solves the model and writes the report.
func Run(o *Options) error {
	if o.Output == "" {
		return exit.With(exit.BadInput, "report needs an output file: -o FILE.html")
	}
	page, out, err := Build(o.Model, o.Timeout, false)
	if err != nil {
		return err
	}
	if err := pipeline.WriteFile(o.Output, page, o.Model); err != nil {
		return err
	}
	fmt.Fprintf(o.IO.ErrOut, "wrote %s; %s\n", o.Output, viz.Verdict(out.Solution))
	if code := out.Code(); code != exit.OK {
		return exit.Silent(code)
	}
	return nil
}

// Build solves a model and returns its report page. live adds the script
// of the live view. A model that does not read or solve is an error (with
// its exit code); the outcome is returned for the verdict and exit code.
func Build(model string, timeout time.Duration, live bool) ([]byte, *pipeline.Outcome, error) {
	out, err := pipeline.Solve(model, solve.Settings{})
	if err != nil {
		return nil, nil, err
	}
	if out.Solution == nil {
		return nil, out, out.NotConverged()
	}
	dot, err := viz.DOT(out.Solution, viz.ColourMargin)
	if err != nil {
		return nil, out, exit.With(exit.Internal, "building the diagram: %v", err)
	}
	if timeout <= 0 {
		timeout = DefaultTimeout
	}
	ctx, cancel := context.WithTimeout(context.Background(), timeout)
	defer cancel()
	svg, err := viz.Render(ctx, dot, viz.FormatSVG)
	if err != nil {
		return nil, out, exit.With(exit.OutputFailed, "drawing the diagram: %v", err)
	}
	r := viz.NewHTMLReport(out.Solution, out.Run, svg)
	r.Live = live
	var buf bytes.Buffer
	if err := viz.WriteHTML(&buf, r); err != nil {
		return nil, out, exit.With(exit.Internal, "writing the report: %v", err)
	}
	return buf.Bytes(), out, nil
}

// ErrorPage is the report page that shows why a model gave no results.
func ErrorPage(model string, err error, live bool) []byte {
	msg := strings.TrimSpace(err.Error())
	r := viz.NewHTMLError(model, msg)
	r.Live = live
	var buf bytes.Buffer
	if werr := viz.WriteHTML(&buf, r); werr != nil {
		return []byte("heatgraph: " + werr.Error())
	}
	return buf.Bytes()
}
