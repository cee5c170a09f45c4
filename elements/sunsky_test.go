package elements

import (
	"math"
	"testing"
)

type ramp struct{ a, b float64 }

func (r ramp) At(t float64) float64 { return r.a + r.b*t }

// Absorbed sunlight is α_s·A·G (Incropera et al. §12.5): a lid of 0.12 m²
// with α_s = 0.25 (a value chosen for the test) under 900 W/m² absorbs 27 W;
// the profile is read at the state's time.
func TestSunAbsorbed(t *testing.T) {
	u, err := NewSun(0, 1, 0.25, 0.12, 900, nil)
	if err != nil {
		t.Fatal(err)
	}
	r := stampAt(u, testEnv, []float64{300, 290})
	if math.Abs(r.q[0]-27) > 1e-12 || r.q[1] != 0 {
		t.Errorf("flows %v, want [27 0]", r.q)
	}
	u.Of = ramp{100, 2}
	l := NewLocal(1, 0, true)
	u.Eval(&State{X: []float64{300, 290}, Time: 50, Env: testEnv}, l)
	if want := 0.25 * 0.12 * 200; math.Abs(l.R[0]-want) > 1e-12 {
		t.Errorf("at t = 50 s: %g W, want %g W", l.R[0], want)
	}
	if h := u.EnvironmentHeat(&State{Time: 50}); math.Abs(h-l.R[0]) > 0 {
		t.Errorf("environment heat %g W, stamped %g W", h, l.R[0])
	}
	var _ EnvironmentSource = u
	checkJacobian(t, "sun", u, []float64{300, 290}, 1e-6)
	for _, bad := range [][3]float64{{0, 1, 1}, {1.2, 1, 1}, {0.5, 0, 1}, {0.5, 1, -1}} {
		if _, err := NewSun(0, 1, bad[0], bad[1], bad[2], nil); err == nil {
			t.Errorf("NewSun(α %g, A %g, G %g) accepted", bad[0], bad[1], bad[2])
		}
	}
}

// Swinbank's clear-sky relation: T_sky = 0.0552·T_air^1.5, equivalent to
// a sky emission of 5.31e-13·T_air⁶ W/m² in Swinbank's own form (1963;
// the coefficient from memory): the two agree within 1.5 %.
func TestSwinbankSky(t *testing.T) {
	ts, _ := SwinbankSky(300)
	// 0.0552 × 300^1.5 = 0.0552 × 5196.152 = 286.83 K
	if math.Abs(ts-286.828) > 1e-3 {
		t.Errorf("T_sky at 300 K: %.4f K, want 286.828 K", ts)
	}
	for _, ta := range []float64{260, 280, 300, 320} {
		ts, _ := SwinbankSky(ta)
		l := StefanBoltzmann * math.Pow(ts, 4)
		want := 5.31e-13 * math.Pow(ta, 6)
		if math.Abs(l-want) > 0.015*want {
			t.Errorf("sky emission at %g K: %.2f W/m2, Swinbank %.2f W/m2", ta, l, want)
		}
	}
}

// Sky radiation: εσA[F(T⁴ − T_sky⁴) + (1 − F)(T⁴ − T_g⁴)] (Incropera eq.
// 1.7 split between sky and ground), by hand at stated temperatures, with
// exact derivatives, and conserving (what the surface loses, the
// surroundings node takes).
func TestSkyRadiation(t *testing.T) {
	k, err := NewSky(0, 1, 0.9, 0.2, 0.5)
	if err != nil {
		t.Fatal(err)
	}
	k.TSky = 270
	x := []float64{320, 300}
	r := stampAt(k, testEnv, x)
	c := 0.9 * StefanBoltzmann * 0.2
	want := c * (0.5*(math.Pow(320, 4)-math.Pow(270, 4)) + 0.5*(math.Pow(320, 4)-math.Pow(300, 4)))
	if math.Abs(-r.q[0]-want) > 1e-12*want {
		t.Errorf("heat lost %.9g W, want %.9g W", -r.q[0], want)
	}
	checkConserves(t, "sky", k, x)
	checkJacobian(t, "sky, given", k, x, 1e-6)
	k.Swinbank = true
	checkJacobian(t, "sky, Swinbank", k, x, 1e-6)
	checkConserves(t, "sky, Swinbank", k, x)
	// Seeing only sky, a surface at the sky temperature exchanges nothing.
	k2, _ := NewSky(0, 1, 0.8, 1, 1)
	k2.Swinbank = true
	ts, _ := SwinbankSky(300)
	if r := stampAt(k2, testEnv, []float64{ts, 300}); math.Abs(r.q[0]) > 1e-9 {
		t.Errorf("surface at the sky temperature loses %g W", -r.q[0])
	}
	for _, bad := range [][3]float64{{0, 1, 1}, {0.9, 0, 1}, {0.9, 1, 0}, {0.9, 1, 1.1}} {
		if _, err := NewSky(0, 1, bad[0], bad[1], bad[2]); err == nil {
			t.Errorf("NewSky(ε %g, A %g, F %g) accepted", bad[0], bad[1], bad[2])
		}
	}
}
