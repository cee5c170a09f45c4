package sparse

import (
	"math/rand/v2"
	"testing"
)

func TestAMDIsPermutation(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	cases := map[string]*Matrix{
		"grid2D":   grid2D(17, 13, rng),
		"grid3D":   grid3D(6, 5, 7, rng),
		"network":  network(300, rng, true),
		"single":   NewBuilder(1).Build(),
		"diagonal": NewBuilder(50).Build(),
	}
	for name, a := range cases {
		p := AMD(a)
		if !isPermutation(p, a.N) {
			t.Errorf("%s: AMD ordering is not a permutation of 0..%d", name, a.N-1)
		}
	}
}

// The fill of a 2-D grid factor in its natural (banded) order grows as
// n^1.5, under a good ordering as n·log n: at n = 10⁴ the AMD factor must
// hold at most a quarter of the natural one's entries (measured: 0.19).
// The growth rates are those of George, Nested dissection of a regular
// finite element mesh, SIAM J. Numer. Anal. 10, 1973 (from memory); the
// quarter is our own margin.
func TestAMDFillOnGrid(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	a := grid2D(100, 100, rng)
	nat, err := AnalyseWith(a, identity(a.N))
	if err != nil {
		t.Fatal(err)
	}
	perm, fill := AMDWithFill(a)
	amd, err := AnalyseWith(a, perm)
	if err != nil {
		t.Fatal(err)
	}
	ratio := float64(amd.NNZL()) / float64(nat.NNZL())
	t.Logf("nnz(L): natural %d, AMD %d (ratio %.3f); flops natural %.3g, AMD %.3g",
		nat.NNZL(), amd.NNZL(), ratio, nat.Flops(), amd.Flops())
	if ratio > 0.25 {
		t.Errorf("AMD fill %d is %.2f of the natural order's %d, want ≤ 0.25", amd.NNZL(), ratio, nat.NNZL())
	}
	// The elimination gives the factor's size exactly.
	if int(fill.NNZL) != amd.NNZL() {
		t.Errorf("AMD fill estimate %v, symbolic count %d", fill.NNZL, amd.NNZL())
	}
	if fill.Flops != amd.Flops() {
		t.Errorf("AMD flop estimate %v, symbolic %v", fill.Flops, amd.Flops())
	}
}

// A 3-D grid gains even more from the ordering.
func TestAMDFillOn3DGrid(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	a := grid3D(14, 14, 14, rng)
	nat, _ := AnalyseWith(a, identity(a.N))
	amd, _ := Analyse(a)
	ratio := float64(amd.NNZL()) / float64(nat.NNZL())
	t.Logf("3-D nnz(L): natural %d, AMD %d (ratio %.3f)", nat.NNZL(), amd.NNZL(), ratio)
	if ratio > 0.5 {
		t.Errorf("AMD fill ratio %.2f on a 14³ grid, want ≤ 0.5", ratio)
	}
}

// A node linked to every other (a dense row) is set aside and ordered
// last; without that, the star's hub eliminated first would fill the
// whole matrix.
func TestAMDDenseRow(t *testing.T) {
	n := 400
	s := newStamp(n)
	for i := 1; i < n; i++ {
		s.conductance(0, i, 1)
		if i+1 < n {
			s.conductance(i, i+1, 1)
		}
	}
	a := s.build()
	p := AMD(a)
	if !isPermutation(p, n) {
		t.Fatal("not a permutation")
	}
	if p[n-1] != 0 {
		t.Errorf("hub ordered at %d, want last", invPerm(p)[0])
	}
	sym, _ := AnalyseWith(a, p)
	if sym.NNZL() > 3*n {
		t.Errorf("nnz(L) = %d for a chain plus hub, want ≤ %d", sym.NNZL(), 3*n)
	}
}

func TestAnalyseRejectsBadOrdering(t *testing.T) {
	a := grid2D(3, 3, rand.New(rand.NewPCG(1, 1)))
	if _, err := AnalyseWith(a, []int{0, 1, 2, 3, 4, 5, 6, 7, 7}); err == nil {
		t.Error("a repeated index must be rejected")
	}
	if _, err := AnalyseWith(a, []int{0, 1}); err == nil {
		t.Error("a short ordering must be rejected")
	}
}
