package solve

// Settings control the Newton iteration. The zero value of a field means its
// default, so Settings{} is a valid choice.
type Settings struct {
	// MaxIterations is the most Newton iterations. Default 100.
	MaxIterations int
	// StepTolerance is the largest absolute Newton step at convergence, in
	// the unknowns' units (K for temperatures). Default 1e-7.
	StepTolerance float64
	// ResidualTolerance is the largest residual at convergence, relative to
	// the scale Problem.Evaluate returns. Default 1e-9.
	ResidualTolerance float64
	// Armijo is the sufficient-decrease constant c of the line search: a
	// step λ is accepted when ‖F(x+λp)‖² ≤ (1 − 2cλ)‖F(x)‖². Default 1e-4.
	Armijo float64
	// MinStep is the shortest fraction λ of the Newton step the line search
	// tries before it gives up. Default 1e-8.
	MinStep float64
	// MaxChange limits the largest change of any unknown in one iteration
	// (K for temperatures); longer Newton steps are scaled down. Default
	// 200.
	MaxChange float64
	// PseudoStep is the change of the unknowns (K for temperatures) that
	// a pseudo-transient step aims at when the Jacobian is singular; see
	// Newton. Default 10.
	PseudoStep float64
	// Linear solves the Newton systems. Default NewDenseLU().
	Linear LinearSolver
	// Monitor, if not nil, is called after every iteration.
	Monitor Monitor
}

// Defaults of Settings.
const (
	DefaultMaxIterations     = 100
	DefaultStepTolerance     = 1e-7
	DefaultResidualTolerance = 1e-9
	DefaultArmijo            = 1e-4
	DefaultMinStep           = 1e-8
	DefaultMaxChange         = 200
	DefaultPseudoStep        = 10
)

// withDefaults returns s with every zero field replaced by its default.
func (s Settings) withDefaults() Settings {
	if s.MaxIterations <= 0 {
		s.MaxIterations = DefaultMaxIterations
	}
	if s.StepTolerance <= 0 {
		s.StepTolerance = DefaultStepTolerance
	}
	if s.ResidualTolerance <= 0 {
		s.ResidualTolerance = DefaultResidualTolerance
	}
	if s.Armijo <= 0 {
		s.Armijo = DefaultArmijo
	}
	if s.MinStep <= 0 {
		s.MinStep = DefaultMinStep
	}
	if s.MaxChange <= 0 {
		s.MaxChange = DefaultMaxChange
	}
	if s.PseudoStep <= 0 {
		s.PseudoStep = DefaultPseudoStep
	}
	if s.Linear == nil {
		s.Linear = NewDenseLU()
	}
	return s
}

// Iterate describes one Newton iteration, for monitors.
type Iterate struct {
	Iteration int     // 1 for the first step
	Residual  float64 // largest |F| after the step
	Scaled    float64 // Residual divided by the residual scale
	Step      float64 // largest |Δx| taken
	Lambda    float64 // fraction of the Newton step taken
}

// Monitor watches the iteration; see Settings.Monitor.
type Monitor func(Iterate)
