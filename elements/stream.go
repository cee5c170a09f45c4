package elements

// Stream carries air from node Up to node Down at a given mass flow, with the
// enthalpy it holds: the upwind (donor-cell) form of the energy equation of
// a flowing fluid,
//
//	H = ṁ·c_p·(T_Up − T_ref),
//
// leaves Up and enters Down. Chains of streams and channels make air warm
// along its path: each air node's balance ṁc_p(T_in − T_node) + Σq = 0 sets
// its temperature to the mixed temperature of the air leaving it. T_ref is
// the ambient temperature (Env.AmbientT) and c_p is Env.AirCp; since every
// air node passes on the mass it receives, the reference cancels out of
// every balance and only sets the reported value.
type Stream struct {
	Up, Down int
	MassFlow float64 // kg/s
}

// Nodes returns Up and Down.
func (s *Stream) Nodes() []int { return []int{s.Up, s.Down} }

// Stamp moves the enthalpy from Up to Down.
func (s *Stream) Stamp(st *State, out Stamper) {
	c := s.MassFlow * st.Env.AirCp
	stampPair(out, s.Up, s.Down, c*(st.T[s.Up]-st.Env.AmbientT), c, 0)
}

// Report gives the mass flow, the capacity rate ṁc_p and the air
// temperature carried.
func (s *Stream) Report(st *State) Report {
	return Report{Details: []Detail{
		{Name: "mass_flow", Value: s.MassFlow, Unit: "kg/s"},
		{Name: "capacity_rate", Value: s.MassFlow * st.Env.AirCp, Unit: "W/K"},
		{Name: "air_temperature", Value: st.T[s.Up] - 273.15, Unit: "degC"},
	}}
}
