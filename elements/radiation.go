package elements

import "fmt"

// StefanBoltzmann is the Stefan–Boltzmann constant, W/(m² K⁴) (CODATA 2018,
// exact since the 2019 SI redefinition).
const StefanBoltzmann = 5.670374419e-8

// Radiation is gray diffuse radiative exchange between two surfaces
// represented by nodes A and B:
//
//	q(A→B) = σ·S·(T_A⁴ − T_B⁴)
//
// where S (m²) is the exchange area that folds emissivities, areas and the
// view factor together. The T⁴ law is stamped exactly; nothing is linearised.
type Radiation struct {
	A, B int
	S    float64 // exchange area, m²
}

// RadiationToSurroundings returns the exchange between a small gray surface
// of emissivity eps and area (m²) and large surroundings that it sees with
// view factor f (1 when it sees nothing else): S = ε·A·F (Incropera et al.,
// Fundamentals of Heat and Mass Transfer, eq. 1.7, small surface in a large
// enclosure, with the view factor limiting the part of the surroundings it
// sees).
func RadiationToSurroundings(a, b int, eps, area, f float64) (*Radiation, error) {
	if err := checkEmissivity(eps); err != nil {
		return nil, err
	}
	if err := positive("area", area, "view factor", f); err != nil {
		return nil, err
	}
	if f > 1 {
		return nil, fmt.Errorf("view factor must be at most 1, got %g", f)
	}
	return &Radiation{A: a, B: b, S: eps * area * f}, nil
}

// RadiationBetween returns the gray diffuse exchange between two surfaces
// that see each other: surface 1 (node a) of emissivity eps1 and area a1,
// which sees surface 2 (node b, eps2, a2) with view factor f12,
//
//	q₁₂ = σ(T₁⁴ − T₂⁴) / [(1−ε₁)/(ε₁A₁) + 1/(A₁F₁₂) + (1−ε₂)/(ε₂A₂)],
//
// the two-surface enclosure relation (Incropera et al., Fundamentals of
// Heat and Mass Transfer, eq. 13.23), exact when the two surfaces see only
// each other (F₁₂ = 1 with reciprocity) and otherwise the exchange along
// the direct path alone.
func RadiationBetween(a, b int, eps1, a1, eps2, a2, f12 float64) (*Radiation, error) {
	for _, e := range []float64{eps1, eps2} {
		if err := checkEmissivity(e); err != nil {
			return nil, err
		}
	}
	if err := positive("area", a1, "other area", a2, "view factor", f12); err != nil {
		return nil, err
	}
	if f12 > 1 {
		return nil, fmt.Errorf("view factor must be at most 1, got %g", f12)
	}
	if f21 := f12 * a1 / a2; f21 > 1+1e-9 {
		return nil, fmt.Errorf("view factor %g from %g m² to %g m² gives %.3g back by reciprocity, above 1", f12, a1, a2, f21)
	}
	r := (1-eps1)/(eps1*a1) + 1/(a1*f12) + (1-eps2)/(eps2*a2)
	return &Radiation{A: a, B: b, S: 1 / r}, nil
}

func checkEmissivity(eps float64) error {
	if !(eps > 0 && eps <= 1) {
		return fmt.Errorf("emissivity must be in (0, 1], got %g", eps)
	}
	return nil
}

// Rows returns A and B.
func (r *Radiation) Rows() []int { return []int{r.A, r.B} }

// Vars returns A and B.
func (r *Radiation) Vars() []int { return []int{r.A, r.B} }

// Eval adds the exchange and its exact derivatives 4σS·T³.
func (r *Radiation) Eval(s *State, l *Local) {
	ta, tb := s.X[r.A], s.X[r.B]
	ta2, tb2 := ta*ta, tb*tb
	q := StefanBoltzmann * r.S * (ta2*ta2 - tb2*tb2)
	da := 4 * StefanBoltzmann * r.S * ta2 * ta
	db := 4 * StefanBoltzmann * r.S * tb2 * tb
	stampPair(l, q, da, -db)
}

// Report gives the exchange area and the radiative heat transfer
// coefficient h_r = σ(T_A + T_B)(T_A² + T_B²), referred to the exchange area,
// so that q = h_r·S·(T_A − T_B) can be checked by hand.
func (r *Radiation) Report(s *State) Report {
	ta, tb := s.X[r.A], s.X[r.B]
	hr := StefanBoltzmann * (ta + tb) * (ta*ta + tb*tb)
	return Report{Details: []Detail{
		{Name: "exchange area", Value: r.S, Unit: "m2"},
		{Name: "h_r", Value: hr, Unit: "W/(m2 K)"},
		{Name: "G_equiv", Value: hr * r.S, Unit: "W/K"},
	}}
}
