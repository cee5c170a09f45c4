package viz

import (
	"fmt"
	"io"
	"math"
	"sort"
	"strconv"
	"strings"

	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/network"
)

// Order is how the text report sorts nodes.
type Order string

// Node orders for the text report.
const (
	ByFile        Order = "file"        // as in the model file
	ByMargin      Order = "margin"      // smallest margin first, nodes without a limit last
	ByTemperature Order = "temperature" // hottest first
)

// Orders lists the valid orders.
var Orders = []Order{ByFile, ByMargin, ByTemperature}

// WriteText writes the human-readable report of a solution.
func WriteText(w io.Writer, sol *network.Solution, run Run, order Order) error {
	tw := &textWriter{w: w}
	m := sol.Net.Model
	title := m.Title
	if title == "" {
		title = m.File
	}
	tw.printf("%s\n", title)
	tw.printf("model %s; ambient %.2f °C, %s\n", m.File, celsius(m.Ambient.Temperature), pressureText(m.Ambient))
	tw.printf("solved in %d Newton iterations", run.Iterations)
	if run.LinearIterations > 0 {
		tw.printf(" (%d iterations of the linear solver)", run.LinearIterations)
	}
	if run.Worst != "" {
		// Converged means every balance is within 1e-9 of the flows that
		// meet in it, or within the round-off of its terms; the fraction
		// alone would make round-off at a node that carries next to
		// nothing look large.
		tw.printf("; worst remaining imbalance %.2g %s, in the %s", run.Residual, run.WorstUnit, run.Worst)
	}
	tw.printf("\n")
	if len(run.Kinds) > 1 {
		for _, k := range run.Kinds {
			tw.printf("  %s: %s, last step %.2g %s, largest %s residual %.2g %s\n",
				k.Name, countOf(k.Unknowns, "unknown"), k.Step, k.Unit, k.Equation, k.Residual, k.EquationUnit)
		}
	}
	tw.printf("\n")

	nodes := sortNodes(sol.Nodes, order)
	idw := len("node")
	for _, n := range nodes {
		idw = max(idw, len(n.ID))
	}
	tw.printf("%-*s  %-8s  %9s  %9s  %9s  %9s  %s\n", idw, "node", "kind", "T [°C]", "power [W]", "limit [°C]", "margin [K]", "status")
	for _, n := range nodes {
		input, limit, margin := "", "", ""
		if n.Power != 0 {
			input = fnum("%.3f", n.Power)
		}
		if n.HasLimit {
			limit = fnum("%.2f", celsius(n.Limit))
			margin = fnum("%+.2f", n.Margin)
		}
		tw.printf("%-*s  %-8s  %9s  %9s  %10s  %10s  %s\n", idw, n.ID, n.Kind, fnum("%.2f", celsius(n.Temperature)), input, limit, margin, statusText(n.Status))
	}

	idw = len("link")
	kw := len("kind")
	for _, l := range sol.Links {
		idw = max(idw, len(l.ID))
		kw = max(kw, len(l.Kind))
	}
	tw.printf("\n%-*s  %-*s  %10s  %s\n", idw, "link", kw, "kind", "heat [W]", "from → to (positive heat flows this way)")
	plates := plateNodes(sol)
	for _, l := range sol.Links {
		if plates[l.From] {
			// A plate's joins are listed with the plate, below.
			out := 0.0
			for _, p := range l.Paths {
				out += p.Heat
			}
			tw.printf("%-*s  %-*s  %10s  %s → its %d joins (see plates below)\n", idw, l.ID, kw, l.Kind, fnum("%.3f", noNegZero(out, 3)), l.From, len(l.Paths))
			continue
		}
		tw.printf("%-*s  %-*s  %10s  %s → %s", idw, l.ID, kw, l.Kind, fnum("%.3f", noNegZero(l.Heat, 3)), l.From, l.To)
		for _, p := range l.Paths[min(1, len(l.Paths)):] {
			if p.Heat == 0 || noNegZero(p.Heat, 3) == 0 {
				continue // air that brings nothing (from ambient) is no path
			}
			how := ""
			if p.Carried {
				how = " carried by the air"
			}
			tw.printf("; %s W%s %s → %s", fnum("%.3f", noNegZero(p.Heat, 3)), how, p.From, p.To)
		}
		tw.printf("\n")
	}

	writeDetails(tw, sol)
	writeAirflow(tw, sol)
	writePlates(tw, sol)

	b := sol.Balance
	tw.printf("\nenergy balance [W]\n")
	tw.printf("  heat in                %12s\n", fnum("%.4f", b.In))
	if b.Environment != 0 {
		tw.printf("  from the environment   %12s\n", fnum("%.4f", b.Environment))
	}
	for _, o := range b.Out {
		if o.Heat != 0 {
			tw.printf("  out through %-10s %12s\n", o.Node, fnum("%.4f", o.Heat))
		}
	}
	tw.printf("  imbalance              %12s\n", fnum("%.3g", b.Imbalance))

	warnings := append(append([]string(nil), sol.Warnings...), NonFinite(sol)...)
	if len(warnings) > 0 {
		tw.printf("\nwarnings\n")
		for _, warn := range warnings {
			tw.printf("  - %s\n", warn)
		}
	}
	tw.printf("\n%s\n", Verdict(sol))
	tw.printf("\n%s\n", wrap(Caution, 100))
	return tw.err
}

// writeDetails lists, for every link whose heat comes from a correlation,
// the quantities behind it, so that each coefficient can be traced and
// checked by hand.
func writeDetails(tw *textWriter, sol *network.Solution) {
	first := true
	plates := plateNodes(sol)
	for _, l := range sol.Links {
		var texts []string
		var nums []string
		for _, d := range l.Details {
			switch {
			case d.Text != "":
				texts = append(texts, d.Text)
			default:
				nums = append(nums, detailText(d))
			}
		}
		if len(texts) == 0 || plates[l.From] {
			continue
		}
		if first {
			tw.printf("\ncorrelations (each link's coefficient and what it rests on)\n")
			first = false
		}
		tw.printf("  %s (%s): %s\n", l.ID, l.Kind, strings.Join(texts, "; "))
		tw.printf("%s\n", wrapItems(nums, 94, "      "))
	}
}

// detailText formats one numeric detail as "name value unit".
func detailText(d elements.Detail) string {
	name := strings.ReplaceAll(d.Name, "_", " ")
	unit := d.Unit
	if unit == "degC" {
		unit = "°C"
	}
	if !finite(d.Value) {
		return name + " not finite (see warnings)"
	}
	v := strconv.FormatFloat(d.Value, 'g', 4, 64)
	if unit == "" {
		return name + " " + v
	}
	return name + " " + v + " " + unit
}

// fnum formats x with verb, or says "not finite" (a warning explains).
func fnum(verb string, x float64) string {
	if !finite(x) {
		return "not finite"
	}
	return fmt.Sprintf(verb, x)
}

// wrapItems joins items with ", " into lines of at most width bytes after
// prefix, never breaking an item.
func wrapItems(items []string, width int, prefix string) string {
	var b strings.Builder
	line := 0
	for i, it := range items {
		switch {
		case i == 0:
			b.WriteString(prefix)
		case line+2+len(it) > width:
			b.WriteString(",\n" + prefix)
			line = 0
		default:
			b.WriteString(", ")
			line += 2
		}
		b.WriteString(it)
		line += len(it)
	}
	return b.String()
}

// noNegZero returns x, or zero when x would print as -0 with the given
// number of decimals.
func noNegZero(x float64, decimals int) float64 {
	if math.Abs(x) < 0.5*math.Pow(10, -float64(decimals)) {
		return 0
	}
	return x
}

// Verdict summarises the limit checks in one line.
func Verdict(sol *network.Solution) string {
	var over, tight []string
	checked := 0
	for _, n := range sol.Nodes {
		switch n.Status {
		case network.Over:
			over = append(over, fmt.Sprintf("%s (%+.2f K)", n.ID, n.Margin))
		case network.Tight:
			tight = append(tight, fmt.Sprintf("%s (%+.2f K)", n.ID, n.Margin))
		}
		if n.HasLimit {
			checked++
		}
	}
	var parts []string
	switch {
	case checked == 0:
		parts = append(parts, "no node has a limit to check")
	case len(over) > 0:
		parts = append(parts, fmt.Sprintf("OVER LIMIT: %s", strings.Join(over, ", ")))
	default:
		parts = append(parts, limitsHold(checked))
	}
	if len(tight) > 0 {
		parts = append(parts, fmt.Sprintf("below the required margin of %.1f K: %s", sol.Net.Model.RequiredMargin, strings.Join(tight, ", ")))
	}
	return strings.Join(parts, "; ")
}

// limitsHold says that every one of n checked limits holds.
func limitsHold(n int) string {
	if n == 1 {
		return "the 1 limit holds"
	}
	return fmt.Sprintf("all %d limits hold", n)
}

func statusText(s network.Status) string {
	switch s {
	case network.Over:
		return "OVER"
	case network.NoLimit:
		return "-"
	}
	return string(s)
}

func pressureText(a network.Ambient) string {
	if a.FromAlt {
		return fmt.Sprintf("%.2f kPa (standard atmosphere at %.0f m)", a.Pressure/1000, a.Altitude)
	}
	return fmt.Sprintf("%.2f kPa", a.Pressure/1000)
}

func sortNodes(nodes []network.NodeResult, order Order) []network.NodeResult {
	out := append([]network.NodeResult(nil), nodes...)
	switch order {
	case ByMargin:
		sort.SliceStable(out, func(i, j int) bool {
			a, b := out[i], out[j]
			if a.HasLimit != b.HasLimit {
				return a.HasLimit
			}
			return a.HasLimit && a.Margin < b.Margin
		})
	case ByTemperature:
		sort.SliceStable(out, func(i, j int) bool { return out[i].Temperature > out[j].Temperature })
	}
	return out
}

// wrap breaks text into lines of at most width bytes at spaces.
func wrap(text string, width int) string {
	var b strings.Builder
	line := 0
	for i, word := range strings.Fields(text) {
		if i > 0 {
			if line+1+len(word) > width {
				b.WriteByte('\n')
				line = 0
			} else {
				b.WriteByte(' ')
				line++
			}
		}
		b.WriteString(word)
		line += len(word)
	}
	return b.String()
}

// textWriter remembers the first write error so that the report code can
// stay linear.
type textWriter struct {
	w   io.Writer
	err error
}

func (t *textWriter) printf(format string, args ...any) {
	if t.err == nil {
		_, t.err = fmt.Fprintf(t.w, format, args...)
	}
}
