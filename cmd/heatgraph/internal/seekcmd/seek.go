// Package seekcmd implements "heatgraph seek".
package seekcmd

import (
	"bytes"
	"encoding/json"
	"fmt"
	"math"
	"strconv"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/pipeline"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/sensitivitycmd"
	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/study"
	"github.com/heatgraph/heatgraph/units"
	"github.com/heatgraph/heatgraph/viz"
	"github.com/spf13/cobra"
)

// Options are the inputs of the seek command.
type Options struct {
	IO        *iostreams.IOStreams
	Model     string
	Set       []string // overrides, PATH=VALUE
	Vary      string   // the parameter's path
	From, To  string   // the range, with units
	Tolerance string   // with units; default 1e-4 of the range
	Format    string   // text or json
	Output    string
}

// NewCmd returns the seek command.
func NewCmd(ios *iostreams.IOStreams, runF func(*Options) error) *cobra.Command {
	o := &Options{IO: ios}
	cmd := &cobra.Command{
		Use:   "seek MODEL --vary PATH --from VALUE --to VALUE",
		Short: "Find the value of one parameter at which the limits are just met",
		Long: `Find the value of one of the model's values (a path as for --set) between
--from and --to at which every limit just holds with the model's
required margin: the highest ambient temperature or power, the lowest
flow or fin area, and the node that limits it.

The worst margin (over every node with a limit, its margin less the
required margin) is a function of the value; Brent's method (1973) finds
where it crosses zero, solving the model at each value it tries. The
answer is the value nearest the crossing at which the limits hold, with
the width of the final bracket as its tolerance. When the limits hold (or
fail) at both ends, that is reported instead; when the margin crosses zero
more than once in the range, one crossing is found.

Exit status: 0 when a boundary was found or the limits hold over the whole
range, 1 when they fail at both ends, 2 for an invalid model or command
line, 3 when a solve found no solution, 4 when the report could not be
written.`,
		Example: "  heatgraph seek examples/outdoor-controller.yaml --vary ambient.temperature --from 20degC --to 80degC --set ambient.altitude=3000m\n" +
			"  heatgraph seek examples/heatsink-module.yaml --vary components.bridge-front.power --from 10W --to 200W",
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
	cmd.Flags().StringVar(&o.Vary, "vary", "", "the value to vary, a path as for --set (e.g. ambient.temperature)")
	cmd.Flags().StringVar(&o.From, "from", "", "one end of the range, with its unit (e.g. 20degC)")
	cmd.Flags().StringVar(&o.To, "to", "", "the other end of the range, with its unit (e.g. 80degC)")
	cmd.Flags().StringVar(&o.Tolerance, "tol", "", "width of the final bracket, with its unit (default: 1e-4 of the range)")
	cmd.Flags().StringVarP(&o.Format, "format", "f", "text", "report format: text, json")
	cmd.Flags().StringVarP(&o.Output, "output", "o", "", "write the report to this file instead of standard output")
	return cmd
}

// Run seeks and writes the report.
func Run(o *Options) error {
	if o.Format != "text" && o.Format != "json" {
		return exit.With(exit.BadInput, "--format %q is not a report format (use text, json)", o.Format)
	}
	if o.Vary == "" || o.From == "" || o.To == "" {
		return exit.With(exit.BadInput, "seek needs --vary PATH, --from VALUE and --to VALUE")
	}
	m, err := sensitivitycmd.Open(o.Model, o.Set)
	if err != nil {
		return err
	}
	q, err := m.Parameter(o.Vary)
	if err != nil {
		return exit.With(exit.BadInput, "--vary %v", err)
	}
	from, err := units.Parse(o.From, q.Kind)
	if err != nil {
		return exit.With(exit.BadInput, "--from: %v", err)
	}
	to, err := units.Parse(o.To, q.Kind)
	if err != nil {
		return exit.With(exit.BadInput, "--to: %v", err)
	}
	if from == to {
		return exit.With(exit.BadInput, "--from and --to are the same value")
	}
	tol := 1e-4 * math.Abs(to-from)
	if o.Tolerance != "" {
		kind := q.Kind
		if kind == units.Temperature {
			kind = units.TemperatureDifference
		}
		if tol, err = units.Parse(o.Tolerance, kind); err != nil || !(tol > 0) {
			return exit.With(exit.BadInput, "--tol %q: a positive %s is needed", o.Tolerance, kind)
		}
	}
	r, err := m.Seek(o.Vary, from, to, tol)
	if err != nil {
		return sensitivitycmd.Failed(o.Model, err)
	}
	var buf bytes.Buffer
	if o.Format == "json" {
		err = writeJSON(&buf, m, r)
	} else {
		writeText(&buf, m, r)
	}
	if err != nil {
		return err
	}
	if o.Output != "" {
		err = pipeline.WriteFile(o.Output, buf.Bytes(), o.Model)
	} else if _, werr := o.IO.Out.Write(buf.Bytes()); werr != nil {
		err = &exit.Error{Code: exit.OutputFailed, Err: fmt.Errorf("writing the report: %w", werr)}
	}
	if err != nil {
		return err
	}
	if r.Outcome == study.Fails {
		return exit.Silent(exit.LimitExceeded)
	}
	return nil
}

// show writes an SI value of q's kind for people: temperatures in degC.
func show(q network.Parameter, v float64) string {
	if q.Kind == units.Temperature {
		return strconv.FormatFloat(v-273.15, 'f', 4, 64) + " degC"
	}
	return q.Format(roundSig(v, 7))
}

// difference writes a difference of q's kind.
func difference(q network.Parameter, d float64) string {
	if q.Kind == units.Temperature {
		return fmt.Sprintf("%.2g K", d)
	}
	return q.Format(roundSig(d, 2))
}

func roundSig(v float64, n int) float64 {
	f, _ := strconv.ParseFloat(strconv.FormatFloat(v, 'g', n, 64), 64)
	return f
}

func writeText(buf *bytes.Buffer, m *study.Model, r *study.SeekResult) {
	q := r.Param
	fmt.Fprintf(buf, "Seeking %s from %s to %s in %s\n", q.Path, show(q, r.From), show(q, r.To), m.File)
	for _, ov := range m.Set {
		fmt.Fprintf(buf, "with --set %s\n", ov)
	}
	margin := "its limit"
	if rm := marginOf(m); rm > 0 {
		margin = fmt.Sprintf("its limit with the required margin of %g K", rm)
	}
	switch r.Outcome {
	case study.Bounded:
		word := "highest"
		if !r.Highest {
			word = "lowest"
		}
		fmt.Fprintf(buf, "%s %s at which every node keeps %s: %s (within %s: the limits fail at %s)\n",
			word, q.Path, margin, show(q, r.Value), difference(q, r.Tolerance), show(q, r.Other))
		fmt.Fprintf(buf, "limiting node: %s, %.3g K from its limit less the required margin\n", r.Limiting, r.Slack)
	case study.Holds:
		fmt.Fprintf(buf, "every node keeps %s over the whole range; least room at %s: %s, %.3g K to spare\n", margin, show(q, r.Value), r.Limiting, r.Slack)
	case study.Fails:
		fmt.Fprintf(buf, "a limit fails at both ends of the range; at %s %s is %.3g K short\n", show(q, r.Value), r.Limiting, -r.Slack)
	}
	fmt.Fprintf(buf, "%d solves (Brent's method on the worst margin)\n\n%s\n", r.Solves, viz.Caution)
}

func marginOf(m *study.Model) float64 {
	for _, p := range m.Parameters() {
		if p.Path == "required_margin" {
			return p.Value
		}
	}
	return 0
}

func writeJSON(buf *bytes.Buffer, m *study.Model, r *study.SeekResult) error {
	doc := map[string]any{
		"model": m.File, "vary": r.Param.Path, "unit_si": r.Param.Kind.SIUnit(),
		"from_si": r.From, "to_si": r.To, "outcome": string(r.Outcome), "value_si": r.Value,
		"limiting_node": r.Limiting, "slack_K": r.Slack, "solves": r.Solves, "method": "Brent (1973)",
		"caution": viz.Caution,
	}
	if r.Outcome == study.Bounded {
		doc["failing_value_si"] = r.Other
		doc["tolerance_si"] = r.Tolerance
		doc["direction"] = map[bool]string{true: "highest", false: "lowest"}[r.Highest]
	}
	var set []string
	for _, ov := range m.Set {
		set = append(set, ov.String())
	}
	if len(set) > 0 {
		doc["set"] = set
	}
	enc := json.NewEncoder(buf)
	enc.SetIndent("", "  ")
	return enc.Encode(doc)
}
