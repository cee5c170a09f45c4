package sparse

import (
	"errors"
	"math/rand/v2"
	"testing"
)

// Multigrid-preconditioned solvers against the dense solution, and the
// property that makes multigrid worth having: an iteration count that does
// not grow with the grid (here: at most 25 iterations on every grid, where
// IC(0) needs ever more; 40 on the random networks with conductances over
// six decades).
func TestAMGAgainstDense(t *testing.T) {
	rng := rand.New(rand.NewPCG(41, 42))
	cases := map[string]*Matrix{
		"grid2D 40×40":   grid2D(40, 40, rng),
		"grid2D 150×150": grid2D(150, 150, rng),
		"grid3D 12³":     grid3D(12, 12, 12, rng),
		"network 900":    network(900, rng, false),
		"streams 900":    network(900, rng, true),
		"grid2D 3×3":     grid2D(3, 3, rng),
		"grid3D 2×2×90":  grid3D(2, 2, 90, rng),
	}
	for name, a := range cases {
		amg := &AMG{MaxCoarse: 50}
		var s Iterative
		if IsSymmetric(a, 1e-12) {
			s = &CG{iterBase{Precond: amg}}
		} else {
			s = &BiCGStab{iterBase{Precond: amg}}
		}
		if err := s.Factorize(a); err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		b := randVec(a.N, rng)
		x := make([]float64, a.N)
		if err := s.Solve(x, b); err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		it, res := s.Stats()
		if got := relResidual(a, x, b); got > DefaultTol {
			t.Errorf("%s: residual %.3g", name, got)
		}
		if a.N <= 2000 {
			if e := relErr(x, denseSolve(t, a, b, false)); e > 1e-6 {
				t.Errorf("%s: error %.3g against gonum dense LU", name, e)
			}
		}
		limit := 25
		if a.N == 900 {
			limit = 40
		}
		if it > limit {
			t.Errorf("%s: %d iterations, want ≤ %d", name, it, limit)
		}
		t.Logf("%s: levels %v, %d iterations, residual %.2g", name, amg.Levels(), it, res)
	}
}

// Reusing the aggregates for new values of the same pattern gives the
// same hierarchy sizes and still converges.
func TestAMGReuse(t *testing.T) {
	rng := rand.New(rand.NewPCG(43, 44))
	a := grid2D(30, 30, rng)
	amg := &AMG{ReuseAggregates: true, MaxCoarse: 20}
	s := &CG{iterBase{Precond: amg}}
	if err := s.Factorize(a); err != nil {
		t.Fatal(err)
	}
	first := amg.Levels()
	agg := amg.levels[0].agg
	a = grid2D(30, 30, rng) // new values, same pattern
	if err := s.Factorize(a); err != nil {
		t.Fatal(err)
	}
	if &amg.levels[0].agg[0] != &agg[0] {
		t.Error("the aggregates were rebuilt")
	}
	if got := amg.Levels(); len(got) != len(first) || got[1] != first[1] {
		t.Errorf("levels %v, first %v", got, first)
	}
	b := randVec(a.N, rng)
	x := make([]float64, a.N)
	if err := s.Solve(x, b); err != nil {
		t.Fatal(err)
	}
	if e := relErr(x, denseSolve(t, a, b, false)); e > 1e-6 {
		t.Errorf("error %.3g", e)
	}
}

func TestAMGSingular(t *testing.T) {
	a := grid2D(30, 30, rand.New(rand.NewPCG(45, 46)))
	i := 77
	for k := a.RowPtr[i]; k < a.RowPtr[i+1]; k++ {
		a.Val[k] = 0
	}
	s := &CG{iterBase{Precond: &AMG{}}}
	if err := s.Factorize(a); !errors.Is(err, ErrSingular) {
		t.Errorf("error %v, want ErrSingular", err)
	}
}

// A lagging hierarchy: after new values (the diagonal made several times
// stronger, as radiation does when a board heats up) CG still solves the
// new matrix to its tolerance with the old coarse levels, or with new
// ones when it judged the old too slow; Renew forces a new hierarchy.
func TestAMGLag(t *testing.T) {
	rng := rand.New(rand.NewPCG(45, 46))
	a := grid2D(30, 30, rng)
	amg := &AMG{ReuseAggregates: true, Lag: true, MaxCoarse: 40}
	s := &CG{iterBase{Precond: amg}}
	b := randVec(a.N, rng)
	x := make([]float64, a.N)
	for step, grow := range []float64{0, 1e-3, 0.1, 3} {
		for i := 0; i < a.N; i++ {
			a.Add(i, i, -grow*float64(i%7))
		}
		if err := s.Factorize(a); err != nil {
			t.Fatal(err)
		}
		if fresh := amg.Fresh(); fresh != (step == 0) && step < 2 {
			t.Errorf("step %d: fresh %v", step, fresh)
		}
		if err := s.Solve(x, b); err != nil {
			t.Fatalf("step %d: %v", step, err)
		}
		if got := relResidual(a, x, b); got > DefaultTol {
			t.Errorf("step %d: residual %.3g", step, got)
		}
		if e := relErr(x, denseSolve(t, a, b, false)); e > 1e-6 {
			t.Errorf("step %d: error %.3g against gonum dense LU", step, e)
		}
	}
	amg.Renew()
	if err := s.Factorize(a); err != nil || !amg.Fresh() {
		t.Fatalf("after Renew: %v, fresh %v", err, amg.Fresh())
	}
}

// On vectors long enough to be split into blocks worked on in parallel,
// a solve gives the same bits every time.
func TestParallelDeterministic(t *testing.T) {
	rng := rand.New(rand.NewPCG(47, 48))
	a := grid2D(140, 140, rng)
	if a.N < parallelRows {
		t.Fatalf("%d rows: too few to split", a.N)
	}
	b := randVec(a.N, rng)
	var first []float64
	for run := 0; run < 3; run++ {
		s := &CG{iterBase{Precond: &AMG{}}}
		if err := s.Factorize(a); err != nil {
			t.Fatal(err)
		}
		x := make([]float64, a.N)
		if err := s.Solve(x, b); err != nil {
			t.Fatal(err)
		}
		if got := relResidual(a, x, b); got > DefaultTol {
			t.Fatalf("residual %.3g", got)
		}
		if first == nil {
			first = x
			continue
		}
		for i := range x {
			if x[i] != first[i] {
				t.Fatalf("run %d differs at %d: %v against %v", run, i, x[i], first[i])
			}
		}
	}
}
