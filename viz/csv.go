package viz

import (
	"encoding/csv"
	"io"
	"strconv"

	"github.com/heatgraph/heatgraph/network"
)

// CSVHeader is the header row of WriteCSV. The record column says what a
// row is: "node", "link", or "boundary" (heat leaving through a fixed node).
var CSVHeader = []string{"record", "id", "kind", "from", "to", "temperature_degC", "limit_degC", "margin_K", "status", "power_W", "heat_W"}

// WriteCSV writes one table holding every node, link and boundary flow of a
// solution, numbers at full precision. A table has no room for warnings:
// a number that is not finite leaves its cell empty, and the caller shows
// the warnings of NonFinite.
func WriteCSV(w io.Writer, sol *network.Solution) error {
	cw := csv.NewWriter(w)
	// A number that is not finite leaves its cell empty; NonFinite lists
	// the warnings, which the caller shows.
	num := func(x float64) string {
		if !finite(x) {
			return ""
		}
		return strconv.FormatFloat(x, 'g', -1, 64)
	}
	rows := [][]string{CSVHeader}
	for _, n := range sol.Nodes {
		limit, margin := "", ""
		if n.HasLimit {
			limit, margin = num(celsius(n.Limit)), num(n.Margin)
		}
		rows = append(rows, []string{"node", n.ID, string(n.Kind), "", "", num(celsius(n.Temperature)), limit, margin, string(n.Status), num(n.Power), ""})
	}
	for _, l := range sol.Links {
		rows = append(rows, []string{"link", l.ID, l.Kind, l.From, l.To, "", "", "", "", "", num(l.Heat)})
	}
	for _, o := range sol.Balance.Out {
		rows = append(rows, []string{"boundary", o.Node, "", "", "", "", "", "", "", "", num(o.Heat)})
	}
	if err := cw.WriteAll(rows); err != nil {
		return err
	}
	return cw.Error()
}
