package graphcmd

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// A board of two parts in one group, a sealed box's trickle through a
// gasket, and a lid group.
const grouped = `
title: grouped
ambient: {temperature: 25 degC}
nodes:
  - {id: board, group: main-board}
  - {id: lid, group: enclosure}
  - {id: gasket-side, group: enclosure}
components:
  - {id: cpu, power: 6 W, r_jc: 1 K/W, case: lid, r_jb: 3 K/W, board: board, limit: 100 degC, group: main-board}
  - {id: pmic, power: 1 W, r_jb: 8 K/W, board: board, limit: 110 degC, group: main-board}
links:
  - {id: spreader, kind: lumped, from: board, to: lid, resistance: 2 K/W}
  - {id: lid-film, kind: convection, from: lid, coefficient: 8 W/m2/K, area: 0.05 m2}
  - {id: lid-glow, kind: radiation, from: lid, emissivity: 0.9, area: 0.05 m2}
  - {id: gasket, kind: lumped, from: lid, to: gasket-side, resistance: 900 K/W}
  - {id: side-film, kind: convection, from: gasket-side, coefficient: 5 W/m2/K, area: 0.001 m2}
`

func graph(t *testing.T, args ...string) (string, error) {
	t.Helper()
	dir := t.TempDir()
	model := filepath.Join(dir, "m.yaml")
	require.NoError(t, os.WriteFile(model, []byte(grouped), 0o644))
	out := filepath.Join(dir, "d.dot")
	ios, _, _, _ := iostreams.Test()
	cmd := NewCmd(ios, nil)
	cmd.SetArgs(append([]string{model, "-o", out}, args...))
	if err := cmd.Execute(); err != nil {
		return "", err
	}
	data, err := os.ReadFile(out)
	require.NoError(t, err)
	return string(data), nil
}

func TestGraphDiagramLanguage(t *testing.T) {
	dot, err := graph(t)
	require.NoError(t, err)
	assert.Contains(t, dot, `cluster_group_\"main-board\"`, "groups are clusters")
	assert.Contains(t, dot, "style=dashed", "convection is dashed")
	assert.Contains(t, dot, "dotted: radiation", "radiation is explained")
	assert.Contains(t, dot, `label="6.99 W (42 % rad.)\n "`, "the radiated share of a merged arrow")
	assert.Contains(t, dot, `lid-glow (radiation) 2.91 W`, "the kind is named on hover")
	assert.Contains(t, dot, "101.33 kPa", "the header gives the pressure")
	assert.NotContains(t, dot, "moving air")
	assert.Contains(t, dot, `color="#a8a8a8"`, "the gasket's trickle is faded")
	assert.NotContains(t, dot, "-0 W")

	dot, err = graph(t, "--link-labels", "--hide-below", "0.1W", "--color", "temperature")
	require.NoError(t, err)
	assert.Contains(t, dot, `label="spreader\n1.67 W"`, "a thin arrow's label is not lifted")
	assert.NotContains(t, dot, "gasket (lumped)", "the trickle is hidden")
	assert.Contains(t, dot, "smaller flows not drawn")
	assert.Contains(t, dot, "colour: temperature")

	dot, err = graph(t, "--collapse", "main-board")
	require.NoError(t, err)
	assert.Contains(t, dot, `"group main-board"`)
	assert.NotContains(t, dot, `"cpu" [`, "cpu is drawn inside the group's node")
	assert.Contains(t, dot, "(3 nodes)")
	// The group's node: the hottest member (pmic, 46.5 °C), the worst
	// margin (cpu: 100 − 40.5 = 59.5 K; pmic: 110 − 46.5 = 63.5 K) and
	// the power of all members (6 W + 1 W).
	assert.Contains(t, dot, `group main-board (3 nodes)\nup to 46.5 °C\nmargin +59.5 K ok\npower 7 W`)

	dot, err = graph(t, "--source", "pmic")
	require.NoError(t, err)
	assert.Contains(t, dot, "heat of pmic only")
	assert.NotContains(t, dot, `"cpu"->`, "cpu's own heat is not drawn")
	assert.NotContains(t, dot, `"cpu" [`, "nor cpu, which pmic's heat does not pass")
	assert.Contains(t, dot, `"pmic"->"board"`)

	_, err = graph(t, "--source", "board")
	assert.ErrorContains(t, err, "sources: cpu, pmic")
	_, err = graph(t, "--collapse", "nothing")
	assert.ErrorContains(t, err, "groups: enclosure, main-board")
}

func TestParseHideBelow(t *testing.T) {
	for _, c := range []struct {
		in   string
		w, f float64
	}{{"", 0, 0}, {"0.1W", 0.1, 0}, {"0.1 W", 0.1, 0}, {"50 mW", 0.05, 0}, {"0.02", 0, 0.02}} {
		w, f, err := ParseHideBelow(c.in)
		require.NoError(t, err, c.in)
		assert.InDelta(t, c.w, w, 1e-15, c.in)
		assert.InDelta(t, c.f, f, 1e-15, c.in)
	}
	for _, bad := range []string{"2", "-1W", "x", "1 K"} {
		_, _, err := ParseHideBelow(bad)
		assert.Error(t, err, bad)
		assert.True(t, strings.Contains(err.Error(), "--hide-below"))
	}
}
