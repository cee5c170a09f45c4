package sparse

import (
	"errors"
	"fmt"
	"math"
)

// DefaultDirectFloor is the factorisation work, in multiply-adds, below
// which Auto always solves directly, whatever the iterative estimate: a
// fraction of a second, and a direct solve either succeeds or reports
// ErrSingular, with no convergence to doubt.
const DefaultDirectFloor = 1e8

// DefaultIterativeWeight is Auto's estimate of the work of a
// multigrid-preconditioned solve (set-up included) in units of
// 3·nnz(A) + 10·n operations, about one matrix-vector product with the
// vector updates of one Krylov iteration, against the multiply-adds of the
// supernodal factorisation. Measured (processor time, the benchmarks of
// this package): on the 2-D grid of 1e5 unknowns (F = 2.6e8, 3·nnz + 10·n
// = 2.5e6) the factorisation and solve took 0.14 s and CG with multigrid
// 0.38 s, a break-even weight of 285; on the 3-D grid of 1e4 unknowns
// (F = 3.1e8, 3.3e5) 0.13 s against 0.054 s, a break-even weight of 390.
// The default sits between.
const DefaultIterativeWeight = 300.0

// DefaultOrderLimit is the order above which Auto iterates without
// ordering the matrix first. The minimum degree ordering alone then costs
// about half of a whole Newton solve with the multigrid-preconditioned CG
// (measured with the meshed-plate benchmarks of package solve, processor
// time: on the board of 1e5 cells 0.3 s to order against 0.6 s to solve,
// on the block 0.4 s against 1.0 s), while Newton repeats the
// factorisation at every step and reuses the multigrid hierarchy. A
// thermal network grows that large only by meshing, where the fill of a
// factor makes direct solving lose in any case.
const DefaultOrderLimit = 50_000

// symmetryTol is the relative tolerance of the value-symmetry test.
const symmetryTol = 1e-12

// AutoSolver chooses a solver by the size and structure of the matrix.
//
// The rule: above OrderLimit unknowns (default DefaultOrderLimit) it
// iterates without ordering. Below, Analyse orders the pattern by AMD,
// which also yields the exact
// work F of the factorisation (FillEstimate.Flops, multiply-adds). It
// estimates the work of one multigrid-preconditioned Krylov solve, whose
// iteration count hardly depends on the size, as
// W = IterativeWeight·(3·nnz(A) + 10·n) (default DefaultIterativeWeight).
// When F ≤ W, or F ≤ DirectFloor (default DefaultDirectFloor, for the
// small and irregular networks whose conductances span decades), it solves
// directly: each Factorize tests whether the values are symmetric (to 1e-12
// of the row scales) and uses Cholesky (the supernodal one) if they are,
// LU if not or if
// Cholesky finds −A not positive
// definite; both share the one symbolic analysis. Above the limit it
// iterates: CG for symmetric values, BiCGStab otherwise (or when CG meets a
// direction of non-positive curvature), both preconditioned by AMG whose
// aggregates are kept for later values of the same pattern (the whole
// hierarchy lags behind the values until the solver finds it too slow, see
// AMG.Lag and CG.Solve), except that
// BiCGStab takes ILU(0) where air streams dominate (Asymmetry above
// AdvectionLimit, default DefaultAdvectionLimit), at
// the tolerance set by SetTolerance (default DefaultTol). Failure to
// converge is an error wrapping ErrNotConverged; there is no silent
// fallback. Dense solving of small models is left to the caller.
type AutoSolver struct {
	// IterativeWeight overrides DefaultIterativeWeight when positive.
	IterativeWeight float64
	// DirectFloor overrides DefaultDirectFloor when positive.
	DirectFloor float64
	// AdvectionLimit overrides DefaultAdvectionLimit when positive.
	AdvectionLimit float64
	// OrderLimit overrides DefaultOrderLimit when positive.
	OrderLimit int

	fill      FillEstimate
	iterWork  float64
	direct    bool
	sym       *Symbolic
	chol      *Supernodal
	lu        *LU
	cg        *CG
	bicg      *BiCGStab
	chosen    Solver
	tol       float64
	warm      bool
	patPtr    []int
	patCol    []int
	analysed  bool
	lastIters int
	lastRes   float64
}

// Auto returns a solver for matrices with a's pattern, already analysed.
func Auto(a *Matrix) *AutoSolver {
	s := &AutoSolver{}
	s.Analyse(a)
	return s
}

// Analyse orders a and decides between direct and iterative solving. A
// second call with the same pattern does nothing.
func (s *AutoSolver) Analyse(a *Matrix) error {
	if s.analysed && samePattern(a, len(s.patPtr)-1, s.patPtr, s.patCol) {
		return nil
	}
	weight := s.IterativeWeight
	if weight <= 0 {
		weight = DefaultIterativeWeight
	}
	s.iterWork = weight * float64(3*a.NNZ()+10*a.N)
	limit := s.OrderLimit
	if limit <= 0 {
		limit = DefaultOrderLimit
	}
	var perm []int
	if a.N > limit {
		s.fill, s.direct = FillEstimate{NNZL: math.NaN(), Flops: math.NaN()}, false
	} else {
		var fill FillEstimate
		perm, fill = AMDWithFill(a)
		s.fill = fill
		floor := s.DirectFloor
		if floor <= 0 {
			floor = DefaultDirectFloor
		}
		s.direct = fill.Flops <= s.iterWork || fill.Flops <= floor
	}
	s.sym, s.chol, s.lu, s.cg, s.bicg, s.chosen = nil, nil, nil, nil, nil, nil
	if s.direct {
		sym, err := AnalyseWith(a, Postorder(a, perm))
		if err != nil {
			return err
		}
		s.sym = sym
	}
	// The pattern is kept by reference: it does not change (see Solver),
	// and a copy would cost as much memory as the matrix's indices.
	s.patPtr, s.patCol = a.RowPtr, a.Col
	s.analysed = true
	return nil
}

// Fill returns the factor size and work that the ordering leads to (NaN
// when the matrix was too large to order, see DefaultOrderLimit).
func (s *AutoSolver) Fill() FillEstimate { return s.fill }

// Work returns the estimates Auto compared: the multiply-adds of the
// factorisation and the operations of one iterative solve.
func (s *AutoSolver) Work() (direct, iterative float64) { return s.fill.Flops, s.iterWork }

// DefaultAdvectionLimit is the mean row asymmetry (see Asymmetry) above
// which Auto preconditions BiCGStab by ILU(0) instead of multigrid.
const DefaultAdvectionLimit = 0.25

// Asymmetry returns the mean over the rows of Σ_j |a_ij − a_ji| / (2·|a_ii|):
// zero for symmetric values, near one for a row dominated by an upwind
// air stream (a stream stamps −ṁc on the diagonal of its upstream row and
// +ṁc into its downstream row only).
func Asymmetry(a *Matrix) float64 {
	if a.N == 0 {
		return 0
	}
	sum := sumBlocks(a.N, func(lo, hi int) float64 {
		sum := 0.0
		for i := lo; i < hi; i++ {
			d := math.Abs(a.At(i, i))
			if d == 0 {
				continue
			}
			r := 0.0
			for k := a.RowPtr[i]; k < a.RowPtr[i+1]; k++ {
				if j := a.Col[k]; j != i {
					r += math.Abs(a.Val[k] - a.At(j, i))
				}
			}
			sum += math.Min(r/(2*d), 1)
		}
		return sum
	})
	return sum / float64(a.N)
}

// choosePrecond gives BiCGStab multigrid, or ILU(0) where air streams
// dominate: smoothed aggregation is built for diffusion, and its
// iterations grow several-fold once advection dominates, while ILU(0) in
// an order that follows the streams (the order in which a network numbers
// its air nodes along a duct) is then nearly exact. Both were measured on
// a 100×100 grid with a stream along every second line: at ṁc ten times
// the conductances 11 multigrid against 18 ILU(0) iterations, at a hundred
// times 98 against 7.
func (s *AutoSolver) choosePrecond(a *Matrix) {
	limit := s.AdvectionLimit
	if limit <= 0 {
		limit = DefaultAdvectionLimit
	}
	if Asymmetry(a) > limit {
		if _, ok := s.bicg.Precond.(*ILU0); !ok {
			s.bicg.Precond = &ILU0{}
		}
	} else if _, ok := s.bicg.Precond.(*AMG); !ok {
		s.bicg.Precond = &AMG{ReuseAggregates: true, Lag: true}
	}
}

// Kind names the solver in use: "cholesky", "lu", "cg" or "bicgstab"
// ("" before the first Factorize).
func (s *AutoSolver) Kind() string {
	switch s.chosen.(type) {
	case *Cholesky, *Supernodal:
		return "cholesky"
	case *LU:
		return "lu"
	case *CG:
		return "cg"
	case *BiCGStab:
		return "bicgstab"
	}
	return ""
}

// Factorize chooses the solver for a's values and factorizes.
func (s *AutoSolver) Factorize(a *Matrix) error {
	if !s.analysed {
		if err := s.Analyse(a); err != nil {
			return err
		}
	}
	symmetric := IsSymmetric(a, symmetryTol)
	if s.direct {
		if symmetric {
			if s.chol == nil {
				s.chol = NewSupernodal()
				s.chol.UseSymbolic(s.sym)
			}
			err := s.chol.Factorize(a)
			if !errors.Is(err, ErrNotDefinite) {
				s.chosen = s.chol
				return err
			}
		}
		if s.lu == nil {
			s.lu = NewLU()
			s.lu.UseSymbolic(s.sym)
		}
		s.chosen = s.lu
		return s.lu.Factorize(a)
	}
	if symmetric {
		if s.cg == nil {
			s.cg = &CG{iterBase{Precond: &AMG{ReuseAggregates: true, Lag: true}}}
		}
		s.chosen = s.cg
	} else {
		if s.bicg == nil {
			s.bicg = &BiCGStab{iterBase{Precond: &AMG{ReuseAggregates: true, Lag: true}}}
		}
		s.choosePrecond(a)
		s.chosen = s.bicg
	}
	s.configure()
	return s.chosen.Factorize(a)
}

func (s *AutoSolver) configure() {
	if it, ok := s.chosen.(Iterative); ok {
		it.SetTolerance(s.tol)
		it.SetWarmStart(s.warm)
	}
}

// Solve solves with the chosen solver.
func (s *AutoSolver) Solve(x, b []float64) error {
	if s.chosen == nil {
		return fmt.Errorf("%w: no factorisation", ErrPattern)
	}
	err := s.chosen.Solve(x, b)
	if cg, ok := s.chosen.(*CG); ok && errors.Is(err, ErrNotDefinite) {
		if s.bicg == nil {
			s.bicg = &BiCGStab{iterBase{Precond: &AMG{ReuseAggregates: true, Lag: true}}}
		}
		s.chosen = s.bicg
		s.configure()
		if err = s.bicg.Factorize(&cg.a); err != nil {
			return err
		}
		err = s.bicg.Solve(x, b)
	}
	if it, ok := s.chosen.(Iterative); ok {
		s.lastIters, s.lastRes = it.Stats()
	}
	return err
}

// SetTolerance sets the relative residual for the iterative solvers; the
// direct ones solve exactly.
func (s *AutoSolver) SetTolerance(rel float64) { s.tol = rel; s.configure() }

// SetWarmStart makes the iterative solvers start from the given x.
func (s *AutoSolver) SetWarmStart(on bool) { s.warm = on; s.configure() }

// Stats returns the iterations and relative residual of the last iterative
// solve (zero for a direct one).
func (s *AutoSolver) Stats() (int, float64) {
	if _, ok := s.chosen.(Iterative); ok {
		return s.lastIters, s.lastRes
	}
	return 0, 0
}

// SolveTranspose solves Aᵀ·x = b with a direct factorisation.
func (s *AutoSolver) SolveTranspose(x, b []float64) error {
	ts, ok := s.chosen.(TransposeSolver)
	if !ok {
		return fmt.Errorf("sparse: %s cannot solve with the transpose", s.Kind())
	}
	return ts.SolveTranspose(x, b)
}

var (
	_ Iterative       = (*AutoSolver)(nil)
	_ Iterative       = (*CG)(nil)
	_ Iterative       = (*BiCGStab)(nil)
	_ Solver          = (*Cholesky)(nil)
	_ Solver          = (*LU)(nil)
	_ Solver          = (*PivotLU)(nil)
	_ TransposeSolver = (*LU)(nil)
	_ TransposeSolver = (*Cholesky)(nil)
	_ TransposeSolver = (*PivotLU)(nil)
	_ TransposeSolver = (*Supernodal)(nil)
	_ Solver          = (*Supernodal)(nil)
)
