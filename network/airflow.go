package network

import (
	"fmt"
	"math"
	"sort"

	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/elements/air"
	"github.com/heatgraph/heatgraph/elements/dual"
	"github.com/heatgraph/heatgraph/units"
	"gopkg.in/yaml.v3"
)

// Solved airflow. A link whose flow the solve finds is a branch: it has a
// mass-flow unknown paired with its momentum balance, and each of its ends
// has a pressure: an unknown paired with the node's mass balance at an air
// node, a given value (0, or the node's pressure:) at a fixed node or
// ambient. Given flows (flow:, mass_flow:) stay given and add their mass
// to the balances of the ends that have a pressure, so both kinds mix.

// branchParams is implemented by the parameters of links whose flow is
// solved for.
type branchParams interface {
	// solved reports whether the link's flow is an unknown.
	solved() bool
}

// solvedBranch reports whether the link l is a branch with a solved flow.
func (l *LinkSpec) solvedBranch() bool {
	b, ok := l.Params.(branchParams)
	return ok && b.solved()
}

// branchEnds returns the nodes the air of link l runs between: a
// channel's inlet and outlet, or its from and to.
func (l *LinkSpec) branchEnds() (up, down string) {
	if c, ok := l.Params.(airCarrier); ok {
		up, down, _ = c.air(l)
		return up, down
	}
	return l.From, l.To
}

// solvedAirNodes returns the nodes at the ends of solved branches.
func (m *Model) solvedAirNodes() map[string]bool {
	out := map[string]bool{}
	for i := range m.Links {
		if l := &m.Links[i]; l.solvedBranch() {
			up, down := l.branchEnds()
			out[up], out[down] = true, true
		}
	}
	return out
}

// assignPressures gives every end of a solved branch its pressure
// variable.
func (net *Network) assignPressures() {
	net.pvar = map[int]int{}
	for i := range net.Model.Links {
		l := &net.Model.Links[i]
		if !l.solvedBranch() {
			continue
		}
		up, down := l.branchEnds()
		for _, id := range []string{up, down} {
			n := net.Index[id]
			if _, ok := net.pvar[n]; ok {
				continue
			}
			node := &net.Nodes[n]
			v := Variable{Kind: PressureVar, Owner: node.ID}
			if node.Fixed() {
				v.Given, v.Value = true, node.Pressure
			}
			net.pvar[n] = net.addVar(v)
		}
	}
}

// pressure returns the pressure variable of node n, or −1.
func (e linkEnv) pressure(n int) int {
	if v, ok := e.net.pvar[n]; ok {
		return v
	}
	return -1
}

// carried joins a given flow's mass to the balances of its ends, where
// they have pressures: el carries the heat, from up to down at the flow
// variable flow.
func (e linkEnv) carried(el elements.Element, up, down, flow int) elements.Element {
	pu, pd := e.pressure(up), e.pressure(down)
	if pu < 0 && pd < 0 {
		return el
	}
	return elements.Combine(el, elements.NewAirway(elements.Airway{From: up, To: down, PFrom: pu, PTo: pd, Flow: flow}))
}

// solvedFlow reports whether a channel's flow is the word solved.
func solvedFlow(o *object) bool {
	v, ok := o.values["flow"]
	return ok && v.Kind == yaml.ScalarNode && v.Value == "solved" && !o.has("mass_flow")
}

func (c *Channel) solved() bool { return c.Solved }

// solvedElement builds channels whose flow is solved for: the Channel's
// heat transfer and the airway from inlet to outlet with the channels'
// pressure drop as its law.
func (c *Channel) solvedElement(e linkEnv) (elements.Element, error) {
	law := &elements.ChannelFlow{Geometry: c.Geometry, Options: c.Options, Upstream: c.Upstream}
	in := e.others[0]
	aw, flow, err := branch{}.airway(e, law, in, e.to)
	if err != nil {
		return nil, err
	}
	ch := elements.NewReversibleChannel(elements.Channel{Wall: e.from, Inlet: in, Outlet: e.to, Flow: flow,
		Geometry: c.Geometry, Options: c.Options, Upstream: c.Upstream, Downstream: c.Downstream})
	return elements.Combine(ch, aw), nil
}

// branch is what every branch kind's parameters share: the opening's
// elevation.
type branch struct {
	Elevation    float64 // m
	HasElevation bool
}

func (branch) solved() bool { return true }

// readBranch reads the keys every branch kind takes.
func readBranch(o *object) (branch, bool) {
	var b branch
	if o.has("elevation") {
		z, ok := o.quantity("elevation", units.Length)
		if !ok {
			return b, false
		}
		b.Elevation, b.HasElevation = z, true
	}
	return b, true
}

// elevationKey is the key every branch kind takes.
var elevationKey = keySpec{name: "elevation", dim: units.Length, help: "height of the opening, for the stack effect; default: the mean height of its air ends"}

// branchEnds are the ends every branch kind takes.
var branchEnds = []endRule{{"from", "the air's origin", airwayKinds}, {"to", "the air's destination", airwayKinds}}

// element builds a solved branch with the law: a reversible stream that
// carries the air's heat, and the airway with its mass and momentum
// balances.
func (b branch) element(e linkEnv, law elements.FlowLaw) (elements.Element, error) {
	aw, flow, err := b.airway(e, law, e.from, e.to)
	if err != nil {
		return nil, err
	}
	return elements.Combine(&elements.Stream{Up: e.from, Down: e.to, Flow: flow, Reversible: true}, aw), nil
}

// airway builds the airway of a solved branch from node a to node b, with
// its flow variable.
func (b branch) airway(e linkEnv, law elements.FlowLaw, a, bb int) (*elements.Airway, int, error) {
	net := e.net
	rho0 := air.Density(dual.C(net.Env.AmbientT), net.Env.Pressure).V
	start := 1e-3
	if s, ok := law.(elements.Starter); ok {
		start = s.StartFlow(rho0)
	}
	flow := net.addVar(Variable{Kind: MassFlowVar, Owner: e.link, Value: start})
	nf, nt := &net.Nodes[a], &net.Nodes[bb]
	w := elements.Airway{From: a, To: bb, PFrom: e.pressure(a), PTo: e.pressure(bb), Flow: flow, Law: law,
		ZFrom: nf.Height, ZTo: nt.Height, ColumnFrom: nf.Kind == Air, ColumnTo: nt.Kind == Air}
	switch {
	case b.HasElevation:
		w.ZOpen = b.Elevation
	case w.ColumnFrom && w.ColumnTo:
		w.ZOpen = (w.ZFrom + w.ZTo) / 2
	case w.ColumnFrom:
		w.ZOpen = w.ZFrom
	case w.ColumnTo:
		w.ZOpen = w.ZTo
	}
	if w.PFrom < 0 || w.PTo < 0 {
		return nil, 0, fmt.Errorf("internal: branch ends without pressures")
	}
	return elements.NewAirway(w), flow, nil
}

// airwayOf returns the airway of a link's element, or nil.
func airwayOf(el elements.Element) *elements.Airway {
	switch x := el.(type) {
	case *elements.Airway:
		return x
	case *elements.Combined:
		return x.Airway()
	}
	return nil
}

// MassBalance is the mass balance of one air node in a solved air path, or
// the air leaving the network through one fixed node.
type MassBalance struct {
	Node      string
	In, Out   float64 // kg/s
	Imbalance float64 // In − Out, kg/s; round-off at a converged solution
	Fixed     bool    // a fixed node or ambient: air enters or leaves the network here
}

// BranchResult is the flow through one link that carries air.
type BranchResult struct {
	Link                     string
	Kind                     string
	From, To                 string
	Solved                   bool    // the flow is an unknown of the solve (else it is given)
	MassFlow                 float64 // kg/s, positive from From to To
	VolumeFlow               float64 // m³/s at the mean density of the ends
	Density                  float64 // kg/m³
	Velocity                 float64 // m/s, where the law has an area; 0 otherwise
	PressureFrom, PressureTo float64 // Pa above ambient at the ends' heights
	Rise                     float64 // what the law adds, Pa (negative for a loss, a fan's rise for a fan)
	Stack                    float64 // the stack (buoyancy) term, Pa
	Share                    float64 // |ṁ| over the largest air flow into or out of the network
	Fan                      *elements.Operating
	Warnings                 []string
}

// airflowResults computes the branches and the mass balances at a
// solution.
func (net *Network) airflowResults(s *elements.State) ([]BranchResult, []MassBalance) {
	var out []BranchResult
	in, outm := map[int]float64{}, map[int]float64{}
	for _, l := range net.Links {
		w := airwayOf(l.Element)
		if w == nil {
			continue
		}
		m, q, rise, stack, rho := w.Operating(s)
		br := BranchResult{Link: l.ID, Kind: l.Kind, From: net.Nodes[w.From].ID, To: net.Nodes[w.To].ID, Solved: w.Law != nil,
			MassFlow: m, VolumeFlow: q, Density: rho, Rise: rise, Stack: stack}
		if w.PFrom >= 0 {
			br.PressureFrom = s.X[w.PFrom]
		}
		if w.PTo >= 0 {
			br.PressureTo = s.X[w.PTo]
		}
		if w.Law != nil {
			rep := w.Report(s)
			for _, d := range rep.Details {
				if d.Name == "velocity" {
					br.Velocity = d.Value
				}
			}
			br.Warnings = rep.Warnings
			if f, ok := w.Law.(*elements.Fan); ok {
				op := f.OperatingPoint(m, s.X[w.From], s.Env.Pressure)
				br.Fan = &op
			}
		}
		up, down := w.From, w.To
		if m < 0 {
			up, down, m = down, up, -m
		}
		outm[up] += m
		in[down] += m
		out = append(out, br)
	}
	var mb []MassBalance
	total := 0.0
	nodes := make([]int, 0, len(in)+len(outm))
	seen := map[int]bool{}
	for _, mp := range []map[int]float64{in, outm} {
		for n := range mp {
			if !seen[n] {
				seen[n] = true
				nodes = append(nodes, n)
			}
		}
	}
	sort.Ints(nodes)
	for _, n := range nodes {
		b := MassBalance{Node: net.Nodes[n].ID, In: in[n], Out: outm[n], Imbalance: in[n] - outm[n], Fixed: net.Nodes[n].Fixed()}
		if b.Fixed {
			total += b.Out
		}
		mb = append(mb, b)
	}
	for i := range out {
		if total > 0 {
			out[i].Share = math.Abs(out[i].MassFlow) / total
		}
	}
	return out, mb
}

// readTable reads key as a list of [x, y] pairs with the given kinds, e.g.
// [[0, 120 Pa], [10 CFM, 90 Pa]].
func readTable(o *object, key string, xk, yk units.Kind, need bool) (xs, ys []float64, ok bool) {
	v, has := o.values[key]
	if !has {
		if need {
			o.missing(key, fmt.Sprintf("a list of [%s, %s] points, e.g. [[0, 120 Pa], [20 CFM, 60 Pa]]", xk, yk))
		}
		return nil, nil, false
	}
	items := o.r.list(v, o.field(key), fmt.Sprintf("[%s, %s] points", xk, yk))
	if items == nil {
		return nil, nil, false
	}
	ok = true
	for i, it := range items {
		it = deref(it)
		if it.Kind != yaml.SequenceNode || len(it.Content) != 2 {
			o.r.addf(it, fmt.Sprintf("%s[%d]", o.field(key), i), "expected a [%s, %s] pair such as [10 CFM, 50 Pa], got %s", xk, yk, describe(it))
			ok = false
			continue
		}
		var pair [2]float64
		for j, k := range []units.Kind{xk, yk} {
			n := deref(it.Content[j])
			x, err := units.Parse(n.Value, k)
			if n.Kind != yaml.ScalarNode || err != nil {
				msg := fmt.Sprintf("expected %s such as %q", withArticle(k.String()), example(k))
				if err != nil {
					msg = err.Error()
				}
				o.r.addf(n, fmt.Sprintf("%s[%d]", o.field(key), i), "%s", msg)
				ok = false
				continue
			}
			pair[j] = x
		}
		xs, ys = append(xs, pair[0]), append(ys, pair[1])
	}
	return xs, ys, ok
}

// gauge reads a pressure difference that must be above zero (a drop or a
// rise, not an absolute pressure).
func gauge(o *object, key string) (float64, bool) {
	x, ok := o.required(key, units.Pressure)
	if ok && !(x > 0) {
		o.r.addf(o.values[key], o.field(key), "%q must be greater than zero (a pressure difference such as 25 Pa or 0.1 inH2O)", o.values[key].Value)
		return 0, false
	}
	return x, ok
}

// startFlows sets where the solve starts the flows of passive branches.
// With running fans, each starts at the flow at which its own drop is half
// the largest shut-off pressure, but at most the largest fan's start (half
// its free delivery): parts in series then start near the fan's flow, a
// narrow bypass at the little it passes, so that no quadratic loss starts
// far from its share. With given flows and no fans, each starts at the
// largest given flow. Otherwise each starts at its own estimate (1 m/s
// through an opening, say).
func (net *Network) startFlows() {
	fan, given, shut := 0.0, 0.0, 0.0
	for _, v := range net.Vars {
		if v.Kind == MassFlowVar && v.Given {
			given = math.Max(given, math.Abs(v.Value))
		}
	}
	t0 := dual.C(net.Env.AmbientT)
	p := net.Env.Pressure
	for _, l := range net.Links {
		if w := airwayOf(l.Element); w != nil {
			if f, ok := w.Law.(*elements.Fan); ok && !f.Stopped {
				fan = math.Max(fan, net.Vars[w.Flow].Value)
				shut = math.Max(shut, f.Rise(dual.C(0), t0, t0, p).V)
			}
		}
	}
	for _, l := range net.Links {
		w := airwayOf(l.Element)
		if w == nil || w.Law == nil {
			continue
		}
		if f, ok := w.Law.(*elements.Fan); ok && !f.Stopped {
			continue
		}
		switch {
		case fan > 0 && shut > 0:
			net.Vars[w.Flow].Value = math.Min(flowAtDrop(w.Law, shut/2, t0, p), fan)
		case given > 0:
			net.Vars[w.Flow].Value = given
		}
	}
}

// flowAtDrop returns the forward flow at which a passive law's drop is dp,
// by bisection (a passive drop rises with the flow).
func flowAtDrop(law elements.FlowLaw, dp float64, t0 dual.Num, p float64) float64 {
	drop := func(m float64) float64 { return -law.Rise(dual.C(m), t0, t0, p).V }
	hi := 1e-4
	for i := 0; i < 60 && drop(hi) < dp; i++ {
		hi *= 2
	}
	lo := 0.0
	for i := 0; i < 60; i++ {
		mid := (lo + hi) / 2
		if drop(mid) < dp {
			lo = mid
		} else {
			hi = mid
		}
	}
	return (lo + hi) / 2
}

// closedAir reports every group of air nodes that solved branches join to
// each other but to no fixed node or ambient: with no given pressure
// among them, their pressures would be undetermined (any constant could
// be added to all of them).
func (m *Model) closedAir() Problems {
	parent := map[string]string{}
	find := func(a string) string {
		for parent[a] != a {
			parent[a] = parent[parent[a]]
			a = parent[a]
		}
		return a
	}
	kind := map[string]NodeKind{AmbientID: Fixed}
	line := map[string]int{}
	for _, n := range m.Nodes {
		kind[n.ID], line[n.ID] = n.Kind, n.Line
	}
	for i := range m.Links {
		l := &m.Links[i]
		if !l.solvedBranch() {
			continue
		}
		up, down := l.branchEnds()
		for _, id := range []string{up, down} {
			if _, ok := parent[id]; !ok {
				parent[id] = id
			}
		}
		parent[find(up)] = find(down)
	}
	open := map[string]bool{}
	for id := range parent {
		if kind[id] == Fixed {
			open[find(id)] = true
		}
	}
	groups := map[string][]string{}
	for id := range parent {
		if r := find(id); !open[r] {
			groups[r] = append(groups[r], id)
		}
	}
	var ps Problems
	for _, g := range groups {
		sort.Slice(g, func(a, b int) bool { return line[g[a]] < line[g[b]] })
		ps = append(ps, Problem{File: m.File, Line: line[g[0]], Field: "nodes[" + g[0] + "]",
			Message: fmt.Sprintf("the air of %s is joined by fans and losses to no fixed node or ambient, so its pressure is undetermined (open the path to ambient, e.g. with a loss link, or give a fixed node a pressure)", quoteList(g))})
	}
	if len(ps) == 0 {
		ps = append(ps, m.deadEnds(kind, line)...)
	}
	return ps
}

// deadEnds reports the air nodes of a solved flow network that air can
// reach by one way only: every path from them to a fixed node or ambient
// crosses one branch (a bridge of the graph of solved branches, with every
// fixed node taken as one), so by mass conservation no air flows through
// them, and heat given to their air has nowhere to go with it. A fan
// blowing into a box with no outlet is the usual cause.
func (m *Model) deadEnds(kind map[string]NodeKind, line map[string]int) Problems {
	const outside = "\x00outside"
	name := func(id string) string {
		if kind[id] == Fixed {
			return outside
		}
		return id
	}
	type edge struct{ a, b string }
	var edges []edge
	adj := map[string][]int{}
	add := func(up, down string) {
		a, b := name(up), name(down)
		if a == b {
			return
		}
		adj[a] = append(adj[a], len(edges))
		adj[b] = append(adj[b], len(edges))
		edges = append(edges, edge{a, b})
	}
	solved := 0
	for i := range m.Links {
		l := &m.Links[i]
		switch {
		case l.solvedBranch():
			add(l.branchEnds())
			solved++
		default:
			// A given flow moves air too.
			if up, down, _, ok := l.airflow(); ok {
				add(up, down)
			}
		}
	}
	if solved == 0 || adj[outside] == nil {
		return nil
	}
	// Bridges by depth-first search (Tarjan 1974): an edge to a child
	// whose subtree reaches no earlier node.
	order, low := map[string]int{}, map[string]int{}
	bridge := make([]bool, len(edges))
	n := 0
	var visit func(v string, via int)
	visit = func(v string, via int) {
		order[v], low[v] = n, n
		n++
		for _, e := range adj[v] {
			if e == via {
				continue
			}
			w := edges[e].a
			if w == v {
				w = edges[e].b
			}
			if _, seen := order[w]; !seen {
				visit(w, e)
				low[v] = min(low[v], low[w])
				if low[w] > order[v] {
					bridge[e] = true
				}
			} else {
				low[v] = min(low[v], order[w])
			}
		}
	}
	visit(outside, -1)
	// The nodes still joined to the outside without the bridges carry
	// air; the others are dead ends.
	reach := map[string]bool{outside: true}
	stack := []string{outside}
	for len(stack) > 0 {
		v := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		for _, e := range adj[v] {
			if bridge[e] {
				continue
			}
			w := edges[e].a
			if w == v {
				w = edges[e].b
			}
			if !reach[w] {
				reach[w] = true
				stack = append(stack, w)
			}
		}
	}
	var dead []string
	for v := range adj {
		if !reach[v] && kind[v] == Air {
			dead = append(dead, v)
		}
	}
	if len(dead) == 0 {
		return nil
	}
	sort.Slice(dead, func(a, b int) bool { return line[dead[a]] < line[dead[b]] })
	return Problems{{File: m.File, Line: line[dead[0]], Field: "nodes[" + dead[0] + "]",
		Message: fmt.Sprintf("air can reach %s by one way only, so no air flows through it and its heat cannot leave with the air (give it an outlet: a loss, vent or stream to ambient or to another air node)", quoteList(dead))}}
}
