package duct

import (
	"math"
	"testing"

	"github.com/heatgraph/heatgraph/elements/dual"
)

// near reports whether got is within the relative tolerance tol of want.
func near(got, want, tol float64) bool {
	return math.Abs(got-want) <= tol*math.Abs(want)
}

// checkDerivative compares the dual derivative of g at (re, pr) with a central
// difference of its value, along Re alone, Pr alone and both together. The
// seed directions are relative (dRe = Re), so one step size fits every point.
func checkDerivative(t *testing.T, name string, g func(re, pr dual.Num) dual.Num, re, pr float64) {
	t.Helper()
	const h = 1e-6
	for _, dir := range [][2]float64{{1, 0}, {0, 1}, {1, -0.5}} {
		dre, dpr := dir[0]*re, dir[1]*pr
		v := g(dual.Num{V: re, D: dre}, dual.Num{V: pr, D: dpr})
		plus := g(dual.C(re+h*dre), dual.C(pr+h*dpr)).V
		minus := g(dual.C(re-h*dre), dual.C(pr-h*dpr)).V
		fd := (plus - minus) / (2 * h)
		if math.Abs(v.D-fd) > 1e-6*math.Abs(fd)+1e-9*math.Abs(v.V) {
			t.Errorf("%s at Re = %g, Pr = %g, direction %v: dual derivative %.10g, central difference %.10g",
				name, re, pr, dir, v.D, fd)
		}
	}
}
