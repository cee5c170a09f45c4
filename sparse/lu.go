package sparse

import (
	"fmt"
	"math"
)

// DefaultMaxMultiplier is the default stability limit of the static-pivot
// LU: a multiplier |l_kj| above it means the diagonal pivots are unsafe.
const DefaultMaxMultiplier = 1e6

// LU solves unsymmetric systems, such as the Jacobian of a network where
// air streams carry heat (an upwind stream stamps only into its downstream
// row, so the values lose their symmetry while the pattern keeps it).
//
// Pivoting choice: static pivoting on the diagonal. It computes
// P·A·Pᵀ = L·U with L unit lower triangular and the symmetric ordering P
// from AMD of A+Aᵀ, found once in Analyse together with the elimination
// tree and column counts. With the pivots fixed on the diagonal, L and Uᵀ
// have the pattern of the Cholesky factor of P(A+Aᵀ)Pᵀ, so the symbolic
// work is that of Cholesky and the numeric factorisation is its up-looking
// counterpart (row k of L and column k of U by two sparse triangular solves
// over the same row subtree). This is safe when A is diagonally dominant by
// rows or by columns, as a thermal Jacobian is (its rows are heat balances
// and its off-diagonal entries are conductances): Gaussian elimination then
// keeps the dominance, so a pivot can only vanish for a singular matrix,
// and with column dominance every multiplier is at most one in magnitude
// (Golub & Van Loan, Matrix Computations, §3.4.10; from memory for the
// section).
//
// Stability check and fallback: a multiplier larger than MaxMultiplier, or
// a pivot |u_kk| ≤ PivotTol·max_j |a_kj|, means the diagonal pivots are
// unsafe for this matrix: that Factorize falls back to left-looking LU with
// threshold partial pivoting (Gilbert & Peierls 1988), see PivotLU, and
// reports ErrSingular, with the row, only if that finds no acceptable pivot
// either. Fallbacks counts the factorisations that needed it.
type LU struct {
	// PivotTol is the relative pivot tolerance, default DefaultPivotTol.
	PivotTol float64
	// MaxMultiplier is the stability limit, default DefaultMaxMultiplier.
	MaxMultiplier float64

	sym    *Symbolic
	li     []int32
	lx, ux []float64
	ud     []float64
	y, z   []float64
	work   []float64
	flag   []int
	path   []int
	stack  []int
	next   []int
	scales []float64
	ok     bool

	fallback *PivotLU // in use when the static pivots failed the check
	// Fallbacks counts the factorisations that needed partial pivoting.
	Fallbacks int
}

// NewLU returns an LU solver with default settings.
func NewLU() *LU { return &LU{PivotTol: DefaultPivotTol, MaxMultiplier: DefaultMaxMultiplier} }

// Analyse orders a by AMD of A+Aᵀ and does the symbolic factorisation.
func (f *LU) Analyse(a *Matrix) error {
	s, err := Analyse(a)
	if err != nil {
		return err
	}
	f.UseSymbolic(s)
	return nil
}

// UseSymbolic takes an analysis done elsewhere in place of Analyse.
func (f *LU) UseSymbolic(s *Symbolic) {
	f.sym = s
	n := s.N
	m := s.NNZL()
	f.li = make([]int32, m)
	f.lx = make([]float64, m)
	f.ux = make([]float64, m)
	f.ud = make([]float64, n)
	f.y = make([]float64, n)
	f.z = make([]float64, n)
	f.work = make([]float64, n)
	f.flag = make([]int, n)
	f.path = make([]int, n)
	f.stack = make([]int, n)
	f.next = make([]int, n)
	f.ok = false
	f.fallback = nil
}

// Symbolic returns the analysis in use.
func (f *LU) Symbolic() *Symbolic { return f.sym }

// Factorize computes L and U for a's current values.
func (f *LU) Factorize(a *Matrix) error {
	f.ok = false
	f.fallback = nil
	if f.sym == nil {
		if err := f.Analyse(a); err != nil {
			return err
		}
	}
	s := f.sym
	if err := s.accepts(a); err != nil {
		return err
	}
	tol := pivotTol(f.PivotTol)
	maxMul := f.MaxMultiplier
	if maxMul == 0 {
		maxMul = DefaultMaxMultiplier
	}
	f.scales = rowScales(a, f.scales)
	n := s.N
	next := f.next
	copy(next, s.colPtr[:n])
	y, z, flag, li, lx, ux := f.y, f.z, f.flag, f.li, f.lx, f.ux
	for i := range flag {
		flag[i] = -1
	}
	for k := 0; k < n; k++ {
		// y = A(k, 0:k), z = A(0:k, k), in the permuted order.
		for q := s.lowPtr[k]; q < s.lowPtr[k+1]; q++ {
			j := s.lowCol[q]
			if p := s.rowVal[q]; p >= 0 {
				y[j] = a.Val[p]
			}
			if p := s.colVal[q]; p >= 0 {
				z[j] = a.Val[p]
			}
		}
		d := 0.0
		if p := s.diag[k]; p >= 0 {
			d = a.Val[p]
		}
		top := s.ereach(k, flag, f.path, f.stack)
		unstable := false
		for _, j := range f.stack[top:n] {
			lkj := y[j] / f.ud[j]
			uj := z[j]
			y[j], z[j] = 0, 0
			end := next[j]
			col := li[s.colPtr[j]:end]
			lv := lx[s.colPtr[j]:end]
			uv := ux[s.colPtr[j]:end]
			lv, uv = lv[:len(col)], uv[:len(col)]
			for q, i := range col {
				y[i] -= uv[q] * lkj // U(j, i)
				z[i] -= lv[q] * uj  // L(i, j)
			}
			d -= lkj * uj
			li[end] = int32(k)
			lx[end] = lkj
			ux[end] = uj
			next[j] = end + 1
			if !(math.Abs(lkj) <= maxMul) {
				unstable = true
			}
		}
		if unstable {
			// Clear the workspace of the rows not reached and fall back.
			for q := s.lowPtr[k]; q < s.lowPtr[k+1]; q++ {
				y[s.lowCol[q]], z[s.lowCol[q]] = 0, 0
			}
			return f.pivoted(a)
		}
		scale := f.scales[s.Perm[k]]
		if !(math.Abs(d) > tol*scale) {
			// A tiny diagonal pivot may still be avoidable by row exchanges.
			if err := f.pivoted(a); err == nil {
				return nil
			}
			return fmt.Errorf("%w: pivot %.3g at row %d (row scale %.3g)", ErrSingular, d, s.Perm[k], scale)
		}
		f.ud[k] = d
	}
	f.ok = true
	return nil
}

// pivoted factorises a with partial pivoting instead of the static pivots.
func (f *LU) pivoted(a *Matrix) error {
	p := &PivotLU{PivotTol: f.PivotTol}
	p.UseOrdering(f.sym.Perm)
	if err := p.Factorize(a); err != nil {
		return err
	}
	f.fallback = p
	f.Fallbacks++
	f.ok = true
	return nil
}

// Solve sets x to the solution of A·x = b.
func (f *LU) Solve(x, b []float64) error {
	if !f.ok {
		return fmt.Errorf("%w: no successful factorisation", ErrPattern)
	}
	if f.fallback != nil {
		return f.fallback.Solve(x, b)
	}
	s := f.sym
	n := s.N
	if err := checkLen(n, x, b); err != nil {
		return err
	}
	w := f.work
	for k := 0; k < n; k++ {
		w[k] = b[s.Perm[k]]
	}
	for j := 0; j < n; j++ { // L, by columns
		wj := w[j]
		for p := s.colPtr[j]; p < s.colPtr[j+1]; p++ {
			w[f.li[p]] -= f.lx[p] * wj
		}
	}
	for j := n - 1; j >= 0; j-- { // U, by rows
		t := w[j]
		for p := s.colPtr[j]; p < s.colPtr[j+1]; p++ {
			t -= f.ux[p] * w[f.li[p]]
		}
		w[j] = t / f.ud[j]
	}
	for k := 0; k < n; k++ {
		x[s.Perm[k]] = w[k]
	}
	return nil
}

// SolveTranspose sets x to the solution of Aᵀ·x = b.
func (f *LU) SolveTranspose(x, b []float64) error {
	if !f.ok {
		return fmt.Errorf("%w: no successful factorisation", ErrPattern)
	}
	if f.fallback != nil {
		return f.fallback.SolveTranspose(x, b)
	}
	s := f.sym
	n := s.N
	if err := checkLen(n, x, b); err != nil {
		return err
	}
	w := f.work
	for k := 0; k < n; k++ {
		w[k] = b[s.Perm[k]]
	}
	for j := 0; j < n; j++ { // Uᵀ, lower, column j = row j of U
		wj := w[j] / f.ud[j]
		w[j] = wj
		for p := s.colPtr[j]; p < s.colPtr[j+1]; p++ {
			w[f.li[p]] -= f.ux[p] * wj
		}
	}
	for j := n - 1; j >= 0; j-- { // Lᵀ, unit upper
		t := w[j]
		for p := s.colPtr[j]; p < s.colPtr[j+1]; p++ {
			t -= f.lx[p] * w[f.li[p]]
		}
		w[j] = t
	}
	for k := 0; k < n; k++ {
		x[s.Perm[k]] = w[k]
	}
	return nil
}

// NNZ returns the number of stored entries of L and U.
func (f *LU) NNZ() int { return 2*len(f.li) + len(f.ud) }
