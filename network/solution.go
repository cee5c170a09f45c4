package network

import (
	"fmt"
	"math"

	"github.com/heatgraph/heatgraph/elements"
)

// Status is the verdict on a node's temperature against its limit.
type Status string

// Node statuses.
const (
	NoLimit Status = ""      // the node has no limit
	OK      Status = "ok"    // the margin is at least the required margin
	Tight   Status = "tight" // within the limit, but closer than the required margin
	Over    Status = "over"  // above the limit
)

// NodeResult is a node's temperature and its margin to its limit.
type NodeResult struct {
	ID          string
	Kind        NodeKind
	Temperature float64 // K
	Power       float64 // heat input, W
	Limit       float64 // K, when HasLimit
	HasLimit    bool
	Margin      float64 // Limit − Temperature, K, when HasLimit
	Status      Status
	Line        int
}

// LinkResult is the heat a link carries and what it reports about itself.
type LinkResult struct {
	ID       string
	Kind     string
	From, To string
	Heat     float64 // W, positive from From to To
	// Inlet and Carried describe a channel's air: the node it comes from
	// and the heat it brings to the outlet (To) above ambient, W. Inlet is
	// "" for other links.
	Inlet    string
	Carried  float64
	Details  []elements.Detail
	Warnings []string
	Line     int
}

// BoundaryHeat is the heat leaving the network through one fixed node.
type BoundaryHeat struct {
	Node string
	Heat float64 // W, positive out of the network into the node
}

// Balance is the energy balance of a solution: what goes in must come out.
type Balance struct {
	In        float64        // total heat input, W
	Out       []BoundaryHeat // per fixed node, in node order
	Imbalance float64        // In − ΣOut, W; round-off at a converged solution
}

// Solution is a solved network presented for people: every node against
// its limit, every link's heat, the energy balance and the warnings.
type Solution struct {
	Net      *Network
	T        []float64 // every node, K
	Nodes    []NodeResult
	Links    []LinkResult
	Balance  Balance
	Warnings []string
}

// Solution evaluates the network at the free-node temperatures x (as
// returned by the solver) and reports on every node and link.
func (net *Network) Solution(x []float64) *Solution {
	p := net.Steady()
	f := make([]float64, p.Size())
	if _, err := p.Evaluate(x, f, nil); err != nil {
		// x came from a converged solve, which evaluated it.
		panic(fmt.Sprintf("network: solution state cannot be evaluated: %v", err))
	}
	sol := &Solution{Net: net, T: append([]float64(nil), p.temps...)}
	state := &elements.State{T: sol.T, Env: &net.Env}
	margin := net.Model.RequiredMargin
	for i, n := range net.Nodes {
		r := NodeResult{ID: n.ID, Kind: n.Kind, Temperature: sol.T[i], Power: n.Power, Limit: n.Limit, HasLimit: n.HasLimit, Line: n.Line}
		if n.HasLimit {
			r.Margin = n.Limit - sol.T[i]
			switch {
			case r.Margin < 0:
				r.Status = Over
			case r.Margin < margin:
				r.Status = Tight
			default:
				r.Status = OK
			}
		}
		sol.Nodes = append(sol.Nodes, r)
	}
	rec := &heatRecorder{heat: map[int]float64{}}
	for _, l := range net.Links {
		clear(rec.heat)
		l.Element.Stamp(state, rec)
		lr := LinkResult{ID: l.ID, Kind: l.Kind, From: net.Nodes[l.From].ID, To: net.Nodes[l.To].ID, Heat: -rec.heat[l.From], Line: l.Line}
		if l.Inlet >= 0 {
			lr.Inlet, lr.Carried = net.Nodes[l.Inlet].ID, -rec.heat[l.Inlet]
		}
		if rep, ok := l.Element.(elements.Reporter); ok {
			report := rep.Report(state)
			lr.Details, lr.Warnings = report.Details, report.Warnings
			for _, w := range report.Warnings {
				sol.Warnings = append(sol.Warnings, fmt.Sprintf("link %q: %s", l.ID, w))
			}
		}
		sol.Links = append(sol.Links, lr)
	}
	for _, s := range net.sources {
		sol.Balance.In += s.Power(state)
	}
	out := 0.0
	for i, n := range net.Nodes {
		if n.Fixed() {
			// p.heat holds what the links put into each node.
			sol.Balance.Out = append(sol.Balance.Out, BoundaryHeat{Node: n.ID, Heat: p.heat[i]})
			out += p.heat[i]
		}
	}
	sol.Balance.Imbalance = sol.Balance.In - out
	return sol
}

// Exceeded returns the nodes above their limits.
func (s *Solution) Exceeded() []NodeResult {
	var out []NodeResult
	for _, n := range s.Nodes {
		if n.Status == Over {
			out = append(out, n)
		}
	}
	return out
}

// MaxImbalance returns the tolerance the energy balance is held to: a
// converged solution's imbalance is round-off of the heat moving through it.
func (b Balance) MaxImbalance() float64 {
	scale := math.Abs(b.In)
	for _, o := range b.Out {
		scale = math.Max(scale, math.Abs(o.Heat))
	}
	return 1e-6 * math.Max(scale, 1e-3)
}

// heatRecorder is a Stamper that keeps only heat flows.
type heatRecorder struct{ heat map[int]float64 }

func (r *heatRecorder) AddHeat(n int, q float64)   { r.heat[n] += q }
func (r *heatRecorder) AddDeriv(int, int, float64) {}
