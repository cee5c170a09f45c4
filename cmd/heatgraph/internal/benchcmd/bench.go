// Package benchcmd implements "heatgraph bench": it generates models of
// meshed plates of growing size, solves each in a process of its own as a
// user would (model file in, JSON results out), and reports the wall time,
// the peak memory and the iterations of every solve against the project's
// targets.
package benchcmd

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"time"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/pipeline"
	"github.com/spf13/cobra"
)

// Options are the inputs of the bench command.
type Options struct {
	IO       *iostreams.IOStreams
	Sizes    []string      // numbers of cells, as written (1e3, 1e6)
	Shapes   []string      // board, block, duct
	Repeat   int           // runs of each case
	Keep     string        // write the models and results here and keep them; "" for a temporary folder
	Markdown bool          // print the table as Markdown
	Binary   string        // the heatgraph that solves; "" for this one
	Timeout  time.Duration // longest one solve may take; 0 for no limit
	Strict   bool          // exit status 1 when a target is missed
	// MaxMemoryMB stops a solve whose resident set passes it, MB (10⁶
	// bytes); 0 for no bound. Linux only.
	MaxMemoryMB float64
}

// DefaultSizes are the sizes the bench runs unless told otherwise.
var DefaultSizes = []string{"1e3", "1e4", "1e5", "1e6"}

// NewCmd returns the bench command. runF, when not nil, replaces Run (for
// tests of flag handling).
func NewCmd(ios *iostreams.IOStreams, runF func(*Options) error) *cobra.Command {
	o := &Options{IO: ios}
	cmd := &cobra.Command{
		Use:   "bench",
		Short: "Measure the time and memory of whole solves of meshed plates of growing size",
		Long: `Measure how long heatgraph takes, and how much memory it needs, to solve
meshed plates of growing size, the whole way from model file to written
results.

For every shape and size the bench writes a model file, then runs
'heatgraph solve MODEL -f json -o RESULT' as a process of its own, measures
its wall time and its peak resident set (the operating system's account of
the process), and reads the report: the number of unknowns, the Newton
iterations, the linear solver's iterations when the report gives them,
whether the solve converged, and whether its energy balance closes.

Shapes:
  board  a 200 × 200 mm printed board with four copper layers, one cell
         through its thickness, square cells in the plane; five parts on
         it (one with a heat sink on its case, one on the bottom face) and
         a heated region; convection and radiation from both faces.
  block  a 100 × 100 × 20 mm aluminium base, about as many cells along
         each direction (10 × 10 × 10 for 1e3); two heated regions on its
         top, a part placed on it, a heated region on one side;
         convection and radiation from all six faces.
  duct   a 100 × 120 mm aluminium heat-sink base, one cell through its
         thickness, over two fields of fins in a duct, the air warming
         through one and then the other (fin channels in series): the
         Jacobian is not symmetric, as in any model with air streams.
         Two power modules on it. Not measured unless asked for.
Radiation makes every solve nonlinear. The models are invented, with
realistic powers; --keep writes them (and the results) to a folder.

The table gives, for every case: the shape, its cells, the unknowns of
the solve, the median wall time (s) over --repeat runs, the largest peak
memory (MB, 10^6 bytes), the Newton and linear iterations, the project's
target on a 2-core machine (s / MB) and whether it is met, and below it
the machine: CPU, logical CPUs, GOMAXPROCS, Go version and, on Linux,
the kernel's transparent huge page mode (with "never" a big solve's first
writes to fresh memory take much longer). The targets:
  board 1e5: 0.6 s        board 1e6: 3.9 s, 1500 MB
  block 1e5: 4 s          block 1e6: 10 s, 1500 MB
The solves inherit the environment, so GOMAXPROCS=2 heatgraph bench
measures on two threads.

Exit status: 0 when every case converged (targets are reported, not
enforced, unless --strict), 1 with --strict when a target is missed, 3
when a case failed: no solution, an energy balance that does not close,
or no result within --timeout or --max-memory; 2 for an invalid command
line, 4 when a solve could not run or its report could not be read.`,
		Example: `  heatgraph bench
  heatgraph bench --sizes 1e3,1e4 --shapes board --repeat 5
  GOMAXPROCS=2 heatgraph bench --sizes 1e6 --markdown
  heatgraph bench --sizes 1e5 --keep bench-models --binary ./heatgraph-old`,
		Args: cobra.NoArgs,
		RunE: func(*cobra.Command, []string) error {
			if runF != nil {
				return runF(o)
			}
			return Run(o)
		},
	}
	cmd.Flags().StringSliceVar(&o.Sizes, "sizes", DefaultSizes, "numbers of cells of the models, comma-separated")
	cmd.Flags().StringSliceVar(&o.Shapes, "shapes", DefaultShapes, "shapes of the models: "+strings.Join(Shapes, ", "))
	cmd.Flags().IntVar(&o.Repeat, "repeat", 1, "runs of each case: the time is their median, the memory their largest")
	cmd.Flags().StringVar(&o.Keep, "keep", "", "write the models and results to this folder and keep them (default: a temporary folder, removed)")
	cmd.Flags().BoolVar(&o.Markdown, "markdown", false, "print the table in Markdown")
	cmd.Flags().StringVar(&o.Binary, "binary", "", "solve with this heatgraph executable instead of the running one (to compare builds)")
	cmd.Flags().DurationVar(&o.Timeout, "timeout", 10*time.Minute, "longest one solve may take before its case fails (0 for no limit)")
	cmd.Flags().Float64Var(&o.MaxMemoryMB, "max-memory", 6000, "stop a solve whose resident memory passes this many MB, and fail its case (0 for no bound; Linux only)")
	cmd.Flags().BoolVar(&o.Strict, "strict", false, "exit with status 1 when a case misses its target")
	return cmd
}

// Run generates the models, solves each, and prints the table.
func Run(o *Options) error {
	cases, err := o.cases()
	if err != nil {
		return err
	}
	exe := o.Binary
	if exe == "" {
		if exe, err = os.Executable(); err != nil {
			return &exit.Error{Code: exit.Internal, Err: fmt.Errorf("finding the running heatgraph: %w", err)}
		}
	} else if exe, err = filepath.Abs(exe); err != nil {
		return exit.With(exit.BadInput, "--binary: %v", err)
	}
	dir := o.Keep
	if dir == "" {
		if dir, err = os.MkdirTemp("", "heatgraph-bench-"); err != nil {
			return &exit.Error{Code: exit.OutputFailed, Err: fmt.Errorf("making a temporary folder: %w", err)}
		}
		defer os.RemoveAll(dir)
	} else if err := os.MkdirAll(dir, 0o755); err != nil {
		return &exit.Error{Code: exit.OutputFailed, Err: fmt.Errorf("--keep: %w", err)}
	}
	var ms []*Measure
	for _, c := range cases {
		model := filepath.Join(dir, c.Name()+".yaml")
		if err := pipeline.WriteFile(model, c.Model()); err != nil {
			return err
		}
		ms = append(ms, o.measure(c, exe, model, filepath.Join(dir, c.Name()+".json")))
	}
	var b bytes.Buffer
	mach := ThisMachine()
	if o.Markdown {
		err = WriteMarkdown(&b, ms, mach, o.Repeat)
	} else {
		err = WriteText(&b, ms, mach, o.Repeat)
	}
	if err != nil {
		return err
	}
	if _, err := o.IO.Out.Write(b.Bytes()); err != nil {
		return &exit.Error{Code: exit.OutputFailed, Err: fmt.Errorf("writing the table: %w", err)}
	}
	if o.Keep != "" {
		fmt.Fprintf(o.IO.ErrOut, "bench: models and results kept in %s\n", o.Keep)
	}
	return outcome(ms, o.Strict)
}

// outcome is the exit status of the bench: a failure that is a bug or a
// broken run (Internal) before one without a solution (NotConverged),
// then, with strict, a missed target.
func outcome(ms []*Measure, strict bool) error {
	code := exit.OK
	for _, m := range ms {
		switch {
		case m.Failed() && m.Code == exit.Internal:
			code = exit.Internal
		case m.Failed() && code != exit.Internal:
			code = exit.NotConverged
		case strict && m.Met() == "no" && code == exit.OK:
			code = exit.LimitExceeded
		}
	}
	if code == exit.OK {
		return nil
	}
	return exit.Silent(code)
}

// cases checks the options and lists the cases, shape by shape, each in
// the order of --sizes.
func (o *Options) cases() ([]Case, error) {
	if o.Repeat < 1 {
		return nil, exit.With(exit.BadInput, "--repeat %d: give at least one run", o.Repeat)
	}
	if o.Timeout < 0 {
		return nil, exit.With(exit.BadInput, "--timeout %s: give a positive duration, or 0 for no limit", o.Timeout)
	}
	if !(o.MaxMemoryMB >= 0) {
		return nil, exit.With(exit.BadInput, "--max-memory %g: give a positive number of MB, or 0 for no bound", o.MaxMemoryMB)
	}
	if len(o.Sizes) == 0 || len(o.Shapes) == 0 {
		return nil, exit.With(exit.BadInput, "give at least one size (--sizes) and one shape (--shapes)")
	}
	var sizes []float64
	for _, s := range o.Sizes {
		x, err := ParseSize(s)
		if err != nil {
			return nil, exit.With(exit.BadInput, "--sizes: %v", err)
		}
		sizes = append(sizes, x)
	}
	var out []Case
	seen := map[string]bool{}
	for _, sh := range o.Shapes {
		sh = strings.TrimSpace(sh)
		if !slices.Contains(Shapes, sh) {
			return nil, exit.With(exit.BadInput, "--shapes: %q is not a shape (use %s)", sh, strings.Join(Shapes, ", "))
		}
		for i, x := range sizes {
			c, err := NewCase(sh, x, strings.TrimSpace(o.Sizes[i]))
			if err != nil {
				return nil, exit.With(exit.BadInput, "%v", err)
			}
			if seen[c.Name()] {
				continue
			}
			seen[c.Name()] = true
			out = append(out, c)
		}
	}
	return out, nil
}

// measure solves one case Repeat times, saying on standard error how each
// run went; it stops at the first run that fails.
func (o *Options) measure(c Case, exe, model, result string) *Measure {
	m := &Measure{Case: c, PeakBytes: -1, Linear: -1}
	for i := 0; i < o.Repeat; i++ {
		r, err := solveOnce(context.Background(), exe, model, result, limits{timeout: o.Timeout, memory: int64(o.MaxMemoryMB * 1e6)})
		m.Times = append(m.Times, r.wall)
		m.PeakBytes = max(m.PeakBytes, r.peakBytes)
		if r.result != nil {
			m.Unknowns, m.Newton, m.Linear = r.result.unknowns(), r.result.Solver.Iterations, r.result.linear()
		}
		status := fmt.Sprintf("%.3f s", r.wall.Seconds())
		if r.peakBytes >= 0 {
			status += fmt.Sprintf(", %.0f MB", float64(r.peakBytes)/1e6)
		}
		fmt.Fprintf(o.IO.ErrOut, "bench: %s, %d × %d × %d cells, run %d of %d: %s\n", c.Name(), c.NX, c.NY, c.NZ, i+1, o.Repeat, status)
		if err != nil {
			m.Err, m.Code = err, exit.Internal
			var ee *exit.Error
			if errors.As(err, &ee) {
				m.Code = ee.Code
			}
			fmt.Fprintf(o.IO.ErrOut, "bench: %s FAILED: %v\n", c.Name(), err)
			break
		}
	}
	return m
}
