package study

import (
	"math"
	"math/rand/v2"
	"testing"

	"github.com/heatgraph/heatgraph/sparse"
)

// The sparse factorization that large problems take solves with the matrix
// and with its transpose as the dense one does, on an unsymmetric matrix
// of the shape a network with an air stream has.
func TestSparseFactorAgreesWithDense(t *testing.T) {
	n := 700
	rng := rand.New(rand.NewPCG(1, 2))
	b := sparse.NewBuilder(n)
	type entry struct {
		i, j int
		v    float64
	}
	var es []entry
	for i := 0; i < n; i++ {
		d := 0.0
		for _, j := range []int{i - 1, i + 1, (i * 7) % n} {
			if j < 0 || j >= n || j == i {
				continue
			}
			v := -rng.Float64()
			es = append(es, entry{i, j, v})
			d += math.Abs(v)
		}
		es = append(es, entry{i, i, d + 0.1 + rng.Float64()})
	}
	for _, e := range es {
		b.Mark(e.i, e.j)
	}
	a := b.Build()
	for _, e := range es {
		a.Add(e.i, e.j, e.v)
	}
	dn, err := factorDense(a)
	if err != nil {
		t.Fatal(err)
	}
	sp, err := factorize(a)
	if err != nil {
		t.Fatal(err)
	}
	if _, ok := sp.(*sparseLU); !ok {
		t.Fatalf("%d unknowns factorized as %T, want the sparse LU", n, sp)
	}
	rhs := make([]float64, n)
	for i := range rhs {
		rhs[i] = rng.NormFloat64()
	}
	for _, trans := range []bool{false, true} {
		x1, err1 := dn.solve(rhs, trans)
		x2, err2 := sp.solve(rhs, trans)
		if err1 != nil || err2 != nil {
			t.Fatal(err1, err2)
		}
		for i := range x1 {
			if math.Abs(x1[i]-x2[i]) > 1e-10*(1+math.Abs(x1[i])) {
				t.Fatalf("trans %v: x[%d] dense %.15g, sparse %.15g", trans, i, x1[i], x2[i])
			}
		}
	}
}
