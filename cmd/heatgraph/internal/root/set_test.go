package root

import (
	"encoding/json"
	"testing"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// --set changes a value before the model is read: 10 W through 3 K/W is
// 30 K above ambient (hand calculation), 7 W is 21 K.
func TestSetOverridesTheModel(t *testing.T) {
	path := writeModel(t, overLimit)
	code, out, _ := run("solve", path, "--format", "json")
	assert.Equal(t, exit.LimitExceeded, code)
	assert.Contains(t, out, `"temperature_degC": 70`)
	code, out, stderr := run("solve", path, "--format", "json", "--set", "nodes.chip.power=5W", "--set", "ambient.temperature=30degC")
	require.Equal(t, exit.OK, code, stderr)
	var doc struct {
		Nodes []struct {
			ID string  `json:"id"`
			T  float64 `json:"temperature_degC"`
		} `json:"nodes"`
	}
	require.NoError(t, json.Unmarshal([]byte(out), &doc))
	for _, n := range doc.Nodes {
		if n.ID == "chip" {
			assert.InDelta(t, 45, n.T, 1e-6)
		}
	}
	for _, verb := range []string{"check", "solve", "graph"} {
		args := []string{verb, path, "--set", "nodes.chip.power=7 V"}
		if verb == "graph" {
			args = append(args, "-o", t.TempDir()+"/g.dot")
		}
		code, _, stderr = run(args...)
		assert.Equal(t, exit.BadInput, code, verb)
		assert.Contains(t, stderr, `--set nodes.chip.power: unknown unit "V" in "7 V"`, verb)
	}
	code, _, stderr = run("check", path, "--set", "nodes.chp.power=7W")
	assert.Equal(t, exit.BadInput, code)
	assert.Contains(t, stderr, `--set nodes.chp.power: no node "chp" (did you mean "chip"?) (nodes: chip)`)
	code, _, stderr = run("check", path, "--set", "nodes.chip.power")
	assert.Equal(t, exit.BadInput, code)
	assert.Contains(t, stderr, "expected PATH=VALUE")
}
