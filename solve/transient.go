package solve

import (
	"errors"
	"fmt"
	"math"
	"sort"

	"github.com/heatgraph/heatgraph/internal/bigmem"
	"github.com/heatgraph/heatgraph/sparse"
)

// Transient is a problem with stored quantities that change in time:
//
//	dE(x)/dt = F(x, t)
//
// with F the problem's Evaluate (the net flow into each equation, at the
// time last given to SetTime) and E its stored quantity (heat, J). An
// equation with no stored quantity (a node without heat capacity) is
// algebraic, F(x, t) = 0, so that the problem is in general a
// differential-algebraic system of index 1.
type Transient interface {
	Problem
	// Stored sets e to E(x) and, when m is not nil, m (in the pattern of
	// Pattern) to ∂E/∂x.
	Stored(x, e []float64, m *sparse.Matrix) error
	// SetTime sets the time at which Evaluate evaluates F, s.
	SetTime(t float64)
}

// Jumper is implemented by transient problems whose given quantities jump
// at known times (a power switched on, a pulse train). Jumps returns the
// times in (from, to] at which F is discontinuous, in increasing order; the
// integrator steps exactly onto each, evaluates the step that ends there
// just before it, and restarts from it with a short step.
type Jumper interface {
	Jumps(from, to float64) []float64
}

// RunReason says why a run through time ended.
type RunReason int

// The reasons a run ends. Only Completed means the run reached its end.
const (
	// Completed: the run reached its end time.
	Completed RunReason = iota
	// StepTooSmall: the step the error control or the stage iterations
	// needed fell below TransientSettings.MinStep.
	StepTooSmall
	// StageFailed: with fixed steps, a stage's Newton iteration did not
	// converge (or left the domain).
	StageFailed
	// StepLimit: TransientSettings.MaxSteps steps were taken first.
	StepLimit
	// InvalidState: the problem could not be evaluated at the start.
	InvalidState
	// LinearFailed: the linear solver failed (a problem too large for it,
	// a singular stage matrix).
	LinearFailed
	// Interrupted: a step callback asked to stop.
	Interrupted
)

var runReasonNames = [...]string{
	Completed:    "completed",
	StepTooSmall: "step size fell below the minimum",
	StageFailed:  "a stage did not converge at the fixed step",
	StepLimit:    "step limit reached",
	InvalidState: "cannot evaluate the initial state",
	LinearFailed: "linear solver failed",
	Interrupted:  "stopped by a callback",
}

// String describes the reason in a few words.
func (r RunReason) String() string {
	if r >= 0 && int(r) < len(runReasonNames) {
		return runReasonNames[r]
	}
	return "unknown run reason"
}

// Completed reports whether the run reached its end.
func (r RunReason) Completed() bool { return r == Completed }

// Tolerance is the local error allowed to one kind of unknown in one step:
// Abs + Rel·|x|, in the kind's unit.
type Tolerance struct{ Abs, Rel float64 }

// TransientSettings control a run through time. A zero field means its
// default.
type TransientSettings struct {
	Start, End float64 // s
	// Outputs are the times at which Output is called, in (Start, End];
	// the integrator steps exactly onto each (there is no interpolation),
	// so the values are the method's own. Start and End are always output.
	Outputs []float64
	// FixedStep, when positive, turns the error control off: every step
	// is this long (shortened only to land on outputs and jumps).
	FixedStep float64
	// FirstStep is the first step, and the step after every jump.
	// Default: 1e-6 of the run.
	FirstStep float64
	// MaxStep bounds the step; default the whole run.
	MaxStep float64
	// MinStep: a step shorter than this ends the run with StepTooSmall.
	// Default: 1e-12 of the run.
	MinStep float64
	// RelTol and AbsTol give each kind the tolerance
	// {Abs: AbsTol·Kind.Scale, Rel: RelTol}. Defaults 1e-4 and 1e-3 (with
	// a scale of 1 K: 1 mK plus 0.01 % of the absolute temperature).
	RelTol, AbsTol float64
	// Tolerances, when not nil, replaces them per kind (indexed as Kinds).
	Tolerances []Tolerance
	// MaxSteps bounds the accepted steps; default 1e6.
	MaxSteps int
	// MaxNewton is the most Newton iterations of one stage; default 8.
	MaxNewton int
	// NewtonTol is the largest Newton correction, relative to the error
	// tolerance, at which a stage is converged. Default 1e-2.
	NewtonTol float64
	// ModifiedNewton keeps the Jacobian and its factorization across
	// iterations and steps for as long as the step is unchanged and each
	// correction is at most half the one before, and refreshes it
	// otherwise (a stage that fails with an old factorization is solved
	// again with a fresh one). For large networks, whose factorizations
	// cost far more than their evaluations.
	ModifiedNewton bool
	// Linear solves the stage systems; default Auto(n). It analyses the
	// pattern once per run.
	Linear LinearSolver
	// Output, when not nil, is called at Start, at each of Outputs and at
	// End with the state there (x must not be kept).
	Output func(t float64, x []float64) error
	// OnStep, when not nil, is called after every accepted step; returning
	// false stops the run (Interrupted).
	OnStep func(StepInfo) bool
	// Monitors are called after every accepted step, after OnStep.
	Monitors []func(StepInfo)
}

// Defaults of TransientSettings.
const (
	DefaultRelTol    = 1e-4
	DefaultAbsTol    = 1e-3
	DefaultMaxSteps  = 1000000
	DefaultMaxNewton = 8
	DefaultNewtonTol = 1e-2
)

// Stage is one evaluation point of a step: the time, the state and the
// weight (s) with which its flows enter the step's change of stored
// quantity: E(x_{n+1}) − E(x_n) = Σ W·F(X, T) over the step's stages,
// exactly, for every equation with a stored quantity. Quantities
// integrated with the same weights at the same stages (the heat a source
// puts in, the heat leaving through a boundary) balance the stored heat to
// the stage iterations' tolerance.
type Stage struct {
	T float64
	X []float64
	W float64
}

// StepInfo describes one accepted step, for callbacks and monitors. Its
// slices are reused by the next step.
type StepInfo struct {
	Step     int     // 1 for the first
	T, H     float64 // the step went from T to T+H
	Error    float64 // the estimated local error relative to the tolerance (0 with fixed steps)
	Newton   int     // Newton iterations of the step's stages
	Rejected int     // steps rejected so far in the run
	Stages   [3]Stage
	Progress float64 // (T+H − Start)/(End − Start)
}

// TransientResult is the outcome of a run.
type TransientResult struct {
	T          float64   // the time reached
	X          []float64 // the state at T
	Reason     RunReason
	Steps      int // accepted
	Rejected   int // rejected by the error control or by failed stages
	Newton     int // Newton iterations
	Factorized int // factorizations of the stage matrix
	Err        error
}

// γ = 2 − √2 makes both stages of TR-BDF2 share one iteration matrix
// (M − γh/2·J) (Bank et al. 1985).
var (
	gamma = 2 - math.Sqrt2
	// the step's stage weights (see Stage): the trapezoid's two points
	// carry 1/(2(2−γ)) each, the end (1−γ)/(2−γ).
	wTrap = 1 / (2 * (2 - gamma))
	wEnd  = (1 - gamma) / (2 - gamma)
	// the BDF2 stage: E₁ − βE_γ + δE₀ = wEnd·h·F₁.
	beta  = 1 / (gamma * (2 - gamma))
	delta = (1 - gamma) * (1 - gamma) / (gamma * (2 - gamma))
	// errConst·h·[F₀/γ − F_γ/(γ(1−γ)) + F₁/(1−γ)] is the method's error
	// constant (−3γ² + 4γ − 2)/(12(2 − γ)) (Bank et al. 1985) times h³y‴
	// taken from the second divided difference of the stage flows. It is
	// the same as Hosea & Shampine's estimate, h·Σ(b̂ᵢ − bᵢ)·Fᵢ, the
	// difference between TR-BDF2's weights b = (w, w, d) and those of their
	// embedded third-order formula b̂ = ((1 − w)/3, w + 1/3, d/3), with
	// w = √2/4 and d = γ/2 (checked in the tests).
	errConst = (-3*gamma*gamma + 4*gamma - 2) / (6 * (2 - gamma))
)

// TRBDF2 integrates p from x0 at s.Start to s.End by the TR-BDF2 method of
// Bank, Coughran, Fichtner, Grosse, Rose & Smith (Transient simulation of
// silicon devices and circuits, IEEE Trans. CAD 4, 1985): each step is a
// trapezoidal stage to t + γh followed by a second-order backward
// differentiation stage to t + h, γ = 2 − √2. It is second order,
// L-stable, and handles massless unknowns (algebraic equations) because
// each stage is solved in the form
//
//	(E(x) − E_known)/(c·h) − F(x, t) = 0
//
// whose algebraic rows are F(x, t) = 0 (the trapezoidal stage takes only
// F at its end point on those rows, so the algebraic equations hold at
// every stage).
//
// The start is made consistent by one backward-Euler step of negligible
// length (1e-9 of the first step) at Start, which brings the massless
// unknowns onto their equations and leaves the others where they are.
//
// Steps are chosen by the local error estimate of Hosea & Shampine
// (Analysis and implementation of TR-BDF2, Appl. Numer. Math. 20, 1996):
// the second divided difference of the stage flows times the method's
// error constant, filtered through the iteration matrix (M − γh/2·J)⁻¹
// so that stiff components are not over-estimated; the step then changes
// by 0.9·err^(−1/3), within a factor of 0.2 to 5. The error of each
// unknown is judged against the tolerance of its kind.
//
// Each stage is solved by Newton's method with a fresh Jacobian and
// factorization at every iteration, symmetric diagonal scaling as in
// Newton, and the linear solver's Analyse called once per run. A stage
// that does not converge in MaxNewton iterations, or that leaves the
// problem's domain, is retried with a quarter of the step.
//
// Output is given at the requested times by stepping exactly onto them.
func TRBDF2(p Transient, x0 []float64, s TransientSettings) TransientResult {
	it := newIntegrator(p, x0, s)
	return it.run()
}

type integrator struct {
	p      Transient
	s      TransientSettings
	n      int
	kinds  []Kind
	kindOf []int
	tol    []Tolerance // per unknown
	alg    []bool      // algebraic rows

	x, xg, x1, xs []float64 // state at t_n, at the γ stage, at t_{n+1}, a stage's start
	factored      bool      // the factorization is of aM − J with a = factA
	factA         float64
	e0, eg, ek, e []float64
	f0, fg, f1, f []float64
	rhs, dx, d    []float64
	est           []float64
	jac, m, a     *sparse.Matrix
	lin           LinearSolver
	res           TransientResult
	info          StepInfo
}

func newIntegrator(p Transient, x0 []float64, s TransientSettings) *integrator {
	n := p.Size()
	span := s.End - s.Start
	if s.FirstStep <= 0 {
		s.FirstStep = 1e-6 * span
	}
	if s.MaxStep <= 0 {
		s.MaxStep = span
	}
	if s.MinStep <= 0 {
		s.MinStep = 1e-12 * span
	}
	if s.RelTol <= 0 {
		s.RelTol = DefaultRelTol
	}
	if s.AbsTol <= 0 {
		s.AbsTol = DefaultAbsTol
	}
	if s.MaxSteps <= 0 {
		s.MaxSteps = DefaultMaxSteps
	}
	if s.MaxNewton <= 0 {
		s.MaxNewton = DefaultMaxNewton
	}
	if s.NewtonTol <= 0 {
		s.NewtonTol = DefaultNewtonTol
	}
	it := &integrator{p: p, s: s, n: n, kinds: p.Kinds()}
	vec := func() []float64 { return bigmem.Make[float64](n) }
	it.x = append(vec()[:0], x0...)
	it.xg, it.x1, it.xs = vec(), vec(), vec()
	it.e0, it.eg, it.ek, it.e = vec(), vec(), vec(), vec()
	it.f0, it.fg, it.f1, it.f = vec(), vec(), vec(), vec()
	it.rhs, it.dx, it.d, it.est = vec(), vec(), vec(), vec()
	it.kindOf = bigmem.Make[int](n)
	it.tol = bigmem.Make[Tolerance](n)
	for i := range it.kindOf {
		k := p.KindOf(i)
		it.kindOf[i] = k
		if s.Tolerances != nil {
			it.tol[i] = s.Tolerances[k]
		} else {
			it.tol[i] = Tolerance{Abs: s.AbsTol * it.kinds[k].Scale, Rel: s.RelTol}
		}
	}
	it.alg = make([]bool, n)
	it.jac = p.Pattern()
	// The capacities and the stage matrix share the Jacobian's pattern.
	it.m = samePattern(it.jac)
	it.a = samePattern(it.jac)
	it.lin = s.Linear
	if it.lin == nil {
		it.lin = Auto(n)
	}
	return it
}

// weight returns the tolerance of unknown i at the values a and b.
func (it *integrator) weight(i int, a, b float64) float64 {
	t := it.tol[i]
	return t.Abs + t.Rel*math.Max(math.Abs(a), math.Abs(b))
}

func (it *integrator) run() TransientResult {
	s := it.s
	it.res = TransientResult{T: s.Start, X: it.x}
	if !(s.End > s.Start) {
		it.res.Reason, it.res.Err = InvalidState, fmt.Errorf("the run must end after it starts (start %g s, end %g s)", s.Start, s.End)
		return it.res
	}
	if err := it.lin.Analyse(it.a); err != nil {
		it.res.Reason, it.res.Err = LinearFailed, err
		return it.res
	}
	// Which equations hold no stored quantity: rows of ∂E/∂x that are
	// zero throughout.
	it.p.SetTime(s.Start)
	if err := it.p.Stored(it.x, it.e0, it.m); err != nil {
		it.res.Reason, it.res.Err = InvalidState, err
		return it.res
	}
	for i := 0; i < it.n; i++ {
		alg := true
		for k := it.m.RowPtr[i]; k < it.m.RowPtr[i+1]; k++ {
			if it.m.Val[k] != 0 {
				alg = false
			}
		}
		it.alg[i] = alg
	}
	// A consistent start: a backward-Euler step of negligible length.
	h := s.FirstStep
	if s.FixedStep > 0 {
		h = s.FixedStep
	}
	if err := it.consistent(s.Start, 1e-9*h); err != nil {
		it.res.Reason, it.res.Err = InvalidState, err
		return it.res
	}
	if s.Output != nil {
		if err := s.Output(s.Start, it.x); err != nil {
			it.res.Reason, it.res.Err = Interrupted, err
			return it.res
		}
	}
	outs := append([]float64(nil), s.Outputs...)
	sort.Float64s(outs)
	oi := 0
	for oi < len(outs) && outs[oi] <= s.Start {
		oi++
	}
	var jumps []float64
	if j, ok := it.p.(Jumper); ok {
		jumps = j.Jumps(s.Start, s.End)
	}
	ji := 0
	t := s.Start
	afterJump := false
	span := s.End - s.Start
	for t < s.End {
		if it.res.Steps >= s.MaxSteps {
			it.res.Reason = StepLimit
			return it.finish(t)
		}
		// The next stop: an output, a jump or the end.
		stop, isJump := s.End, false
		if oi < len(outs) && outs[oi] < stop {
			stop = outs[oi]
		}
		for ji < len(jumps) && jumps[ji] <= t {
			ji++
		}
		if ji < len(jumps) && jumps[ji] <= stop {
			stop, isJump = jumps[ji], true
		}
		h = math.Min(h, s.MaxStep)
		hTry, landing := h, false
		if t+hTry >= stop-1e-12*span {
			hTry, landing = stop-t, true
		} else if s.FixedStep <= 0 && t+2*hTry > stop {
			// Two even steps rather than a long one and a sliver.
			hTry = (stop - t) / 2
		}
		errNorm, ok, err := it.step(t, hTry, afterJump, landing && isJump)
		if err != nil && !ok {
			var le *linearError
			if errors.As(err, &le) {
				it.res.Reason, it.res.Err = LinearFailed, le.err
				return it.finish(t)
			}
		}
		if s.FixedStep > 0 {
			if !ok {
				it.res.Reason, it.res.Err = StageFailed, err
				return it.finish(t)
			}
		} else if !ok || errNorm > 1 {
			it.res.Rejected++
			factor := 0.25
			if ok {
				factor = math.Max(0.2, 0.9*math.Pow(errNorm, -1.0/3))
			}
			h = hTry * factor
			if h < s.MinStep {
				it.res.Reason, it.res.Err = StepTooSmall, err
				if err == nil {
					it.res.Err = fmt.Errorf("at t = %g s the error estimate needs steps below %g s", t, s.MinStep)
				}
				return it.finish(t)
			}
			continue
		}
		// Accepted.
		it.res.Steps++
		it.info.Step = it.res.Steps
		it.info.T, it.info.H, it.info.Error = t, hTry, errNorm
		it.info.Rejected = it.res.Rejected
		afterJump = landing && isJump
		if landing {
			t = stop
		} else {
			t += hTry
		}
		it.info.Progress = (t - s.Start) / span
		halt := s.OnStep != nil && !s.OnStep(it.info)
		for _, mon := range s.Monitors {
			mon(it.info)
		}
		copy(it.x, it.x1)
		if halt {
			it.res.Reason = Interrupted
			return it.finish(t)
		}
		if landing && oi < len(outs) && outs[oi] <= t {
			for oi < len(outs) && outs[oi] <= t {
				oi++
			}
			if s.Output != nil && t < s.End {
				if err := s.Output(t, it.x); err != nil {
					it.res.Reason, it.res.Err = Interrupted, err
					return it.finish(t)
				}
			}
		}
		// The next step.
		switch {
		case s.FixedStep > 0:
			h = s.FixedStep
		case landing && isJump:
			h = s.FirstStep
		default:
			next := hTry * math.Min(5, math.Max(0.2, 0.9*math.Pow(math.Max(errNorm, 1e-10), -1.0/3)))
			if landing {
				// A step shortened to land on an output does not limit
				// the next.
				next = math.Max(next, h)
			}
			h = next
		}
	}
	if s.Output != nil {
		if err := s.Output(t, it.x); err != nil {
			it.res.Reason, it.res.Err = Interrupted, err
			return it.finish(t)
		}
	}
	it.res.Reason = Completed
	return it.finish(t)
}

func (it *integrator) finish(t float64) TransientResult {
	it.res.T = t
	it.res.X = append([]float64(nil), it.x...)
	return it.res
}

type linearError struct{ err error }

// recoverable reports whether a linear solver's error may go away with a
// shorter step: a singular stage matrix, or an iterative solver that did
// not reach its tolerance (the matrix is better conditioned when the
// capacities weigh more).
func recoverable(err error) bool {
	return errors.Is(err, ErrSingular) || errors.Is(err, sparse.ErrSingular) || errors.Is(err, sparse.ErrNotConverged)
}

func (e *linearError) Error() string { return e.err.Error() }

// consistent makes x consistent at t with a backward-Euler step of length
// eps.
func (it *integrator) consistent(t, eps float64) error {
	it.p.SetTime(t)
	if err := it.p.Stored(it.x, it.e0, nil); err != nil {
		return err
	}
	copy(it.x1, it.x)
	_, err := it.newton(it.x1, t, 1/eps, it.e0, nil)
	if err == nil {
		copy(it.x, it.x1)
		return nil
	}
	// Newton's method alone fails where a massless unknown's equation has
	// no slope at the start (natural convection at zero temperature
	// difference): solve the same equations with Newton, whose line search
	// and pseudo-transient steps are made for that, with the run's linear
	// solver (which Newton analyses again for the same pattern).
	start := &startProblem{Transient: it.p, e0: it.e0, a: 1 / eps, e: make([]float64, it.n), m: it.p.Pattern()}
	it.factored = false
	res := Newton(start, it.x, Settings{Linear: it.lin})
	if !res.Reason.Converged() {
		if res.Err != nil {
			return fmt.Errorf("the massless unknowns could not be put on their balances at the start (%s): %w", res.Reason, res.Err)
		}
		return fmt.Errorf("the massless unknowns could not be put on their balances at the start (%s)", res.Reason)
	}
	copy(it.x, res.X)
	return nil
}

// startProblem is the consistent start as a Problem for Newton:
// F(x) − a·(E(x) − E₀) = 0.
type startProblem struct {
	Transient
	e0, e []float64
	a     float64
	m     *sparse.Matrix
}

func (p *startProblem) Evaluate(x, f []float64, jac *sparse.Matrix, mag []float64) error {
	if err := p.Transient.Evaluate(x, f, jac, mag); err != nil {
		return err
	}
	var m *sparse.Matrix
	if jac != nil {
		m = p.m
	}
	if err := p.Stored(x, p.e, m); err != nil {
		return err
	}
	for i := range f {
		d := p.a * (p.e[i] - p.e0[i])
		f[i] -= d
		if mag != nil {
			mag[i] += math.Abs(d)
		}
	}
	if jac != nil {
		for k := range jac.Val {
			jac.Val[k] -= p.a * m.Val[k]
		}
	}
	return nil
}

// step takes one TR-BDF2 step from (t, it.x) of length h into it.x1 and
// returns the estimated error relative to the tolerance (0 with fixed
// steps). A step that starts on a jump is evaluated from just after it,
// and a step that ends on one up to just before it: a billionth of the
// step inside, so that the given quantities take their values on the
// step's own side of the jump whatever the round-off in computing the
// jump's time.
func (it *integrator) step(t, h float64, jumpStart, jumpEnd bool) (float64, bool, error) {
	p := it.p
	t0, tg, t1 := t, t+gamma*h, t+h
	if jumpStart {
		t0 += 1e-9 * h
	}
	if jumpEnd {
		t1 -= 1e-9 * h
	}
	// F and E at the start.
	p.SetTime(t0)
	if err := p.Evaluate(it.x, it.f0, nil, nil); err != nil {
		return 0, false, err
	}
	if err := p.Stored(it.x, it.e0, nil); err != nil {
		return 0, false, err
	}
	// Trapezoidal stage: (E − E₀)/(γh/2) − F(x) = F₀ on rows with storage.
	a := 2 / (gamma * h)
	copy(it.xg, it.x)
	p.SetTime(tg)
	n1, err := it.newton(it.xg, tg, a, it.e0, it.f0)
	it.info.Newton = n1
	if err != nil {
		return 0, false, err
	}
	if err := p.Evaluate(it.xg, it.fg, nil, nil); err != nil {
		return 0, false, err
	}
	if err := p.Stored(it.xg, it.eg, nil); err != nil {
		return 0, false, err
	}
	// BDF2 stage: (E − βE_γ + δE₀)/(wEnd·h) − F(x) = 0, the same a.
	for i := range it.ek {
		it.ek[i] = beta*it.eg[i] - delta*it.e0[i]
	}
	for i := range it.x1 {
		it.x1[i] = it.x[i] + (it.xg[i]-it.x[i])/gamma
	}
	p.SetTime(t1)
	n2, err := it.newton(it.x1, t1, a, it.ek, nil)
	it.info.Newton += n2
	if err != nil {
		// The extrapolated guess may leave the domain: start from x_γ.
		copy(it.x1, it.xg)
		n3, err2 := it.newton(it.x1, t1, a, it.ek, nil)
		it.info.Newton += n3
		if err2 != nil {
			return 0, false, err2
		}
	}
	if err := p.Evaluate(it.x1, it.f1, nil, nil); err != nil {
		return 0, false, err
	}
	it.info.Stages = [3]Stage{
		{T: t0, X: it.x, W: wTrap * h},
		{T: tg, X: it.xg, W: wTrap * h},
		{T: t1, X: it.x1, W: wEnd * h},
	}
	if it.s.FixedStep > 0 {
		return 0, true, nil
	}
	// Hosea & Shampine's estimate: errConst·h·[f₀/γ − f_γ/(γ(1−γ)) +
	// f₁/(1−γ)], in stored quantity, filtered through (M − γh/2·J)⁻¹,
	// whose factorization (times a) is the last of the BDF2 stage.
	for i := range it.est {
		if it.alg[i] {
			it.rhs[i] = 0
			continue
		}
		v := errConst * h * (it.f0[i]/gamma - it.fg[i]/(gamma*(1-gamma)) + it.f1[i]/(1-gamma))
		// (M − γh/2·J)⁻¹ = a·(aM − J)⁻¹; the system is scaled by d.
		it.rhs[i] = a * v * it.d[i]
	}
	if err := it.lin.Solve(it.est, it.rhs); err != nil {
		return 0, false, &linearError{err}
	}
	worst := 0.0
	for i, v := range it.est {
		r := math.Abs(v*it.d[i]) / it.weight(i, it.x[i], it.x1[i])
		if math.IsNaN(r) {
			return 0, false, errors.New("error estimate not finite")
		}
		worst = math.Max(worst, r)
	}
	return worst, true, nil
}

// newton solves a·(E(x) − ek) − F(x, t) = g for x (in place), where g is
// rhs on the rows with storage (nil for zero): algebraic rows are
// F(x, t) = 0 at every stage. It returns the iterations taken.
func (it *integrator) newton(x []float64, t, a float64, ek, rhs []float64) (int, error) {
	if !it.s.ModifiedNewton {
		return it.iterate(x, t, a, ek, rhs, true, true)
	}
	// Modified Newton: keep the factorization while it serves; on
	// failure, start the stage again with a fresh one.
	copy(it.xs, x)
	// Steps that differ by round-off (a fixed step landing on an output)
	// share the factorization.
	stale := !(it.factored && math.Abs(it.factA-a) <= 1e-9*a)
	k, err := it.iterate(x, t, a, ek, rhs, stale, false)
	if err == nil || stale {
		return k, err
	}
	var le *linearError
	if errors.As(err, &le) {
		return k, err
	}
	copy(x, it.xs)
	k2, err := it.iterate(x, t, a, ek, rhs, true, true)
	return k + k2, err
}

// iterate runs the Newton iterations of one stage. With always, it forms
// and factorizes the matrix at every iteration; otherwise (modified
// Newton) at the first only when fresh, and later only when a correction
// fails to shrink to half the one before.
func (it *integrator) iterate(x []float64, t, a float64, ek, rhs []float64, fresh, always bool) (int, error) {
	p := it.p
	prev := math.Inf(1)
	for k := 1; k <= it.s.MaxNewton; k++ {
		it.res.Newton++
		var jac, m *sparse.Matrix
		if fresh {
			jac, m = it.jac, it.m
		}
		if err := p.Evaluate(x, it.f, jac, nil); err != nil {
			return k, err
		}
		if err := p.Stored(x, it.e, m); err != nil {
			return k, err
		}
		// Residual G and matrix aM − J.
		for i := 0; i < it.n; i++ {
			g := -it.f[i]
			if !it.alg[i] {
				g += a * (it.e[i] - ek[i])
				if rhs != nil {
					g -= rhs[i]
				}
			}
			it.rhs[i] = -g
		}
		if fresh {
			if err := it.factorize(a); err != nil {
				return k, err
			}
		}
		for i := range it.rhs {
			it.rhs[i] *= it.d[i]
		}
		if err := it.lin.Solve(it.dx, it.rhs); err != nil {
			if recoverable(err) {
				return k, err
			}
			return k, &linearError{err}
		}
		worst := 0.0
		for i := range it.dx {
			it.dx[i] *= it.d[i]
			if math.IsNaN(it.dx[i]) || math.IsInf(it.dx[i], 0) {
				return k, errors.New("Newton correction not finite")
			}
			worst = math.Max(worst, math.Abs(it.dx[i])/it.weight(i, x[i], x[i]))
			x[i] += it.dx[i]
		}
		if worst <= it.s.NewtonTol {
			// Leave the factorization of the converged state for the
			// error estimate: the change since is within NewtonTol.
			return k, nil
		}
		fresh = always || worst > prev/2
		prev = worst
	}
	return it.s.MaxNewton, fmt.Errorf("a stage did not converge in %d Newton iterations at t = %g s", it.s.MaxNewton, t)
}

// factorize forms D(aM − J)D from the last evaluated Jacobian and
// capacities, with D_ii = 1/√|aM − J|_ii, and factorizes it.
func (it *integrator) factorize(a float64) error {
	for k2 := range it.a.Val {
		it.a.Val[k2] = a*it.m.Val[k2] - it.jac.Val[k2]
	}
	for i := 0; i < it.n; i++ {
		dii := 0.0
		if k2 := it.a.Index(i, i); k2 >= 0 {
			dii = math.Abs(it.a.Val[k2])
		}
		if dii > 0 && !math.IsInf(dii, 0) {
			it.d[i] = 1 / math.Sqrt(dii)
		} else {
			it.d[i] = 1
		}
	}
	for i := 0; i < it.n; i++ {
		for k2 := it.a.RowPtr[i]; k2 < it.a.RowPtr[i+1]; k2++ {
			it.a.Val[k2] *= it.d[i] * it.d[it.a.Col[k2]]
		}
	}
	it.res.Factorized++
	it.factored = false
	if err := it.lin.Factorize(it.a); err != nil {
		if recoverable(err) {
			return err
		}
		return &linearError{err}
	}
	it.factored, it.factA = true, a
	return nil
}
