package network

import (
	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/units"
)

func init() {
	registerLinkKind(linkKind{
		name: "flat-plate", order: 90,
		summary: "forced convection from a flat wall in a stream of air of given velocity",
		help: "Forced convection along a flat wall in a draught of given velocity: laminar " +
			"0.664·Re^½·Pr^⅓ below Re 5×10⁵, mixed (0.037·Re^0.8 − 871)·Pr^⅓ above, at the film " +
			"temperature.",
		sources: []string{"Incropera et al. eqs. 7.30 and 7.38"},
		example: "{id: side, kind: flat-plate, from: wall, velocity: 1.5 m/s, length: 200 mm, width: 120 mm}",
		keys: []keySpec{
			{name: "velocity", dim: units.Velocity, need: "required", help: "free-stream velocity"},
			{name: "length", dim: units.Length, need: "required", help: "along the flow"},
			{name: "width", dim: units.Length, need: "one of width, area"},
			{name: "area", dim: units.Area, need: "one of width, area"},
		},
		defaultTo: AmbientID,
		parse:     parseFlatPlate,
		ends:      surfaceRules,
	})
}

// FlatPlate is forced convection along a flat wall.
type FlatPlate struct {
	Velocity, Length, Area float64
}

func (f *FlatPlate) element(e linkEnv) (elements.Element, error) {
	return elements.NewFlatPlate(e.from, e.to, f.Velocity, f.Length, f.Area)
}

func parseFlatPlate(o *object, _ *Model) LinkParams {
	v, ok1 := o.positive("velocity", units.Velocity, true)
	l, ok2 := o.positive("length", units.Length, true)
	a, ok3 := plateArea(o, l)
	if !ok1 || !ok2 || !ok3 {
		return nil
	}
	return &FlatPlate{Velocity: v, Length: l, Area: a}
}
