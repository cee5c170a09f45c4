package network_test

import (
	"fmt"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/solve"
)

// Benchmarks: go test -bench . ./network/

func buildModel(b *testing.B, text string) *network.Network {
	b.Helper()
	m, err := network.Parse("bench.yaml", []byte(text))
	if err != nil {
		b.Fatal(err)
	}
	net, err := network.Build(m)
	if err != nil {
		b.Fatal(err)
	}
	return net
}

// A linear network: the discretised fin of the analytic tests.
func BenchmarkSolveFin(b *testing.B) {
	for _, m := range []int{100, 400} {
		net := buildModel(b, finModel(m))
		b.Run(fmt.Sprintf("nodes=%d", m), func(b *testing.B) {
			for b.Loop() {
				p := net.Steady()
				if r := solve.Newton(p, p.InitialGuess(), solve.Settings{}); !r.Reason.Converged() {
					b.Fatal(r.Reason)
				}
			}
		})
	}
}

// chainOfSinks is a duct with n heat sinks in series, each a channel with
// correlations and fin efficiency: the costliest elements to stamp.
func chainOfSinks(n int) string {
	var s strings.Builder
	s.WriteString("ambient: {temperature: 30 degC}\nnodes:\n")
	for i := 0; i < n; i++ {
		fmt.Fprintf(&s, "  - {id: sink%d, power: 5 W}\n  - {id: air%d, kind: air}\n", i, i)
	}
	s.WriteString("links:\n")
	for i := 0; i < n; i++ {
		inlet := "ambient"
		if i > 0 {
			inlet = fmt.Sprintf("air%d", i-1)
		}
		fmt.Fprintf(&s, "  - {kind: channel, from: sink%d, inlet: %s, to: air%d, flow: 40 CFM, fin_count: 20, fin_thickness: 1 mm, fin_height: 25 mm, base_width: 80 mm, length: 40 mm, material: aluminium}\n", i, inlet, i)
	}
	fmt.Fprintf(&s, "  - {kind: stream, from: air%d, to: ambient, flow: 40 CFM}\n", n-1)
	return s.String()
}

func BenchmarkSolveChannels(b *testing.B) {
	net := buildModel(b, chainOfSinks(50))
	for b.Loop() {
		p := net.Steady()
		if r := solve.Newton(p, p.InitialGuess(), solve.Settings{}); !r.Reason.Converged() {
			b.Fatal(r.Reason)
		}
	}
}

// One residual and Jacobian evaluation of the channel chain.
func BenchmarkEvaluateChannels(b *testing.B) {
	net := buildModel(b, chainOfSinks(50))
	p := net.Steady()
	x := p.InitialGuess()
	f := make([]float64, len(x))
	mag := make([]float64, len(x))
	jac := p.Pattern()
	for b.Loop() {
		if err := p.Evaluate(x, f, jac, mag); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkFanWall solves a chassis of four fans (two stopped) feeding six
// heat sinks with bypasses: flows, pressures and temperatures together.
func BenchmarkFanWall(b *testing.B) {
	text := fanWallModel()
	m, err := network.Parse("wall.yaml", []byte(text))
	if err != nil {
		b.Fatal(err)
	}
	net, err := network.Build(m)
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		p := net.Steady()
		if r := solve.Newton(p, p.InitialGuess(), solve.Settings{}); !r.Reason.Converged() {
			b.Fatal(r.Reason)
		}
	}
}
