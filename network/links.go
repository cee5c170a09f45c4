package network

import (
	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/network/units"
)

// LinkParams holds the kind-specific values of a link, in SI units.
type LinkParams interface {
	// element builds the link's element.
	element(e linkEnv) (elements.Element, error)
}

// linkEnv is what link parameters need to become an element.
type linkEnv struct {
	from, to int   // node indices of the link's ends
	others   []int // node indices of its other ends (a channel's inlet), in the order of linkKind.ends
	env      *elements.Env
	net      *Network
	link     string // the link's id, naming its variables
}

// givenFlow adds a mass-flow variable of the link, held at mdot kg/s, and
// returns it.
func (e linkEnv) givenFlow(mdot float64) int {
	return e.net.addVar(Variable{Kind: MassFlowVar, Owner: e.link, Given: true, Value: mdot})
}

// linkKind describes one kind of link in the model file; see
// registerLinkKind.
type linkKind struct {
	name      string
	order     int // place in listings
	summary   string
	help      string    // what it models and how, a paragraph
	sources   []string  // published sources of its physics
	example   string    // a YAML list item
	keys      []keySpec // keys besides id, kind, from, to, note
	defaultTo string    // node used when "to" is omitted; "" makes it required
	parse     func(o *object, m *Model) LinkParams
	// ends says which kinds of node each end may be; ends other than
	// from and to are further nodes the link joins.
	ends []endRule
}

// endRule restricts one end of a link to some kinds of node.
type endRule struct {
	key   string     // "from", "to", or a further end such as "inlet"
	role  string     // what the node is to the link, for messages
	kinds []NodeKind // the kinds allowed
}

var (
	solidKinds   = []NodeKind{Solid, Fixed, Junction}
	airwayKinds  = []NodeKind{Air, Fixed}
	surfaceRules = []endRule{{"from", "the surface", solidKinds}, {"to", "the air", airwayKinds}}
	solidRules   = []endRule{{"from", "each end", solidKinds}, {"to", "each end", solidKinds}}
)

// commonLinkKeys are accepted by every kind.
var commonLinkKeys = []string{"id", "kind", "from", "to", "note"}

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

// Lumped is a resistance or conductance given directly.
type Lumped struct {
	Conductance float64 // W/K
}

func (l *Lumped) element(e linkEnv) (elements.Element, error) {
	return &elements.Conductance{A: e.from, B: e.to, G: l.Conductance}, nil
}

func parseLumped(o *object, _ *Model) LinkParams {
	switch o.oneOf("a resistance such as 0.8 K/W or a conductance such as 2 W/K", "resistance", "conductance") {
	case "resistance":
		if r, ok := o.positive("resistance", units.ThermalResistance, true); ok {
			return &Lumped{Conductance: 1 / r}
		}
	case "conductance":
		if g, ok := o.positive("conductance", units.Conductance, true); ok {
			return &Lumped{Conductance: g}
		}
	}
	return nil
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
