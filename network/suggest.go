package network

import (
	"fmt"

	"github.com/heatgraph/heatgraph/internal/spell"
)

// suggest returns ` (did you mean "x"?)` for the candidate closest to s in
// edit distance, or "" when none is close enough to be a likely misspelling.
func suggest(s string, candidates []string) string {
	best := closest(s, candidates)
	if best == "" {
		return ""
	}
	return fmt.Sprintf(" (did you mean %q?)", best)
}

// closest returns the candidate nearest to s, within about a third of its
// length, or "".
func closest(s string, candidates []string) string {
	return spell.Closest(s, candidates, len(s)/3+1)
}
