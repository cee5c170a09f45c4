package solve

// LineSearch decides how far to go along a step p from x. Newton gives it
// the merit φ(0) = ½‖F(x)‖² (equations scaled by their magnitudes) and a
// function that evaluates the problem at x + λp and returns φ(λ) (or an
// error when that state is outside the problem's domain). It returns the
// accepted λ, or ok false when no λ will do. A negative φ(λ) means the
// trial is acceptable whatever its merit (it is within tolerance already,
// or it is a pseudo-transient step, which need not decrease the merit).
type LineSearch interface {
	Search(phi0 float64, try func(lambda float64) (float64, error)) (lambda float64, ok bool, lastErr error)
}

// Backtracking is the classic backtracking line search with Armijo's
// sufficient-decrease condition (Dennis & Schnabel, Numerical Methods for
// Unconstrained Optimization and Nonlinear Equations, 1983, §6.3): it tries
// λ = 1, ½, ¼ … and accepts the first with φ(λ) ≤ (1 − 2cλ)φ(0), which for
// φ = ½‖F‖² and a Newton step p is Armijo's condition with slope −2φ(0).
type Backtracking struct {
	// Armijo is the sufficient-decrease constant c. Default 1e-4.
	Armijo float64
	// MinStep is the shortest λ tried before giving up. Default 1e-8.
	MinStep float64
}

// Search implements LineSearch.
func (b Backtracking) Search(phi0 float64, try func(float64) (float64, error)) (float64, bool, error) {
	c, minStep := b.Armijo, b.MinStep
	if c <= 0 {
		c = 1e-4
	}
	if minStep <= 0 {
		minStep = 1e-8
	}
	var last error
	for lambda := 1.0; lambda >= minStep; lambda /= 2 {
		phi, err := try(lambda)
		if err != nil {
			last = err
			continue
		}
		if phi <= (1-2*c*lambda)*phi0 {
			return lambda, true, nil
		}
	}
	return 0, false, last
}
