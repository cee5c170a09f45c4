package sparse

import "fmt"

// Symbolic is the pattern analysis shared by the Cholesky and LU
// factorisations: a fill-reducing ordering P, the elimination tree of
// P·(A+Aᵀ)·Pᵀ and the column counts of its factor. It depends on the
// pattern of A only.
type Symbolic struct {
	N    int
	Perm []int // Perm[k] is the original index of pivot k
	Pinv []int // Pinv[i] is the pivot position of original index i

	// Lower triangle of the permuted pattern by rows: row k holds the
	// pivots j < k with (k, j) in the pattern of P(A+Aᵀ)Pᵀ; rowVal and
	// colVal give the positions in a.Val of A(Perm[k], Perm[j]) and of
	// A(Perm[j], Perm[k]), or -1 where A lacks the entry.
	lowPtr []int
	lowCol []int32
	rowVal []int
	colVal []int
	diag   []int // position of A(Perm[k], Perm[k]) in a.Val, -1 if absent

	Parent []int // elimination tree, -1 at a root
	colPtr []int // start of each column of the strictly lower factor

	patPtr []int // the analysed pattern
	patCol []int
}

// NNZL returns the number of entries of the strictly lower triangle of the
// factor L (its fill included), the diagonal excluded.
func (s *Symbolic) NNZL() int { return s.colPtr[s.N] }

// Flops returns the multiply-add count of the numeric factorisation of a
// symmetric matrix with this analysis, Σ_j c_j·(c_j+3)/2 for the column
// counts c_j; the static-pivot LU does about twice as much.
func (s *Symbolic) Flops() float64 {
	f := 0.0
	for j := 0; j < s.N; j++ {
		c := float64(s.colPtr[j+1] - s.colPtr[j])
		f += c * (c + 3) / 2
	}
	return f
}

// Analyse orders a with AMD, post-orders the ordering's elimination tree
// (which keeps the fill and makes every supernode a run of consecutive
// columns) and computes the symbolic factorisation.
func Analyse(a *Matrix) (*Symbolic, error) {
	return AnalyseWith(a, Postorder(a, AMD(a)))
}

// Postorder returns the ordering perm refined by a post-order of its
// elimination tree: an equivalent ordering, with the same fill, in which
// every subtree is numbered consecutively.
func Postorder(a *Matrix, perm []int) []int {
	n := a.N
	ptr, idx := symPattern(a)
	pinv := invPerm(perm)
	parent := make([]int, n)
	anc := make([]int, n)
	for k := 0; k < n; k++ {
		parent[k], anc[k] = -1, -1
		i0 := perm[k]
		for _, j := range idx[ptr[i0]:ptr[i0+1]] {
			for i := pinv[j]; i >= 0 && i < k; {
				nx := anc[i]
				anc[i] = k
				if nx < 0 {
					parent[i] = k
				}
				i = nx
			}
		}
	}
	post := postorder(parent)
	out := make([]int, n)
	for k, j := range post {
		out[k] = perm[j]
	}
	return out
}

// AnalyseWith computes the symbolic factorisation of a under the given
// symmetric ordering (perm[k] is the original index of pivot k).
func AnalyseWith(a *Matrix, perm []int) (*Symbolic, error) {
	n := a.N
	if len(perm) != n {
		return nil, fmt.Errorf("sparse: ordering of length %d for order %d", len(perm), n)
	}
	pinv := make([]int, n)
	for i := range pinv {
		pinv[i] = -1
	}
	for k, i := range perm {
		if i < 0 || i >= n || pinv[i] >= 0 {
			return nil, fmt.Errorf("sparse: ordering is not a permutation (index %d at %d)", i, k)
		}
		pinv[i] = k
	}
	s := &Symbolic{N: n, Perm: append([]int(nil), perm...), Pinv: pinv,
		patPtr: append([]int(nil), a.RowPtr...), patCol: append([]int(nil), a.Col...)}
	ptr, idx := symPattern(a)

	// Lower rows of the permuted pattern.
	s.lowPtr = make([]int, n+1)
	for k := 0; k < n; k++ {
		i := perm[k]
		c := 0
		for _, j := range idx[ptr[i]:ptr[i+1]] {
			if pinv[j] < k {
				c++
			}
		}
		s.lowPtr[k+1] = s.lowPtr[k] + c
	}
	m := s.lowPtr[n]
	s.lowCol = make([]int32, m)
	s.rowVal = make([]int, m)
	s.colVal = make([]int, m)
	s.diag = make([]int, n)
	for k := 0; k < n; k++ {
		i := perm[k]
		q := s.lowPtr[k]
		for _, j := range idx[ptr[i]:ptr[i+1]] {
			if jk := pinv[j]; jk < k {
				s.lowCol[q] = int32(jk)
				s.rowVal[q] = a.Index(i, int(j))
				s.colVal[q] = a.Index(int(j), i)
				q++
			}
		}
		s.diag[k] = a.Index(i, i)
	}

	// Elimination tree (Liu's algorithm with path compression).
	s.Parent = make([]int, n)
	anc := make([]int, n)
	for k := 0; k < n; k++ {
		s.Parent[k], anc[k] = -1, -1
		for _, j := range s.lowCol[s.lowPtr[k]:s.lowPtr[k+1]] {
			for i := int(j); i >= 0 && i < k; {
				nx := anc[i]
				anc[i] = k
				if nx < 0 {
					s.Parent[i] = k
				}
				i = nx
			}
		}
	}

	// Column counts: row k of L is the row subtree reached from the
	// entries of row k of the permuted matrix.
	flag := anc // reuse
	for i := range flag {
		flag[i] = -1
	}
	count := make([]int, n+1)
	for k := 0; k < n; k++ {
		flag[k] = k
		for _, j := range s.lowCol[s.lowPtr[k]:s.lowPtr[k+1]] {
			for i := int(j); flag[i] != k; i = s.Parent[i] {
				flag[i] = k
				count[i+1]++
			}
		}
	}
	for j := 0; j < n; j++ {
		count[j+1] += count[j]
	}
	s.colPtr = count
	return s, nil
}

// samePattern reports whether a has the analysed pattern.
func (s *Symbolic) samePattern(a *Matrix) bool {
	return samePattern(a, s.N, s.patPtr, s.patCol)
}

// ereach puts the pattern of row k of L (without k) into stack[top:n] in
// topological order and returns top. flag must not hold k on entry.
func (s *Symbolic) ereach(k int, flag, path, stack []int) int {
	top := s.N
	flag[k] = k
	for _, j := range s.lowCol[s.lowPtr[k]:s.lowPtr[k+1]] {
		l := 0
		for i := int(j); flag[i] != k; i = s.Parent[i] {
			path[l] = i
			l++
			flag[i] = k
		}
		for l > 0 {
			l--
			top--
			stack[top] = path[l]
		}
	}
	return top
}

// accepts checks that a has the analysed pattern and finite values, as
// every factorization needs.
func (s *Symbolic) accepts(a *Matrix) error {
	if !s.samePattern(a) {
		return ErrPattern
	}
	return checkFinite(a)
}

// pivotTol returns the pivot tolerance tol, or DefaultPivotTol when it is
// zero.
func pivotTol(tol float64) float64 {
	if tol == 0 {
		return DefaultPivotTol
	}
	return tol
}
