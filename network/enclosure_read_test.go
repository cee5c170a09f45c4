package network_test

import (
	"fmt"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/network"
)

// An enclosure joins only the surfaces that see each other; an
// open enclosure joins each surface to open_to when part of its view is
// left to it.
func TestEnclosureJoins(t *testing.T) {
	m := parseOK(t, `ambient: {temperature: 25 degC}
nodes:
  - {id: lid}
  - {id: can, power: 1 W}
links:
  - {kind: convection, from: lid, coefficient: 6 W/m2/K, area: 0.04 m2}
enclosures:
  - id: pocket
    open_to: lid
    surfaces:
      - {node: can, emissivity: 0.5, area: 0.01 m2}
    view_factors:
      - {from: can, to: can, value: 0.2}
`)
	if _, err := network.Build(m); err != nil {
		t.Errorf("build: %v", err)
	}
	ps := problems(t, `ambient: {temperature: 25 degC}
nodes:
  - {id: lid}
  - {id: can, power: 1 W}
links:
  - {kind: convection, from: lid, coefficient: 6 W/m2/K, area: 0.04 m2}
enclosures:
  - id: pocket
    open_to: lid
    surfaces:
      - {node: can, emissivity: 0.5, area: 0.01 m2}
    view_factors:
      - {from: can, to: can, value: 1}
`)
	if len(ps) != 1 || ps[0].Line != 11 || !strings.Contains(ps[0].Message, `surface "can" sees only itself`) {
		t.Errorf("got %v", ps)
	}
}

// An enclosure's surfaces are bounded before any matrix is sized by them.
func TestTooManySurfaces(t *testing.T) {
	var b strings.Builder
	b.WriteString("ambient: {temperature: 25 degC}\nnodes: [{id: a, power: 1 W}]\nlinks: [{kind: convection, from: a, coefficient: 5 W/m2/K, area: 1 cm2}]\nenclosures:\n  - id: big\n    open_to: ambient\n    surfaces:\n")
	for i := 0; i < 501; i++ {
		fmt.Fprintf(&b, "      - {id: s%d, node: a, emissivity: 0.5, area: 1 cm2}\n", i)
	}
	b.WriteString("    view_factors: []\n")
	ps := problems(t, b.String())
	if len(ps) != 1 || ps[0].Line != 8 || !strings.Contains(ps[0].Message, "501 surfaces; an enclosure takes 2 to 500") {
		t.Errorf("got %v", ps)
	}
}
