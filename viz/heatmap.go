package viz

import (
	"bufio"
	"fmt"
	"hash/fnv"
	"html"
	"image"
	"image/color"
	"image/png"
	"io"
	"math"
	"strconv"
	"strings"

	"github.com/fogleman/gg"
	"github.com/golang/freetype/truetype"
	"golang.org/x/image/font"
	"golang.org/x/image/font/gofont/gobold"
	"golang.org/x/image/font/gofont/goregular"

	"github.com/heatgraph/heatgraph/network"
)

// HeatView chooses which cells of a plate a heat map shows.
type HeatView int

// Heat map views.
const (
	ViewTop     HeatView = iota // the top layer, k = NZ − 1 (the default)
	ViewLayer                   // the layer HeatMapOptions.Layer
	ViewHottest                 // the hottest cell through the thickness of every column
)

// HeatMapOptions choose what a plate's heat map shows and its size.
type HeatMapOptions struct {
	View  HeatView
	Layer int // with ViewLayer: k, 0 at the bottom face
	// MaxBlocks bounds the SVG's blocks along each side (200 when 0): a
	// larger grid is drawn in blocks of several cells, each showing the
	// hottest of them.
	MaxBlocks int
	// WidthPx and HeightPx are the picture's size (900 × 640 when 0; at
	// least 400 × 300): SVG user units, PNG pixels.
	WidthPx, HeightPx int
}

// Our sequential scale for cell temperatures, coolest to hottest: from a
// warm paper white through straw, apricot, terracotta and a berry red to a
// deep aubergine. Its CIELAB lightness falls steadily from L* 96 to L* 17,
// so the order reads from lightness alone: with a red-green colour vision
// deficiency, in grey-scale print, on a poor projector. Hue adds to it for
// those who see it. The tests check that lightness falls at every step of
// the scale, in normal vision and in simulated deuteranopia and protanopia.
var plateScale = scale{
	{0, rgb{0xf8, 0xf4, 0xe6}},    // paper white, L* 96
	{0.18, rgb{0xf1, 0xdc, 0x96}}, // straw
	{0.38, rgb{0xe8, 0xab, 0x66}}, // apricot
	{0.58, rgb{0xcc, 0x6e, 0x4a}}, // terracotta
	{0.78, rgb{0x93, 0x38, 0x4e}}, // berry red
	{1, rgb{0x3c, 0x16, 0x3e}},    // aubergine, L* 17
}

// heatLevels is the number of colour steps of a heat map: fine enough to
// read a field, coarse enough that neighbouring blocks of one step merge
// into one shape in the SVG.
const heatLevels = 64

var (
	noValueFill = rgb{0x9a, 0x9a, 0x9a} // a cell without a finite temperature
	hatchLight  = "#ffffff"
	hatchDark   = "#161616"
	frameColour = "#3d4852"
)

// levelColour is the colour of step l of heatLevels (−1: no value).
func levelColour(l int) rgb {
	if l < 0 {
		return noValueFill
	}
	return plateScale.at((float64(l) + 0.5) / heatLevels)
}

// heatMap is a plate's field with the picture's layout.
type heatMap struct {
	f      *plateField
	lo, hi float64 // K, the ends of the colour bar
	w, h   float64
	// The plot: left, top, width and height in picture units, and the
	// scale, picture units per metre.
	x0, y0, pw, ph, s      float64
	barX, barY, barW, barH float64
	captionY               float64
	view                   string
}

func newHeatMap(p *network.PlateResult, opt HeatMapOptions) (*heatMap, error) {
	if err := checkPlate(p); err != nil {
		return nil, err
	}
	k := p.NZ - 1
	view := fmt.Sprintf("top layer (k = %d", k)
	switch opt.View {
	case ViewTop:
	case ViewLayer:
		if opt.Layer < 0 || opt.Layer >= p.NZ {
			return nil, fmt.Errorf("plate %q has layers 0 to %d, not %d", p.ID, p.NZ-1, opt.Layer)
		}
		k = opt.Layer
		view = fmt.Sprintf("layer k = %d (", k)
		if k == 0 && p.NZ > 1 {
			view = "bottom layer (k = 0"
		}
	case ViewHottest:
		k = -1
		view = fmt.Sprintf("hottest cell through the thickness of each column (%s", countOf(p.NZ, "layer"))
	default:
		return nil, fmt.Errorf("unknown heat map view %d", opt.View)
	}
	if k >= 0 {
		z0, z1 := zSpan(p, k)
		if view[len(view)-1] != '(' {
			view += ", "
		}
		view += fmt.Sprintf("z %s to %s mm", fnum("%.2f", 1e3*z0), fnum("%.2f", 1e3*z1))
	}
	view += ")"
	f, err := newPlateField(p, k)
	if err != nil {
		return nil, err
	}
	m := &heatMap{f: f, lo: f.lo, hi: f.hi, view: view}
	if f.hotI < 0 {
		m.lo, m.hi = 0, 1 // nothing finite to show
	}
	if !(m.hi-m.lo > 1e-9) {
		m.hi = m.lo + 1 // one temperature everywhere: one colour
	}
	m.w, m.h = float64(opt.WidthPx), float64(opt.HeightPx)
	if m.w == 0 {
		m.w = 900
	}
	if m.h == 0 {
		m.h = 640
	}
	m.w, m.h = math.Max(m.w, 400), math.Max(m.h, 300)
	const left, right, top, bottom = 64.0, 190.0, 62.0, 132.0
	aw, ah := m.w-left-right, m.h-top-bottom
	m.s = math.Min(aw/p.Width, ah/p.Length)
	m.x0, m.y0, m.pw, m.ph = left, top, m.s*p.Width, m.s*p.Length
	m.barX, m.barY, m.barW = left+m.pw+34, top, 18
	m.barH = math.Max(m.ph, math.Min(ah, 180))
	m.captionY = top + math.Max(m.ph, m.barH) + 52
	return m, nil
}

func (m *heatMap) px(x float64) float64 { return m.x0 + m.s*x }
func (m *heatMap) py(y float64) float64 { return m.y0 + m.ph - m.s*y }

// level is the colour step of a temperature, −1 when it is not finite.
func (m *heatMap) level(t float64) int {
	if !finite(t) {
		return -1
	}
	l := int((t - m.lo) / (m.hi - m.lo) * heatLevels)
	return max(0, min(heatLevels-1, l))
}

// barY is the height on the colour bar of a temperature.
func (m *heatMap) barAt(t float64) float64 {
	return m.barY + m.barH - (t-m.lo)/(m.hi-m.lo)*m.barH
}

// over reports whether t is above the plate's limit.
func (m *heatMap) over(t float64) bool {
	return m.f.p.HasLimit && finite(t) && t > m.f.p.Limit
}

// canvas draws the parts of a heat map around its cells, in picture units,
// for SVG and PNG alike.
type canvas interface {
	rect(x, y, w, h float64, fill, stroke string, width float64, dashed bool)
	hatch(x, y, w, h float64)
	line(x1, y1, x2, y2 float64, colour string, width float64)
	circle(cx, cy, r float64, stroke string, width float64)
	// text with its baseline at y, anchored left (−1), centre (0) or
	// right (1); halo draws a white outline under it.
	text(x, y float64, anchor int, size float64, bold, halo bool, s string)
}

// niceStep is a step of 1, 2 or 5 × 10ⁿ giving about n ticks over span.
func niceStep(span float64, n int) float64 {
	if !(span > 0) {
		return 1
	}
	raw := span / float64(n)
	e := math.Pow(10, math.Floor(math.Log10(raw)))
	for _, f := range []float64{1, 2, 5, 10} {
		if f*e >= raw {
			return f * e
		}
	}
	return 10 * e
}

// ticks returns the multiples of step in [lo, hi].
func ticks(lo, hi, step float64) []float64 {
	var out []float64
	for v := math.Ceil(lo/step-1e-9) * step; v <= hi+1e-9*step; v += step {
		out = append(out, v)
	}
	return out
}

// tickText formats a tick value without needless decimals.
func tickText(v, step float64) string {
	d := 0
	if step < 1 {
		d = int(math.Ceil(-math.Log10(step) - 1e-9))
	}
	s := strconv.FormatFloat(v, 'f', d, 64)
	if strings.Trim(s, "-0.") == "" {
		s = strings.TrimPrefix(s, "-")
	}
	return s
}

// decorate draws everything but the cells: title, frame, axes in mm,
// footprints, the hottest cell, the colour bar with the limit, the caption.
func (m *heatMap) decorate(c canvas, cellWords string) {
	p, f := m.f.p, m.f
	c.text(m.x0, 24, -1, 15, true, false, p.ID+": cell temperatures [°C]")
	c.text(m.x0, 43, -1, 11, false, false, "plate "+fnum("%.1f", 1e3*p.Width)+" × "+fnum("%.1f", 1e3*p.Length)+" mm; "+m.view)
	c.rect(m.x0, m.y0, m.pw, m.ph, "none", frameColour, 1, false)

	// Axes in mm.
	wmm, lmm := 1e3*p.Width, 1e3*p.Length
	step := niceStep(wmm, max(2, int(m.pw/70)))
	for _, v := range ticks(0, wmm, step) {
		x := m.px(v / 1e3)
		c.line(x, m.y0+m.ph, x, m.y0+m.ph+5, frameColour, 1)
		c.text(x, m.y0+m.ph+17, 0, 10, false, false, tickText(v, step))
	}
	c.text(m.x0+m.pw/2, m.y0+m.ph+33, 0, 11, false, false, "x [mm]")
	step = niceStep(lmm, max(2, int(m.ph/50)))
	for _, v := range ticks(0, lmm, step) {
		y := m.py(v / 1e3)
		c.line(m.x0-5, y, m.x0, y, frameColour, 1)
		c.text(m.x0-8, y+4, 1, 10, false, false, tickText(v, step))
	}
	c.text(m.x0-8, m.y0-8, 1, 11, false, false, "y [mm]")

	// Footprints: outlined, named with their power; dashed on the bottom face.
	for _, fp := range p.Parts {
		x0, x1 := m.px(math.Min(fp.X0, fp.X1)), m.px(math.Max(fp.X0, fp.X1))
		ytop, ybot := m.py(math.Max(fp.Y0, fp.Y1)), m.py(math.Min(fp.Y0, fp.Y1))
		if !finite(x0) || !finite(x1) || !finite(ytop) || !finite(ybot) {
			continue
		}
		dashed := fp.Face == "bottom"
		c.rect(x0, ytop, x1-x0, ybot-ytop, "none", "#ffffff", 3, false)
		c.rect(x0, ytop, x1-x0, ybot-ytop, "none", "#1b1b1b", 1.3, dashed)
		label := fp.Name
		if fp.Power != 0 {
			label += " " + watts(fp.Power)
		}
		if fp.Face != "" && fp.Face != "top" {
			label += " (" + fp.Face + ")"
		}
		c.text(x0+3, ytop+12, -1, 10, true, true, label)
	}

	// The hottest cell shown.
	if f.hotI >= 0 {
		x, y, z := f.position(f.hotI, f.hotJ, f.hotK)
		cx, cy := m.px(x), m.py(y)
		c.circle(cx, cy, 7, "#ffffff", 3.5)
		c.circle(cx, cy, 7, "#111111", 1.5)
		c.line(cx-11, cy, cx-4, cy, "#111111", 1.5)
		c.line(cx+4, cy, cx+11, cy, "#111111", 1.5)
		label := "hottest " + fnum("%.1f", celsius(f.hi)) + " °C at " + mmText(p, x, y, z)
		// Below the marker (above it near the bottom edge), clear of the
		// footprints' names at their top left corners.
		ly := cy + 24
		if ly > m.y0+m.ph-4 {
			ly = cy - 14
		}
		if cx > m.x0+0.55*m.pw {
			c.text(cx+8, ly, 1, 11, true, true, label)
		} else {
			c.text(cx-8, ly, -1, 11, true, true, label)
		}
	}

	// The colour bar, coolest at the bottom.
	c.text(m.barX, m.barY-10, -1, 11, true, false, "T [°C]")
	for l := 0; l < heatLevels; l++ {
		y1 := m.barY + m.barH*(1-float64(l)/heatLevels)
		y0 := m.barY + m.barH*(1-float64(l+1)/heatLevels)
		c.rect(m.barX, y0, m.barW, y1-y0+0.4, levelColour(l).hex(), "none", 0, false)
	}
	c.rect(m.barX, m.barY, m.barW, m.barH, "none", frameColour, 1, false)
	lo, hi := celsius(m.lo), celsius(m.hi)
	step = niceStep(hi-lo, 6)
	for _, v := range ticks(lo, hi, step) {
		y := m.barAt(v + kelvin)
		c.line(m.barX+m.barW, y, m.barX+m.barW+4, y, frameColour, 1)
		c.text(m.barX+m.barW+7, y+4, -1, 10, false, false, tickText(v, step))
	}
	note := m.barY + m.barH + 18
	if p.HasLimit && finite(p.Limit) {
		lim := fnum("%.1f", celsius(p.Limit))
		switch {
		case p.Limit > m.hi:
			c.text(m.barX, note, -1, 10, false, false, "limit "+lim+" °C: above")
			c.text(m.barX, note+13, -1, 10, false, false, "every cell shown")
		case p.Limit < m.lo:
			c.text(m.barX, note, -1, 10, false, false, "limit "+lim+" °C: below")
			c.text(m.barX, note+13, -1, 10, false, false, "every cell shown")
		default:
			y := m.barAt(p.Limit)
			c.line(m.barX-6, y, m.barX+m.barW+6, y, "#ffffff", 4)
			c.line(m.barX-6, y, m.barX+m.barW+6, y, "#111111", 2)
			c.text(m.barX+m.barW+44, y+4, -1, 10, true, true, "◄ limit "+lim+" °C")
		}
		if f.overCells > 0 {
			c.hatch(m.barX, note+22, m.barW, 12)
			c.rect(m.barX, note+22, m.barW, 12, "none", frameColour, 1, false)
			c.text(m.barX+m.barW+6, note+32, -1, 10, false, false, "above the limit")
		}
	}

	// The caption: what a block shows, and the plate's summary.
	lines := []string{cellWords}
	sum := "plate: hottest " + fnum("%.2f", celsius(p.Hottest)) + " °C at " + mmText(p, p.HotX, p.HotY, p.HotZ) +
		", mean " + fnum("%.2f", celsius(p.Mean)) + " °C, coolest " + fnum("%.2f", celsius(p.Coolest)) + " °C"
	lines = append(lines, sum)
	if p.HasLimit {
		lines = append(lines, "limit "+fnum("%.2f", celsius(p.Limit))+" °C, margin "+fnum("%+.2f", noNegZero(p.Margin, 2))+" K: "+plateStatus(p)+
			overWords(f.overCells))
	}
	if len(p.Parts) > 0 {
		outl := "outlined: parts on the top face"
		for _, fp := range p.Parts {
			if fp.Face == "bottom" {
				outl += "; dashed: on the bottom face"
				break
			}
		}
		lines = append(lines, outl+"; ring: the hottest cell shown")
	}
	if f.nonFinite > 0 {
		lines = append(lines, "grey: "+countOf(f.nonFinite, "column")+" without a finite temperature")
	}
	for i, l := range lines {
		c.text(m.x0-40, m.captionY+15*float64(i), -1, 10.5, false, false, l)
	}
}

func overWords(n int) string {
	if n == 0 {
		return ""
	}
	return "; hatched: " + countOf(n, "cell") + " shown above the limit"
}

// blocksFor returns how many cells each block takes along each side so
// that no side has more than maxBlocks blocks.
func blocksFor(nx, ny, maxBlocks int) (bx, by int) {
	if maxBlocks <= 0 {
		maxBlocks = 200
	}
	return (nx + maxBlocks - 1) / maxBlocks, (ny + maxBlocks - 1) / maxBlocks
}

// WritePlateSVG draws a plate's heat map as a self-contained SVG picture:
// one layer's cells (or the hottest through the thickness) coloured by
// temperature, a colour bar in °C with the limit marked, cells above the
// limit hatched, footprints outlined and named with their power, the
// hottest cell marked with its temperature and position, axes in mm.
//
// A grid larger than opt.MaxBlocks along a side is drawn in blocks of
// several cells, each coloured by the hottest cell in it, so that a hot
// spot is never averaged away; the caption says so. Cells of one colour
// step next to each other in a row are drawn as one shape, and each
// colour's shapes are one path, so the picture stays small. The output
// depends on nothing but p and opt.
func WritePlateSVG(w io.Writer, p *network.PlateResult, opt HeatMapOptions) error {
	m, err := newHeatMap(p, opt)
	if err != nil {
		return err
	}
	f := m.f
	bx, by := blocksFor(f.nx, f.ny, opt.MaxBlocks)
	nbx, nby, v := f.blockMax(bx, by)

	bw := bufio.NewWriterSize(w, 64<<10)
	hid := svgID(p.ID)
	fmt.Fprintf(bw, `<svg xmlns="http://www.w3.org/2000/svg" width="%s" height="%s" viewBox="0 0 %s %s" font-family="Helvetica, Arial, sans-serif" role="img">`+"\n",
		svgNum(m.w), svgNum(m.h), svgNum(m.w), svgNum(m.h))
	fmt.Fprintf(bw, "<title>%s</title>\n", html.EscapeString("heat map of plate "+p.ID))
	fmt.Fprintf(bw, `<defs><pattern id="%s" width="8" height="8" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">`+
		`<rect x="0" y="0" width="2" height="8" fill="%s"/><rect x="2" y="0" width="1.5" height="8" fill="%s"/></pattern></defs>`+"\n",
		hid, hatchLight, hatchDark)
	bw.WriteString(`<rect x="0" y="0" width="100%" height="100%" fill="#ffffff"/>` + "\n")

	// The cells, one path per colour step, runs of one step in a row of
	// blocks merged into one rectangle.
	paths := make([][]byte, heatLevels+1) // index level+1: 0 is "no value"
	var overPath []byte
	cw, ch := m.s*p.Width/float64(f.nx), m.s*p.Length/float64(f.ny)
	rect := func(b []byte, i0, i1, j0, j1 int) []byte {
		x, y := m.x0+cw*float64(i0), m.y0+m.ph-ch*float64(j1)
		b = append(b, 'M')
		b = appendSVGNum(b, x)
		b = append(b, ' ')
		b = appendSVGNum(b, y)
		b = append(b, 'h')
		b = appendSVGNum(b, m.x0+cw*float64(i1)-x)
		b = append(b, 'v')
		b = appendSVGNum(b, m.y0+m.ph-ch*float64(j0)-y)
		b = append(b, 'H')
		b = appendSVGNum(b, x)
		return append(b, 'z')
	}
	for bj := 0; bj < nby; bj++ {
		row := v[bj*nbx : (bj+1)*nbx]
		j0, j1 := bj*by, min((bj+1)*by, f.ny)
		for b0 := 0; b0 < nbx; {
			l := m.level(row[b0])
			b1 := b0 + 1
			for b1 < nbx && m.level(row[b1]) == l {
				b1++
			}
			paths[l+1] = rect(paths[l+1], b0*bx, min(b1*bx, f.nx), j0, j1)
			b0 = b1
		}
		for b0 := 0; b0 < nbx; {
			if !m.over(row[b0]) {
				b0++
				continue
			}
			b1 := b0 + 1
			for b1 < nbx && m.over(row[b1]) {
				b1++
			}
			overPath = rect(overPath, b0*bx, min(b1*bx, f.nx), j0, j1)
			b0 = b1
		}
	}
	bw.WriteString(`<g shape-rendering="crispEdges">` + "\n")
	for i, d := range paths {
		if len(d) == 0 {
			continue
		}
		fmt.Fprintf(bw, `<path fill="%s" d="`, levelColour(i-1).hex())
		bw.Write(d)
		bw.WriteString("\"/>\n")
	}
	if len(overPath) > 0 {
		fmt.Fprintf(bw, `<path fill="url(#%s)" d="`, hid)
		bw.Write(overPath)
		bw.WriteString("\"/>\n")
	}
	bw.WriteString("</g>\n")

	words := fmt.Sprintf("each of the %d × %d cells drawn as it is", f.nx, f.ny)
	if bx > 1 || by > 1 {
		words = fmt.Sprintf("%d × %d cells drawn as %d × %d blocks of up to %d × %d cells; each block shows its hottest cell, so no hot spot is lost",
			f.nx, f.ny, nbx, nby, bx, by)
	}
	m.decorate(&svgCanvas{w: bw, hatchID: hid}, words)
	bw.WriteString("</svg>\n")
	return bw.Flush()
}

// svgID is an id for a plate's hatch pattern, unique to the plate's id so
// that several heat maps can stand in one page.
func svgID(id string) string {
	h := fnv.New32a()
	h.Write([]byte(id))
	var b strings.Builder
	b.WriteString("hg-over-")
	for _, r := range id {
		if len(b.String()) > 40 {
			break
		}
		if r < 128 && (r == '-' || r == '_' || r >= '0' && r <= '9' || r >= 'a' && r <= 'z' || r >= 'A' && r <= 'Z') {
			b.WriteRune(r)
		}
	}
	fmt.Fprintf(&b, "-%08x", h.Sum32())
	return b.String()
}

// appendSVGNum appends x rounded to hundredths, without needless digits.
func appendSVGNum(b []byte, x float64) []byte {
	x = math.Round(x*100) / 100
	if x == 0 {
		x = 0 // no "-0"
	}
	return strconv.AppendFloat(b, x, 'f', -1, 64)
}

func svgNum(x float64) string { return string(appendSVGNum(nil, x)) }

type svgCanvas struct {
	w       *bufio.Writer
	hatchID string
}

func (c *svgCanvas) rect(x, y, w, h float64, fill, stroke string, width float64, dashed bool) {
	fmt.Fprintf(c.w, `<rect x="%s" y="%s" width="%s" height="%s" fill="%s"`, svgNum(x), svgNum(y), svgNum(w), svgNum(h), fill)
	if stroke != "none" {
		fmt.Fprintf(c.w, ` stroke="%s" stroke-width="%s"`, stroke, svgNum(width))
		if dashed {
			c.w.WriteString(` stroke-dasharray="5 3"`)
		}
	}
	c.w.WriteString("/>\n")
}

func (c *svgCanvas) hatch(x, y, w, h float64) {
	fmt.Fprintf(c.w, `<rect x="%s" y="%s" width="%s" height="%s" fill="%s"/>`+"\n", svgNum(x), svgNum(y), svgNum(w), svgNum(h), levelColour(heatLevels-1).hex())
	fmt.Fprintf(c.w, `<rect x="%s" y="%s" width="%s" height="%s" fill="url(#%s)"/>`+"\n", svgNum(x), svgNum(y), svgNum(w), svgNum(h), c.hatchID)
}

func (c *svgCanvas) line(x1, y1, x2, y2 float64, colour string, width float64) {
	fmt.Fprintf(c.w, `<line x1="%s" y1="%s" x2="%s" y2="%s" stroke="%s" stroke-width="%s"/>`+"\n",
		svgNum(x1), svgNum(y1), svgNum(x2), svgNum(y2), colour, svgNum(width))
}

func (c *svgCanvas) circle(cx, cy, r float64, stroke string, width float64) {
	fmt.Fprintf(c.w, `<circle cx="%s" cy="%s" r="%s" fill="none" stroke="%s" stroke-width="%s"/>`+"\n",
		svgNum(cx), svgNum(cy), svgNum(r), stroke, svgNum(width))
}

func (c *svgCanvas) text(x, y float64, anchor int, size float64, bold, halo bool, s string) {
	fmt.Fprintf(c.w, `<text x="%s" y="%s" font-size="%s"`, svgNum(x), svgNum(y), svgNum(size))
	switch anchor {
	case 0:
		c.w.WriteString(` text-anchor="middle"`)
	case 1:
		c.w.WriteString(` text-anchor="end"`)
	}
	if bold {
		c.w.WriteString(` font-weight="bold"`)
	}
	if halo {
		c.w.WriteString(` stroke="#ffffff" stroke-width="3" paint-order="stroke" stroke-linejoin="round"`)
	}
	fmt.Fprintf(c.w, ` fill="#111111">%s</text>`+"\n", html.EscapeString(s))
}

// WritePlatePNG draws a plate's heat map as a PNG picture of
// opt.WidthPx × opt.HeightPx pixels (900 × 640 when 0), with what
// WritePlateSVG shows. Each pixel of the plot shows the hottest of the
// cells it covers (the nearest cell where cells are larger than pixels),
// so no hot spot is lost however large the grid.
func WritePlatePNG(w io.Writer, p *network.PlateResult, opt HeatMapOptions) error {
	m, err := newHeatMap(p, opt)
	if err != nil {
		return err
	}
	if m.w*m.h > maxPNGPixels {
		return fmt.Errorf("a heat map of %g × %g pixels is larger than %g pixels", m.w, m.h, float64(maxPNGPixels))
	}
	f := m.f
	dc := gg.NewContext(int(m.w), int(m.h))
	dc.SetRGB(1, 1, 1)
	dc.Clear()
	img := dc.Image().(*image.RGBA)

	var palette [heatLevels + 1]color.RGBA
	for l := -1; l < heatLevels; l++ {
		c := levelColour(l)
		palette[l+1] = color.RGBA{uint8(math.Round(c.r)), uint8(math.Round(c.g)), uint8(math.Round(c.b)), 255}
	}
	light, dark := color.RGBA{255, 255, 255, 255}, color.RGBA{0x16, 0x16, 0x16, 255}
	ix0, iy0 := int(math.Round(m.x0)), int(math.Round(m.y0))
	iw, ih := max(1, int(math.Round(m.pw))), max(1, int(math.Round(m.ph)))
	// The cells each pixel column covers: [i0[c], i1[c]).
	i0, i1 := make([]int, iw), make([]int, iw)
	for c := range iw {
		i0[c] = c * f.nx / iw
		i1[c] = max(i0[c]+1, ((c+1)*f.nx+iw-1)/iw)
	}
	rowMax := make([]float64, iw)
	for r := range ih {
		// Pixel rows run down; j runs up from y = 0.
		jt0 := r * f.ny / ih
		jt1 := max(jt0+1, ((r+1)*f.ny+ih-1)/ih)
		for c := range rowMax {
			rowMax[c] = math.NaN()
		}
		for jt := jt0; jt < jt1; jt++ {
			j := f.ny - 1 - jt
			row := f.v[j*f.nx : (j+1)*f.nx]
			for c := range iw {
				mx := rowMax[c]
				for _, t := range row[i0[c]:i1[c]] {
					if finite(t) && !(t <= mx) {
						mx = t
					}
				}
				rowMax[c] = mx
			}
		}
		y := iy0 + r
		if y < 0 || y >= img.Bounds().Dy() {
			continue
		}
		for c, t := range rowMax {
			x := ix0 + c
			if x < 0 || x >= img.Bounds().Dx() {
				continue
			}
			col := palette[m.level(t)+1]
			if m.over(t) {
				switch (x + y) % 8 {
				case 0, 1:
					col = light
				case 2:
					col = dark
				}
			}
			img.SetRGBA(x, y, col)
		}
	}
	words := fmt.Sprintf("%d × %d cells on %d × %d pixels; each pixel shows the hottest cell it covers, so no hot spot is lost", f.nx, f.ny, iw, ih)
	m.decorate(&pngCanvas{dc: dc, img: img}, words)
	return png.Encode(w, img)
}

type pngCanvas struct {
	dc    *gg.Context
	img   *image.RGBA
	faces map[string]font.Face
}

func hexColour(s string) color.Color {
	if s == "none" || len(s) != 7 {
		return color.Transparent
	}
	v, err := strconv.ParseUint(s[1:], 16, 32)
	if err != nil {
		return color.Transparent
	}
	return color.RGBA{uint8(v >> 16), uint8(v >> 8), uint8(v), 255}
}

func (c *pngCanvas) rect(x, y, w, h float64, fill, stroke string, width float64, dashed bool) {
	if fill != "none" {
		c.dc.SetColor(hexColour(fill))
		c.dc.DrawRectangle(x, y, w, h)
		c.dc.Fill()
	}
	if stroke != "none" {
		c.dc.SetColor(hexColour(stroke))
		c.dc.SetLineWidth(width)
		if dashed {
			c.dc.SetDash(5, 3)
		} else {
			c.dc.SetDash()
		}
		c.dc.DrawRectangle(x, y, w, h)
		c.dc.Stroke()
		c.dc.SetDash()
	}
}

func (c *pngCanvas) hatch(x, y, w, h float64) {
	light, dark := color.RGBA{255, 255, 255, 255}, color.RGBA{0x16, 0x16, 0x16, 255}
	fill := hexColour(levelColour(heatLevels - 1).hex()).(color.RGBA)
	for py := int(y); py < int(y+h); py++ {
		for px := int(x); px < int(x+w); px++ {
			col := fill
			switch (px + py) % 8 {
			case 0, 1:
				col = light
			case 2:
				col = dark
			}
			c.img.SetRGBA(px, py, col)
		}
	}
}

func (c *pngCanvas) line(x1, y1, x2, y2 float64, colour string, width float64) {
	c.dc.SetColor(hexColour(colour))
	c.dc.SetLineWidth(width)
	c.dc.DrawLine(x1, y1, x2, y2)
	c.dc.Stroke()
}

func (c *pngCanvas) circle(cx, cy, r float64, stroke string, width float64) {
	c.dc.SetColor(hexColour(stroke))
	c.dc.SetLineWidth(width)
	c.dc.DrawCircle(cx, cy, r)
	c.dc.Stroke()
}

func (c *pngCanvas) face(size float64, bold bool) font.Face {
	key := fmt.Sprintf("%v/%g", bold, size)
	if f, ok := c.faces[key]; ok {
		return f
	}
	data := goregular.TTF
	if bold {
		data = gobold.TTF
	}
	ft, err := truetype.Parse(data)
	if err != nil {
		panic(fmt.Sprintf("viz: built-in font: %v", err)) // compiled-in data
	}
	f := truetype.NewFace(ft, &truetype.Options{Size: size, DPI: 72})
	if c.faces == nil {
		c.faces = map[string]font.Face{}
	}
	c.faces[key] = f
	return f
}

func (c *pngCanvas) text(x, y float64, anchor int, size float64, bold, halo bool, s string) {
	c.dc.SetFontFace(c.face(size, bold))
	ax := 0.5 + 0.5*float64(anchor)
	if halo {
		c.dc.SetColor(color.White)
		for _, d := range [][2]float64{{-1, -1}, {0, -1.5}, {1, -1}, {-1.5, 0}, {1.5, 0}, {-1, 1}, {0, 1.5}, {1, 1}} {
			c.dc.DrawStringAnchored(s, x+d[0], y+d[1], ax, 0)
		}
	}
	c.dc.SetColor(color.RGBA{0x11, 0x11, 0x11, 255})
	c.dc.DrawStringAnchored(s, x, y, ax, 0)
}
