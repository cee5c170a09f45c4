package viz

import (
	"context"
	"fmt"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/solve"
)

// chainModel returns a model of n solid nodes in a chain, each joined to
// the next by conduction and to ambient by two links (convection and
// radiation), with the heat put in at one end: the shape of a long
// board or rail losing heat along its length, and the case that made
// diagram layout slow (many parallel links to one ambient node).
func chainModel(n int) string {
	var b strings.Builder
	b.WriteString("title: chain\nambient: {temperature: 25 degC}\nnodes:\n")
	for i := range n {
		fmt.Fprintf(&b, "  - {id: n%d", i)
		if i == 0 {
			b.WriteString(", power: 20 W, limit: 105 degC")
		}
		b.WriteString("}\n")
	}
	b.WriteString("links:\n")
	for i := range n {
		if i+1 < n {
			fmt.Fprintf(&b, "  - {kind: lumped, from: n%d, to: n%d, resistance: 2 K/W}\n", i, i+1)
		}
		fmt.Fprintf(&b, "  - {id: c%d, kind: convection, from: n%d, coefficient: 8 W/m2/K, area: 20 cm2}\n", i, i)
		fmt.Fprintf(&b, "  - {id: r%d, kind: radiation, from: n%d, emissivity: 0.9, area: 20 cm2}\n", i, i)
	}
	return b.String()
}

func solveChain(b testing.TB, n int) *network.Solution {
	m, err := network.Parse("chain.yaml", []byte(chainModel(n)))
	if err != nil {
		b.Fatal(err)
	}
	net, err := network.Build(m)
	if err != nil {
		b.Fatal(err)
	}
	p := net.Steady()
	r := solve.Newton(p, p.InitialGuess(), solve.Settings{})
	if !r.Reason.Converged() {
		b.Fatalf("chain of %d: %s", n, r.Reason)
	}
	return net.Solution(r.X)
}

// BenchmarkDiagram builds and lays out the diagram of chains of 60, 100 and
// 200 nodes as SVG.
func BenchmarkDiagram(b *testing.B) {
	for _, n := range []int{60, 100, 200} {
		b.Run(fmt.Sprintf("chain-%d", n), func(b *testing.B) {
			sol := solveChain(b, n)
			if _, err := Render(context.Background(), "digraph warm { a -> b }", FormatSVG); err != nil {
				b.Fatal(err) // start the engine outside the timing
			}
			b.ResetTimer()
			for b.Loop() {
				dot, err := DOT(sol, ColourMargin)
				if err != nil {
					b.Fatal(err)
				}
				if _, err := Render(context.Background(), dot, FormatSVG); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
