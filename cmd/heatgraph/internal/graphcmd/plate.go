package graphcmd

import (
	"bytes"
	"fmt"
	"math"
	"sort"
	"strings"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/pipeline"
	"github.com/heatgraph/heatgraph/internal/spell"
	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/solve"
	"github.com/heatgraph/heatgraph/viz"
)

// ThroughHottest is the one value of --through: each column of cells
// through the thickness is drawn as its hottest cell.
const ThroughHottest = "hottest"

// plateMode reports whether the options ask for a plate's heat map rather
// than the heat-path diagram.
func (o *Options) plateMode() bool { return o.Plate != "" || o.LayerSet || o.Through != "" }

// checkPlateOptions checks the options of a heat map that can be checked
// without the model.
func (o *Options) checkPlateOptions(format viz.ImageFormat) error {
	if o.Plate == "" {
		return exit.With(exit.BadInput, "--layer and --through choose the cells of a plate's heat map: name the plate with --plate ID")
	}
	if format == viz.FormatDOT {
		return exit.With(exit.BadInput, "--plate draws a heat map, which has no Graphviz source: -o %s must end in .svg or .png", o.Output)
	}
	for _, f := range []struct {
		name  string
		given bool
	}{
		{"--colour temperature", o.Colour == string(viz.ColourTemperature)},
		{"--link-labels", o.LinkLabels},
		{"--hide-below", o.HideBelow != ""},
		{"--collapse", len(o.Collapse) > 0},
		{"--source", o.Source != ""},
	} {
		if f.given {
			return exit.With(exit.BadInput, "%s is for the heat-path diagram, not for a plate's heat map (--plate)", f.name)
		}
	}
	if o.LayerSet && o.Through != "" {
		return exit.With(exit.BadInput, "--layer %d and --through %s both choose the cells to draw: give one of them", o.Layer, o.Through)
	}
	if o.Through != "" && o.Through != ThroughHottest {
		return exit.With(exit.BadInput, "--through %q is not a choice: use --through %s (the hottest cell through the thickness of each column)", o.Through, ThroughHottest)
	}
	if o.LayerSet && o.Layer < 0 {
		return exit.With(exit.BadInput, "--layer %d: layers count from 0 at the bottom face", o.Layer)
	}
	return nil
}

// findPlate returns the plate id of the model, or a message naming the
// plates it has.
func findPlate(m *network.Model, file, id string) (*network.PlateSpec, error) {
	ids := make([]string, len(m.Plates))
	for i := range m.Plates {
		if m.Plates[i].ID == id {
			return &m.Plates[i], nil
		}
		ids[i] = m.Plates[i].ID
	}
	if len(ids) == 0 {
		return nil, exit.With(exit.BadInput, "--plate %s: %s has no plates to draw (a heat map is of a plate of the model's plates: list)", id, file)
	}
	hint := ""
	if best := spell.Closest(id, ids, len(id)/3+1); best != "" {
		hint = fmt.Sprintf(" (did you mean %q?)", best)
	}
	sort.Strings(ids)
	return nil, exit.With(exit.BadInput, "--plate %q: no plate has this id%s (plates: %s)", id, hint, strings.Join(ids, ", "))
}

// runPlate solves the model and draws the heat map of one plate.
func runPlate(o *Options, format viz.ImageFormat) error {
	if err := o.checkPlateOptions(format); err != nil {
		return err
	}
	net, err := pipeline.Load(o.Model, o.Set...)
	if err != nil {
		return err
	}
	spec, err := findPlate(net.Model, o.Model, o.Plate)
	if err != nil {
		return err
	}
	nz := 0
	for _, l := range spec.Layers {
		nz += l.Cells
	}
	opt := viz.HeatMapOptions{View: viz.ViewTop}
	view := "top layer"
	switch {
	case o.LayerSet && o.Layer >= nz && nz == 1:
		return exit.With(exit.BadInput, "--layer %d: plate %q is one cell thick; its one layer is 0", o.Layer, o.Plate)
	case o.LayerSet && o.Layer >= nz:
		return exit.With(exit.BadInput, "--layer %d: plate %q has layers 0 (bottom) to %d (top)", o.Layer, o.Plate, nz-1)
	case o.LayerSet:
		opt = viz.HeatMapOptions{View: viz.ViewLayer, Layer: o.Layer}
		view = fmt.Sprintf("layer %d", o.Layer)
		switch {
		case nz == 1:
			view = "its one layer"
		case o.Layer == 0:
			view = "bottom layer"
		case o.Layer == nz-1:
			view = "top layer"
		}
	case o.Through == ThroughHottest:
		opt.View = viz.ViewHottest
		view = "hottest of each column"
	}

	out := pipeline.SolveNetwork(net, solve.Settings{})
	if out.Solution == nil {
		return out.NotConverged()
	}
	var p *network.PlateResult
	for i := range out.Solution.Plates {
		if out.Solution.Plates[i].ID == o.Plate {
			p = &out.Solution.Plates[i]
		}
	}
	if p == nil {
		return exit.With(exit.Internal, "plate %q is in the model but not in its solution", o.Plate)
	}
	var buf bytes.Buffer
	if format == viz.FormatPNG {
		err = viz.WritePlatePNG(&buf, p, opt)
	} else {
		err = viz.WritePlateSVG(&buf, p, opt)
	}
	if err != nil {
		return exit.With(exit.OutputFailed, "%s: %v", o.Output, err)
	}
	if err := pipeline.WriteFile(o.Output, buf.Bytes(), o.Model); err != nil {
		return err
	}
	hottest := "no cell has a finite temperature"
	if !math.IsNaN(p.Hottest) && !math.IsInf(p.Hottest, 0) {
		hottest = fmt.Sprintf("its hottest cell %.2f °C at %s", p.Hottest-273.15, position(p))
	}
	fmt.Fprintf(o.IO.ErrOut, "wrote %s; plate %s, %s drawn; %s; %s\n", o.Output, p.ID, view, hottest, viz.Verdict(out.Solution))
	if code := out.Code(); code != exit.OK {
		return exit.Silent(code)
	}
	return nil
}

// position is where a plate's hottest cell is, in mm: (x, y), and z when
// the plate is more than one cell thick.
func position(p *network.PlateResult) string {
	if p.NZ > 1 {
		return fmt.Sprintf("(%.1f, %.1f, %.2f) mm", 1e3*p.HotX, 1e3*p.HotY, 1e3*p.HotZ)
	}
	return fmt.Sprintf("(%.1f, %.1f) mm", 1e3*p.HotX, 1e3*p.HotY)
}
