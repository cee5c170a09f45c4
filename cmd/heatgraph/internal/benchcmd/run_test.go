package benchcmd_test

import (
	"encoding/json"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/benchcmd"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/root"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// The test binary doubles as heatgraph: started with
// HEATGRAPH_BENCH_AS_MAIN=1 it runs the command line with its own
// arguments, so that the bench can solve its models in processes of their
// own without building heatgraph first.
func TestMain(m *testing.M) {
	if os.Getenv("HEATGRAPH_BENCH_HOG") == "1" {
		// Stand in for a solve that keeps taking memory.
		var held [][]byte
		for {
			b := make([]byte, 16<<20)
			for i := range b {
				b[i] = 1
			}
			held = append(held, b)
			time.Sleep(10 * time.Millisecond)
		}
	}
	if os.Getenv("HEATGRAPH_BENCH_AS_MAIN") == "1" {
		os.Exit(root.Main(os.Args[1:], iostreams.System()))
	}
	os.Exit(m.Run())
}

// The whole bench on the smallest board, block and duct: every model is solved
// by a heatgraph process, converges, and closes its energy balance; the
// table has a row for each with every column filled in but the targets.
func TestBenchSolvesSmallModels(t *testing.T) {
	t.Setenv("HEATGRAPH_BENCH_AS_MAIN", "1")
	ios, _, out, errOut := iostreams.Test()
	kept := t.TempDir()
	err := benchcmd.Run(&benchcmd.Options{IO: ios, Sizes: []string{"1e3", "2e2"}, Shapes: benchcmd.Shapes, Repeat: 2, Binary: os.Args[0], Keep: kept})
	require.NoError(t, err, "%s\n%s", out, errOut)
	lines := strings.Split(out.String(), "\n")
	assert.Equal(t, benchcmd.Columns, regexp.MustCompile(`\s{2,}`).Split(strings.TrimSpace(lines[0]), -1))
	want := map[string]int{"board 1e3": 992, "board 2e2": 196, "block 1e3": 1000, "block 2e2": 0, "duct 1e3": 992, "duct 2e2": 196}
	for i, name := range []string{"board 1e3", "board 2e2", "block 1e3", "block 2e2", "duct 1e3", "duct 2e2"} {
		f := strings.Fields(lines[1+i])
		require.Len(t, f, 9, lines[1+i]) // no target: "-" and "-"
		assert.Equal(t, strings.Fields(name)[0], f[0])
		cells, err := strconv.Atoi(f[1])
		require.NoError(t, err)
		if want[name] > 0 {
			assert.Equal(t, want[name], cells, name)
		}
		unknowns, err := strconv.Atoi(f[2])
		require.NoError(t, err)
		assert.Greater(t, unknowns, cells, "%s: every cell and every junction is an unknown", name)
		for _, v := range f[3:6] {
			x, err := strconv.ParseFloat(v, 64)
			require.NoError(t, err, lines[1+i])
			assert.Positive(t, x, "%s: time, memory and Newton iterations", name)
		}
		assert.Equal(t, []string{"-", "-"}, f[7:], lines[1+i])
	}
	assert.NotContains(t, out.String(), "FAILED")

	// Every part keeps within its limit, and all the heat the models put
	// in (the sum of their powers) comes out at the ambient.
	for name, in := range map[string]float64{"board-1e3": 13.7, "board-2e2": 13.7, "block-1e3": 20.5, "block-2e2": 20.5, "duct-1e3": 120, "duct-2e2": 120} {
		data, err := os.ReadFile(filepath.Join(kept, name+".json"))
		require.NoError(t, err)
		var r struct {
			Exceeded []string `json:"limits_exceeded"`
			Balance  struct {
				In  float64 `json:"heat_in_W"`
				Out []struct {
					Node string  `json:"node"`
					Heat float64 `json:"heat_W"`
				} `json:"heat_out"`
			} `json:"energy_balance"`
		}
		require.NoError(t, json.Unmarshal(data, &r))
		assert.Empty(t, r.Exceeded, name)
		assert.InDelta(t, in, r.Balance.In, 1e-9, name)
		require.Len(t, r.Balance.Out, 1, name)
		assert.Equal(t, "ambient", r.Balance.Out[0].Node)
		assert.InDelta(t, in, r.Balance.Out[0].Heat, 1e-6*in, name)
	}
	assert.Equal(t, 12, strings.Count(errOut.String(), " of 2: "), "two runs of each of six cases\n%s", errOut)
}

// A solve that keeps taking memory is stopped at --max-memory, and its
// case fails with exit status 3.
func TestMaxMemoryStopsASolve(t *testing.T) {
	if !benchcmd.CanWatchMemory {
		t.Skip("this system's solves are not watched")
	}
	t.Setenv("HEATGRAPH_BENCH_HOG", "1")
	ios, _, out, errOut := iostreams.Test()
	err := benchcmd.Run(&benchcmd.Options{IO: ios, Sizes: []string{"1e3"}, Shapes: []string{"board"}, Repeat: 1, Binary: os.Args[0], MaxMemoryMB: 150})
	assert.Equal(t, exit.Silent(exit.NotConverged), err, "%s\n%s", out, errOut)
	assert.Contains(t, out.String(), "FAILED board-1e3 (992 cells): stopped: it held more than 150 MB (--max-memory)")
	f := strings.Fields(strings.Split(out.String(), "\n")[1])
	require.Len(t, f, 9)
	peak, err := strconv.ParseFloat(f[4], 64)
	require.NoError(t, err)
	assert.GreaterOrEqual(t, peak, 150.0, "the peak is measured up to the stop (rounded to whole MB)")
}
