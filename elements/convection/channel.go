package convection

import (
	"math"

	"github.com/heatgraph/heatgraph/elements/dual"
	"github.com/heatgraph/heatgraph/elements/validity"
)

// ChannelRaL is the validity of the vertical-channel correlations, as the
// Rayleigh number based on the channel height L and the wall-to-ambient
// temperature difference: the composite relations join the fully developed
// channel limit to the laminar isolated-plate limit Nu_S = 0.59 El^(1/4)
// (the vertical-plate 0.59 Ra^(1/4)), which holds up to Ra_L ≈ 10⁹ (from
// memory). Ra_L = El (L/S)³.
var ChannelRaL = validity.Range{Name: "Ra_L", Min: 0, Max: 1e9}

// BarCohenSymmetric returns the mean Nusselt number Nu_S = h S/k of a
// vertical channel between two parallel isothermal plates at the same
// temperature, open at top and bottom, in natural convection:
//
//	Nu_S = [576/El² + 2.873/El^(1/2)]^(−1/2),
//
// Bar-Cohen & Rohsenow (1984), Thermally optimum spacing of vertical,
// natural convection cooled, parallel plates. El = g β ΔT S⁴/(ν α L) =
// Ra_S·S/L is the Elenbaas number, S the plate spacing, L the plate height
// and ΔT the wall temperature minus the ambient (inlet) temperature; h
// applies to both walls with that ΔT. The characteristic length of Nu is S.
// The form El·(576 + 2.873 El^(3/2))^(−1/2) is evaluated, which is
// identical and smooth at El = 0 (Nu_S → El/24). Validity: ChannelRaL.
func BarCohenSymmetric(El dual.Num) dual.Num {
	return barCohen(El, 576)
}

// BarCohenAsymmetric returns Nu_S for a vertical parallel-plate channel
// with one wall isothermal and the other adiabatic:
//
//	Nu_S = [144/El² + 2.873/El^(1/2)]^(−1/2),
//
// Bar-Cohen & Rohsenow (1984). Symbols and validity as for
// BarCohenSymmetric; h applies to the heated wall (Nu_S → El/12 at small El).
func BarCohenAsymmetric(El dual.Num) dual.Num {
	return barCohen(El, 144)
}

// barCohen returns El·(c + 2.873 El^(3/2))^(−1/2).
func barCohen(El dual.Num, c float64) dual.Num {
	return El.Mul(dual.Pow(dual.Pow(El, 1.5).Scale(2.873).AddC(c), -0.5))
}

// Elenbaas returns the mean Nusselt number Nu_S of a vertical channel
// between two isothermal parallel plates from the original correlation of
// Elenbaas (1942), Heat dissipation of parallel plates by free convection:
//
//	Nu_S = (El/24) [1 − exp(−35/El)]^(3/4),
//
// with El and S as for BarCohenSymmetric (formula from memory). It serves
// as a cross-check of BarCohenSymmetric, which is preferred. At El = 0 it
// returns 0 with the limiting slope 1/24.
func Elenbaas(El dual.Num) dual.Num {
	if El.V == 0 {
		return El.Scale(1.0 / 24)
	}
	f := dual.OneMinusExpNeg(El.Inv().Scale(35))
	return El.Scale(1.0 / 24).Mul(dual.Pow(f, 0.75))
}

// OptimumSpacing returns the plate spacing, m, that maximises the heat
// dissipated per unit base width by an array of isothermal vertical plates
// of height L (m) in natural convection,
//
//	S_opt = 2.714 L Ra_L^(−1/4),
//
// Bar-Cohen & Rohsenow (1984), with Ra_L based on L and the wall-to-ambient
// temperature difference (constant from memory; it places El at 2.714⁴ ≈
// 54.3, where Nu_S/El^(1/2) of BarCohenSymmetric peaks). Plate thickness is
// neglected. At Ra_L = 0 the result is +Inf.
func OptimumSpacing(L float64, RaL dual.Num) dual.Num {
	if RaL.V == 0 {
		return dual.C(math.Inf(1))
	}
	return dual.Pow(RaL, -0.25).Scale(2.714 * L)
}
