package elements

import (
	"math"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/elements/air"
	"github.com/heatgraph/heatgraph/elements/dual"
	"github.com/heatgraph/heatgraph/elements/duct"
)

// airEnv is testEnv with the stream reference: 20 °C ambient, c_p of air at
// 20 °C.
var airEnv = &Env{Pressure: 101325, Gravity: StandardGravity, AmbientT: 293.15, AirCp: air.SpecificHeat(dual.C(293.15)).V}

func stampEnv(el Element, x []float64) *recorder { return stampAt(el, airEnv, x) }

func detail(t *testing.T, rep Report, name string) Detail {
	t.Helper()
	for _, d := range rep.Details {
		if d.Name == name {
			return d
		}
	}
	t.Fatalf("no detail %q in %+v", name, rep.Details)
	return Detail{}
}

func TestStream(t *testing.T) {
	s := &Stream{Up: 0, Down: 1, Flow: 2}
	temps := []float64{303.15, 310, 0.01}
	r := stampEnv(s, temps)
	// ṁ·c_p·(T_up − T_ambient) = 0.01 × c_p × 10 K.
	want := 0.01 * airEnv.AirCp * 10
	if math.Abs(r.q[1]-want) > 1e-12 || math.Abs(r.q[0]+want) > 1e-12 {
		t.Errorf("enthalpy carried: %v, want ±%g", r.q, want)
	}
	checkJacobianEnv(t, "stream", s, temps)
}

// checkJacobianEnv is checkJacobian with the air-stream environment.
func checkJacobianEnv(t *testing.T, name string, el Element, temps []float64) {
	t.Helper()
	checkJacobianIn(t, name, airEnv, el, temps, 1e-6)
	checkConserves(t, name, el, temps)
}

func plateFin(t *testing.T) ChannelGeometry {
	t.Helper()
	// 12 fins, 1 mm thick, 25 mm tall, on a 60 mm base, 80 mm long,
	// aluminium 200 W/(m K): gaps of (60 − 12)/11 = 4.364 mm.
	g, err := PlateFinSink(12, 1e-3, 25e-3, 60e-3, 80e-3, 200)
	if err != nil {
		t.Fatal(err)
	}
	return g
}

func TestPlateFinGeometry(t *testing.T) {
	g := plateFin(t)
	gap := 48e-3 / 11
	if g.Count != 11 || math.Abs(g.Duct.Width-gap) > 1e-15 {
		t.Errorf("channels %d of %g m, want 11 of %g", g.Count, g.Duct.Width, gap)
	}
	// Dh = 4A/P = 2ab/(a+b) for the gap × height rectangle (definition of
	// the hydraulic diameter).
	if want := 2 * gap * 25e-3 / (gap + 25e-3); math.Abs(g.Duct.Dh()-want) > 1e-15 {
		t.Errorf("Dh = %g, want %g", g.Duct.Dh(), want)
	}
	if math.Abs(g.FinArea-11*2*25e-3*80e-3) > 1e-15 || math.Abs(g.PrimeArea-11*gap*80e-3) > 1e-15 {
		t.Errorf("areas %g, %g", g.FinArea, g.PrimeArea)
	}
	if _, err := PlateFinSink(30, 2e-3, 25e-3, 60e-3, 80e-3, 200); err == nil {
		t.Error("30 fins of 2 mm on 60 mm must not fit")
	}
}

func TestChannelJacobianAllRegimes(t *testing.T) {
	fins := plateFin(t)
	tube, err := Passages(duct.Duct{Shape: duct.Circular, Diameter: 6e-3, Length: 0.3}, 4)
	if err != nil {
		t.Fatal(err)
	}
	// Mass flows that put the fin channels (Dh ≈ 7.4 mm, 11 × 109 mm² of
	// flow area) and the tubes in each regime.
	cases := []struct {
		name string
		g    ChannelGeometry
		mdot float64
		opt  duct.Options
	}{
		{"fins laminar", fins, 2e-3, duct.Options{}},
		{"fins transitional", fins, 2e-2, duct.Options{}},
		{"fins turbulent", fins, 6e-2, duct.Options{}},
		{"fins turbulent Dittus-Boelter", fins, 6e-2, duct.Options{Turbulent: duct.DittusBoelter}},
		{"tubes laminar", tube, 2e-4, duct.Options{}},
		{"tubes turbulent", tube, 4e-3, duct.Options{}},
	}
	for _, c := range cases {
		ch := &Channel{Wall: 0, Inlet: 1, Outlet: 2, Flow: 3, Geometry: c.g, Options: c.opt}
		temps := []float64{340, 298, 312, c.mdot}
		checkJacobianEnv(t, c.name, ch, temps)
		rep := ch.Report(&State{X: temps, Env: airEnv})
		regime := detail(t, rep, "regime").Text
		want := strings.Fields(c.name)[1]
		if !strings.HasPrefix(regime, want) {
			t.Errorf("%s: regime %q", c.name, regime)
		}
	}
}

// The reported quantities trace to each other by hand: Re = ṁD_h/(A·μ),
// h = Nu·k/D_h, NTU = h·A_eff/(ṁc_p), and the heat to the air follows the
// uniform-wall outlet relation q = ṁc_p(1 − e^(−NTU))(T_w − T_in)
// (Incropera et al. eq. 8.42b).
func TestChannelTraceable(t *testing.T) {
	g := plateFin(t)
	ch := &Channel{Wall: 0, Inlet: 1, Outlet: 2, Flow: 3, Geometry: g}
	temps := []float64{333.15, 293.15, 303.15, 5e-3}
	s := &State{X: temps, Env: airEnv}
	rep := ch.Report(s)
	p := air.At(dual.C(298.15), airEnv.Pressure) // mean bulk temperature
	re := 5e-3 * g.Duct.Dh() / (g.FlowArea() * p.Mu.V)
	near := func(what string, got, want float64) {
		t.Helper()
		if math.Abs(got-want) > 1e-9*math.Abs(want) {
			t.Errorf("%s = %.10g, want %.10g", what, got, want)
		}
	}
	near("Re", detail(t, rep, "Re").Value, re)
	nu := detail(t, rep, "Nu").Value
	h := nu * p.K.V / g.Duct.Dh()
	near("h", detail(t, rep, "h").Value, h)
	eta := detail(t, rep, "fin_efficiency").Value
	m := math.Sqrt(2 * h / (200 * 1e-3))
	near("fin efficiency (adiabatic tip)", eta, math.Tanh(m*25e-3)/(m*25e-3))
	ntu := h * (g.PrimeArea + eta*g.FinArea) / (5e-3 * airEnv.AirCp)
	near("NTU", detail(t, rep, "NTU").Value, ntu)
	q := 5e-3 * airEnv.AirCp * (1 - math.Exp(-ntu)) * 40
	near("heat to the air", detail(t, rep, "heat_to_air").Value, q)
	r := stampEnv(ch, temps)
	near("heat from the wall", -r.q[0], q)
	v := 5e-3 / (p.Rho.V * g.FlowArea())
	near("velocity", detail(t, rep, "velocity").Value, v)
	if dp := detail(t, rep, "pressure_drop").Value; !(dp > 0) {
		t.Errorf("pressure drop %g", dp)
	}
}

func TestNaturalJacobians(t *testing.T) {
	fins := Fins{Count: 8, Thickness: 2e-3, Height: 20e-3, Spacing: 8e-3, Conductivity: 150}
	for _, c := range []struct {
		name string
		o    Orientation
	}{{"vertical", Vertical}, {"up", FacingUp}, {"down", FacingDown}, {"fins", FinArray}} {
		n, err := NewNatural(0, 1, c.o, 0.02, 0.1, fins)
		if err != nil {
			t.Fatal(err)
		}
		for _, temps := range [][]float64{{340, 300}, {290, 310}} {
			checkJacobianEnv(t, c.name, n, temps)
		}
	}
}

// Churchill & Chu at a state computed by hand: a 0.1 m tall plate at
// 330 K in air at 300 K. The film temperature is 315 K; Ra, Nu and h follow
// from the air properties there and eq. Nu = {0.825 + 0.387Ra^⅙/[1 +
// (0.492/Pr)^(9/16)]^(8/27)}² (Churchill & Chu 1975).
func TestNaturalVerticalByHand(t *testing.T) {
	n, _ := NewNatural(0, 1, Vertical, 0.1*0.2, 0.1, Fins{})
	s := &State{X: []float64{330, 300}, Env: airEnv}
	p := air.At(dual.C(315), airEnv.Pressure)
	ra := StandardGravity / 315 * 30 * 1e-3 / (p.Nu.V * p.Alpha.V)
	pr := p.Pr.V
	nu := math.Pow(0.825+0.387*math.Pow(ra, 1.0/6)/math.Pow(1+math.Pow(0.492/pr, 9.0/16), 8.0/27), 2)
	h := nu * p.K.V / 0.1
	rep := n.Report(s)
	if got := detail(t, rep, "h").Value; math.Abs(got-h) > 1e-9*h {
		t.Errorf("h = %.8g, want %.8g", got, h)
	}
	// h of a 10 cm plate 30 K above air is a few W/(m² K) (rule of thumb:
	// natural convection in air gives 2 to 10 W/(m² K)).
	if h < 2 || h > 10 {
		t.Errorf("h = %g W/(m² K), outside the usual range for free convection in air", h)
	}
	r := stampEnv(n, s.X)
	if q := r.q[1]; math.Abs(q-h*0.02*30) > 1e-9*q {
		t.Errorf("q = %g, want h·A·ΔT = %g", q, h*0.02*30)
	}
}

func TestFlatPlate(t *testing.T) {
	f, err := NewFlatPlate(0, 1, 2, 0.3, 0.06)
	if err != nil {
		t.Fatal(err)
	}
	checkJacobianEnv(t, "flat plate laminar", f, []float64{330, 300})
	fast, _ := NewFlatPlate(0, 1, 40, 0.5, 0.2)
	checkJacobianEnv(t, "flat plate mixed", fast, []float64{330, 300})
	// Laminar: Nu = 0.664 Re^½ Pr^⅓ (Incropera eq. 7.30) at 315 K film.
	p := air.At(dual.C(315), airEnv.Pressure)
	re := 2 * 0.3 / p.Nu.V
	h := 0.664 * math.Sqrt(re) * math.Cbrt(p.Pr.V) * p.K.V / 0.3
	if got := detail(t, f.Report(&State{X: []float64{330, 300}, Env: airEnv}), "h").Value; math.Abs(got-h) > 1e-9*h {
		t.Errorf("h = %g, want %g", got, h)
	}
}

// Infinite parallel plates at 350 K and 300 K, ε = 0.8 each: q″ = 261.1 W/m²
// (hand calculation from the two-surface relation, Incropera et al. eq. 13.24).
func TestRadiationBetweenPlates(t *testing.T) {
	r, err := RadiationBetween(0, 1, 0.8, 1, 0.8, 1, 1)
	if err != nil {
		t.Fatal(err)
	}
	rec := stampAt(r, testEnv, []float64{350, 300})
	if math.Abs(rec.q[1]-261.1)/261.1 > 1e-3 {
		t.Errorf("q″ = %.2f W/m², want 261.1", rec.q[1])
	}
	checkJacobian(t, "gray pair", r, []float64{350, 300}, 1e-7)
	if _, err := RadiationBetween(0, 1, 0.8, 2, 0.8, 1, 1); err == nil {
		t.Error("F₁₂ = 1 from 2 m² to 1 m² breaks reciprocity and must be refused")
	}
}

// Two aligned unit squares 1 m apart (F = 0.19982), ε = 0.8, at 350 K and
// 300 K, the rest of their view black surroundings at 300 K: J₁ = 773.1,
// J₂ = 471.8 W/m², q₁ = +311.3 W, q₂ = −50.16 W (hand solution of the
// radiosity equations, Incropera et al. §13.3).
func TestEnclosureThreeSurfaces(t *testing.T) {
	const f = 0.19982
	pairs, err := EnclosureExchange(
		[]Surface{{Node: 0, Emissivity: 0.8, Area: 1}, {Node: 1, Emissivity: 0.8, Area: 1}},
		[][]float64{{0, f}, {f, 0}}, 2)
	if err != nil {
		t.Fatal(err)
	}
	temps := []float64{350, 300, 300}
	heat := make([]float64, 3)
	for _, p := range pairs {
		r := stampAt(p.Link, testEnv, temps)
		for i := range heat {
			heat[i] += r.q[i]
		}
		checkJacobian(t, "enclosure pair", p.Link, temps, 1e-7)
	}
	if q1 := -heat[0]; math.Abs(q1-311.3) > 0.05 {
		t.Errorf("q₁ = %.2f W, want 311.3", q1)
	}
	if q2 := -heat[1]; math.Abs(q2+50.16) > 0.01 {
		t.Errorf("q₂ = %.3f W, want −50.16", q2)
	}
	if math.Abs(heat[0]+heat[1]+heat[2]) > 1e-9 {
		t.Errorf("enclosure does not conserve energy: %v", heat)
	}
}

// A closed two-surface enclosure must reproduce the two-surface relation
// (Incropera et al. eq. 13.23): the radiosity method with F₁₂ = F₂₁ = 1 is
// the same physics.
func TestEnclosureMatchesTwoSurfaceRelation(t *testing.T) {
	pairs, err := EnclosureExchange(
		[]Surface{{Node: 0, Emissivity: 0.8, Area: 1}, {Node: 1, Emissivity: 0.8, Area: 1}},
		[][]float64{{0, 1}, {1, 0}}, -1)
	if err != nil || len(pairs) != 1 {
		t.Fatalf("pairs %v, err %v", pairs, err)
	}
	direct, _ := RadiationBetween(0, 1, 0.8, 1, 0.8, 1, 1)
	if math.Abs(pairs[0].Link.S-direct.S) > 1e-12 {
		t.Errorf("exchange area %g, two-surface relation %g", pairs[0].Link.S, direct.S)
	}
	if _, err := EnclosureExchange([]Surface{{0, 0.8, 1}, {1, 0.8, 1}}, [][]float64{{0, 0.5}, {0.5, 0}}, -1); err == nil {
		t.Error("rows summing to 0.5 in a closed enclosure must be refused")
	}
}

// Cutting channels in two along the flow must not change the total heat
// transfer at equal conditions: L·Nu_front + L·Nu_rear = 2L·Nu_whole,
// since h̄·L = ∫h dx (definition of the mean coefficient).
func TestChannelSegmentsAddUp(t *testing.T) {
	g := plateFin(t)
	half := g
	half.Duct.Length /= 2
	whole := &Channel{Wall: 0, Inlet: 1, Outlet: 2, Flow: 3, Geometry: g}
	front := &Channel{Wall: 0, Inlet: 1, Outlet: 2, Flow: 3, Geometry: half}
	rear := &Channel{Wall: 0, Inlet: 1, Outlet: 2, Flow: 3, Geometry: half, Upstream: half.Duct.Length}
	s := &State{X: []float64{330, 300, 310, 3e-3}, Env: airEnv}
	nu := func(c *Channel) float64 { return detail(t, c.Report(s), "Nu").Value }
	sum := nu(front) + nu(rear)
	if math.Abs(sum-2*nu(whole)) > 1e-9*sum {
		t.Errorf("Nu front %g + rear %g = %g, want 2 × whole = %g", nu(front), nu(rear), sum, 2*nu(whole))
	}
	if nu(rear) >= nu(front) {
		t.Errorf("the rear segment of developing flow must have the lower Nu: %g vs %g", nu(rear), nu(front))
	}
	checkJacobianEnv(t, "rear segment", rear, s.X)
}

// Isothermal fins bound the finned channel from above: η_f = 1 gives the
// largest effective area (definition of fin efficiency, Incropera et al.
// §3.6.4).
func TestIsothermalFins(t *testing.T) {
	g := plateFin(t)
	iso := g
	iso.IsothermalFins = true
	s := &State{X: []float64{330, 300, 310, 3e-3}, Env: airEnv}
	real := &Channel{Wall: 0, Inlet: 1, Outlet: 2, Flow: 3, Geometry: g}
	ideal := &Channel{Wall: 0, Inlet: 1, Outlet: 2, Flow: 3, Geometry: iso}
	if detail(t, ideal.Report(s), "fin_efficiency").Value != 1 {
		t.Error("isothermal fins must report an efficiency of 1")
	}
	if !(detail(t, ideal.Report(s), "NTU").Value > detail(t, real.Report(s), "NTU").Value) {
		t.Error("isothermal fins must transfer more than real ones")
	}
	checkJacobianEnv(t, "isothermal fins", ideal, s.X)
}
