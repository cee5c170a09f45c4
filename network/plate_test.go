package network_test

import (
	"math"
	"testing"

	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/solve"
)

// solveText parses, builds and solves a model, failing the test on any
// error.
func solveText(t *testing.T, text string) *network.Solution {
	t.Helper()
	net, err := network.Build(parseOK(t, text))
	if err != nil {
		t.Fatal(err)
	}
	p := net.Steady()
	r := solve.Newton(p, p.InitialGuess(), solve.Settings{})
	if !r.Reason.Converged() {
		t.Fatalf("not converged: %v (%v)", r.Reason, r.Err)
	}
	return net.Solution(r.X)
}

// A plate heated uniformly over its top and cooled by h over its bottom
// carries the heat straight through: with one cell through the thickness,
// the cell's centre sits at T∞ + q″·(1/h + (t/2)/k) (plane wall in
// series with a film, Incropera et al., ch. 3), whatever the mesh.
func TestPlateUniformFlux(t *testing.T) {
	sol := solveText(t, `
ambient: {temperature: 20 degC}
plates:
  - id: slab
    size: [40 mm, 25 mm]
    cells: [8, 5]
    conductivity: 2 W/(m K)
    thickness: 3 mm
    faces:
      - {face: bottom, to: ambient, h: 50 W/(m2 K)}
    heat:
      - {power: 2 W}
`)
	q := 2 / (0.040 * 0.025)
	want := 293.15 + q*(1/50.0+0.0015/2)
	p := sol.Plates[0]
	for c, v := range p.T {
		if math.Abs(v-want) > 1e-9 {
			t.Fatalf("cell %d at %.12g K, want %.12g K", c, v, want)
		}
	}
	if got := nodeT(t, sol, "slab"); math.Abs(got-want) > 1e-9 {
		t.Errorf("plate node at %.12g K, want its hottest cell's %.12g K", got, want)
	}
	if math.Abs(p.Joins[0].Heat-2) > 1e-12 || math.Abs(sol.Balance.Imbalance) > 1e-12 {
		t.Errorf("join heat %.15g W, imbalance %g W; want 2 W and 0", p.Joins[0].Heat, sol.Balance.Imbalance)
	}
}

// Parts placed on a plate put all their power into it: a part with no
// case leg sends exactly its power through its footprint, whatever cells
// the footprint straddles, and the energy balance closes.
func TestPlatePartsConservePower(t *testing.T) {
	sol := solveText(t, `
ambient: {temperature: 25 degC}
plates:
  - id: board
    size: [73 mm, 41 mm]
    cell: 3.3 mm
    board: {thickness: 1.6 mm, copper: [{thickness: 35 um, coverage: 40 %}, {thickness: 35 um, coverage: 40 %}]}
    faces:
      - {face: top, to: ambient, h: 8 W/(m2 K), emissivity: 0.9}
      - {face: bottom, to: ambient, h: 5 W/(m2 K)}
components:
  - {id: a, power: 1.7 W, r_jb: 9 K/W, board: board, at: [11.1 mm, 7.7 mm], footprint: [5.3 mm, 4.1 mm]}
  - {id: b, power: 0.8 W, r_jb: 15 K/W, board: board, at: [60.2 mm, 30.9 mm], footprint: [9.9 mm, 3.7 mm], side: bottom}
  - {id: c, power: 2.3 W, r_jb: 4 K/W, board: board, at: [36.5 mm, 20.5 mm], footprint: [73 mm, 41 mm]}
`)
	p := sol.Plates[0]
	want := map[string]float64{"a footprint": 1.7, "b footprint": 0.8, "c footprint": 2.3}
	for _, j := range p.Joins {
		if w, ok := want[j.Name]; ok {
			if math.Abs(-j.Heat-w) > 1e-12*w {
				t.Errorf("%s: %.15g W into the plate, want %g W", j.Name, -j.Heat, w)
			}
			delete(want, j.Name)
		}
	}
	if len(want) > 0 {
		t.Errorf("joins missing: %v", want)
	}
	if math.Abs(sol.Balance.In-4.8) > 1e-12 || math.Abs(sol.Balance.Imbalance) > 1e-12 {
		t.Errorf("heat in %.15g W, imbalance %g W", sol.Balance.In, sol.Balance.Imbalance)
	}
	// The part on the bottom warms the bottom face's cells more than the
	// top's; its own footprint join is on the bottom face.
	for _, j := range p.Joins {
		if j.Name == "b footprint" && j.Face != "bottom" {
			t.Errorf("b's footprint on the %s face", j.Face)
		}
	}
}

// A plate of very high conductivity is isothermal, and the meshed model
// gives what the lumped one gives: the same parts on one board node with
// the same films (h·A and ε·σ·A·(T⁴ − T∞⁴)).
func TestPlateIsothermalLimitMatchesLumpedBoard(t *testing.T) {
	meshed := solveText(t, `
ambient: {temperature: 30 degC}
plates:
  - id: board
    size: [100 mm, 60 mm]
    cell: 5 mm
    conductivity: 1e6 W/(m K)
    thickness: 10 mm
    faces:
      - {face: top, to: ambient, h: 10 W/(m2 K), emissivity: 0.8}
      - {face: bottom, to: ambient, h: 6 W/(m2 K)}
components:
  - {id: cpu, power: 3 W, r_jb: 5 K/W, board: board, at: [30 mm, 30 mm], footprint: [10 mm, 10 mm]}
  - {id: ram, power: 1 W, r_jb: 12 K/W, board: board, at: [75 mm, 20 mm], footprint: [10 mm, 10 mm]}
`)
	lumped := solveText(t, `
ambient: {temperature: 30 degC}
nodes:
  - {id: board}
components:
  - {id: cpu, power: 3 W, r_jb: 5 K/W, board: board}
  - {id: ram, power: 1 W, r_jb: 12 K/W, board: board}
links:
  - {kind: convection, from: board, coefficient: 16 W/(m2 K), area: 6000 mm2}
  - {kind: radiation, from: board, emissivity: 0.8, area: 6000 mm2}
`)
	// The half cell between each face and the cell's centre adds
	// (t/2)/k = 5e-9 m²K/W to the film, and the plate's in-plane
	// conductance of k·t = 1e4 W/K leaves differences of about 1e-4 K
	// across it.
	sameTemps(t, meshed, lumped, 1e-3, "board", "cpu", "ram")
}

// sameTemps checks that the nodes ids have the same temperature, within
// tol, in a meshed model and in its lumped counterpart.
func sameTemps(t *testing.T, meshed, lumped *network.Solution, tol float64, ids ...string) {
	t.Helper()
	for _, id := range ids {
		if a, b := nodeT(t, meshed, id), nodeT(t, lumped, id); math.Abs(a-b) > tol {
			t.Errorf("%s: meshed %.6f K, lumped %.6f K", id, a, b)
		}
	}
}

// Natural convection on a plate's faces, in the isothermal limit, gives
// what the lumped natural-convection links give for the same surfaces: a
// horizontal lid facing up and down over its whole area (L = A/P), and a
// vertical plate of the same size whose height is its y extent.
func TestPlateNaturalMatchesLumpedLinks(t *testing.T) {
	meshed := solveText(t, `
ambient: {temperature: 25 degC}
plates:
  - id: lid
    size: [200 mm, 150 mm]
    cell: 10 mm
    conductivity: 1e6 W/(m K)
    thickness: 10 mm
    faces:
      - {face: top, to: ambient, natural: facing-up}
      - {face: bottom, to: ambient, natural: facing-down}
    heat:
      - {face: top, region: [50 mm, 50 mm, 90 mm, 80 mm], power: 6 W}
  - id: wall
    size: [200 mm, 150 mm]
    cell: 10 mm
    conductivity: 1e6 W/(m K)
    thickness: 10 mm
    faces:
      - {face: top, to: ambient, natural: vertical}
      - {face: bottom, to: ambient, natural: vertical, height: 150 mm}
    heat:
      - {face: top, region: [50 mm, 50 mm, 90 mm, 80 mm], power: 6 W}
`)
	lumped := solveText(t, `
ambient: {temperature: 25 degC}
nodes:
  - {id: lid, power: 6 W}
  - {id: wall, power: 6 W}
links:
  - {kind: natural, from: lid, orientation: facing-up, length: 200 mm, width: 150 mm}
  - {kind: natural, from: lid, orientation: facing-down, length: 200 mm, width: 150 mm}
  - {kind: natural, from: wall, orientation: vertical, height: 150 mm, width: 200 mm}
  - {kind: natural, from: wall, orientation: vertical, height: 150 mm, width: 200 mm}
`)
	// The plate's in-plane conductance of k·t = 1e4 W/K leaves
	// differences of about 1e-4 K across it.
	sameTemps(t, meshed, lumped, 1e-3, "lid", "wall")
}
