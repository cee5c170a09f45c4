package root

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"errors"
	"image/png"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/spf13/cobra"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

const examples = "../../../../examples/"

// run executes heatgraph with args on test streams.
func run(args ...string) (code int, stdout, stderr string) {
	ios, _, out, errOut := iostreams.Test()
	code = Main(args, ios)
	return code, out.String(), errOut.String()
}

// writeModel writes a model file into a test folder and returns its path.
func writeModel(t *testing.T, text string) string {
	t.Helper()
	path := filepath.Join(t.TempDir(), "model.yaml")
	require.NoError(t, os.WriteFile(path, []byte(text), 0o644))
	return path
}

const overLimit = `
ambient: {temperature: 40 degC}
nodes:
  - {id: chip, power: 10 W, limit: 60 degC}
links:
  - {kind: lumped, from: chip, to: ambient, resistance: 3 K/W}
`

// Heat cannot be pulled out of a node that only radiates to warmer
// surroundings at this rate: σT⁴ would have to be negative.
const noSolution = `
ambient: {temperature: 300 K}
nodes:
  - {id: cooler, power: -1000 W}
links:
  - {kind: radiation, from: cooler, emissivity: 1, area: 1 cm2}
`

func TestSolveExamples(t *testing.T) {
	files, err := filepath.Glob(examples + "*.yaml")
	require.NoError(t, err)
	require.GreaterOrEqual(t, len(files), 2)
	for _, f := range files {
		code, out, stderr := run("solve", f)
		assert.Equal(t, exit.OK, code, "%s: %s", f, stderr)
		assert.Contains(t, out, "energy balance [W]", f)
		assert.Contains(t, out, "limits hold", f)
		assert.Contains(t, out, "Confirm them by measurement", f)
	}
}

func TestSolveJSON(t *testing.T) {
	code, out, stderr := run("solve", examples+"outdoor-controller.yaml", "--format", "json")
	require.Equal(t, exit.OK, code, stderr)
	var doc struct {
		Units  map[string]string `json:"units"`
		Solver struct {
			Converged bool `json:"converged"`
		} `json:"solver"`
		Nodes []struct {
			ID           string   `json:"id"`
			TemperatureC *float64 `json:"temperature_degC"`
			MarginK      *float64 `json:"margin_K"`
		} `json:"nodes"`
		Links []struct {
			ID    string   `json:"id"`
			From  string   `json:"from"`
			To    string   `json:"to"`
			HeatW *float64 `json:"heat_W"`
		} `json:"links"`
		Balance struct {
			InW        float64 `json:"heat_in_W"`
			ImbalanceW float64 `json:"imbalance_W"`
			Out        []struct {
				Node  string  `json:"node"`
				HeatW float64 `json:"heat_W"`
			} `json:"heat_out"`
		} `json:"energy_balance"`
		Caution string `json:"caution"`
	}
	require.NoError(t, json.Unmarshal([]byte(out), &doc))
	assert.True(t, doc.Solver.Converged)
	assert.Equal(t, "W", doc.Units["heat"])
	require.NotEmpty(t, doc.Nodes)
	for _, n := range doc.Nodes {
		assert.NotEmpty(t, n.ID)
		assert.NotNil(t, n.TemperatureC, n.ID)
	}
	for _, l := range doc.Links {
		assert.NotEmpty(t, l.From)
		assert.NotEmpty(t, l.To)
		assert.NotNil(t, l.HeatW, l.ID)
	}
	// 5.5 + 3.2 + 1.8 + 2 W go in; all of it leaves through ambient and
	// the pole.
	assert.InDelta(t, 12.5, doc.Balance.InW, 1e-12)
	sum := 0.0
	for _, o := range doc.Balance.Out {
		sum += o.HeatW
	}
	assert.InDelta(t, 12.5, sum, 1e-9)
	assert.Less(t, abs(doc.Balance.ImbalanceW), 1e-9)
	assert.Contains(t, doc.Caution, "estimates")
	// Full precision: a temperature is printed with more digits than the
	// text report's two decimals.
	assert.Regexp(t, `"temperature_degC": -?\d+\.\d{6,}`, out)
}

func TestSolveCSV(t *testing.T) {
	code, out, _ := run("solve", examples+"bench-logger.yaml", "-f", "csv")
	require.Equal(t, exit.OK, code)
	rows, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	require.NoError(t, err)
	assert.Equal(t, []string{"record", "id", "kind", "from", "to", "temperature_degC", "limit_degC", "margin_K", "status", "power_W", "heat_W"}, rows[0])
	kinds := map[string]int{}
	for _, r := range rows[1:] {
		kinds[r[0]]++
	}
	assert.Positive(t, kinds["node"])
	assert.Positive(t, kinds["link"])
	assert.Positive(t, kinds["boundary"])
}

func TestSolveOverLimit(t *testing.T) {
	code, out, _ := run("solve", writeModel(t, overLimit))
	assert.Equal(t, exit.LimitExceeded, code)
	assert.Contains(t, out, "OVER LIMIT: chip (-10.00 K)")
	code, out, _ = run("solve", writeModel(t, overLimit), "--format", "json")
	assert.Equal(t, exit.LimitExceeded, code)
	assert.Contains(t, out, `"limits_exceeded": [`)
}

func TestSolveNoSolution(t *testing.T) {
	path := writeModel(t, noSolution)
	code, out, stderr := run("solve", path)
	assert.Equal(t, exit.NotConverged, code)
	assert.Empty(t, out, "no result may be printed when there is no solution")
	assert.Contains(t, stderr, "no solution")
	code, out, _ = run("solve", path, "--format", "json")
	assert.Equal(t, exit.NotConverged, code)
	assert.Contains(t, out, `"converged": false`)
	assert.NotContains(t, out, `"nodes"`)
}

func TestSolveInvalid(t *testing.T) {
	code, out, stderr := run("solve", "../../../../testdata/invalid/unknown-nodes.yaml")
	assert.Equal(t, exit.BadInput, code)
	assert.Empty(t, out)
	assert.Contains(t, stderr, `unknown-nodes.yaml:9: links[pad].from: unknown node "cpu-lidd" (did you mean "cpu-lid"?)`)
	assert.Contains(t, stderr, "3 problems found")
	assert.NotContains(t, stderr, "goroutine", "no stack traces")
}

func TestBadCommandLines(t *testing.T) {
	for _, args := range [][]string{
		{"solve"},
		{"solve", "a.yaml", "b.yaml"},
		{"solve", examples + "bench-logger.yaml", "--format", "xml"},
		{"solve", examples + "bench-logger.yaml", "--sort", "size"},
		{"solve", examples + "bench-logger.yaml", "--no-such-flag"},
		{"frobnicate"},
		{"graph", examples + "bench-logger.yaml"},
		{"graph", examples + "bench-logger.yaml", "-o", "out.pdf"},
		{"graph", examples + "bench-logger.yaml", "-o", "out.svg", "--colour", "rainbow"},
		{"solve", "no-such-file.yaml"},
	} {
		code, _, stderr := run(args...)
		assert.Equal(t, exit.BadInput, code, "%v: %s", args, stderr)
		assert.NotEmpty(t, stderr, args)
	}
}

func TestSolveOutputFile(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "result.json")
	code, out, _ := run("solve", examples+"bench-logger.yaml", "-f", "json", "-o", path)
	require.Equal(t, exit.OK, code)
	assert.Empty(t, out)
	data, err := os.ReadFile(path)
	require.NoError(t, err)
	assert.True(t, json.Valid(data))
	code, _, stderr := run("solve", examples+"bench-logger.yaml", "-o", filepath.Join(dir, "missing", "r.txt"))
	assert.Equal(t, exit.OutputFailed, code, stderr)
}

func TestCheck(t *testing.T) {
	code, out, _ := run("check", examples+"outdoor-controller.yaml")
	assert.Equal(t, exit.OK, code)
	assert.Contains(t, out, "valid: 12 nodes (2 fixed), 10 unknowns, 3 components, 19 links")
	code, _, stderr := run("check", "../../../../testdata/invalid/isolated.yaml")
	assert.Equal(t, exit.BadInput, code)
	assert.Contains(t, stderr, `nodes "shield", "can" have no path to any fixed temperature`)
}

func TestGraph(t *testing.T) {
	dir := t.TempDir()
	for _, name := range []string{"g.dot", "g.svg", "g.png"} {
		path := filepath.Join(dir, name)
		code, _, stderr := run("graph", examples+"outdoor-controller.yaml", "-o", path, "--colour", "temperature")
		require.Equal(t, exit.OK, code, stderr)
		data, err := os.ReadFile(path)
		require.NoError(t, err)
		switch filepath.Ext(name) {
		case ".dot":
			assert.Contains(t, string(data), `"cpu-pad"->"lid"`)
		case ".svg":
			assert.Contains(t, string(data), "<svg")
			assert.Contains(t, string(data), "cpu&#45;pad")
		case ".png":
			img, err := png.Decode(bytes.NewReader(data))
			require.NoError(t, err)
			assert.Greater(t, img.Bounds().Dx(), 500)
		}
	}
	entries, _ := os.ReadDir(dir)
	assert.Len(t, entries, 3, "no temporary files may be left behind")
}

// A failed solve must not touch an existing diagram.
func TestGraphKeepsGoodFileOnFailure(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "good.dot")
	require.NoError(t, os.WriteFile(path, []byte("digraph good {}\n"), 0o644))
	code, _, _ := run("graph", writeModel(t, noSolution), "-o", path)
	assert.Equal(t, exit.NotConverged, code)
	data, _ := os.ReadFile(path)
	assert.Equal(t, "digraph good {}\n", string(data))
	code, _, _ = run("graph", "../../../../testdata/invalid/geometry.yaml", "-o", path)
	assert.Equal(t, exit.BadInput, code)
	data, _ = os.ReadFile(path)
	assert.Equal(t, "digraph good {}\n", string(data))
}

func TestListings(t *testing.T) {
	code, out, _ := run("materials")
	assert.Equal(t, exit.OK, code)
	assert.Contains(t, out, "fr4-through-plane")
	assert.Contains(t, out, "Sarvar")
	code, out, _ = run("kinds")
	assert.Equal(t, exit.OK, code)
	for _, k := range []string{"conduction", "contact", "lumped", "convection", "radiation"} {
		assert.Contains(t, out, k)
	}
	code, out, _ = run("--version")
	assert.Equal(t, exit.OK, code)
	assert.Contains(t, out, Version)
}

func TestMonitor(t *testing.T) {
	code, _, stderr := run("solve", examples+"bench-logger.yaml", "--monitor")
	assert.Equal(t, exit.OK, code)
	assert.Contains(t, stderr, "newton   1:")
}

func abs(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}

// -o naming the model itself is a command-line mistake: exit 2, the model
// untouched, and no usage hint.
func TestOutputOverInputRefused(t *testing.T) {
	path := writeModel(t, overLimit)
	for _, args := range [][]string{
		{"solve", path, "-o", path},
		{"solve", path, "-o", filepath.Join(filepath.Dir(path), ".", filepath.Base(path))},
		{"graph", path, "-o", path + ".dot"},
	} {
		if args[0] == "graph" {
			require.NoError(t, os.Symlink(path, args[3]))
		}
		code, _, stderr := run(args...)
		assert.Equal(t, exit.BadInput, code, "%v: %s", args, stderr)
		assert.Contains(t, stderr, "refusing to write over the input file")
		assert.NotContains(t, stderr, "--help")
		data, err := os.ReadFile(path)
		require.NoError(t, err)
		assert.Equal(t, overLimit, string(data))
	}
}

// A layout that runs out of time stops with a message that names the
// diagram's size and what to do, exit status 4, and no file.
func TestGraphLayoutTimeout(t *testing.T) {
	path := filepath.Join(t.TempDir(), "g.svg")
	code, _, stderr := run("graph", examples+"outdoor-controller.yaml", "-o", path, "--layout-timeout", "1ns")
	assert.Equal(t, exit.OutputFailed, code, stderr)
	assert.Contains(t, stderr, "the diagram of 12 nodes and 19 links was not laid out within 1ns")
	assert.Contains(t, stderr, "draw fewer nodes")
	assert.NotContains(t, stderr, "--help for usage")
	assert.NoFileExists(t, path)
}

// A conductance too small for its reciprocal to be finite (its resistance
// would be infinite) is refused where it is written, with the range a
// model takes, exit status 2 and no usage hint. (Before, the JSON encoder
// failed on the infinite resistance; viz's TestNonFiniteNumbers checks
// that no report writes a non-finite number as one.)
const denormal = `
ambient: {temperature: 25 degC}
nodes:
  - {id: chip, power: 1 W, limit: 90 degC}
  - {id: lid}
links:
  - {id: weak, kind: lumped, from: chip, to: lid, conductance: 1e-320 W/K}
  - {id: main, kind: lumped, from: chip, to: ambient, resistance: 10 K/W}
  - {id: skin, kind: convection, from: lid, coefficient: 5 W/m2/K, area: 0.01 m2}
`

func TestNonFiniteDetails(t *testing.T) {
	path := writeModel(t, denormal)
	code, out, stderr := run("solve", path, "-f", "json")
	require.Equal(t, exit.BadInput, code, stderr)
	assert.Empty(t, out)
	assert.Contains(t, stderr, `links[weak].conductance: "1e-320 W/K" is outside the range`)
	assert.NotContains(t, stderr, "--help")
}

// An error that reaches Main without an exit code is a bug: exit status 4,
// a request to report it, and no usage hint.
func TestUncodedErrorIsInternal(t *testing.T) {
	ios, _, _, errOut := iostreams.Test()
	cmd := NewCmd(ios)
	for _, sub := range cmd.Commands() {
		if sub.Name() == "materials" {
			sub.Run, sub.RunE = nil, func(*cobra.Command, []string) error { return errors.New("json: unsupported value: +Inf") }
			classify(sub)
		}
	}
	cmd.SetArgs([]string{"materials"})
	err := cmd.Execute()
	var ee *exit.Error
	require.ErrorAs(t, err, &ee)
	assert.Equal(t, exit.Internal, ee.Code)
	assert.Contains(t, err.Error(), "please report it")
	assert.Empty(t, errOut.String())
}

// A panic ends with exit status 4 and one line that says what happened,
// then the request to report it.
func TestPanicIsInternal(t *testing.T) {
	ios, _, _, errOut := iostreams.Test()
	code := guard(ios, func() int { panic("index out of range\nsecond line") })
	assert.Equal(t, 4, code)
	lines := strings.Split(strings.TrimSpace(errOut.String()), "\n")
	require.Len(t, lines, 2, errOut.String())
	assert.Equal(t, "heatgraph: internal error: index out of range second line", lines[0])
	assert.Contains(t, lines[1], "please report it")
	assert.NotContains(t, errOut.String(), "--help")
}

// Only command-line mistakes get the usage hint; a solve without a
// solution and a failed write do not.
func TestUsageHintOnlyForCommandLine(t *testing.T) {
	code, _, stderr := run("solve", writeModel(t, noSolution))
	assert.Equal(t, exit.NotConverged, code)
	assert.NotContains(t, stderr, "--help")
	code, _, stderr = run("solve", examples+"bench-logger.yaml", "-o", filepath.Join(t.TempDir(), "missing", "r.txt"))
	assert.Equal(t, exit.OutputFailed, code)
	assert.NotContains(t, stderr, "--help")
	code, _, stderr = run("solve", examples+"bench-logger.yaml", "--no-such-flag")
	assert.Equal(t, exit.BadInput, code)
	assert.Contains(t, stderr, "--help")
}

// A heat input that takes more heat out of a node than its links can bring
// has no physical solution: the solve says so and why, exit status 3, with
// no result and no usage hint.
func TestNegativePowerBelowAbsoluteZero(t *testing.T) {
	path := writeModel(t, `
ambient: {temperature: 25 degC}
nodes:
  - {id: cooler, power: -50 W, limit: 60 degC}
links:
  - {kind: lumped, from: cooler, to: ambient, conductance: 0.1 W/K}
`)
	code, out, stderr := run("solve", path)
	assert.Equal(t, exit.NotConverged, code, stderr)
	assert.Empty(t, out)
	assert.Contains(t, stderr, "every step left the physical domain")
	assert.Contains(t, stderr, `node "cooler" would be at`)
	assert.Contains(t, stderr, "below absolute zero")
	assert.NotContains(t, stderr, "--help")
}
