package study

import (
	"math"
	"path/filepath"
	"testing"

	"github.com/heatgraph/heatgraph/network"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func examples(t *testing.T) []string {
	t.Helper()
	files, err := filepath.Glob("../examples/*.yaml")
	require.NoError(t, err)
	variants, err := filepath.Glob("../examples/variants/*.yaml")
	require.NoError(t, err)
	files = append(files, variants...)
	require.NotEmpty(t, files)
	return files
}

// temperatureOf returns the solved temperature of node id.
func temperatureOf(t *testing.T, pt *Point, id string) float64 {
	t.Helper()
	return pt.Solution.T[pt.Net.Index[id]]
}

// The adjoint sensitivities agree with central differences of the whole
// solve (the model solved again with the parameter at p ± h, h = 1e-4·|p|)
// on every example, for every output and parameter: the temperature
// changes for the ranking's step (10 % of the value, 10 K for a
// temperature) agree within 1e-6 K + 1e-5 of the change (observed: 1e-7 K at worst). The difference of
// solves carries the solver's convergence error over 2h and a truncation
// error of order h²; both are far below this bound.
func TestAdjointAgreesWithResolving(t *testing.T) {
	for _, file := range examples(t) {
		m, err := Open(file, nil)
		require.NoError(t, err)
		s, err := m.Sensitivity()
		require.NoError(t, err, file)
		require.NotEmpty(t, s.Outputs, file)
		require.NotEmpty(t, s.Params, file)
		assert.Equal(t, "adjoint", s.Method)
		// Flows in series along one air path change together.
		assert.Empty(t, s.Skipped, file)
		checked, worst := 0, 0.0
		for j, q := range s.Params {
			h := 1e-4 * math.Abs(q.Value)
			if h == 0 {
				h = 1e-4
			}
			up, errU := m.Solve(q.Overrides(q.Value + h)...)
			dn, errD := m.Solve(q.Overrides(q.Value - h)...)
			var lo, hi *Point
			var width float64
			switch {
			case errU == nil && errD == nil:
				lo, hi, width = dn, up, 2*h
			case errU == nil:
				lo, hi, width = s.Point, up, h
			case errD == nil:
				lo, hi, width = dn, s.Point, h
			default:
				t.Fatalf("%s %s: %v", file, q.Path, errU)
			}
			step := EffectStep(q)
			for k, o := range s.Outputs {
				fd := (temperatureOf(t, hi, o.Node) - temperatureOf(t, lo, o.Node)) / width
				adj := s.D[k][j]
				tol := 1e-6 + 1e-5*math.Abs(adj*step)
				if width == h {
					tol += 1e-3 * math.Abs(adj*step) // one-sided: truncation of order h
				}
				assert.InDelta(t, fd*step, adj*step, tol, "%s: d%s/d%s", file, o.Node, q.Path)
				checked++
				worst = max(worst, math.Abs(fd-adj)*step)
			}
		}
		t.Logf("%s: %d outputs × %d parameters (%d skipped), %d checked, worst difference %.2g K", filepath.Base(file), len(s.Outputs), len(s.Params), len(s.Skipped), checked, worst)
	}
}

// A linear network's sensitivities by hand: a node with P = 10 W through
// R = 3 K/W to an ambient of 40 degC: T = Ta + P·R, so ∂T/∂P = R = 3 K/W,
// ∂T/∂R = P = 10 W, ∂T/∂Ta = 1.
func TestSensitivityByHand(t *testing.T) {
	m := linearModel(t, nil)
	s, err := m.Sensitivity()
	require.NoError(t, err)
	require.Len(t, s.Outputs, 1)
	want := map[string]float64{"ambient.temperature": 1, "nodes.chip.power": 3, "links.chip--ambient.resistance": 10}
	require.Len(t, s.Params, len(want))
	for j, q := range s.Params {
		assert.InDelta(t, want[q.Path], s.D[0][j], 1e-8, q.Path)
	}
	r := s.Ranking(0)
	// ±10 % of 10 W is 3 K, ±10 % of 3 K/W is 3 K, 10 K of ambient is 10 K.
	assert.Equal(t, "ambient.temperature", r[0].Param.Path)
	assert.InDelta(t, 10, r[0].Change, 1e-8)
	assert.InDelta(t, 3, r[1].Change, 1e-8)
}

const linear = `ambient: {temperature: 40 degC}
required_margin: 5 K
nodes:
  - {id: chip, power: 10 W, limit: 100 degC}
links:
  - {kind: lumped, from: chip, to: ambient, resistance: 3 K/W}
`

func linearModel(t *testing.T, set []network.Override) *Model {
	t.Helper()
	return modelFrom(t, linear, set)
}

func modelFrom(t *testing.T, text string, set []network.Override) *Model {
	t.Helper()
	m := &Model{File: "linear.yaml", Data: []byte(text), Set: set}
	_, err := network.ParseWith(m.File, m.Data, set)
	require.NoError(t, err)
	return m
}
