package duct

import (
	"math"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/elements/dual"
)

// longTube is a smooth tube long enough for entry effects to vanish.
var longTube = Duct{Shape: Circular, Diameter: 0.01, Length: 0.01 * 1e5}

// Friction across all regimes follows the Moody chart: 64/Re in laminar
// flow and the Colebrook (1939) equation in turbulent flow, smooth tube.
// Check values: Re 1e4 0.03088, Re 1e5 0.01799 (checks: Colebrook iterated
// by hand); Re 5000 0.03739, Re 8000 0.03279 (Colebrook iterated by hand,
// same formula). Churchill (1977) stays within 1.5 % of Colebrook there
// (its own fit); the former linear blend between 64/2300 and the value at
// 1e4 missed Colebrook by 8 to 22 % in the transition range.
func TestFrictionFollowsMoody(t *testing.T) {
	pr := dual.C(0.71)
	if got := Flow(longTube, dual.C(1000), pr, Options{}).F.V; !near(got, 64.0/1000, 1e-3) {
		t.Errorf("Re 1000: f = %.5f, want 64/Re = 0.064", got)
	}
	for _, c := range []struct{ re, colebrook float64 }{{5000, 0.03739}, {8000, 0.03279}, {1e4, 0.03088}, {1e5, 0.01799}} {
		for _, o := range []Options{{}, {Developed: true}, {Transition: TransitionTurbulent}} {
			r := Flow(longTube, dual.C(c.re), pr, o)
			if !near(r.F.V, c.colebrook, 0.015) {
				t.Errorf("Re %g %+v: f = %.5f, Colebrook %.5f", c.re, o, r.F.V, c.colebrook)
			}
		}
		if got := Colebrook(dual.C(c.re), 0).V; !near(got, c.colebrook, 2e-4) {
			t.Errorf("Re %g: Colebrook %.5f, want %.5f", c.re, got, c.colebrook)
		}
	}
	// Friction is continuous and has no regime jumps anywhere (sampled).
	for _, d := range append(flowDucts(), squareDuct) {
		prev := Flow(d, dual.C(1500), pr, Options{}).F.V
		for re := 1500.0; re < 2e4; re *= 1.001 {
			f := Flow(d, dual.C(re), pr, Options{}).F.V
			if math.Abs(f-prev) > 0.01*prev {
				t.Errorf("%v: f jumps from %g to %g at Re %g", d.Shape, prev, f, re)
			}
			prev = f
		}
	}
}

// The transition treatments, with the turbulent correlation the user chose.
// Hand values, tube L/D = 50, Pr = 0.71, cooled fluid:
// Dittus-Boelter (1930) 0.023·Re^0.8·Pr^0.3 = 18.8921 at Re 5000 and 32.8931
// at 1e4; Stephan (1959) Nu(2300) = 6.11645; Gnielinski (2013)
// interpolation, γ = 2700/7700: 6.11645 + γ·(32.8931 − 6.11645) = 15.5057.
func TestTransitionTreatments(t *testing.T) {
	re, pr := dual.C(5000), dual.C(0.71)
	interp := Flow(tube, re, pr, Options{Turbulent: DittusBoelter})
	if !near(interp.Nu.V, 15.5057, 1e-4) || interp.Transition != TransitionNameInterpolate ||
		!strings.Contains(interp.Correlation, corrDittusBoelter) {
		t.Errorf("interpolation: Nu %.4f (%s, %s), want 15.5057 to Dittus-Boelter", interp.Nu.V, interp.Correlation, interp.Transition)
	}
	ext := Flow(tube, re, pr, Options{Turbulent: DittusBoelter, Transition: TransitionTurbulent})
	if !near(ext.Nu.V, 18.8921, 1e-4) || ext.Transition != TransitionNameTurbulent ||
		!strings.Contains(ext.Transition, "hand-calculation practice") || !strings.Contains(ext.Correlation, "from Re 2300") {
		t.Errorf("turbulent from 2300: Nu %.4f (%s, %s), want 18.8921", ext.Nu.V, ext.Correlation, ext.Transition)
	}
	for _, r := range []Result{interp, ext} {
		if !strings.Contains(strings.Join(r.Warnings, "; "), TransitionWarning) {
			t.Errorf("%s: no transition warning in %q", r.Transition, r.Warnings)
		}
	}
	// Gnielinski (2013): the interpolation ends at Re 4000. Hand, Pr 0.71:
	// Gnielinski (1976)/Petukhov Nu(4000) = 13.5647, γ = 700/1700 at Re
	// 3000: 6.11645 + γ·(13.5647 − 6.11645) = 9.18339; from 4000 on the
	// turbulent correlation itself, Nu(6000) = 19.6488.
	o13 := Options{Transition: TransitionInterpolate4000}
	if r := Flow(tube, dual.C(3000), pr, o13); !near(r.Nu.V, 9.18339, 1e-5) || r.Transition != TransitionNameInterpolate4000 {
		t.Errorf("Gnielinski 2013 at Re 3000: Nu %.5f (%s), want 9.18339", r.Nu.V, r.Transition)
	}
	if r := Flow(tube, dual.C(6000), pr, o13); !near(r.Nu.V, 19.6488, 1e-5) || !strings.Contains(strings.Join(r.Warnings, "; "), TransitionWarning) {
		t.Errorf("Gnielinski 2013 at Re 6000: Nu %.5f, warnings %q; want 19.6488 with the transition warning", r.Nu.V, r.Warnings)
	}
	for _, edge := range []float64{ReLaminar, 4000} {
		lo, hi := Flow(tube, dual.C(edge*(1-1e-12)), pr, o13).Nu.V, Flow(tube, dual.C(edge*(1+1e-12)), pr, o13).Nu.V
		if !near(hi, lo, 1e-9) {
			t.Errorf("Gnielinski 2013: Nu jumps at Re %g: %g | %g", edge, lo, hi)
		}
	}
	// Gnielinski (1976) from 2300: its own formula at Re 5000.
	if got, want := Flow(tube, re, pr, Options{Transition: TransitionTurbulent}).Nu.V, GnielinskiNu(re, pr).V; got != want {
		t.Errorf("Gnielinski from 2300: Nu %g, want %g", got, want)
	}
	// Turbulent and laminar flow give no transition warning.
	for _, re := range []float64{1000, 2e4} {
		if w := strings.Join(Flow(tube, dual.C(re), pr, Options{}).Warnings, "; "); strings.Contains(w, "transitional") {
			t.Errorf("Re %g: %q", re, w)
		}
	}
	for _, re := range []float64{2350, 6000, 9950} {
		checkDerivative(t, "turbulent from 2300", func(re, pr dual.Num) dual.Num {
			return Flow(tube, re, pr, Options{Turbulent: DittusBoelter, Transition: TransitionTurbulent}).Nu
		}, re, 0.71)
	}
}

// Fully developed flow: Nu_T of Shah & London (1978) whatever the length in
// laminar flow, friction with the fully developed f·Re/Re as Churchill's
// laminar term (64/Re for a tube), no short-duct factor.
func TestDevelopedFlow(t *testing.T) {
	pr := dual.C(0.71)
	o := Options{Developed: true, ShortDuct: true}
	for _, d := range []Duct{finChannel, tube, slot} {
		r := Flow(d, dual.C(500), pr, o)
		if r.Nu.V != d.LaminarNuT() || r.Developing || r.Correlation != corrShahLondon {
			t.Errorf("%v laminar: Nu %g (%s), want %g", d.Shape, r.Nu.V, r.Correlation, d.LaminarNuT())
		}
	}
	if got := Flow(tube, dual.C(500), pr, o).F.V; !near(got, 64.0/500, 1e-9) {
		t.Errorf("tube, Re 500: f = %g, want 64/Re", got)
	}
	if got := Flow(finChannel, dual.C(500), pr, o).F.V; !near(got, ShahLondonFRe(0.25)/500, 1e-9) {
		t.Errorf("fin channel, Re 500: f = %g, want f·Re/Re = %g", got, ShahLondonFRe(0.25)/500)
	}
	// Hand, Gnielinski (1976) at 1e4, Pr 0.71: 30.03, with no short-duct
	// factor even though ShortDuct is set.
	if got := Flow(tube, dual.C(1e4), pr, o).Nu.V; !near(got, 30.03, 1e-3) {
		t.Errorf("turbulent developed: Nu %g, want 30.03", got)
	}
}
