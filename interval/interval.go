package interval

import (
	"fmt"
	"math"
)

// I is the closed interval [Lo, Hi] of real numbers. The zero value is the
// point 0. An I built by this package always has Lo ≤ Hi and no NaN end;
// Lo may be −∞ and Hi may be +∞.
type I struct {
	Lo, Hi float64
}

// Point returns the degenerate interval [x, x]. It panics unless x is
// finite (an interval is a set of reals; ±∞ may only be an open end).
func Point(x float64) I {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		panic(fmt.Sprintf("interval: point %g is not a real number", x))
	}
	return I{x, x}
}

// New returns [lo, hi]. It panics if lo > hi, if an end is NaN, or if
// lo = +∞ or hi = −∞.
func New(lo, hi float64) I {
	if !(lo <= hi) || math.IsInf(lo, 1) || math.IsInf(hi, -1) {
		panic(fmt.Sprintf("interval: invalid ends [%g, %g]", lo, hi))
	}
	return I{lo, hi}
}

// Entire returns (−∞, +∞).
func Entire() I { return I{math.Inf(-1), math.Inf(1)} }

// Inf returns the lower end.
func (x I) Inf() float64 { return x.Lo }

// Sup returns the upper end.
func (x I) Sup() float64 { return x.Hi }

// Mid returns a float64 in x near its midpoint (IEEE 1788 mid: finite for
// bounded x, 0 for the entire line, ±MaxFloat64 for half-bounded x). It is
// a choice, not a bound: Mid is only guaranteed to lie in x.
func (x I) Mid() float64 {
	switch {
	case math.IsInf(x.Lo, -1) && math.IsInf(x.Hi, 1):
		return 0
	case math.IsInf(x.Lo, -1):
		return -math.MaxFloat64
	case math.IsInf(x.Hi, 1):
		return math.MaxFloat64
	}
	m := float64(0.5*x.Lo) + float64(0.5*x.Hi) // no overflow
	if m < x.Lo {
		return x.Lo
	}
	if m > x.Hi {
		return x.Hi
	}
	return m
}

// Rad returns an upper bound of the radius: x ⊆ [Mid − Rad, Mid + Rad].
func (x I) Rad() float64 {
	m := x.Mid()
	return math.Max(SubUp(m, x.Lo), SubUp(x.Hi, m))
}

// Wid returns an upper bound of the width Hi − Lo.
func (x I) Wid() float64 { return SubUp(x.Hi, x.Lo) }

// Mag returns max |t| over t ∈ x (exact).
func (x I) Mag() float64 { return math.Max(math.Abs(x.Lo), math.Abs(x.Hi)) }

// Mig returns min |t| over t ∈ x (exact).
func (x I) Mig() float64 {
	if x.Lo <= 0 && x.Hi >= 0 {
		return 0
	}
	return math.Min(math.Abs(x.Lo), math.Abs(x.Hi))
}

// IsPoint reports whether Lo == Hi.
func (x I) IsPoint() bool { return x.Lo == x.Hi }

// IsBounded reports whether both ends are finite.
func (x I) IsBounded() bool { return !math.IsInf(x.Lo, 0) && !math.IsInf(x.Hi, 0) }

// Contains reports whether t ∈ x.
func (x I) Contains(t float64) bool { return x.Lo <= t && t <= x.Hi }

// ContainsZero reports whether 0 ∈ x.
func (x I) ContainsZero() bool { return x.Lo <= 0 && 0 <= x.Hi }

// Subset reports whether x ⊆ y.
func (x I) Subset(y I) bool { return y.Lo <= x.Lo && x.Hi <= y.Hi }

// Interior reports whether x lies in the interior of y.
func (x I) Interior(y I) bool {
	return (y.Lo < x.Lo || math.IsInf(y.Lo, -1)) && (x.Hi < y.Hi || math.IsInf(y.Hi, 1))
}

// Positive reports whether every element of x is > 0 (a decided sign).
func (x I) Positive() bool { return x.Lo > 0 }

// Negative reports whether every element of x is < 0.
func (x I) Negative() bool { return x.Hi < 0 }

// NonNegative reports whether every element of x is ≥ 0.
func (x I) NonNegative() bool { return x.Lo >= 0 }

// Sign returns +1 if x > 0, −1 if x < 0, and 0 if the sign is not decided
// (0 ∈ x).
func (x I) Sign() int {
	switch {
	case x.Lo > 0:
		return 1
	case x.Hi < 0:
		return -1
	}
	return 0
}

// Less reports whether every element of x is less than every element of y.
func (x I) Less(y I) bool { return x.Hi < y.Lo }

// Hull returns the smallest interval containing x and y.
func (x I) Hull(y I) I { return I{math.Min(x.Lo, y.Lo), math.Max(x.Hi, y.Hi)} }

// HullPoint returns the smallest interval containing x and t. It panics if
// t is NaN.
func (x I) HullPoint(t float64) I {
	if math.IsNaN(t) {
		panic("interval: NaN point")
	}
	return I{math.Min(x.Lo, t), math.Max(x.Hi, t)}
}

// Intersection returns x ∩ y and whether it is nonempty.
func (x I) Intersection(y I) (I, bool) {
	lo, hi := math.Max(x.Lo, y.Lo), math.Min(x.Hi, y.Hi)
	if lo > hi {
		return I{}, false
	}
	return I{lo, hi}, true
}

// Neg returns −x (exact).
func (x I) Neg() I { return I{-x.Hi, -x.Lo} }

// Add returns an enclosure of x + y (tightest).
func (x I) Add(y I) I { return I{AddDown(x.Lo, y.Lo), AddUp(x.Hi, y.Hi)} }

// Sub returns an enclosure of x − y (tightest).
func (x I) Sub(y I) I { return I{SubDown(x.Lo, y.Hi), SubUp(x.Hi, y.Lo)} }

// AddF returns the tightest enclosure of x + t. It panics unless t is
// finite.
func (x I) AddF(t float64) I {
	mustFinite(t)
	return I{AddDown(x.Lo, t), AddUp(x.Hi, t)}
}

// MulF returns the tightest enclosure of x · t, with 0·∞ = 0. It panics
// unless t is finite.
func (x I) MulF(t float64) I {
	mustFinite(t)
	if t >= 0 {
		return I{MulDown(x.Lo, t), MulUp(x.Hi, t)}
	}
	return I{MulDown(x.Hi, t), MulUp(x.Lo, t)}
}

func mustFinite(t float64) {
	if math.IsNaN(t) || math.IsInf(t, 0) {
		panic(fmt.Sprintf("interval: operand %g is not a real number", t))
	}
}

// Mul returns the tightest enclosure of {s·t : s ∈ x, t ∈ y}. Infinite ends
// stand for unbounded sets of reals, so a zero factor against an infinite
// end contributes 0 (0·∞ = 0, IEEE 1788-2015). Each end is the directed
// rounding of the extreme exact product, which is attained at a pair of ends
// chosen by the signs of x and y.
func (x I) Mul(y I) I {
	a, b, c, d := x.Lo, x.Hi, y.Lo, y.Hi
	switch {
	case a >= 0: // x ≥ 0
		switch {
		case c >= 0:
			return I{MulDown(a, c), MulUp(b, d)}
		case d <= 0:
			return I{MulDown(b, c), MulUp(a, d)}
		default:
			return I{MulDown(b, c), MulUp(b, d)}
		}
	case b <= 0: // x ≤ 0
		switch {
		case c >= 0:
			return I{MulDown(a, d), MulUp(b, c)}
		case d <= 0:
			return I{MulDown(b, d), MulUp(a, c)}
		default:
			return I{MulDown(a, d), MulUp(a, c)}
		}
	default: // 0 in the interior of x
		switch {
		case c >= 0:
			return I{MulDown(a, d), MulUp(b, d)}
		case d <= 0:
			return I{MulDown(b, c), MulUp(a, c)}
		default:
			return I{math.Min(MulDown(a, d), MulDown(b, c)), math.Max(MulUp(a, c), MulUp(b, d))}
		}
	}
}

// Sqr returns the tightest enclosure of {t² : t ∈ x}, namely
// [Mig², Mag²] rounded outward (tighter than x.Mul(x) when 0 ∈ x).
func (x I) Sqr() I {
	m, g := x.Mag(), x.Mig()
	return I{MulDown(g, g), MulUp(m, m)}
}

// Div returns an enclosure of {s/t : s ∈ x, t ∈ y}. If 0 ∉ y it is the
// tightest one (an infinite end of y contributes the limit 0). If 0 ∈ y the
// quotient is not defined on all of y and Div returns Entire (sound but
// useless); callers that must reject such cases check y.ContainsZero first.
func (x I) Div(y I) I {
	if y.ContainsZero() {
		return Entire()
	}
	a, b, c, d := x.Lo, x.Hi, y.Lo, y.Hi
	if c > 0 { // y > 0
		switch {
		case a >= 0:
			return I{DivDown(a, d), DivUp(b, c)}
		case b <= 0:
			return I{DivDown(a, c), DivUp(b, d)}
		default:
			return I{DivDown(a, c), DivUp(b, c)}
		}
	}
	// y < 0
	switch {
	case a >= 0:
		return I{DivDown(b, d), DivUp(a, c)}
	case b <= 0:
		return I{DivDown(b, c), DivUp(a, d)}
	default:
		return I{DivDown(b, d), DivUp(a, d)}
	}
}

// DivF returns the tightest enclosure of x / t for finite t ≠ 0 (Entire for
// t = 0). It panics unless t is finite.
func (x I) DivF(t float64) I { return x.Div(Point(t)) }

// Recip returns an enclosure of 1/x (Entire if 0 ∈ x).
func (x I) Recip() I { return I{1, 1}.Div(x) }

// Sqrt returns an enclosure of {√t : t ∈ x} and whether x ⊆ [0, ∞), i.e.
// whether √ is defined on all of x. If not, the returned interval is the
// enclosure over x ∩ [0, ∞) (or [0, 0] if that is empty) and ok is false.
func (x I) Sqrt() (r I, ok bool) {
	ok = x.Lo >= 0
	lo, hi := math.Max(x.Lo, 0), math.Max(x.Hi, 0)
	return I{SqrtDown(lo), SqrtUp(hi)}, ok
}

// Abs returns {|t| : t ∈ x} (exact).
func (x I) Abs() I { return I{x.Mig(), x.Mag()} }

// Min returns {min(s, t) : s ∈ x, t ∈ y} (exact).
func (x I) Min(y I) I { return I{math.Min(x.Lo, y.Lo), math.Min(x.Hi, y.Hi)} }

// Max returns {max(s, t) : s ∈ x, t ∈ y} (exact).
func (x I) Max(y I) I { return I{math.Max(x.Lo, y.Lo), math.Max(x.Hi, y.Hi)} }

// PowInt returns an enclosure of {tⁿ : t ∈ x} for an integer n, with
// x⁰ = [1, 1]. Even powers are enclosed by [Migⁿ, Magⁿ], odd powers
// (increasing) by [Loⁿ, Hiⁿ], each end computed by repeated squaring with
// directed products; n = 1, 2 are tightest. As any product of n factors
// with directed roundings, an end is within relative distance
// (1 + 2⁻⁵²)^(n−1) − 1 of the exact extreme while the intermediates stay in
// the normal range. For n < 0 the result is Entire when 0 ∈ x; otherwise
// each end is 1/t^|n| with t the matching end of x (relative distance
// (1 + 2⁻⁵²)^|n| − 1), and where t^|n| leaves [2⁻¹⁰⁰⁰, 2¹⁰⁰⁰] also
// (1/t)^|n|, whose intermediates cannot overflow when the result is
// representable; the tighter of the two is kept.
func (x I) PowInt(n int) I {
	if n == math.MinInt { // −n overflows; t^(2k) = (t^k)²
		return x.PowInt(n / 2).Sqr()
	}
	if n < 0 {
		if x.ContainsZero() {
			return Entire()
		}
		m := -n
		switch {
		case m%2 == 0: // |t|^−m decreases in |t|
			return I{invPowDown(x.Mag(), m), invPowUp(x.Mig(), m)}
		case x.Lo > 0: // t^−m decreases on t > 0
			return I{invPowDown(x.Hi, m), invPowUp(x.Lo, m)}
		default: // t^−m = −|t|^−m decreases on t < 0
			return I{-invPowUp(-x.Hi, m), -invPowDown(-x.Lo, m)}
		}
	}
	if n == 0 {
		return I{1, 1}
	}
	if n%2 == 0 {
		g, m := x.Mig(), x.Mag()
		return I{powDown(g, n), powUp(m, n)}
	}
	return I{oddPowDown(x.Lo, n), oddPowUp(x.Hi, n)}
}

// powDown returns a float64 ≤ tⁿ for t ≥ 0, n ≥ 1 (repeated squaring with
// downward products: each partial product is ≤ the exact one and all are
// nonnegative, so monotonicity of multiplication keeps the chain sound).
func powDown(t float64, n int) float64 {
	r, b := 1.0, t
	for n > 0 {
		if n&1 == 1 {
			r = MulDown(r, b)
		}
		n >>= 1
		if n > 0 {
			b = MulDown(b, b)
		}
	}
	return r
}

// powUp returns a float64 ≥ tⁿ for t ≥ 0, n ≥ 1.
func powUp(t float64, n int) float64 {
	r, b := 1.0, t
	for n > 0 {
		if n&1 == 1 {
			r = MulUp(r, b)
		}
		n >>= 1
		if n > 0 {
			b = MulUp(b, b)
		}
	}
	return r
}

// invPowDown returns a float64 ≤ t⁻ⁿ for t > 0 (t = +∞ allowed), n ≥ 1:
// the larger of 1/tⁿ and (1/t)ⁿ rounded down, the second only where tⁿ
// leaves [2⁻¹⁰⁰⁰, 2¹⁰⁰⁰].
func invPowDown(t float64, n int) float64 {
	p := powUp(t, n) // > 0
	r := DivDown(1, p)
	if p >= 0x1p-1000 && p <= 0x1p1000 {
		return r
	}
	return math.Max(r, powDown(DivDown(1, t), n))
}

// invPowUp returns a float64 ≥ t⁻ⁿ for t > 0 (t = +∞ allowed), n ≥ 1.
func invPowUp(t float64, n int) float64 {
	p := powDown(t, n) // ≥ 0; 0 if it underflowed
	if p >= 0x1p-1000 && p <= 0x1p1000 {
		return DivUp(1, p)
	}
	r := powUp(DivUp(1, t), n)
	if p > 0 {
		r = math.Min(r, DivUp(1, p))
	}
	return r
}

func oddPowDown(t float64, n int) float64 {
	if t >= 0 {
		return powDown(t, n)
	}
	return -powUp(-t, n)
}

func oddPowUp(t float64, n int) float64 {
	if t >= 0 {
		return powUp(t, n)
	}
	return -powDown(-t, n)
}

// String formats x as [lo, hi] with %g ends. It is for diagnostics only:
// %g rounds to nearest, so use package decimalio for printed bounds.
func (x I) String() string { return fmt.Sprintf("[%g, %g]", x.Lo, x.Hi) }
