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
	Heat     float64 // W, positive from From to To: the link's main path
	// Paths are the ways heat goes through the link (a channel has two:
	// from the wall to the air, and the heat the air brings from the
	// inlet); the first is the main path, Heat.
	Paths    []PathResult
	Details  []elements.Detail
	Warnings []string
	Line     int
}

// PathResult is one heat path of a link: Heat watts from From to To.
// Carried marks heat carried by moving air (its enthalpy above ambient).
type PathResult struct {
	From, To string
	Heat     float64
	Carried  bool
}

// BoundaryHeat is the heat leaving the network through one fixed node.
type BoundaryHeat struct {
	Node string
	Heat float64 // W, positive out of the network into the node
}

// Balance is the energy balance of a solution: what goes in must come out.
type Balance struct {
	In float64 // total heat input of sources (nodes' and components' power), W
	// Environment is the heat brought in from the environment (the sun on
	// outside surfaces), W: heat in, but not any part's dissipation.
	Environment float64
	Out         []BoundaryHeat // per fixed node, in node order
	Imbalance   float64        // In + Environment − ΣOut, W; round-off at a converged solution
	// Mass is the mass balance of every node that air flows through, and
	// the air entering or leaving through each fixed node, in node order.
	Mass []MassBalance
}

// Solution is a solved network presented for people: every node against
// its limit, every link's heat, the energy balance and the warnings.
type Solution struct {
	Net      *Network
	X        []float64 // every variable, SI
	T        []float64 // every node's temperature, K (the first variables)
	Nodes    []NodeResult
	Links    []LinkResult
	Branches []BranchResult // every link that carries air: its flow, pressures and, for a fan, its operating point
	Plates   []PlateResult  // every meshed plate: its hottest cell, mean, joins and cells
	Balance  Balance
	Residual Residual
	Warnings []string
}

// Residual is the largest remaining imbalance of one equation at a
// solution, relative to the flows that meet in it.
type Residual struct {
	Variable string  // what the equation balances, e.g. `temperature of "cpu"`
	Value    float64 // in the equation's unit (W for a heat balance)
	Unit     string
	Scaled   float64 // Value relative to the sum of |terms| of the equation
}

// Solution evaluates the network at the unknowns x (as returned by the
// solver) and reports on every node and link.
func (net *Network) Solution(x []float64) *Solution {
	p := net.Steady()
	if err := p.load(x); err != nil {
		// x came from a converged solve, which evaluated it.
		panic(fmt.Sprintf("network: solution state cannot be evaluated: %v", err))
	}
	p.ev.eval(&p.state, p.sum, p.mag, nil)
	sums := net.refreshViews(p.x)
	sol := &Solution{Net: net, X: p.x} // p is this solution's own
	sol.T = sol.X[:len(net.Nodes)]
	state := &elements.State{X: sol.X, Env: &net.Env}
	margin := net.Model.RequiredMargin
	for i, n := range net.Nodes {
		r := NodeResult{ID: n.ID, Kind: n.Kind, Temperature: sol.T[i], Power: n.Power, Limit: n.Limit, HasLimit: n.HasLimit, Line: n.Line}
		if n.HasLimit {
			r.Margin = n.Limit - sol.T[i]
			r.Status = verdict(r.Margin, margin)
		}
		sol.Nodes = append(sol.Nodes, r)
	}
	worst, worstSc := -1, 0.0
	for _, u := range net.unknown {
		sc := math.Abs(p.sum[u]) / math.Max(p.mag[u], math.SmallestNonzeroFloat64)
		if p.sum[u] == 0 {
			sc = 0
		}
		if worst < 0 || sc > worstSc {
			worst, worstSc = u, sc
		}
	}
	if worst >= 0 {
		// Named once: a plate cell's name takes some formatting.
		sol.Residual = Residual{Variable: net.varName(worst), Value: p.sum[worst], Unit: varKinds[net.Vars[worst].Kind].EquationUnit, Scaled: worstSc}
	}
	for _, l := range net.Links {
		lr := LinkResult{ID: l.ID, Kind: l.Kind, From: net.Nodes[l.From].ID, To: net.Nodes[l.To].ID, Line: l.Line}
		for _, path := range net.paths(l.Element, state) {
			lr.Paths = append(lr.Paths, PathResult{From: net.Nodes[path.From].ID, To: net.Nodes[path.To].ID, Heat: path.Heat, Carried: path.Carried})
		}
		if len(lr.Paths) > 0 {
			lr.Heat = lr.Paths[0].Heat
			if lr.Paths[0].From != lr.From {
				lr.Heat = -lr.Heat
			}
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
		if src, ok := s.(elements.Source); ok {
			sol.Balance.In += src.Power(state)
		}
	}
	for _, l := range net.Links {
		if src, ok := l.Element.(elements.EnvironmentSource); ok {
			sol.Balance.Environment += src.EnvironmentHeat(state)
		}
	}
	out := 0.0
	for i, n := range net.Nodes {
		if n.Fixed() {
			// p.sum holds what the elements put into each node.
			sol.Balance.Out = append(sol.Balance.Out, BoundaryHeat{Node: n.ID, Heat: p.sum[i]})
			out += p.sum[i]
		}
	}
	sol.Balance.Imbalance = sol.Balance.In + sol.Balance.Environment - out
	sol.Branches, sol.Balance.Mass = net.airflowResults(state)
	sol.Plates = net.plateResults(state, sums)
	return sol
}

// paths returns the heat paths of an element: its own, or, for an element
// with two rows, one path from the first to the second carrying what
// leaves the first.
func (net *Network) paths(el elements.Element, s *elements.State) []elements.Path {
	if pr, ok := el.(elements.PathReporter); ok {
		return pr.Paths(s)
	}
	rows := el.Rows()
	if len(rows) != 2 {
		return nil
	}
	l := elements.NewLocal(2, len(el.Vars()), false)
	el.Eval(s, l)
	return []elements.Path{{From: rows[0], To: rows[1], Heat: -l.R[0]}}
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
	scale := math.Abs(b.In) + math.Abs(b.Environment)
	for _, o := range b.Out {
		scale = math.Max(scale, math.Abs(o.Heat))
	}
	return 1e-6 * math.Max(scale, 1e-3)
}
