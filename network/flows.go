package network

import (
	"fmt"
	"math"
)

// airCarrier is implemented by the parameters of link kinds that carry air
// at a given mass flow.
type airCarrier interface {
	// air returns the node the air comes from, the node it goes to, and
	// the mass flow, kg/s, of the link l.
	air(l *LinkSpec) (up, down string, mdot float64)
}

// airflow returns the air a link carries: from the node up to the node
// down at mdot kg/s. ok is false for links that carry no air.
func (l *LinkSpec) airflow() (up, down string, mdot float64, ok bool) {
	if c, is := l.Params.(airCarrier); is {
		up, down, mdot = c.air(l)
		return up, down, mdot, true
	}
	return "", "", 0, false
}

// unbalancedAir reports every air node that does not pass on the air it
// receives: with given flows, mass must be conserved at each air node for
// its energy balance to mean anything.
func (m *Model) unbalancedAir() Problems {
	in, out := map[string]float64{}, map[string]float64{}
	// unknown holds the nodes that a stream or channel whose values could
	// not be read runs through: their balance is not known, and the
	// link's own problem is reported already.
	unknown := map[string]bool{}
	for i := range m.Links {
		l := &m.Links[i]
		if l.Params == nil && (l.Kind == "stream" || l.Kind == "channel") {
			unknown[l.From], unknown[l.To] = true, true
			for _, o := range l.Others {
				unknown[o] = true
			}
			continue
		}
		if up, down, f, ok := l.airflow(); ok {
			out[up] += f
			in[down] += f
		}
	}
	var ps Problems
	for _, n := range m.Nodes {
		if n.Kind != Air || unknown[n.ID] {
			continue
		}
		a, b := in[n.ID], out[n.ID]
		if math.Abs(a-b) <= 1e-6*math.Max(a, b) {
			continue
		}
		ps = append(ps, Problem{File: m.File, Line: n.Line, Field: "nodes[" + n.ID + "]",
			Message: fmt.Sprintf("air arrives at %.4g g/s but leaves at %.4g g/s; an air node must pass on the air it receives (check the flows of the stream and channel links into and out of it)", a*1e3, b*1e3)})
	}
	return ps
}
