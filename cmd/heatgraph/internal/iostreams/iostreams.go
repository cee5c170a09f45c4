// Package iostreams carries the input and output streams of a command, so
// that commands can run in tests without a terminal.
package iostreams

import (
	"bytes"
	"io"
	"os"
)

// IOStreams are the streams a command reads and writes.
type IOStreams struct {
	In     io.Reader
	Out    io.Writer
	ErrOut io.Writer
}

// System returns the process's standard streams.
func System() *IOStreams {
	return &IOStreams{In: os.Stdin, Out: os.Stdout, ErrOut: os.Stderr}
}

// Test returns streams backed by buffers, and the buffers.
func Test() (ios *IOStreams, in, out, errOut *bytes.Buffer) {
	in, out, errOut = &bytes.Buffer{}, &bytes.Buffer{}, &bytes.Buffer{}
	return &IOStreams{In: in, Out: out, ErrOut: errOut}, in, out, errOut
}
