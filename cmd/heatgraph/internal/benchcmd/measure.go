package benchcmd

import (
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"os"
	"os/exec"
	"slices"
	"strings"
	"sync/atomic"
	"time"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/viz"
)

// Measure is what the bench found for one case.
type Measure struct {
	Case Case
	// Times are the wall times of the runs, from starting the solve
	// process to its end, result written.
	Times []time.Duration
	// PeakBytes is the largest peak resident set of the runs, bytes; −1
	// where the system does not report it.
	PeakBytes int64
	Unknowns  int // unknowns of the solve, from its report
	Newton    int // Newton iterations
	// Linear is the linear solver's iterations, −1 when the report does
	// not give them.
	Linear int
	// Err says why the case failed: the solve did not converge, its
	// energy balance did not close, or it could not run. Code is the exit
	// status the failure maps to.
	Err  error
	Code int
}

// Failed reports whether the case failed.
func (m *Measure) Failed() bool { return m.Err != nil }

// Median returns the median of the run times (the mean of the middle two
// for an even count), 0 when there are none.
func (m *Measure) Median() time.Duration {
	if len(m.Times) == 0 {
		return 0
	}
	t := slices.Clone(m.Times)
	slices.Sort(t)
	n := len(t)
	if n%2 == 1 {
		return t[n/2]
	}
	return (t[n/2-1] + t[n/2]) / 2
}

// limits bound one solve: its wall time and its resident memory (0 for
// no bound).
type limits struct {
	timeout time.Duration
	memory  int64 // bytes
}

// run is one solve of a model by a child process.
type run struct {
	wall      time.Duration
	peakBytes int64
	result    *result
}

// solveOnce runs "exe solve model -f json -o out" and measures its wall
// time and peak memory. A solve that ends with exit status 0 or 1 (a limit
// exceeded is still a solution) has its report read; exit status 3 (no
// solution) too, so that the reason can be told.
func solveOnce(ctx context.Context, exe, model, out string, lim limits) (run, error) {
	if lim.timeout > 0 {
		var cancel context.CancelFunc
		ctx, cancel = context.WithTimeout(ctx, lim.timeout)
		defer cancel()
	}
	_ = os.Remove(out) // a report left by an earlier run must not be read
	cmd := exec.CommandContext(ctx, exe, "solve", model, "-f", "json", "-o", out)
	var stderr bytes.Buffer
	cmd.Stderr = &limited{w: &stderr, n: 8 << 10}
	start := time.Now()
	err := cmd.Start()
	var overMemory atomic.Bool
	if err == nil {
		done := make(chan struct{})
		if lim.memory > 0 {
			go watchMemory(cmd.Process.Pid, lim.memory, 20*time.Millisecond, done, func() {
				overMemory.Store(true)
				_ = cmd.Process.Kill()
			})
		}
		err = cmd.Wait()
		close(done)
	}
	r := run{wall: time.Since(start), peakBytes: -1}
	if cmd.ProcessState != nil {
		r.peakBytes = peakRSS(cmd.ProcessState)
	}
	switch {
	case overMemory.Load():
		return r, &exit.Error{Code: exit.NotConverged, Err: fmt.Errorf("stopped: it held more than %.0f MB (--max-memory)", float64(lim.memory)/1e6)}
	case ctx.Err() == context.DeadlineExceeded:
		return r, &exit.Error{Code: exit.NotConverged, Err: fmt.Errorf("no result within %s (--timeout)", lim.timeout)}
	}
	code := 0
	var ee *exec.ExitError
	switch {
	case errors.As(err, &ee) && ee.Exited():
		code = ee.ExitCode()
	case err != nil:
		return r, &exit.Error{Code: exit.Internal, Err: fmt.Errorf("the solve did not run to its end: %v%s", err, tail(stderr.String()))}
	}
	if code != exit.OK && code != exit.LimitExceeded && code != exit.NotConverged {
		return r, &exit.Error{Code: exit.Internal, Err: fmt.Errorf("the solve ended with exit status %d%s", code, tail(stderr.String()))}
	}
	data, err := os.ReadFile(out)
	if err != nil {
		return r, &exit.Error{Code: exit.Internal, Err: fmt.Errorf("the solve ended with exit status %d and left no report: %v%s", code, err, tail(stderr.String()))}
	}
	res, err := readResult(data)
	if err != nil {
		return r, &exit.Error{Code: exit.Internal, Err: fmt.Errorf("reading the report %s: %v", out, err)}
	}
	r.result = res
	if err := res.check(); err != nil {
		return r, &exit.Error{Code: exit.NotConverged, Err: err}
	}
	return r, nil
}

// result is what the bench reads from a solve's JSON report (viz.Report).
type result struct {
	Solver struct {
		Converged  bool   `json:"converged"`
		Reason     string `json:"reason"`
		Iterations int    `json:"iterations"`
		// LinearIterations is read when the report gives it.
		LinearIterations *int `json:"linear_iterations"`
		Unknowns         []struct {
			Count int `json:"count"`
		} `json:"unknowns"`
	} `json:"solver"`
	Balance *struct {
		In          viz.Number `json:"heat_in_W"`
		Environment viz.Number `json:"environment_heat_W"`
		Out         []struct {
			Node string     `json:"node"`
			Heat viz.Number `json:"heat_W"`
		} `json:"heat_out"`
		Imbalance viz.Number `json:"imbalance_W"`
	} `json:"energy_balance"`
}

func readResult(data []byte) (*result, error) {
	var r result
	if err := json.Unmarshal(data, &r); err != nil {
		return nil, err
	}
	return &r, nil
}

// unknowns returns the number of unknowns the solve had.
func (r *result) unknowns() int {
	n := 0
	for _, u := range r.Solver.Unknowns {
		n += u.Count
	}
	return n
}

// linear returns the linear iterations, −1 when the report has none.
func (r *result) linear() int {
	if r.Solver.LinearIterations == nil {
		return -1
	}
	return *r.Solver.LinearIterations
}

// check says why a report is not a good solution: the solve did not
// converge, or its energy balance does not close within the tolerance the
// project holds every solution to (network.Balance.MaxImbalance).
func (r *result) check() error {
	if !r.Solver.Converged {
		return fmt.Errorf("no solution after %d Newton iterations: %s", r.Solver.Iterations, r.Solver.Reason)
	}
	if r.Balance == nil {
		return errors.New("the report has no energy balance")
	}
	b := network.Balance{In: float64(r.Balance.In), Environment: float64(r.Balance.Environment), Imbalance: float64(r.Balance.Imbalance)}
	for _, o := range r.Balance.Out {
		b.Out = append(b.Out, network.BoundaryHeat{Node: o.Node, Heat: float64(o.Heat)})
	}
	if !(math.Abs(b.Imbalance) <= b.MaxImbalance()) {
		return fmt.Errorf("the energy balance does not close: %.3g W in, %.3g W imbalance, more than the %.3g W allowed", b.In+b.Environment, b.Imbalance, b.MaxImbalance())
	}
	return nil
}

// limited writes at most n bytes to w and drops the rest.
type limited struct {
	w *bytes.Buffer
	n int
}

func (l *limited) Write(p []byte) (int, error) {
	if room := l.n - l.w.Len(); room > 0 {
		l.w.Write(p[:min(len(p), room)])
	}
	return len(p), nil
}

// tail formats what a failed solve said on standard error, for a message.
func tail(s string) string {
	s = strings.TrimSpace(s)
	if s == "" {
		return ""
	}
	return ":\n" + s
}
