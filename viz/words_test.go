package viz

import (
	"bytes"
	"encoding/json"
	"os"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestCSVNumbers(t *testing.T) {
	assert.Equal(t, "0", csvNumber(-0.0))
	assert.Equal(t, "0", csvNumber(-3e-14))
	assert.Equal(t, "50", csvNumber(50.00000000000001))
	assert.Equal(t, "1.234567891", csvNumber(1.2345678912345))
	sol, _ := solved(t)
	var buf bytes.Buffer
	require.NoError(t, WriteCSV(&buf, sol))
	assert.NotContains(t, buf.String(), ",-0,")
	assert.NotContains(t, buf.String(), ",-0\n")
	for _, cell := range strings.FieldsFunc(buf.String(), func(r rune) bool { return r == ',' || r == '\n' }) {
		assert.LessOrEqual(t, len(strings.TrimLeft(cell, "-0.")), 16, "cell %q", cell)
	}
}

// Power is called "power" in every output: the model key, the text
// header, the JSON key, the CSV column and the diagram label.
func TestPowerIsOneWord(t *testing.T) {
	sol, run := solved(t)
	var text, js, csvOut bytes.Buffer
	require.NoError(t, WriteText(&text, sol, run, ByFile))
	require.NoError(t, WriteJSON(&js, NewReport(sol.Net.Model, sol, run)))
	require.NoError(t, WriteCSV(&csvOut, sol))
	dot, err := DOT(sol, ColourMargin)
	require.NoError(t, err)
	assert.Contains(t, text.String(), "power [W]")
	assert.Contains(t, js.String(), `"power_W"`)
	assert.Contains(t, csvOut.String(), "power_W")
	assert.Contains(t, dot, `power 3 W`)
	for _, out := range []string{text.String(), js.String(), csvOut.String(), dot} {
		assert.NotContains(t, out, "heat input")
		assert.NotContains(t, out, "W in\\n")
	}
}

func TestJSONAlwaysHasLimitsAndMargin(t *testing.T) {
	sol, run := solved(t)
	var js bytes.Buffer
	require.NoError(t, WriteJSON(&js, NewReport(sol.Net.Model, sol, run)))
	var doc map[string]any
	require.NoError(t, json.Unmarshal(js.Bytes(), &doc))
	assert.Equal(t, []any{}, doc["limits_exceeded"])
	assert.Equal(t, 0.0, doc["required_margin_K"])
	require.Contains(t, doc, "breakdown")
	// A run without a solution has both keys too.
	js.Reset()
	require.NoError(t, WriteJSON(&js, NewReport(sol.Net.Model, nil, Run{})))
	doc = nil
	require.NoError(t, json.Unmarshal(js.Bytes(), &doc))
	assert.Equal(t, []any{}, doc["limits_exceeded"])
	assert.Contains(t, doc, "required_margin_K")
}

func TestNoNegativeZeroWatts(t *testing.T) {
	assert.Equal(t, "0 W", watts(-0.0))
	assert.Equal(t, "0 W", watts(-1e-12))
	assert.Equal(t, "0 W", watts(0))
	assert.Equal(t, "1.5 W", watts(1.5))
	assert.Equal(t, "+0.0", signed(-0.04))
}

func TestLinkKindsByLineStyle(t *testing.T) {
	sol, _ := solveText(t, "kinds.yaml", `
ambient: {temperature: 20 degC}
nodes:
  - {id: chip, power: 3 W}
  - {id: lid}
  - {id: shell}
links:
  - {id: pad, kind: conduction, from: chip, to: lid, conductivity: 3 W/m/K, area: 4 cm2, thickness: 1 mm}
  - {id: glow, kind: radiation, from: lid, to: shell, emissivity: 0.9, area: 0.02 m2}
  - {id: film, kind: convection, from: shell, coefficient: 10 W/m2/K, area: 0.05 m2}
`)
	dot, err := DOT(sol, ColourMargin)
	require.NoError(t, err)
	assert.Regexp(t, `"chip"->"lid"\[[^\]]*tooltip="pad \(conduction\)"`, dot)
	assert.NotRegexp(t, `"chip"->"lid"\[[^\]]*style=`, dot, "conduction is solid")
	assert.Regexp(t, `"lid"->"shell"\[[^\]]*style=dotted`, dot)
	assert.Regexp(t, `"shell"->"ambient"\[[^\]]*style=dashed`, dot)
	for _, words := range []string{"solid: conduction", "dashed: convection", "dotted: radiation"} {
		assert.Contains(t, dot, words)
	}
	assert.NotContains(t, dot, "moving air")
}

// Air drawn in at ambient carries no heat: the text report does not list
// it as a path ("0.000 W carried by the air ambient → …").
func TestTextLeavesOutEmptyAirPaths(t *testing.T) {
	data, err := os.ReadFile("../examples/heatsink-module.yaml")
	require.NoError(t, err)
	sol, run := solveText(t, "heatsink-module.yaml", string(data))
	var text bytes.Buffer
	require.NoError(t, WriteText(&text, sol, run, ByFile))
	assert.NotContains(t, text.String(), "0.000 W carried")
	assert.Contains(t, text.String(), "W carried by the air air-mid → air-out", "air that does carry heat is listed")
}

func TestSingularWords(t *testing.T) {
	assert.Equal(t, "the 1 limit holds", limitsHold(1))
	assert.Equal(t, "all 3 limits hold", limitsHold(3))
	assert.Equal(t, "1 node", countOf(1, "node"))
	assert.Equal(t, "2 nodes", countOf(2, "node"))
	sol, _ := solveText(t, "one.yaml", `
ambient: {temperature: 20 degC}
nodes:
  - {id: chip, power: 1 W, limit: 60 degC}
links:
  - {kind: lumped, from: chip, to: ambient, resistance: 10 K/W}
`)
	assert.Equal(t, "the 1 limit holds", Verdict(sol))
}
