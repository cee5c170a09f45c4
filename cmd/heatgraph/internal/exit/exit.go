// Package exit defines the exit codes of heatgraph and the error that
// carries one.
package exit

import "fmt"

// Exit codes. They are part of the command-line interface: scripts and CI
// jobs rely on them.
const (
	// OK: the command did its job and every limit holds.
	OK = 0
	// LimitExceeded: the solve converged and at least one node is above
	// its limit.
	LimitExceeded = 1
	// BadInput: the model file or the command line is invalid.
	BadInput = 2
	// NotConverged: the solver stopped without a solution.
	NotConverged = 3
	// OutputFailed: the result could not be written.
	OutputFailed = 4
	// Internal: a bug in heatgraph (a panic, an error no check foresaw).
	// It shares its code with OutputFailed: either way there is no
	// result, and the message tells which.
	Internal = 4
)

// Error is an error that ends the program with Code. A nil Err with a
// non-zero code means the command has already said what it had to.
type Error struct {
	Code int
	Err  error
}

func (e *Error) Error() string {
	if e.Err == nil {
		return fmt.Sprintf("exit status %d", e.Code)
	}
	return e.Err.Error()
}

func (e *Error) Unwrap() error { return e.Err }

// With returns an Error with code and a formatted message.
func With(code int, format string, args ...any) *Error {
	return &Error{Code: code, Err: fmt.Errorf(format, args...)}
}

// Silent returns an Error that sets the exit code without a message.
func Silent(code int) *Error { return &Error{Code: code} }
