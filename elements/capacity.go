package elements

// Capacity is the thermal mass of a node: it stores the energy E = C·T
// (J, relative to 0 K) at the node's temperature T, with a constant heat
// capacity C (J/K), so that dE/dt = C·dT/dt (the lumped-capacitance model;
// Incropera et al., Fundamentals of Heat and Mass Transfer, §5.1). It moves
// no heat: in a steady solve it adds nothing.
type Capacity struct {
	Node int
	C    float64 // J/K
}

// Rows returns the node.
func (c *Capacity) Rows() []int { return []int{c.Node} }

// Vars returns the node.
func (c *Capacity) Vars() []int { return []int{c.Node} }

// Eval adds nothing: a heat capacity moves no heat.
func (c *Capacity) Eval(*State, *Local) {}

// Stored adds C·T and its derivative C.
func (c *Capacity) Stored(s *State, l *Local) {
	l.Add(0, c.C*s.X[c.Node])
	l.D(0, 0, c.C)
}

// Paths returns none.
func (c *Capacity) Paths(*State) []Path { return nil }

// Report gives the capacity.
func (c *Capacity) Report(*State) Report {
	return Report{Details: []Detail{{Name: "C", Value: c.C, Unit: "J/K"}}}
}
