package solve

import (
	"errors"
	"fmt"

	"github.com/heatgraph/heatgraph/sparse"
	"gonum.org/v1/gonum/mat"
)

// ErrSingular is returned by a LinearSolver whose matrix is singular or too
// ill-conditioned to solve.
var ErrSingular = errors.New("matrix is singular to working precision")

// LinearSolver solves A·x = b for the Newton step.
type LinearSolver interface {
	// Factorize prepares to solve with a. It must not keep a reference
	// that a later change of a would corrupt.
	Factorize(a *sparse.Matrix) error
	// Solve sets x to the solution of A·x = b for the last factorized A.
	Solve(x, b []float64) error
}

// DenseLU solves with a dense LU factorization with partial pivoting
// (gonum's mat.LU). Its cost grows as n³: it suits networks up to a few
// thousand nodes.
type DenseLU struct {
	// MaxCondition is the largest estimated condition number accepted; a
	// larger one is reported as ErrSingular. Default 1e14.
	MaxCondition float64

	dense *mat.Dense
	lu    mat.LU
}

// NewDenseLU returns a dense LU solver with default settings.
func NewDenseLU() *DenseLU { return &DenseLU{MaxCondition: 1e14} }

// Factorize copies a into a dense matrix and factorizes it.
func (d *DenseLU) Factorize(a *sparse.Matrix) error {
	n := a.N
	if d.dense == nil || d.dense.RawMatrix().Rows != n {
		d.dense = mat.NewDense(n, n, nil)
	} else {
		d.dense.Zero()
	}
	for i := 0; i < n; i++ {
		for k := a.RowPtr[i]; k < a.RowPtr[i+1]; k++ {
			d.dense.Set(i, a.Col[k], a.Val[k])
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
