package viz

import (
	"bytes"
	"context"
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/network"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// A board that heats a box's air and a chassis: solved as one node, then
// given the kind and the summary a meshed plate has, as the network will
// report it (the network's meshing is not in this package's hands).
const plateModel = `
title: board in a box
ambient: {temperature: 25 degC}
required_margin: 5 K
nodes:
  - {id: main-board, power: 14 W, limit: 105 degC}
  - {id: box-air}
  - {id: chassis}
links:
  - {id: top-air, kind: lumped, from: main-board, to: box-air, resistance: 2 K/W}
  - {id: clamp, kind: lumped, from: main-board, to: chassis, resistance: 3 K/W}
  - {id: vents, kind: lumped, from: box-air, to: ambient, resistance: 1.5 K/W}
  - {id: skin, kind: lumped, from: chassis, to: ambient, resistance: 2.5 K/W}
`

// plateSolution solves plateModel and makes main-board a meshed plate
// whose summary is p.
func plateSolution(t testing.TB, p network.PlateResult) (*network.Solution, Run) {
	t.Helper()
	sol, run := solveText(t, "board.yaml", plateModel)
	p.ID = "main-board"
	for i := range sol.Nodes {
		n := &sol.Nodes[i]
		if n.ID == p.ID {
			n.Kind = plateKind
			n.Temperature, n.Limit, n.Margin, n.Status = p.Hottest, p.Limit, p.Margin, p.Status
		}
	}
	sol.Plates = append(sol.Plates, p)
	return sol, run
}

func TestTextPlates(t *testing.T) {
	p := testBoard(100, 80, 50, 40, 2)
	p.Limit = 100 + kelvin
	p.Margin, p.Status = p.Limit-p.Hottest, network.Over
	sol, run := plateSolution(t, p)
	var buf bytes.Buffer
	require.NoError(t, WriteText(&buf, sol, run, ByFile))
	out := buf.String()
	for _, want := range []string{
		"plates (each is one node above, at its hottest cell)",
		"  main-board: 100.0 × 80.0 × 1.60 mm, 50 × 40 × 2 cells",
		fmt.Sprintf("    hottest     %.2f °C at (65.0, 39.0, 1.20) mm", celsius(p.Hottest)),
		fmt.Sprintf("    mean         %.2f °C", celsius(p.Mean)),
		fmt.Sprintf("    coolest      %.2f °C", celsius(p.Coolest)),
		fmt.Sprintf("    limit       100.00 °C, margin %+.2f K  OVER", p.Margin),
		"    parts on it: cpu 11 W, vreg 2.5 W, heater pad 0.5 W (bottom)",
		"    join                              heat [W]  to node (positive heat leaves the plate)",
		"    top to box-air (convection)          5.620  box-air",
		"    bottom to box-air (convection)       3.910  box-air",
		"    x_min to chassis (contact)           4.470  chassis",
		"    all joins                           14.000\n",
		"main-board  plate",
	} {
		assert.Contains(t, out, want)
	}
	// One layer: the position has no height.
	q := testBoard(100, 80, 50, 40, 1)
	q.HasLimit = false
	sol, run = plateSolution(t, q)
	buf.Reset()
	require.NoError(t, WriteText(&buf, sol, run, ByFile))
	assert.Contains(t, buf.String(), "at (65.0, 39.0) mm\n")
	assert.Contains(t, buf.String(), "    limit            - (none set)")
}

// A summary number that is not finite is written "not finite" with a
// warning, never as NaN; a cell that is not finite is counted.
func TestPlatesNotFinite(t *testing.T) {
	p := testBoard(100, 80, 10, 8, 1)
	p.Mean = math.NaN()
	p.Joins[0].Heat = math.Inf(1)
	p.T[3] = math.NaN()
	sol, run := plateSolution(t, p)
	var text, js bytes.Buffer
	require.NoError(t, WriteText(&text, sol, run, ByFile))
	require.NoError(t, WriteJSON(&js, NewReport(sol.Net.Model, sol, run)))
	for _, out := range []string{text.String(), js.String()} {
		assert.NotRegexp(t, `[^(]NaN|Inf`, out, "only the warning's words name NaN")
		assert.Contains(t, out, "plate main-board: mean temperature is undefined (NaN), not a finite number")
		assert.Contains(t, out, "plate main-board: 1 cell without a finite temperature")
	}
	assert.Contains(t, js.String(), `"mean_degC": null`)
	assert.Contains(t, text.String(), "    mean     not finite °C\n")
	assert.Contains(t, text.String(), "    top to box-air (convection)     not finite  box-air\n")
	var cells bytes.Buffer
	require.NoError(t, WritePlateCells(&cells, sol, CellsJSON))
	assert.Contains(t, cells.String(), ",null,")
	var doc any
	require.NoError(t, json.Unmarshal(cells.Bytes(), &doc))
}

// The JSON report has the plates' summaries and joins, not their cells,
// and follows the schema.
func TestJSONPlates(t *testing.T) {
	p := testBoard(100, 80, 50, 40, 2)
	sol, run := plateSolution(t, p)
	var buf bytes.Buffer
	require.NoError(t, WriteJSON(&buf, NewReport(sol.Net.Model, sol, run)))
	assert.Less(t, buf.Len(), 20000, "no cells in the report")
	var doc map[string]any
	require.NoError(t, json.Unmarshal(buf.Bytes(), &doc))
	assert.Empty(t, validate(loadSchema(t), doc))
	var r Report
	require.NoError(t, json.Unmarshal(buf.Bytes(), &r))
	require.Len(t, r.Plates, 1)
	pr := r.Plates[0]
	assert.Equal(t, "main-board", pr.ID)
	assert.Equal(t, [3]int{50, 40, 2}, [3]int{pr.NX, pr.NY, pr.NZ})
	assert.Equal(t, celsius(p.Hottest), float64(pr.HottestC))
	assert.Equal(t, p.HotX, float64(pr.HottestXM))
	assert.Equal(t, celsius(p.Mean), float64(pr.MeanC))
	assert.Equal(t, p.Margin, float64(*pr.MarginK))
	assert.Equal(t, "over", pr.Status, "107.8 °C against 105 °C")
	require.Len(t, pr.Joins, 3)
	assert.Equal(t, PlateJoinReport{Name: "x_min to chassis (contact)", Face: "x_min", Node: "chassis", Kind: "contact", HeatW: 4.47}, pr.Joins[2])
	require.Len(t, pr.Parts, 3)
	assert.Equal(t, 11.0, float64(pr.Parts[0].PowerW))

	// The schema knows the plate's keys: one it does not know fails.
	doc["plates"].([]any)[0].(map[string]any)["cells"] = []any{1.0}
	assert.Contains(t, strings.Join(validate(loadSchema(t), doc), "\n"), `key "cells" is not in the schema`)
	delete(doc["plates"].([]any)[0].(map[string]any), "cells")
	delete(doc["plates"].([]any)[0].(map[string]any), "hottest_degC")
	assert.Contains(t, strings.Join(validate(loadSchema(t), doc), "\n"), `missing required key "hottest_degC"`)
}

// The cells written as CSV and JSON read back to exactly the temperatures
// of the solution, in the documented order, with the cells' centres.
func TestPlateCellsReadBack(t *testing.T) {
	p := testBoard(100, 80, 25, 20, 3)
	q := testBoard(60, 30, 6, 3, 1)
	q.ID = `odd, "quoted" id`
	odd := testBoard(100, 80, 7, 3, 3) // cells of 100/7 and 80/3 mm
	odd.ID = "odd"
	sol, _ := plateSolution(t, p)
	sol.Plates = append(sol.Plates, q, odd)

	var buf bytes.Buffer
	require.NoError(t, WritePlateCells(&buf, sol, CellsCSV))
	rows, err := csv.NewReader(&buf).ReadAll()
	require.NoError(t, err)
	assert.Equal(t, PlateCellsHeader, rows[0])
	require.Len(t, rows, 1+len(p.T)+len(q.T)+len(odd.T))
	row := 1
	for _, pl := range sol.Plates {
		for c, want := range pl.T {
			r := rows[row]
			row++
			assert.Equal(t, pl.ID, r[0])
			i, j, k := c%pl.NX, (c/pl.NX)%pl.NY, c/(pl.NX*pl.NY)
			assert.Equal(t, []string{strconv.Itoa(i), strconv.Itoa(j), strconv.Itoa(k)}, r[1:4])
			x, _ := strconv.ParseFloat(r[4], 64)
			z, _ := strconv.ParseFloat(r[6], 64)
			assert.InDelta(t, 1e3*(float64(i)+0.5)*pl.Width/float64(pl.NX), x, 1e-9)
			assert.InDelta(t, 1e3*zCentre(&pl, k), z, 1e-9)
			for _, v := range r[4:7] {
				// Positions are rounded to 1e-9 mm: no round-off of the
				// arithmetic shows (0.3, not 0.30000000000000004).
				if _, frac, ok := strings.Cut(v, "."); ok && len(frac) > 9 {
					t.Fatalf("%s cell %d: position %s shows round-off", pl.ID, c, v)
				}
			}
			got, err := strconv.ParseFloat(r[7], 64)
			require.NoError(t, err)
			if got != celsius(want) {
				t.Fatalf("%s cell %d: %v, want exactly %v", pl.ID, c, got, celsius(want))
			}
		}
	}

	buf.Reset()
	require.NoError(t, WritePlateCells(&buf, sol, CellsJSON))
	assert.Equal(t, 1, bytes.Count(buf.Bytes(), []byte("\n")), "compact: one line")
	var doc []struct {
		Plate    string    `json:"plate"`
		NX       int       `json:"nx"`
		NY       int       `json:"ny"`
		NZ       int       `json:"nz"`
		DX       float64   `json:"dx_mm"`
		DY       float64   `json:"dy_mm"`
		ZEdges   []float64 `json:"z_edges_mm"`
		TDegC    []float64 `json:"temperature_degC"`
		Unwanted any       `json:"cells"`
	}
	require.NoError(t, json.Unmarshal(buf.Bytes(), &doc))
	require.Len(t, doc, 3)
	for n, pl := range sol.Plates {
		d := doc[n]
		assert.Equal(t, pl.ID, d.Plate)
		assert.Equal(t, [3]int{pl.NX, pl.NY, pl.NZ}, [3]int{d.NX, d.NY, d.NZ})
		assert.InDelta(t, 1e3*pl.Width/float64(pl.NX), d.DX, 1e-9)
		assert.InDelta(t, 1e3*pl.Length/float64(pl.NY), d.DY, 1e-9)
		require.Len(t, d.ZEdges, pl.NZ+1)
		assert.InDelta(t, 1.6, d.ZEdges[pl.NZ], 1e-12)
		require.Len(t, d.TDegC, len(pl.T))
		for c, want := range pl.T {
			if d.TDegC[c] != celsius(want) {
				t.Fatalf("%s cell %d: %v, want exactly %v", pl.ID, c, d.TDegC[c], celsius(want))
			}
		}
	}
	assert.ErrorContains(t, WritePlateCells(&buf, sol, "xml"), `unknown cell format "xml"`)
	buf.Reset()
	empty, _ := solved(t)
	require.NoError(t, WritePlateCells(&buf, empty, CellsJSON))
	assert.Equal(t, "[]\n", buf.String())
}

// Streaming: the allocations of writing the cells do not grow with their
// number (a hundred times more cells, the same allocations).
func TestPlateCellsStream(t *testing.T) {
	for _, format := range []string{CellsCSV, CellsJSON} {
		allocs := func(nx int) float64 {
			sol, _ := plateSolution(t, testBoard(100, 80, nx, nx, 1))
			return testing.AllocsPerRun(3, func() {
				if err := WritePlateCells(io.Discard, sol, format); err != nil {
					t.Fatal(err)
				}
			})
		}
		small, large := allocs(20), allocs(200)
		assert.Equal(t, small, large, "%s: allocations grow with the number of cells", format)
		assert.Less(t, large, 30.0, format)
	}
}

func benchmarkCells(b *testing.B, format string) {
	sol, _ := plateSolution(b, bigBoard())
	var n int64
	b.ReportAllocs()
	for b.Loop() {
		var c countingWriter
		if err := WritePlateCells(&c, sol, format); err != nil {
			b.Fatal(err)
		}
		n = c.n
	}
	b.SetBytes(n)
}

func BenchmarkPlateCellsCSV1e6(b *testing.B)  { benchmarkCells(b, CellsCSV) }
func BenchmarkPlateCellsJSON1e6(b *testing.B) { benchmarkCells(b, CellsJSON) }

// The HTML report has a section per plate: its summary, its joins and its
// heat map inline, every model string escaped, and each heat map's
// pattern id its own.
func TestHTMLPlates(t *testing.T) {
	p := testBoard(100, 80, 50, 40, 2)
	sol, run := plateSolution(t, p)
	q := testBoard(60, 30, 12, 6, 1)
	q.ID = `<img src=x onerror=alert(1)>`
	q.Parts[0].Name = `"><script>bad()</script>`
	sol.Plates = append(sol.Plates, q)
	var buf bytes.Buffer
	require.NoError(t, WriteHTML(&buf, NewHTMLReport(sol, run, nil)))
	page := buf.String()
	assert.Contains(t, page, "<h2>Meshed plates</h2>")
	assert.Contains(t, page, "<h3>main-board</h3>")
	assert.Contains(t, page, "<td>100.0 × 80.0 × 1.60 mm, 50 × 40 × 2 cells</td>")
	assert.Contains(t, page, fmt.Sprintf(`<tr><th>hottest</th><td class="n">%.2f °C</td><td>at (65.0, 39.0, 1.20) mm</td></tr>`, celsius(p.Hottest)))
	assert.Contains(t, page, `<tr class="over"><th>limit</th><td class="n">105.00 °C</td><td>margin -2.80 K OVER</td></tr>`)
	assert.Contains(t, page, `<tr><td>x_min to chassis (contact)</td><td>chassis</td><td class="n">4.470</td></tr>`)
	assert.Equal(t, 2, strings.Count(page, `<div class="heatmap"><svg xmlns="http://www.w3.org/2000/svg"`))
	assert.NotContains(t, page, "<img")
	assert.NotContains(t, page, "<script>bad")
	assert.Contains(t, page, "&lt;img src=x onerror=alert(1)&gt;")
	ids := regexp.MustCompile(`<pattern id="([^"]+)"`).FindAllStringSubmatch(page, -1)
	require.Len(t, ids, 2)
	assert.NotEqual(t, ids[0][1], ids[1][1])
	assert.NotContains(t, page, "http://www.w3.org/2000/svg\" href", "nothing is loaded from elsewhere")

	// A plate that cannot be drawn says why, and the page is still written.
	sol.Plates[1].T = nil
	buf.Reset()
	require.NoError(t, WriteHTML(&buf, NewHTMLReport(sol, run, nil)))
	assert.Contains(t, buf.String(), "no heat map: plate &#34;&lt;img src=x onerror=alert(1)&gt;&#34;: 0 cell temperatures")
}

// A plate's node is one slab with its hottest cell and mean, its paths
// those of its joins; the legend names the shape only when a plate is
// drawn. Graphviz lays it out.
func TestDOTPlateNode(t *testing.T) {
	p := testBoard(100, 80, 50, 40, 2)
	sol, _ := plateSolution(t, p)
	dot, err := DOT(sol, ColourMargin)
	require.NoError(t, err)
	assert.Regexp(t, `"main-board"\s*\[[^\]]*shape=box3d`, dot)
	assert.Regexp(t, `"main-board"\s*\[[^\]]*style="filled"`, dot, "a slab, not a rounded box")
	assert.Contains(t, dot, `label="main-board\nplate, 50 × 40 × 2 cells\nhottest 107.8 °C\nmean 50.8 °C\nmargin -2.8 K OVER\npower 14 W"`)
	assert.Contains(t, dot, "3-D slab: meshed plate, at its")
	assert.Contains(t, dot, `"main-board"->"box-air"`)
	assert.Contains(t, dot, `"main-board"->"chassis"`)
	assert.Regexp(t, `"box-air"\s*\[[^\]]*shape=box`, dot)
	assert.NotRegexp(t, `"box-air"\s*\[[^\]]*shape=box3d`, dot)
	svg, err := Render(context.Background(), dot, FormatSVG)
	require.NoError(t, err)
	assert.Contains(t, string(svg), "hottest 107.8 °C")

	plain, _ := solveText(t, "board.yaml", plateModel)
	dot, err = DOT(plain, ColourTemperature)
	require.NoError(t, err)
	assert.NotContains(t, dot, "box3d")
	assert.NotContains(t, dot, "meshed plate")

	// A plate node without a summary still says what it is.
	sol.Plates = nil
	dot, err = DOT(sol, ColourMargin)
	require.NoError(t, err)
	assert.Contains(t, dot, `label="main-board\nhottest 107.8 °C\nmargin -2.8 K OVER\npower 14 W"`)
}

// The table of a solution has a row for each join of a plate: the heat
// from the plate to the node joined; the plate itself is a node row.
func TestCSVPlateJoins(t *testing.T) {
	sol, _ := plateSolution(t, testBoard(100, 80, 50, 40, 1))
	var buf bytes.Buffer
	require.NoError(t, WriteCSV(&buf, sol))
	rows, err := csv.NewReader(&buf).ReadAll()
	require.NoError(t, err)
	assert.Contains(t, rows, []string{"join", "bottom to box-air (convection)", "convection", "main-board", "box-air", "", "", "", "", "", "3.91"})
	found := false
	for _, r := range rows {
		found = found || (r[0] == "node" && r[1] == "main-board" && r[2] == "plate")
	}
	assert.True(t, found, "the plate is a node row of kind plate")
}

// Power is "power" in every plate output too, never "heat input"; a
// join carries "heat".
func TestPlateWords(t *testing.T) {
	sol, run := plateSolution(t, testBoard(100, 80, 20, 16, 1))
	var text, js, page, svg bytes.Buffer
	require.NoError(t, WriteText(&text, sol, run, ByFile))
	require.NoError(t, WriteJSON(&js, NewReport(sol.Net.Model, sol, run)))
	require.NoError(t, WriteHTML(&page, NewHTMLReport(sol, run, nil)))
	require.NoError(t, WritePlateSVG(&svg, &sol.Plates[0], HeatMapOptions{}))
	dot, err := DOT(sol, ColourMargin)
	require.NoError(t, err)
	for _, out := range []string{text.String(), js.String(), page.String(), svg.String(), dot} {
		assert.NotContains(t, out, "heat input")
	}
	assert.Contains(t, js.String(), `"power_W": 11`)
	assert.Contains(t, text.String(), "heat [W]  to node")
	assert.Contains(t, svg.String(), ">cpu 11 W<")
}

// A plate's arrows: its links where links join it to a node (each heat
// counted once), and its joins where no link does, merged per node.
func TestPlateArrowsFromJoins(t *testing.T) {
	sol, _ := plateSolution(t, testBoard(100, 80, 50, 40, 1))
	dot, err := DOT(sol, ColourMargin)
	require.NoError(t, err)
	assert.Regexp(t, `"main-board"->"box-air"\[[^\]]*label="8.56 W`, dot, "the link's heat, not the joins' added to it")

	// Joins that are not links of the solution.
	var kept []network.LinkResult
	for _, l := range sol.Links {
		if l.From != "main-board" {
			kept = append(kept, l)
		}
	}
	sol.Links = kept
	dot, err = DOT(sol, ColourMargin)
	require.NoError(t, err)
	assert.Regexp(t, `"main-board"->"box-air"\[[^\]]*label="9.53 W`, dot, "top and bottom to the box air: 5.62 + 3.91 W")
	assert.Regexp(t, `"main-board"->"box-air"\[[^\]]*style=dashed`, dot, "convection")
	assert.Regexp(t, `"main-board"->"chassis"\[[^\]]*label="4.47 W`, dot)
	assert.Contains(t, dot, "main-board: x_min to chassis (contact)")
	b := NewBreakdown(sol).Source("main-board")
	require.NotNil(t, b)
	assert.InDelta(t, 14, b.Heat, 1e-9)
}
