package viz

import (
	"strconv"

	"github.com/heatgraph/heatgraph/network"
)

// The airflow sections of the reports: every branch's flow and pressures,
// each fan's operating point and the mass balance of each air node. They
// appear only when the solve found flows.

// cubicFeetPerMinute is 1 CFM in m³/s (NIST SP 811, B.8).
const cubicFeetPerMinute = 4.719474e-4

// solvedAir reports whether any flow of the solution was solved for.
func solvedAir(sol *network.Solution) bool {
	for _, b := range sol.Branches {
		if b.Solved {
			return true
		}
	}
	return false
}

// writeAirflow writes the branches, the fans and the mass balance.
func writeAirflow(tw *textWriter, sol *network.Solution) {
	if !solvedAir(sol) {
		return
	}
	idw, kw := len("branch"), len("kind")
	for _, b := range sol.Branches {
		idw, kw = max(idw, len(b.Link)), max(kw, len(b.Kind))
	}
	tw.printf("\nairflow (positive from → to; p is gauge pressure above ambient at each node's height;\n")
	tw.printf("for each solved branch p_from − p_to + stack + law = 0, the law being a fan's rise or a loss, < 0)\n")
	tw.printf("%-*s  %-*s  %9s  %8s  %7s  %8s  %9s  %9s  %8s  %8s  %6s  %s\n", idw, "branch", kw, "kind",
		"mass[g/s]", "Q [L/s]", "Q [CFM]", "V [m/s]", "p_from[Pa]", "p_to [Pa]", "law [Pa]", "stack[Pa]", "share", "from → to")
	for _, b := range sol.Branches {
		v, law, stack := "", "", ""
		if b.Velocity != 0 {
			v = ftoa(b.Velocity, 3)
		}
		if b.Solved {
			law, stack = ftoa(b.Rise, 3), ftoa(b.Stack, 4)
		} else {
			law = "given"
		}
		tw.printf("%-*s  %-*s  %9.4f  %8.3f  %7.2f  %8s  %10.3f  %9.3f  %8s  %9s  %5.1f%%  %s → %s\n", idw, b.Link, kw, b.Kind,
			noNegZero(b.MassFlow*1e3, 4), noNegZero(b.VolumeFlow*1e3, 3), noNegZero(b.VolumeFlow/cubicFeetPerMinute, 2), v,
			noNegZero(b.PressureFrom, 3), noNegZero(b.PressureTo, 3), law, stack, 100*b.Share, b.From, b.To)
	}
	fans := false
	for _, b := range sol.Branches {
		if b.Fan == nil {
			continue
		}
		if !fans {
			tw.printf("\nfans (operating point at the inlet density)\n")
			tw.printf("%-*s  %8s  %7s  %10s  %8s  %10s  %14s\n", idw, "fan", "Q [L/s]", "Q [CFM]", "rise [Pa]", "speed", "ρ [kg/m³]", "free [L/s]")
			fans = true
		}
		f := b.Fan
		speed := "-"
		if f.Speed > 0 {
			speed = ftoa(f.Speed, 0) + " rpm"
		}
		if f.Stopped {
			speed = "stopped"
		}
		tw.printf("%-*s  %8.3f  %7.2f  %10.3f  %8s  %10.4f  %14.3f\n", idw, b.Link, noNegZero(f.VolumeFlow*1e3, 3), noNegZero(f.VolumeFlow/cubicFeetPerMinute, 2),
			noNegZero(f.Pressure, 3), speed, f.InletDensity, f.FreeDelivery*1e3)
	}
	tw.printf("\nmass balance [g/s]\n")
	for _, m := range sol.Balance.Mass {
		if m.Fixed {
			tw.printf("  %-20s in %9.4f  out %9.4f  (air %s the network here)\n", m.Node, m.In*1e3, m.Out*1e3, enterLeave(m))
			continue
		}
		tw.printf("  %-20s in %9.4f  out %9.4f  imbalance %9.2g\n", m.Node, m.In*1e3, m.Out*1e3, m.Imbalance*1e3)
	}
}

func enterLeave(m network.MassBalance) string {
	switch {
	case m.Out > m.In:
		return "enters"
	case m.In > m.Out:
		return "leaves"
	}
	return "passes through"
}

func ftoa(x float64, decimals int) string {
	return formatFixed(noNegZero(x, decimals), decimals)
}

// AirflowReport is the airflow part of the JSON document.
type AirflowReport struct {
	Branches []BranchReport      `json:"branches"`
	Fans     []FanReport         `json:"fans,omitempty"`
	Mass     []MassBalanceReport `json:"mass_balance"`
}

// BranchReport is one link that carries air.
type BranchReport struct {
	Link         string   `json:"link"`
	Kind         string   `json:"kind"`
	From         string   `json:"from"`
	To           string   `json:"to"`
	Solved       bool     `json:"solved"`
	MassFlow     Number   `json:"mass_flow_kg_s"`
	VolumeFlow   Number   `json:"volume_flow_m3_s"`
	Density      Number   `json:"density_kg_m3"`
	Velocity     *Number  `json:"velocity_m_s,omitempty"`
	PressureFrom Number   `json:"pressure_from_Pa"`
	PressureTo   Number   `json:"pressure_to_Pa"`
	Law          Number   `json:"law_Pa"`
	Stack        Number   `json:"stack_Pa"`
	Share        Number   `json:"share"`
	Warnings     []string `json:"warnings,omitempty"`
}

// FanReport is a fan's operating point.
type FanReport struct {
	Link         string   `json:"link"`
	VolumeFlow   Number   `json:"volume_flow_m3_s"`
	Pressure     Number   `json:"static_pressure_Pa"`
	Speed        *Number  `json:"speed_rpm,omitempty"`
	Stopped      bool     `json:"stopped,omitempty"`
	InletDensity Number   `json:"inlet_density_kg_m3"`
	FreeDelivery Number   `json:"free_delivery_m3_s"`
	Warnings     []string `json:"warnings,omitempty"`
}

// MassBalanceReport is the mass balance of one node.
type MassBalanceReport struct {
	Node      string `json:"node"`
	In        Number `json:"in_kg_s"`
	Out       Number `json:"out_kg_s"`
	Imbalance Number `json:"imbalance_kg_s"`
	Fixed     bool   `json:"boundary"`
}

// newAirflowReport returns the airflow part of the JSON document, or nil
// when no flow was solved for.
func newAirflowReport(sol *network.Solution) *AirflowReport {
	if !solvedAir(sol) {
		return nil
	}
	r := &AirflowReport{}
	for _, b := range sol.Branches {
		br := BranchReport{Link: b.Link, Kind: b.Kind, From: b.From, To: b.To, Solved: b.Solved, MassFlow: Number(b.MassFlow),
			VolumeFlow: Number(b.VolumeFlow), Density: Number(b.Density), PressureFrom: Number(b.PressureFrom), PressureTo: Number(b.PressureTo),
			Law: Number(b.Rise), Stack: Number(b.Stack), Share: Number(b.Share), Warnings: b.Warnings}
		if b.Velocity != 0 {
			v := Number(b.Velocity)
			br.Velocity = &v
		}
		r.Branches = append(r.Branches, br)
		if f := b.Fan; f != nil {
			fr := FanReport{Link: b.Link, VolumeFlow: Number(f.VolumeFlow), Pressure: Number(f.Pressure), InletDensity: Number(f.InletDensity),
				FreeDelivery: Number(f.FreeDelivery), Stopped: f.Stopped, Warnings: f.Warnings}
			if f.Speed > 0 {
				s := Number(f.Speed)
				fr.Speed = &s
			}
			r.Fans = append(r.Fans, fr)
		}
	}
	for _, m := range sol.Balance.Mass {
		r.Mass = append(r.Mass, MassBalanceReport{Node: m.Node, In: Number(m.In), Out: Number(m.Out), Imbalance: Number(m.Imbalance), Fixed: m.Fixed})
	}
	return r
}

// formatFixed formats x with the given number of decimals.
func formatFixed(x float64, decimals int) string {
	return strconv.FormatFloat(x, 'f', decimals, 64)
}
