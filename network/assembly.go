package network

import (
	"math"
	"runtime"
	"sync"

	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/internal/bigmem"
	"github.com/heatgraph/heatgraph/sparse"
)

// assembly is the network's elements with every Jacobian position resolved
// once: evaluation only writes values. For element e, its rows are
// rows[rowStart[e]:rowStart[e+1]] (variables) and the position in the
// Jacobian's values of its entry (row a, var b) is
// slots[slotStart[e] + a·nv + b], or −1 where the row or the var is given;
// for a Patterned element, the position of its entry k is
// slots[slotStart[e] + k].
type assembly struct {
	elems     []elements.Element
	rowStart  []int32
	rows      []int32
	slotStart []int32
	slots     []int32
	nvars     []int32 // per element
	given     []bool  // per element and var (at varStart), whether the var is given
	varStart  []int32
	pattern   *sparse.Matrix // RowPtr and Col only
	maxR      int
	maxV      int
	storing   []int // indices of elements that implement elements.Storage
	entries   []int // per element, its number of entries if Patterned, else −1
	// temp marks the unknowns that are temperatures (checked to be
	// physical at every evaluation without reading the variables).
	temp []bool
	// runs are the unknowns in runs of consecutive variables (a plate's
	// cells are one), for copying between unknowns and variables.
	runs []run
}

// run is n unknowns from u whose variables are consecutive from v.
type run struct{ u, v, n int }

// unknownRuns returns the runs of unknown (unknown index → variable).
func unknownRuns(unknown []int) []run {
	var out []run
	for u, v := range unknown {
		if k := len(out) - 1; k >= 0 && out[k].v+out[k].n == v {
			out[k].n++
			continue
		}
		out = append(out, run{u: u, v: v, n: 1})
	}
	return out
}

// toUnknowns copies the variables' values vars into the unknowns' dst.
func (a *assembly) toUnknowns(dst, vars []float64) {
	for _, r := range a.runs {
		copy(dst[r.u:r.u+r.n], vars[r.v:r.v+r.n])
	}
}

// allElements returns every element: heat inputs, heat capacities, then
// links.
func (net *Network) allElements() []elements.Element {
	all := make([]elements.Element, 0, len(net.sources)+len(net.stores)+len(net.Links))
	all = append(all, net.sources...)
	all = append(all, net.stores...)
	for _, l := range net.Links {
		all = append(all, l.Element)
	}
	return all
}

// assemble builds the Jacobian pattern over the unknowns and resolves
// every element's positions in it. Each entry whose row and var are both
// unknowns is marked once, in element order; the builder tells where
// every mark lands, so no position is searched for.
func (net *Network) assemble() *assembly {
	a := &assembly{elems: net.allElements()}
	n := len(net.unknown)
	a.temp = bigmem.Make[bool](n)
	for u, v := range net.unknown {
		a.temp[u] = net.Vars[v].Kind == TemperatureVar
	}
	a.runs = unknownRuns(net.unknown)
	b := sparse.NewBuilder(n)
	ne := len(a.elems)
	a.entries = bigmem.Make[int](ne)
	a.rowStart = bigmem.Make[int32](ne + 1)
	a.slotStart = bigmem.Make[int32](ne + 1)
	a.nvars = bigmem.Make[int32](ne)
	a.varStart = bigmem.Make[int32](ne + 1)
	// Count first, so that nothing below reallocates and the builder
	// puts each mark straight into its row: a meshed plate has millions
	// of entries.
	type block struct {
		rows, vars []int
		er, ev     []int32 // entries of a Patterned element that does not list them
	}
	blocks := make([]block, ne)
	total := 0
	for e, el := range a.elems {
		bl := block{rows: el.Rows(), vars: el.Vars()}
		a.entries[e] = -1
		k := len(bl.rows) * len(bl.vars)
		if p, ok := el.(elements.Patterned); ok {
			k = 0
			count := func(r, v int32) {
				if fr := net.free[bl.rows[r]]; fr >= 0 && net.free[bl.vars[v]] >= 0 {
					b.Count(fr)
				}
				k++
			}
			if w, ok := el.(elements.EntryLister); ok {
				w.EachEntry(count)
			} else {
				bl.er, bl.ev = p.Entries()
				for i := range bl.er {
					count(bl.er[i], bl.ev[i])
				}
			}
			a.entries[e] = k
		} else {
			for _, r := range bl.rows {
				if fr := net.free[r]; fr >= 0 {
					for _, v := range bl.vars {
						if net.free[v] >= 0 {
							b.Count(fr)
						}
					}
				}
			}
		}
		total += k
		a.rowStart[e+1] = a.rowStart[e] + int32(len(bl.rows))
		a.varStart[e+1] = a.varStart[e] + int32(len(bl.vars))
		a.slotStart[e+1] = a.slotStart[e] + int32(k)
		a.nvars[e] = int32(len(bl.vars))
		a.maxR = max(a.maxR, len(bl.rows))
		a.maxV = max(a.maxV, len(bl.vars))
		if _, ok := el.(elements.Storage); ok {
			a.storing = append(a.storing, e)
		}
		blocks[e] = bl
	}
	a.slots = bigmem.Make[int32](total)
	a.rows = bigmem.Make[int32](int(a.rowStart[ne]))
	a.given = bigmem.Make[bool](int(a.varStart[ne]))
	// Mark: slots holds each entry's mark number for now, −1 where its
	// row or its var is given.
	mark := func(k int, fr, fv int) {
		if fr < 0 || fv < 0 {
			a.slots[k] = -1
			return
		}
		a.slots[k] = int32(b.Marks())
		b.Mark(fr, fv)
	}
	for e, bl := range blocks {
		for i, r := range bl.rows {
			a.rows[int(a.rowStart[e])+i] = int32(r)
		}
		for i, v := range bl.vars {
			a.given[int(a.varStart[e])+i] = net.free[v] < 0
		}
		k := int(a.slotStart[e])
		if a.entries[e] >= 0 {
			put := func(r, v int32) {
				mark(k, net.free[bl.rows[r]], net.free[bl.vars[v]])
				k++
			}
			if w, ok := a.elems[e].(elements.EntryLister); ok {
				w.EachEntry(put)
			} else {
				for i := range bl.er {
					put(bl.er[i], bl.ev[i])
				}
			}
		} else {
			for _, r := range bl.rows {
				fr := net.free[r]
				for _, v := range bl.vars {
					mark(k, fr, net.free[v])
					k++
				}
			}
		}
		blocks[e] = block{} // let a plate's lists go
	}
	var at []int32
	a.pattern, at = b.BuildSlots()
	a.pattern.Val = nil // only the pattern is kept: Steady.Pattern gives values
	for k, m := range a.slots {
		if m >= 0 {
			a.slots[k] = at[m]
		}
	}
	return a
}

// evaluator evaluates an assembly into per-variable sums; each Problem has
// its own, so that several may run at once. A Patterned element adds its
// derivatives straight into the Jacobian through its slots (local); every
// other element fills a dense block (dense) that is scattered after it.
type evaluator struct {
	a     *assembly
	local elements.Local
	dense elements.Local
}

// eval evaluates every element at s: flow into each variable's equation
// (all variables, given ones included) into sum, the magnitude of the
// terms into mag (when not nil), and derivatives into jac (when not nil),
// which it zeroes first.
func (ev *evaluator) eval(s *elements.State, sum, mag []float64, jac *sparse.Matrix) {
	clear(sum)
	if mag != nil {
		clear(mag)
	}
	if jac != nil {
		clearLarge(jac.Val)
	}
	a := ev.a
	for e, el := range a.elems {
		l := ev.reset(e, jac)
		el.Eval(s, l)
		ev.scatter(e, l, sum, mag, jac)
	}
}

// stored evaluates the stored energy of every storing element into sum and
// its derivatives into jac.
func (ev *evaluator) stored(s *elements.State, sum []float64, jac *sparse.Matrix) {
	clear(sum)
	if jac != nil {
		clearLarge(jac.Val)
	}
	a := ev.a
	for _, e := range a.storing {
		l := ev.reset(e, jac)
		a.elems[e].(elements.Storage).Stored(s, l)
		ev.scatter(e, l, sum, nil, jac)
	}
}

// reset sizes and zeroes the Local for element e and returns it: for a
// Patterned element, with jac's values and the element's slots when
// derivatives are wanted.
func (ev *evaluator) reset(e int, jac *sparse.Matrix) *elements.Local {
	a := ev.a
	nr, nv := int(a.rowStart[e+1]-a.rowStart[e]), int(a.nvars[e])
	var l *elements.Local
	if a.entries[e] >= 0 {
		l = &ev.local
		l.ResetEntries(nr, nv, 0, false)
		if jac != nil {
			l.J, l.Slot = jac.Val, a.slots[a.slotStart[e]:a.slotStart[e+1]]
		}
	} else {
		l = &ev.dense
		l.Reset(nr, nv, jac != nil)
	}
	l.Given = a.given[a.varStart[e]:a.varStart[e+1]]
	return l
}

// scatter adds element e's local values into the sums and, unless the
// element wrote them there itself, the Jacobian.
func (ev *evaluator) scatter(e int, l *elements.Local, sum, mag []float64, jac *sparse.Matrix) {
	a := ev.a
	r0 := a.rowStart[e]
	for k, r := range a.rows[r0:a.rowStart[e+1]] {
		sum[r] += l.R[k]
		if mag != nil {
			mag[r] += math.Abs(l.R[k])
		}
	}
	if jac != nil && l.Slot == nil {
		for k, slot := range a.slots[a.slotStart[e]:a.slotStart[e+1]] {
			if slot >= 0 {
				jac.Val[slot] += l.J[k]
			}
		}
	}
}

// clearLarge zeroes v: a long one (a meshed plate's Jacobian) in parts
// done at once, as one core alone does not reach the memory's speed.
func clearLarge(v []float64) {
	const part = 1 << 20
	parts := min(runtime.GOMAXPROCS(0), len(v)/part)
	if parts < 2 {
		clear(v)
		return
	}
	var wg sync.WaitGroup
	for w := range parts {
		lo, hi := len(v)*w/parts, len(v)*(w+1)/parts
		wg.Go(func() { clear(v[lo:hi]) })
	}
	wg.Wait()
}
