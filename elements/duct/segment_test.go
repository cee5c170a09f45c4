package duct

import (
	"testing"

	"github.com/heatgraph/heatgraph/elements/dual"
)

// A stretch of a duct with a uniform wall temperature never has a mean Nu
// below the fully developed value, however far downstream it lies: h̄·L =
// ∫h dx with the local h falling towards h_fd (Shah & London 1978, the
// thermal entrance problem: the local Nu_x,T decreases monotonically to
// Nu_T). The same holds for the friction factor and the fully developed
// f. Many splits, Re, Pr, shapes and models.
func TestSegmentNeverBelowDeveloped(t *testing.T) {
	ducts := append(flowDucts(), Duct{Shape: Rectangular, Width: 0.002, Height: 0.02, Length: 0.03},
		Duct{Shape: ParallelPlates, Gap: 0.002, Width: 0.08, Length: 0.01, Heated: OneLongWall})
	opts := []Options{{}, {Laminar: ThermalEntry}, {Turbulent: DittusBoelter, ShortDuct: true}, {Transition: TransitionTurbulent}}
	clamped := 0
	for _, d := range ducts {
		for _, o := range opts {
			for _, re := range []float64{20, 200, 1000, 2300, 3000, 6000, 2e4} {
				for _, pr := range []float64{0.7, 7} {
					for _, up := range []float64{0.01, 0.1, 1, 3, 10, 100} {
						x0 := up * d.Length
						seg := Segment(d, x0, dual.C(re), dual.C(pr), o)
						dev := Flow(d, dual.C(re), dual.C(pr), Options{Developed: true, Turbulent: o.Turbulent, Transition: o.Transition, Heating: o.Heating})
						if seg.Nu.V < dev.Nu.V*(1-1e-12) {
							t.Errorf("%v %+v Re %g Pr %g, from %g L: segment Nu %g below fully developed %g",
								d.Shape, o, re, pr, up, seg.Nu.V, dev.Nu.V)
						}
						if seg.F.V < dev.F.V*(1-1e-12) {
							t.Errorf("%v %+v Re %g Pr %g, from %g L: segment f %g below fully developed %g",
								d.Shape, o, re, pr, up, seg.F.V, dev.F.V)
						}
						if seg.Nu.V == seg.NuDeveloped.V {
							clamped++
						}
					}
				}
			}
		}
	}
	t.Logf("%d segments at the fully developed bound", clamped)
	checkDerivative(t, "segment Nu", func(re, pr dual.Num) dual.Num { return Segment(finChannel, 0.05, re, pr, Options{}).Nu }, 800, 0.7)
	checkDerivative(t, "segment F", func(re, pr dual.Num) dual.Num { return Segment(finChannel, 0.05, re, pr, Options{}).F }, 800, 0.7)
}
