// Package viz presents solved networks: the text report, JSON and CSV for
// scripts, and heat-path diagrams as DOT, SVG or PNG. It never solves; it
// reads a network.Solution.
//
// A meshed plate is one node of the reports, at its hottest cell, with a
// summary of its own (plates.go); its heat map is drawn as SVG or PNG
// (heatmap.go) and its cells are written on request as CSV or compact JSON
// (platecells.go).
//
// Units are stated everywhere: text headers carry them, JSON and CSV put
// them in the key and column names (temperature_degC, heat_W, margin_K).
// Temperatures are shown in degrees Celsius, differences in kelvin, heat
// flows in watts.
package viz

// Caution is printed with every result. Lumped models are estimates; people
// can be hurt by hot surfaces and failed safety parts.
const Caution = "Results are estimates from a lumped thermal model. Confirm them by measurement on the real product, " +
	"and defer to local codes, product-safety standards (touch-temperature limits among them) and licensed engineering practice."

// Run describes how the solve went, for the reports.
type Run struct {
	Converged  bool
	Reason     string // the solver's stop reason
	Iterations int    // Newton iterations
	// LinearIterations counts the linear solver's iterations (0 when
	// every linear solve was direct).
	LinearIterations int
	// Worst names the equation with the largest residual relative to its
	// own magnitude (e.g. `heat balance of "cpu"`); Residual is its
	// residual in WorstUnit and Scaled the ratio.
	Worst     string
	WorstUnit string
	Residual  float64
	Scaled    float64
	// Kinds reports each kind of unknown (temperature, pressure, mass
	// flow) that the model has.
	Kinds []KindRun
}

// KindRun is the state of one kind of unknown at the end of a solve.
type KindRun struct {
	Name, Unit             string // e.g. "temperature", "K"
	Equation, EquationUnit string // e.g. "heat balance", "W"
	Unknowns               int
	Step                   float64 // largest component of the last Newton step, Unit
	Residual               float64 // largest residual, EquationUnit
	Scaled                 float64 // largest residual relative to its equation's magnitude
	Converged              bool
}

// kelvin is the offset between kelvin and degrees Celsius.
const kelvin = 273.15

// celsius converts an absolute temperature in K to °C.
func celsius(t float64) float64 { return t - kelvin }
