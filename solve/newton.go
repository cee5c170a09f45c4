package solve

import (
	"errors"
	"fmt"
	"math"
	"runtime"
	"strings"

	"github.com/heatgraph/heatgraph/internal/bigmem"
	"github.com/heatgraph/heatgraph/sparse"
)

// Result is the outcome of a solve.
type Result struct {
	X          []float64  // the last state; a solution only if Reason is Converged
	Reason     StopReason // why the iteration stopped
	Iterations int        // Newton steps computed; the last one, when converged, only confirms it
	Residual   float64    // largest |F(X)|, in mixed units when kinds differ
	Scaled     float64    // largest |F_i(X)| relative to its equation's magnitude
	Worst      int        // the equation with the largest scaled residual, −1 if none
	WorstValue float64    // that equation's residual, in its unit
	Step       float64    // largest |Δx|/Scale of the last Newton step computed
	// Kinds reports the convergence of each kind of unknown at X.
	Kinds []KindResult
	// Pseudo counts the pseudo-transient steps taken.
	Pseudo int
	// LinearIterations counts the iterations of the linear solver over
	// the whole solve when it iterates (conjugate gradients, say); 0 when
	// every linear solve was direct.
	LinearIterations int
	// SingularAtSolution is set when the Jacobian is singular at X: some
	// unknown has no slope there (a node whose only link is natural
	// convection at zero temperature difference, say), so convergence
	// rests on the residual test of each equation alone.
	SingularAtSolution bool
	// Floating lists the unknowns that no non-zero Jacobian entry joins to
	// any given quantity when the Jacobian is singular: their values are
	// undetermined.
	Floating []int
	Err      error // the underlying error, for the reasons that have one
}

// KindResult is the state of the unknowns of one kind at the end of a
// solve.
type KindResult struct {
	Kind Kind
	// Unknowns is how many unknowns are of this kind.
	Unknowns int
	// Step is the largest |Δx| of the last Newton step, in the kind's unit,
	// at unknown StepAt (−1 when none).
	Step   float64
	StepAt int
	// Residual is the largest |F_i| of the kind's equations, in the
	// equation unit, at equation ResidualAt; Scaled the largest |F_i|
	// relative to the equation's magnitude, at ScaledAt.
	Residual   float64
	ResidualAt int
	Scaled     float64
	ScaledAt   int
	// Converged reports whether both tests hold for every unknown of the
	// kind.
	Converged bool
}

// Newton solves p's equations from the initial state x0 (which it does not
// modify) by Newton's method with a line search.
//
// Each iteration solves J·Δx = −F at the current state x. The iteration
// stops, converged, when at x both
//   - every equation's residual is within Settings.ResidualTolerance of
//     that equation's own magnitude (plus its kind's ResidualFloor), and
//   - every component of the full Newton step Δx is within
//     Settings.StepTolerance of its kind's Scale.
//
// Both are judged on the undamped Newton step computed at x, never on a
// step the line search shortened: a damped step is short because the line
// search made it so, not because x is close to the solution. Otherwise the
// step is limited to each kind's MaxStep and the line search (Settings.
// LineSearch) chooses how far to go along it, on the merit ½Σ(F_i/w_i)²,
// each equation weighted by its magnitude.
//
// Where the Jacobian is singular (natural convection has zero slope at zero
// temperature difference, which is where a thermal model starts), the
// iteration takes a pseudo-transient step instead (Kelley & Keyes 1998,
// Convergence analysis of pseudo-transient continuation, SIAM J. Numer.
// Anal. 35): it solves (J − S/Δτ)·Δx = −F, with S the problem's real
// capacities where it has them (Capacitive) and otherwise each equation's
// magnitude per unit Scale, and Δτ such that the fastest unknown moves by
// about Settings.PseudoStep of its Scale. Such a step is taken without a
// decrease of the merit; it only has to land inside the problem's domain.
//
// The linear systems are solved with symmetric diagonal scaling, J̃ = DJD
// with D_ii = 1/√|J_ii|, which keeps a symmetric Jacobian symmetric and
// makes networks whose conductances span many decades well conditioned.
// A linear solver that iterates (one with a SetTolerance(float64) method,
// as SparseAuto) solves each step only as accurately as the progress of
// the iteration calls for (inexact Newton with Eisenstat and Walker's
// forcing terms, from 1e-4 at the first step); a step taken where every
// residual is already within tolerance, the one whose length decides
// convergence, is solved to a relative residual of 1e-8.
func Newton(p Problem, x0 []float64, s Settings) (res Result) {
	s = s.withDefaults()
	n := p.Size()
	x := append(bigmem.MakeCap[float64](0, len(x0)), x0...)
	res = Result{X: x, Worst: -1}
	kinds := p.Kinds()
	kindOf := bigmem.Make[int](n)
	for i := range kindOf {
		kindOf[i] = p.KindOf(i)
	}
	if n == 0 {
		res.Reason = Converged
		return res
	}
	w := &work{
		p: p, s: s, kinds: kinds, kindOf: kindOf,
		f: bigmem.Make[float64](n), mag: bigmem.Make[float64](n),
		ft: bigmem.Make[float64](n), magt: bigmem.Make[float64](n),
		wt: bigmem.Make[float64](n), step: bigmem.Make[float64](n), rhs: bigmem.Make[float64](n),
		trial: bigmem.Make[float64](n), d: bigmem.Make[float64](n), xnow: x,
	}
	defer func() { res.LinearIterations = w.linear }()
	w.jac = p.Pattern()
	w.jact = samePattern(w.jac)
	w.shift = samePattern(w.jac)
	w.diag = bigmem.Make[int](n)
	for i := range w.diag {
		w.diag[i] = w.jac.Index(i, i)
	}
	if s.Linear == nil {
		s.Linear = Auto(n)
		w.s.Linear = s.Linear
	}
	if t, ok := s.Linear.(tolerant); ok {
		// The forcing terms are Newton's own business: the caller's
		// solver gets its tolerance back (a transient run goes on with
		// the same solver).
		prev := 0.0
		if g, ok := s.Linear.(interface{ Tolerance() float64 }); ok {
			prev = g.Tolerance()
		}
		defer t.SetTolerance(prev)
	}
	if err := p.Evaluate(x, w.f, w.jac, w.mag); err != nil {
		res.Reason, res.Err = InvalidStart, err
		return res
	}
	if !allFinite(w.f) {
		res.Reason = NotFinite
		return res
	}
	if err := s.Linear.Analyse(w.jac); err != nil {
		res.Reason, res.Err = classify(err)
		return res
	}
	cut := 0 // consecutive iterations whose longer trials left the domain
	for it := 1; it <= s.MaxIterations; it++ {
		res.Iterations = it
		w.weights()
		shifted, err := w.direction(x)
		if err != nil {
			res.Reason, res.Err = classify(err)
			if res.Reason == SingularJacobian {
				res.Floating = floating(w.jac)
				res.Err = w.nameFloating(res.Err, res.Floating)
			}
			return w.finish(res)
		}
		if !allFinite(w.step) {
			res.Reason = NotFinite
			return w.finish(res)
		}
		stepOK, resOK := w.tests()
		res.Step = w.scaledStepMax()
		if stepOK && resOK {
			res.Reason = Converged
			res.SingularAtSolution = shifted
			{
				// Take the last step too: it is within tolerance,
				// and Newton's method squares the error. Keep it
				// only if the residual stays within tolerance.
				for i := range w.trial {
					w.trial[i] = x[i] + w.step[i]
				}
				if err := p.Evaluate(w.trial, w.ft, w.jact, w.magt); err == nil && allFinite(w.ft) && w.withinTolerance(w.trial, w.ft, w.magt, w.jact) {
					copy(x, w.trial)
					w.f, w.ft = w.ft, w.f
					w.mag, w.magt = w.magt, w.mag
					w.jac, w.jact = w.jact, w.jac
				}
			}
			return w.finish(res)
		}
		if shifted {
			res.Pseudo++
			if s.MaxPseudoSteps > 0 && res.Pseudo > s.MaxPseudoSteps {
				res.Reason = SingularJacobian
				res.Floating = floating(w.jac)
				res.Err = w.nameFloating(fmt.Errorf("%w after %d pseudo-transient steps", ErrSingular, s.MaxPseudoSteps), res.Floating)
				return w.finish(res)
			}
		}
		w.limitStep()
		taken := w.scaledStepMax()
		phi0 := w.merit(w.f)
		tried := math.NaN()
		var domainErr error
		try := func(lambda float64) (float64, error) {
			tried = lambda
			for i := range w.trial {
				w.trial[i] = x[i] + lambda*w.step[i]
			}
			if err := p.Evaluate(w.trial, w.ft, w.jact, w.magt); err != nil {
				domainErr = err
				return 0, err
			}
			if !allFinite(w.ft) {
				return 0, errNotFinite
			}
			if shifted || w.withinTolerance(w.trial, w.ft, w.magt, w.jact) {
				// A pseudo-transient step need not decrease the
				// merit; near the solution round-off stops the merit
				// from falling, and a trial within tolerance will do.
				return -1, nil
			}
			// Both merits are weighed by each equation's magnitude at
			// x or at the trial, whichever is larger: where nothing
			// flowed at x (a mesh at the ambient temperature), the
			// flows the step starts are what its residuals are judged
			// against. As λ → 0 the weights tend to those at x, so the
			// Newton step stays a descent direction. The ratio is
			// returned relative to phi0, for the line search's test.
			trialPhi, basePhi := w.merits(w.ft, w.f, w.magt)
			if !(basePhi > 0) {
				return w.merit(w.ft), nil
			}
			return phi0 * trialPhi / basePhi, nil
		}
		lambda, ok, lastErr := s.LineSearch.Search(phi0, try)
		if !shifted && (!ok || lambda < pseudoBelow) {
			// The Newton direction is poor here: a slope near zero
			// (natural convection near zero temperature difference)
			// predicts a step far too long. A pseudo-transient step
			// moves at the pace the capacities allow instead.
			if err := w.pseudoStep(x); err == nil && allFinite(w.step) {
				w.limitStep()
				if _, err := try(1); err == nil {
					shifted, lambda, ok = true, 1, true
					taken = w.scaledStepMax()
					res.Pseudo++
				}
			}
		}
		if !ok {
			res.Reason = LineSearchFailed
			if lastErr != nil && !errors.Is(lastErr, errNotFinite) {
				res.Reason = LeftDomain
			}
			res.Err = lastErr
			return w.finish(res)
		}
		if tried != lambda {
			// A line search may look further than the step it accepts;
			// the accepted trial is evaluated again.
			if _, err := try(lambda); err != nil {
				res.Reason, res.Err = InvalidStart, err
				return w.finish(res)
			}
		}
		if domainErr != nil {
			// Steps that keep running into the edge of the domain mean
			// the balance has no physical solution there (a heat input
			// that takes more heat out of a node than the network can
			// bring to it would need a temperature below absolute zero).
			cut++
			if cut >= maxDomainCuts {
				res.Reason, res.Err = LeftDomain, domainErr
				return w.finish(res)
			}
		} else {
			cut = 0
		}
		if !shifted && lambda == 1 {
			w.dtau = 0
		}
		w.lastShifted = shifted
		copy(x, w.trial)
		w.f, w.ft = w.ft, w.f
		w.mag, w.magt = w.magt, w.mag
		w.jac, w.jact = w.jact, w.jac
		it := Iterate{Iteration: it, Residual: maxAbs(w.f), Step: lambda * taken, Lambda: lambda, Pseudo: shifted}
		it.Scaled, it.Worst = w.worstScaled()
		for _, m := range s.Monitors {
			m(it)
		}
		if s.Monitor != nil {
			s.Monitor(it)
		}
	}
	res.Reason = MaxIterations
	if w.lastShifted {
		// Still taking pseudo-transient steps at the end: the Jacobian
		// never became regular.
		res.Reason = SingularJacobian
		res.Floating = floating(w.jac)
		res.Err = w.nameFloating(fmt.Errorf("%w after %d iterations, %d of them pseudo-transient steps", ErrSingular, res.Iterations, res.Pseudo), res.Floating)
	}
	return w.finish(res)
}

var errNotFinite = errors.New("residual not finite")

// pseudoBelow is the shortest fraction of a Newton step worth taking: when
// the line search would go less far, a pseudo-transient step is taken
// instead.
const pseudoBelow = 1.0 / 16

// maxDomainCuts is how many iterations in a row may have their steps cut
// short by the edge of the domain before the solve gives up with
// LeftDomain.
const maxDomainCuts = 8

// work holds the iteration's vectors and matrices.
type work struct {
	p      Problem
	s      Settings
	kinds  []Kind
	kindOf []int

	f, mag    []float64 // at x
	ft, magt  []float64 // at the trial state
	wt        []float64 // merit weights
	step, rhs []float64
	trial     []float64
	xnow      []float64 // the current state (Newton's x)
	d         []float64 // diagonal scaling
	jac, jact *sparse.Matrix
	shift     *sparse.Matrix
	diag      []int // the diagonal's position in Val, −1 if absent
	// lastNorm is ‖D·F‖₂ of the last inexact Newton step's right side
	// and lastEta its forcing term (0 before the first).
	lastNorm, lastEta float64
	capacity          []float64
	dtau              float64 // the last pseudo time step; 0 until the first
	minShift          []float64
	// lastShifted is set when the last step taken was pseudo-transient.
	lastShifted bool
	linear      int // linear solver iterations so far
}

// iterationCounter is a linear solver that iterates and tells how many
// iterations its last solve took.
type iterationCounter interface {
	Stats() (iterations int, residual float64)
}

// solveLinear solves for the Newton step and counts the linear solver's
// iterations.
func (w *work) solveLinear() error {
	err := w.s.Linear.Solve(w.step, w.rhs)
	if c, ok := w.s.Linear.(iterationCounter); ok && err == nil {
		it, _ := c.Stats()
		w.linear += it
	}
	return err
}

// floor returns equation i's residual floor.
func (w *work) floor(i int) float64 { return w.kinds[w.kindOf[i]].ResidualFloor }

// weights sets the merit weights: each equation's magnitude, bounded below
// by a thousandth of the largest magnitude of its kind, so that equations
// with nothing flowing yet do not dominate the merit. (With a millionth,
// the cells of a meshed board far from any part, nearly idle at the start,
// made every full step look worse by their radiation's small overshoot:
// a board of 1e4 cells took 22 iterations of steps cut to a sixteenth,
// against 3 now; the examples' counts did not change.)
func (w *work) weights() {
	largest := make([]float64, len(w.kinds))
	for i, m := range w.mag {
		k := w.kindOf[i]
		largest[k] = math.Max(largest[k], m)
	}
	for i, m := range w.mag {
		k := w.kindOf[i]
		w.wt[i] = math.Max(math.Max(m, 1e-3*largest[k]), math.Max(w.kinds[k].ResidualFloor, math.SmallestNonzeroFloat64))
	}
}

// merit returns ½Σ(f_i/w_i)².
func (w *work) merit(f []float64) float64 {
	s := 0.0
	for i, v := range f {
		r := v / w.wt[i]
		s += r * r
	}
	return s / 2
}

// merits returns ½Σ(ft_i/v_i)² and ½Σ(f_i/v_i)², with v_i the larger of
// the merit weight and magt_i.
func (w *work) merits(ft, f, magt []float64) (float64, float64) {
	st, s := 0.0, 0.0
	for i, m := range magt {
		v := math.Max(w.wt[i], m)
		a, b := ft[i]/v, f[i]/v
		st += a * a
		s += b * b
	}
	return st / 2, s / 2
}

// withinTolerance reports whether every equation passes the residual test
// at the state x whose residual is f, magnitudes mag and Jacobian jac.
func (w *work) withinTolerance(x, f, mag []float64, jac *sparse.Matrix) bool {
	for i, v := range f {
		if math.Abs(v) > w.tolerance(i, x, mag, jac) {
			return false
		}
	}
	return true
}

// roundOff is the factor on the unit round-off of the terms of an equation
// that no residual can be asked to beat: a heat balance computed from
// absolute temperatures, G·(T_a − T_b) with T ≈ 300 K, carries rounding
// errors of about ε·G·T whatever the heat it moves.
const roundOff = 16 * 0x1p-52

// tolerance returns the largest residual accepted for equation i:
// ResidualTolerance of its magnitude, plus the round-off of its terms
// (roundOff·Σ_j |J_ij·x_j|), plus its kind's floor.
func (w *work) tolerance(i int, x, mag []float64, jac *sparse.Matrix) float64 {
	noise := 0.0
	for k := jac.RowPtr[i]; k < jac.RowPtr[i+1]; k++ {
		noise += math.Abs(jac.Val[k] * x[jac.Col[k]])
	}
	return w.s.ResidualTolerance*mag[i] + roundOff*noise + w.floor(i)
}

// tests applies the step and residual tests at the current state.
func (w *work) tests() (stepOK, resOK bool) {
	stepOK = true
	for i, v := range w.step {
		if math.Abs(v) > w.s.StepTolerance*w.kinds[w.kindOf[i]].Scale {
			stepOK = false
			break
		}
	}
	return stepOK, w.withinTolerance(w.xnow, w.f, w.mag, w.jac)
}

func (w *work) scaledStepMax() float64 {
	m := 0.0
	for i, v := range w.step {
		m = math.Max(m, math.Abs(v)/w.kinds[w.kindOf[i]].Scale)
	}
	return m
}

// limitStep scales the whole step down so that no unknown moves by more
// than its kind's MaxStep.
func (w *work) limitStep() {
	f := 1.0
	for i, v := range w.step {
		if ms := w.kinds[w.kindOf[i]].MaxStep; ms > 0 && math.Abs(v)*f > ms {
			f = ms / math.Abs(v)
		}
	}
	if f < 1 {
		scale(w.step, f)
	}
}

// worstScaled returns the largest |f_i| relative to its equation's
// magnitude and floor, and where it is.
func (w *work) worstScaled() (float64, int) {
	worst, at := 0.0, -1
	for i, v := range w.f {
		r := math.Abs(v) / math.Max(w.mag[i], math.Max(w.floor(i), math.SmallestNonzeroFloat64))
		if at < 0 || r > worst {
			worst, at = r, i
		}
	}
	return worst, at
}

// direction sets w.step to the Newton step at x, or to a pseudo-transient
// step when the Jacobian is singular; it reports which.
func (w *work) direction(x []float64) (bool, error) {
	n := len(w.f)
	// Symmetric diagonal scaling D = diag(1/√|J_ii|) (1 for a zero
	// diagonal): solve (DJD)y = −Df, Δx = Dy.
	for i := 0; i < n; i++ {
		k := w.diag[i]
		dii := 0.0
		if k >= 0 {
			dii = math.Abs(w.jac.Val[k])
		}
		if dii > 0 && !math.IsInf(dii, 0) {
			w.d[i] = 1 / math.Sqrt(dii)
		} else {
			w.d[i] = 1
		}
	}
	w.scaleInto(w.shift, w.jac)
	for i := range w.rhs {
		w.rhs[i] = -w.f[i] * w.d[i]
	}
	w.force(x)
	err := w.s.Linear.Factorize(w.shift)
	if err == nil {
		if err = w.solveLinear(); err != nil {
			return false, err
		}
		for i := range w.step {
			w.step[i] *= w.d[i]
		}
		return false, nil
	}
	if !singular(err) {
		return false, err
	}
	return true, w.pseudoStep(x)
}

// Forcing terms of inexact Newton (Eisenstat & Walker, Choosing the
// forcing terms in an inexact Newton method, SIAM J. Sci. Comput. 17,
// 1996, choice 2 with its safeguard): with a linear solver that iterates,
// step k is solved to the relative residual
// η_k = γ·(‖F_k‖/‖F_{k−1}‖)^α, kept within [etaFinal, etaMax], and never
// below γ·η_{k−1}^α while that is above etaSafe.
const (
	etaGamma = 0.9
	etaAlpha = 2
	// etaMax is the loosest tolerance of a step, and the first step's.
	// Looser first steps cost more than they save on meshed plates with
	// radiation: on a board of 1e6 cells a first tolerance of 0.01 led
	// to steps the line search cut to a sixteenth, 10 Newton iterations
	// and twice the time; 1e-4 converged in 4 (measured with heatgraph
	// bench).
	etaMax  = 1e-4
	etaSafe = 0.1
	// etaFinal is the tolerance of a step taken where every residual is
	// already within tolerance: the step test that decides convergence is
	// then judged on a step accurate to better than a percent even in a
	// scaled matrix of condition 1e6.
	etaFinal = 1e-8
)

// tolerant is a linear solver that iterates to a relative residual.
type tolerant interface {
	SetTolerance(rel float64)
}

// force sets the linear solver's tolerance for the step at x, whose
// right side is w.rhs, when the solver iterates.
func (w *work) force(x []float64) {
	t, ok := w.s.Linear.(tolerant)
	if !ok {
		return
	}
	norm := 0.0
	for _, v := range w.rhs {
		norm += v * v
	}
	norm = math.Sqrt(norm)
	eta := etaMax
	switch {
	case w.withinTolerance(x, w.f, w.mag, w.jac):
		// The step decides convergence: solve it accurately.
		eta = etaFinal
	case w.lastNorm > 0:
		eta = etaGamma * math.Pow(norm/w.lastNorm, etaAlpha)
		if safe := etaGamma * math.Pow(w.lastEta, etaAlpha); safe > etaSafe {
			eta = math.Max(eta, safe)
		}
		eta = math.Min(math.Max(eta, etaFinal), etaMax)
	}
	w.lastNorm, w.lastEta = norm, eta
	t.SetTolerance(eta)
}

// samePattern returns a matrix that shares m's pattern, values zero.
func samePattern(m *sparse.Matrix) *sparse.Matrix {
	return &sparse.Matrix{N: m.N, RowPtr: m.RowPtr, Col: m.Col, Val: bigmem.Make[float64](len(m.Val))}
}

// scaleInto sets dst = D·src·D, on two halves of the rows at once for a
// large matrix (each entry is computed alone, so the result is the same).
func (w *work) scaleInto(dst, src *sparse.Matrix) {
	rows := func(lo, hi int) {
		for i := lo; i < hi; i++ {
			di := w.d[i]
			for k := src.RowPtr[i]; k < src.RowPtr[i+1]; k++ {
				dst.Val[k] = src.Val[k] * di * w.d[src.Col[k]]
			}
		}
	}
	n := src.N
	if n < 1<<14 || runtime.GOMAXPROCS(0) < 2 {
		rows(0, n)
		return
	}
	done := make(chan struct{})
	go func() {
		rows(n/2, n)
		close(done)
	}()
	rows(0, n/2)
	<-done
}

// pseudoStep solves (J − S/Δτ)·Δx = −F; see Newton.
func (w *work) pseudoStep(x []float64) error {
	n := len(w.f)
	if w.capacity == nil {
		w.capacity = bigmem.Make[float64](n)
	}
	clear(w.capacity)
	if c, ok := w.p.(Capacitive); ok {
		c.Capacity(x, w.capacity)
	}
	// S_i: the real capacity, or the equation's magnitude per unit
	// Scale; Δτ so that the fastest unknown moves by PseudoStep·Scale.
	rate := 0.0
	for i := range w.capacity {
		sc := w.kinds[w.kindOf[i]].Scale
		if !(w.capacity[i] > 0) {
			w.capacity[i] = w.wt[i] / sc
		}
		rate = math.Max(rate, math.Abs(w.f[i])/(w.capacity[i]*sc))
	}
	if !(rate > 0) {
		rate = 1
	}
	// The first pseudo-step moves the fastest unknown by PseudoStep of its
	// scale; each further one in a row doubles Δτ, so that the steps turn
	// into Newton steps as the iteration settles (a geometric form of
	// switched evolution relaxation, Kelley & Keyes 1998, §2).
	dtau := w.s.PseudoStep / rate
	if w.dtau > 0 {
		dtau = math.Max(dtau, 2*w.dtau)
	}
	// However small the residual, each row's shift stays above 1e-10 of
	// the row's largest entry, so that the shifted matrix is regular.
	if len(w.minShift) != n {
		w.minShift = bigmem.Make[float64](n)
	}
	for i := 0; i < n; i++ {
		big := 0.0
		for k := w.jac.RowPtr[i]; k < w.jac.RowPtr[i+1]; k++ {
			big = math.Max(big, math.Abs(w.jac.Val[k]))
		}
		w.minShift[i] = 1e-10 * big
	}
	var err error
	defer func() { w.dtau = dtau }()
	for try := 0; try < 8; try, dtau = try+1, dtau/10 {
		for i := 0; i < n; i++ {
			for k := w.jac.RowPtr[i]; k < w.jac.RowPtr[i+1]; k++ {
				w.shift.Val[k] = w.jac.Val[k]
			}
			k := w.diag[i]
			mu := math.Max(w.capacity[i]/dtau, w.minShift[i])
			// The dissipative sign: the shift strengthens the diagonal.
			if w.shift.Val[k] > 0 {
				w.shift.Val[k] += mu
			} else {
				w.shift.Val[k] -= mu
			}
		}
		// Scale by the shifted diagonal.
		for i := 0; i < n; i++ {
			w.d[i] = 1 / math.Sqrt(math.Abs(w.shift.Val[w.diag[i]]))
		}
		w.scaleInto(w.shift, w.shift)
		for i := range w.rhs {
			w.rhs[i] = -w.f[i] * w.d[i]
		}
		if err = w.s.Linear.Factorize(w.shift); err == nil {
			if err = w.solveLinear(); err != nil {
				return err
			}
			for i := range w.step {
				w.step[i] *= w.d[i]
			}
			return nil
		}
		if !singular(err) {
			return err
		}
	}
	return err
}

// finish records the residual and the state of each kind at the last
// accepted state.
func (w *work) finish(r Result) Result {
	r.Residual = maxAbs(w.f)
	r.Scaled, r.Worst = w.worstScaled()
	if r.Worst >= 0 {
		r.WorstValue = w.f[r.Worst]
	}
	r.Kinds = make([]KindResult, len(w.kinds))
	for k := range w.kinds {
		r.Kinds[k] = KindResult{Kind: w.kinds[k], StepAt: -1, ResidualAt: -1, ScaledAt: -1, Converged: true}
	}
	for i, v := range w.f {
		kr := &r.Kinds[w.kindOf[i]]
		kr.Unknowns++
		if a := math.Abs(w.step[i]); kr.StepAt < 0 || a > kr.Step {
			kr.Step, kr.StepAt = a, i
		}
		if a := math.Abs(v); kr.ResidualAt < 0 || a > kr.Residual {
			kr.Residual, kr.ResidualAt = a, i
		}
		sc := math.Abs(v) / math.Max(w.mag[i], math.Max(w.floor(i), math.SmallestNonzeroFloat64))
		if kr.ScaledAt < 0 || sc > kr.Scaled {
			kr.Scaled, kr.ScaledAt = sc, i
		}
		if math.Abs(v) > w.tolerance(i, w.xnow, w.mag, w.jac) ||
			math.Abs(w.step[i]) > w.s.StepTolerance*w.kinds[w.kindOf[i]].Scale {
			kr.Converged = false
		}
	}
	return r
}

// nameFloating adds the names of floating unknowns to err.
func (w *work) nameFloating(err error, fl []int) error {
	if len(fl) == 0 {
		return err
	}
	names := make([]string, 0, len(fl))
	for k, i := range fl {
		if k == 12 {
			names = append(names, fmt.Sprintf("and %d more", len(fl)-12))
			break
		}
		if nm, ok := w.p.(Namer); ok {
			names = append(names, nm.Name(i))
		} else {
			names = append(names, fmt.Sprintf("unknown %d", i))
		}
	}
	return fmt.Errorf("%w; undetermined: %s", err, strings.Join(names, ", "))
}

// floating returns the unknowns that no chain of non-zero Jacobian entries
// joins to an equation that depends on something given: an equation whose
// row does not sum to zero (for a heat balance, a node with a conductance
// to a fixed temperature). Their values are undetermined by the equations.
func floating(j *sparse.Matrix) []int {
	n := j.N
	anchored := make([]bool, n)
	var queue []int
	for i := 0; i < n; i++ {
		sum, big := 0.0, 0.0
		for k := j.RowPtr[i]; k < j.RowPtr[i+1]; k++ {
			sum += j.Val[k]
			big = math.Max(big, math.Abs(j.Val[k]))
		}
		if big > 0 && math.Abs(sum) > 1e-12*big {
			anchored[i] = true
			queue = append(queue, i)
		}
	}
	// Entries join both ways: the transpose's rows are needed too.
	adj := make([][]int, n)
	for i := 0; i < n; i++ {
		for k := j.RowPtr[i]; k < j.RowPtr[i+1]; k++ {
			if c := j.Col[k]; c != i && j.Val[k] != 0 {
				adj[i] = append(adj[i], c)
				adj[c] = append(adj[c], i)
			}
		}
	}
	for len(queue) > 0 {
		i := queue[len(queue)-1]
		queue = queue[:len(queue)-1]
		for _, c := range adj[i] {
			if !anchored[c] {
				anchored[c] = true
				queue = append(queue, c)
			}
		}
	}
	var out []int
	for i, a := range anchored {
		if !a {
			out = append(out, i)
		}
	}
	return out
}

// singular reports whether a linear solver's error means the matrix could
// not be solved as it is: singular, or an iterative solver that could not
// reach its tolerance (a shifted matrix is better conditioned).
func singular(err error) bool {
	return errors.Is(err, ErrSingular) || errors.Is(err, sparse.ErrNotConverged)
}

func classify(err error) (StopReason, error) {
	if singular(err) {
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
