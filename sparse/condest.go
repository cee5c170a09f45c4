package sparse

import (
	"fmt"
	"math"
)

// ConditionEstimate returns an estimate of the 1-norm condition number
// κ₁(A) = ‖A‖₁·‖A⁻¹‖₁ of a, using the factorisation f of a's current
// values (a *Cholesky, *LU, *PivotLU, or an Auto solver that chose one of
// them). It is not computed by Factorize; call it on request.
//
// ‖A⁻¹‖₁ is estimated by Hager's method (Condition estimates, SIAM J. Sci.
// Stat. Comput. 5, 1984) in Higham's form (FORTRAN codes for estimating the
// one-norm of a real or complex matrix, ACM TOMS 14, 1988): at
// most five pairs of solves with A and Aᵀ, then one more solve with an
// alternating-sign vector guarding against the method's known worst cases.
// The estimate is a lower bound that is almost always within a factor 3.
func ConditionEstimate(a *Matrix, f TransposeSolver) (float64, error) {
	if au, ok := f.(*AutoSolver); ok {
		ts, ok := au.chosen.(TransposeSolver)
		if !ok {
			return 0, fmt.Errorf("sparse: condition estimate needs a direct factorisation, not %s", au.Kind())
		}
		f = ts
	}
	n := a.N
	if n == 0 {
		return 0, nil
	}
	// ‖A‖₁: the largest column sum.
	colSum := make([]float64, n)
	for i := 0; i < n; i++ {
		for k := a.RowPtr[i]; k < a.RowPtr[i+1]; k++ {
			colSum[a.Col[k]] += math.Abs(a.Val[k])
		}
	}
	anorm := 0.0
	for _, v := range colSum {
		anorm = math.Max(anorm, v)
	}
	x := make([]float64, n)
	y := make([]float64, n)
	z := make([]float64, n)
	xi := make([]float64, n)
	for i := range x {
		x[i] = 1 / float64(n)
	}
	est := 0.0
	last := -1
	for it := 0; it < 5; it++ {
		if err := f.Solve(y, x); err != nil {
			return 0, err
		}
		newEst := 0.0
		for _, v := range y {
			newEst += math.Abs(v)
		}
		if it > 0 && newEst <= est {
			break
		}
		est = newEst
		for i, v := range y {
			if v >= 0 {
				xi[i] = 1
			} else {
				xi[i] = -1
			}
		}
		if err := f.SolveTranspose(z, xi); err != nil {
			return 0, err
		}
		j, zmax, zx := 0, -1.0, 0.0
		for i, v := range z {
			if math.Abs(v) > zmax {
				j, zmax = i, math.Abs(v)
			}
			zx += v * x[i]
		}
		if it > 0 && (zmax <= zx || j == last) {
			break
		}
		last = j
		clear(x)
		x[j] = 1
	}
	// Higham's extra vector.
	for i := range x {
		s := 1.0
		if i%2 == 1 {
			s = -1
		}
		if n > 1 {
			x[i] = s * (1 + float64(i)/float64(n-1))
		} else {
			x[i] = s
		}
	}
	if err := f.Solve(y, x); err != nil {
		return 0, err
	}
	alt := 0.0
	for _, v := range y {
		alt += math.Abs(v)
	}
	alt *= 2 / (3 * float64(n))
	est = math.Max(est, alt)
	return anorm * est, nil
}
