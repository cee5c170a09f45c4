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
			{name: "flow", dim: units.VolumeFlow, need: "one of flow, mass_flow", help: "volume flow of ambient air, e.g. 12 CFM; constant or a profile in time"},
			{name: "mass_flow", dim: units.MassFlow, need: "one of flow, mass_flow", help: "mass flow, e.g. 6 g/s; constant or a profile in time"},
		},
		parse: parseStream,
		ends:  []endRule{{"from", "the air's origin", airwayKinds}, {"to", "the air's destination", airwayKinds}},
	})
}

// Stream is air carried between two nodes.
type Stream struct {
	MassFlow float64 // kg/s (at t = 0)
	Profile  Profile // the mass flow in time, nil when constant
}

func (s *Stream) flowProfile() Profile { return s.Profile }

func (s *Stream) air(l *LinkSpec) (string, string, float64) { return l.From, l.To, s.MassFlow }

func (s *Stream) element(e linkEnv) (elements.Element, error) {
	f := e.givenFlowProfile(s.MassFlow, s.Profile)
	return e.carried(&elements.Stream{Up: e.from, Down: e.to, Flow: f}, e.from, e.to, f), nil
}

func parseStream(o *object, m *Model) LinkParams {
	if f, p, ok := massFlowProfile(o, m); ok {
		return &Stream{MassFlow: f, Profile: p}
	}
	return nil
}
