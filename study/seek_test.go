package study

import (
	"math"
	"testing"

	"github.com/heatgraph/heatgraph/network"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// The linear network of linearModel by hand: T = Ta + P·R with P = 10 W,
// R = 3 K/W, limit 100 degC and a required margin of 5 K, so every limit
// holds with its margin up to Ta = 100 − 5 − 30 = 65 degC, up to
// P = (95 − 40)/3 = 18.333 W, and down to R = 55/10 = 5.5 K/W; with a
// conductance instead, from G = 10/55 W/K up (more is better).
func TestSeekLinearByHand(t *testing.T) {
	m := linearModel(t, nil)
	for _, c := range []struct {
		path      string
		from, to  float64
		tol, want float64
		highest   bool
	}{
		{"ambient.temperature", 273.15 + 20, 273.15 + 80, 1e-3, 273.15 + 65, true},
		{"ambient.temperature", 273.15 + 80, 273.15 + 20, 1e-6, 273.15 + 65, true},
		{"nodes.chip.power", 1, 50, 1e-6, 55.0 / 3, true},
		{"links.chip--ambient.resistance", 0.1, 10, 1e-9, 5.5, true},
		{"links.chip--ambient.conductance", 0.01, 10, 1e-9, 10.0 / 55, false},
	} {
		r, err := m.Seek(c.path, c.from, c.to, c.tol)
		require.NoError(t, err, c.path)
		assert.Equal(t, Bounded, r.Outcome)
		assert.Equal(t, c.highest, r.Highest, c.path)
		assert.Equal(t, "chip", r.Limiting)
		assert.LessOrEqual(t, r.Tolerance, c.tol, c.path)
		// The boundary lies between Value (holds) and Other (fails).
		assert.LessOrEqual(t, math.Min(r.Value, r.Other), c.want+1e-9*c.want, c.path)
		assert.GreaterOrEqual(t, math.Max(r.Value, r.Other), c.want-1e-9*c.want, c.path)
		assert.GreaterOrEqual(t, r.Slack, 0.0)
		assert.Less(t, r.Solves, 30, c.path)
	}
	r, err := m.Seek("ambient.temperature", 273.15, 273.15+60, 1e-3)
	require.NoError(t, err)
	assert.Equal(t, Holds, r.Outcome)
	assert.InDelta(t, 5, r.Slack, 1e-6) // at 60 degC: 100 − 90 − 5
	r, err = m.Seek("ambient.temperature", 273.15+70, 273.15+80, 1e-3)
	require.NoError(t, err)
	assert.Equal(t, Fails, r.Outcome)
	_, err = m.Seek("links.chip--ambient.kind", 1, 2, 1e-3)
	assert.ErrorContains(t, err, "names no numeric value")
}

// Brent's method and plain bisection agree on a nonlinear model: the
// highest ambient of the outdoor controller at 3000 m.
func TestSeekAgreesWithBisection(t *testing.T) {
	m, err := Open("../examples/outdoor-controller.yaml", []network.Override{{Path: "ambient.altitude", Value: "3000m"}})
	require.NoError(t, err)
	const tol = 1e-4
	lo, hi := 273.15+20, 273.15+90
	r, err := m.Seek("ambient.temperature", lo, hi, tol)
	require.NoError(t, err)
	require.Equal(t, Bounded, r.Outcome)
	q, err := m.Parameter("ambient.temperature")
	require.NoError(t, err)
	slack := func(v float64) float64 {
		pt, err := m.Solve(q.Overrides(v)...)
		require.NoError(t, err)
		s, _, err := pt.Slack()
		require.NoError(t, err)
		return s
	}
	require.GreaterOrEqual(t, slack(lo), 0.0)
	require.Less(t, slack(hi), 0.0)
	bisections := 0
	for hi-lo > tol {
		mid := (lo + hi) / 2
		if slack(mid) >= 0 {
			lo = mid
		} else {
			hi = mid
		}
		bisections++
	}
	assert.InDelta(t, lo, r.Value, 2*tol)
	assert.True(t, r.Highest)
	t.Logf("highest ambient %.4f degC (%s limits), Brent %d solves, bisection %d", r.Value-273.15, r.Limiting, r.Solves, bisections+2)
}
