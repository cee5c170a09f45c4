package study

import (
	"fmt"
	"math"
	"math/rand/v2"

	"github.com/heatgraph/heatgraph/network"
)

// Design gives the values of the varied parameters at each point of a
// study. The values of point i depend on i alone, so that any subset of
// the points (a shard) can be run anywhere and in any order.
type Design interface {
	Params() []network.Parameter
	Len() int
	At(i int) []float64 // SI, one per parameter
}

// Axis is one parameter of a grid and its values, SI.
type Axis struct {
	Param  network.Parameter
	Values []float64
}

// Grid is every combination of its axes' values; the last axis varies
// fastest.
type Grid []Axis

// Params returns the axes' parameters.
func (g Grid) Params() []network.Parameter {
	out := make([]network.Parameter, len(g))
	for i, a := range g {
		out[i] = a.Param
	}
	return out
}

// Len returns the number of points.
func (g Grid) Len() int {
	n := 1
	for _, a := range g {
		n *= len(a.Values)
	}
	return n
}

// At returns the values of point i.
func (g Grid) At(i int) []float64 {
	out := make([]float64, len(g))
	for k := len(g) - 1; k >= 0; k-- {
		n := len(g[k].Values)
		out[k] = g[k].Values[i%n]
		i /= n
	}
	return out
}

// Range returns the values from from to to: with step (> 0) the values
// from, from ± step, ... up to to (to itself when it falls on a step, to
// within 1e-9 of the step); with count (≥ 2) that many values evenly
// spaced, or with log set geometrically spaced (from and to of one sign,
// not zero).
func Range(from, to, step float64, count int, log bool) ([]float64, error) {
	switch {
	case step > 0 && count > 0:
		return nil, fmt.Errorf("give step or count, not both")
	case step > 0:
		if log {
			return nil, fmt.Errorf("a logarithmic range takes a count, not a step")
		}
		n := int(math.Floor(math.Abs(to-from)/step + 1e-9))
		if n > 1e6 {
			return nil, fmt.Errorf("the step gives more than a million values")
		}
		dir := 1.0
		if to < from {
			dir = -1
		}
		out := make([]float64, 0, n+1)
		for k := 0; k <= n; k++ {
			out = append(out, from+dir*float64(k)*step)
		}
		return out, nil
	case count == 1:
		return []float64{from}, nil
	case count >= 2:
		if count > 1e6 {
			return nil, fmt.Errorf("count is more than a million")
		}
		out := make([]float64, count)
		for k := range out {
			f := float64(k) / float64(count-1)
			if log {
				if !(from*to > 0) {
					return nil, fmt.Errorf("a logarithmic range needs both ends of one sign and not zero")
				}
				out[k] = from * math.Pow(to/from, f)
			} else {
				out[k] = from + f*(to-from)
			}
		}
		out[count-1] = to
		return out, nil
	}
	return nil, fmt.Errorf("give a step (> 0) or a count (≥ 1)")
}

// Distribution draws values of one parameter.
type Distribution struct {
	Param network.Parameter
	// Kind is "normal" (Mean, Sigma), "uniform" (Low, High) or
	// "triangular" (Low, Mode, High).
	Kind                         string
	Mean, Sigma, Low, Mode, High float64 // SI
}

// Draw returns a value drawn with r.
func (d Distribution) Draw(r *rand.Rand) float64 {
	switch d.Kind {
	case "normal":
		return d.Mean + d.Sigma*r.NormFloat64()
	case "uniform":
		return d.Low + (d.High-d.Low)*r.Float64()
	case "triangular":
		// Inverse of the cumulative distribution.
		u := r.Float64()
		a, b, c := d.Low, d.High, d.Mode
		if u < (c-a)/(b-a) {
			return a + math.Sqrt(u*(b-a)*(c-a))
		}
		return b - math.Sqrt((1-u)*(b-a)*(b-c))
	}
	panic("unknown distribution " + d.Kind)
}

// Variance returns the distribution's variance.
func (d Distribution) Variance() float64 {
	switch d.Kind {
	case "normal":
		return d.Sigma * d.Sigma
	case "uniform":
		return (d.High - d.Low) * (d.High - d.Low) / 12
	case "triangular":
		a, b, c := d.Low, d.High, d.Mode
		return (a*a + b*b + c*c - a*b - a*c - b*c) / 18
	}
	return math.NaN()
}

// Sampling is a Monte Carlo design: sample i draws every distribution in
// order from a PCG generator (math/rand/v2) seeded with (Seed, i), so that
// a sample's values depend on the seed and its index alone, not on which
// worker or shard draws it.
type Sampling struct {
	Dists   []Distribution
	Samples int
	Seed    uint64
}

// Params returns the varied parameters.
func (s Sampling) Params() []network.Parameter {
	out := make([]network.Parameter, len(s.Dists))
	for i, d := range s.Dists {
		out[i] = d.Param
	}
	return out
}

// Len returns the number of samples.
func (s Sampling) Len() int { return s.Samples }

// At returns the values of sample i.
func (s Sampling) At(i int) []float64 {
	r := rand.New(rand.NewPCG(s.Seed, uint64(i)))
	out := make([]float64, len(s.Dists))
	for k, d := range s.Dists {
		out[k] = d.Draw(r)
	}
	return out
}

// Shard returns the point indices of shard k of n (0 ≤ k < n) of a design
// of size points: every n-th point from k, so that the shards of a sweep
// take similar work.
func Shard(size, k, n int) []int {
	var out []int
	for i := k; i < size; i += n {
		out = append(out, i)
	}
	return out
}

// All returns 0 … size−1.
func All(size int) []int {
	out := make([]int, size)
	for i := range out {
		out[i] = i
	}
	return out
}

// Row is the result at one point of a design.
type Row struct {
	Index  int
	Values []float64 // the varied parameters, SI
	T      []float64 // K, for each of the study's nodes; nil when Err is set
	// Margin is each node's limit less its temperature, K (NaN for a node
	// without a limit), and Required the model's required margin, at this
	// point.
	Margin   []float64
	Required float64
	Err      string // why there is no result (an invalid value, no solution)
}

// Run solves the model at the points indices of d, in parallel over the
// cores (each point its own network and problem), and returns one row per
// point in the order of indices. done, when not nil, is called after each
// point (from any goroutine).
func (m *Model) Run(d Design, indices []int, nodes []string, done func()) []Row {
	rows := make([]Row, len(indices))
	params := d.Params()
	parallel(len(indices), func(j int) {
		i := indices[j]
		vals := d.At(i)
		var ovs []network.Override
		for k, q := range params {
			ovs = append(ovs, q.Overrides(vals[k])...)
		}
		row := Row{Index: i, Values: vals}
		pt, err := m.Solve(ovs...)
		if err != nil {
			row.Err = firstLine(err.Error())
		} else {
			row.T = make([]float64, len(nodes))
			row.Margin = make([]float64, len(nodes))
			row.Required = pt.Net.Model.RequiredMargin
			for k, id := range nodes {
				i := pt.Net.Index[id]
				row.T[k] = pt.Solution.T[i]
				row.Margin[k] = math.NaN()
				if n := pt.Net.Nodes[i]; n.HasLimit {
					row.Margin[k] = n.Limit - row.T[k]
				}
			}
		}
		rows[j] = row
		if done != nil {
			done()
		}
	})
	return rows
}

// Node is a node a study reports: its id, and its limit when it has one.
type Node struct {
	ID       string
	Kind     network.NodeKind
	Limit    float64 // K
	HasLimit bool
}

// Nodes returns the nodes whose temperature is solved for, in network
// order, from the model with its overrides.
func (m *Model) Nodes() ([]Node, float64, error) {
	net, err := m.Build()
	if err != nil {
		return nil, 0, err
	}
	var out []Node
	for _, n := range net.Nodes {
		if n.Kind == network.Fixed {
			continue
		}
		out = append(out, Node{ID: n.ID, Kind: n.Kind, Limit: n.Limit, HasLimit: n.HasLimit})
	}
	return out, net.Model.RequiredMargin, nil
}

// IDs returns the nodes' ids.
func IDs(nodes []Node) []string {
	out := make([]string, len(nodes))
	for i, n := range nodes {
		out[i] = n.ID
	}
	return out
}
