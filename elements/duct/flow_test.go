package duct

import (
	"math"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/elements/dual"
)

// Ducts of the flow tests: a fin channel, a tube and a plate slot.
var (
	finChannel = Duct{Shape: Rectangular, Width: 0.004, Height: 0.016, Length: 0.064}    // Dh 6.4 mm, L/Dh 10, alpha 0.25
	tube       = Duct{Shape: Circular, Diameter: 0.01, Length: 0.5}                      // L/D 50
	slot       = Duct{Shape: ParallelPlates, Gap: 0.002, Width: 0.08, Length: 0.1}       // L/Dh 25
	roughTube  = Duct{Shape: Circular, Diameter: 0.01, Length: 0.5, Roughness: 1e-5}     // e = 1e-3
	squareDuct = Duct{Shape: Rectangular, Width: 0.01, Height: 0.01, Length: 0.01 * 1e5} // very long
	allOptions = []Options{{}, {Turbulent: DittusBoelter, Heating: true}, {ShortDuct: true}, {Laminar: ThermalEntry}, {Developed: true}, {Transition: TransitionInterpolate4000, ShortDuct: true}}
)

func flowDucts() []Duct { return []Duct{finChannel, tube, slot, roughTube} }

func TestFlowRegimes(t *testing.T) {
	// Rule of thumb: laminar below Re = 2300, turbulent from 1e4 (Gnielinski
	// 2013 transition range between).
	for _, c := range []struct {
		re   float64
		want string
	}{{500, RegimeLaminar}, {2300, RegimeLaminar}, {2301, RegimeTransitional}, {9999, RegimeTransitional}, {1e4, RegimeTurbulent}, {1e6, RegimeTurbulent}} {
		if got := Flow(tube, dual.C(c.re), dual.C(0.71), Options{}).Regime; got != c.want {
			t.Errorf("Re = %g: regime %q, want %q", c.re, got, c.want)
		}
	}
}

func TestFlowEntranceLengths(t *testing.T) {
	// Rule of thumb: laminar L_h = 0.05 Re Dh, L_t = 0.05 Re Pr Dh;
	// turbulent entrance about 10 Dh.
	lam := Flow(tube, dual.C(1000), dual.C(0.71), Options{})
	if !near(lam.EntryHydro, 0.05*1000*0.01, 1e-12) || !near(lam.EntryThermal, 0.05*1000*0.71*0.01, 1e-12) {
		t.Errorf("laminar entry lengths %g, %g m; want 0.5, 0.355", lam.EntryHydro, lam.EntryThermal)
	}
	if lam.Developing {
		t.Error("L = 0.5 m > L_t = 0.355 m: should not be developing")
	}
	if !Flow(finChannel, dual.C(1000), dual.C(0.71), Options{}).Developing {
		t.Error("fin channel L = 64 mm < L_t = 227 mm: should be developing")
	}
	turb := Flow(tube, dual.C(5e4), dual.C(0.71), Options{})
	if !near(turb.EntryHydro, 10*0.01, 1e-12) || !near(turb.EntryThermal, 10*0.01, 1e-12) || turb.Developing {
		t.Errorf("turbulent entry lengths %g, %g m, developing %v; want 0.1, 0.1, false", turb.EntryHydro, turb.EntryThermal, turb.Developing)
	}
}

func TestFlowLaminarSources(t *testing.T) {
	re, pr := dual.C(1000), dual.C(0.71)
	cases := []struct {
		d    Duct
		o    Options
		want dual.Num
		name string
	}{
		{finChannel, Options{}, MuzychkaYovanovichShahLondon(re, pr, 0.25, 10), corrMuzychkaYovanovich},
		{tube, Options{}, StephanTube(re, pr, 50), corrStephanTube},
		{slot, Options{}, StephanPlates(re, pr, 25), corrStephanPlates},
		{tube, Options{Laminar: ThermalEntry}, Hausen(re, pr, 50), corrHausen},
		{finChannel, Options{Laminar: ThermalEntry}, HausenRectangular(re, pr, 0.25, 10), corrHausenRectangular},
		{slot, Options{Laminar: ThermalEntry}, PlatesThermalEntry(re, pr, 7.541, 25), corrPlatesThermal},
	}
	for _, c := range cases {
		r := Flow(c.d, re, pr, c.o)
		if !near(r.Nu.V, c.want.V, 1e-12) || r.Correlation != c.name {
			t.Errorf("%v %+v: Nu %g (%s), want %g (%s)", c.d.Shape, c.o, r.Nu.V, r.Correlation, c.want.V, c.name)
		}
		if want := MuzychkaYovanovichF(re, c.d.LaminarFRe(), c.d.lengthRatio()).V; !near(r.F.V, want, 1e-12) {
			t.Errorf("%v: F = %g, want %g", c.d.Shape, r.F.V, want)
		}
	}
}

func TestFlowLaminarNeverBelowFullyDeveloped(t *testing.T) {
	// Nu = max(developing, Shah & London Nu_T): a very long square duct gives
	// at least 2.979, and a tube at least 3.657.
	for _, d := range []Duct{squareDuct, {Shape: Circular, Diameter: 0.01, Length: 1e3}} {
		for _, re := range []float64{10, 100, 2000} {
			if r := Flow(d, dual.C(re), dual.C(0.7), Options{}); r.Nu.V < d.LaminarNuT() {
				t.Errorf("%v Re %g: Nu %g below Nu_T %g", d.Shape, re, r.Nu.V, d.LaminarNuT())
			}
		}
	}
}

func TestFlowTurbulent(t *testing.T) {
	// Hand, Gnielinski (1976)/Petukhov at Re = 1e4, Pr = 0.71: 30.03; with the
	// short-duct factor at L/D = 50: 30.028*(1 + 50^(-2/3)) = 32.240.
	// Dittus-Boelter heating 31.79. F: Churchill (1977) smooth 0.03100.
	re, pr := dual.C(1e4), dual.C(0.71)
	r := Flow(tube, re, pr, Options{})
	if !near(r.Nu.V, 30.03, 1e-3) || !near(r.F.V, 0.03100, 1e-3) || r.Correlation != corrGnielinski {
		t.Errorf("Gnielinski: Nu %g, F %g, %s", r.Nu.V, r.F.V, r.Correlation)
	}
	if got := Flow(tube, re, pr, Options{ShortDuct: true}).Nu.V; !near(got, 30.0278*ShortDuctFactor(50), 1e-4) {
		t.Errorf("short duct: Nu %g, want %g", got, 30.0278*ShortDuctFactor(50))
	}
	if got := Flow(tube, re, pr, Options{Turbulent: DittusBoelter, Heating: true}); !near(got.Nu.V, 31.79, 1e-3) || got.Correlation != corrDittusBoelter {
		t.Errorf("Dittus-Boelter: Nu %g (%s), want 31.79", got.Nu.V, got.Correlation)
	}
	// Rough tube: Churchill with e = 1e-3, Re = 1e5 gives 0.022343 (hand).
	if got := Flow(roughTube, dual.C(1e5), pr, Options{}).F.V; !near(got, 0.0223432, 1e-5) {
		t.Errorf("rough tube F = %g, want 0.0223432", got)
	}
}

func TestFlowTransition(t *testing.T) {
	// Hand, Gnielinski (2013) blend, tube L/D = 50, Pr = 0.71, Re = 5000,
	// gamma = 2700/7700: Stephan Nu(2300) = 6.11645, Gnielinski Nu(1e4) =
	// 30.0278, Nu = 14.5010. f: Churchill (1977) with the Muzychka-Yovanovich
	// (2009) apparent friction 0.0274345 as its laminar term, 0.0381010
	// (hand, formula check).
	r := Flow(tube, dual.C(5000), dual.C(0.71), Options{})
	if !near(r.Nu.V, 14.5010, 1e-5) || r.Transition != TransitionNameInterpolate || !strings.HasPrefix(r.Correlation, "Gnielinski interpolation") {
		t.Errorf("Nu = %.5f (%s, %s), want 14.5010", r.Nu.V, r.Correlation, r.Transition)
	}
	if !near(r.F.V, 0.0381010, 1e-5) {
		t.Errorf("F = %.7f, want 0.0381010", r.F.V)
	}
}

func TestFlowContinuity(t *testing.T) {
	// Nu(Re) and F(Re) are continuous at both ends of the transition range.
	for _, d := range append(flowDucts(), squareDuct) {
		for _, o := range allOptions {
			for _, edge := range []float64{ReLaminar, ReTurbulent} {
				lo := Flow(d, dual.C(edge*(1-1e-12)), dual.C(0.71), o)
				hi := Flow(d, dual.C(edge*(1+1e-12)), dual.C(0.71), o)
				if lo.Regime == hi.Regime {
					t.Fatalf("Re = %g: no regime change", edge)
				}
				if !near(hi.Nu.V, lo.Nu.V, 1e-9) || !near(hi.F.V, lo.F.V, 1e-9) {
					t.Errorf("%v %+v at Re = %g: Nu %.10g | %.10g, F %.10g | %.10g",
						d.Shape, o, edge, lo.Nu.V, hi.Nu.V, lo.F.V, hi.F.V)
				}
			}
		}
	}
}

func TestFlowDerivatives(t *testing.T) {
	// Laminar, near 2300, transition, near 1e4 and turbulent; never on 2300 or
	// 1e4 themselves, where the derivative steps.
	res := []float64{30, 400, 2250, 2350, 6000, 9950, 1.005e4, 1e5, 2e6}
	for _, d := range flowDucts() {
		for _, o := range allOptions {
			for _, re := range res {
				for _, pr := range []float64{0.7, 3} {
					checkDerivative(t, "Flow Nu", func(re, pr dual.Num) dual.Num { return Flow(d, re, pr, o).Nu }, re, pr)
					checkDerivative(t, "Flow F", func(re, pr dual.Num) dual.Num { return Flow(d, re, pr, o).F }, re, pr)
				}
			}
		}
	}
}

func TestFlowWarnings(t *testing.T) {
	pr := dual.C(0.71)
	quiet := []struct {
		d  Duct
		re float64
		o  Options
	}{
		{finChannel, 1000, Options{}},
		{tube, 1e5, Options{}},
		{slot, 800, Options{}},
		{finChannel, 5e4, Options{ShortDuct: true}},
	}
	for _, c := range quiet {
		if w := Flow(c.d, dual.C(c.re), pr, c.o).Warnings; len(w) != 0 {
			t.Errorf("%v Re %g: unexpected warnings %q", c.d.Shape, c.re, w)
		}
	}
	loud := []struct {
		d    Duct
		re   float64
		pr   float64
		o    Options
		want string
	}{
		{tube, 1e7, 0.71, Options{}, "Re = 1e+07 is outside 3000 to 5e+06"},
		{tube, 1e5, 0.3, Options{}, "Pr = 0.3 is outside 0.5 to 2000"},
		{tube, 1e5, 0.5, Options{Turbulent: DittusBoelter}, "Pr = 0.5 is outside 0.6 to 160"},
		{Duct{Shape: Circular, Diameter: 0.01, Length: 0.05}, 1e5, 0.71, Options{}, "L/Dh = 5 is below 10"},
		{Duct{Shape: Circular, Diameter: 0.01, Length: 0.05}, 1e5, 0.71, Options{Turbulent: DittusBoelter}, "L/Dh = 5 is below 10"},
		{Duct{Shape: Rectangular, Width: 0.1, Height: 0.001, Length: 1}, 500, 0.71, Options{}, "aspect = 0.01 is outside 0.02 to 1"},
		{Duct{Shape: ParallelPlates, Gap: 0.01, Width: 0.05, Length: 1}, 500, 0.71, Options{}, "gap/width = 0.2 is outside 0 to 0.05"},
		{tube, 1000, 0.71, Options{Laminar: ThermalEntry}, "Pr = 0.71 is below 5"},
		{tube, 1000, 0.05, Options{}, "Pr = 0.05 is below 0.1"},
	}
	for _, c := range loud {
		w := Flow(c.d, dual.C(c.re), dual.C(c.pr), c.o).Warnings
		if !strings.Contains(strings.Join(w, "; "), c.want) {
			t.Errorf("%v Re %g Pr %g %+v: warnings %q, want %q", c.d.Shape, c.re, c.pr, c.o, w, c.want)
		}
	}
	// A plate slot warns about gap/width once, also in the transition range,
	// where the transition warning comes too.
	wide := Duct{Shape: ParallelPlates, Gap: 0.01, Width: 0.05, Length: 1}
	if w := Flow(wide, dual.C(5000), pr, Options{}).Warnings; len(w) != 2 || w[0] != TransitionWarning {
		t.Errorf("wide slot, transition: warnings %q, want the transition and gap/width", w)
	}
}

func TestFlowNoFlow(t *testing.T) {
	// Re -> 0: the fully developed limit Nu_T and an unbounded f.
	r := Flow(tube, dual.C(0), dual.C(0.71), Options{})
	if r.Nu.V != CircularNuT || !math.IsInf(r.F.V, 1) || len(r.Warnings) != 1 {
		t.Errorf("no flow: Nu %g, F %g, warnings %q", r.Nu.V, r.F.V, r.Warnings)
	}
}
