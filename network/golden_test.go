package network_test

import (
	"errors"
	"flag"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/solve"
)

var update = flag.Bool("update", false, "rewrite the golden files of invalid models")

// Every invalid model in testdata/invalid gets exactly the messages in its
// .golden file: all problems in one pass, each as file:line: field: message.
func TestInvalidModelsGolden(t *testing.T) {
	files, err := filepath.Glob("../testdata/invalid/*.yaml")
	if err != nil || len(files) == 0 {
		t.Fatalf("no invalid models found: %v", err)
	}
	for _, path := range files {
		name := filepath.Base(path)
		t.Run(name, func(t *testing.T) {
			data, err := os.ReadFile(path)
			if err != nil {
				t.Fatal(err)
			}
			_, err = network.Parse(name, data)
			var ps network.Problems
			if !errors.As(err, &ps) {
				t.Fatalf("got %v, want a list of problems", err)
			}
			for _, p := range ps {
				if p.File != name || p.Message == "" {
					t.Errorf("malformed problem %+v", p)
				}
			}
			got := err.Error() + "\n"
			golden := strings.TrimSuffix(path, ".yaml") + ".golden"
			if *update {
				if err := os.WriteFile(golden, []byte(got), 0o644); err != nil {
					t.Fatal(err)
				}
				return
			}
			want, err := os.ReadFile(golden)
			if err != nil {
				t.Fatalf("%v (run go test ./network -update to create it)", err)
			}
			if got != string(want) {
				t.Errorf("messages differ from %s\n--- got\n%s--- want\n%s", golden, got, want)
			}
		})
	}
}

func TestMissingFile(t *testing.T) {
	_, err := network.ReadFile("../testdata/no-such-model.yaml")
	if err == nil || !strings.Contains(err.Error(), "no-such-model.yaml: no such file") {
		t.Errorf("got %v", err)
	}
}

// Parse must never panic, whatever it is given.
func FuzzParse(f *testing.F) {
	for _, path := range append(globOrNil("../testdata/invalid/*.yaml"), globOrNil("../examples/*.yaml")...) {
		if data, err := os.ReadFile(path); err == nil {
			f.Add(data)
		}
	}
	f.Add([]byte("ambient: {temperature: 25 degC}\nnodes: [{id: a, power: 1 W}]\nlinks: [{kind: lumped, from: a, to: ambient, resistance: 1 K/W}]\n"))
	f.Fuzz(func(t *testing.T, data []byte) {
		m, err := network.Parse("fuzz.yaml", data)
		if err != nil {
			return
		}
		if m.Cells() > 3000 {
			return // a fine mesh is slow and large, not a new path
		}
		net, err := network.Build(m)
		if err != nil {
			var ps network.Problems
			if !errors.As(err, &ps) {
				t.Fatalf("build error is not a Problems list: %v", err)
			}
			return
		}
		// Whatever a valid model holds, solving and reporting must not
		// panic.
		p := net.Steady()
		if r := solve.Newton(p, p.InitialGuess(), solve.Settings{MaxIterations: 30}); r.Reason.Converged() {
			net.Solution(r.X)
		}
	})
}

func globOrNil(pattern string) []string {
	m, _ := filepath.Glob(pattern)
	return m
}
