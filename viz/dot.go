package viz

import (
	"fmt"
	"math"
	"strings"

	"github.com/awalterschulze/gographviz"
	"github.com/heatgraph/heatgraph/network"
)

// Colouring selects what the node fill shows.
type Colouring string

// Node colourings.
const (
	ColourMargin      Colouring = "margin"      // margin to the node's limit
	ColourTemperature Colouring = "temperature" // temperature between ambient and the hottest node
)

// Colourings lists the valid colourings.
var Colourings = []Colouring{ColourMargin, ColourTemperature}

// DOT returns the heat-path diagram of a solution in the DOT language,
// with the default options and the given colouring (see DOTWith).
func DOT(sol *network.Solution, colouring Colouring) (string, error) {
	return DOTWith(sol, DiagramOptions{Colouring: colouring})
}

// DOTWith returns the heat-path diagram of a solution in the DOT language.
//
// Nodes show their temperature, their margin and status word where they
// have a limit, and their heat input; the fill follows the chosen
// colouring, the outline the status. Edges point the way heat flows, carry
// its value in watts, grow thicker with it, and are drawn in the line
// style of their kind of link (see linkStyle). Nodes of a group are drawn
// in a box of their own, or as one node. A legend explains it all.
func DOTWith(sol *network.Solution, opt DiagramOptions) (string, error) {
	if opt.Colouring == "" {
		opt.Colouring = ColourMargin
	}
	g := gographviz.NewGraph()
	const name = "heatpaths"
	d := &dotBuilder{g: g, name: name}
	d.check(g.SetName(name))
	d.check(g.SetDir(true))
	for k, v := range map[string]string{
		"rankdir":  "LR",
		"fontname": q("Helvetica"),
		"fontsize": "11",
		"label":    q(diagramHeader(sol, opt)),
		"labelloc": "t",
		"nodesep":  "0.35",
		"ranksep":  "0.6",
	} {
		d.check(g.AddAttr(name, k, v))
	}

	tMin, tMax := sol.Net.Model.Ambient.Temperature, sol.Net.Model.Ambient.Temperature
	for _, n := range sol.Nodes {
		tMin, tMax = math.Min(tMin, n.Temperature), math.Max(tMax, n.Temperature)
	}
	ds := newDiagramState(sol, opt)
	edges := ds.edges
	// A fixed node with several links is drawn once at each of them: one
	// node joined to every part of the box makes the layout slow (Graphviz
	// draws its long edges through every rank) and the picture a tangle.
	links := map[string]int{}
	for _, e := range edges {
		links[e.from]++
		links[e.to]++
	}
	ids := map[string]bool{}
	for _, n := range ds.nodes {
		ids[n.ID] = true
	}
	copies := map[string][]string{} // DOT node names of each split fixed node
	split := func(id string, kind network.NodeKind) string {
		if kind != network.Fixed || links[id] < 2 {
			return id
		}
		drawn := fmt.Sprintf("%s#%d", id, len(copies[id])+1)
		for ids[drawn] {
			drawn += "#"
		}
		ids[drawn] = true
		copies[id] = append(copies[id], drawn)
		return drawn
	}
	kinds := map[string]network.NodeKind{}
	for _, n := range ds.nodes {
		kinds[n.ID] = n.Kind
	}
	for i := range edges {
		edges[i].fromName = split(edges[i].from, kinds[edges[i].from])
		edges[i].toName = split(edges[i].to, kinds[edges[i].to])
	}

	steps := marginScaleFor(sol.Net.Model.RequiredMargin)
	plates := plateByID(sol)
	for _, n := range ds.nodes {
		fill := nodeFill(n, opt.Colouring, tMin, tMax, steps)
		attrs := map[string]string{
			"label":     q(compareLabel(nodeLabel(n, ds.members[n.ID]), n, opt)),
			"shape":     nodeShape(n.Kind),
			"style":     q("filled,rounded"),
			"fillcolor": q(fill.hex()),
			"fontcolor": q(textOn(fill)),
			"fontname":  q("Helvetica"),
			"fontsize":  "10",
			"color":     q("#5a5a5a"),
			"tooltip":   q(nodeTooltip(n, ds.members[n.ID])),
		}
		switch n.Status {
		case network.Over:
			attrs["penwidth"] = "3.5"
			attrs["color"] = q(overOutline)
		case network.Tight:
			attrs["penwidth"] = "2.5"
			attrs["color"] = q(tightOutline)
			attrs["style"] = q("filled,rounded,dashed")
		}
		if n.Kind == plateKind {
			plateNodeAttrs(attrs, n, plates[n.ID], opt)
		}
		names := copies[n.ID]
		if len(names) == 0 {
			names = []string{n.ID}
		} else {
			attrs["tooltip"] = q(fmt.Sprintf("%s: drawn at each of its %d links", n.ID, len(names)))
		}
		parent := name
		if gr := ds.group[n.ID]; gr != "" && len(copies[n.ID]) == 0 {
			parent = d.cluster(gr)
		}
		for _, drawn := range names {
			d.check(g.AddNode(parent, q(drawn), attrs))
		}
	}

	qMax := 0.0
	for _, e := range edges {
		qMax = math.Max(qMax, e.heat)
	}
	for _, e := range edges {
		attrs := edgeAttrsFor(e, qMax, opt)
		if e.fromName != e.from || e.toName != e.to {
			// A copy of a fixed node hangs off its neighbour: leave the
			// straightening to the paths between the nodes that matter,
			// or a long chain becomes a staircase.
			attrs["weight"] = "0"
		}
		d.check(g.AddEdge(q(e.fromName), q(e.toName), true, attrs))
	}
	d.legendFor(sol, opt, tMin, tMax, len(copies) > 0, ds)
	if d.err != nil {
		return "", d.err
	}
	return g.String(), nil
}

// heatEdge is one arrow of the diagram: the heat between two nodes, in the
// direction it flows, summed over the links that carry it.
type heatEdge struct {
	from, to         string // node ids, heat flows from -> to
	fromName, toName string // DOT node names (a split fixed node's copy)
	heat             float64
	air              bool // heat carried by moving air
	// flow is the solved volume flow (m³/s) of the air on this path, when
	// every part of it is a solved branch; hasFlow says so.
	flow    float64
	hasFlow bool
	parts   []edgePart
}

type edgePart struct {
	what string  // "id (kind)" or "id: air from inlet"
	kind string  // the link's kind
	heat float64 // W, positive from -> to of the edge
}

func (e heatEdge) tooltip() string {
	if len(e.parts) == 1 {
		return e.parts[0].what
	}
	items := make([]string, len(e.parts))
	for i, p := range e.parts {
		items[i] = fmt.Sprintf("%s %s", p.what, watts(p.heat))
	}
	return fmt.Sprintf("%d links, %s in all: %s", len(e.parts), watts(e.heat), strings.Join(items, "; "))
}

// heatEdges merges the links of a solution into arrows: links between the
// same two nodes become one arrow with their heat summed (conduction,
// convection and radiation side by side), so that the diagram has one
// arrow per path; heat carried by air is kept apart from heat conducted.
// Arrows point the way the net heat flows. The order follows the model.
func heatEdges(sol *network.Solution) []heatEdge {
	type key struct {
		a, b string
		air  bool
	}
	index := map[key]int{}
	var edges []heatEdge
	add := func(from, to string, heat float64, air bool, what, kind string) int {
		a, b, sign := from, to, 1.0
		if b < a {
			a, b, sign = b, a, -1
		}
		k := key{a, b, air}
		i, ok := index[k]
		if !ok {
			i = len(edges)
			index[k] = i
			edges = append(edges, heatEdge{from: a, to: b, air: air})
		}
		edges[i].heat += sign * heat
		edges[i].parts = append(edges[i].parts, edgePart{what: what, kind: kind, heat: sign * heat})
		return i
	}
	flows := map[string]float64{} // solved air flows by link, m³/s
	for _, b := range sol.Branches {
		if b.Solved {
			flows[b.Link] = b.VolumeFlow
		}
	}
	linked := map[[2]string]bool{} // pairs of nodes a link joins
	for _, l := range sol.Links {
		for k, p := range l.Paths {
			linked[[2]string{p.From, p.To}], linked[[2]string{p.To, p.From}] = true, true
			if k > 0 && p.Heat == 0 {
				continue
			}
			what := fmt.Sprintf("%s (%s)", l.ID, l.Kind)
			if k > 0 && p.Carried {
				// The air a channel passes on carries heat of its own.
				what = fmt.Sprintf("%s: air from %s", l.ID, p.From)
			}
			i := add(p.From, p.To, p.Heat, p.Carried, what, l.Kind)
			if f, solved := flows[l.ID]; solved && p.Carried {
				if len(edges[i].parts) == 1 {
					edges[i].flow, edges[i].hasFlow = f, true
				} else {
					edges[i].flow += f
				}
			} else if p.Carried {
				edges[i].hasFlow = false
			}
		}
	}
	plateJoinEdges(sol, linked, add)
	for i := range edges {
		e := &edges[i]
		if e.heat < 0 {
			e.from, e.to, e.heat = e.to, e.from, -e.heat
			for j := range e.parts {
				e.parts[j].heat = -e.parts[j].heat
			}
		}
	}
	return edges
}

type dotBuilder struct {
	g        *gographviz.Graph
	name     string
	err      error
	clusters map[string]bool
}

func (d *dotBuilder) check(err error) {
	if d.err == nil && err != nil {
		d.err = err
	}
}

func nodeFill(n network.NodeResult, c Colouring, tMin, tMax float64, margins scale) rgb {
	if n.Kind == network.Fixed {
		return fixedFill
	}
	if c == ColourTemperature {
		f := 0.0
		if tMax > tMin {
			f = (n.Temperature - tMin) / (tMax - tMin)
		}
		return temperatureScale.at(f)
	}
	if !n.HasLimit {
		return noLimitFill
	}
	return margins.band(n.Margin)
}

func nodeShape(k network.NodeKind) string {
	switch k {
	case network.Fixed:
		return "cylinder"
	case network.Junction:
		return "octagon"
	case network.Air:
		return "ellipse"
	case plateKind:
		return "box3d"
	}
	return "box"
}

// q quotes s as a DOT string.
func q(s string) string {
	r := strings.NewReplacer(`\`, `\\`, `"`, `\"`, "\n", `\n`)
	return `"` + r.Replace(s) + `"`
}
