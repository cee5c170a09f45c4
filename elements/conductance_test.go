package elements

import (
	"math"
	"testing"
)

func TestConductanceConstructors(t *testing.T) {
	// Fourier's law for a plane wall, G = kA/L (Incropera et al. eq. 3.6):
	// aluminium 200 W/(m K), 10 cm², 5 mm -> 40 W/K.
	slab, err := Slab(0, 1, 200, 10e-4, 5e-3)
	if err != nil || math.Abs(slab.G-40) > 1e-12 {
		t.Fatalf("Slab: G = %v, err %v; want 40 W/K", slab, err)
	}
	// Contact: R″ = 0.5 K·cm²/W = 0.5e-4 K·m²/W over 4 cm² -> 0.125 K/W, 8 W/K.
	c, err := Contact(0, 1, 0.5e-4, 4e-4)
	if err != nil || math.Abs(c.G-8) > 1e-12 {
		t.Fatalf("Contact: %v, %v; want 8 W/K", c, err)
	}
	r, _ := Resistance(0, 1, 0.25)
	if r.G != 4 {
		t.Errorf("Resistance 0.25 K/W: G = %g, want 4", r.G)
	}
	h, _ := FixedConvection(0, 1, 10, 0.02)
	if math.Abs(h.G-0.2) > 1e-15 {
		t.Errorf("FixedConvection 10 W/(m² K) × 0.02 m²: G = %g, want 0.2", h.G)
	}
	for _, bad := range []func() error{
		func() error { _, err := Slab(0, 1, 0, 1, 1); return err },
		func() error { _, err := Slab(0, 1, 1, -1, 1); return err },
		func() error { _, err := Contact(0, 1, 1, math.Inf(1)); return err },
		func() error { _, err := Resistance(0, 1, math.NaN()); return err },
		func() error { _, err := FixedConvection(0, 1, 1, 0); return err },
	} {
		if bad() == nil {
			t.Error("non-positive or non-finite input accepted")
		}
	}
}

func TestConductanceStamp(t *testing.T) {
	c := &Conductance{A: 0, B: 1, G: 2.5}
	r := stampAt(c, testEnv, []float64{330, 310})
	if r.q[0] != -50 || r.q[1] != 50 {
		t.Errorf("heat into A, B = %v, want -50, +50 W", r.q)
	}
	checkJacobian(t, "conductance", c, []float64{330, 310}, 1e-8)
	checkConserves(t, "conductance", c, []float64{330, 310})
}

func TestHeatInput(t *testing.T) {
	h := &HeatInput{Node: 1, Q: 7.5}
	r := stampAt(h, testEnv, []float64{300, 300})
	if r.q[1] != 7.5 || r.q[0] != 0 {
		t.Errorf("heat = %v, want [0 7.5]", r.q)
	}
	if h.Power(nil) != 7.5 {
		t.Error("Power should return Q")
	}
	checkJacobian(t, "heat input", h, []float64{300, 300}, 1e-8)
}
