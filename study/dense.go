package study

import (
	"fmt"

	"github.com/heatgraph/heatgraph/sparse"
	"gonum.org/v1/gonum/mat"
)

// factored is a factorization of the Jacobian for solves with it and with
// its transpose.
type factored interface {
	solve(b []float64, trans bool) ([]float64, error)
}

// denseBelow is the size under which the Jacobian is factorized densely,
// with its condition number checked; larger ones (meshed plates) take the
// sparse LU, whose cost grows with the fill rather than as n³.
const denseBelow = 500

// factorize factorizes a for solves with it and its transpose.
func factorize(a *sparse.Matrix) (factored, error) {
	if a.N < denseBelow {
		return factorDense(a)
	}
	return factorSparse(a)
}

// sparseLU holds sparse LU factorizations of a matrix and, once a
// transpose solve asks for it, of its transpose.
type sparseLU struct {
	a, at *sparse.LU
	m     *sparse.Matrix
}

func factorSparse(a *sparse.Matrix) (*sparseLU, error) {
	f := &sparseLU{m: a.Clone()}
	lu, err := luOf(f.m)
	if err != nil {
		return nil, err
	}
	f.a = lu
	return f, nil
}

func luOf(a *sparse.Matrix) (*sparse.LU, error) {
	lu := sparse.NewLU()
	if err := lu.Analyse(a); err != nil {
		return nil, err
	}
	if err := lu.Factorize(a); err != nil {
		return nil, fmt.Errorf("the Jacobian at the solution cannot be factorized: %w", err)
	}
	return lu, nil
}

func (f *sparseLU) solve(b []float64, trans bool) ([]float64, error) {
	lu := f.a
	if trans {
		if f.at == nil {
			at, err := luOf(f.m.Transpose())
			if err != nil {
				return nil, err
			}
			f.at = at
		}
		lu = f.at
	}
	x := make([]float64, len(b))
	if err := lu.Solve(x, append([]float64(nil), b...)); err != nil {
		return nil, err
	}
	return x, nil
}

// denseLU is an LU factorization of a dense copy of a sparse matrix, for
// solves with the matrix and with its transpose; small problems only.
type denseLU struct {
	n  int
	lu mat.LU
}

// factorDense factorizes a dense copy of a.
func factorDense(a *sparse.Matrix) (*denseLU, error) {
	n := a.N
	d := mat.NewDense(max(n, 1), max(n, 1), nil)
	for i := 0; i < n; i++ {
		for k := a.RowPtr[i]; k < a.RowPtr[i+1]; k++ {
			d.Set(i, a.Col[k], a.Val[k])
		}
	}
	f := &denseLU{n: n}
	f.lu.Factorize(d)
	if c := f.lu.Cond(); !(c < 1e16) {
		return nil, fmt.Errorf("the Jacobian at the solution is singular to working precision (condition number %.3g)", c)
	}
	return f, nil
}

// solve returns x with A·x = b, or Aᵀ·x = b when trans is set.
func (f *denseLU) solve(b []float64, trans bool) ([]float64, error) {
	x := make([]float64, f.n)
	if f.n == 0 {
		return x, nil
	}
	xv := mat.NewVecDense(f.n, x)
	if err := f.lu.SolveVecTo(xv, trans, mat.NewVecDense(f.n, append([]float64(nil), b...))); err != nil {
		return nil, err
	}
	return x, nil
}
