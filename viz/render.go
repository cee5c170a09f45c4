package viz

import (
	"context"
	"fmt"
	"path/filepath"
	"strings"

	"github.com/heatgraph/heatgraph/viz/internal/engine"
)

// ImageFormat is a diagram file format.
type ImageFormat string

// Diagram formats.
const (
	FormatDOT ImageFormat = "dot"
	FormatSVG ImageFormat = "svg"
	FormatPNG ImageFormat = "png"
)

// FormatFor returns the diagram format for a file name by its extension:
// .dot or .gv, .svg, .png.
func FormatFor(path string) (ImageFormat, error) {
	switch strings.ToLower(filepath.Ext(path)) {
	case ".dot", ".gv":
		return FormatDOT, nil
	case ".svg":
		return FormatSVG, nil
	case ".png":
		return FormatPNG, nil
	}
	return "", fmt.Errorf("cannot tell the diagram format from %q (use a name ending in .dot, .gv, .svg or .png)", filepath.Base(path))
}

// ErrLayoutTimeout is returned (wrapped) by Render when its context ends
// before the layout is done.
var ErrLayoutTimeout = engine.ErrLayoutTimeout

// Render lays out DOT source and returns it as the given format. DOT is
// returned as it is. Layout uses the Graphviz library compiled into the
// program, so no system Graphviz is needed; it starts on the first call
// (see package viz/internal/engine) and stops with an error wrapping
// ErrLayoutTimeout when ctx ends first.
func Render(ctx context.Context, dot string, format ImageFormat) ([]byte, error) {
	switch format {
	case FormatDOT:
		return []byte(dot), nil
	case FormatSVG:
		return engine.Render(ctx, dot, engine.SVG)
	case FormatPNG:
		return renderPNG(ctx, dot)
	}
	return nil, fmt.Errorf("unknown diagram format %q", format)
}
