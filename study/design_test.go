package study

import (
	"bytes"
	"fmt"
	"testing"

	"github.com/heatgraph/heatgraph/network"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestRangeAndGrid(t *testing.T) {
	v, err := Range(20, 60, 5, 0, false)
	require.NoError(t, err)
	assert.Equal(t, []float64{20, 25, 30, 35, 40, 45, 50, 55, 60}, v)
	v, err = Range(60, 50, 4, 0, false)
	require.NoError(t, err)
	assert.Equal(t, []float64{60, 56, 52}, v)
	v, err = Range(1, 1000, 0, 4, true)
	require.NoError(t, err)
	assert.InDeltaSlice(t, []float64{1, 10, 100, 1000}, v, 1e-12)
	v, err = Range(0, 1, 0, 5, false)
	require.NoError(t, err)
	assert.Equal(t, []float64{0, 0.25, 0.5, 0.75, 1}, v)
	_, err = Range(0, 1, 0, 3, true)
	assert.Error(t, err)
	_, err = Range(0, 1, 0.1, 3, false)
	assert.Error(t, err)
	g := Grid{{Values: []float64{1, 2}}, {Values: []float64{10, 20, 30}}}
	assert.Equal(t, 6, g.Len())
	var got [][]float64
	for i := range g.Len() {
		got = append(got, g.At(i))
	}
	assert.Equal(t, [][]float64{{1, 10}, {1, 20}, {1, 30}, {2, 10}, {2, 20}, {2, 30}}, got)
}

// A sweep split into shards and merged is the sweep run at once, byte for
// byte, and so is a Monte Carlo study with its seed.
func TestShardsMergeToTheWhole(t *testing.T) {
	st, err := ReadStudy("../examples/studies/ambient-sweep.yaml", nil)
	require.NoError(t, err)
	table := func(d Design, k, n int) []byte {
		nodes, _, err := st.Model.Nodes()
		require.NoError(t, err)
		rows := st.Model.Run(d, Shard(d.Len(), k, n), IDs(nodes), nil)
		var buf bytes.Buffer
		require.NoError(t, WriteCSV(&buf, d.Params(), nodes, rows))
		return buf.Bytes()
	}
	mc := Sampling{Samples: 23, Seed: 99, Dists: []Distribution{
		{Param: mustParam(t, st.Model, "components.bridge-front.power"), Kind: "normal", Mean: 60, Sigma: 3},
		{Param: mustParam(t, st.Model, "ambient.temperature"), Kind: "triangular", Low: 290, Mode: 300, High: 320},
	}}
	for _, d := range []Design{st.Grid, mc} {
		whole := table(d, 0, 1)
		for _, n := range []int{2, 3, 7} {
			var names []string
			var parts [][]byte
			for k := n - 1; k >= 0; k-- { // in any order
				names = append(names, fmt.Sprintf("shard-%d", k))
				parts = append(parts, table(d, k, n))
			}
			merged, err := MergeCSV(names, parts, d.Len())
			require.NoError(t, err)
			assert.Equal(t, string(whole), string(merged), "%d shards", n)
			_, err = MergeCSV(names[1:], parts[1:], d.Len())
			assert.ErrorContains(t, err, "missing")
		}
	}
	_, err = MergeCSV([]string{"a", "b"}, [][]byte{[]byte("point,x\n0,1\n"), []byte("point,y\n1,1\n")}, 0)
	assert.ErrorContains(t, err, "b: its columns differ from those of a")
	_, err = MergeCSV([]string{"a", "b"}, [][]byte{[]byte("point,x\n0,1\n"), []byte("point,x\n0,2\n")}, 0)
	assert.ErrorContains(t, err, "point 0 differs between a and b")
}

func mustParam(t *testing.T, m *Model, path string) network.Parameter {
	t.Helper()
	q, err := m.Parameter(path)
	require.NoError(t, err)
	return q
}

func TestParseAxis(t *testing.T) {
	m := linearModel(t, nil)
	ax, err := m.ParseAxis("ambient.temperature=20degC:30degC:5K")
	require.NoError(t, err)
	assert.InDeltaSlice(t, []float64{293.15, 298.15, 303.15}, ax.Values, 1e-9)
	ax, err = m.ParseAxis("nodes.chip.power=1W:100W:3log")
	require.NoError(t, err)
	assert.InDeltaSlice(t, []float64{1, 10, 100}, ax.Values, 1e-12)
	ax, err = m.ParseAxis("links.chip--ambient.resistance=1K/W, 2 K/W")
	require.NoError(t, err)
	assert.Equal(t, []float64{1, 2}, ax.Values)
	_, err = m.ParseAxis("nodes.chip.power=1V,2W")
	assert.ErrorContains(t, err, `--vary nodes.chip.power: unknown unit "V"`)
	_, err = m.ParseAxis("nodes.chip.power")
	assert.ErrorContains(t, err, "expected PATH=")
}
