package network

import (
	"math"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/solve"
	"github.com/heatgraph/heatgraph/units"
)

// This test follows the walkthrough in DEVELOPERS.md ("Adding a link
// kind"): a kind is one element (Rows, Vars, Eval), one parameter type
// with its element builder, one parse function and one registration, all
// of which could live in one new file. Nothing else in heatgraph changes.

// varying is a conductance that grows linearly with the mean temperature
// of its ends, G = G₀·(1 + α·(T_m − T₀)), as the conductivity of a
// metal does over a modest range (Incropera et al., §2.2).
type varying struct {
	a, b          int
	g0, alpha, t0 float64
	wrong         bool // stamp a wrong derivative, to show the check fails
}

func (v *varying) Rows() []int { return []int{v.a, v.b} }
func (v *varying) Vars() []int { return []int{v.a, v.b} }
func (v *varying) Eval(s *elements.State, l *elements.Local) {
	ta, tb := s.X[v.a], s.X[v.b]
	tm := (ta + tb) / 2
	g := v.g0 * (1 + v.alpha*(tm-v.t0))
	q := g * (ta - tb)
	dg := v.g0 * v.alpha / 2 // ∂G/∂T_a = ∂G/∂T_b
	if v.wrong {
		dg = 0
	}
	l.Add(0, -q)
	l.Add(1, q)
	l.D(0, 0, -(g + dg*(ta-tb)))
	l.D(0, 1, -(-g + dg*(ta-tb)))
	l.D(1, 0, g+dg*(ta-tb))
	l.D(1, 1, -g+dg*(ta-tb))
}

type varyingParams struct {
	g0, alpha, t0 float64
	wrong         bool
}

func (p *varyingParams) element(e linkEnv) (elements.Element, error) {
	return &varying{a: e.from, b: e.to, g0: p.g0, alpha: p.alpha, t0: p.t0, wrong: p.wrong}, nil
}

func registerVarying(t *testing.T, name string, wrong bool) {
	t.Helper()
	registerLinkKind(linkKind{
		name: name, order: 1000,
		summary: "a conductance that grows linearly with the mean temperature",
		help:    "G = G₀·(1 + α·(T_m − T₀)), T_m the mean of the two ends.",
		sources: []string{"Incropera et al., §2.2 (temperature dependence of conductivity)"},
		example: "{kind: " + name + ", from: a, to: b, conductance: 2 W/K, coefficient: 0.004, reference: 20 degC}",
		keys: []keySpec{
			{name: "conductance", dim: units.Conductance, need: "required", help: "G₀ at the reference temperature"},
			{name: "coefficient", dim: units.Dimensionless, need: "required", help: "α, per kelvin"},
			{name: "reference", dim: units.Temperature, need: "required", help: "T₀"},
		},
		parse: func(o *object, _ *Model) LinkParams {
			g, ok1 := o.positive("conductance", units.Conductance, true)
			a, ok2 := o.required("coefficient", units.Dimensionless)
			t0, ok3 := o.required("reference", units.Temperature)
			if !ok1 || !ok2 || !ok3 {
				return nil
			}
			return &varyingParams{g0: g, alpha: a, t0: t0, wrong: wrong}
		},
		ends: solidRules,
	})
	t.Cleanup(func() {
		for i, k := range registry {
			if k.name == name {
				registry = append(registry[:i], registry[i+1:]...)
				return
			}
		}
	})
}

func TestNewLinkKindInOneFile(t *testing.T) {
	registerVarying(t, "warming-bar", false)
	net := buildBar(t, `
ambient: {temperature: 20 degC}
nodes:
  - {id: hot, power: 10 W}
links:
  - {kind: warming-bar, from: hot, to: ambient, conductance: 0.5 W/K, coefficient: 0.004, reference: 20 degC}
`)
	p := net.Steady()
	r := solve.Newton(p, p.InitialGuess(), solve.Settings{})
	if !r.Reason.Converged() {
		t.Fatal(r.Reason)
	}
	// 10 = 0.5·(1 + 0.004·θ/2)·θ with θ the rise over 20 °C:
	// 0.001·θ² + 0.5·θ − 10 = 0, θ = (−0.5 + √(0.25 + 0.04))/0.002 (by hand).
	theta := (-0.5 + math.Sqrt(0.25+0.04)) / 0.002
	if got := r.X[0] - 293.15; math.Abs(got-theta) > 1e-9 {
		t.Errorf("rise %.12g K, want %.12g K", got, theta)
	}
	c, err := net.CheckJacobian(p.OffKinks(p.InitialGuess()), 3)
	if err != nil || c.MaxError > DefaultJacobianTolerance {
		t.Errorf("Jacobian check: %v, %+v", err, c)
	}
	doc, ok := LinkKind("warming-bar")
	if !ok || len(doc.Keys) != 3 || !strings.Contains(doc.Sources[0], "Incropera") {
		t.Errorf("kind not described: %+v", doc)
	}
	// Misspelt keys of the new kind are caught like any other's.
	_, err = Parse("bar.yaml", []byte(`
ambient: {temperature: 20 degC}
nodes:
  - {id: hot, power: 10 W}
links:
  - {kind: warming-bar, from: hot, to: ambient, conductance: 0.5 W/K, coeficient: 0.004, reference: 20 degC}
`))
	if err == nil || !strings.Contains(err.Error(), `did you mean "coefficient"`) {
		t.Errorf("misspelt key: %v", err)
	}
}

// The whole-problem Jacobian check catches a kind whose derivative is
// wrong.
func TestJacobianCheckCatchesWrongDerivative(t *testing.T) {
	registerVarying(t, "wrong-bar", true)
	net := buildBar(t, `
ambient: {temperature: 20 degC}
nodes:
  - {id: hot, power: 10 W}
links:
  - {kind: wrong-bar, from: hot, to: ambient, conductance: 0.5 W/K, coefficient: 0.004, reference: 20 degC}
`)
	c, err := net.CheckJacobian([]float64{313.15}, 3)
	if err != nil {
		t.Fatal(err)
	}
	if c.MaxError < 1e-3 || len(c.Worst) == 0 || !strings.Contains(c.Worst[0].Elements[0], "wrong-bar") {
		t.Errorf("wrong derivative not caught: %+v", c)
	}
}

// In a problem too large to difference every column (a meshed plate of
// 2,500 cells), the sampled columns and the random directions still catch
// a wrong derivative, here of a link beside the plate, and the plate's own
// entries pass.
func TestJacobianCheckCatchesWrongDerivativeBesidePlate(t *testing.T) {
	registerVarying(t, "wrong-bar-2", true)
	net := buildBar(t, `
ambient: {temperature: 20 degC}
nodes:
  - {id: hot, power: 10 W}
plates:
  - id: lid
    size: [50 mm, 50 mm]
    cell: 1 mm
    material: aluminium
    thickness: 2 mm
    faces:
      - {face: bottom, region: [20 mm, 20 mm, 30 mm, 30 mm], to: hot, contact: 100 K*cm2/W}
      - {face: top, to: ambient, h: 10 W/(m2 K), emissivity: 0.8}
links:
  - {kind: wrong-bar-2, from: hot, to: ambient, conductance: 0.5 W/K, coefficient: 0.004, reference: 20 degC}
`)
	p := net.Steady()
	if p.Size() <= FullCheckUnknowns {
		t.Fatalf("%d unknowns: the test needs more than %d", p.Size(), FullCheckUnknowns)
	}
	x := p.OffKinks(p.InitialGuess())
	x[0] = 313.15 // "hot", 20 K above the reference, where the error shows
	c, err := net.CheckJacobian(x, 3)
	if err != nil {
		t.Fatal(err)
	}
	if c.MaxError < 1e-3 || len(c.Worst) == 0 || !strings.Contains(strings.Join(c.Worst[0].Elements, " "), "wrong-bar-2") {
		t.Errorf("wrong derivative not caught: %+v", c)
	}
	for _, e := range c.Worst {
		if strings.Contains(e.Equation, "cell") && e.Error > DefaultJacobianTolerance {
			t.Errorf("a plate entry fails: %+v", e)
		}
	}
}

// buildBar reads and builds a model text, failing the test on any problem.
func buildBar(t *testing.T, text string) *Network {
	t.Helper()
	m, err := Parse("bar.yaml", []byte(text))
	if err != nil {
		t.Fatal(err)
	}
	net, err := Build(m)
	if err != nil {
		t.Fatal(err)
	}
	return net
}
