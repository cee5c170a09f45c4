package viz

import (
	"encoding/json"
	"io"

	"github.com/heatgraph/heatgraph/network"
)

// JSONFormat is the version of the JSON document WriteJSON writes; it
// changes only when a field changes meaning or disappears.
const JSONFormat = 1

// Report is the JSON document of a solve. Every numeric field carries its
// unit in its name; numbers keep full float64 precision.
type Report struct {
	Format   int               `json:"heatgraph_json"`
	Model    string            `json:"model"`
	Title    string            `json:"title,omitempty"`
	Units    map[string]string `json:"units"`
	Ambient  AmbientReport     `json:"ambient"`
	Solver   SolverReport      `json:"solver"`
	Nodes    []NodeReport      `json:"nodes,omitempty"`
	Links    []LinkReport      `json:"links,omitempty"`
	Balance  *BalanceReport    `json:"energy_balance,omitempty"`
	Airflow  *AirflowReport    `json:"airflow,omitempty"` // when flows were solved for
	Exceeded []string          `json:"limits_exceeded,omitempty"`
	Warnings []string          `json:"warnings"`
	Caution  string            `json:"caution"`
}

// AmbientReport gives the ambient conditions.
type AmbientReport struct {
	TemperatureC float64  `json:"temperature_degC"`
	PressurePa   float64  `json:"pressure_Pa"`
	AltitudeM    *float64 `json:"altitude_m,omitempty"`
}

// SolverReport tells whether and how the solve converged.
type SolverReport struct {
	Converged  bool    `json:"converged"`
	Reason     string  `json:"reason"`
	Iterations int     `json:"iterations"`
	ResidualW  float64 `json:"max_residual_W"`
	Scaled     float64 `json:"scaled_residual"`
}

// NodeReport is one node's result.
type NodeReport struct {
	ID           string   `json:"id"`
	Kind         string   `json:"kind"`
	TemperatureC float64  `json:"temperature_degC"`
	TemperatureK float64  `json:"temperature_K"`
	PowerW       float64  `json:"power_W"`
	LimitC       *float64 `json:"limit_degC,omitempty"`
	MarginK      *float64 `json:"margin_K,omitempty"`
	Status       string   `json:"status,omitempty"`
}

// LinkReport is one link's result. HeatW is positive from From to To.
// Paths lists every way heat goes through the link, the main one first: a
// channel has two, the heat from the wall to the outlet air and the heat
// the air brings from the inlet (above ambient, Carried).
type LinkReport struct {
	ID       string         `json:"id"`
	Kind     string         `json:"kind"`
	From     string         `json:"from"`
	To       string         `json:"to"`
	HeatW    float64        `json:"heat_W"`
	Paths    []PathReport   `json:"paths,omitempty"`
	Details  []DetailReport `json:"details,omitempty"`
	Warnings []string       `json:"warnings,omitempty"`
}

// PathReport is one heat path of a link: HeatW watts from From to To;
// Carried when moving air carries it.
type PathReport struct {
	From    string  `json:"from"`
	To      string  `json:"to"`
	HeatW   float64 `json:"heat_W"`
	Carried bool    `json:"carried_by_air"`
}

// DetailReport is one quantity a link reports, with its SI unit.
type DetailReport struct {
	Name  string   `json:"name"`
	Value *float64 `json:"value,omitempty"`
	Unit  string   `json:"unit,omitempty"`
	Text  string   `json:"text,omitempty"`
}

// BalanceReport is the energy balance.
type BalanceReport struct {
	InW        float64          `json:"heat_in_W"`
	Out        []BoundaryReport `json:"heat_out"`
	ImbalanceW float64          `json:"imbalance_W"`
}

// BoundaryReport is the heat leaving through one fixed node.
type BoundaryReport struct {
	Node  string  `json:"node"`
	HeatW float64 `json:"heat_W"`
}

// NewReport builds the JSON document. sol may be nil when the solve did not
// converge: the document then says so and holds no results.
func NewReport(m *network.Model, sol *network.Solution, run Run) *Report {
	r := &Report{
		Format: JSONFormat,
		Model:  m.File,
		Title:  m.Title,
		Units: map[string]string{
			"temperature": "degC (and K where the key says _K)", "temperature_difference": "K",
			"heat": "W", "pressure": "Pa", "length": "m", "details": "SI, as each detail's unit says",
		},
		Ambient: AmbientReport{TemperatureC: celsius(m.Ambient.Temperature), PressurePa: m.Ambient.Pressure},
		Solver: SolverReport{Converged: run.Converged, Reason: run.Reason, Iterations: run.Iterations,
			ResidualW: run.Residual, Scaled: run.Scaled},
		Warnings: []string{},
		Caution:  Caution,
	}
	if m.Ambient.FromAlt {
		z := m.Ambient.Altitude
		r.Ambient.AltitudeM = &z
	}
	if sol == nil {
		return r
	}
	for _, n := range sol.Nodes {
		nr := NodeReport{ID: n.ID, Kind: string(n.Kind), TemperatureC: celsius(n.Temperature), TemperatureK: n.Temperature, PowerW: n.Power}
		if n.HasLimit {
			limit, margin := celsius(n.Limit), n.Margin
			nr.LimitC, nr.MarginK, nr.Status = &limit, &margin, string(n.Status)
		}
		if n.Status == network.Over {
			r.Exceeded = append(r.Exceeded, n.ID)
		}
		r.Nodes = append(r.Nodes, nr)
	}
	for _, l := range sol.Links {
		lr := LinkReport{ID: l.ID, Kind: l.Kind, From: l.From, To: l.To, HeatW: l.Heat, Warnings: l.Warnings}
		for _, p := range l.Paths {
			lr.Paths = append(lr.Paths, PathReport{From: p.From, To: p.To, HeatW: p.Heat, Carried: p.Carried})
		}
		for _, d := range l.Details {
			dr := DetailReport{Name: d.Name, Unit: d.Unit, Text: d.Text}
			if d.Text == "" {
				v := d.Value
				dr.Value = &v
			}
			lr.Details = append(lr.Details, dr)
		}
		r.Links = append(r.Links, lr)
	}
	b := &BalanceReport{InW: sol.Balance.In, ImbalanceW: sol.Balance.Imbalance}
	for _, o := range sol.Balance.Out {
		b.Out = append(b.Out, BoundaryReport{Node: o.Node, HeatW: o.Heat})
	}
	r.Balance = b
	r.Airflow = newAirflowReport(sol)
	r.Warnings = append(r.Warnings, sol.Warnings...)
	return r
}

// WriteJSON writes the report as indented JSON.
func WriteJSON(w io.Writer, r *Report) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(r)
}
