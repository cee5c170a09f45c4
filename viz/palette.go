package viz

import (
	"fmt"
	"math"
)

// rgb is a colour with components in [0, 255].
type rgb struct{ r, g, b float64 }

func (c rgb) hex() string {
	return fmt.Sprintf("#%02x%02x%02x", int(math.Round(c.r)), int(math.Round(c.g)), int(math.Round(c.b)))
}

// luminance is the relative luminance of c (ITU-R BT.709 weights on
// linearised sRGB), used to choose a readable text colour.
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

// Our colours. The margin scale runs from a calm moss green (plenty of
// margin) through straw (a few kelvin) to rust and a deep oxblood (over the
// limit); the temperature scale from pale slate (ambient) through ochre to
// a dark aubergine (hottest).
var (
	marginScale = scale{
		{-10, rgb{0x6b, 0x12, 0x20}}, // oxblood
		{0, rgb{0xc0, 0x4a, 0x1f}},   // rust
		{5, rgb{0xe8, 0xc2, 0x5a}},   // straw
		{15, rgb{0xb9, 0xcf, 0x8f}},  // sage
		{30, rgb{0x4f, 0x7d, 0x5c}},  // moss
	}
	temperatureScale = scale{
		{0, rgb{0xdd, 0xe4, 0xea}},    // pale slate
		{0.35, rgb{0xf0, 0xd4, 0x8a}}, // sand
		{0.65, rgb{0xd0, 0x83, 0x3c}}, // ochre
		{1, rgb{0x4a, 0x1c, 0x3f}},    // aubergine
	}
	noLimitFill = rgb{0xf2, 0xf0, 0xeb} // warm paper, for nodes without a limit
	fixedFill   = rgb{0xd6, 0xe3, 0xf0} // cool blue-grey, for given temperatures
	edgeColour  = "#3d4852"
	airColour   = "#3b6ea5" // heat carried by moving air
)

// textOn returns a readable text colour on fill c.
func textOn(c rgb) string {
	if c.luminance() < 0.25 {
		return "#ffffff"
	}
	return "#1d1d1d"
}
