package network

import (
	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/units"
)

func init() {
	registerLinkKind(linkKind{
		name: "radiation", order: 50,
		summary: "gray radiation to large surroundings, ε·σ·A·F·(T⁴ − T∞⁴), or between two gray surfaces",
		help: "Gray diffuse radiation with the exact T⁴ law. Alone, a small surface radiating to " +
			"large surroundings: q = εσAF(T⁴ − T∞⁴). With to_emissivity and to_area, the " +
			"two-surface exchange σ(T₁⁴ − T₂⁴)/[(1−ε₁)/(ε₁A₁) + 1/(A₁F₁₂) + (1−ε₂)/(ε₂A₂)]. For " +
			"several surfaces that see each other, use an enclosure instead.",
		sources: []string{"Incropera et al. eq. 1.7 and eq. 13.23", "σ = 5.670374419e-8 W/(m² K⁴), CODATA 2018"},
		example: "{id: glow, kind: radiation, from: lid, emissivity: 0.9, area: 0.03 m2}",
		keys: []keySpec{
			{name: "emissivity", dim: units.Dimensionless, need: "required", help: "in (0, 1]"},
			{name: "area", dim: units.Area, need: "required", help: "radiating area"},
			{name: "view_factor", dim: units.Dimensionless, def: "1", help: "from this surface to the other, in (0, 1]"},
			{name: "to_emissivity", dim: units.Dimensionless, need: "with to_area", help: "the other surface's emissivity"},
			{name: "to_area", dim: units.Area, need: "with to_emissivity", help: "the other surface's area"},
		},
		defaultTo: AmbientID,
		parse:     parseRadiation,
		ends:      solidRules,
	})
}

// Radiation is gray radiation from a surface to large surroundings, or,
// when the other surface's emissivity and area are given, between two gray
// surfaces.
type Radiation struct {
	Emissivity   float64
	Area         float64 // m²
	ViewFactor   float64 // from this surface to the other, default 1
	ToEmissivity float64 // the other surface, 0 for large surroundings
	ToArea       float64 // m², 0 for large surroundings
}

func (r *Radiation) element(e linkEnv) (elements.Element, error) {
	if r.ToArea > 0 {
		return elements.RadiationBetween(e.from, e.to, r.Emissivity, r.Area, r.ToEmissivity, r.ToArea, r.ViewFactor)
	}
	return elements.RadiationToSurroundings(e.from, e.to, r.Emissivity, r.Area, r.ViewFactor)
}

func parseRadiation(o *object, _ *Model) LinkParams {
	r := &Radiation{ViewFactor: 1}
	eps, ok1 := o.fraction("emissivity", true)
	a, ok2 := o.positive("area", units.Area, true)
	ok3, ok4 := true, true
	if o.has("view_factor") {
		r.ViewFactor, ok3 = o.fraction("view_factor", true)
	}
	if o.has("to_emissivity") || o.has("to_area") {
		var okE, okA bool
		r.ToEmissivity, okE = o.fraction("to_emissivity", true)
		r.ToArea, okA = o.positive("to_area", units.Area, true)
		ok4 = okE && okA
		if ok2 && okA && ok3 && r.ViewFactor*a/r.ToArea > 1+1e-9 {
			o.r.addf(o.values["view_factor"], o.field("view_factor"), "%.4g from %.4g m2 to %.4g m2 gives %.4g back by reciprocity (A1·F12 = A2·F21), above 1", r.ViewFactor, a, r.ToArea, r.ViewFactor*a/r.ToArea)
			ok4 = false
		}
	}
	if !ok1 || !ok2 || !ok3 || !ok4 {
		return nil
	}
	r.Emissivity, r.Area = eps, a
	return r
}
