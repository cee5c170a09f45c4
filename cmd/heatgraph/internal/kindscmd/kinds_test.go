package kindscmd

import (
	"bytes"
	"strings"
	"testing"
	"unicode/utf8"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/heatgraph/heatgraph/network"
)

// Every kind's description is complete: every key with its unit and
// whether it is needed, an example and sources; and every line fits the
// width asked for (the example excepted, which is YAML).
func TestDescribeEveryKind(t *testing.T) {
	for _, name := range network.LinkKindNames() {
		var out bytes.Buffer
		o := &Options{IO: &iostreams.IOStreams{Out: &out}, Kind: name, Width: 72}
		if err := Run(o); err != nil {
			t.Fatal(err)
		}
		text := out.String()
		doc, _ := network.LinkKind(name)
		for _, k := range doc.Keys {
			if !strings.Contains(text, k.Name+": ") {
				t.Errorf("%s: key %s not described", name, k.Name)
			}
		}
		for _, section := range []string{"ends\n", "keys (", "example\n", "sources\n"} {
			if !strings.Contains(text, section) {
				t.Errorf("%s: no %q section", name, section)
			}
		}
		inExample := false
		for _, line := range strings.Split(text, "\n") {
			switch line {
			case "example":
				inExample = true
			case "sources":
				inExample = false
			}
			if !inExample && utf8.RuneCountInString(line) > 72 && strings.Contains(line, " ") {
				t.Errorf("%s: line longer than 72 columns: %q", name, line)
			}
		}
	}
}

func TestDescribeChannel(t *testing.T) {
	var out bytes.Buffer
	if err := Run(&Options{IO: &iostreams.IOStreams{Out: &out}, Kind: "channel", Width: 80}); err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"fin_count: count", "length: length (m); required", "Shah & London", "turbulent: word; optional, default gnielinski"} {
		if !strings.Contains(out.String(), want) {
			t.Errorf("missing %q in\n%s", want, out.String())
		}
	}
}

func TestUnknownKind(t *testing.T) {
	err := Run(&Options{IO: &iostreams.IOStreams{Out: &bytes.Buffer{}}, Kind: "chanel"})
	if err == nil || !strings.Contains(err.Error(), "channel") {
		t.Errorf("err = %v, want the valid kinds listed", err)
	}
}
