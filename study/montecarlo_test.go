package study

import (
	"bytes"
	"math"
	"testing"

	"github.com/heatgraph/heatgraph/network"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// On the linear network T = Ta + P·R (R = 3 K/W), with Ta normal (40 degC,
// σ 2 K) and P triangular (8, 10, 13 W), first-order propagation of
// variance is exact: mean 40 + 3·31/3 degC, variance 2² + 3²·Var(P) with
// Var(P) = (a² + b² + c² − ab − ac − bc)/18 for the triangular law
// (standard formula, e.g. Evans, Hastings & Peacock, Statistical
// Distributions). 4000 samples: the sample mean within 4 standard errors
// (σ/√n) and the sample standard deviation within 4 of its standard
// errors (σ/√(2n), normal approximation).
func TestMonteCarloAgainstPropagation(t *testing.T) {
	m := modelFrom(t, linear, nil)
	d := Sampling{Samples: 4000, Seed: 2024, Dists: []Distribution{
		{Param: mustParam(t, m, "ambient.temperature"), Kind: "normal", Mean: 313.15, Sigma: 2},
		{Param: mustParam(t, m, "nodes.chip.power"), Kind: "triangular", Low: 8, Mode: 10, High: 13},
	}}
	nodes, _, err := m.Nodes()
	require.NoError(t, err)
	rows := m.Run(d, All(d.Len()), IDs(nodes), nil)
	stats, failed := Summarize(nodes, rows)
	require.Zero(t, failed)
	require.Len(t, stats, 1)
	s := stats[0]
	varP := (8.0*8 + 13*13 + 10*10 - 8*13 - 8*10 - 13*10) / 18
	assert.InDelta(t, varP, d.Dists[1].Variance(), 1e-12)
	mean := 313.15 + 3*(8+10+13)/3.0
	sigma := math.Sqrt(4 + 9*varP)
	n := float64(s.N)
	assert.InDelta(t, mean, s.Mean, 4*sigma/math.Sqrt(n))
	assert.InDelta(t, sigma, s.StdDev, 4*sigma/math.Sqrt(2*n))
	assert.Less(t, s.P5, s.P50)
	assert.Less(t, s.P50, s.P95)
	// Limit 100 degC at a mean of 71 degC, σ ≈ 3.2 K: about 9σ away, no
	// sample exceeds it, and Wilson's interval is [0, 3.84/(n + 3.84)].
	assert.Zero(t, s.Exceed)
	assert.InDelta(t, Z95*Z95/(n+Z95*Z95), s.Higher, 1e-12)
	// The samples read back from the table give the same statistics.
	var buf bytes.Buffer
	require.NoError(t, WriteCSV(&buf, d.Params(), nodes, rows))
	back, err := ReadCSV(buf.Bytes(), nodes)
	require.NoError(t, err)
	again, _ := Summarize(nodes, back)
	assert.InDelta(t, s.Mean, again[0].Mean, 1e-9)
	assert.InDelta(t, s.P95, again[0].P95, 1e-9)
}

// Wilson's interval for 10 of 100 at 95 %: 0.0552 to 0.1744, and for 0 of
// 10: 0 to 0.2775, worked by hand from Wilson's (1927) formula; the first
// agrees with Newcombe (1998, Statist. Med. 17:857, Table I, method 3) as
// recalled (from memory).
func TestWilson(t *testing.T) {
	lo, hi := Wilson(10, 100, Z95)
	assert.InDelta(t, 0.0552, lo, 1e-4)
	assert.InDelta(t, 0.1744, hi, 1e-4)
	lo, hi = Wilson(0, 10, Z95)
	assert.Equal(t, 0.0, lo)
	assert.InDelta(t, 0.2775, hi, 1e-4)
	assert.Equal(t, 2.5, Percentile([]float64{1, 2, 3, 4}, 50))
	assert.Equal(t, 1.15, math.Round(Percentile([]float64{1, 2, 3, 4}, 5)*1e12)/1e12)
}

// With a normal ambient (σ 2 K) and a normal power (σ 0.5 W through
// 3 K/W), T is normal with mean 70 degC and σ = √(2² + 1.5²) = 2.5 K; the
// chance of exceeding a limit of 73 degC is 1 − Φ(1.2) = 0.11507 (normal
// table, e.g. Abramowitz & Stegun, Table 26.1). The 95 % Wilson interval
// of 4000 samples holds it (one run, fixed seed: such an interval misses
// one time in twenty).
func TestMonteCarloExceedance(t *testing.T) {
	m := modelFrom(t, linear, []network.Override{{Path: "nodes.chip.limit", Value: "73 degC"}})
	d := Sampling{Samples: 4000, Seed: 1, Dists: []Distribution{
		{Param: mustParam(t, m, "ambient.temperature"), Kind: "normal", Mean: 313.15, Sigma: 2},
		{Param: mustParam(t, m, "nodes.chip.power"), Kind: "normal", Mean: 10, Sigma: 0.5},
	}}
	nodes, _, err := m.Nodes()
	require.NoError(t, err)
	stats, _ := Summarize(nodes, m.Run(d, All(d.Len()), IDs(nodes), nil))
	s := stats[0]
	assert.LessOrEqual(t, s.Lower, 0.11507)
	assert.GreaterOrEqual(t, s.Higher, 0.11507)
	assert.Less(t, s.Higher-s.Lower, 0.02)
	// The 5th and 95th percentiles of a normal law: mean ∓ 1.6449σ, within
	// 4 standard errors of a sample quantile, √(p(1−p)/n)/f(x_p) =
	// √(0.05·0.95/4000)/(φ(1.6449)/σ) = 0.0835 K (asymptotic normality of
	// sample quantiles).
	assert.InDelta(t, 343.15-1.6449*2.5, s.P5, 4*0.0835)
	assert.InDelta(t, 343.15+1.6449*2.5, s.P95, 4*0.0835)
	t.Logf("P(over) = %.4f, Wilson 95 %%: %.4f – %.4f", s.Probability, s.Lower, s.Higher)
}
