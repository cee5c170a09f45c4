package elements

// HeatInput puts a constant heat flow into one node: the dissipation of a
// component, a resistor or a board region.
type HeatInput struct {
	Node int
	Q    float64 // W; negative values remove heat (a thermoelectric cold side, say)
}

// Rows returns the one node heated.
func (h *HeatInput) Rows() []int { return []int{h.Node} }

// Vars returns nothing: the heat does not depend on any variable.
func (h *HeatInput) Vars() []int { return nil }

// Eval adds Q into the node.
func (h *HeatInput) Eval(_ *State, l *Local) { l.R[0] += h.Q }

// Power returns Q.
func (h *HeatInput) Power(*State) float64 { return h.Q }

// Paths returns none: a source is where heat starts, not a path.
func (h *HeatInput) Paths(*State) []Path { return nil }
