package viz

import (
	"fmt"
	"io"
	"strings"
)

// BreakdownReport is the breakdown section of the JSON document.
type BreakdownReport struct {
	Method  string                  `json:"method"`
	Sources []SourceBreakdownReport `json:"sources"`
}

// SourceBreakdownReport is where one source's heat goes.
type SourceBreakdownReport struct {
	Node  string            `json:"node"`
	Fixed bool              `json:"fixed_temperature"`
	HeatW Number            `json:"heat_W"`
	RiseK Number            `json:"rise_K"`
	Sinks []SinkShareReport `json:"sinks"`
	Paths []HeatPathReport  `json:"paths"`
	Drops []ArcDropReport   `json:"improve_first,omitempty"`
}

// SinkShareReport is the part of a source's heat that ends in one sink.
type SinkShareReport struct {
	Sink          string `json:"sink"`
	CarriedByAir  bool   `json:"carried_by_air"`
	HeatW         Number `json:"heat_W"`
	ShareFraction Number `json:"share"`
}

// HeatPathReport is one main path.
type HeatPathReport struct {
	Nodes         []string `json:"nodes"`
	Links         []string `json:"links"`
	HeatW         Number   `json:"heat_W"`
	ShareFraction Number   `json:"share"`
	DeltaTK       Number   `json:"delta_T_K"`
	ResistanceKW  Number   `json:"resistance_K_per_W"`
}

// ArcDropReport is the temperature drop across one arc of a main path.
type ArcDropReport struct {
	From        string `json:"from"`
	To          string `json:"to"`
	Links       string `json:"links"`
	DeltaTK     Number `json:"delta_T_K"`
	ShareOfRise Number `json:"share_of_rise"`
}

// Report returns the JSON section of the breakdown.
func (b *Breakdown) Report() *BreakdownReport {
	r := &BreakdownReport{Method: BreakdownMethod, Sources: []SourceBreakdownReport{}}
	for _, s := range b.Sources {
		sr := SourceBreakdownReport{Node: s.Node, Fixed: s.Fixed, HeatW: Number(s.Heat), RiseK: Number(s.Rise),
			Sinks: []SinkShareReport{}, Paths: []HeatPathReport{}}
		for _, k := range s.Sinks {
			sr.Sinks = append(sr.Sinks, SinkShareReport{Sink: k.Sink, CarriedByAir: k.Air, HeatW: Number(k.Heat), ShareFraction: Number(k.Share)})
		}
		for _, p := range s.Paths {
			sr.Paths = append(sr.Paths, HeatPathReport{Nodes: p.Nodes, Links: p.Links, HeatW: Number(p.Heat),
				ShareFraction: Number(p.Share), DeltaTK: Number(p.DeltaT), ResistanceKW: Number(p.Resistance)})
		}
		for _, d := range s.Drops {
			sr.Drops = append(sr.Drops, ArcDropReport{From: d.From, To: d.To, Links: d.Links, DeltaTK: Number(d.DeltaT), ShareOfRise: Number(d.Share)})
		}
		r.Sources = append(r.Sources, sr)
	}
	return r
}

// WriteBreakdownText writes the breakdown as a section of the text report.
func WriteBreakdownText(w io.Writer, b *Breakdown) error {
	tw := &textWriter{w: w}
	tw.printf("\nheat-path breakdown (where each source's heat goes)\n")
	tw.printf("%s\n", indent(wrap(BreakdownMethod, 96), "  "))
	for _, s := range b.Sources {
		what := "power"
		if s.Fixed {
			what = "heat given by this fixed temperature"
		}
		tw.printf("\n  %s: %s %s", s.Node, what, watts(s.Heat))
		var sinks []string
		for _, k := range s.Sinks {
			sinks = append(sinks, fmt.Sprintf("%s %.1f %%", k.Name(), 100*k.Share))
		}
		tw.printf(" → %s\n", strings.Join(sinks, ", "))
		for _, p := range s.Paths {
			tw.printf("    %5.1f %%  %9s  %s  (via %s)  ΔT %s K, %s K/W\n", 100*p.Share, watts(p.Heat),
				strings.Join(p.Nodes, " → "), strings.Join(p.Links, ", "), fnum("%.2f", p.DeltaT), fnum("%.3g", p.Resistance))
		}
		if len(s.Drops) > 0 {
			tw.printf("    improve first (temperature drop across each link of its main paths, of a rise of %s K above ambient):\n", fnum("%.2f", s.Rise))
			for i, d := range s.Drops {
				if i == 5 {
					break
				}
				tw.printf("      %d. %-24s %s → %s  %s K (%.0f %%)\n", i+1, d.Links, d.From, d.To, fnum("%.2f", d.DeltaT), 100*d.Share)
			}
		}
	}
	return tw.err
}

func indent(text, prefix string) string {
	return prefix + strings.ReplaceAll(text, "\n", "\n"+prefix)
}
