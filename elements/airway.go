package elements

import (
	"math"

	"github.com/heatgraph/heatgraph/elements/air"
	"github.com/heatgraph/heatgraph/elements/dual"
)

// Smoothing of the flow laws near zero flow. Both are far below any flow
// that matters in a box (1 CFM of air is about 5.8e-4 kg/s), and both are
// stated so that results can be judged against them.
const (
	// UpwindWidth ε is the width of the smooth switch of the enthalpy a
	// solved branch carries: the air leaving the From end is
	// ṁ⁺ = (ṁ + √(ṁ² + ε²))/2 and the air leaving the To end
	// ṁ⁻ = ṁ⁺ − ṁ. Energy is conserved exactly whatever ε; the upwind
	// value is off by ε²/(4ṁ²) of the carried heat (2.5e-9 at 0.1 g/s),
	// and at zero flow the two ends still exchange c_p·ε/2 = 5e-6 W/K, so
	// that an air node with no flow through it keeps a defined
	// temperature.
	UpwindWidth = 1e-8 // kg/s
	// LinearFlow δ is the linear part given to loss laws that go as the
	// square of the flow: ṁ|ṁ| is taken as ṁ·√(ṁ² + δ²), whose slope at
	// zero flow is δ rather than zero, so that the Jacobian of a network
	// at rest is not singular. It changes a quadratic loss by δ²/(2ṁ²) of
	// itself (5e-7 at 0.1 g/s).
	LinearFlow = 1e-7 // kg/s
)

// SignedSquare returns ṁ·√(ṁ² + δ²) with δ = LinearFlow: ṁ|ṁ| with a small
// linear part at zero, odd in ṁ, so that a loss opposes the flow in
// either direction.
func SignedSquare(m dual.Num) dual.Num {
	return m.Mul(dual.Sqrt(m.Mul(m).AddC(LinearFlow * LinearFlow)))
}

// FlowLaw is the pressure law of a flow branch.
type FlowLaw interface {
	// Rise returns the pressure the branch adds to air going from its
	// From end to its To end, Pa (a fan's rise minus the losses, so
	// negative for a plain loss), at mass flow m (kg/s, positive from
	// From to To) with the air of the ends at temperatures tFrom and tTo
	// (K) and the ambient pressure p (Pa). Any one argument may carry a
	// dual seed.
	Rise(m, tFrom, tTo dual.Num, p float64) dual.Num
}

// TimedLaw is implemented by laws that change in time (a fan whose speed
// follows a profile): RiseAt is Rise at t seconds from the start of a run.
// An airway calls it with the state's time.
type TimedLaw interface {
	RiseAt(t float64, m, tFrom, tTo dual.Num, p float64) dual.Num
}

// riseAt is law's rise at time t.
func riseAt(law FlowLaw, t float64, m, tFrom, tTo dual.Num, p float64) dual.Num {
	if tl, ok := law.(TimedLaw); ok {
		return tl.RiseAt(t, m, tFrom, tTo, p)
	}
	return law.Rise(m, tFrom, tTo, p)
}

// LawReporter is implemented by laws with more to say at a solution (a
// fan's operating point and warnings).
type LawReporter interface {
	LawReport(m, tFrom, tTo, p float64) Report
}

// Starter is implemented by laws that know a sensible flow to start the
// solve from, kg/s, at ambient density rho.
type Starter interface {
	StartFlow(rho float64) float64
}

// MeanDensity returns the density of the air in a branch, kg/m³: the mean
// of the ideal-gas densities at its two ends, at pressure p.
func MeanDensity(tFrom, tTo dual.Num, p float64) dual.Num {
	return air.Density(tFrom, p).Add(air.Density(tTo, p)).Scale(0.5)
}

// Airway is the flow of air through a branch between two air (or fixed)
// nodes: the mass balances of its ends and, when the flow is solved for,
// its momentum balance. With pressures p gauge above the ambient air at
// each node's own height z, the momentum balance of a branch from a to b
// through an opening at height z_o is
//
//	p_a − p_b + g·[(ρ_a − ρ₀)(z_a − z_o) − (ρ_b − ρ₀)(z_b − z_o)] + Δp_rise(ṁ) = 0,
//
// the hydrostatic pressure of each end's air between the node's height
// and the opening's, against the ambient column (ρ₀ at the ambient
// temperature): the stack (chimney) effect. Densities are those of an
// ideal gas at the node temperature and the ambient pressure. Fixed and
// ambient ends are taken at the opening's height: their given pressure is
// the pressure there. A vented box with inlet at the bottom and outlet at
// the top then has the classic draft Δp = g·H·(ρ₀ − ρ_inside) summed over
// the two vents.
//
// The mass balance rows of the ends get −ṁ (From) and +ṁ (To); at a fixed
// end that is the mass leaving the network there. A given flow (Law nil)
// stamps only the mass rows of the ends that have a pressure.
type Airway struct {
	From, To   int // temperature variables of the ends
	PFrom, PTo int // pressure variables of the ends; −1 where an end has none (given flows only)
	Flow       int // the mass-flow variable, kg/s, positive From → To
	Law        FlowLaw
	// Heights, m: of the From and To nodes and of the opening. Column
	// marks an end whose air column counts (an air node); otherwise the
	// end is taken at the opening's height.
	ZFrom, ZTo, ZOpen    float64
	ColumnFrom, ColumnTo bool

	rows, vars []int
	rFrom, rTo int // positions of the pressure rows in rows, −1 if absent
	rMom       int // position of the momentum row, −1 if absent
}

// NewAirway returns the airway with its rows and vars laid out.
func NewAirway(a Airway) *Airway {
	w := a
	w.rFrom, w.rTo, w.rMom = -1, -1, -1
	if w.PFrom >= 0 {
		w.rFrom = len(w.rows)
		w.rows = append(w.rows, w.PFrom)
	}
	if w.PTo >= 0 {
		w.rTo = len(w.rows)
		w.rows = append(w.rows, w.PTo)
	}
	w.vars = []int{w.Flow}
	if w.Law != nil {
		w.rMom = len(w.rows)
		w.rows = append(w.rows, w.Flow)
		w.vars = append(w.vars, w.PFrom, w.PTo, w.From, w.To)
	}
	return &w
}

// Rows returns the pressure rows of the ends and the momentum row.
func (w *Airway) Rows() []int { return w.rows }

// Vars returns the flow and, for a solved flow, the end pressures and
// temperatures.
func (w *Airway) Vars() []int { return w.vars }

// buoyancy returns the stack term of the momentum balance, Pa, with the
// temperatures of the ends (either may carry a seed).
func (w *Airway) buoyancy(tFrom, tTo dual.Num, env *Env) dual.Num {
	rho0 := air.Density(dual.C(env.AmbientT), env.Pressure).V
	b := dual.C(0)
	if w.ColumnFrom && w.ZFrom != w.ZOpen {
		b = b.Add(air.Density(tFrom, env.Pressure).AddC(-rho0).Scale(w.ZFrom - w.ZOpen))
	}
	if w.ColumnTo && w.ZTo != w.ZOpen {
		b = b.Sub(air.Density(tTo, env.Pressure).AddC(-rho0).Scale(w.ZTo - w.ZOpen))
	}
	return b.Scale(env.Gravity)
}

// Eval stamps the mass balances and the momentum balance.
func (w *Airway) Eval(s *State, l *Local) {
	m := s.X[w.Flow]
	if w.rFrom >= 0 {
		l.Add(w.rFrom, -m)
		l.D(w.rFrom, 0, -1)
	}
	if w.rTo >= 0 {
		l.Add(w.rTo, m)
		l.D(w.rTo, 0, 1)
	}
	if w.Law == nil {
		return
	}
	tf, tt := s.X[w.From], s.X[w.To]
	p := s.Env.Pressure
	rise := riseAt(w.Law, s.Time, dual.C(m), dual.C(tf), dual.C(tt), p)
	b := w.buoyancy(dual.C(tf), dual.C(tt), s.Env)
	l.Add(w.rMom, s.X[w.PFrom]-s.X[w.PTo]+b.V+rise.V)
	if !l.WantsJacobian() {
		return
	}
	r := w.rMom
	l.D(r, 0, riseAt(w.Law, s.Time, dual.Var(m), dual.C(tf), dual.C(tt), p).D)
	l.D(r, 1, 1)
	l.D(r, 2, -1)
	if l.Needs(3) {
		l.D(r, 3, riseAt(w.Law, s.Time, dual.C(m), dual.Var(tf), dual.C(tt), p).D+w.buoyancy(dual.Var(tf), dual.C(tt), s.Env).D)
	}
	if l.Needs(4) {
		l.D(r, 4, riseAt(w.Law, s.Time, dual.C(m), dual.C(tf), dual.Var(tt), p).D+w.buoyancy(dual.C(tf), dual.Var(tt), s.Env).D)
	}
}

// Operating returns, at a solution, the branch's mass flow (kg/s), its
// volume flow at the mean density of its ends (m³/s), the pressure the law
// adds (Pa, negative for a loss), the stack term (Pa) and the mean density.
func (w *Airway) Operating(s *State) (m, q, rise, stack, rho float64) {
	m = s.X[w.Flow]
	tf, tt := dual.C(s.X[w.From]), dual.C(s.X[w.To])
	rho = MeanDensity(tf, tt, s.Env.Pressure).V
	if w.Law != nil {
		rise = riseAt(w.Law, s.Time, dual.C(m), tf, tt, s.Env.Pressure).V
		stack = w.buoyancy(tf, tt, s.Env).V
	}
	return m, m / rho, rise, stack, rho
}

// Report gives the flow, the pressures and what the law reports.
func (w *Airway) Report(s *State) Report {
	m, q, rise, stack, rho := w.Operating(s)
	d := []Detail{
		{Name: "mass_flow", Value: m, Unit: "kg/s"},
		{Name: "volume_flow", Value: q, Unit: "m3/s"},
		{Name: "density", Value: rho, Unit: "kg/m3"},
	}
	if w.Law == nil {
		return Report{Details: d}
	}
	d = append(d, Detail{Name: "pressure_rise", Value: rise, Unit: "Pa"}, Detail{Name: "stack_pressure", Value: stack, Unit: "Pa"})
	rep := Report{Details: d}
	if lr, ok := w.Law.(LawReporter); ok {
		more := lr.LawReport(m, s.X[w.From], s.X[w.To], s.Env.Pressure)
		rep.Details = append(rep.Details, more.Details...)
		rep.Warnings = append(rep.Warnings, more.Warnings...)
	}
	return rep
}

// Combined is an element made of parts that share variables: the heat a
// branch carries (a Stream or a Channel) and its Airway. Its rows and vars
// are the union of the parts'; it reports the first part's paths and every
// part's details.
type Combined struct {
	Parts      []Element
	rows, vars []int
	rowMap     [][]int // per part: its row positions in rows
	varMap     [][]int
}

// Combine joins parts into one element.
func Combine(parts ...Element) *Combined {
	c := &Combined{Parts: parts}
	ri, vi := map[int]int{}, map[int]int{}
	for _, p := range parts {
		var rm, vm []int
		for _, r := range p.Rows() {
			k, ok := ri[r]
			if !ok {
				k = len(c.rows)
				ri[r] = k
				c.rows = append(c.rows, r)
			}
			rm = append(rm, k)
		}
		for _, v := range p.Vars() {
			k, ok := vi[v]
			if !ok {
				k = len(c.vars)
				vi[v] = k
				c.vars = append(c.vars, v)
			}
			vm = append(vm, k)
		}
		c.rowMap = append(c.rowMap, rm)
		c.varMap = append(c.varMap, vm)
	}
	return c
}

// Rows returns the union of the parts' rows.
func (c *Combined) Rows() []int { return c.rows }

// Vars returns the union of the parts' vars.
func (c *Combined) Vars() []int { return c.vars }

// Eval evaluates every part and adds it in.
func (c *Combined) Eval(s *State, l *Local) {
	for i, p := range c.Parts {
		rm, vm := c.rowMap[i], c.varMap[i]
		pl := NewLocal(len(rm), len(vm), l.J != nil)
		if l.Given != nil {
			pl.Given = make([]bool, len(vm))
			for b, k := range vm {
				pl.Given[b] = l.Given[k]
			}
		}
		p.Eval(s, pl)
		for a, k := range rm {
			l.R[k] += pl.R[a]
			if pl.J == nil {
				continue
			}
			for b, kv := range vm {
				l.J[k*l.NV+kv] += pl.J[a*len(vm)+b]
			}
		}
	}
}

// Paths returns the heat paths of the first part.
func (c *Combined) Paths(s *State) []Path {
	if pr, ok := c.Parts[0].(PathReporter); ok {
		return pr.Paths(s)
	}
	rows := c.Parts[0].Rows()
	l := NewLocal(len(rows), len(c.Parts[0].Vars()), false)
	c.Parts[0].Eval(s, l)
	return []Path{{From: rows[0], To: rows[1], Heat: -l.R[0]}}
}

// Report joins the parts' reports; a detail that an earlier part gave is
// not repeated.
func (c *Combined) Report(s *State) Report {
	var rep Report
	seen := map[string]bool{}
	for _, p := range c.Parts {
		if r, ok := p.(Reporter); ok {
			more := r.Report(s)
			for _, d := range more.Details {
				if !seen[d.Name] {
					seen[d.Name] = true
					rep.Details = append(rep.Details, d)
				}
			}
			rep.Warnings = append(rep.Warnings, more.Warnings...)
		}
	}
	return rep
}

// Airway returns the part that is an Airway, or nil.
func (c *Combined) Airway() *Airway {
	for _, p := range c.Parts {
		if w, ok := p.(*Airway); ok {
			return w
		}
	}
	return nil
}

// isFinite reports whether v is a finite number.
func isFinite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
