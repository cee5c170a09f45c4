package sparse

import (
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// exactCond1 is ‖A‖₁·‖A⁻¹‖₁ from gonum's dense inverse.
func exactCond1(t *testing.T, a *Matrix) float64 {
	t.Helper()
	d := dense(a)
	var inv mat.Dense
	if err := inv.Inverse(d); err != nil {
		t.Fatalf("inverse: %v", err)
	}
	return mat.Norm(d, 1) * mat.Norm(&inv, 1)
}

// Hager's estimate is a lower bound, in practice within a factor 3
// (Higham, Accuracy and Stability of Numerical Algorithms, 2nd ed., SIAM
// 2002, §15.3, from memory for the factor).
func TestConditionEstimate(t *testing.T) {
	rng := rand.New(rand.NewPCG(27, 28))
	cases := map[string]*Matrix{
		"grid2D":      grid2D(12, 10, rng),
		"grid3D":      grid3D(5, 5, 5, rng),
		"network":     network(150, rng, false),
		"streams":     network(150, rng, true),
		"single node": single(-4),
	}
	for name, a := range cases {
		exact := exactCond1(t, a)
		for sname, s := range map[string]interface {
			Solver
			TransposeSolver
		}{"lu": NewLU(), "pivotlu": NewPivotLU(), "cholesky": NewCholesky(), "auto": Auto(a)} {
			if sname == "cholesky" && !IsSymmetric(a, 1e-12) {
				continue
			}
			if err := s.Analyse(a); err != nil {
				t.Fatal(err)
			}
			if err := s.Factorize(a); err != nil {
				t.Fatal(err)
			}
			est, err := ConditionEstimate(a, s)
			if err != nil {
				t.Fatal(err)
			}
			if est > exact*(1+1e-8) || est < exact/3 {
				t.Errorf("%s, %s: estimate %.4g, exact %.4g", name, sname, est, exact)
			}
		}
	}
}

// An upwind air stream with no outlet conserves heat that cannot leave:
// the matrix is singular (its columns sum to zero), yet no pivot of its LU
// is small, as LU is not rank-revealing. The condition estimate shows it.
func TestConditionEstimateRevealsSingular(t *testing.T) {
	rng := rand.New(rand.NewPCG(29, 30))
	s := newStamp(300)
	for k := 1; k < 300; k++ {
		s.stream(k-1, k, 1+rng.Float64())
		s.conductance(k-1, k, 1e-3)
	}
	a := s.build()
	f := NewLU()
	if err := f.Factorize(a); err != nil {
		t.Skipf("the pivots revealed it: %v", err)
	}
	est, err := ConditionEstimate(a, f)
	if err != nil {
		t.Fatal(err)
	}
	if est < 1e14 {
		t.Errorf("condition estimate %.3g for a singular matrix, want ≥ 1e14", est)
	}
}

func TestConditionEstimateNeedsFactor(t *testing.T) {
	rng := rand.New(rand.NewPCG(31, 32))
	a := grid2D(10, 10, rng)
	s := Auto(a)
	s.IterativeWeight, s.DirectFloor = 1e-9, 1e-9
	s.analysed = false
	if err := s.Factorize(a); err != nil {
		t.Fatal(err)
	}
	if _, err := ConditionEstimate(a, s); err == nil {
		t.Error("an iterative Auto choice has no factor to estimate with")
	}
}
