// Package graphcmd implements "heatgraph graph".
package graphcmd

import (
	"context"
	"errors"
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

// Options are the inputs of the graph command.
type Options struct {
	IO     *iostreams.IOStreams
	Model  string
	Set    []string // overrides, PATH=VALUE
	Output string   // .dot, .gv, .svg or .png
	Colour string   // margin or temperature
	// LinkLabels names the links in each arrow's label.
	LinkLabels bool
	// HideBelow hides arrows carrying less heat: watts ("0.1W") or a
	// fraction of the largest arrow ("0.02").
	HideBelow string
	// Collapse draws these groups as one node each.
	Collapse []string
	// Source draws only this source's heat.
	Source string
	// Timeout bounds the layout; a larger diagram stops with an error.
	Timeout time.Duration
	// Plate draws the heat map of this plate (.svg or .png) instead of
	// the heat-path diagram.
	Plate string
	// Layer is the layer of cells the heat map draws, 0 at the bottom,
	// when LayerSet; else the top layer.
	Layer    int
	LayerSet bool
	// Through, ThroughHottest, draws each column of cells through the
	// thickness as its hottest cell.
	Through string
}

// DefaultTimeout is the default bound on the layout time.
const DefaultTimeout = 60 * time.Second

// NewCmd returns the graph command.
func NewCmd(ios *iostreams.IOStreams, runF func(*Options) error) *cobra.Command {
	o := &Options{IO: ios}
	cmd := &cobra.Command{
		Use:   "graph MODEL -o FILE",
		Short: "Draw the solved heat paths as DOT, SVG or PNG",
		Long: `Solve a model and draw its heat paths. Nodes show their temperature and
margin, coloured by margin (default) or temperature; arrows point the way
heat flows, labelled in watts and thicker for more heat; a legend explains
the colours. The format follows the output file's extension: .dot or .gv
(Graphviz source), .svg, .png.

Large diagrams take long to lay out: the layout stops after
--layout-timeout (60s by default) with an error.

--plate ID draws the heat map of one of the model's plates instead (.svg
or .png): its cells coloured by temperature, the parts on it outlined,
its hottest cell marked. It shows the top layer of cells, or --layer K
(0 at the bottom face), or --through hottest: the hottest cell through
the thickness of each column.

Exit status as for solve; the file is written only when the solve converged.`,
		Example: "  heatgraph graph examples/outdoor-controller.yaml -o controller.svg\n" +
			"  heatgraph graph examples/camera-board.yaml --plate board -o board.png",
		Args: cobra.ExactArgs(1),
		RunE: func(c *cobra.Command, args []string) error {
			o.Model = args[0]
			o.LayerSet = c.Flags().Changed("layer")
			if runF != nil {
				return runF(o)
			}
			return Run(o)
		},
	}
	cmd.Flags().StringVarP(&o.Output, "output", "o", "", "diagram file (.dot, .gv, .svg or .png)")
	cmd.Flags().StringVar(&o.Colour, "colour", string(viz.ColourMargin), "node fill: margin or temperature")
	cmd.Flags().StringVar(&o.Colour, "color", string(viz.ColourMargin), "the same as --colour")
	cmd.Flags().BoolVar(&o.LinkLabels, "link-labels", false, "name the links in each arrow's label (they are always in its tooltip)")
	cmd.Flags().StringVar(&o.HideBelow, "hide-below", "", "hide arrows carrying less heat: watts (0.1W) or a fraction of the largest arrow (0.02)")
	cmd.Flags().StringSliceVar(&o.Collapse, "collapse", nil, "draw a group (a node's group key) as one node; repeat or separate by commas")
	cmd.Flags().StringVar(&o.Source, "source", "", "draw only the heat of this source node, along the paths it takes")
	cmd.Flags().DurationVar(&o.Timeout, "layout-timeout", DefaultTimeout, "give up drawing a diagram whose layout takes longer than this")
	cmd.Flags().StringVar(&o.Plate, "plate", "", "draw the heat map of this plate (.svg or .png) instead of the heat-path diagram")
	cmd.Flags().IntVar(&o.Layer, "layer", 0, "with --plate: the layer of cells to draw, 0 at the bottom face (default the top layer)")
	cmd.Flags().StringVar(&o.Through, "through", "", "with --plate: \"hottest\" draws the hottest cell through the thickness of each column")
	cmd.Flags().StringArrayVar(&o.Set, "set", nil, pipeline.SetHelp)
	return cmd
}

// Run solves the model and writes the diagram.
func Run(o *Options) error {
	if o.Output == "" && o.plateMode() {
		return exit.With(exit.BadInput, "graph --plate needs an output file: -o FILE with .svg or .png")
	}
	if o.Output == "" {
		return exit.With(exit.BadInput, "graph needs an output file: -o FILE with .dot, .gv, .svg or .png")
	}
	format, err := viz.FormatFor(o.Output)
	if err != nil {
		return &exit.Error{Code: exit.BadInput, Err: err}
	}
	if o.plateMode() {
		return runPlate(o, format)
	}
	colour := viz.Colouring(o.Colour)
	if colour != viz.ColourMargin && colour != viz.ColourTemperature {
		names := make([]string, len(viz.Colourings))
		for i, c := range viz.Colourings {
			names[i] = string(c)
		}
		return exit.With(exit.BadInput, "--colour %q is not a colouring (use %s)", o.Colour, strings.Join(names, ", "))
	}
	opt := viz.DiagramOptions{Colouring: colour, LinkLabels: o.LinkLabels, Collapse: o.Collapse, Source: o.Source}
	if opt.HideBelowW, opt.HideBelowFraction, err = ParseHideBelow(o.HideBelow); err != nil {
		return &exit.Error{Code: exit.BadInput, Err: err}
	}
	out, err := pipeline.Solve(o.Model, solve.Settings{}, o.Set...)
	if err != nil {
		return err
	}
	if out.Solution == nil {
		return out.NotConverged()
	}
	if err := checkNames(out.Solution, opt); err != nil {
		return &exit.Error{Code: exit.BadInput, Err: err}
	}
	dot, err := viz.DOTWith(out.Solution, opt)
	if err != nil {
		return exit.With(exit.Internal, "building the diagram: %v", err)
	}
	timeout := o.Timeout
	if timeout <= 0 {
		timeout = DefaultTimeout
	}
	ctx, cancel := context.WithTimeout(context.Background(), timeout)
	defer cancel()
	data, err := viz.Render(ctx, dot, format)
	switch {
	case errors.Is(err, viz.ErrLayoutTimeout):
		return exit.With(exit.OutputFailed, "%s: the diagram of %d nodes and %d links was not laid out within %s; "+
			"draw fewer nodes (lump parts of the model together) or allow more time with --layout-timeout",
			o.Output, len(out.Solution.Nodes), len(out.Solution.Links), timeout)
	case err != nil:
		return exit.With(exit.OutputFailed, "%s: %v", o.Output, err)
	}
	if err := pipeline.WriteFile(o.Output, data, o.Model); err != nil {
		return err
	}
	fmt.Fprintf(o.IO.ErrOut, "wrote %s; %s\n", o.Output, viz.Verdict(out.Solution))
	if code := out.Code(); code != exit.OK {
		return exit.Silent(code)
	}
	return nil
}
