package elements

import (
	"github.com/heatgraph/heatgraph/elements/air"
	"github.com/heatgraph/heatgraph/elements/dual"
	"github.com/heatgraph/heatgraph/elements/duct"
)

// ChannelFlow is the pressure law of channels (or a plate-fin heat sink)
// whose flow is solved for: the drop the Channel element reports,
//
//	Δp = (f_app·L/D_h + K_entry + K_exit)·ρV²/2,   V = ṁ/(ρ·A_flow),
//
// with the apparent friction factor of duct.Flow (Muzychka & Yovanovich
// 2009 laminar, Churchill 1977 turbulent, Gnielinski's blend between) at
// Re = ṁD_h/(A_flow·μ), air properties at the mean of the inlet and
// outlet temperatures, and entry and exit losses from the geometry (Kays
// & London). The drop is taken at |ṁ| smoothed as √(ṁ² + δ²) (δ =
// LinearFlow) and given the sign of the flow, so the law is smooth and
// odd; at low flow it is laminar, Δp ∝ ṁ, which needs no smoothing at
// all. The heat the channels pass to the air (the Channel element) needs
// the air to run from inlet to outlet: a solved channel flow that
// reverses is reported.
type ChannelFlow struct {
	Geometry ChannelGeometry
	Options  duct.Options
	Upstream float64 // m, as Channel.Upstream
}

// drop returns the pressure drop at a positive mass flow m and mean
// temperature tm.
func (c *ChannelFlow) drop(m, tm dual.Num, p float64) (dual.Num, duct.Result) {
	g := &c.Geometry
	props := air.At(tm, p)
	re := props.Mu.Inv().Mul(m).Scale(g.Duct.Dh() / g.FlowArea())
	ch := Channel{Geometry: c.Geometry, Options: c.Options, Upstream: c.Upstream}
	res := ch.segmentFlow(re, props.Pr, c.Options)
	v := m.Div(props.Rho).Scale(1 / g.FlowArea())
	return duct.PressureDrop(res.F, g.Duct.Length/g.Duct.Dh(), g.KEntry+g.KExit, props.Rho, v), res
}

// Rise returns −Δp, signed with the flow.
func (c *ChannelFlow) Rise(m, tFrom, tTo dual.Num, p float64) dual.Num {
	s := dual.Sqrt(m.Mul(m).AddC(LinearFlow * LinearFlow))
	d, _ := c.drop(s, tFrom.Add(tTo).Scale(0.5), p)
	return d.Mul(m).Div(s).Neg()
}

// StartFlow is the flow at 1 m/s through the channels.
func (c *ChannelFlow) StartFlow(rho float64) float64 { return rho * c.Geometry.FlowArea() }

// LawReport warns of reversed flow.
func (c *ChannelFlow) LawReport(m, tFrom, tTo, p float64) Report {
	var rep Report
	if m < 0 {
		rep.Warnings = append(rep.Warnings, "the air runs backwards through the channels (from the outlet to the inlet): their heat transfer assumes the air enters at the inlet, so this result does not hold")
	}
	return rep
}
