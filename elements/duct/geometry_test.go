package duct

import (
	"math"
	"testing"
)

func TestRectangleHydraulicDiameter(t *testing.T) {
	// Hand, Dh = 2ab/(a+b) = 4A/P: 5 mm x 20 mm gives 8.000 mm, aspect 0.25.
	for _, d := range []Duct{
		{Shape: Rectangular, Width: 0.020, Height: 0.005, Length: 0.1},
		{Shape: Rectangular, Width: 0.005, Height: 0.020, Length: 0.1},
	} {
		if got := d.Dh(); !near(got, 0.008, 1e-12) {
			t.Errorf("Dh = %g m, want 0.008", got)
		}
		if got := d.Aspect(); !near(got, 0.25, 1e-12) {
			t.Errorf("aspect = %g, want 0.25", got)
		}
		if got, want := d.Dh(), 4*d.FlowArea()/d.WettedPerimeter(); !near(got, want, 1e-12) {
			t.Errorf("Dh = %g, 4A/P = %g", got, want)
		}
	}
}

func TestCircleAndPlates(t *testing.T) {
	// Hand: a tube has Dh = D; infinite plates have Dh = 2 gap = 4A/P with
	// A = gap*width and P = 2 width.
	tube := Duct{Shape: Circular, Diameter: 0.01, Length: 1}
	if got := tube.Dh(); got != 0.01 {
		t.Errorf("tube Dh = %g, want 0.01", got)
	}
	if got, want := tube.FlowArea(), math.Pi*0.01*0.01/4; !near(got, want, 1e-12) {
		t.Errorf("tube area = %g, want %g", got, want)
	}
	plates := Duct{Shape: ParallelPlates, Gap: 0.002, Width: 0.05, Length: 0.1}
	if got := plates.Dh(); !near(got, 0.004, 1e-12) {
		t.Errorf("plates Dh = %g, want 0.004", got)
	}
	if got, want := plates.Dh(), 4*plates.FlowArea()/plates.WettedPerimeter(); !near(got, want, 1e-12) {
		t.Errorf("plates Dh = %g, 4A/P = %g", got, want)
	}
	if plates.Aspect() != 0 || tube.Aspect() != 1 {
		t.Errorf("aspect: plates %g, tube %g; want 0 and 1", plates.Aspect(), tube.Aspect())
	}
	rough := Duct{Shape: Circular, Diameter: 0.02, Length: 1, Roughness: 2e-5}
	if got := rough.RelativeRoughness(); !near(got, 1e-3, 1e-12) {
		t.Errorf("relative roughness = %g, want 1e-3", got)
	}
}

func TestValidate(t *testing.T) {
	good := []Duct{
		{Shape: Rectangular, Width: 0.01, Height: 0.002, Length: 0.05},
		{Shape: Circular, Diameter: 0.01, Length: 0.05, Roughness: 1e-6},
		{Shape: ParallelPlates, Gap: 0.002, Width: 0.05, Length: 0.05},
	}
	for _, d := range good {
		if err := d.Validate(); err != nil {
			t.Errorf("%v: unexpected error %v", d.Shape, err)
		}
	}
	bad := []Duct{
		{Shape: Rectangular, Width: 0.01, Length: 0.05},
		{Shape: Circular, Diameter: math.NaN(), Length: 0.05},
		{Shape: ParallelPlates, Gap: 0.002, Length: 0.05},
		{Shape: Circular, Diameter: 0.01},
		{Shape: Circular, Diameter: 0.01, Length: math.Inf(1)},
		{Shape: Circular, Diameter: 0.01, Length: 1, Roughness: -1e-6},
		{Shape: Shape(7), Diameter: 0.01, Length: 1},
	}
	for i, d := range bad {
		if err := d.Validate(); err == nil {
			t.Errorf("case %d (%v): no error", i, d.Shape)
		}
	}
}
