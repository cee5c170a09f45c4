package units

import (
	"strings"
	"unicode/utf8"

	"github.com/heatgraph/heatgraph/internal/spell"
)

// Error is the error Parse returns. Its message is one line that names the
// input but not where it came from, so a caller can prefix "file:line: field: ".
type Error struct {
	Input string // the text given to Parse
	Kind  Kind   // the kind of quantity that was expected

	// Reason says what is wrong, quoting the input, e.g.
	// `"25 mm" is a length, but an area is needed`.
	Reason string

	// Suggestion says what would be valid, e.g. `use e.g. mm2, cm2, m2, in2`
	// or `did you mean "mm"?`. It may be empty.
	Suggestion string
}

// Error returns the Reason followed by the Suggestion in parentheses.
func (e *Error) Error() string {
	if e.Suggestion == "" {
		return e.Reason
	}
	return e.Reason + " (" + e.Suggestion + ")"
}

// closest returns the accepted symbol nearest to name: one that differs only
// in letter case, or else the first within a small edit distance. It returns
// "" if no symbol is near enough, and for names of one letter or of more than
// 16, which are unlikely to be misspelt symbols.
func closest(name string) string {
	for _, c := range spellings {
		if strings.EqualFold(c, name) {
			return c
		}
	}
	var limit int
	switch n := utf8.RuneCountInString(name); {
	case n <= 1 || n > 16:
		return ""
	case n <= 4:
		limit = 1
	default:
		limit = 2
	}
	return spell.Closest(name, spellings, limit)
}
