package viz

import (
	"fmt"
	"html"
	"math"
	"strconv"
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

// DOT returns the heat-path diagram of a solution in the DOT language.
//
// Nodes show their temperature and, where they have a limit, their margin;
// the fill follows the chosen colouring. Edges point the way heat flows,
// carry its value in watts, and grow thicker with it. A legend explains the
// colours.
func DOT(sol *network.Solution, colouring Colouring) (string, error) {
	g := gographviz.NewGraph()
	const name = "heatpaths"
	d := &dotBuilder{g: g, name: name}
	d.check(g.SetName(name))
	d.check(g.SetDir(true))
	title := sol.Net.Model.Title
	if title == "" {
		title = sol.Net.Model.File
	}
	for k, v := range map[string]string{
		"rankdir":  "LR",
		"fontname": q("Helvetica"),
		"fontsize": "11",
		"label": q(fmt.Sprintf("%s\nambient %.1f °C\nestimates from a lumped model: confirm by measurement",
			title, celsius(sol.Net.Model.Ambient.Temperature))),
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
	edges := heatEdges(sol)
	// A fixed node with several links is drawn once at each of them: one
	// node joined to every part of the box makes the layout slow (Graphviz
	// draws its long edges through every rank) and the picture a tangle.
	links := map[string]int{}
	for _, e := range edges {
		links[e.from]++
		links[e.to]++
	}
	ids := map[string]bool{}
	for _, n := range sol.Nodes {
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
	for _, n := range sol.Nodes {
		kinds[n.ID] = n.Kind
	}
	for i := range edges {
		edges[i].fromName = split(edges[i].from, kinds[edges[i].from])
		edges[i].toName = split(edges[i].to, kinds[edges[i].to])
	}

	for _, n := range sol.Nodes {
		fill := nodeFill(n, colouring, tMin, tMax)
		label := fmt.Sprintf("%s\n%.1f °C", n.ID, celsius(n.Temperature))
		if n.HasLimit {
			label += fmt.Sprintf("\nmargin %+.1f K", n.Margin)
		}
		if n.Power != 0 {
			label += fmt.Sprintf("\n%.3g W in", n.Power)
		}
		attrs := map[string]string{
			"label":     q(label),
			"shape":     nodeShape(n.Kind),
			"style":     q("filled,rounded"),
			"fillcolor": q(fill.hex()),
			"fontcolor": q(textOn(fill)),
			"fontname":  q("Helvetica"),
			"fontsize":  "10",
			"color":     q("#5a5a5a"),
		}
		if n.Status == network.Over {
			attrs["penwidth"] = "3"
			attrs["color"] = q(marginScale[0].c.hex())
		}
		names := copies[n.ID]
		if len(names) == 0 {
			names = []string{n.ID}
		} else {
			attrs["tooltip"] = q(fmt.Sprintf("%s: drawn at each of its %d links", n.ID, len(names)))
		}
		for _, drawn := range names {
			d.check(g.AddNode(name, q(drawn), attrs))
		}
	}

	qMax := 0.0
	for _, e := range edges {
		qMax = math.Max(qMax, e.heat)
	}
	for _, e := range edges {
		colour := edgeColour
		if e.air {
			colour = airColour
		}
		attrs := edgeAttrs(e.heat, qMax, e.tooltip(), colour)
		if e.fromName != e.from || e.toName != e.to {
			// A copy of a fixed node hangs off its neighbour: leave the
			// straightening to the paths between the nodes that matter,
			// or a long chain becomes a staircase.
			attrs["weight"] = "0"
		}
		d.check(g.AddEdge(q(e.fromName), q(e.toName), true, attrs))
	}
	d.legend(colouring, tMin, tMax, len(copies) > 0)
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
	parts            []edgePart
}

type edgePart struct {
	what string  // "id (kind)" or "id: air from inlet"
	heat float64 // W, positive from -> to of the edge
}

func (e heatEdge) tooltip() string {
	if len(e.parts) == 1 {
		return e.parts[0].what
	}
	items := make([]string, len(e.parts))
	for i, p := range e.parts {
		items[i] = fmt.Sprintf("%s %.3g W", p.what, p.heat)
	}
	return fmt.Sprintf("%d links, %.3g W in all: %s", len(e.parts), e.heat, strings.Join(items, "; "))
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
	add := func(from, to string, heat float64, air bool, what string) {
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
		edges[i].parts = append(edges[i].parts, edgePart{what: what, heat: sign * heat})
	}
	for _, l := range sol.Links {
		for k, p := range l.Paths {
			if k > 0 && p.Heat == 0 {
				continue
			}
			what := fmt.Sprintf("%s (%s)", l.ID, l.Kind)
			if k > 0 && p.Carried {
				// The air a channel passes on carries heat of its own.
				what = fmt.Sprintf("%s: air from %s", l.ID, p.From)
			}
			add(p.From, p.To, p.Heat, p.Carried, what)
		}
	}
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

// edgeAttrs returns the attributes of an edge carrying heat watts (≥ 0) of
// the largest qMax: labelled in watts, thicker for more heat, dashed when
// it carries next to nothing.
func edgeAttrs(heat, qMax float64, tooltip, colour string) map[string]string {
	weight := 1.0
	if qMax > 0 {
		weight = 0.8 + 5.2*heat/qMax
	}
	attrs := map[string]string{
		"label":     q(fmt.Sprintf("%.3g W", heat)),
		"tooltip":   q(tooltip),
		"penwidth":  strconv.FormatFloat(weight, 'f', 2, 64),
		"arrowsize": strconv.FormatFloat(0.5+0.1*weight, 'f', 2, 64),
		"color":     q(colour),
		"fontname":  q("Helvetica"),
		"fontsize":  "9",
	}
	if colour != edgeColour {
		attrs["fontcolor"] = q(colour)
	}
	if qMax > 0 && heat < 1e-3*qMax {
		attrs["style"] = "dashed"
	}
	return attrs
}

type dotBuilder struct {
	g    *gographviz.Graph
	name string
	err  error
}

func (d *dotBuilder) check(err error) {
	if d.err == nil && err != nil {
		d.err = err
	}
}

// legend adds a box that explains shapes, colours and edge widths.
func (d *dotBuilder) legend(c Colouring, tMin, tMax float64, split bool) {
	var rows strings.Builder
	cell := func(fill rgb, text string) {
		fmt.Fprintf(&rows, `<tr><td bgcolor="%s" width="18"></td><td align="left">%s</td></tr>`, fill.hex(), html.EscapeString(text))
	}
	switch c {
	case ColourTemperature:
		for _, f := range []float64{0, 0.35, 0.65, 1} {
			cell(temperatureScale.at(f), fmt.Sprintf("%.1f °C", celsius(tMin+f*(tMax-tMin))))
		}
	default:
		for _, s := range []struct {
			m    float64
			text string
		}{{30, "margin 30 K or more"}, {15, "margin 15 K"}, {5, "margin 5 K"}, {0, "at the limit"}, {-10, "10 K or more over"}} {
			cell(marginScale.at(s.m), s.text)
		}
		cell(noLimitFill, "no limit set")
	}
	cell(fixedFill, "fixed temperature")
	label := fmt.Sprintf(`<<table border="0" cellborder="0" cellspacing="2"><tr><td colspan="2"><b>%s</b></td></tr>%s`+
		`<tr><td colspan="2" align="left">box: solid; octagon: junction;</td></tr>`+
		`<tr><td colspan="2" align="left">ellipse: air; cylinder: fixed</td></tr>`+
		splitRow(split)+
		`<tr><td colspan="2" align="left">arrows: the way heat flows;</td></tr>`+
		`<tr><td colspan="2" align="left">width grows with watts;</td></tr>`+
		`<tr><td colspan="2" align="left"><font color="`+airColour+`">blue: heat carried by moving air</font></td></tr></table>>`,
		html.EscapeString("colour: "+string(c)), rows.String())
	const cluster = "cluster_legend"
	d.check(d.g.AddSubGraph(d.name, cluster, map[string]string{"label": q("legend"), "style": q("rounded"), "color": q("#9a9a9a"), "fontname": q("Helvetica"), "fontsize": "10"}))
	d.check(d.g.AddNode(cluster, q("legend: colours"), map[string]string{"shape": "plaintext", "label": label, "fontname": q("Helvetica"), "fontsize": "9"}))
}

// splitRow is the legend's line on fixed nodes drawn more than once.
func splitRow(split bool) string {
	if !split {
		return ""
	}
	return `<tr><td colspan="2" align="left">(a fixed node is drawn</td></tr>` +
		`<tr><td colspan="2" align="left">at each of its links)</td></tr>`
}

func nodeFill(n network.NodeResult, c Colouring, tMin, tMax float64) rgb {
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
	return marginScale.at(n.Margin)
}

func nodeShape(k network.NodeKind) string {
	switch k {
	case network.Fixed:
		return "cylinder"
	case network.Junction:
		return "octagon"
	case network.Air:
		return "ellipse"
	}
	return "box"
}

// q quotes s as a DOT string.
func q(s string) string {
	r := strings.NewReplacer(`\`, `\\`, `"`, `\"`, "\n", `\n`)
	return `"` + r.Replace(s) + `"`
}
