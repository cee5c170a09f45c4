package elements

import (
	"runtime"
	"sort"
	"sync"

	"github.com/heatgraph/heatgraph/elements/dual"
	"github.com/heatgraph/heatgraph/internal/bigmem"
)

// The Jacobian entries of a plate, in order: for each cell, line by line
// (a line is the NX cells of one j and k), its diagonal, then its
// neighbours at i−1, i+1, j−1, j+1, k−1, k+1 where they exist; then for
// each join whose node is not given (NodeGiven), (cell, node) and (node,
// cell) for each covered cell and one (node, node). A join's (cell, cell)
// derivative adds to the cell's diagonal.

// Entries returns the positions of the plate's Jacobian entries in Rows
// and Vars, built anew at each call (EachEntry lists them without storing
// them).
func (p *Plate) Entries() (er, ev []int32) {
	er = bigmem.Make[int32](p.nEntries)
	ev = bigmem.Make[int32](p.nEntries)
	k := 0
	p.EachEntry(func(r, v int32) {
		er[k], ev[k] = r, v
		k++
	})
	return er, ev
}

// EachEntry calls put with the row and var of each of the plate's
// Jacobian entries, in order.
func (p *Plate) EachEntry(put func(r, v int32)) {
	nx, ny, nxy := int32(p.NX), int32(p.NY), int32(p.NX*p.NY)
	nz := int32(p.nz)
	c := int32(0)
	for k := range nz {
		for j := range ny {
			for i := range nx {
				put(c, c)
				if i > 0 {
					put(c, c-1)
				}
				if i < nx-1 {
					put(c, c+1)
				}
				if j > 0 {
					put(c, c-nx)
				}
				if j < ny-1 {
					put(c, c+nx)
				}
				if k > 0 {
					put(c, c-nxy)
				}
				if k < nz-1 {
					put(c, c+nxy)
				}
				c++
			}
		}
	}
	for _, jn := range p.joins {
		if jn.entry < 0 {
			continue
		}
		node := int32(p.n + jn.pos)
		for _, c := range jn.cells {
			put(c, node)
			put(node, c)
		}
		put(node, node)
	}
}

// parallelCells is the number of cells above which Eval splits the cells
// among goroutines.
const parallelCells = 20000

// plateAcc gathers what one part of the cells sends to the join nodes: the
// heat into each node (by position) and each join's (node, node)
// derivative.
type plateAcc struct {
	r  []float64
	nn []float64
}

// Eval adds the heat into every cell (conduction from its neighbours minus
// what leaves through joins) and into every join node, with exact
// derivatives. Each cell's row gathers its own neighbours' flows, so the
// rows split among goroutines without sharing: a link's flow is G·(a − b)
// in one row and G·(b − a) in the other, exact negatives. The join nodes'
// rows are gathered per part and added in order afterwards.
func (p *Plate) Eval(s *State, l *Local) {
	parts := 1
	if p.n > parallelCells {
		parts = min(runtime.GOMAXPROCS(0), p.n/(parallelCells/2))
	}
	accs := make([]plateAcc, parts)
	buf := make([]float64, parts*(len(p.nodes)+len(p.joins)))
	for w := range accs {
		accs[w].r, buf = buf[:len(p.nodes)], buf[len(p.nodes):]
		accs[w].nn, buf = buf[:len(p.joins)], buf[len(p.joins):]
	}
	needN := make([]bool, len(p.nodes))
	for i := range p.nodes {
		needN[i] = l.Needs(p.n + i)
	}
	if parts == 1 {
		p.evalCells(s, l, 0, p.n, &accs[0], needN)
	} else {
		var wg sync.WaitGroup
		for w := range parts {
			c0, c1 := p.n*w/parts, p.n*(w+1)/parts
			wg.Go(func() { p.evalCells(s, l, c0, c1, &accs[w], needN) })
		}
		wg.Wait()
	}
	for w := range accs {
		for i, q := range accs[w].r {
			l.R[p.n+i] += q
		}
	}
	if l.J == nil {
		return
	}
	for i, jn := range p.joins {
		if needN[jn.pos] && jn.entry >= 0 {
			nn := 0.0
			for w := range accs {
				nn += accs[w].nn[i]
			}
			l.E(jn.entry+2*len(jn.cells), nn)
		}
	}
}

// evalCells evaluates the rows of cells c0 ≤ c < c1 and their joins.
func (p *Plate) evalCells(s *State, l *Local, c0, c1 int, acc *plateAcc, needN []bool) {
	t := s.X[p.Base : p.Base+p.n]
	for c := c0; c < c1; {
		line := c / p.NX
		i0 := c - line*p.NX
		i1 := min(p.NX, i0+c1-c)
		if l.J != nil {
			p.lineJacobian(t, l, line, i0, i1)
		} else {
			p.lineResidual(t, l.R, line, i0, i1)
		}
		c += i1 - i0
	}
	for ji := range p.joins {
		jn := &p.joins[ji]
		lo := sort.Search(len(jn.cells), func(q int) bool { return int(jn.cells[q]) >= c0 })
		hi := lo + sort.Search(len(jn.cells)-lo, func(q int) bool { return int(jn.cells[lo+q]) >= c1 })
		if lo == hi {
			continue
		}
		tn := s.X[jn.node]
		wantN := l.J != nil && needN[jn.pos] && jn.entry >= 0
		qsum, nn := 0.0, 0.0
		diag := diagCursor{p: p, end: -1}
		switch jn.kind {
		case joinLinear:
			for q := lo; q < hi; q++ {
				c := int(jn.cells[q])
				g := jn.share[q]
				f := g * (t[c] - tn)
				l.R[c] -= f
				qsum += f
				if wantN {
					l.E(jn.entry+2*q, g)
					l.E(jn.entry+2*q+1, g)
					nn -= g
				}
				if l.J != nil {
					l.E(diag.at(c), -g)
				}
			}
		case joinNatural:
			// q = h·A·ΔT with h a function of both temperatures: the
			// correlation is evaluated twice per cell for its two exact
			// derivatives (dual numbers seeded on each).
			for q := lo; q < hi; q++ {
				c := int(jn.cells[q])
				a := jn.share[q]
				tc := t[c]
				dT := tc - tn
				if l.J == nil {
					f := a * jn.natural.surfaceH(s, dual.C(tc), dual.C(tn)).V * dT
					l.R[c] -= f
					qsum += f
					continue
				}
				hc := jn.natural.surfaceH(s, dual.Num{V: tc, D: 1}, dual.C(tn))
				f := a * hc.V * dT
				l.R[c] -= f
				qsum += f
				dc := a * (hc.V + hc.D*dT)
				if wantN {
					hn := jn.natural.surfaceH(s, dual.C(tc), dual.Num{V: tn, D: 1})
					dn := a * (hc.V - hn.D*dT)
					l.E(jn.entry+2*q, dn)
					l.E(jn.entry+2*q+1, dc)
					nn -= dn
				}
				l.E(diag.at(c), -dc)
			}
		case joinRadiation:
			tn3 := tn * tn * tn
			tn4 := tn3 * tn
			for q := lo; q < hi; q++ {
				c := int(jn.cells[q])
				sh := jn.share[q]
				tc := t[c]
				tc3 := tc * tc * tc
				f := sh * (tc3*tc - tn4)
				l.R[c] -= f
				qsum += f
				if l.J != nil {
					dc := 4 * sh * tc3
					if wantN {
						dn := 4 * sh * tn3
						l.E(jn.entry+2*q, dn)
						l.E(jn.entry+2*q+1, dc)
						nn -= dn
					}
					l.E(diag.at(c), -dc)
				}
			}
		}
		acc.r[jn.pos] += qsum
		acc.nn[ji] += nn
	}
}

// diagCursor finds the diagonal entries of cells in increasing order,
// dividing only when a cell is on a new line.
type diagCursor struct {
	p                 *Plate
	first, end, start int // the line's first cell, one past its last, its first entry
	e                 int // the line's entries per cell besides x neighbours
}

// at returns the entry of cell c's diagonal.
func (d *diagCursor) at(c int) int {
	if c < d.first || c >= d.end {
		p := d.p
		line := c / p.NX
		k := line / p.NY
		d.first, d.end = line*p.NX, (line+1)*p.NX
		d.start, d.e = p.lineStart[line], p.perCell(line-k*p.NY, k)
	}
	i := c - d.first
	return d.start + i*d.e + max(i-1, 0) + min(i, d.p.NX-1)
}

// lineGeometry returns what the cells of a line share: the conductances to
// their neighbours (0 where there is none) and the offset of the line's
// cells in the mesh.
func (p *Plate) lineGeometry(line int) (base int, gx, gym, gyp, gzm, gzp float64) {
	k := line / p.NY
	j := line - k*p.NY
	gx = p.gx[k]
	if j > 0 {
		gym = p.gy[k]
	}
	if j < p.NY-1 {
		gyp = p.gy[k]
	}
	if k > 0 {
		gzm = p.gz[k-1]
	}
	if k < p.nz-1 {
		gzp = p.gz[k]
	}
	return line * p.NX, gx, gym, gyp, gzm, gzp
}

// lineResidual adds the conduction into cells i0 ≤ i < i1 of a line.
func (p *Plate) lineResidual(t, r []float64, line, i0, i1 int) {
	base, gx, gym, gyp, gzm, gzp := p.lineGeometry(line)
	nx, nxy := p.NX, p.NX*p.NY
	for i := i0; i < i1; i++ {
		c := base + i
		tc := t[c]
		q := 0.0
		if i > 0 {
			q += gx * (t[c-1] - tc)
		}
		if i < nx-1 {
			q += gx * (t[c+1] - tc)
		}
		if gym > 0 {
			q += gym * (t[c-nx] - tc)
		}
		if gyp > 0 {
			q += gyp * (t[c+nx] - tc)
		}
		if gzm > 0 {
			q += gzm * (t[c-nxy] - tc)
		}
		if gzp > 0 {
			q += gzp * (t[c+nxy] - tc)
		}
		r[c] += q
	}
}

// lineJacobian adds the conduction into cells i0 ≤ i < i1 of a line and
// its derivatives.
func (p *Plate) lineJacobian(t []float64, l *Local, line, i0, i1 int) {
	r := l.R
	base, gx, gym, gyp, gzm, gzp := p.lineGeometry(line)
	nx, nxy := p.NX, p.NX*p.NY
	e := 1
	for _, g := range []float64{gym, gyp, gzm, gzp} {
		if g > 0 {
			e++
		}
	}
	at := p.lineStart[line] + p.inLine(i0, e)
	for i := i0; i < i1; i++ {
		c := base + i
		tc := t[c]
		q, g := 0.0, 0.0
		d := at
		at++
		if i > 0 {
			q += gx * (t[c-1] - tc)
			g += gx
			l.E(at, gx)
			at++
		}
		if i < nx-1 {
			q += gx * (t[c+1] - tc)
			g += gx
			l.E(at, gx)
			at++
		}
		if gym > 0 {
			q += gym * (t[c-nx] - tc)
			g += gym
			l.E(at, gym)
			at++
		}
		if gyp > 0 {
			q += gyp * (t[c+nx] - tc)
			g += gyp
			l.E(at, gyp)
			at++
		}
		if gzm > 0 {
			q += gzm * (t[c-nxy] - tc)
			g += gzm
			l.E(at, gzm)
			at++
		}
		if gzp > 0 {
			q += gzp * (t[c+nxy] - tc)
			g += gzp
			l.E(at, gzp)
			at++
		}
		r[c] += q
		l.E(d, -g)
	}
}

// Stored adds each cell's stored energy C·T (J, relative to 0 K) and its
// heat capacity C on the cell's diagonal; the join nodes' rows get
// nothing. A plate without heat capacity adds nothing.
func (p *Plate) Stored(s *State, l *Local) {
	if !p.stores {
		return
	}
	t := s.X[p.Base : p.Base+p.n]
	for line := range p.NY * p.nz {
		k := line / p.NY
		j := line - k*p.NY
		c0 := line * p.NX
		cp := p.cap[k]
		for i := range p.NX {
			l.R[c0+i] += cp * t[c0+i]
		}
		if l.J == nil {
			continue
		}
		e := p.perCell(j, k)
		for i := range p.NX {
			l.E(p.lineStart[line]+p.inLine(i, e), cp)
		}
	}
}
