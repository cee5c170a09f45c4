package network

import (
	"errors"
	"fmt"
	"math"
	"sort"

	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/solve"
)

// Transient is the network through time, as the integrator takes it:
// dE/dt = F(x, t) with E the heat stored in the nodes' capacities and F
// the steady balances at time t (powers, fixed and ambient temperatures,
// irradiance at their values then). Nodes without a capacity are
// massless: their balances hold at every instant. It implements
// solve.Transient and solve.Jumper.
type Transient struct {
	*Steady
}

// Transient returns a new problem for a run through time.
func (net *Network) Transient() *Transient { return &Transient{Steady: net.Steady()} }

// Jumps returns the times in (from, to] at which a profile jumps.
func (p *Transient) Jumps(from, to float64) []float64 { return p.net.Jumps(from, to) }

// Start says where a run starts.
type Start string

// Starts of a run.
const (
	// FromAmbient: every free node at the ambient temperature at t = 0.
	FromAmbient Start = "ambient"
	// FromSteady: the steady state with every profile at its t = 0 value.
	FromSteady Start = "steady"
	// FromGiven: the temperatures in RunOptions.Initial, ambient for the
	// nodes not named there.
	FromGiven Start = "given"
)

// RunOptions describe a run through time.
type RunOptions struct {
	End      float64 // s
	Interval float64 // output interval, s; default End/100
	Start    Start
	// Initial gives starting temperatures by node id (K), with FromGiven.
	Initial map[string]float64
	// FixedStep, RelTol, AbsTol, FirstStep: see solve.TransientSettings
	// (AbsTol in K for temperatures).
	FixedStep, RelTol, AbsTol, FirstStep float64
	// Linear solves the stage systems; default solve.Auto (the dense LU
	// for small networks, the sparse family for large ones).
	Linear solve.LinearSolver
	// ModifiedNewton keeps the stage matrix's factorization while it
	// serves (see solve.TransientSettings).
	ModifiedNewton bool
	// Progress, when not nil, is called after every step with the fraction
	// of the run done.
	Progress func(done float64)
	// CycleTolerance is the largest change of any temperature from one
	// period to the next at which a repeated profile's periodic state has
	// settled, K. Default 0.01 K.
	CycleTolerance float64
	// Period, when positive, is the period of the cycle to check for a
	// settled periodic state; default the common period of the network's
	// repeated profiles, if they have one.
	Period float64
}

// Peak is the highest temperature of a node during a run and when.
type Peak struct {
	Node        string
	Temperature float64 // K
	At          float64 // s
}

// Crossing is the first time a node rose above its limit.
type Crossing struct {
	Node  string
	Limit float64 // K
	At    float64 // s, interpolated linearly between steps
}

// RunEnergy is the energy balance over a run, J: the heat in (sources and
// environment) equals the heat out through fixed nodes plus the change of
// the heat stored. Each is integrated with the weights of the integrator's
// own stages, so that the balance closes to the stage iterations'
// tolerance.
type RunEnergy struct {
	Sources, Environment float64
	Out                  []BoundaryHeat // J per fixed node
	Stored               float64        // change of the stored heat
	Imbalance            float64        // Sources + Environment − ΣOut − Stored
}

// Relative returns the imbalance relative to the largest term.
func (e RunEnergy) Relative() float64 {
	scale := math.Abs(e.Sources) + math.Abs(e.Environment)
	out := 0.0
	for _, o := range e.Out {
		out += math.Abs(o.Heat)
	}
	scale = math.Max(scale, math.Max(out, math.Abs(e.Stored)))
	if scale == 0 {
		return 0
	}
	return math.Abs(e.Imbalance) / scale
}

// EnergyTolerance is the relative imbalance of a run's energy above which
// the run is reported with a warning: the stage iterations stop within a
// hundredth of the error tolerance, which leaves a far smaller imbalance.
const EnergyTolerance = 1e-5

// Cycle is the periodic state of a run whose profiles repeat.
type Cycle struct {
	Period  float64 // s
	Settled bool    // the change from one period to the next fell below the tolerance
	Cycles  int     // periods run until it did (or in all)
	Change  float64 // the last period-to-period change of any temperature, K
	// Peaks are each node's highest temperature in the last whole period.
	Peaks []Peak
}

// History is the outcome of a run through time.
type History struct {
	Net    *Network
	Result solve.TransientResult
	Times  []float64   // output times, s
	T      [][]float64 // every node's temperature at each output time, K
	// Peaks holds each node's highest temperature (at step ends) and when.
	Peaks []Peak
	// Crossings lists the nodes that rose above their limits, in order
	// of time.
	Crossings []Crossing
	Energy    RunEnergy
	Cycle     *Cycle // nil unless the profiles repeat
	Warnings  []string
}

// Completed reports whether the run reached its end.
func (h *History) Completed() bool { return h.Result.Reason.Completed() }

// Run integrates the network from its start to o.End with TR-BDF2 and
// records temperatures at the output times, each node's peak, the first
// crossing of every limit, the energy balance and, for repeated profiles,
// the periodic state.
func (net *Network) Run(o RunOptions) (*History, error) {
	if !(o.End > 0) {
		return nil, errors.New("the run needs an end time after 0")
	}
	if o.Interval <= 0 {
		o.Interval = o.End / 100
	}
	if o.CycleTolerance <= 0 {
		o.CycleTolerance = 0.01
	}
	p := net.Transient()
	x0, err := net.startState(p, o)
	if err != nil {
		return nil, err
	}
	h := &History{Net: net}
	acc := newAccountant(net)
	nn := len(net.Nodes)
	// Outputs at every interval, and at every period for the cycle check.
	var outs []float64
	for k := 1; float64(k)*o.Interval < o.End*(1-1e-12); k++ {
		outs = append(outs, float64(k)*o.Interval)
	}
	period := o.Period
	if period <= 0 {
		period = net.commonPeriod()
	}
	var cyc *cycleCheck
	if period > 0 && period < o.End {
		cyc = &cycleCheck{period: period, tol: o.CycleTolerance}
		h.Cycle = &Cycle{Period: period}
		for k := 1; float64(k)*period <= o.End*(1+1e-12); k++ {
			outs = append(outs, float64(k)*period)
		}
	}
	sort.Float64s(outs)
	for i := range net.Nodes {
		h.Peaks = append(h.Peaks, Peak{Node: net.Nodes[i].ID, Temperature: math.Inf(-1)})
	}
	crossed := make([]bool, nn)
	prevT := make([]float64, nn)
	prevTime := 0.0
	observe := func(t float64, temps []float64, first bool) {
		for i, n := range net.Nodes {
			v := temps[i]
			if v > h.Peaks[i].Temperature {
				h.Peaks[i].Temperature, h.Peaks[i].At = v, t
			}
			if n.HasLimit && !crossed[i] && v > n.Limit {
				crossed[i] = true
				at := t
				if !first && prevT[i] <= n.Limit && v != prevT[i] {
					at = prevTime + (t-prevTime)*(n.Limit-prevT[i])/(v-prevT[i])
				}
				h.Crossings = append(h.Crossings, Crossing{Node: n.ID, Limit: n.Limit, At: at})
			}
		}
		copy(prevT, temps)
		prevTime = t
		if cyc != nil {
			cyc.observe(t, temps)
		}
	}
	temps0 := acc.temperatures(0, x0)
	observe(0, temps0, true)
	acc.start(x0)
	settings := solve.TransientSettings{
		End: o.End, Outputs: outs, FixedStep: o.FixedStep, RelTol: o.RelTol, AbsTol: o.AbsTol,
		FirstStep: o.FirstStep, Linear: o.Linear, ModifiedNewton: o.ModifiedNewton,
		Output: func(t float64, x []float64) error {
			if !onGrid(t, o.Interval) && t != 0 && t != o.End {
				if cyc != nil {
					cyc.atPeriod(t, acc.temperatures(t, x))
				}
				return nil
			}
			temps := acc.temperatures(t, x)
			h.Times = append(h.Times, t)
			h.T = append(h.T, append([]float64(nil), temps...))
			if cyc != nil {
				cyc.atPeriod(t, temps)
			}
			return nil
		},
		OnStep: func(s solve.StepInfo) bool {
			acc.step(s)
			end := s.Stages[2]
			observe(s.T+s.H, acc.temperatures(end.T, end.X), false)
			if o.Progress != nil {
				o.Progress(s.Progress)
			}
			return true
		},
	}
	h.Result = solve.TRBDF2(p, x0, settings)
	if !h.Result.Reason.Completed() {
		return h, nil
	}
	h.Energy = acc.finish(h.Result.X)
	if r := h.Energy.Relative(); r > EnergyTolerance {
		h.Warnings = append(h.Warnings, fmt.Sprintf("the energy over the run does not balance: %.3g J, %.2g of the heat moved (tolerance %.0e); tighten --rel-tol", h.Energy.Imbalance, r, EnergyTolerance))
	}
	sort.SliceStable(h.Crossings, func(a, b int) bool { return h.Crossings[a].At < h.Crossings[b].At })
	if cyc != nil {
		cyc.report(h.Cycle, net)
	}
	return h, nil
}

// onGrid reports whether t is a multiple of the interval.
func onGrid(t, interval float64) bool {
	k := math.Round(t / interval)
	return math.Abs(t-k*interval) <= 1e-9*math.Max(t, interval)
}

// startState returns the unknowns at the start of a run.
func (net *Network) startState(p *Transient, o RunOptions) ([]float64, error) {
	p.SetTime(0)
	x := p.InitialGuess()
	switch o.Start {
	case "", FromAmbient:
	case FromSteady:
		st := net.Steady()
		res := solve.Newton(st, st.InitialGuess(), solve.Settings{Linear: o.Linear})
		if !res.Reason.Converged() {
			err := fmt.Errorf("the steady state at t = 0 was not found (%s)", res.Reason)
			if res.Err != nil {
				err = fmt.Errorf("%w: %v", err, res.Err)
			}
			return nil, err
		}
		x = res.X
	case FromGiven:
		for id, t := range o.Initial {
			i, ok := net.Index[id]
			if !ok {
				return nil, fmt.Errorf("no node %q to start at %g K%s", id, t, suggest(id, sortedKeys(net.Index)))
			}
			u := net.free[i]
			if u < 0 {
				return nil, fmt.Errorf("node %q has a given temperature; it cannot be given a starting one", id)
			}
			x[u] = t
		}
	default:
		return nil, fmt.Errorf("unknown start %q (use ambient, steady or given)", o.Start)
	}
	return x, nil
}

// commonPeriod returns the period shared by every profile of the network
// that changes with time, or 0 when some profile does not repeat or the
// periods differ.
func (net *Network) commonPeriod() float64 {
	period := 0.0
	for _, p := range net.profiles {
		if s, ok := p.(*scaledProfile); ok {
			p = s.Of
		}
		var q float64
		switch v := p.(type) {
		case *RepeatProfile:
			q = v.Period
		case *DutyProfile:
			if v.Start != 0 {
				return 0
			}
			q = v.Period
		default:
			return 0
		}
		switch {
		case period == 0:
			period = q
		case math.Abs(q-period) > 1e-9*period:
			return 0
		}
	}
	return period
}

// accountant integrates the heat of a run with the integrator's stage
// weights.
type accountant struct {
	net    *Network
	p      *Steady
	e      []float64
	e0     float64
	energy RunEnergy
	out    []float64 // per node
	temps  []float64
}

func newAccountant(net *Network) *accountant {
	return &accountant{net: net, p: net.Steady(), e: make([]float64, len(net.unknown)), out: make([]float64, len(net.Nodes)), temps: make([]float64, len(net.Nodes))}
}

// temperatures returns every node's temperature at (t, x); the slice is
// reused.
func (a *accountant) temperatures(t float64, x []float64) []float64 {
	a.p.SetTime(t)
	_ = a.p.load(x)
	a.net.refreshViews(a.p.x)
	copy(a.temps, a.p.x[:len(a.net.Nodes)])
	return a.temps
}

func (a *accountant) stored(x []float64) float64 {
	if err := a.p.Stored(x, a.e, nil); err != nil {
		return math.NaN()
	}
	s := 0.0
	for u, v := range a.net.unknown {
		if a.net.Vars[v].Kind == TemperatureVar {
			s += a.e[u]
		}
	}
	return s
}

func (a *accountant) start(x []float64) { a.e0 = a.stored(x) }

// step adds one step's heat: each stage's flows times its weight.
func (a *accountant) step(s solve.StepInfo) {
	for _, st := range s.Stages {
		a.p.SetTime(st.T)
		if err := a.p.load(st.X); err != nil {
			continue
		}
		sum := a.p.flows()
		state := &a.p.state
		for _, src := range a.net.sources {
			if h, ok := src.(elements.Source); ok {
				a.energy.Sources += st.W * h.Power(state)
			}
		}
		for _, l := range a.net.Links {
			if env, ok := l.Element.(elements.EnvironmentSource); ok {
				a.energy.Environment += st.W * env.EnvironmentHeat(state)
			}
		}
		for i, n := range a.net.Nodes {
			if n.Fixed() {
				a.out[i] += st.W * sum[i]
			}
		}
	}
}

func (a *accountant) finish(x []float64) RunEnergy {
	a.energy.Stored = a.stored(x) - a.e0
	out := 0.0
	for i, n := range a.net.Nodes {
		if n.Fixed() {
			a.energy.Out = append(a.energy.Out, BoundaryHeat{Node: n.ID, Heat: a.out[i]})
			out += a.out[i]
		}
	}
	a.energy.Imbalance = a.energy.Sources + a.energy.Environment - out - a.energy.Stored
	return a.energy
}

// cycleCheck compares the temperatures at the end of each period with
// those at the end of the one before, and keeps each node's peak within
// the current period.
type cycleCheck struct {
	period, tol float64
	last        []float64 // at the end of the previous period
	cycles      int
	settledAt   int
	change      float64
	peaks       []Peak // in the current period
	done        []Peak // of the last whole period
}

func (c *cycleCheck) observe(t float64, temps []float64) {
	if c.peaks == nil {
		c.peaks = make([]Peak, len(temps))
		for i := range c.peaks {
			c.peaks[i].Temperature = math.Inf(-1)
		}
	}
	for i, v := range temps {
		if v > c.peaks[i].Temperature {
			c.peaks[i].Temperature, c.peaks[i].At = v, t
		}
	}
}

// atPeriod is called at output times; it acts at the ends of periods.
func (c *cycleCheck) atPeriod(t float64, temps []float64) {
	k := math.Round(t / c.period)
	if k < 1 || math.Abs(t-k*c.period) > 1e-9*t {
		return
	}
	c.cycles = int(k)
	if c.last != nil {
		c.change = 0
		for i, v := range temps {
			c.change = math.Max(c.change, math.Abs(v-c.last[i]))
		}
		if c.settledAt == 0 && c.change < c.tol {
			c.settledAt = c.cycles
		}
	}
	c.last = append(c.last[:0], temps...)
	c.done = append(c.done[:0], c.peaks...)
	for i := range c.peaks {
		c.peaks[i] = Peak{Temperature: temps[i], At: t}
	}
}

func (c *cycleCheck) report(out *Cycle, net *Network) {
	out.Cycles = c.cycles
	out.Change = c.change
	if c.settledAt > 0 {
		out.Settled, out.Cycles = true, c.settledAt
	}
	for i, p := range c.done {
		p.Node = net.Nodes[i].ID
		out.Peaks = append(out.Peaks, p)
	}
}
