package sparse

import (
	"reflect"
	"testing"
)

func TestBuilderPattern(t *testing.T) {
	b := NewBuilder(3)
	b.Mark(0, 2)
	b.Mark(2, 0)
	b.Mark(0, 2) // duplicate
	b.Mark(1, 0)
	m := b.Build()
	if want := []int{0, 2, 4, 6}; !reflect.DeepEqual(m.RowPtr, want) {
		t.Errorf("RowPtr = %v, want %v", m.RowPtr, want)
	}
	if want := []int{0, 2, 0, 1, 0, 2}; !reflect.DeepEqual(m.Col, want) {
		t.Errorf("Col = %v, want %v", m.Col, want)
	}
	if m.NNZ() != 6 || len(m.Val) != 6 {
		t.Errorf("NNZ %d, len(Val) %d, want 6", m.NNZ(), len(m.Val))
	}
}

func TestMatrixValues(t *testing.T) {
	b := NewBuilder(2)
	b.Mark(0, 1)
	b.Mark(1, 0)
	m := b.Build()
	m.Add(0, 0, 2)
	m.Add(0, 1, -1)
	m.Add(0, 1, -1)
	m.Add(1, 0, 3)
	m.Add(1, 1, 4)
	if m.At(0, 1) != -2 || m.At(1, 1) != 4 {
		t.Errorf("At: %v", m.Val)
	}
	y := make([]float64, 2)
	m.MulVec(y, []float64{1, 2})
	if y[0] != -2 || y[1] != 11 {
		t.Errorf("MulVec = %v, want [-2 11]", y)
	}
	c := m.Clone()
	m.Zero()
	if m.At(1, 0) != 0 || c.At(1, 0) != 3 {
		t.Error("Zero must clear values and Clone must be deep")
	}
	defer func() {
		if recover() == nil {
			t.Error("adding outside the pattern must panic")
		}
	}()
	b2 := NewBuilder(2)
	b2.Build().Add(0, 1, 1)
}

func TestIndexLongRow(t *testing.T) {
	b := NewBuilder(40)
	for j := 0; j < 40; j += 2 {
		b.Mark(5, j)
	}
	m := b.Build()
	for j := 0; j < 40; j++ {
		in := j%2 == 0 || j == 5
		if got := m.Index(5, j) >= 0; got != in {
			t.Errorf("Index(5, %d) present = %v, want %v", j, got, in)
		}
	}
}

// Transpose swaps every entry's row and column and keeps rows sorted.
func TestTranspose(t *testing.T) {
	b := NewBuilder(3)
	for _, e := range [][2]int{{0, 1}, {0, 2}, {1, 0}, {2, 1}} {
		b.Mark(e[0], e[1])
	}
	m := b.Build()
	m.Add(0, 1, 2)
	m.Add(0, 2, 3)
	m.Add(1, 0, 4)
	m.Add(2, 1, 5)
	m.Add(1, 1, 6)
	tr := m.Transpose()
	for i := 0; i < 3; i++ {
		for j := 0; j < 3; j++ {
			if tr.At(i, j) != m.At(j, i) {
				t.Errorf("(%d, %d): %g, want %g", i, j, tr.At(i, j), m.At(j, i))
			}
		}
		for k := tr.RowPtr[i] + 1; k < tr.RowPtr[i+1]; k++ {
			if tr.Col[k] <= tr.Col[k-1] {
				t.Errorf("row %d not sorted: %v", i, tr.Col[tr.RowPtr[i]:tr.RowPtr[i+1]])
			}
		}
	}
}
