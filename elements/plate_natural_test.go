package elements

import (
	"math"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/elements/dual"
)

// naturalPlate is a 3 × 2 plate of two layers whose faces lose heat by
// natural convection: the top facing up and the bottom facing down to the
// air node 0, an edge as a vertical face 60 mm tall to the air node 1;
// the 18 cells from 2, a rail node 20 joined by contact, the view 21.
func naturalPlate(t *testing.T) *Plate {
	t.Helper()
	p, err := NewPlate(Plate{
		Name: "lid", Width: 0.03, Length: 0.02, NX: 3, NY: 2,
		Layers: []PlateLayer{
			{Thickness: 1e-3, KIn: 0.8, KThrough: 0.3, Cells: 1},
			{Thickness: 2e-3, KIn: 150, KThrough: 140, Cells: 2},
		},
		Base: 2, View: 21,
		Joins: []PlateJoin{
			{Name: "top", Face: Top, Node: 0, Natural: true, Orientation: FacingUp},
			{Name: "under", Face: Bottom, Region: Rect{0.004, 0.003, 0.017, 0.012}, Node: 0, Natural: true, Orientation: FacingDown},
			{Name: "edge", Face: XMax, Node: 1, Natural: true, Orientation: Vertical, Length: 0.06},
			{Name: "rail", Face: XMin, Node: 20, PerArea: 3000},
		},
	})
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// The natural-convection joins' derivatives, h's dependence on both
// temperatures included, against finite differences (gonum diff/fd), with
// cells both warmer and cooler than the air, and their heat conserved.
func TestPlateNaturalJacobian(t *testing.T) {
	p := naturalPlate(t)
	for seed := uint64(1); seed <= 3; seed++ {
		x := spreadTemps(22, 290, 360, seed)
		checkJacobian(t, "plate with natural convection", p, x, 1e-6)
		checkConserves(t, "plate with natural convection", p, x)
	}
}

// On an isothermal plate a natural-convection join carries exactly what
// the lumped natural-convection element (Natural, whose correlations are
// checked against their sources in natural_test.go) carries for the same
// surface: facing up over the whole top with L = A/P, facing down under a
// region with that region's A/P, and a vertical edge with the height given.
func TestPlateNaturalIsothermal(t *testing.T) {
	p := naturalPlate(t)
	x := make([]float64, 22)
	for c := 2; c < 20; c++ {
		x[c] = 345
	}
	x[0], x[1], x[20] = 298, 305, 330
	s := &State{X: x, Env: testEnv}
	got := p.JoinHeat(s)
	cases := []struct {
		o            Orientation
		area, length float64
		air          int
	}{
		{FacingUp, 0.03 * 0.02, 0.03 * 0.02 / (2 * (0.03 + 0.02)), 0},
		{FacingDown, 0.013 * 0.009, 0.013 * 0.009 / (2 * (0.013 + 0.009)), 0},
		{Vertical, 0.02 * 0.003, 0.06, 1},
	}
	for i, c := range cases {
		lumped, err := NewNatural(2, c.air, c.o, c.area, c.length, Fins{})
		if err != nil {
			t.Fatal(err)
		}
		want := lumped.eval(s, -1).hA.V * (x[2] - x[c.air])
		if math.Abs(got[i]-want) > 1e-12*math.Abs(want) {
			t.Errorf("%s: %.12g W, lumped element %.12g W", c.o, got[i], want)
		}
	}
	// A plate warmer than its air loses heat through every join.
	for i, q := range got[:3] {
		if !(q > 0) {
			t.Errorf("join %d carries %g W from a plate 40 K above the air", i, q)
		}
	}
}

// The report names each natural join's correlation and coefficient, and
// warns when a cell's Rayleigh number lies outside the correlation's range:
// a 200 × 150 mm lid 47 K above the air, facing up, L = A/P = 43 mm, has
// Ra = gβΔT·L³/(να) ≈ 9.81·(1/321)·47·0.043³/(1.8e-5·2.5e-5) ≈ 2.5e5
// (air properties at 321 K, Incropera et al. Table A.4), within the range
// of Lloyd & Moran; a 13 × 9 mm region underneath, L = 2.7 mm, has
// Ra ≈ 60, far below it.
func TestPlateNaturalReport(t *testing.T) {
	p, err := NewPlate(Plate{
		Name: "lid", Width: 0.2, Length: 0.15, NX: 4, NY: 3, Base: 2, View: -1,
		Layers: []PlateLayer{{Thickness: 3e-3, KIn: 200, KThrough: 200, Cells: 1}},
		Joins: []PlateJoin{
			{Name: "top", Face: Top, Node: 0, Natural: true, Orientation: FacingUp},
			{Name: "under", Face: Bottom, Region: Rect{0.05, 0.05, 0.063, 0.059}, Node: 0, Natural: true, Orientation: FacingDown},
			{Name: "rail", Face: XMin, Node: 1, PerArea: 3000},
		},
	})
	if err != nil {
		t.Fatal(err)
	}
	x := make([]float64, 14)
	for c := 2; c < 14; c++ {
		x[c] = 345
	}
	x[0], x[1] = 298, 330
	rep := p.Report(&State{X: x, Env: testEnv})
	var hTop, ra float64
	found := map[string]bool{}
	for _, d := range rep.Details {
		switch d.Name {
		case "h top":
			hTop = d.Value
			found[d.Name] = true
		case "characteristic_length top":
			ra = d.Value
			found[d.Name] = true
		case "correlation top":
			found[d.Name] = true
		}
	}
	if len(found) != 3 {
		t.Errorf("details found %v, want h, correlation and characteristic_length of top", found)
	}
	if want := 0.03 / 0.7; math.Abs(ra-want) > 1e-12 {
		t.Errorf("characteristic length %g m, want A/P = %g m", ra, want)
	}
	// By hand: Nu = 0.54·Ra^¼ (Lloyd & Moran, 1e4 ≤ Ra ≤ 1e7) = 0.54·
	// (2.5e5)^¼ = 12.1, h = Nu·k/L = 12.1·0.0277/0.0429 = 7.8 W/(m² K),
	// k of air at 321 K from Incropera et al. Table A.4; the rounded
	// properties allow 5 %.
	if math.Abs(hTop-7.8) > 0.05*7.8 {
		t.Errorf("h on top %.4g W/(m2 K), want about 7.8 by hand", hTop)
	}
	warned := false
	for _, w := range rep.Warnings {
		if strings.Contains(w, "join under") && strings.Contains(w, "Ra") {
			warned = true
		}
		if strings.Contains(w, "join top:") && strings.Contains(w, "Ra") {
			t.Errorf("warning on the top, within range: %s", w)
		}
	}
	if !warned {
		t.Errorf("no warning for the small region underneath; warnings: %q", rep.Warnings)
	}
}

// Bad natural joins are refused: a fin array, two ways at once, a
// negative length.
func TestPlateNaturalBadInput(t *testing.T) {
	base := Plate{Width: 0.03, Length: 0.02, NX: 3, NY: 2, Base: 2, View: -1,
		Layers: []PlateLayer{{Thickness: 1e-3, KIn: 1, KThrough: 1, Cells: 1}}}
	for name, jn := range map[string]PlateJoin{
		"fins":       {Face: Top, Node: 0, Natural: true, Orientation: FinArray},
		"two ways":   {Face: Top, Node: 0, Natural: true, Orientation: FacingUp, PerArea: 5},
		"bad length": {Face: Top, Node: 0, Natural: true, Orientation: Vertical, Length: -1},
	} {
		p := base
		p.Joins = []PlateJoin{jn}
		if _, err := NewPlate(p); err == nil {
			t.Errorf("%s: accepted", name)
		}
	}
}

// The lean coefficient of a meshed face's cells is the lumped element's,
// value and both derivatives, on either side of the air's temperature.
func TestSurfaceHIsEvalH(t *testing.T) {
	for _, o := range []Orientation{Vertical, FacingUp, FacingDown} {
		n := &Natural{Surface: 0, Air: 1, Orientation: o, Area: 1, Length: 0.05}
		for _, x := range [][]float64{{340, 300}, {290, 310}} {
			s := &State{X: x, Env: testEnv}
			for seed := 0; seed < 2; seed++ {
				want := n.eval(s, seed).h
				ts, ta := dual.C(x[0]), dual.C(x[1])
				if seed == 0 {
					ts.D = 1
				} else {
					ta.D = 1
				}
				got := n.surfaceH(s, ts, ta)
				if got != want {
					t.Errorf("%s at %v, seed %d: %+v, eval gives %+v", o, x, seed, got, want)
				}
			}
		}
	}
}

// A plate with natural convection on its faces has an accuracy band: the
// least accurate of its correlations (±20 % for the horizontal faces,
// from the lumped element), and scaling its coefficient by k scales the
// heat of its natural joins by k, so the coefficient slope ∂R/∂ln h of a
// node's row is the natural heat it receives. A plate without natural
// joins has none.
func TestPlateNaturalAccuracy(t *testing.T) {
	p := naturalPlate(t)
	x := spreadTemps(22, 300, 350, 4)
	s := &State{X: x, Env: testEnv}
	acc, src := p.Accuracy(s)
	if acc != 0.20 || !strings.Contains(src, "horizontal") {
		t.Errorf("accuracy %g (%s), want 0.20 of the horizontal plates", acc, src)
	}
	q := p.JoinHeat(s)
	q2 := p.ScaledBy(1.3).(*Plate).JoinHeat(s)
	for i, name := range []string{"top", "under", "edge"} {
		if math.Abs(q2[i]-1.3*q[i]) > 1e-12*math.Abs(q[i]) {
			t.Errorf("%s: scaled by 1.3 carries %g W, want 1.3 × %g W", name, q2[i], q[i])
		}
	}
	if q2[3] != q[3] {
		t.Errorf("the rail (given h) changed: %g W, was %g W", q2[3], q[3])
	}
	rows := p.Rows()
	l := NewLocal(len(rows), len(p.Vars()), false)
	CoefficientSlope(p, s, l)
	for r, v := range rows {
		want := 0.0
		switch v {
		case 0:
			want = q[0] + q[1]
		case 1:
			want = q[2]
		default:
			continue
		}
		if math.Abs(l.R[r]-want) > 1e-8*math.Abs(want) {
			t.Errorf("slope of node %d's row %g W, want its natural heat %g W", v, l.R[r], want)
		}
	}
	if a, _ := smallPlate(t).Accuracy(s); a != 0 {
		t.Errorf("a plate without natural joins has accuracy %g", a)
	}
}
