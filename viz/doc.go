// Package viz presents solved networks: the text report, JSON and CSV for
// scripts, and heat-path diagrams as DOT, SVG or PNG. It never solves; it
// reads a network.Solution.
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
	Reason     string  // the solver's stop reason
	Iterations int     // Newton iterations
	Residual   float64 // largest residual, W
	Scaled     float64 // residual relative to the heat moving through the network
}

// kelvin is the offset between kelvin and degrees Celsius.
const kelvin = 273.15

// celsius converts an absolute temperature in K to °C.
func celsius(t float64) float64 { return t - kelvin }
