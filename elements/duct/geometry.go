package duct

import (
	"errors"
	"fmt"
	"math"
)

// Shape is the cross-section of a duct.
type Shape int

const (
	// Rectangular is a rectangle with sides Width and Height.
	Rectangular Shape = iota
	// Circular is a round tube of inner diameter Diameter.
	Circular
	// ParallelPlates is the slot between two plates Gap apart and Width deep
	// across the flow. Side walls are ignored (infinite-plate idealisation):
	// Dh = 2·Gap and the wetted perimeter is 2·Width.
	ParallelPlates
)

// String returns the name of s.
func (s Shape) String() string {
	switch s {
	case Rectangular:
		return "rectangular"
	case Circular:
		return "circular"
	case ParallelPlates:
		return "parallel plates"
	}
	return fmt.Sprintf("Shape(%d)", int(s))
}

// Duct is the geometry of one flow channel. Lengths are in metres. Only the
// fields of its Shape are used.
type Duct struct {
	Shape     Shape
	Width     float64 // rectangle side; plate depth across the flow for ParallelPlates
	Height    float64 // rectangle side
	Diameter  float64 // inner diameter of a Circular duct
	Gap       float64 // plate spacing of ParallelPlates
	Length    float64 // flow length
	Roughness float64 // absolute wall roughness; 0 for a smooth wall
	// Heated says which walls take part in the heat transfer, the others
	// being adiabatic; the zero value heats all walls.
	Heated Walls
}

// FlowArea returns the cross-sectional flow area of the channel in m².
func (d Duct) FlowArea() float64 {
	switch d.Shape {
	case Rectangular:
		return d.Width * d.Height
	case Circular:
		return math.Pi * d.Diameter * d.Diameter / 4
	case ParallelPlates:
		return d.Gap * d.Width
	}
	return math.NaN()
}

// WettedPerimeter returns the wetted perimeter in m. For ParallelPlates it is
// the two plate faces, 2·Width.
func (d Duct) WettedPerimeter() float64 {
	switch d.Shape {
	case Rectangular:
		return 2 * (d.Width + d.Height)
	case Circular:
		return math.Pi * d.Diameter
	case ParallelPlates:
		return 2 * d.Width
	}
	return math.NaN()
}

// Dh returns the hydraulic diameter 4A/P in m: 2ab/(a+b) for a rectangle,
// the diameter for a tube and 2·Gap for parallel plates.
func (d Duct) Dh() float64 {
	switch d.Shape {
	case Rectangular:
		return 2 * d.Width * d.Height / (d.Width + d.Height)
	case Circular:
		return d.Diameter
	case ParallelPlates:
		return 2 * d.Gap
	}
	return math.NaN()
}

// Aspect returns the aspect ratio α = short side / long side in (0, 1] of a
// rectangle and 0 for parallel plates, the limits of the Shah & London fits.
// For a tube it returns 1, which carries no meaning: circular ducts use
// their own constants, never the rectangular fits.
func (d Duct) Aspect() float64 {
	switch d.Shape {
	case Rectangular:
		return math.Min(d.Width, d.Height) / math.Max(d.Width, d.Height)
	case Circular:
		return 1
	case ParallelPlates:
		return 0
	}
	return math.NaN()
}

// RelativeRoughness returns Roughness/Dh.
func (d Duct) RelativeRoughness() float64 { return d.Roughness / d.Dh() }

// lengthRatio returns L/Dh.
func (d Duct) lengthRatio() float64 { return d.Length / d.Dh() }

// Validate reports the first geometric input that is missing, not finite or
// not positive (Roughness may be zero).
func (d Duct) Validate() error {
	var dims []dim
	switch d.Shape {
	case Rectangular:
		dims = []dim{{"Width", d.Width}, {"Height", d.Height}}
	case Circular:
		dims = []dim{{"Diameter", d.Diameter}}
	case ParallelPlates:
		dims = []dim{{"Gap", d.Gap}, {"Width", d.Width}}
	default:
		return fmt.Errorf("duct: unknown shape %v", d.Shape)
	}
	if d.Heated != AllWalls && d.Shape == Circular {
		return fmt.Errorf("duct: a circular duct is heated all round, not on %v", d.Heated)
	}
	if d.Heated < AllWalls || d.Heated > OneLongWall {
		return fmt.Errorf("duct: unknown heated walls %v", d.Heated)
	}
	dims = append(dims, dim{"Length", d.Length})
	for _, x := range dims {
		if !(x.v > 0) || math.IsInf(x.v, 0) {
			return fmt.Errorf("duct: %s %s = %g must be positive and finite", d.Shape, x.name, x.v)
		}
	}
	if !(d.Roughness >= 0) || math.IsInf(d.Roughness, 0) {
		return errors.New("duct: Roughness must be zero or positive and finite")
	}
	return nil
}

// dim is a named dimension checked by Validate.
type dim struct {
	name string
	v    float64
}
