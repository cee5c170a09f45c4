package sparse

import (
	"errors"
	"fmt"
	"math"

	"github.com/heatgraph/heatgraph/internal/bigmem"
)

// Defaults of the iterative solvers.
const (
	// DefaultTol is the default relative residual ‖b − A·x‖₂/‖b‖₂.
	DefaultTol = 1e-10
	// DefaultMaxIter is the default iteration limit.
	DefaultMaxIter = 5000
)

// iterBase holds what CG and BiCGStab share.
type iterBase struct {
	// Tol is the relative residual to reach, default DefaultTol.
	Tol float64
	// MaxIter is the iteration limit, default DefaultMaxIter.
	MaxIter int
	// Precond is the preconditioner; nil means ILU0 (IC(0) for CG).
	Precond Preconditioner
	// WarmStart makes Solve start from the x it is given.
	WarmStart bool

	// sign is the sign the preconditioner is built for, σ·A: CG's σ, for
	// which σ·A is positive definite; +1 for BiCGStab.
	sign   float64
	a      Matrix // pattern shared with the caller's matrix, values copied
	op     *op    // a with 4-byte column indices, for the products
	narrow narrowing
	ok     bool
	iters  int
	relres float64
	w      [][]float64
	// freshRate is the natural logarithm of the residual's reduction per
	// iteration in the first solve after a full preconditioner set-up.
	freshRate float64
}

func (s *iterBase) SetTolerance(rel float64) { s.Tol = rel }
func (s *iterBase) SetWarmStart(on bool)     { s.WarmStart = on }
func (s *iterBase) Stats() (int, float64)    { return s.iters, s.relres }

// Analyse records the pattern; iterative solvers need no ordering.
func (s *iterBase) Analyse(a *Matrix) error {
	s.a = Matrix{N: a.N, RowPtr: a.RowPtr, Col: a.Col}
	s.ok = false
	return nil
}

func (s *iterBase) factorize(a *Matrix, sign float64) error {
	s.ok = false
	if s.a.RowPtr == nil {
		s.Analyse(a)
	}
	if a.N != s.a.N || len(a.Col) != len(s.a.Col) {
		return ErrPattern
	}
	if err := checkFinite(a); err != nil {
		return err
	}
	if cap(s.a.Val) < len(a.Val) {
		s.a.Val = bigmem.Make[float64](len(a.Val))
	}
	s.a.Val = s.a.Val[:len(a.Val)]
	copy(s.a.Val, a.Val)
	s.a.RowPtr, s.a.Col = a.RowPtr, a.Col
	o, err := s.narrow.op(&s.a)
	if err != nil {
		return err
	}
	s.op = o
	if s.Precond == nil {
		s.Precond = &ILU0{}
	}
	s.sign = sign
	if err := s.setupPrecond(); err != nil {
		return err
	}
	s.ok = true
	return nil
}

// setupPrecond sets the preconditioner up for s.sign·A; multigrid takes
// the matrix with the solver's own 4-byte column indices.
func (s *iterBase) setupPrecond() error {
	if m, ok := s.Precond.(*AMG); ok {
		return m.setup(s.op, s.sign)
	}
	return s.Precond.Setup(&s.a, s.sign)
}

func (s *iterBase) vectors(k int) [][]float64 {
	n := s.a.N
	if len(s.w) != k || len(s.w[0]) != n {
		s.w = make([][]float64, k)
		for i := range s.w {
			s.w[i] = bigmem.Make[float64](n)
		}
	}
	return s.w
}

func (s *iterBase) limits() (float64, int) {
	tol, maxIter := s.Tol, s.MaxIter
	if tol <= 0 {
		tol = DefaultTol
	}
	if maxIter <= 0 {
		maxIter = DefaultMaxIter
	}
	return tol, maxIter
}

// start sets x to its initial guess and r = b − A·x, and returns ‖b‖₂
// and ‖r‖₂.
func (s *iterBase) start(x, b, r []float64) (float64, float64) {
	if !s.WarmStart {
		clear(x)
		copy(r, b)
	} else {
		s.op.MulVec(r, x)
		for i := range r {
			r[i] = b[i] - r[i]
		}
	}
	return norm2(b), norm2(r)
}

func (s *iterBase) fail(name string, it int, why string) error {
	tol, _ := s.limits()
	return fmt.Errorf("%w: %s %s after %d iterations, relative residual %.3g (tolerance %.3g)",
		ErrNotConverged, name, why, it, s.relres, tol)
}

// CG is the preconditioned conjugate gradient method (Hestenes & Stiefel
// 1952; Saad 2003, ch. 9) for symmetric definite A of either sign: a
// Jacobian of heat flows is negative definite, the matrix of a time step
// (capacity over the step less the Jacobian) positive definite. It
// iterates on σ·A·x = σ·b with σ the sign of A's diagonal (−1 unless
// every diagonal entry is positive), whose matrix is then positive
// definite, and the preconditioner is built for σ·A. Its default
// preconditioner is IC(0) (ILU0 on a symmetric matrix). The residual it
// checks is the true one, recomputed when the recurrence claims
// convergence.
type CG struct{ iterBase }

// NewCG returns a CG solver with the IC(0) preconditioner and defaults.
func NewCG() *CG { return &CG{} }

// Factorize copies a's values and builds the preconditioner for σ·A.
func (s *CG) Factorize(a *Matrix) error {
	return s.factorize(a, definiteSign(a))
}

// definiteSign returns +1 when every diagonal entry of a is positive (the
// sign of a positive definite matrix's diagonal), else −1.
func definiteSign(a *Matrix) float64 {
	for i := 0; i < a.N; i++ {
		if !(a.At(i, i) > 0) {
			return -1
		}
	}
	return 1
}

// Solve iterates from zero (or from x with WarmStart) until
// ‖b − A·x‖₂ ≤ Tol·‖b‖₂; failing that within MaxIter iterations, it
// returns an error wrapping ErrNotConverged, with x the last iterate.
//
// With a lagging multigrid preconditioner (AMG.Lag), Solve judges the
// hierarchy by its rate: when a solve with the kept coarse levels
// reduces the residual much more slowly per iteration than the first
// solve after the last full set-up, it asks for a new hierarchy at the
// next Factorize; when the kept levels would take far more iterations
// than that rate predicts, it builds the new hierarchy at once and goes on
// from where it is.
func (s *CG) Solve(x, b []float64) error {
	if !s.ok {
		return fmt.Errorf("%w: no successful factorisation", ErrPattern)
	}
	if err := checkLen(s.a.N, x, b); err != nil {
		return err
	}
	return s.lagged(func(tol float64, maxIter int) (float64, error) { return s.cg(x, b, tol, maxIter) })
}

// lagged runs the iteration run (returning the relative residual it
// started from) to the solver's tolerance; with a lagging multigrid
// preconditioner (AMG.Lag) for s.sign·A it judges the hierarchy as CG.Solve
// describes.
func (s *iterBase) lagged(run func(tol float64, maxIter int) (float64, error)) error {
	tol, maxIter := s.limits()
	l, lagging := s.Precond.(lagger)
	limit := maxIter
	if lagging && !l.Fresh() && s.freshRate < 0 {
		// The iterations a fresh hierarchy would take from a cold start,
		// three times over.
		limit = min(maxIter, 10+int(3*math.Log(tol)/s.freshRate))
	}
	start, err := run(tol, limit)
	iters := s.iters
	if lagging && errors.Is(err, ErrNotConverged) && !l.Fresh() && limit < maxIter {
		l.Renew()
		if err = s.setupPrecond(); err != nil {
			return err
		}
		warm := s.WarmStart
		s.WarmStart = true
		start, err = run(tol, maxIter-iters)
		s.WarmStart = warm
		s.iters += iters
	}
	if lagging && err == nil {
		s.judge(l, start)
	}
	return err
}

// lagger is a preconditioner that may keep part of an older set-up.
type lagger interface {
	Fresh() bool
	Renew()
}

// judge records the rate of a solve with a fresh preconditioner, or asks
// for a new one when a lagging one has become much slower; start is the
// relative residual the solve began from.
func (s *iterBase) judge(l lagger, start float64) {
	if s.iters < 2 || !(s.relres > 0) || !(start > s.relres) {
		return
	}
	rate := math.Log(s.relres/start) / float64(s.iters)
	if l.Fresh() {
		s.freshRate = rate
		return
	}
	if s.freshRate < 0 && rate > 0.6*s.freshRate {
		l.Renew()
	}
}

// cg is the CG iteration on σ·A·x = σ·b, at most maxIter steps. It
// returns the relative residual it started from.
func (s *CG) cg(x, b []float64, tol float64, maxIter int) (float64, error) {
	n := s.a.N
	a := s.op
	w := s.vectors(4)
	r, z, p, q := w[0], w[1], w[2], w[3]
	bn, rn := s.start(x, b, r)
	s.iters, s.relres = 0, 0
	if bn == 0 {
		clear(x)
		return 0, nil
	}
	s.relres = rn / bn
	start := s.relres
	if s.relres <= tol {
		return start, nil
	}
	// Work on M = σ·A, c = σ·b: the residual c − M·x is σ·r.
	sign := s.sign
	inBlocks(n, func(_, lo, hi int) {
		for i := lo; i < hi; i++ {
			r[i] *= sign
		}
	})
	s.Precond.Apply(z, r)
	copy(p, z)
	rz := pdot(r, z)
	for it := 1; it <= maxIter; it++ {
		// q = M·p and p·q in one pass.
		pq := sumBlocks(n, func(lo, hi int) float64 {
			mulRows(a.RowPtr, a.Col, a.Val, q, p, lo, hi)
			t := 0.0
			for i := lo; i < hi; i++ {
				q[i] *= sign
				t += p[i] * q[i]
			}
			return t
		})
		if !(pq > 0) {
			s.iters = it
			m := "−A"
			if sign > 0 {
				m = "A"
			}
			return start, fmt.Errorf("%w: %s is not positive definite along a search direction (iteration %d)", ErrNotDefinite, m, it)
		}
		alpha := rz / pq
		rr := sumBlocks(n, func(lo, hi int) float64 {
			t := 0.0
			for i := lo; i < hi; i++ {
				x[i] += alpha * p[i]
				r[i] -= alpha * q[i]
				t += r[i] * r[i]
			}
			return t
		})
		s.iters = it
		s.relres = math.Sqrt(rr) / bn
		if s.relres <= tol {
			// Confirm with the true residual; restart from it if the
			// recurrence has drifted.
			a.MulVec(r, x)
			for i := range r {
				r[i] = sign * (b[i] - r[i]) // c − M·x = σ·(b − A·x)
			}
			s.relres = norm2(r) / bn
			if s.relres <= tol {
				return start, nil
			}
			s.Precond.Apply(z, r)
			copy(p, z)
			rz = pdot(r, z)
			continue
		}
		s.Precond.Apply(z, r)
		rzNew := pdot(r, z)
		beta := rzNew / rz
		rz = rzNew
		inBlocks(n, func(_, lo, hi int) {
			for i := lo; i < hi; i++ {
				p[i] = z[i] + beta*p[i]
			}
		})
	}
	return start, s.fail("CG", s.iters, "stopped at the iteration limit")
}

// BiCGStab is the stabilised biconjugate gradient method (van der Vorst,
// SIAM J. Sci. Stat. Comput. 13, 1992; Saad 2003, ch. 7) with right
// preconditioning, for unsymmetric A; its default preconditioner is ILU(0).
// On a breakdown (ρ or ω zero) it restarts from the current iterate.
type BiCGStab struct{ iterBase }

// NewBiCGStab returns a BiCGStab solver with the ILU(0) preconditioner and
// defaults.
func NewBiCGStab() *BiCGStab { return &BiCGStab{} }

// Factorize copies a's values and builds the preconditioner for A.
func (s *BiCGStab) Factorize(a *Matrix) error { return s.factorize(a, 1) }

// Solve iterates from zero (or from x with WarmStart) until
// ‖b − A·x‖₂ ≤ Tol·‖b‖₂; failing that within MaxIter iterations, it
// returns an error wrapping ErrNotConverged, with x the last iterate. A
// lagging multigrid preconditioner is judged as in CG.Solve.
func (s *BiCGStab) Solve(x, b []float64) error {
	if !s.ok {
		return fmt.Errorf("%w: no successful factorisation", ErrPattern)
	}
	if err := checkLen(s.a.N, x, b); err != nil {
		return err
	}
	return s.lagged(func(tol float64, maxIter int) (float64, error) { return s.bicg(x, b, tol, maxIter) })
}

// bicg is the BiCGStab iteration, at most maxIter steps, on blocks of rows
// in parallel on long vectors. It returns the relative residual it
// started from.
func (s *BiCGStab) bicg(x, b []float64, tol float64, maxIter int) (float64, error) {
	n := s.a.N
	w := s.vectors(7)
	r, rhat, p, v, ph, sh, t := w[0], w[1], w[2], w[3], w[4], w[5], w[6]
	bn, rn := s.start(x, b, r)
	s.iters, s.relres = 0, 0
	if bn == 0 {
		clear(x)
		return 0, nil
	}
	s.relres = rn / bn
	start := s.relres
	if s.relres <= tol {
		return start, nil
	}
	restart := true
	var rho, alpha, omega float64
	restarts := 0
	for it := 1; it <= maxIter; it++ {
		if restart {
			copy(rhat, r)
			copy(p, r)
			rho = pdot(rhat, r)
			restart = false
		} else {
			rhoNew := pdot(rhat, r)
			if rhoNew == 0 || omega == 0 {
				restart = true
				restarts++
				if restarts > 20 {
					return start, s.fail("BiCGStab", it, "broke down")
				}
				it--
				continue
			}
			beta := rhoNew / rho * alpha / omega
			rho = rhoNew
			inBlocks(n, func(_, lo, hi int) {
				for i := lo; i < hi; i++ {
					p[i] = r[i] + beta*(p[i]-omega*v[i])
				}
			})
		}
		s.Precond.Apply(ph, p)
		s.op.MulVec(v, ph)
		rv := pdot(rhat, v)
		if rv == 0 {
			restart = true
			restarts++
			if restarts > 20 {
				return start, s.fail("BiCGStab", it, "broke down")
			}
			continue
		}
		alpha = rho / rv
		// s = r − α·v, kept in r.
		sn := math.Sqrt(sumBlocks(n, func(lo, hi int) float64 {
			t := 0.0
			for i := lo; i < hi; i++ {
				r[i] -= alpha * v[i]
				t += r[i] * r[i]
			}
			return t
		}))
		s.iters = it
		if sn/bn <= tol {
			inBlocks(n, func(_, lo, hi int) {
				for i := lo; i < hi; i++ {
					x[i] += alpha * ph[i]
				}
			})
			if s.converged(x, b, r, bn, tol) {
				return start, nil
			}
			restart = true
			continue
		}
		s.Precond.Apply(sh, r)
		s.op.MulVec(t, sh)
		tt := pdot(t, t)
		if tt == 0 {
			omega = 0
		} else {
			omega = pdot(t, r) / tt
		}
		rr := sumBlocks(n, func(lo, hi int) float64 {
			q := 0.0
			for i := lo; i < hi; i++ {
				x[i] += alpha*ph[i] + omega*sh[i]
				r[i] -= omega * t[i]
				q += r[i] * r[i]
			}
			return q
		})
		s.relres = math.Sqrt(rr) / bn
		if s.relres <= tol {
			if s.converged(x, b, r, bn, tol) {
				return start, nil
			}
			restart = true
		}
	}
	return start, s.fail("BiCGStab", s.iters, "stopped at the iteration limit")
}

// converged recomputes r = b − A·x and reports whether it meets tol.
func (s *iterBase) converged(x, b, r []float64, bn, tol float64) bool {
	s.op.MulVec(r, x)
	for i := range r {
		r[i] = b[i] - r[i]
	}
	s.relres = norm2(r) / bn
	return s.relres <= tol
}

func dot(a, b []float64) float64 {
	s := 0.0
	for i, v := range a {
		s += v * b[i]
	}
	return s
}

func norm2(a []float64) float64 { return math.Sqrt(dot(a, a)) }
