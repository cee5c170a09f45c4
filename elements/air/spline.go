package air

import "github.com/heatgraph/heatgraph/elements/dual"

// naturalSpline is a cubic spline with zero second derivative at both
// ends, continued beyond them by straight lines with the end slopes.
type naturalSpline struct {
	x, y []float64 // knots, x strictly increasing
	m    []float64 // second derivative at each knot
}

// newNaturalSpline fits a natural cubic spline through (x[i], y[i]). It
// needs at least three knots with x strictly increasing.
func newNaturalSpline(x, y []float64) naturalSpline {
	n := len(x)
	m := make([]float64, n)
	// Tridiagonal system for the interior second derivatives, solved by
	// the Thomas algorithm: sub[i]·m[i-1] + diag[i]·m[i] + sup[i]·m[i+1] = rhs[i].
	diag := make([]float64, n)
	rhs := make([]float64, n)
	for i := 1; i < n-1; i++ {
		h0, h1 := x[i]-x[i-1], x[i+1]-x[i]
		diag[i] = 2 * (h0 + h1)
		rhs[i] = 6 * ((y[i+1]-y[i])/h1 - (y[i]-y[i-1])/h0)
		if i > 1 {
			w := h0 / diag[i-1]
			diag[i] -= w * h0
			rhs[i] -= w * rhs[i-1]
		}
	}
	for i := n - 2; i >= 1; i-- {
		m[i] = (rhs[i] - (x[i+1]-x[i])*m[i+1]) / diag[i]
	}
	return naturalSpline{x: x, y: y, m: m}
}

// at evaluates the spline at t.
func (s naturalSpline) at(t dual.Num) dual.Num {
	n := len(s.x)
	switch {
	case t.V < s.x[0]:
		h := s.x[1] - s.x[0]
		slope := (s.y[1]-s.y[0])/h - (2*s.m[0]+s.m[1])*h/6
		return t.AddC(-s.x[0]).Scale(slope).AddC(s.y[0])
	case t.V > s.x[n-1]:
		h := s.x[n-1] - s.x[n-2]
		slope := (s.y[n-1]-s.y[n-2])/h + (s.m[n-2]+2*s.m[n-1])*h/6
		return t.AddC(-s.x[n-1]).Scale(slope).AddC(s.y[n-1])
	}
	i := 0
	for i < n-2 && t.V > s.x[i+1] {
		i++
	}
	h := s.x[i+1] - s.x[i]
	a := t.Neg().AddC(s.x[i+1]) // distance to the right knot
	b := t.AddC(-s.x[i])        // distance from the left knot
	cubic := a.Mul(a).Mul(a).Scale(s.m[i] / (6 * h)).Add(b.Mul(b).Mul(b).Scale(s.m[i+1] / (6 * h)))
	linear := a.Scale(s.y[i]/h - s.m[i]*h/6).Add(b.Scale(s.y[i+1]/h - s.m[i+1]*h/6))
	return cubic.Add(linear)
}
