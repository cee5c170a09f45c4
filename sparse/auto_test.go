package sparse

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"
)

func TestAutoChoice(t *testing.T) {
	rng := rand.New(rand.NewPCG(33, 34))
	sym := grid3D(8, 8, 8, rng)
	unsym := network(500, rng, true)
	for _, c := range []struct {
		name  string
		a     *Matrix
		limit float64
		want  string
	}{
		{"symmetric", sym, 0, "cholesky"},
		{"unsymmetric", unsym, 0, "lu"},
		{"symmetric, large", sym, 1e-9, "cg"},
		{"unsymmetric, large", unsym, 1e-9, "bicgstab"},
	} {
		s := &AutoSolver{IterativeWeight: c.limit, DirectFloor: c.limit}
		if err := s.Analyse(c.a); err != nil {
			t.Fatal(err)
		}
		if err := s.Factorize(c.a); err != nil {
			t.Fatal(err)
		}
		if s.Kind() != c.want {
			t.Errorf("%s: chose %q, want %q", c.name, s.Kind(), c.want)
		}
		b := randVec(c.a.N, rng)
		x := make([]float64, c.a.N)
		if err := s.Solve(x, b); err != nil {
			t.Fatal(err)
		}
		if e := relErr(x, denseSolve(t, c.a, b, false)); e > 1e-7 {
			t.Errorf("%s: error %.3g", c.name, e)
		}
		it, res := s.Stats()
		if (it > 0) != (c.want == "cg" || c.want == "bicgstab") || res > DefaultTol {
			t.Errorf("%s: stats %d iterations, residual %.3g", c.name, it, res)
		}
	}
}

// The values decide between Cholesky and LU at every Factorize: a stream
// appearing in a network switches to LU on the same analysis.
func TestAutoFollowsValues(t *testing.T) {
	rng := rand.New(rand.NewPCG(35, 36))
	st := newStamp(60)
	for k := 1; k < 60; k++ {
		st.conductance(k-1, k, 1+rng.Float64())
		st.stream(k-1, k, 0) // a stream with no flow yet
	}
	st.ground(0, 1)
	st.ground(59, 1)
	a := st.build()
	s := Auto(a)
	if err := s.Factorize(a); err != nil || s.Kind() != "cholesky" {
		t.Fatalf("no flow: %v, chose %q", err, s.Kind())
	}
	for k := 1; k < 60; k++ {
		a.Add(k-1, k-1, -0.5)
		a.Add(k, k-1, 0.5)
	}
	a.Add(59, 59, -0.5) // the outlet
	if err := s.Factorize(a); err != nil || s.Kind() != "lu" {
		t.Fatalf("with flow: %v, chose %q", err, s.Kind())
	}
	b := randVec(a.N, rng)
	x := make([]float64, a.N)
	if err := s.Solve(x, b); err != nil {
		t.Fatal(err)
	}
	if e := relErr(x, denseSolve(t, a, b, false)); e > 1e-10 {
		t.Errorf("error %.3g", e)
	}
}

// The rule picks direct for the 2-D grid and iterative for the 3-D grid of
// the same size, as the benchmarks measured.
func TestAutoRule(t *testing.T) {
	rng := rand.New(rand.NewPCG(39, 40))
	for _, c := range []struct {
		name   string
		a      *Matrix
		direct bool
	}{
		{"2D 100×100", grid2D(100, 100, rng), true},
		{"3D 22³", grid3D(22, 22, 22, rng), false},
		{"network 2000", network(2000, rng, false), true},
	} {
		s := Auto(c.a)
		d, w := s.Work()
		if s.direct != c.direct {
			t.Errorf("%s: direct %v (factor %.3g, iterative %.3g), want %v", c.name, s.direct, d, w, c.direct)
		}
	}
	// Above the order limit it iterates without ordering.
	a := grid2D(30, 30, rng)
	s := &AutoSolver{OrderLimit: 500}
	if err := s.Analyse(a); err != nil {
		t.Fatal(err)
	}
	if d, _ := s.Work(); s.direct || !math.IsNaN(d) {
		t.Errorf("900 unknowns above a limit of 500: direct %v, factor work %v", s.direct, d)
	}
	if err := s.Factorize(a); err != nil || s.Kind() != "cg" {
		t.Errorf("above the limit: %v, chose %q", err, s.Kind())
	}
}

// Where air streams dominate, the iterative path preconditions by ILU(0);
// where conduction does, by multigrid.
func TestAutoAdvection(t *testing.T) {
	for _, c := range []struct {
		mc   float64
		want string
	}{{0.5, "*sparse.AMG"}, {100, "*sparse.ILU0"}} {
		rng := rand.New(rand.NewPCG(49, 50))
		nx, ny := 40, 40
		a := grid2D(nx, ny, rng)
		for y := 0; y < ny; y += 2 {
			for x := 1; x < nx; x++ {
				up, down := x-1+nx*y, x+nx*y
				a.Add(up, up, -c.mc)
				a.Add(down, up, c.mc)
			}
			a.Add(nx-1+nx*y, nx-1+nx*y, -c.mc) // the outlet
		}
		s := &AutoSolver{IterativeWeight: 1e-9, DirectFloor: 1e-9}
		if err := s.Factorize(a); err != nil {
			t.Fatal(err)
		}
		if got := fmt.Sprintf("%T", s.bicg.Precond); s.Kind() != "bicgstab" || got != c.want {
			t.Errorf("ṁc %g (asymmetry %.2f): %s with %s, want bicgstab with %s", c.mc, Asymmetry(a), s.Kind(), got, c.want)
		}
		b := randVec(a.N, rng)
		x := make([]float64, a.N)
		if err := s.Solve(x, b); err != nil {
			t.Fatal(err)
		}
		if e := relErr(x, denseSolve(t, a, b, false)); e > 1e-7 {
			t.Errorf("ṁc %g: error %.3g", c.mc, e)
		}
	}
}
