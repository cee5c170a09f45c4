package network

import (
	"fmt"

	"github.com/heatgraph/heatgraph/solve"
)

// VarKind is the physical kind of a network variable.
type VarKind int

// Variable kinds. Each is paired with one kind of equation.
const (
	// TemperatureVar is a node's temperature, K, paired with the node's
	// heat balance, W.
	TemperatureVar VarKind = iota
	// PressureVar is an air node's pressure above ambient, Pa, paired with
	// the node's mass balance, kg/s.
	PressureVar
	// MassFlowVar is a flow branch's mass flow, kg/s, paired with the
	// branch's momentum balance (pressure rise minus drop), Pa.
	MassFlowVar
)

// varKinds describes each kind for the solver: its unit, the equations it
// is paired with, the size of a meaningful change (convergence is judged
// relative to it: 1e-7 of it by default), the largest change in one Newton
// step, and a residual small enough to be zero whatever the equation's
// terms.
var varKinds = []solve.Kind{
	// The heat balance's floor is about the round-off of the enthalpy
	// that air carries through a node that nothing heats: ṁ·c_p·ulp(T),
	// 1e-12 W at 20 g/s and 300 K, where every term is relative to ambient
	// and so near zero (the solver adds the round-off of each balance's
	// terms on top of it).
	TemperatureVar: {Name: "temperature", Unit: "K", Equation: "heat balance", EquationUnit: "W",
		Scale: 1, MaxStep: 500, ResidualFloor: 1e-12},
	// Pressures in a box are tens to hundreds of pascals: a scale of 10 Pa
	// lets the solver's pseudo-transient steps move them at that pace
	// (with 1 Pa they crawl where a flow must reverse), and still judges
	// convergence to 1e-6 Pa.
	PressureVar: {Name: "pressure", Unit: "Pa", Equation: "mass balance", EquationUnit: "kg/s",
		Scale: 10, MaxStep: 1e4, ResidualFloor: 1e-15},
	// A branch's momentum balance is stamped by its one element, so its
	// magnitude is its own residual: it is judged against the floor alone,
	// 1e-8 Pa (a ten-millionth of the 0.1 Pa a good manometer reads, and
	// round-off of pressures of kilopascals).
	MassFlowVar: {Name: "mass flow", Unit: "kg/s", Equation: "momentum balance", EquationUnit: "Pa",
		Scale: 1e-4, MaxStep: 1, ResidualFloor: 1e-8},
}

// VarKinds returns the kinds of variables, as the solver sees them.
func VarKinds() []solve.Kind { return append([]solve.Kind(nil), varKinds...) }

// Variable is one quantity of the network: a node's temperature, an air
// node's pressure or a branch's mass flow. A given variable keeps Value; the
// others are unknowns, and Value is where the solve starts.
type Variable struct {
	Kind  VarKind
	Owner string // the node or link it belongs to
	Given bool
	// Cell is 1 + the index of the cell within its plate (Owner) when the
	// variable is a plate cell's temperature, else 0.
	Cell  int32
	Value float64 // SI
}

// Name describes the variable for messages.
func (v Variable) Name() string {
	switch v.Kind {
	case TemperatureVar:
		return fmt.Sprintf("temperature of %q", v.Owner)
	case PressureVar:
		return fmt.Sprintf("pressure of %q", v.Owner)
	}
	return fmt.Sprintf("mass flow of %q", v.Owner)
}

// Equation names the equation paired with the variable, for messages.
func (v Variable) Equation() string {
	return fmt.Sprintf("%s of %q", varKinds[v.Kind].Equation, v.Owner)
}

// addVar appends a variable and returns its index.
func (net *Network) addVar(v Variable) int {
	net.Vars = append(net.Vars, v)
	return len(net.Vars) - 1
}
