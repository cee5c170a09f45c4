package units

import (
	"fmt"
	"math"
	"unicode"
)

// term is one symbol of a unit expression raised to a power.
type term struct {
	sym    *symbol
	prefix float64
	exp    int
}

// unit is a parsed unit expression.
type unit struct {
	terms []term
}

// scale returns the factor that takes a value in u to SI units, ignoring any
// temperature offset.
func (u unit) scale() float64 {
	f := 1.0
	for _, t := range u.terms {
		f *= math.Pow(t.prefix*t.sym.scale, float64(t.exp))
	}
	return f
}

// dim returns the dimension of u.
func (u unit) dim() dimension {
	var d dimension
	for _, t := range u.terms {
		d = d.addScaled(t.sym.dim, t.exp)
	}
	return d
}

// single returns the symbol of u if u is one symbol to the first power.
func (u unit) single() (*symbol, bool) {
	if len(u.terms) == 1 && u.terms[0].exp == 1 {
		return u.terms[0].sym, true
	}
	return nil, false
}

// unknownUnitError reports a symbol that is neither a unit nor a prefixed
// unit.
type unknownUnitError struct{ name string }

func (e *unknownUnitError) Error() string { return fmt.Sprintf("unknown unit %q", e.name) }

// syntaxError reports a unit expression that does not follow the grammar.
type syntaxError struct{ msg string }

func (e *syntaxError) Error() string { return e.msg }

func syntaxErrorf(format string, args ...any) error {
	return &syntaxError{fmt.Sprintf(format, args...)}
}

// Limits on unit expressions.
const (
	maxNesting  = 8 // parentheses
	maxExponent = 9
)

const eof = -1

// parseUnit reads a unit expression, which must not be empty.
func parseUnit(s string) (unit, error) {
	p := parser{src: []rune(s)}
	terms, err := p.expr()
	if err != nil {
		return unit{}, err
	}
	if p.peek() != eof {
		// expr stops only at the end or at a closing parenthesis.
		return unit{}, syntaxErrorf(`unexpected ")"`)
	}
	return unit{terms}, nil
}

// parser is a recursive-descent reader of unit expressions.
type parser struct {
	src   []rune
	pos   int
	depth int
}

func (p *parser) peek() rune {
	if p.pos >= len(p.src) {
		return eof
	}
	return p.src[p.pos]
}

// skipSpace skips white space and reports whether there was any.
func (p *parser) skipSpace() bool {
	start := p.pos
	for p.pos < len(p.src) && unicode.IsSpace(p.src[p.pos]) {
		p.pos++
	}
	return p.pos > start
}

// expr reads factors joined by operators up to the end of the input or an
// unmatched closing parenthesis.
func (p *parser) expr() ([]term, error) {
	terms, err := p.factor()
	if err != nil {
		return nil, err
	}
	for {
		spaced := p.skipSpace()
		r := p.peek()
		switch {
		case r == eof || r == ')':
			return terms, nil
		case r == '*' || r == '·' || r == '⋅' || r == '/':
			p.pos++
			p.skipSpace()
		case !spaced:
			return nil, syntaxErrorf("unexpected %q", string(r))
		}
		f, err := p.factor()
		if err != nil {
			return nil, err
		}
		if r == '/' {
			for i := range f {
				f[i].exp = -f[i].exp
			}
		}
		terms = append(terms, f...)
	}
}

// factor reads a symbol or a parenthesised expression, with its exponent.
func (p *parser) factor() ([]term, error) {
	var terms []term
	switch r := p.peek(); {
	case r == '(':
		if p.depth == maxNesting {
			return nil, syntaxErrorf("parentheses nested too deeply")
		}
		p.pos++
		p.depth++
		p.skipSpace()
		inner, err := p.expr()
		if err != nil {
			return nil, err
		}
		if p.peek() != ')' {
			return nil, syntaxErrorf(`missing ")"`)
		}
		p.pos++
		p.depth--
		terms = inner
	case isSymbolRune(r):
		name := p.symbolName()
		sym, prefix, ok := lookup(name)
		if !ok {
			return nil, &unknownUnitError{name}
		}
		terms = []term{{sym: sym, prefix: prefix, exp: 1}}
	case r == '1' && p.unityBeforeSlash():
		// "1/s", "1/K": the unity a reciprocal unit is written with.
		p.pos++
		return nil, nil
	case r == eof:
		return nil, syntaxErrorf("a unit is missing at the end")
	default:
		return nil, syntaxErrorf("unexpected %q", string(r))
	}
	n, err := p.exponent()
	if err != nil {
		return nil, err
	}
	for i := range terms {
		terms[i].exp *= n
	}
	return terms, nil
}

// unityBeforeSlash reports whether the input at p is a lone "1" followed,
// after any spaces, by "/".
func (p *parser) unityBeforeSlash() bool {
	i := p.pos + 1
	for i < len(p.src) && unicode.IsSpace(p.src[i]) {
		i++
	}
	return i < len(p.src) && p.src[i] == '/'
}

// isSymbolRune reports whether r can be part of a unit symbol.
func isSymbolRune(r rune) bool {
	return unicode.IsLetter(r) || r == '°' || r == '℃' || r == '℉' || r == '%'
}

// symbolName reads a symbol. The "2" of "H2O" belongs to the symbol, so
// "inH2O" is one symbol while "cm2" is "cm" squared.
func (p *parser) symbolName() string {
	start := p.pos
	for p.pos < len(p.src) {
		r := p.src[p.pos]
		switch {
		case isSymbolRune(r):
			p.pos++
		case r == '2' && p.pos > start && p.src[p.pos-1] == 'H' &&
			p.pos+1 < len(p.src) && p.src[p.pos+1] == 'O':
			p.pos += 2
		default:
			return string(p.src[start:p.pos])
		}
	}
	return string(p.src[start:p.pos])
}

// superscripts maps superscript digits to their values.
var superscripts = map[rune]int{
	'⁰': 0, '¹': 1, '²': 2, '³': 3, '⁴': 4, '⁵': 5, '⁶': 6, '⁷': 7, '⁸': 8, '⁹': 9,
}

// asciiDigit returns the value of a digit 0 to 9.
func asciiDigit(r rune) (int, bool) {
	if r >= '0' && r <= '9' {
		return int(r - '0'), true
	}
	return 0, false
}

// superscriptDigit returns the value of a superscript digit ⁰ to ⁹.
func superscriptDigit(r rune) (int, bool) {
	d, ok := superscripts[r]
	return d, ok
}

// exponent reads an optional exponent: "2", "^2", "^-1", "²" or "⁻¹". Without
// one the exponent is 1.
func (p *parser) exponent() (int, error) {
	sign, digit := 1, asciiDigit
	r := p.peek()
	_, superscript := superscriptDigit(r)
	_, ascii := asciiDigit(r)
	switch {
	case r == '^':
		p.pos++
		switch p.peek() {
		case '-', '−':
			sign = -1
			p.pos++
		case '+':
			p.pos++
		}
	case r == '⁻':
		sign, digit = -1, superscriptDigit
		p.pos++
	case superscript:
		digit = superscriptDigit
	case !ascii:
		return 1, nil
	}
	start := p.pos
	n := 0
	for p.pos < len(p.src) {
		d, ok := digit(p.src[p.pos])
		if !ok {
			break
		}
		n = min(10*n+d, 10*maxExponent) // large enough to be refused, small enough not to overflow
		p.pos++
	}
	if p.pos == start {
		return 0, syntaxErrorf("an exponent is missing")
	}
	if n < 1 || n > maxExponent {
		return 0, syntaxErrorf("exponent %q is out of range (1 to %d)", string(p.src[start:p.pos]), maxExponent)
	}
	return sign * n, nil
}
