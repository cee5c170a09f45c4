package viz

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// Colour-vision-deficiency simulation of Machado, Oliveira & Fernandes
// (2009), "A physiologically-based model for simulation of color vision
// deficiency", IEEE Transactions on Visualization and Computer Graphics
// 15(6), 1291–1298: the matrices for severity 1.0 (dichromacy) from the
// table of precomputed matrices the authors published with the paper,
// applied to linear sRGB.
var (
	machadoDeuteranopia = [3][3]float64{
		{0.367322, 0.860646, -0.227968},
		{0.280085, 0.672501, 0.047413},
		{-0.011820, 0.042940, 0.968881},
	}
	machadoProtanopia = [3][3]float64{
		{0.152286, 1.052583, -0.204868},
		{0.114503, 0.786281, 0.099216},
		{-0.003882, -0.048116, 1.051998},
	}
)

// srgbLinear decodes an sRGB component in [0, 255] (IEC 61966-2-1).
func srgbLinear(v float64) float64 {
	v /= 255
	if v <= 0.04045 {
		return v / 12.92
	}
	return math.Pow((v+0.055)/1.055, 2.4)
}

func srgbEncode(v float64) float64 {
	v = math.Min(1, math.Max(0, v))
	if v <= 0.0031308 {
		return 255 * 12.92 * v
	}
	return 255 * (1.055*math.Pow(v, 1/2.4) - 0.055)
}

// simulate returns c as seen with the dichromacy of matrix m.
func simulate(c rgb, m [3][3]float64) rgb {
	l := [3]float64{srgbLinear(c.r), srgbLinear(c.g), srgbLinear(c.b)}
	var o [3]float64
	for i := range o {
		o[i] = srgbEncode(m[i][0]*l[0] + m[i][1]*l[1] + m[i][2]*l[2])
	}
	return rgb{o[0], o[1], o[2]}
}

// lightness is CIELAB L* (CIE 15:2004) from relative luminance Y (white
// Y = 1): 116·f(Y) − 16, f(t) = t^(1/3) above (6/29)³, else linear.
func lightness(c rgb) float64 {
	y := c.luminance()
	f := math.Cbrt(y)
	if y <= 216.0/24389 {
		f = (24389.0/27*y + 16) / 116
	}
	return 116*f - 16
}

// minLightnessStep is the smallest difference of L* between neighbouring
// margin steps that we accept: about ten just-noticeable differences of
// lightness (one ΔE*ab unit is roughly one, a rule of thumb), enough to
// tell fills apart side by side in a diagram.
const minLightnessStep = 10.0

func TestMarginColoursLightnessSteps(t *testing.T) {
	for _, vision := range []struct {
		name string
		see  func(rgb) rgb
	}{
		{"normal vision", func(c rgb) rgb { return c }},
		{"deuteranopia", func(c rgb) rgb { return simulate(c, machadoDeuteranopia) }},
		{"protanopia", func(c rgb) rgb { return simulate(c, machadoProtanopia) }},
	} {
		for i := 1; i < len(marginColours); i++ {
			lo, hi := lightness(vision.see(marginColours[i-1])), lightness(vision.see(marginColours[i]))
			assert.Greater(t, hi-lo, minLightnessStep, "%s: step %d (L* %.1f) to step %d (L* %.1f)", vision.name, i-1, lo, i, hi)
		}
		// Node fills come in bands: lightness never falls as the
		// margin grows, the scale reads one way.
		s := marginScaleFor(5)
		prev := -1.0
		for m := -15.0; m <= 35; m += 0.25 {
			l := lightness(vision.see(s.band(m)))
			assert.GreaterOrEqual(t, l, prev-0.5, "%s: L* falls at margin %g K", vision.name, m)
			prev = math.Max(prev, l)
		}
	}
}

// The simulation itself: a grey is its own image (each row of a Machado
// matrix sums to 1), and pure red and green, far apart in normal vision,
// come out close in hue for a deuteranope: a check that the matrices were
// copied into the code correctly.
func TestMachadoSimulation(t *testing.T) {
	for _, m := range [][3][3]float64{machadoDeuteranopia, machadoProtanopia} {
		for _, row := range m {
			assert.InDelta(t, 1, row[0]+row[1]+row[2], 1e-5)
		}
		g := simulate(rgb{128, 128, 128}, m)
		assert.InDelta(t, 128, g.r, 0.6)
		assert.InDelta(t, 128, g.b, 0.6)
	}
	red, green := simulate(rgb{255, 0, 0}, machadoDeuteranopia), simulate(rgb{0, 255, 0}, machadoDeuteranopia)
	// Both become olive-yellow: red ≥ blue in each.
	assert.Greater(t, red.r, red.b)
	assert.Greater(t, green.r, green.b)
}

// Text on every fill meets WCAG 2.x's 4.5:1 for normal text (success
// criterion 1.4.3), with the ratio (L1 + 0.05)/(L2 + 0.05) of relative
// luminances.
func TestTextContrastOnEveryFill(t *testing.T) {
	// Check values for the formula: black on white is 21:1, a colour on
	// itself 1:1 (WCAG 2.1, definition of contrast ratio).
	assert.InDelta(t, 21, contrast(rgb{0, 0, 0}, rgb{255, 255, 255}), 1e-9)
	assert.InDelta(t, 1, contrast(rgb{90, 90, 90}, rgb{90, 90, 90}), 1e-12)
	fills := append([]rgb{noLimitFill, fixedFill}, marginColours[:]...)
	for _, s := range temperatureScale {
		fills = append(fills, s.c)
	}
	s := marginScaleFor(5)
	for m := -15.0; m <= 35; m += 0.5 {
		fills = append(fills, s.band(m))
	}
	for f := 0.0; f <= 1; f += 0.05 {
		fills = append(fills, temperatureScale.at(f))
	}
	for _, c := range fills {
		text := darkText
		if textOn(c) == lightText.hex() {
			text = lightText
		}
		assert.GreaterOrEqual(t, contrast(c, text), 4.5, "text %s on %s", text.hex(), c.hex())
	}
}

func TestMarginStepsFollowRequiredMargin(t *testing.T) {
	steps := marginSteps(8)
	require.Len(t, steps, 5)
	assert.Equal(t, []float64{-10, 0, 8, 24, 48}, []float64{steps[0].margin, steps[1].margin, steps[2].margin, steps[3].margin, steps[4].margin})
	assert.Equal(t, "margin 0 to 8 K: tight", steps[1].text)
	assert.Equal(t, "margin 8 to 24 K", steps[2].text)
	assert.Equal(t, "margin 48 K or more", steps[4].text)
	assert.Equal(t, 5.0, marginSteps(0)[2].margin, "no required margin: 5 K steps")
	sol, _ := solveText(t, "m.yaml", `
ambient: {temperature: 20 degC}
required_margin: 8 K
nodes:
  - {id: chip, power: 3 W, limit: 110 degC}
  - {id: warm, power: 1 W, limit: 45 degC}
links:
  - {id: up, kind: lumped, from: chip, to: ambient, resistance: 20 K/W}
  - {id: w, kind: lumped, from: warm, to: ambient, resistance: 20 K/W}
`)
	dot, err := DOT(sol, ColourMargin)
	require.NoError(t, err)
	assert.Contains(t, dot, "margin 0 to 8 K: tight")
	assert.Contains(t, dot, "margin 24 to 48 K")
	assert.Contains(t, dot, "tight (margin under 8 K)")
	assert.Contains(t, dot, "margin +5.0 K tight", "warm is 40 °C against 45 °C")
	assert.Contains(t, dot, "margin +30.0 K ok")
	assert.Contains(t, dot, `fillcolor="#bac26b"`, "30 K is in the band from 24 to 48 K")
	assert.Contains(t, dot, `fillcolor="#ad3d32"`, "5 K is under 8 K: the tight band")
	assert.Contains(t, dot, "dashed", "the tight node's outline")
	assert.NotContains(t, dot, "moving air", "the model has no moving air")
}

// Each fill is exactly one of the legend's bands: over the limit, tight
// (0 to m), m to 3m, 3m to 6m, 6m or more.
func TestMarginBands(t *testing.T) {
	s := marginScaleFor(10)
	for _, c := range []struct {
		margin float64
		band   int
	}{{-30, 0}, {-0.01, 0}, {0, 1}, {9.99, 1}, {10, 2}, {29.9, 2}, {30, 3}, {59.9, 3}, {60, 4}, {500, 4}} {
		assert.Equal(t, marginColours[c.band], s.band(c.margin), "margin %g K", c.margin)
	}
}
