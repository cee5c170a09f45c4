package elements

import "testing"

// A join whose node is given (NodeGiven) has no entries of its own, and
// the plate's residual and every derivative that is used stay what they
// are with the node merely marked given.
func TestPlateNodeGivenDropsEntries(t *testing.T) {
	full := smallPlate(t)
	spec := Plate{Name: full.Name, Width: full.Width, Length: full.Length, NX: full.NX, NY: full.NY,
		Layers: full.Layers, Base: full.Base, View: full.View, Joins: append([]PlateJoin(nil), full.Joins...)}
	dropped := 0
	for i := range spec.Joins {
		if spec.Joins[i].Node == 0 {
			spec.Joins[i].NodeGiven = true
			dropped += 2*len(full.joins[i].cells) + 1
		}
	}
	lean, err := NewPlate(spec)
	if err != nil {
		t.Fatal(err)
	}
	erF, evF := full.Entries()
	erL, evL := lean.Entries()
	if dropped == 0 || len(erL) != len(erF)-dropped {
		t.Fatalf("%d entries with node 0 given, %d without: want %d fewer", len(erL), len(erF), dropped)
	}
	rows := full.Rows()
	given := make([]bool, len(rows))
	node := -1
	for i, v := range rows {
		if v == 0 {
			given[i], node = true, i
		}
	}
	x := spreadTemps(22, 290, 380, 3)
	lf := NewPatternedLocal(len(rows), len(rows), len(erF), true)
	lf.Given = given
	full.Eval(&State{X: x}, lf)
	ll := NewPatternedLocal(len(rows), len(rows), len(erL), true)
	ll.Given = given
	lean.Eval(&State{X: x}, ll)
	for r := range lf.R {
		if lf.R[r] != ll.R[r] {
			t.Errorf("row %d: %g with the entries dropped, %g with them", r, ll.R[r], lf.R[r])
		}
	}
	// Sum the derivatives by position, leaving out the given node's row
	// and column.
	sum := func(er, ev []int32, j []float64) map[[2]int32]float64 {
		m := map[[2]int32]float64{}
		for k := range er {
			if int(er[k]) != node && int(ev[k]) != node {
				m[[2]int32{er[k], ev[k]}] += j[k]
			}
		}
		return m
	}
	mf, ml := sum(erF, evF, lf.J), sum(erL, evL, ll.J)
	if len(mf) != len(ml) {
		t.Fatalf("%d positions with the entries dropped, %d with them", len(ml), len(mf))
	}
	for pos, v := range mf {
		if ml[pos] != v {
			t.Errorf("position %v: %g with the entries dropped, %g with them", pos, ml[pos], v)
		}
	}
}
