package sparse

import (
	"errors"
	"fmt"
	"math"
	"slices"
)

// ErrSingular is returned, wrapped with detail such as the pivot row, by
// every solver of this package for a singular or numerically singular
// matrix. Test for it with errors.Is.
var ErrSingular = errors.New("sparse: matrix is singular to working precision")

// ErrNotConverged is returned, wrapped with the iteration count and the
// residual reached, by an iterative solver that stops before its tolerance.
var ErrNotConverged = errors.New("sparse: iterative solver did not reach its tolerance")

// ErrPattern is returned by Factorize when the matrix does not have the
// pattern that was analysed, and by Solve before any Factorize.
var ErrPattern = errors.New("sparse: matrix pattern differs from the analysed one")

// Solver solves A·x = b for square sparse matrices sharing one pattern.
//
// Analyse looks at the pattern only (ordering, symbolic factorisation) and
// is called once per pattern. Factorize does the numeric work for a's
// current values; every solver of this package copies what it needs from
// a.Val, so changing a.Val afterwards does not disturb later solves (the
// iterative solvers also keep a reference to a.RowPtr and a.Col, which the
// pattern contract says do not change). Solve sets x to the solution for
// the last factorized matrix; x and b may not overlap.
type Solver interface {
	Analyse(a *Matrix) error
	Factorize(a *Matrix) error
	Solve(x, b []float64) error
}

// Iterative is a Solver that converges to a tolerance instead of solving
// exactly. Its Factorize builds or refreshes the preconditioner.
type Iterative interface {
	Solver
	// SetTolerance sets the relative residual ‖b − A·x‖₂/‖b‖₂ the next
	// solves must reach (inexact Newton).
	SetTolerance(rel float64)
	// SetWarmStart makes Solve start from the x it is given instead of
	// from zero.
	SetWarmStart(on bool)
	// Stats returns the iteration count and the final relative residual of
	// the last Solve.
	Stats() (iterations int, relResidual float64)
}

// TransposeSolver is a factorisation that can also solve Aᵀ·x = b, which
// the condition estimator needs.
type TransposeSolver interface {
	Solve(x, b []float64) error
	SolveTranspose(x, b []float64) error
}

// DefaultPivotTol is the default relative pivot tolerance of the direct
// solvers: a pivot whose magnitude is at most DefaultPivotTol times the
// largest magnitude in its row of A makes the matrix numerically singular.
const DefaultPivotTol = 1e-12

// rowScales returns the largest magnitude of each row of a.
func rowScales(a *Matrix, dst []float64) []float64 {
	if cap(dst) < a.N {
		dst = make([]float64, a.N)
	}
	dst = dst[:a.N]
	for i := 0; i < a.N; i++ {
		m := 0.0
		for k := a.RowPtr[i]; k < a.RowPtr[i+1]; k++ {
			if v := math.Abs(a.Val[k]); v > m {
				m = v
			}
		}
		dst[i] = m
	}
	return dst
}

// checkFinite reports a non-finite value of a as an error.
func checkFinite(a *Matrix) error {
	for i := 0; i < a.N; i++ {
		for k := a.RowPtr[i]; k < a.RowPtr[i+1]; k++ {
			if v := a.Val[k]; math.IsNaN(v) || math.IsInf(v, 0) {
				return fmt.Errorf("sparse: entry (%d, %d) is %v", i, a.Col[k], v)
			}
		}
	}
	return nil
}

// checkLen reports vectors of the wrong length.
func checkLen(n int, x, b []float64) error {
	if len(x) != n || len(b) != n {
		return fmt.Errorf("sparse: vectors of length %d and %d for a matrix of order %d", len(x), len(b), n)
	}
	return nil
}

// IsSymmetric reports whether a's values are symmetric: every entry
// equals its transpose to within rel times the larger of the two row scales
// (an entry missing from the pattern counts as zero).
func IsSymmetric(a *Matrix, rel float64) bool {
	// rowScale is the largest magnitude in row i: computed where needed
	// rather than stored, so that the test, run at every factorization,
	// allocates nothing (rows are short).
	rowScale := func(i int) float64 {
		m := 0.0
		for _, v := range a.Val[a.RowPtr[i]:a.RowPtr[i+1]] {
			if v := math.Abs(v); v > m {
				m = v
			}
		}
		return m
	}
	var asym [blocks]bool
	inBlocks(a.N, func(b, lo, hi int) {
		for i := lo; i < hi; i++ {
			si := rowScale(i)
			for k := a.RowPtr[i]; k < a.RowPtr[i+1]; k++ {
				j := a.Col[k]
				if j > i {
					t := a.At(j, i)
					if d := math.Abs(a.Val[k] - t); d > rel*si && d > rel*rowScale(j) {
						asym[b] = true
						return
					}
				} else if j < i && a.Index(j, i) < 0 {
					// An entry below the diagonal whose transpose is
					// missing.
					if d := math.Abs(a.Val[k]); d > rel*si && d > rel*rowScale(j) {
						asym[b] = true
						return
					}
				}
			}
		}
	})
	for _, x := range asym {
		if x {
			return false
		}
	}
	return true
}

// symPattern returns the pattern of A + Aᵀ without the diagonal, in
// compressed rows with sorted, distinct column indices.
func symPattern(a *Matrix) (ptr []int, idx []int32) {
	n := a.N
	count := make([]int, n+1)
	for i := 0; i < n; i++ {
		for k := a.RowPtr[i]; k < a.RowPtr[i+1]; k++ {
			if j := a.Col[k]; j != i {
				count[i+1]++
				count[j+1]++
			}
		}
	}
	for i := 0; i < n; i++ {
		count[i+1] += count[i]
	}
	raw := make([]int32, count[n])
	next := append([]int(nil), count[:n]...)
	for i := 0; i < n; i++ {
		for k := a.RowPtr[i]; k < a.RowPtr[i+1]; k++ {
			if j := a.Col[k]; j != i {
				raw[next[i]] = int32(j)
				next[i]++
				raw[next[j]] = int32(i)
				next[j]++
			}
		}
	}
	ptr = make([]int, n+1)
	out := 0
	for i := 0; i < n; i++ {
		row := raw[count[i]:count[i+1]]
		sortInt32(row)
		for k, c := range row {
			if k > 0 && c == row[k-1] {
				continue
			}
			raw[out] = c
			out++
		}
		ptr[i+1] = out
	}
	return ptr, raw[:out:out]
}

// sortInt32 sorts a short slice by insertion, a long one by the library.
func sortInt32(s []int32) {
	if len(s) > 32 {
		slices.Sort(s)
		return
	}
	for i := 1; i < len(s); i++ {
		v := s[i]
		j := i
		for j > 0 && s[j-1] > v {
			s[j] = s[j-1]
			j--
		}
		s[j] = v
	}
}

// samePattern reports whether a has the pattern recorded by ptr and col.
func samePattern(a *Matrix, n int, ptr, col []int) bool {
	if a.N != n || len(a.Col) != len(col) || len(a.RowPtr) != len(ptr) {
		return false
	}
	if len(col) > 0 && &a.Col[0] == &col[0] && &a.RowPtr[0] == &ptr[0] {
		return true // the very same arrays
	}
	for i, v := range ptr {
		if a.RowPtr[i] != v {
			return false
		}
	}
	for i, v := range col {
		if a.Col[i] != v {
			return false
		}
	}
	return true
}
