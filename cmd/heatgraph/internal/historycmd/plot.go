package historycmd

import (
	"bytes"
	"fmt"

	"github.com/heatgraph/heatgraph/network"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/plotutil"
	"gonum.org/v1/plot/vg"
)

// drawPlot draws the temperatures of the nodes against time, each node's
// limit as a dashed line of its colour, and returns the image in format
// ("png" or "svg").
func drawPlot(h *network.History, nodes []int, tu timeUnit, format string) ([]byte, error) {
	p := plot.New()
	title := h.Net.Model.Title
	if title == "" {
		title = h.Net.Model.File
	}
	p.Title.Text = title
	p.X.Label.Text = fmt.Sprintf("time [%s]", tu.name)
	p.Y.Label.Text = "temperature [degC]"
	p.Legend.Top = true
	p.Legend.Left = true
	p.Add(plotter.NewGrid())
	end := h.Times[len(h.Times)-1] / tu.scale
	for k, i := range nodes {
		n := h.Net.Nodes[i]
		xy := make(plotter.XYs, len(h.Times))
		for j, t := range h.Times {
			xy[j].X = t / tu.scale
			xy[j].Y = degC(h.T[j][i])
		}
		line, err := plotter.NewLine(xy)
		if err != nil {
			return nil, err
		}
		line.Color = plotutil.Color(k)
		line.Width = vg.Points(1.5)
		p.Add(line)
		p.Legend.Add(n.ID, line)
		if n.HasLimit {
			lim, err := plotter.NewLine(plotter.XYs{{X: 0, Y: degC(n.Limit)}, {X: end, Y: degC(n.Limit)}})
			if err != nil {
				return nil, err
			}
			lim.Color = plotutil.Color(k)
			lim.Width = vg.Points(1)
			lim.Dashes = []vg.Length{vg.Points(6), vg.Points(3)}
			p.Add(lim)
			p.Legend.Add(n.ID+" limit", lim)
		}
	}
	wt, err := p.WriterTo(9*vg.Inch, 5*vg.Inch, format)
	if err != nil {
		return nil, err
	}
	var buf bytes.Buffer
	if _, err := wt.WriteTo(&buf); err != nil {
		return nil, err
	}
	return buf.Bytes(), nil
}
