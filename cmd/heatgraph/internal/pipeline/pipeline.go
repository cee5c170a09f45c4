// Package pipeline joins the library's steps for the commands: read and
// check a model, solve it, and write output files safely.
package pipeline

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/solve"
	"github.com/heatgraph/heatgraph/viz"
)

// Outcome is a solved (or failed) model.
type Outcome struct {
	Net      *network.Network
	Result   solve.Result
	Run      viz.Run
	Solution *network.Solution // nil unless the solve converged
}

// Load reads, checks and assembles a model, turning invalid input into an
// exit.Error with code BadInput whose message lists every problem.
func Load(path string) (*network.Network, error) {
	net, err := network.Load(path)
	if err != nil {
		var ps network.Problems
		if errors.As(err, &ps) {
			return nil, &exit.Error{Code: exit.BadInput, Err: ps}
		}
		return nil, &exit.Error{Code: exit.BadInput, Err: err}
	}
	return net, nil
}

// Solve loads a model and solves it for the steady state.
func Solve(path string, settings solve.Settings) (*Outcome, error) {
	net, err := Load(path)
	if err != nil {
		return nil, err
	}
	p := net.Steady()
	res := solve.Newton(p, p.InitialGuess(), settings)
	out := &Outcome{Net: net, Result: res, Run: viz.Run{
		Converged:  res.Reason.Converged(),
		Reason:     res.Reason.String(),
		Iterations: res.Iterations,
		Residual:   res.Residual,
		Scaled:     res.Scaled,
	}}
	if out.Run.Converged {
		out.Solution = net.Solution(res.X)
	}
	return out, nil
}

// NotConverged returns the error for a solve that found no solution.
func (o *Outcome) NotConverged() error {
	msg := fmt.Sprintf("%s: no solution: the solver stopped after %d iterations (%s; largest residual %.3g W, %.2g of the heat flow)",
		o.Net.Model.File, o.Result.Iterations, o.Result.Reason, o.Result.Residual, o.Result.Scaled)
	if o.Result.Err != nil {
		msg += ": " + o.Result.Err.Error()
	}
	msg += "\nhint: check for links far stronger or weaker than the rest, and for temperatures or powers with wrong units"
	return &exit.Error{Code: exit.NotConverged, Err: errors.New(msg)}
}

// Code returns the exit code for a converged outcome: LimitExceeded when a
// node is above its limit, else OK.
func (o *Outcome) Code() int {
	if o.Solution != nil && len(o.Solution.Exceeded()) > 0 {
		return exit.LimitExceeded
	}
	return exit.OK
}

// WriteFile writes data to path through a temporary file in the same
// folder, renamed into place only when complete, so that a failed write
// never leaves a half-written file over a good one.
func WriteFile(path string, data []byte) error {
	dir := filepath.Dir(path)
	tmp, err := os.CreateTemp(dir, "."+filepath.Base(path)+".*.tmp")
	if err != nil {
		return &exit.Error{Code: exit.OutputFailed, Err: fmt.Errorf("cannot write %s: %w", path, unwrapPath(err))}
	}
	name := tmp.Name()
	_, werr := tmp.Write(data)
	cerr := tmp.Close()
	if werr == nil {
		werr = cerr
	}
	if werr == nil {
		werr = os.Chmod(name, 0o644)
	}
	if werr == nil {
		werr = os.Rename(name, path)
	}
	if werr != nil {
		os.Remove(name)
		return &exit.Error{Code: exit.OutputFailed, Err: fmt.Errorf("cannot write %s: %w", path, unwrapPath(werr))}
	}
	return nil
}

func unwrapPath(err error) error {
	var pe *os.PathError
	if errors.As(err, &pe) {
		return pe.Err
	}
	return err
}
