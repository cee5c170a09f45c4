package solve

// Settings control the Newton iteration. DefaultSettings returns the
// defaults; a zero field also means its default, so Settings{} is valid.
type Settings struct {
	// MaxIterations is the most Newton iterations. Default 100.
	MaxIterations int
	// StepTolerance is the largest full Newton step, relative to each
	// unknown's Kind.Scale, at which the iteration may stop. Default 1e-7
	// (1e-7 K for temperatures of scale 1 K).
	StepTolerance float64
	// ResidualTolerance is the largest residual of each equation at
	// convergence, relative to that equation's own magnitude (the heat
	// that moves through the node, not through the whole network), plus
	// its kind's ResidualFloor. Default 1e-9.
	ResidualTolerance float64
	// PseudoStep is the change, relative to Kind.Scale, that a
	// pseudo-transient step aims at when the Jacobian is singular (see
	// Newton). Default 10.
	PseudoStep float64
	// MaxPseudoSteps, when positive, bounds the pseudo-transient steps of
	// one solve. By default only MaxIterations bounds them; a solve that
	// ends still taking pseudo-transient steps stops as SingularJacobian,
	// naming the undetermined unknowns.
	MaxPseudoSteps int
	// Linear solves the Newton systems. Default: a DenseLU for up to
	// DenseLimit unknowns.
	Linear LinearSolver
	// LineSearch chooses how far to go along each Newton step. Default
	// Backtracking{}.
	LineSearch LineSearch
	// Monitors are called after every iteration, in order.
	Monitors []Monitor
	// Monitor, if not nil, is called after every iteration, after
	// Monitors.
	Monitor Monitor
}

// Defaults of Settings.
const (
	DefaultMaxIterations     = 100
	DefaultStepTolerance     = 1e-7
	DefaultResidualTolerance = 1e-9
	DefaultPseudoStep        = 10
)

// DefaultSettings returns the settings with every default filled in.
func DefaultSettings() Settings { return Settings{}.withDefaults() }

// withDefaults returns s with every zero field replaced by its default.
// The linear solver is left nil when not given: Newton picks one for the
// problem's size.
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
	if s.PseudoStep <= 0 {
		s.PseudoStep = DefaultPseudoStep
	}
	if s.LineSearch == nil {
		s.LineSearch = Backtracking{}
	}
	return s
}

// Iterate describes one Newton iteration, for monitors.
type Iterate struct {
	Iteration int     // 1 for the first step
	Residual  float64 // largest |F| after the step, in mixed units
	Scaled    float64 // largest |F_i| relative to its equation's magnitude
	Worst     int     // the equation with the largest scaled residual
	Step      float64 // largest |Δx|/Scale taken
	Lambda    float64 // fraction of the Newton step taken
	Pseudo    bool    // the step was a pseudo-transient step
}

// Monitor watches the iteration; see Settings.Monitors.
type Monitor func(Iterate)
