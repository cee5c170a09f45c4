package sparse

import (
	"fmt"
	"math"
)

// DefaultPivotThreshold is the default threshold of PivotLU's partial
// pivoting: the diagonal entry stays the pivot while its magnitude is at
// least this fraction of the largest candidate in its column.
const DefaultPivotThreshold = 0.1

// PivotLU is the left-looking sparse LU factorisation of Gilbert & Peierls
// (Sparse partial pivoting in time proportional to arithmetic operations,
// SIAM J. Sci. Stat. Comput. 9, 1988; Davis 2006, ch. 6) with threshold
// partial pivoting: column k of L and U comes from a sparse triangular
// solve with the columns of L found so far, whose pattern is found by a
// depth-first search in the graph of L. It computes P·A·Q = L·U with the
// column order Q given (AMD of A+Aᵀ by default) and the row order P chosen
// while factorising, preferring the diagonal entry.
//
// It is the fallback of LU when the static diagonal pivots fail their
// stability check. Its pattern work is redone by every Factorize, so only
// the column ordering is kept from Analyse.
type PivotLU struct {
	// PivotTol is the relative pivot tolerance, default DefaultPivotTol.
	PivotTol float64
	// Threshold is the partial-pivoting threshold, default
	// DefaultPivotThreshold.
	Threshold float64

	q           []int // column order
	pinv        []int // row i of A is pivot row pinv[i]
	lp          []int
	li          []int32 // rows of L in pivot order
	lx          []float64
	up          []int
	ui          []int32
	ux          []float64
	ud          []float64
	work, work2 []float64
	ok          bool
}

// NewPivotLU returns a partial-pivoting LU with default settings.
func NewPivotLU() *PivotLU {
	return &PivotLU{PivotTol: DefaultPivotTol, Threshold: DefaultPivotThreshold}
}

// Analyse computes the column ordering, AMD of A+Aᵀ.
func (f *PivotLU) Analyse(a *Matrix) error {
	f.UseOrdering(AMD(a))
	return nil
}

// UseOrdering sets the column ordering: q[k] is the original column
// factorised k-th.
func (f *PivotLU) UseOrdering(q []int) { f.q = append(f.q[:0], q...) }

// Factorize computes L and U for a's current values.
func (f *PivotLU) Factorize(a *Matrix) error {
	f.ok = false
	n := a.N
	if len(f.q) != n {
		f.q = AMD(a)
	}
	if err := checkFinite(a); err != nil {
		return err
	}
	tol, thr := f.PivotTol, f.Threshold
	if tol == 0 {
		tol = DefaultPivotTol
	}
	if thr == 0 {
		thr = DefaultPivotThreshold
	}
	// The columns of A: A's transpose in compressed rows.
	cp := make([]int, n+1)
	for _, j := range a.Col {
		cp[j+1]++
	}
	for j := 0; j < n; j++ {
		cp[j+1] += cp[j]
	}
	ci := make([]int, len(a.Col))
	cx := make([]float64, len(a.Col))
	nx := append([]int(nil), cp[:n]...)
	for i := 0; i < n; i++ {
		for p := a.RowPtr[i]; p < a.RowPtr[i+1]; p++ {
			j := a.Col[p]
			ci[nx[j]] = i
			cx[nx[j]] = a.Val[p]
			nx[j]++
		}
	}
	scales := rowScales(a, nil)
	f.pinv = make([]int, n)
	for i := range f.pinv {
		f.pinv[i] = -1
	}
	f.lp = make([]int, 1, n+1)
	f.up = make([]int, 1, n+1)
	f.li, f.lx, f.ui, f.ux = f.li[:0], f.lx[:0], f.ui[:0], f.ux[:0]
	f.ud = make([]float64, n)
	x := make([]float64, n)
	mark := make([]int, n)
	for i := range mark {
		mark[i] = -1
	}
	stack := make([]int, n)
	head := make([]int, n)
	out := make([]int, n)
	lrow := make([]int32, 0) // rows of L in original numbering while factorising
	for k := 0; k < n; k++ {
		col := f.q[k]
		// Pattern of x = L \ A(:, col): rows reachable in the graph of L,
		// in topological order in out[top:n].
		top := n
		for p := cp[col]; p < cp[col+1]; p++ {
			r := ci[p]
			if mark[r] == k {
				continue
			}
			// Depth-first search from r.
			sp := 0
			stack[0] = r
			mark[r] = k
			if j := f.pinv[r]; j >= 0 {
				head[0] = f.lp[j]
			}
			for sp >= 0 {
				i := stack[sp]
				j := f.pinv[i]
				done := true
				if j >= 0 {
					for ; head[sp] < f.lp[j+1]; head[sp]++ {
						c := int(lrow[head[sp]])
						if mark[c] == k {
							continue
						}
						mark[c] = k
						head[sp]++
						sp++
						stack[sp] = c
						if jc := f.pinv[c]; jc >= 0 {
							head[sp] = f.lp[jc]
						}
						done = false
						break
					}
				}
				if done {
					sp--
					top--
					out[top] = i
				}
			}
		}
		for p := cp[col]; p < cp[col+1]; p++ {
			x[ci[p]] = cx[p]
		}
		// Numeric solve, then choose the pivot among the rows not yet
		// pivotal.
		ipiv, big := -1, -1.0
		for _, i := range out[top:n] {
			j := f.pinv[i]
			if j < 0 {
				if v := math.Abs(x[i]); v > big {
					big, ipiv = v, i
				}
				continue
			}
			xi := x[i]
			f.ui = append(f.ui, int32(j))
			f.ux = append(f.ux, xi)
			for p := f.lp[j]; p < f.lp[j+1]; p++ {
				x[lrow[p]] -= f.lx[p] * xi
			}
		}
		if ipiv >= 0 {
			// Re-scan: the candidates changed after the updates above.
			big = -1
			for _, i := range out[top:n] {
				if f.pinv[i] < 0 {
					if v := math.Abs(x[i]); v > big {
						big, ipiv = v, i
					}
				}
			}
			if f.pinv[col] < 0 && mark[col] == k && math.Abs(x[col]) >= thr*big {
				ipiv = col
			}
		}
		if ipiv < 0 || !(math.Abs(x[ipiv]) > tol*scales[ipiv]) {
			for _, i := range out[top:n] {
				x[i] = 0
			}
			row := col
			if ipiv >= 0 {
				row = ipiv
			}
			return fmt.Errorf("%w: no acceptable pivot in column %d (near row %d)", ErrSingular, col, row)
		}
		piv := x[ipiv]
		f.ud[k] = piv
		f.pinv[ipiv] = k
		for _, i := range out[top:n] {
			if f.pinv[i] < 0 {
				lrow = append(lrow, int32(i))
				f.lx = append(f.lx, x[i]/piv)
			}
			x[i] = 0
		}
		f.lp = append(f.lp, len(lrow))
		f.up = append(f.up, len(f.ui))
	}
	f.li = f.li[:0]
	for _, i := range lrow {
		f.li = append(f.li, int32(f.pinv[i]))
	}
	f.work = make([]float64, n)
	f.work2 = make([]float64, n)
	f.ok = true
	return nil
}

// Solve sets x to the solution of A·x = b.
func (f *PivotLU) Solve(x, b []float64) error {
	if !f.ok {
		return fmt.Errorf("%w: no successful factorisation", ErrPattern)
	}
	n := len(f.ud)
	if err := checkLen(n, x, b); err != nil {
		return err
	}
	w := f.work
	for i := 0; i < n; i++ {
		w[f.pinv[i]] = b[i]
	}
	for j := 0; j < n; j++ {
		wj := w[j]
		for p := f.lp[j]; p < f.lp[j+1]; p++ {
			w[f.li[p]] -= f.lx[p] * wj
		}
	}
	for j := n - 1; j >= 0; j-- {
		wj := w[j] / f.ud[j]
		w[j] = wj
		for p := f.up[j]; p < f.up[j+1]; p++ {
			w[f.ui[p]] -= f.ux[p] * wj
		}
	}
	for k := 0; k < n; k++ {
		x[f.q[k]] = w[k]
	}
	return nil
}

// SolveTranspose sets x to the solution of Aᵀ·x = b.
func (f *PivotLU) SolveTranspose(x, b []float64) error {
	if !f.ok {
		return fmt.Errorf("%w: no successful factorisation", ErrPattern)
	}
	n := len(f.ud)
	if err := checkLen(n, x, b); err != nil {
		return err
	}
	w := f.work
	for k := 0; k < n; k++ {
		w[k] = b[f.q[k]]
	}
	for k := 0; k < n; k++ { // Uᵀ, gather along column k of U
		t := w[k]
		for p := f.up[k]; p < f.up[k+1]; p++ {
			t -= f.ux[p] * w[f.ui[p]]
		}
		w[k] = t / f.ud[k]
	}
	for j := n - 1; j >= 0; j-- { // Lᵀ
		t := w[j]
		for p := f.lp[j]; p < f.lp[j+1]; p++ {
			t -= f.lx[p] * w[f.li[p]]
		}
		w[j] = t
	}
	for i := 0; i < n; i++ {
		x[i] = w[f.pinv[i]]
	}
	return nil
}
