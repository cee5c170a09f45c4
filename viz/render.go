package viz

import (
	"bytes"
	"context"
	"fmt"
	"path/filepath"
	"strings"

	"github.com/goccy/go-graphviz"
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

// Render lays out DOT source and returns it as the given format. DOT is
// returned as it is. Layout uses the Graphviz library compiled into the
// program, so no system Graphviz is needed.
func Render(dot string, format ImageFormat) ([]byte, error) {
	if format == FormatDOT {
		return []byte(dot), nil
	}
	if format != FormatSVG && format != FormatPNG {
		return nil, fmt.Errorf("unknown diagram format %q", format)
	}
	ctx := context.Background()
	gv, err := graphviz.New(ctx)
	if err != nil {
		return nil, fmt.Errorf("starting the layout engine: %w", err)
	}
	defer gv.Close()
	if format == FormatPNG {
		return renderPNG(gv, dot)
	}
	graph, err := graphviz.ParseBytes([]byte(dot))
	if err != nil {
		return nil, fmt.Errorf("reading the diagram: %w", err)
	}
	defer graph.Close()
	var buf bytes.Buffer
	if err := gv.Render(ctx, graph, graphviz.SVG, &buf); err != nil {
		return nil, fmt.Errorf("laying out the diagram: %w", err)
	}
	return buf.Bytes(), nil
}
