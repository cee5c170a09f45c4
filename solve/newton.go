package solve

import (
	"errors"
	"fmt"
	"math"

	"github.com/heatgraph/heatgraph/sparse"
)

// Result is the outcome of a solve.
type Result struct {
	X          []float64  // the last state; a solution only if Reason is Converged
	Reason     StopReason // why the iteration stopped
	Iterations int        // Newton iterations taken
	Residual   float64    // largest |F(X)|
	Scaled     float64    // Residual divided by the scale at X
	Step       float64    // largest |Δx| of the last iteration
	Err        error      // the underlying error for SingularJacobian and InvalidStart
}

// Newton solves p's equations from the initial state x0 (which it does not
// modify) by Newton's method with a backtracking line search on ‖F‖².
//
// Each iteration solves J·p = −F (or, where J is singular, takes a
// pseudo-transient step, see newtonStep), limits the step so that no
// unknown moves by more than Settings.MaxChange, then halves the step until
// the residual falls enough (Armijo's condition); a trial state outside the
// problem's domain counts as no decrease. Close to the solution, where
// round-off keeps the residual from falling further, a trial whose residual
// is already within tolerance is accepted. The iteration converges when
// both the last step and the scaled residual are below tolerance.
func Newton(p Problem, x0 []float64, s Settings) Result {
	s = s.withDefaults()
	n := p.Size()
	x := append([]float64(nil), x0...)
	res := Result{X: x}
	if n == 0 {
		res.Reason = Converged
		return res
	}
	f := make([]float64, n)
	jac := p.Jacobian()
	fscale, err := p.Evaluate(x, f, jac)
	if err != nil {
		res.Reason, res.Err = InvalidStart, err
		return res
	}
	if !allFinite(f) {
		res.Reason = NotFinite
		return res
	}
	step := make([]float64, n)
	rhs := make([]float64, n)
	trial := make([]float64, n)
	ftrial := make([]float64, n)
	phi := sumSquares(f)
	shifts := 0
	for it := 1; it <= s.MaxIterations; it++ {
		res.Iterations = it
		shifted, err := newtonStep(s, jac, f, fscale, step, rhs)
		if err != nil {
			res.Reason, res.Err = classify(err)
			return finish(res, f, fscale)
		}
		if shifted {
			shifts++
			if shifts > maxShiftedSteps {
				res.Reason = SingularJacobian
				res.Err = fmt.Errorf("%w after %d pseudo-transient steps", ErrSingular, maxShiftedSteps)
				return finish(res, f, fscale)
			}
		}
		if !allFinite(step) {
			res.Reason = NotFinite
			return finish(res, f, fscale)
		}
		if big := maxAbs(step); big > s.MaxChange {
			scale(step, s.MaxChange/big)
		}
		// Backtracking line search on φ = ‖F‖². A shifted step is not a
		// Newton step and need not reduce φ; it only has to land where
		// the problem can be evaluated.
		lambda := 1.0
		accepted := false
		for lambda >= s.MinStep {
			for i := range trial {
				trial[i] = x[i] + lambda*step[i]
			}
			if tscale, err := p.Evaluate(trial, ftrial, nil); err == nil && allFinite(ftrial) {
				// Near the solution round-off stops φ from falling;
				// a trial already within tolerance is accepted.
				phiTrial := sumSquares(ftrial)
				if shifted || phiTrial <= (1-2*s.Armijo*lambda)*phi ||
					maxAbs(ftrial) <= s.ResidualTolerance*tscale {
					accepted = true
					break
				}
			}
			lambda /= 2
		}
		if !accepted {
			res.Reason = LineSearchFailed
			return finish(res, f, fscale)
		}
		copy(x, trial)
		if fscale, err = p.Evaluate(x, f, jac); err != nil {
			// Evaluated without error a moment ago; the Jacobian pass
			// must not disagree.
			res.Reason, res.Err = InvalidStart, err
			return finish(res, f, fscale)
		}
		phi = sumSquares(f)
		res.Step = lambda * maxAbs(step)
		res.Residual = maxAbs(f)
		res.Scaled = res.Residual / fscale
		if s.Monitor != nil {
			s.Monitor(Iterate{Iteration: it, Residual: res.Residual, Scaled: res.Scaled, Step: res.Step, Lambda: lambda})
		}
		if res.Step <= s.StepTolerance && res.Scaled <= s.ResidualTolerance {
			res.Reason = Converged
			return res
		}
	}
	res.Reason = MaxIterations
	return res
}

// maxShiftedSteps bounds the pseudo-transient steps of one solve: a
// problem that stays singular after this many has part of its unknowns
// truly undetermined.
const maxShiftedSteps = 50

// newtonStep solves J·step = −F. When J is singular, as it is where a
// nonlinear link has zero slope (natural convection at zero temperature
// difference, at the usual starting state), it takes a pseudo-transient
// step instead (Kelley & Keyes 1998, Convergence analysis of
// pseudotransient continuation, SIAM J. Numer. Anal. 35): it solves
// (J − μ·D)·step = −F with D = diag(±1) in the sign of each row's
// diagonal (−1 for a zero diagonal: the dissipative sign of a thermal
// network, where more heat leaves a node as it warms) and
// μ = fscale/Settings.PseudoStep, a capacity that moves the unknowns by
// about PseudoStep. It reports whether it shifted.
func newtonStep(s Settings, jac *sparse.Matrix, f []float64, fscale float64, step, rhs []float64) (bool, error) {
	for i := range rhs {
		rhs[i] = -f[i]
	}
	err := s.Linear.Factorize(jac)
	if err == nil {
		return false, s.Linear.Solve(step, rhs)
	}
	if !errors.Is(err, ErrSingular) {
		return false, err
	}
	mu := fscale / s.PseudoStep
	for try := 0; try < 6; try, mu = try+1, mu*10 {
		shiftedJac := jac.Clone()
		for i := 0; i < jac.N; i++ {
			k := jac.Index(i, i)
			if shiftedJac.Val[k] > 0 {
				shiftedJac.Val[k] += mu
			} else {
				shiftedJac.Val[k] -= mu
			}
		}
		if err = s.Linear.Factorize(shiftedJac); err == nil {
			return true, s.Linear.Solve(step, rhs)
		}
	}
	return false, err
}

// finish records the residual at the last accepted state.
func finish(r Result, f []float64, scale float64) Result {
	r.Residual = maxAbs(f)
	r.Scaled = r.Residual / scale
	return r
}

func classify(err error) (StopReason, error) {
	if errors.Is(err, ErrSingular) {
		return SingularJacobian, err
	}
	return LinearSolverFailed, err
}

func allFinite(v []float64) bool {
	for _, x := range v {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return false
		}
	}
	return true
}

func sumSquares(v []float64) float64 {
	s := 0.0
	for _, x := range v {
		s += x * x
	}
	return s
}

func maxAbs(v []float64) float64 {
	m := 0.0
	for _, x := range v {
		if a := math.Abs(x); a > m {
			m = a
		}
	}
	return m
}

func scale(v []float64, c float64) {
	for i := range v {
		v[i] *= c
	}
}
