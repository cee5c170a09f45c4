package solve

import (
	"errors"
	"fmt"
	"math"
	"testing"

	"github.com/heatgraph/heatgraph/sparse"
)

// funcProblem is a dense test problem given by closures. Its equations'
// magnitudes are mag(x) when given, else scale for every equation.
type funcProblem struct {
	n       int
	f       func(x, f []float64) error
	jac     func(x []float64, j [][]float64)
	mag     func(x, m []float64)
	scale   float64
	maxStep float64
	kinds   []Kind
	kindOf  []int
}

func (p *funcProblem) Size() int { return p.n }
func (p *funcProblem) Kinds() []Kind {
	if p.kinds != nil {
		return p.kinds
	}
	return []Kind{{Name: "x", Unit: "1", Equation: "f", EquationUnit: "1", Scale: 1, MaxStep: p.maxStep}}
}
func (p *funcProblem) KindOf(i int) int {
	if p.kindOf != nil {
		return p.kindOf[i]
	}
	return 0
}
func (p *funcProblem) Name(i int) string { return fmt.Sprintf("x%d", i) }
func (p *funcProblem) Pattern() *sparse.Matrix {
	b := sparse.NewBuilder(p.n)
	for i := 0; i < p.n; i++ {
		for j := 0; j < p.n; j++ {
			b.Mark(i, j)
		}
	}
	return b.Build()
}
func (p *funcProblem) Evaluate(x, f []float64, jac *sparse.Matrix, mag []float64) error {
	if err := p.f(x, f); err != nil {
		return err
	}
	if mag != nil {
		if p.mag != nil {
			p.mag(x, mag)
		} else {
			for i := range mag {
				mag[i] = p.scale
			}
		}
	}
	if jac != nil {
		jac.Zero()
		j := make([][]float64, p.n)
		for i := range j {
			j[i] = make([]float64, p.n)
		}
		p.jac(x, j)
		for r := range j {
			for c, v := range j[r] {
				jac.Add(r, c, v)
			}
		}
	}
	return nil
}

// A sphere of radius 1 losing heat by radiation only, σT⁴ = 1000 W/m² gives
// T = (1000/σ)^¼ = 364.42 K (Stefan–Boltzmann law, hand calculation).
func TestNewtonRadiationBalance(t *testing.T) {
	const sigma = 5.670374419e-8
	p := &funcProblem{n: 1, scale: 1000,
		f:   func(x, f []float64) error { f[0] = 1000 - sigma*math.Pow(x[0], 4); return nil },
		jac: func(x []float64, j [][]float64) { j[0][0] = -4 * sigma * math.Pow(x[0], 3) },
	}
	var seen []Iterate
	r := Newton(p, []float64{300}, Settings{Monitor: func(it Iterate) { seen = append(seen, it) }})
	if r.Reason != Converged {
		t.Fatalf("reason %v", r.Reason)
	}
	want := math.Pow(1000/sigma, 0.25)
	if math.Abs(r.X[0]-want) > 1e-9 {
		t.Errorf("T = %.12g, want %.12g", r.X[0], want)
	}
	if len(seen) != r.Iterations-1 || seen[len(seen)-1].Scaled > DefaultResidualTolerance {
		t.Errorf("monitor saw %d iterations of %d; last %+v", len(seen), r.Iterations, seen[len(seen)-1])
	}
}

// A linear problem converges in two iterations: one step, one confirmation.
func TestNewtonLinear(t *testing.T) {
	// 2x + y = 5, x + 3y = 10 -> x = 1, y = 3.
	p := &funcProblem{n: 2, scale: 10,
		f: func(x, f []float64) error {
			f[0] = 5 - 2*x[0] - x[1]
			f[1] = 10 - x[0] - 3*x[1]
			return nil
		},
		jac: func(_ []float64, j [][]float64) { j[0][0], j[0][1], j[1][0], j[1][1] = -2, -1, -1, -3 },
	}
	r := Newton(p, []float64{0, 0}, Settings{})
	if r.Reason != Converged || r.Iterations != 2 {
		t.Fatalf("reason %v after %d iterations", r.Reason, r.Iterations)
	}
	if math.Abs(r.X[0]-1) > 1e-12 || math.Abs(r.X[1]-3) > 1e-12 {
		t.Errorf("x = %v, want [1 3]", r.X)
	}
}

func TestNewtonSingular(t *testing.T) {
	p := &funcProblem{n: 2, scale: 1,
		f: func(x, f []float64) error {
			f[0] = 1 - x[0] - x[1]
			f[1] = 2 - x[0] - x[1]
			return nil
		},
		jac: func(_ []float64, j [][]float64) { j[0][0], j[0][1], j[1][0], j[1][1] = -1, -1, -1, -1 },
	}
	r := Newton(p, []float64{0, 0}, Settings{})
	if r.Reason != SingularJacobian || !errors.Is(r.Err, ErrSingular) {
		t.Fatalf("reason %v, err %v; want singular", r.Reason, r.Err)
	}
	if r.Reason.Converged() {
		t.Error("a singular stop must not count as converged")
	}
}

// x² + 1 = 0 has no real root: the iteration must say so, not return a
// value as a solution.
func TestNewtonNoSolution(t *testing.T) {
	p := &funcProblem{n: 1, scale: 1,
		f:   func(x, f []float64) error { f[0] = x[0]*x[0] + 1; return nil },
		jac: func(x []float64, j [][]float64) { j[0][0] = 2 * x[0] },
	}
	r := Newton(p, []float64{0.5}, Settings{MaxIterations: 50})
	if r.Reason == Converged {
		t.Fatalf("converged to %v on a problem with no solution", r.X)
	}
}

// Steps into the problem's domain boundary are shortened, not taken.
func TestNewtonDomain(t *testing.T) {
	// √x = 3 from x = 100: the full Newton step would land at x < 0.
	errDomain := errors.New("negative")
	p := &funcProblem{n: 1, scale: 1,
		f: func(x, f []float64) error {
			if x[0] <= 0 {
				return errDomain
			}
			f[0] = 3 - math.Sqrt(x[0])
			return nil
		},
		jac: func(x []float64, j [][]float64) { j[0][0] = -0.5 / math.Sqrt(x[0]) },
	}
	r := Newton(p, []float64{1e4}, Settings{})
	if r.Reason != Converged || math.Abs(r.X[0]-9) > 1e-9 {
		t.Fatalf("reason %v, x %v; want 9", r.Reason, r.X)
	}
	r = Newton(p, []float64{-1}, Settings{})
	if r.Reason != InvalidStart || !errors.Is(r.Err, errDomain) {
		t.Errorf("start outside the domain: reason %v, err %v", r.Reason, r.Err)
	}
}

func TestNewtonMaxChange(t *testing.T) {
	p := &funcProblem{n: 1, scale: 1,
		f:   func(x, f []float64) error { f[0] = 1000 - x[0]; return nil },
		jac: func(_ []float64, j [][]float64) { j[0][0] = -1 },
	}
	p.maxStep = 50
	var first Iterate
	r := Newton(p, []float64{0}, Settings{Monitor: func(it Iterate) {
		if it.Iteration == 1 {
			first = it
		}
	}})
	if r.Reason != Converged || first.Step != 50 {
		t.Errorf("reason %v, first step %g; want converged with a first step of 50", r.Reason, first.Step)
	}
}

func TestStopReasonStrings(t *testing.T) {
	for r := Converged; r <= LeftDomain; r++ {
		if r.String() == "" || r.String() == "unknown stop reason" {
			t.Errorf("reason %d has no name", r)
		}
	}
	if StopReason(99).String() != "unknown stop reason" {
		t.Error("unknown reason")
	}
}

func TestNewtonEmpty(t *testing.T) {
	p := &funcProblem{n: 0, scale: 1}
	if r := Newton(p, nil, Settings{}); r.Reason != Converged {
		t.Errorf("empty problem: %v", r.Reason)
	}
}

// A dissipation with zero slope at the start, q = x^(5/4) as in laminar
// natural convection (h ∝ ΔT^¼), makes the first Jacobian singular; the
// pseudo-transient step must get the iteration going. Root of
// 8 − x^(5/4): x = 8^(4/5) = 5.278 (hand calculation).
func TestNewtonZeroSlopeStart(t *testing.T) {
	p := &funcProblem{n: 1, scale: 8,
		f: func(x, f []float64) error {
			f[0] = 8 - math.Pow(math.Max(x[0], 0), 1.25)
			return nil
		},
		jac: func(x []float64, j [][]float64) { j[0][0] = -1.25 * math.Pow(math.Max(x[0], 0), 0.25) },
	}
	r := Newton(p, []float64{0}, Settings{})
	if r.Reason != Converged {
		t.Fatalf("reason %v after %d iterations", r.Reason, r.Iterations)
	}
	if want := math.Pow(8, 0.8); math.Abs(r.X[0]-want) > 1e-9 {
		t.Errorf("x = %.12g, want %.12g", r.X[0], want)
	}
}
