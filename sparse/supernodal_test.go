package sparse

import (
	"errors"
	"math/rand/v2"
	"testing"
)

func TestSupernodalAgainstDense(t *testing.T) {
	rng := rand.New(rand.NewPCG(51, 52))
	cases := symmetricCases(rng)
	cases["grid3D 12³"] = grid3D(12, 12, 12, rng)
	for name, a := range cases {
		f := NewSupernodal()
		if err := f.Analyse(a); err != nil {
			t.Fatal(err)
		}
		if err := f.Factorize(a); err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		b := randVec(a.N, rng)
		x := make([]float64, a.N)
		if err := f.Solve(x, b); err != nil {
			t.Fatal(err)
		}
		if e := relErr(x, denseSolve(t, a, b, false)); e > 1e-9 {
			t.Errorf("%s: relative error %.3g against gonum dense LU", name, e)
		}
		t.Logf("%s: %d columns in %d supernodes", name, a.N, f.Supernodes())
	}
}

// The post-order keeps the fill of the ordering it refines, and numbers
// children before their parents.
func TestPostorderKeepsFill(t *testing.T) {
	rng := rand.New(rand.NewPCG(53, 54))
	a := grid2D(40, 40, rng)
	amd := AMD(a)
	s0, _ := AnalyseWith(a, amd)
	perm := Postorder(a, amd)
	if !isPermutation(perm, a.N) {
		t.Fatal("post-order is not a permutation")
	}
	s1, _ := AnalyseWith(a, perm)
	if s1.NNZL() != s0.NNZL() {
		t.Errorf("nnz(L) %d after post-order, %d before", s1.NNZL(), s0.NNZL())
	}
	for j, p := range s1.Parent {
		if p >= 0 && p <= j {
			t.Fatalf("parent %d of %d comes first", p, j)
		}
	}
	// Subtrees are consecutive: a node's descendants directly precede it.
	size := make([]int, a.N)
	for j := range size {
		size[j]++
		if p := s1.Parent[j]; p >= 0 {
			size[p] += size[j]
		}
	}
	for j, p := range s1.Parent {
		if p >= 0 && j < p-size[p]+1 {
			t.Fatalf("node %d lies outside the subtree range of its parent %d", j, p)
		}
	}
}

func TestSupernodalSingularAndIndefinite(t *testing.T) {
	rng := rand.New(rand.NewPCG(55, 56))
	a := grid2D(10, 10, rng)
	for k := a.RowPtr[33]; k < a.RowPtr[34]; k++ {
		a.Val[k] = 0
	}
	f := NewSupernodal()
	if err := f.Factorize(a); !errors.Is(err, ErrSingular) {
		t.Errorf("zero row: %v, want ErrSingular", err)
	}
	// Symmetric with a negative diagonal but couplings three times too
	// strong: indefinite.
	b := grid2D(10, 10, rng)
	for i := 0; i < b.N; i++ {
		for k := b.RowPtr[i]; k < b.RowPtr[i+1]; k++ {
			if b.Col[k] != i {
				b.Val[k] *= 3
			}
		}
	}
	if err := NewSupernodal().Factorize(b); !errors.Is(err, ErrNotDefinite) {
		t.Errorf("indefinite: %v, want ErrNotDefinite", err)
	}
	// Positive definite (every diagonal entry positive): factorised as A,
	// and solved.
	c := grid2D(10, 10, rng)
	for k := range c.Val {
		c.Val[k] = -c.Val[k]
	}
	p := NewSupernodal()
	if err := p.Factorize(c); err != nil {
		t.Fatalf("positive definite: %v", err)
	}
	rhs := randVec(c.N, rng)
	x := make([]float64, c.N)
	if err := p.Solve(x, rhs); err != nil {
		t.Fatal(err)
	}
	if e := relErr(x, denseSolve(t, c, rhs, false)); e > 1e-10 {
		t.Errorf("positive definite: error %.3g against gonum dense LU", e)
	}
}
