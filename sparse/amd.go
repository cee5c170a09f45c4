package sparse

import (
	"math"
	"sort"
)

// AMD returns a fill-reducing symmetric ordering of a by approximate
// minimum degree on the pattern of A + Aᵀ (the values are not read):
// perm[k] is the original index of the k-th pivot.
//
// The method is that of Amestoy, Davis and Duff, An approximate minimum
// degree ordering algorithm, SIAM J. Matrix Anal. Appl. 17(4), 1996, as
// also described in Davis, Direct Methods for Sparse Linear Systems, SIAM
// 2006, ch. 7: elimination on the quotient graph (variables and elements),
// the approximate external degree bound instead of the exact degree,
// element absorption (including aggressive absorption), mass elimination,
// and detection of indistinguishable variables (supervariables) by hashing.
// Rows denser than 10·√n (at least 16 entries) are set aside and ordered
// last, as the paper recommends. The ordering is not post-ordered: the
// factorisations here do not use supernodes, and a post-order does not
// change the fill.
func AMD(a *Matrix) []int {
	ptr, idx := symPattern(a)
	order, _ := amdOrder(a.N, ptr, idx)
	return order
}

// FillEstimate is what the AMD elimination learns about the factor of its
// ordering: the element of each pivot is exactly the pattern of its column
// of L, so these are exact for the variables not set aside as dense.
type FillEstimate struct {
	NNZL  float64 // entries of L below the diagonal
	Flops float64 // multiply-adds of a symmetric factorisation, Σ c(c+3)/2
}

// AMDWithFill returns the AMD ordering and the fill it leads to.
func AMDWithFill(a *Matrix) ([]int, FillEstimate) {
	ptr, idx := symPattern(a)
	return amdOrder(a.N, ptr, idx)
}

const (
	amdVar      int8 = iota // a principal variable
	amdElement              // an element (an eliminated supervariable)
	amdAbsorbed             // an element absorbed into another
	amdMerged               // a variable merged into a supervariable or mass-eliminated
	amdDense                // a dense variable set aside, ordered last
)

type amdState struct {
	n     int
	kind  []int8
	nv    []int // weight of a principal supervariable
	deg   []int // approximate external degree of a variable
	esize []int // weighted size |Le| of an element
	elist [][]int32
	alist [][]int32
	lelem [][]int32

	head, next, prev []int // degree lists
	mindeg           int

	w    []int // |Le \ Lp| + wflg for the elements met in a step
	wflg int
	mark []int // membership stamps
	mflg int

	gnext, gtail []int // members of each supervariable
	hash         []uint
}

func (s *amdState) insert(i, d int) {
	s.deg[i] = d
	h := s.head[d]
	s.next[i] = h
	s.prev[i] = -1
	if h >= 0 {
		s.prev[h] = i
	}
	s.head[d] = i
	if d < s.mindeg {
		s.mindeg = d
	}
}

func (s *amdState) remove(i int) {
	if p := s.prev[i]; p >= 0 {
		s.next[p] = s.next[i]
	} else {
		s.head[s.deg[i]] = s.next[i]
	}
	if nx := s.next[i]; nx >= 0 {
		s.prev[nx] = s.prev[i]
	}
}

// join appends the members of j's group to i's.
func (s *amdState) join(i, j int) {
	s.gnext[s.gtail[i]] = j
	s.gtail[i] = s.gtail[j]
}

func (s *amdState) stamp() int {
	s.mflg++
	return s.mflg
}

func amdOrder(n int, ptr []int, idx []int32) ([]int, FillEstimate) {
	var fill FillEstimate
	s := &amdState{
		n: n, kind: make([]int8, n), nv: make([]int, n), deg: make([]int, n),
		esize: make([]int, n), elist: make([][]int32, n), alist: make([][]int32, n),
		lelem: make([][]int32, n), head: make([]int, n+1), next: make([]int, n),
		prev: make([]int, n), w: make([]int, n), wflg: 1, mark: make([]int, n),
		gnext: make([]int, n), gtail: make([]int, n), hash: make([]uint, n),
	}
	for d := range s.head {
		s.head[d] = -1
	}
	s.mindeg = n
	dense := max(16, int(10*math.Sqrt(float64(n))))
	var denseVars []int
	for i := 0; i < n; i++ {
		s.gnext[i] = -1
		s.gtail[i] = i
		s.nv[i] = 1
		if ptr[i+1]-ptr[i] > dense {
			s.kind[i] = amdDense
			denseVars = append(denseVars, i)
		}
	}
	for i := 0; i < n; i++ {
		if s.kind[i] == amdDense {
			continue
		}
		row := idx[ptr[i]:ptr[i+1]]
		al := make([]int32, 0, len(row))
		for _, j := range row {
			if s.kind[j] != amdDense {
				al = append(al, j)
			}
		}
		s.alist[i] = al
		s.insert(i, len(al))
	}

	order := make([]int, 0, n)
	nel := 0
	live := n - len(denseVars)
	type cand struct {
		h uint
		i int32
	}
	var cands []cand
	for nel < live {
		// Select the variable of least approximate degree.
		for s.mindeg < n && s.head[s.mindeg] < 0 {
			s.mindeg++
		}
		p := s.head[s.mindeg]
		s.remove(p)
		nel += s.nv[p]

		// Form Lp, the variables of the new element p: the union of p's
		// variables and of the variables of the elements p touches, which
		// p absorbs.
		st := s.stamp()
		s.mark[p] = st
		lp := make([]int32, 0, len(s.alist[p])+4)
		dk := 0
		add := func(j int32) {
			if s.kind[j] == amdVar && s.mark[j] != st {
				s.mark[j] = st
				lp = append(lp, j)
				dk += s.nv[j]
				s.remove(int(j))
			}
		}
		for _, e := range s.elist[p] {
			if s.kind[e] != amdElement {
				continue
			}
			for _, j := range s.lelem[e] {
				add(j)
			}
			s.kind[e] = amdAbsorbed
			s.lelem[e] = nil
		}
		for _, j := range s.alist[p] {
			add(j)
		}
		s.elist[p], s.alist[p] = nil, nil
		s.kind[p] = amdElement

		// |Le \ Lp| for every element e next to a variable of Lp.
		wflg := s.wflg
		for _, i := range lp {
			nvi := s.nv[i]
			for _, e := range s.elist[i] {
				if s.kind[e] != amdElement {
					continue
				}
				if s.w[e] >= wflg {
					s.w[e] -= nvi
				} else {
					s.w[e] = wflg + s.esize[e] - nvi
				}
			}
		}

		// Prune the lists of the variables of Lp, bound their degrees, and
		// eliminate at once those that only p touches.
		cands = cands[:0]
		for _, i := range lp {
			var h uint
			d := 0
			el := s.elist[i]
			out := el[:0]
			for _, e := range el {
				if s.kind[e] != amdElement {
					continue
				}
				if dext := s.w[e] - wflg; dext > 0 {
					d += dext
					out = append(out, e)
					h += uint(e)
				} else { // Le ⊆ Lp: aggressive absorption into p
					s.kind[e] = amdAbsorbed
					s.lelem[e] = nil
				}
			}
			out = append(out, int32(p))
			h += uint(p)
			s.elist[i] = out
			al := s.alist[i]
			outa := al[:0]
			for _, j := range al {
				if s.kind[j] != amdVar || s.mark[j] == st {
					continue
				}
				d += s.nv[j]
				outa = append(outa, j)
				h += uint(j)
			}
			s.alist[i] = outa
			if len(out) == 1 && len(outa) == 0 { // mass elimination
				nvi := s.nv[i]
				s.kind[i] = amdMerged
				s.nv[i] = 0
				nel += nvi
				dk -= nvi
				s.elist[i] = nil
				s.alist[i] = nil
				s.join(p, int(i))
				continue
			}
			s.deg[i] = min(s.deg[i], d)
			s.hash[i] = h % uint(n)
			cands = append(cands, cand{s.hash[i], i})
		}

		// Merge indistinguishable variables: equal hash, then equal lists.
		sort.Slice(cands, func(a, b int) bool { return cands[a].h < cands[b].h })
		for a := 0; a < len(cands); a++ {
			i := int(cands[a].i)
			if s.kind[i] != amdVar || a+1 >= len(cands) || cands[a+1].h != cands[a].h {
				continue
			}
			marked := false
			var cst int
			for b := a + 1; b < len(cands) && cands[b].h == cands[a].h; b++ {
				j := int(cands[b].i)
				if s.kind[j] != amdVar || len(s.elist[j]) != len(s.elist[i]) || len(s.alist[j]) != len(s.alist[i]) {
					continue
				}
				if !marked {
					cst = s.stamp()
					for _, e := range s.elist[i] {
						s.mark[e] = cst
					}
					for _, v := range s.alist[i] {
						s.mark[v] = cst
					}
					marked = true
				}
				same := true
				for _, e := range s.elist[j] {
					if s.mark[e] != cst {
						same = false
						break
					}
				}
				if same {
					for _, v := range s.alist[j] {
						if s.mark[v] != cst {
							same = false
							break
						}
					}
				}
				if same {
					s.nv[i] += s.nv[j]
					s.nv[j] = 0
					s.kind[j] = amdMerged
					s.elist[j], s.alist[j] = nil, nil
					s.join(i, j)
				}
			}
		}

		// Finish the degrees and put the variables back in the lists.
		out := lp[:0]
		for _, i := range lp {
			if s.kind[i] != amdVar {
				continue
			}
			nvi := s.nv[i]
			d := min(s.deg[i]+dk-nvi, n-nel-nvi)
			s.insert(int(i), d)
			out = append(out, i)
		}
		s.lelem[p] = out
		s.esize[p] = dk
		g := len(order)
		for v := p; v >= 0; v = s.gnext[v] {
			order = append(order, v)
		}
		g = len(order) - g
		for m := 0; m < g; m++ {
			c := float64(dk + g - 1 - m + len(denseVars))
			fill.NNZL += c
			fill.Flops += c * (c + 3) / 2
		}
		s.wflg += n + 1
	}
	for m := range denseVars {
		c := float64(len(denseVars) - 1 - m)
		fill.NNZL += c
		fill.Flops += c * (c + 3) / 2
	}
	return append(order, denseVars...), fill
}

// invPerm returns the inverse of the permutation p.
func invPerm(p []int) []int {
	q := make([]int, len(p))
	for k, i := range p {
		q[i] = k
	}
	return q
}
