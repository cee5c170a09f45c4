package network

import (
	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/units"
)

func init() {
	registerLinkKind(linkKind{
		name: "loss", order: 80,
		summary: "an air path with a pressure loss: an opening, a fitting, a bypass, a part with a known drop",
		help: "Air flows between two air (or fixed) nodes at the flow the solve finds, against a " +
			"pressure loss Δp = K·ρV²/2 on a flow area (the loss coefficient's definition), or " +
			"Δp = R·Q² with R given (resistance) or from one measured point (drop at at_flow). It carries the air's " +
			"heat with it, in whichever direction the air goes. A bypass round a heat sink or a " +
			"filter is one such link between the two air nodes the part joins.",
		sources: []string{"Idelchik, Handbook of Hydraulic Resistance, ch. 1 (loss coefficients)"},
		example: "{id: gap, kind: loss, from: front, to: rear, coefficient: 1.5, area: 6 cm2}",
		keys: []keySpec{
			{name: "coefficient", dim: units.Dimensionless, need: "one of coefficient, drop, resistance", help: "loss coefficient K on area"},
			{name: "area", dim: units.Area, need: "with coefficient", help: "the flow area K refers to"},
			{name: "resistance", dim: units.FlowResistance, need: "one of coefficient, drop, resistance", help: "R of Δp = R·Q², e.g. 2e5 Pa/(m3/s)^2"},
			{name: "drop", dim: units.Pressure, need: "one of coefficient, drop, resistance", help: "a measured pressure drop ..."},
			{name: "at_flow", dim: units.VolumeFlow, need: "with drop", help: "... at this volume flow: R = drop/at_flow²"},
			elevationKey,
		},
		parse: parseLoss,
		ends:  branchEnds,
	})
}

// LossParams is a loss in a solved air path.
type LossParams struct {
	branch
	Law elements.FlowLaw
}

func (p *LossParams) element(e linkEnv) (elements.Element, error) { return p.branch.element(e, p.Law) }

func parseLoss(o *object, m *Model) LinkParams {
	b, ok := readBranch(o)
	switch o.oneOf("a loss coefficient with its area, a measured drop with the flow it was measured at, or a resistance R of Δp = R·Q²", "coefficient", "drop", "resistance") {
	case "resistance":
		r, ok1 := o.positive("resistance", units.FlowResistance, true)
		if ok && ok1 {
			return &LossParams{branch: b, Law: &elements.FlowResistance{R: r}}
		}
	case "coefficient":
		k, ok1 := o.positive("coefficient", units.Dimensionless, true)
		a, ok2 := o.positive("area", units.Area, true)
		if ok && ok1 && ok2 {
			law, err := elements.NewLoss(k, a)
			if err != nil {
				o.r.addf(o.node, o.path, "%v", err)
				return nil
			}
			return &LossParams{branch: b, Law: law}
		}
	case "drop":
		dp, ok1 := gauge(o, "drop")
		q, ok2 := o.positive("at_flow", units.VolumeFlow, true)
		if ok && ok1 && ok2 {
			return &LossParams{branch: b, Law: &elements.FlowResistance{R: dp / (q * q)}}
		}
	}
	return nil
}
