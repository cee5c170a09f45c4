package dual

import (
	"math"
	"testing"
)

// Each function's derivative must match a central finite difference of its
// value (the definition of the derivative; step 1e-6, relative 1e-7).
func TestDerivativesMatchFiniteDifferences(t *testing.T) {
	cases := []struct {
		name string
		f    func(Num) Num
		x    float64
	}{
		{"add", func(a Num) Num { return a.Add(a.Scale(3)) }, 1.7},
		{"sub", func(a Num) Num { return C(2).Sub(a.Mul(a)) }, 0.4},
		{"mul", func(a Num) Num { return a.Mul(Exp(a)) }, 0.9},
		{"div", func(a Num) Num { return C(1).AddC(2).Div(a.AddC(1)) }, 2.5},
		{"inv", func(a Num) Num { return a.Inv() }, 0.3},
		{"neg", func(a Num) Num { return a.Neg().Mul(a) }, 1.1},
		{"sqrt", Sqrt, 2.0},
		{"pow 0.8", func(a Num) Num { return Pow(a, 0.8) }, 1e4},
		{"pow -2", func(a Num) Num { return Pow(a, -2) }, 3.0},
		{"pow 2", func(a Num) Num { return Pow(a, 2) }, 3.0},
		{"pow 1", func(a Num) Num { return Pow(a.Mul(a), 1) }, 3.0},
		{"pow 0.5", func(a Num) Num { return Pow(a, 0.5) }, 7.0},
		{"pow 1.5", func(a Num) Num { return Pow(a, 1.5) }, 300.0},
		{"pow 0.25", func(a Num) Num { return Pow(a, 0.25) }, 2e5},
		{"pow 1/6", func(a Num) Num { return Pow(a, 1.0/6) }, 2e5},
		{"pow 1/3", func(a Num) Num { return Pow(a, 1.0/3) }, 2e7},
		{"pown", func(a Num) Num { return PowN(a, a.Scale(0.5)) }, 1.3},
		{"exp", Exp, -0.7},
		{"log", Log, 5.0},
		{"log10", Log10, 50.0},
		{"tanh", Tanh, 0.6},
		{"cosh", Cosh, 0.6},
		{"sinh", Sinh, -0.6},
		{"atan", Atan, 1.4},
		{"abs-", Abs, -2.0},
		{"abs+", Abs, 2.0},
		{"expm1", Expm1, 1e-3},
		{"1-exp(-x)", OneMinusExpNeg, 0.25},
		{"max", func(a Num) Num { return Max(a, C(1)) }, 1.5},
		{"min", func(a Num) Num { return Min(a.Mul(a), a) }, 0.5},
	}
	const h = 1e-6
	for _, c := range cases {
		got := c.f(Var(c.x)).D
		want := (c.f(C(c.x+h*math.Max(1, math.Abs(c.x)))).V - c.f(C(c.x-h*math.Max(1, math.Abs(c.x)))).V) / (2 * h * math.Max(1, math.Abs(c.x)))
		if math.Abs(got-want) > 1e-7*math.Max(1, math.Abs(want)) {
			t.Errorf("%s at %g: derivative %.12g, finite difference %.12g", c.name, c.x, got, want)
		}
	}
}

// The powers taken by roots agree with math.Pow to a few units in the last
// place (math.Pow is not correctly rounded either: 2.5e7^1.5 is exactly
// 1.25e11, which the root gives and math.Pow misses by one unit).
func TestPowRootsAreMathPow(t *testing.T) {
	for _, p := range []float64{0.5, 1.5, 0.25, 1.0 / 3} {
		for _, x := range []float64{1e-3, 0.7, 293.15, 2.5e7} {
			got, want := Pow(C(x), p).V, math.Pow(x, p)
			if math.Abs(got-want) > 2e-15*want {
				t.Errorf("%g^%g = %.17g, math.Pow %.17g", x, p, got, want)
			}
		}
	}
}

func TestConstantsCarryNoDerivative(t *testing.T) {
	if d := Pow(C(2), 3.5).D; d != 0 {
		t.Errorf("Pow of a constant has derivative %g", d)
	}
	if v := OneMinusExpNeg(C(1e-12)).V; math.Abs(v-1e-12) > 1e-24 {
		t.Errorf("1 - exp(-1e-12) = %g, want 1e-12 without cancellation", v)
	}
}
