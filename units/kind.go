package units

import "fmt"

// Kind names the physical quantity a model field expects.
type Kind int

// The kinds of quantity Parse can read. The comment on each gives the SI
// unit of the result.
const (
	Dimensionless           Kind = iota // 1; also accepts "%": "85 %" is 0.85
	Length                              // m
	Area                                // m2
	Volume                              // m3
	Mass                                // kg
	Time                                // s
	Temperature                         // K, absolute: "35 degC" and "95 F" are 308.15
	TemperatureDifference               // K: "5 degC" is 5, "9 degF" is 5
	Power                               // W
	Energy                              // J
	HeatFlux                            // W/m2
	Conductivity                        // W/(m K), thermal conductivity
	ThermalResistance                   // K/W
	Conductance                         // W/K, thermal conductance
	SpecificResistance                  // K m2/W, area-specific thermal resistance
	HeatTransferCoefficient             // W/(m2 K)
	Pressure                            // Pa
	VolumeFlow                          // m3/s
	MassFlow                            // kg/s
	Velocity                            // m/s
	Density                             // kg/m3
	SpecificHeat                        // J/(kg K)
	HeatCapacity                        // J/K
	DynamicViscosity                    // Pa s
	Acceleration                        // m/s2
)

// kindInfo describes a Kind: its name, its SI unit, a few valid units, a
// sample value for messages and its dimension.
type kindInfo struct {
	name     string
	si       string
	examples string
	sample   string
	dim      dimension
}

var kinds = [...]kindInfo{
	Dimensionless:           {"dimensionless number", "", "%", "0.85", dimension{}},
	Length:                  {"length", "m", "mm, cm, m, in, mil", "1.6 mm", dimLength},
	Area:                    {"area", "m2", "mm2, cm2, m2, in2", "25 mm2", dimArea},
	Volume:                  {"volume", "m3", "cm3, L, m3, in3", "2 L", dimVolume},
	Mass:                    {"mass", "kg", "g, kg, lb", "0.5 kg", dimMass},
	Time:                    {"time", "s", "ms, s, min, h", "10 min", dimTime},
	Temperature:             {"temperature", "K", "degC, degF, K", "35 degC", dimTemperature},
	TemperatureDifference:   {"temperature difference", "K", "K, degC, degF", "10 K", dimTemperature},
	Power:                   {"power", "W", "mW, W, kW, BTU/h", "12 W", dimPower},
	Energy:                  {"energy", "J", "J, kJ, Wh, BTU", "5 kJ", dimEnergy},
	HeatFlux:                {"heat flux", "W/m2", "W/m2, W/cm2, BTU/(h ft2)", "500 W/m2", dimHeatFlux},
	Conductivity:            {"thermal conductivity", "W/(m K)", "W/m/K, W/(m K), BTU/(h ft F)", "0.3 W/m/K", dimConductivity},
	ThermalResistance:       {"thermal resistance", "K/W", "K/W, degC/W", "1.5 K/W", dimThermalResistance},
	Conductance:             {"thermal conductance", "W/K", "W/K, mW/K, BTU/(h F)", "0.2 W/K", dimConductance},
	SpecificResistance:      {"area-specific thermal resistance", "K m2/W", "K*m2/W, K*cm2/W, K*mm2/W", "0.5 K*cm2/W", dimSpecificResistance},
	HeatTransferCoefficient: {"heat transfer coefficient", "W/(m2 K)", "W/(m2 K), W/m2/K, BTU/(h ft2 F)", "10 W/(m2 K)", dimHeatTransferCoefficient},
	Pressure:                {"pressure", "Pa", "Pa, kPa, bar, psi, inH2O", "101.3 kPa", dimPressure},
	VolumeFlow:              {"volume flow", "m3/s", "m3/s, m3/h, L/min, CFM", "20 CFM", dimVolumeFlow},
	MassFlow:                {"mass flow", "kg/s", "kg/s, g/s, kg/h, lb/h", "0.01 kg/s", dimMassFlow},
	Velocity:                {"velocity", "m/s", "m/s, ft/min, km/h", "3 m/s", dimVelocity},
	Density:                 {"density", "kg/m3", "kg/m3, g/cm3, lb/ft3", "1.2 kg/m3", dimDensity},
	SpecificHeat:            {"specific heat", "J/(kg K)", "J/(kg K), J/kg/K, BTU/(lb F)", "1005 J/(kg K)", dimSpecificHeat},
	HeatCapacity:            {"heat capacity", "J/K", "J/K, kJ/K", "50 J/K", dimHeatCapacity},
	DynamicViscosity:        {"dynamic viscosity", "Pa s", "Pa s, mPa s, kg/(m s)", "1.8e-5 Pa s", dimDynamicViscosity},
	Acceleration:            {"acceleration", "m/s2", "m/s2, ft/s2", "9.81 m/s2", dimAcceleration},
}

// info returns the description of k and whether k is one of the declared
// kinds.
func (k Kind) info() (kindInfo, bool) {
	if k < 0 || int(k) >= len(kinds) {
		return kindInfo{}, false
	}
	return kinds[k], true
}

// String returns the name of the quantity, such as "length", "area" or
// "thermal resistance". An undeclared Kind prints as "Kind(n)".
func (k Kind) String() string {
	if i, ok := k.info(); ok {
		return i.name
	}
	return fmt.Sprintf("Kind(%d)", int(k))
}

// SIUnit returns the SI unit of Parse's result for k, written so that Parse
// reads it back: "m", "m2", "K/W", "W/(m K)". It is "K" for Temperature and
// the empty string for Dimensionless and for an undeclared Kind.
func (k Kind) SIUnit() string {
	i, _ := k.info()
	return i.si
}

// Examples returns a few valid units of k, separated by ", ", for use in
// messages; for Area it is "mm2, cm2, m2, in2". It is empty for an
// undeclared Kind.
func (k Kind) Examples() string {
	i, _ := k.info()
	return i.examples
}

// withArticle returns name preceded by "a" or "an".
func withArticle(name string) string {
	if name != "" && (name[0] == 'a' || name[0] == 'e' || name[0] == 'i' || name[0] == 'o' || name[0] == 'u') {
		return "an " + name
	}
	return "a " + name
}

// describe names the kind of quantity a unit of dimension d measures, such
// as "a length", or else gives its dimension in SI base units.
func describe(d dimension) string {
	for _, i := range kinds {
		if i.dim == d {
			return withArticle(i.name)
		}
	}
	return "of dimension " + d.String()
}
