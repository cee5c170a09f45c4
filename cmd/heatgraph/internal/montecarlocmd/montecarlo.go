// Package montecarlocmd implements "heatgraph montecarlo".
package montecarlocmd

import (
	"bytes"
	"encoding/json"
	"fmt"
	"os"
	"text/tabwriter"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/pipeline"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/sweepcmd"
	"github.com/heatgraph/heatgraph/study"
	"github.com/heatgraph/heatgraph/viz"
	"github.com/spf13/cobra"
)

// Options are the inputs of the montecarlo command.
type Options struct {
	IO      *iostreams.IOStreams
	Study   string
	Set     []string
	Output  string // the samples, CSV
	JSON    string // the summary, JSON
	Shard   string
	Table   string // summarize this table instead of sampling
	Summary bool   // print the summary (default; off for a shard)
}

// NewCmd returns the montecarlo command.
func NewCmd(ios *iostreams.IOStreams, runF func(*Options) error) *cobra.Command {
	o := &Options{IO: ios}
	cmd := &cobra.Command{
		Use:   "montecarlo STUDY",
		Short: "Propagate tolerances: sample the values of a study file and summarize",
		Long: `Draw the values of a study file's montecarlo: section from their
distributions (normal, uniform, triangular), solve the model for every
sample in parallel over the cores, and summarize every junction and every
node with a limit: the 5th, 50th and 95th percentiles of its temperature,
its mean and standard deviation, and the probability of exceeding its
limit with its Wilson score interval (95 %).

Sample i draws from a PCG generator seeded with the study's seed and i, so
that the samples do not depend on the number of cores or shards. With
--shard i/n only the samples whose index is i modulo n are drawn and
written (-o); 'heatgraph merge' joins the shards' tables and
'heatgraph montecarlo STUDY --table merged.csv' summarizes the whole.

Exit status: 0, 2 for an invalid study, model or command line, 4 when a
result could not be written. Samples without a result (a drawn value the
model refuses, such as a negative area, or no solution) are counted and
left out of the statistics.`,
		Example: "  heatgraph montecarlo examples/studies/tolerances.yaml -o samples.csv",
		Args:    cobra.ExactArgs(1),
		RunE: func(_ *cobra.Command, args []string) error {
			o.Study = args[0]
			if runF != nil {
				return runF(o)
			}
			return Run(o)
		},
	}
	cmd.Flags().StringArrayVar(&o.Set, "set", nil, pipeline.SetHelp)
	cmd.Flags().StringVarP(&o.Output, "output", "o", "", "write every sample (values, temperatures, margins) to this CSV file")
	cmd.Flags().StringVar(&o.JSON, "json", "", "write the summary as JSON to this file")
	cmd.Flags().StringVar(&o.Shard, "shard", "", "draw shard i of n, i/n with 0 ≤ i < n (needs -o; no summary)")
	cmd.Flags().StringVar(&o.Table, "table", "", "summarize the samples of this CSV table (a merge of shards) instead of drawing them")
	return cmd
}

// Run samples (or reads the samples) and writes the outputs.
func Run(o *Options) error {
	st, err := sweepcmd.ReadStudy(o.Study, o.Set)
	if err != nil {
		return err
	}
	if st.Sampling == nil {
		return exit.With(exit.BadInput, "%s: the study has no montecarlo: section (for a sweep: use 'heatgraph sweep')", o.Study)
	}
	if o.Shard != "" && o.Output == "" {
		return exit.With(exit.BadInput, "--shard needs -o for the shard's samples")
	}
	if o.Shard != "" && o.Table != "" {
		return exit.With(exit.BadInput, "give --shard or --table, not both")
	}
	inputs := []string{o.Study, st.Model.File}
	var nodes []study.Node
	var rows []study.Row
	if o.Table != "" {
		nodes, _, err = st.Model.Nodes()
		if err != nil {
			return &exit.Error{Code: exit.BadInput, Err: err}
		}
		data, err := os.ReadFile(o.Table)
		if err != nil {
			return exit.With(exit.BadInput, "%v", err)
		}
		if rows, err = study.ReadCSV(data, nodes); err != nil {
			return exit.With(exit.BadInput, "%s: %v", o.Table, err)
		}
		inputs = append(inputs, o.Table)
	} else {
		nodes, rows, err = sweepcmd.RunDesign(o.IO, st, st.Sampling, o.Shard, "samples")
		if err != nil {
			return err
		}
	}
	if o.Output != "" {
		var buf bytes.Buffer
		if err := study.WriteCSV(&buf, st.Sampling.Params(), nodes, rows); err != nil {
			return err
		}
		if err := pipeline.WriteFile(o.Output, buf.Bytes(), inputs...); err != nil {
			return err
		}
	}
	if o.Shard != "" {
		return nil
	}
	stats, failed := study.Summarize(nodes, rows)
	if o.JSON != "" {
		var buf bytes.Buffer
		if err := writeJSON(&buf, st, stats, len(rows), failed); err != nil {
			return err
		}
		if err := pipeline.WriteFile(o.JSON, buf.Bytes(), inputs...); err != nil {
			return err
		}
	}
	var buf bytes.Buffer
	writeText(&buf, st, stats, len(rows), failed)
	if _, err := o.IO.Out.Write(buf.Bytes()); err != nil {
		return &exit.Error{Code: exit.OutputFailed, Err: fmt.Errorf("writing the summary: %w", err)}
	}
	return nil
}

func c(k float64) float64 { return k - 273.15 }

func writeText(buf *bytes.Buffer, st *study.Study, stats []study.NodeStats, n, failed int) {
	s := st.Sampling
	fmt.Fprintf(buf, "Monte Carlo: %s, %d samples (seed %d), %d without a result (a value the model refuses, or no solution)\n", st.Model.File, n, s.Seed, failed)
	for _, d := range s.Dists {
		switch d.Kind {
		case "normal":
			fmt.Fprintf(buf, "  %s: normal, mean %s, σ %g %s\n", d.Param.Path, d.Param.Format(d.Mean), d.Sigma, d.Param.Kind.SIUnit())
		case "uniform":
			fmt.Fprintf(buf, "  %s: uniform from %s to %s\n", d.Param.Path, d.Param.Format(d.Low), d.Param.Format(d.High))
		case "triangular":
			fmt.Fprintf(buf, "  %s: triangular, %s, mode %s, %s\n", d.Param.Path, d.Param.Format(d.Low), d.Param.Format(d.Mode), d.Param.Format(d.High))
		}
	}
	fmt.Fprintln(buf)
	tw := tabwriter.NewWriter(buf, 0, 0, 2, ' ', tabwriter.AlignRight)
	fmt.Fprintln(tw, "node\tmean degC\tσ K\tP5 degC\tP50 degC\tP95 degC\tlimit degC\tP(over)\t95 % interval (Wilson)\t")
	for _, x := range stats {
		limit, p, ci := "-", "-", "-"
		if x.Node.HasLimit {
			limit = fmt.Sprintf("%.2f", c(x.Node.Limit))
			p = fmt.Sprintf("%.4f", x.Probability)
			ci = fmt.Sprintf("%.4f – %.4f", x.Lower, x.Higher)
		}
		fmt.Fprintf(tw, "%s\t%.2f\t%.3f\t%.2f\t%.2f\t%.2f\t%s\t%s\t%s\t\n", x.Node.ID, c(x.Mean), x.StdDev, c(x.P5), c(x.P50), c(x.P95), limit, p, ci)
	}
	tw.Flush()
	fmt.Fprintf(buf, "\n%s\n", viz.Caution)
}

func writeJSON(buf *bytes.Buffer, st *study.Study, stats []study.NodeStats, n, failed int) error {
	type jn struct {
		ID     string   `json:"id"`
		N      int      `json:"samples"`
		Mean   float64  `json:"mean_degC"`
		Std    float64  `json:"stddev_K"`
		P5     float64  `json:"p5_degC"`
		P50    float64  `json:"p50_degC"`
		P95    float64  `json:"p95_degC"`
		Limit  *float64 `json:"limit_degC,omitempty"`
		Exceed *int     `json:"over,omitempty"`
		P      *float64 `json:"p_over,omitempty"`
		Lo     *float64 `json:"p_over_low95,omitempty"`
		Hi     *float64 `json:"p_over_high95,omitempty"`
	}
	doc := struct {
		Model   string `json:"model"`
		Samples int    `json:"samples"`
		Seed    uint64 `json:"seed"`
		Failed  int    `json:"without_solution"`
		Nodes   []jn   `json:"nodes"`
		Caution string `json:"caution"`
	}{Model: st.Model.File, Samples: n, Seed: st.Sampling.Seed, Failed: failed, Caution: viz.Caution}
	for _, x := range stats {
		j := jn{ID: x.Node.ID, N: x.N, Mean: c(x.Mean), Std: x.StdDev, P5: c(x.P5), P50: c(x.P50), P95: c(x.P95)}
		if x.Node.HasLimit {
			x := x
			l := c(x.Node.Limit)
			j.Limit, j.Exceed, j.P, j.Lo, j.Hi = &l, &x.Exceed, &x.Probability, &x.Lower, &x.Higher
		}
		doc.Nodes = append(doc.Nodes, j)
	}
	enc := json.NewEncoder(buf)
	enc.SetIndent("", "  ")
	return enc.Encode(doc)
}
