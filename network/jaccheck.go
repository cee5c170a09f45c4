package network

import (
	"fmt"
	"math"
	"sort"
)

// JacobianEntry is one entry of the assembled Jacobian compared with its
// finite-difference estimate.
type JacobianEntry struct {
	Equation string   // the equation (row), by the variable it is paired with
	Variable string   // the variable (column)
	Analytic float64  // as the elements stamp it
	Finite   float64  // central finite difference of the assembled residual
	Error    float64  // |Analytic − Finite| relative to the column's largest entry
	Elements []string // the elements that stamp this entry
}

// JacobianCheck is the comparison of a whole problem's Jacobian with
// finite differences at one state.
type JacobianCheck struct {
	Unknowns int
	Worst    []JacobianEntry // the worst entries, worst first
	MaxError float64
}

// DefaultJacobianTolerance is the largest relative error a Jacobian check
// accepts: central differences with a relative step of 1e-6 are accurate
// to about 1e-9 relative on smooth flows, so anything above 1e-5 is a
// wrong derivative, not round-off.
const DefaultJacobianTolerance = 1e-5

// CheckJacobian compares the Jacobian the elements stamp at the unknowns x
// with a central finite difference of the assembled residual, each
// variable stepped relative to its own size (a relative step of 1e-6), and
// returns the worst entries (up to worst of them). Each entry's error is
// relative to the largest entry of its column, so that small derivatives
// beside large ones are judged fairly.
//
// Every column is differenced when the problem has at most
// FullCheckUnknowns unknowns. A larger one (a meshed plate of many cells)
// is checked on every unknown that is not a plate cell, on
// SampledCells cells spread evenly over the plates, and along
// three pseudo-random directions that move every unknown at once, whose
// mismatches are reported row by row as "a random direction": a wrong
// derivative anywhere shows in them. Each plate's own Jacobian is checked
// entry by entry by the tests of package elements.
func (net *Network) CheckJacobian(x []float64, worst int) (*JacobianCheck, error) {
	p := net.Steady()
	n := p.Size()
	out := &JacobianCheck{Unknowns: n}
	if n == 0 {
		return out, nil
	}
	jac := p.Pattern()
	f := make([]float64, n)
	if err := p.Evaluate(x, f, jac, nil); err != nil {
		return nil, err
	}
	sc := make([]float64, n)
	for j, v := range x {
		// A variable near zero (a gauge pressure at the start) is stepped
		// relative to its kind's scale: a step far below it would drown
		// in the round-off of the other terms of its equations.
		sc[j] = math.Max(math.Abs(v), varKinds[p.KindOf(j)].Scale)
	}
	const step = 1e-6
	xs := append([]float64(nil), x...)
	fp, fm, d := make([]float64, n), make([]float64, n), make([]float64, n)
	// along sets d to the central difference of F along the direction dir
	// (in units of sc), per unit of the step.
	along := func(dir func(j int) float64) error {
		for sign, dst := range [2][]float64{fp, fm} {
			h := step
			if sign == 1 {
				h = -step
			}
			for j := range xs {
				xs[j] = x[j] + h*sc[j]*dir(j)
			}
			if err := p.Evaluate(xs, dst, nil, nil); err != nil {
				return fmt.Errorf("finite differences left the domain: %w", err)
			}
		}
		for i := range d {
			d[i] = (fp[i] - fm[i]) / (2 * step)
		}
		return nil
	}
	// Columns of the stamped Jacobian: the transpose's rows.
	t := jac.Transpose()
	colPtr, colRow, colVal := t.RowPtr, t.Col, t.Val
	type pos struct{ i, j int }
	var all []JacobianEntry
	var at []pos
	for _, j := range net.checkColumns(p) {
		if err := along(func(k int) float64 {
			if k == j {
				return 1
			}
			return 0
		}); err != nil {
			return nil, err
		}
		col := 0.0
		stamped := map[int]float64{}
		for k := colPtr[j]; k < colPtr[j+1]; k++ {
			stamped[colRow[k]] = colVal[k]
			col = math.Max(col, math.Abs(colVal[k]))
		}
		for i := range d {
			d[i] /= sc[j]
			col = math.Max(col, math.Abs(d[i]))
		}
		if col == 0 {
			continue
		}
		for i := range d {
			a, b := stamped[i], d[i]
			if a == 0 && b == 0 {
				continue
			}
			all = append(all, JacobianEntry{Equation: net.varEquation(net.unknown[i]), Variable: p.Name(j), Analytic: a, Finite: b, Error: math.Abs(a-b) / col})
			at = append(at, pos{i, j})
		}
	}
	if n > FullCheckUnknowns {
		jv, mag := make([]float64, n), make([]float64, n)
		for r := range 3 {
			dir := func(j int) float64 { return directionSign(r, j) }
			if err := along(dir); err != nil {
				return nil, err
			}
			clear(jv)
			clear(mag)
			for i := 0; i < n; i++ {
				for k := jac.RowPtr[i]; k < jac.RowPtr[i+1]; k++ {
					t := jac.Val[k] * sc[jac.Col[k]] * dir(jac.Col[k])
					jv[i] += t
					mag[i] += math.Abs(t)
				}
			}
			for i := range d {
				m := math.Max(mag[i], math.Abs(d[i]))
				if m == 0 {
					continue
				}
				all = append(all, JacobianEntry{Equation: net.varEquation(net.unknown[i]), Variable: fmt.Sprintf("a random direction (%d of 3)", r+1),
					Analytic: jv[i], Finite: d[i], Error: math.Abs(jv[i]-d[i]) / m})
				at = append(at, pos{i, -1})
			}
		}
	}
	idx := make([]int, len(all))
	for k := range idx {
		idx[k] = k
	}
	sort.SliceStable(idx, func(a, b int) bool { return all[idx[a]].Error > all[idx[b]].Error })
	for k, i := range idx {
		if k == worst {
			break
		}
		e := all[i]
		col := -1
		if at[i].j >= 0 {
			col = net.unknown[at[i].j]
		}
		e.Elements = net.elementsAt(net.unknown[at[i].i], col)
		out.Worst = append(out.Worst, e)
	}
	if len(out.Worst) > 0 {
		out.MaxError = out.Worst[0].Error
	}
	return out, nil
}

// FullCheckUnknowns is the most unknowns for which CheckJacobian
// differences every column, and SampledCells the plate cells it
// differences in a larger problem.
const (
	FullCheckUnknowns = 2000
	SampledCells      = 200
)

// checkColumns returns the unknowns whose columns CheckJacobian
// differences: all of them in a small problem; else every unknown that is
// not a plate cell and SampledCells cells spread evenly.
func (net *Network) checkColumns(p *Steady) []int {
	n := p.Size()
	var cols, cells []int
	for u := 0; u < n; u++ {
		if n <= FullCheckUnknowns || net.Vars[net.unknown[u]].Cell == 0 {
			cols = append(cols, u)
		} else {
			cells = append(cells, u)
		}
	}
	if len(cells) == 0 {
		return cols
	}
	k := min(SampledCells, len(cells))
	for s := range k {
		cols = append(cols, cells[s*len(cells)/k])
	}
	sort.Ints(cols)
	return cols
}

// directionSign is component j of the r-th check direction: ±1 by a fixed
// hash of (r, j), so that the check is repeatable.
func directionSign(r, j int) float64 {
	h := uint64(j)*0x9E3779B97F4A7C15 + uint64(r+1)*0xBF58476D1CE4E5B9
	h ^= h >> 31
	h *= 0x94D049BB133111EB
	h ^= h >> 29
	if h&1 == 0 {
		return 1
	}
	return -1
}

// OffKinks returns x moved off the points where correlations have a kink:
// at the usual start every node is at ambient, where |ΔT| in natural
// convection has no derivative. Unknown i moves by (i+1)/100 of its kind's
// scale (0.01 K, 0.02 K, …), so that no two temperatures are equal.
func (p *Steady) OffKinks(x []float64) []float64 {
	y := append([]float64(nil), x...)
	for i := range y {
		y[i] += 0.01 * float64(i+1) * varKinds[p.KindOf(i)].Scale
	}
	return y
}

// elementsAt names the elements that stamp the entry of row variable r and
// column variable v.
func (net *Network) elementsAt(r, v int) []string {
	var names []string
	a := net.asm
	for e, el := range a.elems {
		hasRow := false
		for _, rr := range a.rows[a.rowStart[e]:a.rowStart[e+1]] {
			hasRow = hasRow || int(rr) == r
		}
		if !hasRow {
			continue
		}
		hasVar := v < 0
		if !hasVar {
			for _, vv := range el.Vars() {
				hasVar = hasVar || vv == v
			}
		}
		if hasVar {
			names = append(names, net.elementName(e))
		}
	}
	return names
}

// elementName names element e of the assembly.
func (net *Network) elementName(e int) string {
	switch {
	case e < len(net.sources):
		if r := net.sources[e].Rows(); len(r) == 1 && r[0] < len(net.Nodes) {
			return fmt.Sprintf("heat input of %q", net.Nodes[r[0]].ID)
		}
		return fmt.Sprintf("heat input of a region of plate %q", net.Vars[net.sources[e].Rows()[0]].Owner)
	case e < len(net.sources)+len(net.stores):
		return fmt.Sprintf("heat capacity of %q", net.Nodes[net.stores[e-len(net.sources)].Rows()[0]].ID)
	}
	l := net.Links[e-len(net.sources)-len(net.stores)]
	return fmt.Sprintf("link %q (%s)", l.ID, l.Kind)
}
