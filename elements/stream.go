package elements

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
type Stream struct {
	Up, Down int
	Flow     int // the variable holding the mass flow, kg/s
}

// Rows returns Up and Down.
func (s *Stream) Rows() []int { return []int{s.Up, s.Down} }

// Vars returns Up, Down and Flow.
func (s *Stream) Vars() []int { return []int{s.Up, s.Down, s.Flow} }

// Eval moves the enthalpy from Up to Down.
func (s *Stream) Eval(st *State, l *Local) {
	m := st.X[s.Flow]
	rise := st.X[s.Up] - st.Env.AmbientT
	c := m * st.Env.AirCp
	stampPair(l, c*rise, c, 0)
	dm := st.Env.AirCp * rise
	l.D(0, 2, -dm)
	l.D(1, 2, dm)
}

// Paths returns the heat the air carries above ambient.
func (s *Stream) Paths(st *State) []Path {
	h := st.X[s.Flow] * st.Env.AirCp * (st.X[s.Up] - st.Env.AmbientT)
	return []Path{{From: s.Up, To: s.Down, Heat: h, Carried: true}}
}

// Report gives the mass flow, the capacity rate ṁc_p and the air
// temperature carried.
func (s *Stream) Report(st *State) Report {
	m := st.X[s.Flow]
	return Report{Details: []Detail{
		{Name: "mass_flow", Value: m, Unit: "kg/s"},
		{Name: "capacity_rate", Value: m * st.Env.AirCp, Unit: "W/K"},
		{Name: "air_temperature", Value: st.X[s.Up] - 273.15, Unit: "degC"},
	}}
}
