package network

import (
	"fmt"
	"regexp"
	"sort"
	"strconv"
	"strings"
	"unicode/utf8"
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
// problems on the same line, with long values shortened (see clip).
func (ps Problems) sorted() Problems {
	out := append(Problems(nil), ps...)
	for i := range out {
		out[i].Field = clipField(out[i].Field)
		out[i].Message = clipQuoted(out[i].Message)
	}
	sort.SliceStable(out, func(i, j int) bool { return out[i].Line < out[j].Line })
	return out
}

// clipRunes is how much of a long value a message quotes.
const clipRunes = 60

// clip shortens s to its first clipRunes characters followed by "…"; ok
// is false when s is short enough to quote whole.
func clip(s string) (string, bool) {
	if utf8.RuneCountInString(s) <= clipRunes+10 {
		return s, false
	}
	i, n := 0, 0
	for n < clipRunes {
		_, size := utf8.DecodeRuneInString(s[i:])
		i += size
		n++
	}
	return s[:i] + "…", true
}

var quoted = regexp.MustCompile(`"(?:[^"\\]|\\.)*"`)

// clipQuoted shortens every long quoted value in a message, such as a
// 200 kB scalar, to its start followed by "…" and its length.
func clipQuoted(msg string) string {
	if len(msg) <= clipRunes+12 {
		return msg
	}
	return quoted.ReplaceAllStringFunc(msg, func(q string) string {
		s, err := strconv.Unquote(q)
		if err != nil {
			return q
		}
		short, long := clip(s)
		if !long {
			return q
		}
		return fmt.Sprintf("%q (%d characters)", short, utf8.RuneCountInString(s))
	})
}

var fieldPart = regexp.MustCompile(`[^.\[\]]{71,}`)

// clipField shortens the long keys and ids in a field path.
func clipField(field string) string {
	return fieldPart.ReplaceAllStringFunc(field, func(part string) string {
		short, _ := clip(part)
		return fmt.Sprintf("%s(%d characters)", short, utf8.RuneCountInString(part))
	})
}
