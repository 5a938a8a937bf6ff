package interval

import (
	"math"
	"math/big"
)

// Trigonometric functions and the arctangent.
//
// References:
//
//	J.-M. Muller, Elementary Functions: Algorithms and Implementation,
//	3rd ed., Birkhäuser, 2016 (ch. 11, additive range reduction).
//	W. Tucker, Validated Numerics, Princeton University Press, 2011.

const (
	trigTerms = 9   // sin: degree 19, cos: degree 18 on |r| ≤ π/4
	atanTerms = 11  // atan: degree 23 on |u| ≤ 3/16
	fastTrig  = 1e6 // |x| ≤ fastTrig: Cody–Waite reduction in float64
)

var (
	sinCoef [trigTerms]I // (−1)^{k+1}/(2k+3)!
	cosCoef [trigTerms]I // (−1)^{k+1}/(2k+2)!
	atnCoef [atanTerms]I // (−1)^{k+1}/(2k+3)
	mask64  = new(big.Int).SetUint64(math.MaxUint64)
)

func init() {
	for k := 0; k < trigTerms; k++ {
		sinCoef[k] = invFact[2*k+3]
		cosCoef[k] = invFact[2*k+2]
		if k%2 == 0 {
			sinCoef[k] = sinCoef[k].Neg()
			cosCoef[k] = cosCoef[k].Neg()
		}
	}
	for k := range atnCoef {
		atnCoef[k] = invOdd[k+1]
		if k%2 == 0 {
			atnCoef[k] = atnCoef[k].Neg()
		}
	}
}

// reduceHalfPi returns k (exact modulo 2⁶⁴), a float rh and an interval
// rl such that x − k·π/2 = rh + ρ for some ρ ∈ rl, for finite x; k is
// chosen near x/(π/2), so |rh + ρ| ≤ π/4 up to a few ulps and rl is small.
//
// For |x| ≤ 10⁶ (|k| < 2²⁰) the Cody–Waite splitting
// π/2 ∈ halfPi1 + halfPi2 + halfPi3I is used: k·halfPi1 and k·halfPi2 are
// exact floats, and the two subtractions are made exact by TwoSum
// (a − b = s + e exactly), so x − k·π/2 ∈ s₂ + (e₁ + e₂ − k·halfPi3I); a
// last TwoSum moves the midpoint of the small part into rh. When the
// result is below 2⁻²⁰ for k ≠ 0 (x near a multiple of π/2), x is reduced
// by the math/big path instead, whose absolute accuracy is far finer.
// Beyond, x (exact) is reduced in math/big with a 1400-bit enclosure
// [p⁻, p⁺] ∋ π/2: x − k·π/2 ∈ [x − k p⁺, x − k p⁻] for k ≥ 0 (swapped for
// k < 0); |x| < 2¹⁰²⁴ makes the width of that enclosure below 2⁻³⁷⁰, so
// every float64 argument, however large, is reduced correctly and tightly.
func reduceHalfPi(x float64) (k int64, rh float64, rl I) {
	if math.Abs(x) <= fastTrig {
		kf := math.Round(float64(x * twoOverPi))
		s1, e1 := twoSum(x, -float64(kf*halfPi1))
		s2, e2 := twoSum(s1, -float64(kf*halfPi2))
		rl = Point(e1).Add(Point(e2)).Sub(halfPi3I.MulF(kf))
		// Fold the bulk of rl into rh (s₂ + m = rh + e₃ exactly) so that
		// the second-order terms in ρ² of the callers stay negligible.
		m := rl.Mid()
		rh, e3 := twoSum(s2, m)
		if kf != 0 && math.Abs(rh) < 0x1p-20 {
			// x is close to a nonzero multiple of π/2: the absolute
			// accuracy of the splitting (about 2⁻⁹⁰) would be a large
			// relative error, so reduce exactly.
			return reduceHuge(x)
		}
		return int64(kf), rh, rl.Sub(Point(m)).Add(Point(e3))
	}
	return reduceHuge(x)
}

// twoSum returns s = fl(a + b) and e with a + b = s + e exactly (Knuth's
// TwoSum; used here only with |a|, |b| ≤ 2²⁰, far from overflow).
func twoSum(a, b float64) (s, e float64) {
	s = a + b
	bb := s - a
	e = (a - (s - bb)) + (b - bb)
	return s, e
}

func reduceHuge(x float64) (int64, float64, I) {
	pLo, pHi := hugeHalfPi()
	const w = 2*hugePrec + 200 // k·p± and x − k·p± are exact at w bits
	X := new(big.Float).SetFloat64(x)
	q := new(big.Float).SetPrec(1200).Quo(X, pLo) // a choice of k
	half := big.NewFloat(0.5)
	if x < 0 {
		half.Neg(half)
	}
	q.Add(q, half)
	kInt, _ := q.Int(nil)
	K := new(big.Float).SetInt(kInt)
	kpLo := new(big.Float).SetPrec(w).SetMode(big.ToNegativeInf).Mul(K, pLo)
	kpHi := new(big.Float).SetPrec(w).SetMode(big.ToPositiveInf).Mul(K, pHi)
	if kInt.Sign() < 0 {
		kpLo.SetMode(big.ToPositiveInf).Mul(K, pLo)
		kpHi.SetMode(big.ToNegativeInf).Mul(K, pHi)
		kpLo, kpHi = kpHi, kpLo
	}
	// Now kpLo ≤ k·π/2 ≤ kpHi.
	rLo := new(big.Float).SetPrec(w).SetMode(big.ToNegativeInf).Sub(X, kpHi)
	rHi := new(big.Float).SetPrec(w).SetMode(big.ToPositiveInf).Sub(X, kpLo)
	rh, _ := rLo.Float64() // a choice
	k := int64(new(big.Int).And(kInt, mask64).Uint64())
	return k, rh, bigToI(sub(rLo, rh, w, big.ToNegativeInf), sub(rHi, rh, w, big.ToPositiveInf))
}

// sinRel encloses sin(r)/r − 1 = Σ_{k≥1} (−1)^k r^{2k}/(2k+1)! by the
// terms through r^{18} and the Lagrange remainder |r|^{20}/21! (that is,
// |sin r − T₁₉(r)| ≤ |r|^{21}/21!, since |sin^{(21)}| ≤ 1).
func sinRel(r2 I, m float64) I {
	rem := MulUp(powUp(m, 2*trigTerms+2), invFact[2*trigTerms+3].Hi)
	return r2.Mul(horner(sinCoef[:], r2)).Add(sym(rem))
}

// cosRel encloses cos(r) − 1 by the terms through r^{18} and the Lagrange
// remainder |r|^{20}/20!.
func cosRel(r2 I, m float64) I {
	rem := MulUp(powUp(m, 2*trigTerms+2), invFact[2*trigTerms+2].Hi)
	return r2.Mul(horner(cosCoef[:], r2)).Add(sym(rem))
}

// sinCosParts returns floats sh, ch and small intervals sl, cl with
// sin(r) ∈ sh + sl and cos(r) ∈ ch + cl for r = rh + ρ, ρ ∈ rl, by Taylor's
// theorem about the float rh,
//
//	sin(rh + ρ) = sin rh + ρ cos rh − (ρ²/2) sin ξ,
//	cos(rh + ρ) = cos rh − ρ sin rh − (ρ²/2) cos ξ,
//
// with sin rh = rh + rh·s' and cos rh = 1 − rh²/2 + rh⁴·c₄(rh) from the series
// of sinRel and cosRel. To round the large terms only once, rh² = q + q'
// exactly (FMA error-free product) and 1 − q/2 = h + h' exactly (TwoSum),
// and everything else is summed first as a small interval.
func sinCosParts(rh float64, rl I) (sh float64, sl I, ch float64, cl I) {
	x := Point(rh)
	m := math.Abs(rh)
	x2 := x.Sqr()
	q := float64(rh * rh)
	qe := math.FMA(rh, rh, -q) // exact for |rh| ≥ 2⁻⁴⁸⁰ (q ≥ 2⁻⁹⁶⁰); q/2 is exact too
	if m < 0x1p-480 {
		qe = 0
		q = 0
	}
	ds := x.Mul(sinRel(x2, m))
	s0 := ds.AddF(rh)
	h, he := twoSum(1, -0.5*q)
	dc := cosQuartic(x2, m).Add(Point(he)).Sub(Point(qe).MulF(0.5))
	if m < 0x1p-480 {
		// rh⁴ terms negligible but enclosed: cos rh − 1 ∈ cosRel.
		dc = cosRel(x2, m)
	}
	c0 := dc.AddF(h)
	rq := rl.Mag()
	e := sym(MulUp(MulUp(rq, rq), 0.5))
	return rh, ds.Add(rl.Mul(c0).Add(e)), h, dc.Sub(rl.Mul(s0).Add(e))
}

// sinCosAt encloses sin(rh + ρ) and cos(rh + ρ), ρ ∈ rl (see sinCosParts).
func sinCosAt(rh float64, rl I) (s, c I) {
	sh, sl, ch, cl := sinCosParts(rh, rl)
	return sl.AddF(sh), cl.AddF(ch)
}

// cosQuartic encloses cos(r) − 1 + r²/2 = Σ_{k≥2} (−1)^k r^{2k}/(2k)! by the
// terms through r^{18} and the Lagrange remainder |r|^{20}/20!.
func cosQuartic(r2 I, m float64) I {
	rem := MulUp(powUp(m, 2*trigTerms+2), invFact[2*trigTerms+2].Hi)
	return r2.Sqr().Mul(horner(cosCoef[1:], r2)).Add(sym(rem))
}

// sinReduced encloses sin(k·π/2 + rh + ρ), ρ ∈ rl.
func sinReduced(k int64, rh float64, rl I) I {
	s, c := sinCosAt(rh, rl)
	switch k & 3 {
	case 0:
		return clipUnit(s)
	case 1:
		return clipUnit(c)
	case 2:
		return clipUnit(s.Neg())
	}
	return clipUnit(c.Neg())
}

func clipUnit(v I) I {
	return I{math.Max(v.Lo, -1), math.Min(v.Hi, 1)}
}

// Sin returns an enclosure of {sin t : t ∈ x}.
//
// At a point: sin(k·π/2 + r) is ±sin r or ±cos r by k mod 4 (reduction in
// reduceHalfPi), with
//
//	sin r = Σ_{j=0}^{9} (−1)^j r^{2j+1}/(2j+1)! + R,  |R| ≤ |r|^{21}/21!,
//	cos r = Σ_{j=0}^{9} (−1)^j r^{2j}/(2j)! + R,      |R| ≤ |r|^{20}/20!
//
// (Lagrange remainders; every derivative of sin and cos is bounded by 1).
// The reduced argument is carried as a float rh plus a small interval and
// expanded about rh to first order with a ρ²/2 remainder (sinCosParts).
// Reduction is exact in math/big beyond 10⁶, so every finite float64
// argument, up to MaxFloat64, gets a tight enclosure.
// On an interval: sin is monotone between consecutive odd multiples of
// π/2; an odd multiple m·π/2 that may lie in x (decided with enclosures of
// the ends' positions k + r/(π/2)) contributes its value ±1, and otherwise
// the range is the hull of the values at the ends. Unbounded x or x wider
// than 7 give [−1, 1].
func Sin(x I) I { return trigRange(x, 0) }

// Cos returns an enclosure of {cos t : t ∈ x}, by the method of Sin with
// cos(k·π/2 + r) = sin((k+1)·π/2 + r); its extrema lie at even multiples
// of π/2.
func Cos(x I) I { return trigRange(x, 1) }

// trigRange encloses sin(t + shift·π/2) over t ∈ x.
func trigRange(x I, shift int64) I {
	if !x.IsBounded() || x.Hi-x.Lo > 7 {
		return I{-1, 1}
	}
	ka, ha, la := reduceHalfPi(x.Lo)
	ka += shift
	if x.IsPoint() {
		return sinReduced(ka, ha, la)
	}
	kb, hb, lb := reduceHalfPi(x.Hi)
	kb += shift
	v := sinReduced(ka, ha, la).Hull(sinReduced(kb, hb, lb))
	lo, hi, ok := multiplesIn(ka, la.AddF(ha), kb, lb.AddF(hb))
	if !ok {
		return I{-1, 1}
	}
	for j := lo; j <= hi; j++ {
		switch (ka + j) & 3 {
		case 1:
			v.Hi = 1
		case 3:
			v.Lo = -1
		}
	}
	return v
}

// multiplesIn returns the range lo..hi of offsets j such that the multiple
// (ka + j)·π/2 may lie in [ka·π/2 + ra, kb·π/2 + rb]: every j outside it is
// proved outside. ok is false if kb − ka is not small.
func multiplesIn(ka int64, ra I, kb int64, rb I) (lo, hi int64, ok bool) {
	d := kb - ka
	if d < 0 || d > 8 {
		return 0, 0, false
	}
	fa := ra.Div(halfPiI)
	fb := rb.Div(halfPiI)
	// (ka + j)π/2 ≥ ka·π/2 + ra needs j ≥ ra/(π/2) ≥ fa.Lo;
	// (ka + j)π/2 ≤ kb·π/2 + rb needs j ≤ d + rb/(π/2) ≤ d + fb.Hi.
	return int64(math.Ceil(fa.Lo)), int64(math.Floor(AddUp(float64(d), fb.Hi))), true
}

// Tan returns an enclosure of {tan t : t ∈ x}, or a *DomainError if x is
// unbounded or may contain an odd multiple of π/2.
//
// At a point t = k·π/2 + r: tan t = tan r for even k and −cot r for odd k,
// tan r = sin r/cos r and cot r = cos r/sin r, formed from the parts of
// sinCosParts by a compensated quotient (tanReduced). tan increases between
// its poles, so on an interval without a pole the range is
// [tan x.Lo, tan x.Hi]; poles are located as the extrema of Sin.
func Tan(x I) (I, error) {
	if !x.IsBounded() {
		return Entire(), &DomainError{"tan", x}
	}
	ka, ha, la := reduceHalfPi(x.Lo)
	if x.IsPoint() {
		v, ok := tanReduced(ka, ha, la)
		if !ok {
			return Entire(), &DomainError{"tan", x}
		}
		return v, nil
	}
	kb, hb, lb := reduceHalfPi(x.Hi)
	lo, hi, ok := multiplesIn(ka, la.AddF(ha), kb, lb.AddF(hb))
	if !ok {
		return Entire(), &DomainError{"tan", x}
	}
	for j := lo; j <= hi; j++ {
		if (ka+j)&1 == 1 {
			return Entire(), &DomainError{"tan", x}
		}
	}
	va, oka := tanReduced(ka, ha, la)
	vb, okb := tanReduced(kb, hb, lb)
	if !oka || !okb {
		return Entire(), &DomainError{"tan", x}
	}
	return I{va.Lo, vb.Hi}, nil
}

// tanReduced encloses tan(k·π/2 + rh + ρ), ρ ∈ rl, as sin/cos (k even) or
// −cos/sin (k odd); ok is false if the divisor may vanish. With
// numerator a + α and divisor b + β (floats a, b; small intervals α, β
// from sinCosParts), q = fl(a/b) and a − q·b is exact for a correctly
// rounded quotient away from underflow (Muller et al., Handbook of
// Floating-Point Arithmetic, 2018, §4.4), so
//
//	(a + α)/(b + β) = q + (a − q·b + α − q·β)/(b + β),
//
// and only the final addition rounds at full size.
func tanReduced(k int64, rh float64, rl I) (I, bool) {
	a, al, b, bl := sinCosParts(rh, rl)
	if k&1 == 1 {
		a, al, b, bl = b, bl, -a, al.Neg()
	}
	den := bl.AddF(b)
	if den.ContainsZero() {
		return Entire(), false
	}
	if !(math.Abs(a) >= 0x1p-900 && math.Abs(b) >= 0x1p-900) {
		return al.AddF(a).Div(den), true
	}
	q := a / b
	if math.IsInf(q, 0) {
		return al.AddF(a).Div(den), true
	}
	r0 := math.FMA(-q, b, a)
	return Point(r0).Add(al).Sub(bl.MulF(q)).Div(den).AddF(q), true
}

// Atan returns an enclosure of {atan t : t ∈ x} (atan increases;
// atan(±∞) = ±π/2).
//
// At a point t ≥ 0 (atan is odd): for t > 1, atan t = π/2 − atan(1/t);
// for 0 ≤ t ≤ 1, with c = j/4 the nearest quarter (c = 0 below 3/16),
// atan t = atan c + atan u, u = (t − c)/(1 + t c), |u| ≤ 3/16 (the
// addition formula, valid as t c > −1), and
//
//	atan u = Σ_{k=0}^{11} (−1)^k u^{2k+1}/(2k+1) + R,
//	|R| ≤ Σ_{k>11} |u|^{2k+1}/(2k+1) ≤ |u|^{25}/(25(1 − u²)) ≤ 1.04|u|^{25}/25.
//
// atan(j/4) and π/2 are held as a float plus a tiny interval (math/big,
// see the constants), so that only the last addition rounds at full size.
func Atan(x I) I {
	if x.IsPoint() {
		return atanPoint(x.Lo)
	}
	return I{atanPoint(x.Lo).Lo, atanPoint(x.Hi).Hi}
}

func atanPoint(t float64) I {
	if t < 0 {
		return atanPoint(-t).Neg()
	}
	if math.IsInf(t, 1) {
		return halfPiI
	}
	if t > 1 {
		// π/2 − atan(1/t) = (π/2)hi − h + (π/2 lo − l), the first
		// difference made exact by TwoSum.
		h, l := atanUnit(Point(1).Div(Point(t)))
		d, e := twoSum(halfPiHi, -h)
		return halfPiLo.Sub(l).AddF(e).AddF(d)
	}
	h, l := atanUnit(Point(t))
	return l.AddF(h)
}

// atanUnit returns a float h and a small interval l with
// atan τ ∈ h + l for every τ ∈ t ⊆ [0, 1].
func atanUnit(t I) (float64, I) {
	j := math.Round(4 * t.Mid())
	if t.Mid() < 0.1875 {
		j = 0 // small results keep their relative accuracy
	}
	c := j / 4
	u := t.Sub(Point(c)).Div(Point(1).Add(t.MulF(c)))
	m := u.Mag()
	if !(m <= 0.19) {
		panic("interval: internal error: atan reduction out of range")
	}
	// 1/(1 − u²) ≤ 1.04 for u² ≤ 0.0361.
	rem := MulUp(powUp(m, 2*atanTerms+3), DivUp(1.04, 2*atanTerms+3))
	u2 := u.Sqr()
	s := u.Add(u.Mul(u2.Mul(horner(atnCoef[:], u2))).Add(sym(rem)))
	return atanHi[int(j)], atanLo[int(j)].Add(s)
}
