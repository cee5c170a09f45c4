package viewfactor

import (
	"math"
	"strings"
	"testing"
)

// relErr returns |got − want|/|want|.
func relErr(got, want float64) float64 { return math.Abs(got-want) / math.Abs(want) }

func TestParallelRectangles(t *testing.T) {
	for _, c := range []struct {
		name           string
		got, want, tol float64
	}{
		// Hand, Incropera Table 13.2 formula; 0.1998 is also the value of the
		// published view-factor tables for unit squares one side apart.
		{"x = y = 1", ParallelRectangles(1, 1, 1), 0.1998, 5e-4},
		{"x = 2, y = 1", ParallelRectangles(2, 1, 1), 0.2859, 5e-4},
		{"x = 1, y = 2 (symmetry)", ParallelRectangles(1, 2, 1), 0.2859, 5e-4},
		{"x = y = 10", ParallelRectangles(10, 10, 1), 0.8270, 5e-4},
		{"scale invariance", ParallelRectangles(0.2, 0.4, 0.1), ParallelRectangles(2, 4, 1), 1e-14},
		// Far apart: two small opposed areas, F → A/(π L²) (definition of
		// the view factor between differential areas).
		{"far apart", ParallelRectangles(0.01, 0.01, 1), 1e-4 / math.Pi, 1e-3},
		// Very long strips of width w at distance L (crossed-string rule,
		// Hottel): F = √(1 + (L/w)²) − L/w, here √2 − 1.
		{"long strips", ParallelRectangles(1e5, 1, 1), math.Sqrt2 - 1, 1e-4},
	} {
		if relErr(c.got, c.want) > c.tol {
			t.Errorf("%s: F = %.6g, want %.6g", c.name, c.got, c.want)
		}
	}
	// Large plates close together see only each other.
	if f := ParallelRectangles(1000, 1000, 1); f < 0.998 || f > 1 {
		t.Errorf("large plates: F = %.6g, want just below 1", f)
	}
}

func TestPerpendicularRectangles(t *testing.T) {
	for _, c := range []struct {
		name           string
		got, want, tol float64
	}{
		// Hand, Incropera Table 13.2 formula.
		{"W = H = 1", PerpendicularRectangles(1, 1, 1), 0.2000, 5e-4},
		{"W = 1, H = 2", PerpendicularRectangles(1, 1, 2), 0.2329, 5e-4},
		{"W = 2, H = 1", PerpendicularRectangles(1, 2, 1), 0.11643, 5e-4},
		// Very long common edge: two-dimensional strips, crossed-string rule
		// F = (1 + H/W − √(1 + (H/W)²))/2, here (2 − √2)/2.
		{"long edge", PerpendicularRectangles(1e4, 1, 1), (2 - math.Sqrt2) / 2, 1e-4},
	} {
		if relErr(c.got, c.want) > c.tol {
			t.Errorf("%s: F = %.6g, want %.6g", c.name, c.got, c.want)
		}
	}
	// Reciprocity, W·F(W=1, H=2) = H·F(W=2, H=1) = 0.2329 (hand).
	a := 1 * PerpendicularRectangles(1, 1, 2)
	b := 2 * PerpendicularRectangles(1, 2, 1)
	if relErr(a, b) > 1e-12 || relErr(a, 0.2329) > 5e-4 {
		t.Errorf("reciprocity: %.8g vs %.8g, want 0.2329", a, b)
	}
	// A unit cube closes: the opposite face plus four adjacent faces sum to 1.
	if s := ParallelRectangles(1, 1, 1) + 4*PerpendicularRectangles(1, 1, 1); math.Abs(s-1) > 1e-12 {
		t.Errorf("cube row sum = %.15g", s)
	}
}

func TestCoaxialDisks(t *testing.T) {
	// Worked example for r1 = 0.1 m, r2 = 0.2 m, 0.5 m apart: F = 0.1339
	// (secondary worked example citing Siegel & Howell, Thermal Radiation
	// Heat Transfer, 4th ed., disk to parallel coaxial disk).
	if f := CoaxialDisks(0.1, 0.2, 0.5); relErr(f, 0.1339) > 5e-4 {
		t.Errorf("example: F = %.5g, want 0.1339", f)
	}
	// Small disk 1: the differential-area-to-disk result r2²/(r2² + L²)
	// (integration of the view-factor definition).
	if f := CoaxialDisks(1e-6, 0.3, 0.4); relErr(f, 0.09/0.25) > 1e-9 {
		t.Errorf("small source: F = %.9g, want 0.36", f)
	}
	// Reciprocity between the two directions.
	r1, r2, L := 0.05, 0.12, 0.07
	if a, b := r1*r1*CoaxialDisks(r1, r2, L), r2*r2*CoaxialDisks(r2, r1, L); relErr(a, b) > 1e-12 {
		t.Errorf("reciprocity: %.12g vs %.12g", a, b)
	}
	// Limits: large disks close together → 1; far apart → 0.
	if f := CoaxialDisks(100, 100, 1); f < 0.99 || f > 1 {
		t.Errorf("large disks: F = %.6g", f)
	}
	if f := CoaxialDisks(0.01, 0.01, 100); f > 1e-7 {
		t.Errorf("far disks: F = %.3g", f)
	}
}

func TestReciprocal(t *testing.T) {
	if got := Reciprocal(0.3, 2, 3); relErr(got, 0.2) > 1e-15 {
		t.Errorf("Reciprocal = %g, want 0.2", got)
	}
}

// box returns the view-factor matrix and areas of the six faces of an
// a × b × c box. Face 2k+s is normal to axis k, at side s.
func box(dims [3]float64) ([][]float64, []float64) {
	F := make([][]float64, 6)
	A := make([]float64, 6)
	for i := range 6 {
		k := i / 2
		F[i] = make([]float64, 6)
		A[i] = dims[(k+1)%3] * dims[(k+2)%3]
		for j := range 6 {
			m := j / 2
			switch {
			case i == j:
			case k == m:
				F[i][j] = ParallelRectangles(dims[(k+1)%3], dims[(k+2)%3], dims[k])
			default:
				l := 3 - k - m // the axis of the common edge
				F[i][j] = PerpendicularRectangles(dims[l], dims[m], dims[k])
			}
		}
	}
	return F, A
}

func TestCheckEnclosureBox(t *testing.T) {
	// A closed 1 × 2 × 3 box built from the two rectangle formulas must
	// satisfy summation and reciprocity.
	F, A := box([3]float64{1, 2, 3})
	if err := CheckEnclosure(F, A, 1e-9, false); err != nil {
		t.Fatalf("box: %v", err)
	}
	// Break one entry: row 0 and pair 0-1 must be named.
	F[0][1] += 0.01
	err := CheckEnclosure(F, A, 1e-6, false)
	if err == nil {
		t.Fatal("perturbed box passed")
	}
	for _, want := range []string{"row 0 sums", "pair 0-1"} {
		if !strings.Contains(err.Error(), want) {
			t.Errorf("error %q does not mention %q", err, want)
		}
	}
}

func TestCheckEnclosureOpen(t *testing.T) {
	// Two opposed unit squares one apart: each sees 0.19982 of the other,
	// the rest goes to the surroundings.
	f := ParallelRectangles(1, 1, 1)
	F := [][]float64{{0, f}, {f, 0}}
	A := []float64{1, 1}
	if err := CheckEnclosure(F, A, 1e-9, true); err != nil {
		t.Errorf("open pair: %v", err)
	}
	if err := CheckEnclosure(F, A, 1e-9, false); err == nil || !strings.Contains(err.Error(), "row 1") {
		t.Errorf("closed pair: err = %v, want rows below 1", err)
	}
	// Above 1 is never allowed.
	over := [][]float64{{0.5, 0.6}, {0.6, 0.4}}
	if err := CheckEnclosure(over, A, 1e-9, true); err == nil || !strings.Contains(err.Error(), "row 0 sums") {
		t.Errorf("row above 1: err = %v", err)
	}
}

func TestCheckEnclosureShape(t *testing.T) {
	for _, c := range []struct {
		name string
		F    [][]float64
		A    []float64
		want string
	}{
		{"rows", [][]float64{{1}}, []float64{1, 1}, "1 rows for 2 areas"},
		{"ragged", [][]float64{{0, 1}, {1}}, []float64{1, 1}, "row 1 has 1 entries"},
		{"area", [][]float64{{0, 1}, {1, 0}}, []float64{1, 0}, "area 1"},
		{"negative", [][]float64{{1.1, -0.1}, {0, 1}}, []float64{1, 1}, "F[0][1]"},
	} {
		err := CheckEnclosure(c.F, c.A, 1e-9, false)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: err = %v, want mention of %q", c.name, err, c.want)
		}
	}
}
