package elements

import (
	"fmt"
	"math"
)

// PerforatedK returns the loss coefficient of a perforated plate or grille,
// on the velocity across its whole face, for an open-area ratio f (holes'
// area over face area), a plate thickness l and a hole (or slot) hydraulic
// diameter d. It is Idelchik's relation for thick-edged orifices and
// perforated plates (Handbook of Hydraulic Resistance, 3rd ed., diagram
// 8-3; written here from memory):
//
//	ζ = [0.5(1 − f)^0.75 + τ(1 − f)^1.375 + (1 − f)² + λ·l/d] / f²,
//	τ = (2.4 − l̄)·10^(−φ(l̄)),   φ(l̄) = 0.25 + 0.535·l̄⁸/(0.05 + l̄⁸),   l̄ = l/d,
//
// with λ = 0.02 (a rule of thumb for the friction in short holes); l̄ is
// capped at 2.4, beyond which the jet has reattached inside the hole and
// τ = 0. A thin plate (l̄ ≤ 0.015, Idelchik's limit for a sharp edge, from
// memory) takes the sharp-edged orifice relation instead,
// ζ = (1 + 0.707√(1 − f) − f)²/f² (Idelchik diagram 8-1, from memory). At
// the thin limit the two relations differ by 7 % at f = 0.5 and 25 % at
// f = 0.8: the spread of such correlations, and a reason to prefer a
// maker's measured drop (a filter link with a curve) where there is one.
// Reynolds numbers in the holes should be above about 10⁵ for the
// relation to hold; below, the coefficient grows (Idelchik diagram 8-4),
// which this function leaves out.
func PerforatedK(f, l, d float64) (float64, error) {
	if !(f > 0 && f < 1) {
		return 0, fmt.Errorf("open-area ratio must be between 0 and 1 (exclusive), got %g", f)
	}
	if !(l >= 0) || !(d > 0) {
		return 0, fmt.Errorf("plate thickness must not be negative and hole diameter must be positive (got %g m, %g m)", l, d)
	}
	if l/d <= 0.015 {
		return ThinPlateK(f), nil
	}
	lb := math.Min(l/d, 2.4)
	l8 := math.Pow(lb, 8)
	phi := 0.25 + 0.535*l8/(0.05+l8)
	tau := (2.4 - lb) * math.Pow(10, -phi)
	g := 1 - f
	const lambda = 0.02
	return (0.5*math.Pow(g, 0.75) + tau*math.Pow(g, 1.375) + g*g + lambda*l/d) / (f * f), nil
}

// ThinPlateK returns Idelchik's sharp-edged thin-plate coefficient
// (1 + 0.707√(1 − f) − f)²/f², on the face velocity (from memory).
func ThinPlateK(f float64) float64 {
	return math.Pow(1+0.707*math.Sqrt(1-f)-f, 2) / (f * f)
}

func sqrt(x float64) float64 { return math.Sqrt(x) }
