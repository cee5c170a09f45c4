package network_test

import (
	"testing"

	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/solve"
)

// The assembled Jacobian of every example and reference network agrees
// with finite differences of the assembled residual, at the start and at
// the solution.
func TestJacobianOfEveryModel(t *testing.T) {
	for _, path := range solvedModels(t) {
		net, err := network.Load(path)
		if err != nil {
			t.Fatal(err)
		}
		p := net.Steady()
		// The start sits where natural convection has a kink in |ΔT|.
		start := p.OffKinks(p.InitialGuess())
		r := solve.Newton(p, p.InitialGuess(), solve.Settings{})
		if !r.Reason.Converged() {
			t.Fatalf("%s: %v", path, r.Reason)
		}
		for _, at := range []struct {
			name string
			x    []float64
		}{{"start", start}, {"solution", r.X}} {
			c, err := net.CheckJacobian(at.x, 5)
			if err != nil {
				t.Fatalf("%s at the %s: %v", path, at.name, err)
			}
			if c.MaxError > network.DefaultJacobianTolerance {
				t.Errorf("%s at the %s: worst %+v", path, at.name, c.Worst[0])
			}
		}
	}
}
