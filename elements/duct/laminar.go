package duct

import (
	"math"

	"github.com/heatgraph/heatgraph/elements/dual"
	"github.com/heatgraph/heatgraph/elements/validity"
)

// Fully developed laminar flow in a circular tube (Shah & London 1978,
// Laminar Flow Forced Convection in Ducts): Darcy f·Re, Nu for a uniform wall
// temperature and Nu for a uniform heat flux.
const (
	CircularFRe = 64.0
	CircularNuT = 3.657
	CircularNuH = 4.364
)

// ShahLondonFRe returns the fully developed laminar Darcy f·Re of a
// rectangular duct of aspect ratio alpha, 0 ≤ alpha ≤ 1 (0: parallel plates,
// 96), from the polynomial fit of Shah & London (1978), Laminar Flow Forced
// Convection in Ducts. The fit matches their table within 0.1 %.
func ShahLondonFRe(alpha float64) float64 {
	return 96 * poly(alpha, 1, -1.3553, 1.9467, -1.7012, 0.9564, -0.2537)
}

// ShahLondonNuT returns the fully developed laminar Nusselt number (on Dh) of
// a rectangular duct of aspect ratio alpha, 0 ≤ alpha ≤ 1, for a uniform
// wall temperature on all four walls (the T boundary condition), from the
// polynomial fit of Shah & London (1978), Laminar Flow Forced Convection in
// Ducts. Nu_T(0) = 7.541 (parallel plates), Nu_T(1) ≈ 2.98 (square).
func ShahLondonNuT(alpha float64) float64 {
	return 7.541 * poly(alpha, 1, -2.610, 4.970, -5.119, 2.702, -0.548)
}

// ShahLondonNuH1 returns the fully developed laminar Nusselt number (on Dh)
// of a rectangular duct of aspect ratio alpha, 0 ≤ alpha ≤ 1, for a uniform
// axial heat flux with a peripherally uniform wall temperature (H1), four
// walls heated, from the polynomial fit of Shah & London (1978), Laminar Flow
// Forced Convection in Ducts. Nu_H1(0) = 8.235.
func ShahLondonNuH1(alpha float64) float64 {
	return 8.235 * poly(alpha, 1, -2.0421, 3.0853, -2.4765, 1.0578, -0.1861)
}

// LaminarFRe returns the fully developed laminar Darcy f·Re of d (Shah &
// London 1978).
func (d Duct) LaminarFRe() float64 {
	if d.Shape == Circular {
		return CircularFRe
	}
	return ShahLondonFRe(d.Aspect())
}

// LaminarNuH returns the fully developed laminar Nusselt number of d for a
// uniform axial heat flux (H1 for rectangles; Shah & London 1978).
func (d Duct) LaminarNuH() float64 {
	if d.Shape == Circular {
		return CircularNuH
	}
	return ShahLondonNuH1(d.Aspect())
}

// StephanTubePr is the Prandtl range of StephanTube (from memory).
var StephanTubePr = validity.Range{Name: "Pr", Min: 0.1}

// StephanTube returns the mean Nusselt number over the length of a circular
// tube with a uniform wall temperature and simultaneously developing
// velocity and temperature profiles, from Stephan (1959), Wärmeübergang und
// Druckabfall bei nicht ausgebildeter Laminarströmung in Rohren und ebenen
// Spalten, as given by Baehr & Stephan, Heat and Mass Transfer:
//
//	Nu_m = [3.657/tanh(2.264·X^(1/3) + 1.7·X^(2/3)) + 0.0499·tanh(X)/X]
//	       / tanh(2.432·Pr^(1/6)·X^(1/6)),   X = (L/D)/(Re·Pr).
//
// The form and constants agree with a secondary source citing Baehr &
// Stephan. It tends to 3.657 for long tubes. lOverD is L/D; re and pr must
// be positive.
func StephanTube(re, pr dual.Num, lOverD float64) dual.Num {
	x := inverseGraetz(re, pr, lOverD)
	x13 := dual.Pow(x, 1.0/3)
	thermal := dual.Tanh(x13.Scale(2.264).Add(x13.Mul(x13).Scale(1.7))).Inv().Scale(3.657)
	tail := dual.Tanh(x).Div(x).Scale(0.0499)
	velocity := dual.Tanh(dual.Pow(pr, 1.0/6).Mul(dual.Pow(x, 1.0/6)).Scale(2.432))
	return thermal.Add(tail).Div(velocity)
}

// StephanPlatesPr is the Prandtl range of StephanPlates (from memory).
var StephanPlatesPr = validity.Range{Name: "Pr", Min: 0.1, Max: 1000}

// StephanPlates returns the mean Nusselt number (on Dh = 2·gap) over the
// length of a parallel-plate channel, both plates at a uniform temperature,
// with simultaneously developing velocity and temperature profiles, from
// Stephan (1959), Wärmeübergang und Druckabfall bei nicht ausgebildeter
// Laminarströmung in Rohren und ebenen Spalten:
//
//	Nu_m = 7.55 + 0.024·X^(-1.14) / (1 + 0.0358·Pr^0.17·X^(-0.64)),
//	X = (L/Dh)/(Re·Pr).
//
// The form is from memory; a secondary implementation citing the paper has
// the same constants. lOverDh is L/Dh; re and pr must be positive.
func StephanPlates(re, pr dual.Num, lOverDh float64) dual.Num {
	x := inverseGraetz(re, pr, lOverDh)
	num := dual.Pow(x, -1.14).Scale(0.024)
	den := dual.Pow(pr, 0.17).Mul(dual.Pow(x, -0.64)).Scale(0.0358).AddC(1)
	return num.Div(den).AddC(7.55)
}

// Constants of the Muzychka & Yovanovich (2004) combined-entry model for a
// uniform wall temperature and the mean Nusselt number over the length.
// Checked against a secondary implementation citing the paper; the original
// was not seen (from memory otherwise).
const (
	myC1    = 3.24  // fully developed, uniform wall temperature
	myC2    = 1.5   // mean over the length (1 for local)
	myC3    = 0.409 // thermal entry, uniform wall temperature
	myC4    = 2.0   // mean over the length (1 for local)
	myGamma = 0.1   // shape exponent for rectangles
)

// MuzychkaYovanovichPr is the Prandtl range of MuzychkaYovanovichNu (from
// memory).
var MuzychkaYovanovichPr = validity.Range{Name: "Pr", Min: 0.1}

// MuzychkaYovanovichAspect is the aspect-ratio range over which the long-duct
// limit of MuzychkaYovanovichNu lies within 12.5 % of the Shah & London
// Nu_T(α) (checked in this package's tests; not a published bound).
var MuzychkaYovanovichAspect = validity.Range{Name: "aspect", Min: 0.02, Max: 1}

// MuzychkaYovanovichNu returns the mean Nusselt number (on Dh) over the
// length of a rectangular duct of aspect ratio alpha (0 < alpha ≤ 1) with a
// uniform wall temperature and simultaneously developing velocity and
// temperature profiles, from Muzychka & Yovanovich (2004), Laminar forced
// convection heat transfer in the combined entry region of non-circular
// ducts, J. Heat Transfer 126:54–61. On the √A length scale
//
//	Nu_√A = {[C4·f(Pr)/√z*]^m + ([C2·C3·(fRe/z*)^(1/3)]^5 + [C1·fRe/(8√π·α^γ)]^5)^(m/5)}^(1/m)
//	f(Pr) = 0.564/[1 + (1.664·Pr^(1/6))^(9/2)]^(2/9),  m = 2.27 + 1.65·Pr^(1/3)
//	fRe   = 12/(√α·(1 + α)·[1 − 192α/π⁵·tanh(π/(2α))])  (Fanning, on √A)
//	z*    = L/(√A·Re_√A·Pr),  C1 = 3.24, C2 = 3/2, C3 = 0.409, C4 = 2, γ = 1/10,
//
// converted with Re_√A = Re·√A/Dh and Nu = Nu_√A·Dh/√A. The constant 1.664 is
// from memory (one secondary implementation prints 1.644); 1.664 makes the
// large-Pr limit 0.564/1.664 = 0.3389 agree with the flat-plate coefficient
// 0.3387 of Churchill & Ozoe (1973) (from memory). The long-duct limit exceeds the Shah &
// London Nu_T(α) by up to 12 % near α = 0.5. lOverDh is L/Dh; re and pr must
// be positive.
func MuzychkaYovanovichNu(re, pr dual.Num, alpha, lOverDh float64) dual.Num {
	developed := myC1 * muzychkaYovanovichFRe(alpha) / (8 * math.Sqrt(math.Pi) * math.Pow(alpha, myGamma))
	return muzychkaYovanovich(re, pr, alpha, lOverDh, developed)
}

// MuzychkaYovanovichShahLondon is MuzychkaYovanovichNu with its fully
// developed term, C1·fRe/(8√π·α^γ), replaced by the Shah & London (1978)
// Nu_T(α) on the same √A scale (Nu_T·√A/Dh). The model's entry terms and
// its blending are unchanged, so short ducts behave as in the published
// model, while long ducts tend to the exact fully developed value instead
// of the model's own asymptote, which is 3 to 12 % higher. This is an
// engineering substitution of this package, not a published correlation.
func MuzychkaYovanovichShahLondon(re, pr dual.Num, alpha, lOverDh float64) dual.Num {
	r := 2 * math.Sqrt(alpha) / (1 + alpha) // Dh/√A
	return muzychkaYovanovich(re, pr, alpha, lOverDh, ShahLondonNuT(alpha)/r)
}

// muzychkaYovanovich evaluates the Muzychka & Yovanovich (2004) blend with
// the fully developed Nusselt number developed on the √A scale.
func muzychkaYovanovich(re, pr dual.Num, alpha, lOverDh, developed float64) dual.Num {
	r := 2 * math.Sqrt(alpha) / (1 + alpha) // Dh/√A
	fRe := muzychkaYovanovichFRe(alpha)
	z := inverseGraetz(re, pr, lOverDh*r*r)
	m := dual.Pow(pr, 1.0/3).Scale(1.65).AddC(2.27)
	fPr := dual.Pow(dual.Pow(pr, 1.0/6).Scale(1.664), 4.5).AddC(1)
	fPr = dual.Pow(fPr, 2.0/9).Inv().Scale(0.564)
	short := fPr.Div(dual.Sqrt(z)).Scale(myC4)
	entry := dual.Pow(z.Inv().Scale(fRe), 1.0/3).Scale(myC2 * myC3)
	long := dual.Pow(dual.Pow(entry, 5).AddC(math.Pow(developed, 5)), 0.2)
	nu := dual.PowN(dual.PowN(short, m).Add(dual.PowN(long, m)), m.Inv())
	return nu.Scale(r)
}

// muzychkaYovanovichFRe returns the fully developed Fanning f·Re on the √A
// scale of a rectangle of aspect ratio alpha (first term of the series
// solution, as used by Muzychka & Yovanovich 2004).
func muzychkaYovanovichFRe(alpha float64) float64 {
	b := 1 - 192*alpha/math.Pow(math.Pi, 5)*math.Tanh(math.Pi/(2*alpha))
	return 12 / (math.Sqrt(alpha) * (1 + alpha) * b)
}

// HausenPr is the Prandtl range where Hausen's thermal-entry form, which
// assumes a developed velocity profile, also holds for a developing one
// (from memory; "Pr ≳ 5"). For air it applies only behind an unheated
// starting length.
var HausenPr = validity.Range{Name: "Pr", Min: 5}

// Hausen returns the mean Nusselt number over the length of a circular tube
// with a uniform wall temperature and a developed velocity profile (thermal
// entry), from Hausen (1943), Darstellung des Wärmeüberganges in Rohren durch
// verallgemeinerte Potenzbeziehungen:
//
//	Nu_m = 3.66 + 0.0668·Gz/(1 + 0.04·Gz^(2/3)),  Gz = Re·Pr·D/L.
//
// lOverD is L/D; re and pr must be positive.
func Hausen(re, pr dual.Num, lOverD float64) dual.Num {
	return hausenForm(re, pr, 3.66, lOverD)
}

// HausenRectangular returns Hausen's thermal-entry form with 3.66 replaced by
// the Shah & London Nu_T(alpha) of a rectangle (alpha = 0: parallel plates):
//
//	Nu_m = Nu_T(α) + 0.0668·Gz/(1 + 0.04·Gz^(2/3)),  Gz = Re·Pr·Dh/L.
//
// This is an engineering substitution, not a published correlation: it has
// the right long-duct limit, and its entry term is that of the tube. Against
// this package's numerical solution of the rectangular Graetz problem it
// stays within 12 % with all walls heated (α = 0.25 and 1) and within 20 %
// for one heated wall of a square duct, over 10⁻³ ≤ x* ≤ 0.3 (Flow uses it
// with the Nu_T of the heated walls). lOverDh is L/Dh; re and pr must be
// positive.
func HausenRectangular(re, pr dual.Num, alpha, lOverDh float64) dual.Num {
	return hausenForm(re, pr, ShahLondonNuT(alpha), lOverDh)
}

// PlatesThermalEntry returns the mean Nusselt number (on Dh = 2·gap, per
// heated area) over the length of a parallel-plate channel with a developed
// velocity profile and a uniform temperature of the heated plates (thermal
// entry, the Graetz problem), as the superposition of its two limits:
//
//	Nu_m = [Nu_T³ + (1.849·x*^(−1/3))³]^(1/3),  x* = (L/Dh)/(Re·Pr),
//
// with 1.849·x*^(−1/3) the Lévêque short-length mean and Nu_T the fully
// developed value, 7.541 with both plates heated and 4.861 with one
// (Shah & London 1978, Laminar Flow Forced Convection in Ducts; constants
// from memory). The cube superposition follows Churchill & Usagi (1972);
// the exponent 3 is that of the VDI Heat Atlas forms for the thermal entry
// (from memory). This package's tests solve the Graetz problem numerically:
// the limits are reproduced and the superposition stays within 5 % for
// 10⁻⁴ ≤ x* ≤ 1. nuT is the fully developed value, lOverDh is L/Dh; re and
// pr must be positive.
func PlatesThermalEntry(re, pr dual.Num, nuT, lOverDh float64) dual.Num {
	leveque := dual.Pow(inverseGraetz(re, pr, lOverDh), -1.0/3).Scale(1.849)
	return dual.Pow(dual.Pow(leveque, 3).AddC(nuT*nuT*nuT), 1.0/3)
}

// hausenForm returns nu0 + 0.0668·Gz/(1 + 0.04·Gz^(2/3)).
func hausenForm(re, pr dual.Num, nu0, lOverDh float64) dual.Num {
	gz := re.Mul(pr).Scale(1 / lOverDh)
	return gz.Scale(0.0668).Div(dual.Pow(gz, 2.0/3).Scale(0.04).AddC(1)).AddC(nu0)
}

// inverseGraetz returns lRatio/(Re·Pr).
func inverseGraetz(re, pr dual.Num, lRatio float64) dual.Num {
	return re.Mul(pr).Inv().Scale(lRatio)
}

// poly returns c[0] + c[1]·x + c[2]·x² + ….
func poly(x float64, c ...float64) float64 {
	var s float64
	for i := len(c) - 1; i >= 0; i-- {
		s = s*x + c[i]
	}
	return s
}
