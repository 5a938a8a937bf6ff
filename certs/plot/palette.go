package plot

import (
	"image/color"

	"gonum.org/v1/plot/palette"
	"gonum.org/v1/plot/palette/moreland"
)

// The colours of the Okabe–Ito palette, chosen to stay distinct for the
// common forms of colour blindness (M. Okabe and K. Ito, "Color Universal
// Design (CUD): how to make figures and presentations that are friendly to
// colorblind people", 2008, https://jfly.uni-koeln.de/color/). Pictures
// draw categories (modes, verdicts, boundary conditions, bands) with these
// colours, and also with different glyphs or dashes, so that they can be
// told apart in grey print.
var (
	Black         color.Color = color.RGBA{R: 0x00, G: 0x00, B: 0x00, A: 0xff}
	Orange        color.Color = color.RGBA{R: 0xe6, G: 0x9f, B: 0x00, A: 0xff}
	SkyBlue       color.Color = color.RGBA{R: 0x56, G: 0xb4, B: 0xe9, A: 0xff}
	BluishGreen   color.Color = color.RGBA{R: 0x00, G: 0x9e, B: 0x73, A: 0xff}
	Yellow        color.Color = color.RGBA{R: 0xf0, G: 0xe4, B: 0x42, A: 0xff}
	Blue          color.Color = color.RGBA{R: 0x00, G: 0x72, B: 0xb2, A: 0xff}
	Vermillion    color.Color = color.RGBA{R: 0xd5, G: 0x5e, B: 0x00, A: 0xff}
	ReddishPurple color.Color = color.RGBA{R: 0xcc, G: 0x79, B: 0xa7, A: 0xff}
)

// Lighten returns c mixed with white, a fraction f ∈ [0, 1] of the way
// (for fills under lines of the colour c).
func Lighten(c color.Color, f float64) color.Color {
	r, g, b, _ := c.RGBA()
	mix := func(v uint32) uint8 { return uint8(float64(v>>8) + f*(255-float64(v>>8)) + 0.5) }
	return color.RGBA{R: mix(r), G: mix(g), B: mix(b), A: 0xff}
}

// viridisControls are nine colours of the viridis map (S. van der Walt and
// N. Smith, the default colour map of matplotlib since version 2.0, 2015),
// at 0, 1/8, …, 1, rounded to 8 bits, as listed in public tables of the
// map; at 0, 1/4, 1/2, 3/4 and 1 they agree within 2/255 with the
// five-colour viridis of the R package viridisLite (#440154, #3B528B,
// #21918C, #5EC962, #FDE725); the others are not cross-checked. Their
// luminance increases, as Sequential needs (TestScaleFor).
var viridisControls = []color.Color{
	color.RGBA{R: 68, G: 1, B: 84, A: 0xff},
	color.RGBA{R: 71, G: 44, B: 122, A: 0xff},
	color.RGBA{R: 59, G: 81, B: 139, A: 0xff},
	color.RGBA{R: 44, G: 113, B: 142, A: 0xff},
	color.RGBA{R: 33, G: 144, B: 141, A: 0xff},
	color.RGBA{R: 39, G: 173, B: 129, A: 0xff},
	color.RGBA{R: 92, G: 200, B: 99, A: 0xff},
	color.RGBA{R: 170, G: 220, B: 50, A: 0xff},
	color.RGBA{R: 253, G: 231, B: 37, A: 0xff},
}

// Sequential returns the colour map of values that do not change sign:
// the viridis colours, interpolated by moreland.NewLuminance so that the
// lightness grows linearly with the value (K. Moreland, "Diverging color
// maps for scientific visualization", ISVC 2009, and gonum's
// palette/moreland), from dark violet at lo to yellow at hi. Lightness
// alone orders the colours, which colour-blind readers and grey print
// keep.
func Sequential(lo, hi float64) palette.ColorMap {
	m, err := moreland.NewLuminance(viridisControls)
	if err != nil {
		panic("plot: viridis controls: " + err.Error())
	}
	m.SetMin(lo)
	m.SetMax(hi)
	return m
}

// Diverging returns the colour map of values of both signs on [−top, top]:
// Moreland's cool–warm map (blue below 0, light grey at 0, red above; K.
// Moreland, ISVC 2009, designed to stay readable for colour-blind
// readers), so that the sign is the hue and the magnitude the saturation.
func Diverging(top float64) palette.ColorMap {
	m := moreland.SmoothBlueRed()
	m.SetMin(-top)
	m.SetMax(top)
	return m
}

// ScaleFor returns the colour map of values in [lo, hi] and its range: a
// diverging map symmetric about 0 when the values have both signs (lo < 0 <
// hi), else a sequential map over [lo, hi] itself. lo = hi is widened to a
// range around it. It panics unless lo ≤ hi are finite.
func ScaleFor(lo, hi float64) (m palette.ColorMap, min, max float64) {
	if !(lo <= hi) || lo-lo != 0 || hi-hi != 0 {
		panic("plot: ScaleFor needs finite lo ≤ hi")
	}
	if lo < 0 && 0 < hi {
		top := hi
		if -lo > top {
			top = -lo
		}
		return Diverging(top), -top, top
	}
	if lo == hi {
		d := 1.0
		if lo != 0 {
			d = 0.01 * abs64(lo)
		}
		lo, hi = lo-d, hi+d
	}
	return Sequential(lo, hi), lo, hi
}

func abs64(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}
