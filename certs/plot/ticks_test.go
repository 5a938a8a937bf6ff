package plot

import (
	"image/color"
	"math"
	"slices"
	"testing"

	gplot "gonum.org/v1/plot"
)

func labelled(ticks []gplot.Tick) (labels []string, values []float64) {
	for _, t := range ticks {
		if t.Label != "" {
			labels = append(labels, t.Label)
			values = append(values, t.Value)
		}
	}
	return labels, values
}

func TestRoundTicks(t *testing.T) {
	for _, tc := range []struct {
		lo, hi float64
		want   []string
	}{
		{2.8, 7.2, []string{"3", "4", "5", "6", "7"}},
		{0, 1, []string{"0.0", "0.2", "0.4", "0.6", "0.8", "1.0"}},
		{-1.05, 1.05, []string{"−1.0", "−0.5", "0.0", "0.5", "1.0"}},
		{-87, 87, []string{"−50", "0", "50"}},
		{-0.04, 20.8, []string{"0", "5", "10", "15", "20"}},
		{3, 3 + 1e-7, []string{"3.00000000", "3.00000002", "3.00000004", "3.00000006", "3.00000008", "3.00000010"}},
		{0, 4e-5, []string{"0", "1e−5", "2e−5", "3e−5", "4e−5"}},
		{1e7, 3e7, []string{"1.0e7", "1.5e7", "2.0e7", "2.5e7", "3.0e7"}},
		{0.25, 1.25, []string{"0.4", "0.6", "0.8", "1.0", "1.2"}},
		{-0.1, 1.1, []string{"0.0", "0.2", "0.4", "0.6", "0.8", "1.0"}},
	} {
		ticks := RoundTicks{}.Ticks(tc.lo, tc.hi)
		labels, values := labelled(ticks)
		if !slices.Equal(labels, tc.want) {
			t.Errorf("[%g, %g]: labels %q, want %q", tc.lo, tc.hi, labels, tc.want)
		}
		for _, v := range values {
			if v < tc.lo || v > tc.hi {
				t.Errorf("[%g, %g]: tick %g outside", tc.lo, tc.hi, v)
			}
		}
		// The labelled ticks are equally spaced by 1, 2 or 5 × 10^k.
		if len(values) >= 2 {
			step := values[1] - values[0]
			e := math.Floor(math.Log10(step))
			m := step / math.Pow(10, e)
			if math.Abs(m-math.Round(m)) > 1e-6 || !slices.Contains([]float64{1, 2, 5}, math.Round(m)) {
				t.Errorf("[%g, %g]: step %g is not 1, 2 or 5 × 10^k", tc.lo, tc.hi, step)
			}
		}
	}
	if ticks := (RoundTicks{}).Ticks(1, 1); ticks != nil {
		t.Errorf("empty range: %v", ticks)
	}
}

func TestLogTicks(t *testing.T) {
	for _, tc := range []struct {
		lo, hi float64
		want   []string
		minor  bool
	}{
		{2e-9, 3e-7, []string{"1e−8", "1e−7"}, true},
		{1e-3, 10, []string{"0.001", "0.01", "0.1", "1", "10"}, false},
		{0.5, 20, []string{"1", "10"}, true},
		{1e-16, 1, []string{"1e−16", "1e−14", "1e−12", "1e−10", "1e−8", "1e−6", "1e−4", "0.01", "1"}, false},
	} {
		ticks := LogTicks{}.Ticks(tc.lo, tc.hi)
		labels, _ := labelled(ticks)
		if !slices.Equal(labels, tc.want) {
			t.Errorf("[%g, %g]: labels %q, want %q", tc.lo, tc.hi, labels, tc.want)
		}
		minor := false
		for _, tk := range ticks {
			e := math.Round(math.Log10(tk.Value))
			minor = minor || math.Abs(tk.Value/math.Pow(10, e)-1) > 1e-9
		}
		if minor != tc.minor {
			t.Errorf("[%g, %g]: %d ticks, %d labelled; minor ticks %v, want %v", tc.lo, tc.hi, len(ticks), len(labels), minor, tc.minor)
		}
	}
}

// TestScaleFor: a diverging map only for values of both signs, symmetric
// about 0 with light grey at 0; otherwise the sequential map on the data's
// own range, whose lightness grows with the value.
func TestScaleFor(t *testing.T) {
	m, lo, hi := ScaleFor(-3, 1)
	if lo != -3 || hi != 3 {
		t.Errorf("both signs: range [%g, %g], want [−3, 3]", lo, hi)
	}
	mid, _ := m.At(0)
	if r, g, b, _ := mid.RGBA(); r>>8 < 0xc0 || g>>8 < 0xc0 || b>>8 < 0xc0 {
		t.Errorf("diverging map at 0 is %v, want light grey", mid)
	}
	for _, r := range [][2]float64{{2, 87}, {0, 5}, {-4, -1}} {
		m, lo, hi := ScaleFor(r[0], r[1])
		if lo != r[0] || hi != r[1] {
			t.Errorf("one sign %v: range [%g, %g], want the data's", r, lo, hi)
		}
		prev := -1.0
		for i := range 11 {
			c, err := m.At(lo + (hi-lo)*float64(i)/10)
			if err != nil {
				t.Fatal(err)
			}
			if y := luma(c); y <= prev {
				t.Errorf("one sign %v: lightness %g at step %d does not grow (was %g)", r, y, i, prev)
			} else {
				prev = y
			}
		}
		first, _ := m.At(lo)
		if !sameColour(first, viridisControls[0]) {
			t.Errorf("sequential map starts at %v, want viridis %v", first, viridisControls[0])
		}
	}
	if _, lo, hi := ScaleFor(2, 2); !(lo < 2 && 2 < hi) {
		t.Errorf("one value: range [%g, %g] does not hold it", lo, hi)
	}
}

// luma is the Rec. 709 luma of c (common practice), a proxy for lightness.
func luma(c color.Color) float64 {
	r, g, b, _ := c.RGBA()
	return 0.2126*float64(r) + 0.7152*float64(g) + 0.0722*float64(b)
}

func TestLighten(t *testing.T) {
	if c := Lighten(Blue, 0); !sameColour(c, Blue) {
		t.Errorf("Lighten(Blue, 0) = %v", c)
	}
	if c := Lighten(Vermillion, 1); !sameColour(c, color.White) {
		t.Errorf("Lighten(Vermillion, 1) = %v, want white", c)
	}
	// Halfway: each channel halfway to 255, rounded (0x72 → 0xb9).
	if c := Lighten(Blue, 0.5); !sameColour(c, color.RGBA{R: 0x80, G: 0xb9, B: 0xd9, A: 0xff}) {
		t.Errorf("Lighten(Blue, 0.5) = %v", c)
	}
}
