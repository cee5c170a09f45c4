package units

import (
	"strings"
	"unicode/utf8"
)

// Exact definitions used by the symbol table.
const (
	inch            = 0.0254     // m, international inch
	foot            = 0.3048     // m, international foot
	pound           = 0.45359237 // kg, avoirdupois pound
	standardGravity = 9.80665    // m/s2, standard acceleration of gravity
	poundForce      = pound * standardGravity
	btu             = 1055.05585262 // J, International Table British thermal unit
	calorie         = 4.1868        // J, International Table calorie
	atmosphere      = 101325        // Pa, standard atmosphere

	// Conventional manometer columns: mercury of 13 595.1 kg/m3 and water
	// of 1000 kg/m3 under standard gravity, one millimetre high.
	millimetreOfMercury = 13595.1 * standardGravity * 1e-3 // Pa
	millimetreOfWater   = 1000 * standardGravity * 1e-3    // Pa
)

// prefixes maps the SI prefix symbols this package accepts to their factors.
var prefixes = map[rune]float64{
	'n': 1e-9,
	'u': 1e-6,
	'µ': 1e-6, // U+00B5 micro sign
	'μ': 1e-6, // U+03BC Greek small letter mu
	'm': 1e-3,
	'c': 1e-2,
	'd': 1e-1,
	'h': 1e2,
	'k': 1e3,
	'M': 1e6,
	'G': 1e9,
}

// symbol is a unit symbol with its spellings. A value v in this unit is
// (v + zero)·scale in SI units when the unit stands alone for an absolute
// temperature, and v·scale everywhere else.
type symbol struct {
	names    []string
	scale    float64
	zero     float64
	dim      dimension
	prefixes string // the prefixes the symbol takes, in the order they are suggested
}

var symbols = []symbol{
	{names: []string{"m"}, scale: 1, dim: dimLength, prefixes: "nuµμmcdk"},
	{names: []string{"g"}, scale: 1e-3, dim: dimMass, prefixes: "nuµμmk"},
	{names: []string{"s"}, scale: 1, dim: dimTime, prefixes: "nuµμm"},
	{names: []string{"K"}, scale: 1, dim: dimTemperature, prefixes: "uµμm"},
	{names: []string{"W"}, scale: 1, dim: dimPower, prefixes: "nuµμmkMG"},
	{names: []string{"J"}, scale: 1, dim: dimEnergy, prefixes: "uµμmkMG"},
	{names: []string{"N"}, scale: 1, dim: dimForce, prefixes: "mk"},
	{names: []string{"Pa"}, scale: 1, dim: dimPressure, prefixes: "mhkMG"},
	{names: []string{"L", "l"}, scale: 1e-3, dim: dimVolume, prefixes: "uµμmcd"},
	{names: []string{"Wh"}, scale: 3600, dim: dimEnergy, prefixes: "kMG"},
	{names: []string{"cal"}, scale: calorie, dim: dimEnergy, prefixes: "k"},
	{names: []string{"bar"}, scale: 1e5, dim: dimPressure, prefixes: "m"},

	{names: []string{"degC", "°C", "℃", "C"}, scale: 1, zero: 273.15, dim: dimTemperature},
	{names: []string{"degF", "°F", "℉", "F"}, scale: 1 / 1.8, zero: 459.67, dim: dimTemperature},
	{names: []string{"min"}, scale: 60, dim: dimTime},
	{names: []string{"h", "hr"}, scale: 3600, dim: dimTime},
	{names: []string{"in", "inch"}, scale: inch, dim: dimLength},
	{names: []string{"ft"}, scale: foot, dim: dimLength},
	{names: []string{"mil", "thou"}, scale: inch / 1000, dim: dimLength},
	{names: []string{"lb", "lbm"}, scale: pound, dim: dimMass},
	{names: []string{"BTU", "Btu"}, scale: btu, dim: dimEnergy},
	{names: []string{"hp"}, scale: 550 * foot * poundForce, dim: dimPower},
	{names: []string{"atm"}, scale: atmosphere, dim: dimPressure},
	{names: []string{"psi"}, scale: poundForce / (inch * inch), dim: dimPressure},
	{names: []string{"torr", "Torr"}, scale: atmosphere / 760.0, dim: dimPressure},
	{names: []string{"mmHg"}, scale: millimetreOfMercury, dim: dimPressure},
	{names: []string{"inHg"}, scale: millimetreOfMercury * 25.4, dim: dimPressure},
	{names: []string{"mmH2O"}, scale: millimetreOfWater, dim: dimPressure},
	{names: []string{"inH2O"}, scale: millimetreOfWater * 25.4, dim: dimPressure},
	{names: []string{"CFM", "cfm"}, scale: foot * foot * foot / 60, dim: dimVolumeFlow},
	{names: []string{"LPM", "lpm"}, scale: 1e-3 / 60, dim: dimVolumeFlow},
	{names: []string{"%"}, scale: 0.01},
}

// symbolsByName indexes symbols by each of their spellings.
var symbolsByName = indexSymbols()

func indexSymbols() map[string]*symbol {
	m := make(map[string]*symbol)
	for i := range symbols {
		for _, n := range symbols[i].names {
			m[n] = &symbols[i]
		}
	}
	return m
}

// lookup resolves a symbol as written, possibly with a prefix. It returns
// the symbol and the factor of the prefix (1 without one).
func lookup(name string) (sym *symbol, prefix float64, ok bool) {
	if s, ok := symbolsByName[name]; ok {
		return s, 1, true
	}
	p, size := utf8.DecodeRuneInString(name)
	factor, ok := prefixes[p]
	if !ok {
		return nil, 0, false
	}
	s, ok := symbolsByName[name[size:]]
	if !ok || !strings.ContainsRune(s.prefixes, p) {
		return nil, 0, false
	}
	return s, factor, true
}

// spellings lists every symbol lookup accepts, unprefixed spellings first,
// in table order, for suggestions.
var spellings = listSpellings()

func listSpellings() []string {
	var all []string
	for _, s := range symbols {
		all = append(all, s.names...)
	}
	for _, s := range symbols {
		for _, p := range s.prefixes {
			for _, n := range s.names {
				all = append(all, string(p)+n)
			}
		}
	}
	return all
}
