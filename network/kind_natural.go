package network

import (
	"strings"

	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/units"
)

func init() {
	registerLinkKind(linkKind{
		name: "natural", order: 80,
		summary: "natural convection from a surface: vertical, facing up, facing down, or vertical fins",
		help: "Natural convection with h̄ from a published correlation at the film temperature: " +
			"vertical plates by Churchill & Chu (all Ra), horizontal plates by Lloyd & Moran where " +
			"the warm air leaves the face and by 0.52·Ra^⅕ where it is trapped under it, vertical " +
			"fin arrays by Bar-Cohen & Rohsenow with fin efficiency. Warns outside each range.",
		sources: []string{
			"Churchill & Chu, Int. J. Heat Mass Transfer 18, 1975",
			"Lloyd & Moran, ASME 74-WA/HT-66, 1974",
			"Incropera et al. eq. 9.32",
			"Bar-Cohen & Rohsenow, J. Heat Transfer 106, 1984",
		},
		example: "{id: lid-top, kind: natural, from: lid, orientation: facing-up, length: 200 mm, width: 150 mm}",
		keys: []keySpec{
			{name: "orientation", what: "word", need: "required", help: "vertical, facing-up, facing-down or fins"},
			{name: "height", dim: units.Length, need: "vertical and fins", help: "vertical extent"},
			{name: "width", dim: units.Length, need: "vertical (or area); facing-up/down", help: "horizontal extent"},
			{name: "length", dim: units.Length, need: "facing-up/down"},
			{name: "area", dim: units.Area, need: "vertical: instead of width"},
			{name: "fin_count", what: "count", need: "fins"},
			{name: "fin_thickness", dim: units.Length, need: "fins"},
			{name: "fin_height", dim: units.Length, need: "fins", help: "how far the fins stand off the base"},
			{name: "fin_spacing", dim: units.Length, need: "fins", help: "clear gap between fins"},
			{name: "material", what: "material", need: "fins: one of material, conductivity"},
			{name: "conductivity", dim: units.Conductivity, need: "fins: one of material, conductivity"},
		},
		defaultTo: AmbientID,
		parse:     parseNatural,
		ends:      surfaceRules,
	})
}

// Natural is natural convection from a surface.
type Natural struct {
	Orientation elements.Orientation
	Area        float64
	Length      float64
	Fins        elements.Fins
}

func (n *Natural) element(e linkEnv) (elements.Element, error) {
	return elements.NewNatural(e.from, e.to, n.Orientation, n.Area, n.Length, n.Fins)
}

var orientations = []string{"vertical", "facing-up", "facing-down", "fins"}

func parseNatural(o *object, m *Model) LinkParams {
	if !o.has("orientation") {
		o.missing("orientation", "one of "+strings.Join(orientations, ", "))
		return nil
	}
	s, _ := o.choice("orientation", "orientation", orientations)
	n := &Natural{}
	switch s {
	case "vertical":
		n.Orientation = elements.Vertical
		h, ok := o.positive("height", units.Length, true)
		a, okA := plateArea(o, h)
		if !ok || !okA {
			return nil
		}
		n.Length, n.Area = h, a
	case "facing-up", "facing-down":
		n.Orientation = elements.FacingUp
		if s == "facing-down" {
			n.Orientation = elements.FacingDown
		}
		l, ok1 := o.positive("length", units.Length, true)
		w, ok2 := o.positive("width", units.Length, true)
		if o.has("area") {
			o.r.addf(o.values["area"], o.field("area"), "not used for a horizontal plate: its area is length × width")
			return nil
		}
		if !ok1 || !ok2 {
			return nil
		}
		// Characteristic length A/P (Goldstein, Sparrow & Jones 1973).
		n.Area, n.Length = l*w, l*w/(2*(l+w))
	case "fins":
		n.Orientation = elements.FinArray
		cnt, ok1 := o.count("fin_count", 2, maxFins)
		t, ok2 := o.positive("fin_thickness", units.Length, true)
		h, ok3 := o.positive("fin_height", units.Length, true)
		sp, ok4 := o.positive("fin_spacing", units.Length, true)
		l, ok5 := o.positive("height", units.Length, true)
		k, ok6 := conductivity(o, m, finHint)
		if !(ok1 && ok2 && ok3 && ok4 && ok5 && ok6) {
			return nil
		}
		n.Length = l
		n.Fins = elements.Fins{Count: cnt, Thickness: t, Height: h, Spacing: sp, Conductivity: k}
	default:
		return nil
	}
	return n
}

// plateArea reads the area of a plate whose height or length l is known:
// from a width across it, or given directly.
func plateArea(o *object, l float64) (float64, bool) {
	switch o.oneOf("the plate's width, or its area", "width", "area") {
	case "width":
		w, ok := o.positive("width", units.Length, true)
		return w * l, ok
	case "area":
		return o.positive("area", units.Area, true)
	}
	return 0, false
}
