package sweepplot

import (
	"fmt"
	"image/color"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"gapcert/certs"
	"gapcert/certs/plot"
	"gapcert/interval"
)

// sequentialMap is the map of the triangle sweep's first claim, which
// holds at every point: every lower bound of its margin is positive.
func sequentialMap(t *testing.T) *Map {
	t.Helper()
	m, err := load(t, "triangle").Map("a", "b", "1")
	if err != nil {
		t.Fatal(err)
	}
	return m
}

// svgTexts writes pic as SVG and returns its texts, one a line, framed
// by newlines.
func svgTexts(t *testing.T, write func(string) error) (string, string) {
	t.Helper()
	path := filepath.Join(t.TempDir(), "p.svg")
	if err := write(path); err != nil {
		t.Fatal(err)
	}
	return "\n" + strings.Join(summarise(t, path).Texts, "\n") + "\n", path
}

// fills returns the fill colours of the SVG file.
func fills(t *testing.T, path string) []color.RGBA {
	t.Helper()
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	var out []color.RGBA
	for _, m := range regexp.MustCompile(`fill:#([0-9A-F]{6})`).FindAllStringSubmatch(string(data), -1) {
		v, _ := strconv.ParseUint(m[1], 16, 32)
		out = append(out, color.RGBA{R: uint8(v >> 16), G: uint8(v >> 8), B: uint8(v), A: 0xff})
	}
	return out
}

// near reports whether a and b differ by at most 1 in each channel (the
// rounding of a colour map's colour to 8 bits).
func near(a, b color.Color) bool {
	r1, g1, b1, _ := a.RGBA()
	r2, g2, b2, _ := b.RGBA()
	d := func(x, y uint32) bool { x, y = x>>8, y>>8; return x <= y+1 && y <= x+1 }
	return d(r1, r2) && d(g1, g2) && d(b1, b2)
}

func hasFill(fs []color.RGBA, c color.Color) bool {
	for _, f := range fs {
		if near(f, c) {
			return true
		}
	}
	return false
}

// TestMapColourScale: a map whose lower bounds all have one sign is drawn
// on the sequential scale of its own range (the least bound in the darkest
// colour, the largest in the lightest); a map with bounds of both signs on
// the diverging scale symmetric about 0, the bound of largest magnitude at
// its end. Neither scale is fixed in advance.
func TestMapColourScale(t *testing.T) {
	for _, tc := range []struct {
		name      string
		m         *Map
		diverging bool
	}{
		{"one sign", sequentialMap(t), false},
		{"both signs", goldenMap(t), true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			lo, hi := math.Inf(1), math.Inf(-1)
			for _, c := range tc.m.Cells {
				lo, hi = math.Min(lo, c.Margin), math.Max(hi, c.Margin)
			}
			if (lo < 0 && hi > 0) != tc.diverging {
				t.Fatalf("bounds in [%g, %g]: test case misdescribed", lo, hi)
			}
			text, path := svgTexts(t, tc.m.Write)
			fs := fills(t, path)
			cm, min, max := plot.ScaleFor(lo, hi)
			end := func(v float64) color.Color {
				c, err := cm.At(v)
				if err != nil {
					t.Fatal(err)
				}
				return c
			}
			if tc.diverging {
				if !strings.Contains(text, "Colour scale diverging about 0") || min != -max {
					t.Errorf("scale [%g, %g], caption:\n%s", min, max, text)
				}
				top := hi
				if -lo > hi {
					top = lo
				}
				if !hasFill(fs, end(top)) {
					t.Errorf("no cell in the colour of the end of the scale at %g", top)
				}
				if hasFill(fs, end(-top)) {
					t.Errorf("a cell in the colour of the other end %g, where no bound is", -top)
				}
			} else {
				if !strings.Contains(text, "Colour scale sequential over the bounds drawn") || min != lo || max != hi {
					t.Errorf("scale [%g, %g], want the bounds' [%g, %g]; caption:\n%s", min, max, lo, hi, text)
				}
				if !hasFill(fs, end(lo)) || !hasFill(fs, end(hi)) {
					t.Errorf("the least and largest bounds are not drawn in the ends of the scale")
				}
				if hasFill(fs, plot.Diverging(1).Palette(3).Colors()[1]) {
					t.Errorf("light grey cell: a diverging map on one-signed data")
				}
			}
		})
	}
}

// TestShadingOnlyWhenVisible: a band whose enclosures are much narrower
// than a line draws no shading and names none in its legend; the gap band
// of the mixed Robin sweep, whose enclosures are wide enough, does both.
func TestShadingOnlyWhenVisible(t *testing.T) {
	convex, _ := svgTexts(t, goldenBand(t).Write)
	if strings.Contains(convex, "shading") {
		t.Errorf("narrow band names a shading:\n%s", convex)
	}
	wide, err := load(t, "robin_mixed").Band("alpha", BandSpec{Quantity: "gap"})
	if err != nil {
		t.Fatal(err)
	}
	robin, _ := svgTexts(t, wide.Write)
	if !strings.Contains(robin, "shading between points") || strings.Contains(robin, "narrower than a line") {
		t.Errorf("mixed Robin band legend:\n%s", robin)
	}
}

// TestWidthPanel: the lower panel's log axis spans whole decades around
// the widths of the enclosures, and the legend names what it draws.
func TestWidthPanel(t *testing.T) {
	b := goldenBand(t)
	lo, hi := math.Inf(1), 0.0
	for _, pt := range b.Points {
		w := pt.Quantity.Wid()
		if w <= 0 {
			t.Fatalf("point %d: width %g; the test needs positive widths", pt.Index, w)
		}
		lo, hi = math.Min(lo, w), math.Max(hi, w)
	}
	text, _ := svgTexts(t, func(p string) error { return b.WritePanel(p, WidthPanel) })
	for _, want := range []string{
		"\nwidth\n", "lower panel: width of the certified enclosure of D²·gap/π² (log axis)",
		"\n" + strings.ReplaceAll("1e"+strconv.Itoa(int(math.Floor(math.Log10(lo)))), "-", "−") + "\n",
		"\n" + strings.ReplaceAll("1e"+strconv.Itoa(int(math.Ceil(math.Log10(hi)))), "-", "−") + "\n",
		"The enclosures are narrower than a line at this scale; the lower panel shows their widths.",
	} {
		if !strings.Contains(text, want) {
			t.Errorf("width panel lacks %q; texts:\n%s", want, text)
		}
	}
	if strings.Count(text, "\nc\n") != 1 {
		t.Errorf("the parameter should label only the lower panel's axis:\n%s", text)
	}
}

// TestMarginPanel: the margin of the golden band's threshold comparison;
// every point's margin enclosure lies on the side of 0 its verdict says
// (the threshold does not share variables with the quantity, so interval
// subtraction loses nothing a verdict needs).
func TestMarginPanel(t *testing.T) {
	b := goldenBand(t)
	for _, pt := range b.Points {
		m := pt.Quantity.Sub(pt.Threshold)
		switch pt.Verdict {
		case certs.Holds:
			if !(m.Lo >= 0) {
				t.Errorf("c = %s holds with margin %v", pt.XText, m)
			}
		case certs.Fails:
			if !(m.Hi < 0) {
				t.Errorf("c = %s fails with margin %v", pt.XText, m)
			}
		case certs.Undecided:
			if !(m.Lo <= 0 && 0 <= m.Hi) {
				t.Errorf("c = %s undecided with margin %v", pt.XText, m)
			}
		}
	}
	text, _ := svgTexts(t, func(p string) error { return b.WritePanel(p, MarginPanel) })
	for _, want := range []string{"\nmargin\n", "lower panel: certified enclosure of the margin D²·gap/π² − (3 + c²/100)", "a bar wholly above the dashed 0 holds."} {
		if !strings.Contains(text, want) {
			t.Errorf("margin panel lacks %q; texts:\n%s", want, text)
		}
	}
}

func TestPanelErrors(t *testing.T) {
	dir := t.TempDir()
	b, err := load(t, "convex").Band("c", BandSpec{Quantity: "gap"})
	if err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(dir, "x.svg")
	wantError(t, "margin without a threshold", b.WritePanel(path, MarginPanel), "give a threshold")
	wantError(t, "unknown panel", b.WritePanel(path, Panel("widths")), `unknown band panel "widths" (hint: use width`)
	if _, err := os.Stat(path); !os.IsNotExist(err) {
		t.Errorf("a picture was written despite the error")
	}
	for _, s := range []string{"", "width", "margin"} {
		if p, err := ParsePanel(s); err != nil || string(p) != s {
			t.Errorf("ParsePanel(%q) = %q, %v", s, p, err)
		}
	}
	if _, err := ParsePanel("Width"); err == nil {
		t.Error(`ParsePanel("Width") accepted`)
	}
}

// TestPanelEdgeCases: a band of one point whose quantity is known exactly
// (width 0) and one of two points, one exact: the width panel draws the
// exact values at the foot of its axis and says so, and nothing panics.
func TestPanelEdgeCases(t *testing.T) {
	exact := interval.I{Lo: 2, Hi: 2}
	narrow := interval.I{Lo: 3, Hi: math.Nextafter(3, 4)}
	for _, tc := range []struct {
		name   string
		points []BandPoint
		zero   int
	}{
		{"one exact point", []BandPoint{{X: 1, XText: "1", Quantity: exact, Threshold: exact, Verdict: certs.Holds}}, 1},
		{"exact and narrow", []BandPoint{
			{X: 1, XText: "1", Quantity: exact, Threshold: exact, Verdict: certs.Holds},
			{X: 2, XText: "2", Quantity: narrow, Threshold: exact, Verdict: certs.Holds},
		}, 1},
	} {
		t.Run(tc.name, func(t *testing.T) {
			b := &Band{Title: "hand-made band", X: "s", Quantity: "lambda1", Threshold: "2", Rel: ">=", Points: tc.points}
			for _, extra := range []Panel{WidthPanel, MarginPanel} {
				text, _ := svgTexts(t, func(p string) error { return b.WritePanel(p, extra) })
				if !strings.Contains(text, "λ₁") {
					t.Errorf("%s: λ₁ not in the labels:\n%s", extra, text)
				}
				if extra == WidthPanel && !strings.Contains(text, fmt.Sprintf("lower panel: width 0, a value known exactly, drawn at the foot (%d)", tc.zero)) {
					t.Errorf("width panel does not name the exact values:\n%s", text)
				}
			}
			if err := b.WritePanel(filepath.Join(t.TempDir(), "b.png"), WidthPanel); err != nil {
				t.Error(err)
			}
		})
	}
}
