package interval

import (
	"math"
	"math/big"
)

// tiny is 2⁻⁹⁶⁹: below it the error terms of the error-free transformations
// for ·, / and √ may be inexact (they can fall below the subnormal range), so
// directed results of that size are computed exactly with math/big.
const tiny = 0x1p-969

// AddDown returns the largest float64 ≤ a + b (exact real sum). a and b must
// not be NaN; ∞ + (−∞) returns −∞ (the sound choice for a lower end).
func AddDown(a, b float64) float64 {
	s := a + b
	if math.IsInf(s, 0) || math.IsNaN(s) {
		return infDown(s, a, b)
	}
	// TwoSum (Knuth): s + e = a + b exactly, for any finite a, b.
	bb := s - a
	e := (a - (s - bb)) + (b - bb)
	if e < 0 {
		return math.Nextafter(s, math.Inf(-1))
	}
	return s
}

// AddUp returns the smallest float64 ≥ a + b.
func AddUp(a, b float64) float64 {
	s := a + b
	if math.IsInf(s, 0) || math.IsNaN(s) {
		return infUp(s, a, b)
	}
	bb := s - a
	e := (a - (s - bb)) + (b - bb)
	if e > 0 {
		return math.Nextafter(s, math.Inf(1))
	}
	return s
}

// SubDown returns the largest float64 ≤ a − b.
func SubDown(a, b float64) float64 { return AddDown(a, -b) }

// SubUp returns the smallest float64 ≥ a − b.
func SubUp(a, b float64) float64 { return AddUp(a, -b) }

// infDown handles a sum that overflowed or involved an infinity.
func infDown(s, a, b float64) float64 {
	if math.IsInf(a, 0) || math.IsInf(b, 0) {
		if math.IsNaN(s) {
			return math.Inf(-1)
		}
		return s
	}
	// Finite operands, overflowed result.
	if s > 0 {
		return math.MaxFloat64
	}
	return math.Inf(-1)
}

// infUp handles a sum that overflowed or involved an infinity.
func infUp(s, a, b float64) float64 {
	if math.IsInf(a, 0) || math.IsInf(b, 0) {
		if math.IsNaN(s) {
			return math.Inf(1)
		}
		return s
	}
	if s < 0 {
		return -math.MaxFloat64
	}
	return math.Inf(1)
}

// MulDown returns the largest float64 ≤ a·b. A zero factor gives 0 even
// against an infinite one (the interval convention 0·∞ = 0 of IEEE 1788).
func MulDown(a, b float64) float64 {
	if a == 0 || b == 0 {
		return 0
	}
	p := float64(a * b)
	if math.IsInf(p, 0) {
		if !math.IsInf(a, 0) && !math.IsInf(b, 0) && p > 0 {
			return math.MaxFloat64
		}
		return p
	}
	if math.Abs(p) < tiny {
		return slowMul(a, b, big.ToNegativeInf)
	}
	// a·b = p + e exactly (FMA error-free product).
	e := math.FMA(a, b, -p)
	if e < 0 {
		return math.Nextafter(p, math.Inf(-1))
	}
	return p
}

// MulUp returns the smallest float64 ≥ a·b, with 0·∞ = 0.
func MulUp(a, b float64) float64 {
	if a == 0 || b == 0 {
		return 0
	}
	p := float64(a * b)
	if math.IsInf(p, 0) {
		if !math.IsInf(a, 0) && !math.IsInf(b, 0) && p < 0 {
			return -math.MaxFloat64
		}
		return p
	}
	if math.Abs(p) < tiny {
		return slowMul(a, b, big.ToPositiveInf)
	}
	e := math.FMA(a, b, -p)
	if e > 0 {
		return math.Nextafter(p, math.Inf(1))
	}
	return p
}

// DivDown returns the largest float64 ≤ a/b. b must be nonzero; ±∞/±∞
// returns −∞ (sound for a lower end).
func DivDown(a, b float64) float64 {
	q := a / b
	if math.IsInf(q, 0) || math.IsNaN(q) || math.IsInf(b, 0) || math.IsInf(a, 0) {
		return divSpecial(q, a, b, false)
	}
	if math.Abs(q) < tiny || math.Abs(a) < tiny {
		return slowDiv(a, b, big.ToNegativeInf)
	}
	// a − q·b = r exactly, and a/b − q = r/b.
	r := math.FMA(-q, b, a)
	if (r < 0 && b > 0) || (r > 0 && b < 0) {
		return math.Nextafter(q, math.Inf(-1))
	}
	return q
}

// DivUp returns the smallest float64 ≥ a/b. b must be nonzero.
func DivUp(a, b float64) float64 {
	q := a / b
	if math.IsInf(q, 0) || math.IsNaN(q) || math.IsInf(b, 0) || math.IsInf(a, 0) {
		return divSpecial(q, a, b, true)
	}
	if math.Abs(q) < tiny || math.Abs(a) < tiny {
		return slowDiv(a, b, big.ToPositiveInf)
	}
	r := math.FMA(-q, b, a)
	if (r > 0 && b > 0) || (r < 0 && b < 0) {
		return math.Nextafter(q, math.Inf(1))
	}
	return q
}

func divSpecial(q, a, b float64, up bool) float64 {
	switch {
	case math.IsNaN(q): // ∞/∞
		if up {
			return math.Inf(1)
		}
		return math.Inf(-1)
	case math.IsInf(b, 0) && !math.IsInf(a, 0):
		// finite/∞ = 0 exactly in the limit; the exact value is 0 only in
		// the limit sense used by interval division (IEEE 1788 §10.5.4).
		return 0
	case math.IsInf(a, 0):
		return q
	}
	// Finite operands, overflow.
	if up && q < 0 {
		return -math.MaxFloat64
	}
	if !up && q > 0 {
		return math.MaxFloat64
	}
	return q
}

// SqrtDown returns the largest float64 ≤ √a for a ≥ 0.
func SqrtDown(a float64) float64 {
	s := math.Sqrt(a) // IEEE 754 requires √ correctly rounded.
	if a == 0 || math.IsInf(a, 0) {
		return s
	}
	if a < tiny {
		return slowSqrt(a, big.ToNegativeInf)
	}
	// a − s² = e exactly.
	if math.FMA(-s, s, a) < 0 {
		return math.Nextafter(s, 0)
	}
	return s
}

// SqrtUp returns the smallest float64 ≥ √a for a ≥ 0.
func SqrtUp(a float64) float64 {
	s := math.Sqrt(a)
	if a == 0 || math.IsInf(a, 0) {
		return s
	}
	if a < tiny {
		return slowSqrt(a, big.ToPositiveInf)
	}
	if math.FMA(-s, s, a) > 0 {
		return math.Nextafter(s, math.Inf(1))
	}
	return s
}

// roundBig converts an exact-or-directed big.Float z to float64 in the
// direction of mode. z must already be rounded in that direction at 53 bits
// (or be exact); the conversion adds at most one more directed ulp where
// the subnormal range has fewer bits.
func roundBig(z *big.Float, mode big.RoundingMode) float64 {
	f, acc := z.Float64()
	if mode == big.ToNegativeInf && acc == big.Above {
		f = math.Nextafter(f, math.Inf(-1))
	}
	if mode == big.ToPositiveInf && acc == big.Below {
		f = math.Nextafter(f, math.Inf(1))
	}
	return f
}

func slowMul(a, b float64, mode big.RoundingMode) float64 {
	x := new(big.Float).SetFloat64(a)
	y := new(big.Float).SetFloat64(b)
	z := new(big.Float).SetPrec(200).Mul(x, y) // exact: 106 bits suffice
	return roundBig(z, mode)
}

func slowDiv(a, b float64, mode big.RoundingMode) float64 {
	x := new(big.Float).SetFloat64(a)
	y := new(big.Float).SetFloat64(b)
	z := new(big.Float).SetPrec(53).SetMode(mode).Quo(x, y)
	return roundBig(z, mode)
}

func slowSqrt(a float64, mode big.RoundingMode) float64 {
	x := new(big.Float).SetFloat64(a)
	// A first guess within an ulp or two, then exact comparisons of f² with
	// a decide the directed rounding (f² is exact at 220 bits).
	f, _ := new(big.Float).SetPrec(120).Sqrt(x).Float64()
	cmp := func(v float64) int {
		t := new(big.Float).SetPrec(220).SetFloat64(v)
		return t.Mul(t, t).Cmp(x)
	}
	if mode == big.ToNegativeInf {
		for cmp(f) > 0 {
			f = math.Nextafter(f, 0)
		}
		for g := math.Nextafter(f, math.Inf(1)); cmp(g) <= 0; g = math.Nextafter(f, math.Inf(1)) {
			f = g
		}
		return f
	}
	for cmp(f) < 0 {
		f = math.Nextafter(f, math.Inf(1))
	}
	for f > 0 {
		g := math.Nextafter(f, 0)
		if cmp(g) < 0 {
			break
		}
		f = g
	}
	return f
}
