package elements

// Stamper receives an element's contribution to the energy balance of its
// nodes. Node indices are those of the assembled network; the stamper decides
// which of them are unknowns.
type Stamper interface {
	// AddHeat adds q watts flowing into node n.
	AddHeat(n int, q float64)
	// AddDeriv adds d = ∂q_n/∂T_m, the change of the heat flowing into node
	// n per kelvin of node m, in W/K.
	AddDeriv(n, m int, d float64)
}

// Env holds the conditions shared by every element.
type Env struct {
	Pressure float64 // ambient absolute pressure, Pa; air inside the box is at this pressure too
	Gravity  float64 // gravitational acceleration, m/s²
	// AmbientT is the ambient temperature, K: the reference of the enthalpy
	// that air streams carry, so that a stream's reported heat is what it
	// carries above ambient.
	AmbientT float64
	// AirCp is the specific heat of air used for the enthalpy of air
	// streams, J/(kg K), one value for the whole network so that energy is
	// conserved exactly where streams meet. Air's cp changes by less than
	// 1 % between 250 and 400 K (Incropera et al., Table A.4), so the
	// network takes it at the ambient temperature.
	AirCp float64
}

// StandardGravity is the standard acceleration of gravity, m/s² (CGPM 1901,
// as used by the U.S. Standard Atmosphere 1976).
const StandardGravity = 9.80665

// State is what an element reads when it stamps or reports.
type State struct {
	T   []float64 // temperature of every node, K
	Env *Env
}

// Element is a part of the network that moves heat between its nodes, or
// puts heat into them. Stamp must add, for every node the element touches,
// the heat flowing into that node and its exact derivatives with respect to
// the temperatures of the element's nodes.
type Element interface {
	// Nodes returns the indices of the nodes the element touches. The
	// Jacobian pattern is built from it, so Stamp may only call AddDeriv
	// for pairs of these nodes.
	Nodes() []int
	// Stamp adds the element's heat flows and their derivatives at s.
	Stamp(s *State, out Stamper)
}

// Detail is one quantity an element reports at a solution, such as a heat
// transfer coefficient or the flow regime.
type Detail struct {
	Name  string  // short name, e.g. "h", "Re", "regime"
	Value float64 // numeric value in SI units; unused when Text is set
	Unit  string  // SI unit of Value, "" for dimensionless
	Text  string  // a non-numeric detail, e.g. "laminar"
}

// Report describes an element at a solution: derived quantities a reviewer
// can check by hand, and warnings such as a correlation used outside its
// published range.
type Report struct {
	Details  []Detail
	Warnings []string
}

// Reporter is implemented by elements that have more to say than their heat
// flows.
type Reporter interface {
	Report(s *State) Report
}

// Source is implemented by elements that put heat into the network rather
// than move it; the energy balance counts them as heat in.
type Source interface {
	Element
	// Power returns the heat the element puts in at s, W.
	Power(s *State) float64
}

// stampPair stamps a heat flow q from node a to node b, with its
// derivatives dqa = ∂q/∂T_a and dqb = ∂q/∂T_b: every two-node link is this.
func stampPair(out Stamper, a, b int, q, dqa, dqb float64) {
	out.AddHeat(a, -q)
	out.AddHeat(b, q)
	out.AddDeriv(a, a, -dqa)
	out.AddDeriv(a, b, -dqb)
	out.AddDeriv(b, a, dqa)
	out.AddDeriv(b, b, dqb)
}
