package elements

import "fmt"

// Sun is sunlight absorbed by an outside surface (node Node):
//
//	q = α_s·A·G(t)
//
// with α_s the surface's solar absorptivity (for the short-wave spectrum
// of sunlight, distinct from its infrared emissivity: white paint absorbs
// little sunlight yet emits well), A the area facing the sun and G the
// irradiance on it, W/m², constant or a profile in time (Incropera et al.,
// Fundamentals of Heat and Mass Transfer, §12.5 and §12.8: absorbed
// irradiation G_abs = α·G, with α of the sun's spectrum). The heat comes
// from outside the network: the energy balance lists it as environment
// heat, not as any part's power.
type Sun struct {
	Node int
	// Sky is the node that stands for where the light comes from, for
	// reports and diagrams only: no heat is taken from it.
	Sky          int
	Absorptivity float64
	Area         float64  // m²
	G            float64  // W/m², when Of is nil
	Of           TimeFunc // irradiance in time, W/m²
}

// NewSun checks the values and returns the element.
func NewSun(node, sky int, absorptivity, area, g float64, of TimeFunc) (*Sun, error) {
	if !(absorptivity > 0 && absorptivity <= 1) {
		return nil, fmt.Errorf("solar absorptivity must be in (0, 1], got %g", absorptivity)
	}
	if !(area > 0) {
		return nil, fmt.Errorf("area must be greater than zero, got %g", area)
	}
	if of == nil && g < 0 {
		return nil, fmt.Errorf("irradiance must not be negative, got %g W/m2", g)
	}
	return &Sun{Node: node, Sky: sky, Absorptivity: absorptivity, Area: area, G: g, Of: of}, nil
}

// Irradiance returns G at s's time.
func (u *Sun) Irradiance(s *State) float64 {
	if u.Of != nil && s != nil {
		return u.Of.At(s.Time)
	}
	return u.G
}

// Rows returns the surface.
func (u *Sun) Rows() []int { return []int{u.Node} }

// Vars returns nothing: the absorbed heat does not depend on temperature.
func (u *Sun) Vars() []int { return nil }

// Eval adds α_s·A·G into the surface.
func (u *Sun) Eval(s *State, l *Local) { l.R[0] += u.EnvironmentHeat(s) }

// EnvironmentHeat returns α_s·A·G, W.
func (u *Sun) EnvironmentHeat(s *State) float64 {
	return u.Absorptivity * u.Area * u.Irradiance(s)
}

// Paths reports the heat arriving from the sky node.
func (u *Sun) Paths(s *State) []Path {
	return []Path{{From: u.Sky, To: u.Node, Heat: u.EnvironmentHeat(s)}}
}

// Report gives the irradiance and the absorbed heat.
func (u *Sun) Report(s *State) Report {
	return Report{Details: []Detail{
		{Name: "G", Value: u.Irradiance(s), Unit: "W/m2"},
		{Name: "alpha_s", Value: u.Absorptivity},
		{Name: "absorbed", Value: u.EnvironmentHeat(s), Unit: "W"},
	}}
}
