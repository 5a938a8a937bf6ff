package ritz

import (
	"math"
	"math/big"
	"testing"

	"gapcert/interval"
)

func TestAccumulatorSumsOutwardAndMirrors(t *testing.T) {
	a := NewAccumulator(3)
	tenth := interval.I{Lo: interval.DivDown(1, 10), Hi: interval.DivUp(1, 10)}
	for k := 0; k < 10; k++ {
		a.Add(2, 0, tenth)
	}
	a.Add(1, 1, interval.Point(2))
	a.Add(1, 1, interval.Point(-0.5))
	s := a.Sym()
	if x := s.At(2, 0); !x.Contains(1) || x.Hi-x.Lo > 1e-14 {
		t.Errorf("ten tenths = %v, want a narrow enclosure of 1", x)
	}
	if s.At(0, 2) != s.At(2, 0) {
		t.Errorf("upper entry %v differs from lower %v", s.At(0, 2), s.At(2, 0))
	}
	if x := s.At(1, 1); x != interval.Point(1.5) {
		t.Errorf("exact sum = %v, want [1.5, 1.5]", x)
	}
	if x := s.At(0, 0); x != (interval.I{}) {
		t.Errorf("untouched entry = %v, want [0, 0]", x)
	}
}

func TestAccumulatorRefusesUpperEntries(t *testing.T) {
	defer func() {
		if recover() == nil {
			t.Error("Add(0, 1) did not panic")
		}
	}()
	NewAccumulator(2).Add(0, 1, interval.Point(1))
}

// TestAccumulatorWidthDoesNotGrowWithTheCount adds 100,000 enclosures of
// 1/10 (each one ulp wide) and of 1/3 to ±1: the exact sums 10,000 and
// 100,000/3 ± 100,000 must be enclosed, and the width must be the sum of
// the contributions' widths plus a few ulps of the total. A plain interval
// sum widens by about an ulp of the partial sum per addition (about 1e-8
// absolute here), far above that.
func TestAccumulatorWidthDoesNotGrowWithTheCount(t *testing.T) {
	const n = 100000
	a := NewAccumulator(2)
	tenth := interval.I{Lo: interval.DivDown(1, 10), Hi: interval.DivUp(1, 10)}
	third := interval.I{Lo: interval.DivDown(1, 3), Hi: interval.DivUp(1, 3)}
	for k := 0; k < n; k++ {
		a.Add(0, 0, tenth)
		a.Add(1, 0, third)
		sign := float64(1 - 2*(k%2))
		a.Add(1, 1, interval.Point(sign).Add(third))
	}
	s := a.Sym()
	checks := []struct {
		name        string
		got         interval.I
		lo, hi      *big.Rat // exact sum lies in [lo, hi]
		widthOfAdds float64
	}{
		{"tenths", s.At(0, 0), big.NewRat(n, 10), big.NewRat(n, 10), n * (tenth.Hi - tenth.Lo)},
		{"thirds", s.At(1, 0), big.NewRat(n, 3), big.NewRat(n, 3), n * (third.Hi - third.Lo)},
		{"alternating", s.At(1, 1), big.NewRat(n, 3), big.NewRat(n, 3), n * (third.Hi - third.Lo)},
	}
	for _, c := range checks {
		lo := new(big.Rat).SetFloat64(c.got.Lo)
		hi := new(big.Rat).SetFloat64(c.got.Hi)
		if lo.Cmp(c.lo) > 0 || hi.Cmp(c.hi) < 0 {
			t.Errorf("%s: %v does not contain the exact sum %s", c.name, c.got, c.lo.FloatString(20))
		}
		// widthOfAdds bounds the widths of the contributions (each ≤ 1 ulp
		// of its value); 4 ulps of the total for the final roundings.
		if w, limit := c.got.Hi-c.got.Lo, c.widthOfAdds+4*math.Abs(c.got.Hi)*0x1p-52; w > limit {
			t.Errorf("%s: width %.3g, want ≤ %.3g (compensated sums)", c.name, w, limit)
		}
	}
}

// TestAccumulatorUnboundedEnds: an infinite end makes that end of the
// entry infinite and leaves the other end summed.
func TestAccumulatorUnboundedEnds(t *testing.T) {
	a := NewAccumulator(1)
	a.Add(0, 0, interval.Point(1))
	a.Add(0, 0, interval.I{Lo: math.Inf(-1), Hi: 2})
	a.Add(0, 0, interval.Point(0.5))
	if got := a.Sym().At(0, 0); !math.IsInf(got.Lo, -1) || got.Hi != 3.5 {
		t.Errorf("sum with an unbounded lower end = %v, want [-Inf, 3.5]", got)
	}
	b := NewAccumulator(1)
	b.Add(0, 0, interval.Point(math.MaxFloat64))
	b.Add(0, 0, interval.Point(math.MaxFloat64))
	if got := b.Sym().At(0, 0); !math.IsInf(got.Lo, -1) || !math.IsInf(got.Hi, 1) {
		t.Errorf("overflowing sum = %v, want [-Inf, +Inf]", got)
	}
}
