package viz

import (
	"bytes"
	"context"
	"fmt"
	"image/color"
	"math"
	"strconv"
	"strings"

	"github.com/awalterschulze/gographviz"
	"github.com/awalterschulze/gographviz/ast"
	"github.com/fogleman/gg"
	"github.com/golang/freetype/truetype"
	"golang.org/x/image/font"
	"golang.org/x/image/font/gofont/gobold"
	"golang.org/x/image/font/gofont/goregular"

	"github.com/heatgraph/heatgraph/viz/internal/engine"
)

// pngScale is the number of pixels per typographic point of the layout:
// 2 gives crisp text on ordinary and high-density screens alike.
const pngScale = 2.0

// maxPNGPixels bounds the size of a PNG (4 bytes a pixel while painting):
// a larger diagram is drawn at a smaller scale rather than exhausting
// memory. SVG has no such limit.
const maxPNGPixels = 64e6

// pngScaleFor returns the pixels per point for a layout of w × h points.
func pngScaleFor(w, h float64) float64 {
	if px := w * h * pngScale * pngScale; px > maxPNGPixels {
		return pngScale * math.Sqrt(maxPNGPixels/px)
	}
	return pngScale
}

// renderPNG lays out DOT source and paints it as a PNG.
//
// The layout comes from Graphviz's xdot output: every node, edge, cluster
// and label carries its drawing as a list of primitive operations
// (polygons, Bézier curves, ellipses, text with its font and colours),
// which this function paints with a 2-D vector library. Painting the
// primitives ourselves keeps the picture identical to the SVG output.
func renderPNG(ctx context.Context, dot string) ([]byte, error) {
	xdot, err := engine.Render(ctx, dot, engine.XDOT)
	if err != nil {
		return nil, err
	}
	laid, err := readXdot(xdot)
	if err != nil {
		return nil, fmt.Errorf("reading the layout: %w", err)
	}

	var bb [4]float64
	if _, err := fmt.Sscanf(laid.attrs["bb"], "%g,%g,%g,%g", &bb[0], &bb[1], &bb[2], &bb[3]); err != nil {
		return nil, fmt.Errorf("reading the layout's bounding box %q: %w", laid.attrs["bb"], err)
	}
	const margin = 8.0 // points
	w, h := bb[2]-bb[0]+2*margin, bb[3]-bb[1]+2*margin
	scale := pngScaleFor(w, h)
	p := &painter{
		dc:    gg.NewContext(int(math.Ceil(w*scale)), int(math.Ceil(h*scale))),
		scale: scale,
		// xdot has y up from the bottom-left corner; the image has y down.
		x: func(x float64) float64 { return (x - bb[0] + margin) * scale },
		y: func(y float64) float64 { return (bb[3] - y + margin) * scale },
	}
	p.dc.SetRGB(1, 1, 1)
	p.dc.Clear()

	var ops []string
	ops = append(ops, laid.attrs["_draw_"])
	ops = append(ops, laid.clusterOps()...)
	for _, n := range laid.nodes {
		ops = append(ops, n["_draw_"], n["_ldraw_"])
	}
	for _, e := range laid.edges {
		for _, a := range []string{"_draw_", "_tdraw_", "_hdraw_", "_ldraw_", "_tldraw_", "_hldraw_"} {
			ops = append(ops, e[a])
		}
	}
	ops = append(ops, laid.attrs["_ldraw_"])
	for _, o := range ops {
		if err := p.paint(o); err != nil {
			return nil, err
		}
	}
	var out bytes.Buffer
	if err := p.dc.EncodePNG(&out); err != nil {
		return nil, err
	}
	return out.Bytes(), nil
}

// xdotGraph is a laid-out graph read from xdot output: the attributes of
// the graph, of each subgraph, and of every node and edge in file order.
type xdotGraph struct {
	attrs    map[string]string
	clusters []*xdotGraph
	nodes    []map[string]string
	edges    []map[string]string
}

// readXdot reads Graphviz's xdot output. It walks the syntax tree rather
// than building a checked graph, since the drawing attributes (_draw_ …)
// are not in the DOT attribute list.
func readXdot(data []byte) (*xdotGraph, error) {
	tree, err := gographviz.Parse(data)
	if err != nil {
		return nil, err
	}
	g := &xdotGraph{attrs: map[string]string{}}
	g.add(tree.StmtList, g)
	return g, nil
}

func (g *xdotGraph) add(list ast.StmtList, top *xdotGraph) {
	for _, s := range list {
		switch s := s.(type) {
		case ast.GraphAttrs:
			for k, v := range ast.AttrList(s).GetMap() {
				g.attrs[k] = unquote(v)
			}
		case *ast.Attr:
			g.attrs[s.Field.String()] = unquote(s.Value.String())
		case *ast.NodeStmt:
			top.nodes = append(top.nodes, attrMap(s.Attrs))
		case *ast.EdgeStmt:
			top.edges = append(top.edges, attrMap(s.Attrs))
		case *ast.SubGraph:
			sub := &xdotGraph{attrs: map[string]string{}}
			sub.add(s.StmtList, top)
			g.clusters = append(g.clusters, sub)
		}
	}
}

func attrMap(l ast.AttrList) map[string]string {
	m := l.GetMap()
	for k, v := range m {
		m[k] = unquote(v)
	}
	return m
}

// unquote returns the text of a DOT string as Graphviz writes it: without
// its quotes, with \" and \\ turned back into " and \, and line
// continuations (backslash, newline) removed. Other backslashes stay.
func unquote(s string) string {
	if len(s) < 2 || s[0] != '"' || s[len(s)-1] != '"' {
		return s
	}
	s = s[1 : len(s)-1]
	if !strings.Contains(s, `\`) {
		return s
	}
	var b strings.Builder
	for i := 0; i < len(s); i++ {
		if s[i] == '\\' && i+1 < len(s) {
			switch s[i+1] {
			case '"', '\\':
				b.WriteByte(s[i+1])
				i++
				continue
			case '\n':
				i++
				continue
			case '\r':
				i++
				if i+1 < len(s) && s[i+1] == '\n' {
					i++
				}
				continue
			}
		}
		b.WriteByte(s[i])
	}
	return b.String()
}

// clusterOps returns the drawing operations of every subgraph, nested ones
// after their parents.
func (g *xdotGraph) clusterOps() []string {
	var ops []string
	for _, sub := range g.clusters {
		ops = append(ops, sub.attrs["_draw_"], sub.attrs["_ldraw_"])
		ops = append(ops, sub.clusterOps()...)
	}
	return ops
}

// painter paints xdot operations (Graphviz's "xdot" output format, version
// 1.7: E e P p L B b T t C c F S) on a gg context.
type painter struct {
	dc       *gg.Context
	scale    float64 // pixels per point
	x, y     func(float64) float64
	pen      color.Color
	fill     color.Color
	lineW    float64
	dashed   bool
	dotted   bool
	fontSize float64
	bold     bool
	faces    map[string]font.Face
}

// paint runs one attribute's list of operations. Each list starts from
// the default drawing state (black pen and fill, a line 1 point wide, solid,
// 14-point regular text): Graphviz writes into every list only what differs
// from the defaults, so state left over from an earlier list (the thick
// outline of a node over its limit, a dashed edge) must not carry over.
func (p *painter) paint(s string) error {
	p.reset()
	r := &xdotReader{s: s}
	for {
		r.space()
		if r.done() {
			return r.err
		}
		op := r.s[r.i]
		r.i++
		switch op {
		case 'E', 'e':
			cx, cy, rx, ry := r.num(), r.num(), r.num(), r.num()
			p.dc.DrawEllipse(p.x(cx), p.y(cy), rx*p.scale, ry*p.scale)
			p.finish(op == 'E')
		case 'P', 'p', 'L', 'B', 'b':
			pts := r.points()
			p.path(op, pts)
		case 'T':
			x, y, just, _ := r.num(), r.num(), r.num(), r.num()
			p.text(x, y, just, r.str())
		case 't':
			p.bold = int(r.num())&1 != 0
		case 'C':
			p.fill = parseColour(r.str())
		case 'c':
			p.pen = parseColour(r.str())
		case 'F':
			p.fontSize = r.num()
			r.str() // font name: the built-in Go fonts stand in for all
		case 'S':
			p.style(r.str())
		case 'I':
			r.num()
			r.num()
			r.num()
			r.num()
			r.str() // images are not used in heatgraph diagrams
		default:
			return fmt.Errorf("unknown drawing operation %q in the layout", op)
		}
		if r.err != nil {
			return r.err
		}
	}
}

// reset restores the default drawing state of an xdot operation list.
func (p *painter) reset() {
	p.pen, p.fill, p.lineW, p.fontSize = color.Black, color.Black, 1, 14
	p.dashed, p.dotted, p.bold = false, false, false
}

// path draws a polygon, polyline or Bézier spline.
func (p *painter) path(op byte, pts [][2]float64) {
	if len(pts) == 0 {
		return
	}
	p.dc.NewSubPath()
	p.dc.MoveTo(p.x(pts[0][0]), p.y(pts[0][1]))
	switch op {
	case 'B', 'b':
		for i := 1; i+2 < len(pts); i += 3 {
			p.dc.CubicTo(p.x(pts[i][0]), p.y(pts[i][1]), p.x(pts[i+1][0]), p.y(pts[i+1][1]), p.x(pts[i+2][0]), p.y(pts[i+2][1]))
		}
	default:
		for _, pt := range pts[1:] {
			p.dc.LineTo(p.x(pt[0]), p.y(pt[1]))
		}
	}
	if op == 'P' || op == 'p' || op == 'b' {
		p.dc.ClosePath()
	}
	p.finish(op == 'P' || op == 'b')
}

// finish fills (then outlines with the pen) or strokes the current path.
func (p *painter) finish(filled bool) {
	if filled {
		p.dc.SetColor(p.fill)
		p.dc.FillPreserve()
	}
	p.dc.SetColor(p.pen)
	p.dc.SetLineWidth(p.lineW * p.scale)
	switch {
	case p.dotted:
		// Short dashes with round caps: dots.
		p.dc.SetDash(p.lineW*p.scale, (2+2*p.lineW)*p.scale)
	case p.dashed:
		p.dc.SetDash(5*p.scale, 3*p.scale)
	default:
		p.dc.SetDash()
	}
	p.dc.SetLineCapRound()
	p.dc.SetLineJoinRound()
	p.dc.Stroke()
}

// text draws a string with its baseline at (x, y), justified left (-1),
// centred (0) or right (1).
func (p *painter) text(x, y, just float64, s string) {
	p.dc.SetFontFace(p.face())
	p.dc.SetColor(p.pen)
	ax := 0.5 + 0.5*just // -1 -> 0 (left), 0 -> 0.5, 1 -> 1
	p.dc.DrawStringAnchored(s, p.x(x), p.y(y), ax, 0)
}

func (p *painter) face() font.Face {
	key := fmt.Sprintf("%v/%g", p.bold, p.fontSize)
	if f, ok := p.faces[key]; ok {
		return f
	}
	data := goregular.TTF
	if p.bold {
		data = gobold.TTF
	}
	ft, err := truetype.Parse(data)
	if err != nil {
		panic(fmt.Sprintf("viz: built-in font: %v", err)) // compiled-in data
	}
	f := truetype.NewFace(ft, &truetype.Options{Size: p.fontSize * p.scale * 0.96, DPI: 72})
	if p.faces == nil {
		p.faces = map[string]font.Face{}
	}
	p.faces[key] = f
	return f
}

func (p *painter) style(s string) {
	switch {
	case strings.HasPrefix(s, "setlinewidth("):
		if w, err := strconv.ParseFloat(strings.TrimSuffix(strings.TrimPrefix(s, "setlinewidth("), ")"), 64); err == nil {
			p.lineW = w
		}
	case s == "dashed":
		p.dashed, p.dotted = true, false
	case s == "dotted":
		p.dashed, p.dotted = false, true
	case s == "solid":
		p.dashed, p.dotted = false, false
	}
}

// parseColour reads "#rrggbb", "#rrggbbaa" or one of the few names Graphviz
// writes for defaults.
func parseColour(s string) color.Color {
	switch s {
	case "black":
		return color.Black
	case "white":
		return color.White
	case "transparent", "none", "invis":
		return color.Transparent
	}
	if len(s) == 7 || len(s) == 9 {
		if v, err := strconv.ParseUint(s[1:], 16, 32); err == nil && s[0] == '#' {
			if len(s) == 7 {
				return color.NRGBA{uint8(v >> 16), uint8(v >> 8), uint8(v), 255}
			}
			return color.NRGBA{uint8(v >> 24), uint8(v >> 16), uint8(v >> 8), uint8(v)}
		}
	}
	return color.Black
}

// xdotReader tokenizes one xdot operation list.
type xdotReader struct {
	s   string
	i   int
	err error
}

func (r *xdotReader) done() bool { return r.err != nil || r.i >= len(r.s) }

func (r *xdotReader) space() {
	for r.i < len(r.s) && (r.s[r.i] == ' ' || r.s[r.i] == '\n' || r.s[r.i] == '\t' || r.s[r.i] == '\\') {
		r.i++
	}
}

func (r *xdotReader) num() float64 {
	r.space()
	start := r.i
	for r.i < len(r.s) && r.s[r.i] != ' ' && r.s[r.i] != '\n' {
		r.i++
	}
	v, err := strconv.ParseFloat(r.s[start:r.i], 64)
	if err != nil && r.err == nil {
		r.err = fmt.Errorf("malformed number %q in the layout", r.s[start:r.i])
	}
	return v
}

func (r *xdotReader) points() [][2]float64 {
	n := int(r.num())
	if n < 0 || n > len(r.s) {
		r.err = fmt.Errorf("malformed point count %d in the layout", n)
		return nil
	}
	pts := make([][2]float64, n)
	for k := range pts {
		pts[k] = [2]float64{r.num(), r.num()}
	}
	return pts
}

// str reads "n -bytes": a byte count, a dash, then exactly n bytes.
func (r *xdotReader) str() string {
	n := int(r.num())
	r.space()
	if r.err != nil || r.i >= len(r.s) || r.s[r.i] != '-' || n < 0 || r.i+1+n > len(r.s) {
		if r.err == nil {
			r.err = fmt.Errorf("malformed string in the layout at %d", r.i)
		}
		return ""
	}
	s := r.s[r.i+1 : r.i+1+n]
	r.i += 1 + n
	return s
}
