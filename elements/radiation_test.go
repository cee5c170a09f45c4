package elements

import (
	"math"
	"testing"
)

func TestRadiationSmallBody(t *testing.T) {
	// Small gray body ε = 0.9 at 330 K in surroundings at 300 K:
	// q″ = 191.8 W/m², h_r = 6.395 W/(m² K) (hand calculation from
	// q = εσA(T₁⁴ − T₂⁴), Incropera et al. eq. 1.7, σ from CODATA 2018).
	r, err := RadiationToSurroundings(0, 1, 0.9, 1, 1)
	if err != nil {
		t.Fatal(err)
	}
	rec := stampAt(r, testEnv, []float64{330, 300})
	if got := rec.q[1]; math.Abs(got-191.8)/191.8 > 1e-3 {
		t.Errorf("q″ = %.4f W/m², want 191.8", got)
	}
	rep := r.Report(&State{X: []float64{330, 300}})
	hr := rep.Details[1].Value * 0.9 // referred to the area, not the exchange area
	if math.Abs(hr-6.395)/6.395 > 1e-3 {
		t.Errorf("ε·h_r = %.4f W/(m² K), want 6.395", hr)
	}
	checkJacobian(t, "radiation", r, []float64{330, 300}, 1e-7)
	checkJacobian(t, "radiation", r, []float64{600, 250}, 1e-7)
	checkConserves(t, "radiation", r, []float64{330, 300})
}

func TestRadiationInputs(t *testing.T) {
	for _, c := range []struct{ eps, area, f float64 }{
		{0, 1, 1}, {1.01, 1, 1}, {0.5, 0, 1}, {0.5, 1, 0}, {0.5, 1, 1.2},
	} {
		if _, err := RadiationToSurroundings(0, 1, c.eps, c.area, c.f); err == nil {
			t.Errorf("ε %g, A %g, F %g accepted", c.eps, c.area, c.f)
		}
	}
	if _, err := RadiationToSurroundings(0, 1, 1, 1, 1); err != nil {
		t.Errorf("a black surface must be accepted: %v", err)
	}
}
