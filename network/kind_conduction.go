package network

import (
	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/units"
)

func init() {
	registerLinkKind(linkKind{
		name: "conduction", order: 10,
		summary: "conduction through a slab or bar: k·A/L",
		help: "Steady one-dimensional conduction through a plane slab or a bar of one material: " +
			"G = k·A/L, with k from the material table or given. Use it for pads, plates, " +
			"walls, posts and spreaders whose temperature drop is along one direction.",
		sources: []string{"Fourier's law; Incropera et al., Fundamentals of Heat and Mass Transfer, §3.1"},
		example: "{id: pad, kind: conduction, from: cpu, to: lid, material: pad-6w, area: 1 cm2, thickness: 0.5 mm}",
		keys: []keySpec{
			{name: "material", what: "material", need: "one of material, conductivity", help: hintMaterial},
			{name: "conductivity", dim: units.Conductivity, need: "one of material, conductivity", help: "thermal conductivity k"},
			{name: "area", dim: units.Area, need: "required", help: "cross-section normal to the heat flow"},
			{name: "thickness", dim: units.Length, need: "one of thickness, length", help: "slab thickness along the heat flow"},
			{name: "length", dim: units.Length, need: "one of thickness, length", help: "bar length along the heat flow"},
		},
		parse: parseConduction,
		ends:  solidRules,
	})
}

// Conduction is a slab or bar of one material.
type Conduction struct {
	Material     string  // material name, "" when the conductivity was given
	Conductivity float64 // W/(m K)
	Area         float64 // cross-section normal to the heat flow, m²
	Length       float64 // thickness or length along the heat flow, m
}

func (c *Conduction) element(e linkEnv) (elements.Element, error) {
	return elements.Slab(e.from, e.to, c.Conductivity, c.Area, c.Length)
}

func parseConduction(o *object, m *Model) LinkParams {
	c := &Conduction{}
	var ok bool
	c.Conductivity, ok = conductivity(o, m, "a material name from the table or a conductivity such as 0.3 W/m/K")
	c.Material, _ = o.str("material")
	var okA, okL bool
	c.Area, okA = o.positive("area", units.Area, true)
	switch o.oneOf("the slab thickness or bar length along the heat flow, e.g. 1.6 mm", "thickness", "length") {
	case "thickness":
		c.Length, okL = o.positive("thickness", units.Length, true)
	case "length":
		c.Length, okL = o.positive("length", units.Length, true)
	}
	if !ok || !okA || !okL || !o.checkConductance(c.Conductivity*c.Area/c.Length, "k·A/L") {
		return nil
	}
	return c
}
