package network_test

import (
	"fmt"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/network"
)

func link(t *testing.T, m *network.Model, id string) network.LinkSpec {
	t.Helper()
	for _, l := range m.Links {
		if l.ID == id {
			return l
		}
	}
	t.Fatalf("no link %q", id)
	return network.LinkSpec{}
}

// Anchors, aliases and merge keys share values: explicit keys override
// merged ones, and of several merged mappings the first to give a key wins
// (YAML merge key type, yaml.org/type/merge).
func TestAnchorsAndMergeKeys(t *testing.T) {
	m := parseOK(t, `
shared:
  watts: &watts 2.5 W
  pad: &pad {kind: conduction, material: gap-pad, thickness: 1 mm, area: 2 cm2}
  thin: &thin {thickness: 0.5 mm}
  wide: &wide {area: 4 cm2, thickness: 2 mm}
ambient: {temperature: 25 degC}
nodes:
  - {id: board, power: *watts}
  - &lid {id: lid}
links:
  - {<<: *pad, id: a, from: board, to: lid}
  - {<<: *pad, id: b, from: board, to: lid, thickness: 0.25 mm}
  - {<<: [*thin, *wide, *pad], id: c, from: board, to: lid}
  - {kind: convection, from: lid, coefficient: 5 W/m2/K, area: 1 cm2}
`)
	if m.Nodes[0].Power != 2.5 {
		t.Errorf("power from an alias: got %g W, want 2.5", m.Nodes[0].Power)
	}
	cases := []struct {
		id           string
		length, area float64
	}{
		{"a", 1e-3, 2e-4},    // all from &pad
		{"b", 0.25e-3, 2e-4}, // thickness given beside the merge
		{"c", 0.5e-3, 4e-4},  // thickness from &thin (first), area from &wide (before &pad)
	}
	for _, c := range cases {
		p, ok := link(t, m, c.id).Params.(*network.Conduction)
		if !ok {
			t.Fatalf("link %s: params %T", c.id, link(t, m, c.id).Params)
		}
		if p.Length != c.length || p.Area != c.area || p.Material != "gap-pad" {
			t.Errorf("link %s: L %g m, A %g m², material %q; want %g, %g, gap-pad", c.id, p.Length, p.Area, p.Material, c.length, c.area)
		}
	}
}

// An explicit key overrides a merged one even when both are written, and
// the values of a merged key keep the line where they are written.
func TestMergedLines(t *testing.T) {
	ps := problems(t, `shared:
  pad: &pad {kind: conduction, material: gap-pad, thickness: 1 mmm, area: 2 cm2}
ambient: {temperature: 25 degC}
nodes:
  - {id: board, power: 1 W}
links:
  - {<<: *pad, from: board, to: ambient}
  - {<<: *pad, from: ambient, to: board, thickness: 1 mm}
`)
	if len(ps) != 1 || ps[0].Line != 2 || ps[0].Field != "links[0].thickness" {
		t.Errorf("got %v, want one problem on line 2, in links[0].thickness", ps)
	}
}

// A mapping that merges itself, or merges the same mapping twice, must not
// make the reader loop.
func TestMergeCycles(t *testing.T) {
	m := parseOK(t, `shared:
  a: &a {<<: *a, area: 1 cm2}
ambient: {temperature: 25 degC}
nodes:
  - {id: board, power: 1 W}
links:
  - {<<: [*a, *a], kind: convection, from: board, coefficient: 5 W/m2/K}
`)
	if p := m.Links[0].Params.(*network.Convection); p.Area != 1e-4 {
		t.Errorf("area %g m², want 1e-4", p.Area)
	}
}

// Aliases of aliases make a small file name a value millions of times;
// the reader stops, says why, and does so quickly.
func TestAliasExpansionIsBounded(t *testing.T) {
	var b strings.Builder
	b.WriteString("shared:\n  k: &k {")
	for i := 0; i < 1000; i++ {
		fmt.Fprintf(&b, "k%d: 1, ", i)
	}
	b.WriteString("}\n  l: &l [")
	for i := 0; i < 1000; i++ {
		b.WriteString("*k, ")
	}
	b.WriteString("]\nambient: {temperature: 25 degC}\nnodes: [{id: a, power: 1 W}]\nlinks: *l\n")
	ps := problems(t, b.String())
	if !strings.Contains(ps.Error(), "aliases (*name) and merge keys (<<) repeat values") {
		t.Errorf("got %d problems starting %v", len(ps), ps[0])
	}
	if len(ps) > 201 {
		t.Errorf("%d problems: the list should stop at 200", len(ps))
	}
}

// A file holds one YAML document; a second one is refused at its line.
func TestSecondDocument(t *testing.T) {
	model := "ambient: {temperature: 25 degC}\nnodes: [{id: a, power: 1 W}]\nlinks: [{kind: convection, from: a, coefficient: 5 W/m2/K, area: 1 cm2}]\n"
	parseOK(t, "---\n"+model)
	parseOK(t, model+"...\n")
	for _, c := range []struct {
		tail string
		line int
	}{
		{"---\nnodes: [{id: b}]\n", 4},
		{"---\n", 4},
	} {
		ps := problems(t, model+c.tail)
		if len(ps) != 1 || ps[0].Line != c.line || !strings.Contains(ps[0].Message, "second YAML document") {
			t.Errorf("%q: got %v, want a second document on line %d", c.tail, ps, c.line)
		}
	}
}

// Quoted values are cut to about 60 characters in every message, with the
// length of the whole.
func TestLongValuesAreShortened(t *testing.T) {
	long := strings.Repeat("7", 200000)
	ps := problems(t, "ambient: {temperature: "+long+" kelvinz}\nnodes: [{id: "+long+", power: "+long+"}]\n")
	if len(ps) == 0 {
		t.Fatal("no problems")
	}
	for _, p := range ps {
		if s := p.String(); len(s) > 400 {
			t.Errorf("message of %d bytes: %.300s", len(s), s)
		}
	}
	if !strings.Contains(ps.Error(), `…" (200000 characters)`) {
		t.Errorf("no shortened value with its length in:\n%s", ps.Error())
	}
}

// A NUL byte or another control character is reported at its line; a
// byte order mark at the start is allowed.
func TestControlCharacters(t *testing.T) {
	parseOK(t, "\uFEFFambient: {temperature: 25 degC}\nnodes: [{id: a, power: 1 W}]\nlinks: [{kind: convection, from: a, coefficient: 5 W/m2/K, area: 1 cm2}]\n")
	for _, c := range []struct {
		text string
		line int
		says string
	}{
		{"ambient:\n  temperature: 25 degC\n\x00", 3, "NUL"},
		{"title: a\x01b\n", 1, "U+0001"},
		{"title: x\n\ntitle2: \xff\n", 3, "0xFF"},
		{"\xff\xfet\x00i\x00", 1, "UTF-16"},
		{"\uFEFFtitle: x\nnote: a\uFEFFb\n", 2, "byte order mark"},
	} {
		ps := problems(t, c.text)
		if len(ps) != 1 || ps[0].Line != c.line || !strings.Contains(ps[0].Message, c.says) {
			t.Errorf("%q: got %v, want line %d saying %s", c.text, ps, c.line, c.says)
		}
	}
}
