package viz

import (
	"encoding/json"
	"fmt"
	"math"
	"strings"

	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/network"
)

// A solution can hold numbers that are not finite: an infinite resistance
// from a vanishing conductance, an infinite friction factor at zero flow.
// No report prints such a number as if it were one. JSON has no way to
// write them: a detail whose value is not finite is left out of the
// link's details, any other field is written as null. The text report
// prints "not finite" for such a detail, and a CSV cell stays empty. In
// every case a warning names the item and the quantity (NonFinite).

// finite reports whether x is a finite number.
func finite(x float64) bool { return !math.IsInf(x, 0) && !math.IsNaN(x) }

// Number is a float64 that JSON writes as null when it is not finite.
type Number float64

// MarshalJSON writes the number, or null when it is not finite.
func (n Number) MarshalJSON() ([]byte, error) {
	if !finite(float64(n)) {
		return []byte("null"), nil
	}
	return json.Marshal(float64(n))
}

// UnmarshalJSON reads a number, or null as NaN.
func (n *Number) UnmarshalJSON(b []byte) error {
	if string(b) == "null" {
		*n = Number(math.NaN())
		return nil
	}
	var f float64
	if err := json.Unmarshal(b, &f); err != nil {
		return err
	}
	*n = Number(f)
	return nil
}

func num(x float64) *Number {
	n := Number(x)
	return &n
}

// nonFiniteWarning says that quantity of item is not a finite number.
func nonFiniteWarning(item, quantity string, x float64, fate string) string {
	return fmt.Sprintf("%s: %s is %s, not a finite number; %s", item, quantity, valueWord(x), fate)
}

func valueWord(x float64) string {
	switch {
	case math.IsInf(x, 1):
		return "infinite"
	case math.IsInf(x, -1):
		return "negatively infinite"
	}
	return "undefined (NaN)"
}

// detailWarning is the warning for a detail of link id that is not finite.
func detailWarning(id string, d elements.Detail) string {
	return nonFiniteWarning("link "+id, strings.ReplaceAll(d.Name, "_", " "), d.Value, "it is not reported")
}

// NonFinite returns a warning for every number of a solution that is not
// finite, naming the node, link or boundary and the quantity.
func NonFinite(sol *network.Solution) []string {
	var w []string
	check := func(item, quantity string, x float64) {
		if !finite(x) {
			w = append(w, nonFiniteWarning(item, quantity, x, "its value is left out"))
		}
	}
	for _, n := range sol.Nodes {
		item := "node " + n.ID
		check(item, "temperature", n.Temperature)
		check(item, "heat input", n.Power)
		if n.HasLimit {
			check(item, "limit", n.Limit)
			check(item, "margin", n.Margin)
		}
	}
	for _, l := range sol.Links {
		item := "link " + l.ID
		check(item, "heat", l.Heat)
		for _, p := range l.Paths[min(1, len(l.Paths)):] {
			check(item, "heat from "+p.From+" to "+p.To, p.Heat)
		}
		for _, d := range l.Details {
			if d.Text == "" && !finite(d.Value) {
				w = append(w, detailWarning(l.ID, d))
			}
		}
	}
	for i := range sol.Plates {
		w = append(w, plateWarnings(&sol.Plates[i])...)
	}
	check("energy balance", "heat in", sol.Balance.In)
	check("energy balance", "imbalance", sol.Balance.Imbalance)
	for _, o := range sol.Balance.Out {
		check("energy balance", "heat out through "+o.Node, o.Heat)
	}
	return w
}

// runWarnings returns warnings for the numbers of a solver run that are not
// finite (a diverged solve can end with an infinite residual).
func runWarnings(run Run) []string {
	var w []string
	if !finite(run.Residual) {
		w = append(w, nonFiniteWarning("solver", "largest residual", run.Residual, "its value is left out"))
	}
	if !finite(run.Scaled) {
		w = append(w, nonFiniteWarning("solver", "scaled residual", run.Scaled, "its value is left out"))
	}
	return w
}
