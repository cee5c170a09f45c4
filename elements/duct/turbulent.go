package duct

import (
	"math"

	"github.com/heatgraph/heatgraph/elements/dual"
	"github.com/heatgraph/heatgraph/elements/validity"
)

// Validity ranges of Gnielinski (1976) with the Petukhov friction factor,
// for fully developed flow in smooth tubes.
var (
	GnielinskiRe = validity.Range{Name: "Re", Min: 3000, Max: 5e6}
	GnielinskiPr = validity.Range{Name: "Pr", Min: 0.5, Max: 2000}
)

// FullyDevelopedLD is the shortest L/Dh for which a fully developed turbulent
// correlation is used without an entry correction: the turbulent entrance
// length is about ten hydraulic diameters (rule of thumb).
var FullyDevelopedLD = validity.Range{Name: "L/Dh", Min: 10}

// PetukhovRe is the Reynolds range of Petukhov as used with Gnielinski (1976).
var PetukhovRe = validity.Range{Name: "Re", Min: 3000, Max: 5e6}

// Petukhov returns the Darcy friction factor of fully developed turbulent flow
// in a smooth tube, from Petukhov (1970), Heat transfer and friction in
// turbulent pipe flow with variable physical properties:
//
//	f = (0.790·ln Re − 1.64)^(−2).
func Petukhov(re dual.Num) dual.Num {
	return dual.Pow(dual.Log(re).Scale(0.790).AddC(-1.64), -2)
}

// GnielinskiNu returns the Nusselt number of fully developed turbulent flow in
// a smooth tube (on Dh for other shapes, ±10–15 %, from memory), from
// Gnielinski (1976), New equations for heat and mass transfer in turbulent
// pipe and channel flow, with the Petukhov friction factor f:
//
//	Nu = (f/8)(Re − 1000)Pr / [1 + 12.7·(f/8)^(1/2)·(Pr^(2/3) − 1)].
//
// Valid for GnielinskiRe and GnielinskiPr; negative below Re = 1000.
func GnielinskiNu(re, pr dual.Num) dual.Num {
	f8 := Petukhov(re).Scale(1.0 / 8)
	num := f8.Mul(re.AddC(-1000)).Mul(pr)
	den := dual.Sqrt(f8).Mul(dual.Pow(pr, 2.0/3).AddC(-1)).Scale(12.7).AddC(1)
	return num.Div(den)
}

// ShortDuctFactor returns the entry correction 1 + (Dh/L)^(2/3) by which
// Gnielinski (1976) multiplies the fully developed turbulent Nusselt number
// of a duct of length ratio lOverDh = L/Dh (from memory).
func ShortDuctFactor(lOverDh float64) float64 {
	return 1 + math.Pow(1/lOverDh, 2.0/3)
}

// Validity ranges of Dittus & Boelter (1930).
var (
	DittusBoelterRe = validity.Range{Name: "Re", Min: 1e4}
	DittusBoelterPr = validity.Range{Name: "Pr", Min: 0.6, Max: 160}
	DittusBoelterLD = validity.Range{Name: "L/Dh", Min: 10}
)

// DittusBoelterNu returns the Nusselt number of fully developed turbulent flow
// in a smooth tube with a small wall-to-fluid temperature difference, from
// Dittus & Boelter (1930), Heat transfer in automobile radiators of the
// tubular type:
//
//	Nu = 0.023·Re^0.8·Pr^n,  n = 0.4 when the fluid is heated, 0.3 when cooled.
//
// Valid for DittusBoelterRe, DittusBoelterPr and DittusBoelterLD; errors up
// to about 25 % (from memory).
func DittusBoelterNu(re, pr dual.Num, heating bool) dual.Num {
	n := 0.3
	if heating {
		n = 0.4
	}
	return dual.Pow(re, 0.8).Mul(dual.Pow(pr, n)).Scale(0.023)
}
