package study

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"fmt"
	"math"
	"sort"
	"strconv"

	"github.com/heatgraph/heatgraph/network"
)

// Status of a row: every limit holds with the required margin ("ok"),
// holds but closer ("tight"), fails ("over"), or no result ("failed").
func (r Row) Status() string {
	if r.Err != "" {
		return "failed"
	}
	status := "ok"
	for _, m := range r.Margin {
		switch {
		case math.IsNaN(m):
		case m < 0:
			return "over"
		case m < r.Required:
			status = "tight"
		}
	}
	return status
}

// Worst returns the index of the node with the least margin less the
// required margin, and that slack, K; -1 when no node has a limit.
func (r Row) Worst() (int, float64) {
	k, worst := -1, math.Inf(1)
	for i, m := range r.Margin {
		if !math.IsNaN(m) && m-r.Required < worst {
			k, worst = i, m-r.Required
		}
	}
	return k, worst
}

func num(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

// Column names the CSV column of parameter q: its path and SI unit.
func Column(q network.Parameter) string {
	if u := q.Kind.SIUnit(); u != "" {
		return q.Path + "_" + u
	}
	return q.Path
}

// WriteCSV writes one line per row: the point's index, the varied values
// (SI), every node's temperature (degC), the margin of every node with a
// limit (K), the worst node and its slack (margin less the required
// margin, K), the status and the error. Numbers are written in full
// (shortest round-trip form), so that a table split into shards and
// merged is byte for byte the table written at once.
func WriteCSV(buf *bytes.Buffer, params []network.Parameter, nodes []Node, rows []Row) error {
	w := csv.NewWriter(buf)
	head := []string{"point"}
	for _, q := range params {
		head = append(head, Column(q))
	}
	for _, n := range nodes {
		head = append(head, n.ID+"_degC")
	}
	for _, n := range nodes {
		if n.HasLimit {
			head = append(head, n.ID+"_margin_K")
		}
	}
	head = append(head, "worst_node", "worst_slack_K", "status", "error")
	if err := w.Write(head); err != nil {
		return err
	}
	for _, r := range rows {
		line := []string{strconv.Itoa(r.Index)}
		for _, v := range r.Values {
			line = append(line, num(v))
		}
		for k := range nodes {
			if r.T == nil {
				line = append(line, "")
			} else {
				line = append(line, num(r.T[k]-273.15))
			}
		}
		for k, n := range nodes {
			if !n.HasLimit {
				continue
			}
			if r.T == nil || math.IsNaN(r.Margin[k]) {
				line = append(line, "")
			} else {
				line = append(line, num(r.Margin[k]))
			}
		}
		worst, slack := r.Worst()
		if worst < 0 || r.T == nil {
			line = append(line, "", "")
		} else {
			line = append(line, nodes[worst].ID, num(slack))
		}
		line = append(line, r.Status(), r.Err)
		if err := w.Write(line); err != nil {
			return err
		}
	}
	w.Flush()
	return w.Error()
}

// WriteJSON writes the rows as one document: the parameters, the nodes
// and, per point, its values, temperatures, margins and status.
func WriteJSON(buf *bytes.Buffer, model string, set []network.Override, params []network.Parameter, nodes []Node, rows []Row, caution string) error {
	type jp struct {
		Path string   `json:"path"`
		Also []string `json:"also,omitempty"`
		Unit string   `json:"unit_si"`
	}
	type jn struct {
		ID    string   `json:"id"`
		Kind  string   `json:"kind"`
		Limit *float64 `json:"limit_degC,omitempty"`
	}
	type jr struct {
		Point  int        `json:"point"`
		Values []float64  `json:"values_si"`
		T      []float64  `json:"temperature_degC,omitempty"`
		Margin []*float64 `json:"margin_K,omitempty"`
		Worst  string     `json:"worst_node,omitempty"`
		Slack  *float64   `json:"worst_slack_K,omitempty"`
		Status string     `json:"status"`
		Err    string     `json:"error,omitempty"`
	}
	doc := struct {
		Model   string   `json:"model"`
		Set     []string `json:"set,omitempty"`
		Params  []jp     `json:"parameters"`
		Nodes   []jn     `json:"nodes"`
		Points  []jr     `json:"points"`
		Caution string   `json:"caution"`
	}{Model: model, Caution: caution, Points: []jr{}}
	for _, o := range set {
		doc.Set = append(doc.Set, o.String())
	}
	for _, q := range params {
		doc.Params = append(doc.Params, jp{q.Path, q.Also, q.Kind.SIUnit()})
	}
	for _, n := range nodes {
		j := jn{ID: n.ID, Kind: string(n.Kind)}
		if n.HasLimit {
			l := n.Limit - 273.15
			j.Limit = &l
		}
		doc.Nodes = append(doc.Nodes, j)
	}
	for _, r := range rows {
		j := jr{Point: r.Index, Values: r.Values, Status: r.Status(), Err: r.Err}
		if r.T != nil {
			for k, t := range r.T {
				j.T = append(j.T, t-273.15)
				if m := r.Margin[k]; !math.IsNaN(m) {
					j.Margin = append(j.Margin, &m)
				} else {
					j.Margin = append(j.Margin, nil)
				}
			}
			if w, s := r.Worst(); w >= 0 {
				j.Worst, j.Slack = nodes[w].ID, &s
			}
		}
		doc.Points = append(doc.Points, j)
	}
	enc := json.NewEncoder(buf)
	enc.SetIndent("", "  ")
	return enc.Encode(doc)
}

// MergeCSV joins tables written by WriteCSV for parts of one study (its
// shards): the headers must be the same; the rows are put in point order.
// A point given twice must be given the same; expect, when positive, is
// the number of points the whole study has, and a missing one is an
// error.
func MergeCSV(names []string, tables [][]byte, expect int) ([]byte, error) {
	var head []string
	rows := map[int][]string{}
	from := map[int]string{}
	for t, data := range tables {
		recs, err := csv.NewReader(bytes.NewReader(data)).ReadAll()
		if err != nil {
			return nil, fmt.Errorf("%s: %w", names[t], err)
		}
		if len(recs) == 0 {
			return nil, fmt.Errorf("%s: empty (not a study table)", names[t])
		}
		if head == nil {
			head = recs[0]
			if len(head) == 0 || head[0] != "point" {
				return nil, fmt.Errorf("%s: not a study table (its first column is not \"point\")", names[t])
			}
		} else if !equal(head, recs[0]) {
			return nil, fmt.Errorf("%s: its columns differ from those of %s: the tables are not of one study", names[t], names[0])
		}
		for _, rec := range recs[1:] {
			i, err := strconv.Atoi(rec[0])
			if err != nil || i < 0 {
				return nil, fmt.Errorf("%s: point %q is not a point index", names[t], rec[0])
			}
			if prev, dup := rows[i]; dup && !equal(prev, rec) {
				return nil, fmt.Errorf("point %d differs between %s and %s", i, from[i], names[t])
			}
			rows[i], from[i] = rec, names[t]
		}
	}
	idx := make([]int, 0, len(rows))
	for i := range rows {
		idx = append(idx, i)
	}
	sort.Ints(idx)
	if expect > 0 {
		var missing []int
		for i := 0; i < expect; i++ {
			if _, ok := rows[i]; !ok {
				missing = append(missing, i)
			}
		}
		if len(missing) > 0 {
			return nil, fmt.Errorf("%d of %d points are missing (the first: %d): is a shard missing?", len(missing), expect, missing[0])
		}
		if len(idx) > 0 && idx[len(idx)-1] >= expect {
			return nil, fmt.Errorf("point %d is beyond the %d points expected", idx[len(idx)-1], expect)
		}
	}
	var buf bytes.Buffer
	w := csv.NewWriter(&buf)
	w.Write(head)
	for _, i := range idx {
		w.Write(rows[i])
	}
	w.Flush()
	return buf.Bytes(), w.Error()
}

func equal(a, b []string) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}
