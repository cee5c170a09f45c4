package convection

import (
	"math"

	"github.com/heatgraph/heatgraph/elements/dual"
	"github.com/heatgraph/heatgraph/elements/validity"
)

// CriticalRe is the Reynolds number of laminar-turbulent transition on a
// flat plate used by FlatPlate and FlatPlateMixed.
const CriticalRe = 5e5

// mixedA is the laminar correction of FlatPlateMixed,
// 0.037 Re_c^(4/5) − 0.664 Re_c^(1/2) = 871.3 at Re_c = 5×10⁵.
var mixedA = 0.037*math.Pow(CriticalRe, 0.8) - 0.664*math.Sqrt(CriticalRe)

// Validity of the flat-plate correlations, Re and Nu based on the plate
// length L in the flow direction (Incropera et al., Fundamentals of Heat
// and Mass Transfer, ch. 7; the upper limits from memory).
var (
	LaminarPlateRe   = validity.Range{Name: "Re", Min: 0, Max: CriticalRe}
	LaminarPlatePr   = validity.Range{Name: "Pr", Min: 0.6}
	TurbulentPlateRe = validity.Range{Name: "Re", Min: CriticalRe, Max: 1e8}
	TurbulentPlatePr = validity.Range{Name: "Pr", Min: 0.6, Max: 60}
	FlatPlateRe      = validity.Range{Name: "Re", Min: 0, Max: 1e8}
	FlatPlatePr      = validity.Range{Name: "Pr", Min: 0.6, Max: 60}
)

// FlatPlateLaminar returns the mean Nusselt number over length L of an
// isothermal flat plate in laminar parallel flow,
//
//	Nu = 0.664 Re^(1/2) Pr^(1/3),
//
// the Pohlhausen similarity result as given by Incropera et al.,
// Fundamentals of Heat and Mass Transfer, ch. 7 (Eq. 7.30). Re = u∞ L/ν.
// Validity: LaminarPlateRe, LaminarPlatePr.
func FlatPlateLaminar(Re, Pr dual.Num) dual.Num {
	return powPos(Re, 0.5).Mul(dual.Pow(Pr, 1.0/3)).Scale(0.664)
}

// FlatPlateTurbulent returns the mean Nusselt number over length L of an
// isothermal flat plate with a turbulent boundary layer from the leading
// edge (a tripped boundary layer),
//
//	Nu = 0.037 Re^(4/5) Pr^(1/3),
//
// Incropera et al., Fundamentals of Heat and Mass Transfer, ch. 7.
// Validity: TurbulentPlateRe, TurbulentPlatePr.
func FlatPlateTurbulent(Re, Pr dual.Num) dual.Num {
	return powPos(Re, 0.8).Mul(dual.Pow(Pr, 1.0/3)).Scale(0.037)
}

// FlatPlateMixed returns the mean Nusselt number over length L of an
// isothermal flat plate with a laminar leading section up to CriticalRe
// and a turbulent boundary layer after it,
//
//	Nu = (0.037 Re^(4/5) − A) Pr^(1/3),  A = 0.037 Re_c^(4/5) − 0.664 Re_c^(1/2),
//
// Incropera et al., Fundamentals of Heat and Mass Transfer, Eq. 7.38. A is
// computed here (871.3) rather than taken as the rounded 871, so that the
// value equals FlatPlateLaminar exactly at CriticalRe. Validity:
// TurbulentPlateRe, TurbulentPlatePr.
func FlatPlateMixed(Re, Pr dual.Num) dual.Num {
	return powPos(Re, 0.8).Scale(0.037).AddC(-mixedA).Mul(dual.Pow(Pr, 1.0/3))
}

// FlatPlate returns the mean Nusselt number over length L of an isothermal
// flat plate in parallel flow: FlatPlateLaminar below CriticalRe and
// FlatPlateMixed from it on. The value is continuous at CriticalRe; the
// slope dNu/dRe jumps there from 0.332 Re_c^(−1/2) Pr^(1/3) to
// 0.0296 Re_c^(−1/5) Pr^(1/3), about 4.6 times larger. Validity:
// FlatPlateRe, FlatPlatePr.
func FlatPlate(Re, Pr dual.Num) dual.Num {
	if Re.V < CriticalRe {
		return FlatPlateLaminar(Re, Pr)
	}
	return FlatPlateMixed(Re, Pr)
}
