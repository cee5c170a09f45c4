package network

import (
	"fmt"
	"math"
	"sort"

	"github.com/heatgraph/heatgraph/elements/air"
	"github.com/heatgraph/heatgraph/elements/dual"
	"github.com/heatgraph/heatgraph/units"
)

// scaledProfile is a profile times a constant: a volume flow's profile as
// a mass flow.
type scaledProfile struct {
	Of     Profile
	Factor float64
}

// At implements Profile.
func (p *scaledProfile) At(t float64) float64 { return p.Factor * p.Of.At(t) }

// Jumps implements Profile.
func (p *scaledProfile) Jumps(from, to float64) []float64 { return p.Of.Jumps(from, to) }

// Range implements Profile.
func (p *scaledProfile) Range() (float64, float64) {
	lo, hi := p.Of.Range()
	lo, hi = p.Factor*lo, p.Factor*hi
	return min(lo, hi), max(lo, hi)
}

// Describe implements Profile.
func (p *scaledProfile) Describe() string {
	return fmt.Sprintf("%s, times %g", p.Of.Describe(), p.Factor)
}

// massFlowProfile reads flow (a volume flow of ambient air) or mass_flow,
// each a constant or a profile in time, and returns the mass flow at t = 0
// and its profile (nil when constant). A flow must stay above zero.
func massFlowProfile(o *object, m *Model) (float64, Profile, bool) {
	key := o.oneOf("a volume flow of ambient air such as 12 CFM, or a mass flow such as 6 g/s", "flow", "mass_flow")
	if key == "" {
		return 0, nil, false
	}
	kind, factor := units.MassFlow, 1.0
	if key == "flow" {
		// Fans and blowers are rated in volume: the air is at the
		// ambient state where it is drawn in.
		kind = units.VolumeFlow
		factor = air.Density(dual.C(m.Ambient.Temperature), m.Ambient.Pressure).V
	}
	x, p, ok := o.varying(key, kind, true)
	if !ok {
		return 0, nil, false
	}
	if low := profileLowest(p, x); !(low > 0) {
		o.r.addf(o.values[key], o.field(key), "%q must be greater than zero at all times (it reaches %g %s)", key, low, kind.SIUnit())
		return 0, nil, false
	}
	if p == nil {
		return x * factor, nil, true
	}
	if factor != 1 {
		p = &scaledProfile{Of: p, Factor: factor}
	}
	return p.At(0), p, true
}

// givenFlowProfile adds a mass-flow variable of the link that follows p
// (held at mdot when p is nil) and returns it.
func (e linkEnv) givenFlowProfile(mdot float64, p Profile) int {
	v := e.givenFlow(mdot)
	if p != nil {
		e.net.given = append(e.net.given, givenProfile{v: v, p: p})
		e.net.profiles = append(e.net.profiles, p)
	}
	return v
}

// flowProfiler is implemented by the parameters of links whose flow may
// follow a profile.
type flowProfiler interface {
	flowProfile() Profile
}

// unbalancedAirInTime reports the air nodes whose inflow and outflow part
// at some time of a run, when flows follow profiles (unbalancedAir checks
// t = 0). Profiles are constant or linear between their corners and jumps,
// so the balance is checked on both sides of every corner and jump of
// every flow profile, over the first two periods of the longest repeat.
func (m *Model) unbalancedAirInTime() Problems {
	type flow struct {
		up, down string
		c        float64
		p        Profile
	}
	var flows []flow
	varying := false
	for i := range m.Links {
		l := &m.Links[i]
		up, down, f, ok := l.airflow()
		if !ok {
			continue
		}
		fl := flow{up: up, down: down, c: f}
		if fp, is := l.Params.(flowProfiler); is && fp.flowProfile() != nil {
			fl.p = fp.flowProfile()
			varying = true
		}
		flows = append(flows, fl)
	}
	if !varying {
		return nil
	}
	horizon := 0.0
	var times []float64
	for _, f := range flows {
		if f.p != nil {
			times = append(times, profileCorners(f.p)...)
			horizon = math.Max(horizon, profileHorizon(f.p))
		}
	}
	var samples []float64
	for _, f := range flows {
		if f.p != nil {
			samples = append(samples, f.p.Jumps(0, horizon)...)
		}
	}
	samples = append(samples, times...)
	sort.Float64s(samples)
	var ps Problems
	for _, n := range m.Nodes {
		if n.Kind != Air {
			continue
		}
		for _, t := range samples {
			bad := false
			for _, at := range []float64{t * (1 - 1e-9), t, t*(1+1e-9) + 1e-9} {
				in, out := 0.0, 0.0
				for _, f := range flows {
					v := f.c
					if f.p != nil {
						v = f.p.At(at)
					}
					if f.down == n.ID {
						in += v
					}
					if f.up == n.ID {
						out += v
					}
				}
				if math.Abs(in-out) > 1e-6*math.Max(in, out) {
					ps = append(ps, Problem{File: m.File, Line: n.Line, Field: "nodes[" + n.ID + "]",
						Message: fmt.Sprintf("at t = %g s air arrives at %.4g g/s but leaves at %.4g g/s; flows that follow profiles must keep every air node's inflow equal to its outflow at all times (give the links of one air path the same profile)", at, in*1e3, out*1e3)})
					bad = true
					break
				}
			}
			if bad {
				break
			}
		}
	}
	return ps
}

// profileCorners returns the times of a profile's table points (with a
// repeat, those of its first period and the period's end), where a
// piecewise-linear profile changes slope.
func profileCorners(p Profile) []float64 {
	switch v := p.(type) {
	case *TableProfile:
		return append([]float64(nil), v.T...)
	case *RepeatProfile:
		return append(profileCorners(v.Of), v.Period)
	case *scaledProfile:
		return profileCorners(v.Of)
	}
	return nil
}

// profileHorizon returns a time by which a profile has shown all it does:
// its last jump or corner, or two periods of a repeat or duty cycle.
func profileHorizon(p Profile) float64 {
	switch v := p.(type) {
	case *StepProfile:
		return v.Time
	case *PulseProfile:
		return v.Start + v.Width
	case *DutyProfile:
		return v.Start + 2*v.Period
	case *TableProfile:
		return v.T[len(v.T)-1]
	case *RepeatProfile:
		return 2 * v.Period
	case *scaledProfile:
		return profileHorizon(v.Of)
	}
	return 0
}
