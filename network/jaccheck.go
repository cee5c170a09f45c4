package network

import (
	"fmt"
	"math"
	"sort"

	"gonum.org/v1/gonum/diff/fd"
	"gonum.org/v1/gonum/mat"
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
// with a central finite difference of the assembled residual (gonum
// diff/fd), each variable stepped relative to its own size, and returns
// the worst entries (up to worst of them). Each entry's error is relative
// to the largest entry of its column, so that small derivatives beside
// large ones are judged fairly.
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
	y0 := make([]float64, n)
	for j, v := range x {
		// A variable near zero (a gauge pressure at the start) is stepped
		// relative to its kind's scale: a step far below it would drown
		// in the round-off of the other terms of its equations.
		sc[j] = math.Max(math.Abs(v), varKinds[p.KindOf(j)].Scale)
		y0[j] = x[j] / sc[j]
	}
	num := mat.NewDense(n, n, nil)
	xs := make([]float64, n)
	var evalErr error
	fd.Jacobian(num, func(fy, y []float64) {
		for j := range y {
			xs[j] = y[j] * sc[j]
		}
		if err := p.Evaluate(xs, fy, nil, nil); err != nil && evalErr == nil {
			evalErr = err
		}
	}, y0, &fd.JacobianSettings{Formula: fd.Central, Step: 1e-6})
	if evalErr != nil {
		return nil, fmt.Errorf("finite differences left the domain: %w", evalErr)
	}
	var all []JacobianEntry
	type pos struct{ i, j int }
	var at []pos
	for j := 0; j < n; j++ {
		col := 0.0
		for i := 0; i < n; i++ {
			num.Set(i, j, num.At(i, j)/sc[j])
			col = math.Max(col, math.Max(math.Abs(num.At(i, j)), math.Abs(jac.At(i, j))))
		}
		if col == 0 {
			continue
		}
		for i := 0; i < n; i++ {
			a, b := jac.At(i, j), num.At(i, j)
			if a == 0 && b == 0 {
				continue
			}
			e := math.Abs(a-b) / col
			all = append(all, JacobianEntry{Equation: net.Vars[net.unknown[i]].Equation(), Variable: p.Name(j), Analytic: a, Finite: b, Error: e})
			at = append(at, pos{i, j})
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
		e.Elements = net.elementsAt(net.unknown[at[i].i], net.unknown[at[i].j])
		out.Worst = append(out.Worst, e)
	}
	if len(out.Worst) > 0 {
		out.MaxError = out.Worst[0].Error
	}
	return out, nil
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
		hasRow, hasVar := false, false
		for _, rr := range el.Rows() {
			hasRow = hasRow || rr == r
		}
		for _, vv := range el.Vars() {
			hasVar = hasVar || vv == v
		}
		if hasRow && hasVar {
			names = append(names, net.elementName(e))
		}
	}
	return names
}

// elementName names element e of the assembly.
func (net *Network) elementName(e int) string {
	switch {
	case e < len(net.sources):
		return fmt.Sprintf("heat input of %q", net.Nodes[net.sources[e].Rows()[0]].ID)
	case e < len(net.sources)+len(net.stores):
		return fmt.Sprintf("heat capacity of %q", net.Nodes[net.stores[e-len(net.sources)].Rows()[0]].ID)
	}
	l := net.Links[e-len(net.sources)-len(net.stores)]
	return fmt.Sprintf("link %q (%s)", l.ID, l.Kind)
}
