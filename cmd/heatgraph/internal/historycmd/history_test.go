package historycmd_test

import (
	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/historycmd"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/root"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// Flags land in the options struct that Run receives.
func TestFlagsToOptions(t *testing.T) {
	ios, _, _, _ := iostreams.Test()
	var got *historycmd.Options
	cmd := historycmd.NewCmd(ios, func(o *historycmd.Options) error { got = o; return nil })
	cmd.SetArgs([]string{"box.yaml", "--end", "2h", "--every", "1min", "--start", "given", "--initial", "lid=30degC",
		"--fixed-step", "1s", "--rel-tol", "1e-5", "--abs-tol", "1mK", "--csv", "t.csv", "--plot", "t.png", "--nodes", "a,b"})
	require.NoError(t, cmd.Execute())
	assert.Equal(t, &historycmd.Options{IO: ios, Model: "box.yaml", End: "2h", Every: "1min", Start: "given",
		Initial: []string{"lid=30degC"}, FixedStep: "1s", RelTol: 1e-5, AbsTol: "1mK", CycleTol: "0.01 K",
		CSV: "t.csv", Plot: "t.png", Nodes: []string{"a", "b"}}, got)
}

const heated = `
title: Heated part
ambient: {temperature: 20 degC}
nodes:
  - {id: part, power: {step: {before: 0 W, after: 10 W, at: 10 s}}, capacity: 100 J/K, limit: LIMIT}
links:
  - {from: part, to: ambient, kind: lumped, conductance: 1 W/K}
`

func writeModel(t *testing.T, limit string) (string, string) {
	dir := t.TempDir()
	path := filepath.Join(dir, "part.yaml")
	require.NoError(t, os.WriteFile(path, []byte(strings.Replace(heated, "LIMIT", limit, 1)), 0o644))
	return dir, path
}

func run(args ...string) (int, string, string) {
	ios, _, out, errOut := iostreams.Test()
	code := root.Main(append([]string{"history"}, args...), ios)
	return code, out.String(), errOut.String()
}

// A run writes the temperatures as CSV with units in the header, a plot in
// PNG and in SVG, and a report; a node rising above its limit gives exit
// status 1 and the time it crossed: θ = P/G·(1 − e^(−(t−10 s)/τ)) reaches
// 5 K at t = 10 s + 100 s·ln 2 = 79.3 s.
func TestRunWritesOutputs(t *testing.T) {
	dir, model := writeModel(t, "25 degC")
	csv := filepath.Join(dir, "part.csv")
	png := filepath.Join(dir, "part.png")
	code, out, errOut := run(model, "--end", "300s", "--every", "10s", "--csv", csv, "--plot", png)
	assert.Equal(t, 1, code, errOut)
	assert.Contains(t, out, "first over the limit")
	assert.Contains(t, out, "at 79.32 s  OVER")
	assert.Contains(t, out, "verdict: OVER THE LIMIT during the run: part")
	assert.Contains(t, out, "Results are estimates")
	assert.Empty(t, errOut, "no progress bar when standard error is not a terminal")
	data, err := os.ReadFile(csv)
	require.NoError(t, err)
	lines := strings.Split(strings.TrimSpace(string(data)), "\n")
	assert.Equal(t, "time [s],ambient [degC],part [degC]", lines[0])
	assert.Len(t, lines, 32) // header, t = 0 and 30 outputs
	img, err := os.ReadFile(png)
	require.NoError(t, err)
	assert.True(t, bytes.HasPrefix(img, []byte("\x89PNG")), "not a PNG")

	svg := filepath.Join(dir, "part.svg")
	code, _, errOut = run(model, "--end", "300s", "--plot", svg, "--start", "steady")
	// From the steady state at t = 0 (no power yet): the step still
	// takes the part over its limit.
	assert.Equal(t, 1, code, errOut)
	img, err = os.ReadFile(svg)
	require.NoError(t, err)
	assert.Contains(t, string(img), "<svg")
}

func TestExitStatuses(t *testing.T) {
	dir, model := writeModel(t, "60 degC")
	code, out, _ := run(model, "--end", "10min")
	assert.Equal(t, 0, code)
	assert.Contains(t, out, "verdict: no node rose above its limit")

	for _, args := range [][]string{
		{model},                        // no --end
		{model, "--end", "10 parsecs"}, // not a time
		{model, "--end", "10min", "--start", "x"}, // unknown start
		{model, "--end", "10min", "--plot", "a.pdf"},
		{model, "--end", "10min", "--nodes", "prt"},
		{model, "--end", "10min", "--start", "given", "--initial", "part"},
		{model, "--end", "10min", "--start", "given", "--initial", "nothing=30degC"},
		{filepath.Join(dir, "missing.yaml"), "--end", "10min"},
	} {
		code, _, errOut := run(args...)
		assert.Equal(t, 2, code, "%v: %s", args, errOut)
	}
	// The run fails: a negative power takes more heat out than the link can
	// bring, and the temperature would fall below absolute zero.
	cold := filepath.Join(dir, "cold.yaml")
	require.NoError(t, os.WriteFile(cold, []byte("ambient: {temperature: 20 degC}\nnodes: [{id: p, power: -500 W, capacity: 1 J/K}]\nlinks: [{from: p, to: ambient, kind: lumped, conductance: 0.1 W/K}]\n"), 0o644))
	code, _, errOut := run(cold, "--end", "1h")
	assert.Equal(t, 3, code, errOut)
	assert.Contains(t, errOut, "the run stopped at t =")
	// Output failed.
	code, _, errOut = run(model, "--end", "10min", "--csv", filepath.Join(dir, "no", "such", "dir.csv"))
	assert.Equal(t, 4, code, errOut)
}

// The start from given temperatures: the part starts at 50 degC and cools
// towards ambient before its power comes on.
func TestStartFromGiven(t *testing.T) {
	_, model := writeModel(t, "60 degC")
	code, out, errOut := run(model, "--end", "5s", "--start", "given", "--initial", "part=50degC")
	require.Equal(t, 0, code, errOut)
	assert.Contains(t, out, "start: given temperatures")
	assert.Regexp(t, `part\s+50\.00\s+50\.00\s+0 s`, out)
}

// The progress bar goes to standard error when asked for (by default only
// when standard error is a terminal); standard output keeps the report.
func TestProgressBar(t *testing.T) {
	_, model := writeModel(t, "60 degC")
	ios, _, out, errOut := iostreams.Test()
	on := true
	err := historycmd.Run(&historycmd.Options{IO: ios, Model: model, End: "60s", Start: "ambient", CycleTol: "0.01 K", Progress: &on})
	require.NoError(t, err)
	assert.Contains(t, errOut.String(), "run")
	assert.Contains(t, errOut.String(), "100%")
	assert.NotContains(t, out.String(), "100%")
}

// Fixed steps on a stiff pair: a thin pad (0.02 J/K) on a heavy block
// (3 kJ/K) joined by 40 W/K, time constants 5e-4 s and about an hour;
// 60 steps of a minute each stay on the quasi-steady pad temperature, the
// block's plus P/G = 0.25 K (L-stability, Bank et al. 1985).
func TestFixedStepsOnAStiffPair(t *testing.T) {
	dir := t.TempDir()
	model := filepath.Join(dir, "stiff.yaml")
	require.NoError(t, os.WriteFile(model, []byte(`ambient: {temperature: 20 degC}
nodes:
  - {id: pad, power: 10 W, capacity: 0.02 J/K}
  - {id: block, capacity: 3 kJ/K}
links:
  - {from: pad, to: block, kind: lumped, conductance: 40 W/K}
  - {from: block, to: ambient, kind: lumped, conductance: 0.8 W/K}
`), 0o644))
	csv := filepath.Join(dir, "stiff.csv")
	code, out, errOut := run(model, "--end", "1h", "--fixed-step", "1min", "--every", "5min", "--csv", csv)
	require.Equal(t, 0, code, errOut)
	assert.Contains(t, out, "fixed steps of 60 s: 60 steps")
	data, err := os.ReadFile(csv)
	require.NoError(t, err)
	lines := strings.Split(strings.TrimSpace(string(data)), "\n")
	require.Len(t, lines, 14)
	for _, l := range lines[2:] {
		var tm, amb, pad, block float64
		_, err := fmt.Sscanf(strings.ReplaceAll(l, ",", " "), "%g %g %g %g", &tm, &amb, &pad, &block)
		require.NoError(t, err)
		assert.InDelta(t, 0.25, pad-block, 1e-3, "pad − block at %g min", tm)
	}
}
