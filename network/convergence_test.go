package network_test

import (
	"math"
	"testing"

	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/elements/air"
	"github.com/heatgraph/heatgraph/elements/dual"
	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/solve"
)

func solveYAML(t *testing.T, name, text string) *network.Solution {
	t.Helper()
	m, err := network.Parse(name, []byte(text))
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
		t.Fatalf("%s: %v (%v)", name, r.Reason, r.Err)
	}
	return net.Solution(r.X)
}

func nodeResult(t *testing.T, sol *network.Solution, id string) network.NodeResult {
	t.Helper()
	for _, n := range sol.Nodes {
		if n.ID == id {
			return n
		}
	}
	t.Fatalf("no node %q", id)
	return network.NodeResult{}
}

// A tag joined to the rest of the box by links a million times weaker than
// the board's own: 200 W leave the board through 5 W/K to a 25 °C ambient,
// so T_board = 65 °C; the tag takes 5e-5 W and is joined by 5e-6 W/K to the
// board and 5e-6 W/K to ambient, so (Fourier's law, by hand)
// T_tag − 25 = (5e-6·40 + 5e-5)/(1e-5) = 25 K: 50 °C, over its 45 °C limit.
// A solver that judged the tag's balance against the board's 200 W once
// reported it converged, cooler, and within its limit.
func TestWeakLinkExact(t *testing.T) {
	sol := solveYAML(t, "weak.yaml", `
ambient: {temperature: 25 degC}
nodes:
  - {id: board, power: 200 W, limit: 150 degC}
  - {id: tag, power: 5e-5 W, limit: 45 degC}
links:
  - {kind: lumped, from: board, to: ambient, conductance: 5 W/K}
  - {kind: lumped, from: board, to: tag, conductance: 5e-6 W/K}
  - {kind: lumped, from: tag, to: ambient, conductance: 5e-6 W/K}
`)
	board, tag := nodeResult(t, sol, "board"), nodeResult(t, sol, "tag")
	// The board also gets back what reaches it from the tag: solve the
	// 2×2 system by hand: 5.000005·Tb − 5e-6·Tt = 200 + 5·298.15 ... in
	// rises over ambient θ: 5.000005θb − 5e-6θt = 200, −5e-6θb + 1e-5θt = 5e-5.
	det := 5.000005*1e-5 - 5e-6*5e-6
	thetaB := (200*1e-5 + 5e-6*5e-5) / det
	thetaT := (5.000005*5e-5 + 5e-6*200) / det
	if math.Abs(board.Temperature-(298.15+thetaB)) > 1e-9 || math.Abs(tag.Temperature-(298.15+thetaT)) > 1e-7 {
		t.Errorf("board %.9f K, tag %.9f K; want %.9f, %.9f", board.Temperature, tag.Temperature, 298.15+thetaB, 298.15+thetaT)
	}
	if tag.Status != network.Over {
		t.Errorf("tag status %q at %.3f °C, want over its 45 °C limit", tag.Status, tag.Temperature-273.15)
	}
}

// A small tag cooled only by natural convection from its upper face beside
// a strongly cooled 100 W board. Its exact temperature solves
// P = h(T)·A·(T − T∞) with h from the same correlation (Lloyd & Moran 1974
// for a heated face up); the reference root here is found by bisection on
// the element's own heat flow, independently of Newton's method.
func TestNaturalOnlyExact(t *testing.T) {
	sol := solveYAML(t, "natural.yaml", `
ambient: {temperature: 25 degC}
nodes:
  - {id: board, power: 100 W}
  - {id: tag, power: 0.05 W, limit: 35 degC}
links:
  - {kind: lumped, from: board, to: ambient, resistance: 0.1 K/W}
  - {kind: natural, from: tag, orientation: facing-up, length: 20 mm, width: 20 mm}
`)
	const tInf, power = 298.15, 0.05
	env := &elements.Env{Pressure: 101325, Gravity: elements.StandardGravity, AmbientT: tInf,
		AirCp: air.SpecificHeat(dual.C(tInf)).V}
	el, err := elements.NewNatural(0, 1, elements.FacingUp, 4e-4, 0.02*0.02/(4*0.02), elements.Fins{})
	if err != nil {
		t.Fatal(err)
	}
	heat := func(ts float64) float64 {
		l := elements.NewLocal(2, 2, false)
		el.Eval(&elements.State{X: []float64{ts, tInf}, Env: env}, l)
		return -l.R[0]
	}
	lo, hi := tInf+1e-6, tInf+500
	for i := 0; i < 200; i++ {
		mid := (lo + hi) / 2
		if heat(mid) < power {
			lo = mid
		} else {
			hi = mid
		}
	}
	want := (lo + hi) / 2
	tag := nodeResult(t, sol, "tag")
	if math.Abs(tag.Temperature-want) > 1e-6 {
		t.Errorf("tag %.9f K, want %.9f K (bisection)", tag.Temperature, want)
	}
	if tag.Status != network.Over {
		t.Errorf("tag at %.2f °C has status %q, want over its 35 °C limit", tag.Temperature-273.15, tag.Status)
	}
}
