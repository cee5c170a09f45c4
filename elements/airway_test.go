package elements

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/elements/dual"
	"github.com/heatgraph/heatgraph/elements/duct"
)

// flowEnv is an environment with the enthalpy of air in it (testEnv has
// none): 20 °C ambient, c_p of air there (Incropera et al., Table A.4).
var flowEnv = &Env{Pressure: 101325, Gravity: StandardGravity, AmbientT: 293.15, AirCp: 1007}

// A branch's variables in these tests: T_a, T_b, p_a, p_b, ṁ.
func testBranch(law FlowLaw) *Combined {
	return Combine(&Stream{Up: 0, Down: 1, Flow: 4, Reversible: true},
		NewAirway(Airway{From: 0, To: 1, PFrom: 2, PTo: 3, Flow: 4, Law: law,
			ZFrom: 0.3, ZTo: 0.1, ZOpen: 0.5, ColumnFrom: true, ColumnTo: true}))
}

func testLaws(t *testing.T) map[string]FlowLaw {
	t.Helper()
	loss, _ := NewLoss(2.5, 8e-4)
	table, err := NewTableLoss([]float64{0.005, 0.01, 0.02}, []float64{6, 18, 60})
	if err != nil {
		t.Fatal(err)
	}
	curve, err := NewMonotoneCurve([]float64{0, 0.005, 0.01, 0.015}, []float64{80, 70, 40, 0})
	if err != nil {
		t.Fatal(err)
	}
	fan, err := NewFan(Fan{Curve: curve, CurveDensity: 1.2, CurveSpeed: 3000, Speed: 2500})
	if err != nil {
		t.Fatal(err)
	}
	stopped, err := NewFan(Fan{Curve: curve, CurveDensity: 1.2, Stopped: true, StoppedLoss: loss})
	if err != nil {
		t.Fatal(err)
	}
	holes, err := Passages(duct.Duct{Shape: duct.Circular, Diameter: 4e-3, Length: 0.05}, 40)
	if err != nil {
		t.Fatal(err)
	}
	sink, err := PlateFinSink(12, 1e-3, 20e-3, 50e-3, 60e-3, 200)
	if err != nil {
		t.Fatal(err)
	}
	return map[string]FlowLaw{"loss": loss, "resistance": &FlowResistance{R: 2e5}, "table": table, "fan": fan, "stopped fan": stopped,
		"channels": &ChannelFlow{Geometry: holes}, "heat sink": &ChannelFlow{Geometry: sink, Upstream: 0.02}}
}

// Every law's branch, forward, reversed, near zero and beyond the ends of
// its curve, against finite differences; mass and energy conserved.
func TestBranchJacobianAndConservation(t *testing.T) {
	for name, law := range testLaws(t) {
		for _, x := range [][]float64{
			{320, 300, 12, -3, 4e-3},
			{310, 335, -5, 20, -6e-3},
			{330, 300, 0.5, 0.4, 2e-5},
			{300, 300, 2, 1, 0.03},   // beyond the end of the curves
			{300, 300, 2, 90, -0.01}, // backwards through a fan
		} {
			el := testBranch(law)
			checkJacobianIn(t, fmt.Sprintf("%s at %v", name, x), flowEnv, el, x, 1e-6)
			r := stampAt(el, flowEnv, x)
			if e := r.q[0] + r.q[1]; math.Abs(e) > 1e-12*(math.Abs(r.q[0])+1e-9) {
				t.Errorf("%s: energy not conserved: %g W", name, e)
			}
			if m := r.q[2] + r.q[3]; m != 0 || math.Abs(r.q[3]-x[4]) > 0 {
				t.Errorf("%s: mass rows %g and %g kg/s for a flow of %g kg/s", name, r.q[2], r.q[3], x[4])
			}
		}
	}
}

// Inside the smooth upwind switch (|ṁ| of order ε) the stamped
// derivatives are exact too.
func TestUpwindSwitchJacobian(t *testing.T) {
	s := &Stream{Up: 0, Down: 1, Flow: 2, Reversible: true}
	for _, m := range []float64{3e-9, -7e-9, 2e-8} {
		checkJacobianIn(t, fmt.Sprintf("stream at %g kg/s", m), flowEnv, s, []float64{330, 310, m}, 1e-6)
		checkConservesIn(t, s, []float64{330, 310, m})
	}
}

func checkConservesIn(t *testing.T, el Element, x []float64) {
	t.Helper()
	r := stampAt(el, flowEnv, x)
	if e := r.q[0] + r.q[1]; math.Abs(e) > 1e-12*(math.Abs(r.q[0])+1e-12) {
		t.Errorf("energy not conserved: %g W", e)
	}
}

// The smooth upwind switch carries the upstream air's heat, within
// ε²/(4ṁ²) of it, in either direction.
func TestUpwindSwitch(t *testing.T) {
	s := &Stream{Up: 0, Down: 1, Flow: 2, Reversible: true}
	for _, m := range []float64{1e-3, -1e-3} {
		x := []float64{330, 310, m}
		h, _, _, _ := s.carried(&State{X: x, Env: flowEnv})
		up := x[0]
		if m < 0 {
			up = x[1]
		}
		want := m * flowEnv.AirCp * (up - flowEnv.AmbientT)
		if math.Abs(h-want) > 1e-9*math.Abs(want) {
			t.Errorf("ṁ = %g: carried %.12g W, want %.12g W", m, h, want)
		}
	}
}

// Fritsch & Carlson (1980): the interpolant is monotone where the data
// are, never overshoots between points, is flat at a local extremum of
// the data, passes through every point, and reproduces a parabola between
// interior points of even spacing (central slopes are exact for it).
func TestMonotoneCurve(t *testing.T) {
	// A step in the data, where a natural spline would overshoot.
	x := []float64{0, 1, 2, 3, 4, 5}
	y := []float64{0, 0, 0, 10, 10, 10}
	c, err := NewMonotoneCurve(x, y)
	if err != nil {
		t.Fatal(err)
	}
	prev := -1.0
	for u := 0.0; u <= 5; u += 0.001 {
		v := c.At(dual.Var(u))
		if v.V < prev-1e-12 || v.V < -1e-12 || v.V > 10+1e-12 || v.D < -1e-12 {
			t.Fatalf("at %g: %g (slope %g) after %g: not monotone or overshoots", u, v.V, v.D, prev)
		}
		prev = v.V
	}
	for i := range x {
		if v := c.At(dual.C(x[i])).V; math.Abs(v-y[i]) > 1e-12 {
			t.Errorf("at point %d: %g, want %g", i, v, y[i])
		}
	}
	// A fan curve with a dip (the stall region): flat at the extrema, no
	// value outside each interval's data.
	fc, _ := NewMonotoneCurve([]float64{0, 1, 2, 3, 4}, []float64{100, 80, 85, 50, 0})
	if fc.M[1] != 0 || fc.M[2] != 0 {
		t.Errorf("slopes at the extrema %g, %g, want 0", fc.M[1], fc.M[2])
	}
	for u := 1.0; u <= 2; u += 0.01 {
		if v := fc.At(dual.C(u)).V; v < 80-1e-12 || v > 85+1e-12 {
			t.Fatalf("at %g: %g, outside [80, 85]", u, v)
		}
	}
	// A parabola on even spacing, between interior points.
	var px, py []float64
	for i := 0; i <= 10; i++ {
		q := 0.002 * float64(i)
		px, py = append(px, q), append(py, 100*(1-q*q/4e-4))
	}
	pc, _ := NewMonotoneCurve(px, py)
	for q := 0.002; q <= 0.018; q += 0.0001 {
		if v, want := pc.At(dual.C(q)).V, 100*(1-q*q/4e-4); math.Abs(v-want) > 1e-9 {
			t.Errorf("parabola at %g: %.12g, want %.12g", q, v, want)
		}
	}
	if _, err := NewMonotoneCurve([]float64{0, 1, 1}, []float64{1, 2, 3}); err == nil {
		t.Error("repeated flow accepted")
	}
}

// Idelchik's perforated-plate coefficients: a thin plate is the
// sharp-edged orifice, (1 + 0.707√(1 − f) − f)²/f² (Idelchik, Handbook of
// Hydraulic Resistance, diagram 8-1, from memory; at f = 0.5 that is 4.0);
// just above the thin limit the thick-edged relation (diagram 8-3, from
// memory) agrees with it within 30 %; a plate about 1.5 hole diameters
// thick loses less, the jet reattaching inside the hole.
func TestPerforatedPlate(t *testing.T) {
	for _, f := range []float64{0.2, 0.5, 0.8} {
		k, err := PerforatedK(f, 0, 1e-3)
		if err != nil {
			t.Fatal(err)
		}
		if want := ThinPlateK(f); k != want {
			t.Errorf("f = %g: thin plate K = %.4g, sharp-edged orifice %.4g", f, k, want)
		}
		if k2, _ := PerforatedK(f, 0.02e-3, 1e-3); math.Abs(k2-k) > 0.3*k {
			t.Errorf("f = %g: just above the thin limit K = %.4g, thin %.4g", f, k2, k)
		}
	}
	if k := ThinPlateK(0.5); math.Abs(k-4.0) > 0.005 {
		t.Errorf("thin plate of open ratio 0.5: K = %g, want 4.0", k)
	}
	thin, _ := PerforatedK(0.4, 0, 2e-3)
	thick, _ := PerforatedK(0.4, 3e-3, 2e-3)
	if !(thick < 0.8*thin) {
		t.Errorf("a plate 1.5 diameters thick: K = %g, thin %g; want clearly less", thick, thin)
	}
	if _, err := PerforatedK(1, 0, 1e-3); err == nil {
		t.Error("open ratio 1 accepted")
	}
}

// A fan warns where it runs: in the rising part of its curve, near
// shut-off, beyond free delivery, backwards, and when stopped.
func TestFanWarnings(t *testing.T) {
	curve, _ := NewMonotoneCurve([]float64{0, 0.004, 0.008, 0.012, 0.02}, []float64{90, 70, 80, 60, 0})
	f, err := NewFan(Fan{Curve: curve, CurveDensity: 1.2})
	if err != nil {
		t.Fatal(err)
	}
	rho := flowEnv.Pressure / (287.05 * 293.15) // ideal gas, close to the model's air
	for _, tc := range []struct {
		q    float64
		want string
	}{
		{0.001, "near shut-off"},
		{0.006, "unstable"},
		{0.025, "beyond the free-delivery end"},
		{-0.002, "backwards"},
	} {
		op := f.OperatingPoint(tc.q*rho, 293.15, flowEnv.Pressure)
		if !strings.Contains(strings.Join(op.Warnings, "; "), tc.want) {
			t.Errorf("Q = %g m³/s: warnings %q, want %q", tc.q, op.Warnings, tc.want)
		}
	}
	if op := f.OperatingPoint(0.016*rho, 293.15, flowEnv.Pressure); len(op.Warnings) != 0 {
		t.Errorf("a sound operating point warns: %q", op.Warnings)
	}
	loss, _ := NewLoss(4, 1e-3)
	s, _ := NewFan(Fan{Curve: curve, CurveDensity: 1.2, Stopped: true, StoppedLoss: loss})
	if op := s.OperatingPoint(1e-3, 293.15, flowEnv.Pressure); op.Pressure >= 0 || len(op.Warnings) == 0 {
		t.Errorf("a stopped fan: %+v, want a loss and a warning", op)
	}
}

// Channels whose flow may reverse: forward they are the Channel itself
// (to its reporting precision), backward the Channel from outlet to
// inlet, and through zero their derivatives are exact and energy is
// conserved.
func TestReversibleChannel(t *testing.T) {
	g, err := PlateFinSink(12, 1e-3, 20e-3, 50e-3, 60e-3, 200)
	if err != nil {
		t.Fatal(err)
	}
	// Variables: wall, inlet, outlet, flow.
	fwd := Channel{Wall: 0, Inlet: 1, Outlet: 2, Flow: 3, Geometry: g}
	rc := NewReversibleChannel(fwd)
	for _, x := range [][]float64{{350, 300, 315, 4e-3}, {350, 315, 300, -4e-3}, {350, 300, 305, 5e-9}, {350, 305, 300, -2e-8}} {
		checkJacobianIn(t, fmt.Sprintf("reversible channel at %v", x), flowEnv, rc, x, 1e-6)
		r := stampAt(rc, flowEnv, x)
		if e := r.q[0] + r.q[1] + r.q[2]; math.Abs(e) > 1e-12*(math.Abs(r.q[0])+math.Abs(r.q[1])+1e-12) {
			t.Errorf("at %v: energy not conserved: %g W", x, e)
		}
	}
	x := []float64{350, 300, 315, 4e-3}
	one, two := stampAt(&fwd, flowEnv, x), stampAt(rc, flowEnv, x)
	for i := range 3 {
		if math.Abs(one.q[i]-two.q[i]) > 1e-9*math.Abs(one.q[i]) {
			t.Errorf("forward, row %d: %.12g W, the channel's %.12g W", i, two.q[i], one.q[i])
		}
	}
	back := Channel{Wall: 0, Inlet: 2, Outlet: 1, Flow: 3, Geometry: g}
	y := []float64{350, 315, 300, -4e-3}
	yb := []float64{350, 315, 300, 4e-3}
	one, two = stampAt(&back, flowEnv, yb), stampAt(rc, flowEnv, y)
	for i := range 3 {
		if math.Abs(one.q[i]-two.q[i]) > 1e-9*math.Abs(one.q[i]) {
			t.Errorf("backward, row %d: %.12g W, the reversed channel's %.12g W", i, two.q[i], one.q[i])
		}
	}
}
