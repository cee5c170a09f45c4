package sweepcmd

import (
	"bytes"
	"fmt"
	"image/color"
	"math"
	"path/filepath"
	"sort"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/heatgraph/heatgraph/study"
	"github.com/heatgraph/heatgraph/units"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/plotutil"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// Plot draws the study's plotted nodes (all with a limit by default)
// against its plot x value (the first swept value by default), one line
// per node, with each node's limit as a dashed line of the same colour.
// With more than one swept value, the points of each combination of the
// others are drawn as separate lines only when there is one; otherwise
// only the points where the others are at their first value are drawn.
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
	// The points where every other swept value is at its first value.
	var pts []study.Row
	for _, r := range rows {
		keep := true
		for i, a := range st.Grid {
			if i != xi && r.Values[i] != a.Values[0] {
				keep = false
			}
		}
		if keep && r.T != nil {
			pts = append(pts, r)
		}
	}
	sort.SliceStable(pts, func(a, b int) bool { return pts[a].Values[xi] < pts[b].Values[xi] })
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
		xy := make(plotter.XYs, len(pts))
		for i, r := range pts {
			xy[i].X, xy[i].Y = xval(r.Values[xi]), r.T[k]-273.15
		}
		col := plotutil.Color(c)
		line, points, err := plotter.NewLinePoints(xy)
		if err != nil {
			return nil, err
		}
		line.Color, points.Color = col, col
		points.Shape = draw.CircleGlyph{}
		p.Add(line, points)
		p.Legend.Add(nodes[k].ID, line)
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

func withAlpha(c color.Color) color.Color {
	r, g, b, _ := c.RGBA()
	return color.NRGBA{uint8(r >> 8), uint8(g >> 8), uint8(b >> 8), 160}
}
