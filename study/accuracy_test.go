package study

import (
	"math"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/elements/air"
	"github.com/heatgraph/heatgraph/elements/dual"
)

// One plate cooled only by natural convection from a vertical face: the
// band of its temperature from Churchill & Chu's stated accuracy must be
// the first-order change of the temperature when h is off by that much,
// found here by solving the plate's balance P = q(T) again by bisection
// with h scaled (independently of the adjoint and of Newton's method).
func TestAccuracyBandAgainstResolving(t *testing.T) {
	const model = `
ambient: {temperature: 25 degC}
nodes:
  - {id: plate, power: 4 W, limit: 80 degC}
links:
  - {id: face, kind: natural, from: plate, orientation: vertical, height: 120 mm, width: 100 mm}
`
	m := &Model{File: "plate.yaml", Data: []byte(model)}
	bands, err := m.Accuracy()
	if err != nil {
		t.Fatal(err)
	}
	if len(bands) != 1 || len(bands[0].Contributions) != 1 {
		t.Fatalf("bands %+v", bands)
	}
	c := bands[0].Contributions[0]
	if c.Accuracy != 0.10 || !strings.Contains(c.Source, "Churchill") {
		t.Errorf("contribution %+v", c)
	}
	// Re-solve with h scaled by 1 ± δ, δ small, by bisection on the
	// element itself.
	const tInf = 298.15
	env := &elements.Env{Pressure: 101325, Gravity: elements.StandardGravity, AmbientT: tInf, AirCp: air.SpecificHeat(dual.C(tInf)).V}
	el, err := elements.NewNatural(0, 1, elements.Vertical, 0.012, 0.12, elements.Fins{})
	if err != nil {
		t.Fatal(err)
	}
	solveWith := func(k float64) float64 {
		e, _ := elements.ScaleCoefficient(el, k)
		lo, hi := tInf, tInf+300
		for i := 0; i < 200; i++ {
			mid := (lo + hi) / 2
			l := elements.NewLocal(2, 2, false)
			e.Eval(&elements.State{X: []float64{mid, tInf}, Env: env}, l)
			if -l.R[0] < 4 {
				lo = mid
			} else {
				hi = mid
			}
		}
		return (lo + hi) / 2
	}
	const delta = 1e-3
	slope := (solveWith(1+delta) - solveWith(1-delta)) / (2 * delta) // dT/d(ln h)
	want := slope * c.Accuracy
	if math.Abs(c.DeltaK-want) > 1e-3*math.Abs(want) {
		t.Errorf("ΔT for h off by %.0f %%: adjoint %.6g K, re-solving %.6g K", 100*c.Accuracy, c.DeltaK, want)
	}
	if math.Abs(bands[0].HalfWidthK-math.Abs(want)) > 1e-3*math.Abs(want) {
		t.Errorf("band %.6g K, want %.6g K", bands[0].HalfWidthK, math.Abs(want))
	}
	if !(c.DeltaK < 0) {
		t.Errorf("a higher coefficient must cool the plate: ΔT = %g", c.DeltaK)
	}
}

// Sampling the correlations' accuracy agrees with the first-order band: for
// one plate under natural convection (nearly linear in a ±10 % change of
// h), the spread of 2000 samples is the first-order σ = band/2 to within
// the sampling error of a standard deviation (√(1/(2n)) ≈ 1.6 %, so 6 %
// allows for the curvature too), and the same seed gives the same result.
func TestCorrelationMonteCarlo(t *testing.T) {
	const model = `
ambient: {temperature: 25 degC}
nodes:
  - {id: plate, power: 4 W, limit: 80 degC}
links:
  - {id: face, kind: natural, from: plate, orientation: vertical, height: 120 mm, width: 100 mm}
`
	m := &Model{File: "plate.yaml", Data: []byte(model)}
	a, err := m.CorrelationMonteCarlo(2000, 7)
	if err != nil {
		t.Fatal(err)
	}
	if len(a) != 1 || a[0].N != 2000 {
		t.Fatalf("%+v", a)
	}
	if r := a[0].StdDev / a[0].FirstOrderSig; math.Abs(r-1) > 0.06 {
		t.Errorf("spread %.4g K against the first-order σ %.4g K", a[0].StdDev, a[0].FirstOrderSig)
	}
	b, _ := m.CorrelationMonteCarlo(2000, 7)
	if a[0].P95 != b[0].P95 || a[0].Mean != b[0].Mean {
		t.Error("the same seed must give the same samples")
	}
}
