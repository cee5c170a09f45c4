package network_test

import (
	"fmt"
	"math"
	"testing"

	"github.com/heatgraph/heatgraph/elements/air"
	"github.com/heatgraph/heatgraph/elements/dual"
	"github.com/heatgraph/heatgraph/network"
)

func detailOf(t *testing.T, sol *network.Solution, link, name string) float64 {
	t.Helper()
	for _, l := range sol.Links {
		if l.ID != link {
			continue
		}
		for _, d := range l.Details {
			if d.Name == name {
				return d.Value
			}
		}
	}
	t.Fatalf("link %q has no detail %q", link, name)
	return 0
}

// A block held at 60 °C with 12 drilled passages, air from a 20 °C
// ambient. At the solution the outlet temperature must satisfy both the
// energy balance T_out − T_in = q/(ṁc_p) and the uniform-wall relation
// (T_s − T_out)/(T_s − T_in) = e^(−NTU) (Incropera et al. eq. 8.42b), to
// round-off.
func TestChannelOutletRelations(t *testing.T) {
	sol := solveModel(t, "block", `
ambient: {temperature: 20 degC}
nodes:
  - {id: block, kind: fixed, temperature: 60 degC}
  - {id: out, kind: air}
links:
  - {id: holes, kind: channel, from: block, inlet: ambient, to: out, mass_flow: 2 g/s,
     shape: circular, diameter: 5 mm, count: 12, length: 150 mm}
  - {id: vent, kind: stream, from: out, to: ambient, mass_flow: 2 g/s}
`)
	tIn, tOut, tS := 293.15, nodeT(t, sol, "out"), 333.15
	cp := air.SpecificHeat(dual.C(293.15)).V
	q := linkQ(t, sol, "holes")
	near(t, "outlet from the energy balance", tOut-tIn, q/(2e-3*cp), 1e-12)
	ntu := detailOf(t, sol, "holes", "NTU")
	near(t, "uniform-wall outlet relation", (tS-tOut)/(tS-tIn), math.Exp(-ntu), 1e-12)
	near(t, "heat leaving through the vent", sol.Balance.Out[0].Heat, q, 1e-12)
	// The relation itself, by hand: T_s = 60 °C, T_in = 20 °C, NTU = 1
	// give T_out = 60 − 40/e = 45.28 °C.
	if got := 60 - 40*math.Exp(-1); math.Abs(got-45.28) > 0.005 {
		t.Errorf("uniform-wall relation at NTU = 1: %.3f °C, want 45.28", got)
	}
}

// Air warms along its path: two blocks in series in one stream, the second
// fed by the first's outlet. With given powers the exhaust temperature
// rise is P/(ṁc_p) whatever happens inside (first law).
func TestStreamWarmsAlongPath(t *testing.T) {
	sol := solveModel(t, "series", `
ambient: {temperature: 25 degC}
nodes:
  - {id: a, power: 15 W}
  - {id: b, power: 10 W}
  - {id: mid, kind: air}
  - {id: out, kind: air}
links:
  - {id: ca, kind: channel, from: a, inlet: ambient, to: mid, flow: 5 CFM, shape: rectangular, width: 3 mm, height: 20 mm, count: 10, length: 60 mm}
  - {id: cb, kind: channel, from: b, inlet: mid, to: out, flow: 5 CFM, shape: rectangular, width: 3 mm, height: 20 mm, count: 10, length: 60 mm, upstream_length: 60 mm}
  - {id: vent, kind: stream, from: out, to: ambient, flow: 5 CFM}
`)
	rho := air.Density(dual.C(298.15), 101325).V
	mdot := 5 * 0.3048 * 0.3048 * 0.3048 / 60 * rho // 5 CFM of ambient air
	cp := air.SpecificHeat(dual.C(298.15)).V
	near(t, "exhaust rise", nodeT(t, sol, "out")-298.15, 25/(mdot*cp), 1e-10)
	near(t, "rise after the first block", nodeT(t, sol, "mid")-298.15, 15/(mdot*cp), 1e-10)
	if !(nodeT(t, sol, "b") > nodeT(t, sol, "mid")) {
		t.Error("the second block must be warmer than the air reaching it")
	}
}

// The same fan volume at altitude moves less mass: the exhaust rise grows
// as 1/ρ. At 3000 m the 1976 standard atmosphere gives 70 121 Pa against
// 101 325 Pa at sea level (U.S. Standard Atmosphere 1976, p = p₀(T/T₀)^5.2559
// with T = 268.66 K), a ratio of 1.445 at
// equal temperature.
func TestAltitudeThinsTheAir(t *testing.T) {
	model := func(where string) string {
		return fmt.Sprintf(`
ambient: {temperature: 30 degC, %s}
nodes:
  - {id: chip, power: 20 W}
  - {id: out, kind: air}
links:
  - {kind: channel, from: chip, inlet: ambient, to: out, flow: 10 CFM, fin_count: 10, fin_thickness: 1 mm, fin_height: 20 mm, base_width: 50 mm, length: 50 mm, material: aluminium}
  - {kind: stream, from: out, to: ambient, flow: 10 CFM}
`, where)
	}
	low := solveModel(t, "sea", model("altitude: 0 m"))
	high := solveModel(t, "high", model("altitude: 3000 m"))
	ratio := (nodeT(t, high, "out") - 303.15) / (nodeT(t, low, "out") - 303.15)
	near(t, "exhaust rise ratio", ratio, 101325.0/70121, 2e-4)
	if !(nodeT(t, high, "chip") > nodeT(t, low, "chip")) {
		t.Error("the chip must run hotter at altitude")
	}
}

// A vertical plate losing heat by natural convection only: at the solved
// temperature the heat must equal h·A·ΔT with h from Churchill & Chu
// (1975) evaluated by hand at the film temperature.
func TestNaturalConvectionPlate(t *testing.T) {
	sol := solveModel(t, "plate", `
ambient: {temperature: 300 K}
nodes:
  - {id: plate, power: 3 W}
links:
  - {id: nc, kind: natural, from: plate, orientation: vertical, height: 0.2 m, width: 0.15 m}
`)
	ts := nodeT(t, sol, "plate")
	film := (ts + 300) / 2
	p := air.At(dual.C(film), 101325)
	ra := 9.80665 / film * (ts - 300) * 0.008 / (p.Nu.V * p.Alpha.V)
	nu := math.Pow(0.825+0.387*math.Pow(ra, 1.0/6)/math.Pow(1+math.Pow(0.492/p.Pr.V, 9.0/16), 8.0/27), 2)
	h := nu * p.K.V / 0.2
	near(t, "heat at the solution", h*0.03*(ts-300), 3, 1e-9)
}

// Three surfaces by radiosity, solved by hand from the radiosity equations
// (Incropera et al. §13.3): two
// aligned 1 m × 1 m plates 1 m apart (F = 0.19982 by the parallel-
// rectangle formula), ε = 0.8, at 350 K and 300 K, the rest of their view
// to black surroundings at 300 K: q₁ = +311.3 W, q₂ = −50.16 W.
func TestEnclosureModel(t *testing.T) {
	sol := solveModel(t, "plates", `
ambient: {temperature: 300 K}
nodes:
  - {id: hot, kind: fixed, temperature: 350 K}
  - {id: cool, kind: fixed, temperature: 300 K}
enclosures:
  - id: gap
    open_to: ambient
    surfaces:
      - {node: hot, emissivity: 0.8, area: 1 m2}
      - {node: cool, emissivity: 0.8, area: 1 m2}
    view_factors:
      - {from: hot, to: cool, parallel: {width: 1 m, length: 1 m, gap: 1 m}}
`)
	q1, q2 := 0.0, 0.0
	for _, b := range sol.Balance.Out {
		switch b.Node {
		case "hot":
			q1 = -b.Heat
		case "cool":
			q2 = -b.Heat
		}
	}
	if math.Abs(q1-311.3) > 0.05 || math.Abs(q2+50.16) > 0.01 {
		t.Errorf("q₁ = %.3f W, q₂ = %.3f W; want 311.3 and −50.16", q1, q2)
	}
}

func TestExamplesSolve(t *testing.T) {
	for _, f := range globOrNil("../examples/*.yaml") {
		sol := solveModel(t, f, readFile(t, f))
		if len(sol.Exceeded()) > 0 {
			t.Errorf("%s: an example exceeds a limit: %v", f, sol.Exceeded())
		}
	}
}

// At the usual start, every node at ambient, natural convection has zero
// slope (h ∝ ΔT^¼ for a horizontal plate); the solve must still find the
// balance P = h·A·ΔT.
func TestNaturalFromAmbientStart(t *testing.T) {
	sol := solveModel(t, "lid", `
ambient: {temperature: 25 degC}
nodes:
  - {id: lid, power: 5 W}
links:
  - {id: up, kind: natural, from: lid, orientation: facing-up, length: 200 mm, width: 150 mm}
`)
	h := detailOf(t, sol, "up", "h")
	near(t, "heat at the solution", h*0.03*(nodeT(t, sol, "lid")-298.15), 5, 1e-9)
}
