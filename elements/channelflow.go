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
// all. The heat the channels pass to the air in either direction is
// ReversibleChannel's.
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

// ReversibleChannel is channels whose solved flow may run either way: the
// Channel from inlet to outlet carrying ṁ⁺ and the same channels from
// outlet to inlet carrying ṁ⁻ (ṁ⁺ = (ṁ + √(ṁ² + ε²))/2, ṁ⁻ = ṁ⁺ − ṁ, ε =
// UpwindWidth, as in a reversible Stream), summed. Forward, the backward
// part carries ε²/(4ṁ) and its heat is negligible (and the other way
// round), so each direction is the Channel's own relation; through zero
// the switch is smooth and its derivatives exact. It needs no change to
// Channel, which it evaluates at the split flows.
type ReversibleChannel struct {
	Forward  Channel // Inlet → Outlet
	Backward Channel // the same channels, Outlet → Inlet
}

// NewReversibleChannel returns the channel c made reversible.
func NewReversibleChannel(c Channel) *ReversibleChannel {
	b := c
	b.Inlet, b.Outlet = c.Outlet, c.Inlet
	return &ReversibleChannel{Forward: c, Backward: b}
}

// Rows returns Wall, Inlet and Outlet.
func (r *ReversibleChannel) Rows() []int { return r.Forward.Rows() }

// Vars returns Wall, Inlet, Outlet and Flow.
func (r *ReversibleChannel) Vars() []int { return r.Forward.Vars() }

// at evaluates f with the flow variable set to m, then restores it.
func (r *ReversibleChannel) at(s *State, m float64, f func()) {
	keep := s.X[r.Forward.Flow]
	s.X[r.Forward.Flow] = m
	f()
	s.X[r.Forward.Flow] = keep
}

// Eval adds both directions.
func (r *ReversibleChannel) Eval(s *State, l *Local) {
	m := s.X[r.Forward.Flow]
	mp, mn, dmp, dmn := split(m)
	jac := l.J != nil
	perm := [4]int{0, 2, 1, 3} // the backward part's rows and vars in ours
	for part, c := range []*Channel{&r.Forward, &r.Backward} {
		flow, dm, p := mp, dmp, [4]int{0, 1, 2, 3}
		if part == 1 {
			flow, dm, p = mn, dmn, perm
		}
		pl := NewLocal(3, 4, jac)
		if l.Given != nil {
			pl.Given = make([]bool, 4)
			for v := range 4 {
				pl.Given[v] = l.Given[p[v]]
			}
		}
		r.at(s, flow, func() { c.Eval(s, pl) })
		for a := range 3 {
			l.R[p[a]] += pl.R[a]
			if !jac {
				continue
			}
			for v := range 4 {
				d := pl.J[a*4+v]
				if v == 3 {
					d *= dm
				}
				l.J[p[a]*l.NV+p[v]] += d
			}
		}
	}
}

// Paths returns the paths of the direction the air takes.
func (r *ReversibleChannel) Paths(s *State) []Path {
	m := s.X[r.Forward.Flow]
	mp, mn, _, _ := split(m)
	var out []Path
	if m >= 0 {
		r.at(s, mp, func() { out = r.Forward.Paths(s) })
	} else {
		r.at(s, mn, func() { out = r.Backward.Paths(s) })
	}
	return out
}

// Report gives the report of the direction the air takes.
func (r *ReversibleChannel) Report(s *State) Report {
	m := s.X[r.Forward.Flow]
	mp, mn, _, _ := split(m)
	var rep Report
	if m >= 0 {
		r.at(s, mp, func() { rep = r.Forward.Report(s) })
		return rep
	}
	r.at(s, mn, func() { rep = r.Backward.Report(s) })
	rep.Warnings = append(rep.Warnings, "the air runs backwards through the channels, from the outlet to the inlet; the details are for that direction")
	return rep
}
