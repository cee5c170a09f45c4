package network

import (
	"github.com/heatgraph/heatgraph/units"
)

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
