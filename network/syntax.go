package network

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"os"
	"regexp"
	"strconv"
	"strings"
	"unicode/utf8"

	"gopkg.in/yaml.v3"
)

// MaxFileSize is the largest model file ReadFile reads, in bytes. A model
// of a whole box with thousands of nodes takes well under a megabyte; the
// YAML parser needs up to about a hundred times a file's size in memory,
// so the limit keeps a wrong file (a log, an image, a device) from
// exhausting it.
const MaxFileSize = 16 << 20

// ReadFile reads and checks a model file. On invalid input the error is a
// Problems list naming every problem found, each with its line. Files
// larger than MaxFileSize and devices, which may never end, are refused
// without being read.
func ReadFile(path string) (*Model, error) {
	data, msg := readLimited(path, MaxFileSize)
	if msg != "" {
		return nil, Problems{{File: path, Message: msg}}
	}
	return Parse(path, data)
}

// readLimited reads at most limit bytes of the file at path. On failure it
// returns a message for the user.
func readLimited(path string, limit int64) ([]byte, string) {
	f, err := os.Open(path)
	if err != nil {
		return nil, readError(err)
	}
	defer f.Close()
	info, err := f.Stat()
	if err != nil {
		return nil, readError(err)
	}
	mode := info.Mode()
	switch {
	case mode.IsDir():
		return nil, "is a directory, not a model file"
	case mode&(os.ModeDevice|os.ModeCharDevice) != 0:
		return nil, "is a device, not a model file (a model is a YAML text file)"
	case mode.IsRegular() && info.Size() > limit:
		return nil, tooLarge(limit)
	}
	// Pipes and the like have no size: read one byte past the limit to
	// tell a file that fits from one that does not.
	data, err := io.ReadAll(io.LimitReader(f, limit+1))
	if err != nil {
		return nil, readError(err)
	}
	if int64(len(data)) > limit {
		return nil, tooLarge(limit)
	}
	return data, ""
}

func tooLarge(limit int64) string {
	return fmt.Sprintf("file is larger than the %d MiB limit for a model file (is it the right file?)", limit>>20)
}

func readError(err error) string {
	switch {
	case os.IsNotExist(err):
		return "no such file"
	case os.IsPermission(err):
		return "permission denied"
	}
	var pe *os.PathError
	if errors.As(err, &pe) {
		return pe.Err.Error()
	}
	return err.Error()
}

// lineStarts returns the offset at which each line of data starts. Lines
// end at "\n", "\r\n" or a lone "\r", as in YAML.
func lineStarts(data []byte) []int {
	starts := []int{0}
	for i := 0; i < len(data); i++ {
		switch data[i] {
		case '\n':
			starts = append(starts, i+1)
		case '\r':
			if i+1 < len(data) && data[i+1] == '\n' {
				i++
			}
			starts = append(starts, i+1)
		}
	}
	if starts[len(starts)-1] == len(data) && len(starts) > 1 {
		starts = starts[:len(starts)-1]
	}
	return starts
}

// lineAt returns the 1-based line of offset off.
func lineAt(starts []int, off int) int {
	lo, hi := 0, len(starts)
	for lo+1 < hi {
		mid := (lo + hi) / 2
		if starts[mid] <= off {
			lo = mid
		} else {
			hi = mid
		}
	}
	return lo + 1
}

// checkText finds the first thing that cannot be in a model file, which is
// UTF-8 text: a NUL byte, another control character, or bytes that are not
// UTF-8. It returns the line and a message, or 0 and "" when the text is
// clean. The characters allowed are those YAML allows (YAML 1.2, §5.1).
func checkText(data []byte) (int, string) {
	if bytes.HasPrefix(data, []byte{0xFE, 0xFF}) || bytes.HasPrefix(data, []byte{0xFF, 0xFE}) {
		return 1, "the file is UTF-16 text; save it as UTF-8"
	}
	data = bytes.TrimPrefix(data, []byte("\uFEFF"))
	for i := 0; i < len(data); {
		r, size := utf8.DecodeRune(data[i:])
		var msg string
		switch {
		case r == utf8.RuneError && size <= 1:
			msg = fmt.Sprintf("byte 0x%02X is not UTF-8 text; save the file as UTF-8", data[i])
		case r == 0:
			msg = "a NUL byte: a model file is text, and this looks like a binary file"
		case r == '\t' || r == '\n' || r == '\r' || r == 0x85:
		case r < 0x20 || r == 0x7F || (r >= 0x80 && r <= 0x9F):
			msg = fmt.Sprintf("control character U+%04X is not allowed in a model file (of the control characters, only tab, line feed and carriage return are)", r)
		case r == 0xFEFF:
			msg = "a byte order mark (U+FEFF) is allowed only at the start of the file"
		case r == 0xFFFE || r == 0xFFFF:
			msg = fmt.Sprintf("U+%04X is not a character; save the file as UTF-8 text", r)
		}
		if msg != "" {
			return lineAt(lineStarts(data), i), msg
		}
		i += size
	}
	return 0, ""
}

// decodeAll decodes every YAML document in data. It returns the documents
// read before the first error.
func decodeAll(data []byte) ([]*yaml.Node, error) {
	dec := yaml.NewDecoder(bytes.NewReader(data))
	var docs []*yaml.Node
	for {
		var doc yaml.Node
		err := dec.Decode(&doc)
		if err == io.EOF {
			return docs, nil
		}
		if err != nil {
			return docs, err
		}
		docs = append(docs, &doc)
	}
}

// yamlErrorText returns the text of a yaml.v3 error without its prefix.
func yamlErrorText(err error) string {
	msg := err.Error()
	if te, ok := err.(*yaml.TypeError); ok && len(te.Errors) > 0 {
		msg = te.Errors[0]
	}
	msg = strings.TrimPrefix(msg, "yaml: unmarshal errors:\n  ")
	return strings.TrimPrefix(msg, "yaml: ")
}

var yamlLine = regexp.MustCompile(`^line (\d+): (.*)$`)

// splitYAMLError splits "line N: problem" into N and the problem (0 when
// the error names no line).
func splitYAMLError(text string) (int, string) {
	if m := yamlLine.FindStringSubmatch(text); m != nil {
		line, _ := strconv.Atoi(m[1])
		return line, m[2]
	}
	return 0, text
}

// scannerProblems are yaml.v3's messages for errors found while splitting
// the text into tokens. For these yaml.v3 counts lines from 1; for the
// errors found while parsing the tokens it counts them from 0.
var scannerProblems = []string{
	"found character that cannot start any token", "could not find expected ':'",
	"found a tab character", "block sequence entries are not allowed", "mapping keys are not allowed",
	"mapping values are not allowed", "found unexpected end of stream", "found unexpected document indicator",
	"directive", "did not find expected comment or line break", "found unexpected non-alphabetical character",
	"did not find expected digit", "found extremely long version number", "did not find expected version number",
	"did not find expected whitespace", "did not find expected alphabetic or numeric character",
	"did not find the expected '>'", "found an indentation indicator equal to 0",
	"found unknown escape character", "did not find expected hexdecimal number",
	"found invalid Unicode character escape code", "exceeded max depth",
}

func isScannerProblem(p string) bool {
	for _, s := range scannerProblems {
		if strings.Contains(p, s) {
			return true
		}
	}
	return false
}

// locateLimit bounds the text searched for the line of a syntax error;
// beyond it yaml.v3's own line is used.
const locateLimit = 1 << 20

// syntaxProblem turns the YAML error that data gives into a line and a
// message.
//
// yaml.v3 reports the line of the construct an error was found in (the
// mapping or list being read, or the start of the value) rather than of
// the problem, and counts it from 0 or from 1 depending on the kind of
// error; for some errors it gives no line at all. So the line is found
// here instead: it is the first line at which the text, cut after that
// line, shows the same error. The text is read with a blank line in front,
// so that yaml.v3 always reports the construct (its rule falls back to the
// problem's position when the construct starts on the first line).
func syntaxProblem(data []byte, fullErr error) (int, string) {
	shifted := append([]byte("\n"), data...)
	_, err := decodeAll(shifted)
	if err == nil {
		// Cannot happen: the blank line changes no meaning. Fall back to
		// yaml.v3's own report.
		line, p := splitYAMLError(yamlErrorText(fullErr))
		return line, explainYAML(p, 0, line, "", "")
	}
	want := yamlErrorText(err)
	reported, problem := splitYAMLError(want)
	// The construct the error was found in, in the lines of data: yaml.v3
	// gives its 0-based line in shifted, which is its 1-based line in data,
	// and adds one for the errors of its scanner.
	context := reported
	if isScannerProblem(problem) {
		context--
	}
	if context < 1 {
		context = 0
	}
	// The search starts at the construct, or for an alias to nothing,
	// which yaml.v3 gives no line, where the alias is first written.
	from := context
	if m := unknownAnchor.FindStringSubmatch(problem); m != nil {
		if i := bytes.Index(data, []byte("*"+m[1])); i >= 0 {
			from = lineAt(lineStarts(data), i)
		}
	}
	line := from
	if len(data) <= locateLimit {
		starts := lineStarts(shifted)
		same := func(k int) bool { // k: a line of shifted
			end := len(shifted)
			if k < len(starts) {
				end = starts[k]
			}
			_, err := decodeAll(shifted[:end])
			return err != nil && yamlErrorText(err) == want
		}
		// The problem is at or after the construct: search forward in
		// growing steps, then narrow down.
		lo := max(from, 0) // same(lo) is taken to be false
		hi, step := lo+1, 1
		for hi < len(starts) && !same(hi) {
			lo = hi
			hi += step
			step *= 2
		}
		hi = min(hi, len(starts))
		for lo+1 < hi {
			mid := (lo + hi) / 2
			if same(mid) {
				hi = mid
			} else {
				lo = mid
			}
		}
		line = hi - 1 // back to the lines of data
		if line < 1 {
			line = 1
		}
	}
	return line, explainYAML(problem, context, line, lineText(data, line), lineText(data, context))
}

// lineText returns line n (1-based) of data.
func lineText(data []byte, n int) string {
	starts := lineStarts(data)
	if n < 1 || n > len(starts) {
		return ""
	}
	end := len(data)
	if n < len(starts) {
		end = starts[n]
	}
	return string(data[starts[n-1]:end])
}

var unknownAnchor = regexp.MustCompile(`^unknown anchor '(.*)' referenced$`)

// explainYAML words a yaml.v3 problem for the user: the problem was found
// on line, whose text is text, within the construct that starts on line
// context (0 when not known), whose text is contextText.
func explainYAML(problem string, context, line int, text, contextText string) string {
	const hint = " (check the indentation and that every key is followed by a colon and a space)"
	opened := func(what, open, close string) string {
		if context == 0 || context == line {
			return fmt.Sprintf("the %s opened with '%s' on this line is not closed: a '%s' is missing, or a ',' between two of its entries", what, open, close)
		}
		return fmt.Sprintf("the %s opened with '%s' on line %d is not closed by here: a '%s' is missing, or a ',' between two of its entries", what, open, context, close)
	}
	indent := text[:len(text)-len(strings.TrimLeft(text, " \t"))]
	switch {
	case strings.Contains(problem, "tab character"),
		strings.Contains(indent, "\t") && (problem == "found character that cannot start any token" ||
			problem == "did not find expected key" || problem == "did not find expected '-' indicator"):
		return "a tab in the indentation; YAML indents with spaces only"
	case problem == "found character that cannot start any token":
		return "a character that cannot start a value here (a tab in the indentation, or a value that starts with @ or ` must be quoted)"
	case problem == "did not find expected key", problem == "did not find expected '-' indicator":
		what := "mapping"
		if strings.Contains(problem, "'-'") {
			what = "list"
		}
		switch {
		case context > 0 && context < line && linesUp(contextText, len(indent)):
			return fmt.Sprintf("this line does not continue the %s that starts on line %d (a stray ']' or '}', a list entry among keys or a key among list entries?)", what, context)
		case context > 0 && context < line:
			return fmt.Sprintf("this line is indented differently from the %s that starts on line %d (entries of one mapping or list start in the same column, with spaces)", what, context)
		}
		return "this line's indentation does not match the lines around it (entries of one mapping or list start in the same column, with spaces)"
	case problem == "did not find expected <document start>":
		return "this line does not fit the top level: top-level keys start in the same column, and a file holds one YAML document"
	case problem == "mapping values are not allowed in this context":
		return "a ':' where no key can start (a key indented under a value, or a value with \": \" in it that needs quotes?)"
	case problem == "did not find expected ',' or ']'":
		return opened("list", "[", "]")
	case problem == "did not find expected ',' or '}'":
		return opened("mapping", "{", "}")
	case problem == "found unexpected end of stream":
		return "a quoted value that starts on this line is never closed (a closing quote is missing)"
	}
	if m := unknownAnchor.FindStringSubmatch(problem); m != nil {
		return fmt.Sprintf("*%s refers to no value: define it before this line by writing &%s in front of the value to share", m[1], m[1])
	}
	return problem + hint
}

// linesUp reports whether a line indented by col spaces lines up with a
// mapping or list that starts on a line of text: with its first
// character, or with the content after a leading "- ".
func linesUp(text string, col int) bool {
	i := len(text) - len(strings.TrimLeft(text, " "))
	for {
		if i == col {
			return true
		}
		if !strings.HasPrefix(text[i:], "- ") {
			return false
		}
		i += 2
		for i < len(text) && text[i] == ' ' {
			i++
		}
	}
}

// secondDocument is the message for a YAML document after the first,
// which the reader would otherwise ignore.
const secondDocument = "a second YAML document starts here; a model file holds one document (remove this '---' and what follows, or move it to a file of its own)"
