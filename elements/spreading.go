package elements

import (
	"fmt"
	"math"
)

// SpreadingPlate describes a heat source centred on a plate whose far side
// is cooled: the geometry of the closed-form spreading resistance.
type SpreadingPlate struct {
	SourceArea   float64 // m², the footprint through which the heat enters
	PlateArea    float64 // m², the plate's area (≥ SourceArea)
	Thickness    float64 // m
	Conductivity float64 // W/(m K)
	// SinkResistance is R₀ = 1/(h_eff·A_p), K/W: how well the plate's far
	// side is cooled, as the formula needs it (the cooling itself is a link
	// of its own in the network).
	SinkResistance float64
	// Maximum selects the resistance to the source's centre (its hottest
	// point) rather than to its mean temperature.
	Maximum bool
}

// SpreadingResult holds the dimensionless groups of the closed form and
// the resistance, for reports and tests.
type SpreadingResult struct {
	Epsilon, Tau, Bi, Lambda, Phi, Psi float64
	R                                  float64 // K/W: spreading plus one-dimensional conduction through the plate
	// Series is R by the exact series solution (SpreadingSeries), K/W.
	Series float64
}

// Spreading returns the spreading resistance of a source on a plate by the
// closed form of Lee, Song, Au & Moran (1995), Constriction/spreading
// resistance model for electronics packaging, ASME/JSME Thermal
// Engineering Conference (formula from memory): circular source and plate of the same areas, a = √(A_s/π),
// b = √(A_p/π), ε = a/b, τ = t/b, Bi = 1/(π·k·b·R₀), λ = π + 1/(√π·ε),
// Φ = [tanh(λτ) + λ/Bi]/[1 + (λ/Bi)·tanh(λτ)],
// ψ_avg = ετ/√π + ½(1 − ε)^(3/2)·Φ, ψ_max = ετ/√π + (1 − ε)·Φ/√π,
// R = ψ/(√π·k·a), which includes the one-dimensional resistance
// t/(k·A_p) of the plate. Against the exact series solution for an
// isoflux disk on a disk it is within about 10 % on the cases of the
// tests (spreadingSeries); ε → 1 gives t/(k·A_p) exactly.
func Spreading(p SpreadingPlate) (SpreadingResult, error) {
	if err := positive("source area", p.SourceArea, "plate area", p.PlateArea, "thickness", p.Thickness,
		"conductivity", p.Conductivity, "sink resistance", p.SinkResistance); err != nil {
		return SpreadingResult{}, err
	}
	if p.SourceArea > p.PlateArea*(1+1e-12) {
		return SpreadingResult{}, fmt.Errorf("the source (%.4g m²) is larger than the plate (%.4g m²)", p.SourceArea, p.PlateArea)
	}
	a := math.Sqrt(p.SourceArea / math.Pi)
	b := math.Sqrt(p.PlateArea / math.Pi)
	eps := math.Min(a/b, 1)
	tau := p.Thickness / b
	bi := 1 / (math.Pi * p.Conductivity * b * p.SinkResistance)
	lambda := math.Pi + 1/(math.Sqrt(math.Pi)*eps)
	th := math.Tanh(lambda * tau)
	phi := (th + lambda/bi) / (1 + (lambda/bi)*th)
	psi := eps*tau/math.Sqrt(math.Pi) + 0.5*math.Pow(1-eps, 1.5)*phi
	if p.Maximum {
		psi = eps*tau/math.Sqrt(math.Pi) + (1-eps)*phi/math.Sqrt(math.Pi)
	}
	r := psi / (math.Sqrt(math.Pi) * p.Conductivity * a)
	return SpreadingResult{Epsilon: eps, Tau: tau, Bi: bi, Lambda: lambda, Phi: phi, Psi: psi, R: r,
		Series: spreadingSeries(eps, tau, bi, p.Conductivity, a, p.Maximum)}, nil
}

// seriesTerms is how many terms of the exact series are summed: the mean
// converges as n⁻³, the centre as about n⁻², so 4000 terms leave well under
// 0.1 % (checked in the tests against 16 000).
const seriesTerms = 4000

var j1Zeros = besselJ1Zeros(seriesTerms)

// spreadingSeries is the exact solution of a uniform flux over a disk of
// radius a centred on a disk of radius b, thickness t, adiabatic rim,
// cooled back of Biot number Bi (separation of variables; the form of
// Song, Lee & Au 1994 and Yovanovich et al. 1999, citations from memory):
// ψ_avg = ετ/√π + 4/(√π·ε)·Σ J₁²(δₙε)·Φₙ/(δₙ³·J₀²(δₙ)),
// ψ_max = ετ/√π + 2/√π·Σ J₁(δₙε)·Φₙ/(δₙ²·J₀²(δₙ)), δₙ the zeros of J₁ and
// Φₙ the Φ of the closed form with λ → δₙ; R = ψ/(√π·k·a).
func spreadingSeries(eps, tau, bi, k, a float64, maximum bool) float64 {
	sum := 0.0
	for _, d := range j1Zeros {
		th := math.Tanh(d * tau)
		phi := (th + d/bi) / (1 + (d/bi)*th)
		j0 := math.J0(d)
		j1e := math.J1(d * eps)
		if maximum {
			sum += j1e * phi / (d * d * j0 * j0)
		} else {
			sum += j1e * j1e * phi / (d * d * d * j0 * j0)
		}
	}
	psi := eps * tau / math.Sqrt(math.Pi)
	if maximum {
		psi += 2 / math.Sqrt(math.Pi) * sum
	} else {
		psi += 4 / (math.Sqrt(math.Pi) * eps) * sum
	}
	return psi / (math.Sqrt(math.Pi) * k * a)
}

// besselJ1Zeros returns the first n positive zeros of J₁, by Newton's
// method from McMahon's asymptotic estimates (Abramowitz & Stegun 9.5.12),
// with J₁′(x) = J₀(x) − J₁(x)/x.
func besselJ1Zeros(n int) []float64 {
	z := make([]float64, n)
	for k := 1; k <= n; k++ {
		beta := (float64(k) + 0.25) * math.Pi
		x := beta - 3/(8*beta)
		for i := 0; i < 50; i++ {
			dx := math.J1(x) / (math.J0(x) - math.J1(x)/x)
			x -= dx
			if math.Abs(dx) < 1e-15*x {
				break
			}
		}
		z[k-1] = x
	}
	return z
}

// Spread is a spreading resistance between the node of a source's
// footprint and the node of the plate's far side: a linear link of
// conductance 1/R, R by the exact series (Result.Series) for the disks of
// the same areas as the source and the plate; the closed form of Lee et al.
// (Result.R) is reported beside it as a hand check.
type Spread struct {
	Conductance
	Plate  SpreadingPlate
	Result SpreadingResult
}

// NewSpread returns the spreading link from node a (the source) to node b
// (the plate's far side).
func NewSpread(a, b int, p SpreadingPlate) (*Spread, error) {
	r, err := Spreading(p)
	if err != nil {
		return nil, err
	}
	return &Spread{Conductance: Conductance{A: a, B: b, G: 1 / r.Series}, Plate: p, Result: r}, nil
}

// Report gives the dimensionless groups and the resistance, so that the
// value can be checked by hand, and warns where the closed form is
// stretched.
func (s *Spread) Report(*State) Report {
	r := s.Result
	which := "R to the mean source temperature"
	if s.Plate.Maximum {
		which = "R to the source's centre (its hottest point)"
	}
	rep := Report{Details: []Detail{
		{Name: "correlation", Text: "exact series, uniform-flux disk on a cooled disk (Song, Lee & Au 1994); " + which},
		{Name: "epsilon", Value: r.Epsilon},
		{Name: "tau", Value: r.Tau},
		{Name: "Bi", Value: r.Bi},
		{Name: "lambda", Value: r.Lambda},
		{Name: "Phi", Value: r.Phi},
		{Name: "psi", Value: r.Psi},
		{Name: "R", Value: r.Series, Unit: "K/W"},
		{Name: "R_closed_form", Value: r.R, Unit: "K/W"},
		{Name: "R_one_dimensional", Value: s.Plate.Thickness / (s.Plate.Conductivity * s.Plate.PlateArea), Unit: "K/W"},
		{Name: "G", Value: s.G, Unit: "W/K"},
	}}
	if ar := s.Plate.SourceArea / s.Plate.PlateArea; ar < 1e-4 {
		rep.Warnings = append(rep.Warnings, fmt.Sprintf("spreading: the source is very small against the plate (area ratio %.2g); the series converges slowly there", ar))
	}
	return rep
}
