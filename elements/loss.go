package elements

import (
	"fmt"

	"github.com/heatgraph/heatgraph/elements/dual"
)

// Loss is a loss coefficient K on a flow area A: the pressure drop of air
// at mean velocity V = ṁ/(ρA) through an opening, a bend, a grille or any
// fitting whose coefficient is known,
//
//	Δp = K·ρV²/2 = K·ṁ|ṁ|/(2ρA²),
//
// the definition of the loss coefficient (Idelchik, Handbook of Hydraulic
// Resistance, ch. 1), with ρ the mean density of the branch's ends and
// ṁ|ṁ| smoothed near zero (SignedSquare). The drop opposes the flow in
// either direction.
type Loss struct {
	K    float64 // loss coefficient, on Area
	Area float64 // m²
}

// NewLoss checks K and A.
func NewLoss(k, area float64) (*Loss, error) {
	if !(k > 0) || !(area > 0) || !isFinite(k) || !isFinite(area) {
		return nil, fmt.Errorf("a loss needs a positive coefficient and area (got K = %g, A = %g m²)", k, area)
	}
	return &Loss{K: k, Area: area}, nil
}

// Rise returns −Δp.
func (o *Loss) Rise(m, tFrom, tTo dual.Num, p float64) dual.Num {
	rho := MeanDensity(tFrom, tTo, p)
	return SignedSquare(m).Div(rho).Scale(-o.K / (2 * o.Area * o.Area))
}

// StartFlow is the flow through the opening at 1 m/s.
func (o *Loss) StartFlow(rho float64) float64 { return rho * o.Area }

// LawReport gives the velocity and the coefficient.
func (o *Loss) LawReport(m, tFrom, tTo, p float64) Report {
	rho := MeanDensity(dual.C(tFrom), dual.C(tTo), p).V
	return Report{Details: []Detail{
		{Name: "K", Value: o.K},
		{Name: "area", Value: o.Area, Unit: "m2"},
		{Name: "velocity", Value: m / (rho * o.Area), Unit: "m/s"},
	}}
}

// FlowResistance is a fixed flow resistance R: Δp = R·Q|Q| with the volume
// flow Q = ṁ/ρ at the mean density of the ends, as a system curve or a
// part measured at one operating point is often given (R = Δp/Q²). It
// opposes the flow in either direction; Q|Q| is smoothed near zero as in
// SignedSquare.
type FlowResistance struct {
	R float64 // Pa/(m³/s)²
}

// Rise returns −R·Q|Q|.
func (r *FlowResistance) Rise(m, tFrom, tTo dual.Num, p float64) dual.Num {
	rho := MeanDensity(tFrom, tTo, p)
	return SignedSquare(m).Div(rho.Mul(rho)).Scale(-r.R)
}

// StartFlow is the flow at which the drop is 10 Pa.
func (r *FlowResistance) StartFlow(rho float64) float64 { return rho * sqrt(10/r.R) }

// LawReport gives R.
func (r *FlowResistance) LawReport(m, tFrom, tTo, p float64) Report {
	return Report{Details: []Detail{{Name: "resistance", Value: r.R, Unit: "Pa s2/m6"}}}
}
