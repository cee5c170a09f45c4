package solve

import (
	"errors"
	"math"

	"github.com/heatgraph/heatgraph/sparse"
)

// plate is a meshed board (nz = 1) or block (nz > 1) of square (cubic)
// cells: conduction between neighbouring cells, and from every outer face
// convection h·A·(T − T∞) and grey radiation ε·σ·A·(T⁴ − T∞⁴) to the
// ambient; four square components heat about 1 % of the cells. Its
// residual is the heat into each cell (Fourier's law between cell
// centres, Newton's law of cooling, the Stefan–Boltzmann law for a grey
// surface facing surroundings at T∞), so its Jacobian is a symmetric
// M-matrix with a negative diagonal that changes with T.
//
// The board is FR-4-like (k = 20 W/(m·K) for a board with copper planes,
// 1.6 mm thick; a rule of thumb for multilayer boards, from memory), the
// block aluminium-like (k = 200 W/(m·K), from memory); h = 10 W/(m²·K)
// (still air, rule of thumb) and ε = 0.9 (painted or solder-masked
// surfaces, from memory). The cells are 0.1 m/nx wide, kept between
// 0.1 mm and 1 mm; the components' powers scale with the outer area, so
// that a 100 mm board carries 10 W and a 100 mm cube 20 W.
type plate struct {
	nx, ny, nz int
	dx         float64 // cell width (m)
	g          float64 // conductance between neighbours (W/K)
	area       []float64
	power      []float64
	cap        []float64
	total      float64 // the components' total power (W)
	pat        *sparse.Matrix
}

var errBelowZero = errors.New("temperature at or below absolute zero")

const (
	plateSigma = 5.670374419e-8 // W/(m²·K⁴), CODATA 2018
	plateH     = 10.0
	plateEps   = 0.9
	plateAmb   = 300.0
)

func newPlate(nx, ny, nz int) *plate {
	p := &plate{nx: nx, ny: ny, nz: nz}
	n := nx * ny * nz
	p.dx = math.Min(math.Max(0.1/float64(nx), 1e-4), 1e-3)
	dx := p.dx
	p.area = make([]float64, n)
	p.power = make([]float64, n)
	p.cap = make([]float64, n)
	outer := 0.0
	if nz == 1 {
		const k, t = 20.0, 1.6e-3
		p.g = k * t * dx / dx
		for i := range p.area {
			p.area[i] = 2 * dx * dx // top and bottom
			p.cap[i] = 1850 * 1100 * dx * dx * t
		}
		outer = 2 * float64(nx*ny) * dx * dx
	} else {
		const k = 200.0
		p.g = k * dx
		for z := 0; z < nz; z++ {
			for y := 0; y < ny; y++ {
				for x := 0; x < nx; x++ {
					faces := 0
					for _, edge := range []bool{x == 0, x == nx-1, y == 0, y == ny-1, z == 0, z == nz-1} {
						if edge {
							faces++
						}
					}
					i := x + nx*(y+ny*z)
					p.area[i] = float64(faces) * dx * dx
					p.cap[i] = 2700 * 900 * dx * dx * dx
					outer += p.area[i]
				}
			}
		}
	}
	// Four components, each a square (cube) of about n/400 cells, at
	// fixed fractions of the board, touching the top face of a block.
	side := func(m int) int { return max(1, int(math.Round(float64(m)/20))) }
	sx, sy, sz := side(nx), side(ny), 1
	if nz > 1 {
		c := max(1, int(math.Round(math.Cbrt(float64(n)/400))))
		sx, sy, sz = min(c, nx), min(c, ny), min(c, nz)
	}
	watts := []float64{1.5, 2.5, 2.5, 3.5} // 10 W for a 100 mm board
	ref := 0.02                            // its outer area (m²)
	if nz > 1 {
		watts = []float64{3, 5, 5, 7} // 20 W for a 100 mm cube
		ref = 0.06
	}
	at := [][2]float64{{0.2, 0.3}, {0.6, 0.2}, {0.35, 0.7}, {0.75, 0.65}}
	for c, w := range watts {
		q := w * outer / ref
		x0 := int(at[c][0] * float64(nx-sx))
		y0 := int(at[c][1] * float64(ny-sy))
		cells := sx * sy * sz
		for z := nz - sz; z < nz; z++ {
			for y := y0; y < y0+sy; y++ {
				for x := x0; x < x0+sx; x++ {
					p.power[x+nx*(y+ny*z)] += q / float64(cells)
				}
			}
		}
		p.total += q
	}
	return p
}

func (p *plate) Size() int { return p.nx * p.ny * p.nz }

func (p *plate) Kinds() []Kind {
	return []Kind{{Name: "temperature", Unit: "K", Equation: "heat balance", EquationUnit: "W",
		Scale: 1, MaxStep: 500, ResidualFloor: 1e-12}}
}

func (p *plate) KindOf(int) int { return 0 }

// Pattern returns the five- or seven-point pattern, rows sorted.
func (p *plate) Pattern() *sparse.Matrix {
	n := p.Size()
	nx, nxy := p.nx, p.nx*p.ny
	m := &sparse.Matrix{N: n, RowPtr: make([]int, n+1)}
	per := 5
	if p.nz > 1 {
		per = 7
	}
	m.Col = make([]int, 0, per*n)
	for i := 0; i < n; i++ {
		x, y, z := i%nx, (i/nx)%p.ny, i/nxy
		if z > 0 {
			m.Col = append(m.Col, i-nxy)
		}
		if y > 0 {
			m.Col = append(m.Col, i-nx)
		}
		if x > 0 {
			m.Col = append(m.Col, i-1)
		}
		m.Col = append(m.Col, i)
		if x < nx-1 {
			m.Col = append(m.Col, i+1)
		}
		if y < p.ny-1 {
			m.Col = append(m.Col, i+nx)
		}
		if z < p.nz-1 {
			m.Col = append(m.Col, i+nxy)
		}
		m.RowPtr[i+1] = len(m.Col)
	}
	m.Val = make([]float64, len(m.Col))
	return m
}

// Evaluate gathers each cell's balance from its neighbours' temperatures,
// on two halves of the cells at once when they are many.
func (p *plate) Evaluate(x, f []float64, jac *sparse.Matrix, mag []float64) error {
	for _, t := range x {
		if !(t > 0) {
			return errBelowZero
		}
	}
	var rp, col []int
	var val []float64
	if jac != nil {
		rp, col, val = jac.RowPtr, jac.Col, jac.Val
	} else {
		// The residual alone: walk the pattern of a cached matrix.
		if p.pat == nil {
			p.pat = p.Pattern()
		}
		rp, col = p.pat.RowPtr, p.pat.Col
	}
	n := len(x)
	if n < 1<<14 {
		p.cells(0, n, x, f, rp, col, val, mag)
		return nil
	}
	done := make(chan struct{})
	go func() {
		p.cells(n/2, n, x, f, rp, col, val, mag)
		close(done)
	}()
	p.cells(0, n/2, x, f, rp, col, val, mag)
	<-done
	return nil
}

// cells evaluates cells from ≤ i < to.
func (p *plate) cells(from, to int, x, f []float64, rp, col []int, val, mag []float64) {
	const ta4 = plateAmb * plateAmb * plateAmb * plateAmb
	g := p.g
	for i := from; i < to; i++ {
		ti := x[i]
		lo, hi := rp[i], rp[i+1]
		cond, abs := 0.0, 0.0
		for _, c := range col[lo:hi] {
			q := g * (x[c] - ti)
			cond += q
			abs += math.Abs(q)
		}
		a := p.area[i]
		t3 := ti * ti * ti
		conv := plateH * a * (ti - plateAmb)
		rad := plateEps * plateSigma * a * (t3*ti - ta4)
		f[i] = cond + p.power[i] - conv - rad
		if mag != nil {
			mag[i] = abs + p.power[i] + math.Abs(conv) + math.Abs(rad)
		}
		if val != nil {
			d := -a * (plateH + 4*plateEps*plateSigma*t3)
			row, v := col[lo:hi], val[lo:hi]
			for k, c := range row {
				if c == i {
					v[k] = d - g*float64(len(row)-1)
				} else {
					v[k] = g
				}
			}
		}
	}
}

// Capacity is each cell's heat capacity (FR-4 about 1850 kg/m³ and
// 1100 J/(kg·K), aluminium 2700 kg/m³ and 900 J/(kg·K), from memory).
func (p *plate) Capacity(_, c []float64) { copy(c, p.cap) }

// start is the ambient temperature everywhere.
func (p *plate) start() []float64 {
	x := make([]float64, p.Size())
	for i := range x {
		x[i] = plateAmb
	}
	return x
}

// heatOut is the heat the surfaces give to the ambient at x (W).
func (p *plate) heatOut(x []float64) float64 {
	const ta4 = plateAmb * plateAmb * plateAmb * plateAmb
	s := 0.0
	for i, t := range x {
		a := p.area[i]
		s += plateH*a*(t-plateAmb) + plateEps*plateSigma*a*(t*t*t*t-ta4)
	}
	return s
}
