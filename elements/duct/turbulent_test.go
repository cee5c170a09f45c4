package duct

import (
	"testing"

	"github.com/heatgraph/heatgraph/elements/dual"
)

func TestTurbulentNusselt(t *testing.T) {
	// Hand, Gnielinski (1976) with Petukhov (1970); Dittus & Boelter (1930).
	re, pr := dual.C(1e4), dual.C(0.71)
	checks := []struct {
		name      string
		got, want float64
	}{
		{"Petukhov f, Re 1e4", Petukhov(re).V, 0.03148},
		{"Gnielinski, Re 1e4", GnielinskiNu(re, pr).V, 30.03},
		{"Dittus-Boelter heating", DittusBoelterNu(re, pr, true).V, 31.79},
		{"Dittus-Boelter cooling", DittusBoelterNu(re, pr, false).V, 32.89},
		{"Petukhov f, Re 3000", Petukhov(dual.C(3000)).V, 0.04556},
		{"Gnielinski, Re 3000", GnielinskiNu(dual.C(3000), pr).V, 10.05},
	}
	for _, c := range checks {
		if !near(c.got, c.want, 1e-3) {
			t.Errorf("%s = %.5g, want %.5g", c.name, c.got, c.want)
		}
	}
}

func TestShortDuctFactor(t *testing.T) {
	// Hand, 1 + (Dh/L)^(2/3): L/Dh = 20 gives 1.13572; L/Dh = 1 gives 2.
	if got := ShortDuctFactor(20); !near(got, 1.13572, 1e-5) {
		t.Errorf("factor(20) = %.5f, want 1.13572", got)
	}
	if got := ShortDuctFactor(1); got != 2 {
		t.Errorf("factor(1) = %g, want 2", got)
	}
}

func TestTurbulentDerivatives(t *testing.T) {
	for _, re := range []float64{3000, 9990, 1.01e4, 1e5, 3e6} {
		for _, pr := range []float64{0.7, 7} {
			checkDerivative(t, "Petukhov", func(re, _ dual.Num) dual.Num { return Petukhov(re) }, re, pr)
			checkDerivative(t, "GnielinskiNu", GnielinskiNu, re, pr)
			for _, heating := range []bool{true, false} {
				checkDerivative(t, "DittusBoelterNu", func(re, pr dual.Num) dual.Num {
					return DittusBoelterNu(re, pr, heating)
				}, re, pr)
			}
		}
	}
}
