package study

import (
	"math"
	"math/rand/v2"
	"sort"

	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/solve"
)

// Contribution is one correlation's part of an output's accuracy band.
type Contribution struct {
	Link     string
	Kind     string
	Accuracy float64 // ± fraction of the link's coefficient
	Source   string
	// DeltaK is the change of the output's temperature, K, when the link's
	// coefficient is off by its whole accuracy (signed: for the coefficient
	// high).
	DeltaK float64
}

// Band is an output's temperature with the band that the stated
// accuracies of the correlations give it.
type Band struct {
	Output Output
	// HalfWidthK is the root-sum-square of the contributions, K: the
	// temperature is T ± HalfWidthK from the correlations alone.
	HalfWidthK float64
	// Contributions, the largest first.
	Contributions []Contribution
}

// Accuracy propagates the published accuracy of every correlation in the
// model (a natural-convection surface's Churchill–Chu, a channel's
// Gnielinski …, elements.Uncertain) to each output's temperature, to first
// order, through the adjoint of the converged Jacobian:
//
//	ΔT_k,e = −λ_kᵀ·(∂F/∂ln h_e)·u_e,   Jᵀλ_k = e_k,
//
// for each link e whose coefficient h_e is known to ±u_e, and combines
// them as independent errors by the root-sum-square. The slopes ∂F/∂ln h_e
// are central differences of the link's own flows with its coefficient
// scaled (no solve). Given coefficients (convection with a coefficient the
// user states) and radiation carry no correlation error here: their
// uncertainty is in the values the user gives, which Monte Carlo covers.
// Links whose flow is solved for (branches) are not included.
func (m *Model) Accuracy() ([]Band, error) {
	pt, err := m.Solve()
	if err != nil {
		return nil, err
	}
	return AccuracyAt(pt)
}

// AccuracyAt is Accuracy at a point already solved (the Point of a
// Sensitivities, say), without solving again.
func AccuracyAt(pt *Point) ([]Band, error) {
	p := pt.Problem
	x := pt.Result.X
	slopes, err := p.CoefficientSlopes(x)
	if err != nil {
		return nil, err
	}
	jac := p.Pattern()
	f0 := make([]float64, p.Size())
	if err := p.Evaluate(x, f0, jac, nil); err != nil {
		return nil, err
	}
	lu, err := factorize(jac)
	if err != nil {
		return nil, err
	}
	outputs := outputsOf(pt, x)
	bands := make([]Band, len(outputs))
	e := make([]float64, p.Size())
	for k, o := range outputs {
		clear(e)
		e[o.unknown] = 1
		lambda, err := lu.solve(e, true)
		if err != nil {
			return nil, err
		}
		b := Band{Output: o}
		sum := 0.0
		for _, s := range slopes {
			d := -dot(lambda, s.Slope) * s.Accuracy
			b.Contributions = append(b.Contributions, Contribution{Link: s.Link, Kind: s.Kind, Accuracy: s.Accuracy, Source: s.Source, DeltaK: d})
			sum += d * d
		}
		b.HalfWidthK = math.Sqrt(sum)
		sort.SliceStable(b.Contributions, func(i, j int) bool {
			return math.Abs(b.Contributions[i].DeltaK) > math.Abs(b.Contributions[j].DeltaK)
		})
		bands[k] = b
	}
	return bands, nil
}

// outputsOf returns the outputs of a solved point: every node with a
// limit, and every junction.
func outputsOf(pt *Point, x []float64) []Output {
	p := pt.Problem
	unknownOf := map[int]int{}
	for u := 0; u < p.Size(); u++ {
		unknownOf[p.Variable(u)] = u
	}
	var out []Output
	for i, n := range pt.Net.Nodes {
		u, free := unknownOf[i]
		if !free || !(n.HasLimit || n.Kind == network.Junction) {
			continue
		}
		o := Output{Node: n.ID, Kind: n.Kind, Temperature: x[u], Limit: n.Limit, HasLimit: n.HasLimit, unknown: u}
		if n.HasLimit {
			o.Margin = n.Limit - x[u]
		}
		out = append(out, o)
	}
	return out
}

// CorrelationSample is the result of sampling the correlations' accuracy:
// for each output, the percentiles of its temperature over the samples.
type CorrelationSample struct {
	Output        Output
	N             int     // samples that converged
	P5, P50, P95  float64 // K
	Mean, StdDev  float64 // K
	FirstOrderSig float64 // K: the first-order band's half-width divided by 2, for comparison
}

// CorrelationMonteCarlo samples the correlations' accuracy: in each sample
// every link whose coefficient comes from a correlation has it multiplied
// by 1 + z·u/2, z a standard normal draw and u its stated accuracy (the
// stated ± is taken as a band of two standard deviations, about 95 %),
// and the model is solved again. Sample i draws from a PCG source seeded
// with (seed, i), so results do not depend on the order samples run in.
// It returns each output's statistics beside the first-order band.
func (m *Model) CorrelationMonteCarlo(samples int, seed uint64) ([]CorrelationSample, error) {
	pt, err := m.Solve()
	if err != nil {
		return nil, err
	}
	bands, err := AccuracyAt(pt)
	if err != nil {
		return nil, err
	}
	slopes, err := pt.Problem.CoefficientSlopes(pt.Result.X)
	if err != nil {
		return nil, err
	}
	temps := make([][]float64, samples) // per sample, per output
	parallel(samples, func(i int) {
		rng := rand.New(rand.NewPCG(seed, uint64(i)))
		scale := map[string]float64{}
		for _, s := range slopes {
			scale[s.Link] = math.Max(1+rng.NormFloat64()*s.Accuracy/2, 0.05)
		}
		net := pt.Net.WithCoefficients(scale)
		p := net.Steady()
		r := solve.Newton(p, pt.Result.X, m.Settings)
		if !r.Reason.Converged() {
			return
		}
		t := make([]float64, len(bands))
		for k, b := range bands {
			t[k] = r.X[b.Output.unknown]
		}
		temps[i] = t
	})
	out := make([]CorrelationSample, len(bands))
	for k, b := range bands {
		var ts []float64
		for _, t := range temps {
			if t != nil {
				ts = append(ts, t[k])
			}
		}
		cs := CorrelationSample{Output: b.Output, N: len(ts), FirstOrderSig: b.HalfWidthK / 2}
		if len(ts) > 0 {
			sort.Float64s(ts)
			cs.P5, cs.P50, cs.P95 = Percentile(ts, 5), Percentile(ts, 50), Percentile(ts, 95)
			sum := 0.0
			for _, t := range ts {
				sum += t
			}
			cs.Mean = sum / float64(len(ts))
			ss := 0.0
			for _, t := range ts {
				ss += (t - cs.Mean) * (t - cs.Mean)
			}
			if len(ts) > 1 {
				cs.StdDev = math.Sqrt(ss / float64(len(ts)-1))
			}
		}
		out[k] = cs
	}
	return out, nil
}
