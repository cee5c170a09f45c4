package solve

import "github.com/heatgraph/heatgraph/sparse"

// Problem is a system of nonlinear equations F(x) = 0 with a sparse
// Jacobian. Its unknowns may be of several kinds (temperatures, pressures,
// mass flows ...); each unknown i has a kind, and the equation of the same
// index i is judged with that kind's settings.
type Problem interface {
	// Size returns the number of unknowns, which is also the number of
	// equations.
	Size() int
	// Kinds describes the kinds of unknowns; KindOf(i) indexes it.
	Kinds() []Kind
	// KindOf returns the index in Kinds of unknown i's kind.
	KindOf(i int) int
	// Pattern returns a new matrix holding the Jacobian's sparsity
	// pattern, every value zero. Solvers call it once per problem and
	// analyse the pattern once.
	Pattern() *sparse.Matrix
	// Evaluate sets f = F(x) and, when jac is not nil, fills jac (which
	// has Pattern's pattern) with ∂F/∂x, zeroing it first. When mag is not
	// nil it sets mag[i] ≥ 0 to the magnitude of the terms that make up
	// f[i] (for a heat balance, the sum of the absolute heat flows into
	// and out of the node): equation i is judged relative to it, never
	// relative to the rest of the problem. It returns an error when x is
	// outside the problem's domain (a temperature at or below absolute
	// zero, say); the solver then shortens its step.
	Evaluate(x, f []float64, jac *sparse.Matrix, mag []float64) error
}

// Kind describes one kind of unknown and the equations paired with it, in
// the problem's own units; the solver reads nothing else about them.
type Kind struct {
	Name string // e.g. "temperature"
	Unit string // of the unknown, e.g. "K"
	// Equation names the equations of this kind ("energy balance") and
	// EquationUnit their unit ("W").
	Equation, EquationUnit string
	// Scale is the size of a meaningful change of the unknown (1 K, say).
	// Settings.StepTolerance and Settings.PseudoStep are relative to it.
	Scale float64
	// MaxStep is the largest change of one unknown in one iteration, in
	// its unit; longer steps are scaled down. Zero means no limit.
	MaxStep float64
	// ResidualFloor is an absolute residual, in the equation's unit, that
	// counts as zero whatever the equation's magnitude: it only matters
	// for equations whose terms are all (nearly) zero.
	ResidualFloor float64
}

// Namer is implemented by problems that can name their unknowns for
// messages ("node cpu").
type Namer interface {
	Name(i int) string
}

// Capacitive is implemented by problems with stored quantities (heat in a
// thermal network). Capacity sets c[i] ≥ 0 to ∂E_i/∂x_i at x, the
// capacity of unknown i in equation-unit·seconds per unknown-unit (J/K),
// zero where nothing is stored. Pseudo-transient steps then follow the
// real capacities.
type Capacitive interface {
	Capacity(x, c []float64)
}
