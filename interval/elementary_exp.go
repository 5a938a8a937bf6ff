package interval

import "math"

// Exponential, logarithm, hyperbolic functions and powers.
//
// References:
//
//	J.-M. Muller, Elementary Functions: Algorithms and Implementation,
//	3rd ed., Birkhäuser, 2016.
//	W. Tucker, Validated Numerics, Princeton University Press, 2011.

// Degrees of the Taylor polynomials (chosen so that the Lagrange remainder
// is below 2⁻⁶⁰ relative on the reduced ranges).
const (
	expDegree  = 16 // e^r − 1, |r| ≤ 0.35: 3·0.35¹⁷/17! < 2⁻⁷²
	logTerms   = 12 // atanh(s), |s| ≤ 0.1716
	hypTerms   = 12 // sinh, cosh, |x| ≤ 2
	tanhTerms  = 10 // tanh correction, |x| ≤ 1
	expHuge    = 1000
	hypDirect  = 2.0 // |x| ≤ hypDirect: sinh, cosh by their own series
	tanhDirect = 1.0
)

var (
	expm1Coef [expDegree - 1]I // 1/(i+2)!, i = 0..expDegree−2
	logCoef   [logTerms]I      // 1/(2k+3), k = 0..logTerms−1
	sinhCoef  [hypTerms]I      // 1/(2k+3)!
	coshCoef  [hypTerms]I      // 1/(2k+2)!
	tanhCoef  [tanhTerms]I     // 2(k+1)/(2k+3)!
)

func init() {
	for i := range expm1Coef {
		expm1Coef[i] = invFact[i+2]
	}
	for k := range logCoef {
		logCoef[k] = invOdd[k+1]
	}
	for k := range sinhCoef {
		sinhCoef[k] = invFact[2*k+3]
		coshCoef[k] = invFact[2*k+2]
	}
	for k := range tanhCoef {
		tanhCoef[k] = invFact[2*k+3].MulF(float64(2 * (k + 1)))
	}
}

// Exp returns an enclosure of {eᵗ : t ∈ x}. exp increases, so the ends are
// enclosures at x.Lo and x.Hi; exp(−∞) = 0, and a result beyond MaxFloat64
// has the upper end +∞ (exp(710) = [MaxFloat64, +∞]).
//
// At a point t: t = k·ln 2 + r with k = round(t/ln 2) (a choice) and r
// enclosed by the Cody–Waite splitting r ∈ (t − k·ln2Hi) − k·ln2LoI, so
// |r| ≤ 0.347; then e^t = 2^k (1 + (e^r − 1)) with
//
//	e^r − 1 = Σ_{i=1}^{16} rⁱ/i! + R,  |R| ≤ e^{|r|} |r|¹⁷/17! ≤ 3 |r|¹⁷/17!
//
// (Taylor's theorem with the Lagrange remainder), and the power of two
// applied by directed multiplications.
func Exp(x I) I {
	if x.IsPoint() {
		return expPoint(x.Lo)
	}
	return I{expPoint(x.Lo).Lo, expPoint(x.Hi).Hi}
}

// expPoint encloses e^t for a single float64 t (±∞ allowed).
func expPoint(t float64) I {
	switch {
	case t == 0:
		return I{1, 1}
	case t > expHuge: // e^1000 > 2^1024
		return I{math.MaxFloat64, math.Inf(1)}
	case t < -expHuge: // 0 < e^−1000 < 2^−1074
		if math.IsInf(t, -1) {
			return I{0, 0}
		}
		return I{0, math.SmallestNonzeroFloat64}
	}
	k, p := expParts(t)
	return scale2(p, k)
}

// expParts returns k and an enclosure p of e^r with e^t = 2^k e^r exactly,
// for |t| ≤ expHuge.
func expParts(t float64) (int, I) {
	kf := math.Round(float64(t * invLn2))
	r := Point(t).Sub(Point(float64(kf * ln2Hi))).Sub(ln2LoI.MulF(kf))
	return int(kf), expm1Series(r).AddF(1)
}

// expm1Series encloses e^r − 1 for |r| ≤ 1/2 by the Taylor polynomial of
// degree expDegree with the Lagrange remainder e^{|r|}|r|^{n+1}/(n+1)!,
// e^{|r|} ≤ 3. The sum is formed as r + r·(r·q(r)) so that its rounding
// error is relative to the result.
func expm1Series(r I) I {
	m := r.Mag()
	if !(m <= 0.5) {
		panic("interval: internal error: exp reduction out of range")
	}
	rem := MulUp(MulUp(powUp(m, expDegree+1), invFact[expDegree+1].Hi), 3)
	q := horner(expm1Coef[:], r)
	return r.Add(r.Mul(r.Mul(q)).Add(sym(rem)))
}

// scale2 returns an enclosure of 2^k·p, |k| ≤ 2100, by two directed
// multiplications with exact powers of two.
func scale2(p I, k int) I {
	k1 := k / 2
	k2 := k - k1
	return p.MulF(math.Ldexp(1, k1)).MulF(math.Ldexp(1, k2))
}

// Log returns an enclosure of {ln t : t ∈ x}, or a *DomainError unless
// x.Lo > 0. ln increases, so the ends are enclosures at x.Lo and x.Hi
// (ln(+∞) = +∞).
//
// At a point t = m·2^e with m ∈ [√½, √2) (exact, math.Frexp):
// ln t = e·ln 2 + ln m and ln m = 2 atanh(s), s = (m − 1)/(m + 1),
// |s| ≤ 0.1716, with
//
//	atanh(s) = Σ_{k=0}^{12} s^{2k+1}/(2k+1) + R,
//	|R| ≤ Σ_{k>12} |s|^{2k+1}/(2k+1) ≤ |s|^{27}/(27·(1 − s²))
//
// (the tail of the power series, bounded by a geometric series). e·ln 2 is
// formed with the Cody–Waite splitting (e·ln2Hi exact), and s is carried
// as a float plus a small interval (see logParts) so that only the last
// addition rounds at full size.
func Log(x I) (I, error) {
	if !(x.Lo > 0) {
		return Entire(), &DomainError{"log", x}
	}
	if x.IsPoint() {
		return logPoint(x.Lo), nil
	}
	return I{logPoint(x.Lo).Lo, logPoint(x.Hi).Hi}, nil
}

// logPoint encloses ln t for t > 0 (t = +∞ allowed).
func logPoint(t float64) I {
	if math.IsInf(t, 1) {
		return I{math.MaxFloat64, math.Inf(1)}
	}
	h, l := logParts(t)
	return l.AddF(h)
}

// logParts returns a float h and an interval l with ln t ∈ h + l for
// finite t > 0; l is small (about 2⁻⁶⁰|ln t| wide), so h + l carries
// about 110 bits.
//
// t = m·2^e, m ∈ [√½, √2), and s = (m − 1)/(m + 1) is formed as a pair
// s = sh + σ: n = m − 1 is exact (Sterbenz's lemma, m/1 ∈ [½, 2]),
// m + 1 = dh + dl exactly (TwoSum), sh = fl(n/dh), and n − sh·dh is
// exact for a correctly rounded quotient (Muller et al., Handbook of
// Floating-Point Arithmetic, 2018, §4.4), so σ = (n − sh·dh − sh·dl)/(dh + dl)
// is enclosed in interval arithmetic. Then, by the mean value theorem,
// atanh(sh + σ) = atanh(sh) + σ/(1 − ξ²) with 1 ≤ 1/(1 − ξ²) ≤ 1.031
// (ξ² ≤ 0.0296), and atanh(sh) = sh + T with T enclosed by the series of
// Log. Finally ln t = e·ln2Hi + 2sh + (e·ln2LoI + 2T + 2σ[1, 1.031]), the
// first two terms joined by TwoSum.
func logParts(t float64) (float64, I) {
	m, e := math.Frexp(t)
	if m < sqrtHlf {
		m *= 2
		e--
	}
	n := m - 1
	dh, dl := twoSum(m, 1)
	sh := n / dh
	r0 := math.FMA(-sh, dh, n)
	sigma := Point(r0).Sub(Point(sh).Mul(Point(dl))).Div(Point(dh).Add(Point(dl)))
	sm := math.Abs(sh) + sigma.Mag()
	if !(sm < 0.172) {
		panic("interval: internal error: log reduction out of range")
	}
	x := Point(sh)
	s2 := x.Sqr()
	// Tail of the atanh series: |s|^{27}/(27(1 − s²)) ≤ |s|^{27}/(27·0.97).
	rem := MulUp(powUp(math.Abs(sh), 2*logTerms+3), DivUp(1, MulDown(float64(2*logTerms+3), 0.97)))
	tail := x.Mul(s2.Mul(horner(logCoef[:], s2))).Add(sym(rem))
	ef := float64(e)
	h, e1 := twoSum(float64(ef*ln2Hi), 2*sh)
	l := Point(e1).Add(ln2LoI.MulF(ef)).Add(tail.MulF(2)).Add(sigma.Mul(I{1, 1.031}).MulF(2))
	return h, l
}

// Sinh returns an enclosure of {sinh t : t ∈ x} (sinh increases).
//
// For |t| ≤ 2 by its Taylor polynomial,
//
//	sinh t = Σ_{k=0}^{12} t^{2k+1}/(2k+1)! + R,  |R| ≤ cosh(2)|t|^{27}/27! ≤ 4|t|^{27}/27!
//
// (Lagrange remainder; |sinh^{(27)}| = cosh ≤ cosh 2 on [−2, 2]); for
// |t| > 2 as 2^{k−1}e^r − 2^{−k−1}e^{−r} with e^t = 2^k e^r from Exp's
// reduction (the subtraction loses less than two bits there).
func Sinh(x I) I {
	if x.IsPoint() {
		return sinhPoint(x.Lo)
	}
	return I{sinhPoint(x.Lo).Lo, sinhPoint(x.Hi).Hi}
}

func sinhPoint(t float64) I {
	if t < 0 {
		return sinhPoint(-t).Neg()
	}
	if t > expHuge {
		return I{math.MaxFloat64, math.Inf(1)}
	}
	if t <= hypDirect {
		if t < 0x1p-600 {
			// t < sinh t ≤ t + t³ < t + ulp(t) (0 < t ≤ 1, t³ < 2⁻¹⁸⁰⁰).
			if t == 0 {
				return I{0, 0}
			}
			return I{t, math.Nextafter(t, 1)}
		}
		x := Point(t)
		x2 := x.Sqr()
		rem := MulUp(MulUp(powUp(t, 2*hypTerms+3), invFact[2*hypTerms+3].Hi), 4)
		return x.Add(x.Mul(x2.Mul(horner(sinhCoef[:], x2))).Add(sym(rem)))
	}
	k, p := expParts(t)
	return scale2(p, k-1).Sub(scale2(p.Recip(), -k-1))
}

// Cosh returns an enclosure of {cosh t : t ∈ x}. cosh is even and
// increases in |t|, so the range is [cosh(mig x), cosh(mag x)].
//
// For |t| ≤ 2 by its Taylor polynomial,
//
//	cosh t = Σ_{k=0}^{12} t^{2k}/(2k)! + R,  |R| ≤ cosh(2)|t|^{26}/26! ≤ 4|t|^{26}/26!
//
// (Lagrange remainder), for |t| > 2 as 2^{k−1}e^r + 2^{−k−1}e^{−r}.
func Cosh(x I) I {
	if x.IsPoint() {
		return coshPoint(math.Abs(x.Lo))
	}
	return I{coshPoint(x.Mig()).Lo, coshPoint(x.Mag()).Hi}
}

func coshPoint(t float64) I {
	if t > expHuge {
		return I{math.MaxFloat64, math.Inf(1)}
	}
	if t <= hypDirect {
		x2 := Point(t).Sqr()
		rem := MulUp(MulUp(powUp(t, 2*hypTerms+2), invFact[2*hypTerms+2].Hi), 4)
		if t < 0x1p-480 {
			return x2.Mul(horner(coshCoef[:], x2)).Add(sym(rem)).AddF(1)
		}
		// 1 + t²/2 = h + h' + q'/2 exactly (t² = q + q' by FMA, q/2 exact,
		// TwoSum), so only the final addition rounds at full size.
		q := float64(t * t)
		qe := math.FMA(t, t, -q)
		h, he := twoSum(1, 0.5*q)
		quart := x2.Sqr().Mul(horner(coshCoef[1:], x2)).Add(sym(rem))
		return quart.Add(Point(he)).Add(Point(qe).MulF(0.5)).AddF(h)
	}
	k, p := expParts(t)
	return scale2(p, k-1).Add(scale2(p.Recip(), -k-1))
}

// Tanh returns an enclosure of {tanh t : t ∈ x} (tanh increases; the
// result lies in [−1, 1]).
//
// For |t| ≤ 1: tanh t = t − t·w/cosh t with
// w = (t cosh t − sinh t)/t = Σ_{k≥1} 2k t^{2k}/(2k+1)!; the ratio of
// consecutive terms is t²/(2k(2k+3)) ≤ 1/10, so the tail after k = 10 is at
// most 2·22 t^{22}/23!. For |t| > 1: tanh |t| = 1 − 2/(e^{2|t|} + 1).
func Tanh(x I) I {
	if x.IsPoint() {
		return tanhPoint(x.Lo)
	}
	return I{tanhPoint(x.Lo).Lo, tanhPoint(x.Hi).Hi}
}

func tanhPoint(t float64) I {
	if t < 0 {
		return tanhPoint(-t).Neg()
	}
	if t == 0 {
		return I{0, 0}
	}
	if t < 0x1p-600 {
		// t − t³ ≤ tanh t < t and t³ < ulp(t)/2 (0 < t ≤ 1).
		return I{math.Nextafter(t, 0), t}
	}
	if t <= tanhDirect {
		x := Point(t)
		x2 := x.Sqr()
		n := tanhTerms + 1
		rem := MulUp(MulUp(powUp(t, 2*n), invFact[2*n+1].Hi), float64(4*n))
		w := x2.Mul(horner(tanhCoef[:], x2)).Add(sym(rem))
		c := coshPoint(t)
		r := x.Sub(x.Mul(w).Div(c))
		return I{r.Lo, math.Min(r.Hi, 1)}
	}
	if t > expHuge/2 {
		return I{math.Nextafter(1, 0), 1}
	}
	k, p := expParts(2 * t)
	u := scale2(p, k).AddF(1)
	q := Point(2).Div(u)
	return I{SubDown(1, q.Hi), math.Min(SubUp(1, q.Lo), 1)}
}

// Pow returns an enclosure of {s^t : s ∈ x, t ∈ y}.
//
// If y is a point integer n, the result is x.PowInt(n) for any x, and a
// *DomainError if n < 0 and 0 ∈ x. Otherwise x^y = exp(y·ln x), which
// requires x.Lo > 0; x.Lo == 0 is allowed when y.Lo > 0 (then 0^t = 0 is
// the infimum). Every other x gives a *DomainError. On a box, y·ln x is a
// product of two intervals and takes its extremes at corners, and exp
// increases, so the range is the hull of the values at the four corners.
// At a corner (s, t): ln s ∈ h + l (logParts), t·h = p + p' exactly
// (FMA error-free product), and e^{p + p' + t·l} is enclosed by the
// reduction of Exp applied to p with the small interval p' + t·l added to
// the reduced argument.
func Pow(x, y I) (I, error) {
	if y.IsPoint() && y.Lo == math.Trunc(y.Lo) && !math.IsInf(y.Lo, 0) {
		n := y.Lo
		if n < 0 && x.ContainsZero() {
			return Entire(), &DomainError{"pow", x}
		}
		if math.Abs(n) < 1<<62 {
			return x.PowInt(int(n)), nil
		}
		// |n| ≥ 2⁶² is even: x^n = |x|^n.
		x = x.Abs()
		if x.Lo == 0 { // here n > 0
			return powBox(I{x.Hi, x.Hi}, y).HullPoint(0), nil
		}
		return powBox(x, y), nil
	}
	switch {
	case x.Lo > 0:
		return powBox(x, y), nil
	case x.Lo == 0 && y.Lo > 0:
		if x.Hi == 0 {
			return I{0, 0}, nil
		}
		return powBox(I{x.Hi, x.Hi}, y).HullPoint(0), nil
	}
	return Entire(), &DomainError{"pow", x}
}

// powBox encloses {s^t : s ∈ x, t ∈ y} for x.Lo > 0.
func powBox(x, y I) I {
	if !x.IsBounded() || !y.IsBounded() {
		l, _ := Log(x)
		return Exp(y.Mul(l))
	}
	v := powPoint(x.Lo, y.Lo)
	for _, c := range [3][2]float64{{x.Lo, y.Hi}, {x.Hi, y.Lo}, {x.Hi, y.Hi}} {
		w := powPoint(c[0], c[1])
		v = I{math.Min(v.Lo, w.Lo), math.Max(v.Hi, w.Hi)}
	}
	return v
}

// powPoint encloses s^t for finite s > 0 and finite t.
func powPoint(s, t float64) I {
	if t == 0 || s == 1 {
		return I{1, 1}
	}
	h, l := logParts(s)
	p := float64(t * h)
	if !(math.Abs(p) <= 800 && math.Abs(p) >= 0x1p-900) {
		// Overflow, underflow or a tiny exponent: the plain composition.
		return Exp(Point(t).Mul(l.AddF(h)))
	}
	pe := math.FMA(t, h, -p) // t·h − p, exact as |p| ≥ 2⁻⁹⁰⁰
	d := Point(pe).Add(l.MulF(t))
	kf := math.Round(float64(p * invLn2))
	r := Point(p).Sub(Point(float64(kf * ln2Hi))).Sub(ln2LoI.MulF(kf)).Add(d)
	return scale2(expm1Series(r).AddF(1), int(kf))
}
