package network

import (
	"fmt"
	"math"

	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/internal/bigmem"
	"github.com/heatgraph/heatgraph/solve"
	"github.com/heatgraph/heatgraph/sparse"
)

// Steady is the steady balance of a network in the form the Newton solver
// takes: the unknowns are the variables that are not given (temperatures
// of the free nodes, K; pressures, Pa; mass flows, kg/s), the residuals
// the balances paired with them (net heat into each free node, W, ...).
// Each Steady has its own work space, so several may solve the same
// Network at once.
type Steady struct {
	net   *Network
	x     []float64 // every variable
	sum   []float64 // net flow into every variable's equation
	mag   []float64 // magnitude of the terms of every equation
	ev    evaluator
	state elements.State
	capM  *sparse.Matrix // work space of Capacity
	capE  []float64
}

// Steady returns a new steady-state problem for the network.
func (net *Network) Steady() *Steady {
	p := &Steady{
		net: net,
		x:   bigmem.Make[float64](len(net.Vars)),
		sum: bigmem.Make[float64](len(net.Vars)),
		mag: bigmem.Make[float64](len(net.Vars)),
		ev:  evaluator{a: net.asm},
	}
	for i, v := range net.Vars {
		p.x[i] = v.Value
	}
	p.state = elements.State{X: p.x, Env: &net.Env}
	return p
}

// Size returns the number of unknowns.
func (p *Steady) Size() int { return len(p.net.unknown) }

// Kinds returns the kinds of variables.
func (p *Steady) Kinds() []solve.Kind { return varKinds }

// KindOf returns the kind of unknown i.
func (p *Steady) KindOf(i int) int { return int(p.net.Vars[p.net.unknown[i]].Kind) }

// Name names unknown i for messages.
func (p *Steady) Name(i int) string { return p.net.varName(p.net.unknown[i]) }

// EquationName names the equation of unknown i for messages, e.g.
// `heat balance of "cpu"`.
func (p *Steady) EquationName(i int) string { return p.net.varEquation(p.net.unknown[i]) }

// Variable returns the network variable of unknown i.
func (p *Steady) Variable(i int) int { return p.net.unknown[i] }

// Pattern returns a matrix with the Jacobian's pattern, every value
// zero. Its values are its own; its RowPtr and Col are the network's, shared
// with every other matrix Pattern returns (a meshed plate's are large), and
// must not be changed.
func (p *Steady) Pattern() *sparse.Matrix {
	m := p.net.asm.pattern
	return &sparse.Matrix{N: m.N, RowPtr: m.RowPtr, Col: m.Col, Val: bigmem.Make[float64](len(m.Col))}
}

// Jacobian returns a matrix with the Jacobian's pattern.
//
// Deprecated: use Pattern.
func (p *Steady) Jacobian() *sparse.Matrix { return p.Pattern() }

// SetTime sets the time the elements see, s, and the given variables that
// follow a profile (fixed and ambient temperatures) to their values then.
func (p *Steady) SetTime(t float64) {
	p.state.Time = t
	p.net.setGiven(p.x, t)
}

// InitialGuess returns a starting state: every free node at the ambient
// temperature, every other unknown at its starting value.
func (p *Steady) InitialGuess() []float64 {
	x := make([]float64, p.Size())
	for u, v := range p.net.unknown {
		x[u] = p.net.Vars[v].Value
	}
	return x
}

// load puts the unknowns x into the full variable vector, checking that
// every temperature is physical.
func (p *Steady) load(x []float64) error {
	temp := p.net.asm.temp
	for u, t := range x[:len(temp)] {
		if temp[u] && (!(t > 0) || math.IsInf(t, 0)) {
			return fmt.Errorf("node %q would be at %.4g K, at or below absolute zero: no physical state has these balances (does a negative power take more heat out of it than its links can bring?)", p.net.Vars[p.net.unknown[u]].Owner, t)
		}
		if math.IsNaN(t) || math.IsInf(t, 0) {
			return fmt.Errorf("%s: %g is not finite", p.net.Vars[p.net.unknown[u]].Name(), t)
		}
	}
	for _, r := range p.net.asm.runs {
		copy(p.x[r.v:r.v+r.n], x[r.u:r.u+r.n])
	}
	return nil
}

// Evaluate evaluates every element at the unknowns x: f is the net flow
// into each unknown's equation (heat into each free node, W, ...), mag the
// magnitude of the terms of each, and jac, when given, the Jacobian.
func (p *Steady) Evaluate(x, f []float64, jac *sparse.Matrix, mag []float64) error {
	if err := p.load(x); err != nil {
		return err
	}
	var m []float64
	if mag != nil {
		m = p.mag
	}
	p.ev.eval(&p.state, p.sum, m, jac)
	p.net.asm.toUnknowns(f, p.sum)
	if mag != nil {
		p.net.asm.toUnknowns(mag, p.mag)
	}
	return nil
}

// Stored sets e to the energy stored at each unknown's equation (J) and,
// when m is given, m to its derivatives (the heat capacities, J/K, in the
// Jacobian's pattern).
func (p *Steady) Stored(x, e []float64, m *sparse.Matrix) error {
	if err := p.load(x); err != nil {
		return err
	}
	p.ev.stored(&p.state, p.sum, m)
	p.net.asm.toUnknowns(e, p.sum)
	return nil
}

// Capacity sets c to each unknown's own heat capacity, J/K (0 where none
// is given), for the solver's pseudo-transient steps.
func (p *Steady) Capacity(x, c []float64) {
	clear(c)
	if len(p.net.asm.storing) == 0 {
		return
	}
	if p.capM == nil {
		p.capM, p.capE = p.Pattern(), make([]float64, len(c))
	}
	if err := p.Stored(x, p.capE, p.capM); err != nil {
		return
	}
	for i := range c {
		c[i] = p.capM.At(i, i)
	}
}

// flows evaluates the network at the full variable vector (a solution)
// and returns the net flow into every variable's equation.
func (p *Steady) flows() []float64 {
	p.ev.eval(&p.state, p.sum, nil, nil)
	return p.sum
}

// CoefficientSlope is how the balances change when one link's correlation
// coefficient is off by a fraction: Slope[u] = ∂F_u/∂ln h for every
// unknown u, with the correlation's published accuracy.
type CoefficientSlope struct {
	Link     string
	Kind     string
	Accuracy float64 // ± fraction of the coefficient
	Source   string  // where the accuracy figure comes from
	Slope    []float64
}

// CoefficientSlopes returns the coefficient slope of every link whose
// coefficient comes from a correlation with a stated accuracy
// (elements.Uncertain), at the unknowns x.
func (p *Steady) CoefficientSlopes(x []float64) ([]CoefficientSlope, error) {
	if err := p.load(x); err != nil {
		return nil, err
	}
	var out []CoefficientSlope
	for _, l := range p.net.Links {
		u, ok := l.Element.(elements.Uncertain)
		if !ok {
			continue
		}
		acc, src := u.Accuracy(&p.state)
		if acc == 0 {
			continue // a plate without natural convection on its faces
		}
		rows := u.Rows()
		loc := elements.NewLocal(len(rows), len(u.Vars()), false)
		elements.CoefficientSlope(u, &p.state, loc)
		cs := CoefficientSlope{Link: l.ID, Kind: l.Kind, Accuracy: acc, Source: src, Slope: make([]float64, p.Size())}
		for r, v := range rows {
			if f := p.net.free[v]; f >= 0 {
				cs.Slope[f] += loc.R[r]
			}
		}
		out = append(out, cs)
	}
	return out, nil
}
