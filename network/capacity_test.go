package network

import (
	"math"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/elements/air"
	"github.com/heatgraph/heatgraph/elements/dual"
	"github.com/heatgraph/heatgraph/solve"
	"github.com/heatgraph/heatgraph/sparse"
)

func capacities(t *testing.T, text string) map[string]float64 {
	t.Helper()
	m, err := Parse("c.yaml", []byte(text))
	if err != nil {
		t.Fatal(err)
	}
	net, err := Build(m)
	if err != nil {
		t.Fatal(err)
	}
	out := map[string]float64{}
	for _, n := range net.Nodes {
		out[n.ID] = n.Capacity
	}
	return out
}

// Heat capacity from each way a model may state it. Check values by hand:
// 25 g × 900 J/(kg K) = 22.5 J/K; 10 g of aluminium-6063 at 900 J/(kg K)
// (the table's value) = 9 J/K; 4 cm³ of copper (8933 kg/m³, 385 J/(kg K),
// Incropera Table A.1) = 13.757 J/K; 2 L of air at 25 °C and 101.325 kPa,
// ρ·V·c_p with the air properties of package air.
func TestCapacityKeys(t *testing.T) {
	c := capacities(t, `
ambient: {temperature: 25 degC}
nodes:
  - {id: given, capacity: 40 J/K}
  - {id: mass-cp, mass: 25 g, specific_heat: 900 J/kg/K}
  - {id: mass-mat, mass: 10 g, material: aluminium-6063}
  - {id: volume, volume: 4 cm3, material: copper}
  - {id: inside, kind: air, volume: 2 L}
  - {id: none}
components:
  - {id: chip, power: 1 W, r_jc: 1 K/W, case: given, capacity: 0.5 J/K}
links:
  - {kind: lumped, from: given, to: ambient, conductance: 1 W/K}
  - {kind: lumped, from: mass-cp, to: ambient, conductance: 1 W/K}
  - {kind: lumped, from: mass-mat, to: ambient, conductance: 1 W/K}
  - {kind: lumped, from: volume, to: ambient, conductance: 1 W/K}
  - {kind: lumped, from: none, to: ambient, conductance: 1 W/K}
  - {kind: convection, from: given, to: inside, coefficient: 5 W/m2/K, area: 0.01 m2}
  - {kind: stream, from: inside, to: ambient, flow: 1 CFM}
  - {kind: stream, from: ambient, to: inside, flow: 1 CFM}
`)
	tAir := dual.C(298.15)
	want := map[string]float64{
		"given": 40, "mass-cp": 22.5, "mass-mat": 9, "volume": 4e-6 * 8933 * 385,
		"inside": 2e-3 * air.Density(tAir, 101325).V * air.SpecificHeat(tAir).V, "none": 0, "chip": 0.5,
	}
	for id, w := range want {
		if math.Abs(c[id]-w) > 1e-12*math.Max(w, 1) {
			t.Errorf("%s: %.12g J/K, want %.12g", id, c[id], w)
		}
	}
}

func TestCapacityProblems(t *testing.T) {
	_, err := Parse("c.yaml", []byte(`
ambient: {temperature: 25 degC}
materials:
  - {name: bare, conductivity: 10 W/m/K}
nodes:
  - {id: a, capacity: 40 J/K, mass: 3 g}
  - {id: b, mass: 3 g}
  - {id: c, volume: 1 cm3, material: bare}
  - {id: d, capacity: -1 J/K}
links:
  - {kind: lumped, from: a, to: ambient, conductance: 1 W/K}
  - {kind: lumped, from: b, to: ambient, conductance: 1 W/K}
  - {kind: lumped, from: c, to: ambient, conductance: 1 W/K}
  - {kind: lumped, from: d, to: ambient, conductance: 1 W/K}
`))
	if err == nil {
		t.Fatal("accepted")
	}
	msg := err.Error()
	for _, want := range []string{
		"c.yaml:6: nodes[a].mass: give only one of capacity, mass",
		"c.yaml:7: nodes[b]: needs one of specific_heat, material",
		`c.yaml:8: nodes[c].material: material "bare" has no density or specific heat`,
		"c.yaml:9: nodes[d].capacity:",
	} {
		if !strings.Contains(msg, want) {
			t.Errorf("missing %q in\n%s", want, msg)
		}
	}
}

// The stored energy of a node is C·T and its derivative C, and the solver's
// pseudo-transient steps see the capacities.
func TestStoredEnergy(t *testing.T) {
	m, err := Parse("c.yaml", []byte(`
ambient: {temperature: 25 degC}
nodes:
  - {id: a, capacity: 40 J/K, power: 5 W}
  - {id: b}
links:
  - {kind: lumped, from: a, to: b, conductance: 1 W/K}
  - {kind: lumped, from: b, to: ambient, conductance: 1 W/K}
`))
	if err != nil {
		t.Fatal(err)
	}
	net, err := Build(m)
	if err != nil {
		t.Fatal(err)
	}
	p := net.Steady()
	x := []float64{310, 300}
	e := make([]float64, 2)
	mm := p.Pattern()
	if err := p.Stored(x, e, mm); err != nil {
		t.Fatal(err)
	}
	if e[0] != 40*310 || e[1] != 0 || mm.At(0, 0) != 40 || mm.At(1, 1) != 0 {
		t.Errorf("stored %v, capacity matrix %v", e, mm.Val)
	}
	c := make([]float64, 2)
	p.Capacity(x, c)
	if c[0] != 40 || c[1] != 0 {
		t.Errorf("capacities %v", c)
	}
	var _ solve.Capacitive = p
	var _ *sparse.Matrix = mm
}
