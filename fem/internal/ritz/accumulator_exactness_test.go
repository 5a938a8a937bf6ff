package ritz

import (
	"math"
	"math/big"
	"math/rand"
	"testing"

	"gapcert/interval"
)

// exactEnds returns the exact sums of the lower and upper ends of xs
// (nil for an end with a non-finite term).
func exactEnds(xs []interval.I) (lo, hi *big.Rat) {
	lo, hi = new(big.Rat), new(big.Rat)
	for _, x := range xs {
		if lo != nil {
			if math.IsInf(x.Lo, 0) || math.IsNaN(x.Lo) {
				lo = nil
			} else {
				lo.Add(lo, new(big.Rat).SetFloat64(x.Lo))
			}
		}
		if hi != nil {
			if math.IsInf(x.Hi, 0) || math.IsNaN(x.Hi) {
				hi = nil
			} else {
				hi.Add(hi, new(big.Rat).SetFloat64(x.Hi))
			}
		}
	}
	return lo, hi
}

// accumulate sums xs into entry (0, 0) of a 1×1 accumulator.
func accumulate(xs []interval.I) interval.I {
	a := NewAccumulator(1)
	for _, x := range xs {
		a.Add(0, 0, x)
	}
	return a.Sym().At(0, 0)
}

// checkEncloses reports a sum whose lower end is above the exact sum of
// the lower ends or whose upper end is below that of the upper ends, or
// an end that is NaN.
func checkEncloses(t *testing.T, name string, xs []interval.I) interval.I {
	t.Helper()
	got := accumulate(xs)
	if math.IsNaN(got.Lo) || math.IsNaN(got.Hi) {
		t.Fatalf("%s: NaN end in %v", name, got)
	}
	lo, hi := exactEnds(xs)
	if lo != nil && !math.IsInf(got.Lo, -1) && new(big.Rat).SetFloat64(got.Lo).Cmp(lo) > 0 {
		t.Errorf("%s: lower end %.17g above the exact sum %s", name, got.Lo, lo.FloatString(30))
	}
	if hi != nil && !math.IsInf(got.Hi, 1) && new(big.Rat).SetFloat64(got.Hi).Cmp(hi) < 0 {
		t.Errorf("%s: upper end %.17g below the exact sum %s", name, got.Hi, hi.FloatString(30))
	}
	if lo == nil && !math.IsInf(got.Lo, -1) {
		t.Errorf("%s: a non-finite lower end gave the finite %g", name, got.Lo)
	}
	if hi == nil && !math.IsInf(got.Hi, 1) {
		t.Errorf("%s: a non-finite upper end gave the finite %g", name, got.Hi)
	}
	return got
}

// TestAccumulatorEnclosesAdversarialSums: compensated sums of each end
// against exact rational sums, on sums chosen to break them: total
// cancellation of huge terms around small ones (the TwoSum errors are
// then as large as the result), random mixed signs over 600 binary
// orders of magnitude, terms and partial sums just below and at the
// overflow threshold 2¹⁰²³ of TwoSum, subnormal terms, and NaN or
// infinite ends. Every lower end must be ≤ the exact sum of the lower
// ends and every upper end ≥ that of the upper ends.
func TestAccumulatorEnclosesAdversarialSums(t *testing.T) {
	tiny := math.SmallestNonzeroFloat64
	big1022 := math.Ldexp(1, 1022)
	maxF := math.MaxFloat64
	cases := []struct {
		name string
		xs   []interval.I
	}{
		{"cancellation around thirds", []interval.I{
			interval.Point(1e300), {Lo: 1.0 / 3, Hi: math.Nextafter(1.0/3, 1)}, interval.Point(-1e300),
			interval.Point(1e300), {Lo: -1e-20, Hi: 1e-20}, interval.Point(-1e300)}},
		{"cancellation of large odd floats", []interval.I{
			interval.Point(math.Ldexp(1, 60) + 1024*3), interval.Point(0.1), interval.Point(-math.Ldexp(1, 60)), interval.Point(-3071.9)}},
		{"near the TwoSum limit, below", []interval.I{
			interval.Point(math.Nextafter(big1022*2, 0) - math.Ldexp(1, 970)), interval.Point(math.Ldexp(1, 969)), interval.Point(-1)}},
		{"at the TwoSum limit", []interval.I{interval.Point(big1022), interval.Point(big1022), interval.Point(-big1022)}},
		{"largest floats cancelling", []interval.I{interval.Point(maxF), interval.Point(-maxF), interval.Point(maxF), {Lo: -maxF, Hi: -maxF / 2}}},
		{"subnormal terms", []interval.I{interval.Point(tiny), interval.Point(3 * tiny), interval.Point(-tiny * 7), {Lo: -tiny, Hi: tiny}}},
		{"subnormal residue of normal terms", []interval.I{interval.Point(math.Ldexp(1, -1000)), interval.Point(tiny), interval.Point(-math.Ldexp(1, -1000))}},
		{"NaN lower end", []interval.I{interval.Point(1), {Lo: math.NaN(), Hi: 2}, interval.Point(1)}},
		{"infinite ends", []interval.I{{Lo: math.Inf(-1), Hi: 1}, {Lo: 0, Hi: math.Inf(1)}, interval.Point(-5)}},
	}
	for _, c := range cases {
		checkEncloses(t, c.name, c.xs)
	}
	// A sum that overflows stays unbounded after the terms that would
	// bring it back.
	if got := checkEncloses(t, "overflow then back", []interval.I{interval.Point(maxF), interval.Point(maxF), interval.Point(-maxF), interval.Point(-maxF)}); !math.IsInf(got.Lo, -1) || !math.IsInf(got.Hi, 1) {
		t.Errorf("overflow then back: %v, want unbounded ends", got)
	}

	rng := rand.New(rand.NewSource(20261205))
	for trial := 0; trial < 300; trial++ {
		n := 1 + rng.Intn(400)
		xs := make([]interval.I, n)
		for k := range xs {
			m := rng.NormFloat64()
			e := rng.Intn(600) - 300
			if trial%3 == 0 {
				e = rng.Intn(8) // narrow range, heavy cancellation
			}
			v := math.Ldexp(m, e)
			w := math.Abs(v) * math.Ldexp(1, -52-rng.Intn(3))
			if rng.Intn(4) == 0 {
				w = 0
			}
			xs[k] = interval.I{Lo: interval.SubDown(v, w), Hi: interval.AddUp(v, w)}
		}
		if trial%3 == 0 { // append the negated sum so the exact total nearly cancels
			var s float64
			for _, x := range xs {
				s += x.Lo
			}
			xs = append(xs, interval.Point(-s))
		}
		checkEncloses(t, "random", xs)
	}
}

// TestAccumulatorNarrowOnCancellation: when huge terms cancel exactly
// around small ones, the compensated sums keep the small ones. The sum of
// 10¹⁶ + 1/10 and −10¹⁶, repeated 1,000 times, is 100 (up to the widths
// of the tenths); a plain interval sum loses every tenth at the ulp 2 of
// 10¹⁶ and is about 2,000 wide. Here every tenth goes to the TwoSum error
// sums, which are themselves summed with directed rounding, each addition
// costing up to an ulp of 100 at each end: the width is at most the
// contributions' widths plus 2·1000·ulp(100), not "a few ulps of the
// total" (measured 8.2e-12).
func TestAccumulatorNarrowOnCancellation(t *testing.T) {
	const n = 1000
	tenth := interval.I{Lo: interval.DivDown(1, 10), Hi: interval.DivUp(1, 10)}
	var xs []interval.I
	for k := 0; k < n; k++ {
		xs = append(xs, interval.Point(1e16), tenth, interval.Point(-1e16))
	}
	got := checkEncloses(t, "huge cancelling terms", xs)
	ulp100 := math.Nextafter(100, 200) - 100
	if w, limit := got.Hi-got.Lo, n*(tenth.Hi-tenth.Lo)+2*n*ulp100; !(w <= limit) {
		t.Errorf("width %.3g, want ≤ %.3g", w, limit)
	}
}
