package network

import (
	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/units"
)

func init() {
	registerLinkKind(linkKind{
		name: "convection", order: 40,
		summary: "convection with a given heat transfer coefficient: h·A",
		help: "Convection from a surface to air with a coefficient the user gives: q = h·A·ΔT " +
			"(Newton's law of cooling). heatgraph does not check the coefficient; the natural, " +
			"flat-plate and channel kinds compute it from correlations instead.",
		sources: []string{"Newton's law of cooling; Incropera et al. §1.2.2"},
		example: "{id: skin, kind: convection, from: lid, coefficient: 5 W/m2/K, area: 0.03 m2}",
		keys: []keySpec{
			{name: "coefficient", dim: units.HeatTransferCoefficient, need: "required", help: "heat transfer coefficient h"},
			{name: "area", dim: units.Area, need: "required", help: "wetted area"},
		},
		defaultTo: AmbientID,
		parse:     parseConvection,
	})
}

// Convection is convection with a coefficient the user gives.
type Convection struct {
	Coefficient float64 // W/(m² K)
	Area        float64 // m²
}

func (c *Convection) element(e linkEnv) (elements.Element, error) {
	return elements.FixedConvection(e.from, e.to, c.Coefficient, c.Area)
}

func parseConvection(o *object, _ *Model) LinkParams {
	h, ok1 := o.positive("coefficient", units.HeatTransferCoefficient, true)
	a, ok2 := o.positive("area", units.Area, true)
	if !ok1 || !ok2 || !o.checkConductance(h*a, "h·A") {
		return nil
	}
	return &Convection{Coefficient: h, Area: a}
}
