package sparse

import (
	"errors"
	"math/rand/v2"
	"testing"
)

func TestIterativeAgainstDense(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 22))
	sym := map[string]*Matrix{
		"grid2D 30×30":  grid2D(30, 30, rng),
		"grid3D 9×9×9":  grid3D(9, 9, 9, rng),
		"network 400":   network(400, rng, false),
		"single node":   single(-2),
		"grid2D 1×50":   grid2D(1, 50, rng),
		"grid3D 2×3×40": grid3D(2, 3, 40, rng),
	}
	unsym := map[string]*Matrix{
		"streams 400": network(400, rng, true),
		"streams 50":  network(50, rng, true),
	}
	for name, a := range sym {
		unsym[name] = a
	}
	type mk func() Iterative
	run := func(solvers map[string]mk, cases map[string]*Matrix) {
		for name, a := range cases {
			for sname, newSolver := range solvers {
				s := newSolver()
				s.SetTolerance(1e-11)
				if err := s.Analyse(a); err != nil {
					t.Fatal(err)
				}
				if err := s.Factorize(a); err != nil {
					t.Fatalf("%s, %s: %v", name, sname, err)
				}
				b := randVec(a.N, rng)
				x := make([]float64, a.N)
				if err := s.Solve(x, b); err != nil {
					t.Fatalf("%s, %s: %v", name, sname, err)
				}
				it, res := s.Stats()
				if got := relResidual(a, x, b); got > 1e-11 || got > res*1.01+1e-16 {
					t.Errorf("%s, %s: true residual %.3g, reported %.3g, tolerance 1e-11", name, sname, got, res)
				}
				want := denseSolve(t, a, b, false)
				if e := relErr(x, want); e > 1e-6 {
					t.Errorf("%s, %s: error %.3g against gonum dense LU", name, sname, e)
				}
				t.Logf("%s, %s: %d iterations, residual %.2g", name, sname, it, res)
			}
		}
	}
	run(map[string]mk{
		"cg ic0":    func() Iterative { return NewCG() },
		"cg jacobi": func() Iterative { return &CG{iterBase{Precond: &Jacobi{}}} },
	}, sym)
	run(map[string]mk{
		"bicgstab ilu0":   func() Iterative { return NewBiCGStab() },
		"bicgstab jacobi": func() Iterative { return &BiCGStab{iterBase{Precond: &Jacobi{}}} },
	}, unsym)
}

// Not reaching the tolerance is an error, never a silent return.
func TestIterativeLimit(t *testing.T) {
	rng := rand.New(rand.NewPCG(23, 24))
	a := grid2D(40, 40, rng)
	au := network(600, rng, true)
	for name, s := range map[string]Iterative{
		"cg":       &CG{iterBase{MaxIter: 3, Precond: &Jacobi{}}},
		"bicgstab": &BiCGStab{iterBase{MaxIter: 2, Precond: &Jacobi{}}},
	} {
		m := a
		if name == "bicgstab" {
			m = au
		}
		if err := s.Factorize(m); err != nil {
			t.Fatal(err)
		}
		x := make([]float64, m.N)
		err := s.Solve(x, randVec(m.N, rng))
		if !errors.Is(err, ErrNotConverged) {
			t.Errorf("%s: error %v, want ErrNotConverged", name, err)
		}
		if it, res := s.Stats(); it == 0 || res <= DefaultTol {
			t.Errorf("%s: stats %d iterations, residual %.3g", name, it, res)
		}
	}
}

// A warm start from a good guess takes fewer iterations; from the exact
// solution, none. A loose tolerance (inexact Newton) takes fewer too.
func TestIterativeWarmStartAndTolerance(t *testing.T) {
	rng := rand.New(rand.NewPCG(25, 26))
	a := grid2D(50, 50, rng)
	b := randVec(a.N, rng)
	s := NewCG()
	if err := s.Factorize(a); err != nil {
		t.Fatal(err)
	}
	x := make([]float64, a.N)
	if err := s.Solve(x, b); err != nil {
		t.Fatal(err)
	}
	cold, _ := s.Stats()
	s.SetTolerance(1e-3)
	y := make([]float64, a.N)
	if err := s.Solve(y, b); err != nil {
		t.Fatal(err)
	}
	loose, res := s.Stats()
	if loose >= cold || res > 1e-3 {
		t.Errorf("tolerance 1e-3: %d iterations (residual %.2g), default: %d", loose, res, cold)
	}
	s.SetTolerance(0) // back to the default
	s.SetWarmStart(true)
	if err := s.Solve(y, b); err != nil { // from the loose solution
		t.Fatal(err)
	}
	warm, _ := s.Stats()
	if warm >= cold {
		t.Errorf("warm start: %d iterations, cold %d", warm, cold)
	}
	if err := s.Solve(x, b); err != nil { // from the solution
		t.Fatal(err)
	}
	if it, _ := s.Stats(); it != 0 {
		t.Errorf("started at the solution: %d iterations, want 0", it)
	}
	t.Logf("iterations: cold %d, loose %d, warm %d", cold, loose, warm)
}

func TestIterativeSingularPreconditioner(t *testing.T) {
	a := NewBuilder(3).Build()
	a.Val[0], a.Val[2] = -1, -1 // middle row zero
	for name, s := range map[string]Solver{"cg": NewCG(), "bicgstab": NewBiCGStab(), "jacobi": &CG{iterBase{Precond: &Jacobi{}}}} {
		if err := s.Factorize(a); !errors.Is(err, ErrSingular) {
			t.Errorf("%s: error %v, want ErrSingular", name, err)
		}
	}
}

// CG solves a positive definite system as well as a negative definite one
// (the matrix of a time step, capacity over the step less the Jacobian, is
// positive definite): with multigrid or IC(0), to the tolerance, in the
// same iterations as for −A, and Auto keeps CG for it instead of falling
// back to BiCGStab.
func TestCGEitherSign(t *testing.T) {
	rng := rand.New(rand.NewPCG(51, 52))
	neg := grid2D(150, 150, rng) // a conduction Jacobian: negative definite
	pos := &Matrix{N: neg.N, RowPtr: neg.RowPtr, Col: neg.Col, Val: make([]float64, len(neg.Val))}
	for k, v := range neg.Val {
		pos.Val[k] = -v
	}
	b := randVec(neg.N, rng)
	for _, pre := range []func() Preconditioner{func() Preconditioner { return &AMG{} }, func() Preconditioner { return &ILU0{} }} {
		iters := map[string]int{}
		for name, a := range map[string]*Matrix{"negative": neg, "positive": pos} {
			s := &CG{iterBase{Precond: pre()}}
			if err := s.Factorize(a); err != nil {
				t.Fatal(err)
			}
			x := make([]float64, a.N)
			if err := s.Solve(x, b); err != nil {
				t.Fatalf("%s definite: %v", name, err)
			}
			if r := relResidual(a, x, b); r > DefaultTol {
				t.Errorf("%s definite: residual %.3g", name, r)
			}
			iters[name], _ = s.Stats()
		}
		if iters["negative"] != iters["positive"] {
			t.Errorf("%T: %d iterations for A, %d for −A", pre(), iters["positive"], iters["negative"])
		}
	}
	auto := Auto(pos)
	if err := auto.Factorize(pos); err != nil {
		t.Fatal(err)
	}
	x := make([]float64, pos.N)
	if err := auto.Solve(x, b); err != nil {
		t.Fatal(err)
	}
	if k := auto.Kind(); k != "cg" && k != "cholesky" {
		t.Errorf("Auto solved a positive definite system with %s", k)
	}
}
