package solve

import (
	"errors"
	"fmt"

	"github.com/heatgraph/heatgraph/sparse"
	"gonum.org/v1/gonum/mat"
)

// ErrSingular is returned by a LinearSolver whose matrix is singular or too
// ill-conditioned to solve. It is the sparse package's, so that every
// solver reports singularity the same way.
var ErrSingular = sparse.ErrSingular

// LinearSolver solves A·x = b for the Newton step, in three phases, so that
// work that depends only on the sparsity pattern is done once per problem:
// Analyse (ordering, symbolic factorization) once, Factorize for each new
// set of values, Solve for each right-hand side.
type LinearSolver interface {
	// Analyse prepares for matrices of a's pattern. It is called once,
	// before the first Factorize; the values of a are not used.
	Analyse(a *sparse.Matrix) error
	// Factorize prepares to solve with a's current values. It must not
	// keep a reference that a later change of a's values would corrupt.
	// A singular matrix gives an error wrapping ErrSingular.
	Factorize(a *sparse.Matrix) error
	// Solve sets x to the solution of A·x = b for the last factorized A.
	Solve(x, b []float64) error
}

// DenseLimit is the most unknowns the dense LU takes: its memory grows as n²
// and its time as n³ (8 bytes × 5000² = 200 MB).
const DenseLimit = 5000

// ErrTooLarge is returned when a problem is too large for a solver.
var ErrTooLarge = errors.New("problem too large for the linear solver")

// DenseBelow is the size under which Auto picks the dense LU: below it the
// dense factorization is as fast as the sparse one and its condition
// estimate judges singularity most reliably.
const DenseBelow = 200

// Auto returns the linear solver for a problem of n unknowns: the dense LU
// below DenseBelow unknowns, else the sparse family's own choice (sparse
// Cholesky or LU with a fill-reducing ordering, or a preconditioned
// iterative solver for large three-dimensional meshes; see sparse.Auto).
func Auto(n int) LinearSolver {
	if n < DenseBelow {
		return NewDenseLU()
	}
	return &SparseAuto{}
}

// SparseAuto is the sparse family behind the LinearSolver interface: its
// Analyse orders and analyses the pattern once, and sparse.Auto chooses a
// direct or an iterative solver by the work the ordering predicts.
type SparseAuto struct {
	s   *sparse.AutoSolver
	tol float64
}

// Analyse orders the pattern and chooses the solver.
func (a *SparseAuto) Analyse(m *sparse.Matrix) error {
	a.s = sparse.Auto(m)
	if a.tol > 0 {
		a.s.SetTolerance(a.tol)
	}
	return nil
}

// Tolerance returns the tolerance last set, 0 for the solvers' default.
func (a *SparseAuto) Tolerance() float64 { return a.tol }

// SetTolerance sets the relative residual ‖b − A·x‖₂/‖b‖₂ that the next
// solves must reach when the chosen solver iterates (a direct one solves
// exactly; 0 means the sparse solvers' default); Newton sets it for each
// of its steps (inexact Newton) and gives the old one back at its end.
func (a *SparseAuto) SetTolerance(rel float64) {
	a.tol = rel
	if a.s != nil {
		a.s.SetTolerance(rel)
	}
}

// Factorize factorizes m's values (or sets up the preconditioner).
func (a *SparseAuto) Factorize(m *sparse.Matrix) error {
	if a.s == nil {
		if err := a.Analyse(m); err != nil {
			return err
		}
	}
	return a.s.Factorize(m)
}

// Solve solves with the last factorization.
func (a *SparseAuto) Solve(x, b []float64) error { return a.s.Solve(x, b) }

// Chosen names the solver the sparse family chose, for reports.
func (a *SparseAuto) Chosen() string {
	if a.s == nil {
		return "sparse (not analysed)"
	}
	return a.s.Kind()
}

// DenseLU solves with a dense LU factorization with partial pivoting
// (gonum's mat.LU). Its cost grows as n³: it suits networks up to a few
// thousand unknowns, and refuses more than DenseLimit.
type DenseLU struct {
	// MaxCondition is the largest estimated condition number accepted; a
	// larger one is reported as ErrSingular. Default 1e14. The matrices
	// Newton passes are diagonally scaled, so this judges the network, not
	// the spread of its conductances.
	MaxCondition float64

	dense *mat.Dense
	lu    mat.LU
}

// NewDenseLU returns a dense LU solver with default settings.
func NewDenseLU() *DenseLU { return &DenseLU{MaxCondition: 1e14} }

// Analyse allocates the dense matrix, after checking its size.
func (d *DenseLU) Analyse(a *sparse.Matrix) error {
	if a.N > DenseLimit {
		return fmt.Errorf("%w: the dense LU takes at most %d unknowns, this problem has %d", ErrTooLarge, DenseLimit, a.N)
	}
	d.dense = mat.NewDense(max(a.N, 1), max(a.N, 1), nil)
	return nil
}

// Factorize copies a into the dense matrix and factorizes it.
func (d *DenseLU) Factorize(a *sparse.Matrix) error {
	n := a.N
	if d.dense == nil || d.dense.RawMatrix().Rows != n {
		if err := d.Analyse(a); err != nil {
			return err
		}
	} else {
		d.dense.Zero()
	}
	raw := d.dense.RawMatrix()
	for i := 0; i < n; i++ {
		row := raw.Data[i*raw.Stride : i*raw.Stride+n]
		for k := a.RowPtr[i]; k < a.RowPtr[i+1]; k++ {
			row[a.Col[k]] = a.Val[k]
		}
	}
	d.lu.Factorize(d.dense)
	if c := d.lu.Cond(); !(c <= d.MaxCondition) {
		return fmt.Errorf("%w (condition number %.3g)", ErrSingular, c)
	}
	return nil
}

// Solve solves with the factorization from the last Factorize.
func (d *DenseLU) Solve(x, b []float64) error {
	xv := mat.NewVecDense(len(x), x)
	if err := d.lu.SolveVecTo(xv, false, mat.NewVecDense(len(b), b)); err != nil {
		var c mat.Condition
		if errors.As(err, &c) {
			return fmt.Errorf("%w (condition number %.3g)", ErrSingular, float64(c))
		}
		return err
	}
	return nil
}

// Stats returns the iterations and relative residual of the last solve
// when the chosen solver iterates, zeros for a direct one.
func (a *SparseAuto) Stats() (int, float64) {
	if a.s == nil {
		return 0, 0
	}
	return a.s.Stats()
}
