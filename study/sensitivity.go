package study

import (
	"fmt"
	"math"
	"runtime"
	"sort"
	"strings"
	"sync"

	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/units"
)

// Output is a temperature whose sensitivities are computed: every node
// with a limit, and every component's junction.
type Output struct {
	Node        string
	Kind        network.NodeKind
	Temperature float64 // K, at the solution
	Limit       float64 // K, when HasLimit
	HasLimit    bool
	Margin      float64 // Limit − Temperature, K
	unknown     int
}

// Skipped is a parameter whose sensitivities could not be computed, with
// the reason (a value that cannot be changed alone, such as one stream's
// flow into an air node that others leave).
type Skipped struct {
	Param  network.Parameter
	Reason string
}

// Sensitivities are the derivatives of the outputs' temperatures with
// respect to the model's parameters at the solution.
type Sensitivities struct {
	Point   *Point
	Outputs []Output
	Params  []network.Parameter
	Skipped []Skipped
	// D[k][j] is ∂T_k/∂p_j, in K per SI unit of parameter j.
	D [][]float64
	// Method is "adjoint" (one transpose solve per output) or "direct"
	// (one solve per parameter), whichever needs fewer solves.
	Method string
}

// RelativeStep is the step of the central differences of the residual,
// relative to the parameter's size (1 SI unit for a zero value): small
// enough that the truncation error, of order step², is negligible, large
// enough that round-off, of order 1e-16/step of the flows, is too.
const RelativeStep = 1e-5

// Sensitivity computes the sensitivities of the model's outputs to every
// parameter that the temperatures depend on, by the adjoint method.
//
// At the solution x* of F(x, p) = 0 (F: the net flow into each unknown's
// equation), the implicit function theorem gives
//
//	dT_k/dp = −e_kᵀ J⁻¹ ∂F/∂p = −λ_kᵀ ∂F/∂p,  with Jᵀ λ_k = e_k,
//
// J = ∂F/∂x the Jacobian the elements stamp exactly. ∂F/∂p is a central
// finite difference of the residual at the fixed state x*: the parameter
// is perturbed through an override, the model read and the network
// rebuilt, and the balances evaluated — no solve. Where one side of the
// difference is not a valid model (an emissivity of 1 cannot grow), the
// other side gives a one-sided difference. Given flows of one value that
// the model refuses to change alone (a stream and channels in series, whose
// air nodes must pass on what they receive) are changed together, as one
// value whose Also lists the others. One LU factorization of J
// serves every solve; with fewer outputs than parameters (the usual case)
// each output takes one transpose solve, else each parameter one solve.
func (m *Model) Sensitivity() (*Sensitivities, error) {
	pt, err := m.Solve()
	if err != nil {
		return nil, err
	}
	p := pt.Problem
	x := pt.Result.X
	s := &Sensitivities{Point: pt, Outputs: outputsOf(pt, x)}
	jac := p.Pattern()
	f0 := make([]float64, p.Size())
	if err := p.Evaluate(x, f0, jac, nil); err != nil {
		return nil, err
	}
	lu, err := factorize(jac)
	if err != nil {
		return nil, err
	}
	var params []network.Parameter
	for _, q := range m.Parameters() {
		if !q.Verdict {
			params = append(params, q)
		}
	}
	grads := make([][]float64, len(params))
	reasons := make([]string, len(params))
	parallel(len(params), func(j int) {
		grads[j], reasons[j] = m.residualSlope(pt, x, f0, params[j])
	})
	// Given flows of one value that cannot change alone (streams and
	// channels in series along one air path, which an air node must pass
	// on) change together, as one value.
	groups := map[[2]float64][]int{}
	var order [][2]float64
	for j, q := range params {
		if grads[j] == nil && (q.Kind == units.VolumeFlow || q.Kind == units.MassFlow) {
			key := [2]float64{float64(q.Kind), q.Value}
			if groups[key] == nil {
				order = append(order, key)
			}
			groups[key] = append(groups[key], j)
		}
	}
	for _, key := range order {
		g := groups[key]
		if len(g) < 2 {
			continue
		}
		joint := params[g[0]]
		for _, j := range g[1:] {
			joint.Also = append(append(joint.Also, params[j].Path), params[j].Also...)
		}
		grad, _ := m.residualSlope(pt, x, f0, joint)
		if grad == nil {
			continue
		}
		params[g[0]], grads[g[0]] = joint, grad
		for _, j := range g[1:] {
			reasons[j] = "changed together with " + joint.Path
		}
	}
	var cols [][]float64
	for j, q := range params {
		if grads[j] == nil {
			if strings.HasPrefix(reasons[j], "changed together with ") {
				continue
			}
			s.Skipped = append(s.Skipped, Skipped{q, reasons[j]})
			continue
		}
		s.Params = append(s.Params, q)
		cols = append(cols, grads[j])
	}
	s.D = make([][]float64, len(s.Outputs))
	for k := range s.D {
		s.D[k] = make([]float64, len(s.Params))
	}
	if len(s.Outputs) <= len(s.Params) {
		s.Method = "adjoint"
		e := make([]float64, p.Size())
		for k, o := range s.Outputs {
			clear(e)
			e[o.unknown] = 1
			lambda, err := lu.solve(e, true)
			if err != nil {
				return nil, err
			}
			for j, g := range cols {
				s.D[k][j] = -dot(lambda, g)
			}
		}
	} else {
		s.Method = "direct"
		for j, g := range cols {
			dx, err := lu.solve(g, false)
			if err != nil {
				return nil, err
			}
			for k, o := range s.Outputs {
				s.D[k][j] = -dx[o.unknown]
			}
		}
	}
	return s, nil
}

// residualSlope returns ∂F/∂p at x for parameter q, or nil and the reason.
func (m *Model) residualSlope(base *Point, x, f0 []float64, q network.Parameter) ([]float64, string) {
	h := RelativeStep * math.Abs(q.Value)
	if h == 0 {
		h = RelativeStep
	}
	fp, errP := m.residualAt(base, x, q.Overrides(q.Value+h))
	fm, errM := m.residualAt(base, x, q.Overrides(q.Value-h))
	g := make([]float64, len(x))
	switch {
	case errP == nil && errM == nil:
		for i := range g {
			g[i] = (fp[i] - fm[i]) / (2 * h)
		}
	case errP == nil:
		for i := range g {
			g[i] = (fp[i] - f0[i]) / h
		}
	case errM == nil:
		for i := range g {
			g[i] = (f0[i] - fm[i]) / h
		}
	default:
		return nil, firstLine(errP.Error())
	}
	return g, ""
}

// residualAt rebuilds the network with the overrides ovs and evaluates its
// balances at the unknowns x of base, whose layout it must share.
func (m *Model) residualAt(base *Point, x []float64, ovs []network.Override) ([]float64, error) {
	net, err := m.Build(ovs...)
	if err != nil {
		return nil, err
	}
	p := net.Steady()
	if p.Size() != base.Problem.Size() || len(net.Vars) != len(base.Net.Vars) {
		return nil, fmt.Errorf("changing the value changes the network's unknowns")
	}
	for u := 0; u < p.Size(); u++ {
		if p.Variable(u) != base.Problem.Variable(u) {
			return nil, fmt.Errorf("changing the value changes the network's unknowns")
		}
	}
	f := make([]float64, p.Size())
	if err := p.Evaluate(x, f, nil, nil); err != nil {
		return nil, err
	}
	return f, nil
}

// Effect is what one parameter does to one output.
type Effect struct {
	Param network.Parameter
	Slope float64 // ∂T/∂p, K per SI unit
	// Step is the change of the parameter the Change is for: 10 % of its
	// value, or 10 K for a temperature (10 % of an absolute temperature
	// means nothing to a designer).
	Step   float64
	Change float64 // Slope·Step, K: first order, the same with opposite sign for −Step
}

// EffectStep returns the change of a parameter that Effect.Change is for.
func EffectStep(q network.Parameter) float64 {
	if q.Kind == units.Temperature {
		return 10
	}
	return 0.1 * math.Abs(q.Value)
}

// Ranking returns the effects of every parameter on output k, the largest
// change first (ties in file order).
func (s *Sensitivities) Ranking(k int) []Effect {
	out := make([]Effect, len(s.Params))
	for j, q := range s.Params {
		step := EffectStep(q)
		out[j] = Effect{Param: q, Slope: s.D[k][j], Step: step, Change: s.D[k][j] * step}
	}
	sort.SliceStable(out, func(a, b int) bool { return math.Abs(out[a].Change) > math.Abs(out[b].Change) })
	return out
}

func dot(a, b []float64) float64 {
	var s float64
	for i := range a {
		s += a[i] * b[i]
	}
	return s
}

func firstLine(s string) string {
	for i, c := range s {
		if c == '\n' {
			return s[:i] + " …"
		}
	}
	return s
}

// parallel runs f(0) … f(n−1) on as many goroutines as there are cores.
func parallel(n int, f func(i int)) {
	workers := min(runtime.GOMAXPROCS(0), n)
	var wg sync.WaitGroup
	next := make(chan int)
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range next {
				f(i)
			}
		}()
	}
	for i := range n {
		next <- i
	}
	close(next)
	wg.Wait()
}
