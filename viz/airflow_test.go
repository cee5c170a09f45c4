package viz

import (
	"bytes"
	"encoding/json"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// A fan against a vent: the text report lists the branches, the fan's
// operating point and the mass balance; JSON carries the same; the
// diagram labels the air path with its flow. A model without solved
// flows has no airflow section.
const fanBox = `
title: fan box
ambient: {temperature: 20 degC}
nodes:
  - {id: board, power: 10 W}
  - {id: box, kind: air}
links:
  - {kind: convection, from: board, to: box, coefficient: 20 W/m2/K, area: 0.05 m2}
  - {id: fan, kind: fan, from: ambient, to: box, curve: [[0, 60 Pa], [10 L/s, 40 Pa], [20 L/s, 0 Pa]], curve_speed: 3000 rpm, speed: 2400 rpm}
  - {id: vent, kind: loss, from: box, to: ambient, coefficient: 2, area: 10 cm2}
`

func TestAirflowSections(t *testing.T) {
	sol, run := solveText(t, "fan.yaml", fanBox)
	var b bytes.Buffer
	require.NoError(t, WriteText(&b, sol, run, ByFile))
	text := b.String()
	for _, want := range []string{"airflow (", "fans (operating point", "2400 rpm", "mass balance [g/s]", "vent "} {
		assert.Contains(t, text, want)
	}
	b.Reset()
	require.NoError(t, WriteJSON(&b, NewReport(sol.Net.Model, sol, run)))
	var doc map[string]any
	require.NoError(t, json.Unmarshal(b.Bytes(), &doc))
	af, ok := doc["airflow"].(map[string]any)
	require.True(t, ok, "no airflow in the JSON")
	assert.Len(t, af["branches"], 2)
	assert.Len(t, af["fans"], 1)
	dot, err := DOT(sol, ColourMargin)
	require.NoError(t, err)
	assert.True(t, strings.Contains(dot, "L/s"), "air path not labelled with its flow")

	plain, run := solved(t)
	b.Reset()
	require.NoError(t, WriteText(&b, plain, run, ByFile))
	assert.NotContains(t, b.String(), "airflow (")
}
