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
			"Stephan for tubes; Hausen with development: thermal; Shah & London with development: full), " +
			"turbulent Gnielinski or Dittus–Boelter, and between Re 2300 and 10⁴ Gnielinski's " +
			"interpolation or the turbulent correlation (transition key); friction from Churchill's " +
			"all-regime equation; fins through their efficiency; only the heated walls take heat. The " +
			"report gives every number behind h and the pressure drop.",
		sources: []string{
			"Incropera et al., Fundamentals of Heat and Mass Transfer, eq. 8.42b (outlet relation)",
			"Shah & London, Laminar Flow Forced Convection in Ducts, 1978",
			"Muzychka & Yovanovich, J. Heat Transfer 126, 2004 (combined entry)",
			"Gnielinski, Int. Chem. Eng. 16, 1976; Petukhov 1970 (friction)",
			"Gnielinski, VDI Heat Atlas 2010, G1; Gnielinski, Int. J. Heat Mass Transfer 63, 2013 (transition range)",
			"Dittus & Boelter, 1930",
			"Kays & London, Compact Heat Exchangers (entry and exit losses)",
			"Churchill, Chem. Eng. 84, 1977 (friction factor)",
		},
		example: "{id: fins, kind: channel, from: base, inlet: ambient, to: air-out, flow: 15 CFM, length: 100 mm,\n" +
			"   fin_count: 14, fin_thickness: 1.2 mm, fin_height: 30 mm, base_width: 80 mm, material: aluminium-6063}",
		keys: []keySpec{
			{name: "inlet", what: "node", need: "required", help: "the air or fixed node the air comes from"},
			{name: "flow", dim: units.VolumeFlow, need: "one of flow, mass_flow", help: "volume flow of ambient air, constant or a profile in time; or solved: the flow the air path's fans and losses give"},
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
			{name: "transition", what: "word", def: "interpolate", help: "for 2300 < Re < 10⁴: interpolate (Gnielinski, VDI Heat Atlas G1: laminar at 2300 to turbulent at 10⁴), interpolate-4000 (Gnielinski 2013: to turbulent at 4000) or turbulent (the turbulent correlation from Re 2300, a hand-calculation practice)"},
			{name: "development", what: "word", def: "combined", help: "combined (velocity and temperature develop from the entry), thermal (velocity developed, temperature developing) or full (fully developed throughout)"},
			{name: "laminar_entry", what: "word", help: "older name for development: combined or thermal"},
			{name: "heated_walls", what: "word", def: "all", help: "with shape: rectangular: all, two-long (the two long walls, the short ones adiabatic) or one-long"},
			{name: "upstream_length", dim: units.Length, def: "0", help: "length of the same channels before this segment (it then takes no entry loss)"},
			{name: "downstream_length", dim: units.Length, def: "0", help: "length of the same channels after this segment (it then takes no exit loss)"},
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
	Solved   bool    // flow: solved: the flow is an unknown, with the channels' drop as its law (airflow.go)
	Geometry elements.ChannelGeometry
	Options  duct.Options
	Upstream float64 // length of the same channels before this segment, m
	// Downstream is the length of the same channels after this segment, m.
	Downstream float64
}

func (c *Channel) flowProfile() Profile { return c.Profile }

func (c *Channel) air(l *LinkSpec) (string, string, float64) { return l.Others[0], l.To, c.MassFlow }

func (c *Channel) element(e linkEnv) (elements.Element, error) {
	if c.Solved {
		return c.solvedElement(e)
	}
	f := e.givenFlowProfile(c.MassFlow, c.Profile)
	el := &elements.Channel{Wall: e.from, Inlet: e.others[0], Outlet: e.to, Flow: f,
		Geometry: c.Geometry, Options: c.Options, Upstream: c.Upstream, Downstream: c.Downstream}
	// A given flow between nodes of a solved air path adds its mass to
	// their balances (airflow.go).
	return e.carried(el, e.others[0], e.to, f), nil
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
	developments    = []string{"combined", "thermal", "full"}
	transitions     = []string{"interpolate", "interpolate-4000", "turbulent"}
	heatedWalls     = map[string]duct.Walls{"all": duct.AllWalls, "two-long": duct.TwoLongWalls, "one-long": duct.OneLongWall}
)

func parseChannel(o *object, m *Model) LinkParams {
	c := &Channel{}
	var ok bool
	if c.Solved = solvedFlow(o); c.Solved {
		ok = true
	} else {
		c.MassFlow, c.Profile, ok = massFlowProfile(o, m)
	}
	length, okL := o.positive("length", units.Length, true)
	ok = ok && okL
	switch {
	case o.has("fin_count"):
		for _, k := range []string{"shape", "width", "height", "diameter", "count", "heated_walls"} {
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
	var okU, okD bool
	c.Upstream, okU = segmentLength(o, "upstream_length", "before")
	c.Downstream, okD = segmentLength(o, "downstream_length", "after")
	okO := channelOptions(o, &c.Options)
	if !okU || !okD || !okO {
		return nil
	}
	return c
}

// segmentLength reads upstream_length or downstream_length: zero or a
// positive length of the same channels before or after this part.
func segmentLength(o *object, key, where string) (float64, bool) {
	if !o.has(key) {
		return 0, true
	}
	u, ok := o.quantity(key, units.Length)
	if !ok {
		return 0, false
	}
	if u < 0 {
		o.r.addf(o.values[key], o.field(key), "must not be negative (the length of the same channels %s this part, e.g. 60 mm)", where)
		return 0, false
	}
	return u, true
}

// channelOptions reads the correlation choices of a channel.
func channelOptions(o *object, opts *duct.Options) bool {
	turb, ok1 := o.choice("turbulent", "correlation", turbulentModels)
	trans, ok2 := o.choice("transition", "transition treatment", transitions)
	entry, ok3 := o.choice("laminar_entry", "entry model", laminarEntries)
	dev, ok4 := o.choice("development", "flow development", developments)
	if !ok1 || !ok2 || !ok3 || !ok4 {
		return false
	}
	if entry != "" && dev != "" {
		o.r.addf(o.values["laminar_entry"], o.field("laminar_entry"), "give development or its older name laminar_entry, not both")
		return false
	}
	if dev == "" {
		dev = entry
	}
	if turb == "dittus-boelter" {
		opts.Turbulent = duct.DittusBoelter
	}
	switch trans {
	case "turbulent":
		opts.Transition = duct.TransitionTurbulent
	case "interpolate-4000":
		opts.Transition = duct.TransitionInterpolate4000
	}
	switch dev {
	case "thermal":
		opts.Laminar = duct.ThermalEntry
	case "full":
		opts.Developed = true
	}
	return true
}

// walls reads heated_walls of plain rectangular channels.
func walls(o *object, shape string) (duct.Walls, bool) {
	if !o.has("heated_walls") {
		return duct.AllWalls, true
	}
	names := []string{"all", "two-long", "one-long"}
	w, ok := o.choice("heated_walls", "heated walls", names)
	if !ok {
		return duct.AllWalls, false
	}
	if shape != "rectangular" && w != "all" {
		o.r.addf(o.values["heated_walls"], o.field("heated_walls"), "only rectangular channels can be heated on some walls (a %s channel is heated all round)", shape)
		return duct.AllWalls, false
	}
	return heatedWalls[w], true
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
	heated, okW := walls(o, shape)
	okN = okN && okW
	switch shape {
	case "rectangular":
		w, ok1 := o.positive("width", units.Length, true)
		h, ok2 := o.positive("height", units.Length, true)
		return duct.Duct{Shape: duct.Rectangular, Width: w, Height: h, Length: length, Heated: heated}, n, ok1 && ok2 && okN
	case "circular":
		d, ok1 := o.positive("diameter", units.Length, true)
		return duct.Duct{Shape: duct.Circular, Diameter: d, Length: length}, n, ok1 && okN
	}
	return duct.Duct{}, 0, false
}
