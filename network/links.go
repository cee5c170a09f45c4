package network

import (
	"github.com/heatgraph/heatgraph/elements"
)

// LinkParams holds the kind-specific values of a link, in SI units.
type LinkParams interface {
	// element builds the link's element.
	element(e linkEnv) (elements.Element, error)
}

// linkEnv is what link parameters need to become an element.
type linkEnv struct {
	from, to int   // node indices of the link's ends
	others   []int // node indices of its other ends (a channel's inlet), in the order of linkKind.ends
	env      *elements.Env
	net      *Network
	link     string // the link's id, naming its variables
}

// givenFlow adds a mass-flow variable of the link, held at mdot kg/s, and
// returns it.
func (e linkEnv) givenFlow(mdot float64) int {
	return e.net.addVar(Variable{Kind: MassFlowVar, Owner: e.link, Given: true, Value: mdot})
}

// linkKind describes one kind of link in the model file; see
// registerLinkKind.
type linkKind struct {
	name      string
	order     int // place in listings
	summary   string
	help      string    // what it models and how, a paragraph
	sources   []string  // published sources of its physics
	example   string    // a YAML list item
	keys      []keySpec // keys besides id, kind, from, to, note
	defaultTo string    // node used when "to" is omitted; "" makes it required
	parse     func(o *object, m *Model) LinkParams
	// ends says which kinds of node each end may be; ends other than
	// from and to are further nodes the link joins.
	ends []endRule
}

// endRule restricts one end of a link to some kinds of node.
type endRule struct {
	key   string     // "from", "to", or a further end such as "inlet"
	role  string     // what the node is to the link, for messages
	kinds []NodeKind // the kinds allowed
}

var (
	solidKinds   = []NodeKind{Solid, Fixed, Junction}
	airwayKinds  = []NodeKind{Air, Fixed}
	surfaceRules = []endRule{{"from", "the surface", solidKinds}, {"to", "the air", airwayKinds}}
	solidRules   = []endRule{{"from", "each end", solidKinds}, {"to", "each end", solidKinds}}
)

// commonLinkKeys are accepted by every kind.
var commonLinkKeys = []string{"id", "kind", "from", "to", "note"}

const hintMaterial = "a material name from 'heatgraph materials' or the model's materials:"
