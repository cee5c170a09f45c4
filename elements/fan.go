package elements

import (
	"fmt"
	"math"

	"github.com/heatgraph/heatgraph/elements/air"
	"github.com/heatgraph/heatgraph/elements/dual"
)

// Fan is a fan or blower in a branch, blowing from the branch's From end
// to its To end. Its curve is the static pressure rise against the volume
// flow at the fan's inlet, measured at CurveSpeed and CurveDensity; it is
// read through a monotone cubic (MonotoneCurve: Fritsch & Carlson 1980), so
// it never overshoots the published points. At another speed N and inlet
// density ρ the fan laws give the curve (Q, Δp) → (Q·N/N₀, Δp·(N/N₀)²·ρ/ρ₀)
// (the fan affinity laws; ASHRAE Handbook—HVAC Systems and Equipment, ch.
// "Fans"). The inlet is the From end whatever side of the box the fan is
// on: a fan that pushes air into a box and one that pulls it out are the
// same branch, and the curve applies at the density of the air it draws.
//
// Outside the curve (reverse flow, or beyond free delivery) the rise is
// continued from the end point along the end slope (taken no steeper than
// flat) minus a quadratic loss c·u², c = Δp_max/Q_free², u the distance
// beyond the end: a rule of thumb that makes a fan driven backwards or
// beyond free delivery resist like a part of its own size. Both give a
// warning.
//
// A stopped fan (Stopped) is a loss: StoppedLoss on the fan's face.
type Fan struct {
	Curve             MonotoneCurve // Q (m³/s) → static pressure (Pa), at CurveSpeed and CurveDensity
	CurveSpeed, Speed float64       // rpm; the ratio is 1 when either is 0
	// SpeedAt, when set, gives the speed (rpm) at t seconds from the
	// start of a run, in place of Speed: a speed profile.
	SpeedAt               func(t float64) float64
	CurveDensity          float64 // kg/m³
	Stopped               bool
	StoppedLoss           *Loss
	ShutoffFraction       float64 // below this fraction of free delivery, warn of shut-off; 0.1 by default
	quadratic, free, pmax float64
	firstSlope, lastSlope float64
	firstFlow, lastFlow   float64
	firstPress, lastPress float64
}

// NewFan checks and prepares the fan.
func NewFan(f Fan) (*Fan, error) {
	c := f.Curve
	n := len(c.X)
	if n < 2 {
		return nil, fmt.Errorf("a fan curve needs at least two points")
	}
	if c.X[0] < 0 {
		return nil, fmt.Errorf("a fan curve's flows must not be negative (first point %g m³/s)", c.X[0])
	}
	if !(c.X[n-1] > 0) {
		return nil, fmt.Errorf("a fan curve needs a point at positive flow")
	}
	if !(f.CurveDensity > 0) {
		return nil, fmt.Errorf("a fan curve needs the density it was measured at")
	}
	g := f
	g.free = c.X[n-1]
	for _, p := range c.Y {
		g.pmax = math.Max(g.pmax, p)
	}
	if !(g.pmax > 0) {
		return nil, fmt.Errorf("a fan curve needs a point of positive pressure")
	}
	g.quadratic = g.pmax / (g.free * g.free)
	g.firstSlope, g.lastSlope = math.Min(c.M[0], 0), math.Min(c.M[n-1], 0)
	g.firstFlow, g.lastFlow = c.X[0], c.X[n-1]
	g.firstPress, g.lastPress = c.Y[0], c.Y[n-1]
	if g.ShutoffFraction == 0 {
		g.ShutoffFraction = 0.1
	}
	if g.Stopped && g.StoppedLoss == nil {
		return nil, fmt.Errorf("a stopped fan needs its loss")
	}
	return &g, nil
}

// ratio returns N/N₀.
func (f *Fan) ratio() float64 { return f.ratioAt(0) }

// ratioAt returns N/N₀ at t seconds from the start of a run: the speed
// follows SpeedAt when it is set.
func (f *Fan) ratioAt(t float64) float64 {
	speed := f.Speed
	if f.SpeedAt != nil {
		speed = f.SpeedAt(t)
	}
	if speed > 0 && f.CurveSpeed > 0 {
		return speed / f.CurveSpeed
	}
	if f.SpeedAt != nil && f.CurveSpeed > 0 {
		return 0
	}
	return 1
}

// curveAt returns the pressure of the curve at its own speed and density,
// continued beyond its ends.
func (f *Fan) curveAt(q dual.Num) dual.Num {
	switch {
	case q.V < f.firstFlow:
		u := q.Neg().AddC(f.firstFlow)
		return u.Scale(-f.firstSlope).Sub(u.Mul(u).Scale(f.quadratic)).AddC(f.firstPress)
	case q.V > f.lastFlow:
		u := q.AddC(-f.lastFlow)
		return u.Scale(f.lastSlope).Sub(u.Mul(u).Scale(f.quadratic)).AddC(f.lastPress)
	}
	return f.Curve.At(q)
}

// Rise returns the fan's static pressure rise at mass flow m, by the fan
// laws from the curve, with the inlet density at tFrom.
func (f *Fan) Rise(m, tFrom, tTo dual.Num, p float64) dual.Num {
	return f.RiseAt(0, m, tFrom, tTo, p)
}

// RiseAt is Rise at t seconds from the start of a run, with the speed of
// that moment (a speed that falls to zero leaves the fan as its stopped
// loss, when it has one, else as a fan at zero speed: no rise).
func (f *Fan) RiseAt(t float64, m, tFrom, tTo dual.Num, p float64) dual.Num {
	if f.Stopped {
		return f.StoppedLoss.Rise(m, tFrom, tTo, p)
	}
	s := f.ratioAt(t)
	if s <= 0 {
		if f.StoppedLoss != nil {
			return f.StoppedLoss.Rise(m, tFrom, tTo, p)
		}
		s = 1e-6
	}
	rho := air.Density(tFrom, p)
	q := m.Div(rho).Scale(1 / s) // the flow on the curve's own speed
	return f.curveAt(q).Mul(rho).Scale(s * s / f.CurveDensity)
}

// StartFlow is half of free delivery.
func (f *Fan) StartFlow(rho float64) float64 {
	if f.Stopped {
		return f.StoppedLoss.StartFlow(rho) / 10
	}
	return rho * f.free * f.ratio() / 2
}

// Operating is a fan's operating point.
type Operating struct {
	VolumeFlow   float64 // at the fan's inlet, m³/s
	Pressure     float64 // static pressure rise, Pa
	Speed        float64 // rpm, 0 when not given
	InletDensity float64 // kg/m³
	FreeDelivery float64 // at this speed, m³/s
	Slope        float64 // dΔp/dQ at the operating point, Pa/(m³/s)
	Stopped      bool
	Warnings     []string
}

// OperatingPoint returns the fan's operating point at mass flow m with
// the inlet air at tFrom.
func (f *Fan) OperatingPoint(m, tFrom, p float64) Operating {
	rho := air.Density(dual.C(tFrom), p).V
	q := m / rho
	s := f.ratio()
	op := Operating{VolumeFlow: q, InletDensity: rho, Speed: f.Speed, FreeDelivery: f.free * s}
	if f.Stopped {
		op.Pressure = f.StoppedLoss.Rise(dual.C(m), dual.C(tFrom), dual.C(tFrom), p).V
		op.Speed, op.Stopped = 0, true
		op.Warnings = append(op.Warnings, "the fan is stopped: it is a loss in the air path")
		return op
	}
	qc := q / s
	pc := f.curveAt(dual.Var(qc))
	op.Pressure = pc.V * s * s * rho / f.CurveDensity
	op.Slope = pc.D * s * rho / f.CurveDensity
	switch {
	case qc < 0:
		op.Warnings = append(op.Warnings, fmt.Sprintf("air flows backwards through the running fan (%.4g m³/s): the pressure is extrapolated beyond shut-off", q))
	case qc < f.firstFlow:
		op.Warnings = append(op.Warnings, fmt.Sprintf("the fan runs below the first point of its curve (%.4g m³/s): the pressure is extrapolated", q))
	case qc > f.lastFlow:
		op.Warnings = append(op.Warnings, fmt.Sprintf("the fan runs beyond the free-delivery end of its curve (%.4g m³/s of %.4g m³/s): the pressure is extrapolated", q, op.FreeDelivery))
	case qc < f.ShutoffFraction*f.free:
		op.Warnings = append(op.Warnings, fmt.Sprintf("the fan runs near shut-off (%.4g m³/s, below %.0f %% of free delivery, a rule of thumb): little air moves and the fan may stall", q, 100*f.ShutoffFraction))
	}
	if qc >= f.firstFlow && qc <= f.lastFlow && pc.D > 0 {
		op.Warnings = append(op.Warnings, fmt.Sprintf("the fan runs where its pressure rises with flow (slope %.3g Pa per m³/s): the unstable part of the curve, where the operating point may jump", op.Slope))
	}
	return op
}

// LawReport gives the operating point.
func (f *Fan) LawReport(m, tFrom, tTo, p float64) Report {
	op := f.OperatingPoint(m, tFrom, p)
	d := []Detail{
		{Name: "fan_flow", Value: op.VolumeFlow, Unit: "m3/s"},
		{Name: "fan_pressure", Value: op.Pressure, Unit: "Pa"},
		{Name: "inlet_density", Value: op.InletDensity, Unit: "kg/m3"},
		{Name: "free_delivery", Value: op.FreeDelivery, Unit: "m3/s"},
	}
	if op.Speed > 0 {
		d = append(d, Detail{Name: "speed", Value: op.Speed, Unit: "rpm"})
	}
	if f.Stopped {
		d = append(d, Detail{Name: "state", Text: "stopped"})
	}
	return Report{Details: d, Warnings: op.Warnings}
}
