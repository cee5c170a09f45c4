package duct

import "github.com/heatgraph/heatgraph/elements/dual"

// Minor-loss coefficients, referred to the channel velocity: a sharp-edged
// entry from a plenum and the exit into a plenum, where the whole dynamic
// pressure is lost (common practice).
const (
	KEntrySharp = 0.5
	KExitPlenum = 1.0
)

// KaysLondonKc returns the contraction (entry) loss coefficient of a fin
// array or channel bank, K_c ≈ 0.42·(1 − σ²), with σ the ratio of open to
// frontal area; a fit to the charts of Kays & London (1984), Compact Heat
// Exchangers (from memory). The charts assume developed flow at the exit and
// slightly overpredict short heat sinks (Webb & Paek 2003).
func KaysLondonKc(sigma float64) float64 { return 0.42 * (1 - sigma*sigma) }

// KaysLondonKe returns the expansion (exit) loss coefficient of a fin array
// or channel bank, K_e ≈ (1 − σ²)², with σ the ratio of open to frontal
// area; a fit to the charts of Kays & London (1984), Compact Heat Exchangers
// (from memory).
func KaysLondonKe(sigma float64) float64 {
	s := 1 - sigma*sigma
	return s * s
}

// PressureDrop returns the pressure drop in Pa of a channel,
//
//	Δp = (f·L/Dh + ΣK)·ρV²/2,
//
// with the apparent Darcy friction factor f over the length, lOverDh = L/Dh,
// the sum kSum of the minor-loss coefficients (for example Kc + Ke), the
// density rho in kg/m³ and the channel velocity v in m/s.
func PressureDrop(f dual.Num, lOverDh, kSum float64, rho, v dual.Num) dual.Num {
	return f.Scale(lOverDh).AddC(kSum).Mul(rho).Mul(v.Mul(v)).Scale(0.5)
}
