package network

import (
	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/units"
)

// SkyParams is long-wave radiation from an outside surface to the sky and
// the ground.
type SkyParams struct {
	Emissivity float64
	Area       float64 // m²
	ViewSky    float64 // view factor to the sky
	TSky       float64 // K at t = 0, when not Swinbank
	Profile    Profile // sky temperature in time, nil when constant
	Swinbank   bool    // the sky temperature from Swinbank's relation
}

func (p *SkyParams) element(e linkEnv) (elements.Element, error) {
	k, err := elements.NewSky(e.from, e.to, p.Emissivity, p.Area, p.ViewSky)
	if err != nil {
		return nil, err
	}
	k.TSky, k.Swinbank = p.TSky, p.Swinbank
	if p.Profile != nil {
		k.Of = p.Profile
		e.net.profiles = append(e.net.profiles, p.Profile)
	}
	return k, nil
}

func parseSky(o *object, _ *Model) LinkParams {
	eps, ok1 := o.fraction("emissivity", true)
	area, ok2 := o.positive("area", units.Area, true)
	f := 1.0
	ok3 := true
	if o.has("view_factor") {
		f, ok3 = o.fraction("view_factor", false)
	}
	p := &SkyParams{Emissivity: eps, Area: area, ViewSky: f}
	ok4 := false
	switch o.oneOf("a sky_temperature such as -5 degC, or sky_model: swinbank", "sky_temperature", "sky_model") {
	case "sky_temperature":
		p.TSky, p.Profile, ok4 = o.varying("sky_temperature", units.Temperature, true)
		if ok4 {
			if low := profileLowest(p.Profile, p.TSky); !(low > 0) {
				o.r.addf(o.values["sky_temperature"], o.field("sky_temperature"), "the sky temperature must be above absolute zero (it reaches %g K)", low)
				ok4 = false
			}
		}
	case "sky_model":
		var m string
		m, ok4 = o.choice("sky_model", "sky model", []string{"swinbank"})
		p.Swinbank = m == "swinbank"
	}
	if !(ok1 && ok2 && ok3 && ok4) {
		return nil
	}
	return p
}

func init() {
	registerLinkKind(linkKind{
		name: "sky", order: 110,
		summary: "radiation from an outside surface to the sky and the ground: εσA[F(T⁴ − T_sky⁴) + (1 − F)(T⁴ − T_to⁴)]",
		help: "Long-wave radiation from an outside surface to the sky, which it sees with " +
			"view_factor F, and to the ground and surroundings (the to node, ambient by " +
			"default), which take the rest of its view: q = εσA[F(T⁴ − T_sky⁴) + (1 − F)(T⁴ − T_to⁴)], " +
			"exact T⁴. The sky temperature is given (constant or a profile in time) or, with " +
			"sky_model: swinbank, follows the to node's air temperature by Swinbank's clear-sky " +
			"relation T_sky = 0.0552·T_air^1.5 (K). Heat to the sky is counted as heat leaving " +
			"through the to node.",
		sources: []string{
			"Incropera et al., Fundamentals of Heat and Mass Transfer, eq. 1.7",
			"Swinbank, Long-wave radiation from clear skies, Q. J. R. Meteorol. Soc. 89, 1963",
			"Duffie & Beckman, Solar Engineering of Thermal Processes, §3.9 (Swinbank's relation as T_sky = 0.0552·T_air^1.5)",
		},
		example: "{id: night, kind: sky, from: lid, emissivity: 0.9, area: 0.06 m2, view_factor: 0.5, sky_model: swinbank}",
		keys: []keySpec{
			{name: "emissivity", dim: units.Dimensionless, need: "required", help: "infrared emissivity, in (0, 1]"},
			{name: "area", dim: units.Area, need: "required", help: "radiating area"},
			{name: "view_factor", dim: units.Dimensionless, def: "1", help: "view factor to the sky, in (0, 1]; the rest goes to the to node"},
			{name: "sky_temperature", dim: units.Temperature, need: "one of sky_temperature, sky_model", help: "effective sky temperature, constant or a profile in time"},
			{name: "sky_model", what: "word", need: "one of sky_temperature, sky_model", help: "swinbank: T_sky = 0.0552·T_air^1.5 from the to node"},
		},
		defaultTo: AmbientID,
		parse:     parseSky,
		ends:      []endRule{{"from", "the outside surface", solidKinds}, {"to", "the ground and surroundings", solidKinds}},
	})
}
