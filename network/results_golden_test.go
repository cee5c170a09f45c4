package network_test

import (
	"encoding/json"
	"flag"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/solve"
)

var updateResults = flag.Bool("update-results", false, "rewrite the golden results of every example (only when a change of results is intended and explained)")

// goldenResult is what a solved model must keep through any change of the
// solver or the element contract: every node temperature, every link's heat
// and every numeric detail a link reports.
type goldenResult struct {
	Nodes   map[string]float64            `json:"nodes_K"`
	Links   map[string]float64            `json:"links_W"`
	Details map[string]map[string]float64 `json:"details"`
}

// solvedModels lists every runnable example and reference network.
func solvedModels(t *testing.T) []string {
	t.Helper()
	var files []string
	for _, pat := range []string{"../examples/*.yaml", "../testdata/*.yaml"} {
		m, err := filepath.Glob(pat)
		if err != nil {
			t.Fatal(err)
		}
		files = append(files, m...)
	}
	if len(files) == 0 {
		t.Fatal("no models found")
	}
	return files
}

func goldenOf(t *testing.T, path string) goldenResult {
	t.Helper()
	net, err := network.Load(path)
	if err != nil {
		t.Fatal(err)
	}
	p := net.Steady()
	res := solve.Newton(p, p.InitialGuess(), solve.Settings{})
	if !res.Reason.Converged() {
		t.Fatalf("%s: %v", path, res.Reason)
	}
	sol := net.Solution(res.X)
	g := goldenResult{Nodes: map[string]float64{}, Links: map[string]float64{}, Details: map[string]map[string]float64{}}
	for _, n := range sol.Nodes {
		g.Nodes[n.ID] = n.Temperature
	}
	for _, l := range sol.Links {
		g.Links[l.ID] = l.Heat
		for _, d := range l.Details {
			if d.Text != "" || math.IsInf(d.Value, 0) || math.IsNaN(d.Value) {
				continue
			}
			if g.Details[l.ID] == nil {
				g.Details[l.ID] = map[string]float64{}
			}
			g.Details[l.ID][d.Name] = d.Value
		}
	}
	return g
}

// The results of every example and reference network agree with the
// golden results recorded before the element contract was redesigned, to
// 1e-9 relative (heat flows relative to the largest heat flow of the model,
// which is what a converged solve can promise for a small flow).
func TestGoldenResults(t *testing.T) {
	for _, path := range solvedModels(t) {
		name := strings.TrimSuffix(filepath.Base(path), ".yaml")
		t.Run(name, func(t *testing.T) {
			got := goldenOf(t, path)
			file := filepath.Join("..", "testdata", "golden", name+".json")
			if *updateResults {
				data, _ := json.MarshalIndent(got, "", "  ")
				if err := os.WriteFile(file, append(data, '\n'), 0o644); err != nil {
					t.Fatal(err)
				}
				return
			}
			data, err := os.ReadFile(file)
			if err != nil {
				t.Fatalf("%v (run go test ./network -run TestGoldenResults -update-results to create it)", err)
			}
			var want goldenResult
			if err := json.Unmarshal(data, &want); err != nil {
				t.Fatal(err)
			}
			const rel = 1e-9
			for id, w := range want.Nodes {
				g, ok := got.Nodes[id]
				if !ok || math.Abs(g-w) > rel*math.Abs(w) {
					t.Errorf("node %s: %.12g K, want %.12g K", id, g, w)
				}
			}
			qMax := 0.0
			for _, w := range want.Links {
				qMax = math.Max(qMax, math.Abs(w))
			}
			for id, w := range want.Links {
				g, ok := got.Links[id]
				if !ok || math.Abs(g-w) > rel*qMax {
					t.Errorf("link %s: %.12g W, want %.12g W", id, g, w)
				}
			}
			for id, ds := range want.Details {
				for name, w := range ds {
					g, ok := got.Details[id][name]
					if !ok || math.Abs(g-w) > 1e-7*math.Max(math.Abs(w), 1e-12) {
						t.Errorf("link %s detail %s: %.12g, want %.12g", id, name, g, w)
					}
				}
			}
			if len(got.Nodes) != len(want.Nodes) || len(got.Links) != len(want.Links) {
				t.Errorf("%d nodes and %d links, want %d and %d", len(got.Nodes), len(got.Links), len(want.Nodes), len(want.Links))
			}
		})
	}
}
