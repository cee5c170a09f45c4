package elements

import "math"

// Stream carries air from node Up to node Down at the mass flow of
// variable Flow, with the enthalpy it holds: the upwind (donor-cell) form
// of the energy equation of a flowing fluid,
//
//	H = ṁ·c_p·(T_Up − T_ref),
//
// leaves Up and enters Down. Chains of streams and channels make air warm
// along its path: each air node's balance ṁc_p(T_in − T_node) + Σq = 0 sets
// its temperature to the mixed temperature of the air leaving it. T_ref is
// the ambient temperature (Env.AmbientT) and c_p is Env.AirCp; since every
// air node passes on the mass it receives, the reference cancels out of
// every balance and only sets the reported value.
//
// When the flow is solved for, it may reverse: a Reversible stream then
// carries ṁ⁺·c_p·(T_Up − T_ref) from Up and ṁ⁻·c_p·(T_Down − T_ref) back
// from Down, with ṁ⁺ = (ṁ + √(ṁ² + ε²))/2, ṁ⁻ = ṁ⁺ − ṁ and ε =
// UpwindWidth: a smooth switch of the upwind side, exact in its derivatives
// and conserving energy for any ṁ.
type Stream struct {
	Up, Down   int
	Flow       int // the variable holding the mass flow, kg/s
	Reversible bool
}

// split returns ṁ⁺, ṁ⁻ and their derivatives with respect to ṁ.
func split(m float64) (mp, mn, dmp, dmn float64) {
	sq := math.Sqrt(m*m + UpwindWidth*UpwindWidth)
	mp, mn = (m+sq)/2, (sq-m)/2
	return mp, mn, (1 + m/sq) / 2, (m/sq - 1) / 2
}

// carried returns the heat the stream carries from Up to Down above the
// ambient, W, and its derivatives with respect to T_Up, T_Down and ṁ.
func (s *Stream) carried(st *State) (h, dUp, dDown, dm float64) {
	m := st.X[s.Flow]
	cp := st.Env.AirCp
	ru, rd := st.X[s.Up]-st.Env.AmbientT, st.X[s.Down]-st.Env.AmbientT
	if !s.Reversible {
		return m * cp * ru, m * cp, 0, cp * ru
	}
	mp, mn, dmp, dmn := split(m)
	return cp * (mp*ru - mn*rd), cp * mp, -cp * mn, cp * (dmp*ru - dmn*rd)
}

// Rows returns Up and Down.
func (s *Stream) Rows() []int { return []int{s.Up, s.Down} }

// Vars returns Up, Down and Flow.
func (s *Stream) Vars() []int { return []int{s.Up, s.Down, s.Flow} }

// Eval moves the enthalpy from Up to Down.
func (s *Stream) Eval(st *State, l *Local) {
	h, du, dd, dm := s.carried(st)
	stampPair(l, h, du, dd)
	l.D(0, 2, -dm)
	l.D(1, 2, dm)
}

// Paths returns the heat the air carries above ambient.
func (s *Stream) Paths(st *State) []Path {
	h, _, _, _ := s.carried(st)
	return []Path{{From: s.Up, To: s.Down, Heat: h, Carried: true}}
}

// Report gives the mass flow, the capacity rate ṁc_p and the air
// temperature carried.
func (s *Stream) Report(st *State) Report {
	m := st.X[s.Flow]
	up := s.Up
	if s.Reversible && m < 0 {
		up = s.Down // the air comes from the other end
	}
	return Report{Details: []Detail{
		{Name: "mass_flow", Value: m, Unit: "kg/s"},
		{Name: "capacity_rate", Value: m * st.Env.AirCp, Unit: "W/K"},
		{Name: "air_temperature", Value: st.X[up] - 273.15, Unit: "degC"},
	}}
}
