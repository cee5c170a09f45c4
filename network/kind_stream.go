package network

import (
	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/units"
)

func init() {
	registerLinkKind(linkKind{
		name: "stream", order: 60,
		summary: "air carried from one node to the next at a given flow, with its heat",
		help: "Air moving from one air (or fixed) node to the next at a given flow carries its " +
			"enthalpy ṁ·c_p·(T − T_ambient) (upwind): chains of streams and channels make air " +
			"warm along its path. A volume flow is taken at the ambient state, where fans draw " +
			"their air, and converted with the density there.",
		sources: []string{"energy balance of a flowing fluid, upwind (donor-cell) form"},
		example: "{id: exhaust, kind: stream, from: air-out, to: ambient, flow: 12 CFM}",
		keys: []keySpec{
			{name: "flow", dim: units.VolumeFlow, need: "one of flow, mass_flow", help: "volume flow of ambient air, e.g. 12 CFM"},
			{name: "mass_flow", dim: units.MassFlow, need: "one of flow, mass_flow", help: "mass flow, e.g. 6 g/s"},
		},
		parse: parseStream,
		ends:  []endRule{{"from", "the air's origin", airwayKinds}, {"to", "the air's destination", airwayKinds}},
	})
}

// Stream is air carried between two nodes.
type Stream struct {
	MassFlow float64 // kg/s
}

func (s *Stream) air(l *LinkSpec) (string, string, float64) { return l.From, l.To, s.MassFlow }

func (s *Stream) element(e linkEnv) (elements.Element, error) {
	return &elements.Stream{Up: e.from, Down: e.to, Flow: e.givenFlow(s.MassFlow)}, nil
}

func parseStream(o *object, m *Model) LinkParams {
	if f, ok := massFlow(o, m); ok {
		return &Stream{MassFlow: f}
	}
	return nil
}
