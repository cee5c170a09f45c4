package network

import (
	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/units"
)

// SunParams is sunlight absorbed by an outside surface.
type SunParams struct {
	Absorptivity float64 // solar absorptivity α_s
	Area         float64 // m²
	Irradiance   float64 // W/m² at t = 0
	Profile      Profile // irradiance in time, nil when constant
}

func (p *SunParams) element(e linkEnv) (elements.Element, error) {
	var of elements.TimeFunc
	if p.Profile != nil {
		of = p.Profile
		e.net.profiles = append(e.net.profiles, p.Profile)
	}
	return elements.NewSun(e.from, e.to, p.Absorptivity, p.Area, p.Irradiance, of)
}

func parseSun(o *object, _ *Model) LinkParams {
	a, ok1 := o.fraction("absorptivity", true)
	area, ok2 := o.positive("area", units.Area, true)
	g, prof, ok3 := o.varying("irradiance", units.HeatFlux, true)
	if ok3 {
		if low := profileLowest(prof, g); low < 0 {
			o.r.addf(o.values["irradiance"], o.field("irradiance"), "irradiance must not be negative (it reaches %g W/m2)", low)
			ok3 = false
		}
	}
	if !(ok1 && ok2 && ok3) {
		return nil
	}
	return &SunParams{Absorptivity: a, Area: area, Irradiance: g, Profile: prof}
}

func init() {
	registerLinkKind(linkKind{
		name: "sun", order: 100,
		summary: "sunlight absorbed by an outside surface: α_s·A·G, environment heat",
		help: "Sunlight on an outside surface: q = α_s·A·G, with α_s the surface's solar " +
			"absorptivity (for sunlight; not its infrared emissivity, which the radiation and " +
			"sky kinds take), A the area facing the sun and G the irradiance on it, constant or " +
			"a profile in time (a day's table, say). The heat comes from outside: the energy " +
			"balance lists it as environment heat, apart from the parts' powers. The to node " +
			"(ambient by default) only stands for the sky in reports; no heat is taken from it.",
		sources: []string{"Incropera et al., Fundamentals of Heat and Mass Transfer, §12.5 and §12.8 (absorbed irradiation α·G)"},
		example: "{id: noon, kind: sun, from: lid, absorptivity: 0.3, area: 0.06 m2, irradiance: 800 W/m2}",
		keys: []keySpec{
			{name: "absorptivity", dim: units.Dimensionless, need: "required", help: "solar absorptivity α_s, in (0, 1]"},
			{name: "area", dim: units.Area, need: "required", help: "area facing the sun (its projection normal to the rays, or the area with G on that plane)"},
			{name: "irradiance", dim: units.HeatFlux, need: "required", help: "irradiance G on the surface, constant or a profile in time"},
		},
		defaultTo: AmbientID,
		parse:     parseSun,
		ends: []endRule{{"from", "the sunlit surface", solidKinds},
			{"to", "where the light comes from, for reports only", []NodeKind{Fixed, Solid, Junction, Air}}},
	})
}
