// Package sensitivitycmd implements "heatgraph sensitivity".
package sensitivitycmd

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"strings"
	"text/tabwriter"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/pipeline"
	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/study"
	"github.com/heatgraph/heatgraph/viz"
	"github.com/spf13/cobra"
)

// Options are the inputs of the sensitivity command.
type Options struct {
	IO    *iostreams.IOStreams
	Model string
	Set   []string // overrides, PATH=VALUE
	Nodes []string // outputs to report; all when empty
	Top   int      // parameters per output; 0 for all
	// Samples, when positive, also samples the correlations' accuracy by
	// Monte Carlo with this many samples, from Seed.
	Samples int
	Seed    uint64
	Format  string // text or json
	Output  string
}

// NewCmd returns the sensitivity command.
func NewCmd(ios *iostreams.IOStreams, runF func(*Options) error) *cobra.Command {
	o := &Options{IO: ios}
	cmd := &cobra.Command{
		Use:   "sensitivity MODEL",
		Short: "Rank the model's values by their effect on each limited temperature",
		Long: `Solve the model, then compute how every temperature with a limit, and every
component's junction, changes with each numeric value of the model (every
value --set can address: powers, resistances, geometry, coefficients,
flows, the ambient), and rank the values by their effect.

The derivatives come from the adjoint method at the solution: one
transpose solve with the Jacobian per temperature; the change of the
balances with each value is a central difference at the solution, with the
value changed as by --set and the network rebuilt (no solve). The
"change" column is the first-order change of the temperature for a 10 %
change of the value (10 K for a temperature), up or down.

Exit status: 0, 2 for an invalid model or command line, 3 when the model
has no solution, 4 when the report could not be written.`,
		Example: "  heatgraph sensitivity examples/outdoor-controller.yaml --node cpu --top 5\n" +
			"  heatgraph sensitivity examples/outdoor-controller.yaml --set ambient.altitude=3000m --format json",
		Args: cobra.ExactArgs(1),
		RunE: func(_ *cobra.Command, args []string) error {
			o.Model = args[0]
			if runF != nil {
				return runF(o)
			}
			return Run(o)
		},
	}
	cmd.Flags().StringArrayVar(&o.Set, "set", nil, pipeline.SetHelp)
	cmd.Flags().StringArrayVar(&o.Nodes, "node", nil, "report this node only (repeatable); default: every node with a limit and every junction")
	cmd.Flags().IntVar(&o.Top, "top", 10, "list this many values per node, the largest effect first (0: all)")
	cmd.Flags().IntVar(&o.Samples, "correlation-samples", 0, "also sample the correlations' accuracy by Monte Carlo with this many samples (text report)")
	cmd.Flags().Uint64Var(&o.Seed, "seed", 1, "seed of --correlation-samples")
	cmd.Flags().StringVarP(&o.Format, "format", "f", "text", "report format: text, json")
	cmd.Flags().StringVarP(&o.Output, "output", "o", "", "write the report to this file instead of standard output")
	return cmd
}

// Run computes and writes the sensitivities.
func Run(o *Options) error {
	if o.Format != "text" && o.Format != "json" {
		return exit.With(exit.BadInput, "--format %q is not a report format (use text, json)", o.Format)
	}
	if o.Top < 0 {
		return exit.With(exit.BadInput, "--top must be 0 (all) or more")
	}
	m, err := Open(o.Model, o.Set)
	if err != nil {
		return err
	}
	s, err := m.Sensitivity()
	if err != nil {
		return Failed(o.Model, err)
	}
	outputs, err := choose(s, o.Nodes)
	if err != nil {
		return err
	}
	bands, err := study.AccuracyAt(s.Point)
	if err != nil {
		return Failed(o.Model, err)
	}
	byNode := map[string]study.Band{}
	for _, b := range bands {
		byNode[b.Output.Node] = b
	}
	var buf bytes.Buffer
	if o.Format == "json" {
		err = writeJSON(&buf, m, s, outputs, o.Top, byNode)
	} else {
		var sampled bytes.Buffer
		if o.Samples > 0 {
			if err := writeSamples(&sampled, m, o.Samples, o.Seed); err != nil {
				return err
			}
		}
		err = writeText(&buf, m, s, outputs, o.Top, byNode, sampled.String())
	}
	if err != nil {
		return err
	}
	if o.Output != "" {
		return pipeline.WriteFile(o.Output, buf.Bytes(), o.Model)
	}
	if _, err := o.IO.Out.Write(buf.Bytes()); err != nil {
		return &exit.Error{Code: exit.OutputFailed, Err: fmt.Errorf("writing the report: %w", err)}
	}
	return nil
}

// Open opens a model for a study, with the command's exit codes.
func Open(path string, sets []string) (*study.Model, error) {
	ovs, err := network.ParseOverrides(sets)
	if err != nil {
		return nil, &exit.Error{Code: exit.BadInput, Err: err}
	}
	m, err := study.Open(path, ovs)
	if err != nil {
		return nil, pipeline.BadInput(err, path)
	}
	return m, nil
}

// Failed maps a study's error to an exit code: an invalid model (from an
// override) is bad input, anything else a model without a solution.
func Failed(path string, err error) error {
	var ps network.Problems
	if errors.As(err, &ps) {
		return &exit.Error{Code: exit.BadInput, Err: ps}
	}
	return &exit.Error{Code: exit.NotConverged, Err: fmt.Errorf("%s: %w", path, err)}
}

func choose(s *study.Sensitivities, nodes []string) ([]int, error) {
	if len(nodes) == 0 {
		out := make([]int, len(s.Outputs))
		for i := range out {
			out[i] = i
		}
		return out, nil
	}
	var names []string
	for _, o := range s.Outputs {
		names = append(names, o.Node)
	}
	var out []int
	for _, n := range nodes {
		found := false
		for i, o := range s.Outputs {
			if o.Node == n {
				out, found = append(out, i), true
			}
		}
		if !found {
			return nil, exit.With(exit.BadInput, "--node %q: not a node with a limit or a junction (these are: %s)", n, strings.Join(names, ", "))
		}
	}
	return out, nil
}

func degC(k float64) float64 { return k - 273.15 }

// SlopeUnit is the unit of ∂T/∂p for a parameter of SI unit u.
func SlopeUnit(u string) string {
	switch {
	case u == "":
		return "K"
	case u == "K":
		return "K/K"
	case strings.ContainsAny(u, "/*·"):
		return "K/(" + u + ")"
	}
	return "K/" + u
}

// StepText describes the step of an effect: "10 %" or "10 K".
func StepText(q network.Parameter) string {
	if q.Kind.SIUnit() == "K" && q.Kind.String() == "temperature" {
		return "10 K"
	}
	return "10 %"
}

func writeText(buf *bytes.Buffer, m *study.Model, s *study.Sensitivities, outputs []int, top int, bands map[string]study.Band, sampled string) error {
	title := s.Point.Net.Model.Title
	if title == "" {
		title = m.File
	}
	fmt.Fprintf(buf, "What matters most: %s (%s)\n", title, m.File)
	for _, ov := range m.Set {
		fmt.Fprintf(buf, "with --set %s\n", ov)
	}
	fmt.Fprintf(buf, "%d values; %s method at the solution, ∂F/∂p by central differences of the balances (step %g of each value, network rebuilt, no solve)\n",
		len(s.Params), s.Method, study.RelativeStep)
	fmt.Fprintln(buf, "change: first-order change of the temperature with the value up by the step, 10 % (10 K for a temperature); down by as much, the same with the other sign")
	for _, k := range outputs {
		o := s.Outputs[k]
		fmt.Fprintf(buf, "\n%s (%s): %.2f degC", o.Node, o.Kind, degC(o.Temperature))
		if o.HasLimit {
			fmt.Fprintf(buf, ", limit %.2f degC, margin %.2f K", degC(o.Limit), o.Margin)
		}
		fmt.Fprintln(buf)
		tw := tabwriter.NewWriter(buf, 0, 0, 2, ' ', 0)
		fmt.Fprintln(tw, "  rank\tvalue\tis\tdT/dp\tstep\tchange (value up)")
		for i, e := range s.Ranking(k) {
			if top > 0 && i >= top {
				break
			}
			name := e.Param.Path
			if len(e.Param.Also) > 0 {
				name += " (with " + strings.Join(e.Param.Also, ", ") + ")"
			}
			fmt.Fprintf(tw, "  %d\t%s\t%s\t%.4g %s\t+%s\t%+.3g K\n", i+1, name, e.Param.Text, e.Slope,
				SlopeUnit(e.Param.Kind.SIUnit()), StepText(e.Param), e.Change)
		}
		tw.Flush()
		if b, ok := bands[o.Node]; ok && len(b.Contributions) > 0 {
			fmt.Fprintf(buf, "  from the correlations' stated accuracy: ±%.2f K (first order, independent errors combined root-sum-square); largest:\n", b.HalfWidthK)
			for i, c := range b.Contributions {
				if i == 3 {
					break
				}
				fmt.Fprintf(buf, "    %s (%s) ±%.0f %% of h: %+.2f K for h high — %s\n", c.Link, c.Kind, 100*c.Accuracy, c.DeltaK, c.Source)
			}
		}
	}
	if len(s.Skipped) > 0 {
		fmt.Fprintln(buf, "\nnot varied (the model is not valid with the value changed alone):")
		for _, sk := range s.Skipped {
			fmt.Fprintf(buf, "  %s: %s\n", sk.Param.Path, sk.Reason)
		}
	}
	buf.WriteString(sampled)
	fmt.Fprintf(buf, "\n%s\n", viz.Caution)
	return nil
}

type jsonEffect struct {
	Path   string   `json:"path"`
	Also   []string `json:"also,omitempty"`
	Value  string   `json:"value"`
	SI     float64  `json:"value_si"`
	Unit   string   `json:"unit_si"`
	Slope  float64  `json:"dT_dp"`
	SUnit  string   `json:"dT_dp_unit"`
	Step   float64  `json:"step_si"`
	Change float64  `json:"change_K"`
}

type jsonOutput struct {
	Node     string       `json:"node"`
	Kind     string       `json:"kind"`
	T        float64      `json:"temperature_degC"`
	Limit    *float64     `json:"limit_degC,omitempty"`
	Margin   *float64     `json:"margin_K,omitempty"`
	Rankings []jsonEffect `json:"ranking"`
	// BandK is the half-width of the band the correlations' stated
	// accuracies give the temperature, K (first order, root-sum-square).
	BandK        *float64           `json:"correlation_band_K,omitempty"`
	Correlations []jsonContribution `json:"correlation_contributions,omitempty"`
}

type jsonContribution struct {
	Link     string  `json:"link"`
	Kind     string  `json:"kind"`
	Accuracy float64 `json:"accuracy"`
	Source   string  `json:"source"`
	DeltaK   float64 `json:"change_K"`
}

func writeJSON(buf *bytes.Buffer, m *study.Model, s *study.Sensitivities, outputs []int, top int, bands map[string]study.Band) error {
	doc := struct {
		Model   string            `json:"model"`
		Set     []string          `json:"set,omitempty"`
		Method  string            `json:"method"`
		Step    float64           `json:"relative_step"`
		Outputs []jsonOutput      `json:"outputs"`
		Skipped map[string]string `json:"not_varied,omitempty"`
		Caution string            `json:"caution"`
	}{Model: m.File, Method: s.Method, Step: study.RelativeStep, Caution: viz.Caution}
	for _, ov := range m.Set {
		doc.Set = append(doc.Set, ov.String())
	}
	for _, k := range outputs {
		o := s.Outputs[k]
		jo := jsonOutput{Node: o.Node, Kind: string(o.Kind), T: degC(o.Temperature), Rankings: []jsonEffect{}}
		if o.HasLimit {
			l, mg := degC(o.Limit), o.Margin
			jo.Limit, jo.Margin = &l, &mg
		}
		for i, e := range s.Ranking(k) {
			if top > 0 && i >= top {
				break
			}
			jo.Rankings = append(jo.Rankings, jsonEffect{Path: e.Param.Path, Also: e.Param.Also, Value: e.Param.Text, SI: e.Param.Value,
				Unit: e.Param.Kind.SIUnit(), Slope: e.Slope, SUnit: SlopeUnit(e.Param.Kind.SIUnit()), Step: e.Step, Change: e.Change})
		}
		if b, ok := bands[o.Node]; ok && len(b.Contributions) > 0 {
			w := b.HalfWidthK
			jo.BandK = &w
			for _, c := range b.Contributions {
				jo.Correlations = append(jo.Correlations, jsonContribution{Link: c.Link, Kind: c.Kind, Accuracy: c.Accuracy, Source: c.Source, DeltaK: c.DeltaK})
			}
		}
		doc.Outputs = append(doc.Outputs, jo)
	}
	if len(s.Skipped) > 0 {
		doc.Skipped = map[string]string{}
		for _, sk := range s.Skipped {
			doc.Skipped[sk.Param.Path] = sk.Reason
		}
	}
	enc := json.NewEncoder(buf)
	enc.SetIndent("", "  ")
	return enc.Encode(doc)
}

// writeSamples samples the correlations' accuracy and prints each output's
// spread beside its first-order band.
func writeSamples(buf *bytes.Buffer, m *study.Model, n int, seed uint64) error {
	cs, err := m.CorrelationMonteCarlo(n, seed)
	if err != nil {
		return Failed(m.File, err)
	}
	fmt.Fprintf(buf, "\nthe correlations' accuracy sampled: %d samples (seed %d), each coefficient times 1 + z·u/2 (the stated ±u taken as two standard deviations)\n", n, seed)
	tw := tabwriter.NewWriter(buf, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "  node	solved	P5 [degC]	P50 [degC]	P95 [degC]	σ [K]	first-order σ [K]")
	for _, c := range cs {
		fmt.Fprintf(tw, "  %s	%d	%.2f	%.2f	%.2f	%.3f	%.3f\n", c.Output.Node, c.N, degC(c.P5), degC(c.P50), degC(c.P95), c.StdDev, c.FirstOrderSig)
	}
	return tw.Flush()
}
