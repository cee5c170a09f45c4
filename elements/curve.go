package elements

import (
	"fmt"
	"math"

	"github.com/heatgraph/heatgraph/elements/dual"
)

// MonotoneCurve is a piecewise cubic Hermite interpolant through measured
// points (x_i, y_i) whose slopes are chosen by the method of Fritsch &
// Carlson, "Monotone piecewise cubic interpolation", SIAM J. Numer. Anal.
// 17(2), 1980: where the data rise (or fall) between two points, the curve
// rises (falls) too, and it never overshoots the data between points; at a
// local extremum of the data the slope is zero. Fan curves and filter
// tables are read through it. Beyond the ends it is continued by straight
// lines with the end slopes (callers may override this).
type MonotoneCurve struct {
	X, Y []float64 // knots, X strictly increasing
	M    []float64 // slope at each knot
}

// NewMonotoneCurve fits the curve; it needs at least two points with x
// strictly increasing.
func NewMonotoneCurve(x, y []float64) (MonotoneCurve, error) {
	n := len(x)
	if n < 2 || len(y) != n {
		return MonotoneCurve{}, fmt.Errorf("a curve needs at least two points, got %d", n)
	}
	for i := 1; i < n; i++ {
		if !(x[i] > x[i-1]) {
			return MonotoneCurve{}, fmt.Errorf("the flows of a curve must increase from point to point (point %d: %.4g after %.4g, in SI units)", i+1, x[i], x[i-1])
		}
	}
	d := make([]float64, n-1) // secant slopes
	for i := range d {
		d[i] = (y[i+1] - y[i]) / (x[i+1] - x[i])
	}
	m := make([]float64, n)
	m[0], m[n-1] = d[0], d[n-2]
	for i := 1; i < n-1; i++ {
		if d[i-1]*d[i] > 0 {
			m[i] = (d[i-1] + d[i]) / 2
		}
	}
	// Fritsch & Carlson's step 5: keep (α, β) inside the circle of radius 3,
	// a sufficient condition for monotonicity on each interval.
	for i, s := range d {
		if s == 0 {
			m[i], m[i+1] = 0, 0
			continue
		}
		a, b := m[i]/s, m[i+1]/s
		if a < 0 {
			m[i], a = 0, 0
		}
		if b < 0 {
			m[i+1], b = 0, 0
		}
		if r := a*a + b*b; r > 9 {
			t := 3 / math.Sqrt(r)
			m[i], m[i+1] = t*a*s, t*b*s
		}
	}
	return MonotoneCurve{X: append([]float64(nil), x...), Y: append([]float64(nil), y...), M: m}, nil
}

// At evaluates the curve at t with its derivative.
func (c MonotoneCurve) At(t dual.Num) dual.Num {
	n := len(c.X)
	switch {
	case t.V <= c.X[0]:
		return dual.Num{V: c.Y[0] + c.M[0]*(t.V-c.X[0]), D: c.M[0] * t.D}
	case t.V >= c.X[n-1]:
		return dual.Num{V: c.Y[n-1] + c.M[n-1]*(t.V-c.X[n-1]), D: c.M[n-1] * t.D}
	}
	i := 0
	for i < n-2 && t.V > c.X[i+1] {
		i++
	}
	h := c.X[i+1] - c.X[i]
	u := (t.V - c.X[i]) / h
	u2, u3 := u*u, u*u*u
	h00, h10, h01, h11 := 2*u3-3*u2+1, u3-2*u2+u, -2*u3+3*u2, u3-u2
	v := h00*c.Y[i] + h10*h*c.M[i] + h01*c.Y[i+1] + h11*h*c.M[i+1]
	// d/du of the basis, divided by h for d/dt.
	d00, d10, d01, d11 := 6*u2-6*u, 3*u2-4*u+1, -6*u2+6*u, 3*u2-2*u
	dv := (d00*c.Y[i]+d01*c.Y[i+1])/h + d10*c.M[i] + d11*c.M[i+1]
	return dual.Num{V: v, D: dv * t.D}
}
