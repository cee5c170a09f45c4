package network_test

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/solve"
	"github.com/heatgraph/heatgraph/sparse"
)

// plateGrid is an n×n grid of 10 mm cells of a 2 mm aluminium plate, each
// cell radiating and convecting (natural convection, facing up) to the
// ambient, a 5 W source at one corner and an air stream under one row:
// conduction, radiation, a correlation and upwind air, large enough for the
// sparse solvers.
func plateGrid(n int) string {
	var s strings.Builder
	s.WriteString("ambient: {temperature: 25 degC}\nnodes:\n")
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			power := ""
			if i == 0 && j == 0 {
				power = ", power: 5 W"
			}
			fmt.Fprintf(&s, "  - {id: c%d_%d%s}\n", i, j, power)
		}
	}
	for j := 0; j < n; j++ {
		fmt.Fprintf(&s, "  - {id: a%d, kind: air}\n", j)
	}
	s.WriteString("links:\n")
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			if i+1 < n {
				fmt.Fprintf(&s, "  - {kind: conduction, from: c%d_%d, to: c%d_%d, material: aluminium, area: 20 mm2, length: 10 mm}\n", i, j, i+1, j)
			}
			if j+1 < n {
				fmt.Fprintf(&s, "  - {kind: conduction, from: c%d_%d, to: c%d_%d, material: aluminium, area: 20 mm2, length: 10 mm}\n", i, j, i, j+1)
			}
			fmt.Fprintf(&s, "  - {kind: radiation, from: c%d_%d, emissivity: 0.8, area: 1 cm2}\n", i, j)
			fmt.Fprintf(&s, "  - {kind: natural, from: c%d_%d, orientation: facing-up, length: 10 mm, width: 10 mm}\n", i, j)
		}
	}
	for j := 0; j < n; j++ {
		up := "ambient"
		if j > 0 {
			up = fmt.Sprintf("a%d", j-1)
		}
		fmt.Fprintf(&s, "  - {kind: stream, from: %s, to: a%d, flow: 0.5 CFM}\n", up, j)
		fmt.Fprintf(&s, "  - {kind: convection, from: c%d_%d, to: a%d, coefficient: 10 W/m2/K, area: 1 cm2}\n", n-1, j, j)
	}
	fmt.Fprintf(&s, "  - {kind: stream, from: a%d, to: ambient, flow: 0.5 CFM}\n", n-1)
	return s.String()
}

// Every linear solver gives the same answer, on every example and on a
// plate of a few hundred cells with radiation, natural convection and an
// unsymmetric air stream.
func TestLinearSolversAgree(t *testing.T) {
	models := map[string]string{"plate": plateGrid(18)}
	for _, path := range solvedModels(t) {
		models[path] = readFile(t, path)
	}
	for name, text := range models {
		m, err := network.Parse(name, []byte(text))
		if err != nil {
			t.Fatal(err)
		}
		net, err := network.Build(m)
		if err != nil {
			t.Fatal(err)
		}
		var ref []float64
		// The dense LU is the reference up to its size limit; beyond it
		// (a meshed plate), the sparse LU with pivoting.
		var first solve.LinearSolver = solve.NewDenseLU()
		if net.Unknowns() > solve.DenseLimit {
			first = sparse.NewLU()
		}
		for _, lin := range []solve.LinearSolver{first, &solve.SparseAuto{}} {
			p := net.Steady()
			r := solve.Newton(p, p.InitialGuess(), solve.Settings{Linear: lin})
			if !r.Reason.Converged() {
				t.Fatalf("%s with %T: %v (%v)", name, lin, r.Reason, r.Err)
			}
			if ref == nil {
				ref = r.X
				continue
			}
			for i := range ref {
				if math.Abs(r.X[i]-ref[i]) > 1e-9*math.Abs(ref[i])+1e-10*network.VarKinds()[p.KindOf(i)].Scale {
					t.Errorf("%s: unknown %d: %T gives %.12g, dense %.12g", name, i, lin, r.X[i], ref[i])
				}
			}
		}
	}
}
