package duct

import (
	"fmt"
	"math"

	"github.com/heatgraph/heatgraph/elements/dual"
	"github.com/heatgraph/heatgraph/elements/validity"
)

// Regime boundaries of Flow, after Gnielinski, VDI Heat Atlas (2010),
// chapter G1, Heat transfer in pipe flow (from memory): laminar up to
// ReLaminar, turbulent from ReTurbulent, transitional between.
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
	// tubes, PlatesThermalEntry for plates, the engineering substitution
	// HausenRectangular for rectangles. It
	// suits a heated section behind an unheated starting length.
	ThermalEntry
)

// Transition selects how Flow treats the transition range
// ReLaminar < Re < ReTurbulent.
type Transition int

const (
	// TransitionInterpolate is Gnielinski's linear interpolation as given in
	// the VDI Heat Atlas (2010), chapter G1, Heat transfer in pipe flow (from
	// memory):
	//
	//	Nu = (1 − γ)·Nu_lam(2300) + γ·Nu_turb(10⁴),  γ = (Re − 2300)/(10⁴ − 2300),
	//
	// with the laminar value at the actual length and the turbulent value
	// of the selected Turbulent correlation (Gnielinski 1976 in the
	// published form).
	TransitionInterpolate Transition = iota
	// TransitionTurbulent applies the selected Turbulent correlation at the
	// actual Re from Re = 2300 on: common hand-calculation practice, not a
	// published method, and below the correlations' own Reynolds ranges. Nu
	// jumps at Re = 2300.
	TransitionTurbulent
	// TransitionInterpolate4000 is the same interpolation between Re = 2300
	// and Re = 4000, as in Gnielinski (2013), On heat transfer in tubes,
	// Int. J. Heat Mass Transfer 63:134–140 (its abstract: "a linear
	// interpolation between the Nusselt numbers at Re = 2300 and Re = 4000";
	// a corrigendum followed in vol. 81, 2015, not seen), with the
	// turbulent correlation itself from 4000 to 10⁴.
	TransitionInterpolate4000
)

// Options selects the correlations of Flow. The zero value selects
// Gnielinski, the combined entry, the Gnielinski (2013) transition
// interpolation, a cooled fluid and no short-duct factor.
type Options struct {
	Turbulent  Turbulent  // turbulent Nusselt correlation
	Laminar    Laminar    // laminar developing-flow model
	Transition Transition // treatment of 2300 < Re < 10⁴
	// Developed takes the flow as hydrodynamically and thermally fully
	// developed over the whole length: laminar Nu = Nu_T of the heated
	// walls, friction without the entry term, no short-duct factor. It
	// overrides Laminar and ShortDuct.
	Developed bool
	Heating   bool // fluid heated by the wall: Dittus–Boelter exponent 0.4, else 0.3
	ShortDuct bool // multiply the turbulent Nu by ShortDuctFactor(L/Dh)
	// HeatOnly asks for the Nusselt numbers alone: no friction factors,
	// names or warnings (they cost more than Nu itself), for elements that
	// stamp heat at every Newton iteration and report the rest once.
	HeatOnly bool
	// wantDeveloped asks for NuDeveloped even with HeatOnly (Segment's
	// bound needs it).
	wantDeveloped bool
}

// Result is the mean heat transfer and friction of a duct.
type Result struct {
	Nu                  dual.Num // mean Nusselt number on Dh over the length
	F                   dual.Num // apparent Darcy friction factor over the length
	NuDeveloped         dual.Num // fully developed Nu of the same regime: the least a mean Nu can be
	FDeveloped          dual.Num // fully developed F of the same regime
	Regime              string   // RegimeLaminar, RegimeTransitional or RegimeTurbulent
	Developing          bool     // laminar and shorter than the thermal entrance length
	Correlation         string   // source of Nu
	Transition          string   // treatment of the transition range, when Regime is RegimeTransitional
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
	corrPlatesThermal      = "Leveque limit and Shah-London Nu_T, cube superposition (thermal entry, parallel plates)"
	corrShahLondon         = "Shah-London (1978) fully developed"
	corrGnielinski         = "Gnielinski (1976)/Petukhov"
	corrDittusBoelter      = "Dittus-Boelter (1930)"
	corrPartialWalls       = ", fully developed term of the heated walls (engineering substitution)"
	corrFromRe             = ", applied from Re %g"
	corrFriction           = "Churchill (1977), laminar term: Muzychka-Yovanovich (2009) apparent friction of the duct"
	corrFrictionDeveloped  = "Churchill (1977), laminar term: Shah-London (1978) fully developed f·Re of the duct"
)

// Names of the transition treatments reported in Result.Transition.
const (
	TransitionNameInterpolate     = "Gnielinski interpolation between Re 2300 and 10^4 (VDI Heat Atlas G1)"
	TransitionNameInterpolate4000 = "Gnielinski (2013) interpolation between Re 2300 and 4000"
	TransitionNameTurbulent       = "turbulent correlation applied from Re 2300 (hand-calculation practice)"
)

// TransitionWarning is the warning Flow gives in the transition range. The
// size of the uncertainty is from memory: measured Nusselt numbers between
// Re = 2300 and 10⁴ scatter widely because the onset of turbulence depends
// on the inlet shape and on disturbances (Gnielinski 2013 discusses this).
const TransitionWarning = "transitional flow (2300 < Re < 10^4): heat transfer and friction are uncertain, " +
	"Nu by ±20 % or more, since the onset of turbulence depends on the inlet and on disturbances (from memory)"

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
// whose long-duct limit is the exact Nu_T); with o.Developed, Nu = Nu_T.
// Nu_T is that of the heated walls (Duct.LaminarNuT); when not all walls are
// heated, the developing models keep their entry terms and take the fully
// developed term of the heated walls (an engineering substitution).
// Entrance lengths 0.05·Re·Dh (hydrodynamic) and 0.05·Re·Pr·Dh (thermal).
//
// Turbulent (re ≥ ReTurbulent): Nu from o.Turbulent, times ShortDuctFactor
// when o.ShortDuct (and not o.Developed). Nu assumes a smooth wall and is
// taken on Dh of the wetted perimeter also when only some walls are heated,
// h then applying to the heated walls only (the usual convention; some
// authors use the heated diameter 4A/P_heated instead). Entrance lengths
// about 10·Dh (rule of thumb), also used in the transitional range.
//
// Transitional: o.Transition selects TransitionInterpolate (VDI Heat Atlas
// G1), TransitionInterpolate4000 (Gnielinski 2013) or TransitionTurbulent;
// in every case Result.Warnings carries TransitionWarning.
//
// F, in every regime, is ChurchillDuct with the laminar friction of the duct
// as its laminar term: the Muzychka & Yovanovich (2009) apparent friction
// over the length, or with o.Developed the fully developed f·Re/Re. For a
// long circular tube this is Churchill (1977) itself, which follows Colebrook
// in turbulent flow and bridges the transition range continuously; its
// turbulent term already lifts f near the top of the laminar range (0.1 %
// above 64/Re at Re 2000, 11 % at 2300, for a long tube).
//
// NuDeveloped and FDeveloped are the same model's values for fully
// developed flow at the same Re and Pr: the least the mean over any stretch
// of the duct can be.
func Flow(d Duct, re, pr dual.Num, o Options) Result {
	if !(re.V > 0) || !(pr.V > 0) {
		nu := dual.C(d.LaminarNuT())
		return Result{
			Nu:          nu,
			F:           dual.C(math.Inf(1)),
			NuDeveloped: nu,
			FDeveloped:  dual.C(math.Inf(1)),
			Regime:      RegimeLaminar,
			Correlation: corrShahLondon,
			Warnings:    []string{fmt.Sprintf("Re = %.4g and Pr = %.4g must be positive", re.V, pr.V)},
		}
	}
	dh := d.Dh()
	dev := o
	dev.Developed = true
	var r Result
	if !o.HeatOnly {
		r.F, r.FrictionCorrelation = friction(d, re, o.Developed)
		r.FDeveloped, _ = friction(d, re, true)
	}
	switch {
	case re.V <= ReLaminar:
		r.Regime = RegimeLaminar
		r.Nu, r.Correlation = laminarNu(d, re, pr, o)
		r.NuDeveloped = dual.C(d.LaminarNuT())
		r.EntryHydro = 0.05 * re.V * dh
		r.EntryThermal = 0.05 * re.V * pr.V * dh
		r.Developing = !o.Developed && d.Length < r.EntryThermal
		if !o.HeatOnly {
			r.Warnings = laminarWarnings(d, pr.V, o)
		}
	case re.V < ReTurbulent:
		r.Regime = RegimeTransitional
		r.EntryHydro, r.EntryThermal = 10*dh, 10*dh
		high := ReTurbulent
		switch o.Transition {
		case TransitionTurbulent:
			high = ReLaminar
			r.Transition = TransitionNameTurbulent
		case TransitionInterpolate4000:
			high = 4000
			r.Transition = TransitionNameInterpolate4000
		default:
			r.Transition = TransitionNameInterpolate
		}
		if re.V >= high {
			r.Nu, r.Correlation = turbulentNu(d, re, pr, o)
			if o.needDeveloped() {
				r.NuDeveloped, _ = turbulentNu(d, re, pr, dev)
			}
			if !o.HeatOnly {
				r.Correlation += fmt.Sprintf(corrFromRe, high)
				r.Warnings = turbulentWarnings(d, re.V, pr.V, o)
			}
		} else {
			r.Nu, r.Correlation = transitionNu(d, re, pr, o, high)
			if o.needDeveloped() {
				r.NuDeveloped, _ = transitionNu(d, re, pr, dev, high)
			}
			if !o.HeatOnly {
				r.Warnings = append(laminarWarnings(d, pr.V, o), turbulentWarnings(d, high, pr.V, o)...)
			}
		}
		if !o.HeatOnly {
			r.Warnings = append(r.Warnings, TransitionWarning)
		}
	default:
		r.Regime = RegimeTurbulent
		r.Nu, r.Correlation = turbulentNu(d, re, pr, o)
		if o.needDeveloped() {
			r.NuDeveloped, _ = turbulentNu(d, re, pr, dev)
		}
		r.EntryHydro, r.EntryThermal = 10*dh, 10*dh
		if !o.HeatOnly {
			r.Warnings = turbulentWarnings(d, re.V, pr.V, o)
		}
	}
	if d.Shape == ParallelPlates && !o.HeatOnly {
		w := warnings(r.Warnings)
		w.check(PlatesAspect, d.Gap/d.Width)
		r.Warnings = w
	}
	return r
}

// transitionNu returns Gnielinski's interpolation up to Re = high and its
// name: with γ = (Re − 2300)/(high − 2300),
// Nu = (1 − γ)·Nu_lam(2300) + γ·Nu_turb(high), the laminar value at the
// actual length.
func transitionNu(d Duct, re, pr dual.Num, o Options, high float64) (dual.Num, string) {
	g := re.AddC(-ReLaminar).Scale(1 / (high - ReLaminar))
	lam, lamName := laminarNu(d, dual.C(ReLaminar), pr, o)
	turb, turbName := turbulentNu(d, dual.C(high), pr, o)
	return blend(g, lam, turb), fmt.Sprintf("Gnielinski interpolation: %s at Re 2300, %s at Re %g", lamName, turbName, high)
}

// blend returns (1 − g)·a + g·b.
func blend(g, a, b dual.Num) dual.Num {
	return a.Add(g.Mul(b.Sub(a)))
}

// laminarNu returns the mean laminar Nu of d, never below the fully developed
// Nu_T of its heated walls, and the name of the correlation that gave it.
// With the present models the bound is a safeguard: Stephan and Hausen lie
// above Nu_T by construction, Muzychka & Yovanovich at least 2.9 % above it
// for 0.001 ≤ α ≤ 1.
func laminarNu(d Duct, re, pr dual.Num, o Options) (dual.Num, string) {
	fd := d.LaminarNuT()
	if o.Developed {
		return dual.C(fd), corrShahLondon
	}
	ld := d.lengthRatio()
	var nu dual.Num
	var name string
	switch {
	case o.Laminar == ThermalEntry && d.Shape == Circular:
		nu, name = Hausen(re, pr, ld), corrHausen
	case o.Laminar == ThermalEntry && d.Shape == ParallelPlates:
		nu, name = PlatesThermalEntry(re, pr, fd, ld), corrPlatesThermal
	case o.Laminar == ThermalEntry:
		nu, name = hausenForm(re, pr, fd, ld), corrHausenRectangular
	case d.Shape == Circular:
		nu, name = StephanTube(re, pr, ld), corrStephanTube
	case d.Shape == ParallelPlates:
		nu, name = StephanPlates(re, pr, ld).AddC(fd-ShahLondonNuT(0)), corrStephanPlates
	default:
		a := d.Aspect()
		nu, name = muzychkaYovanovich(re, pr, a, ld, fd*(1+a)/(2*math.Sqrt(a))), corrMuzychkaYovanovich
	}
	if d.Heated != AllWalls {
		name += corrPartialWalls
	}
	if nu.V < fd {
		return dual.C(fd), corrShahLondon
	}
	return nu, name
}

// friction returns the Darcy friction factor of d at re and its source:
// ChurchillDuct with the apparent laminar friction of the length, or the
// fully developed one when developed.
func friction(d Duct, re dual.Num, developed bool) (dual.Num, string) {
	if developed {
		return ChurchillDuct(re, re.Inv().Scale(d.LaminarFRe()), d.RelativeRoughness()), corrFrictionDeveloped
	}
	lam := MuzychkaYovanovichF(re, d.LaminarFRe(), d.lengthRatio())
	return ChurchillDuct(re, lam, d.RelativeRoughness()), corrFriction
}

// turbulentNu returns the turbulent Nu of d selected by o and its source.
func turbulentNu(d Duct, re, pr dual.Num, o Options) (dual.Num, string) {
	nu, name := GnielinskiNu(re, pr), corrGnielinski
	if o.Turbulent == DittusBoelter {
		nu, name = DittusBoelterNu(re, pr, o.Heating), corrDittusBoelter
	}
	if o.ShortDuct && !o.Developed {
		nu = nu.Scale(ShortDuctFactor(d.lengthRatio()))
		name += ", short-duct factor"
	}
	return nu, name
}

// laminarWarnings checks the inputs of the laminar model of Flow.
func laminarWarnings(d Duct, pr float64, o Options) []string {
	var w warnings
	switch {
	case o.Developed:
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

// needDeveloped reports whether Flow must compute NuDeveloped.
func (o Options) needDeveloped() bool { return !o.HeatOnly || o.wantDeveloped }
