package viz

import (
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// Hand-solved networks: lumped resistances only, so every number below
// follows from Ohm's law for heat (ΔT = q·R) and Kirchhoff's laws.

func TestBreakdownSeries(t *testing.T) {
	// 10 W through 2 K/W then 3 K/W: 50 K above 20 °C ambient, one path
	// of 5 K/W; the 3 K/W link drops 30 K (60 % of the rise), the
	// 2 K/W link 20 K.
	sol, _ := solveText(t, "series.yaml", `
ambient: {temperature: 20 degC}
nodes:
  - {id: chip, power: 10 W, limit: 100 degC}
  - {id: plate}
links:
  - {id: pad, kind: lumped, from: chip, to: plate, resistance: 2 K/W}
  - {id: skin, kind: lumped, from: plate, to: ambient, resistance: 3 K/W}
`)
	b := NewBreakdown(sol)
	require.Len(t, b.Sources, 1)
	s := b.Sources[0]
	assert.Equal(t, "chip", s.Node)
	require.Len(t, s.Sinks, 1)
	assert.Equal(t, "ambient", s.Sinks[0].Sink)
	assert.InDelta(t, 1, s.Sinks[0].Share, 1e-12)
	require.Len(t, s.Paths, 1)
	p := s.Paths[0]
	assert.Equal(t, []string{"chip", "plate", "ambient"}, p.Nodes)
	assert.Equal(t, []string{"pad", "skin"}, p.Links)
	assert.InDelta(t, 10, p.Heat, 1e-9)
	assert.InDelta(t, 50, p.DeltaT, 1e-9)
	assert.InDelta(t, 5, p.Resistance, 1e-9)
	require.Len(t, s.Drops, 2)
	assert.Equal(t, "skin", s.Drops[0].Links)
	assert.InDelta(t, 30, s.Drops[0].DeltaT, 1e-9)
	assert.InDelta(t, 0.6, s.Drops[0].Share, 1e-9)
	assert.Equal(t, "pad", s.Drops[1].Links)
	assert.InDelta(t, 20, s.Drops[1].DeltaT, 1e-9)
}

func TestBreakdownParallelSplit(t *testing.T) {
	// 7 W/K to ambient and 3 W/K to a rack at the same temperature: 70 %
	// and 30 %, paths of 1/7 and 1/3 K/W, 1 K above ambient.
	sol, _ := solveText(t, "parallel.yaml", `
ambient: {temperature: 20 degC}
nodes:
  - {id: chip, power: 10 W}
  - {id: rack, kind: fixed, temperature: 20 degC}
links:
  - {id: a, kind: lumped, from: chip, to: ambient, conductance: 7 W/K}
  - {id: b, kind: lumped, from: chip, to: rack, conductance: 3 W/K}
`)
	s := NewBreakdown(sol).Source("chip")
	require.NotNil(t, s)
	require.Len(t, s.Sinks, 2)
	assert.Equal(t, "ambient", s.Sinks[0].Sink)
	assert.InDelta(t, 0.7, s.Sinks[0].Share, 1e-12)
	assert.Equal(t, "rack", s.Sinks[1].Sink)
	assert.InDelta(t, 0.3, s.Sinks[1].Share, 1e-12)
	require.Len(t, s.Paths, 2)
	assert.InDelta(t, 7, s.Paths[0].Heat, 1e-9)
	assert.InDelta(t, 1.0/7, s.Paths[0].Resistance, 1e-9)
	assert.InDelta(t, 1.0/3, s.Paths[1].Resistance, 1e-9)
	assert.Nil(t, s.Drops, "no limit, no ranking")
}

func TestBreakdownJunctionTwoPaths(t *testing.T) {
	// 5 W at a junction: 1 K/W to the lid and 2 K/W on to ambient (3 K/W
	// in all), 4 K/W to the board and 3 K/W on (7 K/W). The split is
	// 7/10 and 3/10: 3.5 W and 1.5 W; the junction sits 10.5 K above
	// ambient. Drops: lid→ambient 7 K, junction→board 6 K, board→ambient
	// 4.5 K, junction→lid 3.5 K.
	sol, _ := solveText(t, "junction.yaml", `
ambient: {temperature: 25 degC}
nodes:
  - {id: lid}
  - {id: board}
components:
  - {id: cpu, power: 5 W, r_jc: 1 K/W, case: lid, r_jb: 4 K/W, board: board, limit: 90 degC}
links:
  - {id: lid-air, kind: lumped, from: lid, to: ambient, resistance: 2 K/W}
  - {id: board-air, kind: lumped, from: board, to: ambient, resistance: 3 K/W}
`)
	s := NewBreakdown(sol).Source("cpu")
	require.NotNil(t, s)
	assert.InDelta(t, 10.5, s.Rise, 1e-9)
	require.Len(t, s.Paths, 2)
	assert.Equal(t, []string{"cpu", "lid", "ambient"}, s.Paths[0].Nodes)
	assert.InDelta(t, 3.5, s.Paths[0].Heat, 1e-9)
	assert.InDelta(t, 3, s.Paths[0].Resistance, 1e-9)
	assert.InDelta(t, 1.5, s.Paths[1].Heat, 1e-9)
	assert.InDelta(t, 7, s.Paths[1].Resistance, 1e-9)
	want := []struct {
		links string
		dt    float64
	}{{"lid-air", 7}, {"cpu.jb", 6}, {"board-air", 4.5}, {"cpu.jc", 3.5}}
	require.Len(t, s.Drops, len(want))
	for i, w := range want {
		assert.Equal(t, w.links, s.Drops[i].Links)
		assert.InDelta(t, w.dt, s.Drops[i].DeltaT, 1e-9)
		assert.InDelta(t, w.dt/10.5, s.Drops[i].Share, 1e-9)
	}
}

func TestBreakdownProportionalAtSharedNode(t *testing.T) {
	// 6 W and 4 W meet in a plate that gives half to ambient and half to
	// a rack at the same temperature (equal resistances): each source
	// splits 50/50, whatever its size.
	sol, _ := solveText(t, "shared.yaml", `
ambient: {temperature: 20 degC}
nodes:
  - {id: a, power: 6 W}
  - {id: b, power: 4 W}
  - {id: plate}
  - {id: rack, kind: fixed, temperature: 20 degC}
links:
  - {kind: lumped, from: a, to: plate, resistance: 1 K/W}
  - {kind: lumped, from: b, to: plate, resistance: 1 K/W}
  - {kind: lumped, from: plate, to: ambient, resistance: 2 K/W}
  - {kind: lumped, from: plate, to: rack, resistance: 2 K/W}
`)
	for _, id := range []string{"a", "b"} {
		s := NewBreakdown(sol).Source(id)
		require.NotNil(t, s)
		require.Len(t, s.Sinks, 2)
		assert.InDelta(t, 0.5, s.Sinks[0].Share, 1e-9, id)
		assert.InDelta(t, 0.5, s.Sinks[1].Share, 1e-9, id)
	}
}

// Energy conservation of the decomposition on every example: each
// source's shares add up to 1, and over all sources the heat arriving in
// each sink is what the energy balance says leaves through it.
func TestBreakdownConservesEnergy(t *testing.T) {
	files, err := filepath.Glob("../examples/*.yaml")
	require.NoError(t, err)
	require.NotEmpty(t, files)
	airSeen := false
	for _, f := range files {
		data, err := os.ReadFile(f)
		require.NoError(t, err)
		sol, _ := solveText(t, f, string(data))
		b := NewBreakdown(sol)
		require.NotEmpty(t, b.Sources, f)
		perSink := map[string]float64{}
		for _, s := range b.Sources {
			sum := 0.0
			for _, k := range s.Sinks {
				sum += k.Share
				perSink[k.Sink] += k.Heat
				airSeen = airSeen || k.Air
			}
			assert.InDelta(t, 1, sum, 1e-6, "%s: shares of %s", f, s.Node)
			placed := 0.0
			for _, p := range s.Paths {
				placed += p.Share
				assert.Greater(t, p.Heat, 0.0)
			}
			assert.LessOrEqual(t, placed, 1+1e-9, "%s: %s", f, s.Node)
		}
		for _, o := range sol.Balance.Out {
			if o.Heat > 0 {
				assert.InDelta(t, o.Heat, perSink[o.Node], 1e-6*sol.Balance.In+1e-9, "%s: heat into %s", f, o.Node)
			}
		}
	}
	assert.True(t, airSeen, "some example carries heat out in moving air")
}

// BenchmarkBreakdown decomposes the heat of chains of 100 and 400 nodes,
// one source at the end, and of a row of 100 sources side by side.
func BenchmarkBreakdown(b *testing.B) {
	for _, n := range []int{100, 400} {
		b.Run(fmt.Sprintf("chain-%d", n), func(b *testing.B) {
			sol := solveChain(b, n)
			for b.Loop() {
				NewBreakdown(sol)
			}
		})
	}
	b.Run("sources-100", func(b *testing.B) {
		var m strings.Builder
		m.WriteString("ambient: {temperature: 25 degC}\nnodes:\n  - {id: plate}\n")
		for i := range 100 {
			fmt.Fprintf(&m, "  - {id: s%d, power: 0.5 W, limit: 100 degC}\n", i)
		}
		m.WriteString("links:\n  - {kind: lumped, from: plate, to: ambient, resistance: 0.1 K/W}\n")
		for i := range 100 {
			fmt.Fprintf(&m, "  - {kind: lumped, from: s%d, to: plate, resistance: %d K/W}\n", i, 1+i%7)
		}
		sol, _ := solveText(b, "row.yaml", m.String())
		for b.Loop() {
			NewBreakdown(sol)
		}
	})
}
