package plot

import (
	"strings"

	gplot "gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
)

// spelledOut names symbols that the picture font (gonum's default,
// Liberation Serif) lacks but labels of enclosures often use.
var spelledOut = map[rune]string{
	'∈': "in",
	'∉': "not in",
	'⊂': "subset of",
	'⊆': "subset of",
}

// drawable returns s with every rune that the picture font has no glyph
// for replaced by its entry in spelledOut, or by '?', so that no symbol of
// a caller's label silently disappears from a picture. The font's glyph
// coverage is the same at every size.
func drawable(s string) string {
	face := font.DefaultCache.Lookup(gplot.DefaultFont, 10)
	var b strings.Builder
	for _, r := range s {
		if r == '\n' || r == ' ' {
			b.WriteRune(r)
			continue
		}
		if i, err := face.Face.GlyphIndex(nil, r); err == nil && i != 0 {
			b.WriteRune(r)
			continue
		}
		if w, ok := spelledOut[r]; ok {
			b.WriteString(w)
		} else {
			b.WriteByte('?')
		}
	}
	return b.String()
}
