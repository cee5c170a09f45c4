package network

import (
	"strings"

	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/elements/air"
	"github.com/heatgraph/heatgraph/elements/dual"
	"github.com/heatgraph/heatgraph/elements/duct"
	"github.com/heatgraph/heatgraph/network/units"
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

// Stream is air carried between two nodes.
type Stream struct {
	MassFlow float64 // kg/s
}

func (s *Stream) air(l *LinkSpec) (string, string, float64) { return l.From, l.To, s.MassFlow }

func (s *Stream) element(e linkEnv) (elements.Element, error) {
	return &elements.Stream{Up: e.from, Down: e.to, Flow: e.givenFlow(s.MassFlow)}, nil
}

func parseStream(o *object, m *Model) LinkParams {
	if f, ok := massFlow(o, m); ok {
		return &Stream{MassFlow: f}
	}
	return nil
}

// Channel is forced convection in channels; the link runs from the wall to
// the outlet air node, with the inlet as a third node.
type Channel struct {
	MassFlow float64 // kg/s
	Geometry elements.ChannelGeometry
	Options  duct.Options
	Upstream float64 // length of the same channels before this segment, m
}

func (c *Channel) air(l *LinkSpec) (string, string, float64) { return l.Others[0], l.To, c.MassFlow }

func (c *Channel) element(e linkEnv) (elements.Element, error) {
	return &elements.Channel{Wall: e.from, Inlet: e.others[0], Outlet: e.to, Flow: e.givenFlow(c.MassFlow),
		Geometry: c.Geometry, Options: c.Options, Upstream: c.Upstream}, nil
}

// The largest counts of fins and of parallel passages a link takes: far
// more than any heat sink or cold plate has (a rule of thumb), and small
// enough that areas computed from them stay sensible.
const (
	maxFins     = 1000
	maxPassages = 100000
)

const finHint = "the fin material, e.g. material: aluminium-6063, or conductivity: 200 W/m/K"

var (
	shapes          = []string{"rectangular", "circular"}
	turbulentModels = []string{"gnielinski", "dittus-boelter"}
	laminarEntries  = []string{"combined", "thermal"}
)

func parseChannel(o *object, m *Model) LinkParams {
	c := &Channel{}
	var ok bool
	c.MassFlow, ok = massFlow(o, m)
	length, okL := o.positive("length", units.Length, true)
	ok = ok && okL
	switch {
	case o.has("fin_count"):
		for _, k := range []string{"shape", "width", "height", "diameter", "count"} {
			if o.has(k) {
				o.r.addf(o.values[k], o.field(k), "not used with fin_count (a plate-fin heat sink takes fin_count, fin_thickness, fin_height, base_width, length and the fin material)")
				ok = false
			}
		}
		n, okN := o.count("fin_count", 2, maxFins)
		t, okT := o.positive("fin_thickness", units.Length, true)
		h, okH := o.positive("fin_height", units.Length, true)
		w, okW := o.positive("base_width", units.Length, true)
		k, okK := conductivity(o, m, finHint)
		if !(ok && okN && okT && okH && okW && okK) {
			return nil
		}
		g, err := elements.PlateFinSink(n, t, h, w, length, k)
		if err != nil {
			o.r.addf(o.values["fin_count"], o.field("fin_count"), "%v", err)
			return nil
		}
		if g.IsothermalFins, ok = o.flag("isothermal_fins"); !ok {
			return nil
		}
		c.Geometry = g
	default:
		for _, k := range []string{"fin_thickness", "fin_height", "base_width", "material", "conductivity", "isothermal_fins"} {
			if o.has(k) {
				o.r.addf(o.values[k], o.field(k), "describes fins, but the channel has no fin_count (plain channels take shape, width and height or diameter, count and length)")
				ok = false
			}
		}
		d, n, okD := passage(o, length)
		if !(ok && okD) {
			return nil
		}
		g, err := elements.Passages(d, n)
		if err != nil {
			o.r.addf(o.node, o.path, "%v", err)
			return nil
		}
		c.Geometry = g
	}
	if o.has("upstream_length") {
		u, okU := o.quantity("upstream_length", units.Length)
		if !okU {
			return nil
		}
		if u < 0 {
			o.r.addf(o.values["upstream_length"], o.field("upstream_length"), "must not be negative (the length of the same channels before this part, e.g. 60 mm)")
			return nil
		}
		c.Upstream = u
	}
	turb, ok1 := o.choice("turbulent", "correlation", turbulentModels)
	entry, ok2 := o.choice("laminar_entry", "entry model", laminarEntries)
	if !ok1 || !ok2 {
		return nil
	}
	if turb == "dittus-boelter" {
		c.Options.Turbulent = duct.DittusBoelter
	}
	if entry == "thermal" {
		c.Options.Laminar = duct.ThermalEntry
	}
	return c
}

// passage reads the cross-section of plain channels.
func passage(o *object, length float64) (duct.Duct, int, bool) {
	if !o.has("shape") {
		o.missing("shape", "rectangular (with width and height) or circular (with diameter); or describe a heat sink with fin_count")
		return duct.Duct{}, 0, false
	}
	shape, okS := o.choice("shape", "shape", shapes)
	if !okS {
		return duct.Duct{}, 0, false
	}
	n := 1
	okN := true
	if o.has("count") {
		n, okN = o.count("count", 1, maxPassages)
	}
	switch shape {
	case "rectangular":
		w, ok1 := o.positive("width", units.Length, true)
		h, ok2 := o.positive("height", units.Length, true)
		return duct.Duct{Shape: duct.Rectangular, Width: w, Height: h, Length: length}, n, ok1 && ok2 && okN
	case "circular":
		d, ok1 := o.positive("diameter", units.Length, true)
		return duct.Duct{Shape: duct.Circular, Diameter: d, Length: length}, n, ok1 && okN
	}
	return duct.Duct{}, 0, false
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

// FlatPlate is forced convection along a flat wall.
type FlatPlate struct {
	Velocity, Length, Area float64
}

func (f *FlatPlate) element(e linkEnv) (elements.Element, error) {
	return elements.NewFlatPlate(e.from, e.to, f.Velocity, f.Length, f.Area)
}

func parseFlatPlate(o *object, _ *Model) LinkParams {
	v, ok1 := o.positive("velocity", units.Velocity, true)
	l, ok2 := o.positive("length", units.Length, true)
	a, ok3 := plateArea(o, l)
	if !ok1 || !ok2 || !ok3 {
		return nil
	}
	return &FlatPlate{Velocity: v, Length: l, Area: a}
}
