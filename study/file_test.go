package study

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestReadStudyProblems(t *testing.T) {
	dir := t.TempDir()
	model := filepath.Join(dir, "m.yaml")
	require.NoError(t, os.WriteFile(model, []byte(linear), 0o644))
	for _, c := range []struct{ text, want string }{
		{"model: m.yaml\nsweep: [{vary: nodes.chip.power, from: 1 W, to: 2 V, count: 3}]\n", `s.yaml:2: sweep[0].to: unknown unit "V"`},
		{"model: m.yaml\nsweep: [{vary: nodes.chp.power, values: [1 W]}]\n", `sweep[0].vary: nodes.chp.power names no numeric value`},
		{"model: m.yaml\nsweep: [{vary: nodes.chip.power, values: [1 W], from: 1 W}]\n", `sweep[0]: give values, or from and to`},
		{"model: m.yaml\nsweep: [{vary: ambient.temperature, from: 20 degC, to: 30 degC, step: 5 K, count: 3}]\n", `sweep[0]: give step or count, not both`},
		{"model: m.yaml\nsweeps: []\n", `field sweeps not found`},
		{"model: m.yaml\n", `the study has neither a sweep: nor a montecarlo: section`},
		{"sweep: []\n", `model: missing`},
		{"model: m.yaml\nset: {nodes.chip.power: 3 V}\nsweep: [{vary: nodes.chip.power, values: [1 W]}]\n", `--set nodes.chip.power: unknown unit "V"`},
		{"model: m.yaml\nmontecarlo: {samples: 10, vary: [{vary: nodes.chip.power, normal: {sigma: 1 W}, uniform: {low: 1 W, high: 2 W}}]}\n", `montecarlo.vary[0]: give one distribution`},
		{"model: m.yaml\nmontecarlo:\n  samples: 10\n  vary:\n    - {vary: nodes.chip.power, normal: {sigma: 1 W}}\n    - {vary: nodes.chip.power, triangular: {low: 1 W, mode: 3 W, high: 2 W}}\n", `s.yaml:6: montecarlo.vary[1].triangular: needs low ≤ mode ≤ high`},
		{"model: m.yaml\nmontecarlo: {samples: 0, vary: [{vary: nodes.chip.power, normal: {sigma: 1 W}}]}\n", `s.yaml:2: montecarlo.samples: a number of samples from 1`},
		{"model: m.yaml\nmontecarlo: {samples: 5, vary: [{vary: ambient.temperature, normal: {sigma: 1 degC}}]}\n", ``},
	} {
		path := filepath.Join(dir, "s.yaml")
		require.NoError(t, os.WriteFile(path, []byte(c.text), 0o644))
		st, err := ReadStudy(path, nil)
		if c.want == "" {
			// A σ in degC is a difference: 1 K.
			require.NoError(t, err)
			assert.Equal(t, 1.0, st.Sampling.Dists[0].Sigma)
			assert.InDelta(t, 313.15, st.Sampling.Dists[0].Mean, 1e-9)
			continue
		}
		require.Error(t, err, c.text)
		assert.Contains(t, err.Error(), c.want, c.text)
	}
}

// A model file given where a study file is expected is named as such, with
// the way to a study file or to --vary.
func TestModelFileIsNotAStudy(t *testing.T) {
	_, err := ReadStudy("../examples/bench-logger.yaml", nil)
	if err == nil || !strings.Contains(err.Error(), "this is a model file, not a study file") || !strings.Contains(err.Error(), "--vary") {
		t.Errorf("err = %v", err)
	}
}
