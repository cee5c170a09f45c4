package convection

import (
	"github.com/heatgraph/heatgraph/elements/dual"
	"github.com/heatgraph/heatgraph/elements/validity"
)

// FinBi is the validity of FinEfficiency as the fin Biot number
// Bi = h t/(2k): the one-dimensional fin model needs the temperature across
// the thickness to be nearly uniform, Bi ≲ 0.1 (from memory).
var FinBi = validity.Range{Name: "Bi", Min: 0, Max: 0.1}

// FinEfficiency returns the efficiency of a straight rectangular fin of
// conductivity k (W/(m K)), thickness t and length L (m) under a uniform
// heat-transfer coefficient h (W/(m² K)) on both faces and the tip,
//
//	η_f = tanh(m L_c)/(m L_c),  m = (2h/(k t))^(1/2),  L_c = L + t/2,
//
// the adiabatic-tip solution with the length corrected for tip convection,
// for fins much wider than thick (Incropera et al., Fundamentals of Heat
// and Mass Transfer, ch. 3). The fin conductance is η_f·h·2w·L_c for fin
// width w. Validity: FinBi. For small m L_c a series in (m L_c)² is used,
// so η_f → 1 and its slope stay finite as h → 0.
func FinEfficiency(h dual.Num, k, thickness, length float64) dual.Num {
	lc := length + thickness/2
	u := h.Scale(2 * lc * lc / (k * thickness)) // (m L_c)²
	if u.V < 1e-6 {
		// tanh(x)/x = 1 − x²/3 + 2x⁴/15 − …; the next term is below 1e-19.
		return u.Mul(u).Scale(2.0 / 15).Sub(u.Scale(1.0 / 3)).AddC(1)
	}
	x := dual.Sqrt(u)
	return dual.Tanh(x).Div(x)
}

// OverallEfficiency returns the overall surface efficiency of a finned
// surface,
//
//	η_o = 1 − (A_f/A_t)(1 − η_f),
//
// where finArea A_f is the area of all fins (N times one fin) and
// totalArea A_t is the fin area plus the exposed base area (Incropera et
// al., Fundamentals of Heat and Mass Transfer, ch. 3). The heat flow of the
// whole surface is η_o·h·A_t·(T_base − T∞).
func OverallEfficiency(etaF dual.Num, finArea, totalArea float64) dual.Num {
	return etaF.Neg().AddC(1).Scale(-finArea / totalArea).AddC(1)
}
