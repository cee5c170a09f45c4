package solvecmd

import (
	"testing"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// Flags land in the options struct that Run receives.
func TestFlagsToOptions(t *testing.T) {
	ios, _, _, _ := iostreams.Test()
	var got *Options
	cmd := NewCmd(ios, func(o *Options) error { got = o; return nil })
	cmd.SetArgs([]string{"box.yaml", "-f", "csv", "--sort", "margin", "-o", "out.csv", "--monitor", "--cells", "cells.json"})
	require.NoError(t, cmd.Execute())
	assert.Equal(t, &Options{IO: ios, Model: "box.yaml", Format: "csv", Order: "margin", Output: "out.csv", Monitor: true, Cells: "cells.json"}, got)
}

func TestDefaults(t *testing.T) {
	ios, _, _, _ := iostreams.Test()
	var got *Options
	cmd := NewCmd(ios, func(o *Options) error { got = o; return nil })
	cmd.SetArgs([]string{"box.yaml"})
	require.NoError(t, cmd.Execute())
	assert.Equal(t, "text", got.Format)
	assert.Equal(t, "file", got.Order)
	assert.Empty(t, got.Output)
}
