package duct

import (
	"math"
	"testing"

	"github.com/heatgraph/heatgraph/elements/dual"
)

func TestKaysLondon(t *testing.T) {
	// Hand, fits to Kays & London (1984) charts [from memory]:
	// sigma = 0.5 gives Kc = 0.42*0.75 = 0.315 and Ke = 0.75^2 = 0.5625;
	// sigma = 0 gives Kc = 0.42 and Ke = 1 (= KExitPlenum); sigma = 1 gives 0.
	if got := KaysLondonKc(0.5); !near(got, 0.315, 1e-12) {
		t.Errorf("Kc(0.5) = %g, want 0.315", got)
	}
	if got := KaysLondonKe(0.5); !near(got, 0.5625, 1e-12) {
		t.Errorf("Ke(0.5) = %g, want 0.5625", got)
	}
	if KaysLondonKc(0) != 0.42 || KaysLondonKe(0) != KExitPlenum || KaysLondonKc(1) != 0 || KaysLondonKe(1) != 0 {
		t.Errorf("limits: Kc(0) %g, Ke(0) %g, Kc(1) %g, Ke(1) %g", KaysLondonKc(0), KaysLondonKe(0), KaysLondonKc(1), KaysLondonKe(1))
	}
}

func TestPressureDrop(t *testing.T) {
	// Hand: (0.03*50 + 1.5)*1.2*5^2/2 = 45 Pa.
	k := KEntrySharp + KExitPlenum
	if got := PressureDrop(dual.C(0.03), 50, k, dual.C(1.2), dual.C(5)).V; !near(got, 45, 1e-12) {
		t.Errorf("dp = %g Pa, want 45", got)
	}
	// Derivative along (f, rho, v) against a central difference.
	const h = 1e-6
	f0, rho0, v0 := 0.05, 1.1, 3.0
	df, drho, dv := 0.4*f0, -0.2*rho0, 0.7*v0
	dp := func(s float64) float64 {
		return PressureDrop(dual.C(f0+s*df), 20, k, dual.C(rho0+s*drho), dual.C(v0+s*dv)).V
	}
	got := PressureDrop(dual.Num{V: f0, D: df}, 20, k, dual.Num{V: rho0, D: drho}, dual.Num{V: v0, D: dv}).D
	want := (dp(h) - dp(-h)) / (2 * h)
	if math.Abs(got-want) > 1e-6*math.Abs(want) {
		t.Errorf("d(dp) = %g, central difference %g", got, want)
	}
}
