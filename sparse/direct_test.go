package sparse

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"
)

func symmetricCases(rng *rand.Rand) map[string]*Matrix {
	return map[string]*Matrix{
		"grid2D 20×15":  grid2D(20, 15, rng),
		"grid3D 7×6×5":  grid3D(7, 6, 5, rng),
		"network 10":    network(10, rng, false),
		"network 200":   network(200, rng, false),
		"network 500":   network(500, rng, false),
		"single node":   single(-3),
		"grid2D 1×40":   grid2D(1, 40, rng),
		"grid3D 3×3×30": grid3D(3, 3, 30, rng),
	}
}

func single(v float64) *Matrix {
	a := NewBuilder(1).Build()
	a.Val[0] = v
	return a
}

func TestCholeskyAgainstDense(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	for name, a := range symmetricCases(rng) {
		c := NewCholesky()
		if err := c.Analyse(a); err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		if err := c.Factorize(a); err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		// Every column was filled exactly to its count.
		for j := 0; j < a.N; j++ {
			if c.next[j] != c.sym.colPtr[j+1] {
				t.Fatalf("%s: column %d holds %d entries, count %d", name, j,
					c.next[j]-c.sym.colPtr[j], c.sym.colPtr[j+1]-c.sym.colPtr[j])
			}
		}
		for try := 0; try < 2; try++ {
			b := randVec(a.N, rng)
			x := make([]float64, a.N)
			if err := c.Solve(x, b); err != nil {
				t.Fatalf("%s: %v", name, err)
			}
			if e := relErr(x, denseSolve(t, a, b, false)); e > 1e-9 {
				t.Errorf("%s: relative error %.3g against gonum dense LU", name, e)
			}
		}
	}
}

func TestLUAgainstDense(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 10))
	cases := symmetricCases(rng)
	cases["streams 10"] = network(10, rng, true)
	cases["streams 300"] = network(300, rng, true)
	cases["streams 800"] = network(800, rng, true)
	for name, a := range cases {
		f := NewLU()
		if err := f.Analyse(a); err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		if err := f.Factorize(a); err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		if f.Fallbacks != 0 {
			t.Errorf("%s: a dominant matrix needed partial pivoting", name)
		}
		b := randVec(a.N, rng)
		x := make([]float64, a.N)
		if err := f.Solve(x, b); err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		if e := relErr(x, denseSolve(t, a, b, false)); e > 1e-9 {
			t.Errorf("%s: relative error %.3g against gonum dense LU", name, e)
		}
		if err := f.SolveTranspose(x, b); err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		if e := relErr(x, denseSolve(t, a, b, true)); e > 1e-9 {
			t.Errorf("%s: transposed: relative error %.3g against gonum dense LU", name, e)
		}
	}
}

// Matrices that the diagonal cannot pivot: zero diagonal entries, or
// random values with no dominance. LU must fall back to partial pivoting
// and still agree with the dense solution; PivotLU alone must too.
func TestLUFallbackAndPivotLU(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	fallbacks := 0
	for trial := 0; trial < 20; trial++ {
		n := 5 + rng.IntN(120)
		a := network(n, rng, trial%2 == 0)
		for k := range a.Val {
			a.Val[k] = rng.NormFloat64()
		}
		// Zero a few diagonal entries.
		for k := 0; k < 1+n/10; k++ {
			i := rng.IntN(n)
			a.Val[a.Index(i, i)] = 0
		}
		b := randVec(n, rng)
		want := denseSolve(t, a, b, false)
		wantT := denseSolve(t, a, b, true)
		for _, s := range []interface {
			Solver
			TransposeSolver
		}{NewLU(), NewPivotLU()} {
			if err := s.Analyse(a); err != nil {
				t.Fatal(err)
			}
			if err := s.Factorize(a); err != nil {
				t.Fatalf("trial %d (%T): %v", trial, s, err)
			}
			x := make([]float64, n)
			if err := s.Solve(x, b); err != nil {
				t.Fatal(err)
			}
			// Random matrices can be ill-conditioned: compare residuals.
			if e := relResidual(a, x, b); e > 1e-8 {
				t.Errorf("trial %d (%T): residual %.3g (dense solution differs by %.3g)", trial, s, e, relErr(x, want))
			}
			if err := s.SolveTranspose(x, b); err != nil {
				t.Fatal(err)
			}
			if e := relErr(x, wantT); e > 1e-6 {
				t.Errorf("trial %d (%T): transposed error %.3g", trial, s, e)
			}
			if lu, ok := s.(*LU); ok {
				fallbacks += lu.Fallbacks
			}
		}
	}
	// Most such matrices defeat the static pivots.
	if fallbacks < 10 {
		t.Errorf("%d of 20 trials fell back to partial pivoting, want most", fallbacks)
	}
}

// A node whose every link has zero slope (natural convection at zero
// temperature difference) leaves a zero row; a network with no path to a
// fixed temperature is singular too (its rows sum to zero).
func TestSingular(t *testing.T) {
	rng := rand.New(rand.NewPCG(13, 14))
	zeroRow := grid2D(8, 8, rng)
	for k := zeroRow.RowPtr[20]; k < zeroRow.RowPtr[21]; k++ {
		j := zeroRow.Col[k]
		zeroRow.Val[k] = 0
		zeroRow.Val[zeroRow.Index(j, 20)] = 0
		if j != 20 {
			// Keep the neighbours' rows balanced.
			zeroRow.Val[zeroRow.Index(j, j)] = 0
			for q := zeroRow.RowPtr[j]; q < zeroRow.RowPtr[j+1]; q++ {
				if c := zeroRow.Col[q]; c != j {
					zeroRow.Val[zeroRow.Index(j, j)] -= zeroRow.Val[q]
				}
			}
		}
	}
	s := newStamp(400)
	for i := 0; i < 20; i++ {
		for j := 0; j < 20; j++ {
			if i+1 < 20 {
				s.conductance(i+20*j, i+1+20*j, 0.5+rng.Float64())
			}
			if j+1 < 20 {
				s.conductance(i+20*j, i+20*(j+1), 0.5+rng.Float64())
			}
		}
	}
	floating := s.build()
	for name, a := range map[string]*Matrix{"zero row": zeroRow, "floating": floating} {
		solvers := map[string]Solver{"lu": NewLU(), "pivotlu": NewPivotLU(), "auto": Auto(a)}
		if IsSymmetric(a, 1e-12) {
			solvers["cholesky"] = NewCholesky()
		}
		for sname, sv := range solvers {
			if err := sv.Analyse(a); err != nil {
				t.Fatal(err)
			}
			err := sv.Factorize(a)
			if !errors.Is(err, ErrSingular) {
				t.Errorf("%s, %s: error %v, want ErrSingular", name, sname, err)
			} else {
				t.Logf("%s, %s: %v", name, sname, err)
			}
			x := make([]float64, a.N)
			if err := sv.Solve(x, x); err == nil {
				t.Errorf("%s, %s: Solve after a failed Factorize must fail", name, sname)
			}
		}
	}
}

func TestCholeskyNotDefinite(t *testing.T) {
	rng := rand.New(rand.NewPCG(15, 16))
	a := grid2D(6, 6, rng)
	for k := range a.Val {
		a.Val[k] = -a.Val[k] // positive definite: the wrong sign for Cholesky
	}
	c := NewCholesky()
	if err := c.Factorize(a); !errors.Is(err, ErrNotDefinite) {
		t.Errorf("error %v, want ErrNotDefinite", err)
	}
	// Auto factorises a positive definite matrix (a time step's) by the
	// supernodal Cholesky of A itself.
	s := Auto(a)
	if err := s.Factorize(a); err != nil {
		t.Fatal(err)
	}
	if s.Kind() != "cholesky" {
		t.Errorf("positive definite: Auto chose %q, want cholesky", s.Kind())
	}
	// A symmetric indefinite matrix with a negative diagonal (couplings
	// three times too strong): Auto falls back to LU, which solves it.
	for i := 0; i < a.N; i++ {
		for k := a.RowPtr[i]; k < a.RowPtr[i+1]; k++ {
			if a.Col[k] == i {
				a.Val[k] = -a.Val[k]
			} else {
				a.Val[k] *= 3
			}
		}
	}
	s = Auto(a)
	if err := s.Factorize(a); err != nil {
		t.Fatal(err)
	}
	if s.Kind() != "lu" {
		t.Errorf("Auto chose %q, want lu", s.Kind())
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

// Factorize copies: changing a afterwards leaves the solution of the
// factorised values; a new Factorize picks up the new values.
func TestFactorizeCopies(t *testing.T) {
	rng := rand.New(rand.NewPCG(17, 18))
	a := network(150, rng, false)
	b := randVec(a.N, rng)
	want := denseSolve(t, a, b, false)
	for name, s := range map[string]Solver{"cholesky": NewCholesky(), "lu": NewLU(), "pivotlu": NewPivotLU(), "cg": NewCG(), "bicgstab": NewBiCGStab()} {
		c := a.Clone()
		if err := s.Analyse(c); err != nil {
			t.Fatal(err)
		}
		if err := s.Factorize(c); err != nil {
			t.Fatal(err)
		}
		for k := range c.Val {
			c.Val[k] *= 3
		}
		x := make([]float64, a.N)
		if err := s.Solve(x, b); err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		if e := relErr(x, want); e > 1e-6 {
			t.Errorf("%s: solution moved with the caller's values: error %.3g", name, e)
		}
		if err := s.Factorize(c); err != nil {
			t.Fatal(err)
		}
		if err := s.Solve(x, b); err != nil {
			t.Fatal(err)
		}
		if e := relErr(x, want); e < 0.5 || e > 0.7 { // x scales by 1/3
			t.Errorf("%s: refactorised solution off: relative change %.3g, want 2/3", name, e)
		}
	}
}

func TestPatternMismatch(t *testing.T) {
	rng := rand.New(rand.NewPCG(19, 20))
	a := grid2D(5, 5, rng)
	other := grid2D(5, 6, rng)
	for name, s := range map[string]Solver{"cholesky": NewCholesky(), "lu": NewLU(), "cg": NewCG()} {
		s.Analyse(a)
		if err := s.Factorize(other); !errors.Is(err, ErrPattern) {
			t.Errorf("%s: error %v, want ErrPattern", name, err)
		}
	}
}

// An empty system (a network whose every node is fixed) solves trivially.
func TestEmptyMatrix(t *testing.T) {
	a := NewBuilder(0).Build()
	for name, s := range map[string]Solver{
		"cholesky": NewCholesky(), "lu": NewLU(), "pivotlu": NewPivotLU(),
		"cg": NewCG(), "bicgstab": NewBiCGStab(), "amg": &CG{iterBase{Precond: &AMG{}}}, "auto": Auto(a),
	} {
		if err := s.Analyse(a); err != nil {
			t.Errorf("%s: Analyse: %v", name, err)
		}
		if err := s.Factorize(a); err != nil {
			t.Errorf("%s: Factorize: %v", name, err)
		}
		if err := s.Solve(nil, nil); err != nil {
			t.Errorf("%s: Solve: %v", name, err)
		}
	}
}

func TestNonFinite(t *testing.T) {
	a := grid2D(4, 4, rand.New(rand.NewPCG(47, 48)))
	a.Val[5] = math.NaN()
	for name, s := range map[string]Solver{"cholesky": NewCholesky(), "lu": NewLU(), "pivotlu": NewPivotLU(), "cg": NewCG(), "auto": Auto(a)} {
		if err := s.Factorize(a); err == nil {
			t.Errorf("%s: a NaN entry must be an error", name)
		}
	}
}
