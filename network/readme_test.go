package network_test

import (
	"math"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/network"
)

// The annotated model in README.md must stay valid and solvable.
func TestReadmeModel(t *testing.T) {
	readme := readFile(t, "../README.md")
	start := strings.Index(readme, "```yaml\n")
	if start < 0 {
		t.Fatal("README.md has no yaml block")
	}
	body := readme[start+len("```yaml\n"):]
	body = body[:strings.Index(body, "```")]
	sol := solveModel(t, "README.md", body)
	if len(sol.Nodes) != 5 || len(sol.Links) != 7 {
		t.Errorf("README model: %d nodes, %d links; want 5 and 7", len(sol.Nodes), len(sol.Links))
	}
}

// The anchors example in README.md reads as it says.
func TestReadmeAnchors(t *testing.T) {
	readme := readFile(t, "../README.md")
	start := strings.Index(readme, "```yaml\nshared:")
	if start < 0 {
		t.Fatal("README.md has no anchors example")
	}
	body := readme[start+len("```yaml\n"):]
	body = body[:strings.Index(body, "```")]
	m := parseOK(t, body)
	want := map[string][2]float64{ // length, area
		"adc-paste":  {0.05e-3, 1e-4},
		"dac-paste":  {0.05e-3, 1.5e-4},
		"fpga-paste": {0.1e-3, 6e-4},
	}
	for id, w := range want {
		p := link(t, m, id).Params.(*network.Conduction)
		if math.Abs(p.Length-w[0]) > 1e-15 || math.Abs(p.Area-w[1]) > 1e-15 || p.Material != "thermal-grease" {
			t.Errorf("%s: L %g m, A %g m², %s; want %g, %g, thermal-grease", id, p.Length, p.Area, p.Material, w[0], w[1])
		}
	}
	if m.Nodes[0].Power != 3.2 || m.Nodes[1].Power != 3.2 {
		t.Errorf("powers %g, %g W; want 3.2 from the alias", m.Nodes[0].Power, m.Nodes[1].Power)
	}
	solveModel(t, "README.md", body)
}

// The README's plate snippet is a working part of a model: with the nodes
// it names, it parses, builds and solves.
func TestReadmePlate(t *testing.T) {
	readme := readFile(t, "../README.md")
	start := strings.Index(readme, "```yaml\nplates:")
	if start < 0 {
		t.Fatal("README.md has no plates example")
	}
	body := readme[start+len("```yaml\n"):]
	body = body[:strings.Index(body, "```")]
	model := `ambient: {temperature: 40 degC}
nodes:
  - {id: inside-air, kind: air}
  - {id: housing}
  - {id: isp-lid}
links:
  - {kind: convection, from: inside-air, to: housing, coefficient: 3 W/m2/K, area: 0.08 m2}
  - {kind: convection, from: housing, coefficient: 5 W/m2/K, area: 0.1 m2}
  - {kind: contact, from: isp-lid, to: housing, specific_resistance: 1 K*cm2/W, area: 3 cm2}
` + body
	sol := solveModel(t, "README.md", model)
	if len(sol.Plates) != 1 || sol.Plates[0].NX != 110 || sol.Plates[0].NY != 80 {
		t.Fatalf("README plate: %+v", sol.Plates)
	}
}
