package network

import (
	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/units"
)

func init() {
	registerLinkKind(linkKind{
		name: "filter", order: 82,
		summary: "a filter or screen: a given loss coefficient, or its measured drop against flow",
		help: "Air flows through a filter or insect screen at the flow the solve finds, against a " +
			"loss coefficient on the face area, or against the maker's table of pressure drop " +
			"against volume flow (a monotone cubic through the points from zero, Fritsch & " +
			"Carlson 1980; no overshoot between points). Beyond the last point the drop is " +
			"extrapolated, with a warning. A loaded (dirty) filter is another table or a larger " +
			"coefficient.",
		sources: []string{"Fritsch & Carlson, SIAM J. Numer. Anal. 17(2), 1980 (monotone interpolation)"},
		example: "{id: dust-filter, kind: filter, from: ambient, to: intake, curve: [[10 CFM, 8 Pa], [20 CFM, 20 Pa], [30 CFM, 36 Pa]]}",
		keys: []keySpec{
			{name: "curve", what: "table", need: "one of curve, coefficient", help: "[volume flow, pressure drop] points, flows increasing"},
			{name: "coefficient", dim: units.Dimensionless, need: "one of curve, coefficient", help: "loss coefficient K on area"},
			{name: "area", dim: units.Area, need: "with coefficient", help: "face area"},
			elevationKey,
		},
		parse: parseFilter,
		ends:  branchEnds,
	})
}

func parseFilter(o *object, m *Model) LinkParams {
	b, ok := readBranch(o)
	switch o.oneOf("the maker's pressure-drop table, or a loss coefficient with its area", "curve", "coefficient") {
	case "curve":
		q, dp, ok1 := readTable(o, "curve", units.VolumeFlow, units.Pressure, true)
		if !(ok && ok1) {
			return nil
		}
		law, err := elements.NewTableLoss(q, dp)
		if err != nil {
			o.r.addf(o.values["curve"], o.field("curve"), "%v", err)
			return nil
		}
		return &LossParams{branch: b, Law: law}
	case "coefficient":
		k, ok1 := o.positive("coefficient", units.Dimensionless, true)
		a, ok2 := o.positive("area", units.Area, true)
		if !(ok && ok1 && ok2) {
			return nil
		}
		law, err := elements.NewLoss(k, a)
		if err != nil {
			o.r.addf(o.node, o.path, "%v", err)
			return nil
		}
		return &LossParams{branch: b, Law: law}
	}
	return nil
}
