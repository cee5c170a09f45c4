package checkcmd

import (
	"bytes"
	"path/filepath"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
)

// `check --jacobian` passes on every example and reference network, at the
// start and at the solution.
func TestJacobianOnEveryModel(t *testing.T) {
	var files []string
	for _, pat := range []string{"../../../../examples/*.yaml", "../../../../testdata/*.yaml"} {
		m, _ := filepath.Glob(pat)
		files = append(files, m...)
	}
	if len(files) == 0 {
		t.Fatal("no models")
	}
	for _, f := range files {
		var out bytes.Buffer
		o := &Options{IO: &iostreams.IOStreams{Out: &out, ErrOut: &out}, Model: f, Jacobian: true, Tolerance: 1e-5, Worst: 3}
		if err := Run(o); err != nil {
			t.Errorf("%s: %v\n%s", f, err, out.String())
			continue
		}
		if strings.Count(out.String(), ": ok") != 2 {
			t.Errorf("%s: want an ok at the start and at the solution:\n%s", f, out.String())
		}
	}
}

func TestCountWords(t *testing.T) {
	for n, want := range map[int]string{0: "0 components", 1: "1 component", 2: "2 components"} {
		if got := count(n, "component"); got != want {
			t.Errorf("count(%d) = %q, want %q", n, got, want)
		}
	}
	var out bytes.Buffer
	o := &Options{IO: &iostreams.IOStreams{Out: &out, ErrOut: &out}, Model: "../../../../testdata/composite-wall.yaml"}
	if err := Run(o); err != nil {
		t.Fatal(err)
	}
	if strings.Contains(out.String(), " 1 components") || strings.Contains(out.String(), " 1 links") || strings.Contains(out.String(), " 1 nodes") {
		t.Errorf("singular counts in the plural: %s", out.String())
	}
}
