package viz

import (
	"fmt"
	"html"
	"math"
	"strconv"
	"strings"

	"github.com/heatgraph/heatgraph/network"
)

// DiagramOptions choose what a heat-path diagram shows.
type DiagramOptions struct {
	Colouring Colouring
	// LinkLabels adds the names of the links to each arrow's label (they
	// are always in its tooltip).
	LinkLabels bool
	// HideBelowW hides arrows carrying less than this many watts;
	// HideBelowFraction those carrying less than this fraction of the
	// largest arrow. Zero hides nothing.
	HideBelowW        float64
	HideBelowFraction float64
	// Collapse names groups (the nodes' group key) drawn as one node each.
	Collapse []string
	// Source, when set, draws only the heat of this source (a node with a
	// heat input) along the arrows it takes (see NewBreakdown).
	Source string
	// Compare, when set, adds to each node the temperatures of other
	// solutions of the same design (variants), labelled by Names, with
	// their change against the drawn one: one diagram for several
	// variants (heatgraph compare --graph).
	Compare []*network.Solution
	Names   []string
}

// fadeFraction is the share of the largest arrow below which an arrow is
// drawn faded (grey and thin), so that the trickles of a sealed box do not
// look like its main path.
const fadeFraction = 0.05

// diagramState is what a diagram draws after collapsing groups, hiding
// small flows and choosing one source.
type diagramState struct {
	nodes   []network.NodeResult
	edges   []heatEdge
	group   map[string]string   // node id -> group drawn as a cluster
	members map[string][]string // collapsed group node -> its members
	hidden  int                 // arrows hidden as too small
	faded   bool                // some arrow is faded
	air     bool                // some arrow carries heat in moving air
	kinds   map[string]bool     // line styles in use
	mixed   bool                // an arrow joins radiation with other links
}

// NodeGroups returns the group of every node of a model that names one.
func NodeGroups(m *network.Model) map[string]string {
	g := map[string]string{}
	for _, n := range m.Nodes {
		if n.Group != "" {
			g[n.ID] = n.Group
		}
	}
	for _, c := range m.Components {
		if c.Group != "" {
			g[c.ID] = c.Group
		}
	}
	return g
}

func newDiagramState(sol *network.Solution, opt DiagramOptions) *diagramState {
	ds := &diagramState{group: NodeGroups(sol.Net.Model), members: map[string][]string{}, kinds: map[string]bool{}}
	edges := heatEdges(sol)
	if opt.Source != "" {
		if sb := NewBreakdown(sol).Source(opt.Source); sb != nil {
			var kept []heatEdge
			for k, e := range edges {
				if sb.arcs[k] > 1e-9*sb.Heat {
					e.heat = sb.arcs[k]
					kept = append(kept, e)
				}
			}
			edges = kept
		}
	}
	collapse := map[string]bool{}
	for _, c := range opt.Collapse {
		collapse[c] = true
	}
	rep := map[string]string{}  // node id -> drawn id
	groupAt := map[string]int{} // collapsed group node -> its index in ds.nodes
	for _, n := range sol.Nodes {
		gr := ds.group[n.ID]
		if !collapse[gr] || n.Kind == network.Fixed {
			rep[n.ID] = n.ID
			ds.nodes = append(ds.nodes, n)
			continue
		}
		// A collapsed group is one node: the hottest member's temperature
		// and the worst member's margin, the members' power summed.
		id := "group " + gr
		rep[n.ID] = id
		ds.members[id] = append(ds.members[id], n.ID)
		i, ok := groupAt[id]
		if !ok {
			i = len(ds.nodes)
			groupAt[id] = i
			ds.nodes = append(ds.nodes, network.NodeResult{ID: id, Kind: network.Solid, Temperature: n.Temperature})
		}
		gn := &ds.nodes[i]
		gn.Temperature = math.Max(gn.Temperature, n.Temperature)
		gn.Power += n.Power
		if n.HasLimit && (!gn.HasLimit || n.Margin < gn.Margin) {
			gn.HasLimit, gn.Margin, gn.Limit, gn.Status = true, n.Margin, n.Limit, n.Status
		}
	}
	if len(collapse) > 0 {
		type key struct {
			a, b string
			air  bool
		}
		index := map[key]int{}
		var merged []heatEdge
		for _, e := range edges {
			a, b := rep[e.from], rep[e.to]
			if a == b {
				continue // inside a collapsed group
			}
			sign := 1.0
			k := key{a, b, e.air}
			if b < a {
				k, sign = key{b, a, e.air}, -1
			}
			i, ok := index[k]
			if !ok {
				i = len(merged)
				index[k] = i
				merged = append(merged, heatEdge{from: k.a, to: k.b, air: e.air})
			}
			merged[i].heat += sign * e.heat
			for _, p := range e.parts {
				p.heat *= sign
				merged[i].parts = append(merged[i].parts, p)
			}
		}
		for i := range merged {
			if merged[i].heat < 0 {
				merged[i].from, merged[i].to, merged[i].heat = merged[i].to, merged[i].from, -merged[i].heat
				for j := range merged[i].parts {
					merged[i].parts[j].heat = -merged[i].parts[j].heat
				}
			}
		}
		edges = merged
	}
	qMax := 0.0
	for _, e := range edges {
		qMax = math.Max(qMax, e.heat)
	}
	for _, e := range edges {
		if e.heat < opt.HideBelowW || e.heat < opt.HideBelowFraction*qMax {
			ds.hidden++
			continue
		}
		if qMax > 0 && e.heat < fadeFraction*qMax {
			ds.faded = true
		}
		ds.air = ds.air || e.air
		ds.kinds[linkStyle(e)] = true
		if r := radiatedShare(e); r > 0.005 && r < 0.995 {
			ds.mixed = true
		}
		ds.edges = append(ds.edges, e)
	}
	if opt.Source != "" {
		// One source's heat: draw only the nodes its heat passes.
		touched := map[string]bool{opt.Source: true}
		for _, e := range ds.edges {
			touched[e.from], touched[e.to] = true, true
		}
		kept := ds.nodes[:0]
		for _, n := range ds.nodes {
			if touched[n.ID] {
				kept = append(kept, n)
			}
		}
		ds.nodes = kept
	}
	return ds
}

// Line styles of the arrows, by what carries the heat.
const (
	styleSolid      = "solid"  // conduction, contact, lumped, component legs
	styleConvection = "dashed" // convection from a surface to air
	styleRadiation  = "dotted" // radiation
	styleAir        = "air"    // heat carried by moving air: coloured
)

// linkStyle returns the line style of an arrow: that of the link carrying
// most of its heat.
func linkStyle(e heatEdge) string {
	if e.air {
		return styleAir
	}
	kind, best := "", -1.0
	for _, p := range e.parts {
		if math.Abs(p.heat) > best {
			kind, best = p.kind, math.Abs(p.heat)
		}
	}
	switch kind {
	case "convection", "natural", "flat-plate", "channel":
		return styleConvection
	case "radiation", "enclosure":
		return styleRadiation
	case "stream":
		return styleAir
	}
	return styleSolid
}

// watts formats a heat flow with three significant digits; round-off
// below a nanowatt is 0 W, never "-0 W".
func watts(x float64) string {
	if math.Abs(x) < 1e-9 {
		return "0 W" // round-off, and never "-0 W"
	}
	s := strconv.FormatFloat(x, 'g', 3, 64)
	if strings.Contains(s, "e") {
		s = fmt.Sprintf("%.2g", x)
	}
	return s + " W"
}

// radiatedShare is the part of an arrow's heat carried by radiation.
func radiatedShare(e heatEdge) float64 {
	if e.heat <= 0 {
		return 0
	}
	rad := 0.0
	for _, p := range e.parts {
		if p.kind == "radiation" || p.kind == "enclosure" {
			rad += p.heat
		}
	}
	return rad / e.heat
}

// linkNames lists the link ids of an arrow.
func linkNames(e heatEdge) string { return arcLinks(e) }

// edgeAttrsFor returns the attributes of an arrow carrying e.heat watts (≥
// 0) of the largest qMax: labelled in watts, thicker for more heat, in the
// line style of its links, faded when it carries next to nothing.
func edgeAttrsFor(e heatEdge, qMax float64, opt DiagramOptions) map[string]string {
	weight := 1.0
	if qMax > 0 {
		weight = 0.8 + 5.2*e.heat/qMax
	}
	label := watts(e.heat)
	if r := radiatedShare(e); r > 0.005 && r < 0.995 {
		// One arrow joins a surface's convection and radiation: its line
		// is that of the larger part, and the label gives the radiated
		// share.
		label += fmt.Sprintf(" (%.0f %% rad.)", 100*r)
	}
	if e.air && e.hasFlow {
		// A solved air path says how much air it carries too.
		label += fmt.Sprintf(", %.3g L/s", math.Abs(e.flow)*1e3)
	}
	if opt.LinkLabels {
		label = linkNames(e) + "\n" + label
	}
	if weight > 2.5 {
		// Graphviz keeps a label clear of the edge's centre line, not of
		// its width: an empty line under the text lifts it off a thick
		// arrow.
		label += "\n "
	}
	colour := edgeColour
	style := linkStyle(e)
	attrs := map[string]string{
		"label":     q(label),
		"tooltip":   q(e.tooltip()),
		"penwidth":  strconv.FormatFloat(weight, 'f', 2, 64),
		"arrowsize": strconv.FormatFloat(0.5+0.1*weight, 'f', 2, 64),
		"fontname":  q("Helvetica"),
		"fontsize":  "9",
		// Labels sit at the tail end, beside the arrow, not under it.
		"labelfloat": "false",
		"decorate":   "false",
	}
	switch style {
	case styleAir:
		colour = airColour
		attrs["fontcolor"] = q(airColour)
		attrs["arrowhead"] = "vee"
	case styleConvection, styleRadiation:
		attrs["style"] = style
	}
	if qMax > 0 && e.heat < fadeFraction*qMax {
		colour = fadedColour
		attrs["fontcolor"] = q(fadedColour)
		attrs["penwidth"] = "0.6"
		attrs["arrowsize"] = "0.5"
	}
	attrs["color"] = q(colour)
	return attrs
}

// statusWord is the status a node's label shows.
func statusWord(n network.NodeResult) string {
	switch {
	case n.Kind == network.Fixed:
		return "fixed"
	case !n.HasLimit:
		return "no limit"
	case n.Status == network.Over:
		return "OVER"
	}
	return string(n.Status)
}

// compareLabel adds the other variants' temperatures of node n.
func compareLabel(label string, n network.NodeResult, opt DiagramOptions) string {
	for i, s := range opt.Compare {
		name := fmt.Sprintf("[%d]", i+2)
		if i+1 < len(opt.Names) {
			name = opt.Names[i+1]
		}
		found := false
		for _, m := range s.Nodes {
			if m.ID == n.ID {
				label += fmt.Sprintf("\n%s %.1f °C (%s K)", name, celsius(m.Temperature), signed(m.Temperature-n.Temperature))
				found = true
				break
			}
		}
		if !found {
			label += fmt.Sprintf("\n%s: not in this variant", name)
		}
	}
	return label
}

// nodeLabel is the text inside a node.
func nodeLabel(n network.NodeResult, members []string) string {
	label := fmt.Sprintf("%s\n%.1f °C", n.ID, celsius(n.Temperature))
	if len(members) > 0 {
		label = fmt.Sprintf("%s (%s)\nup to %.1f °C", n.ID, countOf(len(members), "node"), celsius(n.Temperature))
	}
	if n.HasLimit {
		label += fmt.Sprintf("\nmargin %s K %s", signed(n.Margin), statusWord(n))
	} else if n.Kind != network.Fixed {
		label += "\nno limit"
	}
	if n.Power != 0 {
		label += "\npower " + watts(n.Power)
	}
	return label
}

// signed formats a margin with its sign and one decimal, never "-0.0".
func signed(x float64) string {
	s := fmt.Sprintf("%+.1f", x)
	if s == "-0.0" {
		s = "+0.0"
	}
	return s
}

func nodeTooltip(n network.NodeResult, members []string) string {
	t := fmt.Sprintf("%s (%s): %.2f °C, %s", n.ID, n.Kind, celsius(n.Temperature), statusWord(n))
	if len(members) > 0 {
		t += "; members: " + strings.Join(members, ", ")
	}
	return t
}

// diagramHeader is the diagram's title block.
func diagramHeader(sol *network.Solution, opt DiagramOptions) string {
	m := sol.Net.Model
	title := m.Title
	if title == "" {
		title = m.File
	}
	h := fmt.Sprintf("%s\nambient %.1f °C, %s", title, celsius(m.Ambient.Temperature), pressureText(m.Ambient))
	if m.RequiredMargin > 0 {
		h += fmt.Sprintf("; required margin %s K", trimK(m.RequiredMargin))
	}
	if opt.Source != "" {
		h += "\nheat of " + opt.Source + " only (proportional attribution)"
	}
	return h + "\nestimates from a lumped model: confirm by measurement"
}

// cluster returns the DOT name of a group's box, adding it on first use.
func (d *dotBuilder) cluster(group string) string {
	name := "cluster_group_" + strconv.Quote(group)
	name = q(name)
	if d.clusters == nil {
		d.clusters = map[string]bool{}
	}
	if !d.clusters[name] {
		d.clusters[name] = true
		d.check(d.g.AddSubGraph(d.name, name, map[string]string{"label": q(group), "style": q("rounded,dashed"),
			"color": q("#7a7a7a"), "fontname": q("Helvetica"), "fontsize": "10"}))
	}
	return name
}

// legendFor adds a box that explains shapes, colours, outlines and lines,
// naming only what the diagram shows.
func (d *dotBuilder) legendFor(sol *network.Solution, opt DiagramOptions, tMin, tMax float64, split bool, ds *diagramState) {
	var rows strings.Builder
	cell := func(fill rgb, text string) {
		fmt.Fprintf(&rows, `<tr><td bgcolor="%s" width="18"></td><td align="left">%s</td></tr>`, fill.hex(), html.EscapeString(text))
	}
	line := func(text string, colour string) {
		if colour == "" {
			fmt.Fprintf(&rows, `<tr><td colspan="2" align="left">%s</td></tr>`, html.EscapeString(text))
			return
		}
		fmt.Fprintf(&rows, `<tr><td colspan="2" align="left"><font color="%s">%s</font></td></tr>`, colour, html.EscapeString(text))
	}
	switch opt.Colouring {
	case ColourTemperature:
		for _, f := range []float64{0, 0.35, 0.65, 1} {
			cell(temperatureScale.at(f), fmt.Sprintf("%.1f °C", celsius(tMin+f*(tMax-tMin))))
		}
	default:
		steps := marginSteps(sol.Net.Model.RequiredMargin)
		for i := len(steps) - 1; i >= 0; i-- {
			cell(marginColours[i], steps[i].text)
		}
		cell(noLimitFill, "no limit set")
	}
	cell(fixedFill, "fixed temperature")
	m := sol.Net.Model.RequiredMargin
	if m > 0 {
		line(fmt.Sprintf("dashed brown outline: tight (margin under %s K)", trimK(m)), tightOutline)
	} else {
		line("tight: margin under the required margin (none set)", "")
	}
	line("thick dark outline: OVER the limit", overOutline)
	line("box: solid; octagon: junction;", "")
	line("ellipse: air; cylinder: fixed", "")
	for _, n := range ds.nodes {
		if n.Kind == plateKind {
			line("3-D slab: meshed plate, at its", "")
			line("hottest cell, with its mean", "")
			break
		}
	}
	if split {
		line("(a fixed node is drawn", "")
		line("at each of its links)", "")
	}
	line("arrows: the way heat flows;", "")
	line("width grows with watts", "")
	if ds.kinds[styleSolid] {
		line("solid: conduction, contact, lumped", "")
	}
	if ds.kinds[styleConvection] {
		line("dashed: convection to air", "")
	}
	if ds.kinds[styleRadiation] || ds.mixed {
		line("dotted: radiation", "")
	}
	if ds.mixed {
		line("(x % rad.): radiated share of", "")
		line("an arrow that joins both", "")
	}
	if ds.air {
		line("blue, open head: heat carried by moving air", airColour)
	}
	if ds.faded {
		line(fmt.Sprintf("grey: under %g %% of the largest flow", fadeFraction*100), fadedColour)
	}
	if ds.hidden > 0 {
		line(fmt.Sprintf("%d smaller flows not drawn", ds.hidden), "")
	}
	if len(ds.group) > 0 {
		line("dashed boxes: groups", "")
	}
	label := fmt.Sprintf(`<<table border="0" cellborder="0" cellspacing="2"><tr><td colspan="2"><b>%s</b></td></tr>%s</table>>`,
		html.EscapeString("colour: "+string(opt.Colouring)), rows.String())
	const cluster = "cluster_legend"
	d.check(d.g.AddSubGraph(d.name, cluster, map[string]string{"label": q("legend"), "style": q("rounded"), "color": q("#9a9a9a"), "fontname": q("Helvetica"), "fontsize": "10"}))
	d.check(d.g.AddNode(cluster, q("legend: colours"), map[string]string{"shape": "plaintext", "label": label, "fontname": q("Helvetica"), "fontsize": "9"}))
}
