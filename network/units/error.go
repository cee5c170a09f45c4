package units

import (
	"strings"
	"unicode/utf8"
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
	best, bestDist := "", limit+1
	for _, c := range spellings {
		if d := editDistance(name, c); d < bestDist {
			best, bestDist = c, d
		}
	}
	return best
}

// editDistance returns the Levenshtein distance between a and b, counted in
// runes.
func editDistance(a, b string) int {
	ra, rb := []rune(a), []rune(b)
	prev := make([]int, len(rb)+1)
	cur := make([]int, len(rb)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(ra); i++ {
		cur[0] = i
		for j := 1; j <= len(rb); j++ {
			cost := 1
			if ra[i-1] == rb[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
		}
		prev, cur = cur, prev
	}
	return prev[len(rb)]
}
