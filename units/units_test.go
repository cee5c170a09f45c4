package units

import (
	"errors"
	"math"
	"strconv"
	"strings"
	"testing"
)

// Tolerances for comparisons with published factors.
const (
	exact = 1e-12 // a factor that is exact by definition; allows for rounding in float64
	sp811 = 1e-6  // a factor SP 811 gives to 7 significant digits
)

// checkClose reports an error unless got is within the relative tolerance
// rel of want, or within rel of zero when want is zero.
func checkClose(t *testing.T, name string, got, want, rel float64) {
	t.Helper()
	scale := math.Abs(want)
	if scale == 0 {
		scale = 1
	}
	if !(math.Abs(got-want) <= rel*scale) {
		t.Errorf("%s: got %.10g, want %.10g (relative tolerance %g)", name, got, want, rel)
	}
}

// checkParse parses in as kind and compares the result with want.
func checkParse(t *testing.T, in string, kind Kind, want, rel float64) {
	t.Helper()
	got, err := Parse(in, kind)
	if err != nil {
		t.Errorf("Parse(%q, %v): %v", in, kind, err)
		return
	}
	checkClose(t, "Parse("+strconv.Quote(in)+", "+kind.String()+")", got, want, rel)
}

// parseError parses in as kind and returns the *Error, failing the test if
// there is none.
func parseError(t *testing.T, in string, kind Kind) *Error {
	t.Helper()
	got, err := Parse(in, kind)
	if err == nil {
		t.Errorf("Parse(%q, %v) = %g, want an error", in, kind, got)
		return nil
	}
	var e *Error
	if !errors.As(err, &e) {
		t.Errorf("Parse(%q, %v): error %v is a %T, want *Error", in, kind, err, err)
		return nil
	}
	return e
}

// TestParseAgainstSP811 checks conversion factors against NIST Special
// Publication 811, 2008 edition (A. Thompson and B. N. Taylor, Guide for the
// Use of the International System of Units (SI)), Appendix B.8 "Factors for
// units listed alphabetically" and B.9 "Factors for units listed by kind of
// quantity or field of science". SP 811 prints seven significant digits, or
// marks a factor exact.
func TestParseAgainstSP811(t *testing.T) {
	tests := []struct {
		in   string
		kind Kind
		want float64
		rel  float64
	}{
		// Length.
		{"1 in", Length, 2.54e-02, exact},      // SP 811 B.8: inch, 2.54 E-02 (exact)
		{"1 inch", Length, 2.54e-02, exact},    // SP 811 B.8: inch, 2.54 E-02 (exact)
		{"1 ft", Length, 3.048e-01, exact},     // SP 811 B.8: foot, 3.048 E-01 (exact)
		{"1 mil", Length, 2.54e-05, exact},     // SP 811 B.8: mil (0.001 in), 2.54 E-05 (exact); from memory
		{"1 thou", Length, 2.54e-05, exact},    // as mil; from memory
		{"1 in2", Area, 6.4516e-04, exact},     // SP 811 B.8: square inch, 6.4516 E-04 (exact)
		{"1 ft2", Area, 9.290304e-02, exact},   // SP 811 B.8: square foot, 9.290 304 E-02 (exact)
		{"1 ft3", Volume, 2.831685e-02, sp811}, // SP 811 B.8: cubic foot, 2.831 685 E-02
		{"1 L", Volume, 1.0e-03, exact},        // SP 811 B.8: liter, 1.0 E-03 (exact); Table 6
		{"1 l", Volume, 1.0e-03, exact},        // SP 811 Table 6: l or L
		// Mass.
		{"1 lb", Mass, 4.5359237e-01, exact},  // SP 811 B.8: pound (avoirdupois), 4.535 923 7 E-01 (exact)
		{"1 lbm", Mass, 4.5359237e-01, exact}, // as lb
		// Energy and power.
		{"1 BTU", Energy, 1.055056e+03, sp811},       // SP 811 B.8: British thermal unit_IT, 1.055 056 E+03
		{"1 Btu", Energy, 1.055056e+03, sp811},       // as BTU
		{"1 cal", Energy, 4.1868, exact},             // SP 811 B.8: calorie_IT, 4.1868 (exact)
		{"1 kcal", Energy, 4.1868e+03, exact},        // SP 811 B.8: kilocalorie_IT, 4.1868 E+03 (exact)
		{"1 Wh", Energy, 3.6e+03, exact},             // SP 811 B.8: watt hour, 3.6 E+03 (exact)
		{"1 kWh", Energy, 3.6e+06, exact},            // SP 811 B.8: kilowatt hour, 3.6 E+06 (exact)
		{"1 BTU/h", Power, 2.930711e-01, sp811},      // SP 811 B.8: British thermal unit_IT per hour, 2.930 711 E-01
		{"1 hp", Power, 7.456999e+02, sp811},         // SP 811 B.8: horsepower (550 ft·lbf/s), 7.456 999 E+02
		{"1 BTU/(h ft2)", HeatFlux, 3.154591, sp811}, // SP 811 B.8: Btu_IT per hour square foot, 3.154 591
		// Heat transfer.
		{"1 BTU/(h ft F)", Conductivity, 1.730735, sp811},             // SP 811 B.8: Btu_IT per hour foot degree Fahrenheit, 1.730 735
		{"1 BTU/h/ft/degF", Conductivity, 1.730735, sp811},            // as above, written with "/"
		{"1 BTU/(h ft2 F)", HeatTransferCoefficient, 5.678263, sp811}, // SP 811 B.8: Btu_IT per hour square foot degree Fahrenheit, 5.678 263
		{"1 BTU/(lb degF)", SpecificHeat, 4.1868e+03, exact},          // SP 811 B.8: Btu_IT per pound degree Fahrenheit, 4.1868 E+03 (exact)
		// Pressure.
		{"1 psi", Pressure, 6.894757e+03, sp811},  // SP 811 B.8: pound-force per square inch, 6.894 757 E+03
		{"1 atm", Pressure, 1.01325e+05, exact},   // SP 811 B.8: atmosphere, standard, 1.013 25 E+05 (exact)
		{"1 bar", Pressure, 1.0e+05, exact},       // SP 811 B.8: bar, 1.0 E+05 (exact)
		{"1 mbar", Pressure, 1.0e+02, exact},      // SP 811 B.8: millibar, 1.0 E+02 (exact); from memory
		{"1 torr", Pressure, 1.333224e+02, sp811}, // SP 811 B.8: torr (Torr), 1.333 224 E+02
		{"1 Torr", Pressure, 1.333224e+02, sp811}, // as torr
		{"1 mmHg", Pressure, 1.333224e+02, sp811}, // SP 811 B.8: millimeter of mercury, conventional, 1.333 224 E+02; from memory
		{"1 inHg", Pressure, 3.386389e+03, sp811}, // SP 811 B.8: inch of mercury, conventional, 3.386 389 E+03
		// SP 811 B.8 also lists inch of mercury (32 °F), 3.386 38 E+03, shown to six
		// digits; the conventional unit agrees with it to 3e-6.
		{"1 inHg", Pressure, 3.38638e+03, 5e-6},
		{"1 inH2O", Pressure, 2.490889e+02, sp811}, // SP 811 B.8: inch of water, conventional, 2.490 889 E+02
		// SP 811 B.8: inch of water (39.2 °F), 2.490 82 E+02, from memory. The
		// conventional unit takes water at 1000 kg/m3 rather than 999.972 kg/m3
		// at 4 °C, a difference of 2.8e-5.
		{"1 inH2O", Pressure, 2.49082e+02, 5e-5},
		{"1 mmH2O", Pressure, 9.80665, exact}, // SP 811 B.8: millimeter of water, conventional, 9.806 65 (exact)
		// Flow and motion.
		{"1 CFM", VolumeFlow, 4.719474e-04, sp811},     // SP 811 B.8: cubic foot per minute, 4.719 474 E-04
		{"1 cfm", VolumeFlow, 4.719474e-04, sp811},     // as CFM
		{"1 ft3/min", VolumeFlow, 4.719474e-04, sp811}, // as CFM
		{"1 lb/ft3", Density, 1.601846e+01, sp811},     // SP 811 B.8: pound per cubic foot, 1.601 846 E+01
		{"1 ft/min", Velocity, 5.08e-03, exact},        // SP 811 B.8: foot per minute, 5.08 E-03 (exact)
		{"1 ft/s2", Acceleration, 3.048e-01, exact},    // SP 811 B.8: foot per second squared, 3.048 E-01 (exact); from memory
		// Airflow as fan, filter and vent data give it.
		{"1 m3/h", VolumeFlow, 1.0 / 3600, exact},    // definition of the hour
		{"1 L/s", VolumeFlow, 1.0e-03, exact},        // SP 811 B.8: liter per second, 1.0 E-03 (exact)
		{"1 L/min", VolumeFlow, 1.666667e-05, sp811}, // SP 811 B.8: liter per minute, 1.666 667 E-05; from memory
		{"100 LFM", Velocity, 0.508, exact},          // SP 811 B.8: foot per minute, 5.08 E-03 (exact)
		{"1 FPM", Velocity, 5.08e-03, exact},         // as ft/min
		// inH2O is the conventional inch of water (1000 kg/m3, standard
		// gravity), within 2.8e-5 of SP 811's inch of water at 39.2 °F
		// (4 °C) and 1.0e-3 above its inch of water at 60 °F, 2.4884 E+02
		// (from memory): fan and filter data in inH2O are read at 4 °C.
		{"1 inH2O", Pressure, 2.4884e+02, 1.1e-3},
		{"0.1 inH2O", Pressure, 24.90889, sp811}, // SP 811 B.8: inch of water, conventional, 2.490 889 E+02
		{"3000 rpm", RotationalSpeed, 50, exact},
		// A flow resistance from SP 811 B.8 factors: inch of water,
		// conventional, 2.490 889 E+02 Pa over (cubic foot per minute,
		// 4.719 474 E-04 m3/s) squared.
		{"1 inH2O/CFM^2", FlowResistance, 2.490889e+02 / (4.719474e-04 * 4.719474e-04), 3 * sp811},
		{"2e5 Pa/(m3/s)^2", FlowResistance, 2e5, exact}, // SP 811 B.8: revolution per minute, 1.666 667 E-02 (1/60, exact)
	}
	for _, tt := range tests {
		checkParse(t, tt.in, tt.kind, tt.want, tt.rel)
	}
}

func TestParseTemperature(t *testing.T) {
	tests := []struct {
		in   string
		kind Kind
		want float64
	}{
		// SP 811 B.9: T/K = t/°C + 273.15 and T/K = (t/°F + 459.67)/1.8.
		{"35 degC", Temperature, 308.15},
		{"35 °C", Temperature, 308.15},
		{"35 ℃", Temperature, 308.15},
		{"35 C", Temperature, 308.15},
		{"35C", Temperature, 308.15},
		{"95 F", Temperature, 308.15},
		{"95 degF", Temperature, 308.15},
		{"95 °F", Temperature, 308.15},
		{"95 ℉", Temperature, 308.15},
		{"32 degF", Temperature, 273.15},
		{"212 degF", Temperature, 373.15},
		{"-40 degC", Temperature, 233.15},
		{"−40 degC", Temperature, 233.15}, // Unicode minus sign
		{"-40 degF", Temperature, 233.15},
		{"300 K", Temperature, 300},
		{"300", Temperature, 300}, // a bare number is in kelvins
		{"300000 mK", Temperature, 300},
		{"-273.15 degC", Temperature, 0},
		{"-459.67 F", Temperature, 0},
		{"0 K", Temperature, 0},
		{"20 (degC)", Temperature, 293.15},
		{"20 degC^1", Temperature, 293.15},
		// Differences and compound units have no offset.
		{"5 K", TemperatureDifference, 5},
		{"5 degC", TemperatureDifference, 5},
		{"5 C", TemperatureDifference, 5},
		{"9 degF", TemperatureDifference, 5},
		{"9 °F", TemperatureDifference, 5},
		{"-18 F", TemperatureDifference, -10},
		{"5", TemperatureDifference, 5},
		{"2 degC/W", ThermalResistance, 2},
		{"1.8 degF/W", ThermalResistance, 1},
		{"0.3 W/m/degC", Conductivity, 0.3},
		{"1 W/(m °F)", Conductivity, 1.8},
		{"0.5 C*cm2/W", SpecificResistance, 5e-5},
		{"10 W/(m2 C)", HeatTransferCoefficient, 10},
	}
	for _, tt := range tests {
		checkParse(t, tt.in, tt.kind, tt.want, 1e-12)
	}
}

func TestParseForms(t *testing.T) {
	tests := []struct {
		in   string
		kind Kind
		want float64
	}{
		// Bare numbers are SI, in any notation.
		{"0.002", Length, 0.002},
		{"2", Area, 2},
		{"+5", Power, 5},
		{"-3.5e-3", Length, -3.5e-3},
		{".5", Length, 0.5},
		{"5.", Length, 5},
		{"1.2e5", Pressure, 1.2e5},
		{"  12  ", Power, 12},
		// Number and unit, with and without space.
		{"1.6 mm", Length, 1.6e-3},
		{"2mm", Length, 2e-3},
		{"2   mm  ", Length, 2e-3},
		{"1.2e5 Pa", Pressure, 1.2e5},
		{"1.2E+5Pa", Pressure, 1.2e5},
		{"12e-1 W", Power, 1.2},
		{"12 W", Power, 12},
		// Prefixes.
		{"1 µm", Length, 1e-6}, // micro sign
		{"1 μm", Length, 1e-6}, // Greek mu
		{"1 um", Length, 1e-6},
		{"1 nm", Length, 1e-9},
		{"1 cm", Length, 1e-2},
		{"1 dm", Length, 1e-1},
		{"1 km", Length, 1e3},
		{"1 g", Mass, 1e-3},
		{"1 mg", Mass, 1e-6},
		{"1 kg", Mass, 1},
		{"1 ms", Time, 1e-3},
		{"1 min", Time, 60},
		{"1 h", Time, 3600},
		{"1 hr", Time, 3600},
		{"1 mW", Power, 1e-3},
		{"1 kW", Power, 1e3},
		{"1 MW", Power, 1e6},
		{"1 kJ", Energy, 1e3},
		{"1 hPa", Pressure, 100},
		{"1 kPa", Pressure, 1e3},
		{"1 MPa", Pressure, 1e6},
		{"1 N/m2", Pressure, 1},
		{"1 kN/m2", Pressure, 1e3},
		{"1 mL", Volume, 1e-6},
		{"1 ml", Volume, 1e-6},
		{"1 cm3", Volume, 1e-6},
		{"1 mK", TemperatureDifference, 1e-3},
		// Compound units.
		{"25 mm2", Area, 25e-6},
		{"1 mm^2", Area, 1e-6},
		{"1 mm²", Area, 1e-6},
		{"1 (mm)^2", Area, 1e-6},
		{"1 in^3", Volume, 0.0254 * 0.0254 * 0.0254},
		{"1 m³", Volume, 1},
		{"0.3 W/m/K", Conductivity, 0.3},
		{"0.3 W/(m K)", Conductivity, 0.3},
		{"0.3 W/(m*K)", Conductivity, 0.3},
		{"0.3 W/(m·K)", Conductivity, 0.3},
		{"0.3 W m^-1 K^-1", Conductivity, 0.3},
		{"0.3 W m⁻¹ K⁻¹", Conductivity, 0.3},
		{"0.3 W / m / K", Conductivity, 0.3},
		{"0.5 K*cm2/W", SpecificResistance, 5e-5},
		{"0.5 K cm2/W", SpecificResistance, 5e-5},
		{"0.5 K·cm2/W", SpecificResistance, 5e-5},
		{"0.5 K⋅cm²/W", SpecificResistance, 5e-5},
		{"0.5 (K cm2)/W", SpecificResistance, 5e-5},
		{"0.5 K/(W/cm2)", SpecificResistance, 5e-5},
		{"10 W/(m2 K)", HeatTransferCoefficient, 10},
		{"10 W/m2/K", HeatTransferCoefficient, 10},
		{"10 W/(m^2*K)", HeatTransferCoefficient, 10},
		{"2 W/cm2", HeatFlux, 2e4},
		{"3 m/s", Velocity, 3},
		{"3 m s^-1", Velocity, 3},
		{"3 m·s⁻¹", Velocity, 3},
		{"36 km/h", Velocity, 10},
		{"9.81 m/s2", Acceleration, 9.81},
		{"9.81 m s^-2", Acceleration, 9.81},
		{"1 (m/s)/s", Acceleration, 1},
		{"2 L/min", VolumeFlow, 2e-3 / 60},
		{"2 lpm", VolumeFlow, 2e-3 / 60},
		{"2 LPM", VolumeFlow, 2e-3 / 60},
		{"36 m3/h", VolumeFlow, 0.01},
		{"36 kg/h", MassFlow, 0.01},
		{"1 g/s", MassFlow, 1e-3},
		{"1 g/cm3", Density, 1e3},
		{"1.2 kg/m3", Density, 1.2},
		{"1005 J/(kg K)", SpecificHeat, 1005},
		{"1.005 kJ/kg/K", SpecificHeat, 1005},
		{"50 J/K", HeatCapacity, 50},
		{"0.2 W/K", Conductance, 0.2},
		{"200 mW/K", Conductance, 0.2},
		{"1.5 K/W", ThermalResistance, 1.5},
		{"1.8e-5 Pa s", DynamicViscosity, 1.8e-5},
		{"1 mPa s", DynamicViscosity, 1e-3},
		{"1 mPa*s", DynamicViscosity, 1e-3},
		{"1 kg/(m s)", DynamicViscosity, 1},
		{"1 J/s", Power, 1},
		{"1 N m", Energy, 1},
		{"1 W s", Energy, 1},
		// Percent and ratios.
		{"85 %", Dimensionless, 0.85},
		{"85%", Dimensionless, 0.85},
		{"0.85", Dimensionless, 0.85},
		{"1 mm/m", Dimensionless, 1e-3},
	}
	for _, tt := range tests {
		checkParse(t, tt.in, tt.kind, tt.want, exact)
	}
}

func TestKinds(t *testing.T) {
	names := make(map[string]bool)
	for k := Dimensionless; k <= Acceleration; k++ {
		name := k.String()
		if name == "" || strings.HasPrefix(name, "Kind(") || names[name] {
			t.Errorf("Kind %d has name %q, which is empty, undeclared or a duplicate", int(k), name)
		}
		names[name] = true

		checkParse(t, "2.5", k, 2.5, 0)
		checkParse(t, "2.5 "+k.SIUnit(), k, 2.5, exact)
		for ex := range strings.SplitSeq(k.Examples(), ", ") {
			if _, err := Parse("1 "+ex, k); err != nil {
				t.Errorf("example %q of %v: %v", ex, k, err)
			}
		}
		if _, err := Parse(kinds[k].sample, k); err != nil {
			t.Errorf("sample of %v: %v", k, err)
		}
	}
	for _, tt := range []struct{ got, want string }{
		{ThermalResistance.String(), "thermal resistance"},
		{Conductivity.SIUnit(), "W/(m K)"},
		{Temperature.SIUnit(), "K"},
		{Area.Examples(), "mm2, cm2, m2, in2"},
		{Kind(-1).String(), "Kind(-1)"},
		{(FlowResistance + 1).SIUnit(), ""},
		{(FlowResistance + 1).Examples(), ""},
	} {
		if tt.got != tt.want {
			t.Errorf("got %q, want %q", tt.got, tt.want)
		}
	}
	for _, k := range []Kind{-1, FlowResistance + 1} {
		parseError(t, "1", k)
	}
}

func TestParseErrorMessages(t *testing.T) {
	tests := []struct {
		in   string
		kind Kind
		want string
	}{
		{"25 mm", Area, `"25 mm" is a length, but an area is needed (use e.g. mm2, cm2, m2, in2)`},
		{"3 mmm", Length, `unknown unit "mmm" in "3 mmm" (did you mean "mm"?)`},
		{"abc", Length, `"abc" is not a number with an optional unit (e.g. "1.6 mm")`},
		{"-300 degC", Temperature, `"-300 degC" is below absolute zero`},
		{"", Temperature, `empty value (expected a temperature, e.g. "35 degC")`},
		{"   ", Area, `empty value (expected an area, e.g. "25 mm2")`},
		{"5 W/K", Temperature, `"5 W/K" is a thermal conductance, but a temperature is needed (use e.g. degC, degF, K)`},
		{"3 W/m", Conductivity, `"3 W/m" is of dimension kg m s^-3, but a thermal conductivity is needed (use e.g. W/m/K, W/(m K), BTU/(h ft F))`},
		{"85 %", Length, `"85 %" is a dimensionless number, but a length is needed (use e.g. mm, cm, m, in, mil)`},
		{"0.3 W/m K", Conductivity, `"0.3 W/m K" is of dimension kg m s^-3 K, but a thermal conductivity is needed (did you mean "W/(m K)"? "/" divides only by the unit right after it)`},
		{"-40", Temperature, `"-40" is below absolute zero (a number without a unit is in kelvins; for Celsius write "-40 degC")`},
		{"3 W/(m K", Conductivity, `malformed unit "W/(m K" in "3 W/(m K": missing ")" (use e.g. W/m/K, W/(m K), BTU/(h ft F))`},
		{"3 degC m/m", Temperature, `"3 degC m/m" has a compound unit, but an absolute temperature needs a single one (use e.g. degC, degF, K)`},
		{"1e999 m", Length, `"1e999 m" is out of range`},
		{"1 Watt", Power, `unknown unit "Watt" in "1 Watt" (use e.g. mW, W, kW, BTU/h)`},
	}
	for _, tt := range tests {
		if e := parseError(t, tt.in, tt.kind); e != nil && e.Error() != tt.want {
			t.Errorf("Parse(%q, %v):\n got %s\nwant %s", tt.in, tt.kind, e.Error(), tt.want)
		}
	}
}

func TestParseErrors(t *testing.T) {
	tests := []struct {
		in   string
		kind Kind
	}{
		{"NaN", Length},
		{"nan", Length},
		{"Inf", Length},
		{"+Inf m", Length},
		{"-1e999", Length},
		{"1e400 m", Length},
		{"1e300 km^9", Length},
		{"0x10", Length},
		{"1,5 mm", Length},
		{"1_000 m", Length},
		{"mm", Length},
		{"- 5 mm", Length},
		{"1 m-1", Length},
		{"1 s-1", Velocity},
		{"1 m^", Area},
		{"1 m^0", Dimensionless},
		{"1 m0", Dimensionless},
		{"1 m^12", Area},
		{"1 m⁻", Length},
		{"1 W/", Power},
		{"1 /W", Power},
		{"1 (W", Power},
		{"1 W)", Power},
		{"1 ()", Power},
		{"1 W//m", HeatFlux},
		{"1 * W", Power},
		{"1 m**2", Area},
		{"1 m2m", Volume},
		{"1 ((((((((((m))))))))))", Length},
		{"5 5", Length},
		{"1 kK", Temperature},
		{"1 kmin", Time},
		{"1 kBTU", Energy},
		{"1 mC", Temperature},
		{"1 Mm", Length},
		// Dimension errors.
		{"25 mm", Area},
		{"1 W", Energy},
		{"1 J", Power},
		{"1 K/W", Conductance},
		{"1 W/K", ThermalResistance},
		{"1 K m2/W", ThermalResistance},
		{"1 W/(m K)", HeatTransferCoefficient},
		{"1 W/m2", HeatTransferCoefficient},
		{"1 kg/s", VolumeFlow},
		{"1 m3/s", MassFlow},
		{"1 mm2", Length},
		{"1 degC", Length},
		{"1 %", Length},
		{"300 K^2", Temperature},
		// Absolute temperatures.
		{"-300 degC", Temperature},
		{"-500 F", Temperature},
		{"-1 K", Temperature},
		{"-0.001", Temperature},
		{"1 degC*m/m", Temperature},
		{"1 W/K*K/W*degC", Temperature},
	}
	for _, tt := range tests {
		e := parseError(t, tt.in, tt.kind)
		if e == nil {
			continue
		}
		if e.Input != tt.in || e.Kind != tt.kind || e.Reason == "" || strings.Contains(e.Error(), "\n") {
			t.Errorf("Parse(%q, %v): bad error %#v", tt.in, tt.kind, e)
		}
	}
}

func TestDimensionErrorsNameExamples(t *testing.T) {
	for k := Dimensionless; k <= Acceleration; k++ {
		in := "1 m"
		if kinds[k].dim == dimLength {
			in = "1 s"
		}
		e := parseError(t, in, k)
		if e == nil {
			continue
		}
		if msg := e.Error(); !strings.Contains(msg, k.String()+" is needed (use e.g. "+k.Examples()+")") {
			t.Errorf("Parse(%q, %v): message %q does not name the kind and its units", in, k, msg)
		}
	}
}

func TestUnknownUnitSuggestions(t *testing.T) {
	tests := []struct {
		in   string
		kind Kind
		want string // the suggested spelling, or "" for none
	}{
		{"3 mmm", Length, "mm"},
		{"1 pa", Pressure, "Pa"},
		{"1 kpa", Pressure, "kPa"},
		{"1 KW", Power, "kW"},
		{"1 btu", Energy, "BTU"},
		{"1 degc", Temperature, "degC"},
		{"1 deg", Temperature, "degC"},
		{"1 c", Temperature, "C"},
		{"1 ºC", Temperature, "°C"}, // masculine ordinal instead of degree sign
		{"1 inchs", Length, "inch"},
		{"1 W/m/Kelvin", Conductivity, ""},
		{"1 x", Length, ""},
	}
	for _, tt := range tests {
		e := parseError(t, tt.in, tt.kind)
		if e == nil {
			continue
		}
		want := "use e.g. " + tt.kind.Examples()
		if tt.want != "" {
			want = `did you mean "` + tt.want + `"?`
		}
		if !strings.HasPrefix(e.Reason, "unknown unit") || e.Suggestion != want {
			t.Errorf("Parse(%q, %v): reason %q, suggestion %q; want an unknown unit and %q",
				tt.in, tt.kind, e.Reason, e.Suggestion, want)
		}
	}
}

func TestSymbolTable(t *testing.T) {
	// Every spelling resolves, and no prefixed spelling shadows another symbol.
	seen := make(map[string]bool)
	for _, s := range spellings {
		if seen[s] {
			t.Errorf("spelling %q listed twice", s)
		}
		seen[s] = true
		if sym, prefix, ok := lookup(s); !ok || sym == nil || !(prefix > 0) {
			t.Errorf("lookup(%q) = %v, %g, %t", s, sym, prefix, ok)
		}
	}
	// Whole symbols are found before prefixed ones.
	for _, tt := range []struct {
		in    string
		scale float64
	}{
		{"min", 60}, {"mil", 2.54e-5}, {"m", 1}, {"mm", 1e-3}, {"h", 3600}, {"hPa", 100},
	} {
		sym, prefix, ok := lookup(tt.in)
		if !ok {
			t.Errorf("lookup(%q) failed", tt.in)
			continue
		}
		checkClose(t, "lookup("+strconv.Quote(tt.in)+")", prefix*sym.scale, tt.scale, exact)
	}
}

func TestDimensionString(t *testing.T) {
	for _, tt := range []struct {
		d    dimension
		want string
	}{
		{dimension{}, "1"},
		{dimLength, "m"},
		{dimConductivity, "kg m s^-3 K^-1"},
		{dimSpecificResistance, "kg^-1 s^3 K"},
	} {
		if got := tt.d.String(); got != tt.want {
			t.Errorf("%v.String() = %q, want %q", [4]int(tt.d), got, tt.want)
		}
	}
}

// Reciprocal units are written with a unity: "1/s" (the SI unit of a
// rotational speed in revolutions per second), "1/K" (NIST SP 811 §6.1.6
// writes such units as s⁻¹, K⁻¹).
func TestReciprocalUnits(t *testing.T) {
	for _, c := range []struct {
		in   string
		kind Kind
		want float64
	}{
		{"100 1/s", RotationalSpeed, 100},
		{"6000 rpm", RotationalSpeed, 100},
		{"50 1 / s", RotationalSpeed, 50},
	} {
		got, err := Parse(c.in, c.kind)
		if err != nil || math.Abs(got-c.want) > 1e-12*c.want {
			t.Errorf("%q: %v, %v; want %g", c.in, got, err, c.want)
		}
	}
	if _, err := Parse("100 1", RotationalSpeed); err == nil {
		t.Error(`"100 1" must not read as a speed`)
	}
}
