package network_test

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/elements/air"
	"github.com/heatgraph/heatgraph/elements/dual"
	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/solve"
)

// solveAir solves a model with airflow, checks the Jacobian at the start
// and at the solution, and checks that mass is conserved at every air node
// and energy overall.
func solveAir(t *testing.T, text string) *network.Solution {
	t.Helper()
	m, err := network.Parse("air.yaml", []byte(text))
	if err != nil {
		t.Fatal(err)
	}
	net, err := network.Build(m)
	if err != nil {
		t.Fatal(err)
	}
	p := net.Steady()
	r := solve.Newton(p, p.InitialGuess(), solve.Settings{})
	if !r.Reason.Converged() {
		t.Fatalf("solve: %v (%v) after %d iterations", r.Reason, r.Err, r.Iterations)
	}
	for _, x := range [][]float64{p.InitialGuess(), r.X} {
		c, err := net.CheckJacobian(x, 3)
		if err != nil {
			t.Fatal(err)
		}
		if c.MaxError > network.DefaultJacobianTolerance {
			t.Errorf("Jacobian check: worst %+v", c.Worst[0])
		}
	}
	sol := net.Solution(r.X)
	if b := sol.Balance; math.Abs(b.Imbalance) > b.MaxImbalance() {
		t.Errorf("energy balance does not close: %g W", b.Imbalance)
	}
	total := 0.0
	for _, b := range sol.Balance.Mass {
		total = math.Max(total, math.Max(b.In, b.Out))
	}
	for _, b := range sol.Balance.Mass {
		if !b.Fixed && math.Abs(b.Imbalance) > 1e-12*total {
			t.Errorf("mass balance of %q: %g kg/s in, %g kg/s out", b.Node, b.In, b.Out)
		}
	}
	return sol
}

func branchOf(t *testing.T, sol *network.Solution, id string) network.BranchResult {
	t.Helper()
	for _, b := range sol.Branches {
		if b.Link == id {
			return b
		}
	}
	t.Fatalf("no branch %q", id)
	return network.BranchResult{}
}

// rho20 is the density of air at 20 °C and 101.325 kPa, as the model sees
// it, so that curves given at this density apply unscaled.
var rho20 = air.Density(dual.C(293.15), 101325).V

// parabolaCurve writes the fan curve Δp = p0·[1 − (Q/qmax)²] as n points.
func parabolaCurve(p0, qmax float64, n int) string {
	var pts []string
	for i := 0; i < n; i++ {
		q := qmax * float64(i) / float64(n-1)
		pts = append(pts, fmt.Sprintf("[%.17g m3/s, %.17g Pa]", q, p0*(1-(q/qmax)*(q/qmax))))
	}
	return "[" + strings.Join(pts, ", ") + "]"
}

// A fan curve Δp = 100·[1 − (Q/0.02)²] Pa against a system Δp = 2.0e5·Q²
// meets it where 100 = Q²·(2.0e5 + 100/0.02²): Q = √(100/4.5e5) =
// 0.0149071 m³/s, Δp = 44.444 Pa (by hand). The curve's points are those
// of the parabola; between interior points the monotone cubic, whose
// slopes there are exact for a parabola on even spacing, reproduces it.
func TestFanAgainstSystemCurve(t *testing.T) {
	sol := solveAir(t, fmt.Sprintf(`
ambient: {temperature: 20 degC}
nodes:
  - {id: plenum, kind: air}
links:
  - {id: fan, kind: fan, from: ambient, to: plenum, curve: %s, curve_density: %.17g kg/m3}
  - {id: system, kind: loss, from: plenum, to: ambient, drop: 20 Pa, at_flow: 0.01 m3/s}
`, parabolaCurve(100, 0.02, 11), rho20))
	q := math.Sqrt(100 / 4.5e5)
	f := branchOf(t, sol, "fan")
	if f.Fan == nil {
		t.Fatal("no operating point for the fan")
	}
	if math.Abs(f.Fan.VolumeFlow-q) > 1e-6*q || math.Abs(f.Fan.Pressure-2e5*q*q) > 1e-6*44.44 {
		t.Errorf("operating point %.7g m³/s at %.6g Pa, want %.7g m³/s at %.6g Pa", f.Fan.VolumeFlow, f.Fan.Pressure, q, 2e5*q*q)
	}
	if s := branchOf(t, sol, "system"); math.Abs(s.PressureFrom-2e5*q*q) > 1e-6*44.44 || math.Abs(s.Share-1) > 1e-9 {
		t.Errorf("plenum at %.6g Pa, share %g; want %.6g Pa, 1", s.PressureFrom, s.Share, 2e5*q*q)
	}
}

// Two equal fans in series add their pressures at the same flow, in
// parallel their flows at the same pressure (e.g. ASHRAE Handbook—HVAC
// Systems and Equipment, ch. Fans). Against Δp = 2.0e5·Q², by hand:
// series 2·100·[1 − (Q/0.02)²] = 2e5·Q², Q = √(200/7e5) = 0.0169031 m³/s;
// parallel 100·[1 − (Q/0.04)²] = 2e5·Q², Q = √(100/262500) = 0.0195180 m³/s.
func TestFansInSeriesAndParallel(t *testing.T) {
	curve := parabolaCurve(100, 0.02, 11)
	series := solveAir(t, fmt.Sprintf(`
ambient: {temperature: 20 degC}
nodes:
  - {id: between, kind: air}
  - {id: plenum, kind: air}
links:
  - {id: first, kind: fan, from: ambient, to: between, curve: %[1]s, curve_density: %.17[2]g kg/m3}
  - {id: second, kind: fan, from: between, to: plenum, curve: %[1]s, curve_density: %.17[2]g kg/m3}
  - {id: system, kind: loss, from: plenum, to: ambient, drop: 20 Pa, at_flow: 0.01 m3/s}
`, curve, rho20))
	want := math.Sqrt(200 / 7e5)
	for _, id := range []string{"first", "second", "system"} {
		if q := branchOf(t, series, id).VolumeFlow; math.Abs(q-want) > 1e-6*want {
			t.Errorf("series, %s: %.7g m³/s, want %.7g", id, q, want)
		}
	}
	parallel := solveAir(t, fmt.Sprintf(`
ambient: {temperature: 20 degC}
nodes:
  - {id: plenum, kind: air}
links:
  - {id: left, kind: fan, from: ambient, to: plenum, curve: %[1]s, curve_density: %.17[2]g kg/m3}
  - {id: right, kind: fan, from: ambient, to: plenum, curve: %[1]s, curve_density: %.17[2]g kg/m3}
  - {id: system, kind: loss, from: plenum, to: ambient, drop: 20 Pa, at_flow: 0.01 m3/s}
`, curve, rho20))
	want = math.Sqrt(100.0 / 262500)
	if q := branchOf(t, parallel, "system").VolumeFlow; math.Abs(q-want) > 1e-6*want {
		t.Errorf("parallel: %.7g m³/s, want %.7g", q, want)
	}
	for _, id := range []string{"left", "right"} {
		if q := branchOf(t, parallel, id).VolumeFlow; math.Abs(q-want/2) > 1e-6*want {
			t.Errorf("parallel, %s: %.7g m³/s, want %.7g", id, q, want/2)
		}
	}
}

// The fan laws (affinity laws): at twice the speed a fan against a purely
// quadratic system moves twice the air at four times the pressure
// (Q ∝ N, Δp ∝ N²; ASHRAE Handbook—HVAC Systems and Equipment, ch. Fans).
// At another inlet density, Δp ∝ ρ at the same volume flow.
func TestFanLaws(t *testing.T) {
	model := func(speed string) string {
		return fmt.Sprintf(`
ambient: {temperature: 20 degC}
nodes:
  - {id: plenum, kind: air}
links:
  - {id: fan, kind: fan, from: ambient, to: plenum, curve: %s, curve_density: %.17g kg/m3, curve_speed: 3000 rpm, speed: %s}
  - {id: system, kind: loss, from: plenum, to: ambient, coefficient: 2.5, area: 10 cm2}
`, parabolaCurve(100, 0.02, 11), rho20, speed)
	}
	slow := branchOf(t, solveAir(t, model("3000 rpm")), "fan")
	fast := branchOf(t, solveAir(t, model("6000 rpm")), "fan")
	if r := fast.VolumeFlow / slow.VolumeFlow; math.Abs(r-2) > 1e-6 {
		t.Errorf("flow ratio %.8g at twice the speed, want 2", r)
	}
	if r := fast.Fan.Pressure / slow.Fan.Pressure; math.Abs(r-4) > 4e-6 {
		t.Errorf("pressure ratio %.8g at twice the speed, want 4", r)
	}
	if fast.Fan.Speed != 6000 {
		t.Errorf("speed %g rpm, want 6000", fast.Fan.Speed)
	}
	// Density: the same curve read at half the curve density gives half
	// the pressure at each volume flow.
	f, err := elements.NewFan(elements.Fan{Curve: mustCurve(t, []float64{0, 0.01, 0.02}, []float64{100, 75, 0}), CurveDensity: 2 * rho20})
	if err != nil {
		t.Fatal(err)
	}
	op := f.OperatingPoint(0.01*rho20, 293.15, 101325)
	if math.Abs(op.Pressure-37.5) > 1e-9 {
		t.Errorf("pressure at half the curve density: %g Pa, want 37.5", op.Pressure)
	}
}

func mustCurve(t *testing.T, x, y []float64) elements.MonotoneCurve {
	t.Helper()
	c, err := elements.NewMonotoneCurve(x, y)
	if err != nil {
		t.Fatal(err)
	}
	return c
}

// A vented box with no fan: 20 W into its air, an inlet vent at the
// bottom (0 m) and an outlet vent at the top (0.5 m), each K = 1.5 on
// 20 cm². The warm column drives Δp = g·H·(ρ₀ − ρᵢ) (the stack effect,
// e.g. ASHRAE Handbook—Fundamentals, ch. Ventilation and Infiltration),
// which the two vents take: g·H·(ρ₀ − ρᵢ) = (K₁ + K₂)·ṁ²/(2ρ̄A²), ρ̄ the mean
// of inside and outside; and the air carries the heat, ṁ·c_p·(Tᵢ − T₀) =
// 20 W. The hand solution is found below by bisection on Tᵢ.
func TestStackDraftThroughTwoVents(t *testing.T) {
	sol := solveAir(t, `
ambient: {temperature: 25 degC}
nodes:
  - {id: board, power: 20 W}
  - {id: inside, kind: air, height: 0.25 m}
links:
  - {kind: convection, from: board, to: inside, coefficient: 50 W/m2/K, area: 0.04 m2}
  - {id: inlet, kind: loss, from: ambient, to: inside, coefficient: 1.5, area: 20 cm2, elevation: 0 m}
  - {id: outlet, kind: loss, from: inside, to: ambient, coefficient: 1.5, area: 20 cm2, elevation: 0.5 m}
`)
	t0, p := 298.15, 101325.0
	cp := air.SpecificHeat(dual.C(t0)).V
	rho := func(T float64) float64 { return air.Density(dual.C(T), p).V }
	flowAt := func(ti float64) float64 { // the flow the draft drives at Tᵢ
		dp := elements.StandardGravity * 0.5 * (rho(t0) - rho(ti))
		rm := (rho(t0) + rho(ti)) / 2
		return math.Sqrt(dp * 2 * rm * 20e-4 * 20e-4 / 3)
	}
	lo, hi := t0+0.01, t0+200
	for i := 0; i < 200; i++ {
		mid := (lo + hi) / 2
		if flowAt(mid)*cp*(mid-t0) > 20 {
			hi = mid
		} else {
			lo = mid
		}
	}
	ti := (lo + hi) / 2
	got := nodeResult(t, sol, "inside").Temperature
	if math.Abs(got-ti) > 1e-6*(ti-t0) {
		t.Errorf("inside air %.8g K, want %.8g K", got, ti)
	}
	in, out := branchOf(t, sol, "inlet"), branchOf(t, sol, "outlet")
	if m := flowAt(ti); math.Abs(in.MassFlow-m) > 1e-6*m || math.Abs(out.MassFlow-m) > 1e-6*m {
		t.Errorf("stack flow %.8g and %.8g kg/s, want %.8g kg/s", in.MassFlow, out.MassFlow, m)
	}
}

// A bypass between two plenums reverses when the fan feeding the second
// is the stronger: the flow written from a to b runs from b to a, the
// energy it carries goes with it, and every node still balances.
func TestReverseFlowInBypass(t *testing.T) {
	sol := solveAir(t, fmt.Sprintf(`
ambient: {temperature: 20 degC}
nodes:
  - {id: hot, power: 15 W}
  - {id: a, kind: air}
  - {id: b, kind: air}
links:
  - {kind: convection, from: hot, to: b, coefficient: 40 W/m2/K, area: 0.02 m2}
  - {id: weak, kind: fan, from: ambient, to: a, curve: %s}
  - {id: strong, kind: fan, from: ambient, to: b, curve: %s}
  - {id: bypass, kind: loss, from: a, to: b, coefficient: 1, area: 4 cm2}
  - {id: vent-a, kind: loss, from: a, to: ambient, coefficient: 1, area: 10 cm2}
  - {id: vent-b, kind: loss, from: b, to: ambient, coefficient: 1, area: 4 cm2}
`, parabolaCurve(30, 0.01, 6), parabolaCurve(150, 0.02, 6)))
	by := branchOf(t, sol, "bypass")
	if !(by.MassFlow < 0) {
		t.Fatalf("bypass flow %g kg/s, want it reversed (from b to a)", by.MassFlow)
	}
	// Air from b warms a: a is above ambient only through the reversed bypass.
	ta, tb := nodeResult(t, sol, "a").Temperature, nodeResult(t, sol, "b").Temperature
	if !(ta > 293.15+1e-3 && tb > ta) {
		t.Errorf("a at %g K, b at %g K: the reversed bypass should carry b's warm air into a", ta, tb)
	}
	// a mixes the weak fan's ambient air with the bypass air from b.
	weak := branchOf(t, sol, "weak")
	mix := (weak.MassFlow*293.15 - by.MassFlow*tb) / (weak.MassFlow - by.MassFlow)
	if weak.MassFlow > 0 && math.Abs(ta-mix) > 1e-6 {
		t.Errorf("a at %.9g K, want the mixed temperature %.9g K", ta, mix)
	}
}

// channelModel drives air through circular passages from a fixed node at
// the given pressure, with no heat, out through an outlet air node and a
// wide-open loss (its drop below 1e-4 of the channels').
func channelModel(dp, d, length string, count int) string {
	return fmt.Sprintf(`
ambient: {temperature: 20 degC}
nodes:
  - {id: supply, kind: fixed, temperature: 20 degC, pressure: %s}
  - {id: block, kind: fixed, temperature: 20 degC}
  - {id: out, kind: air}
links:
  - {id: holes, kind: channel, from: block, inlet: supply, to: out, flow: solved, shape: circular, diameter: %s, length: %s, count: %d}
  - {id: open, kind: loss, from: out, to: ambient, coefficient: 1, area: 1 m2}
`, dp, d, length, count)
}

// Laminar: 20 Pa across 0.5 m of 1 mm tubes. Fully developed laminar flow
// in a tube has f·Re = 64 (Shah & London 1978; Hagen–Poiseuille), so
// V = Δp·D²/(32·μ·L) (by hand); entry effects and the entry and exit
// losses add under 0.1 % at L/D = 500 and Re ≈ 5.
func TestLaminarChannelAgainstPoiseuille(t *testing.T) {
	sol := solveAir(t, channelModel("20 Pa", "1 mm", "0.5 m", 4))
	props := air.At(dual.C(293.15), 101325)
	v := 20 * 1e-6 / (32 * props.Mu.V * 0.5)
	want := 4 * props.Rho.V * v * math.Pi / 4 * 1e-6
	if got := branchOf(t, sol, "holes").MassFlow; math.Abs(got-want) > 2e-3*want {
		t.Errorf("laminar: %.6g kg/s, want %.6g kg/s (Poiseuille)", got, want)
	}
}

// Turbulent: 200 Pa across 3 m of a 30 mm tube. By hand: Colebrook's
// smooth-pipe friction 1/√f = −2·log10(2.51/(Re·√f)) with
// Δp = (f·L/D + K_entry + K_exit)·ρV²/2, sharp entry 0.5 and exit 1.0
// (Kays & London; Idelchik), iterated to a fixed point. The channel uses
// Churchill (1977), which follows Colebrook within about 1 %.
func TestTurbulentChannelAgainstColebrook(t *testing.T) {
	sol := solveAir(t, channelModel("200 Pa", "30 mm", "3 m", 1))
	props := air.At(dual.C(293.15), 101325)
	rho, mu := props.Rho.V, props.Mu.V
	v, f := 8.0, 0.03
	for i := 0; i < 200; i++ {
		re := rho * v * 0.03 / mu
		f = math.Pow(-2*math.Log10(2.51/(re*math.Sqrt(f))), -2)
		v = math.Sqrt(200 / ((f*100 + 1.5) * rho / 2))
	}
	want := rho * v * math.Pi / 4 * 0.03 * 0.03
	got := branchOf(t, sol, "holes").MassFlow
	if math.Abs(got-want) > 0.015*want {
		t.Errorf("turbulent: %.6g kg/s, want %.6g kg/s (Colebrook, Re %.0f)", got, want, rho*v*0.03/mu)
	}
}

// A given flow mixes with solved ones: 10 L/s of ambient air blown in at a
// stated flow must leave through a vent whose flow is solved for; the box
// then stands at the vent's drop, Δp = K·ṁ²/(2ρA²) with ρ the mean of the
// box air's and the room's densities (the loss coefficient's definition).
func TestGivenFlowMixesWithSolved(t *testing.T) {
	sol := solveAir(t, `
ambient: {temperature: 20 degC}
nodes:
  - {id: board, power: 30 W}
  - {id: box, kind: air}
links:
  - {kind: convection, from: board, to: box, coefficient: 20 W/m2/K, area: 0.05 m2}
  - {id: blow, kind: stream, from: ambient, to: box, flow: 10 L/s}
  - {id: vent, kind: loss, from: box, to: ambient, coefficient: 2, area: 10 cm2}
`)
	m := 10e-3 * rho20
	v := branchOf(t, sol, "vent")
	if math.Abs(v.MassFlow-m) > 1e-12 {
		t.Errorf("vent %.12g kg/s, want the given %.12g kg/s", v.MassFlow, m)
	}
	tb := nodeResult(t, sol, "box").Temperature
	rho := (rho20 + air.Density(dual.C(tb), 101325).V) / 2
	if want := 2 * m * m / (2 * rho * 1e-6); math.Abs(v.PressureFrom-want) > 1e-6*want {
		t.Errorf("box at %.8g Pa, want %.8g Pa", v.PressureFrom, want)
	}
	if g := branchOf(t, sol, "blow"); g.Solved || math.Abs(g.MassFlow-m) > 1e-15 {
		t.Errorf("given stream: %+v", g)
	}
}

// A bypass in parallel with a part: two losses between the same two
// nodes see the same Δp, so ṁ ∝ A/√K and the split is
// ṁ₁/ṁ₂ = (A₁/√K₁)/(A₂/√K₂) whatever the fan does (from Δp = K·ṁ²/(2ρA²)
// with one density; by hand, 3 cm²/√4 over 1 cm²/√1.5 = 1.8371).
func TestBypassSplit(t *testing.T) {
	sol := solveAir(t, fmt.Sprintf(`
ambient: {temperature: 20 degC}
nodes:
  - {id: plenum, kind: air}
  - {id: rear, kind: air}
links:
  - {id: fan, kind: fan, from: ambient, to: plenum, curve: %s}
  - {id: part, kind: loss, from: plenum, to: rear, coefficient: 4, area: 3 cm2}
  - {id: bypass, kind: loss, from: plenum, to: rear, coefficient: 1.5, area: 1 cm2}
  - {id: exit, kind: loss, from: rear, to: ambient, coefficient: 1, area: 5 cm2}
`, parabolaCurve(100, 0.02, 11)))
	want := (3 / math.Sqrt(4)) / (1 / math.Sqrt(1.5))
	part, by := branchOf(t, sol, "part"), branchOf(t, sol, "bypass")
	if r := part.MassFlow / by.MassFlow; math.Abs(r-want) > 1e-6*want {
		t.Errorf("split %.8g, want %.8g", r, want)
	}
	if s := part.Share + by.Share; math.Abs(s-1) > 1e-9 {
		t.Errorf("shares of part and bypass add to %g, want 1", s)
	}
}

// A heat sink at a given flow inside a solved air path: its stated flow
// goes into the mass balances of its inlet and outlet, so the vent after
// it carries exactly that flow and the fan's extra air leaves by the
// other vent.
func TestGivenChannelInSolvedPath(t *testing.T) {
	sol := solveAir(t, fmt.Sprintf(`
ambient: {temperature: 25 degC}
nodes:
  - {id: base, power: 20 W}
  - {id: plenum, kind: air}
  - {id: out, kind: air}
links:
  - {id: fan, kind: fan, from: ambient, to: plenum, curve: %s}
  - {id: fins, kind: channel, from: base, inlet: plenum, to: out, mass_flow: 3 g/s, length: 50 mm,
     fin_count: 10, fin_thickness: 1 mm, fin_height: 20 mm, base_width: 40 mm, material: aluminium-6063}
  - {id: after, kind: loss, from: out, to: ambient, coefficient: 1, area: 5 cm2}
  - {id: spill, kind: loss, from: plenum, to: ambient, coefficient: 1, area: 5 cm2}
`, parabolaCurve(100, 0.02, 11)))
	if m := branchOf(t, sol, "after").MassFlow; math.Abs(m-3e-3) > 1e-12 {
		t.Errorf("vent after the sink: %.12g kg/s, want the sink's 3 g/s", m)
	}
	fan, spill := branchOf(t, sol, "fan").MassFlow, branchOf(t, sol, "spill").MassFlow
	if math.Abs(fan-spill-3e-3) > 1e-12 {
		t.Errorf("fan %g kg/s, spill %g kg/s: the difference should be the sink's 3 g/s", fan, spill)
	}
}

// A heat sink whose air runs backwards: written from inlet b to outlet a,
// but a is pressurised by the stronger fan, so the air goes a → b and the
// sink's heat arrives at b.
func TestChannelFlowReverses(t *testing.T) {
	sol := solveAir(t, fmt.Sprintf(`
ambient: {temperature: 25 degC}
nodes:
  - {id: base, power: 20 W}
  - {id: a, kind: air}
  - {id: b, kind: air}
links:
  - {id: strong, kind: fan, from: ambient, to: a, curve: %s}
  - {id: weak, kind: fan, from: ambient, to: b, curve: %s}
  - {id: fins, kind: channel, from: base, inlet: b, to: a, flow: solved, length: 50 mm,
     fin_count: 10, fin_thickness: 1 mm, fin_height: 20 mm, base_width: 40 mm, material: aluminium-6063}
  - {id: vent-a, kind: loss, from: a, to: ambient, coefficient: 1, area: 2 cm2}
  - {id: vent-b, kind: loss, from: b, to: ambient, coefficient: 1, area: 6 cm2}
`, parabolaCurve(150, 0.02, 6), parabolaCurve(20, 0.01, 6)))
	fins := branchOf(t, sol, "fins")
	if !(fins.MassFlow < 0) {
		t.Fatalf("fins: %g kg/s, want the air to run from a to b", fins.MassFlow)
	}
	ta, tb := nodeResult(t, sol, "a").Temperature, nodeResult(t, sol, "b").Temperature
	if !(tb > ta+0.1) {
		t.Errorf("a at %.3f K, b at %.3f K: the sink's heat should arrive at b", ta, tb)
	}
}

// A resistance given as R (Pa/(m³/s)²) is the same law as a drop at a
// flow: 20 Pa at 0.01 m³/s is R = 2e5.
func TestResistanceKey(t *testing.T) {
	model := func(law string) float64 {
		sol := solveAir(t, fmt.Sprintf(`
ambient: {temperature: 20 degC}
nodes:
  - {id: plenum, kind: air}
links:
  - {id: fan, kind: fan, from: ambient, to: plenum, curve: %s}
  - {id: system, kind: loss, from: plenum, to: ambient, %s}
`, parabolaCurve(100, 0.02, 11), law))
		return branchOf(t, sol, "system").MassFlow
	}
	a, b := model("drop: 20 Pa, at_flow: 0.01 m3/s"), model("resistance: 2e5 Pa/(m3/s)^2")
	if math.Abs(a-b) > 1e-12*a {
		t.Errorf("drop at flow %.12g kg/s, resistance %.12g kg/s", a, b)
	}
}

// Push or pull: a fan at the intake and the same fan at the exhaust of the
// same box are the same branch physics. Without heat they move the same
// air; with heat, the exhaust fan draws warmer, lighter air, so at its
// volume flow it moves less mass (fan laws: Δp ∝ ρ at a given volume
// flow; a common rule in fan selection).
func TestPushOrPull(t *testing.T) {
	model := func(power string, push bool) float64 {
		fan, vent := "ambient, to: box", "box, to: ambient"
		if !push {
			fan, vent = "box, to: ambient", "ambient, to: box"
		}
		sol := solveAir(t, fmt.Sprintf(`
ambient: {temperature: 20 degC}
nodes:
  - {id: board, power: %s}
  - {id: box, kind: air}
links:
  - {kind: convection, from: board, to: box, coefficient: 50 W/m2/K, area: 0.05 m2}
  - {id: fan, kind: fan, from: %s, curve: %s}
  - {id: vent, kind: loss, from: %s, coefficient: 2, area: 4 cm2}
`, power, fan, parabolaCurve(100, 0.02, 11), vent))
		return math.Abs(branchOf(t, sol, "fan").MassFlow)
	}
	if a, b := model("0 W", true), model("0 W", false); math.Abs(a-b) > 1e-9*a {
		t.Errorf("no heat: push %.12g kg/s, pull %.12g kg/s, want the same", a, b)
	}
	if a, b := model("200 W", true), model("200 W", false); !(b < a) {
		t.Errorf("200 W: push %.6g kg/s, pull %.6g kg/s; the exhaust fan should move less mass", a, b)
	}
}
