// Package duct computes the mean heat transfer and friction of air flowing
// through a duct: the Nusselt number and the apparent Darcy friction factor
// of the channels of an electronics enclosure (fin gaps of heat sinks, card
// slots, tubes).
//
// # Units and length scales
//
// All quantities are SI. Geometry (Duct) is float64; the Reynolds and Prandtl
// numbers are dual.Num so that a channel element inside a Newton solve gets
// the exact derivative of Nu and f with respect to the air temperature, on
// which the properties (taken at the mean bulk temperature) depend.
//
// The hydraulic diameter Dh = 4A/P is the length scale of every exported
// result: Re = ρVDh/μ, Nu = hDh/k, Δp = (f·L/Dh + ΣK)·ρV²/2 with the Darcy
// friction factor f (four times the Fanning factor). Correlations published
// on another scale are converted inside: the Muzychka & Yovanovich models use
// the square root of the flow area, Re_√A = Re·√A/Dh and Nu = Nu_√A·Dh/√A.
// Parallel plates are idealised as infinitely wide: Dh = 2·gap, and only
// the two plate faces are wetted.
//
// # Regimes
//
// Flow selects the regime on the value of Re:
//
//   - laminar, Re ≤ 2300: mean Nu over the length for a uniform wall
//     temperature with simultaneously developing velocity and temperature
//     (Stephan 1959 for tubes and plates, Muzychka & Yovanovich 2004 for
//     rectangles, with its fully developed term replaced by Shah & London's
//     so that long ducts tend to the exact value), or with a developed
//     velocity (Hausen 1943), never below the fully developed value of
//     Shah & London (1978) for the heated walls; or that fully developed
//     value throughout (Options.Developed).
//   - transitional, 2300 < Re < 10⁴: Gnielinski's interpolation between
//     the laminar value at Re = 2300 (actual length) and the turbulent
//     value at Re = 10⁴ (VDI Heat Atlas G1) or at 4000 (Gnielinski 2013),
//     or the turbulent correlation applied from Re = 2300
//     (Options.Transition); always with a warning that Nu is uncertain
//     there.
//   - turbulent, Re ≥ 10⁴: Gnielinski (1976) with the Petukhov (1970)
//     friction factor, or Dittus & Boelter (1930).
//
// The friction factor in every regime is Churchill's (1977) all-regime
// equation with the duct's own laminar friction (Muzychka & Yovanovich 2009
// apparent friction, or the fully developed f·Re/Re) as its laminar term,
// so f(Re) is continuous and follows Colebrook in turbulent flow. With the
// interpolation, Nu(Re) is continuous too, so Newton iterations do not jump
// between regimes. Branches are taken on the value; the derivative is that
// of the branch taken, so the derivative of Nu has steps at 2300 and 10⁴
// but the value does not.
//
// Segment gives the mean values of a stretch of a longer duct, for
// channels split along the flow.
//
// # Heated walls
//
// Duct.Heated says which walls take heat (all, the two long walls, one
// long wall); the others are adiabatic. Nu is always on Dh = 4A/P of the
// whole wetted perimeter and per heated area; the fully developed laminar
// Nu_T is that of the heated walls (Duct.LaminarNuT).
//
// # Sources
//
// Each correlation names its source in its doc comment and exports the
// source's validity ranges as validity.Range values; Flow reports inputs
// outside them in Result.Warnings. Constants marked "from memory" could not
// be checked against the original paper and rest on secondary sources or
// consistency checks described in the tests.
package duct
