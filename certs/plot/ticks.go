package plot

import (
	"math"
	"strconv"
	"strings"

	gplot "gonum.org/v1/plot"
)

// RoundTicks is a gonum plot.Ticker that puts three to seven labelled
// ticks at round values, the multiples of the smallest step 1, 2 or 5 ×
// 10^k that gives at most seven, with unlabelled
// ticks between them, and writes every label with the same number of
// decimals (negative values with the minus sign "−"; exponent form on an
// axis whose values reach 10⁶ or stay below 10⁻³ in magnitude).
type RoundTicks struct{}

// Ticks implements plot.Ticker.
func (RoundTicks) Ticks(lo, hi float64) []gplot.Tick {
	if !(lo < hi) || math.IsInf(lo, 0) || math.IsInf(hi, 0) {
		return nil
	}
	// The smallest round step that gives at most seven labels.
	step, mantissa, exp := roundStep((hi - lo) / 10)
	for math.Floor(hi/step)-math.Ceil(lo/step)+1 > 7 {
		step, mantissa, exp = roundStep(step * 1.01)
	}
	minor := step / 5
	if mantissa == 2 {
		minor = step / 4
	}
	big := math.Max(math.Abs(lo), math.Abs(hi))
	sci := big >= 1e6 || big < 1e-3
	format := func(v float64) string { return tickLabel(v, exp, sci) }
	tol := math.Max(minor*1e-6, big*1e-14) // rounding of k·minor
	var ticks []gplot.Tick
	first := math.Ceil(lo / minor)
	for k := first; k*minor <= hi+tol; k++ {
		v := min(k*minor, hi) // a tick at hi may be computed an ulp above
		if math.Abs(v) < tol {
			v = 0 // no "−0"
		}
		label := ""
		if r := math.Round(v / step); math.Abs(v-r*step) < tol {
			v = min(r*step, hi)
			label = format(v)
		}
		ticks = append(ticks, gplot.Tick{Value: v, Label: label})
		if len(ticks) > 200 {
			break
		}
	}
	return ticks
}

// roundStep returns the smallest step m × 10^exp, m ∈ {1, 2, 5}, that is
// at least raw > 0.
func roundStep(raw float64) (step float64, mantissa, exp int) {
	exp = int(math.Floor(math.Log10(raw)))
	for {
		for _, m := range []int{1, 2, 5} {
			if s := float64(m) * math.Pow(10, float64(exp)); s >= raw*(1-1e-12) {
				return s, m, exp
			}
		}
		exp++
	}
}

// tickLabel writes v, a multiple of a step m × 10^exp, with just the
// digits the step needs, in exponent form ("2.5e−7") when sci is set (an
// axis whose values reach 10⁶ or stay below 10⁻³ in magnitude).
func tickLabel(v float64, exp int, sci bool) string {
	var s string
	switch {
	case v == 0 && sci:
		s = "0"
	case sci:
		digits := max(0, int(math.Floor(math.Log10(math.Abs(v))))-exp)
		s = strconv.FormatFloat(v, 'e', digits, 64)
		mant, e, _ := strings.Cut(s, "e")
		n, _ := strconv.Atoi(e)
		s = mant + "e" + strconv.Itoa(n)
	default:
		s = strconv.FormatFloat(v, 'f', max(0, -exp), 64)
	}
	return strings.ReplaceAll(s, "-", "−")
}

// LogTicks is a gonum plot.Ticker for a logarithmic axis: labelled ticks at
// the powers of ten (every second or third one on a long axis),
// unlabelled ticks at 2…9 × 10^k on an axis of at most three decades.
// Labels are "1", "10", "0.01", … for exponents −3 … 3 and "1e−8", "1e6",
// … beyond.
type LogTicks struct{}

// Ticks implements plot.Ticker.
func (LogTicks) Ticks(lo, hi float64) []gplot.Tick {
	if !(0 < lo && lo < hi) || math.IsInf(hi, 0) {
		return nil
	}
	k0, k1 := int(math.Floor(math.Log10(lo))), int(math.Ceil(math.Log10(hi)))
	every := 1
	if n := k1 - k0; n > 16 {
		every = 4
	} else if n > 8 {
		every = 2
	}
	var ticks []gplot.Tick
	for k := k0; k <= k1; k++ {
		p := math.Pow(10, float64(k))
		if lo <= p && p <= hi {
			label := ""
			if k%every == 0 {
				label = powerLabel(k)
			}
			ticks = append(ticks, gplot.Tick{Value: p, Label: label})
		}
		if k1-k0 <= 3 {
			for m := 2; m <= 9; m++ {
				if v := float64(m) * p; lo <= v && v <= hi {
					ticks = append(ticks, gplot.Tick{Value: v})
				}
			}
		}
	}
	return ticks
}

// powerLabel writes 10^k.
func powerLabel(k int) string {
	switch {
	case k >= 0 && k <= 3:
		return strconv.FormatFloat(math.Pow(10, float64(k)), 'f', 0, 64)
	case k < 0 && k >= -3:
		return strconv.FormatFloat(math.Pow(10, float64(k)), 'f', -k, 64)
	}
	return strings.ReplaceAll("1e"+strconv.Itoa(k), "-", "−")
}
