package elements

import (
	"fmt"
	"math"

	"github.com/heatgraph/heatgraph/elements/air"
	"github.com/heatgraph/heatgraph/elements/convection"
	"github.com/heatgraph/heatgraph/elements/dual"
	"github.com/heatgraph/heatgraph/elements/duct"
)

// ChannelGeometry describes N identical parallel channels through which air
// is forced past a wall: drilled or machined passages in a block, or the
// gaps between the fins of a plate-fin heat sink.
type ChannelGeometry struct {
	Duct  duct.Duct // one channel: shape, size, length along the flow
	Count int       // number of parallel channels
	// PrimeArea is the wetted area of the wall itself in all channels,
	// taken at the wall temperature, m².
	PrimeArea float64
	// FinArea is the area of fins standing on the wall, in all channels,
	// m²; zero when the channel walls are all at the wall temperature.
	FinArea float64
	// FinConductivity, FinThickness and FinHeight describe the fins for
	// their efficiency (W/(m K), m, m); unused when FinArea is zero.
	FinConductivity, FinThickness, FinHeight float64
	// IsothermalFins takes the fins to be at the wall temperature
	// throughout (efficiency 1), as for short, thick or copper fins, or to
	// bound the result.
	IsothermalFins bool
	// KEntry and KExit are the minor-loss coefficients of the inlet and
	// outlet, on the channel velocity.
	KEntry, KExit float64
}

// FlowArea returns the total flow cross-section, m².
func (g *ChannelGeometry) FlowArea() float64 { return float64(g.Count) * g.Duct.FlowArea() }

// PlateFinSink returns the channels of a plate-fin heat sink with count fins
// of the given thickness and height standing on a base of width baseWidth,
// length (along the flow) length, with fins of conductivity k. The flow is
// taken to be confined to the count−1 gaps between fins (a shroud or duct
// wall at the fin tips), each a rectangular channel gap × fin height; the
// fin faces facing the gaps are fin area, the base between fins prime area;
// the outer faces of the two end fins and the fin tips are left out. Entry
// and exit losses follow the Kays & London fits for the open-area ratio
// σ = 1 − count·thickness/baseWidth.
func PlateFinSink(count int, thickness, height, baseWidth, length, k float64) (ChannelGeometry, error) {
	if count < 2 {
		return ChannelGeometry{}, fmt.Errorf("a plate-fin heat sink needs at least 2 fins, got %d", count)
	}
	if err := positive("fin thickness", thickness, "fin height", height, "base width", baseWidth, "length", length, "fin conductivity", k); err != nil {
		return ChannelGeometry{}, err
	}
	gap := (baseWidth - float64(count)*thickness) / float64(count-1)
	if !(gap > 0) {
		return ChannelGeometry{}, fmt.Errorf("%d fins of %g mm do not fit on a %g mm base", count, thickness*1e3, baseWidth*1e3)
	}
	n := count - 1
	sigma := 1 - float64(count)*thickness/baseWidth
	return ChannelGeometry{
		Duct:            duct.Duct{Shape: duct.Rectangular, Width: gap, Height: height, Length: length},
		Count:           n,
		PrimeArea:       float64(n) * gap * length,
		FinArea:         float64(n) * 2 * height * length,
		FinConductivity: k,
		FinThickness:    thickness,
		FinHeight:       height,
		KEntry:          duct.KaysLondonKc(sigma),
		KExit:           duct.KaysLondonKe(sigma),
	}, nil
}

// Passages returns count identical passages with walls at the wall
// temperature (no fins): rectangular or circular holes through a block or
// a cold plate, entered from and left to a plenum (sharp entry K = 0.5,
// exit K = 1). Only the walls that d.Heated names take heat: the prime area
// is the heated perimeter times the length.
func Passages(d duct.Duct, count int) (ChannelGeometry, error) {
	if count < 1 {
		return ChannelGeometry{}, fmt.Errorf("channel count must be at least 1, got %d", count)
	}
	if err := d.Validate(); err != nil {
		return ChannelGeometry{}, err
	}
	return ChannelGeometry{
		Duct:      d,
		Count:     count,
		PrimeArea: float64(count) * d.HeatedPerimeter() * d.Length,
		KEntry:    duct.KEntrySharp,
		KExit:     duct.KExitPlenum,
	}, nil
}

// Channel is forced convection from a wall to air flowing through parallel
// channels along it. Air enters from node Inlet at mass flow ṁ and leaves
// into node Outlet, carrying its enthalpy (as a Stream does) plus the heat
// picked up from node Wall:
//
//	q = ṁ·c_p·(1 − e^(−NTU))·(T_wall − T_in),   NTU = h̄·A_eff/(ṁ·c_p),
//
// the outlet relation for a uniform wall temperature (Incropera et al.,
// Fundamentals of Heat and Mass Transfer, §8.3.1, eq. 8.42b), which gives
// T_out = T_in + q/(ṁc_p) exactly, rather than assuming a mean temperature
// difference. h̄ = Nu·k/D_h, with Nu from duct.Flow (Shah & London fully
// developed, Muzychka & Yovanovich or Stephan combined entry in short
// channels, Gnielinski or Dittus–Boelter turbulent, in transition
// Gnielinski's interpolation or the turbulent correlation, per Options) at
// Re = ṁD_h/(A_flow·μ). The air properties μ, k, c_p and Pr are taken at
// the mean bulk temperature T_m = (T_in + T_out)/2 of the current Newton
// iterate, so the solution is consistent with them; c_p in the energy
// balance is Env.AirCp, the network's single value. Fins, when present,
// count through their efficiency, A_eff = A_prime + η_f·A_fin, with η_f for
// a straight rectangular fin with an adiabatic tip under h̄.
//
// A channel may be one segment of longer channels (a heat sink split along
// the flow, say, so that each part has its own base temperature). Its
// Upstream length is then the length of the same channels before it: the
// flow arrives already developing, and the segment's mean Nusselt number
// and friction factor are those of the stretch from Upstream to
// Upstream + L, Nu_seg = [(x₀+L)·Nu_m(x₀+L) − x₀·Nu_m(x₀)]/L, which
// follows from h̄·L = ∫h dx, never below the fully developed value
// (duct.Segment). Downstream is the length of the same channels after it.
// The entry loss is charged only to the segment at the entry (Upstream 0),
// the exit loss only to the last one (Downstream 0), so that the pressure
// drops of a split channel add up to the whole channel's.
type Channel struct {
	Wall, Inlet, Outlet int
	Flow                int // the variable holding the mass flow, kg/s
	Geometry            ChannelGeometry
	Options             duct.Options
	Upstream            float64 // length of the same channels upstream, m; 0 at the entry
	Downstream          float64 // length of the same channels downstream, m; 0 at the exit
	// hScale multiplies h when not zero: CoefficientSlope varies it.
	hScale float64
}

// channelState is everything the channel computes at one state.
type channelState struct {
	props     air.Props
	re, nu, h dual.Num
	etaF      dual.Num
	ntu, eff  dual.Num
	flow      duct.Result
}

// Seeds of the channel's dual evaluation.
const (
	seedNone = iota
	seedMean // the mean bulk temperature
	seedFlow // the mass flow
)

// eval computes the channel at the state's temperatures and flow, with the
// dual seed on the mean bulk temperature or on the mass flow.
func (c *Channel) eval(s *State, seed int) (cs channelState, tm dual.Num) {
	tm = dual.C((s.X[c.Inlet] + s.X[c.Outlet]) / 2)
	m := dual.C(s.X[c.Flow])
	switch seed {
	case seedMean:
		tm.D = 1
	case seedFlow:
		m.D = 1
	}
	g := &c.Geometry
	p := air.At(tm, s.Env.Pressure)
	re := p.Mu.Inv().Mul(m).Scale(g.Duct.Dh() / g.FlowArea())
	opts := c.Options
	opts.Heating = s.X[c.Wall] > tm.V
	// Stamping needs Nu alone; reports (seedNone) need the rest too.
	opts.HeatOnly = seed != seedNone
	res := c.segmentFlow(re, p.Pr, opts)
	h := res.Nu.Mul(p.K).Scale(c.scale() / g.Duct.Dh())
	aEff := dual.C(g.PrimeArea)
	eta := dual.C(1)
	if g.FinArea > 0 {
		if !g.IsothermalFins {
			// An adiabatic fin tip: L_c = H, hence the length H − t/2.
			eta = convection.FinEfficiency(h, g.FinConductivity, g.FinThickness, g.FinHeight-g.FinThickness/2)
		}
		aEff = aEff.Add(eta.Scale(g.FinArea))
	}
	ntu := h.Mul(aEff).Div(m.Scale(s.Env.AirCp))
	return channelState{props: p, re: re, nu: res.Nu, h: h, etaF: eta, ntu: ntu, eff: dual.OneMinusExpNeg(ntu), flow: res}, tm
}

// segmentFlow returns duct.Flow for this segment: over the whole length
// when the segment starts at the entry, else the stretch after Upstream.
func (c *Channel) segmentFlow(re, pr dual.Num, opts duct.Options) duct.Result {
	return duct.Segment(c.Geometry.Duct, c.Upstream, re, pr, opts)
}

// Rows returns Wall, Inlet and Outlet.
func (c *Channel) Rows() []int { return []int{c.Wall, c.Inlet, c.Outlet} }

// Vars returns Wall, Inlet, Outlet and Flow.
func (c *Channel) Vars() []int { return []int{c.Wall, c.Inlet, c.Outlet, c.Flow} }

// Eval adds the heat from the wall and the enthalpy carried.
func (c *Channel) Eval(s *State, l *Local) {
	cs, _ := c.eval(s, seedMean)
	m := s.X[c.Flow]
	mc := m * s.Env.AirCp
	dT := s.X[c.Wall] - s.X[c.Inlet]
	q := mc * cs.eff.V * dT
	rise := s.X[c.Inlet] - s.Env.AmbientT
	hin := mc * rise
	l.Add(0, -q)
	l.Add(1, -hin)
	l.Add(2, hin+q)
	if !l.WantsJacobian() {
		return
	}
	// ∂q/∂T_m, shared by inlet and outlet through T_m = (T_in + T_out)/2.
	dqm := mc * cs.eff.D * dT / 2
	dqw, dqi, dqo := mc*cs.eff.V, -mc*cs.eff.V+dqm, dqm
	l.D(0, 0, -dqw)
	l.D(0, 1, -dqi)
	l.D(0, 2, -dqo)
	l.D(1, 1, -mc)
	l.D(2, 0, dqw)
	l.D(2, 1, mc+dqi)
	l.D(2, 2, dqo)
	if !l.Needs(3) {
		// The flow is given: its derivatives are not used.
		return
	}
	byFlow, _ := c.eval(s, seedFlow)
	dqf := s.Env.AirCp * dT * (cs.eff.V + m*byFlow.eff.D)
	dhf := s.Env.AirCp * rise
	l.D(0, 3, -dqf)
	l.D(1, 3, -dhf)
	l.D(2, 3, dhf+dqf)
}

// Paths returns the heat from the wall to the outlet air and the heat the
// air brings from the inlet, above ambient.
func (c *Channel) Paths(s *State) []Path {
	cs, _ := c.eval(s, seedNone)
	mc := s.X[c.Flow] * s.Env.AirCp
	q := mc * cs.eff.V * (s.X[c.Wall] - s.X[c.Inlet])
	return []Path{
		{From: c.Wall, To: c.Outlet, Heat: q},
		{From: c.Inlet, To: c.Outlet, Heat: mc * (s.X[c.Inlet] - s.Env.AmbientT), Carried: true},
	}
}

// Report gives what a reviewer needs to check the channel by hand: flow
// regime and correlation, Re, Nu, h, velocity, outlet temperature, NTU,
// fin efficiency, pressure drop and entrance length, and warnings when a
// correlation is used outside its range.
func (c *Channel) Report(s *State) Report {
	cs, tm := c.eval(s, seedNone)
	g := &c.Geometry
	p := cs.props
	v := s.X[c.Flow] / (p.Rho.V * g.FlowArea())
	dp := 0.0
	if !math.IsInf(cs.flow.F.V, 0) {
		dp = duct.PressureDrop(cs.flow.F, g.Duct.Length/g.Duct.Dh(), c.lossCoefficient(), p.Rho, dual.C(v)).V
	}
	mc := s.X[c.Flow] * s.Env.AirCp
	q := mc * cs.eff.V * (s.X[c.Wall] - s.X[c.Inlet])
	regime := cs.flow.Regime
	if cs.flow.Developing {
		regime += ", developing"
	}
	entry := cs.flow.EntryThermal
	d := []Detail{
		{Name: "regime", Text: regime},
		{Name: "correlation", Text: cs.flow.Correlation},
		{Name: "Re", Value: cs.re.V},
		{Name: "Pr", Value: p.Pr.V},
		{Name: "Nu", Value: cs.nu.V},
		{Name: "h", Value: cs.h.V, Unit: "W/(m2 K)"},
		{Name: "velocity", Value: v, Unit: "m/s"},
		{Name: "Dh", Value: g.Duct.Dh(), Unit: "m"},
		{Name: "channels", Value: float64(g.Count)},
		{Name: "mass_flow", Value: s.X[c.Flow], Unit: "kg/s"},
		{Name: "inlet_temperature", Value: s.X[c.Inlet] - 273.15, Unit: "degC"},
		{Name: "outlet_temperature", Value: s.X[c.Outlet] - 273.15, Unit: "degC"},
		{Name: "mean_bulk_temperature", Value: tm.V - 273.15, Unit: "degC"},
		{Name: "NTU", Value: cs.ntu.V},
		{Name: "effectiveness", Value: cs.eff.V},
		{Name: "heat_to_air", Value: q, Unit: "W"},
		{Name: "pressure_drop", Value: dp, Unit: "Pa"},
		{Name: "friction_factor", Value: cs.flow.F.V},
		{Name: "friction_correlation", Text: cs.flow.FrictionCorrelation},
		{Name: "entrance_length", Value: entry, Unit: "m"},
	}
	d = append(d, c.segmentDetails(cs.flow)...)
	if g.FinArea > 0 {
		d = append(d, Detail{Name: "fin_efficiency", Value: cs.etaF.V})
	}
	var warn []string
	warn = append(warn, cs.flow.Warnings...)
	warn = append(warn, air.Check(tm.V, s.Env.Pressure)...)
	if g.FinArea > 0 && !g.IsothermalFins {
		bi := cs.h.V * g.FinThickness / (2 * g.FinConductivity)
		if w := convection.FinBi.Check(bi); w != "" {
			warn = append(warn, "fin efficiency: "+w+" (the one-dimensional fin model needs a thin, conductive fin)")
		}
	}
	return Report{Details: d, Warnings: warn}
}

func (c *Channel) scale() float64 {
	if c.hScale == 0 {
		return 1
	}
	return c.hScale
}

// Accuracy returns the relative accuracy of the Nusselt correlation in use
// at s.
func (c *Channel) Accuracy(s *State) (float64, string) {
	cs, _ := c.eval(s, seedNone)
	switch {
	case cs.flow.Regime == duct.RegimeTransitional:
		return 0.20, "transition range 2300 < Re < 10⁴: ±20 % or more (from memory)"
	case cs.flow.Regime == duct.RegimeTurbulent && c.Options.Turbulent == duct.DittusBoelter:
		return 0.25, "Dittus–Boelter: errors as large as 25 % (Incropera et al. §8.5, from memory)"
	case cs.flow.Regime == duct.RegimeTurbulent:
		return 0.10, "Gnielinski (1976): about ±10 % against most data (from memory)"
	case cs.flow.Developing:
		return 0.10, "laminar developing flow (Muzychka & Yovanovich 2004 combined entry): within about ±10 % (from memory)"
	}
	return 0.05, "laminar fully developed flow (Shah & London 1978): exact for the ideal duct; ±5 % for manufacturing tolerances of the gaps (rule of thumb)"
}

// ScaledBy returns a copy with h multiplied by k.
func (c *Channel) ScaledBy(k float64) Element { cc := *c; cc.hScale = k * c.scale(); return &cc }
