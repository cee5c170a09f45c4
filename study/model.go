// Package study runs studies on a model: sensitivities of the
// temperatures to every value of the model, the value of one parameter at
// which a limit is just met, and the like. Every point of a study is the
// model file read again with its own overrides (network.ParseWith), so
// that every value is checked as in the file, and assembled into its own
// network.
package study

import (
	"errors"
	"fmt"
	"os"

	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/solve"
)

// Model is a model file and the overrides every point starts from.
type Model struct {
	File     string
	Data     []byte
	Set      []network.Override
	Settings solve.Settings // for every solve; the zero value is the default
}

// Open reads a model file and checks it with the overrides set.
func Open(file string, set []network.Override) (*Model, error) {
	data, err := os.ReadFile(file)
	if err != nil {
		return nil, err
	}
	if len(data) > network.MaxFileSize {
		return nil, fmt.Errorf("%s is larger than the %d MiB limit for a model file", file, network.MaxFileSize>>20)
	}
	m := &Model{File: file, Data: data, Set: set}
	if _, err := network.ParseWith(file, data, set); err != nil {
		return nil, err
	}
	return m, nil
}

// Parameters lists the model's numeric values with the overrides applied.
func (m *Model) Parameters() []network.Parameter { return network.Parameters(m.File, m.Data, m.Set) }

// Parameter returns the parameter at path (see network.ParameterAt).
func (m *Model) Parameter(path string) (network.Parameter, error) {
	p, ok := network.ParameterAt(m.File, m.Data, m.Set, path)
	if !ok {
		return p, fmt.Errorf("%s names no numeric value of the model (a path as for --set, e.g. ambient.temperature, nodes.ID.power, links.ID.flow)", path)
	}
	return p, nil
}

// Build reads and assembles the model with its overrides and then extra.
func (m *Model) Build(extra ...network.Override) (*network.Network, error) {
	ovs := append(append([]network.Override{}, m.Set...), extra...)
	mod, err := network.ParseWith(m.File, m.Data, ovs)
	if err != nil {
		return nil, err
	}
	return network.Build(mod)
}

// Point is one solved state of the model.
type Point struct {
	Net      *network.Network
	Problem  *network.Steady
	Result   solve.Result
	Solution *network.Solution
}

// ErrNoSolution is wrapped by the error for a solve that did not converge.
var ErrNoSolution = errors.New("the solver found no solution")

// Solve builds the model with extra overrides and solves it.
func (m *Model) Solve(extra ...network.Override) (*Point, error) {
	net, err := m.Build(extra...)
	if err != nil {
		return nil, err
	}
	p := net.Steady()
	res := solve.Newton(p, p.InitialGuess(), m.Settings)
	if !res.Reason.Converged() {
		return nil, fmt.Errorf("%w (%s)%s", ErrNoSolution, res.Reason, describe(extra))
	}
	return &Point{Net: net, Problem: p, Result: res, Solution: net.Solution(res.X)}, nil
}

func describe(ovs []network.Override) string {
	if len(ovs) == 0 {
		return ""
	}
	s := " with"
	for _, o := range ovs {
		s += " " + o.String()
	}
	return s
}
