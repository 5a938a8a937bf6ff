package interval

import (
	"math"
	"math/big"
)

// tiny is 2⁻⁹⁶⁹. If a product, quotient or radicand has magnitude at least
// tiny, its exact rounding error term is a nonzero multiple of 2⁻¹⁰⁷⁴ or is
// zero, so the round-to-nearest evaluation of that term by math.FMA keeps
// its sign (see MulDown, DivDown, SqrtDown). Below tiny the term may be
// smaller than half the least subnormal and round to zero, so directed
// results of that size are computed exactly with math/big instead.
const tiny = 0x1p-969

// twoSumLimit is 2¹⁰²³. For a computed sum s with |s| < twoSumLimit no
// intermediate operation of TwoSum overflows (see AddDown); sums at or above
// it are rounded exactly with math/big instead.
const twoSumLimit = 0x1p1023

// AddDown returns the largest float64 ≤ a + b (the exact real sum), with
// the extended-real conventions ±∞ + t = ±∞ for finite t. An overflowed
// finite sum gives MaxFloat64 or −∞; ∞ + (−∞) gives −∞ (the only sound
// choice for a lower end). It panics if a or b is NaN.
//
// With s = fl(a + b) (round to nearest), TwoSum gives the rounding error
// e = (a + b) − s exactly (Møller 1965; Knuth, TAOCP 2, §4.2.2),
// provided no intermediate operation overflows, and then the result is s if
// e ≥ 0 and the predecessor of s if e < 0: s is the nearest float to a + b,
// so a + b lies strictly between that predecessor and s.
//
// Overflow of the intermediates: let |s| < 2¹⁰²³, so |s − (a + b)| ≤ 2⁹⁶⁹.
// Then fl(s − b) cannot overflow (|s − b| ≤ |a| + 2⁹⁶⁹), and with
// a′ = fl(s − b) one has s − a′ = b − ε, |ε| ≤ ulp(a′)/2 ≤ 2⁹⁷⁰. That
// reaches the overflow threshold 2¹⁰²⁴ − 2⁹⁷⁰ only if |b| = MaxFloat64 and
// |a′| ≥ 2¹⁰²³; but then |a| ≥ MaxFloat64/2 with the sign opposite to b, so
// a + b is exact (Sterbenz's lemma), a′ = a and ε = 0. The remaining
// operations act on rounding errors. Sums with |s| ≥ 2¹⁰²³ may overflow an
// intermediate (a = −(2¹⁰²³ − 5·2⁹⁷⁰), b = MaxFloat64 does), so they take
// the exact path.
//
// References:
//
//	O. Møller, Quasi double-precision in floating point addition,
//	BIT 5 (1965) 37–50.
//	D. E. Knuth, The Art of Computer Programming, Vol. 2, 3rd ed.,
//	Addison-Wesley, 1998, §4.2.2.
//	P. H. Sterbenz, Floating-Point Computation, Prentice-Hall, 1974.
func AddDown(a, b float64) float64 {
	s := a + b
	if !(math.Abs(s) < twoSumLimit) { // also ±∞ and NaN
		return addSpecial(s, a, b, big.ToNegativeInf)
	}
	bb := s - a
	e := (a - (s - bb)) + (b - bb)
	if e < 0 {
		return nextDown(s)
	}
	return s
}

// AddUp returns the smallest float64 ≥ a + b. An overflowed finite sum
// gives −MaxFloat64 or +∞; ∞ + (−∞) gives +∞. It panics if a or b is NaN.
// The method is that of AddDown.
func AddUp(a, b float64) float64 {
	s := a + b
	if !(math.Abs(s) < twoSumLimit) {
		return addSpecial(s, a, b, big.ToPositiveInf)
	}
	bb := s - a
	e := (a - (s - bb)) + (b - bb)
	if e > 0 {
		return nextUp(s)
	}
	return s
}

// SubDown returns the largest float64 ≤ a − b.
func SubDown(a, b float64) float64 { return AddDown(a, -b) }

// SubUp returns the smallest float64 ≥ a − b.
func SubUp(a, b float64) float64 { return AddUp(a, -b) }

// addSpecial handles sums with |fl(a + b)| ≥ 2¹⁰²³, infinite operands and
// NaN.
func addSpecial(s, a, b float64, mode big.RoundingMode) float64 {
	if math.IsNaN(a) || math.IsNaN(b) {
		panic("interval: NaN operand")
	}
	if math.IsInf(a, 0) || math.IsInf(b, 0) {
		if math.IsNaN(s) { // ∞ + (−∞): no value; widen fully
			return outward(mode)
		}
		return s
	}
	x := new(big.Float).SetFloat64(a)
	y := new(big.Float).SetFloat64(b)
	// Correctly rounded in mode at 53 bits with unbounded exponent; roundBig
	// maps a result beyond MaxFloat64 to ±MaxFloat64 or ±∞ as mode demands.
	z := new(big.Float).SetPrec(53).SetMode(mode).Add(x, y)
	return roundBig(z, mode)
}

// MulDown returns the largest float64 ≤ a·b. A zero factor gives 0 even
// against an infinite one (the convention 0·∞ = 0 of interval
// multiplication, IEEE 1788-2015, since the interval ends stand for
// limits of finite reals); otherwise ±∞ factors give ±∞. An overflowed finite
// product gives MaxFloat64 or −∞. It panics if a or b is NaN.
//
// With p = fl(a·b), write a = Ma·2^qa and b = Mb·2^qb with integers
// |Ma|, |Mb| < 2⁵³. The exact error a·b − p is zero or a multiple of
// 2^(qa+qb). If |p| ≥ 2⁻⁹⁶⁹ then |a·b| ≥ 2⁻⁹⁶⁹ − 2⁻¹⁰²³, while
// |a·b| ≤ (2⁵³ − 1)²·2^(qa+qb) < (2⁻⁹⁶⁹ − 2⁻¹⁰²³)·2^(qa+qb+1075); hence
// qa + qb ≥ −1074. So the error is zero or at least 2⁻¹⁰⁷⁴ in magnitude,
// and its round-to-nearest value math.FMA(a, b, −p) has the same sign (it is
// in fact exact, Boldo and Muller 2011). The result is p, or its predecessor
// if the error is negative.
//
// References:
//
//	S. Boldo, J.-M. Muller, Exact and approximated error of the FMA,
//	IEEE Trans. Computers 60(2) (2011) 157–164.
func MulDown(a, b float64) float64 {
	if a == 0 || b == 0 {
		return 0
	}
	p := float64(a * b)
	if ap := math.Abs(p); !(ap >= tiny && ap <= math.MaxFloat64) {
		return mulSpecial(p, a, b, big.ToNegativeInf)
	}
	if math.FMA(a, b, -p) < 0 {
		return nextDown(p)
	}
	return p
}

// MulUp returns the smallest float64 ≥ a·b, with 0·∞ = 0. An overflowed
// finite product gives −MaxFloat64 or +∞. It panics if a or b is NaN. The
// method is that of MulDown.
func MulUp(a, b float64) float64 {
	if a == 0 || b == 0 {
		return 0
	}
	p := float64(a * b)
	if ap := math.Abs(p); !(ap >= tiny && ap <= math.MaxFloat64) {
		return mulSpecial(p, a, b, big.ToPositiveInf)
	}
	if math.FMA(a, b, -p) > 0 {
		return nextUp(p)
	}
	return p
}

// mulSpecial handles nonzero factors whose rounded product is NaN, infinite
// or below tiny in magnitude.
func mulSpecial(p, a, b float64, mode big.RoundingMode) float64 {
	if math.IsNaN(a) || math.IsNaN(b) {
		panic("interval: NaN operand")
	}
	if math.IsInf(p, 0) {
		if !math.IsInf(a, 0) && !math.IsInf(b, 0) {
			return overflow(p, mode)
		}
		return p
	}
	x := new(big.Float).SetFloat64(a)
	y := new(big.Float).SetFloat64(b)
	z := new(big.Float).SetPrec(106).Mul(x, y) // exact: 53 + 53 bits
	return roundBig(z, mode)
}

// DivDown returns the largest float64 ≤ a/b for b ≠ 0. A finite a over an
// infinite b gives 0 and an infinite a over a finite b gives ±∞ (limits);
// ±∞/±∞ gives −∞. An overflowed finite quotient gives MaxFloat64 or −∞. It
// panics if b is zero or an operand is NaN.
//
// With q = fl(a/b), the exact remainder r = a − q·b satisfies
// a/b − q = r/b. Let |q| ≥ 2⁻⁹⁶⁹ (q normal, so |a/b − q| ≤ 2⁻⁵³|q| and
// |a| ≤ (1 + 2⁻⁵³)|q·b|) and |a| ≥ 2⁻⁹⁶⁹. Then |q·b| > 2⁻⁹⁶⁹ − 2⁻¹⁰²²;
// writing q = Mq·2^qq, b = Mb·2^qb as for MulDown, qq + qb ≤ −1075 would
// give |q·b| ≤ (2⁵³ − 1)²·2⁻¹⁰⁷⁵ < 2⁻⁹⁶⁹ − 2⁻¹⁰²¹. So q·b is a multiple of
// 2⁻¹⁰⁷⁴, as is every float64 a; hence r is zero or at least 2⁻¹⁰⁷⁴ in
// magnitude and
// math.FMA(−q, b, a) has its sign (it is exact, Bohlender et al. 1991). The
// result is q, or its predecessor if r/b < 0.
//
// References:
//
//	G. Bohlender, W. Walter, P. Kornerup, D. W. Matula, Semantics for
//	exact floating point operations, Proc. 10th IEEE Symposium on Computer
//	Arithmetic (1991).
func DivDown(a, b float64) float64 {
	q := a / b
	aq, aa := math.Abs(q), math.Abs(a)
	if !(aq >= tiny && aq <= math.MaxFloat64 && aa >= tiny && aa <= math.MaxFloat64) {
		return divSpecial(q, a, b, big.ToNegativeInf)
	}
	r := math.FMA(-q, b, a)
	if (r < 0 && b > 0) || (r > 0 && b < 0) {
		return nextDown(q)
	}
	return q
}

// DivUp returns the smallest float64 ≥ a/b for b ≠ 0; ±∞/±∞ gives +∞ and
// an overflowed finite quotient gives −MaxFloat64 or +∞. It panics if b is
// zero or an operand is NaN. The method is that of DivDown.
func DivUp(a, b float64) float64 {
	q := a / b
	aq, aa := math.Abs(q), math.Abs(a)
	if !(aq >= tiny && aq <= math.MaxFloat64 && aa >= tiny && aa <= math.MaxFloat64) {
		return divSpecial(q, a, b, big.ToPositiveInf)
	}
	r := math.FMA(-q, b, a)
	if (r > 0 && b > 0) || (r < 0 && b < 0) {
		return nextUp(q)
	}
	return q
}

// divSpecial handles quotients with a zero, infinite, NaN or tiny operand or
// result.
func divSpecial(q, a, b float64, mode big.RoundingMode) float64 {
	switch {
	case math.IsNaN(a) || math.IsNaN(b):
		panic("interval: NaN operand")
	case b == 0:
		panic("interval: division by zero")
	case math.IsInf(a, 0) && math.IsInf(b, 0): // no value; widen fully
		return outward(mode)
	case math.IsInf(a, 0):
		return q
	case math.IsInf(b, 0), a == 0:
		// a/±∞ is the limit 0 of a/t over finite t; 0/b = 0 exactly.
		return 0
	case math.IsInf(q, 0):
		return overflow(q, mode)
	}
	x := new(big.Float).SetFloat64(a)
	y := new(big.Float).SetFloat64(b)
	z := new(big.Float).SetPrec(53).SetMode(mode).Quo(x, y)
	return roundBig(z, mode)
}

// SqrtDown returns the largest float64 ≤ √a for a ≥ 0 (√+∞ = +∞). It panics
// if a < 0 or a is NaN.
//
// With s = fl(√a) (correctly rounded, IEEE 754), the exact residual a − s²
// has the sign of √a − s. If a ≥ 2⁻⁹⁶⁹ then s ≥ 2⁻⁴⁸⁵, s² is a multiple of
// 2⁻¹⁰⁷⁴ and so is a, so the residual is zero or at least 2⁻¹⁰⁷⁴ in
// magnitude and math.FMA(−s, s, a) has its sign. The result is s, or its
// predecessor if the residual is negative.
func SqrtDown(a float64) float64 {
	if !(a >= tiny && a <= math.MaxFloat64) {
		return sqrtSpecial(a, big.ToNegativeInf)
	}
	s := math.Sqrt(a)
	if math.FMA(-s, s, a) < 0 {
		return nextDown(s)
	}
	return s
}

// SqrtUp returns the smallest float64 ≥ √a for a ≥ 0. It panics if a < 0
// or a is NaN. The method is that of SqrtDown.
func SqrtUp(a float64) float64 {
	if !(a >= tiny && a <= math.MaxFloat64) {
		return sqrtSpecial(a, big.ToPositiveInf)
	}
	s := math.Sqrt(a)
	if math.FMA(-s, s, a) > 0 {
		return nextUp(s)
	}
	return s
}

// sqrtSpecial handles radicands that are zero, +∞, below tiny, negative or
// NaN. For 0 < a < tiny the directed root is found by exact comparison of
// squares: f² (106 bits) is computed exactly at 220 bits.
func sqrtSpecial(a float64, mode big.RoundingMode) float64 {
	switch {
	case math.IsNaN(a) || a < 0:
		panic("interval: square root of a negative number or NaN")
	case a == 0 || math.IsInf(a, 1):
		return a
	}
	x := new(big.Float).SetFloat64(a)
	f, _ := new(big.Float).SetPrec(120).Sqrt(x).Float64()
	cmp := func(v float64) int {
		t := new(big.Float).SetPrec(220).SetFloat64(v)
		return t.Mul(t, t).Cmp(x)
	}
	if mode == big.ToNegativeInf {
		for cmp(f) > 0 {
			f = nextDown(f)
		}
		for cmp(nextUp(f)) <= 0 {
			f = nextUp(f)
		}
		return f
	}
	for cmp(f) < 0 {
		f = nextUp(f)
	}
	for cmp(nextDown(f)) >= 0 {
		f = nextDown(f)
	}
	return f
}

// roundBig returns the directed float64 rounding of z in the direction of
// mode (the largest float64 ≤ z for ToNegativeInf, the smallest ≥ z for
// ToPositiveInf); z.Float64 rounds to nearest and reports on which side it
// fell, and one step corrects it. Values beyond ±MaxFloat64 go to
// ±MaxFloat64 or ±∞ as the direction demands. If z is the exact value, or
// its 53-bit rounding in the same direction with unbounded exponent, the
// result is the directed rounding of the exact value: every float64,
// subnormals included, is a 53-bit number.
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

// overflow returns the directed rounding of a finite exact result whose
// round-to-nearest value p is ±∞: such a result exceeds MaxFloat64 in
// magnitude, so the inner end is ±MaxFloat64 and the outer end ±∞.
func overflow(p float64, mode big.RoundingMode) float64 {
	if mode == big.ToNegativeInf && p > 0 {
		return math.MaxFloat64
	}
	if mode == big.ToPositiveInf && p < 0 {
		return -math.MaxFloat64
	}
	return p
}

// outward returns −∞ for downward and +∞ for upward rounding.
func outward(mode big.RoundingMode) float64 {
	if mode == big.ToNegativeInf {
		return math.Inf(-1)
	}
	return math.Inf(1)
}

// nextUp returns the least float64 greater than x, for finite x.
func nextUp(x float64) float64 {
	switch {
	case x > 0:
		return math.Float64frombits(math.Float64bits(x) + 1)
	case x < 0:
		return math.Float64frombits(math.Float64bits(x) - 1)
	}
	return math.SmallestNonzeroFloat64
}

// nextDown returns the greatest float64 less than x, for finite x.
func nextDown(x float64) float64 { return -nextUp(-x) }
