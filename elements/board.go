package elements

import (
	"fmt"
	"math"
)

// CopperConductivity is the conductivity of a printed board's copper,
// W/(m K): 398, within the 385–401 W/(m K) of pure and C110 copper near
// 300 K (Incropera et al., Fundamentals of Heat and Mass Transfer,
// Table A.1, gives 401 for pure copper; from memory). Electrodeposited
// foil may be a few per cent lower.
const CopperConductivity = 398.0

// CopperLayer is a copper layer of a printed board: a plane or a layer of
// traces.
type CopperLayer struct {
	Thickness float64 // m; 1 oz/ft² foil is about 35 µm
	Coverage  float64 // fraction of the board's area covered by copper, 0..1
}

// BoardConductivity returns a printed board's effective in-plane and
// through-plane conductivities, W/(m K), from its laminate's
// conductivities, its total thickness (m, copper included) and its copper
// layers: the layers side by side along the plane conduct in parallel,
// k_in = Σkᵢtᵢ/Σtᵢ, and one after another through the thickness in
// series, k_through = Σtᵢ/Σ(tᵢ/kᵢ) (Incropera et al., §3.1, the composite
// wall), where the laminate fills the thickness
// the copper leaves.
//
// A copper layer of partial coverage f is a mixture of copper and laminate
// (the resin that fills between the traces, taken with the laminate's
// conductivities): in the plane the parallel mix f·k_Cu + (1 − f)·k_in,
// through the thickness the series mix 1/[f/k_Cu + (1 − f)/k_through].
// These are Wiener's upper and lower bounds for the mixture: the in-plane
// value assumes the copper runs unbroken along the heat's path, the
// through-plane value that copper and resin lie one after another. Real
// traces lie between; the in-plane value of a sparse signal layer is
// optimistic.
func BoardConductivity(laminateKIn, laminateKThrough, thickness float64, copper []CopperLayer) (kin, kthrough float64, err error) {
	if err := positive("laminate in-plane conductivity", laminateKIn,
		"laminate through-plane conductivity", laminateKThrough, "board thickness", thickness); err != nil {
		return 0, 0, err
	}
	cu := 0.0
	for i, c := range copper {
		if err := positive("thickness", c.Thickness); err != nil {
			return 0, 0, fmt.Errorf("copper layer %d: %w", i+1, err)
		}
		if !(c.Coverage >= 0 && c.Coverage <= 1) {
			return 0, 0, fmt.Errorf("copper layer %d: coverage must be between 0 and 1, got %g", i+1, c.Coverage)
		}
		cu += c.Thickness
	}
	lam := thickness - cu
	if !(lam > 0) {
		return 0, 0, fmt.Errorf("the copper layers (%.4g mm together) leave no laminate in a board %.4g mm thick", cu*1e3, thickness*1e3)
	}
	sumKT := laminateKIn * lam
	sumTK := lam / laminateKThrough
	for _, c := range copper {
		f := c.Coverage
		sumKT += (f*CopperConductivity + (1-f)*laminateKIn) * c.Thickness
		sumTK += c.Thickness * (f/CopperConductivity + (1-f)/laminateKThrough)
	}
	kin, kthrough = sumKT/thickness, thickness/sumTK
	if math.IsInf(kin, 0) || math.IsInf(kthrough, 0) {
		return 0, 0, fmt.Errorf("board conductivity out of range")
	}
	return kin, kthrough, nil
}
