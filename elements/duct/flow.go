package duct

import (
	"fmt"
	"math"

	"github.com/heatgraph/heatgraph/elements/dual"
	"github.com/heatgraph/heatgraph/elements/validity"
)

// Regime boundaries of Flow, after Gnielinski (2013), On heat transfer in
// tubes, Int. J. Heat Mass Transfer 63:134–140: laminar up to ReLaminar,
// turbulent from ReTurbulent, a linear blend between.
const (
	ReLaminar   = 2300.0
	ReTurbulent = 1e4
)

// Regime names reported in Result.Regime.
const (
	RegimeLaminar      = "laminar"
	RegimeTransitional = "transitional"
	RegimeTurbulent    = "turbulent"
)

// PlatesAspect bounds gap/width of a ParallelPlates duct: at gap/width = 0.05
// the Shah & London Nu_T of the rectangle is already 12 % below the plate
// value, so wider gaps should be modelled as Rectangular.
var PlatesAspect = validity.Range{Name: "gap/width", Min: 0, Max: 0.05}

// Turbulent selects the turbulent Nusselt correlation of Flow.
type Turbulent int

const (
	// Gnielinski selects Gnielinski (1976) with the Petukhov friction factor.
	Gnielinski Turbulent = iota
	// DittusBoelter selects Dittus & Boelter (1930).
	DittusBoelter
)

// Laminar selects the laminar developing-flow model of Flow.
type Laminar int

const (
	// CombinedEntry develops velocity and temperature together from the
	// inlet: Stephan (1959) for tubes and plates, Muzychka & Yovanovich
	// (2004) for rectangles. It suits air entering a channel from a plenum.
	CombinedEntry Laminar = iota
	// ThermalEntry assumes a developed velocity profile: Hausen (1943) for
	// tubes, the engineering substitution HausenRectangular otherwise. It
	// suits a heated section behind an unheated starting length.
	ThermalEntry
)

// Options selects the correlations of Flow. The zero value selects
// Gnielinski, the combined entry, a cooled fluid and no short-duct factor.
type Options struct {
	Turbulent Turbulent // turbulent Nusselt correlation
	Laminar   Laminar   // laminar developing-flow model
	Heating   bool      // fluid heated by the wall: Dittus–Boelter exponent 0.4, else 0.3
	ShortDuct bool      // multiply the turbulent Nu by ShortDuctFactor(L/Dh)
}

// Result is the mean heat transfer and friction of a duct.
type Result struct {
	Nu                  dual.Num // mean Nusselt number on Dh over the length
	F                   dual.Num // apparent Darcy friction factor over the length
	Regime              string   // RegimeLaminar, RegimeTransitional or RegimeTurbulent
	Developing          bool     // laminar and shorter than the thermal entrance length
	Correlation         string   // source of Nu
	FrictionCorrelation string   // source of F
	EntryHydro          float64  // hydrodynamic entrance length in m
	EntryThermal        float64  // thermal entrance length in m
	Warnings            []string // inputs outside the validity ranges of the sources
}

// Correlation names reported in Result.
const (
	corrMuzychkaYovanovich = "Muzychka-Yovanovich (2004) combined entry, Shah-London fully developed limit"
	corrStephanTube        = "Stephan (1959) combined entry, tube"
	corrStephanPlates      = "Stephan (1959) combined entry, parallel plates"
	corrHausen             = "Hausen (1943) thermal entry"
	corrHausenRectangular  = "Hausen form with Shah-London Nu_T (engineering substitution)"
	corrShahLondon         = "Shah-London (1978) fully developed"
	corrGnielinski         = "Gnielinski (1976)/Petukhov"
	corrDittusBoelter      = "Dittus-Boelter (1930)"
	corrTransition         = "Gnielinski (2013) transition blend"
	corrFrictionLaminar    = "Muzychka-Yovanovich (2009) apparent friction"
	corrFrictionTurbulent  = "Churchill (1977)"
	corrFrictionTransition = "Gnielinski (2013) blend of Muzychka-Yovanovich (2009) and Churchill (1977)"
)

// Flow returns the mean Nusselt number and apparent Darcy friction factor of
// air flowing through d at Reynolds number re and Prandtl number pr, both on
// Dh with properties at the mean bulk temperature. d must pass Validate; re
// and pr must be positive (for re ≤ 0 Flow returns the fully developed
// laminar Nu_T, F = +Inf and a warning: a channel without flow has no
// pressure drop, which the caller sets).
//
// Laminar (re ≤ ReLaminar): Nu = max(developing, fully developed Nu_T), both
// continuous in Re and Pr, so Nu is continuous; the developing model follows
// o.Laminar (for rectangles in combined entry MuzychkaYovanovichShahLondon,
// whose long-duct limit is the exact Nu_T). F = MuzychkaYovanovichF with the
// fully developed f·Re of d.
// Entrance lengths 0.05·Re·Dh (hydrodynamic) and 0.05·Re·Pr·Dh (thermal).
//
// Turbulent (re ≥ ReTurbulent): Nu from o.Turbulent, times ShortDuctFactor
// when o.ShortDuct; F = Churchill with the relative roughness. Nu assumes a
// smooth wall. Entrance lengths about 10·Dh (rule of thumb), also used in the
// transitional range.
//
// Transitional: with γ = (Re − 2300)/(10⁴ − 2300),
// Nu = (1 − γ)·Nu_lam(2300) + γ·Nu_turb(10⁴) (Gnielinski 2013), the laminar
// value at the actual length, and F blended alike.
func Flow(d Duct, re, pr dual.Num, o Options) Result {
	if !(re.V > 0) || !(pr.V > 0) {
		return Result{
			Nu:          dual.C(d.LaminarNuT()),
			F:           dual.C(math.Inf(1)),
			Regime:      RegimeLaminar,
			Correlation: corrShahLondon,
			Warnings:    []string{fmt.Sprintf("Re = %.4g and Pr = %.4g must be positive", re.V, pr.V)},
		}
	}
	dh := d.Dh()
	var r Result
	switch {
	case re.V <= ReLaminar:
		r.Regime = RegimeLaminar
		r.Nu, r.Correlation = laminarNu(d, re, pr, o.Laminar)
		r.F, r.FrictionCorrelation = laminarF(d, re), corrFrictionLaminar
		r.EntryHydro = 0.05 * re.V * dh
		r.EntryThermal = 0.05 * re.V * pr.V * dh
		r.Developing = d.Length < r.EntryThermal
		r.Warnings = laminarWarnings(d, pr.V, o)
	case re.V < ReTurbulent:
		g := re.AddC(-ReLaminar).Scale(1 / (ReTurbulent - ReLaminar))
		lam, _ := laminarNu(d, dual.C(ReLaminar), pr, o.Laminar)
		turb, _ := turbulentNu(d, dual.C(ReTurbulent), pr, o)
		r.Regime = RegimeTransitional
		r.Nu, r.Correlation = blend(g, lam, turb), corrTransition
		r.F = blend(g, laminarF(d, dual.C(ReLaminar)), turbulentF(d, dual.C(ReTurbulent)))
		r.FrictionCorrelation = corrFrictionTransition
		r.EntryHydro, r.EntryThermal = 10*dh, 10*dh
		r.Warnings = append(laminarWarnings(d, pr.V, o), turbulentWarnings(d, ReTurbulent, pr.V, o)...)
	default:
		r.Regime = RegimeTurbulent
		r.Nu, r.Correlation = turbulentNu(d, re, pr, o)
		r.F, r.FrictionCorrelation = turbulentF(d, re), corrFrictionTurbulent
		r.EntryHydro, r.EntryThermal = 10*dh, 10*dh
		r.Warnings = turbulentWarnings(d, re.V, pr.V, o)
	}
	if d.Shape == ParallelPlates {
		w := warnings(r.Warnings)
		w.check(PlatesAspect, d.Gap/d.Width)
		r.Warnings = w
	}
	return r
}

// blend returns (1 − g)·a + g·b.
func blend(g, a, b dual.Num) dual.Num {
	return a.Add(g.Mul(b.Sub(a)))
}

// laminarNu returns the mean laminar Nu of d, never below the fully developed
// Nu_T, and the name of the correlation that gave it. With the present
// models the bound is a safeguard: Stephan and Hausen lie above Nu_T by
// construction, Muzychka & Yovanovich at least 2.9 % above it for
// 0.001 ≤ α ≤ 1.
func laminarNu(d Duct, re, pr dual.Num, m Laminar) (dual.Num, string) {
	ld := d.lengthRatio()
	var nu dual.Num
	var name string
	switch {
	case m == ThermalEntry && d.Shape == Circular:
		nu, name = Hausen(re, pr, ld), corrHausen
	case m == ThermalEntry:
		nu, name = HausenRectangular(re, pr, d.Aspect(), ld), corrHausenRectangular
	case d.Shape == Circular:
		nu, name = StephanTube(re, pr, ld), corrStephanTube
	case d.Shape == ParallelPlates:
		nu, name = StephanPlates(re, pr, ld), corrStephanPlates
	default:
		nu, name = MuzychkaYovanovichShahLondon(re, pr, d.Aspect(), ld), corrMuzychkaYovanovich
	}
	if fd := d.LaminarNuT(); nu.V < fd {
		return dual.C(fd), corrShahLondon
	}
	return nu, name
}

// laminarF returns the apparent laminar Darcy friction factor of d.
func laminarF(d Duct, re dual.Num) dual.Num {
	return MuzychkaYovanovichF(re, d.LaminarFRe(), d.lengthRatio())
}

// turbulentNu returns the turbulent Nu of d selected by o and its source.
func turbulentNu(d Duct, re, pr dual.Num, o Options) (dual.Num, string) {
	nu, name := GnielinskiNu(re, pr), corrGnielinski
	if o.Turbulent == DittusBoelter {
		nu, name = DittusBoelterNu(re, pr, o.Heating), corrDittusBoelter
	}
	if o.ShortDuct {
		nu = nu.Scale(ShortDuctFactor(d.lengthRatio()))
	}
	return nu, name
}

// turbulentF returns the turbulent Darcy friction factor of d.
func turbulentF(d Duct, re dual.Num) dual.Num {
	return Churchill(re, d.RelativeRoughness())
}

// laminarWarnings checks the inputs of the laminar model of Flow.
func laminarWarnings(d Duct, pr float64, o Options) []string {
	var w warnings
	switch {
	case o.Laminar == ThermalEntry:
		w.check(HausenPr, pr)
	case d.Shape == Circular:
		w.check(StephanTubePr, pr)
	case d.Shape == ParallelPlates:
		w.check(StephanPlatesPr, pr)
	default:
		w.check(MuzychkaYovanovichPr, pr)
		w.check(MuzychkaYovanovichAspect, d.Aspect())
	}
	return w
}

// turbulentWarnings checks the inputs of the turbulent model of Flow.
func turbulentWarnings(d Duct, re, pr float64, o Options) []string {
	var w warnings
	if o.Turbulent == DittusBoelter {
		w.check(DittusBoelterRe, re)
		w.check(DittusBoelterPr, pr)
		w.check(DittusBoelterLD, d.lengthRatio())
	} else {
		w.check(GnielinskiRe, re)
		w.check(GnielinskiPr, pr)
		if !o.ShortDuct {
			w.check(FullyDevelopedLD, d.lengthRatio())
		}
	}
	return w
}

// warnings collects the messages of validity checks.
type warnings []string

// check appends the message of r.Check(v), if any.
func (w *warnings) check(r validity.Range, v float64) {
	if msg := r.Check(v); msg != "" {
		*w = append(*w, msg)
	}
}
