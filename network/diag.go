package network

import (
	"fmt"
	"sort"
	"strings"
)

// Problem is one thing wrong with a model file, located at a line.
type Problem struct {
	File    string // the model file's path as given
	Line    int    // 1-based; 0 when the problem concerns the whole file
	Field   string // the field at fault, e.g. "links[pad-cpu].thickness"
	Message string // what is wrong and what would be valid
}

// String formats the problem as "file:line: field: message".
func (p Problem) String() string {
	var b strings.Builder
	b.WriteString(p.File)
	if p.Line > 0 {
		fmt.Fprintf(&b, ":%d", p.Line)
	}
	b.WriteString(": ")
	if p.Field != "" {
		b.WriteString(p.Field)
		b.WriteString(": ")
	}
	b.WriteString(p.Message)
	return b.String()
}

// Problems is the list of everything wrong with a model; it is the error
// that Load and Build return for invalid input.
type Problems []Problem

// Error lists the problems one per line, in line order.
func (ps Problems) Error() string {
	lines := make([]string, len(ps))
	for i, p := range ps {
		lines[i] = p.String()
	}
	return strings.Join(lines, "\n")
}

// sorted returns the problems ordered by line, keeping the order of
// problems on the same line.
func (ps Problems) sorted() Problems {
	out := append(Problems(nil), ps...)
	sort.SliceStable(out, func(i, j int) bool { return out[i].Line < out[j].Line })
	return out
}
