package solve

import (
	"math"
	"testing"

	"github.com/heatgraph/heatgraph/sparse"
)

// directOnly is the sparse family made to factorise whatever the size.
type directOnly struct{ s *sparse.AutoSolver }

func (l *directOnly) Analyse(m *sparse.Matrix) error {
	l.s = &sparse.AutoSolver{DirectFloor: 1e300}
	return l.s.Analyse(m)
}
func (l *directOnly) Factorize(m *sparse.Matrix) error { return l.s.Factorize(m) }
func (l *directOnly) Solve(x, b []float64) error       { return l.s.Solve(x, b) }

// iterativeOnly is the sparse family made to iterate whatever the size
// (CG with multigrid for these symmetric Jacobians), for comparing it with
// the direct solvers on small meshes.
type iterativeOnly struct {
	s     *sparse.AutoSolver
	iters int
	tols  []float64 // the tolerances Newton set, in order
}

func (l *iterativeOnly) Analyse(m *sparse.Matrix) error {
	l.s = &sparse.AutoSolver{IterativeWeight: 1e-12, DirectFloor: 1e-12}
	return l.s.Analyse(m)
}
func (l *iterativeOnly) Factorize(m *sparse.Matrix) error { return l.s.Factorize(m) }
func (l *iterativeOnly) Solve(x, b []float64) error {
	err := l.s.Solve(x, b)
	it, _ := l.s.Stats()
	l.iters += it
	return err
}
func (l *iterativeOnly) SetTolerance(rel float64) {
	l.tols = append(l.tols, rel)
	l.s.SetTolerance(rel)
}

// The meshed board and block conserve energy at the solution: the heat
// their surfaces give off (convection plus radiation) equals the power of
// the components (the first law; each cell's balance is solved to 1e-9 of
// its own flows).
func TestPlateEnergyBalance(t *testing.T) {
	for _, c := range []struct{ nx, ny, nz int }{{32, 32, 1}, {10, 10, 10}} {
		p := newPlate(c.nx, c.ny, c.nz)
		r := Newton(p, p.start(), Settings{})
		if r.Reason != Converged {
			t.Fatalf("%v: %v (%v)", c, r.Reason, r.Err)
		}
		if out := p.heatOut(r.X); math.Abs(out-p.total) > 1e-8*p.total {
			t.Errorf("%v: %.12g W out, %.12g W in", c, out, p.total)
		}
		for i, v := range r.X {
			if !(v > plateAmb) {
				t.Fatalf("%v: cell %d at %.6f K, not above the ambient", c, i, v)
			}
		}
		if r.Step > DefaultStepTolerance {
			t.Errorf("%v: converged with a step of %.3g", c, r.Step)
		}
	}
}

// On meshes small enough for the direct solvers, Newton with the
// multigrid-preconditioned CG (inexact steps, a lagging hierarchy) finds
// the same temperatures as with the supernodal Cholesky factorisation, and
// both stop for the same reason.
func TestPlateIterativeMatchesDirect(t *testing.T) {
	for _, c := range []struct{ nx, ny, nz int }{{60, 60, 1}, {16, 16, 16}} {
		p := newPlate(c.nx, c.ny, c.nz)
		dl := &directOnly{}
		direct := Newton(p, p.start(), Settings{Linear: dl})
		lin := &iterativeOnly{}
		iter := Newton(p, p.start(), Settings{Linear: lin})
		if direct.Reason != Converged || iter.Reason != Converged {
			t.Fatalf("%v: direct %v (%v), iterative %v (%v)", c, direct.Reason, direct.Err, iter.Reason, iter.Err)
		}
		if dl.s.Kind() != "cholesky" || lin.s.Kind() != "cg" || lin.iters == 0 {
			t.Fatalf("%v: the solves used %q and %q (%d iterations)", c, dl.s.Kind(), lin.s.Kind(), lin.iters)
		}
		worst := 0.0
		for i := range direct.X {
			worst = math.Max(worst, math.Abs(direct.X[i]-iter.X[i]))
		}
		if worst > 1e-6 {
			t.Errorf("%v: temperatures differ by up to %.3g K", c, worst)
		}
		t.Logf("%v: Newton %d (direct) and %d (iterative, %d CG iterations), largest difference %.2g K",
			c, direct.Iterations, iter.Iterations, lin.iters, worst)
	}
}

// With an iterative linear solver, too few Newton iterations stop at the
// limit and say so, and the deciding step is solved tightly: a solve
// judged converged has a full step within the tolerance when it is solved
// again exactly.
func TestPlateIterativeStops(t *testing.T) {
	p := newPlate(40, 40, 1)
	r := Newton(p, p.start(), Settings{Linear: &iterativeOnly{}, MaxIterations: 2})
	if r.Reason != MaxIterations || r.Kinds[0].Converged {
		t.Fatalf("after 2 iterations: %v, converged kind %v", r.Reason, r.Kinds[0].Converged)
	}
	lin := &iterativeOnly{}
	r = Newton(p, p.start(), Settings{Linear: lin})
	if r.Reason != Converged {
		t.Fatalf("%v (%v)", r.Reason, r.Err)
	}
	// Loose steps far from the solution, a tight one to decide, and the
	// solver's default given back at the end.
	if n := len(lin.tols); n != r.Iterations+1 || lin.tols[0] != etaMax || lin.tols[n-2] > 1e-8 || lin.tols[n-1] != 0 {
		t.Errorf("%d iterations, tolerances %.2g", r.Iterations, lin.tols)
	}
	// The exact Newton step at the solution.
	f := make([]float64, p.Size())
	jac := p.Pattern()
	if err := p.Evaluate(r.X, f, jac, nil); err != nil {
		t.Fatal(err)
	}
	ch := sparse.NewCholesky()
	if err := ch.Analyse(jac); err != nil {
		t.Fatal(err)
	}
	if err := ch.Factorize(jac); err != nil {
		t.Fatal(err)
	}
	for i := range f {
		f[i] = -f[i]
	}
	step := make([]float64, len(f))
	if err := ch.Solve(step, f); err != nil {
		t.Fatal(err)
	}
	for i, v := range step {
		if math.Abs(v) > DefaultStepTolerance {
			t.Fatalf("cell %d: exact step %.3g K at the solution", i, v)
		}
	}
}

// A mesh large enough for the solvers to split their work between
// processors gives the same bits on every run.
func TestPlateDeterministic(t *testing.T) {
	p := newPlate(130, 130, 1)
	var first []float64
	for run := 0; run < 2; run++ {
		r := Newton(p, p.start(), Settings{Linear: &iterativeOnly{}})
		if r.Reason != Converged {
			t.Fatalf("%v (%v)", r.Reason, r.Err)
		}
		if first == nil {
			first = r.X
			continue
		}
		for i := range first {
			if first[i] != r.X[i] {
				t.Fatalf("run %d differs at cell %d: %v against %v", run, i, r.X[i], first[i])
			}
		}
	}
}

// Newton gives a solver that it made inexact its tolerance back, so that
// a transient run that goes on with the same solver solves as tightly as
// before.
func TestNewtonRestoresTolerance(t *testing.T) {
	p := newPlate(60, 60, 1)
	for _, tol := range []float64{0, 1e-9} {
		lin := &SparseAuto{}
		lin.SetTolerance(tol)
		if r := Newton(p, p.start(), Settings{Linear: lin}); r.Reason != Converged {
			t.Fatalf("%v (%v)", r.Reason, r.Err)
		}
		if got := lin.Tolerance(); got != tol {
			t.Errorf("tolerance %g after Newton, want %g", got, tol)
		}
	}
}
