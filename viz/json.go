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
// unit in its name; numbers keep full float64 precision. A number that is
// not finite is never written (see Number and NonFinite).
type Report struct {
	Format  int               `json:"heatgraph_json"`
	Model   string            `json:"model"`
	Title   string            `json:"title,omitempty"`
	Units   map[string]string `json:"units"`
	Ambient AmbientReport     `json:"ambient"`
	// RequiredMarginK is the margin every limit must keep (0 when the
	// model sets none).
	RequiredMarginK Number         `json:"required_margin_K"`
	Solver          SolverReport   `json:"solver"`
	Nodes           []NodeReport   `json:"nodes,omitempty"`
	Links           []LinkReport   `json:"links,omitempty"`
	Balance         *BalanceReport `json:"energy_balance,omitempty"`
	Airflow         *AirflowReport `json:"airflow,omitempty"` // when flows were solved for
	// Plates summarises every meshed plate, without its cells (see
	// WritePlateCells for those).
	Plates []PlateReport `json:"plates,omitempty"`
	// Exceeded lists the nodes over their limits; always present, empty
	// when every limit holds.
	Exceeded []string `json:"limits_exceeded"`
	// Breakdown is where each source's heat goes (see NewBreakdown).
	Breakdown *BreakdownReport `json:"breakdown,omitempty"`
	Warnings  []string         `json:"warnings"`
	Caution   string           `json:"caution"`
}

// AmbientReport gives the ambient conditions.
type AmbientReport struct {
	TemperatureC Number  `json:"temperature_degC"`
	PressurePa   Number  `json:"pressure_Pa"`
	AltitudeM    *Number `json:"altitude_m,omitempty"`
}

// SolverReport tells whether and how the solve converged.
type SolverReport struct {
	Converged  bool   `json:"converged"`
	Reason     string `json:"reason"`
	Iterations int    `json:"iterations"`
	// LinearIterations counts the linear solver's iterations over the
	// solve; 0 when every linear solve was direct.
	LinearIterations int `json:"linear_iterations"`
	// The equation with the largest residual relative to its own
	// magnitude, its residual in its unit, and the ratio.
	Worst    string           `json:"worst_equation,omitempty"`
	Residual Number           `json:"worst_residual"`
	Unit     string           `json:"worst_residual_unit,omitempty"`
	Scaled   Number           `json:"scaled_residual"`
	Unknowns []UnknownsReport `json:"unknowns"`
}

// UnknownsReport is the convergence of one kind of unknown.
type UnknownsReport struct {
	Kind         string `json:"kind"`
	Unit         string `json:"unit"`
	Equation     string `json:"equation"`
	EquationUnit string `json:"equation_unit"`
	Count        int    `json:"count"`
	Step         Number `json:"last_step"`
	Residual     Number `json:"max_residual"`
	Scaled       Number `json:"max_scaled_residual"`
	Converged    bool   `json:"converged"`
}

// NodeReport is one node's result.
type NodeReport struct {
	ID           string  `json:"id"`
	Kind         string  `json:"kind"`
	TemperatureC Number  `json:"temperature_degC"`
	TemperatureK Number  `json:"temperature_K"`
	PowerW       Number  `json:"power_W"`
	LimitC       *Number `json:"limit_degC,omitempty"`
	MarginK      *Number `json:"margin_K,omitempty"`
	Status       string  `json:"status,omitempty"`
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
	HeatW    Number         `json:"heat_W"`
	Paths    []PathReport   `json:"paths,omitempty"`
	Details  []DetailReport `json:"details,omitempty"`
	Warnings []string       `json:"warnings,omitempty"`
}

// PathReport is one heat path of a link: HeatW watts from From to To;
// Carried when moving air carries it.
type PathReport struct {
	From    string `json:"from"`
	To      string `json:"to"`
	HeatW   Number `json:"heat_W"`
	Carried bool   `json:"carried_by_air"`
}

// DetailReport is one quantity a link reports, with its SI unit.
type DetailReport struct {
	Name  string  `json:"name"`
	Value *Number `json:"value,omitempty"`
	Unit  string  `json:"unit,omitempty"`
	Text  string  `json:"text,omitempty"`
}

// BalanceReport is the energy balance.
type BalanceReport struct {
	InW Number `json:"heat_in_W"`
	// EnvironmentW is the heat brought in from the environment (the sun),
	// apart from the parts' heat inputs.
	EnvironmentW Number           `json:"environment_heat_W"`
	Out          []BoundaryReport `json:"heat_out"`
	ImbalanceW   Number           `json:"imbalance_W"`
}

// BoundaryReport is the heat leaving through one fixed node.
type BoundaryReport struct {
	Node  string `json:"node"`
	HeatW Number `json:"heat_W"`
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
		Ambient:         AmbientReport{TemperatureC: Number(celsius(m.Ambient.Temperature)), PressurePa: Number(m.Ambient.Pressure)},
		Solver:          solverReport(run),
		RequiredMarginK: Number(m.RequiredMargin),
		Exceeded:        []string{},
		Warnings:        append([]string{}, runWarnings(run)...), // [] when none, never null
		Caution:         Caution,
	}
	if m.Ambient.FromAlt {
		r.Ambient.AltitudeM = num(m.Ambient.Altitude)
	}
	if sol == nil {
		return r
	}
	for _, n := range sol.Nodes {
		nr := NodeReport{ID: n.ID, Kind: string(n.Kind), TemperatureC: Number(celsius(n.Temperature)),
			TemperatureK: Number(n.Temperature), PowerW: Number(n.Power)}
		if n.HasLimit {
			nr.LimitC, nr.MarginK, nr.Status = num(celsius(n.Limit)), num(n.Margin), string(n.Status)
		}
		if n.Status == network.Over {
			r.Exceeded = append(r.Exceeded, n.ID)
		}
		r.Nodes = append(r.Nodes, nr)
	}
	for _, l := range sol.Links {
		lr := LinkReport{ID: l.ID, Kind: l.Kind, From: l.From, To: l.To, HeatW: Number(l.Heat),
			Warnings: append([]string(nil), l.Warnings...)}
		for _, p := range l.Paths {
			lr.Paths = append(lr.Paths, PathReport{From: p.From, To: p.To, HeatW: Number(p.Heat), Carried: p.Carried})
		}
		for _, d := range l.Details {
			dr := DetailReport{Name: d.Name, Unit: d.Unit, Text: d.Text}
			if d.Text == "" {
				if !finite(d.Value) {
					// Left out; NonFinite puts the warning in the
					// document's list too.
					lr.Warnings = append(lr.Warnings, detailWarning(l.ID, d))
					continue
				}
				dr.Value = num(d.Value)
			}
			lr.Details = append(lr.Details, dr)
		}
		r.Links = append(r.Links, lr)
	}
	b := &BalanceReport{InW: Number(sol.Balance.In), EnvironmentW: Number(sol.Balance.Environment), ImbalanceW: Number(sol.Balance.Imbalance)}
	for _, o := range sol.Balance.Out {
		b.Out = append(b.Out, BoundaryReport{Node: o.Node, HeatW: Number(o.Heat)})
	}
	r.Balance = b
	r.Airflow = newAirflowReport(sol)
	r.Plates = newPlateReports(sol)
	r.Breakdown = NewBreakdown(sol).Report()
	r.Warnings = append(r.Warnings, sol.Warnings...)
	r.Warnings = append(r.Warnings, NonFinite(sol)...)
	return r
}

// WriteJSON writes the report as indented JSON.
func WriteJSON(w io.Writer, r *Report) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(r)
}

func solverReport(run Run) SolverReport {
	r := SolverReport{Converged: run.Converged, Reason: run.Reason, Iterations: run.Iterations, LinearIterations: run.LinearIterations,
		Worst: run.Worst, Residual: Number(run.Residual), Unit: run.WorstUnit, Scaled: Number(run.Scaled),
		Unknowns: []UnknownsReport{}}
	for _, k := range run.Kinds {
		r.Unknowns = append(r.Unknowns, UnknownsReport{Kind: k.Name, Unit: k.Unit, Equation: k.Equation, EquationUnit: k.EquationUnit,
			Count: k.Unknowns, Step: Number(k.Step), Residual: Number(k.Residual), Scaled: Number(k.Scaled), Converged: k.Converged})
	}
	return r
}
