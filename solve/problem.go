package solve

import "github.com/heatgraph/heatgraph/sparse"

// Problem is a system of nonlinear equations F(x) = 0 with a sparse Jacobian.
type Problem interface {
	// Size returns the number of unknowns.
	Size() int
	// Jacobian returns a new matrix with the Jacobian's sparsity pattern.
	Jacobian() *sparse.Matrix
	// Evaluate sets f = F(x) and, when jac is not nil, fills jac with
	// ∂F/∂x (jac has the pattern from Jacobian; Evaluate must zero it
	// first). It returns the scale against which the residual is judged at
	// x, which must be positive: for a thermal network, the heat moving
	// through it (W). It returns an error when x is outside the problem's
	// domain (a temperature at or below absolute zero, say); the solver
	// then shortens its step.
	Evaluate(x, f []float64, jac *sparse.Matrix) (scale float64, err error)
}
