package elements

// HeatInput puts a constant heat flow into one node: the dissipation of a
// component, a resistor or a board region.
type HeatInput struct {
	Node int
	Q    float64 // W; negative values remove heat (a thermoelectric cold side, say)
}

// Nodes returns the one node heated.
func (h *HeatInput) Nodes() []int { return []int{h.Node} }

// Stamp adds Q into the node. It has no temperature derivative.
func (h *HeatInput) Stamp(_ *State, out Stamper) { out.AddHeat(h.Node, h.Q) }

// Power returns Q.
func (h *HeatInput) Power(*State) float64 { return h.Q }
