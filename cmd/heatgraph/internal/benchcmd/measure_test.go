package benchcmd

import (
	"errors"
	"os"
	"path/filepath"
	"runtime"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// report returns a JSON report of a solve as heatgraph writes it, with the
// fields the bench reads.
func report(converged bool, in, out, imbalance float64, linear string) string {
	lin := ""
	if linear != "" {
		lin = `"linear_iterations": ` + linear + `,`
	}
	reason := "converged"
	if !converged {
		reason = "stalled: the line search found no decrease"
	}
	return `{"heatgraph_json": 1, "solver": {"converged": ` + boolText(converged) + `, "reason": "` + reason + `", "iterations": 7, ` + lin + `
  "unknowns": [{"kind": "temperature", "count": 1000}, {"kind": "pressure", "count": 6}]},
 "energy_balance": {"heat_in_W": ` + num(in) + `, "environment_heat_W": 0, "heat_out": [{"node": "ambient", "heat_W": ` + num(out) + `}], "imbalance_W": ` + num(imbalance) + `}}`
}

func boolText(b bool) string {
	if b {
		return "true"
	}
	return "false"
}

func num(x float64) string { return strconv.FormatFloat(x, 'g', -1, 64) }

func TestReadResult(t *testing.T) {
	r, err := readResult([]byte(report(true, 14.7, 14.7, 1e-9, "")))
	require.NoError(t, err)
	assert.NoError(t, r.check())
	assert.Equal(t, 1006, r.unknowns())
	assert.Equal(t, 7, r.Solver.Iterations)
	assert.Equal(t, -1, r.linear(), "no linear_iterations in the report")

	r, err = readResult([]byte(report(true, 14.7, 14.7, 0, "42")))
	require.NoError(t, err)
	assert.Equal(t, 42, r.linear())

	// A solve without a solution says why.
	r, err = readResult([]byte(report(false, 0, 0, 0, "")))
	require.NoError(t, err)
	assert.ErrorContains(t, r.check(), "no solution after 7 Newton iterations: stalled")

	// An energy balance that does not close: 1 mW of 14.7 W is far above
	// the round-off network.Balance.MaxImbalance allows (10⁻⁶ of the heat).
	r, err = readResult([]byte(report(true, 14.7, 14.699, 1e-3, "")))
	require.NoError(t, err)
	assert.ErrorContains(t, r.check(), "energy balance does not close")

	r, err = readResult([]byte(`{"solver": {"converged": true}}`))
	require.NoError(t, err)
	assert.ErrorContains(t, r.check(), "no energy balance")

	_, err = readResult([]byte(`{"solver": `))
	assert.Error(t, err)
}

func TestMedian(t *testing.T) {
	s := time.Second
	for _, c := range []struct {
		times []time.Duration
		want  time.Duration
	}{
		{nil, 0},
		{[]time.Duration{3 * s}, 3 * s},
		{[]time.Duration{5 * s, 1 * s, 3 * s}, 3 * s},
		{[]time.Duration{4 * s, 1 * s, 2 * s, 9 * s}, 3 * s},
	} {
		m := &Measure{Times: c.times}
		assert.Equal(t, c.want, m.Median(), "%v", c.times)
	}
}

func TestCPUModel(t *testing.T) {
	path := filepath.Join(t.TempDir(), "cpuinfo")
	require.NoError(t, os.WriteFile(path, []byte("processor\t: 0\nvendor_id\t: Made Up\nmodel name\t: Made Up  CPU 9000 @ 3.00GHz\n\nprocessor\t: 1\nmodel name\t: other\n"), 0o644))
	assert.Equal(t, "Made Up CPU 9000 @ 3.00GHz", cpuModel(path))
	assert.Equal(t, "", cpuModel(filepath.Join(t.TempDir(), "none")))
}

// fakeSolver writes a shell script that stands for heatgraph: it checks
// that it was called as "solve MODEL -f json -o RESULT" with an existing
// model, writes doc to RESULT and exits with code.
func fakeSolver(t *testing.T, doc string, code int) string {
	t.Helper()
	if runtime.GOOS == "windows" {
		t.Skip("the stand-in solver is a shell script")
	}
	dir := t.TempDir()
	require.NoError(t, os.WriteFile(filepath.Join(dir, "report.json"), []byte(doc), 0o644))
	script := `#!/bin/sh
[ "$1" = solve ] && [ -f "$2" ] && [ "$3" = -f ] && [ "$4" = json ] && [ "$5" = -o ] || exit 9
cp "` + filepath.Join(dir, "report.json") + `" "$6"
exit ` + strconv.Itoa(code) + "\n"
	path := filepath.Join(dir, "heatgraph")
	require.NoError(t, os.WriteFile(path, []byte(script), 0o755))
	return path
}

// The harness, with a stand-in solver: a converged solve gives a row; a
// solve without a solution a FAILED row and exit status 3; a solve that
// cannot run, exit status 4.
func TestHarness(t *testing.T) {
	run := func(bin string, strict bool, sizes ...string) (error, string, string) {
		ios, _, out, errOut := iostreams.Test()
		err := Run(&Options{IO: ios, Sizes: sizes, Shapes: []string{"board"}, Repeat: 3, Binary: bin, Strict: strict})
		return err, out.String(), errOut.String()
	}

	err, out, stderr := run(fakeSolver(t, report(true, 14.7, 14.7, 0, "31"), exit.OK), false, "1e3", "1e5")
	require.NoError(t, err, stderr)
	lines := strings.Split(out, "\n")
	for _, c := range Columns {
		assert.Contains(t, lines[0], c)
	}
	assert.Regexp(t, `^board\s+992\s+1006\s+\d+\.\d{3}\s+\d+\s+7\s+31\s+-\s+-$`, lines[1])
	assert.Regexp(t, `^board\s+99856\s+1006\s+\d+\.\d{3}\s+\d+\s+7\s+31\s+0\.6 / -\s+(yes|no)$`, lines[2])
	assert.Contains(t, out, "median of 3 runs")
	assert.Contains(t, out, "GOMAXPROCS")
	assert.Equal(t, 6, strings.Count(stderr, "bench: board-"), "three runs of each case")

	// A limit exceeded (exit status 1) is still a solution.
	err, out, stderr = run(fakeSolver(t, report(true, 14.7, 14.7, 0, ""), exit.LimitExceeded), false, "1e3")
	require.NoError(t, err, stderr)
	assert.NotContains(t, out, "FAILED")

	err, out, stderr = run(fakeSolver(t, report(false, 0, 0, 0, ""), exit.NotConverged), false, "1e3")
	assert.Equal(t, exit.Silent(exit.NotConverged), err)
	assert.Regexp(t, `(?m)^board\s+992\s+1006\s+.*FAILED$`, out)
	assert.Contains(t, out, "FAILED board-1e3 (992 cells): no solution after 7 Newton iterations")
	assert.Equal(t, 1, strings.Count(stderr, "run "), "a failed case is not run again")

	err, out, _ = run(fakeSolver(t, report(true, 14.7, 14.7, 0, ""), exit.BadInput), false, "1e3")
	assert.Equal(t, exit.Silent(exit.Internal), err)
	assert.Contains(t, out, "exit status 2")

	err, _, _ = run(filepath.Join(t.TempDir(), "no-such-heatgraph"), false, "1e3")
	assert.Equal(t, exit.Silent(exit.Internal), err)
}

// A case meets its target when its median time and its peak memory are
// within it; --strict turns a missed target into exit status 1, and a
// failure outranks it.
func TestTargets(t *testing.T) {
	board6, err := NewCase("board", 1e6, "1e6")
	require.NoError(t, err)
	block5, err := NewCase("block", 1e5, "1e5")
	require.NoError(t, err)
	board4, err := NewCase("board", 1e4, "1e4")
	require.NoError(t, err)
	s := time.Second
	for _, c := range []struct {
		m    Measure
		want string
	}{
		{Measure{Case: board6, Times: []time.Duration{3 * s, 5 * s, 3 * s}, PeakBytes: 1400e6}, "yes"},
		{Measure{Case: board6, Times: []time.Duration{3 * s, 5 * s, 5 * s}, PeakBytes: 1400e6}, "no"},
		{Measure{Case: board6, Times: []time.Duration{3 * s}, PeakBytes: 1600e6}, "no"},
		{Measure{Case: board6, Times: []time.Duration{3 * s}, PeakBytes: -1}, "yes"},
		{Measure{Case: block5, Times: []time.Duration{3 * s}, PeakBytes: 9e9}, "yes"},
		{Measure{Case: block5, Times: []time.Duration{5 * s}}, "no"},
		{Measure{Case: board4, Times: []time.Duration{50 * s}}, "-"},
		{Measure{Case: board6, Times: []time.Duration{s}, Err: errors.New("no solution")}, "FAILED"},
	} {
		assert.Equal(t, c.want, c.m.Met(), "%+v", c.m)
	}
	ok := &Measure{Case: board6, Times: []time.Duration{s}}
	missed := &Measure{Case: board6, Times: []time.Duration{9 * s}}
	failed := &Measure{Case: board4, Err: errors.New("no solution"), Code: exit.NotConverged}
	broken := &Measure{Case: board4, Err: errors.New("exit status 2"), Code: exit.Internal}
	assert.NoError(t, outcome([]*Measure{ok, missed}, false))
	assert.Equal(t, exit.Silent(exit.LimitExceeded), outcome([]*Measure{ok, missed}, true))
	assert.Equal(t, exit.Silent(exit.NotConverged), outcome([]*Measure{missed, failed}, true))
	assert.Equal(t, exit.Silent(exit.Internal), outcome([]*Measure{broken, failed}, false))
	assert.Equal(t, exit.Silent(exit.Internal), outcome([]*Measure{failed, broken}, false))

	// The table shows the target and the verdict.
	var b strings.Builder
	require.NoError(t, WriteText(&b, []*Measure{ok, missed}, Machine{}, 1))
	assert.Regexp(t, `(?m)^board\s+1000000\s.*\s3\.9 / 1500\s+yes$`, b.String())
	assert.Regexp(t, `(?m)^board\s+1000000\s.*\s3\.9 / 1500\s+no$`, b.String())
	assert.Contains(t, b.String(), "unknown CPU")
}

func TestMarkdown(t *testing.T) {
	ios, _, out, _ := iostreams.Test()
	err := Run(&Options{IO: ios, Sizes: []string{"1e3"}, Shapes: Shapes, Repeat: 1, Markdown: true,
		Binary: fakeSolver(t, report(true, 1, 1, 0, ""), exit.OK)})
	require.NoError(t, err)
	lines := strings.Split(out.String(), "\n")
	assert.Equal(t, "| shape | cells | unknowns | time (s) | peak (MB) | Newton | linear | target (s / MB) | met |", lines[0])
	assert.Equal(t, "|---|---:|---:|---:|---:|---:|---:|---:|---:|", lines[1])
	assert.Regexp(t, `^\| board \| 992 \| 1006 \| \d+\.\d{3} \| \d+ \| 7 \| - \| - \| - \|$`, lines[2])
	assert.Regexp(t, `^\| block \| 1000 \| `, lines[3])
	assert.Contains(t, out.String(), "\n- machine: ")
}

// --keep leaves the models and the results in the folder.
func TestKeep(t *testing.T) {
	dir := filepath.Join(t.TempDir(), "kept")
	ios, _, _, _ := iostreams.Test()
	err := Run(&Options{IO: ios, Sizes: []string{"1e3"}, Shapes: []string{"block"}, Repeat: 1, Keep: dir,
		Binary: fakeSolver(t, report(true, 1, 1, 0, ""), exit.OK)})
	require.NoError(t, err)
	assert.FileExists(t, filepath.Join(dir, "block-1e3.yaml"))
	assert.FileExists(t, filepath.Join(dir, "block-1e3.json"))
}

func TestFlagsToOptions(t *testing.T) {
	ios, _, _, _ := iostreams.Test()
	var got *Options
	cmd := NewCmd(ios, func(o *Options) error { got = o; return nil })
	cmd.SetArgs([]string{"--sizes", "1e3,2e4", "--shapes", "block", "--repeat", "3", "--keep", "k", "--markdown", "--binary", "hg", "--timeout", "90s", "--strict", "--max-memory", "2500"})
	require.NoError(t, cmd.Execute())
	assert.Equal(t, &Options{IO: ios, Sizes: []string{"1e3", "2e4"}, Shapes: []string{"block"}, Repeat: 3, Keep: "k", Markdown: true,
		Binary: "hg", Timeout: 90 * time.Second, Strict: true, MaxMemoryMB: 2500}, got)

	cmd = NewCmd(ios, func(o *Options) error { got = o; return nil })
	cmd.SetArgs(nil)
	require.NoError(t, cmd.Execute())
	assert.Equal(t, []string{"1e3", "1e4", "1e5", "1e6"}, got.Sizes)
	assert.Equal(t, []string{"board", "block"}, got.Shapes)
	assert.Equal(t, 1, got.Repeat)
	assert.Equal(t, 10*time.Minute, got.Timeout)
	assert.Equal(t, 6000.0, got.MaxMemoryMB)
}

func TestInvalidOptions(t *testing.T) {
	for _, c := range []struct {
		o    Options
		want string
	}{
		{Options{Sizes: []string{"lots"}, Shapes: Shapes, Repeat: 1}, `"lots" is not a number of cells`},
		{Options{Sizes: []string{"1.5e0"}, Shapes: Shapes, Repeat: 1}, "not a number of cells"},
		{Options{Sizes: []string{"0"}, Shapes: Shapes, Repeat: 1}, "not a number of cells"},
		{Options{Sizes: []string{"1e3"}, Shapes: []string{"sphere"}, Repeat: 1}, `"sphere" is not a shape`},
		{Options{Sizes: []string{"1e3"}, Shapes: Shapes, Repeat: 0}, "--repeat 0"},
		{Options{Sizes: []string{"1e3"}, Shapes: Shapes, Repeat: 1, Timeout: -time.Second}, "--timeout"},
		{Options{Shapes: Shapes, Repeat: 1}, "at least one size"},
		{Options{Sizes: []string{"1e3"}, Shapes: Shapes, Repeat: 1, MaxMemoryMB: -1}, "--max-memory"},
	} {
		ios, _, _, _ := iostreams.Test()
		c.o.IO = ios
		err := Run(&c.o)
		var ee *exit.Error
		require.ErrorAs(t, err, &ee, c.want)
		assert.Equal(t, exit.BadInput, ee.Code)
		assert.ErrorContains(t, err, c.want)
	}
}

// The kernel's huge page mode is the word in brackets (sysfs-kernel-mm-
// transparent-hugepage, the Linux kernel's documentation), and the machine
// line says it.
func TestHugePageMode(t *testing.T) {
	dir := t.TempDir()
	for text, want := range map[string]string{
		"always [madvise] never\n": "madvise",
		"[always] madvise never\n": "always",
		"always madvise [never]\n": "never",
		"garbled\n":                "",
	} {
		p := filepath.Join(dir, "enabled")
		require.NoError(t, os.WriteFile(p, []byte(text), 0o644))
		assert.Equal(t, want, hugePageMode(p), text)
	}
	assert.Equal(t, "", hugePageMode(filepath.Join(dir, "missing")))
	lines := Machine{CPU: "X", CPUs: 2, GOMAXPROCS: 2, HugePages: "never"}.lines(1)
	assert.Contains(t, lines[0], "transparent huge pages never")
}
