package elements

import "github.com/heatgraph/heatgraph/internal/bigmem"

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

// State is what an element reads when it evaluates or reports: every
// quantity of the network in one vector, indexed by the variables the
// element was built with. A node's temperature (K), an air node's pressure
// (Pa above ambient) and a flow branch's mass flow (kg/s) are all
// variables; which of them are unknowns and which are given is the
// network's business, not the element's.
type State struct {
	X    []float64 // every variable's value, SI
	Time float64   // s since the start of a run; 0 in a steady solve
	Env  *Env
}

// Element is a part of the network: a link that moves heat (or air)
// between nodes, a source that puts heat in, a store that holds heat.
//
// Each equation of the network is paired with one variable: a node's heat
// balance (W) with its temperature, an air node's mass balance (kg/s) with
// its pressure, a flow branch's momentum balance (Pa) with its mass flow.
// An element names the equations it adds to (Rows) and the variables it
// reads (Vars), once, when the network is assembled; the network then
// resolves where each of its Jacobian entries lives, and Eval only writes
// values.
type Element interface {
	// Rows returns the equations the element adds to, by the variable
	// each is paired with.
	Rows() []int
	// Vars returns the variables the element reads: its Jacobian
	// columns. Eval may only write derivatives with respect to these.
	Vars() []int
	// Eval adds, for each of its rows r, the flow into that equation
	// (heat into a node, W, say) to l.R[r] and, when l wants them, the
	// exact derivatives with respect to each of its variables v with
	// l.D(r, v, ∂/∂x_v). Indices r and v are positions in Rows and Vars.
	Eval(s *State, l *Local)
}

// Patterned is implemented by elements with many rows whose derivatives
// are sparse, such as a meshed plate of a million cells: instead of the
// dense block of rows × vars, the element names its Jacobian entries once,
// and Eval (and Stored, for a Storage) adds the derivative of entry k
// with l.E(k, d), never by writing l.J itself. Entry k is row ER[k] of
// Rows, var EV[k] of Vars; several entries may name the same position, and
// their values add up. With l.Slot set, E adds straight into the whole
// Jacobian; entries of different rows may then be added from different
// goroutines, entries of one row only from one at a time.
type Patterned interface {
	Element
	// Entries returns the positions of the entries, in Rows and Vars.
	Entries() (er, ev []int32)
}

// EntryLister is implemented by Patterned elements that can list their
// entries without storing them (a meshed plate has tens of millions):
// EachEntry calls put with ER[k] and EV[k] of every entry k, in order, the
// same as Entries returns.
type EntryLister interface {
	EachEntry(put func(r, v int32))
}

// Local is an element's private view of the residual and the Jacobian:
// R[r] for its rows and a dense block of derivatives, rows by vars (or,
// for a Patterned element, one value per entry).
type Local struct {
	R  []float64 // one per row
	J  []float64 // rows × vars, row-major (entries, if Patterned); nil when no derivatives are wanted
	NV int       // number of vars
	// Given, when not nil, marks the vars that are given rather than
	// unknown: their derivatives are not used, and an element may skip
	// the work of computing them. The equation paired with a given var is
	// not solved either, so an element whose Rows and Vars are the same
	// variables may skip the derivatives of that row too.
	Given []bool
	// Slot, when not nil, sends a Patterned element's derivatives
	// straight into a Jacobian whose values are J (shared with the other
	// elements, and not zeroed for this one): entry k adds to
	// J[Slot[k]], or nowhere when Slot[k] < 0.
	Slot []int32
}

// E adds d to the derivative of a Patterned element's entry k.
func (l *Local) E(k int, d float64) {
	if l.Slot == nil {
		l.J[k] += d
		return
	}
	if s := l.Slot[k]; s >= 0 {
		l.J[s] += d
	}
}

// NewPatternedLocal returns a Local for a Patterned element of nr rows, nv
// vars and ne entries, with derivatives when jac is true.
func NewPatternedLocal(nr, nv, ne int, jac bool) *Local {
	l := &Local{R: bigmem.Make[float64](nr), NV: nv}
	if jac {
		l.J = bigmem.Make[float64](ne)
	}
	return l
}

// ResetEntries zeroes the local values and sizes them for a Patterned
// element of nr rows, nv vars and ne entries, reusing the storage.
func (l *Local) ResetEntries(nr, nv, ne int, jac bool) {
	if cap(l.R) < nr {
		l.R = bigmem.Make[float64](nr)
	}
	l.R = l.R[:nr]
	clear(l.R)
	l.NV = nv
	l.Given = nil
	l.Slot = nil
	if !jac {
		l.J = nil
		return
	}
	if cap(l.J) < ne {
		l.J = bigmem.Make[float64](ne)
	}
	l.J = l.J[:ne]
	clear(l.J)
}

// Needs reports whether the derivatives with respect to var v are used.
func (l *Local) Needs(v int) bool { return l.J != nil && (l.Given == nil || !l.Given[v]) }

// NewLocal returns a Local for an element of nr rows and nv vars, with
// derivatives when jac is true.
func NewLocal(nr, nv int, jac bool) *Local {
	l := &Local{R: bigmem.Make[float64](nr), NV: nv}
	if jac {
		l.J = bigmem.Make[float64](nr * nv)
	}
	return l
}

// Reset zeroes the local values and sizes them for nr rows and nv vars,
// reusing the storage.
func (l *Local) Reset(nr, nv int, jac bool) {
	l.ResetEntries(nr, nv, nr*nv, jac)
}

// Add adds v to row r.
func (l *Local) Add(r int, v float64) { l.R[r] += v }

// D adds the derivative d of row r with respect to var v; it does nothing
// when derivatives are not wanted.
func (l *Local) D(r, v int, d float64) {
	if l.J != nil {
		l.J[r*l.NV+v] += d
	}
}

// WantsJacobian reports whether derivatives are wanted, so that an element
// may skip work that only they need.
func (l *Local) WantsJacobian() bool { return l.J != nil }

// Storage is implemented by elements that hold a stored quantity: the heat
// in a node's thermal mass. Stored adds, for each of the element's rows,
// the stored energy E (J, relative to 0 K) to l.R and its derivatives
// ∂E/∂x (the heat capacity, J/K) with l.D. A time integrator wraps the
// network as dE/dt = flows; no element knows the method.
type Storage interface {
	Stored(s *State, l *Local)
}

// Source is implemented by elements that put heat into the network rather
// than move it; the energy balance counts them as heat in.
type Source interface {
	Element
	// Power returns the heat the element puts in at s, W.
	Power(s *State) float64
}

// Path is one way heat goes through an element, for reports, diagrams and
// the heat-path breakdown: Heat watts from node From to node To (positive
// that way). Carried marks heat carried by moving air (enthalpy), as
// opposed to heat that crosses a solid, a gap or a surface.
type Path struct {
	From, To int // node variables
	Heat     float64
	Carried  bool
}

// PathReporter is implemented by elements whose heat paths are not simply
// "from their first row to their second". An element without it that has
// two rows has one path, from row 0 to row 1, carrying what leaves row 0.
type PathReporter interface {
	Paths(s *State) []Path
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

// stampPair stamps a heat flow q from row/var 0 to row/var 1 of l, with its
// derivatives dqa = ∂q/∂x₀ and dqb = ∂q/∂x₁: every two-node link is this.
func stampPair(l *Local, q, dqa, dqb float64) {
	l.R[0] -= q
	l.R[1] += q
	if l.J != nil {
		l.J[0] -= dqa
		l.J[1] -= dqb
		l.J[l.NV] += dqa
		l.J[l.NV+1] += dqb
	}
}
