package sparse

import (
	"math/rand/v2"
	"testing"
)

// The 4-byte form of a matrix holds the same entries, finds them where
// the Matrix does, multiplies the same to the last bit, and is made once
// per pattern.
func TestNarrowingKeepsTheMatrix(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	for name, a := range map[string]*Matrix{
		"grid2D 40×40": grid2D(40, 40, rng),
		"network 300":  network(300, rng, false),
	} {
		var nw narrowing
		o, err := nw.op(a)
		if err != nil {
			t.Fatal(err)
		}
		for i := 0; i < a.N; i++ {
			for j := 0; j < a.N; j += 7 {
				if o.Index(i, j) != a.Index(i, j) || o.At(i, j) != a.At(i, j) {
					t.Fatalf("%s: entry (%d, %d) at %d = %g, Matrix %d = %g", name, i, j, o.Index(i, j), o.At(i, j), a.Index(i, j), a.At(i, j))
				}
			}
		}
		x := randVec(a.N, rng)
		want, got := make([]float64, a.N), make([]float64, a.N)
		a.MulVec(want, x)
		o.MulVec(got, x)
		for i := range want {
			if got[i] != want[i] {
				t.Fatalf("%s: row %d of the product %g, Matrix %g", name, i, got[i], want[i])
			}
		}
		w := o.matrix()
		for k := range a.Col {
			if w.Col[k] != a.Col[k] || w.Val[k] != a.Val[k] {
				t.Fatalf("%s: entry %d widened to (%d, %g), was (%d, %g)", name, k, w.Col[k], w.Val[k], a.Col[k], a.Val[k])
			}
		}
		b := &Matrix{N: a.N, RowPtr: a.RowPtr, Col: a.Col, Val: make([]float64, len(a.Val))}
		o2, err := nw.op(b)
		if err != nil {
			t.Fatal(err)
		}
		if &o2.Col[0] != &o.Col[0] || &o2.Val[0] != &b.Val[0] {
			t.Errorf("%s: new values of the same pattern made new indices, or copied the values", name)
		}
		c := &Matrix{N: a.N, RowPtr: a.RowPtr, Col: append([]int(nil), a.Col...), Val: a.Val}
		c.Col[0] = a.Col[0] // same columns, another pattern slice
		o3, err := nw.op(c)
		if err != nil {
			t.Fatal(err)
		}
		if o3.Index(0, a.Col[0]) != 0 {
			t.Errorf("%s: a new pattern was not read", name)
		}
		if &o3.Col[0] == &o.Col[0] {
			t.Errorf("%s: a new pattern was written over the old one's indices, which the multigrid hierarchy knows its pattern by", name)
		}
	}
}
