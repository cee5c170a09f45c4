package viz

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"github.com/heatgraph/heatgraph/network"
)

// Heat-path breakdown: where the heat of each source goes, by which paths,
// and which links hold a junction's temperature up. It reads a solved
// network only; it never solves.
//
// Method (flow decomposition with proportional splitting):
//
//  1. The solved heat paths of every link (network.LinkResult.Paths) are
//     merged into a directed graph with one arc per pair of nodes and way
//     of transport (conducted, convected or radiated heat apart from heat
//     carried by moving air), pointing the way the net heat flows — the
//     same arcs the diagram draws.
//  2. Sources are the nodes with a heat input, and fixed-temperature nodes
//     that give heat to the network. Sinks are the fixed-temperature nodes
//     (ambient among them); heat that moving air carries into a fixed node
//     is counted apart, as "air leaving to" that node.
//  3. Assumption: at every node the heat leaving it is attributed to the
//     sources in proportion to the heat entering it (its own input
//     counting as entering). Heat is not labelled in nature; this is a
//     bookkeeping convention, exact for a node fed by one source and a
//     choice wherever the heat of several sources meets. The shares of
//     one source over the sinks add up to 1 by construction.
//  4. The main paths of a source are taken from its attributed flows
//     greedily: the path from the source to a sink that follows the
//     largest remaining arc at each node, carrying the smallest flow along
//     it, removed, and again, until 99 % of the heat is placed or eight
//     paths are found. A path's thermal resistance is the temperature
//     drop along it divided by the heat on it; with other heat joining on
//     the way it is an effective, not a physical, resistance.
//  5. For a node with a limit, the arcs of its main paths are ranked by
//     their temperature drop: those first in the list contribute most to
//     its rise above ambient and are the first to improve.

// BreakdownMethod is the one-paragraph statement of the method for reports.
const BreakdownMethod = "Flow decomposition of the solved heat flows: every link's heat, in the direction it flows, " +
	"forms a directed graph from the heat sources to the fixed temperatures. At each node the heat leaving it is " +
	"attributed to the sources in proportion to the heat entering it (an assumption: heat from several sources is " +
	"not told apart in nature). Main paths follow the largest attributed flow at each node; a path's resistance is " +
	"the temperature drop along it divided by the heat on it."

// Breakdown is the heat-path breakdown of a solution.
type Breakdown struct {
	Sources []SourceBreakdown
}

// SourceBreakdown is where the heat of one source goes.
type SourceBreakdown struct {
	Node  string
	Fixed bool    // a fixed-temperature node giving heat to the network
	Heat  float64 // W put in by the source
	Sinks []SinkShare
	Paths []HeatPath
	// Drops ranks the arcs of the main paths by their temperature drop,
	// for nodes with a limit ("improve this first").
	Drops []ArcDrop
	// Rise is the node's temperature above ambient, K.
	Rise float64
	// arcs holds the source's heat on each arc of the diagram, W.
	arcs []float64
}

// SinkShare is the part of a source's heat that ends in one sink.
type SinkShare struct {
	Sink  string // fixed node id
	Air   bool   // carried there by moving air
	Heat  float64
	Share float64 // of the source's heat
}

// Name is the sink as reports show it.
func (s SinkShare) Name() string {
	if s.Air {
		return "air leaving to " + s.Sink
	}
	return s.Sink
}

// HeatPath is one main path of a source's heat.
type HeatPath struct {
	Nodes      []string // source first, sink last
	Links      []string // the links of each arc, "+"-joined where several
	Heat       float64  // W
	Share      float64  // of the source's heat
	DeltaT     float64  // K, source temperature minus sink temperature
	Resistance float64  // K/W, DeltaT / Heat
}

// ArcDrop is the temperature drop across one arc of a main path.
type ArcDrop struct {
	From, To string
	Links    string  // the links, "+"-joined
	DeltaT   float64 // K
	Share    float64 // of the source's rise above ambient
}

// arcLinks names the links of an arc.
func arcLinks(e heatEdge) string {
	names := make([]string, 0, len(e.parts))
	for _, p := range e.parts {
		if len(e.parts) > 1 && math.Abs(p.heat) <= 1e-9*math.Abs(e.heat) {
			continue // a link that carries nothing here (air drawn in at ambient)
		}
		id := p.what
		if i := strings.Index(id, " ("); i > 0 {
			id = id[:i]
		}
		names = append(names, id)
	}
	return strings.Join(names, "+")
}

// NewBreakdown computes the heat-path breakdown of a solution.
func NewBreakdown(sol *network.Solution) *Breakdown {
	edges := heatEdges(sol)
	idx := map[string]int{}
	for i, n := range sol.Nodes {
		idx[n.ID] = i
	}
	n := len(sol.Nodes)
	out := make([]float64, n) // heat leaving each node along arcs
	outArcs := make([][]int, n)
	inArcs := make([][]int, n)
	for k, e := range edges {
		a, b := idx[e.from], idx[e.to]
		out[a] += e.heat
		outArcs[a] = append(outArcs[a], k)
		inArcs[b] = append(inArcs[b], k)
	}
	fixed := func(i int) bool { return sol.Nodes[i].Kind == network.Fixed }
	// Sweep order: hottest first, so that an acyclic graph (heat flows
	// downhill in temperature except where air carries it) settles in
	// one sweep.
	order := make([]int, n)
	for i := range order {
		order[i] = i
	}
	sort.SliceStable(order, func(a, b int) bool { return sol.Nodes[order[a]].Temperature > sol.Nodes[order[b]].Temperature })

	b := &Breakdown{}
	ambient := sol.Net.Model.Ambient.Temperature
	for s, node := range sol.Nodes {
		var inj float64
		switch {
		case fixed(s):
			inj = out[s]
		case node.Power > 0:
			inj = node.Power
		}
		if !(inj > 0) || !finite(inj) {
			continue
		}
		// through[i]: the source's heat passing through node i.
		through := make([]float64, n)
		for sweep := 0; sweep < 10000; sweep++ {
			change := 0.0
			for _, i := range order {
				v := 0.0
				if i == s {
					v = inj
				} else {
					for _, k := range inArcs[i] {
						m := idx[edges[k].from]
						if (fixed(m) && m != s) || out[m] <= 0 {
							continue
						}
						v += through[m] * edges[k].heat / out[m]
					}
				}
				change = math.Max(change, math.Abs(v-through[i]))
				through[i] = v
			}
			if change <= 1e-13*inj {
				break
			}
		}
		sb := SourceBreakdown{Node: node.ID, Fixed: fixed(s), Heat: inj, Rise: node.Temperature - ambient, arcs: make([]float64, len(edges))}
		sinks := map[[2]string]*SinkShare{}
		var sinkOrder [][2]string
		for k, e := range edges {
			m := idx[e.from]
			if (fixed(m) && m != s) || out[m] <= 0 {
				continue
			}
			q := through[m] * e.heat / out[m]
			sb.arcs[k] = q
			if t := idx[e.to]; fixed(t) && t != s && q > 0 {
				key := [2]string{e.to, fmt.Sprint(e.air)}
				if sinks[key] == nil {
					sinks[key] = &SinkShare{Sink: e.to, Air: e.air}
					sinkOrder = append(sinkOrder, key)
				}
				sinks[key].Heat += q
			}
		}
		for _, key := range sinkOrder {
			sk := sinks[key]
			sk.Share = sk.Heat / inj
			sb.Sinks = append(sb.Sinks, *sk)
		}
		sort.SliceStable(sb.Sinks, func(i, j int) bool { return sb.Sinks[i].Heat > sb.Sinks[j].Heat })
		sb.Paths = mainPaths(sol, edges, idx, outArcs, s, sb.arcs, inj)
		if node.HasLimit {
			sb.Drops = drops(sol, edges, idx, sb.Paths, sb.Rise)
		}
		b.Sources = append(b.Sources, sb)
	}
	return b
}

// mainPaths decomposes a source's arc flows into paths, largest first.
func mainPaths(sol *network.Solution, edges []heatEdge, idx map[string]int, outArcs [][]int, s int, arcs []float64, inj float64) []HeatPath {
	left := append([]float64(nil), arcs...)
	var paths []HeatPath
	placed := 0.0
	for len(paths) < 8 && placed < 0.99*inj {
		at := s
		var route []int
		seen := map[int]bool{s: true}
		for {
			best, bestQ := -1, 0.0
			for _, k := range outArcs[at] {
				if left[k] > bestQ && !seen[idx[edges[k].to]] {
					best, bestQ = k, left[k]
				}
			}
			if best < 0 {
				break
			}
			route = append(route, best)
			at = idx[edges[best].to]
			seen[at] = true
			if sol.Nodes[at].Kind == network.Fixed {
				break
			}
		}
		if len(route) == 0 || sol.Nodes[at].Kind != network.Fixed {
			break
		}
		q := math.Inf(1)
		for _, k := range route {
			q = math.Min(q, left[k])
		}
		if !(q > 1e-12*inj) {
			break
		}
		p := HeatPath{Nodes: []string{sol.Nodes[s].ID}, Heat: q, Share: q / inj}
		for _, k := range route {
			left[k] -= q
			p.Nodes = append(p.Nodes, edges[k].to)
			p.Links = append(p.Links, arcLinks(edges[k]))
		}
		p.DeltaT = sol.Nodes[s].Temperature - sol.Nodes[at].Temperature
		p.Resistance = p.DeltaT / q
		paths = append(paths, p)
		placed += q
	}
	return paths
}

// drops ranks the arcs of the main paths (those carrying at least a tenth
// of the heat) by their temperature drop.
func drops(sol *network.Solution, edges []heatEdge, idx map[string]int, paths []HeatPath, rise float64) []ArcDrop {
	seen := map[string]bool{}
	var out []ArcDrop
	for pi, p := range paths {
		if pi > 0 && p.Share < 0.1 {
			continue
		}
		for i := 1; i < len(p.Nodes); i++ {
			from, to := p.Nodes[i-1], p.Nodes[i]
			key := from + "\x00" + to + "\x00" + p.Links[i-1]
			if seen[key] {
				continue
			}
			seen[key] = true
			d := ArcDrop{From: from, To: to, Links: p.Links[i-1],
				DeltaT: sol.Nodes[idx[from]].Temperature - sol.Nodes[idx[to]].Temperature}
			if rise > 0 {
				d.Share = d.DeltaT / rise
			}
			out = append(out, d)
		}
	}
	sort.SliceStable(out, func(i, j int) bool { return out[i].DeltaT > out[j].DeltaT })
	return out
}

// Source returns the breakdown of one source, or nil.
func (b *Breakdown) Source(id string) *SourceBreakdown {
	for i := range b.Sources {
		if b.Sources[i].Node == id {
			return &b.Sources[i]
		}
	}
	return nil
}
