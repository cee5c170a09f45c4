package solve

// StopReason says why the Newton iteration ended.
type StopReason int

// The reasons a solve ends. Only Converged means the state is a solution.
const (
	// Converged: every equation's residual and every component of the
	// full Newton step are within tolerance.
	Converged StopReason = iota
	// MaxIterations: the iteration limit was reached first.
	MaxIterations
	// LineSearchFailed: no step along the Newton direction, however short,
	// reduced the residual; the problem may have no solution nearby, or its
	// Jacobian may be wrong.
	LineSearchFailed
	// SingularJacobian: the linear system could not be solved; usually part
	// of the network has no path for its heat (Result.Floating names it).
	SingularJacobian
	// InvalidStart: the problem could not be evaluated at the initial
	// state.
	InvalidStart
	// NotFinite: the residual or the step became NaN or infinite.
	NotFinite
	// LinearSolverFailed: the linear solver failed for a reason other than
	// a singular matrix (a problem too large for it, say).
	LinearSolverFailed
	// LeftDomain: every step along the Newton direction left the
	// problem's domain (a temperature at or below absolute zero, say, as a
	// heat input that removes more heat than the network can bring to a
	// node would demand); Result.Err says where.
	LeftDomain
)

var reasonNames = [...]string{
	Converged:          "converged",
	MaxIterations:      "iteration limit reached",
	LineSearchFailed:   "line search could not reduce the residual",
	SingularJacobian:   "singular Jacobian",
	InvalidStart:       "cannot evaluate the initial state",
	NotFinite:          "residual or step not finite",
	LinearSolverFailed: "linear solver failed",
	LeftDomain:         "every step left the physical domain",
}

// String describes the reason in a few words.
func (r StopReason) String() string {
	if r >= 0 && int(r) < len(reasonNames) {
		return reasonNames[r]
	}
	return "unknown stop reason"
}

// Converged reports whether r means the state is a solution.
func (r StopReason) Converged() bool { return r == Converged }
