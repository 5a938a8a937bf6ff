package plot

import (
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// PNGDPI is the resolution of PNG output (a 12 cm wide picture is 709
// pixels wide).
const PNGDPI = pngDPI

// Drawable returns s with every rune that the picture font has no glyph
// for spelled out (∈ as "in", …) or replaced by '?', so that text drawn by
// other picture packages loses no symbol silently.
func Drawable(s string) string { return drawable(s) }

// Render draws one picture of the given size with drawFn into path, in
// format ("png" at PNGDPI, or "svg", deterministic bytes). It panics on
// an unknown format (see Formats).
func Render(path, format string, width, height vg.Length, drawFn func(c draw.Canvas)) error {
	return writeFile(path, picture{width: width, height: height, draw: drawFn}, format)
}
