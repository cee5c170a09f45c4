package sparse

import (
	"fmt"
	"math/rand/v2"
	"sync"
	"testing"
	"time"
)

// Benchmark problems: 2-D five-point and 3-D seven-point conduction grids
// of about 1e4 and 1e5 unknowns; the "streams" variants add an upwind air
// stream along every fourth line of x, leaving to the ambient at the far
// end, which makes the values unsymmetric.
var benchProblems = []struct {
	name       string
	nx, ny, nz int
}{
	{"2D-1e4", 100, 100, 1},
	{"2D-1e5", 316, 316, 1},
	{"3D-1e4", 22, 22, 22},
	{"3D-1e5", 46, 46, 46},
}

var (
	benchMu    sync.Mutex
	benchCache = map[string]*Matrix{}
)

func benchMatrix(name string, nx, ny, nz int, streams bool) *Matrix {
	benchMu.Lock()
	defer benchMu.Unlock()
	key := fmt.Sprint(name, streams)
	if a, ok := benchCache[key]; ok {
		return a
	}
	rng := rand.New(rand.NewPCG(uint64(nx), uint64(nz)))
	var a *Matrix
	if nz == 1 {
		a = grid2D(nx, ny, rng)
	} else {
		a = grid3D(nx, ny, nz, rng)
	}
	if streams {
		for z := 0; z < nz; z++ {
			for y := 0; y < ny; y += 4 {
				for x := 1; x < nx; x++ {
					up, down := x-1+nx*(y+ny*z), x+nx*(y+ny*z)
					a.Add(up, up, -0.7)
					a.Add(down, up, 0.7)
				}
				last := nx - 1 + nx*(y+ny*z)
				a.Add(last, last, -0.7)
			}
		}
	}
	benchCache[key] = a
	return a
}

func BenchmarkAnalyse(b *testing.B) {
	for _, p := range benchProblems {
		b.Run(p.name, func(b *testing.B) {
			a := benchMatrix(p.name, p.nx, p.ny, p.nz, false)
			b.ReportAllocs()
			var s *Symbolic
			cpu0 := cpuTime()
			for b.Loop() {
				var err error
				if s, err = Analyse(a); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(cpuTime()-cpu0)/1e6/float64(b.N), "cpu-ms/op")
			b.ReportMetric(float64(s.NNZL()), "nnzL")
			b.ReportMetric(s.Flops(), "flops")
		})
	}
}

// BenchmarkFactorSolve times one Factorize and one Solve (the work of a
// Newton step) after a single Analyse. It reports the processor time
// (cpu-ms/op, steadier than the wall time on a shared machine), the wall
// time of each phase, the iterations, and the size of a direct factor.
func BenchmarkFactorSolve(b *testing.B) {
	solvers := []struct {
		name    string
		streams bool
		make    func() Solver
	}{
		{"cholesky", false, func() Solver { return NewCholesky() }},
		{"supernodal", false, func() Solver { return NewSupernodal() }},
		{"lu", true, func() Solver { return NewLU() }},
		{"cg-ic0", false, func() Solver { return NewCG() }},
		{"cg-jacobi", false, func() Solver { return &CG{iterBase{Precond: &Jacobi{}}} }},
		{"bicgstab-ilu0", true, func() Solver { return NewBiCGStab() }},
		{"cg-amg", false, func() Solver { return &CG{iterBase{Precond: &AMG{ReuseAggregates: true}}} }},
		{"bicgstab-amg", true, func() Solver { return &BiCGStab{iterBase{Precond: &AMG{ReuseAggregates: true}}} }},
		{"auto", false, func() Solver { return &AutoSolver{} }},
		{"auto-streams", true, func() Solver { return &AutoSolver{} }},
	}
	for _, p := range benchProblems {
		for _, sv := range solvers {
			b.Run(p.name+"/"+sv.name, func(b *testing.B) {
				a := benchMatrix(p.name, p.nx, p.ny, p.nz, sv.streams)
				s := sv.make()
				if err := s.Analyse(a); err != nil {
					b.Fatal(err)
				}
				rhs := randVec(a.N, rand.New(rand.NewPCG(1, 2)))
				x := make([]float64, a.N)
				if _, ok := s.(*AutoSolver); ok {
					// Auto builds its factor's structures at the first
					// Factorize, once the values show which it needs.
					if err := s.Factorize(a); err != nil {
						b.Fatal(err)
					}
				}
				b.ReportAllocs()
				cpu0 := cpuTime()
				var factor, solve time.Duration
				for b.Loop() {
					t0 := time.Now()
					if err := s.Factorize(a); err != nil {
						b.Fatal(err)
					}
					t1 := time.Now()
					if err := s.Solve(x, rhs); err != nil {
						b.Fatal(err)
					}
					factor += t1.Sub(t0)
					solve += time.Since(t1)
				}
				b.ReportMetric(float64(cpuTime()-cpu0)/1e6/float64(b.N), "cpu-ms/op")
				b.ReportMetric(float64(factor)/1e6/float64(b.N), "factor-ms/op")
				b.ReportMetric(float64(solve)/1e6/float64(b.N), "solve-ms/op")
				switch f := s.(type) {
				case *Cholesky:
					b.ReportMetric(float64(f.NNZ()*12)/1e6, "factorMB")
				case *Supernodal:
					b.ReportMetric(float64(f.NNZ()*8)/1e6, "factorMB")
				case *LU:
					b.ReportMetric(float64(f.NNZ()*20/2)/1e6, "factorMB")
				case Iterative:
					it, _ := f.Stats()
					b.ReportMetric(float64(it), "iters")
				}
				if f, ok := s.(*AutoSolver); ok {
					d, w := f.Work()
					b.Logf("auto chose %s (factor %.3g, iterative %.3g)", f.Kind(), d, w)
				}
			})
		}
	}
}
