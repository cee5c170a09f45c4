package duct

import (
	"math"
	"testing"

	"github.com/heatgraph/heatgraph/elements/dual"
)

func TestSmoothFriction(t *testing.T) {
	// Hand, Colebrook (1939) iterated, Haaland (1983), Churchill (1977),
	// Petukhov (1970); smooth walls.
	checks := []struct {
		name      string
		got, want float64
	}{
		{"Colebrook 1e5", Colebrook(dual.C(1e5), 0).V, 0.01799},
		{"Haaland 1e5", Haaland(dual.C(1e5), 0).V, 0.01782},
		{"Churchill 1e5", Churchill(dual.C(1e5), 0).V, 0.01787},
		{"Petukhov 1e5", Petukhov(dual.C(1e5)).V, 0.01799},
		{"Colebrook 1e4", Colebrook(dual.C(1e4), 0).V, 0.03088},
		{"Haaland 1e4", Haaland(dual.C(1e4), 0).V, 0.03089},
		{"Churchill 1e4", Churchill(dual.C(1e4), 0).V, 0.03100},
		{"Churchill 1000 (= 64/Re)", Churchill(dual.C(1000), 0).V, 0.06400},
	}
	for _, c := range checks {
		if !near(c.got, c.want, 1e-3) {
			t.Errorf("%s = %.5f, want %.5f", c.name, c.got, c.want)
		}
	}
}

func TestRoughFriction(t *testing.T) {
	// Hand, e = 1e-3, Re = 1e5: Colebrook 0.022175 (fixed-point iteration of
	// 1/sqrt(f) = -2 log10(e/3.7 + 2.51/(Re sqrt(f)))), Haaland 0.021966,
	// Churchill 0.022343.
	re := dual.C(1e5)
	if got := Colebrook(re, 1e-3).V; !near(got, 0.0221745, 1e-5) {
		t.Errorf("Colebrook = %.7f, want 0.0221745", got)
	}
	if got := Haaland(re, 1e-3).V; !near(got, 0.0219662, 1e-5) {
		t.Errorf("Haaland = %.7f, want 0.0219662", got)
	}
	if got := Churchill(re, 1e-3).V; !near(got, 0.0223432, 1e-5) {
		t.Errorf("Churchill = %.7f, want 0.0223432", got)
	}
}

func TestColebrookResidual(t *testing.T) {
	// The iterated value satisfies Colebrook (1939) to machine precision.
	for _, re := range []float64{4000, 1e5, 1e8} {
		for _, e := range []float64{0, 1e-5, 1e-2} {
			f := Colebrook(dual.C(re), e).V
			x := 1 / math.Sqrt(f)
			if res := x + 2*math.Log10(e/3.7+2.51*x/re); math.Abs(res) > 1e-12*x {
				t.Errorf("Re %g, e %g: residual %g", re, e, res)
			}
		}
	}
}

func TestMuzychkaYovanovichF(t *testing.T) {
	// Hand, Darcy on Dh: sqrt(13.76^2/(Re L/Dh) + (fRe/Re)^2) with the Shah &
	// London fRe(0.25) = 72.936: Re = 1000, L/Dh = 20 gives 0.121600.
	fRe := ShahLondonFRe(0.25)
	if got := MuzychkaYovanovichF(dual.C(1000), fRe, 20).V; !near(got, 0.121600, 1e-5) {
		t.Errorf("f_app = %.6f, want 0.121600", got)
	}
	// Long duct: the fully developed fRe/Re (Shah & London 1978).
	if got := MuzychkaYovanovichF(dual.C(1000), fRe, 1e9).V; !near(got, fRe/1000, 1e-5) {
		t.Errorf("long duct f = %g, want %g", got, fRe/1000)
	}
}

func TestMuzychkaYovanovichFTube(t *testing.T) {
	// Consistency with Shah (1978), A correlation for laminar hydrodynamic
	// entry length solutions for circular and noncircular ducts, tube
	// (Fanning, from memory): f_app Re = 3.44/sqrt(x+) + (1.25/(4x+) + 16 -
	// 3.44/sqrt(x+))/(1 + 0.00021 x+^-2), x+ = L/(D Re). Hand values 109.82,
	// 38.545, 21.718, 16.310 at x+ = 0.001, 0.01, 0.05, 1; the model (Fanning
	// = Darcy/4) lies within 2.5 %.
	shah := map[float64]float64{0.001: 109.82, 0.01: 38.545, 0.05: 21.718, 1: 16.310}
	const re = 1000
	for xp, want := range shah {
		got := MuzychkaYovanovichF(dual.C(re), CircularFRe, xp*re).V * re / 4
		if !near(got, want, 0.025) {
			t.Errorf("x+ = %g: f_app Re = %.3f, Shah %.3f", xp, got, want)
		}
	}
}

func TestFrictionDerivatives(t *testing.T) {
	for _, re := range []float64{4000, 9990, 1.01e4, 1e5, 1e7} {
		for _, e := range []float64{0, 1e-4, 1e-2} {
			checkDerivative(t, "Churchill", func(re, _ dual.Num) dual.Num { return Churchill(re, e) }, re, 1)
			checkDerivative(t, "Colebrook", func(re, _ dual.Num) dual.Num { return Colebrook(re, e) }, re, 1)
			checkDerivative(t, "Haaland", func(re, _ dual.Num) dual.Num { return Haaland(re, e) }, re, 1)
		}
	}
	// Churchill also spans the laminar range.
	for _, re := range []float64{10, 500, 2250, 2350} {
		checkDerivative(t, "Churchill", func(re, _ dual.Num) dual.Num { return Churchill(re, 0) }, re, 1)
	}
	for _, re := range []float64{20, 300, 2250} {
		for _, ld := range []float64{2, 50, 1e4} {
			checkDerivative(t, "MuzychkaYovanovichF", func(re, _ dual.Num) dual.Num {
				return MuzychkaYovanovichF(re, 62.2, ld)
			}, re, 1)
		}
	}
}
