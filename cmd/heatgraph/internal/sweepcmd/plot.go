package sweepcmd

import (
	"bytes"
	"fmt"
	"image/color"
	"math"
	"path/filepath"
	"sort"
	"strconv"
	"strings"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/study"
	"github.com/heatgraph/heatgraph/units"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/plotutil"
	"gonum.org/v1/plot/vg"
)

// Plot draws the study's plotted nodes (all with a limit by default)
// against its plot x value (the first swept value by default), one line
// per node and combination of the other swept values (a marker shape
// each; at most maxGroups of them, else only the first), with each node's
// limit as a dashed line of the same colour.
// The format follows the file's extension, .png or .svg.
func Plot(st *study.Study, nodes []study.Node, rows []study.Row, file string) ([]byte, error) {
	params := st.Grid.Params()
	xi := 0
	if st.PlotX != "" {
		xi = -1
		for i, q := range params {
			if q.Path == st.PlotX {
				xi = i
			}
		}
		if xi < 0 {
			return nil, exit.With(exit.BadInput, "%s: plot.x %q is not one of the swept values", st.File, st.PlotX)
		}
	}
	var chosen []int
	if len(st.PlotNodes) == 0 {
		for k, n := range nodes {
			if n.HasLimit {
				chosen = append(chosen, k)
			}
		}
	}
	for _, id := range st.PlotNodes {
		found := false
		for k, n := range nodes {
			if n.ID == id {
				chosen, found = append(chosen, k), true
			}
		}
		if !found {
			return nil, exit.With(exit.BadInput, "%s: plot.nodes: no node %q", st.File, id)
		}
	}
	q := params[xi]
	xval := func(v float64) float64 {
		if q.Kind == units.Temperature {
			return v - 273.15
		}
		return v
	}
	// The points grouped by the other swept values: every group is drawn
	// when there are at most maxGroups, else only the first.
	var keys []string
	groups := map[string][]study.Row{}
	labels := map[string]string{}
	for _, r := range rows {
		if r.T == nil {
			continue
		}
		var parts []string
		for i, a := range st.Grid {
			if i != xi {
				parts = append(parts, a.Param.Path+" = "+show(a.Param, r.Values[i]))
			}
		}
		key := strings.Join(parts, ", ")
		if _, ok := groups[key]; !ok {
			keys = append(keys, key)
			labels[key] = key
		}
		groups[key] = append(groups[key], r)
	}
	if len(keys) > maxGroups {
		keys = keys[:1]
	}
	for _, k := range keys {
		g := groups[k]
		sort.SliceStable(g, func(a, b int) bool { return g[a].Values[xi] < g[b].Values[xi] })
	}
	var pts []study.Row
	for _, k := range keys {
		pts = append(pts, groups[k]...)
	}
	p := plot.New()
	p.Title.Text = "temperatures against " + q.Path
	p.X.Label.Text = q.Path
	if u := q.Kind.SIUnit(); q.Kind == units.Temperature {
		p.X.Label.Text += " (degC)"
	} else if u != "" {
		p.X.Label.Text += " (" + u + ")"
	}
	p.Y.Label.Text = "temperature (degC)"
	p.Legend.Top, p.Legend.Left = true, true
	p.Add(plotter.NewGrid())
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, r := range pts {
		lo, hi = math.Min(lo, xval(r.Values[xi])), math.Max(hi, xval(r.Values[xi]))
	}
	for c, k := range chosen {
		col := plotutil.Color(c)
		for gi, key := range keys {
			g := groups[key]
			xy := make(plotter.XYs, len(g))
			for i, r := range g {
				xy[i].X, xy[i].Y = xval(r.Values[xi]), r.T[k]-273.15
			}
			line, points, err := plotter.NewLinePoints(xy)
			if err != nil {
				return nil, err
			}
			line.Color, points.Color = col, col
			points.Shape = plotutil.Shape(gi)
			p.Add(line, points)
			name := nodes[k].ID
			if len(keys) > 1 || key != "" {
				name += " (" + labels[key] + ")"
			}
			p.Legend.Add(name, line, points)
		}
		if nodes[k].HasLimit && len(pts) > 0 {
			lim := nodes[k].Limit - 273.15
			ll, err := plotter.NewLine(plotter.XYs{{X: lo, Y: lim}, {X: hi, Y: lim}})
			if err != nil {
				return nil, err
			}
			ll.Color = withAlpha(col)
			ll.Dashes = []vg.Length{vg.Points(6), vg.Points(3)}
			p.Add(ll)
			p.Legend.Add(nodes[k].ID+" limit", ll)
		}
	}
	format := filepath.Ext(file)[1:]
	w, err := p.WriterTo(7*vg.Inch, 4.5*vg.Inch, format)
	if err != nil {
		return nil, fmt.Errorf("drawing %s: %w", file, err)
	}
	var buf bytes.Buffer
	if _, err := w.WriteTo(&buf); err != nil {
		return nil, fmt.Errorf("drawing %s: %w", file, err)
	}
	return buf.Bytes(), nil
}

// maxGroups is the most combinations of the other swept values a plot
// draws as lines of their own.
const maxGroups = 6

// show writes an SI value of q's kind for a legend: temperatures in degC.
func show(q network.Parameter, v float64) string {
	if q.Kind == units.Temperature {
		return strconv.FormatFloat(v-273.15, 'g', 6, 64) + " degC"
	}
	return q.Format(v)
}

func withAlpha(c color.Color) color.Color {
	r, g, b, _ := c.RGBA()
	return color.NRGBA{uint8(r >> 8), uint8(g >> 8), uint8(b >> 8), 160}
}
