package bernstein

import (
	"math"
	"math/big"
	"math/rand/v2"
	"testing"

	"gapcert/interval"
)

// exceedsExact reports whether t ≥ r·√x·√y, decided exactly: for t ≥ 0
// this is t² ≥ r²·x·y, and products of floats are exact in big.Float at
// 4·53 bits (an independent computation: no square root, no rounding).
func exceedsExact(t, r, x, y float64) bool {
	const prec = 4 * 53
	sq := func(a float64) *big.Float { f := new(big.Float).SetPrec(prec).SetFloat64(a); return f.Mul(f, f) }
	lhs := sq(t)
	rhs := sq(r)
	rhs.Mul(rhs, new(big.Float).SetPrec(prec).SetFloat64(x))
	rhs.Mul(rhs, new(big.Float).SetPrec(prec).SetFloat64(y))
	return lhs.Cmp(rhs) >= 0
}

func TestRemainderBoundFiniteAgainstExactSquares(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 7))
	draw := func() float64 { return math.Ldexp(1+rng.Float64(), rng.IntN(200)-100) }
	cases := [][3]float64{{1, 1, 1}, {2, 3, 5}, {0.1, 0.2, 0.3}, {1e-300, 1e-300, 1e300}, {3, 0, 7}, {math.MaxFloat64, 1, 1}, {5e-324, 4, 9}}
	for i := 0; i < 2000; i++ {
		cases = append(cases, [3]float64{draw(), draw(), draw()})
	}
	for _, c := range cases {
		r, x, y := c[0], c[1], c[2]
		got := RemainderBound(r, x, y)
		if !exceedsExact(got, r, x, y) {
			t.Fatalf("RemainderBound(%g, %g, %g) = %g is below r·√x·√y", r, x, y, got)
		}
		// Narrowness: three upward roundings cost at most a few ulps
		// (product of two square roots and r, each rounded up once).
		if want := r * math.Sqrt(x) * math.Sqrt(y); want > 1e-290 && got > want*(1+8*0x1p-52) {
			t.Errorf("RemainderBound(%g, %g, %g) = %g, more than 8 ulps above %g", r, x, y, got, want)
		}
	}
}

func TestRemainderBoundNegativeRoundoffCountsAsZero(t *testing.T) {
	if got := RemainderBound(2, -1e-300, 4); got != 0 {
		t.Errorf("RemainderBound(2, -1e-300, 4) = %g, want 0 (a norm² below 0 by rounding is 0)", got)
	}
}

func TestRemainderBoundSpecialArguments(t *testing.T) {
	inf, nan := math.Inf(1), math.NaN()
	for _, c := range []struct {
		r, x, y float64
		want    float64
	}{
		{0, 1, 1, 0},
		{0, inf, 1, 0},   // the term vanishes whatever the (finite) norms
		{0, nan, nan, 0}, // likewise
		{inf, 1, 1, inf},
		{inf, 0, 0, inf},
		{nan, 1, 1, inf},
		{1, inf, 0, inf}, // MulUp alone would give ∞·0 = 0 here
		{1, 0, inf, inf},
		{1, inf, inf, inf},
		{1, nan, 1, inf},
		{1, 1, nan, inf},
		{1e300, 1e300, 1e300, inf}, // overflow rounds up to +Inf
	} {
		if got := RemainderBound(c.r, c.x, c.y); got != c.want && !(math.IsInf(got, 1) && math.IsInf(c.want, 1)) {
			t.Errorf("RemainderBound(%g, %g, %g) = %g, want %g", c.r, c.x, c.y, got, c.want)
		}
	}
}

// exactDot returns Σ a_i b_i exactly (big.Float with enough precision for
// sums of products of floats in a narrow exponent range).
func exactDot(a, b []float64) *big.Float {
	s := new(big.Float).SetPrec(2000)
	for i := range a {
		p := new(big.Float).SetPrec(2000).SetFloat64(a[i])
		p.Mul(p, new(big.Float).SetPrec(2000).SetFloat64(b[i]))
		s.Add(s, p)
	}
	return s
}

func contains(x interval.I, v *big.Float) bool {
	return new(big.Float).SetFloat64(x.Lo).Cmp(v) <= 0 && v.Cmp(new(big.Float).SetFloat64(x.Hi)) <= 0
}

func TestDotAndApplyContainExactSums(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 5))
	const n = 7
	a, b := make([]float64, n), make([]float64, n)
	bi := make([]interval.I, n)
	g := make([]interval.I, 2*n)
	for trial := 0; trial < 200; trial++ {
		for i := range a {
			a[i], b[i] = rng.NormFloat64(), rng.NormFloat64()
			if i == 2 {
				a[i], b[i] = 0, 0 // zero coefficients are skipped
			}
			bi[i] = interval.Point(b[i])
			g[i], g[n+i] = interval.Point(a[i]), interval.Point(b[i])
		}
		exact := exactDot(a, b)
		if d := DotF(a, bi); !contains(d, exact) {
			t.Fatalf("DotF = %v misses %s", d, exact.Text('g', 20))
		}
		ai := make([]interval.I, n)
		for i := range a {
			ai[i] = interval.Point(a[i])
		}
		if d := DotI(ai, bi); !contains(d, exact) {
			t.Fatalf("DotI = %v misses %s", d, exact.Text('g', 20))
		}
		dst := make([]interval.I, 2)
		ApplyF(dst, g, b)
		if !contains(dst[0], exact) || !contains(dst[1], exactDot(b, b)) {
			t.Fatalf("ApplyF = %v misses the exact row products", dst)
		}
		ApplyI(dst, g, bi)
		if !contains(dst[0], exact) || !contains(dst[1], exactDot(b, b)) {
			t.Fatalf("ApplyI = %v misses the exact row products", dst)
		}
		if w := dst[0].Hi - dst[0].Lo; w > 1e-14*(1+math.Abs(dst[0].Mid())) {
			t.Fatalf("ApplyI row width %g too wide", w)
		}
	}
}

// The weighted Gram matrix of the two linear Bernstein functions on [0, 1]
// (B_0 = 1 − ξ, B_1 = ξ) with weight P = w_0 B_0 + w_1 B_1 and shift s.
// By direct integration of cubics, ∫(1−ξ)³ = ∫ξ³ = 1/4 and
// ∫(1−ξ)²ξ = ∫(1−ξ)ξ² = 1/12, so the triple table is T_0 = [1/4 1/12;
// 1/12 1/12], T_1 = [1/12 1/12; 1/12 1/4].
func TestWeightedGramLinearBasis(t *testing.T) {
	twelfth := interval.I{Lo: interval.DivDown(1, 12), Hi: interval.DivUp(1, 12)}
	quarter := interval.Point(0.25)
	triple := []interval.I{quarter, twelfth, twelfth, twelfth, twelfth, twelfth, twelfth, quarter}
	dst := make([]interval.I, 4)
	w := []interval.I{interval.Point(2), interval.Point(6)}
	WeightedGram(dst, triple, w, interval.Point(1), 2)
	// P + 1 = 3B_0 + 7B_1: entries 3/4 + 7/12 = 4/3, 3/12 + 7/12 = 5/6, 3/12 + 7/4 = 2.
	want := []*big.Rat{big.NewRat(4, 3), big.NewRat(5, 6), big.NewRat(5, 6), big.NewRat(2, 1)}
	for i, x := range dst {
		lo, hi := new(big.Rat).SetFloat64(x.Lo), new(big.Rat).SetFloat64(x.Hi)
		if lo.Cmp(want[i]) > 0 || hi.Cmp(want[i]) < 0 {
			t.Errorf("entry %d: %v does not contain %s", i, x, want[i].RatString())
		}
		if x.Hi-x.Lo > 1e-15 {
			t.Errorf("entry %d: %v too wide", i, x)
		}
	}
	if dst[1] != dst[2] {
		t.Errorf("not exactly symmetric: %v vs %v", dst[1], dst[2])
	}
}
