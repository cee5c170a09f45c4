package sparse

import (
	"errors"
	"fmt"
)

// ErrNotDefinite is returned, wrapped with the pivot row, by Cholesky when
// −A is not positive definite (a pivot of the wrong sign), which a
// dissipative thermal network never gives but a general symmetric matrix
// may. Auto then falls back to LU.
var ErrNotDefinite = errors.New("sparse: matrix is not negative definite")

// Cholesky solves symmetric negative definite systems, as the Jacobian of
// a conduction, convection and radiation network is (J = −(M-matrix)).
//
// Sign convention: it factorises −P·A·Pᵀ = L·D·Lᵀ with L unit lower
// triangular and D diagonal and positive, so it reads A as given (negative
// diagonal) and Solve returns the solution of A·x = b itself. A pivot
// d_k ≤ PivotTol·max_j |a_kj| that is nearly zero reports ErrSingular; a
// clearly negative one reports ErrNotDefinite. Only the lower triangle of
// A (in the permuted order) is read: the values are assumed symmetric.
//
// The symbolic work (AMD ordering, elimination tree, column counts) is done
// once in Analyse; Factorize is the up-looking LDLᵀ factorisation (row k of
// L by a sparse triangular solve over the row subtree; Davis 2006, ch. 4),
// which copies the values it needs from a.
type Cholesky struct {
	// PivotTol is the relative pivot tolerance, default DefaultPivotTol.
	PivotTol float64

	sym    *Symbolic
	li     []int32
	lx     []float64
	d      []float64
	ok     bool
	y      []float64
	flag   []int
	path   []int
	stack  []int
	work   []float64
	next   []int
	scales []float64
}

// NewCholesky returns a Cholesky solver with default settings.
func NewCholesky() *Cholesky { return &Cholesky{PivotTol: DefaultPivotTol} }

// Analyse orders a by AMD and does the symbolic factorisation.
func (c *Cholesky) Analyse(a *Matrix) error {
	s, err := Analyse(a)
	if err != nil {
		return err
	}
	c.UseSymbolic(s)
	return nil
}

// UseSymbolic takes an analysis done elsewhere (for instance shared with an
// LU of the same pattern) in place of Analyse.
func (c *Cholesky) UseSymbolic(s *Symbolic) {
	c.sym = s
	n := s.N
	c.li = make([]int32, s.NNZL())
	c.lx = make([]float64, s.NNZL())
	c.d = make([]float64, n)
	c.y = make([]float64, n)
	c.flag = make([]int, n)
	c.path = make([]int, n)
	c.stack = make([]int, n)
	c.work = make([]float64, n)
	c.next = make([]int, n)
	c.ok = false
}

// Symbolic returns the analysis in use.
func (c *Cholesky) Symbolic() *Symbolic { return c.sym }

// Factorize computes L and D for a's current values.
func (c *Cholesky) Factorize(a *Matrix) error {
	c.ok = false
	if c.sym == nil {
		if err := c.Analyse(a); err != nil {
			return err
		}
	}
	s := c.sym
	if err := s.accepts(a); err != nil {
		return err
	}
	tol := pivotTol(c.PivotTol)
	c.scales = rowScales(a, c.scales)
	n := s.N
	next := c.next // next free slot of each column
	copy(next, s.colPtr[:n])
	y, flag, li, lx := c.y, c.flag, c.li, c.lx
	for i := range flag {
		flag[i] = -1
	}
	for k := 0; k < n; k++ {
		// y = row k of −A left of the diagonal; d = −a_kk.
		for q := s.lowPtr[k]; q < s.lowPtr[k+1]; q++ {
			if p := s.rowVal[q]; p >= 0 {
				y[s.lowCol[q]] = -a.Val[p]
			}
		}
		d := 0.0
		if p := s.diag[k]; p >= 0 {
			d = -a.Val[p]
		}
		top := s.ereach(k, flag, c.path, c.stack)
		for _, j := range c.stack[top:n] {
			yj := y[j]
			y[j] = 0
			end := next[j]
			col := li[s.colPtr[j]:end]
			val := lx[s.colPtr[j]:end]
			val = val[:len(col)]
			for q, i := range col {
				y[i] -= val[q] * yj
			}
			lkj := yj / c.d[j]
			d -= lkj * yj
			li[end] = int32(k)
			lx[end] = lkj
			next[j] = end + 1
		}
		scale := c.scales[s.Perm[k]]
		if !(d > tol*scale) {
			if d < -tol*scale {
				return fmt.Errorf("%w: pivot %.3g at row %d", ErrNotDefinite, -d, s.Perm[k])
			}
			return fmt.Errorf("%w: pivot %.3g at row %d (row scale %.3g)", ErrSingular, -d, s.Perm[k], scale)
		}
		c.d[k] = d
	}
	c.ok = true
	return nil
}

// Solve sets x to the solution of A·x = b.
func (c *Cholesky) Solve(x, b []float64) error {
	if !c.ok {
		return fmt.Errorf("%w: no successful factorisation", ErrPattern)
	}
	s := c.sym
	n := s.N
	if err := checkLen(n, x, b); err != nil {
		return err
	}
	w := c.work
	for k := 0; k < n; k++ {
		w[k] = -b[s.Perm[k]] // −A·x = −b
	}
	for j := 0; j < n; j++ {
		wj := w[j]
		for p := s.colPtr[j]; p < s.colPtr[j+1]; p++ {
			w[c.li[p]] -= c.lx[p] * wj
		}
	}
	for j := 0; j < n; j++ {
		w[j] /= c.d[j]
	}
	for j := n - 1; j >= 0; j-- {
		t := w[j]
		for p := s.colPtr[j]; p < s.colPtr[j+1]; p++ {
			t -= c.lx[p] * w[c.li[p]]
		}
		w[j] = t
	}
	for k := 0; k < n; k++ {
		x[s.Perm[k]] = w[k]
	}
	return nil
}

// SolveTranspose solves Aᵀ·x = b, the same system for symmetric A.
func (c *Cholesky) SolveTranspose(x, b []float64) error { return c.Solve(x, b) }

// NNZ returns the number of stored entries of L and D.
func (c *Cholesky) NNZ() int { return len(c.li) + len(c.d) }
