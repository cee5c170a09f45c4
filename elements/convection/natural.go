package convection

import (
	"math"

	"github.com/heatgraph/heatgraph/elements/dual"
	"github.com/heatgraph/heatgraph/elements/validity"
)

// Gravity is standard gravity, m/s².
const Gravity = 9.80665

// Rayleigh returns Ra = g β |ΔT| L³/(ν α) for expansion coefficient beta
// (1/K), temperature difference dT (K), characteristic length L (m),
// kinematic viscosity nu and thermal diffusivity alpha (m²/s), with g =
// Gravity. The magnitude of dT is used, so the result is never negative.
func Rayleigh(beta, dT dual.Num, L float64, nu, alpha dual.Num) dual.Num {
	return beta.Mul(dual.Abs(dT)).Scale(Gravity * L * L * L).Div(nu.Mul(alpha))
}

// Validity of Churchill & Chu (1975). ChurchillChuRa spans the data the
// all-Ra form was fitted to (0.1 to 10¹², from memory); the laminar form
// holds up to Ra = 10⁹. Both hold for all Prandtl numbers.
var (
	ChurchillChuRa        = validity.Range{Name: "Ra", Min: 1e-1, Max: 1e12}
	ChurchillChuLaminarRa = validity.Range{Name: "Ra", Min: 0, Max: 1e9}
)

// churchillChuPr returns 1 + (0.492/Pr)^(9/16), the Prandtl function of
// Churchill & Chu (1975).
func churchillChuPr(Pr dual.Num) dual.Num {
	return dual.Pow(Pr.Inv().Scale(0.492), 9.0/16).AddC(1)
}

// ChurchillChu returns the mean Nusselt number of an isothermal vertical
// plate in laminar, transitional or turbulent natural convection,
//
//	Nu = {0.825 + 0.387 Ra^(1/6) / [1 + (0.492/Pr)^(9/16)]^(8/27)}²,
//
// from Churchill & Chu (1975), Correlating equations for laminar and
// turbulent free convection from a vertical plate. The characteristic
// length of Ra and Nu is the plate height. Validity: ChurchillChuRa, all
// Pr. At Ra = 0 it returns 0.825² with zero derivative.
func ChurchillChu(Ra, Pr dual.Num) dual.Num {
	s := powPos(Ra, 1.0/6).Scale(0.387).Div(dual.Pow(churchillChuPr(Pr), 8.0/27)).AddC(0.825)
	return s.Mul(s)
}

// ChurchillChuLaminar returns the mean Nusselt number of an isothermal
// vertical plate in laminar natural convection,
//
//	Nu = 0.68 + 0.670 Ra^(1/4) / [1 + (0.492/Pr)^(9/16)]^(4/9),
//
// the laminar form of Churchill & Chu (1975), slightly more accurate than
// ChurchillChu below Ra = 10⁹. The characteristic length is the plate
// height. Validity: ChurchillChuLaminarRa, all Pr. At Ra = 0 it returns
// 0.68 with zero derivative.
func ChurchillChuLaminar(Ra, Pr dual.Num) dual.Num {
	return powPos(Ra, 0.25).Scale(0.670).Div(dual.Pow(churchillChuPr(Pr), 4.0/9)).AddC(0.68)
}

// TiltAngle is the range of inclination from the vertical, in radians, over
// which TiltedRa may be used: 0 to 60° (from memory).
var TiltAngle = validity.Range{Name: "theta (rad)", Min: 0, Max: math.Pi / 3}

// TiltedRa returns Ra·cos θ: the Rayleigh number to use in the vertical
// plate correlations for a plate inclined θ radians from the vertical, on
// the face where the boundary layer stays attached — the lower face of a
// hot plate or the upper face of a cold one. The component of gravity along
// the plate, g cos θ, drives that flow (Incropera et al., Fundamentals of
// Heat and Mass Transfer, ch. 9). The other face of a tilted plate is not
// covered. Validity: TiltAngle.
func TiltedRa(Ra dual.Num, theta float64) dual.Num {
	return Ra.Scale(math.Cos(theta))
}

// HorizontalLength returns the characteristic length A/P of a horizontal
// plate of area A and perimeter P, as used by HorizontalUp and
// HorizontalDown (Goldstein, Sparrow & Jones 1973; Lloyd & Moran 1974).
func HorizontalLength(area, perimeter float64) float64 { return area / perimeter }

// Validity of the horizontal-plate correlations, Ra based on L = A/P. For
// HorizontalUp the two published branches span 10⁴–10⁷ and 10⁷–10¹¹;
// for HorizontalDown, 10⁴–10⁹ (Incropera et al. 7th ed.). Both need
// Pr ≥ 0.7.
var (
	HorizontalUpRa   = validity.Range{Name: "Ra", Min: 1e4, Max: 1e11}
	HorizontalDownRa = validity.Range{Name: "Ra", Min: 1e4, Max: 1e9}
	HorizontalPr     = validity.Range{Name: "Pr", Min: 0.7}
)

// HorizontalUp returns the mean Nusselt number of the upper face of a hot
// horizontal plate, or the lower face of a cold one, where the heated
// (cooled) fluid rises (sinks) away from the surface. It is the larger of
//
//	Nu = 0.54 Ra^(1/4)   (laminar, 10⁴ ≤ Ra ≤ 10⁷)
//	Nu = 0.15 Ra^(1/3)   (turbulent, 10⁷ ≤ Ra ≤ 10¹¹)
//
// from Lloyd & Moran (1974), Natural convection adjacent to horizontal
// surface of various planforms, as given by Incropera et al., Fundamentals
// of Heat and Mass Transfer. Taking the larger keeps Nu continuous for
// Newton iterations: the branches cross at Ra = 3.6¹² ≈ 4.7×10⁶, close to
// the 8×10⁶ at which Lloyd & Moran split their own data, whereas switching
// at the quoted 10⁷ would jump by 6 %. Between 4.7×10⁶ and 10⁷ the result
// is up to 6 % above the laminar branch; the slope has a kink at the
// crossing. Characteristic length: HorizontalLength. Validity:
// HorizontalUpRa, HorizontalPr. Below Ra = 10⁴ the laminar branch is kept
// and falls to zero with Ra, under-predicting the conduction limit.
func HorizontalUp(Ra dual.Num) dual.Num {
	return dual.Max(powPos(Ra, 0.25).Scale(0.54), powPos(Ra, 1.0/3).Scale(0.15))
}

// HorizontalDown returns the mean Nusselt number of the lower face of a hot
// horizontal plate, or the upper face of a cold one, where the fluid must
// flow out sideways under the plate:
//
//	Nu = 0.52 Ra^(1/5),
//
// Incropera, DeWitt, Bergman & Lavine, Fundamentals of Heat and Mass
// Transfer, 7th ed. (2011), Eq. 9.32. Characteristic length:
// HorizontalLength. Validity: HorizontalDownRa, HorizontalPr. Below
// Ra = 10⁴ the formula is kept and falls to zero with Ra.
func HorizontalDown(Ra dual.Num) dual.Num {
	return powPos(Ra, 0.2).Scale(0.52)
}

// powPos returns x^p for x ≥ 0 and 0 < p < 1. At x = 0, where the slope
// of x^p is infinite, it returns zero with zero derivative; see the
// package comment for why.
func powPos(x dual.Num, p float64) dual.Num {
	if x.V == 0 {
		return dual.Num{}
	}
	return dual.Pow(x, p)
}
