package network_test

import (
	"fmt"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/solve"
)

// gridModel is a plate discretised into side × side nodes, each with a
// heat capacity, joined to its neighbours, cooled at its edges and heated
// by a pulse train at its centre.
func gridModel(side int) string {
	var sb strings.Builder
	sb.WriteString("ambient: {temperature: 25 degC}\nnodes:\n")
	id := func(i, j int) string { return fmt.Sprintf("n%d_%d", i, j) }
	for i := 0; i < side; i++ {
		for j := 0; j < side; j++ {
			fmt.Fprintf(&sb, "  - {id: %s, capacity: 0.8 J/K", id(i, j))
			if i == side/2 && j == side/2 {
				sb.WriteString(", power: {pulse: {base: 2 W, peak: 40 W, start: 1 s, width: 20 s}, repeat: 50 s}")
			}
			sb.WriteString("}\n")
		}
	}
	sb.WriteString("links:\n")
	for i := 0; i < side; i++ {
		for j := 0; j < side; j++ {
			if i+1 < side {
				fmt.Fprintf(&sb, "  - {from: %s, to: %s, kind: lumped, conductance: 0.4 W/K}\n", id(i, j), id(i+1, j))
			}
			if j+1 < side {
				fmt.Fprintf(&sb, "  - {from: %s, to: %s, kind: lumped, conductance: 0.4 W/K}\n", id(i, j), id(i, j+1))
			}
			if i == 0 || j == 0 || i == side-1 || j == side-1 {
				fmt.Fprintf(&sb, "  - {from: %s, kind: convection, coefficient: 20 W/m2/K, area: 4 cm2}\n", id(i, j))
			}
		}
	}
	return sb.String()
}

// BenchmarkRunGrid runs grids of 400, 4,900 and 10,000 nodes through 1,000
// fixed steps, with the solver solve.Auto picks (the sparse family at these
// sizes: a direct or an iterative solver by the work it estimates) and, up
// to solve.DenseLimit (5,000) unknowns, with the dense LU. Modified Newton keeps one factorization for
// the whole run, so the time is that of one factorization and about 4,000
// solves.
//
//	go test -run x -bench RunGrid -benchtime 1x ./network/
func BenchmarkRunGrid(b *testing.B) {
	for _, side := range []int{20, 70, 100} {
		net := buildModel(b, gridModel(side))
		for _, lin := range []string{"auto", "dense"} {
			b.Run(fmt.Sprintf("nodes=%d/steps=1000/%s", side*side, lin), func(b *testing.B) {
				if lin == "dense" && net.Unknowns() > solve.DenseLimit {
					b.Skipf("%d unknowns: the dense LU takes at most %d", net.Unknowns(), solve.DenseLimit)
				}
				b.ReportAllocs()
				for b.Loop() {
					ls := solve.Auto(net.Unknowns())
					if lin == "dense" {
						ls = solve.NewDenseLU()
					}
					h, err := net.Run(network.RunOptions{End: 1000, FixedStep: 1, Interval: 100, ModifiedNewton: true, Linear: ls})
					if err != nil {
						b.Fatal(err)
					}
					if !h.Completed() {
						b.Fatal(h.Result.Reason, h.Result.Err)
					}
					if h.Result.Steps != 1000 {
						b.Fatalf("%d steps", h.Result.Steps)
					}
				}
			})
		}
	}
}
