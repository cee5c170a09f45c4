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
		d.check(g.AddNode(name, q(n.ID), attrs))
	}

	qMax := 0.0
	for _, l := range sol.Links {
		for _, p := range l.Paths {
			qMax = math.Max(qMax, math.Abs(p.Heat))
		}
	}
	flows := map[string]float64{} // solved air flows by link, m³/s, for the labels of air paths
	for _, b := range sol.Branches {
		if b.Solved {
			flows[b.Link] = b.VolumeFlow
		}
	}
	for _, l := range sol.Links {
		for k, p := range l.Paths {
			from, to, heat := p.From, p.To, p.Heat
			if k > 0 && heat == 0 {
				continue
			}
			if heat < 0 {
				from, to, heat = to, from, -heat
			}
			colour, tip := edgeColour, fmt.Sprintf("%s (%s)", l.ID, l.Kind)
			if p.Carried {
				colour = airColour
				if k > 0 {
					tip = fmt.Sprintf("%s: air from %s", l.ID, p.From)
				}
			}
			f, solved := flows[l.ID]
			if solved && p.Carried {
				// A solved air path points the way the air goes.
				from, to, heat = p.From, p.To, p.Heat
				if f < 0 {
					from, to, heat = to, from, -heat
				}
				if math.Abs(heat) < 1e-9*qMax {
					heat = 0
				}
			}
			attrs := edgeAttrs(math.Abs(heat), qMax, tip, colour)
			if solved && p.Carried {
				attrs["label"] = q(fmt.Sprintf("%.3g W, %.3g L/s", heat, math.Abs(f)*1e3))
			}
			d.check(g.AddEdge(q(from), q(to), true, attrs))
		}
	}
	d.legend(colouring, tMin, tMax)
	if d.err != nil {
		return "", d.err
	}
	return g.String(), nil
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
func (d *dotBuilder) legend(c Colouring, tMin, tMax float64) {
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
		`<tr><td colspan="2" align="left">arrows: the way heat flows;</td></tr>`+
		`<tr><td colspan="2" align="left">width grows with watts;</td></tr>`+
		`<tr><td colspan="2" align="left"><font color="`+airColour+`">blue: heat carried by moving air</font></td></tr></table>>`,
		html.EscapeString("colour: "+string(c)), rows.String())
	const cluster = "cluster_legend"
	d.check(d.g.AddSubGraph(d.name, cluster, map[string]string{"label": q("legend"), "style": q("rounded"), "color": q("#9a9a9a"), "fontname": q("Helvetica"), "fontsize": "10"}))
	d.check(d.g.AddNode(cluster, q("legend: colours"), map[string]string{"shape": "plaintext", "label": label, "fontname": q("Helvetica"), "fontsize": "9"}))
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
