// Package historycmd implements "heatgraph history": a run through time.
package historycmd

import (
	"bytes"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"sort"
	"strings"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/pipeline"
	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/units"
	"github.com/heatgraph/heatgraph/viz"
	"github.com/schollz/progressbar/v3"
	"github.com/spf13/cobra"
	"golang.org/x/term"
)

// Options are the inputs of the history command. Times and temperatures
// are kept as written (with their units) and read in Run.
type Options struct {
	IO        *iostreams.IOStreams
	Model     string
	End       string   // e.g. "2 h"
	Every     string   // output interval, e.g. "1 min"; default a hundredth of the run
	Start     string   // ambient, steady or given
	Initial   []string // node=temperature, with --start given
	FixedStep string   // e.g. "0.5 s"; empty for adaptive steps
	RelTol    float64
	AbsTol    string // e.g. "1 mK"
	CycleTol  string // e.g. "0.01 K"
	CSV       string // write the temperatures here
	Plot      string // write the plot here (.png or .svg)
	Nodes     []string
	// Progress forces the progress bar on (true) or off (false); nil
	// shows it when standard error is a terminal.
	Progress *bool
}

// largeNetwork is the number of unknowns above which a run uses modified
// Newton iterations.
const largeNetwork = 500

// Starts lists the ways a run may start.
var Starts = []string{string(network.FromAmbient), string(network.FromSteady), string(network.FromGiven)}

// NewCmd returns the history command. runF, when not nil, replaces Run
// (for tests of flag handling).
func NewCmd(ios *iostreams.IOStreams, runF func(*Options) error) *cobra.Command {
	o := &Options{IO: ios}
	cmd := &cobra.Command{
		Use:   "history MODEL --end TIME",
		Short: "Run a model through time: temperatures, peaks, limits crossed, energy",
		Long: `Run a model through time from a start state to an end time, with every
power, fixed temperature, ambient temperature and irradiance following its
profile, and every node with a heat capacity storing heat (nodes without
one follow their balances at once). The integrator is TR-BDF2 with
adaptive steps; output is taken by stepping exactly onto each output time.

It reports each node's peak and when, the first time each node rose above
its limit, the energy over the run (heat in = heat out + change in stored
heat), and, when every profile repeats with one period, whether the run
settled into a periodic state and after how many cycles.

Exit status: 0 when no limit was exceeded, 1 when a node rose above its
limit, 2 for an invalid model or command line, 3 when the integration
failed, 4 when an output could not be written.`,
		Example: "  heatgraph history examples/burst-module.yaml --end 10min --every 5s --plot burst.png\n" +
			"  heatgraph history examples/sunny-enclosure.yaml --end 72h --every 15min --start steady --csv day.csv",
		Args: cobra.ExactArgs(1),
		RunE: func(_ *cobra.Command, args []string) error {
			o.Model = args[0]
			if runF != nil {
				return runF(o)
			}
			return Run(o)
		},
	}
	f := cmd.Flags()
	f.StringVar(&o.End, "end", "", "end time of the run, e.g. 30min, 2h (required)")
	f.StringVar(&o.Every, "every", "", "output interval, e.g. 10s (default: a hundredth of the run)")
	f.StringVar(&o.Start, "start", string(network.FromAmbient), "start state: ambient, steady (the steady state at t = 0) or given (--initial)")
	f.StringArrayVar(&o.Initial, "initial", nil, "a starting temperature with --start given, node=value, e.g. lid=35degC (repeatable; other nodes start at ambient)")
	f.StringVar(&o.FixedStep, "fixed-step", "", "take fixed steps of this length, e.g. 1s, instead of adaptive ones")
	f.Float64Var(&o.RelTol, "rel-tol", 0, "relative tolerance of each step's local error (default 1e-4)")
	f.StringVar(&o.AbsTol, "abs-tol", "", "absolute tolerance of each step's local error, e.g. 1mK (default 1 mK)")
	f.StringVar(&o.CycleTol, "cycle-tol", "0.01 K", "largest change from one period to the next of a settled periodic state")
	f.StringVar(&o.CSV, "csv", "", "write the temperatures at every output time to this CSV file")
	f.StringVar(&o.Plot, "plot", "", "draw the temperatures of chosen nodes against time, with their limits, to this .png or .svg file")
	f.StringSliceVar(&o.Nodes, "nodes", nil, "nodes to plot, comma-separated (default: the nodes with limits, else every solved node)")
	cmd.MarkFlagRequired("end")
	return cmd
}

// Run runs the model through time and writes the outputs.
func Run(o *Options) error {
	ro, err := o.runOptions()
	if err != nil {
		return err
	}
	if o.Plot != "" {
		if ext := strings.ToLower(filepath.Ext(o.Plot)); ext != ".png" && ext != ".svg" {
			return exit.With(exit.BadInput, "--plot %q: the plot is written as .png or .svg", o.Plot)
		}
	}
	net, err := pipeline.Load(o.Model)
	if err != nil {
		return err
	}
	plotted, err := o.plotNodes(net)
	if err != nil {
		return err
	}
	if ro.Start == network.FromGiven {
		ro.Initial = map[string]float64{}
		for _, s := range o.Initial {
			id, val, ok := strings.Cut(s, "=")
			if !ok {
				return exit.With(exit.BadInput, "--initial %q: write node=temperature, e.g. lid=35degC", s)
			}
			t, err := units.Parse(val, units.Temperature)
			if err != nil {
				return exit.With(exit.BadInput, "--initial %q: %v", s, err)
			}
			ro.Initial[strings.TrimSpace(id)] = t
		}
	} else if len(o.Initial) > 0 {
		return exit.With(exit.BadInput, "--initial needs --start given")
	}
	// Large networks keep the stage matrix's factorization while it
	// serves: there a factorization costs far more than an evaluation.
	ro.ModifiedNewton = net.Unknowns() > largeNetwork
	bar := o.progressBar()
	if bar != nil {
		ro.Progress = func(done float64) { _ = bar.Set(int(math.Round(1000 * done))) }
	}
	h, err := net.Run(ro)
	if bar != nil {
		_ = bar.Finish()
		fmt.Fprintln(o.IO.ErrOut)
	}
	if err != nil {
		// The start state could not be made: a bad --initial, or no
		// steady state at t = 0.
		if ro.Start == network.FromSteady {
			return &exit.Error{Code: exit.NotConverged, Err: fmt.Errorf("%s: %w", o.Model, err)}
		}
		return &exit.Error{Code: exit.BadInput, Err: err}
	}
	if !h.Completed() {
		msg := fmt.Sprintf("%s: the run stopped at t = %s: %s", o.Model, clock(h.Result.T), h.Result.Reason)
		if h.Result.Err != nil {
			msg += ": " + h.Result.Err.Error()
		}
		return &exit.Error{Code: exit.NotConverged, Err: fmt.Errorf("%s\nhint: try a tighter --rel-tol, or --fixed-step with a short step", msg)}
	}
	tu := chooseTimeUnit(ro.End)
	if o.CSV != "" {
		var buf bytes.Buffer
		writeCSV(&buf, h, tu)
		if err := pipeline.WriteFile(o.CSV, buf.Bytes()); err != nil {
			return err
		}
	}
	if o.Plot != "" {
		data, err := drawPlot(h, plotted, tu, strings.TrimPrefix(strings.ToLower(filepath.Ext(o.Plot)), "."))
		if err != nil {
			return &exit.Error{Code: exit.OutputFailed, Err: fmt.Errorf("drawing the plot: %w", err)}
		}
		if err := pipeline.WriteFile(o.Plot, data); err != nil {
			return err
		}
	}
	var buf bytes.Buffer
	writeSummary(&buf, h, ro)
	if _, err := o.IO.Out.Write(buf.Bytes()); err != nil {
		return &exit.Error{Code: exit.OutputFailed, Err: fmt.Errorf("writing the report: %w", err)}
	}
	if len(h.Crossings) > 0 {
		return exit.Silent(exit.LimitExceeded)
	}
	return nil
}

// runOptions reads the flags' quantities.
func (o *Options) runOptions() (network.RunOptions, error) {
	var ro network.RunOptions
	var err error
	bad := func(flag, val string, err error) error {
		return exit.With(exit.BadInput, "--%s %q: %v", flag, val, err)
	}
	time := func(flag, val string) (float64, error) {
		t, err := units.Parse(val, units.Time)
		if err != nil {
			return 0, bad(flag, val, err)
		}
		if !(t > 0) {
			return 0, exit.With(exit.BadInput, "--%s %q: must be longer than zero", flag, val)
		}
		return t, nil
	}
	if ro.End, err = time("end", o.End); err != nil {
		return ro, err
	}
	if o.Every != "" {
		if ro.Interval, err = time("every", o.Every); err != nil {
			return ro, err
		}
		if ro.Interval > ro.End {
			return ro, exit.With(exit.BadInput, "--every %q is longer than the run (--end %q)", o.Every, o.End)
		}
	}
	if o.FixedStep != "" {
		if ro.FixedStep, err = time("fixed-step", o.FixedStep); err != nil {
			return ro, err
		}
	}
	if o.RelTol < 0 || o.RelTol >= 1 {
		return ro, exit.With(exit.BadInput, "--rel-tol %g: must be in (0, 1), e.g. 1e-4", o.RelTol)
	}
	ro.RelTol = o.RelTol
	if o.AbsTol != "" {
		if ro.AbsTol, err = units.Parse(o.AbsTol, units.TemperatureDifference); err != nil {
			return ro, bad("abs-tol", o.AbsTol, err)
		}
		if !(ro.AbsTol > 0) {
			return ro, exit.With(exit.BadInput, "--abs-tol %q: must be greater than zero", o.AbsTol)
		}
	}
	if ro.CycleTolerance, err = units.Parse(o.CycleTol, units.TemperatureDifference); err != nil || !(ro.CycleTolerance > 0) {
		if err == nil {
			err = fmt.Errorf("must be greater than zero")
		}
		return ro, bad("cycle-tol", o.CycleTol, err)
	}
	found := false
	for _, s := range Starts {
		found = found || s == o.Start
	}
	if !found {
		return ro, exit.With(exit.BadInput, "--start %q is not a start (use %s)", o.Start, strings.Join(Starts, ", "))
	}
	ro.Start = network.Start(o.Start)
	return ro, nil
}

// plotNodes returns the indices of the nodes to plot.
func (o *Options) plotNodes(net *network.Network) ([]int, error) {
	var out []int
	if len(o.Nodes) > 0 {
		for _, id := range o.Nodes {
			i, ok := net.Index[strings.TrimSpace(id)]
			if !ok {
				ids := make([]string, 0, len(net.Index))
				for k := range net.Index {
					ids = append(ids, k)
				}
				sort.Strings(ids)
				return nil, exit.With(exit.BadInput, "--nodes: no node %q in %s (nodes: %s)", id, o.Model, strings.Join(ids, ", "))
			}
			out = append(out, i)
		}
		return out, nil
	}
	for i, n := range net.Nodes {
		if n.HasLimit {
			out = append(out, i)
		}
	}
	if len(out) == 0 {
		for i, n := range net.Nodes {
			if !n.Fixed() {
				out = append(out, i)
			}
		}
	}
	return out, nil
}

// progressBar returns a bar on standard error when it is a terminal (or
// when Progress says so), else nil.
func (o *Options) progressBar() *progressbar.ProgressBar {
	show := false
	if o.Progress != nil {
		show = *o.Progress
	} else if f, ok := o.IO.ErrOut.(*os.File); ok {
		show = term.IsTerminal(int(f.Fd()))
	}
	if !show {
		return nil
	}
	return progressbar.NewOptions(1000,
		progressbar.OptionSetWriter(o.IO.ErrOut),
		progressbar.OptionSetDescription("run"),
		progressbar.OptionShowElapsedTimeOnFinish(),
		progressbar.OptionSetWidth(30),
		progressbar.OptionThrottle(100_000_000))
}

// timeUnit is the unit times are shown in.
type timeUnit struct {
	name  string
	scale float64 // seconds per unit
}

func chooseTimeUnit(end float64) timeUnit {
	switch {
	case end <= 600:
		return timeUnit{"s", 1}
	case end <= 10*3600:
		return timeUnit{"min", 60}
	}
	return timeUnit{"h", 3600}
}

// clock writes a time in s, min or h, whichever reads best.
func clock(t float64) string {
	u := chooseTimeUnit(t)
	return fmt.Sprintf("%.4g %s", t/u.scale, u.name)
}

func degC(k float64) float64 { return k - 273.15 }

// writeCSV writes every node's temperature at every output time, with the
// units in the header.
func writeCSV(w io.Writer, h *network.History, tu timeUnit) {
	fmt.Fprintf(w, "time [%s]", tu.name)
	for _, n := range h.Net.Nodes {
		fmt.Fprintf(w, ",%s [degC]", csvName(n.ID))
	}
	fmt.Fprintln(w)
	for k, t := range h.Times {
		fmt.Fprintf(w, "%.10g", t/tu.scale)
		for _, v := range h.T[k] {
			fmt.Fprintf(w, ",%.6f", degC(v))
		}
		fmt.Fprintln(w)
	}
}

// csvName quotes an id that holds a comma or a quote.
func csvName(id string) string {
	if strings.ContainsAny(id, ",\"") {
		return `"` + strings.ReplaceAll(id, `"`, `""`) + `"`
	}
	return id
}

// writeSummary writes the text report of a run.
func writeSummary(w io.Writer, h *network.History, ro network.RunOptions) {
	net := h.Net
	title := net.Model.Title
	if title == "" {
		title = net.Model.File
	}
	r := h.Result
	steps := "adaptive steps"
	if ro.FixedStep > 0 {
		steps = "fixed steps of " + clock(ro.FixedStep)
	}
	fmt.Fprintf(w, "%s: run from t = 0 (start: %s) to %s\n", title, startName(ro.Start), clock(ro.End))
	fmt.Fprintf(w, "TR-BDF2, %s: %d steps, %d rejected, %d Newton iterations\n\n", steps, r.Steps, r.Rejected, r.Newton)
	crossed := map[string]network.Crossing{}
	for _, c := range h.Crossings {
		crossed[c.Node] = c
	}
	fmt.Fprintf(w, "%-20s %12s %12s %12s %12s  %s\n", "node", "start degC", "peak degC", "at", "limit degC", "first over the limit")
	for i, n := range net.Nodes {
		if n.Fixed() && n.TemperatureProfile == nil {
			continue
		}
		p := h.Peaks[i]
		lim, over := "-", ""
		if n.HasLimit {
			lim = fmt.Sprintf("%.2f", degC(n.Limit))
			over = "never"
			if c, ok := crossed[n.ID]; ok {
				over = "at " + clock(c.At) + "  OVER"
			}
		}
		fmt.Fprintf(w, "%-20s %12.2f %12.2f %12s %12s  %s\n", n.ID, degC(h.T[0][i]), degC(p.Temperature), clock(p.At), lim, over)
	}
	e := h.Energy
	fmt.Fprintf(w, "\nenergy over the run (J)\n")
	fmt.Fprintf(w, "  heat in from sources          %14.6g\n", e.Sources)
	fmt.Fprintf(w, "  heat in from the environment  %14.6g\n", e.Environment)
	for _, o := range e.Out {
		fmt.Fprintf(w, "  heat out through %-12s %14.6g\n", o.Node, o.Heat)
	}
	fmt.Fprintf(w, "  change in stored heat         %14.6g\n", e.Stored)
	fmt.Fprintf(w, "  imbalance                     %14.3g  (%.2g of the heat moved; warning above %.0e)\n", e.Imbalance, e.Relative(), network.EnergyTolerance)
	if c := h.Cycle; c != nil {
		fmt.Fprintf(w, "\nperiodic state (period %s, tolerance %.3g K)\n", clock(c.Period), ro.CycleTolerance)
		if c.Settled {
			fmt.Fprintf(w, "  settled after %d cycles; peaks in the last cycle:\n", c.Cycles)
		} else {
			fmt.Fprintf(w, "  not settled after %d cycles (last change %.3g K); run longer. Peaks in the last cycle:\n", c.Cycles, c.Change)
		}
		for i, p := range c.Peaks {
			if n := net.Nodes[i]; n.Fixed() && n.TemperatureProfile == nil {
				continue
			}
			fmt.Fprintf(w, "  %-20s %10.2f degC at %s into the cycle\n", p.Node, degC(p.Temperature), clock(math.Mod(p.At, c.Period)))
		}
	}
	if len(h.Warnings) > 0 {
		fmt.Fprintf(w, "\nwarnings\n")
		for _, s := range h.Warnings {
			fmt.Fprintf(w, "  %s\n", s)
		}
	}
	fmt.Fprintln(w)
	if len(h.Crossings) == 0 {
		fmt.Fprintln(w, "verdict: no node rose above its limit during the run")
	} else {
		var ids []string
		for _, c := range h.Crossings {
			ids = append(ids, c.Node)
		}
		fmt.Fprintf(w, "verdict: OVER THE LIMIT during the run: %s\n", strings.Join(ids, ", "))
	}
	fmt.Fprintf(w, "\n%s\n", viz.Caution)
}

func startName(s network.Start) string {
	switch s {
	case network.FromSteady:
		return "the steady state at t = 0"
	case network.FromGiven:
		return "given temperatures"
	}
	return "every node at ambient"
}
