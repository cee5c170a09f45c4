package solve

import (
	"flag"
	"strings"
	"testing"
	"time"

	"github.com/heatgraph/heatgraph/sparse"
)

// Benchmarks of the whole steady solve of meshed plates (plate_test.go):
// boards (five-point) and blocks (seven-point) of about 1e3 … 1e6 cells.
// The 1e6 cases run only when asked for by name:
//
//	go test -run - -bench 'Plate/.*1e6' -benchtime 1x ./solve
var plateCases = []struct {
	name       string
	nx, ny, nz int
	big        bool
}{
	{"2D-1e3", 32, 32, 1, false},
	{"2D-1e4", 100, 100, 1, false},
	{"2D-1e5", 316, 316, 1, false},
	{"2D-1e6", 1000, 1000, 1, true},
	{"3D-1e3", 10, 10, 10, false},
	{"3D-1e4", 22, 22, 22, false},
	{"3D-1e5", 46, 46, 46, false},
	{"3D-1e6", 100, 100, 100, true},
}

// BenchmarkPlate times solve.Newton with its default settings from the
// ambient temperature, and reports the processor time (both cores'), the
// peak resident memory of the process (the case's own when it runs alone:
// -bench 'Plate/2D-1e6$'), the Newton iterations, the linear iterations
// of all its solves (when the solver iterates), and the time spent
// evaluating the problem.
func BenchmarkPlate(b *testing.B) {
	for _, c := range plateCases {
		b.Run(c.name, func(b *testing.B) {
			if c.big && !explicitBench() {
				b.Skip("1e6 cells: run with -bench naming it")
			}
			p := newPlate(c.nx, c.ny, c.nz)
			cp := &countingPlate{plate: p}
			x0 := p.start()
			b.ReportAllocs()
			var newton, linear int
			cpu0 := cpuTime()
			for b.Loop() {
				cp.evals, cp.spent = 0, 0
				lin := &countingLinear{LinearSolver: Auto(p.Size())}
				r := Newton(cp, x0, Settings{Linear: lin})
				if r.Reason != Converged {
					b.Fatalf("%v: %v", r.Reason, r.Err)
				}
				newton, linear = r.Iterations, lin.iters
			}
			b.ReportMetric(float64(cpuTime()-cpu0)/1e6/float64(b.N), "cpu-ms/op")
			b.ReportMetric(peakMB(), "peak-MB")
			b.ReportMetric(float64(newton), "newton")
			b.ReportMetric(float64(linear), "linear")
			b.ReportMetric(float64(cp.evals), "evals")
			b.ReportMetric(float64(cp.spent.Milliseconds()), "eval-ms")
		})
	}
}

// countingPlate times the problem's evaluations.
type countingPlate struct {
	*plate
	evals int
	spent time.Duration
}

func (c *countingPlate) Evaluate(x, f []float64, jac *sparse.Matrix, mag []float64) error {
	t := time.Now()
	err := c.plate.Evaluate(x, f, jac, mag)
	c.spent += time.Since(t)
	c.evals++
	return err
}

// countingLinear sums the iterations of an iterative linear solver.
type countingLinear struct {
	LinearSolver
	iters int
}

func (c *countingLinear) Solve(x, b []float64) error {
	err := c.LinearSolver.Solve(x, b)
	if s, ok := c.LinearSolver.(interface{ Stats() (int, float64) }); ok {
		it, _ := s.Stats()
		c.iters += it
	}
	return err
}

// SetTolerance passes an inexact Newton's tolerance on.
func (c *countingLinear) SetTolerance(rel float64) {
	if s, ok := c.LinearSolver.(interface{ SetTolerance(float64) }); ok {
		s.SetTolerance(rel)
	}
}

// explicitBench reports whether -test.bench names the 1e6 cases.
func explicitBench() bool {
	f := flag.Lookup("test.bench")
	return f != nil && strings.Contains(f.Value.String(), "1e6")
}
