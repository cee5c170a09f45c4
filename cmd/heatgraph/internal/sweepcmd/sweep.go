// Package sweepcmd implements "heatgraph sweep", and the parts of running
// a study file that "heatgraph montecarlo" shares.
package sweepcmd

import (
	"bytes"
	"fmt"
	"os"
	"strconv"
	"strings"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/pipeline"
	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/study"
	"github.com/heatgraph/heatgraph/viz"
	"github.com/schollz/progressbar/v3"
	"github.com/spf13/cobra"
	"golang.org/x/term"
)

// Options are the inputs of the sweep command.
type Options struct {
	IO     *iostreams.IOStreams
	Study  string   // study file
	Set    []string // overrides, PATH=VALUE
	Output string   // CSV table; standard output when empty
	JSON   string   // JSON document
	Plot   []string // PNG or SVG plots
	Shard  string   // "i/n"
	// Vary, when given, makes Study a model file swept over these values
	// (PATH=VALUES, see study.ParseAxis) instead of a study file.
	Vary      []string
	PlotX     string
	PlotNodes []string
}

// NewCmd returns the sweep command.
func NewCmd(ios *iostreams.IOStreams, runF func(*Options) error) *cobra.Command {
	o := &Options{IO: ios}
	cmd := &cobra.Command{
		Use:   "sweep STUDY | sweep MODEL --vary PATH=VALUES...",
		Short: "Solve a model over a range or grid of values (a study file)",
		Long: `Solve the model of a study file at every point of its sweep: one or more
values, each given as a list or a range (from, to, and a step or a count,
linear or log); with several, every combination. The points run in
parallel over the cores. The table has one row per point: the values,
every node's temperature, every limited node's margin, the worst node and
the status. See the README for the study file.

Without a study file: give a model and one --vary per swept value,
PATH=FROM:TO:STEP (20degC:60degC:5K), PATH=FROM:TO:COUNT (1W:10W:10, or
10log for geometric spacing) or PATH=V1,V2,...; --plot-x and --plot-node
choose what --plot draws.

--shard i/n runs only the points whose index is i modulo n (0 ≤ i < n);
'heatgraph merge' joins the tables of the shards into the table of the
whole study, byte for byte.

Exit status: 0, 2 for an invalid study, model or command line, 4 when a
result could not be written. Points without a solution are rows with
status "failed" and the reason.`,
		Example: "  heatgraph sweep examples/studies/ambient-sweep.yaml -o sweep.csv --plot sweep.svg\n" +
			"  heatgraph sweep examples/bench-logger.yaml --vary ambient.temperature=15degC:45degC:5K --vary components.fpga.power=4W,6W,8W",
		Args: cobra.ExactArgs(1),
		RunE: func(_ *cobra.Command, args []string) error {
			o.Study = args[0]
			if runF != nil {
				return runF(o)
			}
			return Run(o)
		},
	}
	cmd.Flags().StringArrayVar(&o.Set, "set", nil, pipeline.SetHelp)
	cmd.Flags().StringVarP(&o.Output, "output", "o", "", "write the CSV table to this file instead of standard output")
	cmd.Flags().StringVar(&o.JSON, "json", "", "also write the results as JSON to this file")
	cmd.Flags().StringArrayVar(&o.Plot, "plot", nil, "draw the plotted nodes against the plot's x value to this .png or .svg file (repeatable)")
	cmd.Flags().StringArrayVar(&o.Vary, "vary", nil, "sweep the model given instead of a study file over PATH=FROM:TO:STEP, PATH=FROM:TO:COUNT[log] or PATH=V1,V2,... (repeatable: a grid)")
	cmd.Flags().StringVar(&o.PlotX, "plot-x", "", "with --vary: the value on the plots' x axis (default: the first)")
	cmd.Flags().StringArrayVar(&o.PlotNodes, "plot-node", nil, "with --vary: a node to plot (repeatable; default: every node with a limit)")
	cmd.Flags().StringVar(&o.Shard, "shard", "", "run shard i of n, i/n with 0 ≤ i < n: the points whose index is i modulo n")
	return cmd
}

// ReadStudy reads a study file with the command's exit codes.
func ReadStudy(path string, sets []string) (*study.Study, error) {
	ovs, err := network.ParseOverrides(sets)
	if err != nil {
		return nil, &exit.Error{Code: exit.BadInput, Err: err}
	}
	st, err := study.ReadStudy(path, ovs)
	if err != nil {
		return nil, pipeline.BadInput(err, "")
	}
	return st, nil
}

// ParseShard reads "i/n"; "" is the whole study (0/1).
func ParseShard(s string) (int, int, error) {
	if s == "" {
		return 0, 1, nil
	}
	a, b, ok := strings.Cut(s, "/")
	i, err1 := strconv.Atoi(a)
	n, err2 := strconv.Atoi(b)
	if !ok || err1 != nil || err2 != nil || n < 1 || i < 0 || i >= n {
		return 0, 0, exit.With(exit.BadInput, "--shard %q: expected i/n with 0 ≤ i < n, e.g. 0/4 (in a Kubernetes indexed job: $JOB_COMPLETION_INDEX/n)", s)
	}
	return i, n, nil
}

// RunDesign solves the study's model at the points of design in shard,
// with a progress bar on standard error when it is a terminal.
func RunDesign(ios *iostreams.IOStreams, st *study.Study, d study.Design, shard string, what string) ([]study.Node, []study.Row, error) {
	i, n, err := ParseShard(shard)
	if err != nil {
		return nil, nil, err
	}
	nodes, _, err := st.Model.Nodes()
	if err != nil {
		return nil, nil, &exit.Error{Code: exit.BadInput, Err: err}
	}
	indices := study.Shard(d.Len(), i, n)
	var done func()
	if f, ok := ios.ErrOut.(*os.File); ok && term.IsTerminal(int(f.Fd())) && len(indices) > 1 {
		bar := progressbar.NewOptions(len(indices), progressbar.OptionSetWriter(f), progressbar.OptionSetDescription(what),
			progressbar.OptionShowCount(), progressbar.OptionClearOnFinish(), progressbar.OptionThrottle(100_000_000))
		done = func() { bar.Add(1) }
		defer bar.Finish()
	}
	rows := st.Model.Run(d, indices, study.IDs(nodes), done)
	return nodes, rows, nil
}

// Emit writes data to path, or to standard output when path is "".
func Emit(ios *iostreams.IOStreams, path string, data []byte, inputs ...string) error {
	if path != "" {
		return pipeline.WriteFile(path, data, inputs...)
	}
	if _, err := ios.Out.Write(data); err != nil {
		return &exit.Error{Code: exit.OutputFailed, Err: fmt.Errorf("writing the table: %w", err)}
	}
	return nil
}

// fromFlags makes a study of the model o.Study swept over o.Vary.
func fromFlags(o *Options) (*study.Study, error) {
	ovs, err := network.ParseOverrides(o.Set)
	if err != nil {
		return nil, &exit.Error{Code: exit.BadInput, Err: err}
	}
	m, err := study.Open(o.Study, ovs)
	if err != nil {
		return nil, pipeline.BadInput(err, o.Study)
	}
	st := &study.Study{File: o.Study, Model: m, PlotX: o.PlotX, PlotNodes: o.PlotNodes}
	for _, v := range o.Vary {
		ax, err := m.ParseAxis(v)
		if err != nil {
			return nil, exit.With(exit.BadInput, "%v", err)
		}
		st.Grid = append(st.Grid, ax)
	}
	if st.Grid.Len() > 10_000_000 {
		return nil, exit.With(exit.BadInput, "--vary: %d points is more than ten million", st.Grid.Len())
	}
	return st, nil
}

// Run runs the sweep and writes its outputs.
func Run(o *Options) error {
	var st *study.Study
	var err error
	if len(o.Vary) > 0 {
		st, err = fromFlags(o)
	} else {
		if o.PlotX != "" || len(o.PlotNodes) > 0 {
			return exit.With(exit.BadInput, "--plot-x and --plot-node go with --vary; a study file says what to plot under plot:")
		}
		st, err = ReadStudy(o.Study, o.Set)
	}
	if err != nil {
		return err
	}
	if st.Grid == nil {
		return exit.With(exit.BadInput, "%s: the study has no sweep: section (for montecarlo: use 'heatgraph montecarlo')", o.Study)
	}
	for _, p := range o.Plot {
		if !strings.HasSuffix(p, ".png") && !strings.HasSuffix(p, ".svg") {
			return exit.With(exit.BadInput, "--plot %s: the file must end in .png or .svg", p)
		}
	}
	nodes, rows, err := RunDesign(o.IO, st, st.Grid, o.Shard, "sweep")
	if err != nil {
		return err
	}
	inputs := []string{o.Study}
	if st.Model.File != o.Study {
		inputs = append(inputs, st.Model.File)
	}
	params := st.Grid.Params()
	var buf bytes.Buffer
	if err := study.WriteCSV(&buf, params, nodes, rows); err != nil {
		return err
	}
	if err := Emit(o.IO, o.Output, buf.Bytes(), inputs...); err != nil {
		return err
	}
	if o.JSON != "" {
		buf.Reset()
		if err := study.WriteJSON(&buf, st.Model.File, st.Model.Set, params, nodes, rows, viz.Caution); err != nil {
			return err
		}
		if err := pipeline.WriteFile(o.JSON, buf.Bytes(), inputs...); err != nil {
			return err
		}
	}
	for _, p := range o.Plot {
		data, err := Plot(st, nodes, rows, p)
		if err != nil {
			return err
		}
		if err := pipeline.WriteFile(p, data, inputs...); err != nil {
			return err
		}
	}
	return nil
}
