package solve

import (
	"errors"
	"math"
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
// Each iteration solves J·p = −F, limits the step so that no unknown moves
// by more than Settings.MaxChange, then halves the step until the residual
// falls enough (Armijo's condition); a trial state outside the problem's
// domain counts as no decrease. Close to the solution, where round-off keeps
// the residual from falling further, a trial whose residual is already
// within tolerance is accepted. The iteration converges when both the last
// step and the scaled residual are below tolerance.
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
	for it := 1; it <= s.MaxIterations; it++ {
		res.Iterations = it
		if err := s.Linear.Factorize(jac); err != nil {
			res.Reason, res.Err = classify(err)
			return finish(res, f, fscale)
		}
		for i := range rhs {
			rhs[i] = -f[i]
		}
		if err := s.Linear.Solve(step, rhs); err != nil {
			res.Reason, res.Err = classify(err)
			return finish(res, f, fscale)
		}
		if !allFinite(step) {
			res.Reason = NotFinite
			return finish(res, f, fscale)
		}
		if big := maxAbs(step); big > s.MaxChange {
			scale(step, s.MaxChange/big)
		}
		// Backtracking line search on φ = ‖F‖².
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
				if phiTrial <= (1-2*s.Armijo*lambda)*phi ||
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
