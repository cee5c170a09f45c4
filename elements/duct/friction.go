package duct

import (
	"math"

	"github.com/heatgraph/heatgraph/elements/dual"
	"github.com/heatgraph/heatgraph/elements/validity"
)

// MuzychkaYovanovichF returns the apparent Darcy friction factor over the
// length of laminar flow developing from a uniform inlet velocity, from
// Muzychka & Yovanovich (2009), Pressure drop in laminar developing flow in
// noncircular ducts: a scaling and modeling approach, J. Fluids Eng. 131.
// The published form is Fanning on the √A scale,
//
//	f_app·Re_√A = [(3.44/√L⁺)² + (f·Re_√A)²]^(1/2),  L⁺ = L/(√A·Re_√A),
//
// (from memory; the same form appears in a secondary implementation). Both
// terms are independent of the length scale once divided by Re, so in Darcy
// terms on Dh
//
//	f_app = [13.76²/(Re·L/Dh) + (fRe/Re)²]^(1/2),
//
// with fRe the fully developed Darcy f·Re of the duct (Duct.LaminarFRe; the
// paper's own fit of it agrees with Shah & London within 1 %). lOverDh is
// L/Dh; re must be positive.
func MuzychkaYovanovichF(re dual.Num, fRe, lOverDh float64) dual.Num {
	const c = 4 * 3.44 // Fanning to Darcy
	entry := re.Inv().Scale(c * c / lOverDh)
	developed := re.Inv().Scale(fRe)
	return dual.Sqrt(entry.Add(developed.Mul(developed)))
}

// Churchill returns the Darcy friction factor for any Reynolds number,
// laminar through fully rough turbulent, from Churchill (1977),
// Friction-factor equation spans all fluid-flow regimes:
//
//	f = 8·[(8/Re)¹² + (A + B)^(−3/2)]^(1/12),
//	A = [2.457·ln(1/((7/Re)^0.9 + 0.27·e))]¹⁶,  B = (37530/Re)¹⁶,
//
// with e the relative roughness. It equals 64/Re in laminar flow.
func Churchill(re dual.Num, relRough float64) dual.Num {
	return ChurchillDuct(re, re.Inv().Scale(64), relRough)
}

// ChurchillDuct is Churchill (1977) with its laminar term 64/Re replaced by
// fLam, the laminar Darcy friction factor of the duct at the same Re:
//
//	f = 8·[(fLam/8)¹² + (A + B)^(−3/2)]^(1/12).
//
// Churchill built the equation by blending the laminar and the turbulent
// asymptotes with these exponents; giving it the laminar friction of a
// rectangle, or the apparent friction of a developing flow, keeps that
// blend and the turbulent branch while the laminar end becomes the duct's
// own. This substitution is the package's, not the paper's; with
// fLam = 64/Re it is the published equation.
func ChurchillDuct(re, fLam dual.Num, relRough float64) dual.Num {
	inv := re.Inv()
	a := dual.Pow(dual.Log(dual.Pow(inv.Scale(7), 0.9).AddC(0.27*relRough)).Scale(-2.457), 16)
	b := dual.Pow(inv.Scale(37530), 16)
	s := dual.Pow(fLam.Scale(1.0/8), 12).Add(dual.Pow(a.Add(b), -1.5))
	return dual.Pow(s, 1.0/12).Scale(8)
}

// ColebrookRe is the Reynolds range of the Colebrook equation (turbulent
// flow, about Re > 4000).
var ColebrookRe = validity.Range{Name: "Re", Min: 4000}

// Colebrook returns the Darcy friction factor of turbulent flow from
// Colebrook (1939), Turbulent flow in pipes, with particular reference to the
// transition region between the smooth and rough pipe laws:
//
//	1/√f = −2·log10(e/3.7 + 2.51/(Re·√f)),
//
// with e the relative roughness. It is solved by Newton's method on 1/√f to
// machine precision; the derivative follows from the implicit function
// theorem. Valid for ColebrookRe.
func Colebrook(re dual.Num, relRough float64) dual.Num {
	const k = 2 / math.Ln10
	r, e := re.V, relRough/3.7
	x := -1.8 * math.Log10(math.Pow(e, 1.11)+6.9/r) // Haaland start
	for range 100 {
		u := e + 2.51*x/r
		g := x + 2*math.Log10(u)
		step := g / (1 + k*2.51/(r*u))
		if x-step <= 0 {
			x /= 2
			continue
		}
		x -= step
		if math.Abs(step) <= 1e-15*x {
			break
		}
	}
	u := e + 2.51*x/r
	dxdRe := (k * 2.51 * x / (r * r * u)) / (1 + k*2.51/(r*u))
	return dual.Num{V: 1 / (x * x), D: -2 / (x * x * x) * dxdRe * re.D}
}

// HaalandRe is the Reynolds range of Haaland (1983) (from memory).
var HaalandRe = validity.Range{Name: "Re", Min: 4000, Max: 1e8}

// Haaland returns the Darcy friction factor of turbulent flow from the
// explicit approximation to Colebrook of Haaland (1983), Simple and explicit
// formulas for the friction factor in turbulent pipe flow:
//
//	1/√f = −1.8·log10[(e/3.7)^1.11 + 6.9/Re],
//
// with e the relative roughness. Valid for HaalandRe.
func Haaland(re dual.Num, relRough float64) dual.Num {
	s := re.Inv().Scale(6.9).AddC(math.Pow(relRough/3.7, 1.11))
	return dual.Pow(dual.Log10(s).Scale(-1.8), -2)
}
