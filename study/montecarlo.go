package study

import (
	"bytes"
	"encoding/csv"
	"fmt"
	"math"
	"sort"
	"strconv"
)

// NodeStats summarizes the samples of one node's temperature.
type NodeStats struct {
	Node          Node
	N             int     // samples with a result
	Mean, StdDev  float64 // K; the standard deviation with n − 1
	P5, P50, P95  float64 // percentiles, K
	Exceed        int     // samples above the limit
	Probability   float64 // Exceed/N
	Lower, Higher float64 // Wilson score interval of Probability at 95 %
}

// Z95 is the standard normal quantile of a two-sided 95 % interval.
const Z95 = 1.959963984540054

// Summarize returns the statistics of every node with a limit and every
// junction over the rows that have a result, and the number of rows
// without one.
func Summarize(nodes []Node, rows []Row) ([]NodeStats, int) {
	failed := 0
	for _, r := range rows {
		if r.T == nil {
			failed++
		}
	}
	var out []NodeStats
	for k, n := range nodes {
		if !n.HasLimit && n.Kind != "junction" {
			continue
		}
		var ts []float64
		s := NodeStats{Node: n}
		for _, r := range rows {
			if r.T == nil {
				continue
			}
			ts = append(ts, r.T[k])
			if n.HasLimit && r.Margin[k] < 0 {
				s.Exceed++
			}
		}
		s.N = len(ts)
		if s.N == 0 {
			out = append(out, s)
			continue
		}
		sort.Float64s(ts)
		var sum float64
		for _, t := range ts {
			sum += t
		}
		s.Mean = sum / float64(s.N)
		var ss float64
		for _, t := range ts {
			ss += (t - s.Mean) * (t - s.Mean)
		}
		if s.N > 1 {
			s.StdDev = math.Sqrt(ss / float64(s.N-1))
		}
		s.P5, s.P50, s.P95 = Percentile(ts, 5), Percentile(ts, 50), Percentile(ts, 95)
		s.Probability = float64(s.Exceed) / float64(s.N)
		s.Lower, s.Higher = Wilson(s.Exceed, s.N, Z95)
		out = append(out, s)
	}
	return out, failed
}

// Percentile returns the p-th percentile of sorted values, interpolating
// linearly between order statistics (definition 7 of Hyndman & Fan 1996,
// the default of R and NumPy).
func Percentile(sorted []float64, p float64) float64 {
	if len(sorted) == 0 {
		return math.NaN()
	}
	h := (float64(len(sorted)) - 1) * p / 100
	lo := int(math.Floor(h))
	if lo+1 >= len(sorted) {
		return sorted[len(sorted)-1]
	}
	return sorted[lo] + (h-float64(lo))*(sorted[lo+1]-sorted[lo])
}

// Wilson returns the Wilson score interval (E. B. Wilson, 1927, J. Amer.
// Statist. Assoc. 22:209) of a proportion of k in n, for the normal
// quantile z: unlike the Wald interval p ± z·√(p(1−p)/n), it stays
// within [0, 1] and is not empty when k is 0 or n.
func Wilson(k, n int, z float64) (float64, float64) {
	if n == 0 {
		return 0, 1
	}
	nf := float64(n)
	p := float64(k) / nf
	z2 := z * z
	centre := (p + z2/(2*nf)) / (1 + z2/nf)
	half := z / (1 + z2/nf) * math.Sqrt(p*(1-p)/nf+z2/(4*nf*nf))
	return math.Max(0, centre-half), math.Min(1, centre+half)
}

// ReadCSV reads the rows of a table written by WriteCSV for nodes (a
// merged table of shards, say): temperatures and margins, not the values.
func ReadCSV(data []byte, nodes []Node) ([]Row, error) {
	recs, err := csv.NewReader(bytes.NewReader(data)).ReadAll()
	if err != nil {
		return nil, err
	}
	if len(recs) == 0 || len(recs[0]) == 0 || recs[0][0] != "point" {
		return nil, fmt.Errorf("not a study table (its first column is not \"point\")")
	}
	col := map[string]int{}
	for i, h := range recs[0] {
		col[h] = i
	}
	tcol, mcol := make([]int, len(nodes)), make([]int, len(nodes))
	for k, n := range nodes {
		c, ok := col[n.ID+"_degC"]
		if !ok {
			return nil, fmt.Errorf("the table has no column %s_degC: is it of this study's model?", n.ID)
		}
		tcol[k], mcol[k] = c, -1
		if n.HasLimit {
			if mcol[k], ok = col[n.ID+"_margin_K"]; !ok {
				return nil, fmt.Errorf("the table has no column %s_margin_K: is it of this study's model?", n.ID)
			}
		}
	}
	var rows []Row
	for _, rec := range recs[1:] {
		i, err := strconv.Atoi(rec[0])
		if err != nil {
			return nil, fmt.Errorf("point %q is not a point index", rec[0])
		}
		r := Row{Index: i, Err: rec[len(rec)-1]}
		if rec[tcol[0]] != "" {
			r.T, r.Margin = make([]float64, len(nodes)), make([]float64, len(nodes))
			for k := range nodes {
				t, err := strconv.ParseFloat(rec[tcol[k]], 64)
				if err != nil {
					return nil, fmt.Errorf("point %d: %v", i, err)
				}
				r.T[k], r.Margin[k] = t+273.15, math.NaN()
				if mcol[k] >= 0 {
					if r.Margin[k], err = strconv.ParseFloat(rec[mcol[k]], 64); err != nil {
						return nil, fmt.Errorf("point %d: %v", i, err)
					}
				}
			}
		}
		rows = append(rows, r)
	}
	return rows, nil
}
