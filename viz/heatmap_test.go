package viz

import (
	"bytes"
	"encoding/xml"
	"flag"
	"image"
	"image/png"
	"io"
	"math"
	"math/rand/v2"
	"os"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/network"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

var updateHeatMap = flag.Bool("update-heatmap", false, "rewrite testdata/plate-small.svg (only when a change of the picture is intended)")

// The scale of cell temperatures reads one way by lightness alone: L*
// falls at every step, in normal vision and in the Machado et al. (2009)
// simulations of deuteranopia and protanopia (palette_test.go), over a
// wide range, and every one of the heat map's colour steps is darker than
// the one below it.
func TestPlateScaleLightness(t *testing.T) {
	for _, vision := range []struct {
		name string
		see  func(rgb) rgb
	}{
		{"normal vision", func(c rgb) rgb { return c }},
		{"deuteranopia", func(c rgb) rgb { return simulate(c, machadoDeuteranopia) }},
		{"protanopia", func(c rgb) rgb { return simulate(c, machadoProtanopia) }},
	} {
		prev := lightness(vision.see(plateScale.at(0)))
		top := prev
		for s := 1; s <= 400; s++ {
			l := lightness(vision.see(plateScale.at(float64(s) / 400)))
			assert.Less(t, l, prev, "%s: L* does not fall at %g", vision.name, float64(s)/400)
			prev = l
		}
		assert.Greater(t, top-prev, 70.0, "%s: the scale spans too little lightness", vision.name)
		for l := 1; l < heatLevels; l++ {
			lo, hi := lightness(vision.see(levelColour(l-1))), lightness(vision.see(levelColour(l)))
			assert.Greater(t, lo-hi, 0.5, "%s: steps %d and %d are too close (L* %.2f, %.2f)", vision.name, l-1, l, lo, hi)
		}
	}
	assert.Equal(t, "#f8f4e6", plateScale.at(0).hex())
	assert.Equal(t, "#3c163e", plateScale.at(1).hex())
}

// The picture of a small plate is what was checked by eye and kept: a
// golden file. Run with -update-heatmap to rewrite it after an intended
// change, and look at it.
func TestPlateSVGGolden(t *testing.T) {
	p := testBoard(100, 80, 10, 8, 2)
	var buf bytes.Buffer
	require.NoError(t, WritePlateSVG(&buf, &p, HeatMapOptions{}))
	const golden = "testdata/plate-small.svg"
	if *updateHeatMap {
		require.NoError(t, os.WriteFile(golden, buf.Bytes(), 0o644))
	}
	want, err := os.ReadFile(golden)
	require.NoError(t, err)
	assert.Equal(t, string(want), buf.String(), "run go test ./viz -run PlateSVGGolden -update-heatmap to rewrite it")
}

// svgRects returns the rectangles of every path of one fill.
func svgRects(t *testing.T, svg, fill string) [][4]float64 {
	t.Helper()
	re := regexp.MustCompile(`<path fill="` + regexp.QuoteMeta(fill) + `" d="([^"]*)"`)
	rect := regexp.MustCompile(`M([-0-9.]+) ([-0-9.]+)h([-0-9.]+)v([-0-9.]+)H[-0-9.]+z`)
	var out [][4]float64
	for _, m := range re.FindAllStringSubmatch(svg, -1) {
		for _, r := range rect.FindAllStringSubmatch(m[1], -1) {
			var v [4]float64
			for i := range v {
				f, err := strconv.ParseFloat(r[i+1], 64)
				require.NoError(t, err)
				v[i] = f
			}
			out = append(out, v)
		}
	}
	return out
}

// spikePlate is a plate of nx × ny cells at 40 °C with one cell at 90 °C:
// a hot spot far smaller than a block.
func spikePlate(nx, ny, si, sj int) network.PlateResult {
	p := network.PlateResult{ID: "spreader", NX: nx, NY: ny, NZ: 1, Width: 0.2, Length: 0.15, Thickness: 2e-3,
		ZEdges: []float64{0, 2e-3}, T: make([]float64, nx*ny)}
	for c := range p.T {
		p.T[c] = 40 + kelvin + 1e-3*float64(c%nx)
	}
	p.T[si+nx*sj] = 90 + kelvin
	p.Hottest, p.Coolest, p.Mean = 90+kelvin, 40+kelvin, 40.5+kelvin
	p.HotX, p.HotY = (float64(si)+0.5)*p.Width/float64(nx), (float64(sj)+0.5)*p.Length/float64(ny)
	return p
}

// A single hot cell in a grid of a million survives downsampling: its
// block is drawn in the hottest colour, at its place, and is the only
// one; the SVG has at most 200 blocks a side and stays small.
func TestPlateSVGKeepsHotSpot(t *testing.T) {
	for _, c := range []struct{ nx, ny, si, sj int }{{1000, 1000, 637, 211}, {1000, 1000, 0, 999}, {999, 401, 998, 0}, {7, 3, 3, 1}} {
		p := spikePlate(c.nx, c.ny, c.si, c.sj)
		var buf bytes.Buffer
		require.NoError(t, WritePlateSVG(&buf, &p, HeatMapOptions{}))
		svg := buf.String()
		hot := svgRects(t, svg, levelColour(heatLevels-1).hex())
		require.Len(t, hot, 1, "%+v: one block in the hottest colour", c)
		m, err := newHeatMap(&p, HeatMapOptions{})
		require.NoError(t, err)
		x, y := m.px(p.HotX), m.py(p.HotY)
		r := hot[0]
		assert.True(t, x >= r[0] && x <= r[0]+r[2] && y >= r[1] && y <= r[1]+r[3], "%+v: the hot block %v is not where the hot cell is (%g, %g)", c, r, x, y)
		bx, by := blocksFor(c.nx, c.ny, 0)
		assert.LessOrEqual(t, (c.nx+bx-1)/bx, 200)
		assert.LessOrEqual(t, (c.ny+by-1)/by, 200)
		assert.Contains(t, svg, "hottest 90.0 °C at")
		if c.nx > 200 {
			assert.Contains(t, svg, "each block shows its hottest cell")
			assert.Less(t, buf.Len(), 400<<10, "a smooth field of a million cells stays small")
		}
	}
}

// The maximum over blocks of any size keeps the field's hottest value in
// the block that holds its hottest cell, for random fields and blocks.
func TestBlockMaxNeverLosesTheHottest(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 7))
	for range 300 {
		nx, ny := 1+rng.IntN(60), 1+rng.IntN(60)
		p := network.PlateResult{ID: "p", NX: nx, NY: ny, NZ: 1, Width: 0.1, Length: 0.1, T: make([]float64, nx*ny)}
		for c := range p.T {
			p.T[c] = 300 + 50*rng.Float64()
		}
		f, err := newPlateField(&p, 0)
		require.NoError(t, err)
		bx, by := 1+rng.IntN(nx), 1+rng.IntN(ny)
		nbx, _, v := f.blockMax(bx, by)
		hot := p.T[f.hotI+nx*f.hotJ]
		assert.Equal(t, f.hi, hot)
		assert.Equal(t, hot, v[f.hotI/bx+nbx*(f.hotJ/by)])
		for _, b := range v {
			assert.LessOrEqual(t, b, hot)
		}
	}
}

// The PNG decodes, has the asked size, and the pixel over a single hot
// cell among a million is drawn in the hottest colour.
func TestPlatePNG(t *testing.T) {
	p := spikePlate(1000, 1000, 412, 733)
	for _, size := range [][2]int{{0, 0}, {640, 480}, {1600, 1000}} {
		var buf bytes.Buffer
		opt := HeatMapOptions{WidthPx: size[0], HeightPx: size[1]}
		require.NoError(t, WritePlatePNG(&buf, &p, opt))
		img, err := png.Decode(&buf)
		require.NoError(t, err)
		want := image.Pt(900, 640)
		if size[0] > 0 {
			want = image.Pt(size[0], size[1])
		}
		assert.Equal(t, want, img.Bounds().Size())
		m, err := newHeatMap(&p, opt)
		require.NoError(t, err)
		r, g, b, _ := img.At(int(m.px(p.HotX)), int(m.py(p.HotY))).RGBA()
		hot := levelColour(heatLevels - 1)
		assert.Equal(t, [3]uint32{uint32(math.Round(hot.r)), uint32(math.Round(hot.g)), uint32(math.Round(hot.b))}, [3]uint32{r >> 8, g >> 8, b >> 8}, "size %v", size)
	}
	// A small plate: every cell is many pixels wide (nearest cell).
	q := testBoard(100, 80, 10, 8, 1)
	var a, b bytes.Buffer
	require.NoError(t, WritePlatePNG(&a, &q, HeatMapOptions{}))
	require.NoError(t, WritePlatePNG(&b, &q, HeatMapOptions{}))
	assert.Equal(t, a.Bytes(), b.Bytes(), "the PNG is deterministic")
	_, err := png.Decode(&a)
	require.NoError(t, err)
	assert.ErrorContains(t, WritePlatePNG(io.Discard, &q, HeatMapOptions{WidthPx: 20000, HeightPx: 20000}), "larger than")
}

func TestPlateViews(t *testing.T) {
	p := testBoard(100, 80, 20, 16, 3)
	// Make the bottom layer's corner the plate's hottest cell.
	p.T[0] = 130 + kelvin
	svg := func(opt HeatMapOptions) string {
		var buf bytes.Buffer
		require.NoError(t, WritePlateSVG(&buf, &p, opt))
		return buf.String()
	}
	top := svg(HeatMapOptions{})
	assert.Contains(t, top, "top layer (k = 2, z 1.07 to 1.60 mm)")
	assert.NotContains(t, top, "hottest 130.0 °C", "the corner is in the bottom layer")
	bottom := svg(HeatMapOptions{View: ViewLayer, Layer: 0})
	assert.Contains(t, bottom, "bottom layer (k = 0, z 0.00 to 0.53 mm)")
	assert.Contains(t, bottom, "hottest 130.0 °C at (2.5, 2.5, 0.27) mm")
	through := svg(HeatMapOptions{View: ViewHottest})
	assert.Contains(t, through, "hottest cell through the thickness of each column (3 layers)")
	assert.Contains(t, through, "hottest 130.0 °C at (2.5, 2.5, 0.27) mm", "the column's hottest is in the bottom layer")
	assert.Equal(t, top, svg(HeatMapOptions{}), "the SVG is deterministic")

	var buf bytes.Buffer
	assert.ErrorContains(t, WritePlateSVG(&buf, &p, HeatMapOptions{View: ViewLayer, Layer: 3}), "layers 0 to 2, not 3")
	bad := p
	bad.T = bad.T[:10]
	assert.ErrorContains(t, WritePlateSVG(&buf, &bad, HeatMapOptions{}), "10 cell temperatures")
	assert.ErrorContains(t, WritePlatePNG(&buf, &bad, HeatMapOptions{}), "10 cell temperatures")
	bad = p
	bad.Width = math.NaN()
	assert.Error(t, WritePlateSVG(&buf, &bad, HeatMapOptions{}))
}

// The limit is marked on the colour bar, and cells above it are hatched
// (a pattern, not a colour); without cells above it there is no hatching.
func TestPlateLimitMarks(t *testing.T) {
	p := testBoard(100, 80, 50, 40, 1)
	p.Limit = 100 + kelvin
	var buf bytes.Buffer
	require.NoError(t, WritePlateSVG(&buf, &p, HeatMapOptions{}))
	svg := buf.String()
	assert.Contains(t, svg, "◄ limit 100.0 °C")
	assert.Regexp(t, `<path fill="url\(#hg-over-main-board-[0-9a-f]{8}\)" d="M`, svg)
	assert.Contains(t, svg, "above the limit")
	assert.Contains(t, svg, "cells shown above the limit")

	p.Limit = 150 + kelvin
	buf.Reset()
	require.NoError(t, WritePlateSVG(&buf, &p, HeatMapOptions{}))
	svg = buf.String()
	assert.NotContains(t, svg, `fill="url(#`)
	assert.Contains(t, svg, "limit 150.0 °C: above")

	p.HasLimit = false
	buf.Reset()
	require.NoError(t, WritePlateSVG(&buf, &p, HeatMapOptions{}))
	assert.NotContains(t, buf.String(), "limit")
}

// Names from the model are escaped, the picture is well-formed XML, and a
// cell without a finite temperature is grey, never "NaN".
func TestPlateSVGEscapedAndFinite(t *testing.T) {
	p := testBoard(100, 80, 10, 8, 1)
	p.ID = `<b>&"board"`
	p.Parts[0].Name = "</text><script>alert(1)</script>"
	p.T[5] = math.NaN()
	p.T[6] = math.Inf(1)
	var buf bytes.Buffer
	require.NoError(t, WritePlateSVG(&buf, &p, HeatMapOptions{}))
	svg := buf.String()
	assert.NotContains(t, svg, "<script>")
	assert.NotContains(t, svg, "<b>")
	assert.NotContains(t, svg, "NaN")
	assert.NotContains(t, svg, "Inf")
	assert.Contains(t, svg, noValueFill.hex())
	assert.Contains(t, svg, "grey: 2 columns without a finite temperature")
	d := xml.NewDecoder(strings.NewReader(svg))
	for {
		_, err := d.Token()
		if err == io.EOF {
			break
		}
		require.NoError(t, err)
	}
	require.NoError(t, WritePlatePNG(io.Discard, &p, HeatMapOptions{}))
}

func TestNiceTicks(t *testing.T) {
	assert.Equal(t, 20.0, niceStep(100, 5))
	assert.Equal(t, 0.5, niceStep(2.4, 5))
	assert.Equal(t, []float64{0, 20, 40, 60, 80, 100}, ticks(0, 100, 20))
	assert.Equal(t, "0.5", tickText(0.5, 0.5))
	assert.Equal(t, "0.0", tickText(-1e-17, 0.5), "never -0.0")
}

// bigBoard is the invented board meshed at a million cells.
func bigBoard() network.PlateResult { return testBoard(200, 200, 1000, 1000, 1) }

func BenchmarkPlateSVG1e6(b *testing.B) {
	p := bigBoard()
	var n int64
	b.ReportAllocs()
	for b.Loop() {
		var c countingWriter
		if err := WritePlateSVG(&c, &p, HeatMapOptions{}); err != nil {
			b.Fatal(err)
		}
		n = c.n
	}
	b.ReportMetric(float64(n), "svg-bytes")
}

func BenchmarkPlatePNG1e6(b *testing.B) {
	p := bigBoard()
	b.ReportAllocs()
	for b.Loop() {
		if err := WritePlatePNG(io.Discard, &p, HeatMapOptions{}); err != nil {
			b.Fatal(err)
		}
	}
}

type countingWriter struct{ n int64 }

func (c *countingWriter) Write(p []byte) (int, error) {
	c.n += int64(len(p))
	return len(p), nil
}
