package sparse

import (
	"fmt"
	"math"
)

// Supernodal is a supernodal left-looking Cholesky factorisation for
// symmetric definite A, the faster choice when the factor is large. Like
// Cholesky it factorises −P·A·Pᵀ, here as L·Lᵀ, for a negative definite A
// (a Jacobian of heat flows); when every diagonal entry of A is positive
// (the matrix of a time step, capacity over the step less the Jacobian) it
// factorises P·A·Pᵀ instead. Solve returns the solution of A·x = b itself;
// the pivot tests are those of Cholesky (on the pivot before its square
// root).
//
// Analyse orders by AMD, post-orders the elimination tree so that every
// supernode is a run of consecutive columns, and groups into a supernode
// each column j+1 that is the parent of column j and has its pattern minus
// one entry (a fundamental supernode; Liu, Ng & Peyton, SIAM J. Matrix
// Anal. Appl. 14, 1993). Factorize keeps each supernode as one dense
// column-major block and works left-looking (Ng & Peyton,
// SIAM J. Sci. Comput. 14, 1993): every earlier supernode whose pattern
// meets the columns of the current one subtracts its dense outer product,
// found through linked lists, before the block is factorised densely.
type Supernodal struct {
	// PivotTol is the relative pivot tolerance, default DefaultPivotTol.
	PivotTol float64

	sym      *Symbolic
	super    []int   // first column of each supernode, then n
	colSuper []int   // supernode of each column
	rowPtr   []int   // row pattern of each supernode (its own columns first)
	rows     []int32 //
	valPtr   []int   // start of each supernode's dense block
	val      []float64
	acolPtr  []int // lower entries of the permuted A by columns
	acolRow  []int32
	acolVal  []int

	relpos, head, next, kptr []int
	rel                      []int
	work, tmp                []float64
	scales                   []float64
	sign                     float64 // σ: the factor is of σ·P·A·Pᵀ
	ok                       bool
}

// NewSupernodal returns a supernodal Cholesky solver with default settings.
func NewSupernodal() *Supernodal { return &Supernodal{PivotTol: DefaultPivotTol} }

// Analyse orders a (AMD, post-ordered) and finds the supernodes and their
// patterns.
func (f *Supernodal) Analyse(a *Matrix) error {
	s, err := Analyse(a)
	if err != nil {
		return err
	}
	f.UseSymbolic(s)
	return nil
}

// UseSymbolic takes an analysis done elsewhere; its ordering should be
// post-ordered (as Analyse makes it) for the supernodes to be large.
func (f *Supernodal) UseSymbolic(s *Symbolic) {
	f.sym = s
	n := s.N
	count := func(j int) int { return s.colPtr[j+1] - s.colPtr[j] }
	f.super = f.super[:0]
	f.colSuper = make([]int, n)
	for j := 0; j < n; j++ {
		if j == 0 || s.Parent[j-1] != j || count(j-1) != count(j)+1 {
			f.super = append(f.super, j)
		}
		f.colSuper[j] = len(f.super) - 1
	}
	ns := len(f.super)
	f.super = append(f.super, n)
	// Row patterns: the supernode's own columns, then the pattern of its
	// last column, gathered from the row subtrees.
	f.rowPtr = make([]int, ns+1)
	f.valPtr = make([]int, ns+1)
	for J := 0; J < ns; J++ {
		fc, l := f.super[J], f.super[J+1]-1
		nr := l - fc + 1 + count(l)
		f.rowPtr[J+1] = f.rowPtr[J] + nr
		f.valPtr[J+1] = f.valPtr[J] + nr*(l-fc+1)
	}
	f.rows = make([]int32, f.rowPtr[ns])
	fill := make([]int, ns)
	for J := 0; J < ns; J++ {
		fill[J] = f.rowPtr[J]
		for j := f.super[J]; j < f.super[J+1]; j++ {
			f.rows[fill[J]] = int32(j)
			fill[J]++
		}
	}
	flag := make([]int, n)
	for i := range flag {
		flag[i] = -1
	}
	for k := 0; k < n; k++ {
		flag[k] = k
		for _, j := range s.lowCol[s.lowPtr[k]:s.lowPtr[k+1]] {
			for i := int(j); flag[i] != k; i = s.Parent[i] {
				flag[i] = k
				if J := f.colSuper[i]; f.super[J+1]-1 == i {
					f.rows[fill[J]] = int32(k)
					fill[J]++
				}
			}
		}
	}
	// The lower triangle of the permuted A by columns.
	f.acolPtr = make([]int, n+1)
	for _, j := range s.lowCol {
		f.acolPtr[j+1]++
	}
	for j := 0; j < n; j++ {
		f.acolPtr[j+1] += f.acolPtr[j]
	}
	f.acolRow = make([]int32, len(s.lowCol))
	f.acolVal = make([]int, len(s.lowCol))
	nx := append([]int(nil), f.acolPtr[:n]...)
	for k := 0; k < n; k++ {
		for q := s.lowPtr[k]; q < s.lowPtr[k+1]; q++ {
			j := s.lowCol[q]
			f.acolRow[nx[j]] = int32(k)
			f.acolVal[nx[j]] = s.rowVal[q]
			nx[j]++
		}
	}
	f.val = make([]float64, f.valPtr[ns])
	f.relpos = make([]int, n)
	f.head = make([]int, ns)
	f.next = make([]int, ns)
	f.kptr = make([]int, ns)
	f.rel = make([]int, n)
	f.work = make([]float64, n)
	f.tmp = make([]float64, 4*n)
	f.ok = false
}

// Supernodes returns the number of supernodes.
func (f *Supernodal) Supernodes() int { return len(f.super) - 1 }

// Factorize computes L for a's current values.
func (f *Supernodal) Factorize(a *Matrix) error {
	f.ok = false
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
	f.scales = rowScales(a, f.scales)
	f.sign = definiteSign(a)
	sign := f.sign
	ns := len(f.super) - 1
	clear(f.val)
	for J := range f.head {
		f.head[J] = -1
	}
	for J := 0; J < ns; J++ {
		fc, l := f.super[J], f.super[J+1]-1
		nc := l - fc + 1
		rowsJ := f.rows[f.rowPtr[J]:f.rowPtr[J+1]]
		nr := len(rowsJ)
		blk := f.val[f.valPtr[J]:f.valPtr[J+1]]
		for i, r := range rowsJ {
			f.relpos[r] = i
		}
		// Assemble σ·A (−A for a Jacobian).
		for j := fc; j <= l; j++ {
			c := j - fc
			if p := s.diag[j]; p >= 0 {
				blk[c+nr*c] = sign * a.Val[p]
			}
			for q := f.acolPtr[j]; q < f.acolPtr[j+1]; q++ {
				if p := f.acolVal[q]; p >= 0 {
					blk[f.relpos[f.acolRow[q]]+nr*c] = sign * a.Val[p]
				}
			}
		}
		// Updates from the supernodes linked to J.
		K := f.head[J]
		f.head[J] = -1
		for K >= 0 {
			nextK := f.next[K]
			rowsK := f.rows[f.rowPtr[K]:f.rowPtr[K+1]]
			nrK := len(rowsK)
			ncK := f.super[K+1] - f.super[K]
			blkK := f.val[f.valPtr[K]:f.valPtr[K+1]]
			p1 := f.kptr[K]
			p2 := p1
			for p2 < nrK && int(rowsK[p2]) <= l {
				p2++
			}
			rel := f.rel[:nrK-p1]
			for i := p1; i < nrK; i++ {
				rel[i-p1] = f.relpos[rowsK[i]]
			}
			// For each row q of K in J's columns, t = L_K(q:, :)·L_K(q, :)ᵀ
			// densely, then one scatter into J; four rows at a time, so that
			// each column of K is read once per four.
			q := p1
			for ; q+4 <= p2; q += 4 {
				m := nrK - q
				t := f.tmp[:4*m]
				clear(t)
				t0, t1, t2, t3 := t[:m], t[m:2*m], t[2*m:3*m], t[3*m:4*m]
				for c := 0; c < ncK; c++ {
					col := blkK[nrK*c+q : nrK*(c+1)]
					s0, s1, s2, s3 := col[0], col[1], col[2], col[3]
					if s0 == 0 && s1 == 0 && s2 == 0 && s3 == 0 {
						continue
					}
					col = col[:m]
					t0 := t0[:m]
					t1 := t1[:m]
					t2 := t2[:m]
					t3 := t3[:m]
					for i, v := range col {
						t0[i] += v * s0
						t1[i] += v * s1
						t2[i] += v * s2
						t3[i] += v * s3
					}
				}
				for r, tr := range [4][]float64{t0, t1[1:], t2[2:], t3[3:]} {
					cj := int(rowsK[q+r]) - fc
					dst := blk[nr*cj : nr*(cj+1)]
					rq := rel[q+r-p1:]
					rq = rq[:len(tr)]
					for i, v := range tr {
						dst[rq[i]] -= v
					}
				}
			}
			for ; q < p2; q++ {
				t := f.tmp[:nrK-q]
				clear(t)
				for c := 0; c < ncK; c++ {
					col := blkK[nrK*c+q : nrK*(c+1)]
					sv := col[0]
					if sv == 0 {
						continue
					}
					col = col[:len(t)]
					for i, v := range col {
						t[i] += v * sv
					}
				}
				cj := int(rowsK[q]) - fc
				dst := blk[nr*cj : nr*(cj+1)]
				rq := rel[q-p1:]
				rq = rq[:len(t)]
				for i, v := range t {
					dst[rq[i]] -= v
				}
			}
			f.kptr[K] = p2
			if p2 < nrK {
				T := f.colSuper[rowsK[p2]]
				f.next[K] = f.head[T]
				f.head[T] = K
			}
			K = nextK
		}
		// Dense factorisation of the block, by panels of four columns:
		// factor the panel, then subtract its rank-four product from the
		// columns to its right, writing each of them once per panel.
		for c0 := 0; c0 < nc; c0 += 4 {
			c1 := min(c0+4, nc)
			for c := c0; c < c1; c++ {
				col := blk[nr*c : nr*(c+1)]
				d := col[c]
				scale := f.scales[s.Perm[fc+c]]
				if !(d > tol*scale) {
					if d < -tol*scale {
						return fmt.Errorf("%w: pivot %.3g at row %d", ErrNotDefinite, -d, s.Perm[fc+c])
					}
					return fmt.Errorf("%w: pivot %.3g at row %d (row scale %.3g)", ErrSingular, -d, s.Perm[fc+c], scale)
				}
				ljj := math.Sqrt(d)
				col[c] = ljj
				inv := 1 / ljj
				for i := c + 1; i < nr; i++ {
					col[i] *= inv
				}
				for c2 := c + 1; c2 < c1; c2++ {
					sv := col[c2]
					dst := blk[nr*c2+c2 : nr*(c2+1)]
					src := col[c2:]
					src = src[:len(dst)]
					for i, v := range src {
						dst[i] -= v * sv
					}
				}
			}
			for c2 := c1; c2 < nc; c2++ {
				dst := blk[nr*c2+c2 : nr*(c2+1)]
				m := len(dst)
				if c1-c0 == 4 {
					a0 := blk[nr*c0+c2 : nr*(c0+1)][:m]
					a1 := blk[nr*(c0+1)+c2 : nr*(c0+2)][:m]
					a2 := blk[nr*(c0+2)+c2 : nr*(c0+3)][:m]
					a3 := blk[nr*(c0+3)+c2 : nr*(c0+4)][:m]
					s0, s1, s2, s3 := a0[0], a1[0], a2[0], a3[0]
					for i := range dst {
						dst[i] -= a0[i]*s0 + a1[i]*s1 + a2[i]*s2 + a3[i]*s3
					}
					continue
				}
				for c := c0; c < c1; c++ {
					src := blk[nr*c+c2 : nr*(c+1)][:m]
					sv := src[0]
					for i, v := range src {
						dst[i] -= v * sv
					}
				}
			}
		}
		f.kptr[J] = nc
		if nc < nr {
			T := f.colSuper[rowsJ[nc]]
			f.next[J] = f.head[T]
			f.head[T] = J
		}
	}
	f.ok = true
	return nil
}

// Solve sets x to the solution of A·x = b.
func (f *Supernodal) Solve(x, b []float64) error {
	if !f.ok {
		return fmt.Errorf("%w: no successful factorisation", ErrPattern)
	}
	s := f.sym
	n := s.N
	if err := checkLen(n, x, b); err != nil {
		return err
	}
	w := f.work
	for k := 0; k < n; k++ {
		w[k] = f.sign * b[s.Perm[k]] // σ·A·x = σ·b
	}
	ns := len(f.super) - 1
	for J := 0; J < ns; J++ {
		fc := f.super[J]
		nc := f.super[J+1] - fc
		rowsJ := f.rows[f.rowPtr[J]:f.rowPtr[J+1]]
		nr := len(rowsJ)
		blk := f.val[f.valPtr[J]:f.valPtr[J+1]]
		for c := 0; c < nc; c++ {
			col := blk[nr*c : nr*(c+1)]
			wc := w[fc+c] / col[c]
			w[fc+c] = wc
			for i := c + 1; i < nr; i++ {
				w[rowsJ[i]] -= col[i] * wc
			}
		}
	}
	for J := ns - 1; J >= 0; J-- {
		fc := f.super[J]
		nc := f.super[J+1] - fc
		rowsJ := f.rows[f.rowPtr[J]:f.rowPtr[J+1]]
		nr := len(rowsJ)
		blk := f.val[f.valPtr[J]:f.valPtr[J+1]]
		for c := nc - 1; c >= 0; c-- {
			col := blk[nr*c : nr*(c+1)]
			t := w[fc+c]
			for i := c + 1; i < nr; i++ {
				t -= col[i] * w[rowsJ[i]]
			}
			w[fc+c] = t / col[c]
		}
	}
	for k := 0; k < n; k++ {
		x[s.Perm[k]] = w[k]
	}
	return nil
}

// SolveTranspose solves Aᵀ·x = b, the same system for symmetric A.
func (f *Supernodal) SolveTranspose(x, b []float64) error { return f.Solve(x, b) }

// NNZ returns the number of stored entries of the dense blocks.
func (f *Supernodal) NNZ() int { return len(f.val) }

// postorder returns a post-order of the forest given by parent: post[k] is
// the k-th node, children before their parents.
func postorder(parent []int) []int {
	n := len(parent)
	head := make([]int, n)
	next := make([]int, n)
	for i := range head {
		head[i] = -1
	}
	for j := n - 1; j >= 0; j-- {
		if p := parent[j]; p >= 0 {
			next[j] = head[p]
			head[p] = j
		}
	}
	post := make([]int, 0, n)
	stack := make([]int, 0, 64)
	for r := 0; r < n; r++ {
		if parent[r] >= 0 {
			continue
		}
		stack = append(stack, r)
		for len(stack) > 0 {
			p := stack[len(stack)-1]
			if c := head[p]; c >= 0 {
				head[p] = next[c]
				stack = append(stack, c)
			} else {
				stack = stack[:len(stack)-1]
				post = append(post, p)
			}
		}
	}
	return post
}
