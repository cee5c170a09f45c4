package sparse

import (
	"fmt"
	"math"
	"slices"

	"github.com/heatgraph/heatgraph/internal/bigmem"
)

// Defaults of the algebraic multigrid preconditioner.
const (
	// DefaultAMGTheta is the strength-of-connection threshold: j is a
	// strong neighbour of i when |a_ij| ≥ θ·√(|a_ii·a_jj|).
	DefaultAMGTheta = 0.08
	// DefaultAMGCoarseTheta is the strength threshold on the coarse
	// levels. Their operators, Galerkin products with smoothed
	// prolongations, couple every node to a wide neighbourhood by entries
	// that fall off fast: with the fine level's threshold the aggregates
	// there stay small and the next operators fill up (on a 100³ grid
	// 165 entries a row on the third level, and 41 CG iterations to
	// 1e-8), with this one they take in the whole neighbourhood (16
	// iterations, the third level 20 times smaller).
	DefaultAMGCoarseTheta = 0.01
	// DefaultAMGMaxCoarse is the size at or below which a level is solved
	// directly.
	DefaultAMGMaxCoarse = 400
	// DefaultAMGMaxLevels bounds the depth of the hierarchy.
	DefaultAMGMaxLevels = 25
)

// AMG is a smoothed-aggregation algebraic multigrid preconditioner (Vaněk,
// Mandel & Brezina, Algebraic multigrid by smoothed aggregation for second
// and fourth order elliptic problems, Computing 56, 1996; Saad 2003,
// ch. 13): nodes are grouped into aggregates of strongly connected
// neighbours, the piecewise-constant tentative prolongation P̂ (a constant
// temperature over each aggregate, the near-null space of a conduction
// operator) is smoothed by one damped Jacobi step on the filtered matrix
// (weak entries lumped into the diagonal), P = (I − ω·D_F⁻¹·A_F)·P̂
// with ω = 4/(3·ρ(D⁻¹A)), and the coarse operator is the Galerkin product
// Pᵀ·A·P. One V-cycle with a forward Gauss–Seidel sweep before and a
// backward sweep after the coarse correction is one application; the
// coarsest level is solved by LU. The cycle is symmetric for symmetric A,
// so it serves CG; with BiCGStab it is a heuristic for mildly unsymmetric
// matrices.
//
// Setup builds the whole hierarchy; with ReuseAggregates it keeps the
// aggregates of the first Setup for later values of the same pattern and
// redoes only the numeric work (smoothing, Galerkin products, coarse LU).
// With Lag it goes further: a later Setup with the same pattern only takes
// the new values into the finest level, where the smoother and the
// residual use them, and keeps the coarse levels of the last full Setup,
// until Renew asks for a new hierarchy. The preconditioner stays
// symmetric and positive definite, so CG still converges to the current
// matrix; only its rate suffers when the values have moved far (CG calls
// Renew when it sees that, see CG). Inside Newton's method, where the
// values change a little from step to step, this saves most of the set-up.
//
// On long vectors the smoother works on fixed blocks of rows in parallel
// (hybrid Gauss–Seidel: Gauss–Seidel inside each block, the other blocks'
// values taken from before the sweep), forward before the coarse
// correction and backward after it, which keeps the cycle symmetric; the
// blocks depend on the size alone, so results do not depend on the
// machine.
type AMG struct {
	// Theta is the strength threshold, default DefaultAMGTheta.
	Theta float64
	// CoarseTheta is the strength threshold on the coarse levels,
	// default DefaultAMGCoarseTheta.
	CoarseTheta float64
	// MaxCoarse is the coarsest size, default DefaultAMGMaxCoarse.
	MaxCoarse int
	// MaxLevels bounds the levels, default DefaultAMGMaxLevels.
	MaxLevels int
	// ReuseAggregates keeps the aggregation of the first Setup, until
	// Renew: a renewed hierarchy aggregates again.
	ReuseAggregates bool
	// Lag keeps the coarse levels across Setups; see AMG.
	Lag bool
	// SmoothLevels, when positive, is the number of finest levels whose
	// prolongation is smoothed; the coarser ones use the piecewise
	// constant one, which keeps their operators sparse. Zero smooths all.
	SmoothLevels int

	levels []*amgLevel
	narrow narrowing // the finest level's column indices
	sign   float64
	fresh  bool // the last Setup built the hierarchy
	renew  bool // the next Setup must build it
	coarse *LU
	cx, cb []float64
}

type amgLevel struct {
	a      *op // the operator of this level, of A (not sign·A)
	diag   []int
	inv    []float64 // 1/a_ii
	agg    []int     // aggregate of each node, -1 if none
	nagg   int
	p, r   csr // prolongation and its transpose
	x, b   []float64
	res    []float64
	strong []bool    // strong entries of a, during Setup (see findStrong)
	snap   []float64 // x before a parallel sweep, at the halo
	halo   []int32   // the columns that rows of another block read
	coarse []float64 // restricted residual, the next level's right side
}

// csr is a rectangular compressed sparse row matrix.
type csr struct {
	rows, cols int
	ptr        []int
	col        []int32 // column indices: 4 bytes each halve the index memory
	val        []float64
}

// Levels returns the sizes of the levels of the hierarchy.
func (m *AMG) Levels() []int {
	var s []int
	for _, l := range m.levels {
		s = append(s, l.a.N)
	}
	return s
}

// smoothed returns how many of the finest levels get a smoothed
// prolongation.
func (m *AMG) smoothed() int {
	if m.SmoothLevels == 0 {
		return 1 << 30
	}
	return m.SmoothLevels
}

// Fresh reports whether the last Setup built the hierarchy (rather than
// refreshing the finest level of a lagging one).
func (m *AMG) Fresh() bool { return m.fresh }

// Renew makes the next Setup build the whole hierarchy again.
func (m *AMG) Renew() { m.renew = true }

// Setup builds the hierarchy for sign·A. It keeps a reference to a for
// its finest level, whose values must not change until the next Setup
// (the iterative solvers pass their own copy of the matrix).
func (m *AMG) Setup(a *Matrix, sign float64) error {
	top, err := m.narrow.op(a)
	if err != nil {
		return err
	}
	return m.setup(top, sign)
}

// setup is Setup for a finest level already in 4-byte indices (the
// iterative solvers share theirs).
func (m *AMG) setup(a *op, sign float64) error {
	if m.Lag && !m.renew && len(m.levels) > 1 && m.sign == sign {
		if top := m.levels[0].a; top.N == a.N && len(top.Col) == len(a.Col) && &top.Col[0] == &a.Col[0] {
			m.levels[0].a = a
			if err := m.levels[0].setDiag(); err != nil {
				return err
			}
			m.fresh = false
			return nil
		}
	}
	// A hierarchy renewed because it had become too slow is rebuilt from
	// its aggregates up: the strength of the connections that chose them
	// has changed too (the matrix of a time step's first, tiny step is
	// nearly diagonal, and aggregates kept from it barely coarsen).
	renewed := m.renew
	m.renew, m.fresh, m.sign = false, true, sign
	coarseTheta := m.CoarseTheta
	if coarseTheta <= 0 {
		coarseTheta = DefaultAMGCoarseTheta
	}
	theta, maxCoarse, maxLevels := m.Theta, m.MaxCoarse, m.MaxLevels
	if theta <= 0 {
		theta = DefaultAMGTheta
	}
	if maxCoarse <= 0 {
		maxCoarse = DefaultAMGMaxCoarse
	}
	if maxLevels <= 0 {
		maxLevels = DefaultAMGMaxLevels
	}
	reuse := m.ReuseAggregates && !renewed && len(m.levels) > 0 && m.levels[0].a.N == a.N &&
		len(m.levels[0].a.Col) == len(a.Col)
	old := m.levels
	if !reuse {
		old = nil
	}
	m.levels = m.levels[:0:0]
	// The hierarchy is built for A itself, and Apply changes the sign of
	// its result: (sign·A)⁻¹ = sign·A⁻¹. The finest level is a, not a
	// copy.
	cur := a
	for depth := 0; ; depth++ {
		l := &amgLevel{a: cur}
		if err := l.setDiag(); err != nil {
			return err
		}
		m.levels = append(m.levels, l)
		if cur.N <= maxCoarse || depth+1 >= maxLevels {
			break
		}
		th := theta
		if depth > 0 {
			th = coarseTheta
		}
		l.findStrong(th)
		if depth < len(old) && old[depth].agg != nil && old[depth].a.N == cur.N {
			l.agg, l.nagg = old[depth].agg, old[depth].nagg
		} else {
			l.aggregate()
		}
		if l.nagg == 0 || l.nagg >= cur.N*9/10 {
			l.agg, l.strong = nil, nil
			break // no useful coarsening
		}
		n := l.a.N
		l.x, l.b, l.res = bigmem.Make[float64](n), bigmem.Make[float64](n), bigmem.Make[float64](n)
		l.prolongation(depth < m.smoothed())
		l.strong = nil
		cur = galerkin(l.r, cur, l.p)
		l.coarse = make([]float64, l.nagg)
	}
	last := m.levels[len(m.levels)-1]
	last.agg = nil
	m.coarse = NewLU()
	if err := m.coarse.Factorize(last.a.matrix()); err != nil {
		return fmt.Errorf("multigrid coarsest level of %d: %w", last.a.N, err)
	}
	m.cx = bigmem.Make[float64](last.a.N)
	return nil
}

func (l *amgLevel) setDiag() error {
	a := l.a
	if len(l.diag) != a.N {
		l.diag = bigmem.Make[int](a.N)
		for i := 0; i < a.N; i++ {
			l.diag[i] = a.Index(i, i)
		}
	}
	if len(l.inv) != a.N {
		l.inv = bigmem.Make[float64](a.N)
	}
	for i := 0; i < a.N; i++ {
		if l.diag[i] < 0 || a.Val[l.diag[i]] == 0 {
			return fmt.Errorf("%w: zero diagonal at row %d of a multigrid level of order %d", ErrSingular, i, a.N)
		}
		l.inv[i] = 1 / a.Val[l.diag[i]]
	}
	return nil
}

// findStrong marks the entries of l.a that join their row strongly to
// their column: max(|a_ij|, |a_ji|) ≥ θ·√|a_ii·a_jj|; the diagonal is not
// marked. The rows are judged in parallel blocks; aggregate and
// prolongation read the marks.
func (l *amgLevel) findStrong(theta float64) {
	a := l.a
	l.strong = bigmem.Make[bool](len(a.Col))
	inBlocks(a.N, func(_, lo, hi int) {
		for i := lo; i < hi; i++ {
			di := math.Abs(a.Val[l.diag[i]])
			for k := a.RowPtr[i]; k < a.RowPtr[i+1]; k++ {
				j := int(a.Col[k])
				if j == i {
					continue
				}
				v := math.Abs(a.Val[k])
				if t := math.Abs(a.At(j, i)); t > v {
					v = t
				}
				l.strong[k] = v >= theta*math.Sqrt(di*math.Abs(a.Val[l.diag[j]]))
			}
		}
	})
}

// aggregate groups strongly connected nodes (the three passes of Vaněk,
// Mandel & Brezina 1996): whole neighbourhoods first, then the rest joined
// to a neighbouring aggregate, then leftovers grouped among themselves.
// Nodes with no strong neighbour stay out: the smoother handles them.
func (l *amgLevel) aggregate() {
	a := l.a
	n := a.N
	strong, col := l.strong, a.Col
	// lone reports whether i has no strong neighbour.
	lone := func(i int) bool {
		for k := a.RowPtr[i]; k < a.RowPtr[i+1]; k++ {
			if strong[k] {
				return false
			}
		}
		return true
	}
	agg := bigmem.Make[int](n)
	for i := range agg {
		agg[i] = -1
	}
	na := 0
	for i := 0; i < n; i++ { // pass 1
		if agg[i] >= 0 || lone(i) {
			continue
		}
		free := true
		for k := a.RowPtr[i]; k < a.RowPtr[i+1]; k++ {
			if strong[k] && agg[col[k]] >= 0 {
				free = false
				break
			}
		}
		if !free {
			continue
		}
		agg[i] = na
		for k := a.RowPtr[i]; k < a.RowPtr[i+1]; k++ {
			if strong[k] {
				agg[col[k]] = na
			}
		}
		na++
	}
	// Pass 2 joins a node to an aggregate of pass 1 only: a node it
	// joins is marked −2 − g meanwhile, which later nodes pass over.
	for i := 0; i < n; i++ { // pass 2
		if agg[i] != -1 {
			continue
		}
		for k := a.RowPtr[i]; k < a.RowPtr[i+1]; k++ {
			if g := agg[col[k]]; strong[k] && g >= 0 {
				agg[i] = -2 - g
				break
			}
		}
	}
	for i, g := range agg {
		if g < -1 {
			agg[i] = -2 - g
		}
	}
	for i := 0; i < n; i++ { // pass 3
		if agg[i] >= 0 || lone(i) {
			continue
		}
		agg[i] = na
		for k := a.RowPtr[i]; k < a.RowPtr[i+1]; k++ {
			if strong[k] && agg[col[k]] < 0 {
				agg[col[k]] = na
			}
		}
		na++
	}
	l.agg, l.nagg = agg, na
}

// prolongation forms P = (I − ω·D_F⁻¹·A_F)·P̂ and R = Pᵀ, with A_F the
// filtered matrix of Vaněk, Mandel & Brezina (1996): the weak entries of
// each row (not marked by findStrong) are dropped and added
// to its diagonal, D_F. Without the filter a node joined weakly to many
// (a component's junction over the thousands of cells of its footprint)
// would get a row of P over every aggregate it touches, and the Galerkin
// products would fill up level after level: on a board of 1e6 cells with
// such a node, 1300 entries in its row of P, and 28 entries a row on the
// second level against 9 without it. A node with no strong neighbour
// outside an aggregate gets an empty row, as in P̂: the smoother handles
// it.
func (l *amgLevel) prolongation(smooth bool) {
	a := l.a
	n := a.N
	omega := 0.0
	if smooth {
		omega = 4.0 / 3.0 / l.spectralRadius()
	}
	p := csr{rows: n, cols: l.nagg, ptr: bigmem.Make[int](n + 1)}
	// Each block of rows builds its part; the parts are joined in order.
	var cols [blocks][]int32
	var vals [blocks][]float64
	inBlocks(n, func(b, lo, hi int) {
		est := a.RowPtr[hi] - a.RowPtr[lo] + hi - lo
		pc, pv := bigmem.MakeCap[int32](0, est), bigmem.MakeCap[float64](0, est)
		acc := make([]float64, l.nagg)
		where := make([]int, l.nagg)
		for i := range where {
			where[i] = -1
		}
		var touched []int
		var keep []bool
		for i := lo; i < hi; i++ {
			if !smooth {
				// The piecewise constant prolongation.
				if g := l.agg[i]; g >= 0 {
					pc = append(pc, int32(g))
					pv = append(pv, 1)
				}
				p.ptr[i+1] = len(pc)
				continue
			}
			touched = touched[:0]
			if g := l.agg[i]; g >= 0 {
				acc[g] = 1
				where[g] = i
				touched = append(touched, g)
			}
			// The filtered diagonal; the entries kept are the diagonal
			// and the strong ones.
			k0, k1 := a.RowPtr[i], a.RowPtr[i+1]
			keep = slices.Grow(keep[:0], k1-k0)[:k1-k0]
			df := 0.0
			for k := k0; k < k1; k++ {
				j := int(a.Col[k])
				keep[k-k0] = j == i || l.strong[k]
				if !keep[k-k0] || j == i {
					df += a.Val[k]
				}
			}
			if df == 0 {
				df = a.Val[l.diag[i]]
			}
			s := -omega / df
			for k := k0; k < k1; k++ {
				g := l.agg[a.Col[k]]
				if g < 0 || !keep[k-k0] {
					continue
				}
				v := a.Val[k]
				if k == l.diag[i] {
					v = df
				}
				if where[g] != i {
					where[g] = i
					acc[g] = 0
					touched = append(touched, g)
				}
				acc[g] += s * v
			}
			slices.Sort(touched)
			for _, g := range touched {
				if acc[g] != 0 {
					pc = append(pc, int32(g))
					pv = append(pv, acc[g])
				}
			}
			p.ptr[i+1] = len(pc) // within the block, shifted below
		}
		cols[b], vals[b] = pc, pv
	})
	total := 0
	for b := range cols {
		total += len(cols[b])
	}
	p.col, p.val = bigmem.MakeCap[int32](0, total), bigmem.MakeCap[float64](0, total)
	for b := range cols {
		lo, hi := split(n, b)
		off := len(p.col)
		for i := lo + 1; i <= hi; i++ {
			p.ptr[i] += off
		}
		p.col = append(p.col, cols[b]...)
		p.val = append(p.val, vals[b]...)
		cols[b], vals[b] = nil, nil
	}
	l.p = p
	l.r = p.transpose()
}

// spectralRadius estimates ρ(D⁻¹A) by a few power iterations, bounded by
// the Gershgorin bound; it works in l.x and l.res.
func (l *amgLevel) spectralRadius() float64 {
	a := l.a
	n := a.N
	gersh := 0.0
	for i := 0; i < n; i++ {
		s := 0.0
		for k := a.RowPtr[i]; k < a.RowPtr[i+1]; k++ {
			s += math.Abs(a.Val[k])
		}
		gersh = math.Max(gersh, s/math.Abs(a.Val[l.diag[i]]))
	}
	if len(l.x) != n || len(l.res) != n {
		l.x, l.res = bigmem.Make[float64](n), bigmem.Make[float64](n)
	}
	x, y := l.x, l.res
	for i := range x {
		x[i] = 1 + float64(i%7)/7 - float64(i%3)/5
	}
	rho := 0.0
	for it := 0; it < 15; it++ {
		xn := norm2(x)
		if xn == 0 {
			break
		}
		a.MulVec(y, x)
		for i := range y {
			y[i] /= a.Val[l.diag[i]]
		}
		rho = norm2(y) / xn
		x, y = y, x
	}
	if rho == 0 || rho > gersh {
		rho = gersh
	}
	return rho
}

func (c csr) transpose() csr {
	t := csr{rows: c.cols, cols: c.rows, ptr: bigmem.Make[int](c.cols + 1), col: bigmem.Make[int32](len(c.col)), val: bigmem.Make[float64](len(c.val))}
	for _, j := range c.col {
		t.ptr[j+1]++
	}
	for j := 0; j < c.cols; j++ {
		t.ptr[j+1] += t.ptr[j]
	}
	next := append([]int(nil), t.ptr[:c.cols]...)
	for i := 0; i < c.rows; i++ {
		for k := c.ptr[i]; k < c.ptr[i+1]; k++ {
			j := c.col[k]
			t.col[next[j]] = int32(i)
			t.val[next[j]] = c.val[k]
			next[j]++
		}
	}
	return t
}

// galerkin returns R·A·P as a square operator with its full diagonal
// stored (zero where the product has none) and sorted rows. Each coarse
// row is summed at once over the fine rows of R's row, the rows of A
// they reach and the rows of P those reach (Gustavson's row-by-row
// product taken through both factors), so A·P is never stored: at a
// million rows it was the largest array of the set-up, 90 MB, for about
// the same number of multiply-adds. A counting pass sizes the result, a
// second fills it; both run on blocks of coarse rows in parallel.
func galerkin(r csr, a *op, p csr) *op {
	nc := r.rows
	m := &op{N: nc, RowPtr: bigmem.Make[int](nc + 1)}
	inBlocks(nc, func(_, lo, hi int) {
		where := make([]int32, p.cols)
		for i := range where {
			where[i] = -1
		}
		for ci := lo; ci < hi; ci++ {
			mark := int32(ci)
			where[ci] = mark
			c := 1
			for q := r.ptr[ci]; q < r.ptr[ci+1]; q++ {
				i := r.col[q]
				for k := a.RowPtr[i]; k < a.RowPtr[i+1]; k++ {
					j := a.Col[k]
					for _, cj := range p.col[p.ptr[j]:p.ptr[j+1]] {
						if where[cj] != mark {
							where[cj] = mark
							c++
						}
					}
				}
			}
			m.RowPtr[ci+1] = c
		}
	})
	for i := 0; i < nc; i++ {
		m.RowPtr[i+1] += m.RowPtr[i]
	}
	m.Col = bigmem.Make[int32](m.RowPtr[nc])
	m.Val = bigmem.Make[float64](m.RowPtr[nc])
	inBlocks(nc, func(_, lo, hi int) {
		where := make([]int32, p.cols)
		for i := range where {
			where[i] = -1
		}
		acc := make([]float64, p.cols)
		for ci := lo; ci < hi; ci++ {
			mark := int32(ci)
			row := m.Col[m.RowPtr[ci]:m.RowPtr[ci]:m.RowPtr[ci+1]]
			where[ci], acc[ci] = mark, 0
			row = append(row, mark)
			for q := r.ptr[ci]; q < r.ptr[ci+1]; q++ {
				i, rv := r.col[q], r.val[q]
				for k := a.RowPtr[i]; k < a.RowPtr[i+1]; k++ {
					j, av := a.Col[k], rv*a.Val[k]
					for s := p.ptr[j]; s < p.ptr[j+1]; s++ {
						cj := p.col[s]
						if where[cj] != mark {
							where[cj] = mark
							acc[cj] = 0
							row = append(row, cj)
						}
						acc[cj] += av * p.val[s]
					}
				}
			}
			slices.Sort(row)
			for k, c := range row {
				m.Val[m.RowPtr[ci]+k] = acc[c]
			}
		}
	})
	return m
}

// Apply runs one V-cycle on (sign·A)·z = r from z = 0.
func (m *AMG) Apply(z, r []float64) {
	m.cycle(0, z, r)
	if m.sign < 0 {
		inBlocks(len(z), func(_, lo, hi int) {
			for i := lo; i < hi; i++ {
				z[i] = -z[i]
			}
		})
	}
}

func (m *AMG) cycle(k int, x, b []float64) {
	l := m.levels[k]
	if k == len(m.levels)-1 {
		if err := m.coarse.Solve(x, b); err != nil {
			clear(x) // cannot happen after a successful Setup
		}
		return
	}
	a := l.a
	clear(x)
	l.smooth(x, b, true, true)
	inBlocks(a.N, func(_, lo, hi int) {
		for i := lo; i < hi; i++ {
			s := b[i]
			k0, k1 := a.RowPtr[i], a.RowPtr[i+1]
			cs, vs := a.Col[k0:k1], a.Val[k0:k1]
			vs = vs[:len(cs)]
			for k, c := range cs {
				s -= vs[k] * x[c]
			}
			l.res[i] = s
		}
	})
	l.r.mulVec(l.coarse, l.res)
	next := m.levels[k+1]
	xc := next.x
	if k+1 == len(m.levels)-1 {
		xc = m.cx
	}
	m.cycle(k+1, xc, l.coarse)
	l.p.mulVecAdd(x, xc)
	l.smooth(x, b, false, false)
}

// smooth runs one Gauss–Seidel sweep, forward or backward; on long
// vectors, the hybrid sweep of fixed blocks in parallel (see AMG). zero
// says that x is zero on entry.
func (l *amgLevel) smooth(x, b []float64, forward, zero bool) {
	n := l.a.N
	if n < parallelRows {
		l.gaussSeidel(x, b, forward, 0, n, nil)
		return
	}
	var snap []float64
	if !zero {
		if len(l.snap) != n {
			l.snap = bigmem.Make[float64](n)
			l.halo = l.findHalo()
		}
		snap = l.snap
		for _, c := range l.halo {
			snap[c] = x[c]
		}
	}
	inBlocks(n, func(_, lo, hi int) { l.gaussSeidel(x, b, forward, lo, hi, snap) })
}

// findHalo returns the columns that some row of another block reads, the
// only values of x a hybrid sweep needs from before it.
func (l *amgLevel) findHalo() []int32 {
	a := l.a
	seen := make([]bool, a.N)
	var halo []int32
	for b := 0; b < blocks; b++ {
		lo, hi := split(a.N, b)
		lo32, hi32 := int32(lo), int32(hi)
		for i := lo; i < hi; i++ {
			for _, c := range a.Col[a.RowPtr[i]:a.RowPtr[i+1]] {
				if (c < lo32 || c >= hi32) && !seen[c] {
					seen[c] = true
					halo = append(halo, c)
				}
			}
		}
	}
	return halo
}

// gaussSeidel sweeps rows lo ≤ i < hi. With a snapshot, the columns
// outside [lo, hi) are read from it (nil: they are zero); when the block
// is the whole matrix, from x.
func (l *amgLevel) gaussSeidel(x, b []float64, forward bool, lo, hi int, snap []float64) {
	a := l.a
	i, step, end := lo, 1, hi
	if !forward {
		i, step, end = hi-1, -1, lo-1
	}
	lo32, hi32 := int32(lo), int32(hi)
	for ; i != end; i += step {
		s := b[i]
		k0, k1 := a.RowPtr[i], a.RowPtr[i+1]
		cols := a.Col[k0:k1]
		vals := a.Val[k0:k1]
		vals = vals[:len(cols)]
		if len(cols) > 0 && (cols[0] < lo32 || cols[len(cols)-1] >= hi32) {
			// A row on the edge of its block.
			for k, c := range cols {
				if c >= lo32 && c < hi32 {
					s -= vals[k] * x[c]
				} else if snap != nil {
					s -= vals[k] * snap[c]
				}
			}
		} else {
			for k, c := range cols {
				s -= vals[k] * x[c]
			}
		}
		x[i] += s * l.inv[i]
	}
}

func (c csr) mulVec(dst, x []float64) {
	inBlocks(c.rows, func(_, lo, hi int) { mulRows(c.ptr, c.col, c.val, dst, x, lo, hi) })
}

func (c csr) mulVecAdd(dst, x []float64) {
	inBlocks(c.rows, func(_, lo, hi int) {
		for i := lo; i < hi; i++ {
			s := 0.0
			k0, k1 := c.ptr[i], c.ptr[i+1]
			cs, vs := c.col[k0:k1], c.val[k0:k1]
			vs = vs[:len(cs)]
			for k, col := range cs {
				s += vs[k] * x[col]
			}
			dst[i] += s
		}
	})
}
