package study

import (
	"fmt"

	"github.com/heatgraph/heatgraph/sparse"
	"gonum.org/v1/gonum/mat"
)

// denseLU is an LU factorization of a dense copy of a sparse matrix, for
// solves with the matrix and with its transpose. Its cost grows as n³, as
// the Newton solver's dense LU does; a sparse factorization with transpose
// solves can replace it behind the same two functions.
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
