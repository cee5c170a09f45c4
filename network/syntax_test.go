package network_test

import (
	"errors"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/network"
)

// Syntax errors are reported at the line where the problem is; yaml.v3's
// own line is that of the enclosing construct, counted from 0 for some
// errors and from 1 for others, or missing. Each case names the line a
// reader would point at.
func TestSyntaxErrorLines(t *testing.T) {
	cases := []struct {
		name, text string
		line       int
		says       string
	}{
		{"tab after a plain value", "ambient:\n  temperature: 25 degC\nnodes:\n  - id: board\n\tpower: 3 W\n", 5, "tab"},
		{"tab on line 2", "ambient:\n\ttemperature: 25 degC\n", 2, "tab"},
		{"tab deep in a list", "nodes:\n  - id: a\n    power: 1 W\n  - id: b\n    \tpower: 2 W\n", 5, "tab"},
		{"key indented by one", "ambient:\n  temperature: 25 degC\n nodes:\n  - id: board\n", 3, "mapping that starts on line 1"},
		{"key under a list item", "nodes:\n  - id: board\n    power: 3 W\n   limit: 90 degC\nlinks: []\n", 4, "list that starts on line 2"},
		{"value indented less", "ambient:\n    temperature: 25 degC\n  pressure: 90 kPa\n", 3, "indented"},
		{"unclosed brace on line 1", "ambient: {temperature: 25 degC\nnodes:\n  - id: board\n", 1, "'{' on this line"},
		{"unclosed bracket", "ambient:\n  temperature: 25 degC\nnodes: [{id: a},\n  {id: b}\nlinks: []\n", 4, "'[' on line 3"},
		{"bracket left open to the end", "title: x\nnodes: [a, b\n", 2, "'[' on this line"},
		{"unclosed bracket on line 1, blank lines", "nodes: [a,\n\n  b\nlinks: 1\n", 3, "'[' on line 1"},
		{"unclosed quote", "ambient:\n  temperature: \"25 degC\nnodes: []\n", 2, "quoted value"},
		{"unclosed quote on line 1", "title: \"Box\nambient: {temperature: 25 degC}\n", 1, "quoted value"},
		{"missing colon", "ambient:\n  temperature: 25 degC\nnodes:\n  - id: board\n    power 3 W\n", 5, "colon"},
		{"two colons", "title: x\nambient:\n  temperature: 25 degC: 3\n", 3, "needs quotes"},
		{"stray bracket", "title: x\nnodes: [a, b]]\n", 2, "stray ']'"},
		{"list entry among keys", "ambient:\n  temperature: 25 degC\n  - x\n", 3, "does not continue the mapping that starts on line 2"},
		{"key over-indented under a list item", "title: x\nnodes:\n  - id: a\n     power: 1 W\n", 4, "a key indented under a value"},
		{"value with a colon", "title: x\nnote: a: b\n", 2, "needs quotes"},
		{"top level indented", "\n\n\n   title: x\n  ambient: 1\n", 5, "top level"},
		{"CRLF line ends", "title: x\r\nnodes:\r\n  - id: a\r\n\tpower: 1 W\r\n", 4, "tab"},
		{"undefined alias", "title: x\nambient: {temperature: 25 degC}\nnodes:\n  - {id: a, power: *p}\n", 4, "*p refers to no value"},
		{"alias before its anchor", "title: *t\nnote: &t x\n", 1, "*t refers to no value"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := network.Parse("m.yaml", []byte(c.text))
			var ps network.Problems
			if !errors.As(err, &ps) || len(ps) != 1 {
				t.Fatalf("got %v, want one problem", err)
			}
			if ps[0].Line != c.line || !strings.Contains(ps[0].Message, c.says) {
				t.Errorf("got %v, want line %d saying %q", ps[0], c.line, c.says)
			}
		})
	}
}
