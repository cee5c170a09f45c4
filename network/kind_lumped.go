package network

import (
	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/units"
)

func init() {
	registerLinkKind(linkKind{
		name: "lumped", order: 30,
		summary: "a resistance (K/W) or conductance (W/K) given directly",
		help: "A fixed thermal resistance or conductance between any two nodes, from a " +
			"datasheet, a measurement or a calculation done elsewhere.",
		sources: []string{"definition of thermal resistance, R = ΔT/q"},
		example: "{id: mount, kind: lumped, from: lid, to: rack, resistance: 2 K/W}",
		keys: []keySpec{
			{name: "resistance", dim: units.ThermalResistance, need: "one of resistance, conductance"},
			{name: "conductance", dim: units.Conductance, need: "one of resistance, conductance"},
		},
		parse: parseLumped,
	})
}

// Lumped is a resistance or conductance given directly.
type Lumped struct {
	Conductance float64 // W/K
}

func (l *Lumped) element(e linkEnv) (elements.Element, error) {
	return &elements.Conductance{A: e.from, B: e.to, G: l.Conductance}, nil
}

func parseLumped(o *object, _ *Model) LinkParams {
	switch o.oneOf("a resistance such as 0.8 K/W or a conductance such as 2 W/K", "resistance", "conductance") {
	case "resistance":
		if r, ok := o.positive("resistance", units.ThermalResistance, true); ok {
			return &Lumped{Conductance: 1 / r}
		}
	case "conductance":
		if g, ok := o.positive("conductance", units.Conductance, true); ok {
			return &Lumped{Conductance: g}
		}
	}
	return nil
}
