package viz

import (
	"image"
	"testing"

	"github.com/fogleman/gg"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// redPixels counts the strongly red pixels of img with x in [x0, x1).
func redPixels(img image.Image, x0, x1 int) int {
	n := 0
	b := img.Bounds()
	for y := b.Min.Y; y < b.Max.Y; y++ {
		for x := x0; x < x1; x++ {
			r, g, bl, _ := img.At(x, y).RGBA()
			if r > 0xc000 && g < 0x4000 && bl < 0x4000 {
				n++
			}
		}
	}
	return n
}

// Two identical squares outlined in red, drawn by two operation lists the
// way Graphviz writes two nodes: the first sets a line 3 points wide, the
// second says nothing about width. The second must be drawn 1 point wide:
// its outline has about a third of the first one's red pixels.
func TestPNGDrawingStateDoesNotCarryOver(t *testing.T) {
	p := &painter{
		dc:    gg.NewContext(200, 100),
		scale: 1,
		x:     func(x float64) float64 { return x },
		y:     func(y float64) float64 { return 100 - y },
	}
	p.dc.SetRGB(1, 1, 1)
	p.dc.Clear()
	require.NoError(t, p.paint("S 15 -setlinewidth(3) c 7 -#ff0000 p 4 20.5 20.5 80.5 20.5 80.5 80.5 20.5 80.5 "))
	require.NoError(t, p.paint("c 7 -#ff0000 p 4 120.5 20.5 180.5 20.5 180.5 80.5 120.5 80.5 "))
	thick, thin := redPixels(p.dc.Image(), 0, 100), redPixels(p.dc.Image(), 100, 200)
	require.Greater(t, thin, 0)
	ratio := float64(thick) / float64(thin)
	assert.InDelta(t, 3, ratio, 0.6, "thick %d, thin %d red pixels", thick, thin)

	// The same with a dashed style: a later list is solid again.
	p.dc.SetRGB(1, 1, 1)
	p.dc.Clear()
	require.NoError(t, p.paint("S 6 -dashed c 7 -#ff0000 p 4 20.5 20.5 80.5 20.5 80.5 80.5 20.5 80.5 "))
	require.NoError(t, p.paint("c 7 -#ff0000 p 4 120.5 20.5 180.5 20.5 180.5 80.5 120.5 80.5 "))
	dashed, solid := redPixels(p.dc.Image(), 0, 100), redPixels(p.dc.Image(), 100, 200)
	assert.Less(t, float64(dashed), 0.8*float64(solid), "dashed %d, solid %d", dashed, solid)
}

// Dotted lines are drawn apart from dashed ones: fewer red pixels.
func TestPNGDottedIsNotDashed(t *testing.T) {
	count := func(style string) int {
		p := &painter{dc: gg.NewContext(200, 40), scale: 1,
			x: func(x float64) float64 { return x }, y: func(y float64) float64 { return 40 - y }}
		p.dc.SetRGB(1, 1, 1)
		p.dc.Clear()
		require.NoError(t, p.paint("S 6 -"+style+" S 15 -setlinewidth(2) c 7 -#ff0000 L 2 10.5 20.5 190.5 20.5 "))
		return redPixels(p.dc.Image(), 0, 200)
	}
	solid, dashed, dotted := count("solid"), count("dashed"), count("dotted")
	assert.Less(t, dashed, solid)
	assert.Less(t, dotted, dashed)
	assert.Greater(t, dotted, 0)
}
