// Package convection provides published heat-transfer correlations for the
// outside surfaces of electronics enclosures: natural convection on
// vertical, tilted and horizontal plates and in vertical fin channels,
// forced convection along a flat plate, and the efficiency of straight
// rectangular fins.
//
// Every correlation takes and returns dual.Num values, so a Nusselt number
// evaluated from temperature-dependent Rayleigh, Reynolds and Prandtl
// numbers carries its exact derivative into the Newton Jacobian. Branches
// (flow regimes) are chosen on the value; each function documents whether
// its value and slope are continuous across them.
//
// Each correlation names its characteristic length and exports its
// published validity as validity.Range variables. The functions keep their
// formula outside those ranges (callers warn with Range.Check); they do
// not clamp. Nusselt numbers are returned; h = Nu·k/L with the
// correlation's own length L.
//
// Rayleigh and Reynolds numbers must be non-negative: build them from
// |ΔT|. At exactly Ra = 0 (equal temperatures, common at the first Newton
// iterate) the fractional powers have infinite slope; the correlations then
// return the zero-Ra limit with zero derivative, which makes the heat flow
// h·A·ΔT carry its correct zero derivative instead of NaN.
//
// Sources: Churchill & Chu (1975); Lloyd & Moran (1974) and the hot-face-down
// correlation as given by Incropera, DeWitt, Bergman & Lavine, Fundamentals
// of Heat and Mass Transfer, 7th ed. (2011); Elenbaas (1942); Bar-Cohen &
// Rohsenow (1984); the flat-plate and fin relations of Incropera et al.,
// chapters 3 and 7. Units are SI.
package convection
