package network

import (
	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/units"
)

func init() {
	registerLinkKind(linkKind{
		name: "perforated", order: 81,
		summary: "a perforated plate, grille or vent: loss from its open-area ratio and thickness",
		help: "Air flows through a perforated plate or grille at the flow the solve finds. Its loss " +
			"coefficient on the face velocity follows Idelchik's relation for thick-edged " +
			"perforated plates from the open-area ratio f, the plate thickness l and the hole " +
			"diameter d, ζ = [0.5(1−f)^0.75 + τ(1−f)^1.375 + (1−f)² + λl/d]/f²; a thin plate " +
			"(l/d ≤ 0.015, or no thickness given) takes the sharp-edged orifice " +
			"(1 + 0.707√(1−f) − f)²/f². The report gives ζ (K) and the face velocity.",
		sources: []string{"Idelchik, Handbook of Hydraulic Resistance, 3rd ed., diagrams 8-1 and 8-3 (from memory)"},
		example: "{id: front-grille, kind: perforated, from: ambient, to: intake, area: 40 cm2, open_ratio: 0.45, thickness: 1 mm, hole_diameter: 3 mm}",
		keys: []keySpec{
			{name: "area", dim: units.Area, need: "required", help: "the face area of the plate"},
			{name: "open_ratio", dim: units.Dimensionless, need: "required", help: "open area over face area, below 1"},
			{name: "thickness", dim: units.Length, def: "0 (a thin plate)", help: "plate thickness"},
			{name: "hole_diameter", dim: units.Length, need: "with thickness", help: "hole (or slot hydraulic) diameter"},
			elevationKey,
		},
		parse: parsePerforated,
		ends:  branchEnds,
	})
}

func parsePerforated(o *object, m *Model) LinkParams {
	b, ok := readBranch(o)
	a, ok1 := o.positive("area", units.Area, true)
	f, ok2 := o.fraction("open_ratio", true)
	if ok2 && f >= 1 {
		o.r.addf(o.values["open_ratio"], o.field("open_ratio"), "must be below 1 (a plate with no solid part is no plate; use a loss link)")
		ok2 = false
	}
	t, d, ok3 := 0.0, 1.0, true
	if o.has("thickness") {
		var okT, okD bool
		t, okT = o.quantity("thickness", units.Length)
		d, okD = o.positive("hole_diameter", units.Length, true)
		ok3 = okT && okD
	}
	if !(ok && ok1 && ok2 && ok3) {
		return nil
	}
	k, err := elements.PerforatedK(f, t, d)
	if err != nil {
		o.r.addf(o.node, o.path, "%v", err)
		return nil
	}
	law, err := elements.NewLoss(k, a)
	if err != nil {
		o.r.addf(o.node, o.path, "%v", err)
		return nil
	}
	return &LossParams{branch: b, Law: law}
}
