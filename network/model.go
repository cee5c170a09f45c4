package network

// Model is a model file as read: every quantity in SI units, every name
// checked, nothing assembled yet. Build turns it into a Network.
type Model struct {
	File           string     // path the model was read from
	Title          string     // one line naming the design
	Ambient        Ambient    // surrounding air
	RequiredMargin float64    // K that every limit must keep; closer is flagged
	Materials      Materials  // built-in table with the file's own entries on top
	Nodes          []NodeSpec // in file order
	Components     []ComponentSpec
	Links          []LinkSpec
	Enclosures     []EnclosureSpec
	Plates         []PlateSpec
}

// Ambient describes the air around the box.
type Ambient struct {
	Temperature float64 // K
	Pressure    float64 // absolute, Pa
	Altitude    float64 // m above sea level, when given (else 0)
	FromAlt     bool    // the pressure was derived from Altitude
	Line        int
	// TemperatureProfile, when not nil, gives the temperature during a
	// run; Temperature is its value at t = 0.
	TemperatureProfile Profile
}

// AmbientID is the name of the node that stands for the ambient; every model
// has it, held at the ambient temperature.
const AmbientID = "ambient"

// NodeKind tells what decides a node's temperature.
type NodeKind string

// Node kinds.
const (
	// Solid: a body whose temperature the solve finds.
	Solid NodeKind = "solid"
	// Fixed: a boundary held at a given temperature (ambient, a cold
	// plate, a chassis held by a larger system).
	Fixed NodeKind = "fixed"
	// Junction: the junction node of a component's compact model.
	Junction NodeKind = "junction"
	// Plate: a meshed plate, shown as one node whose temperature is its
	// hottest cell's; its cells are variables of their own.
	Plate NodeKind = "plate"
	// Air: air at one place, the well-mixed air of a compartment or the
	// bulk temperature of a stream at one station along its path.
	Air NodeKind = "air"
)

// NodeSpec is one entry of the nodes list.
type NodeSpec struct {
	ID          string
	Kind        NodeKind // Solid, Fixed or Air
	Power       float64  // heat input, W (Solid only)
	Capacity    float64  // heat capacity, J/K; 0 when not given
	Temperature float64  // K (Fixed only)
	Limit       float64  // highest allowed temperature, K (when HasLimit)
	HasLimit    bool
	Height      float64 // elevation of an air node, m, for the stack effect (Air only)
	Pressure    float64 // gauge pressure above ambient where air leaves or enters, Pa (Fixed only)
	Note        string
	Group       string // what the node belongs to (a board, a heat sink), for diagrams; "" for none
	Line        int
	// PowerProfile and TemperatureProfile, when not nil, give the power or
	// the fixed temperature during a run; Power and Temperature are their
	// values at t = 0.
	PowerProfile, TemperatureProfile Profile
}

// ComponentSpec is a part described by the JEDEC two-resistor compact model
// (JESD15-3): a junction node joined to the case top through R_jc and to the
// board through R_jb.
type ComponentSpec struct {
	ID       string
	Power    float64 // dissipated at the junction, W
	Capacity float64 // heat capacity of the junction, J/K; 0 when not given
	RJC      float64 // junction to case, K/W (when Case is set)
	RJB      float64 // junction to board, K/W (when Board is set)
	Case     string  // node at the case top; "" for an adiabatic top
	Board    string  // board node (or plate) under the part; "" for none
	// At and Footprint place the part on a plate (when Board names one):
	// the centre of its footprint, m, in the plate's plane, and the
	// footprint's size along x and y, m. Side is the plate's face it sits
	// on, "top" or "bottom".
	At, Footprint [2]float64
	Placed        bool // At and Footprint are given
	placing       bool // at:, footprint: or side: is in the file, valid or not
	Side          string
	Limit         float64 // highest allowed junction temperature, K (when HasLimit)
	HasLimit      bool
	Note          string
	Group         string // as NodeSpec.Group
	Line          int
	// PowerProfile, when not nil, gives the power during a run; Power is
	// its value at t = 0.
	PowerProfile Profile
}

// LinkSpec is one entry of the links list.
type LinkSpec struct {
	ID     string
	Kind   string // one of LinkKinds
	From   string
	To     string
	Others []string // further nodes the link joins (a channel's inlet)
	Note   string
	Line   int
	Params LinkParams // nil when the entry had errors
}
