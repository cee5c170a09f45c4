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
