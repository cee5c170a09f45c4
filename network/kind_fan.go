package network

import (
	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/units"
)

func init() {
	registerLinkKind(linkKind{
		name: "fan", order: 85,
		summary: "a fan or blower from its curve of static pressure against flow",
		help: "A fan blows air from its from node (its inlet) to its to node. Its curve is the " +
			"maker's static pressure against volume flow at the inlet, read through a monotone " +
			"cubic (Fritsch & Carlson 1980), measured at curve_speed and curve_density; at " +
			"another speed and at the inlet air's density the fan laws scale it (Q ∝ N, " +
			"Δp ∝ ρN²). Whether the fan pushes air into the box or pulls it out, the network " +
			"is the same: the curve applies at the air it draws. Fans in series are links one " +
			"after the other through an air node; in parallel, links between the same two " +
			"nodes. state: stopped makes it a loss (stopped_coefficient on area). The report " +
			"gives each fan's operating point and warns near shut-off, in the rising (unstable) " +
			"part of the curve and beyond its ends.",
		sources: []string{
			"Fritsch & Carlson, SIAM J. Numer. Anal. 17(2), 1980 (monotone interpolation)",
			"fan affinity laws: ASHRAE Handbook—HVAC Systems and Equipment, ch. Fans",
			"Idelchik, Handbook of Hydraulic Resistance (the stopped fan as a plate of open ratio 0.5, a rule of thumb)",
		},
		example: "{id: blower, kind: fan, from: ambient, to: plenum, curve: [[0, 120 Pa], [10 CFM, 95 Pa], [20 CFM, 55 Pa], [28 CFM, 0 Pa]]}",
		keys: []keySpec{
			{name: "curve", what: "table", need: "required", help: "[volume flow, static pressure] points, flows increasing from shut-off to free delivery"},
			{name: "curve_speed", dim: units.RotationalSpeed, help: "speed the curve was measured at, e.g. 4000 rpm"},
			{name: "speed", dim: units.RotationalSpeed, need: "with curve_speed", help: "speed it runs at: constant or a profile in time (a fan that slows at night, fails at a moment: a step to 0)"},
			{name: "curve_density", dim: units.Density, def: "1.2 kg/m3 (standard air)", help: "air density of the curve"},
			{name: "state", what: "word", def: "running", help: "running or stopped"},
			{name: "area", dim: units.Area, need: "with state: stopped", help: "the fan's face (frame opening) area"},
			{name: "stopped_coefficient", dim: units.Dimensionless, def: "4", help: "loss coefficient of the stopped fan on area"},
			{name: "shutoff_fraction", dim: units.Dimensionless, def: "0.1", help: "warn below this fraction of free delivery"},
			elevationKey,
		},
		parse: parseFan,
		ends:  []endRule{{"from", "the fan's inlet side", airwayKinds}, {"to", "the fan's outlet side", airwayKinds}},
	})
}

// StandardAirDensity is the density of standard air, kg/m³, at which fan
// curves are usually published (1.2 kg/m³: ANSI/AMCA 210 and ISO 5801
// standard air, 20 °C, 101.325 kPa, 50 % relative humidity; from memory).
const StandardAirDensity = 1.2

// StoppedFanK is the default loss coefficient of a stopped fan on its face
// area: a rule of thumb that takes its hub and blades to block about half
// of the face, and prices that as a thin plate of open ratio 0.5
// (Idelchik's sharp-edged orifice, (1 + 0.707√0.5 − 0.5)²/0.5² = 4.0).
const StoppedFanK = 4.0

// FanParams is a fan.
type FanParams struct {
	branch
	Fan   elements.Fan
	speed Profile // the speed in time (rev/s), nil when constant
}

func (p *FanParams) element(e linkEnv) (elements.Element, error) {
	fan := p.Fan
	if p.speed != nil {
		// The speed follows its profile through a run (rev/s → rpm); the
		// run steps onto its jumps.
		prof := p.speed
		fan.SpeedAt = func(t float64) float64 { return prof.At(t) * 60 }
		e.net.profiles = append(e.net.profiles, prof)
	}
	f, err := elements.NewFan(fan)
	if err != nil {
		return nil, err
	}
	return p.branch.element(e, f)
}

func parseFan(o *object, m *Model) LinkParams {
	b, ok := readBranch(o)
	q, dp, okC := readTable(o, "curve", units.VolumeFlow, units.Pressure, true)
	f := elements.Fan{CurveDensity: StandardAirDensity}
	if okC {
		c, err := elements.NewMonotoneCurve(q, dp)
		if err != nil {
			o.r.addf(o.values["curve"], o.field("curve"), "%v", err)
			okC = false
		}
		f.Curve = c
	}
	var speedProfile Profile
	if o.has("speed") || o.has("curve_speed") {
		s, prof, ok1 := o.varying("speed", units.RotationalSpeed, true)
		if ok1 && prof == nil && !(s > 0) {
			o.r.addf(o.values["speed"], o.field("speed"), "must be greater than zero (use state: stopped for a fan that does not run)")
			ok1 = false
		}
		s0, ok2 := o.positive("curve_speed", units.RotationalSpeed, true)
		ok = ok && ok1 && ok2
		f.Speed, f.CurveSpeed = s*60, s0*60 // rpm
		speedProfile = prof
	}
	if o.has("curve_density") {
		d, ok1 := o.positive("curve_density", units.Density, true)
		ok = ok && ok1
		f.CurveDensity = d
	}
	if o.has("shutoff_fraction") {
		x, ok1 := o.fraction("shutoff_fraction", true)
		ok = ok && ok1
		f.ShutoffFraction = x
	}
	state := "running"
	if o.has("state") {
		s, ok1 := o.choice("state", "fan state", []string{"running", "stopped"})
		ok = ok && ok1
		state = s
	}
	k := StoppedFanK
	if o.has("stopped_coefficient") {
		x, ok1 := o.positive("stopped_coefficient", units.Dimensionless, true)
		ok = ok && ok1
		k = x
	}
	if state == "stopped" {
		a, ok1 := o.positive("area", units.Area, true)
		ok = ok && ok1
		if ok1 {
			l, err := elements.NewLoss(k, a)
			if err != nil {
				o.r.addf(o.node, o.path, "%v", err)
				return nil
			}
			f.Stopped, f.StoppedLoss = true, l
		}
	} else if o.has("area") {
		_, ok1 := o.positive("area", units.Area, true)
		ok = ok && ok1
	}
	if !(ok && okC) {
		return nil
	}
	if _, err := elements.NewFan(f); err != nil {
		o.r.addf(o.values["curve"], o.field("curve"), "%v", err)
		return nil
	}
	return &FanParams{branch: b, Fan: f, speed: speedProfile}
}
