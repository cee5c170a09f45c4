package viz

import (
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"image/color"
	"math"
	"regexp"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/solve"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// A node heated by 3 W, held by 10 K/W to ambient at 20 °C: 50 °C, and a
// second link defined against the flow, so that its heat is negative.
const small = `
title: small
ambient: {temperature: 20 degC}
nodes:
  - {id: chip, power: 3 W, limit: 60 degC}
  - {id: shelf, kind: fixed, temperature: 20 degC}
links:
  - {id: up, kind: lumped, from: chip, to: ambient, resistance: 20 K/W}
  - {id: back, kind: lumped, from: shelf, to: chip, resistance: 20 K/W}
`

func solved(t *testing.T) (*network.Solution, Run) {
	t.Helper()
	return solveText(t, "small.yaml", small)
}

// solveText parses, builds and solves a model given as text.
func solveText(t testing.TB, name, text string) (*network.Solution, Run) {
	t.Helper()
	m, err := network.Parse(name, []byte(text))
	require.NoError(t, err)
	net, err := network.Build(m)
	require.NoError(t, err)
	p := net.Steady()
	r := solve.Newton(p, p.InitialGuess(), solve.Settings{})
	require.True(t, r.Reason.Converged())
	return net.Solution(r.X), Run{Converged: true, Reason: r.Reason.String(), Iterations: r.Iterations}
}

func TestDOTFollowsHeat(t *testing.T) {
	sol, _ := solved(t)
	dot, err := DOT(sol, ColourMargin)
	require.NoError(t, err)
	// "back" is defined shelf -> chip but heat flows chip -> shelf.
	assert.Contains(t, dot, `"chip"->"shelf"`)
	assert.NotContains(t, dot, `"shelf"->"chip"`)
	assert.Contains(t, dot, `label="1.5 W\n "`, "a thick arrow's label is lifted off it")
	assert.Contains(t, dot, "margin +10.0 K")
	assert.Contains(t, dot, "cluster_legend")
	assert.Contains(t, dot, "confirm by measurement")
	again, _ := DOT(sol, ColourMargin)
	assert.Equal(t, dot, again, "the DOT text must be deterministic")
}

func TestJSONFullPrecision(t *testing.T) {
	sol, run := solved(t)
	var buf bytes.Buffer
	require.NoError(t, WriteJSON(&buf, NewReport(sol.Net.Model, sol, run)))
	var r Report
	require.NoError(t, json.Unmarshal(buf.Bytes(), &r))
	assert.Equal(t, sol.Nodes[1].Temperature-273.15, float64(r.Nodes[1].TemperatureC))
	assert.Equal(t, sol.Links[1].Heat, float64(r.Links[1].HeatW))
	assert.InDelta(t, -1.5, float64(r.Links[1].HeatW), 1e-12)
	assert.Equal(t, []string{}, r.Exceeded)
}

func TestTextReport(t *testing.T) {
	sol, run := solved(t)
	var buf bytes.Buffer
	require.NoError(t, WriteText(&buf, sol, run, ByMargin))
	out := buf.String()
	assert.Contains(t, out, "chip")
	assert.Contains(t, out, "+10.00")
	assert.Contains(t, out, "the 1 limit holds")
	lines := strings.Split(out, "\n")
	// Sorted by margin: the only node with a limit comes first.
	for i, l := range lines {
		if strings.HasPrefix(l, "node ") {
			assert.True(t, strings.HasPrefix(lines[i+1], "chip"), lines[i+1])
		}
	}
}

func TestScales(t *testing.T) {
	marginScale := marginScaleFor(5)
	assert.Equal(t, marginScale[0].c, marginScale.at(-100))
	assert.Equal(t, marginScale[len(marginScale)-1].c, marginScale.at(1e3))
	mid := marginScale.at(2.5) // halfway between brick (0 K) and amber (5 K)
	assert.InDelta(t, (0xad+0xc2)/2.0, mid.r, 1e-9)
	assert.Equal(t, "#ffffff", textOn(marginScale[0].c))
	assert.Equal(t, "#111111", textOn(noLimitFill))
}

func TestXdotReader(t *testing.T) {
	r := &xdotReader{s: "c 7 -#3d4852 B 4 1 2 3 4 5 6 7 8 T 10 20 0 30 6 -12 °C"}
	r.space()
	assert.Equal(t, byte('c'), r.s[r.i])
	r.i++
	assert.Equal(t, "#3d4852", r.str())
	r.space()
	r.i++ // B
	assert.Equal(t, [][2]float64{{1, 2}, {3, 4}, {5, 6}, {7, 8}}, r.points())
	r.space()
	r.i++ // T
	assert.Equal(t, []float64{10, 20, 0, 30}, []float64{r.num(), r.num(), r.num(), r.num()})
	assert.Equal(t, "12 °C", r.str(), "the byte count includes the two bytes of °")
	assert.NoError(t, r.err)
	bad := &xdotReader{s: "5 -ab"}
	bad.str()
	assert.Error(t, bad.err)
}

func TestParseColour(t *testing.T) {
	assert.Equal(t, color.NRGBA{0x3d, 0x48, 0x52, 0xff}, parseColour("#3d4852"))
	assert.Equal(t, color.NRGBA{0xff, 0xff, 0xfe, 0x00}, parseColour("#fffffe00"))
	assert.Equal(t, color.Transparent, parseColour("transparent"))
}

func TestRenderFormats(t *testing.T) {
	sol, _ := solved(t)
	dot, err := DOT(sol, ColourTemperature)
	require.NoError(t, err)
	svg, err := Render(context.Background(), dot, FormatSVG)
	require.NoError(t, err)
	assert.Contains(t, string(svg), "<svg")
	png, err := Render(context.Background(), dot, FormatPNG)
	require.NoError(t, err)
	assert.True(t, bytes.HasPrefix(png, []byte("\x89PNG")))
	_, err = FormatFor("x.pdf")
	assert.Error(t, err)
	f, err := FormatFor("X.SVG")
	assert.NoError(t, err)
	assert.Equal(t, FormatSVG, f)
}

// A channel's air carries the heat picked up upstream; the diagram must
// show that path, or the heat would seem to vanish at the air node.
func TestDOTShowsCarriedAir(t *testing.T) {
	sol, _ := solveText(t, "duct.yaml", `
ambient: {temperature: 20 degC}
nodes:
  - {id: a, power: 10 W}
  - {id: b, power: 5 W}
  - {id: mid, kind: air}
  - {id: out, kind: air}
links:
  - {kind: channel, from: a, inlet: ambient, to: mid, flow: 4 CFM, shape: circular, diameter: 6 mm, count: 8, length: 80 mm}
  - {id: second, kind: channel, from: b, inlet: mid, to: out, flow: 4 CFM, shape: circular, diameter: 6 mm, count: 8, length: 80 mm}
  - {kind: stream, from: out, to: ambient, flow: 4 CFM}
`)
	for _, l := range sol.Links {
		if l.ID == "second" {
			require.Len(t, l.Paths, 2)
			assert.Equal(t, "mid", l.Paths[1].From)
			assert.True(t, l.Paths[1].Carried)
			assert.InDelta(t, 10, l.Paths[1].Heat, 1e-9, "the air brings the first block's 10 W")
		}
	}
	dot, err := DOT(sol, ColourMargin)
	require.NoError(t, err)
	assert.Contains(t, dot, `"mid"->"out"`)
	assert.Contains(t, dot, `label="10 W\n "`)
}

// Parallel links between two nodes become one arrow with their heat
// summed and the parts in the tooltip; a fixed node with several links is
// drawn at each of them. Every node still shows its temperature, and the
// arrows still point the way heat flows.
func TestDOTMergesParallelLinksAndSplitsFixedNodes(t *testing.T) {
	sol := solveChain(t, 5)
	dot, err := DOT(sol, ColourMargin)
	require.NoError(t, err)
	for i := range 5 {
		var conv, rad float64
		for _, l := range sol.Links {
			switch l.ID {
			case fmt.Sprintf("c%d", i):
				conv = l.Heat
			case fmt.Sprintf("r%d", i):
				rad = l.Heat
			}
		}
		require.Positive(t, conv)
		require.Positive(t, rad)
		// One arrow from n<i> to its own copy of ambient, labelled with the
		// sum, its tooltip naming both links.
		re := regexp.MustCompile(fmt.Sprintf(`"n%d"->"ambient#\d+"\[[^\]]*label="([^"]+) W \(\d+ %% rad\.\)(?:\\n )?"[^\]]*tooltip="2 links, [^"]*c%d \(convection\) [^"]*; r%d \(radiation\) [^"]*"`, i, i, i))
		m := re.FindStringSubmatch(dot)
		require.NotNil(t, m, "n%d: one merged arrow to ambient", i)
		assert.Equal(t, fmt.Sprintf("%.3g", conv+rad), m[1])
		assert.Contains(t, dot, fmt.Sprintf(`label="n%d\n`, i), "every node is drawn with its temperature")
	}
	assert.Equal(t, 5, strings.Count(dot, `label="ambient\n25.0 °C"`), "ambient drawn once per link")
	assert.Equal(t, 5, strings.Count(dot, "->\"ambient#"))
	assert.Equal(t, 5, strings.Count(dot, "weight=0"), "copies of a fixed node do not bend the chain")
	// The heat enters at n0 and flows down the chain.
	for i := range 4 {
		assert.Contains(t, dot, fmt.Sprintf(`"n%d"->"n%d"`, i, i+1))
	}
	assert.Contains(t, dot, "a fixed node is drawn")
}

// heatEdges sums links in both orientations and points the arrow the way
// the net heat flows.
func TestHeatEdges(t *testing.T) {
	sol := &network.Solution{Links: []network.LinkResult{
		{ID: "a", Kind: "lumped", From: "x", To: "y", Heat: 2, Paths: []network.PathResult{{From: "x", To: "y", Heat: 2}}},
		{ID: "b", Kind: "lumped", From: "y", To: "x", Heat: 5, Paths: []network.PathResult{{From: "y", To: "x", Heat: 5}}},
		{ID: "s", Kind: "stream", From: "x", To: "y", Heat: 1, Paths: []network.PathResult{{From: "x", To: "y", Heat: 1, Carried: true}}},
	}}
	edges := heatEdges(sol)
	require.Len(t, edges, 2, "heat carried by air is kept apart")
	assert.Equal(t, "y", edges[0].from)
	assert.Equal(t, "x", edges[0].to)
	assert.InDelta(t, 3, edges[0].heat, 1e-12)
	assert.Equal(t, "2 links, 3 W in all: a (lumped) -2 W; b (lumped) 5 W", edges[0].tooltip())
	assert.True(t, edges[1].air)
	assert.Equal(t, "x", edges[1].from)
}

// No report writes a number that is not finite as if it were one: JSON
// writes null (a detail is left out), CSV leaves the cell empty, text says
// "not finite", and each gets a warning naming the item and quantity.
func TestNonFiniteNumbers(t *testing.T) {
	sol, run := solved(t)
	sol.Links[0].Heat = math.Inf(1)
	sol.Links[0].Details = append(sol.Links[0].Details,
		elements.Detail{Name: "friction_factor", Value: math.Inf(1)},
		elements.Detail{Name: "h", Value: 5, Unit: "W/(m2 K)"})
	sol.Nodes[1].Margin = math.NaN()
	run.Residual = math.Inf(1)

	warnings := NonFinite(sol)
	assert.Contains(t, warnings, "link up: heat is infinite, not a finite number; its value is left out")
	assert.Contains(t, warnings, "link up: friction factor is infinite, not a finite number; it is not reported")
	assert.Contains(t, warnings, "node chip: margin is undefined (NaN), not a finite number; its value is left out")

	var buf bytes.Buffer
	require.NoError(t, WriteJSON(&buf, NewReport(sol.Net.Model, sol, run)))
	var doc map[string]any
	require.NoError(t, json.Unmarshal(buf.Bytes(), &doc), buf.String())
	links := doc["links"].([]any)
	up := links[0].(map[string]any)
	assert.Nil(t, up["heat_W"])
	assert.Contains(t, up, "heat_W", "a field that cannot be left out is null")
	for _, d := range up["details"].([]any) {
		assert.NotEqual(t, "friction_factor", d.(map[string]any)["name"])
	}
	assert.Contains(t, up["warnings"], "link up: friction factor is infinite, not a finite number; it is not reported")
	assert.Nil(t, doc["solver"].(map[string]any)["max_residual_W"])
	assert.Contains(t, doc["warnings"], "solver: largest residual is infinite, not a finite number; its value is left out")
	assert.Contains(t, doc["warnings"], "link up: heat is infinite, not a finite number; its value is left out")

	buf.Reset()
	require.NoError(t, WriteCSV(&buf, sol))
	assert.Contains(t, buf.String(), "link,up,lumped,chip,ambient,,,,,,\n")
	assert.NotRegexp(t, `(?i)inf|nan`, buf.String())

	buf.Reset()
	require.NoError(t, WriteText(&buf, sol, run, ByFile))
	assert.Contains(t, buf.String(), "link up: heat is infinite")
	// The same report without the bad numbers has no warnings section.
	clean, cleanRun := solved(t)
	buf.Reset()
	require.NoError(t, WriteText(&buf, clean, cleanRun, ByFile))
	assert.NotContains(t, buf.String(), "warnings")
	assert.Equal(t, "friction factor not finite (see warnings)", detailText(elements.Detail{Name: "friction_factor", Value: math.Inf(1)}))
}

func TestNumberJSON(t *testing.T) {
	for _, c := range []struct {
		x    float64
		want string
	}{{1.5, "1.5"}, {1e-319, "1e-319"}, {math.Inf(1), "null"}, {math.Inf(-1), "null"}, {math.NaN(), "null"}} {
		b, err := json.Marshal(Number(c.x))
		require.NoError(t, err)
		assert.Equal(t, c.want, string(b))
	}
	var n Number
	require.NoError(t, json.Unmarshal([]byte("null"), &n))
	assert.True(t, math.IsNaN(float64(n)))
}

func TestTextNotFinite(t *testing.T) {
	sol, run := solved(t)
	sol.Links[0].Heat = math.Inf(-1)
	sol.Balance.Imbalance = math.NaN()
	var buf bytes.Buffer
	require.NoError(t, WriteText(&buf, sol, run, ByFile))
	tables, _, _ := strings.Cut(buf.String(), "\nwarnings\n")
	assert.NotRegexp(t, `(?i)\binf\b|nan\b`, tables, "numbers that are not finite are not printed as numbers")
	assert.Contains(t, buf.String(), "not finite  chip → ambient")
	assert.Contains(t, buf.String(), "link up: heat is negatively infinite")
	assert.Contains(t, buf.String(), "energy balance: imbalance is undefined (NaN)")
}

func TestPNGScale(t *testing.T) {
	assert.Equal(t, 2.0, pngScaleFor(1000, 800))
	s := pngScaleFor(30000, 6000)
	assert.Less(t, s, 2.0)
	assert.InDelta(t, maxPNGPixels, 30000*6000*s*s, 1)
}

// The xdot reader undoes DOT quoting: escaped quotes and line
// continuations, which Graphviz writes in long drawing attributes.
func TestReadXdot(t *testing.T) {
	assert.Equal(t, `T 1 2 0 9 8 -say "hi"`, unquote(`"T 1 2 0 9 8 -say \"hi\""`))
	assert.Equal(t, "c 7 -#000000 P 2 1 2 3 4", unquote("\"c 7 -#000000 \\\nP 2 1 2 3 4\""))
	assert.Equal(t, "plain", unquote("plain"))
	assert.Equal(t, `T 1 2 0 3 3 -a\b \n`, unquote(`"T 1 2 0 3 3 -a\\b \n"`), "a written backslash, an unknown escape")

	g, err := readXdot([]byte(`digraph g {
	graph [bb="0,0,10,20", _draw_="c 7 -#fffffe00 "];
	subgraph cluster_a { graph [_draw_="c 7 -#9a9a9a "]; x [_draw_="e 1 2 3 4 "]; }
	y [_ldraw_="T 1 2 0 9 8 -say \"hi\""];
	x -> y [_draw_="B 4 0 0 1 1 2 2 3 3 "];
}`))
	require.NoError(t, err)
	assert.Equal(t, "0,0,10,20", g.attrs["bb"])
	require.Len(t, g.nodes, 2)
	assert.Equal(t, `T 1 2 0 9 8 -say "hi"`, g.nodes[1]["_ldraw_"])
	require.Len(t, g.edges, 1)
	assert.Equal(t, []string{"c 7 -#9a9a9a ", ""}, g.clusterOps())

	// A label with quotes and a backslash is painted without error.
	_, err = Render(context.Background(), `digraph g { a [label="say \"hi\" \\ 5 W"]; a -> b [label="1 W"] }`, FormatPNG)
	assert.NoError(t, err)
}

// A comparison diagram puts every variant's temperature on each node, with
// its change against the drawn one.
func TestCompareDiagram(t *testing.T) {
	a, _ := solveText(t, "a.yaml", small)
	b, _ := solveText(t, "b.yaml", strings.Replace(small, "resistance: 20 K/W}", "resistance: 10 K/W}", 1))
	dot, err := DOTWith(a, DiagramOptions{Compare: []*network.Solution{b}, Names: []string{"base", "better"}})
	require.NoError(t, err)
	for _, n := range a.Nodes {
		for _, m := range b.Nodes {
			if m.ID == n.ID && n.Kind != network.Fixed {
				want := fmt.Sprintf(`better %.1f °C (%s K)`, celsius(m.Temperature), signed(m.Temperature-n.Temperature))
				assert.Contains(t, dot, want, n.ID)
			}
		}
	}
}
