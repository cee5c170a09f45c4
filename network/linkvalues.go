package network

import (
	"github.com/heatgraph/heatgraph/elements/air"
	"github.com/heatgraph/heatgraph/elements/dual"
	"github.com/heatgraph/heatgraph/units"
)

// massFlow reads flow (a volume flow of ambient air) or mass_flow.
func massFlow(o *object, m *Model) (float64, bool) {
	switch o.oneOf("a volume flow of ambient air such as 12 CFM, or a mass flow such as 6 g/s", "flow", "mass_flow") {
	case "flow":
		q, ok := o.positive("flow", units.VolumeFlow, true)
		if !ok {
			return 0, false
		}
		// Fans and blowers are rated in volume: the air is at the
		// ambient state where it is drawn in.
		return q * air.Density(dual.C(m.Ambient.Temperature), m.Ambient.Pressure).V, true
	case "mass_flow":
		return o.positive("mass_flow", units.MassFlow, true)
	}
	return 0, false
}

// conductivity reads a material name or a conductivity; hint says what
// the material is for.
func conductivity(o *object, m *Model, hint string) (float64, bool) {
	switch o.oneOf(hint, "material", "conductivity") {
	case "material":
		name, _ := o.str("material")
		mat, found := m.Materials[name]
		if !found {
			o.r.addf(o.values["material"], o.field("material"), "unknown material %q%s (see 'heatgraph materials' for the table, or add it under materials:)", name, suggest(name, sortedKeys(m.Materials)))
			return 0, false
		}
		return mat.Conductivity, true
	case "conductivity":
		return o.positive("conductivity", units.Conductivity, true)
	}
	return 0, false
}
