package duct

import (
	"fmt"
	"math"
)

// Walls says which walls of a duct are heated; the others are adiabatic.
type Walls int

const (
	// AllWalls heats the whole perimeter (both plates of a slot).
	AllWalls Walls = iota
	// TwoLongWalls heats the two long walls of a rectangle, the short ones
	// being adiabatic (the gap between two boards or two modules); both
	// plates of a slot.
	TwoLongWalls
	// OneLongWall heats one long wall of a rectangle, or one plate of a
	// slot; the rest is adiabatic.
	OneLongWall
)

// String returns the name of w.
func (w Walls) String() string {
	switch w {
	case AllWalls:
		return "all walls"
	case TwoLongWalls:
		return "two long walls"
	case OneLongWall:
		return "one long wall"
	}
	return fmt.Sprintf("Walls(%d)", int(w))
}

// HeatedPerimeter returns the heated part of the wetted perimeter in m:
// only these walls take heat.
func (d Duct) HeatedPerimeter() float64 {
	long := 0.0
	switch d.Shape {
	case Rectangular:
		long = math.Max(d.Width, d.Height)
	case ParallelPlates:
		long = d.Width
	}
	switch d.Heated {
	case TwoLongWalls:
		return 2 * long
	case OneLongWall:
		return long
	}
	return d.WettedPerimeter()
}

// Fully developed laminar Nu_T of parallel plates, one plate at a uniform
// temperature and the other adiabatic, on Dh = 2·gap (Shah & London 1978,
// Laminar Flow Forced Convection in Ducts, parallel plates; from memory,
// and reproduced by this package's tests from the defining eigenproblem).
const PlatesOneSideNuT = 4.861

// LaminarNuT returns the fully developed laminar Nusselt number of d for a
// uniform temperature of its heated walls, the others adiabatic (Shah &
// London 1978), on Dh of the whole wetted perimeter and per heated area.
func (d Duct) LaminarNuT() float64 {
	switch {
	case d.Shape == Circular:
		return CircularNuT
	case d.Heated == AllWalls:
		return ShahLondonNuT(d.Aspect())
	case d.Shape == ParallelPlates && d.Heated == TwoLongWalls:
		return ShahLondonNuT(0)
	case d.Shape == ParallelPlates:
		return PlatesOneSideNuT
	}
	return wallsNuT(d.Heated, d.Aspect())
}

// wallsNuT interpolates nuTWalls linearly in the aspect ratio alpha.
func wallsNuT(w Walls, alpha float64) float64 {
	col := 1
	if w == OneLongWall {
		col = 2
	}
	t := nuTWalls
	for i := 1; i < len(t); i++ {
		if alpha <= t[i][0] || i == len(t)-1 {
			a, b := t[i-1], t[i]
			s := (alpha - a[0]) / (b[0] - a[0])
			return a[col] + s*(b[col]-a[col])
		}
	}
	return math.NaN()
}

// nuTWalls holds the fully developed laminar Nu_T (on Dh, per heated area)
// of rectangular ducts heated on the two long walls or on one long wall, the
// other walls adiabatic, by aspect ratio α = short/long side: rows
// {α, two long walls, one long wall}. Shah & London (1978) tabulate these
// cases (from Schmidt & Newell 1967); the table was not at hand, so the
// values here were computed by this package from the defining eigenproblem
// (fully developed velocity, ∇²φ + μ(u/ū)φ = 0, φ = 0 on heated walls and
// ∂φ/∂n = 0 on adiabatic ones, Nu = μ·A·Dh/P_heated), finite volumes with
// Richardson extrapolation from 16 and 32 cells across the gap; the tests
// recompute them and check the same solver against Shah & London's
// four-wall values and the plate limits (within 0.1 %). The α = 0 row is
// the plate limit. Between rows the table is interpolated linearly.
var nuTWalls = [][3]float64{
	{0, 7.541, 4.861},
	{0.05, 6.974, 4.522},
	{0.1, 6.496, 4.265},
	{0.15, 6.097, 4.058},
	{0.2, 5.769, 3.885},
	{0.25, 5.499, 3.733},
	{0.3, 5.276, 3.598},
	{0.4, 4.927, 3.362},
	{0.5, 4.657, 3.157},
	{0.6, 4.428, 2.975},
	{0.7, 4.224, 2.812},
	{0.8, 4.038, 2.665},
	{0.9, 3.867, 2.531},
	{1, 3.710, 2.410},
}
