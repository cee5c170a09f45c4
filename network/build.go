package network

import (
	"fmt"
	"slices"
	"sort"
	"strings"

	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/elements/air"
	"github.com/heatgraph/heatgraph/elements/dual"
	"github.com/heatgraph/heatgraph/internal/bigmem"
)

// Node is a node of the assembled network. Its temperature is the
// network's variable of the same index.
type Node struct {
	ID          string
	Kind        NodeKind
	Temperature float64 // K; the given temperature of a Fixed node
	Power       float64 // heat input, W
	Capacity    float64 // heat capacity, J/K; 0 when none is given
	Limit       float64 // K, when HasLimit
	HasLimit    bool
	Height      float64 // m, of an air node (stack effect)
	Pressure    float64 // Pa above ambient, of a fixed node in an air path
	Note        string
	Line        int
	// PowerProfile and TemperatureProfile, when not nil, give the heat
	// input or the fixed temperature during a run (Power and Temperature
	// are their values at t = 0).
	PowerProfile, TemperatureProfile Profile
}

// Fixed reports whether the node's temperature is given.
func (n *Node) Fixed() bool { return n.Kind == Fixed }

// Link is a link of the assembled network: one of the model's links or a
// leg of a component's compact model.
type Link struct {
	ID       string
	Kind     string // a link kind, or "junction-case"/"junction-board" for component legs
	From, To int    // node indices
	Note     string
	Line     int
	Element  elements.Element
}

// Network is a model assembled into variables and elements, ready to solve.
// It is not changed by solving, so one Network may be solved many times,
// at once too.
//
// Every quantity is a variable (Vars): the temperature of node i is
// variable i; pressures and mass flows follow. Every element reads
// variables and adds to the equations paired with them. Variables that are
// not given are the unknowns of the solve; the pattern of their Jacobian,
// and where each element's entries land in it, is worked out once, here.
type Network struct {
	Model *Model
	Nodes []Node
	Links []Link
	Index map[string]int // node id to index in Nodes
	Vars  []Variable
	Env   elements.Env

	sources []elements.Element // the heat inputs of nodes and components
	stores  []elements.Element // the heat capacities of nodes
	pvar    map[int]int        // node -> its pressure variable, for nodes in a solved air path
	plates  []*builtPlate      // meshed plates, in file order
	free    []int              // variable -> unknown index, -1 for given variables
	unknown []int              // unknown index -> variable
	asm     *assembly
	// given holds the given variables that follow a profile in time, and
	// profiles every profile of the network (for the jumps of a run).
	given    []givenProfile
	profiles []Profile
}

// Load reads, checks and assembles a model file. Any problem in the file,
// including a group of nodes with no path to a fixed temperature, is
// reported in the returned Problems.
func Load(path string) (*Network, error) {
	m, err := ReadFile(path)
	if err != nil {
		return nil, err
	}
	return Build(m)
}

// Build assembles a checked model into a network.
func Build(m *Model) (*Network, error) {
	net := &Network{
		Model: m,
		Index: map[string]int{},
		Env: elements.Env{
			Pressure: m.Ambient.Pressure,
			Gravity:  elements.StandardGravity,
			AmbientT: m.Ambient.Temperature,
			AirCp:    air.SpecificHeat(dual.C(m.Ambient.Temperature)).V,
		},
	}
	var problems Problems
	add := func(n Node) int {
		i := len(net.Nodes)
		net.Nodes = append(net.Nodes, n)
		net.Index[n.ID] = i
		// A plate's node is given: its value is its hottest cell's,
		// set at each solution, and no balance is paired with it.
		v := Variable{Kind: TemperatureVar, Owner: n.ID, Given: n.Fixed() || n.Kind == Plate, Value: m.Ambient.Temperature}
		if n.Fixed() {
			v.Value = n.Temperature
		}
		net.addVar(v)
		if n.Power != 0 || n.PowerProfile != nil {
			h := &elements.HeatInput{Node: i, Q: n.Power}
			if n.PowerProfile != nil {
				h.Of = n.PowerProfile
				net.profiles = append(net.profiles, n.PowerProfile)
			}
			net.sources = append(net.sources, h)
		}
		if n.Fixed() && n.TemperatureProfile != nil {
			net.given = append(net.given, givenProfile{v: i, p: n.TemperatureProfile})
			net.profiles = append(net.profiles, n.TemperatureProfile)
		}
		if n.Capacity > 0 {
			net.stores = append(net.stores, &elements.Capacity{Node: i, C: n.Capacity})
		}
		return i
	}
	add(Node{ID: AmbientID, Kind: Fixed, Temperature: m.Ambient.Temperature, Line: m.Ambient.Line, Note: "ambient air and surroundings", TemperatureProfile: m.Ambient.TemperatureProfile})
	for _, s := range m.Nodes {
		add(Node{ID: s.ID, Kind: s.Kind, Temperature: s.Temperature, Power: s.Power, Capacity: s.Capacity, Limit: s.Limit, HasLimit: s.HasLimit, Height: s.Height, Pressure: s.Pressure, Note: s.Note, Line: s.Line,
			PowerProfile: s.PowerProfile, TemperatureProfile: s.TemperatureProfile})
	}
	net.addPlateNodes(m, add)
	for _, c := range m.Components {
		j := add(Node{ID: c.ID, Kind: Junction, Power: c.Power, Capacity: c.Capacity, Limit: c.Limit, HasLimit: c.HasLimit, Note: c.Note, Line: c.Line, PowerProfile: c.PowerProfile})
		legs := []struct {
			kind, end, suffix string
			r                 float64
		}{{"junction-case", c.Case, ".jc", c.RJC}, {"junction-board", c.Board, ".jb", c.RJB}}
		for _, leg := range legs {
			if leg.end == "" || (leg.kind == "junction-board" && c.Placed) {
				continue // a part placed on a plate joins it through the plate's element
			}
			el, err := elements.Resistance(j, net.Index[leg.end], leg.r)
			if err != nil {
				problems = append(problems, Problem{File: m.File, Line: c.Line, Field: "components[" + c.ID + "]", Message: err.Error()})
				continue
			}
			net.Links = append(net.Links, Link{ID: c.ID + leg.suffix, Kind: leg.kind, From: j, To: net.Index[leg.end], Line: c.Line, Element: el})
		}
	}
	problems = append(problems, net.buildPlates(m)...)
	net.assignPressures()
	for _, l := range m.Links {
		a, b := net.Index[l.From], net.Index[l.To]
		others := make([]int, len(l.Others))
		for i, id := range l.Others {
			others[i] = net.Index[id]
		}
		el, err := l.Params.element(linkEnv{from: a, to: b, others: others, env: &net.Env, net: net, link: l.ID})
		if err != nil {
			problems = append(problems, Problem{File: m.File, Line: l.Line, Field: "links[" + l.ID + "]", Message: err.Error()})
			continue
		}
		net.Links = append(net.Links, Link{ID: l.ID, Kind: l.Kind, From: a, To: b, Note: l.Note, Line: l.Line, Element: el})
	}
	net.startFlows()
	for _, e := range m.Enclosures {
		links, err := net.enclosureLinks(e)
		if err != nil {
			problems = append(problems, Problem{File: m.File, Line: e.Line, Field: "enclosures[" + e.ID + "]", Message: err.Error()})
			continue
		}
		net.Links = append(net.Links, links...)
	}
	problems = append(problems, m.isolated()...)
	if len(problems) > 0 {
		return nil, problems.sorted()
	}
	net.free = bigmem.Make[int](len(net.Vars))
	net.unknown = bigmem.MakeCap[int](0, len(net.Vars))
	for i := range net.Vars {
		if net.Vars[i].Given {
			net.free[i] = -1
			continue
		}
		net.free[i] = len(net.unknown)
		net.unknown = append(net.unknown, i)
	}
	net.asm = net.assemble()
	return net, nil
}

// isolated reports every group of nodes that no chain of links joins to a
// node of fixed temperature: their temperatures would be undetermined.
func (m *Model) isolated() Problems {
	type entry struct {
		id    string
		line  int
		fixed bool
		plate bool
	}
	nodes := []entry{{id: AmbientID, line: m.Ambient.Line, fixed: true}}
	for _, n := range m.Nodes {
		nodes = append(nodes, entry{n.ID, n.Line, n.Kind == Fixed, false})
	}
	for _, c := range m.Components {
		nodes = append(nodes, entry{c.ID, c.Line, false, false})
	}
	for _, p := range m.Plates {
		nodes = append(nodes, entry{p.ID, p.Line, false, true})
	}
	index := make(map[string]int, len(nodes))
	parent := make([]int, len(nodes))
	for i, n := range nodes {
		index[n.id] = i
		parent[i] = i
	}
	find := func(i int) int {
		for parent[i] != i {
			parent[i] = parent[parent[i]]
			i = parent[i]
		}
		return i
	}
	join := func(a, b string) {
		ia, okA := index[a]
		ib, okB := index[b]
		if okA && okB {
			parent[find(ia)] = find(ib)
		}
	}
	for _, c := range m.Components {
		if c.Case != "" {
			join(c.ID, c.Case)
		}
		if c.Board != "" {
			join(c.ID, c.Board)
		}
	}
	for _, p := range m.Plates {
		for _, f := range p.Faces {
			join(p.ID, f.To)
		}
	}
	for _, l := range m.Links {
		join(l.From, l.To)
		for _, o := range l.Others {
			join(l.From, o)
		}
	}
	// An enclosure joins only the surfaces that see each other, and a
	// surface to its open_to node only when part of its view is left to
	// it: the radiosity exchange between two nodes is non-zero exactly
	// when a chain of non-zero view factors joins them.
	for _, e := range m.Enclosures {
		for i, s := range e.Surfaces {
			for j, t := range e.Surfaces {
				if e.sees(i, j) {
					join(s.Node, t.Node)
				}
			}
			if e.toOpen(i) {
				join(s.Node, e.OpenTo)
			}
		}
	}
	anchored := map[int]bool{}
	for i, n := range nodes {
		if n.fixed {
			anchored[find(i)] = true
		}
	}
	groups := map[int][]int{}
	var roots []int
	for i := range nodes {
		r := find(i)
		if anchored[r] {
			continue
		}
		if groups[r] == nil {
			roots = append(roots, r)
		}
		groups[r] = append(groups[r], i)
	}
	var out Problems
	for _, r := range roots {
		g := groups[r]
		sort.SliceStable(g, func(a, b int) bool { return nodes[g[a]].line < nodes[g[b]].line })
		ids := make([]string, len(g))
		for k, i := range g {
			ids[k] = nodes[i].id
		}
		what := fmt.Sprintf("node %q has", ids[0])
		if len(ids) > 1 {
			what = fmt.Sprintf("nodes %s have", quoteList(ids))
		}
		if len(ids) == 1 && nodes[g[0]].plate {
			out = append(out, Problem{File: m.File, Line: nodes[g[0]].line, Field: "plates[" + ids[0] + "].faces",
				Message: fmt.Sprintf("plate %q has no path to any fixed temperature, so its temperatures are undetermined (join a face to ambient or to a node that leads there, e.g. faces: [{face: top, to: ambient, h: 5 W/(m2 K)}])", ids[0])})
			continue
		}
		out = append(out, Problem{File: m.File, Line: nodes[g[0]].line, Field: "nodes",
			Message: what + " no path to any fixed temperature, so the temperature is undetermined (link them to ambient or to a kind: fixed node, e.g. with a convection link)"})
	}
	return out
}

func quoteList(ids []string) string {
	q := make([]string, len(ids))
	for i, id := range ids {
		q[i] = fmt.Sprintf("%q", id)
	}
	if len(q) > 12 {
		q = append(q[:12], fmt.Sprintf("and %d more", len(ids)-12))
	}
	return strings.Join(q, ", ")
}

// Unknowns returns the number of unknowns the solve finds.
func (net *Network) Unknowns() int { return len(net.unknown) }

// WithCoefficients returns a copy of the network in which the links named
// in scale have their correlation's coefficient multiplied by the given
// factor (links without a correlation coefficient are left as they are):
// for sampling the correlations' accuracy. The copy shares everything
// else with net and has the same unknowns and Jacobian pattern.
func (net *Network) WithCoefficients(scale map[string]float64) *Network {
	c := *net
	c.Links = append([]Link(nil), net.Links...)
	same := true // whether every scaled element has its original's entries
	for i, l := range c.Links {
		if k, ok := scale[l.ID]; ok {
			if el, scaled := elements.ScaleCoefficient(l.Element, k); scaled {
				c.Links[i].Element = el
				same = same && sameEntries(l.Element, el)
			}
		}
	}
	if same && net.asm != nil {
		// The positions are the same: only the elements change.
		a := *net.asm
		a.elems = c.allElements()
		c.asm = &a
	} else {
		c.asm = c.assemble()
	}
	return &c
}

// sameEntries reports whether element b has a's rows and vars and stamps
// the same way (densely, or by the same kind of pattern), so that a's
// resolved positions serve b.
func sameEntries(a, b elements.Element) bool {
	_, pa := a.(elements.Patterned)
	_, pb := b.(elements.Patterned)
	_, sa := a.(elements.Storage)
	_, sb := b.(elements.Storage)
	return !pa && !pb && sa == sb && slices.Equal(a.Rows(), b.Rows()) && slices.Equal(a.Vars(), b.Vars())
}
