package sparse

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// stamp is a test network under construction: links stamp both (i,j) and
// (j,i) into the pattern, conductances give −g on the diagonal and +g off
// it, as a thermal Jacobian has.
type stamp struct {
	n    int
	b    *Builder
	ops  []func(m *Matrix)
	seed uint64
}

func newStamp(n int) *stamp { return &stamp{n: n, b: NewBuilder(n)} }

func (s *stamp) conductance(i, j int, g float64) {
	s.b.Mark(i, j)
	s.b.Mark(j, i)
	s.ops = append(s.ops, func(m *Matrix) {
		m.Add(i, i, -g)
		m.Add(j, j, -g)
		m.Add(i, j, g)
		m.Add(j, i, g)
	})
}

// ground links node i to a fixed temperature.
func (s *stamp) ground(i int, g float64) {
	s.ops = append(s.ops, func(m *Matrix) { m.Add(i, i, -g) })
}

// stream carries heat m·c from up to down (upwind): only the downstream
// row gets the upstream temperature, the upstream row loses it. The last
// node of a stream passes its heat to the ambient: ground(last, m·c).
func (s *stamp) stream(up, down int, mc float64) {
	s.b.Mark(up, down)
	s.b.Mark(down, up)
	s.ops = append(s.ops, func(m *Matrix) {
		m.Add(up, up, -mc)
		m.Add(down, up, mc)
	})
}

func (s *stamp) build() *Matrix {
	m := s.b.Build()
	for _, op := range s.ops {
		op(m)
	}
	return m
}

// grid2D is an nx×ny five-point conduction grid with random conductances,
// grounded along the edge x = 0.
func grid2D(nx, ny int, rng *rand.Rand) *Matrix {
	s := newStamp(nx * ny)
	id := func(x, y int) int { return x + nx*y }
	for y := 0; y < ny; y++ {
		for x := 0; x < nx; x++ {
			if x+1 < nx {
				s.conductance(id(x, y), id(x+1, y), 0.5+rng.Float64())
			}
			if y+1 < ny {
				s.conductance(id(x, y), id(x, y+1), 0.5+rng.Float64())
			}
		}
		s.ground(id(0, y), 2)
	}
	return s.build()
}

// grid3D is an n³-ish seven-point grid grounded on the face z = 0.
func grid3D(nx, ny, nz int, rng *rand.Rand) *Matrix {
	s := newStamp(nx * ny * nz)
	id := func(x, y, z int) int { return x + nx*(y+ny*z) }
	for z := 0; z < nz; z++ {
		for y := 0; y < ny; y++ {
			for x := 0; x < nx; x++ {
				if x+1 < nx {
					s.conductance(id(x, y, z), id(x+1, y, z), 0.5+rng.Float64())
				}
				if y+1 < ny {
					s.conductance(id(x, y, z), id(x, y+1, z), 0.5+rng.Float64())
				}
				if z+1 < nz {
					s.conductance(id(x, y, z), id(x, y, z+1), 0.5+rng.Float64())
				}
				if z == 0 {
					s.ground(id(x, y, z), 2)
				}
			}
		}
	}
	return s.build()
}

// network is a random irregular network: a spanning chain so it is
// connected, extra random links with conductances over six decades, a few
// grounded nodes, and (if streams) upwind air streams along random paths.
func network(n int, rng *rand.Rand, streams bool) *Matrix {
	s := newStamp(n)
	perm := rng.Perm(n)
	for k := 1; k < n; k++ {
		s.conductance(perm[k-1], perm[k], math.Pow(10, 3*rng.Float64()-1))
	}
	for k := 0; k < 2*n; k++ {
		i, j := rng.IntN(n), rng.IntN(n)
		if i != j {
			s.conductance(i, j, math.Pow(10, 6*rng.Float64()-3))
		}
	}
	for k := 0; k < 1+n/20; k++ {
		s.ground(rng.IntN(n), 0.1+rng.Float64())
	}
	if streams {
		// Each stream enters from the ambient (no Jacobian entry), passes
		// through a few nodes and leaves to the ambient from the last.
		for k := 0; k < 1+n/10; k++ {
			up := rng.IntN(n)
			mc := 0.5 + 2*rng.Float64()
			for l := 0; l < 4; l++ {
				down := rng.IntN(n)
				if down != up {
					s.stream(up, down, mc)
					up = down
				}
			}
			s.ground(up, mc) // the outlet
		}
	}
	return s.build()
}

func dense(a *Matrix) *mat.Dense {
	d := mat.NewDense(a.N, a.N, nil)
	for i := 0; i < a.N; i++ {
		for k := a.RowPtr[i]; k < a.RowPtr[i+1]; k++ {
			d.Set(i, a.Col[k], a.Val[k])
		}
	}
	return d
}

// denseSolve solves with gonum's dense LU (transposed if trans).
func denseSolve(t *testing.T, a *Matrix, b []float64, trans bool) []float64 {
	t.Helper()
	var lu mat.LU
	lu.Factorize(dense(a))
	x := mat.NewVecDense(a.N, nil)
	if err := lu.SolveVecTo(x, trans, mat.NewVecDense(a.N, b)); err != nil {
		t.Fatalf("dense solve: %v", err)
	}
	return x.RawVector().Data
}

func randVec(n int, rng *rand.Rand) []float64 {
	v := make([]float64, n)
	for i := range v {
		v[i] = rng.NormFloat64()
	}
	return v
}

// relErr is ‖x − y‖∞ / ‖y‖∞.
func relErr(x, y []float64) float64 {
	num, den := 0.0, 0.0
	for i := range x {
		num = math.Max(num, math.Abs(x[i]-y[i]))
		den = math.Max(den, math.Abs(y[i]))
	}
	return num / den
}

// relResidual is ‖b − A·x‖₂ / ‖b‖₂.
func relResidual(a *Matrix, x, b []float64) float64 {
	r := make([]float64, a.N)
	a.MulVec(r, x)
	for i := range r {
		r[i] = b[i] - r[i]
	}
	return norm2(r) / norm2(b)
}

func isPermutation(p []int, n int) bool {
	if len(p) != n {
		return false
	}
	seen := make([]bool, n)
	for _, i := range p {
		if i < 0 || i >= n || seen[i] {
			return false
		}
		seen[i] = true
	}
	return true
}

func identity(n int) []int {
	p := make([]int, n)
	for i := range p {
		p[i] = i
	}
	return p
}
