package viz

import (
	"fmt"
	"math"
	"strconv"
)

// rgb is a colour with components in [0, 255].
type rgb struct{ r, g, b float64 }

func (c rgb) hex() string {
	return fmt.Sprintf("#%02x%02x%02x", int(math.Round(c.r)), int(math.Round(c.g)), int(math.Round(c.b)))
}

// luminance is the relative luminance of c (ITU-R BT.709 weights on
// linearised sRGB, IEC 61966-2-1), as WCAG 2.x defines it.
func (c rgb) luminance() float64 {
	lin := func(v float64) float64 {
		v /= 255
		if v <= 0.04045 {
			return v / 12.92
		}
		return math.Pow((v+0.055)/1.055, 2.4)
	}
	return 0.2126*lin(c.r) + 0.7152*lin(c.g) + 0.0722*lin(c.b)
}

// stop is a colour at a position of a scale.
type stop struct {
	at float64
	c  rgb
}

// scale maps a number to a colour by linear interpolation between stops
// (sorted by position); values outside take the end colours.
type scale []stop

func (s scale) at(v float64) rgb {
	if v <= s[0].at {
		return s[0].c
	}
	for i := 1; i < len(s); i++ {
		if v <= s[i].at {
			a, b := s[i-1], s[i]
			t := (v - a.at) / (b.at - a.at)
			return rgb{a.c.r + t*(b.c.r-a.c.r), a.c.g + t*(b.c.g-a.c.g), a.c.b + t*(b.c.b-a.c.b)}
		}
	}
	return s[len(s)-1].c
}

// Our colours.
//
// The margin colours are five steps whose CIELAB lightness L* rises
// monotonically from "far over the limit" (darkest) to "plenty of margin"
// (lightest), about 15 L* apart, so that the order reads from lightness
// alone: for people with a red-green colour vision deficiency, in grey-scale
// print, and on a poor projector. Hue helps those who see it (a plum, a
// brick red, an amber, a pale olive and a pale mint) but carries nothing
// that lightness does not. The positions of the steps follow the model's
// required margin (marginSteps). The tests check lightness steps before and
// after a simulation of deuteranopia and protanopia, and text contrast.
var (
	marginColours = [5]rgb{
		{0x77, 0x18, 0x4d}, // plum, L* 27: over the limit
		{0xad, 0x3d, 0x32}, // brick, L* 42: within the limit, under the required margin
		{0xc2, 0x84, 0x22}, // amber, L* 60: from the required margin up
		{0xba, 0xc2, 0x6b}, // pale olive, L* 76
		{0xb6, 0xee, 0xe2}, // pale mint, L* 90: plenty of margin
	}
	temperatureScale = scale{
		{0, rgb{0xdd, 0xe4, 0xea}},    // pale slate
		{0.35, rgb{0xf0, 0xd4, 0x8a}}, // sand
		{0.65, rgb{0xd0, 0x83, 0x3c}}, // ochre
		{1, rgb{0x4a, 0x1c, 0x3f}},    // aubergine
	}
	noLimitFill   = rgb{0xf2, 0xf0, 0xeb} // warm paper, for nodes without a limit
	fixedFill     = rgb{0xd6, 0xe3, 0xf0} // cool blue-grey, for given temperatures
	edgeColour    = "#3d4852"
	airColour     = "#1f5fa0" // heat carried by moving air
	fadedColour   = "#a8a8a8" // flows too small to matter
	overOutline   = "#3a0620" // outline of a node over its limit
	tightOutline  = "#6b3a00" // outline of a node closer than the required margin
	defaultMargin = 5.0       // K: the steps' unit when a model requires no margin
)

// marginStep is one step of the margin colours: a margin in K and what the
// legend calls it.
type marginStep struct {
	margin float64
	text   string
}

// marginSteps returns the five margin bands for a model's required margin
// m (K): over the limit, 0 to m (tight), m to 3m, 3m to 6m, and 6m or more
// (with 5 K standing in for m when the model requires none). Each step's
// margin is where its band starts; the first band takes every margin
// below zero.
func marginSteps(required float64) [5]marginStep {
	m := required
	tight := fmt.Sprintf("margin 0 to %s K: tight", trimK(m))
	if m <= 0 {
		m = defaultMargin
		tight = fmt.Sprintf("margin 0 to %s K", trimK(m))
	}
	return [5]marginStep{
		{-10, "over the limit: OVER"},
		{0, tight},
		{m, fmt.Sprintf("margin %s to %s K", trimK(m), trimK(3*m))},
		{3 * m, fmt.Sprintf("margin %s to %s K", trimK(3*m), trimK(6*m))},
		{6 * m, fmt.Sprintf("margin %s K or more", trimK(6*m))},
	}
}

// band returns the colour of the highest stop at or below v (the lowest
// stop's below it): margin fills come in the legend's bands, never mixed
// between them, so each fill is exactly one the legend shows.
func (s scale) band(v float64) rgb {
	c := s[0].c
	for _, st := range s {
		if v >= st.at {
			c = st.c
		}
	}
	return c
}

// marginScaleFor returns the margin colour scale for a required margin.
func marginScaleFor(required float64) scale {
	steps := marginSteps(required)
	s := make(scale, len(steps))
	for i, st := range steps {
		s[i] = stop{st.margin, marginColours[i]}
	}
	return s
}

// trimK formats a temperature difference without needless decimals.
func trimK(x float64) string {
	return strconv.FormatFloat(math.Round(x*10)/10, 'f', -1, 64)
}

// contrast is the WCAG 2.x contrast ratio of two colours, (L1 + 0.05) /
// (L2 + 0.05) with L1 the larger relative luminance (W3C, Web Content
// Accessibility Guidelines 2.1, definitions of "contrast ratio" and
// "relative luminance").
func contrast(a, b rgb) float64 {
	la, lb := a.luminance(), b.luminance()
	if la < lb {
		la, lb = lb, la
	}
	return (la + 0.05) / (lb + 0.05)
}

var (
	darkText  = rgb{0x11, 0x11, 0x11}
	lightText = rgb{0xff, 0xff, 0xff}
)

// textOn returns the text colour of higher WCAG contrast on fill c.
func textOn(c rgb) string {
	if contrast(c, lightText) > contrast(c, darkText) {
		return lightText.hex()
	}
	return darkText.hex()
}
