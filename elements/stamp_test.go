package elements

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/diff/fd"
	"gonum.org/v1/gonum/mat"
)

// recorder keeps the flow into each equation and a dense Jacobian, for
// tests: an element's Local scattered into vectors over all variables.
type recorder struct {
	q   []float64
	jac *mat.Dense
}

// stampAt evaluates el at the variables x (numbered 0..len(x)-1).
func stampAt(el Element, env *Env, x []float64) *recorder {
	n := len(x)
	r := &recorder{q: make([]float64, n), jac: mat.NewDense(n, n, nil)}
	rows, vars := el.Rows(), el.Vars()
	if p, ok := el.(Patterned); ok {
		er, ev := p.Entries()
		l := NewPatternedLocal(len(rows), len(vars), len(er), true)
		el.Eval(&State{X: x, Env: env}, l)
		for a, i := range rows {
			r.q[i] += l.R[a]
		}
		for k := range er {
			i, j := rows[er[k]], vars[ev[k]]
			r.jac.Set(i, j, r.jac.At(i, j)+l.J[k])
		}
		return r
	}
	l := NewLocal(len(rows), len(vars), true)
	el.Eval(&State{X: x, Env: env}, l)
	for a, i := range rows {
		r.q[i] += l.R[a]
		for b, j := range vars {
			r.jac.Set(i, j, r.jac.At(i, j)+l.J[a*len(vars)+b])
		}
	}
	return r
}

var testEnv = &Env{Pressure: 101325, Gravity: StandardGravity}

// checkJacobian compares the stamped Jacobian of el with a central finite
// difference of its stamped flows (gonum diff/fd), entry by entry, at the
// variables x. Each variable is differenced relative to its own size (so a
// mass flow of grams per second and a temperature of hundreds of kelvin are
// both stepped sensibly). The tolerance is relative to the largest entry of
// each column.
func checkJacobian(t *testing.T, name string, el Element, x []float64, tol float64) {
	t.Helper()
	checkJacobianIn(t, name, testEnv, el, x, tol)
}

// checkJacobianIn is checkJacobian in the environment env.
func checkJacobianIn(t *testing.T, name string, env *Env, el Element, x []float64, tol float64) {
	t.Helper()
	n := len(x)
	got := stampAt(el, env, x).jac
	sc := make([]float64, n)
	y0 := make([]float64, n)
	for j, v := range x {
		sc[j] = math.Max(math.Abs(v), 1e-12)
		y0[j] = v / sc[j]
	}
	want := mat.NewDense(n, n, nil)
	xs := make([]float64, n)
	fd.Jacobian(want, func(q, y []float64) {
		for j := range y {
			xs[j] = y[j] * sc[j]
		}
		copy(q, stampAt(el, env, xs).q)
	}, y0, &fd.JacobianSettings{Formula: fd.Central, Step: 1e-6})
	for j := 0; j < n; j++ {
		col := 0.0
		for i := 0; i < n; i++ {
			want.Set(i, j, want.At(i, j)/sc[j])
			col = math.Max(col, math.Abs(want.At(i, j)))
		}
		if col == 0 {
			col = 1
		}
		for i := 0; i < n; i++ {
			if d := math.Abs(got.At(i, j) - want.At(i, j)); d > tol*col {
				t.Errorf("%s: ∂q%d/∂x%d = %.10g, finite difference %.10g", name, i, j, got.At(i, j), want.At(i, j))
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
