package benchcmd

import (
	"math"
	"testing"

	"github.com/heatgraph/heatgraph/network"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestCaseMeshes(t *testing.T) {
	for _, c := range []struct {
		shape      string
		size       float64
		nx, ny, nz int
	}{
		{"board", 1e3, 31, 32, 1},
		{"board", 1e4, 100, 100, 1},
		{"board", 1e6, 1000, 1000, 1},
		{"board", 1, 1, 1, 1},
		{"block", 1e3, 10, 10, 10},
		{"block", 1e4, 21, 23, 21},
		{"block", 1e6, 100, 100, 100},
		{"block", 1, 1, 1, 1},
	} {
		got, err := NewCase(c.shape, c.size, "x")
		require.NoError(t, err)
		assert.Equal(t, [3]int{c.nx, c.ny, c.nz}, [3]int{got.NX, got.NY, got.NZ}, "%s %g", c.shape, c.size)
	}
	// Every size from 1000 up meshes into about its number of cells: a board
	// or a duct's base within 2 %, a block, whose cells come in near-cubes,
	// within 5 %.
	for _, shape := range Shapes {
		for size := 1000.0; size <= 2e7; size *= 1.37 {
			size = math.Round(size)
			c, err := NewCase(shape, size, "x")
			require.NoError(t, err)
			tol := map[string]float64{"board": 0.02, "duct": 0.02, "block": 0.05}[shape]
			assert.InDelta(t, 1, float64(c.Cells())/size, tol, "%s %g: %d × %d × %d", shape, size, c.NX, c.NY, c.NZ)
		}
	}
	_, err := NewCase("sphere", 1e3, "1e3")
	assert.ErrorContains(t, err, `"sphere" is not a shape`)
}

func TestParseSize(t *testing.T) {
	for s, want := range map[string]float64{"1e3": 1e3, " 250000": 2.5e5, "2.5e4": 2.5e4, "1": 1} {
		got, err := ParseSize(s)
		require.NoError(t, err, s)
		assert.Equal(t, want, got)
	}
	for _, s := range []string{"", "0", "-5", "1.5", "1e10", "NaN", "Inf", "10k"} {
		_, err := ParseSize(s)
		assert.Error(t, err, s)
	}
}

// The generated models are valid: they parse, with the mesh of their
// case, and build into a network whose unknowns are the cells and the
// nodes that are not cells (the board's five junctions and its heat sink,
// the block's one junction, the duct's two fin roots, two air nodes and
// two junctions).
func TestModelsBuild(t *testing.T) {
	others := map[string]int{"board": 6, "block": 1, "duct": 6}
	for _, shape := range Shapes {
		for _, size := range []float64{8, 1e3, 1e4} {
			c, err := NewCase(shape, size, "n")
			require.NoError(t, err)
			m, err := network.Parse(c.Name()+".yaml", c.Model())
			require.NoError(t, err, "%s", c.Model())
			require.Len(t, m.Plates, 1)
			p := m.Plates[0]
			through := 0
			for _, l := range p.Layers {
				through += l.Cells
			}
			assert.Equal(t, [3]int{c.NX, c.NY, c.NZ}, [3]int{p.NX, p.NY, through}, c.Name())
			net, err := network.Build(m)
			require.NoError(t, err, "%s", c.Model())
			assert.Equal(t, c.Cells()+others[shape], net.Unknowns(), c.Name())
		}
	}
}
