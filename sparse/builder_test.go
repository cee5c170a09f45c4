package sparse

import (
	"math/rand/v2"
	"testing"
)

// BuildSlots must place every mark where Index finds its entry, on rows
// short (sorted by insertion) and long (sorted otherwise), with duplicates.
func TestBuildSlots(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	const n = 60
	b := NewBuilder(n)
	type mark struct{ i, j int }
	var marks []mark
	for range 400 {
		i, j := rng.IntN(n), rng.IntN(n)
		if i < 3 {
			j = rng.IntN(n) // rows 0..2 get long
		} else if rng.IntN(3) > 0 {
			i = 3 + rng.IntN(4) // a few rows beyond the insertion sort's reach
		}
		marks = append(marks, mark{i, j})
		b.Mark(i, j)
	}
	if b.Marks() != len(marks) {
		t.Fatalf("Marks() = %d, want %d", b.Marks(), len(marks))
	}
	m, slot := b.BuildSlots()
	if len(slot) != len(marks) {
		t.Fatalf("%d slots for %d marks", len(slot), len(marks))
	}
	for k, mk := range marks {
		if want := m.Index(mk.i, mk.j); want < 0 || int(slot[k]) != want {
			t.Errorf("mark %d (%d, %d): slot %d, Index %d", k, mk.i, mk.j, slot[k], want)
		}
	}
	for i := range n {
		if m.Index(i, i) < 0 {
			t.Errorf("diagonal %d missing", i)
		}
		for k := m.RowPtr[i] + 1; k < m.RowPtr[i+1]; k++ {
			if m.Col[k] <= m.Col[k-1] {
				t.Fatalf("row %d not strictly increasing: %v", i, m.Col[m.RowPtr[i]:m.RowPtr[i+1]])
			}
		}
	}
	// Same pattern as Build.
	b2 := NewBuilder(n)
	for _, mk := range marks {
		b2.Mark(mk.i, mk.j)
	}
	m2 := b2.Build()
	if len(m2.Col) != len(m.Col) {
		t.Fatalf("Build has %d entries, BuildSlots %d", len(m2.Col), len(m.Col))
	}
	for k := range m.Col {
		if m.Col[k] != m2.Col[k] {
			t.Fatalf("Col differs at %d", k)
		}
	}
}

// Counting the rows first gives the same matrix and slots as listing the
// marks, and miscounts are caught.
func TestBuilderCounted(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	const n = 50
	type mark struct{ i, j int }
	var marks []mark
	for range 300 {
		i := rng.IntN(n)
		if rng.IntN(4) == 0 {
			i = 7 // one long row
		}
		marks = append(marks, mark{i, rng.IntN(n)})
	}
	listed, counted := NewBuilder(n), NewBuilder(n)
	for _, mk := range marks {
		counted.Count(mk.i)
	}
	for _, mk := range marks {
		listed.Mark(mk.i, mk.j)
		counted.Mark(mk.i, mk.j)
	}
	if counted.Marks() != len(marks) {
		t.Fatalf("Marks() = %d, want %d", counted.Marks(), len(marks))
	}
	ml, sl := listed.BuildSlots()
	mc, sc := counted.BuildSlots()
	if len(ml.Col) != len(mc.Col) || len(sl) != len(sc) {
		t.Fatalf("listed: %d entries, %d slots; counted: %d, %d", len(ml.Col), len(sl), len(mc.Col), len(sc))
	}
	for i := range ml.RowPtr {
		if ml.RowPtr[i] != mc.RowPtr[i] {
			t.Fatalf("RowPtr[%d]: listed %d, counted %d", i, ml.RowPtr[i], mc.RowPtr[i])
		}
	}
	for k := range ml.Col {
		if ml.Col[k] != mc.Col[k] {
			t.Fatalf("Col[%d]: listed %d, counted %d", k, ml.Col[k], mc.Col[k])
		}
	}
	for k := range sl {
		if sl[k] != sc[k] {
			t.Fatalf("slot %d: listed %d, counted %d", k, sl[k], sc[k])
		}
	}
	// Building a listed builder again gives the same.
	if again := listed.Build(); len(again.Col) != len(ml.Col) {
		t.Errorf("second Build: %d entries, first %d", len(again.Col), len(ml.Col))
	}
	panics := func(name string, f func()) {
		t.Helper()
		defer func() {
			if recover() == nil {
				t.Errorf("%s: no panic", name)
			}
		}()
		f()
	}
	panics("a mark beyond the count", func() {
		b := NewBuilder(3)
		b.Count(1)
		b.Mark(1, 0)
		b.Mark(1, 2)
	})
	panics("a mark short of the count", func() {
		b := NewBuilder(3)
		b.Count(1)
		b.Count(2)
		b.Mark(1, 0)
		b.Build()
	})
	panics("a count after a mark", func() {
		b := NewBuilder(3)
		b.Count(1)
		b.Mark(1, 0)
		b.Count(2)
	})
}
