package root

import (
	"encoding/json"
	"image/png"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// T = Ta + P·R for 10 W through 3 K/W: ∂T/∂P = 3 K/W, ∂T/∂R = 10 W,
// ∂T/∂Ta = 1 (hand calculation).
func TestSensitivityCommand(t *testing.T) {
	path := writeModel(t, overLimit)
	code, out, stderr := run("sensitivity", path)
	require.Equal(t, exit.OK, code, stderr)
	assert.Contains(t, out, "chip (solid): 70.00 degC, limit 60.00 degC, margin -10.00 K")
	assert.Regexp(t, `1 +ambient.temperature +40 degC +1 K/K +\+10 K +\+10 K`, out)
	assert.Regexp(t, `[23] +nodes.chip.power +10 W +3 K/W +\+10 % +\+3 K`, out)
	assert.Regexp(t, `[23] +links.chip--ambient.resistance +3 K/W +10 K/\(K/W\) +\+10 % +\+3 K`, out)
	code, out, stderr = run("sensitivity", path, "--format", "json", "--set", "nodes.chip.power=20W", "--top", "1")
	require.Equal(t, exit.OK, code, stderr)
	var doc struct {
		Outputs []struct {
			Node    string `json:"node"`
			Ranking []struct {
				Path  string  `json:"path"`
				Slope float64 `json:"dT_dp"`
			} `json:"ranking"`
		} `json:"outputs"`
	}
	require.NoError(t, json.Unmarshal([]byte(out), &doc))
	require.Len(t, doc.Outputs, 1)
	require.Len(t, doc.Outputs[0].Ranking, 1)
	// 20 W × 10 % × 3 K/W = 6 K < 10 K of ambient; R up 10 %: 20 W × 0.3 K/W = 6 K.
	assert.Equal(t, "ambient.temperature", doc.Outputs[0].Ranking[0].Path)
	code, _, stderr = run("sensitivity", path, "--node", "chp")
	assert.Equal(t, exit.BadInput, code)
	assert.Contains(t, stderr, `--node "chp": not a node with a limit or a junction (these are: chip)`)
	code, _, stderr = run("sensitivity", path, "--set", "nodes.chip.power=1 V")
	assert.Equal(t, exit.BadInput, code)
	assert.Contains(t, stderr, "--set nodes.chip.power: ")
}

// 10 W through 3 K/W, limit 60 degC: the limit holds up to an ambient of
// 30 degC (hand calculation).
func TestSeekCommand(t *testing.T) {
	path := writeModel(t, overLimit)
	code, out, stderr := run("seek", path, "--vary", "ambient.temperature", "--from", "0degC", "--to", "50degC", "--tol", "1mK")
	require.Equal(t, exit.OK, code, stderr)
	assert.Regexp(t, `highest ambient.temperature at which every node keeps its limit: (29\.999\d|30\.0000) degC \(within`, out)
	assert.Contains(t, out, "limiting node: chip")
	code, out, stderr = run("seek", path, "--vary", "nodes.chip.power", "--from", "1W", "--to", "2W", "--format", "json")
	require.Equal(t, exit.OK, code, stderr)
	var doc map[string]any
	require.NoError(t, json.Unmarshal([]byte(out), &doc))
	assert.Equal(t, "holds", doc["outcome"])
	code, _, _ = run("seek", path, "--vary", "nodes.chip.power", "--from", "20W", "--to", "30W")
	assert.Equal(t, exit.LimitExceeded, code)
	code, _, stderr = run("seek", path, "--vary", "nodes.chip.power", "--from", "20K", "--to", "30W")
	assert.Equal(t, exit.BadInput, code)
	assert.Contains(t, stderr, "--from: ")
	code, _, stderr = run("seek", path, "--vary", "nodes.chip.colour", "--from", "1", "--to", "2")
	assert.Equal(t, exit.BadInput, code)
	assert.Contains(t, stderr, "names no numeric value")
}

func TestSweepShardsAndMerge(t *testing.T) {
	dir := t.TempDir()
	study := examples + "studies/ambient-sweep.yaml"
	code, whole, stderr := run("sweep", study, "--json", dir+"/s.json", "--plot", dir+"/s.png", "--plot", dir+"/s.svg")
	require.Equal(t, exit.OK, code, stderr)
	assert.Equal(t, 19, strings.Count(whole, "\n")) // header + 2 × 9 points
	f, err := os.Open(dir + "/s.png")
	require.NoError(t, err)
	img, err := png.Decode(f)
	f.Close()
	require.NoError(t, err)
	assert.Greater(t, img.Bounds().Dx(), 400)
	svg, err := os.ReadFile(dir + "/s.svg")
	require.NoError(t, err)
	assert.Contains(t, string(svg), "<svg")
	assert.Contains(t, string(svg), "air-out limit")
	var doc struct {
		Points []struct {
			Point  int    `json:"point"`
			Status string `json:"status"`
		} `json:"points"`
	}
	data, err := os.ReadFile(dir + "/s.json")
	require.NoError(t, err)
	require.NoError(t, json.Unmarshal(data, &doc))
	assert.Len(t, doc.Points, 18)
	assert.Equal(t, 17, doc.Points[17].Point)
	var shards []string
	for _, s := range []string{"0/3", "1/3", "2/3"} {
		out := dir + "/part" + strings.ReplaceAll(s, "/", "of") + ".csv"
		code, _, stderr = run("sweep", study, "--shard", s, "-o", out)
		require.Equal(t, exit.OK, code, stderr)
		shards = append(shards, out)
	}
	code, merged, stderr := run(append([]string{"merge", "--points", "18"}, shards...)...)
	require.Equal(t, exit.OK, code, stderr)
	assert.Equal(t, whole, merged)
	code, _, stderr = run("sweep", study, "--shard", "3/3")
	assert.Equal(t, exit.BadInput, code)
	assert.Contains(t, stderr, "expected i/n with 0 ≤ i < n")
	code, _, stderr = run("merge", "--points", "18", shards[0], shards[2])
	assert.Equal(t, exit.BadInput, code)
	assert.Contains(t, stderr, "missing")
}

// Monte Carlo split into shards and merged gives the samples of the whole
// run byte for byte, and the same summary.
func TestMonteCarloShards(t *testing.T) {
	dir := t.TempDir()
	model, err := filepath.Abs(examples + "outdoor-controller.yaml")
	require.NoError(t, err)
	study := filepath.Join(dir, "mc.yaml")
	require.NoError(t, os.WriteFile(study, []byte(`model: `+model+`
montecarlo:
  samples: 40
  seed: 11
  vary:
    - {vary: components.radio.power, triangular: {low: 1.5 W, mode: 1.8 W, high: 2.4 W}}
    - {vary: ambient.temperature, normal: {sigma: 3 K}}
`), 0o644))
	code, summary, stderr := run("montecarlo", study, "-o", dir+"/all.csv", "--json", dir+"/all.json")
	require.Equal(t, exit.OK, code, stderr)
	assert.Contains(t, summary, "40 samples (seed 11), 0 without a result")
	assert.Regexp(t, `radio +\d+\.\d\d +\d\.\d+ +`, summary)
	var parts []string
	for _, s := range []string{"0/4", "1/4", "2/4", "3/4"} {
		out := filepath.Join(dir, "p"+s[:1]+".csv")
		code, _, stderr = run("montecarlo", study, "--shard", s, "-o", out)
		require.Equal(t, exit.OK, code, stderr)
		parts = append(parts, out)
	}
	code, _, stderr = run(append([]string{"merge", "--points", "40", "-o", dir + "/merged.csv"}, parts...)...)
	require.Equal(t, exit.OK, code, stderr)
	whole, err := os.ReadFile(dir + "/all.csv")
	require.NoError(t, err)
	merged, err := os.ReadFile(dir + "/merged.csv")
	require.NoError(t, err)
	assert.Equal(t, string(whole), string(merged))
	code, again, stderr := run("montecarlo", study, "--table", dir+"/merged.csv")
	require.Equal(t, exit.OK, code, stderr)
	assert.Equal(t, summary, again)
}

// A variant of the 10 W, 3 K/W chip at 5 W runs 15 K cooler (hand
// calculation); with a second chip added, the table has its row.
func TestCompareVariants(t *testing.T) {
	base := writeModel(t, overLimit)
	variant := filepath.Join(filepath.Dir(base), "half.yaml")
	require.NoError(t, os.WriteFile(variant, []byte(`base: model.yaml
title: half the power
set: {nodes.chip.power: 5 W}
add:
  nodes: [{id: chip2, power: 1 W, limit: 50 degC}]
  links: [{kind: lumped, from: chip2, to: ambient, resistance: 2 K/W}]
`), 0o644))
	code, out, stderr := run("compare", base, variant, "--format", "csv")
	assert.Equal(t, exit.LimitExceeded, code, stderr) // the base is over its limit
	assert.Equal(t, "node,T1_degC,margin1_K,T2_degC,margin2_K,dT2_K\n"+
		"chip,70,-10,55,5,-15\n"+
		"chip2,,,42,8,\n", out)
	code, out, stderr = run("compare", base, variant, "--set", "ambient.temperature=20degC")
	assert.Equal(t, exit.OK, code, stderr)
	assert.Contains(t, out, "[2] half the power")
	assert.Regexp(t, `chip +50\.00 +\+10\.00 +35\.00 +\+25\.00 +-15\.00`, out)
	code, _, stderr = run("compare", base)
	assert.Equal(t, exit.BadInput, code)
}

// A sweep from flags: 10 W through 3 K/W at ambients of 20, 30, 40 degC
// gives 50, 60, 70 degC (hand calculation); a point whose value the
// model refuses is a failed row.
func TestSweepFromFlags(t *testing.T) {
	path := writeModel(t, overLimit)
	png := filepath.Join(t.TempDir(), "p.png")
	code, out, stderr := run("sweep", path, "--vary", "ambient.temperature=20degC:40degC:10K", "--plot", png, "--plot-node", "chip")
	require.Equal(t, exit.OK, code, stderr)
	assert.Equal(t, "point,ambient.temperature_K,chip_degC,chip_margin_K,worst_node,worst_slack_K,status,error\n"+
		"0,293.15,50,10,chip,10,ok,\n1,303.15,60,0,chip,0,ok,\n2,313.15,70,-10,chip,-10,over,\n", out)
	_, err := os.Stat(png)
	assert.NoError(t, err)
	code, out, stderr = run("sweep", path, "--vary", "nodes.chip.power=5W,-2MW")
	require.Equal(t, exit.OK, code, stderr)
	assert.Contains(t, out, `1,-2e+06,,,,,failed,"--set nodes.chip.power: ""-2e+06 W"" is outside the range`)
	code, _, stderr = run("sweep", path, "--vary", "nodes.chip.power=5V")
	assert.Equal(t, exit.BadInput, code)
	assert.Contains(t, stderr, `unknown unit "V"`)
}
