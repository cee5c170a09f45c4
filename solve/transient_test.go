package solve

import (
	"errors"
	"math"
	"testing"

	"github.com/heatgraph/heatgraph/sparse"
)

// linearRC is a linear thermal network for the tests: C·dT/dt = P(t) − K·T
// + G_a·T_a, with C diagonal (zero for a massless node) and K the
// conductance matrix (dense pattern).
type linearRC struct {
	c     []float64
	k     [][]float64 // conductance matrix: K_ii = Σ G, K_ij = −G_ij
	ga    []float64   // conductance of each node to the ambient
	ta    float64
	power func(t float64) []float64
	t     float64
	evals int
}

func (p *linearRC) Size() int         { return len(p.c) }
func (p *linearRC) Kinds() []Kind     { return []Kind{{Name: "temperature", Unit: "K", Scale: 1}} }
func (p *linearRC) KindOf(int) int    { return 0 }
func (p *linearRC) SetTime(t float64) { p.t = t }
func (p *linearRC) Pattern() *sparse.Matrix {
	n := p.Size()
	b := sparse.NewBuilder(n)
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			b.Mark(i, j)
		}
	}
	return b.Build()
}
func (p *linearRC) Evaluate(x, f []float64, jac *sparse.Matrix, mag []float64) error {
	p.evals++
	pw := p.power(p.t)
	if jac != nil {
		jac.Zero()
	}
	for i := range f {
		f[i] = pw[i] + p.ga[i]*p.ta
		for j := range x {
			f[i] -= p.k[i][j] * x[j]
			if jac != nil {
				jac.Add(i, j, -p.k[i][j])
			}
		}
	}
	return nil
}
func (p *linearRC) Stored(x, e []float64, m *sparse.Matrix) error {
	if m != nil {
		m.Zero()
	}
	for i := range e {
		e[i] = p.c[i] * x[i]
		if m != nil {
			m.Add(i, i, p.c[i])
		}
	}
	return nil
}

// oneNode is a node of capacity c and conductance g to an ambient at ta,
// heated by p watts from t = 0.
func oneNode(c, g, ta, pw float64) *linearRC {
	return &linearRC{c: []float64{c}, k: [][]float64{{g}}, ga: []float64{g}, ta: ta,
		power: func(float64) []float64 { return []float64{pw} }}
}

// rcExact is the lumped-capacitance response of one node heated from
// ambient: T = T_a + P/G·(1 − e^(−t·G/C)) (Incropera et al., Fundamentals of
// Heat and Mass Transfer, §5.3, the general lumped-capacitance analysis
// with a heat input, solved for a constant input).
func rcExact(c, g, ta, pw, t float64) float64 { return ta + pw/g*(1-math.Exp(-t*g/c)) }

func TestRCAgainstExponential(t *testing.T) {
	c, g, ta, pw := 40.0, 0.8, 300.0, 12.0 // τ = 50 s, rise 15 K
	p := oneNode(c, g, ta, pw)
	var outs []float64
	for k := 1; k <= 20; k++ {
		outs = append(outs, float64(k)*15)
	}
	worst := 0.0
	res := TRBDF2(p, []float64{ta}, TransientSettings{End: 300, Outputs: outs, RelTol: 1e-8, AbsTol: 1e-6,
		Output: func(tt float64, x []float64) error {
			worst = math.Max(worst, math.Abs(x[0]-rcExact(c, g, ta, pw, tt)))
			return nil
		}})
	if !res.Reason.Completed() {
		t.Fatalf("run ended: %v (%v)", res.Reason, res.Err)
	}
	// Local tolerance 1e-6 K plus 1e-8 of 300 K per step: the global error
	// stays within 0.2 mK.
	if worst > 2e-4 {
		t.Errorf("largest error against the exponential %.3g K, want below 2e-4 K", worst)
	}
	if res.T != 300 {
		t.Errorf("ended at %g s, want 300", res.T)
	}
	t.Logf("%d steps, %d rejected, %d Newton iterations, worst error %.2g K", res.Steps, res.Rejected, res.Newton, worst)
}

// TestTwoNodesAgainstEigenSolution checks two coupled capacities against
// the solution of the linear system dθ/dt = Aθ + b by its eigenvalues and
// eigenvectors, worked out by hand for the 2×2 case (any text on linear
// ODE systems, e.g. Boyce & DiPrima, Elementary Differential Equations,
// §7.5): θ = θ_ss + c₁v₁e^(λ₁t) + c₂v₂e^(λ₂t).
func TestTwoNodesAgainstEigenSolution(t *testing.T) {
	c1, c2 := 20.0, 150.0 // J/K: a part and its heat sink
	g12, g2 := 2.0, 0.5   // W/K: part to sink, sink to ambient
	ta, pw := 290.0, 10.0 // K, W into the part
	p := &linearRC{c: []float64{c1, c2}, k: [][]float64{{g12, -g12}, {-g12, g12 + g2}}, ga: []float64{0, g2}, ta: ta,
		power: func(float64) []float64 { return []float64{pw, 0} }}
	// A = [[−g12/c1, g12/c1], [g12/c2, −(g12+g2)/c2]]
	a11, a12, a21, a22 := -g12/c1, g12/c1, g12/c2, -(g12+g2)/c2
	tr, det := a11+a22, a11*a22-a12*a21
	disc := math.Sqrt(tr*tr - 4*det)
	l1, l2 := (tr+disc)/2, (tr-disc)/2
	// Eigenvectors (a12, λ − a11).
	v1 := [2]float64{a12, l1 - a11}
	v2 := [2]float64{a12, l2 - a11}
	// Steady rise: the sink is P/g2 above ambient, the part P/g12 above it.
	ss := [2]float64{pw/g2 + pw/g12, pw / g2}
	// θ(0) = 0: c₁v₁ + c₂v₂ = −θ_ss, by Cramer's rule.
	dd := v1[0]*v2[1] - v2[0]*v1[1]
	k1 := (-ss[0]*v2[1] + ss[1]*v2[0]) / dd
	k2 := (-v1[0]*ss[1] + v1[1]*ss[0]) / dd
	exact := func(tt float64) [2]float64 {
		e1, e2 := math.Exp(l1*tt), math.Exp(l2*tt)
		return [2]float64{ta + ss[0] + k1*v1[0]*e1 + k2*v2[0]*e2, ta + ss[1] + k1*v1[1]*e1 + k2*v2[1]*e2}
	}
	if e := exact(0); math.Abs(e[0]-ta) > 1e-9 || math.Abs(e[1]-ta) > 1e-9 {
		t.Fatalf("hand eigen-solution does not start at ambient: %v", e)
	}
	var outs []float64
	for k := 1; k <= 40; k++ {
		outs = append(outs, float64(k)*50)
	}
	worst := 0.0
	res := TRBDF2(p, []float64{ta, ta}, TransientSettings{End: 2000, Outputs: outs, RelTol: 1e-7, AbsTol: 1e-6,
		Output: func(tt float64, x []float64) error {
			e := exact(tt)
			worst = math.Max(worst, math.Max(math.Abs(x[0]-e[0]), math.Abs(x[1]-e[1])))
			return nil
		}})
	if !res.Reason.Completed() {
		t.Fatalf("run ended: %v (%v)", res.Reason, res.Err)
	}
	if worst > 1e-3 {
		t.Errorf("largest error against the eigen-solution %.3g K, want below 1e-3 K", worst)
	}
}

// TestSecondOrder halves a fixed step: a second-order method's error falls
// by 4 each time (the defining property of the order of a method; Bank et
// al. 1985 show TR-BDF2 is second order).
func TestSecondOrder(t *testing.T) {
	c, g, ta, pw := 40.0, 0.8, 300.0, 12.0
	at := 60.0
	var errs []float64
	for _, h := range []float64{6, 3, 1.5, 0.75} {
		p := oneNode(c, g, ta, pw)
		res := TRBDF2(p, []float64{ta}, TransientSettings{End: at, FixedStep: h, NewtonTol: 1e-9})
		if !res.Reason.Completed() {
			t.Fatalf("h = %g: %v (%v)", h, res.Reason, res.Err)
		}
		errs = append(errs, math.Abs(res.X[0]-rcExact(c, g, ta, pw, at)))
	}
	for k := 1; k < len(errs); k++ {
		ratio := errs[k-1] / errs[k]
		if ratio < 3.6 || ratio > 4.4 {
			t.Errorf("error ratio at halving %d: %.3f (errors %.3g, %.3g), want about 4", k, ratio, errs[k-1], errs[k])
		}
	}
	t.Logf("errors %.3g", errs)
}

// TestStageWeightsConserve checks that the stage weights of every step
// account for the change of the stored quantity exactly (to the Newton
// tolerance), including the algebraic row of a massless node.
func TestStageWeightsConserve(t *testing.T) {
	// part (10 J/K) – massless pad – sink (200 J/K) – ambient.
	p := &linearRC{c: []float64{10, 0, 200}, k: [][]float64{{3, -3, 0}, {-3, 5, -2}, {0, -2, 2.5}}, ga: []float64{0, 0, 0.5}, ta: 300,
		power: func(tt float64) []float64 { return []float64{20 * (1 + math.Sin(tt/30)), 0, 0} }}
	e0 := 10*300.0 + 200*300
	in, out := 0.0, 0.0
	f := make([]float64, 3)
	res := TRBDF2(p, []float64{300, 300, 300}, TransientSettings{End: 600, RelTol: 1e-6, AbsTol: 1e-6, NewtonTol: 1e-8,
		OnStep: func(s StepInfo) bool {
			for _, st := range s.Stages {
				p.SetTime(st.T)
				pw := p.power(st.T)
				in += st.W * pw[0]
				out += st.W * 0.5 * (st.X[2] - 300)
				_ = p.Evaluate(st.X, f, nil, nil)
				if math.Abs(f[1]) > 1e-6 {
					t.Fatalf("massless node out of balance by %g W at t = %g s", f[1], st.T)
				}
			}
			return true
		}})
	if !res.Reason.Completed() {
		t.Fatalf("run ended: %v (%v)", res.Reason, res.Err)
	}
	e1 := 10*res.X[0] + 200*res.X[2]
	if d := (in - out) - (e1 - e0); math.Abs(d) > 1e-6*in {
		t.Errorf("heat in %.6g J − out %.6g J = %.6g J, stored change %.6g J (difference %.3g J)", in, out, in-out, e1-e0, d)
	}
}

// TestMasslessNode: a node without capacity between a heated mass and the
// ambient behaves as the series conductance (the reduction of an algebraic
// node: 1/G = 1/G₁ + 1/G₂), so the heated node follows the one-node
// exponential with G = G₁G₂/(G₁+G₂).
func TestMasslessNode(t *testing.T) {
	g1, g2, c, ta, pw := 2.0, 3.0, 60.0, 295.0, 9.0
	p := &linearRC{c: []float64{c, 0}, k: [][]float64{{g1, -g1}, {-g1, g1 + g2}}, ga: []float64{0, g2}, ta: ta,
		power: func(float64) []float64 { return []float64{pw, 0} }}
	g := g1 * g2 / (g1 + g2)
	// The massless node starts off its balance (at ambient with the
	// heated node): the consistent start puts it there.
	worst := 0.0
	res := TRBDF2(p, []float64{ta, ta + 1}, TransientSettings{End: 200, Outputs: []float64{50, 100, 150}, RelTol: 1e-7, AbsTol: 1e-6,
		Output: func(tt float64, x []float64) error {
			worst = math.Max(worst, math.Abs(x[0]-rcExact(c, g, ta, pw, tt)))
			// The massless node sits on its balance.
			mid := (g1*x[0] + g2*ta) / (g1 + g2)
			worst = math.Max(worst, math.Abs(x[1]-mid))
			return nil
		}})
	if !res.Reason.Completed() {
		t.Fatalf("run ended: %v (%v)", res.Reason, res.Err)
	}
	if worst > 1e-3 {
		t.Errorf("largest error %.3g K, want below 1e-3 K", worst)
	}
}

// TestSinusoidalResponse: a node heated by P₀ + P₁·sin(ωt) settles to an
// oscillation of amplitude P₁/√(G² + (ωC)²) lagging the power by
// atan(ωC/G), the steady periodic solution of C·dθ/dt = P − Gθ (first-
// order system frequency response; e.g. Ogata, Modern Control
// Engineering, frequency response of a first-order lag).
func TestSinusoidalResponse(t *testing.T) {
	c, g, ta := 50.0, 1.0, 300.0
	p0, p1, period := 5.0, 4.0, 120.0
	w := 2 * math.Pi / period
	p := &linearRC{c: []float64{c}, k: [][]float64{{g}}, ga: []float64{g}, ta: ta,
		power: func(tt float64) []float64 { return []float64{p0 + p1*math.Sin(w*tt)} }}
	// 20 periods (τ = 50 s: the start has died away by e^(−48)), then one
	// period sampled every second and projected on sin and cos.
	start := 20 * period
	var outs []float64
	for k := 1; k <= int(period); k++ {
		outs = append(outs, start+float64(k))
	}
	var s, co float64
	res := TRBDF2(p, []float64{ta}, TransientSettings{End: start + period, Outputs: outs, RelTol: 1e-7, AbsTol: 1e-6,
		Output: func(tt float64, x []float64) error {
			if tt > start {
				s += (x[0] - ta - p0/g) * math.Sin(w*tt) * 2 / period
				co += (x[0] - ta - p0/g) * math.Cos(w*tt) * 2 / period
			}
			return nil
		}})
	if !res.Reason.Completed() {
		t.Fatalf("run ended: %v (%v)", res.Reason, res.Err)
	}
	amp := math.Hypot(s, co)
	lag := math.Atan2(-co, s)
	wantAmp := p1 / math.Hypot(g, w*c)
	wantLag := math.Atan(w * c / g)
	// The projection is a rectangle-rule sum of 120 samples: exact for a
	// pure sinusoid to round-off.
	if math.Abs(amp-wantAmp) > 1e-3*wantAmp {
		t.Errorf("amplitude %.6g K, want %.6g K", amp, wantAmp)
	}
	if math.Abs(lag-wantLag) > 1e-3 {
		t.Errorf("phase lag %.6g rad, want %.6g rad", lag, wantLag)
	}
}

// TestStiffPair: a thin pad (0.01 J/K) beside a heavy wall (2 kJ/K), joined
// by 50 W/K: time constants of 2e-4 s and about 4000 s. TR-BDF2 is
// L-stable (Bank et al. 1985), so steps ten million times the fast time
// constant neither oscillate nor blow up, and the adaptive run follows the
// slow mode in few steps.
func TestStiffPair(t *testing.T) {
	cp, cw, gpw, gw, ta, pw := 0.01, 2000.0, 50.0, 0.5, 300.0, 20.0
	mk := func() *linearRC {
		return &linearRC{c: []float64{cp, cw}, k: [][]float64{{gpw, -gpw}, {-gpw, gpw + gw}}, ga: []float64{0, gw}, ta: ta,
			power: func(float64) []float64 { return []float64{pw, 0} }}
	}
	// Fixed steps of 2000 s: the pad must stay on its quasi-steady value
	// T_wall + P/G (up to the wall's own error), never oscillate about it.
	prev := math.Inf(-1)
	res := TRBDF2(mk(), []float64{ta, ta}, TransientSettings{End: 40000, FixedStep: 2000,
		OnStep: func(s StepInfo) bool {
			x := s.Stages[2].X
			if d := x[0] - x[1] - pw/gpw; math.Abs(d) > 1e-3 {
				t.Errorf("t = %g s: pad − wall = %.6g K, want %.6g K (quasi-steady)", s.T+s.H, x[0]-x[1], pw/gpw)
			}
			if x[1] < prev {
				t.Errorf("t = %g s: the wall cooled while heated (oscillation)", s.T+s.H)
			}
			prev = x[1]
			return true
		}})
	if !res.Reason.Completed() {
		t.Fatalf("run ended: %v (%v)", res.Reason, res.Err)
	}
	// Adaptive: far fewer steps than the run over the fast time constant.
	res = TRBDF2(mk(), []float64{ta, ta}, TransientSettings{End: 40000})
	if !res.Reason.Completed() {
		t.Fatalf("adaptive run ended: %v (%v)", res.Reason, res.Err)
	}
	if res.Steps > 500 {
		t.Errorf("adaptive run took %d steps; an L-stable method should need a few hundred at most", res.Steps)
	}
	// The slow mode against the wall's exponential (the pad's capacity is
	// negligible): rise P/G_w·(1 − e^(−t·G_w/C_w)) approximately; the
	// exact two-node answer differs by the pad's share, under 1e-5.
	want := rcExact(cw+cp, 1/(1/gw), ta, pw, 40000)
	if math.Abs(res.X[1]-want) > 0.05 {
		t.Errorf("wall at %.4f K, want about %.4f K", res.X[1], want)
	}
	t.Logf("adaptive: %d steps, %d rejected", res.Steps, res.Rejected)
}

// stepPower is a source that switches on at 10 s and off at 10.5 s: a
// pulse shorter than the steps the error control would take.
type pulsed struct{ linearRC }

func (p *pulsed) Jumps(from, to float64) []float64 {
	var out []float64
	for _, j := range []float64{10, 10.5} {
		if j > from && j <= to {
			out = append(out, j)
		}
	}
	return out
}

// TestJumpsAreNotSkipped: with Jumper, a half-second pulse in a 1000 s run
// puts exactly its energy into the node: 50 W × 0.5 s = 25 J, which raises a
// 10 J/K node with negligible losses by about 2.5 K.
func TestJumpsAreNotSkipped(t *testing.T) {
	p := &pulsed{linearRC{c: []float64{10}, k: [][]float64{{1e-6}}, ga: []float64{1e-6}, ta: 300,
		power: func(tt float64) []float64 {
			if tt >= 10 && tt < 10.5 {
				return []float64{50}
			}
			return []float64{0}
		}}}
	res := TRBDF2(p, []float64{300}, TransientSettings{End: 1000})
	if !res.Reason.Completed() {
		t.Fatalf("run ended: %v (%v)", res.Reason, res.Err)
	}
	rise := res.X[0] - 300
	// Loss over the run: 1e-6 W/K × 2.5 K × 1000 s = 2.5e-3 J.
	if math.Abs(rise-2.5) > 1e-3 {
		t.Errorf("rise %.6g K, want 2.5 K", rise)
	}
}

// Modified Newton gives the same steps (to the Newton tolerance) with far
// fewer factorizations: on a linear network at fixed steps, one for the
// whole run.
func TestModifiedNewtonReusesFactorization(t *testing.T) {
	mk := func() *linearRC {
		return &linearRC{c: []float64{20, 150}, k: [][]float64{{2, -2}, {-2, 2.5}}, ga: []float64{0, 0.5}, ta: 290,
			power: func(tt float64) []float64 { return []float64{10 + 5*math.Sin(tt/40), 0} }}
	}
	full := TRBDF2(mk(), []float64{290, 290}, TransientSettings{End: 1000, FixedStep: 5, NewtonTol: 1e-10})
	mod := TRBDF2(mk(), []float64{290, 290}, TransientSettings{End: 1000, FixedStep: 5, NewtonTol: 1e-10, ModifiedNewton: true})
	if !full.Reason.Completed() || !mod.Reason.Completed() {
		t.Fatalf("runs ended: %v, %v", full.Reason, mod.Reason)
	}
	for i := range full.X {
		if d := math.Abs(full.X[i] - mod.X[i]); d > 1e-8 {
			t.Errorf("node %d: %.10g K with Newton, %.10g K with modified Newton", i, full.X[i], mod.X[i])
		}
	}
	// The consistent start factorizes with its own (tiny) step, the run
	// once more.
	if mod.Factorized > 2 {
		t.Errorf("modified Newton factorized %d times, want 2 (start and run)", mod.Factorized)
	}
	t.Logf("factorizations: %d with Newton, %d modified", full.Factorized, mod.Factorized)
	// Adaptive steps: the same accuracy against the eigen-solution test's
	// tolerance, with fewer factorizations.
	adapt := TRBDF2(mk(), []float64{290, 290}, TransientSettings{End: 1000, RelTol: 1e-7, AbsTol: 1e-6})
	adaptMod := TRBDF2(mk(), []float64{290, 290}, TransientSettings{End: 1000, RelTol: 1e-7, AbsTol: 1e-6, ModifiedNewton: true})
	for i := range adapt.X {
		if d := math.Abs(adapt.X[i] - adaptMod.X[i]); d > 1e-4 {
			t.Errorf("adaptive, node %d: %.8g K with Newton, %.8g K modified", i, adapt.X[i], adaptMod.X[i])
		}
	}
	if adaptMod.Factorized >= adapt.Factorized {
		t.Errorf("modified Newton factorized %d times, Newton %d", adaptMod.Factorized, adapt.Factorized)
	}
}

// The error estimate's weights are those of Hosea & Shampine (Analysis
// and implementation of TR-BDF2, Appl. Numer. Math. 20, 1996): the
// difference of their embedded third-order weights b̂ = ((1 − w)/3,
// w + 1/3, d/3) and TR-BDF2's b = (w, w, d), w = √2/4, d = γ/2; and the
// stage weights used for the energy over a step are b.
func TestHoseaShampineWeights(t *testing.T) {
	w, d := math.Sqrt2/4, gamma/2
	b := [3]float64{w, w, d}
	bh := [3]float64{(1 - w) / 3, w + 1.0/3, d / 3}
	ours := [3]float64{errConst / gamma, -errConst / (gamma * (1 - gamma)), errConst / (1 - gamma)}
	for i := range b {
		if math.Abs(ours[i]-(bh[i]-b[i])) > 1e-15 {
			t.Errorf("estimate weight %d: %.17g, want b̂ − b = %.17g", i, ours[i], bh[i]-b[i])
		}
	}
	if math.Abs(wTrap-w) > 1e-15 || math.Abs(wEnd-d) > 1e-15 {
		t.Errorf("stage weights (%g, %g, %g), want (w, w, d) = (%g, %g, %g)", wTrap, wTrap, wEnd, w, w, d)
	}
}

// Every way a run can end says why, with the time it reached.
func TestRunReasons(t *testing.T) {
	mk := func() *linearRC { return oneNode(40, 0.8, 300, 12) }
	if r := TRBDF2(mk(), []float64{300}, TransientSettings{End: 100, MaxSteps: 5}); r.Reason != StepLimit || r.Steps != 5 || !(r.T > 0 && r.T < 100) {
		t.Errorf("step limit: %v after %d steps at %g s", r.Reason, r.Steps, r.T)
	}
	n := 0
	if r := TRBDF2(mk(), []float64{300}, TransientSettings{End: 100, OnStep: func(StepInfo) bool { n++; return n < 3 }}); r.Reason != Interrupted || r.Steps != 3 {
		t.Errorf("interrupted: %v after %d steps", r.Reason, r.Steps)
	}
	if r := TRBDF2(mk(), []float64{300}, TransientSettings{Start: 10, End: 10}); r.Reason != InvalidState || r.Err == nil {
		t.Errorf("empty run: %v (%v)", r.Reason, r.Err)
	}
	// A tolerance no step can meet: the step shrinks below MinStep.
	if r := TRBDF2(mk(), []float64{300}, TransientSettings{End: 100, Tolerances: []Tolerance{{Abs: 1e-30}}, MinStep: 1e-3}); r.Reason != StepTooSmall || r.Err == nil {
		t.Errorf("impossible tolerance: %v (%v)", r.Reason, r.Err)
	}
	// Too large for the dense LU.
	big := &linearRC{c: make([]float64, DenseLimit+1), k: nil}
	if r := TRBDF2(&sizeOnly{big}, make([]float64, DenseLimit+1), TransientSettings{End: 1, Linear: NewDenseLU()}); r.Reason != LinearFailed || !errors.Is(r.Err, ErrTooLarge) {
		t.Errorf("too large: %v (%v)", r.Reason, r.Err)
	}
	for r := Completed; r <= Interrupted; r++ {
		if r.String() == "unknown run reason" {
			t.Errorf("reason %d has no description", r)
		}
	}
}

// sizeOnly is a problem with a diagonal pattern, for a size check.
type sizeOnly struct{ *linearRC }

func (p *sizeOnly) Pattern() *sparse.Matrix {
	n := p.Size()
	b := sparse.NewBuilder(n)
	for i := 0; i < n; i++ {
		b.Mark(i, i)
	}
	return b.Build()
}

// Looser tolerances per kind take fewer steps, and the error follows.
func TestToleranceByKind(t *testing.T) {
	c, g, ta, pw := 40.0, 0.8, 300.0, 12.0
	tight := TRBDF2(oneNode(c, g, ta, pw), []float64{ta}, TransientSettings{End: 200, Tolerances: []Tolerance{{Abs: 1e-6}}})
	loose := TRBDF2(oneNode(c, g, ta, pw), []float64{ta}, TransientSettings{End: 200, Tolerances: []Tolerance{{Abs: 1e-2}}})
	if !(loose.Steps < tight.Steps) {
		t.Errorf("steps: %d with 1e-2 K, %d with 1e-6 K", loose.Steps, tight.Steps)
	}
	et := math.Abs(tight.X[0] - rcExact(c, g, ta, pw, 200))
	el := math.Abs(loose.X[0] - rcExact(c, g, ta, pw, 200))
	if !(et < el) || el > 0.1 {
		t.Errorf("errors: %.3g K with 1e-6 K, %.3g K with 1e-2 K", et, el)
	}
}
