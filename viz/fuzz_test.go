package viz_test

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"io"
	"io/fs"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/solve"
	"github.com/heatgraph/heatgraph/viz"
)

// FuzzReports runs the whole chain a model takes through the command — read,
// check, assemble, solve, present — and every report writer but the image
// renderers: the text report in each order, the JSON document, the CSV
// table and the DOT diagram in each colouring. network.FuzzParse covers the
// reader on its own; this target covers what the writers make of whatever
// the reader accepts.
//
// Invariants: nothing panics; a writer writing to memory returns no error;
// the JSON document is valid JSON whose numbers are all finite; the CSV
// reads back with one row per node, link, boundary and plate join; a
// meshed plate's heat map and cells are written; and a converged
// solution's energy balance closes within Balance.MaxImbalance.
func FuzzReports(f *testing.F) {
	for _, path := range seedModels(f) {
		data, err := os.ReadFile(path)
		if err != nil {
			f.Fatal(err)
		}
		f.Add(data)
	}
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
			return
		}
		p := net.Steady()
		// Few iterations keep the fuzzer fast; a model that needs more
		// still exercises the report of a failed solve.
		res := solve.Newton(p, p.InitialGuess(), solve.Settings{MaxIterations: 40})
		run := viz.Run{
			Converged:  res.Reason.Converged(),
			Reason:     res.Reason.String(),
			Iterations: res.Iterations,
			Residual:   res.Residual,
			Scaled:     res.Scaled,
		}
		if !run.Converged {
			// The command writes a JSON document without results.
			checkJSON(t, viz.NewReport(m, nil, run), nil)
			return
		}
		sol := net.Solution(res.X)

		if b := sol.Balance; !(math.Abs(b.Imbalance) <= b.MaxImbalance()) {
			t.Fatalf("energy balance: in %g W, imbalance %g W, above the allowed %g W", b.In, b.Imbalance, b.MaxImbalance())
		}
		for _, n := range sol.Nodes {
			if !(n.Temperature > 0) || math.IsInf(n.Temperature, 0) {
				t.Fatalf("node %q at %g K in a converged solution", n.ID, n.Temperature)
			}
		}

		for _, order := range viz.Orders {
			var buf bytes.Buffer
			if err := viz.WriteText(&buf, sol, run, order); err != nil {
				t.Fatalf("WriteText(%s): %v", order, err)
			}
			if !strings.Contains(buf.String(), viz.Verdict(sol)) {
				t.Fatalf("WriteText(%s) lacks the verdict %q", order, viz.Verdict(sol))
			}
		}

		var buf bytes.Buffer
		if err := viz.WriteCSV(&buf, sol); err != nil {
			t.Fatalf("WriteCSV: %v", err)
		}
		rows, err := csv.NewReader(&buf).ReadAll()
		if err != nil {
			t.Fatalf("WriteCSV wrote unreadable CSV: %v", err)
		}
		want := 1 + len(sol.Nodes) + len(sol.Links) + len(sol.Balance.Out)
		for _, p := range sol.Plates {
			want += len(p.Joins)
		}
		if len(rows) != want {
			t.Fatalf("WriteCSV wrote %d rows, want %d", len(rows), want)
		}

		for _, c := range viz.Colourings {
			dot, err := viz.DOT(sol, c)
			if err != nil {
				t.Fatalf("DOT(%s): %v", c, err)
			}
			if !strings.HasPrefix(strings.TrimSpace(dot), "digraph") {
				t.Fatalf("DOT(%s) is not a digraph:\n%s", c, dot)
			}
		}

		checkJSON(t, viz.NewReport(m, sol, run), sol)

		// Meshed plates: their heat maps and cells.
		for i := range sol.Plates {
			var svg bytes.Buffer
			if err := viz.WritePlateSVG(&svg, &sol.Plates[i], viz.HeatMapOptions{}); err != nil {
				t.Fatalf("WritePlateSVG(%s): %v", sol.Plates[i].ID, err)
			}
			if nonFiniteAttr.MatchString(svg.String()) {
				t.Fatalf("WritePlateSVG(%s) wrote a number that is not finite", sol.Plates[i].ID)
			}
		}
		buf.Reset()
		if err := viz.WritePlateCells(&buf, sol, viz.CellsJSON); err != nil {
			t.Fatalf("WritePlateCells: %v", err)
		}
		if !json.Valid(buf.Bytes()) {
			t.Fatalf("WritePlateCells wrote invalid JSON")
		}
	})
}

// nonFiniteAttr finds a number that is not finite written into an SVG
// attribute or path.
var nonFiniteAttr = regexp.MustCompile(`="[-+]?(NaN|Inf)"|[MhvH][-+]?(NaN|Inf)|[0-9] [-+]?(NaN|Inf)h`)

// checkJSON writes r and checks that it is valid JSON with finite numbers
// (a non-finite value is never written as a number; the input that once
// made WriteJSON fail on an infinite friction factor is kept in
// testdata/fuzz/FuzzReports).
func checkJSON(t *testing.T, r *viz.Report, sol *network.Solution) {
	t.Helper()
	var buf bytes.Buffer
	if err := viz.WriteJSON(&buf, r); err != nil {
		t.Fatalf("WriteJSON: %v", err)
	}
	if !json.Valid(buf.Bytes()) {
		t.Fatalf("WriteJSON wrote invalid JSON:\n%s", buf.Bytes())
	}
	dec := json.NewDecoder(&buf)
	dec.UseNumber()
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("reading the JSON back: %v", err)
		}
		if n, ok := tok.(json.Number); ok {
			if v, err := strconv.ParseFloat(string(n), 64); err != nil || math.IsInf(v, 0) || math.IsNaN(v) {
				t.Fatalf("JSON number %s is not a finite float64", n)
			}
		}
	}
}

// seedModels lists every example and every model under testdata, invalid
// ones included: the reader's refusals are part of the chain.
func seedModels(tb testing.TB) []string {
	tb.Helper()
	files, err := filepath.Glob("../examples/*.yaml")
	if err != nil {
		tb.Fatal(err)
	}
	err = filepath.WalkDir("../testdata", func(path string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		if !d.IsDir() && strings.HasSuffix(path, ".yaml") {
			files = append(files, path)
		}
		return nil
	})
	if err != nil {
		tb.Fatal(err)
	}
	if len(files) < 5 {
		tb.Fatalf("only %d seed models found", len(files))
	}
	return files
}
