package air

import (
	"math"

	"github.com/heatgraph/heatgraph/elements/dual"
	"github.com/heatgraph/heatgraph/elements/validity"
)

// Gas constants of the U.S. Standard Atmosphere 1976.
const (
	RStar = 8314.32 // universal gas constant as fixed by the standard, J/(kmol K)
	M0    = 28.9644 // molar mass of sea-level air, kg/kmol
)

// R is the specific gas constant of dry air, R*/M0 = 287.0531 J/(kg K). The
// value 287.05287 J/(kg K) is also quoted for standard atmospheres; the two
// differ by 7×10⁻⁷, but only R*/M0 reproduces the layer base pressures the
// 1976 standard publishes (5474.89 Pa at 20 km', 868.02 Pa at 32 km').
const R = RStar / M0

// Sutherland's law constants of the U.S. Standard Atmosphere 1976.
const (
	SutherlandBeta = 1.458e-6 // kg/(m s K^½)
	SutherlandS    = 110.4    // K
)

// ValidT is the temperature range, in K, covered by the specific-heat table
// (Incropera & DeWitt, Table A.4, 200 K to 600 K). Outside it cp is
// extrapolated linearly with the end slope of the spline.
var ValidT = validity.Range{Name: "T", Min: 200, Max: 600}

// ValidP is the pressure range, in Pa, over which the ideal-gas density and
// pressure-independent μ, k and cp are used. Basis (second virial
// coefficient of air about −8 cm³/mol at 300 K and −35 cm³/mol at 200 K,
// from memory): |Z − 1| < 0.5 % for 200 K to 600 K at up to 200 kPa, and
// the dilute-gas μ and k change by far less than that. The lower bound,
// 10 kPa (about 16 km altitude), keeps the mean free path below 1 µm, so
// gaps of a millimetre and more stay in the continuum regime that the
// convection correlations assume.
var ValidP = validity.Range{Name: "p", Min: 10e3, Max: 200e3}

// Props holds the properties of dry air at one temperature and pressure,
// each with its derivative along the seed direction of the temperature.
type Props struct {
	Rho   dual.Num // density, kg/m³
	Mu    dual.Num // dynamic viscosity, Pa s
	K     dual.Num // thermal conductivity, W/(m K)
	Cp    dual.Num // specific heat at constant pressure, J/(kg K)
	Pr    dual.Num // Prandtl number cp μ/k
	Nu    dual.Num // kinematic viscosity μ/ρ, m²/s
	Alpha dual.Num // thermal diffusivity k/(ρ cp), m²/s
	Beta  dual.Num // volumetric expansion coefficient 1/T, 1/K
}

// At returns the properties of dry air at temperature T (K, positive) and
// pressure p (Pa). Use Check to learn whether T and p lie in the ranges
// the sources cover.
func At(T dual.Num, p float64) Props {
	rho := Density(T, p)
	mu := Viscosity(T)
	k := Conductivity(T)
	cp := SpecificHeat(T)
	return Props{
		Rho:   rho,
		Mu:    mu,
		K:     k,
		Cp:    cp,
		Pr:    cp.Mul(mu).Div(k),
		Nu:    mu.Div(rho),
		Alpha: k.Div(rho.Mul(cp)),
		Beta:  T.Inv(),
	}
}

// Density returns ρ = p/(R T), kg/m³, for T in K and p in Pa (ideal gas).
func Density(T dual.Num, p float64) dual.Num {
	return T.Inv().Scale(p / R)
}

// Viscosity returns the dynamic viscosity of air, Pa s, from Sutherland's
// law μ = βs T^(3/2)/(T + S) with the U.S. Standard Atmosphere 1976
// constants SutherlandBeta and SutherlandS.
func Viscosity(T dual.Num) dual.Num {
	return dual.Pow(T, 1.5).Scale(SutherlandBeta).Div(T.AddC(SutherlandS))
}

// Conductivity returns the thermal conductivity of air, W/(m K), from the
// U.S. Standard Atmosphere 1976 expression
// k = 2.64638×10⁻³ T^(3/2)/(T + 245.4·10^(−12/T)).
func Conductivity(T dual.Num) dual.Num {
	tenPow := dual.Exp(T.Inv().Scale(-12 * math.Ln10))
	return dual.Pow(T, 1.5).Scale(2.64638e-3).Div(T.Add(tenPow.Scale(245.4)))
}

// SpecificHeat returns cp of air at atmospheric pressure, J/(kg K), from a
// natural cubic spline through Incropera & DeWitt, Fundamentals of Heat and
// Mass Transfer, Table A.4. The spline and its first two derivatives are
// continuous; below 200 K and above 600 K it continues as a straight line
// with the end slope.
func SpecificHeat(T dual.Num) dual.Num { return cpSpline.at(T) }

// cpTable holds cp of air at atmospheric pressure, J/(kg K), from Incropera
// & DeWitt, Fundamentals of Heat and Mass Transfer, Table A.4, 200 K to
// 600 K in steps of 50 K. The digits were checked against two independent
// public copies of that table; they agree on every row except
// 550 K, where one gives 1039 and the other 1040 (used here).
var cpTable = struct{ t, cp []float64 }{
	t:  []float64{200, 250, 300, 350, 400, 450, 500, 550, 600},
	cp: []float64{1007, 1006, 1007, 1009, 1014, 1021, 1030, 1040, 1051},
}

var cpSpline = newNaturalSpline(cpTable.t, cpTable.cp)

// Check returns one warning for each of T (K) and p (Pa) that lies outside
// ValidT or ValidP, or nil when both are inside.
func Check(T, p float64) []string {
	var warn []string
	for _, w := range []string{ValidT.Check(T), ValidP.Check(p)} {
		if w != "" {
			warn = append(warn, w)
		}
	}
	return warn
}
