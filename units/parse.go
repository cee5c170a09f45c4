package units

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
)

// Parse reads s as a quantity of kind k and returns its value in SI units,
// the unit given by k.SIUnit. A number without a unit is taken to be in SI
// units already. Every error is an *Error.
func Parse(s string, k Kind) (float64, error) {
	info, ok := k.info()
	if !ok {
		return 0, &Error{Input: s, Kind: k, Reason: fmt.Sprintf("unknown kind %v", k)}
	}
	text := strings.TrimSpace(s)
	if text == "" {
		return 0, &Error{Input: s, Kind: k, Reason: "empty value",
			Suggestion: fmt.Sprintf("expected %s, e.g. %q", withArticle(info.name), info.sample)}
	}
	if rest, ok := strings.CutPrefix(text, "−"); ok { // U+2212 minus sign
		text = "-" + rest
	}
	n := numberLength(text)
	if n == 0 {
		return 0, &Error{Input: s, Kind: k, Reason: fmt.Sprintf("%q is not a number with an optional unit", s),
			Suggestion: fmt.Sprintf("e.g. %q", info.sample)}
	}
	v, err := strconv.ParseFloat(text[:n], 64)
	if err != nil {
		return 0, outOfRange(s, k)
	}
	unitText := strings.TrimSpace(text[n:])
	if unitText == "" {
		return checkResult(s, k, v, true)
	}
	u, err := parseUnit(unitText)
	if err != nil {
		return 0, unitError(s, k, unitText, err)
	}
	if d := u.dim(); d != info.dim {
		return 0, dimensionError(s, k, unitText, d)
	}
	if k == Temperature {
		sym, ok := u.single()
		if !ok {
			return 0, &Error{Input: s, Kind: k,
				Reason:     fmt.Sprintf("%q has a compound unit, but an absolute temperature needs a single one", s),
				Suggestion: "use e.g. " + info.examples}
		}
		v += sym.zero
	}
	return checkResult(s, k, v*u.scale(), false)
}

// numberLength returns the length of the decimal number at the start of s:
// an optional sign, digits with an optional decimal point, and an optional
// exponent. It returns 0 if s does not start with a number.
func numberLength(s string) int {
	isDigit := func(i int) bool { return i < len(s) && s[i] >= '0' && s[i] <= '9' }
	i := 0
	if i < len(s) && (s[i] == '+' || s[i] == '-') {
		i++
	}
	digits := 0
	for ; isDigit(i); i++ {
		digits++
	}
	if i < len(s) && s[i] == '.' {
		i++
		for ; isDigit(i); i++ {
			digits++
		}
	}
	if digits == 0 {
		return 0
	}
	if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
		j := i + 1
		if j < len(s) && (s[j] == '+' || s[j] == '-') {
			j++
		}
		if isDigit(j) {
			for i = j; isDigit(i); i++ {
			}
		}
	}
	return i
}

// checkResult refuses results that are not finite and absolute temperatures
// below zero.
func checkResult(s string, k Kind, v float64, bare bool) (float64, error) {
	if math.IsInf(v, 0) || math.IsNaN(v) {
		return 0, outOfRange(s, k)
	}
	if k == Temperature && v < 0 {
		e := &Error{Input: s, Kind: k, Reason: fmt.Sprintf("%q is below absolute zero", s)}
		if bare {
			e.Suggestion = fmt.Sprintf("a number without a unit is in kelvins; for Celsius write %q", strings.TrimSpace(s)+" degC")
		}
		return 0, e
	}
	return v, nil
}

func outOfRange(s string, k Kind) *Error {
	return &Error{Input: s, Kind: k, Reason: fmt.Sprintf("%q is out of range", s)}
}

// unitError explains an error from parseUnit.
func unitError(s string, k Kind, unitText string, err error) *Error {
	var unknown *unknownUnitError
	if errors.As(err, &unknown) {
		e := &Error{Input: s, Kind: k, Reason: fmt.Sprintf("unknown unit %q in %q", unknown.name, s)}
		if c := closest(unknown.name); c != "" {
			e.Suggestion = fmt.Sprintf("did you mean %q?", c)
		} else {
			e.Suggestion = "use e.g. " + k.Examples()
		}
		return e
	}
	return &Error{Input: s, Kind: k, Reason: fmt.Sprintf("malformed unit %q in %q: %v", unitText, s, err),
		Suggestion: "use e.g. " + k.Examples()}
}

// dimensionError explains a unit of dimension d where k is needed. If the
// unit divides by one factor and multiplies by the next, as in "W/m K", and
// dividing by both would fit, it suggests that.
func dimensionError(s string, k Kind, unitText string, d dimension) *Error {
	e := &Error{Input: s, Kind: k,
		Reason:     fmt.Sprintf("%q is %s, but %s is needed", s, describe(d), withArticle(k.String())),
		Suggestion: "use e.g. " + k.Examples()}
	if alt, ok := divideByRest(unitText); ok {
		if u, err := parseUnit(alt); err == nil && u.dim() == kinds[k].dim {
			e.Suggestion = fmt.Sprintf("did you mean %q? \"/\" divides only by the unit right after it", alt)
		}
	}
	return e
}

// divideByRest rewrites a unit so that its first "/" outside parentheses
// divides by everything after it: "W/m K" becomes "W/(m K)".
func divideByRest(unitText string) (string, bool) {
	depth := 0
	for i, r := range unitText {
		switch r {
		case '(':
			depth++
		case ')':
			depth--
		case '/':
			if depth == 0 {
				return unitText[:i+1] + "(" + strings.TrimSpace(unitText[i+1:]) + ")", true
			}
		}
	}
	return "", false
}
