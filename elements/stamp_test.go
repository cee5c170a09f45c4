package elements

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/diff/fd"
	"gonum.org/v1/gonum/mat"
)

// recorder is a Stamper that keeps the heat into each node and a dense
// Jacobian, for tests.
type recorder struct {
	q   []float64
	jac *mat.Dense
}

func newRecorder(n int) *recorder {
	return &recorder{q: make([]float64, n), jac: mat.NewDense(n, n, nil)}
}

func (r *recorder) AddHeat(n int, q float64) { r.q[n] += q }
func (r *recorder) AddDeriv(n, m int, d float64) {
	r.jac.Set(n, m, r.jac.At(n, m)+d)
}

// stampAt stamps el at temperatures t (nodes numbered 0..len(t)-1).
func stampAt(el Element, env *Env, t []float64) *recorder {
	r := newRecorder(len(t))
	el.Stamp(&State{T: t, Env: env}, r)
	return r
}

var testEnv = &Env{Pressure: 101325, Gravity: StandardGravity}

// checkJacobian compares the stamped Jacobian of el with a central finite
// difference of its stamped heat flows (gonum diff/fd), entry by entry, at
// temperatures t. The tolerance is relative to the largest entry.
func checkJacobian(t *testing.T, name string, el Element, temps []float64, tol float64) {
	t.Helper()
	n := len(temps)
	got := stampAt(el, testEnv, temps).jac
	want := mat.NewDense(n, n, nil)
	fd.Jacobian(want, func(y, x []float64) {
		copy(y, stampAt(el, testEnv, x).q)
	}, temps, &fd.JacobianSettings{Formula: fd.Central, Step: 1e-4})
	scale := mat.Norm(want, math.Inf(1))
	if scale == 0 {
		scale = 1
	}
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			if d := math.Abs(got.At(i, j) - want.At(i, j)); d > tol*scale {
				t.Errorf("%s: ∂q%d/∂T%d = %.10g, finite difference %.10g", name, i, j, got.At(i, j), want.At(i, j))
			}
		}
	}
}

// checkConserves verifies that a link takes from its nodes exactly what it
// gives them.
func checkConserves(t *testing.T, name string, el Element, temps []float64) {
	t.Helper()
	r := stampAt(el, testEnv, temps)
	sum, mag := 0.0, 0.0
	for _, q := range r.q {
		sum += q
		mag += math.Abs(q)
	}
	if math.Abs(sum) > 1e-12*math.Max(mag, 1) {
		t.Errorf("%s: heat flows sum to %g W, want 0", name, sum)
	}
}
