package elements

import (
	"fmt"
	"math"
)

// Conductance is a linear link: the heat flowing from node A to node B is
// G·(T_A − T_B). It models every resistance that does not depend on
// temperature: conduction through a slab, an interface (contact) resistance,
// a resistance or conductance given directly, the legs of a compact
// component model, and convection with a given coefficient.
type Conductance struct {
	A, B int     // node indices
	G    float64 // conductance, W/K
}

// Slab returns the conduction link through a plane slab of conductivity k
// (W/(m K)), cross-section area (m²) and thickness or length L (m) in the
// direction of the heat flow: G = k·A/L (Fourier's law, one-dimensional
// steady conduction; Incropera et al., Fundamentals of Heat and Mass
// Transfer, §3.1).
func Slab(a, b int, k, area, length float64) (*Conductance, error) {
	if err := positive("conductivity", k, "area", area, "thickness", length); err != nil {
		return nil, err
	}
	return &Conductance{A: a, B: b, G: k * area / length}, nil
}

// Contact returns an interface link of area-specific resistance r (K·m²/W)
// over an area (m²): G = A/r″ (the usual definition of thermal contact
// resistance; Incropera et al. §3.1.4).
func Contact(a, b int, specific, area float64) (*Conductance, error) {
	if err := positive("specific resistance", specific, "area", area); err != nil {
		return nil, err
	}
	return &Conductance{A: a, B: b, G: area / specific}, nil
}

// Resistance returns a link of given thermal resistance R (K/W): G = 1/R.
func Resistance(a, b int, r float64) (*Conductance, error) {
	if err := positive("resistance", r); err != nil {
		return nil, err
	}
	return &Conductance{A: a, B: b, G: 1 / r}, nil
}

// FixedConvection returns a convection link with a given heat transfer
// coefficient h (W/(m² K)) over an area (m²): G = h·A (Newton's law of
// cooling). The coefficient is the user's; heatgraph does not check it.
func FixedConvection(a, b int, h, area float64) (*Conductance, error) {
	if err := positive("heat transfer coefficient", h, "area", area); err != nil {
		return nil, err
	}
	return &Conductance{A: a, B: b, G: h * area}, nil
}

// Rows returns A and B.
func (c *Conductance) Rows() []int { return []int{c.A, c.B} }

// Vars returns A and B.
func (c *Conductance) Vars() []int { return []int{c.A, c.B} }

// Eval adds G·(T_B − T_A) into A and the opposite into B.
func (c *Conductance) Eval(s *State, l *Local) {
	stampPair(l, c.G*(s.X[c.A]-s.X[c.B]), c.G, -c.G)
}

// Report gives the conductance and its resistance.
func (c *Conductance) Report(*State) Report {
	return Report{Details: []Detail{
		{Name: "G", Value: c.G, Unit: "W/K"},
		{Name: "R", Value: 1 / c.G, Unit: "K/W"},
	}}
}

// positive checks name/value pairs and returns an error naming the first
// value that is not a finite positive number.
func positive(pairs ...any) error {
	for i := 0; i+1 < len(pairs); i += 2 {
		name := pairs[i].(string)
		v := pairs[i+1].(float64)
		if !(v > 0) || math.IsInf(v, 0) {
			return fmt.Errorf("%s must be a positive number, got %g", name, v)
		}
	}
	return nil
}
