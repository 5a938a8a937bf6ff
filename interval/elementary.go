package interval

import (
	"math"
	"math/big"
	"sync"
)

// This file holds what the elementary functions share: the domain error, the
// enclosed constants π, e, ln 2 and their splittings for range reduction, and
// the interval coefficient tables of the Taylor polynomials.
//
// Every constant is enclosed by a series whose terms are exact rationals,
// summed in math/big with each operation rounded toward −∞ (lower sum) or
// +∞ (upper sum), plus an explicit bound of the omitted tail; big.Float
// arithmetic is correctly rounded in the requested mode. The float64 ends
// are then rounded outward. The series (all classical):
//
//	π   = 16 atan(1/5) − 4 atan(1/239)                  (Machin, 1706)
//	atan(1/n) = Σ_k (−1)^k / ((2k+1) n^{2k+1}),  |tail after k terms| ≤ term_k
//	            (alternating series with decreasing terms, Leibniz's test)
//	ln 2 = 2 atanh(1/3) = Σ_k 2 / ((2k+1) 3^{2k+1}),  tail after k terms ≤ (9/8) term_k
//	e    = Σ_k 1/k!,  tail after k ≥ 1 terms ≤ 2/k!
//
// References:
//
//	J.-M. Muller, Elementary Functions: Algorithms and Implementation,
//	3rd ed., Birkhäuser, 2016 (ch. 11: range reduction, Cody–Waite splitting).
//	W. Tucker, Validated Numerics: A Short Introduction to Rigorous
//	Computations, Princeton University Press, 2011 (ch. 3: interval
//	elementary functions).
//	J. M. Borwein, P. B. Borwein, Pi and the AGM, Wiley, 1987 (Machin's formula).

// DomainError reports that a function is not defined on all of an interval
// argument (for example Log of an interval reaching 0). The functions of
// this package never clip such an argument silently.
type DomainError struct {
	Func string // function name, e.g. "log"
	Arg  I      // the argument
}

// Error returns "<func>: not defined on all of the argument [lo, hi]".
func (e *DomainError) Error() string {
	return e.Func + ": not defined on all of the argument " + e.Arg.String()
}

// constPrec is the working precision (bits) of the constants used by the
// float64 paths; the huge-argument trigonometric reduction uses hugePrec.
const constPrec = 256

var (
	piI, halfPiI, ln2I, eI I

	// Cody–Waite splitting of ln 2: ln2Hi has 42 significant bits, so
	// k·ln2Hi is exact for |k| < 2¹¹; ln 2 ∈ ln2Hi + ln2LoI.
	ln2Hi   float64
	ln2LoI  I
	invLn2  float64 // ≈ 1/ln 2, only for choosing k
	sqrtHlf float64 // ≈ √½, only for choosing the log reduction

	// Cody–Waite splitting of π/2: halfPi1, halfPi2 have 30 significant
	// bits each (k·halfPi1, k·halfPi2 exact for |k| < 2²³) and
	// π/2 ∈ halfPi1 + halfPi2 + halfPi3I.
	halfPi1, halfPi2 float64
	halfPi3I         I
	twoOverPi        float64 // ≈ 2/π, only for choosing k

	// invFact[n] ∋ 1/n!.
	invFact [32]I
	// invOdd[k] ∋ 1/(2k+1).
	invOdd [32]I
	// atan(j/4) ∈ atanHi[j] + atanLo[j], j = 0..4 (float plus a tiny
	// interval); likewise π/2 ∈ halfPiHi + halfPiLo.
	atanHi   [5]float64
	atanLo   [5]I
	halfPiHi float64
	halfPiLo I
)

func init() {
	p := uint(constPrec)
	piLo, piHi := piBig(p)
	piI = bigToI(piLo, piHi)
	hpLo := new(big.Float).SetMantExp(piLo, -1)
	hpHi := new(big.Float).SetMantExp(piHi, -1)
	halfPiI = bigToI(hpLo, hpHi)
	twoOverPi = 2 / math.Pi

	halfPi1 = truncBits(hpLo, 30)
	r1Lo := sub(hpLo, halfPi1, p, big.ToNegativeInf)
	r1Hi := sub(hpHi, halfPi1, p, big.ToPositiveInf)
	halfPi2 = truncBits(r1Lo, 30)
	halfPi3I = bigToI(sub(r1Lo, halfPi2, p, big.ToNegativeInf), sub(r1Hi, halfPi2, p, big.ToPositiveInf))

	lLo, lHi := ln2Big(p)
	ln2I = bigToI(lLo, lHi)
	ln2Hi = truncBits(lLo, 42)
	ln2LoI = bigToI(sub(lLo, ln2Hi, p, big.ToNegativeInf), sub(lHi, ln2Hi, p, big.ToPositiveInf))
	invLn2 = 1 / math.Ln2
	sqrtHlf = math.Sqrt(0.5)

	eI = bigToI(eBig(p))

	f := big.NewInt(1)
	for n := range invFact {
		if n > 0 {
			f.Mul(f, big.NewInt(int64(n)))
		}
		invFact[n] = bigToI(recipInt(f, 53, big.ToNegativeInf), recipInt(f, 53, big.ToPositiveInf))
	}
	for k := range invOdd {
		invOdd[k] = Point(1).Div(Point(float64(2*k + 1)))
	}

	// atan(1/4) and atan(1/2) by their series; atan(3/4) = π/4 − atan(1/7)
	// (the addition formula: (1 − 1/7)/(1 + 1/7) = 3/4); atan(1) = π/4.
	qLo, qHi := new(big.Float).SetMantExp(piLo, -2), new(big.Float).SetMantExp(piHi, -2)
	a4Lo, a4Hi := atanInvBig(4, p)
	a2Lo, a2Hi := atanInvBig(2, p)
	a7Lo, a7Hi := atanInvBig(7, p)
	tab := [5][2]*big.Float{
		{new(big.Float), new(big.Float)},
		{a4Lo, a4Hi},
		{a2Lo, a2Hi},
		{subBig(qLo, a7Hi, p, big.ToNegativeInf), subBig(qHi, a7Lo, p, big.ToPositiveInf)},
		{qLo, qHi},
	}
	for j, b := range tab {
		atanHi[j], atanLo[j] = splitBig(b[0], b[1], p)
	}
	halfPiHi, halfPiLo = splitBig(hpLo, hpHi, p)
}

// Pi returns the tightest float64 enclosure of π.
func Pi() I { return piI }

// E returns the tightest float64 enclosure of e.
func E() I { return eI }

// Ln2 returns the tightest float64 enclosure of ln 2.
func Ln2() I { return ln2I }

// SqrtE returns the tightest enclosure of {√t : t ∈ x}, or a *DomainError
// if x.Lo < 0 (√ is then not defined on all of x).
func SqrtE(x I) (I, error) {
	if x.Lo < 0 {
		return Entire(), &DomainError{"sqrt", x}
	}
	r, _ := x.Sqrt()
	return r, nil
}

// bigToI rounds lo down and hi up to float64.
func bigToI(lo, hi *big.Float) I {
	return I{roundBig(lo, big.ToNegativeInf), roundBig(hi, big.ToPositiveInf)}
}

// splitBig returns a float h (a choice near lo) and the outward rounded
// interval l = [lo − h, hi − h], so that [lo, hi] ⊆ h + l.
func splitBig(lo, hi *big.Float, prec uint) (float64, I) {
	h, _ := lo.Float64()
	return h, bigToI(sub(lo, h, prec, big.ToNegativeInf), sub(hi, h, prec, big.ToPositiveInf))
}

// truncBits returns x truncated toward zero to b significant bits (exact
// as a float64 for b ≤ 53 and x in the normal range).
func truncBits(x *big.Float, b uint) float64 {
	f, _ := new(big.Float).SetPrec(b).SetMode(big.ToZero).Set(x).Float64()
	return f
}

// sub returns x − y rounded in mode at prec bits.
func sub(x *big.Float, y float64, prec uint, mode big.RoundingMode) *big.Float {
	return subBig(x, new(big.Float).SetFloat64(y), prec, mode)
}

func subBig(x, y *big.Float, prec uint, mode big.RoundingMode) *big.Float {
	return new(big.Float).SetPrec(prec).SetMode(mode).Sub(x, y)
}

// recipInt returns 1/d rounded in mode at prec bits (d > 0).
func recipInt(d *big.Int, prec uint, mode big.RoundingMode) *big.Float {
	return new(big.Float).SetPrec(prec).SetMode(mode).Quo(big.NewFloat(1), new(big.Float).SetInt(d))
}

// atanInvBig returns lo ≤ atan(1/n) ≤ hi for n ≥ 2 from the alternating
// series Σ (−1)^k/((2k+1) n^{2k+1}); the sum is stopped at the first term
// below 2^−(prec+8), which then bounds the tail (Leibniz).
func atanInvBig(n int64, prec uint) (lo, hi *big.Float) {
	lo = new(big.Float).SetPrec(prec).SetMode(big.ToNegativeInf)
	hi = new(big.Float).SetPrec(prec).SetMode(big.ToPositiveInf)
	eps := new(big.Float).SetMantExp(big.NewFloat(1), -int(prec)-8)
	nn := big.NewInt(n * n)
	pw := big.NewInt(n)
	d := new(big.Int)
	for k := int64(0); ; k++ {
		d.Mul(pw, big.NewInt(2*k+1))
		tLo := recipInt(d, prec, big.ToNegativeInf)
		tHi := recipInt(d, prec, big.ToPositiveInf)
		if tHi.Cmp(eps) < 0 {
			lo.Sub(lo, tHi)
			hi.Add(hi, tHi)
			return lo, hi
		}
		if k%2 == 0 {
			lo.Add(lo, tLo)
			hi.Add(hi, tHi)
		} else {
			lo.Sub(lo, tHi)
			hi.Sub(hi, tLo)
		}
		pw.Mul(pw, nn)
	}
}

// piBig returns lo ≤ π ≤ hi by Machin's formula.
func piBig(prec uint) (lo, hi *big.Float) {
	w := prec + 16
	aLo, aHi := atanInvBig(5, w)
	bLo, bHi := atanInvBig(239, w)
	aLo.SetMantExp(aLo, 4) // ·16, exact
	aHi.SetMantExp(aHi, 4)
	bLo.SetMantExp(bLo, 2) // ·4, exact
	bHi.SetMantExp(bHi, 2)
	return subBig(aLo, bHi, prec, big.ToNegativeInf), subBig(aHi, bLo, prec, big.ToPositiveInf)
}

// ln2Big returns lo ≤ ln 2 ≤ hi from 2 atanh(1/3) = Σ 2/((2k+1) 3^{2k+1});
// consecutive terms shrink by at least 1/9, so the tail after the terms
// summed is at most (9/8)·(first omitted term) ≤ 2·(first omitted term).
func ln2Big(prec uint) (lo, hi *big.Float) {
	lo = new(big.Float).SetPrec(prec).SetMode(big.ToNegativeInf)
	hi = new(big.Float).SetPrec(prec).SetMode(big.ToPositiveInf)
	eps := new(big.Float).SetMantExp(big.NewFloat(1), -int(prec)-8)
	pw := big.NewInt(3)
	nine := big.NewInt(9)
	d := new(big.Int)
	for k := int64(0); ; k++ {
		d.Mul(pw, big.NewInt(2*k+1))
		tLo := recipInt(d, prec, big.ToNegativeInf)
		tHi := recipInt(d, prec, big.ToPositiveInf)
		tLo.SetMantExp(tLo, 1) // 2/d, exact
		tHi.SetMantExp(tHi, 1)
		if tHi.Cmp(eps) < 0 {
			hi.Add(hi, tHi.SetMantExp(tHi, 1))
			return lo, hi
		}
		lo.Add(lo, tLo)
		hi.Add(hi, tHi)
		pw.Mul(pw, nine)
	}
}

// eBig returns lo ≤ e ≤ hi from Σ 1/k!; the tail after the terms with
// k < K is at most 2/K!.
func eBig(prec uint) (lo, hi *big.Float) {
	lo = new(big.Float).SetPrec(prec).SetMode(big.ToNegativeInf)
	hi = new(big.Float).SetPrec(prec).SetMode(big.ToPositiveInf)
	eps := new(big.Float).SetMantExp(big.NewFloat(1), -int(prec)-8)
	f := big.NewInt(1)
	for k := int64(0); ; k++ {
		if k > 0 {
			f.Mul(f, big.NewInt(k))
		}
		tLo := recipInt(f, prec, big.ToNegativeInf)
		tHi := recipInt(f, prec, big.ToPositiveInf)
		if k > 0 && tHi.Cmp(eps) < 0 {
			hi.Add(hi, tHi.SetMantExp(tHi, 1))
			return lo, hi
		}
		lo.Add(lo, tLo)
		hi.Add(hi, tHi)
	}
}

// hugePrec is the precision (bits) of π/2 for the reduction of huge
// trigonometric arguments: |x| < 2¹⁰²⁴ gives |k| < 2¹⁰²⁴, so the error
// |k|·(width of the π/2 enclosure) stays below 2^(1024+2−hugePrec).
const hugePrec = 1400

var (
	hugeOnce           sync.Once
	hugeHPLo, hugeHPHi *big.Float
)

// hugeHalfPi returns lo ≤ π/2 ≤ hi at hugePrec bits, computed once.
func hugeHalfPi() (lo, hi *big.Float) {
	hugeOnce.Do(func() {
		l, h := piBig(hugePrec)
		hugeHPLo = l.SetMantExp(l, -1)
		hugeHPHi = h.SetMantExp(h, -1)
	})
	return hugeHPLo, hugeHPHi
}

// sym returns [−r, r] for r ≥ 0.
func sym(r float64) I { return I{-r, r} }

// horner returns an enclosure of Σ c[i] tⁱ (Horner's scheme in interval
// arithmetic: each step encloses the exact step over all members).
func horner(c []I, t I) I {
	p := c[len(c)-1]
	for i := len(c) - 2; i >= 0; i-- {
		p = p.Mul(t).Add(c[i])
	}
	return p
}
