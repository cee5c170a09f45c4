package viewfactor

import (
	"errors"
	"fmt"
	"math"
)

// ParallelRectangles returns the view factor between two aligned, directly
// opposed, parallel rectangles of the same size X × Y a distance L apart
// (Incropera et al., Table 13.2). With x = X/L and y = Y/L,
//
//	F = 2/(π x y) {ln √[(1+x²)(1+y²)/(1+x²+y²)] + x √(1+y²) atan(x/√(1+y²))
//	    + y √(1+x²) atan(y/√(1+x²)) − x atan x − y atan y}.
//
// X, Y and L must be positive. By symmetry F is the same in both
// directions.
func ParallelRectangles(X, Y, L float64) float64 {
	x, y := X/L, Y/L
	x2, y2 := x*x, y*y
	sx, sy := math.Sqrt(1+x2), math.Sqrt(1+y2)
	s := 0.5*math.Log((1+x2)*(1+y2)/(1+x2+y2)) +
		x*sy*math.Atan(x/sy) + y*sx*math.Atan(y/sx) -
		x*math.Atan(x) - y*math.Atan(y)
	return 2 / (math.Pi * x * y) * s
}

// PerpendicularRectangles returns the view factor F_ij from rectangle i to
// rectangle j, perpendicular to each other and sharing a common edge of
// length X; i extends a width Y and j a width Z away from that edge
// (Incropera et al., Table 13.2). With W = Y/X and H = Z/X,
//
//	F_ij = 1/(π W) {W atan(1/W) + H atan(1/H) − √(H²+W²) atan(1/√(H²+W²))
//	       + ¼ ln[(1+W²)(1+H²)/(1+W²+H²)
//	       · (W²(1+W²+H²)/((1+W²)(W²+H²)))^(W²)
//	       · (H²(1+H²+W²)/((1+H²)(H²+W²)))^(H²)]}.
//
// The logarithm of the product is evaluated as a sum of logarithms. X, Y
// and Z must be positive.
func PerpendicularRectangles(X, Y, Z float64) float64 {
	w, h := Y/X, Z/X
	w2, h2 := w*w, h*h
	r := math.Sqrt(w2 + h2)
	lg := math.Log((1+w2)*(1+h2)/(1+w2+h2)) +
		w2*math.Log(w2*(1+w2+h2)/((1+w2)*(w2+h2))) +
		h2*math.Log(h2*(1+h2+w2)/((1+h2)*(h2+w2)))
	return (w*math.Atan(1/w) + h*math.Atan(1/h) - r*math.Atan(1/r) + lg/4) / (math.Pi * w)
}

// CoaxialDisks returns the view factor F_12 from a disk of radius r1 to a
// parallel coaxial disk of radius r2 a distance L away (Incropera et al.,
// Table 13.2). With R_i = r_i/L and S = 1 + (1 + R2²)/R1²,
//
//	F_12 = [S − √(S² − 4 (r2/r1)²)]/2,
//
// evaluated as 2(r2/r1)²/[S + √(S² − 4 (r2/r1)²)], which is the same
// number without cancellation when r1 is small. Radii and L must be
// positive.
func CoaxialDisks(r1, r2, L float64) float64 {
	R1, R2 := r1/L, r2/L
	s := 1 + (1+R2*R2)/(R1*R1)
	q := (r2 / r1) * (r2 / r1)
	return 2 * q / (s + math.Sqrt(s*s-4*q))
}

// Reciprocal returns F_ji from F_ij by reciprocity, A_i F_ij = A_j F_ji.
func Reciprocal(Fij, Ai, Aj float64) float64 { return Fij * Ai / Aj }

// CheckEnclosure checks the view-factor matrix F of surfaces with areas A,
// where F[i][j] is the view factor from surface i to surface j. It returns
// nil when F passes, or an error joining one message per offending row or
// pair:
//
//   - shape: F must be square with one row per area, every area positive;
//   - bounds: every F[i][j] must lie in [−tol, 1 + tol];
//   - summation: every row must sum to 1 within tol. When open is true the
//     surfaces do not close an enclosure and the rest of each row goes to
//     the surroundings, so a row may sum to less than 1 (never more than
//     1 + tol);
//   - reciprocity: |A_i F_ij − A_j F_ji| ≤ tol·max(A_i, A_j) for every pair,
//     so tol is an absolute tolerance on view factors throughout.
func CheckEnclosure(F [][]float64, A []float64, tol float64, open bool) error {
	n := len(A)
	if len(F) != n {
		return fmt.Errorf("viewfactor: %d rows for %d areas", len(F), n)
	}
	var errs []error
	for i := range n {
		if len(F[i]) != n {
			errs = append(errs, fmt.Errorf("viewfactor: row %d has %d entries, want %d", i, len(F[i]), n))
		}
		if !(A[i] > 0) {
			errs = append(errs, fmt.Errorf("viewfactor: area %d is %g, want positive", i, A[i]))
		}
	}
	if errs != nil {
		return errors.Join(errs...)
	}
	for i := range n {
		sum := 0.0
		for j, f := range F[i] {
			if !(f >= -tol && f <= 1+tol) {
				errs = append(errs, fmt.Errorf("viewfactor: F[%d][%d] = %g is outside 0 to 1", i, j, f))
			}
			sum += f
		}
		switch {
		case sum > 1+tol:
			errs = append(errs, fmt.Errorf("viewfactor: row %d sums to %.9g, above 1 by more than %g", i, sum, tol))
		case sum < 1-tol && !open:
			errs = append(errs, fmt.Errorf("viewfactor: row %d sums to %.9g, below 1 by more than %g in a closed enclosure", i, sum, tol))
		}
	}
	for i := range n {
		for j := i + 1; j < n; j++ {
			d := A[i]*F[i][j] - A[j]*F[j][i]
			if math.Abs(d) > tol*math.Max(A[i], A[j]) {
				errs = append(errs, fmt.Errorf("viewfactor: pair %d-%d breaks reciprocity: A[%d]·F[%d][%d] = %.9g, A[%d]·F[%d][%d] = %.9g",
					i, j, i, i, j, A[i]*F[i][j], j, j, i, A[j]*F[j][i]))
			}
		}
	}
	return errors.Join(errs...)
}
