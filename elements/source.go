package elements

// TimeFunc is a quantity that changes with time: a power profile, an
// irradiance through a day. At returns its value at t seconds from the
// start of a run (t = 0 in a steady solve).
type TimeFunc interface {
	At(t float64) float64
}

// HeatInput puts a heat flow into one node: the dissipation of a
// component, a resistor or a board region, constant or following a
// profile in time.
type HeatInput struct {
	Node int
	Q    float64 // W; negative values remove heat (a thermoelectric cold side, say)
	// Of, when not nil, gives the heat at the state's time instead of Q.
	Of TimeFunc
}

// Rows returns the one node heated.
func (h *HeatInput) Rows() []int { return []int{h.Node} }

// Vars returns nothing: the heat does not depend on any variable.
func (h *HeatInput) Vars() []int { return nil }

// Eval adds the heat into the node.
func (h *HeatInput) Eval(s *State, l *Local) { l.R[0] += h.Power(s) }

// Power returns the heat at s's time: Q, or the profile's value.
func (h *HeatInput) Power(s *State) float64 {
	if h.Of != nil && s != nil {
		return h.Of.At(s.Time)
	}
	return h.Q
}

// Paths returns none: a source is where heat starts, not a path.
func (h *HeatInput) Paths(*State) []Path { return nil }

// EnvironmentSource is implemented by elements that bring heat from the
// environment rather than dissipate it (the sun on an outside wall): the
// energy balance lists it apart from the powers of components and nodes.
type EnvironmentSource interface {
	Element
	// EnvironmentHeat returns the heat the element brings in at s, W.
	EnvironmentHeat(s *State) float64
}
