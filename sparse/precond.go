package sparse

import (
	"fmt"
	"math"
)

// Preconditioner approximates the inverse of an operator sign·A for the
// iterative solvers: CG works on −A (sign −1, positive definite for a
// thermal Jacobian), BiCGStab on A itself (sign +1).
type Preconditioner interface {
	// Setup builds the preconditioner from a's current values.
	Setup(a *Matrix, sign float64) error
	// Apply sets z to the approximate solution of (sign·A)·z = r.
	Apply(z, r []float64)
}

// Jacobi is the diagonal preconditioner.
type Jacobi struct {
	inv []float64
}

// Setup takes the reciprocal diagonal; a zero diagonal is ErrSingular.
func (p *Jacobi) Setup(a *Matrix, sign float64) error {
	if cap(p.inv) < a.N {
		p.inv = make([]float64, a.N)
	}
	p.inv = p.inv[:a.N]
	for i := 0; i < a.N; i++ {
		d := sign * a.At(i, i)
		if d == 0 || math.IsNaN(d) {
			return fmt.Errorf("%w: zero diagonal at row %d", ErrSingular, i)
		}
		p.inv[i] = 1 / d
	}
	return nil
}

// Apply sets z = D⁻¹·r.
func (p *Jacobi) Apply(z, r []float64) {
	for i, v := range r {
		z[i] = v * p.inv[i]
	}
}

// ILU0 is the incomplete LU factorisation with no fill, ILU(0): L and U
// keep the pattern of A (Saad, Iterative Methods for Sparse Linear
// Systems, 2nd ed., SIAM 2003, ch. 10, the IKJ variant). On a
// symmetric matrix its factors are those of the incomplete Cholesky
// factorisation IC(0), U = D·Lᵀ, and it exists for every M-matrix
// (Meijerink & van der Vorst, Math. Comp. 31, 1977), which −J of a
// thermal network is. It works in the natural order of A.
type ILU0 struct {
	n      int
	rowPtr []int
	col    []int
	val    []float64 // L below the diagonal (unit diagonal implied), U on and above
	diag   []int
	iw     []int
}

// Setup computes the factors; a zero pivot is ErrSingular.
func (p *ILU0) Setup(a *Matrix, sign float64) error {
	n := a.N
	p.n, p.rowPtr, p.col = n, a.RowPtr, a.Col
	if cap(p.val) < len(a.Val) {
		p.val = make([]float64, len(a.Val))
	}
	p.val = p.val[:len(a.Val)]
	for k, v := range a.Val {
		p.val[k] = sign * v
	}
	if len(p.diag) != n {
		p.diag = make([]int, n)
		p.iw = make([]int, n)
		for i := range p.iw {
			p.iw[i] = -1
		}
	}
	scale := rowScales(a, nil)
	val := p.val
	for i := 0; i < n; i++ {
		lo, hi := a.RowPtr[i], a.RowPtr[i+1]
		p.diag[i] = -1
		for k := lo; k < hi; k++ {
			p.iw[a.Col[k]] = k
			if a.Col[k] == i {
				p.diag[i] = k
			}
		}
		for k := lo; k < hi; k++ {
			c := a.Col[k]
			if c >= i {
				break
			}
			val[k] /= val[p.diag[c]]
			lik := val[k]
			for q := p.diag[c] + 1; q < a.RowPtr[c+1]; q++ {
				if w := p.iw[a.Col[q]]; w >= 0 {
					val[w] -= lik * val[q]
				}
			}
		}
		for k := lo; k < hi; k++ {
			p.iw[a.Col[k]] = -1
		}
		if p.diag[i] < 0 || !(math.Abs(val[p.diag[i]]) > DefaultPivotTol*scale[i]) {
			return fmt.Errorf("%w: incomplete factorisation breaks down at row %d", ErrSingular, i)
		}
	}
	return nil
}

// Apply solves L·U·z = r.
func (p *ILU0) Apply(z, r []float64) {
	for i := 0; i < p.n; i++ {
		t := r[i]
		for k := p.rowPtr[i]; k < p.diag[i]; k++ {
			t -= p.val[k] * z[p.col[k]]
		}
		z[i] = t
	}
	for i := p.n - 1; i >= 0; i-- {
		t := z[i]
		d := p.diag[i]
		for k := d + 1; k < p.rowPtr[i+1]; k++ {
			t -= p.val[k] * z[p.col[k]]
		}
		z[i] = t / p.val[d]
	}
}
