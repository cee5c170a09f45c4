package network

import (
	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/units"
)

func init() {
	registerLinkKind(linkKind{
		name: "contact", order: 20,
		summary: "interface resistance: area-specific resistance over an area, or a total",
		help: "The resistance of an interface between two solids (a bolted joint, a grease or " +
			"gap-filler line): G = A/R″ from an area-specific resistance, or 1/R from a total.",
		sources: []string{"definition of thermal contact resistance; Incropera et al. §3.1.4"},
		example: "{id: screws, kind: contact, from: board, to: lid, specific_resistance: 1 K*cm2/W, area: 2 cm2}",
		keys: []keySpec{
			{name: "specific_resistance", dim: units.SpecificResistance, need: "one of specific_resistance, resistance", help: "area-specific resistance R″ (with area)"},
			{name: "area", dim: units.Area, need: "with specific_resistance", help: "contact area"},
			{name: "resistance", dim: units.ThermalResistance, need: "one of specific_resistance, resistance", help: "total resistance"},
		},
		parse: parseContact,
		ends:  solidRules,
	})
}

// Contact is an interface resistance.
type Contact struct {
	Specific   float64 // area-specific resistance, K m²/W (with Area)
	Area       float64 // m²
	Resistance float64 // total, K/W (when Specific is zero)
}

func (c *Contact) element(e linkEnv) (elements.Element, error) {
	if c.Specific > 0 {
		return elements.Contact(e.from, e.to, c.Specific, c.Area)
	}
	return elements.Resistance(e.from, e.to, c.Resistance)
}

func parseContact(o *object, _ *Model) LinkParams {
	c := &Contact{}
	switch o.oneOf("an area-specific resistance with an area, e.g. specific_resistance: 0.5 K*cm2/W, or a total resistance in K/W", "specific_resistance", "resistance") {
	case "specific_resistance":
		s, ok1 := o.positive("specific_resistance", units.SpecificResistance, true)
		a, ok2 := o.positive("area", units.Area, true)
		if ok1 && ok2 && o.checkConductance(a/s, "A/R″") {
			c.Specific, c.Area = s, a
			return c
		}
	case "resistance":
		if o.has("area") {
			o.r.addf(o.values["area"], o.field("area"), "not used with a total resistance (give specific_resistance with area, or resistance alone)")
			return nil
		}
		if r, ok := o.positive("resistance", units.ThermalResistance, true); ok {
			c.Resistance = r
			return c
		}
	}
	return nil
}
