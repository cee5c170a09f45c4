package network

import (
	"fmt"
	"math"

	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/sparse"
)

// Steady is the steady energy balance of a network in the form the Newton
// solver takes: the unknowns are the temperatures of the free nodes (K), the
// residuals the net heat flowing into each of them (W). Each Problem has its
// own work space, so several may solve the same Network at once.
type Steady struct {
	net     *Network
	temps   []float64 // every node, K
	heat    []float64 // net heat into every node, W
	input   float64   // total magnitude of the heat inputs, W
	stamper assembler
}

// Steady returns a new steady-state problem for the network.
func (net *Network) Steady() *Steady {
	p := &Steady{
		net:   net,
		temps: make([]float64, len(net.Nodes)),
		heat:  make([]float64, len(net.Nodes)),
	}
	for i, n := range net.Nodes {
		if n.Fixed() {
			p.temps[i] = n.Temperature
		}
	}
	for _, s := range net.sources {
		p.input += math.Abs(s.Q)
	}
	p.stamper = assembler{heat: p.heat, free: net.free}
	return p
}

// Size returns the number of free nodes.
func (p *Steady) Size() int { return len(p.net.unknown) }

// Jacobian returns a matrix with the pattern of the network's links.
func (p *Steady) Jacobian() *sparse.Matrix {
	b := sparse.NewBuilder(p.Size())
	for _, el := range p.net.elements() {
		nodes := el.Nodes()
		for _, i := range nodes {
			for _, j := range nodes {
				if fi, fj := p.net.free[i], p.net.free[j]; fi >= 0 && fj >= 0 {
					b.Mark(fi, fj)
				}
			}
		}
	}
	return b.Build()
}

// InitialGuess returns a starting state: every free node at the ambient
// temperature.
func (p *Steady) InitialGuess() []float64 {
	x := make([]float64, p.Size())
	for i := range x {
		x[i] = p.net.Model.Ambient.Temperature
	}
	return x
}

// Evaluate stamps every element at free-node temperatures x, sets f to the
// net heat into each free node and, when jac is given, fills the Jacobian.
// The residual scale it returns is the larger of the total heat input and
// the heat passing through the fixed-temperature nodes, so that models
// driven only by boundary temperatures are judged fairly too.
func (p *Steady) Evaluate(x, f []float64, jac *sparse.Matrix) (float64, error) {
	for u, i := range p.net.unknown {
		t := x[u]
		if !(t > 0) || math.IsInf(t, 0) {
			return 0, fmt.Errorf("node %q: temperature %g K is not physical", p.net.Nodes[i].ID, t)
		}
		p.temps[i] = t
	}
	p.stamp(jac)
	for u, i := range p.net.unknown {
		f[u] = p.heat[i]
	}
	through := 0.0
	for i, n := range p.net.Nodes {
		if n.Fixed() {
			through += math.Abs(p.heat[i])
		}
	}
	return math.Max(math.Max(p.input, through/2), minResidualScale), nil
}

// minResidualScale keeps the residual scale of a model with no heat flow at
// all (every fixed node at one temperature, no inputs) from being zero.
const minResidualScale = 1e-9 // W

// stamp evaluates every element at p.temps into p.heat and jac.
func (p *Steady) stamp(jac *sparse.Matrix) {
	clear(p.heat)
	if jac != nil {
		jac.Zero()
	}
	p.stamper.jac = jac
	s := &elements.State{T: p.temps, Env: &p.net.Env}
	for _, el := range p.net.elements() {
		el.Stamp(s, &p.stamper)
	}
}

// elements returns every element: heat inputs, then links.
func (net *Network) elements() []elements.Element { return net.all }

// collect gathers every element of the network: heat inputs, then links.
func (net *Network) collect() {
	net.all = make([]elements.Element, 0, len(net.sources)+len(net.Links))
	for _, s := range net.sources {
		net.all = append(net.all, s)
	}
	for _, l := range net.Links {
		net.all = append(net.all, l.Element)
	}
}

// assembler is the Stamper that gathers heat for every node and Jacobian
// entries for pairs of free nodes.
type assembler struct {
	heat []float64
	free []int
	jac  *sparse.Matrix
}

func (a *assembler) AddHeat(n int, q float64) { a.heat[n] += q }

func (a *assembler) AddDeriv(n, m int, d float64) {
	if a.jac == nil {
		return
	}
	if fn, fm := a.free[n], a.free[m]; fn >= 0 && fm >= 0 {
		a.jac.Add(fn, fm, d)
	}
}
