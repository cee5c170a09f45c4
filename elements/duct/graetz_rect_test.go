package duct

import (
	"math"
	"testing"

	"github.com/heatgraph/heatgraph/elements/dual"
)

// graetzRectMean returns the mean Nu_T (on Dh, per heated area) over
// x* = L/(Dh·Re·Pr) of the rectangle 1 × alpha with a developed velocity,
// the walls in heated at a uniform temperature and the others adiabatic,
// from a uniform inlet temperature: w·∂θ/∂x* = Dh²·∇²θ (w = u/ū, lengths in
// units of the long side) marched by implicit Euler on the grid of
// graetzNuT, about n cells across the gap.
func graetzRectMean(alpha float64, heated [4]bool, n int, xs []float64) []float64 {
	g := graetzGrid{nx: int(math.Round(float64(n) / alpha)), ny: n}
	g.hx, g.hy = 1/float64(g.nx), alpha/float64(g.ny)
	all := [4]bool{true, true, true, true}
	cells := g.nx * g.ny
	area := g.hx * g.hy
	u, b := make([]float64, cells), make([]float64, cells)
	for k := range b {
		b[k] = area
	}
	g.solve(b, u, all, g.diag(all))
	mean := 0.0
	for _, v := range u {
		mean += v
	}
	mean /= float64(cells)
	m := make([]float64, cells)
	wsum := 0.0
	for k := range m {
		m[k] = u[k] / mean * area
		wsum += m[k]
	}
	dh := 2 * alpha / (1 + alpha)
	perim := 2 * (1 + alpha)
	lengths := [4]float64{1, 1, alpha, alpha}
	ph := 0.0
	for s, h := range heated {
		if h {
			ph += lengths[s]
		}
	}
	// Energy: w ∂θ/∂x = (α_th/ū) ∇²θ; x* = x α_th/(Dh² ū) → w ∂θ/∂x* = Dh² ∇²θ.
	base := g.diag(heated)
	theta := make([]float64, cells)
	for k := range theta {
		theta[k] = 1
	}
	out := make([]float64, len(xs))
	x, dx := 0.0, 1e-7
	rhs := make([]float64, cells)
	k := 0
	// Each step solves (M + step·Dh²·A)·θ⁺ = M·θ.
	for k < len(xs) {
		step := math.Min(dx, xs[k]-x)
		c := step * dh * dh
		op := func(v, y []float64) {
			g.apply(v, y, heated)
			for i := range y {
				y[i] = m[i]*v[i] + c*y[i]
			}
		}
		diag := make([]float64, cells)
		for i := range diag {
			diag[i] = m[i] + c*base[i]
			rhs[i] = m[i] * theta[i]
		}
		cgSolve(op, rhs, theta, diag)
		x += step
		dx = math.Min(dx*1.03, 2e-3)
		if x >= xs[k]*(1-1e-12) {
			tb := 0.0
			for i := range theta {
				tb += m[i] * theta[i]
			}
			tb /= wsum
			out[k] = -math.Log(tb) / (4 * xs[k] * ph / perim)
			k++
		}
	}
	return out
}

// cgSolve solves op(x) = b by conjugate gradients with the Jacobi
// preconditioner diag, starting from x.
func cgSolve(op func(v, y []float64), b, x, diag []float64) {
	n := len(b)
	r, z, p, q := make([]float64, n), make([]float64, n), make([]float64, n), make([]float64, n)
	op(x, q)
	bn, rz := 0.0, 0.0
	for k := range r {
		r[k] = b[k] - q[k]
		bn += b[k] * b[k]
		z[k] = r[k] / diag[k]
		p[k] = z[k]
		rz += r[k] * z[k]
	}
	for it := 0; it < 10*n; it++ {
		op(p, q)
		pq := 0.0
		for k := range p {
			pq += p[k] * q[k]
		}
		a := rz / pq
		rr := 0.0
		for k := range x {
			x[k] += a * p[k]
			r[k] -= a * q[k]
			rr += r[k] * r[k]
		}
		if rr <= 1e-24*bn {
			return
		}
		rz2 := 0.0
		for k := range z {
			z[k] = r[k] / diag[k]
			rz2 += r[k] * z[k]
		}
		for k := range p {
			p[k] = z[k] + rz2/rz*p[k]
		}
		rz = rz2
	}
}

// The Hausen form with the Shah & London Nu_T of the heated walls, an
// engineering substitution for rectangles in thermal entry, against the
// numerical solution of the rectangular Graetz problem (graetzRectMean,
// this package's own; at x* ≥ 10⁻³ 12 and 24 cells across the gap agree
// within 4 %): within 12 % with all walls heated, α = 0.25 and 1, and
// within 20 % for one wall of a square duct, over 10⁻³ ≤ x* ≤ 0.3. The
// bounds are the documented accuracy of the substitution.
func TestRectangularThermalEntry(t *testing.T) {
	xs := []float64{1e-3, 3e-3, 0.01, 0.03, 0.1, 0.3}
	cases := []struct {
		alpha  float64
		heated [4]bool
		walls  Walls
		tol    float64
	}{{0.25, heatAll, AllWalls, 0.12}, {1, heatAll, AllWalls, 0.12}, {1, heatOneLong, OneLongWall, 0.20}}
	for _, c := range cases {
		ex := graetzRectMean(c.alpha, c.heated, 16, xs)
		d := Duct{Shape: Rectangular, Width: 0.01, Height: 0.01 * c.alpha, Length: 1, Heated: c.walls}
		for i, x := range xs {
			re, pr := 1000.0, 0.7
			d.Length = x * re * pr * d.Dh()
			got := Flow(d, dual.C(re), dual.C(pr), Options{Laminar: ThermalEntry}).Nu.V
			if !near(got, ex[i], c.tol) {
				t.Errorf("α %g, %v, x* %g: Nu_m %.3f, numerical %.3f", c.alpha, c.walls, x, got, ex[i])
			}
		}
	}
}
