package viz

import (
	"encoding/csv"
	"io"
	"math"
	"strconv"

	"github.com/heatgraph/heatgraph/network"
)

// CSVHeader is the header row of WriteCSV. The record column says what a
// row is: "node", "link", "boundary" (heat leaving through a fixed node),
// or "join" (the heat through one join of a meshed plate, from the plate
// to the node joined; the plate's cells are written by WritePlateCells).
var CSVHeader = []string{"record", "id", "kind", "from", "to", "temperature_degC", "limit_degC", "margin_K", "status", "power_W", "heat_W"}

// WriteCSV writes one table holding every node, link and boundary flow of a
// solution. Numbers have 10 significant digits, far finer than any model's
// inputs, and round-off around zero is written 0, never -0. A table has
// no room for warnings:
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
		return csvNumber(x)
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
	for _, p := range sol.Plates {
		for _, j := range p.Joins {
			rows = append(rows, []string{"join", j.Name, j.Kind, p.ID, j.Node, "", "", "", "", "", num(j.Heat)})
		}
	}
	if err := cw.WriteAll(rows); err != nil {
		return err
	}
	return cw.Error()
}

// csvNumber formats a finite number for CSV: 10 significant digits, no
// exponent for ordinary magnitudes, and 0 for anything that rounds to
// zero at that precision relative to 1 mW, 1 mK (|x| < 1e-9) or is -0.
func csvNumber(x float64) string {
	if math.Abs(x) < 1e-9 {
		return "0"
	}
	return strconv.FormatFloat(x, 'g', 10, 64)
}
