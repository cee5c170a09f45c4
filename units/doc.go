// Package units reads physical quantities written with units, such as
// "1.6 mm", "35 degC", "0.3 W/m/K" or "20 CFM", and returns their values in
// SI units.
//
// Parse takes the text and the Kind of quantity a model field expects. It
// checks the dimension of the unit against the Kind, so "25 mm" is refused
// where an area is needed, and it reports every problem as an *Error whose
// message says what is wrong and what would be valid.
//
// # Grammar
//
// A quantity is a number, optional white space, and an optional unit:
//
//	quantity = number [ unit ]
//	unit     = factor { op factor }
//	op       = "*" | "·" | "/" | white space
//	factor   = ( symbol | "(" unit ")" ) [ exponent ]
//	exponent = digit | "^" [ "+" | "-" ] digit | superscript digits, e.g. "²", "⁻¹"
//
// The number is a decimal with an optional exponent ("1.2e5", "-40", ".5");
// a leading Unicode minus sign "−" is read as "-". NaN, infinities and
// numbers out of range are errors. A number without a unit is already in SI
// units and is accepted for every Kind: Parse("0.002", Length) is 0.002.
//
// Factors joined by "*", "·" or white space are multiplied; "/" divides by
// the single factor after it, left to right, so "W/m/K" is W/(m K) and
// "K cm2/W" is (K cm2)/W. "W/m K" therefore reads as W K/m; where that reading
// has the wrong dimension but W/(m K) would fit, the error suggests the
// parenthesised form. Exponents are single digits from 1 to 9 and apply to
// the prefixed symbol ("cm2" is 1e-4 m2) or to a parenthesised group; negative
// exponents need "^" or a superscript minus ("m^-1", "s⁻¹").
//
// # Symbols
//
// A symbol is looked up first as a whole (this makes "min" a minute, "mil"
// a thousandth of an inch and "Pa" a pascal), then as an SI prefix followed by
// a symbol that takes that prefix. The prefixes are n, u, µ, μ, m, c, d, h, k,
// M and G; each symbol takes only the prefixes that are in use for it:
//
//	m    metre          n u µ μ m c d k
//	g    gram           n u µ μ m k          (so kg is the kilogram)
//	s    second         n u µ μ m
//	K    kelvin         u µ μ m
//	W    watt           n u µ μ m k M G
//	J    joule          u µ μ m k M G
//	N    newton         m k
//	Pa   pascal         m h k M G
//	L, l litre          u µ μ m c d
//	Wh   watt hour      k M G
//	cal  calorie (IT)   k
//	bar  bar            m
//
// Symbols that take no prefix: min, h and hr (hour); in and inch, ft, mil and
// thou; lb and lbm (avoirdupois pound); BTU and Btu (International Table);
// hp (mechanical horsepower, 550 ft·lbf/s); atm, psi, torr and Torr; mmHg and
// inHg (conventional, mercury at 13 595.1 kg/m3); mmH2O and inH2O
// (conventional, water at 1000 kg/m3); CFM and cfm (cubic foot per minute);
// LPM and lpm (litre per minute); degC, °C, ℃ and C; degF, °F, ℉ and F; and %
// (one hundredth).
//
// In this package "C" always means degree Celsius and "F" degree Fahrenheit.
// Thermal models have no use for the coulomb or the farad, while "35 C" and
// "95 F" are common ways to write temperatures, so the letters are given to
// the temperature scales.
//
// # Temperatures
//
// Where an absolute Temperature is expected and the unit is a single Celsius
// or Fahrenheit symbol, the scale offset applies: T/K = t/°C + 273.15 and
// T/K = (t/°F + 459.67)/1.8. A bare number is in kelvins. A result below
// 0 K is an error. An absolute temperature must be written with a single
// unit; a compound unit such as "degC m/m" is refused.
//
// Everywhere else, in a TemperatureDifference and inside any compound unit
// such as "W/m/degC", "BTU/(h ft F)" or "K*cm2/W", a degree Celsius is one
// kelvin and a degree Fahrenheit is 5/9 kelvin, with no offset.
//
// # Results
//
// Results are in the coherent SI unit of the Kind, given by Kind.SIUnit:
// metres, square metres, kilograms, seconds, kelvins, watts, pascals,
// W/(m K), K m2/W and so on. Percentages are fractions: "85 %" is 0.85.
package units
