package network

import (
	"fmt"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/elements"
)

// assembleText builds a model from its text.
func assembleText(t *testing.T, text string) *Network {
	t.Helper()
	m, err := Parse("assembly.yaml", []byte(text))
	if err != nil {
		t.Fatal(err)
	}
	net, err := Build(m)
	if err != nil {
		t.Fatal(err)
	}
	return net
}

// evalAt evaluates net at x: balances and Jacobian values.
func evalAt(t *testing.T, net *Network, x []float64) ([]float64, []float64) {
	t.Helper()
	p := net.Steady()
	f := make([]float64, p.Size())
	jac := p.Pattern()
	if err := p.Evaluate(x, f, jac, nil); err != nil {
		t.Fatal(err)
	}
	return f, jac.Val
}

// A network with scaled coefficients keeps the positions of the original
// and gives what assembling it afresh gives, bit for bit.
func TestWithCoefficientsReusesPositions(t *testing.T) {
	var s strings.Builder
	s.WriteString("ambient: {temperature: 30 degC}\nnodes:\n")
	for i := range 3 {
		fmt.Fprintf(&s, "  - {id: sink%d, power: 5 W}\n  - {id: air%d, kind: air}\n", i, i)
	}
	s.WriteString("links:\n")
	for i := range 3 {
		inlet := "ambient"
		if i > 0 {
			inlet = fmt.Sprintf("air%d", i-1)
		}
		fmt.Fprintf(&s, "  - {id: fins%d, kind: channel, from: sink%d, inlet: %s, to: air%d, flow: 40 CFM, fin_count: 20, fin_thickness: 1 mm, fin_height: 25 mm, base_width: 80 mm, length: 40 mm, material: aluminium}\n", i, i, inlet, i)
	}
	s.WriteString("  - {id: out, kind: stream, from: air2, to: ambient, flow: 40 CFM}\n")
	net := assembleText(t, s.String())
	scale := map[string]float64{"fins0": 1.3, "fins2": 0.7}
	c := net.WithCoefficients(scale)
	if c.asm == net.asm || &c.asm.slots[0] != &net.asm.slots[0] {
		t.Fatal("the scaled network should share the original's positions")
	}
	fresh := *c
	fresh.asm = fresh.assemble()
	x := fresh.Steady().InitialGuess()
	for i := range x {
		x[i] += float64(i%5) * 3
	}
	fc, jc := evalAt(t, c, x)
	ff, jf := evalAt(t, &fresh, x)
	for i := range fc {
		if fc[i] != ff[i] {
			t.Errorf("balance %d: %g with shared positions, %g assembled afresh", i, fc[i], ff[i])
		}
	}
	for k := range jc {
		if jc[k] != jf[k] {
			t.Errorf("Jacobian value %d: %g with shared positions, %g assembled afresh", k, jc[k], jf[k])
		}
	}
	f0, _ := evalAt(t, net, x)
	differs := false
	for i := range f0 {
		differs = differs || f0[i] != fc[i]
	}
	if !differs {
		t.Error("scaling the coefficients changed no balance")
	}
}

// listless hides a plate's EachEntry, so that the assembly reads its
// entries from Entries.
type listless struct{ *elements.Plate }

func (l listless) EachEntry() {}

// The assembly gives the same positions whether a patterned element lists
// its entries or hands them over stored.
func TestAssemblyEntriesListedOrStored(t *testing.T) {
	net := assembleText(t, `ambient: {temperature: 25 degC}
nodes:
  - {id: air, kind: fixed, temperature: 40 degC}
  - {id: sink}
plates:
  - id: board
    size: [40 mm, 30 mm]
    cells: [8, 6]
    board: {thickness: 1.6 mm, copper: [{thickness: 35 um, coverage: 50 %}]}
    faces:
      - {face: top, to: air, h: 10 W/m2/K, emissivity: 0.9}
      - {face: bottom, region: [5 mm, 5 mm, 20 mm, 20 mm], to: sink, contact: 1 K*cm2/W}
links:
  - {id: sink-air, kind: convection, from: sink, to: ambient, coefficient: 20 W/m2/K, area: 0.01 m2}
components:
  - {id: cpu, power: 3 W, r_jb: 4 K/W, board: board, at: [20 mm, 15 mm], footprint: [6 mm, 6 mm]}
`)
	stored := *net
	stored.Links = append([]Link(nil), net.Links...)
	found := false
	for i, l := range stored.Links {
		if p, ok := l.Element.(*elements.Plate); ok {
			stored.Links[i].Element = listless{p}
			found = true
		}
	}
	if !found {
		t.Fatal("no plate")
	}
	for _, l := range stored.Links {
		if _, ok := l.Element.(elements.EntryLister); ok {
			t.Fatal("listless still lists")
		}
	}
	stored.asm = stored.assemble()
	if len(stored.asm.slots) != len(net.asm.slots) {
		t.Fatalf("%d slots stored, %d listed", len(stored.asm.slots), len(net.asm.slots))
	}
	for k := range net.asm.slots {
		if stored.asm.slots[k] != net.asm.slots[k] {
			t.Fatalf("slot %d: %d stored, %d listed", k, stored.asm.slots[k], net.asm.slots[k])
		}
	}
}

// Runs of unknowns cover every unknown once, each run's variables
// consecutive.
func TestUnknownRuns(t *testing.T) {
	unknown := []int{1, 2, 3, 5, 6, 9, 10, 11, 12, 4}
	runs := unknownRuns(unknown)
	want := []run{{0, 1, 3}, {3, 5, 2}, {5, 9, 4}, {9, 4, 1}}
	if len(runs) != len(want) {
		t.Fatalf("runs %v, want %v", runs, want)
	}
	for i := range want {
		if runs[i] != want[i] {
			t.Errorf("run %d: %v, want %v", i, runs[i], want[i])
		}
	}
	a := &assembly{runs: runs}
	vars := make([]float64, 13)
	for i := range vars {
		vars[i] = float64(10 * i)
	}
	dst := make([]float64, len(unknown))
	a.toUnknowns(dst, vars)
	for u, v := range unknown {
		if dst[u] != vars[v] {
			t.Errorf("unknown %d: %g, want %g", u, dst[u], vars[v])
		}
	}
}
