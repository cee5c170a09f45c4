package network_test

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/solve"
)

// solveModel parses YAML text, solves it and fails the test on any error.
func solveModel(t *testing.T, name, text string) *network.Solution {
	t.Helper()
	m, err := network.Parse(name, []byte(text))
	if err != nil {
		t.Fatalf("parse: %v", err)
	}
	net, err := network.Build(m)
	if err != nil {
		t.Fatalf("build: %v", err)
	}
	p := net.Steady()
	r := solve.Newton(p, p.InitialGuess(), solve.Settings{})
	if !r.Reason.Converged() {
		t.Fatalf("solve: %v after %d iterations", r.Reason, r.Iterations)
	}
	sol := net.Solution(r.X)
	if b := sol.Balance; math.Abs(b.Imbalance) > b.MaxImbalance() {
		t.Errorf("energy balance does not close: imbalance %g W", b.Imbalance)
	}
	return sol
}

func nodeT(t *testing.T, sol *network.Solution, id string) float64 {
	t.Helper()
	i, ok := sol.Net.Index[id]
	if !ok {
		t.Fatalf("no node %q", id)
	}
	return sol.T[i]
}

func linkQ(t *testing.T, sol *network.Solution, id string) float64 {
	t.Helper()
	for _, l := range sol.Links {
		if l.ID == id {
			return l.Heat
		}
	}
	t.Fatalf("no link %q", id)
	return 0
}

func near(t *testing.T, what string, got, want, rel float64) {
	t.Helper()
	if math.Abs(got-want) > rel*math.Max(math.Abs(want), 1e-300) {
		t.Errorf("%s = %.10g, want %.10g (relative tolerance %g)", what, got, want, rel)
	}
}

// A composite wall: series layers with a contact resistance, a parallel
// path through a bolt, convection on the cold side. The exact answer
// follows from the series and parallel rules for thermal resistances
// (Incropera et al., Fundamentals of Heat and Mass Transfer, §3.1.2–3.1.4).
func TestCompositeWall(t *testing.T) {
	sol := solveModel(t, "../testdata/composite-wall.yaml", readFile(t, "../testdata/composite-wall.yaml"))
	const (
		tHot, tAir = 373.15, 293.15
		rSkin      = 0.05                // K/W, given
		rSteel     = 0.010 / (50 * 0.01) // L/(kA)
		rJoint     = 2e-4 / 0.01         // R″/A, 2 K cm²/W over 100 cm²
		rAlu       = 0.005 / (237 * 0.01)
		rBolt      = 1 / 0.5
		rFilm      = 1 / (25 * 0.01) // 1/(hA)
	)
	rStack := rSteel + rJoint + rAlu
	rPar := 1 / (1/rStack + 1/rBolt)
	q := (tHot - tAir) / (rSkin + rPar + rFilm)
	near(t, "heat through the wall", linkQ(t, sol, "film"), q, 1e-12)
	tOuter := tHot - q*rSkin
	near(t, "steel outer face", nodeT(t, sol, "steel-outer"), tOuter, 1e-12)
	qStack := q * rPar / rStack
	near(t, "heat through the layers", linkQ(t, sol, "steel"), qStack, 1e-12)
	near(t, "heat through the bolt", linkQ(t, sol, "bolt"), q-qStack, 1e-10)
	near(t, "drop across the joint", nodeT(t, sol, "steel-inner")-nodeT(t, sol, "alu-inner"), qStack*rJoint, 1e-10)
	near(t, "aluminium outer face", nodeT(t, sol, "alu-outer"), tAir+q*rFilm, 1e-12)
}

// finModel is a straight rectangular fin with an adiabatic tip, cut into m
// segments: node i sits at x = i·L/m, conduction joins neighbours, and each
// node convects from the surface it represents (half a segment at the base
// and at the tip).
func finModel(m int) string {
	const (
		k, h, w, th, L = 200.0, 25.0, 0.05, 0.0015, 0.03
		base, air      = 80.0, 20.0 // °C
	)
	perimeter := 2 * (w + th)
	dx := L / float64(m)
	var b strings.Builder
	fmt.Fprintf(&b, "ambient: {temperature: %g degC}\nnodes:\n  - {id: n0, kind: fixed, temperature: %g degC}\n", air, base)
	for i := 1; i <= m; i++ {
		fmt.Fprintf(&b, "  - {id: n%d}\n", i)
	}
	b.WriteString("links:\n")
	fmt.Fprintf(&b, "  - {id: c0, kind: convection, from: n0, coefficient: %g, area: %g}\n", h, perimeter*dx/2)
	for i := 1; i <= m; i++ {
		fmt.Fprintf(&b, "  - {kind: conduction, from: n%d, to: n%d, conductivity: %g, area: %g, length: %g}\n", i-1, i, k, w*th, dx)
		area := perimeter * dx
		if i == m {
			area /= 2
		}
		fmt.Fprintf(&b, "  - {id: c%d, kind: convection, from: n%d, coefficient: %g, area: %g}\n", i, i, h, area)
	}
	return b.String()
}

// The discretised fin converges on the analytic solution for an adiabatic
// tip, θ(x)/θ_b = cosh m(L−x)/cosh mL and q_f = √(hPkA_c)·θ_b·tanh mL
// (Incropera et al., Table 3.4, case B), with second-order error.
func TestFinConvergesOnCoshSolution(t *testing.T) {
	const k, h, w, th, L = 200.0, 25.0, 0.05, 0.0015, 0.03
	perimeter, ac := 2*(w+th), w*th
	mm := math.Sqrt(h * perimeter / (k * ac))
	qExact := math.Sqrt(h*perimeter*k*ac) * 60 * math.Tanh(mm*L)
	tipExact := 293.15 + 60/math.Cosh(mm*L)
	prevErr := math.Inf(1)
	for _, m := range []int{4, 8, 16, 32, 64} {
		sol := solveModel(t, "fin", finModel(m))
		q := 0.0
		for _, l := range sol.Links {
			if l.From == "n0" {
				q += l.Heat
			}
		}
		errQ := math.Abs(q-qExact) / qExact
		errTip := math.Abs(nodeT(t, sol, fmt.Sprintf("n%d", m)) - tipExact)
		if ratio := prevErr / errQ; m > 4 && (ratio < 3.5 || ratio > 4.5) {
			t.Errorf("M = %d: heat error fell by %.2f on halving the segment, want about 4 (second order)", m, ratio)
		}
		prevErr = errQ
		if m == 64 && (errQ > 1e-4 || errTip > 1e-3) {
			t.Errorf("M = 64: heat %.6f W vs %.6f W, tip %.5f K vs %.5f K", q, qExact, nodeT(t, sol, "n64"), tipExact)
		}
	}
}

// A plate losing heat by convection and radiation: choosing T = 350 K in
// 300 K surroundings fixes the power by hand,
// P = hA(T − T∞) + εσA(T⁴ − T∞⁴) = 5 + 3.5245 W for h = 10 W/(m² K),
// A = 0.01 m², ε = 0.9; solving with that power must return 350 K.
func TestConvectionRadiationBalance(t *testing.T) {
	const sigma = 5.670374419e-8
	p := 10*0.01*50 + 0.9*sigma*0.01*(math.Pow(350, 4)-math.Pow(300, 4))
	sol := solveModel(t, "plate", fmt.Sprintf(`
ambient: {temperature: 300 K}
nodes:
  - {id: plate, power: %.17g W}
links:
  - {id: conv, kind: convection, from: plate, coefficient: 10 W/m2/K, area: 100 cm2}
  - {id: rad, kind: radiation, from: plate, emissivity: 0.9, area: 100 cm2}
`, p))
	near(t, "plate temperature", nodeT(t, sol, "plate"), 350, 1e-12)
	near(t, "convected heat", linkQ(t, sol, "conv"), 5, 1e-11)
	near(t, "radiated heat", linkQ(t, sol, "rad"), p-5, 1e-11)
}

// The JEDEC two-resistor model (JESD15-3) joins the junction to the case
// through R_jc and to the board through R_jb; with both ends held, the
// junction temperature follows by hand from the node balance
// T_j = (T_c/R_jc + T_b/R_jb + P)/(1/R_jc + 1/R_jb).
func TestTwoResistorComponent(t *testing.T) {
	sol := solveModel(t, "part", `
ambient: {temperature: 25 degC}
required_margin: 10 K
nodes:
  - {id: lid, kind: fixed, temperature: 60 degC}
  - {id: pcb, kind: fixed, temperature: 70 degC}
components:
  - {id: fpga, power: 10 W, r_jc: 0.5 K/W, r_jb: 3 K/W, case: lid, board: pcb, limit: 100 degC}
`)
	tj := (333.15/0.5 + 343.15/3 + 10) / (1/0.5 + 1.0/3)
	near(t, "junction", nodeT(t, sol, "fpga"), tj, 1e-12)
	near(t, "junction-to-case heat", linkQ(t, sol, "fpga.jc"), (tj-333.15)/0.5, 1e-12)
	var fpga network.NodeResult
	for _, n := range sol.Nodes {
		if n.ID == "fpga" {
			fpga = n
		}
	}
	// T_j = 66.36 °C: margin 33.6 K against 100 °C, above the 10 K asked.
	if fpga.Kind != network.Junction || fpga.Status != network.OK || math.Abs(fpga.Margin-(373.15-tj)) > 1e-9 {
		t.Errorf("junction result %+v", fpga)
	}
}

// Limits: over, tight and ok statuses, against a node held by a single
// resistance (T = T∞ + P·R, by hand).
func TestLimitStatuses(t *testing.T) {
	sol := solveModel(t, "limits", `
ambient: {temperature: 40 degC}
required_margin: 5 K
nodes:
  - {id: hot, power: 10 W, limit: 85 degC}
  - {id: warm, power: 10 W, limit: 100 degC}
  - {id: cool, power: 1 W, limit: 100 degC}
links:
  - {kind: lumped, from: hot, to: ambient, resistance: 5 K/W}
  - {kind: lumped, from: warm, to: ambient, resistance: 5.6 K/W}
  - {kind: lumped, from: cool, to: ambient, resistance: 5 K/W}
`)
	want := map[string]network.Status{"hot": network.Over, "warm": network.Tight, "cool": network.OK, "ambient": network.NoLimit}
	for _, n := range sol.Nodes {
		if n.Status != want[n.ID] {
			t.Errorf("%s: status %q, want %q (T = %.2f °C)", n.ID, n.Status, want[n.ID], n.Temperature-273.15)
		}
	}
	if ex := sol.Exceeded(); len(ex) != 1 || ex[0].ID != "hot" {
		t.Errorf("Exceeded() = %v", ex)
	}
}
