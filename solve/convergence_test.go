package solve

import (
	"errors"
	"math"
	"strings"
	"testing"
)

// weakNode is two nodes held by conductances to a fixed temperature of 0:
// a strong one (G₀ = 1e3 W/K, 100 W in) and a weak one (G₁ = 1e-12 W/K,
// 1e-10 W in), so T₀ = 0.1 K and T₁ = 100 K exactly (Fourier's law by
// hand). The weak node carries a hundred-millionth of a millionth of the
// network's heat: judged against the whole network's 100 W its residual
// looks converged at any temperature, which is how a node over its limit
// was once reported as fine.
func weakNode() *funcProblem {
	const g0, g1, q0, q1 = 1e3, 1e-12, 100, 1e-10
	return &funcProblem{n: 2,
		f: func(x, f []float64) error {
			f[0] = q0 - g0*x[0]
			f[1] = q1 - g1*x[1]
			return nil
		},
		jac: func(_ []float64, j [][]float64) { j[0][0], j[1][1] = -g0, -g1 },
		mag: func(x, m []float64) {
			m[0] = q0 + math.Abs(g0*x[0])
			m[1] = q1 + math.Abs(g1*x[1])
		},
	}
}

func TestWeakNodeConvergesToItsOwnBalance(t *testing.T) {
	r := Newton(weakNode(), []float64{0, 0}, Settings{})
	if r.Reason != Converged {
		t.Fatalf("reason %v (%v)", r.Reason, r.Err)
	}
	if math.Abs(r.X[0]-0.1) > 1e-12 || math.Abs(r.X[1]-100) > 1e-7 {
		t.Errorf("x = %v, want [0.1 100]", r.X)
	}
}

// A node whose only link has zero slope at the start (q = G·x^(5/4), as
// natural convection whose coefficient grows as ΔT^¼) beside a strong node,
// with a heat input a billionth of the strong node's: the pseudo-transient
// start moves it by next to nothing. The iteration must not stop there:
// x₁ = (q₁/G₁)^(4/5) = 10^(4/5)·… by hand.
func TestNoConvergenceOnPseudoStep(t *testing.T) {
	const g1, q1 = 1e-10, 1e-9 // x₁^(5/4) = 10, x₁ = 10^0.8 = 6.30957 K
	p := &funcProblem{n: 2,
		f: func(x, f []float64) error {
			f[0] = 1 - math.Pow(math.Max(x[0], 0), 1.25)
			f[1] = q1 - g1*math.Pow(math.Max(x[1], 0), 1.25)
			return nil
		},
		jac: func(x []float64, j [][]float64) {
			j[0][0] = -1.25 * math.Pow(math.Max(x[0], 0), 0.25)
			j[1][1] = -1.25 * g1 * math.Pow(math.Max(x[1], 0), 0.25)
		},
		mag: func(x, m []float64) {
			m[0] = 1 + math.Pow(math.Max(x[0], 0), 1.25)
			m[1] = q1 + g1*math.Pow(math.Max(x[1], 0), 1.25)
		},
	}
	var pseudo int
	r := Newton(p, []float64{0, 0}, Settings{Monitor: func(it Iterate) {
		if it.Pseudo {
			pseudo++
		}
	}})
	if r.Reason != Converged {
		t.Fatalf("reason %v (%v)", r.Reason, r.Err)
	}
	if pseudo == 0 {
		t.Error("the start should have needed a pseudo-transient step")
	}
	if want := math.Pow(10, 0.8); math.Abs(r.X[1]-want) > 1e-6 || math.Abs(r.X[0]-1) > 1e-9 {
		t.Errorf("x = %v, want [1 %.6g]", r.X, want)
	}
}

// Kinds are judged and reported separately, in their own units.
func TestKindsReportedSeparately(t *testing.T) {
	// A "pressure" p and a "flow" m: p = 2·m², m = 3 → p = 18.
	prob := &funcProblem{n: 2,
		kinds: []Kind{
			{Name: "pressure", Unit: "Pa", Equation: "mass", EquationUnit: "kg/s", Scale: 1, MaxStep: 50},
			{Name: "flow", Unit: "kg/s", Equation: "momentum", EquationUnit: "Pa", Scale: 1e-3, MaxStep: 1},
		},
		kindOf: []int{0, 1},
		f: func(x, f []float64) error {
			f[0] = 3 - x[1]
			f[1] = x[0] - 2*x[1]*x[1]
			return nil
		},
		jac: func(x []float64, j [][]float64) {
			j[0][1] = -1
			j[1][0], j[1][1] = 1, -4*x[1]
		},
		mag: func(x, m []float64) {
			m[0] = 3 + math.Abs(x[1])
			m[1] = math.Abs(x[0]) + 2*x[1]*x[1]
		},
	}
	r := Newton(prob, []float64{0, 1}, Settings{})
	if r.Reason != Converged {
		t.Fatalf("reason %v (%v)", r.Reason, r.Err)
	}
	if math.Abs(r.X[0]-18) > 1e-9 || math.Abs(r.X[1]-3) > 1e-12 {
		t.Errorf("x = %v, want [18 3]", r.X)
	}
	if len(r.Kinds) != 2 || r.Kinds[0].Kind.Name != "pressure" || r.Kinds[1].Unknowns != 1 ||
		!r.Kinds[0].Converged || !r.Kinds[1].Converged {
		t.Errorf("kinds %+v", r.Kinds)
	}
}

// A group of unknowns with no path to anything given is named.
func TestFloatingNamed(t *testing.T) {
	// x0 is held (f0 = 1 − x0); x1 and x2 only exchange with each other.
	p := &funcProblem{n: 3, scale: 1,
		f: func(x, f []float64) error {
			f[0] = 1 - x[0]
			f[1] = 1 + (x[2] - x[1])
			f[2] = -1 + (x[1] - x[2])
			return nil
		},
		jac: func(_ []float64, j [][]float64) {
			j[0][0] = -1
			j[1][1], j[1][2] = -1, 1
			j[2][1], j[2][2] = 1, -1
		},
	}
	r := Newton(p, []float64{0, 0, 0}, Settings{MaxPseudoSteps: 3})
	if r.Reason != SingularJacobian || !errors.Is(r.Err, ErrSingular) {
		t.Fatalf("reason %v, err %v", r.Reason, r.Err)
	}
	if len(r.Floating) != 2 || r.Floating[0] != 1 || r.Floating[1] != 2 {
		t.Errorf("floating %v, want [1 2]", r.Floating)
	}
	if !strings.Contains(r.Err.Error(), "x1, x2") {
		t.Errorf("message %q does not name x1 and x2", r.Err)
	}
}

// A heat input that would drive a node below absolute zero ends with the
// reason, not with a bare line-search failure.
func TestLeftDomain(t *testing.T) {
	errBelow := errors.New("x0 at or below zero")
	p := &funcProblem{n: 1, scale: 1,
		f: func(x, f []float64) error {
			if x[0] <= 0 {
				return errBelow
			}
			f[0] = -10 - 1e-3*x[0] // no positive root
			return nil
		},
		jac: func(_ []float64, j [][]float64) { j[0][0] = -1e-3 },
	}
	r := Newton(p, []float64{300}, Settings{})
	if r.Reason != LeftDomain || !errors.Is(r.Err, errBelow) {
		t.Errorf("reason %v, err %v; want %v with the domain error", r.Reason, r.Err, LeftDomain)
	}
}
