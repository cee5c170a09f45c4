package sparse

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"
)

// Multigrid-preconditioned solvers against the dense solution, and the
// property that makes multigrid worth having: an iteration count that does
// not grow with the grid (here: at most 25 iterations on every grid, where
// IC(0) needs ever more; 40 on the random networks with conductances over
// six decades).
func TestAMGAgainstDense(t *testing.T) {
	rng := rand.New(rand.NewPCG(41, 42))
	cases := map[string]*Matrix{
		"grid2D 40×40":   grid2D(40, 40, rng),
		"grid2D 150×150": grid2D(150, 150, rng),
		"grid3D 12³":     grid3D(12, 12, 12, rng),
		"network 900":    network(900, rng, false),
		"streams 900":    network(900, rng, true),
		"grid2D 3×3":     grid2D(3, 3, rng),
		"grid3D 2×2×90":  grid3D(2, 2, 90, rng),
	}
	for name, a := range cases {
		amg := &AMG{MaxCoarse: 50}
		var s Iterative
		if IsSymmetric(a, 1e-12) {
			s = &CG{iterBase{Precond: amg}}
		} else {
			s = &BiCGStab{iterBase{Precond: amg}}
		}
		if err := s.Factorize(a); err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		b := randVec(a.N, rng)
		x := make([]float64, a.N)
		if err := s.Solve(x, b); err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		it, res := s.Stats()
		if got := relResidual(a, x, b); got > DefaultTol {
			t.Errorf("%s: residual %.3g", name, got)
		}
		if a.N <= 2000 {
			if e := relErr(x, denseSolve(t, a, b, false)); e > 1e-6 {
				t.Errorf("%s: error %.3g against gonum dense LU", name, e)
			}
		}
		limit := 25
		if a.N == 900 {
			limit = 40
		}
		if it > limit {
			t.Errorf("%s: %d iterations, want ≤ %d", name, it, limit)
		}
		t.Logf("%s: levels %v, %d iterations, residual %.2g", name, amg.Levels(), it, res)
	}
}

// Reusing the aggregates for new values of the same pattern gives the
// same hierarchy sizes and still converges.
func TestAMGReuse(t *testing.T) {
	rng := rand.New(rand.NewPCG(43, 44))
	a := grid2D(30, 30, rng)
	amg := &AMG{ReuseAggregates: true, MaxCoarse: 20}
	s := &CG{iterBase{Precond: amg}}
	if err := s.Factorize(a); err != nil {
		t.Fatal(err)
	}
	first := amg.Levels()
	agg := amg.levels[0].agg
	a = grid2D(30, 30, rng) // new values, same pattern
	if err := s.Factorize(a); err != nil {
		t.Fatal(err)
	}
	if &amg.levels[0].agg[0] != &agg[0] {
		t.Error("the aggregates were rebuilt")
	}
	if got := amg.Levels(); len(got) != len(first) || got[1] != first[1] {
		t.Errorf("levels %v, first %v", got, first)
	}
	b := randVec(a.N, rng)
	x := make([]float64, a.N)
	if err := s.Solve(x, b); err != nil {
		t.Fatal(err)
	}
	if e := relErr(x, denseSolve(t, a, b, false)); e > 1e-6 {
		t.Errorf("error %.3g", e)
	}
}

func TestAMGSingular(t *testing.T) {
	a := grid2D(30, 30, rand.New(rand.NewPCG(45, 46)))
	i := 77
	for k := a.RowPtr[i]; k < a.RowPtr[i+1]; k++ {
		a.Val[k] = 0
	}
	s := &CG{iterBase{Precond: &AMG{}}}
	if err := s.Factorize(a); !errors.Is(err, ErrSingular) {
		t.Errorf("error %v, want ErrSingular", err)
	}
}

// Renew rebuilds the aggregates too: a hierarchy first built on a matrix
// whose diagonal outweighs its couplings (an early, short step of a
// transient: capacity over the step above the conductances) coarsens
// little, and its aggregates kept for the conduction matrix cost CG nearly
// three times the iterations (38 against 13 on this 60 × 60 grid).
func TestAMGRenewAggregatesAgain(t *testing.T) {
	rng := rand.New(rand.NewPCG(53, 54))
	a := grid2D(60, 60, rng)
	heavy := &Matrix{N: a.N, RowPtr: a.RowPtr, Col: a.Col, Val: append([]float64(nil), a.Val...)}
	for i := 0; i < a.N; i++ {
		heavy.Add(i, i, -10)
	}
	amg := &AMG{ReuseAggregates: true, Lag: true}
	s := &CG{iterBase{Precond: amg}}
	if err := s.Factorize(heavy); err != nil {
		t.Fatal(err)
	}
	first := amg.Levels()
	amg.Renew()
	if err := s.Factorize(a); err != nil {
		t.Fatal(err)
	}
	again := amg.Levels()
	t.Logf("levels %v, then %v", first, again)
	if len(again) < 2 || len(first) > 1 && again[1] >= first[1] {
		t.Errorf("levels %v on the conduction matrix after Renew, %v on the nearly diagonal one: want real coarsening", again, first)
	}
	b := randVec(a.N, rng)
	x := make([]float64, a.N)
	if err := s.Solve(x, b); err != nil {
		t.Fatal(err)
	}
	it, _ := s.Stats()
	t.Logf("%d CG iterations after Renew", it)
	if it > 25 {
		t.Errorf("%d CG iterations after Renew, want at most 25", it)
	}
}

// A lagging hierarchy: after new values (the diagonal made several times
// stronger, as radiation does when a board heats up) CG still solves the
// new matrix to its tolerance with the old coarse levels, or with new
// ones when it judged the old too slow; Renew forces a new hierarchy.
func TestAMGLag(t *testing.T) {
	rng := rand.New(rand.NewPCG(45, 46))
	a := grid2D(30, 30, rng)
	amg := &AMG{ReuseAggregates: true, Lag: true, MaxCoarse: 40}
	s := &CG{iterBase{Precond: amg}}
	b := randVec(a.N, rng)
	x := make([]float64, a.N)
	for step, grow := range []float64{0, 1e-3, 0.1, 3} {
		for i := 0; i < a.N; i++ {
			a.Add(i, i, -grow*float64(i%7))
		}
		lagStep(t, s, amg, a, x, b, step, step < 2)
	}
	renewed(t, s, amg, a)
}

// lagStep factorizes a with the lagging hierarchy amg, checks that the
// hierarchy was built only at step 0 (when judged), and that the solve
// meets its tolerance and agrees with gonum's dense LU.
func lagStep(t *testing.T, s Solver, amg *AMG, a *Matrix, x, b []float64, step int, judged bool) {
	t.Helper()
	if err := s.Factorize(a); err != nil {
		t.Fatal(err)
	}
	if fresh := amg.Fresh(); judged && fresh != (step == 0) {
		t.Errorf("step %d: fresh %v, want %v", step, fresh, step == 0)
	}
	if err := s.Solve(x, b); err != nil {
		t.Fatalf("step %d: %v", step, err)
	}
	if got := relResidual(a, x, b); got > DefaultTol {
		t.Errorf("step %d: residual %.3g", step, got)
	}
	if e := relErr(x, denseSolve(t, a, b, false)); e > 1e-6 {
		t.Errorf("step %d: error %.3g against gonum dense LU", step, e)
	}
}

// renewed checks that Renew makes the next Factorize build a hierarchy.
func renewed(t *testing.T, s Solver, amg *AMG, a *Matrix) {
	t.Helper()
	amg.Renew()
	if err := s.Factorize(a); err != nil || !amg.Fresh() {
		t.Fatalf("after Renew: %v, fresh %v", err, amg.Fresh())
	}
}

// BiCGStab judges a lagging hierarchy as CG does: on a grid with a weak
// air stream along one line (unsymmetric values) it keeps the first
// hierarchy while the values change a little, still solves every matrix to
// its tolerance, and takes a new hierarchy after Renew.
func TestAMGLagBiCGStab(t *testing.T) {
	rng := rand.New(rand.NewPCG(49, 50))
	const nx = 30
	st := newStamp(nx * nx)
	for y := 0; y < nx; y++ {
		for x := 0; x < nx; x++ {
			i := y*nx + x
			if x+1 < nx {
				st.conductance(i, i+1, 0.5+rng.Float64())
			}
			if y+1 < nx {
				st.conductance(i, i+nx, 0.5+rng.Float64())
			}
		}
		st.ground(y*nx, 2)
	}
	for x := 0; x+1 < nx; x++ {
		st.stream(nx*nx/2+x, nx*nx/2+x+1, 0.3)
	}
	a := st.build()
	if IsSymmetric(a, 1e-12) {
		t.Fatal("the stream left the matrix symmetric")
	}
	amg := &AMG{ReuseAggregates: true, Lag: true, MaxCoarse: 40}
	s := &BiCGStab{iterBase{Precond: amg}}
	b := randVec(a.N, rng)
	x := make([]float64, a.N)
	for step, grow := range []float64{0, 1e-3, 1e-2} {
		for i := 0; i < a.N; i++ {
			a.Add(i, i, -grow*float64(i%7))
		}
		lagStep(t, s, amg, a, x, b, step, true)
	}
	renewed(t, s, amg, a)
}

// On vectors long enough to be split into blocks worked on in parallel,
// a solve gives the same bits every time.
func TestParallelDeterministic(t *testing.T) {
	rng := rand.New(rand.NewPCG(47, 48))
	a := grid2D(140, 140, rng)
	if a.N < parallelRows {
		t.Fatalf("%d rows: too few to split", a.N)
	}
	b := randVec(a.N, rng)
	var first []float64
	for run := 0; run < 3; run++ {
		s := &CG{iterBase{Precond: &AMG{}}}
		if err := s.Factorize(a); err != nil {
			t.Fatal(err)
		}
		x := make([]float64, a.N)
		if err := s.Solve(x, b); err != nil {
			t.Fatal(err)
		}
		if got := relResidual(a, x, b); got > DefaultTol {
			t.Fatalf("residual %.3g", got)
		}
		if first == nil {
			first = x
			continue
		}
		for i := range x {
			if x[i] != first[i] {
				t.Fatalf("run %d differs at %d: %v against %v", run, i, x[i], first[i])
			}
		}
	}
}

// The Galerkin product of a multigrid level against a plain triple sum
// Σ_i Σ_k r_Ii·a_ik·p_kJ kept in a map, on grids small and large enough
// for the product to split its rows between blocks: same entries (the
// diagonal always stored), sorted rows, equal values to round-off.
func TestGalerkinAgainstTripleSum(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	for name, a := range map[string]*Matrix{
		"grid2D 30×30":   grid2D(30, 30, rng),
		"grid3D 9³":      grid3D(9, 9, 9, rng),
		"grid2D 400×400": grid2D(400, 400, rng),
		"network 700":    network(700, rng, false),
	} {
		var nw narrowing
		top, err := nw.op(a)
		if err != nil {
			t.Fatal(err)
		}
		l := &amgLevel{a: top}
		if err := l.setDiag(); err != nil {
			t.Fatal(err)
		}
		l.findStrong(DefaultAMGTheta)
		l.aggregate()
		l.prolongation(true)
		got := galerkin(l.r, top, l.p)
		want := make([]map[int]float64, l.nagg)
		for ci := range want {
			want[ci] = map[int]float64{ci: 0}
			for q := l.r.ptr[ci]; q < l.r.ptr[ci+1]; q++ {
				i := int(l.r.col[q])
				for k := a.RowPtr[i]; k < a.RowPtr[i+1]; k++ {
					j := a.Col[k]
					for s := l.p.ptr[j]; s < l.p.ptr[j+1]; s++ {
						want[ci][int(l.p.col[s])] += l.r.val[q] * a.Val[k] * l.p.val[s]
					}
				}
			}
		}
		if got.N != l.nagg {
			t.Fatalf("%s: order %d, want %d", name, got.N, l.nagg)
		}
		scale := 0.0
		for _, v := range a.Val {
			scale = math.Max(scale, math.Abs(v))
		}
		for ci := 0; ci < got.N; ci++ {
			row := got.Col[got.RowPtr[ci]:got.RowPtr[ci+1]]
			if len(row) != len(want[ci]) {
				t.Fatalf("%s: row %d has %d entries, want %d", name, ci, len(row), len(want[ci]))
			}
			for k, c := range row {
				if k > 0 && c <= row[k-1] {
					t.Fatalf("%s: row %d not sorted: %v", name, ci, row)
				}
				w, ok := want[ci][int(c)]
				if !ok {
					t.Fatalf("%s: entry (%d, %d) not in the product", name, ci, c)
				}
				if v := got.Val[got.RowPtr[ci]+k]; math.Abs(v-w) > 1e-12*scale {
					t.Errorf("%s: entry (%d, %d) = %g, want %g", name, ci, c, v, w)
				}
			}
		}
		if got.Index(0, 0) < 0 {
			t.Errorf("%s: no diagonal", name)
		}
	}
}

// A node joined weakly to many (a component's junction over the cells of
// its footprint, the invented case of a 120×120 board with a 40×40
// footprint, 0.01 of a cell-to-cell conductance per cell) must not spread
// its row of the prolongation over every aggregate of the footprint: the
// filtered smoother leaves its row empty, every row of P stays as short
// as on the plain grid, and CG with the hierarchy converges as fast.
func TestAMGWeaklyJoinedHub(t *testing.T) {
	const nx, ny, foot = 120, 120, 40
	n := nx*ny + 1
	hub := nx * ny
	s := newStamp(n)
	for y := 0; y < ny; y++ {
		for x := 0; x < nx; x++ {
			i := y*nx + x
			if x+1 < nx {
				s.conductance(i, i+1, 1)
			}
			if y+1 < ny {
				s.conductance(i, i+nx, 1)
			}
			s.ground(i, 1e-3)
			if x >= 40 && x < 40+foot && y >= 40 && y < 40+foot {
				s.conductance(i, hub, 0.01)
			}
		}
	}
	a := s.build()
	amg := &AMG{}
	if err := amg.Setup(a, -1); err != nil {
		t.Fatal(err)
	}
	top := amg.levels[0]
	longest := 0
	for i := 0; i < n; i++ {
		longest = max(longest, top.p.ptr[i+1]-top.p.ptr[i])
	}
	if got := top.p.ptr[hub+1] - top.p.ptr[hub]; got != 0 {
		t.Errorf("the hub's row of P has %d entries, want none", got)
	}
	if longest > 9 {
		t.Errorf("longest row of P %d entries, want at most 9 on a five-point grid", longest)
	}
	cg := &CG{iterBase{Precond: amg}}
	if err := cg.Factorize(a); err != nil {
		t.Fatal(err)
	}
	b := randVec(n, rand.New(rand.NewPCG(3, 4)))
	x := make([]float64, n)
	if err := cg.Solve(x, b); err != nil {
		t.Fatal(err)
	}
	if it, _ := cg.Stats(); it > 25 {
		t.Errorf("%d CG iterations, want at most 25", it)
	}
	if r := relResidual(a, x, b); r > DefaultTol {
		t.Errorf("residual %.3g", r)
	}
	t.Logf("levels %v, longest row of P %d", amg.Levels(), longest)
}
