package elements

import (
	"fmt"
	"math"
	"math/rand/v2"
	"runtime"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/sparse"
)

// smallPlate is a 3 × 2 plate of two layers (1 and 2 cells through) with
// joins of every kind: variables 0 (ambient) and 1 (a case), the 18 cells
// from 2, a chassis node 20, the view 21.
func smallPlate(t *testing.T) *Plate {
	t.Helper()
	p, err := NewPlate(Plate{
		Name: "board", Width: 0.03, Length: 0.02, NX: 3, NY: 2,
		Layers: []PlateLayer{
			{Thickness: 1e-3, KIn: 0.8, KThrough: 0.3, RhoC: 1.9e6, Cells: 1},
			{Thickness: 2e-3, KIn: 150, KThrough: 140, RhoC: 2.4e6, Cells: 2},
		},
		Base: 2, View: 21,
		Joins: []PlateJoin{
			{Name: "top air", Face: Top, Node: 0, PerArea: 12},
			{Name: "part", Face: Bottom, Region: Rect{0.004, 0.003, 0.017, 0.012}, Node: 1, Total: 2.5},
			{Name: "rail", Face: XMax, Region: Rect{0.005, 0.0005, 0.02, 0.0025}, Node: 20, PerArea: 3000},
			{Name: "glow", Face: Top, Region: Rect{0.01, 0, 0.04, 0.015}, Node: 0, Emissivity: 0.85},
			{Name: "side glow", Face: YMin, Node: 20, Emissivity: 0.6},
			{Name: "pad", Face: XMin, Region: Rect{0, 0, 0.02, 0.001}, Node: 1, Total: 0.7},
		},
	})
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// spreadTemps returns temperatures between lo and hi for n variables.
func spreadTemps(n int, lo, hi float64, seed uint64) []float64 {
	r := rand.New(rand.NewPCG(seed, 1))
	x := make([]float64, n)
	for i := range x {
		x[i] = lo + (hi-lo)*r.Float64()
	}
	return x
}

func TestPlateJacobian(t *testing.T) {
	p := smallPlate(t)
	if p.Cells() != 18 || p.NZ() != 3 {
		t.Fatalf("cells %d, nz %d; want 18, 3", p.Cells(), p.NZ())
	}
	if got := len(p.Rows()); got != 18+3 {
		t.Fatalf("%d rows, want 18 cells and 3 join nodes", got)
	}
	x := spreadTemps(22, 290, 380, 1)
	checkJacobian(t, "plate", p, x, 1e-6)
	checkConserves(t, "plate", p, x)
}

// The entries name each cell's diagonal and neighbours once and every
// join's pairs, all within Rows and Vars.
func TestPlateEntries(t *testing.T) {
	p := smallPlate(t)
	er, ev := p.Entries()
	n := len(p.Rows())
	seen := map[[2]int32]bool{}
	cellEntries := 0
	for k := range er {
		if er[k] < 0 || int(er[k]) >= n || ev[k] < 0 || int(ev[k]) >= n {
			t.Fatalf("entry %d at (%d, %d) outside %d rows", k, er[k], ev[k], n)
		}
		if int(er[k]) < p.Cells() && int(ev[k]) < p.Cells() {
			if seen[[2]int32{er[k], ev[k]}] {
				t.Errorf("cell entry (%d, %d) twice", er[k], ev[k])
			}
			seen[[2]int32{er[k], ev[k]}] = true
			cellEntries++
		}
	}
	// 18 diagonals and two entries per link, the links counted by hand on
	// the 3 × 2 × 3 mesh: along x 2·2·3 = 12, along y 3·1·3 = 9, along z
	// 3·2·2 = 12.
	if want := 18 + 2*(12+9+12); cellEntries != want {
		t.Errorf("%d cell entries, want %d", cellEntries, want)
	}
	for c := range p.Cells() {
		d := p.diagEntry(c)
		if er[d] != int32(c) || ev[d] != int32(c) {
			t.Errorf("cell %d: its diagonal entry %d is at (%d, %d)", c, d, er[d], ev[d])
		}
	}
}

// Given join nodes change nothing but the derivatives that are skipped:
// the node's column and its own row.
func TestPlateGivenNodes(t *testing.T) {
	p := smallPlate(t)
	er, ev := p.Entries()
	x := spreadTemps(22, 290, 380, 2)
	rows := p.Rows()
	full := NewPatternedLocal(len(rows), len(rows), len(er), true)
	p.Eval(&State{X: x}, full)
	part := NewPatternedLocal(len(rows), len(rows), len(er), true)
	part.Given = make([]bool, len(rows))
	part.Given[p.Cells()] = true // the first join node, ambient
	p.Eval(&State{X: x}, part)
	for r := range full.R {
		if full.R[r] != part.R[r] {
			t.Errorf("row %d: %g with the node given, %g without", r, part.R[r], full.R[r])
		}
	}
	for k := range er {
		if int(ev[k]) == p.Cells() || int(er[k]) == p.Cells() {
			continue // the given node's column and its own equation's row
		}
		if full.J[k] != part.J[k] {
			t.Errorf("entry %d (%d, %d): %g with the node given, %g without", k, er[k], ev[k], part.J[k], full.J[k])
		}
	}
}

// The rows split among goroutines give the serial answer: each cell's row
// bit for bit, the join nodes to round-off.
func TestPlateParallelEval(t *testing.T) {
	defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(3))
	p, err := NewPlate(Plate{Width: 0.3, Length: 0.1, NX: 300, NY: 100,
		Layers: []PlateLayer{{Thickness: 1.6e-3, KIn: 20, KThrough: 0.4, Cells: 1}},
		Base:   0, View: -1,
		Joins: []PlateJoin{
			{Face: Top, Node: 30000, Emissivity: 0.9},
			{Face: Bottom, Node: 30001, PerArea: 8},
			{Face: Bottom, Region: Rect{0.1, 0.02, 0.2, 0.07}, Node: 30002, Total: 3},
		}})
	if err != nil {
		t.Fatal(err)
	}
	x := spreadTemps(30003, 300, 360, 3)
	er, _ := p.Entries()
	nr := len(p.Rows())
	par := NewPatternedLocal(nr, nr, len(er), true)
	p.Eval(&State{X: x}, par)
	ser := NewPatternedLocal(nr, nr, len(er), true)
	acc := plateAcc{r: make([]float64, 3), nn: make([]float64, 3)}
	p.evalCells(&State{X: x}, ser, 0, p.Cells(), &acc, []bool{true, true, true})
	for i, jn := range p.joins {
		ser.R[p.n+jn.pos] += acc.r[jn.pos]
		ser.J[jn.entry+2*len(jn.cells)] += acc.nn[i]
	}
	for c := range p.Cells() {
		if par.R[c] != ser.R[c] {
			t.Fatalf("cell %d: %g in parts, %g serially", c, par.R[c], ser.R[c])
		}
	}
	for r := p.Cells(); r < nr; r++ {
		if d := math.Abs(par.R[r] - ser.R[r]); d > 1e-12*math.Abs(ser.R[r]) {
			t.Errorf("node row %d: %g in parts, %g serially", r, par.R[r], ser.R[r])
		}
	}
	for k := range er {
		if d := math.Abs(par.J[k] - ser.J[k]); d > 1e-12*math.Abs(ser.J[k]) {
			t.Fatalf("entry %d: %g in parts, %g serially", k, par.J[k], ser.J[k])
		}
	}
}

// Placement conserves power: a Total join's shares sum to Total and an
// area heat's to its heat, for regions that cut cells anywhere.
func TestPlatePlacementConserves(t *testing.T) {
	p := smallPlate(t)
	for i, jn := range p.Joins {
		if jn.Total > 0 {
			if d := math.Abs(p.joins[i].given - jn.Total); d > 1e-15*jn.Total {
				t.Errorf("join %s: shares sum to %.17g W/K, want %.17g", jn.Name, p.joins[i].given, jn.Total)
			}
		}
	}
	for _, r := range []Rect{{0.0011, 0.0007, 0.0293, 0.0191}, {0.0123, 0.004, 0.0124, 0.013}, {-0.01, -0.01, 0.0151, 0.0101}} {
		const q = 7.3
		h, err := NewAreaHeat(p, Top, r, q, nil)
		if err != nil {
			t.Fatal(err)
		}
		x := spreadTemps(22, 300, 300, 4)
		got := stampAt(h, testEnv, x)
		sum := 0.0
		for _, v := range got.q {
			sum += v
		}
		if math.Abs(sum-q) > 4e-16*q*float64(len(h.Rows())) {
			t.Errorf("area heat on %v: %.17g W into the cells, want %g", r, sum, q)
		}
		for _, v := range h.Rows() {
			if !p.isCell(v) || (v-p.Base)/(p.NX*p.NY) != p.NZ()-1 {
				t.Errorf("area heat on the top face heats variable %d, not a top cell", v)
			}
		}
	}
}

// A join's conductance to each cell is its own share (PerArea × overlap,
// or Total by overlap) in series with the half-cell between the face and
// the centre, d/(2k·A): computed here by hand for the partial joins of the
// small plate.
func TestPlateJoinShares(t *testing.T) {
	p := smallPlate(t)
	series := func(a, b float64) float64 { return a * b / (a + b) }
	// "part": bottom, region x 4–17 mm, y 3–12 mm; cells 10 mm square;
	// the bottom layer's half-cell is 0.5 mm of k 0.3.
	part := p.joins[1]
	wantPart := map[int32]float64{}
	areas := map[int32]float64{0: 6e-3 * 7e-3, 1: 7e-3 * 7e-3, 3: 6e-3 * 2e-3, 4: 7e-3 * 2e-3}
	regionArea := 13e-3 * 9e-3
	for c, a := range areas {
		wantPart[c] = series(2.5*a/regionArea, 0.3*a/0.5e-3)
	}
	checkShares(t, "part", part, wantPart)
	// "rail": x_max edge, y 5–20 mm, z 0.5–2.5 mm; z cells 0–1, 1–2, 2–3
	// mm; the half-cell is 5 mm of the layer's k_in.
	rail := p.joins[2]
	want := map[int32]float64{}
	for _, c := range []struct {
		j, k int
		a    float64
		kin  float64
	}{{0, 0, 5e-3 * 0.5e-3, 0.8}, {0, 1, 5e-3 * 1e-3, 150}, {0, 2, 5e-3 * 0.5e-3, 150},
		{1, 0, 10e-3 * 0.5e-3, 0.8}, {1, 1, 10e-3 * 1e-3, 150}, {1, 2, 10e-3 * 0.5e-3, 150}} {
		want[int32(p.Index(2, c.j, c.k))] = series(3000*c.a, 2*c.kin*c.a/10e-3)
	}
	checkShares(t, "rail", rail, want)
	// "glow": top, x 10–40 mm clipped to 30, y 0–15 mm: radiation acts on
	// the centres, εσA.
	glow := p.joins[3]
	want = map[int32]float64{}
	for _, c := range []struct {
		i, j int
		a    float64
	}{{1, 0, 1e-4}, {2, 0, 1e-4}, {1, 1, 0.5e-4}, {2, 1, 0.5e-4}} {
		want[int32(p.Index(c.i, c.j, 2))] = 0.85 * StefanBoltzmann * c.a
	}
	checkShares(t, "glow", glow, want)
}

func checkShares(t *testing.T, name string, jn plateJoin, want map[int32]float64) {
	t.Helper()
	if len(jn.cells) != len(want) {
		t.Errorf("%s: %d cells %v, want %d", name, len(jn.cells), jn.cells, len(want))
	}
	for q, c := range jn.cells {
		w, ok := want[c]
		if !ok {
			t.Errorf("%s: cell %d covered, not expected", name, c)
			continue
		}
		if math.Abs(jn.share[q]-w) > 1e-12*w {
			t.Errorf("%s: cell %d share %.12g, want %.12g", name, c, jn.share[q], w)
		}
	}
}

// testSolve solves the steady balance of a plate and its area heats for
// the variables that given does not fix, by Newton's method with the
// supernodal Cholesky factorisation, starting from x.
func testSolve(t *testing.T, p *Plate, heats []*AreaHeat, x []float64, given []bool) {
	t.Helper()
	rows := p.Rows()
	er, ev := p.Entries()
	free := make([]int, len(x))
	n := 0
	for v := range x {
		free[v] = -1
		if !given[v] {
			free[v] = n
			n++
		}
	}
	b := sparse.NewBuilder(n)
	for k := range er {
		fr, fv := free[rows[er[k]]], free[rows[ev[k]]]
		if fr >= 0 && fv >= 0 {
			b.Mark(fr, fv)
		}
	}
	m := b.Build()
	slv := sparse.NewSupernodal()
	if err := slv.Analyse(m); err != nil {
		t.Fatal(err)
	}
	f := make([]float64, n)
	dx := make([]float64, n)
	l := NewPatternedLocal(len(rows), len(rows), len(er), true)
	for it := 0; it < 30; it++ {
		l.ResetEntries(len(rows), len(rows), len(er), true)
		l.Given = make([]bool, len(rows))
		for a, v := range rows {
			l.Given[a] = given[v]
		}
		s := &State{X: x, Env: testEnv}
		p.Eval(s, l)
		clear(f)
		for a, v := range rows {
			if fr := free[v]; fr >= 0 {
				f[fr] -= l.R[a]
			}
		}
		for _, h := range heats {
			q := h.Power(s)
			for i, v := range h.vars {
				if fr := free[v]; fr >= 0 {
					f[fr] -= q * h.frac[i]
				}
			}
		}
		m.Zero()
		for k := range er {
			fr, fv := free[rows[er[k]]], free[rows[ev[k]]]
			if fr >= 0 && fv >= 0 {
				m.Add(fr, fv, l.J[k])
			}
		}
		if err := slv.Factorize(m); err != nil {
			t.Fatal(err)
		}
		if err := slv.Solve(dx, f); err != nil {
			t.Fatal(err)
		}
		big := 0.0
		for v, fr := range free {
			if fr >= 0 {
				x[v] += dx[fr]
				big = math.Max(big, math.Abs(dx[fr]))
			}
		}
		if big < 1e-11 {
			return
		}
	}
	t.Fatal("Newton's method did not converge")
}

// A plate heated uniformly on top and cooled by h beneath, with adiabatic
// edges, conducts in one dimension: each cell's temperature is the heat
// flux times the series resistance from the coolant to its centre, 1/h
// plus each layer's thickness over its conductivity (Incropera et al.,
// Fundamentals of Heat and Mass Transfer, §3.1, the composite plane wall).
func TestPlateUniformFlux(t *testing.T) {
	layers := []PlateLayer{
		{Thickness: 1.5e-3, KIn: 1.0, KThrough: 0.35, Cells: 1},
		{Thickness: 0.2e-3, KIn: 390, KThrough: 390, Cells: 2},
		{Thickness: 3e-3, KIn: 200, KThrough: 180, Cells: 3},
	}
	const w, ln, q, h, tInf = 0.05, 0.04, 6.0, 25.0, 300.0
	p, err := NewPlate(Plate{Width: w, Length: ln, NX: 4, NY: 3, Layers: layers, Base: 1, View: -1,
		Joins: []PlateJoin{{Face: Bottom, Node: 0, PerArea: h}}})
	if err != nil {
		t.Fatal(err)
	}
	heat, err := NewAreaHeat(p, Top, Rect{}, q, nil)
	if err != nil {
		t.Fatal(err)
	}
	x := make([]float64, 1+p.Cells())
	given := make([]bool, len(x))
	x[0], given[0] = tInf, true
	testSolve(t, p, []*AreaHeat{heat}, x, given)
	flux := q / (w * ln)
	r := 1 / h // m² K/W from the coolant to the height z
	k := 0
	for _, ly := range layers {
		dz := ly.Thickness / float64(ly.Cells)
		for range ly.Cells {
			r += dz / (2 * ly.KThrough)
			want := tInf + flux*r
			for j := range p.NY {
				for i := range p.NX {
					if got := x[1+p.Index(i, j, k)]; math.Abs(got-want) > 1e-10*want {
						t.Errorf("cell (%d, %d, %d): %.12g K, want %.12g K", i, j, k, got, want)
					}
				}
			}
			r += dz / (2 * ly.KThrough)
			k++
		}
	}
	s := &State{X: x}
	if jh := p.JoinHeat(s); math.Abs(jh[0]-q) > 1e-9*q {
		t.Errorf("heat out through the bottom %g W, want %g W", jh[0], q)
	}
}

// A strip heated over one end edge and cooled over the other by h, with
// every other face adiabatic, conducts along its length: T(x) = T∞ +
// Q·[1/(hA) + (W − x)/(kA)], linear, exact at every cell centre (Incropera
// et al., §3.1, the plane wall with a convective face).
func TestPlateEndToEnd(t *testing.T) {
	const w, ln, th, k, q, h, tInf = 0.12, 0.01, 2e-3, 160.0, 3.0, 500.0, 310.0
	p, err := NewPlate(Plate{Width: w, Length: ln, NX: 12, NY: 2,
		Layers: []PlateLayer{{Thickness: th, KIn: k, KThrough: 0.5 * k, Cells: 2}},
		Base:   0, View: 100, Joins: []PlateJoin{{Name: "cold end", Face: XMax, Node: 48, PerArea: h}}})
	if err != nil {
		t.Fatal(err)
	}
	heat, err := NewAreaHeat(p, XMin, Rect{}, q, nil)
	if err != nil {
		t.Fatal(err)
	}
	x := make([]float64, 49)
	given := make([]bool, 49)
	x[48], given[48] = tInf, true
	testSolve(t, p, []*AreaHeat{heat}, x, given)
	a := ln * th
	for kk := range p.NZ() {
		for j := range p.NY {
			for i := range p.NX {
				xc, _, _ := p.CellCentre(i, j, kk)
				want := tInf + q*(1/(h*a)+(w-xc)/(k*a))
				if got := x[p.Index(i, j, kk)]; math.Abs(got-want) > 1e-10*want {
					t.Errorf("cell (%d, %d, %d) at x = %g: %.12g K, want %.12g K", i, j, kk, xc, got, want)
				}
			}
		}
	}
	sm := p.Summary(&State{X: x})
	if sm.HotI != 0 || math.Abs(sm.Hottest-(tInf+q*(1/(h*a)+(w-w/24)/(k*a)))) > 1e-9*sm.Hottest {
		t.Errorf("hottest %g K at cell %d, want the first column", sm.Hottest, sm.HotI)
	}
	if math.Abs(sm.Coolest-(tInf+q*(1/(h*a)+(w/24)/(k*a)))) > 1e-9*sm.Coolest {
		t.Errorf("coolest %g K", sm.Coolest)
	}
	// The mean of a linear profile is its value at the middle.
	if want := tInf + q*(1/(h*a)+(w/2)/(k*a)); math.Abs(sm.Mean-want) > 1e-10*want {
		t.Errorf("mean %.12g K, want %.12g K", sm.Mean, want)
	}
	paths := p.Paths(&State{X: x})
	if len(paths) != 1 || paths[0].From != 100 || paths[0].To != 48 || math.Abs(paths[0].Heat-q) > 1e-9*q {
		t.Errorf("paths %+v, want one of %g W from 100 to 48", paths, q)
	}
}

// squareSourceRise is the exact mean temperature rise of a uniformly
// heated square of side 2a centred on the top of a square plate of side L,
// thickness th, conductivity k, adiabatic edges, cooled beneath by h into
// fluid at 0 (separation of variables in cosine modes cos(α_m x)·cos(α_n y),
// α = mπ/L: each mode decays through the thickness as a plate with a
// convective back; the form of Muzychka, Culham & Yovanovich, J. Electronic
// Packaging 125, 2003, for a centred source, from memory, derived again
// here):
//
//	θ̄ = Q/L²·(1/h + th/k) + q·Σ' X_m X_n·φ(γ)/(k·γ),
//	X_0 = 2a/L, X_m = 4·sin²(α_m a)/(L·a·α_m²) (m even, odd modes vanish),
//	γ² = α_m² + α_n², φ = [1 + (h/kγ)·tanh γth]/[tanh γth + h/kγ],
//
// the sum over every (m, n) but (0, 0), up to m, n < terms.
func squareSourceRise(q, a, l, th, k, h float64, terms int) float64 {
	xm := make([]float64, 0, terms/2)
	al := make([]float64, 0, terms/2)
	for m := 0; m < terms; m += 2 {
		alpha := float64(m) * math.Pi / l
		al = append(al, alpha)
		if m == 0 {
			xm = append(xm, 2*a/l)
			continue
		}
		s := math.Sin(alpha * a)
		xm = append(xm, 4*s*s/(l*a*alpha*alpha))
	}
	flux := q / (4 * a * a)
	sum := 0.0
	for i := range al {
		for j := range al {
			if i == 0 && j == 0 {
				continue
			}
			g := math.Hypot(al[i], al[j])
			b := h / (k * g)
			th := math.Tanh(g * th)
			sum += xm[i] * xm[j] * (1 + b*th) / (th + b) / (k * g)
		}
	}
	return q/(l*l)*(1/h+th/k) + flux*sum
}

// The exact series converges: doubling the terms changes it by under 1e-5.
func TestSquareSourceSeries(t *testing.T) {
	a := squareSourceRise(10, 5e-3, 0.04, 5e-3, 200, 2000, 1000)
	b := squareSourceRise(10, 5e-3, 0.04, 5e-3, 200, 2000, 2000)
	if math.Abs(a-b) > 1e-5*b {
		t.Errorf("series %g with 1000 terms, %g with 2000", a, b)
	}
	// Against the exact series for the disk of the same area on the disk
	// of the same area (spreading.go, Song, Lee & Au 1994): the shapes
	// differ, so only close agreement is expected (rule of thumb: equal
	// areas give spreading resistances within a few per cent).
	r, err := Spreading(SpreadingPlate{SourceArea: 1e-4, PlateArea: 0.04 * 0.04, Thickness: 5e-3, Conductivity: 200,
		SinkResistance: 1 / (2000 * 0.04 * 0.04)})
	if err != nil {
		t.Fatal(err)
	}
	disk := 10 * (r.Series + 1/(2000*0.04*0.04))
	if math.Abs(b-disk) > 0.05*b {
		t.Errorf("square on square %g K, disk on disk %g K", b, disk)
	}
	t.Logf("square source on square plate: %.6g K rise; equal-area disks: %.6g K", b, disk)
}

// Mesh convergence: a centred square source on a square plate cooled
// beneath, meshed with 8, 16, 32 and 64 cells per side and the thickness
// in cells of the same size (1, 2, 4, 8), its region on cell edges at
// every level. The mean temperature rise of the source (the top cells'
// temperatures raised by the half-cell under the flux, q·d/(2k)) tends to
// the exact series at second order, as the cell-centred scheme is
// (Patankar 1980, §4.2).
func TestPlateConvergence(t *testing.T) {
	if testing.Short() {
		t.Skip("a 32 768-cell solve")
	}
	const l, th, k, h, q, a = 0.04, 5e-3, 200.0, 2000.0, 10.0, 5e-3
	exact := squareSourceRise(q, a, l, th, k, h, 2000)
	var errs []float64
	for _, n := range []int{8, 16, 32, 64} {
		nz := n / 8
		p, err := NewPlate(Plate{Width: l, Length: l, NX: n, NY: n,
			Layers: []PlateLayer{{Thickness: th, KIn: k, KThrough: k, Cells: nz}},
			Base:   1, View: -1, Joins: []PlateJoin{{Face: Bottom, Node: 0, PerArea: h}}})
		if err != nil {
			t.Fatal(err)
		}
		src := Rect{l/2 - a, l/2 - a, l/2 + a, l/2 + a}
		heat, err := NewAreaHeat(p, Top, src, q, nil)
		if err != nil {
			t.Fatal(err)
		}
		x := make([]float64, 1+p.Cells())
		given := make([]bool, len(x))
		given[0] = true
		testSolve(t, p, []*AreaHeat{heat}, x, given)
		dz := th / float64(nz)
		rise := 0.0
		for i, v := range heat.vars {
			rise += heat.frac[i] * (x[v] + q/(4*a*a)*dz/(2*k))
		}
		e := math.Abs(rise-exact) / exact
		errs = append(errs, e)
		t.Logf("%d × %d × %d cells: mean source rise %.6g K, exact %.6g K, error %.3g %%", n, n, nz, rise, exact, 100*e)
	}
	for i := 1; i < len(errs); i++ {
		order := math.Log2(errs[i-1] / errs[i])
		t.Logf("observed order %.2f", order)
		if order < 1.5 || order > 2.5 {
			t.Errorf("refinement %d: observed order %.2f, want about 2", i, order)
		}
	}
	if last := errs[len(errs)-1]; last > 6e-3 {
		t.Errorf("finest mesh: error %.3g, want below 0.6 %%", last)
	}
}

// The stored energy is Σ C·T over the cells with C = ρc·V, its derivative
// the cell's C on its diagonal; the capacities sum to ρc·V of the layers.
func TestPlateStorage(t *testing.T) {
	p := smallPlate(t)
	if !p.Stores() {
		t.Fatal("a plate with ρc > 0 stores no heat")
	}
	// ρc·V by layer: 1.9e6·(30·20·1 mm³), 2.4e6·(30·20·2 mm³).
	wantC := 1.9e6*0.03*0.02*1e-3 + 2.4e6*0.03*0.02*2e-3
	if c := p.HeatCapacity(); math.Abs(c-wantC) > 1e-12*wantC {
		t.Errorf("heat capacity %g J/K, want %g", c, wantC)
	}
	x := spreadTemps(22, 280, 360, 5)
	rows := p.Rows()
	er, ev := p.Entries()
	l := NewPatternedLocal(len(rows), len(rows), len(er), true)
	p.Stored(&State{X: x}, l)
	e, want, csum := 0.0, 0.0, 0.0
	for c := range p.Cells() {
		k := c / 6
		cc := 2.4e6 * 0.01 * 0.01 * 1e-3
		if k == 0 {
			cc = 1.9e6 * 0.01 * 0.01 * 1e-3
		}
		want += cc * x[p.Base+c]
		e += l.R[c]
	}
	for r := p.Cells(); r < len(rows); r++ {
		if l.R[r] != 0 {
			t.Errorf("join node row %d stores %g J", r, l.R[r])
		}
	}
	for k := range er {
		if er[k] != ev[k] && l.J[k] != 0 {
			t.Errorf("entry %d (%d, %d) off the diagonal: %g", k, er[k], ev[k], l.J[k])
		}
		csum += l.J[k]
	}
	if math.Abs(e-want) > 1e-12*want {
		t.Errorf("stored %g J, want %g", e, want)
	}
	if math.Abs(csum-wantC) > 1e-12*wantC {
		t.Errorf("capacities sum to %g J/K, want %g", csum, wantC)
	}
	q, err := NewPlate(Plate{Width: 1, Length: 1, NX: 1, NY: 1, View: -1,
		Layers: []PlateLayer{{Thickness: 1e-3, KIn: 1, KThrough: 1, Cells: 1}}})
	if err != nil {
		t.Fatal(err)
	}
	if q.Stores() {
		t.Error("a plate without ρc stores heat")
	}
}

func TestFaceNames(t *testing.T) {
	for f := Bottom; f <= YMax; f++ {
		g, err := ParseFace(f.String())
		if err != nil || g != f {
			t.Errorf("%v: parsed back as %v, %v", f, g, err)
		}
	}
	if _, err := ParseFace("front"); err == nil || !strings.Contains(err.Error(), `unknown face "front"`) {
		t.Errorf("front: %v", err)
	}
}

func TestPlateReport(t *testing.T) {
	// A 2 mm footprint on 10 mm cells, radiation from a 3 mm cell of
	// k 0.3: h_r·d/(2k) ≈ 6·1.5e-3/0.3 = 3 %, under the 5 % bound; from a
	// 30 mm cell of k 0.3 at 330 K, h_r = 4·0.9·σ·330³ = 7.3 W/(m² K), 36 %.
	p, err := NewPlate(Plate{Name: "lid", Width: 0.05, Length: 0.05, NX: 5, NY: 5,
		Layers: []PlateLayer{{Thickness: 0.03, KIn: 0.3, KThrough: 0.3, Cells: 1}},
		Base:   0, View: 30,
		Joins: []PlateJoin{
			{Name: "chip", Face: Top, Region: Rect{0.02, 0.02, 0.022, 0.022}, Node: 25, Total: 1},
			{Name: "sky", Face: Bottom, Node: 26, Emissivity: 0.9},
			{Name: "over", Face: Bottom, Region: Rect{0.04, 0.04, 0.06, 0.05}, Node: 27, PerArea: 5},
		}})
	if err != nil {
		t.Fatal(err)
	}
	x := spreadTemps(31, 320, 330, 6)
	rep := p.Report(&State{X: x})
	all := strings.Join(rep.Warnings, "\n")
	for _, w := range []string{"join chip: the region (2 × 2 mm) is smaller than the top face's cells (10 × 10 mm)",
		"join over: 50 % of the region lies off the bottom face",
		"layer 1: its cells are 30 mm tall, more than twice their width (10 mm)",
		"join sky: radiation leaves from the cell centres"} {
		if !strings.Contains(all, w) {
			t.Errorf("no warning %q in\n%s", w, all)
		}
	}
	if len(rep.Warnings) != 4 {
		t.Errorf("%d warnings, want 4:\n%s", len(rep.Warnings), all)
	}
	got := map[string]float64{}
	for _, d := range rep.Details {
		got[d.Name] = d.Value
	}
	sm := p.Summary(&State{X: x})
	if got["hottest"] != sm.Hottest || got["cells"] != 25 {
		t.Errorf("details %v", rep.Details)
	}
	jh := p.JoinHeat(&State{X: x})
	if got["heat sky"] != jh[1] {
		t.Errorf("heat sky %g, want %g", got["heat sky"], jh[1])
	}
	// A thin board with a footprint of several cells warns of nothing.
	b, err := NewPlate(Plate{Width: 0.1, Length: 0.1, NX: 50, NY: 50,
		Layers: []PlateLayer{{Thickness: 1.6e-3, KIn: 20, KThrough: 0.4, Cells: 1}}, View: -1,
		Joins: []PlateJoin{{Face: Top, Region: Rect{0.04, 0.04, 0.06, 0.06}, Node: 2500, Total: 2}, {Face: Bottom, Node: 2501, Emissivity: 0.9}}})
	if err != nil {
		t.Fatal(err)
	}
	if w := b.Report(&State{X: spreadTemps(2502, 300, 340, 7)}).Warnings; len(w) != 0 {
		t.Errorf("warnings on a well-meshed board: %q", w)
	}
}

func TestPlateBadInput(t *testing.T) {
	layer := []PlateLayer{{Thickness: 1e-3, KIn: 1, KThrough: 1, Cells: 1}}
	ok := Plate{Name: "p", Width: 0.01, Length: 0.02, NX: 2, NY: 2, Layers: layer, Base: 1, View: -1}
	with := func(f func(*Plate)) Plate {
		p := ok
		p.Layers = append([]PlateLayer(nil), layer...)
		f(&p)
		return p
	}
	join := func(j PlateJoin) Plate { return with(func(p *Plate) { p.Joins = []PlateJoin{j} }) }
	for _, c := range []struct {
		p    Plate
		want string
	}{
		{with(func(p *Plate) { p.Width = 0 }), `plate "p": width must be a positive number, got 0`},
		{with(func(p *Plate) { p.Length = math.NaN() }), `length must be a positive number, got NaN`},
		{with(func(p *Plate) { p.NX = 0 }), `nx (cells along the width) must be at least 1, got 0`},
		{with(func(p *Plate) { p.NY = -2 }), `ny (cells along the length) must be at least 1, got -2`},
		{with(func(p *Plate) { p.Layers = nil }), `layers: a plate needs at least one layer`},
		{with(func(p *Plate) { p.Layers[0].Thickness = -1 }), `layer 1: thickness must be a positive number, got -1`},
		{with(func(p *Plate) { p.Layers[0].KThrough = 0 }), `layer 1: k_through must be a positive number, got 0`},
		{with(func(p *Plate) { p.Layers[0].RhoC = -5 }), `layer 1: rho_c must be zero or a positive number, got -5`},
		{with(func(p *Plate) { p.Layers[0].Cells = 0 }), `layer 1: cells must be at least 1, got 0`},
		{with(func(p *Plate) { p.NX, p.NY = 100000, 100000 }), `100000 × 100000 × 1 cells are too many`},
		{with(func(p *Plate) { p.Base = -1 }), `base variable must not be negative, got -1`},
		{with(func(p *Plate) { p.View = 2 }), `view variable 2 must be −1 or a variable outside the cells 1..4`},
		{join(PlateJoin{Name: "h", Face: Top, Node: 0}), `join 1 (h): exactly one of per_area, total, emissivity and natural must be given, got 0`},
		{join(PlateJoin{Face: Top, Node: 0, PerArea: 5, Total: 1}), `join 1 (top): exactly one of per_area, total, emissivity and natural must be given, got 2`},
		{join(PlateJoin{Face: Top, Node: 0, PerArea: -5}), `per_area must be zero or a positive number, got -5`},
		{join(PlateJoin{Face: Top, Node: 0, Emissivity: 1.2}), `emissivity must be at most 1, got 1.2`},
		{join(PlateJoin{Face: Top, Node: 3, PerArea: 5}), `node variable 3 must be a variable outside the cells 1..4 and not the view`},
		{join(PlateJoin{Face: Face(9), Node: 0, PerArea: 5}), `face 9 is not one of bottom, top`},
		{join(PlateJoin{Face: Top, Region: Rect{0.005, 0.01, 0.004, 0.02}, Node: 0, PerArea: 5}), `region (0.005, 0.01)–(0.004, 0.02) m is empty`},
		{join(PlateJoin{Face: XMin, Region: Rect{0.005, 0.002, 0.01, 0.003}, Node: 0, PerArea: 5}), `region (0.005, 0.002)–(0.01, 0.003) m lies outside the x_min face (0, 0)–(0.02, 0.001) m`},
		{join(PlateJoin{Face: Top, Region: Rect{0, math.Inf(1), 0.01, 0.02}, Node: 0, PerArea: 5}), `must be finite`},
	} {
		_, err := NewPlate(c.p)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("got %v, want %q", err, c.want)
		}
	}
	p, err := NewPlate(ok)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := NewAreaHeat(p, Top, Rect{0.02, 0, 0.03, 0.01}, 1, nil); err == nil || !strings.Contains(err.Error(), `area heat on plate "p": region (0.02, 0)–(0.03, 0.01) m lies outside the top face`) {
		t.Errorf("area heat off the plate: %v", err)
	}
	if _, err := NewAreaHeat(p, Top, Rect{}, math.NaN(), nil); err == nil || !strings.Contains(err.Error(), "heat must be a finite number") {
		t.Errorf("area heat NaN: %v", err)
	}
}

// BenchmarkPlateEval evaluates a 1000 × 1000 × 1 board radiating from both
// faces, with its Jacobian.
func BenchmarkPlateEval(b *testing.B) {
	p, err := NewPlate(Plate{Width: 0.2, Length: 0.2, NX: 1000, NY: 1000,
		Layers: []PlateLayer{{Thickness: 1.6e-3, KIn: 20, KThrough: 0.4, Cells: 1}}, Base: 0, View: -1,
		Joins: []PlateJoin{{Face: Top, Node: 1000000, Emissivity: 0.9}, {Face: Bottom, Node: 1000001, Emissivity: 0.9}}})
	if err != nil {
		b.Fatal(err)
	}
	x := spreadTemps(1000002, 300, 360, 8)
	er, _ := p.Entries()
	nr := len(p.Rows())
	l := NewPatternedLocal(nr, nr, len(er), true)
	s := &State{X: x}
	// The Local is cleared outside the timing: that is the assembly's
	// work, the same for every element.
	for _, jac := range []bool{true, false} {
		name := "residual"
		if jac {
			name = "jacobian"
		}
		b.Run(name, func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				b.StopTimer()
				l.ResetEntries(nr, nr, len(er), jac)
				b.StartTimer()
				p.Eval(s, l)
			}
		})
	}
}

// A 1.6 mm board of FR-4 (in-plane 1.059, through 0.343 W/(m K), Sarvar,
// Poole & Witting 1990), two full 35 µm planes and two 35 µm signal layers
// of 20 % coverage, computed by hand with k_Cu = 398:
// laminate 1.6 − 4·0.035 = 1.46 mm;
// in-plane (398·0.07 + (0.2·398 + 0.8·1.059)·0.07 + 1.059·1.46)/1.6
// = (27.86 + 5.6313 + 1.5461)/1.6 = 21.898 W/(m K);
// a signal layer through the thickness 1/(0.2/398 + 0.8/0.343) = 0.42866,
// so through-plane 1.6/(1.46/0.343 + 0.07/398 + 0.07/0.42866)
// = 1.6/(4.2566 + 0.000176 + 0.1633) = 0.36199 W/(m K).
func TestBoardConductivity(t *testing.T) {
	plane := CopperLayer{Thickness: 35e-6, Coverage: 1}
	signal := CopperLayer{Thickness: 35e-6, Coverage: 0.2}
	kin, kth, err := BoardConductivity(1.059, 0.343, 1.6e-3, []CopperLayer{signal, plane, plane, signal})
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(kin-21.898) > 1e-3 || math.Abs(kth-0.36199) > 1e-5 {
		t.Errorf("k_in %.6g, k_through %.6g; want 21.898 and 0.36199 (by hand)", kin, kth)
	}
	// Without copper, or with copper of no coverage, the laminate.
	for _, cu := range [][]CopperLayer{nil, {{Thickness: 70e-6, Coverage: 0}}} {
		kin, kth, err := BoardConductivity(1.059, 0.343, 1.6e-3, cu)
		if err != nil || math.Abs(kin-1.059) > 1e-12 || math.Abs(kth-0.343) > 1e-12 {
			t.Errorf("%v: %g, %g, %v; want the laminate's 1.059, 0.343", cu, kin, kth, err)
		}
	}
	// The JEDEC JESD51-7 high effective conductivity (2s2p) test board:
	// 1.6 mm of FR-4, two buried 1 oz (35 µm) planes, two 2 oz (70 µm)
	// signal layers of sparse traces (stack from memory; 10 % coverage
	// assumed here). Its effective in-plane conductivity is commonly
	// taken as about 15–40 W/(m K) and its through-plane as 0.3–0.5
	// (ranges from memory, a rule of thumb).
	outer := CopperLayer{Thickness: 70e-6, Coverage: 0.1}
	kin, kth, err = BoardConductivity(1.059, 0.343, 1.6e-3, []CopperLayer{outer, plane, plane, outer})
	if err != nil {
		t.Fatal(err)
	}
	if kin < 15 || kin > 40 || kth < 0.3 || kth > 0.5 {
		t.Errorf("2s2p board: k_in %g, k_through %g W/(m K)", kin, kth)
	}
	t.Logf("2s2p board: k_in %.4g, k_through %.4g W/(m K)", kin, kth)
	for _, c := range []struct {
		kin, kth, th float64
		cu           []CopperLayer
		want         string
	}{
		{0, 0.3, 1.6e-3, nil, "laminate in-plane conductivity must be a positive number, got 0"},
		{1, 0.3, -1, nil, "board thickness must be a positive number, got -1"},
		{1, 0.3, 1.6e-3, []CopperLayer{{Thickness: 0, Coverage: 1}}, "copper layer 1: thickness must be a positive number, got 0"},
		{1, 0.3, 1.6e-3, []CopperLayer{plane, {Thickness: 35e-6, Coverage: 1.5}}, "copper layer 2: coverage must be between 0 and 1, got 1.5"},
		{1, 0.3, 0.05e-3, []CopperLayer{plane, plane}, "the copper layers (0.07 mm together) leave no laminate in a board 0.05 mm thick"},
	} {
		if _, _, err := BoardConductivity(c.kin, c.kth, c.th, c.cu); err == nil || err.Error() != c.want {
			t.Errorf("got %v, want %q", err, c.want)
		}
	}
}

// On a printed board taken as one layer (FaceAtCentre), a footprint's
// conductance reaches the cells' centres whole: the shares are
// Total·A_overlap/A_region with no half cell in series, while the same
// footprint on a plain layer of the same conductivities has it.
func TestPlateFaceAtCentre(t *testing.T) {
	for _, board := range []bool{true, false} {
		p, err := NewPlate(Plate{Name: "pcb", Width: 0.04, Length: 0.03, NX: 4, NY: 3, Base: 0, View: -1,
			Layers: []PlateLayer{{Thickness: 1.6e-3, KIn: 22, KThrough: 0.36, Cells: 1, FaceAtCentre: board}},
			Joins:  []PlateJoin{{Name: "part", Face: Top, Region: Rect{X0: 0.005, Y0: 0.005, X1: 0.02, Y1: 0.015}, Node: 12, Total: 0.25}}})
		if err != nil {
			t.Fatal(err)
		}
		want := map[int32]float64{}
		for c, a := range map[int32]float64{0: 5e-3 * 5e-3, 1: 10e-3 * 5e-3, 4: 5e-3 * 5e-3, 5: 10e-3 * 5e-3} {
			g := 0.25 * a / (15e-3 * 10e-3)
			if !board {
				h := 2 * 0.36 * a / 1.6e-3 // half of the 1.6 mm cell, by hand
				g = g * h / (g + h)
			}
			want[c] = g
		}
		checkShares(t, fmt.Sprintf("board %v", board), p.joins[0], want)
	}
}
