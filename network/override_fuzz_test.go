package network

import (
	"os"
	"strings"
	"testing"
)

// FuzzOverride: any PATH=VALUE on an example model is applied or refused
// with messages, never a panic, and every message names an override or a
// line of the file.
func FuzzOverride(f *testing.F) {
	data, err := os.ReadFile("../examples/outdoor-controller.yaml")
	if err != nil {
		f.Fatal(err)
	}
	for _, s := range []string{"ambient.temperature=45degC", "nodes.board.power=7 W", "links.lid-glow.emissivity=1.1",
		"components.cpu.case=lid", "nodes..power=1", "links.=x", "ambient=3", "materials.pad-5w.name=x", "required_margin.x=1",
		"links.cpu-pad-bulk.kind=radiation", "nodes.pole.kind=solid", "title=[a"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		o, err := ParseOverride(s)
		if err != nil {
			return
		}
		_, err = ParseWith("box.yaml", data, []Override{o})
		if err == nil {
			return
		}
		ps, ok := err.(Problems)
		if !ok {
			t.Fatalf("%q: not a list of problems: %v", s, err)
		}
		for _, p := range ps {
			if p.Line < 0 || !(p.File == "box.yaml" || strings.HasPrefix(p.File, "--set ")) {
				t.Fatalf("%q: problem not placed: %+v", s, p)
			}
		}
	})
}
