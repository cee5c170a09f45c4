package network

import (
	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/elements/duct"
	"github.com/heatgraph/heatgraph/units"
)

func init() {
	registerLinkKind(linkKind{
		name: "channel", order: 70,
		summary: "forced convection from a wall to air in parallel channels or a plate-fin heat sink",
		help: "Air forced through N parallel channels along a wall (drilled passages, or the gaps " +
			"of a plate-fin heat sink) takes heat from the wall by the uniform-wall outlet relation " +
			"q = ṁc_p(1 − e^(−NTU))(T_wall − T_in), NTU = h̄A_eff/(ṁc_p), and carries it to the " +
			"outlet air node with the heat the air brought from the inlet. h̄ = Nu·k/D_h at " +
			"Re = ṁD_h/(A·μ) with air properties at the mean bulk temperature: laminar fully " +
			"developed (Shah & London) or developing (Muzychka & Yovanovich for rectangles, " +
			"Stephan for tubes; Hausen with laminar_entry: thermal), turbulent Gnielinski or " +
			"Dittus–Boelter, Gnielinski's blend in between; fins through their efficiency. The " +
			"report gives every number behind h and the pressure drop.",
		sources: []string{
			"Incropera et al., Fundamentals of Heat and Mass Transfer, eq. 8.42b (outlet relation)",
			"Shah & London, Laminar Flow Forced Convection in Ducts, 1978",
			"Muzychka & Yovanovich, J. Heat Transfer 126, 2004 (combined entry)",
			"Gnielinski, Int. Chem. Eng. 16, 1976; Petukhov 1970 (friction)",
			"Dittus & Boelter, 1930",
			"Kays & London, Compact Heat Exchangers (entry and exit losses)",
			"Churchill, Chem. Eng. 84, 1977 (friction factor)",
		},
		example: "{id: fins, kind: channel, from: base, inlet: ambient, to: air-out, flow: 15 CFM, length: 100 mm,\n" +
			"   fin_count: 14, fin_thickness: 1.2 mm, fin_height: 30 mm, base_width: 80 mm, material: aluminium-6063}",
		keys: []keySpec{
			{name: "inlet", what: "node", need: "required", help: "the air or fixed node the air comes from"},
			{name: "flow", dim: units.VolumeFlow, need: "one of flow, mass_flow", help: "volume flow of ambient air; constant or a profile in time"},
			{name: "mass_flow", dim: units.MassFlow, need: "one of flow, mass_flow", help: "constant or a profile in time"},
			{name: "length", dim: units.Length, need: "required", help: "channel length along the flow"},
			{name: "fin_count", what: "count", need: "for a heat sink", help: "number of fins (2 to 1000)"},
			{name: "fin_thickness", dim: units.Length, need: "with fin_count"},
			{name: "fin_height", dim: units.Length, need: "with fin_count", help: "how far the fins stand off the base"},
			{name: "base_width", dim: units.Length, need: "with fin_count", help: "across the fins"},
			{name: "material", what: "material", need: "with fin_count: one of material, conductivity", help: "fin material"},
			{name: "conductivity", dim: units.Conductivity, need: "with fin_count: one of material, conductivity", help: "fin conductivity"},
			{name: "isothermal_fins", what: "flag", def: "false", help: "take the fins at the base temperature (efficiency 1)"},
			{name: "shape", what: "word", need: "for plain channels", help: "rectangular or circular"},
			{name: "width", dim: units.Length, need: "with shape: rectangular"},
			{name: "height", dim: units.Length, need: "with shape: rectangular"},
			{name: "diameter", dim: units.Length, need: "with shape: circular"},
			{name: "count", what: "count", def: "1", help: "number of parallel plain channels"},
			{name: "turbulent", what: "word", def: "gnielinski", help: "gnielinski or dittus-boelter"},
			{name: "laminar_entry", what: "word", def: "combined", help: "combined (hydrodynamic and thermal) or thermal entry"},
			{name: "upstream_length", dim: units.Length, def: "0", help: "length of the same channels before this segment"},
		},
		parse: parseChannel,
		ends: []endRule{{"from", "the wall", solidKinds}, {"inlet", "the inlet air", airwayKinds},
			{"to", "the outlet air", []NodeKind{Air}}},
	})
}

// Channel is forced convection in channels; the link runs from the wall to
// the outlet air node, with the inlet as a third node.
type Channel struct {
	MassFlow float64 // kg/s (at t = 0)
	Profile  Profile // the mass flow in time, nil when constant
	Geometry elements.ChannelGeometry
	Options  duct.Options
	Upstream float64 // length of the same channels before this segment, m
}

func (c *Channel) flowProfile() Profile { return c.Profile }

func (c *Channel) air(l *LinkSpec) (string, string, float64) { return l.Others[0], l.To, c.MassFlow }

func (c *Channel) element(e linkEnv) (elements.Element, error) {
	return &elements.Channel{Wall: e.from, Inlet: e.others[0], Outlet: e.to, Flow: e.givenFlowProfile(c.MassFlow, c.Profile),
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
	c.MassFlow, c.Profile, ok = massFlowProfile(o, m)
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
