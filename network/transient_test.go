package network_test

import (
	"math"
	"testing"

	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/solve"
)

// A box with nonlinear links (radiation, exact T⁴) and a massless node:
// after many time constants a run must arrive at the steady solution (the
// steady state is the limit of the transient as t → ∞ for a stable
// network; a consistency check of the two solvers, not a published value).
const warmBox = `
ambient: {temperature: 25 degC}
nodes:
  - {id: board, power: 6 W, capacity: 120 J/K, limit: 90 degC}
  - {id: pad}                                  # massless
  - {id: lid, capacity: 400 J/K}
components:
  - {id: cpu, power: 4 W, r_jc: 0.5 K/W, case: pad, r_jb: 8 K/W, board: board, capacity: 2 J/K, limit: 95 degC}
links:
  - {from: pad, to: lid, kind: lumped, conductance: 2 W/K}
  - {from: board, to: lid, kind: lumped, conductance: 0.8 W/K}
  - {from: lid, kind: convection, coefficient: 6 W/m2/K, area: 0.05 m2}
  - {from: lid, kind: radiation, emissivity: 0.9, area: 0.05 m2}
`

func TestLongRunReachesSteadyState(t *testing.T) {
	net := assembleModel(t, "box.yaml", warmBox)
	st := net.Steady()
	res := solve.Newton(st, st.InitialGuess(), solve.Settings{})
	if !res.Reason.Converged() {
		t.Fatal(res.Reason)
	}
	steady := net.Solution(res.X)
	// The slowest time constant is about C_lid/G_lid ≈ 400/(0.3 + 0.3) s;
	// 40 000 s is far beyond it.
	h, err := net.Run(network.RunOptions{End: 40000, RelTol: 1e-7, AbsTol: 1e-5})
	if err != nil {
		t.Fatal(err)
	}
	if !h.Completed() {
		t.Fatalf("run ended: %v (%v)", h.Result.Reason, h.Result.Err)
	}
	last := h.T[len(h.T)-1]
	for i, n := range net.Nodes {
		if d := math.Abs(last[i] - steady.T[i]); d > 1e-4 {
			t.Errorf("%s: %.6f K after the run, steady %.6f K", n.ID, last[i], steady.T[i])
		}
	}
	if h.Times[len(h.Times)-1] != 40000 || h.Times[0] != 0 || len(h.Times) != 101 {
		t.Errorf("output times: %d from %g to %g s, want 101 from 0 to 40000", len(h.Times), h.Times[0], h.Times[len(h.Times)-1])
	}
}

// The energy over a run with a pulse train, a massless node and radiation
// balances: heat in = heat out + change of the heat stored, to far within
// EnergyTolerance (the first law for the whole box).
func TestRunEnergyBalances(t *testing.T) {
	net := assembleModel(t, "box.yaml", `
ambient: {temperature: 25 degC}
nodes:
  - {id: board, power: {pulse: {base: 1 W, peak: 30 W, start: 5 s, width: 3 s}, repeat: 60 s}, capacity: 50 J/K}
  - {id: pad}
  - {id: lid, capacity: 300 J/K}
  - {id: rail, kind: fixed, temperature: {step: {before: 25 degC, after: 40 degC, at: 200 s}}}
links:
  - {from: board, to: pad, kind: lumped, conductance: 3 W/K}
  - {from: pad, to: lid, kind: lumped, conductance: 2 W/K}
  - {from: lid, to: rail, kind: lumped, conductance: 0.3 W/K}
  - {from: lid, kind: radiation, emissivity: 0.9, area: 0.05 m2}
`)
	for _, modified := range []bool{false, true} {
		runEnergy(t, net, modified)
	}
}

func runEnergy(t *testing.T, net *network.Network, modified bool) {
	h, err := net.Run(network.RunOptions{End: 600, Start: network.FromSteady, ModifiedNewton: modified})
	if err != nil {
		t.Fatal(err)
	}
	if !h.Completed() {
		t.Fatalf("run ended: %v (%v)", h.Result.Reason, h.Result.Err)
	}
	e := h.Energy
	// Pulses: 10 per run of 29 W extra for 3 s, over 1 W for 600 s.
	if want := 600*1.0 + 10*29*3; math.Abs(e.Sources-want) > 1e-9*want {
		t.Errorf("heat from sources %.9g J, want %.9g J (the profile's integral)", e.Sources, want)
	}
	t.Logf("modified Newton %v: imbalance %.3g J relative %.3g, steps %d, factorizations %d", modified, e.Imbalance, e.Relative(), h.Result.Steps, h.Result.Factorized)
	if r := e.Relative(); r > 1e-8 {
		t.Errorf("energy imbalance %.3g J (%.2g relative); in %.6g J, stored %.6g J, out %v", e.Imbalance, r, e.Sources, e.Stored, e.Out)
	}
	if len(h.Warnings) != 0 {
		t.Errorf("warnings: %v", h.Warnings)
	}
	if h.Cycle != nil {
		t.Errorf("a step in the rail temperature does not repeat, but a cycle was checked: %+v", h.Cycle)
	}
}

// A repeated duty cycle settles into a periodic state; the run says after
// how many cycles, and the peak within the settled cycle lies between the
// steady temperatures at the mean power and at the on power.
func TestPeriodicStateSettles(t *testing.T) {
	net := assembleModel(t, "box.yaml", `
ambient: {temperature: 20 degC}
nodes:
  - {id: part, power: {duty: {period: 100 s, on_fraction: 30 %, on: 10 W, off: 0 W}}, capacity: 100 J/K, limit: 40 degC}
links:
  - {from: part, to: ambient, kind: lumped, conductance: 1 W/K}
`)
	h, err := net.Run(network.RunOptions{End: 3000})
	if err != nil {
		t.Fatal(err)
	}
	if h.Cycle == nil || !h.Cycle.Settled {
		t.Fatalf("no settled cycle: %+v", h.Cycle)
	}
	// The cycle-to-cycle change decays as e^(−P·G/C) = e^(−1) per period
	// from a start 3 K (the mean rise) away: below 0.01 K after about
	// ln(300) ≈ 6 periods.
	t.Logf("cycle %+v", *h.Cycle)
	if h.Cycle.Cycles < 5 || h.Cycle.Cycles > 9 {
		t.Errorf("settled after %d cycles, want about 6", h.Cycle.Cycles)
	}
	// The settled peak of a first-order system under a square wave:
	// θ_peak = P_on/G·(1 − e^(−aP/τ))/(1 − e^(−P/τ)) with a the on
	// fraction and τ = C/G (the periodic solution of C·dθ/dt = P(t) − Gθ,
	// worked out by matching the exponentials at the switching times).
	tau, per, a := 100.0, 100.0, 0.3
	want := 293.15 + 10*(1-math.Exp(-a*per/tau))/(1-math.Exp(-per/tau))
	var got float64
	for _, p := range h.Cycle.Peaks {
		if p.Node == "part" {
			got = p.Temperature
		}
	}
	if math.Abs(got-want) > 0.02 {
		t.Errorf("settled peak %.4f K, want %.4f K", got, want)
	}
	// The limit of 40 degC is above the peak (26.7 degC): no crossing.
	if len(h.Crossings) != 0 {
		t.Errorf("crossings: %+v", h.Crossings)
	}
}

// The first crossing of a limit is interpolated between steps: a node
// heated by a step of power crosses θ = L at t = −τ·ln(1 − L·G/P).
func TestFirstCrossing(t *testing.T) {
	net := assembleModel(t, "box.yaml", `
ambient: {temperature: 20 degC}
nodes:
  - {id: part, power: 10 W, capacity: 100 J/K, limit: 25 degC}
links:
  - {from: part, to: ambient, kind: lumped, conductance: 1 W/K}
`)
	h, err := net.Run(network.RunOptions{End: 300, RelTol: 1e-8, AbsTol: 1e-6})
	if err != nil {
		t.Fatal(err)
	}
	if len(h.Crossings) != 1 {
		t.Fatalf("crossings: %+v", h.Crossings)
	}
	want := -100 * math.Log(1-5.0/10)
	// Linear interpolation between steps: within a small part of a step.
	if got := h.Crossings[0].At; math.Abs(got-want) > 0.5 {
		t.Errorf("crossed at %.3f s, want %.3f s", got, want)
	}
	// The peak is at the end.
	for _, p := range h.Peaks {
		if p.Node == "part" && p.At != 300 {
			t.Errorf("peak at %g s, want 300 s", p.At)
		}
	}
}

// Sunlight is environment heat: the steady balance lists it apart from the
// parts' powers and still closes; a surface in the sun with a convection
// and a sky link settles where α_s·A·G + P = hA(T − T_a) + sky loss, the
// sky loss by εσA[F(T⁴ − T_sky⁴) + (1 − F)(T⁴ − T_a⁴)] (Incropera eq. 1.7).
func TestSunAndSkySteadyBalance(t *testing.T) {
	sol := solveModel(t, "box.yaml", `
ambient: {temperature: 30 degC}
nodes:
  - {id: lid, power: 5 W}
links:
  - {id: noon, kind: sun, from: lid, absorptivity: 0.4, area: 0.1 m2, irradiance: 1000 W/m2}
  - {id: air, kind: convection, from: lid, coefficient: 8 W/m2/K, area: 0.1 m2}
  - {id: up, kind: sky, from: lid, emissivity: 0.9, area: 0.1 m2, view_factor: 0.5, sky_temperature: 10 degC}
`)
	b := sol.Balance
	if b.In != 5 || math.Abs(b.Environment-40) > 1e-12 {
		t.Errorf("balance in %g W, environment %g W; want 5 W and 40 W (0.4 × 0.1 m2 × 1000 W/m2)", b.In, b.Environment)
	}
	tl := nodeT(t, sol, "lid")
	ta, ts := 303.15, 283.15
	loss := 8*0.1*(tl-ta) + 0.9*5.670374419e-8*0.1*(0.5*(math.Pow(tl, 4)-math.Pow(ts, 4))+0.5*(math.Pow(tl, 4)-math.Pow(ta, 4)))
	near(t, "heat lost by the lid", loss, 45, 1e-9)
}

// Over a day, the sun's energy is the integral of α_s·A·G(t): a table
// rising linearly from 0 at 6 h to 1000 W/m2 at 12 h and back to 0 at
// 18 h holds 6 h × 1000 W/m2 = 21.6 MJ/m2; on α_s·A = 0.04 m2 that is
// 864 kJ. The run's energy closes with it counted as environment heat.
func TestSunOverADay(t *testing.T) {
	net := assembleModel(t, "box.yaml", `
ambient: {temperature: 20 degC}
nodes:
  - {id: lid, capacity: 2 kJ/K}
  - {id: inside, power: 3 W, capacity: 500 J/K}
links:
  - {from: inside, to: lid, kind: lumped, conductance: 1.5 W/K}
  - {id: sun, kind: sun, from: lid, absorptivity: 0.4, area: 0.1 m2,
     irradiance: {table: [[0 h, 0 W/m2], [6 h, 0 W/m2], [12 h, 1000 W/m2], [18 h, 0 W/m2]], repeat: 24 h}}
  - {id: air, kind: convection, from: lid, coefficient: 6 W/m2/K, area: 0.1 m2}
  - {id: up, kind: sky, from: lid, emissivity: 0.9, area: 0.1 m2, sky_model: swinbank}
`)
	h, err := net.Run(network.RunOptions{End: 86400, Interval: 3600})
	if err != nil {
		t.Fatal(err)
	}
	if !h.Completed() {
		t.Fatalf("run ended: %v (%v)", h.Result.Reason, h.Result.Err)
	}
	if math.Abs(h.Energy.Environment-864e3) > 1e-3*864e3 {
		t.Errorf("sun over the day %.6g J, want 864 kJ", h.Energy.Environment)
	}
	if want := 3.0 * 86400; math.Abs(h.Energy.Sources-want) > 1e-9*want {
		t.Errorf("sources over the day %.6g J, want %.6g J", h.Energy.Sources, want)
	}
	if r := h.Energy.Relative(); r > 1e-8 {
		t.Errorf("energy imbalance %.3g J (%.2g relative)", h.Energy.Imbalance, r)
	}
	// The lid is hottest in the afternoon, after the noon peak of the sun
	// (its heat capacity delays it), and before the sun sets.
	for _, p := range h.Peaks {
		if p.Node == "lid" && (p.At < 12*3600 || p.At > 18*3600) {
			t.Errorf("lid peaks at %.2f h, want between noon and 18 h", p.At/3600)
		}
	}
	if h.Cycle != nil {
		t.Logf("cycle: %+v", *h.Cycle)
	}
}

// A massless lid whose only link is natural convection has no slope at
// the usual start, every node at ambient (h ∝ ΔT^¼ → 0): the consistent
// start still puts it on its balance, and it stays at its steady
// temperature while the heavy base warms beside it (the two are not
// linked, so the steady solve gives the lid's answer).
func TestMasslessNodeWithoutSlopeAtStart(t *testing.T) {
	text := `
ambient: {temperature: 25 degC}
nodes:
  - {id: lid, power: 10 W}
  - {id: base, power: 5 W, capacity: 200 J/K}
links:
  - {id: up, kind: natural, from: lid, orientation: facing-up, length: 200 mm, width: 150 mm}
  - {id: side, kind: natural, from: base, orientation: vertical, height: 100 mm, width: 150 mm}
`
	steady := solveModel(t, "box.yaml", text)
	net := assembleModel(t, "box.yaml", text)
	h, err := net.Run(network.RunOptions{End: 3600})
	if err != nil {
		t.Fatal(err)
	}
	if !h.Completed() {
		t.Fatalf("run ended: %v (%v)", h.Result.Reason, h.Result.Err)
	}
	lid := net.Index["lid"]
	for k, tt := range h.Times {
		if d := math.Abs(h.T[k][lid] - steady.T[lid]); d > 1e-6 {
			t.Errorf("t = %g s: lid at %.6f K, steady %.6f K", tt, h.T[k][lid], steady.T[lid])
		}
	}
}

// A network beyond the dense LU's limit runs with the sparse solver that
// solve.Auto picks for it; its energy still balances.
func TestRunBeyondDenseLimit(t *testing.T) {
	net := assembleModel(t, "grid.yaml", gridModel(72))
	if net.Unknowns() <= solve.DenseLimit {
		t.Fatalf("%d unknowns, want more than %d", net.Unknowns(), solve.DenseLimit)
	}
	h, err := net.Run(network.RunOptions{End: 10, FixedStep: 1, ModifiedNewton: true})
	if err != nil {
		t.Fatal(err)
	}
	if !h.Completed() {
		t.Fatalf("run ended: %v (%v)", h.Result.Reason, h.Result.Err)
	}
	// 2 W for the first second, 40 W for the next nine (the pulse).
	if want := 2.0 + 9*40; math.Abs(h.Energy.Sources-want) > 1e-9*want {
		t.Errorf("heat from sources %.9g J, want %g J", h.Energy.Sources, want)
	}
	if r := h.Energy.Relative(); r > 1e-8 {
		t.Errorf("energy imbalance %.3g (relative)", r)
	}
}

// A fan whose speed steps down from 4000 to 2000 rpm at t = 60 s: long
// after the step, a run arrives at the steady state of the same box with
// the fan at 2000 rpm throughout (the fan laws scale the curve by the
// speed; consistency of the speed profile with a constant speed).
func TestFanSpeedProfile(t *testing.T) {
	box := func(speed string) string {
		return `
ambient: {temperature: 30 degC}
nodes:
  - {id: inside, kind: air, volume: 2 L}
  - {id: board, power: 25 W, capacity: 300 J/K, limit: 90 degC}
links:
  - {kind: fan, from: ambient, to: inside, curve: [[0, 60 Pa], [10 L/s, 45 Pa], [20 L/s, 0 Pa]], curve_speed: 4000 rpm, speed: ` + speed + `}
  - {kind: loss, from: inside, to: ambient, coefficient: 2, area: 20 cm2}
  - {kind: convection, from: board, to: inside, coefficient: 25 W/m2/K, area: 0.04 m2}
  - {kind: convection, from: board, to: ambient, coefficient: 3 W/m2/K, area: 0.02 m2}
`
	}
	slow := assembleModel(t, "slow.yaml", box("2000 rpm"))
	st := slow.Steady()
	res := solve.Newton(st, st.InitialGuess(), solve.Settings{})
	if !res.Reason.Converged() {
		t.Fatal(res.Reason, res.Err)
	}
	want := slow.Solution(res.X)
	net := assembleModel(t, "step.yaml", box("{step: {before: 4000 rpm, after: 2000 rpm, at: 60 s}}"))
	st = net.Steady()
	res = solve.Newton(st, st.InitialGuess(), solve.Settings{})
	if !res.Reason.Converged() {
		t.Fatal(res.Reason, res.Err)
	}
	if fast := net.Solution(res.X); !(fast.T[2] < want.T[2]-1) {
		t.Errorf("at t = 0 the fan runs at 4000 rpm: board %.2f K, want well below %.2f K", fast.T[2], want.T[2])
	}
	h, err := net.Run(network.RunOptions{End: 20000, RelTol: 1e-7, AbsTol: 1e-5})
	if err != nil {
		t.Fatal(err)
	}
	if !h.Completed() {
		t.Fatalf("run ended: %v (%v)", h.Result.Reason, h.Result.Err)
	}
	last := h.T[len(h.T)-1]
	for i, n := range net.Nodes {
		if d := math.Abs(last[i] - want.T[i]); d > 1e-4 {
			t.Errorf("%s: %.6f K after the run, %.6f K at 2000 rpm throughout", n.ID, last[i], want.T[i])
		}
	}
}
