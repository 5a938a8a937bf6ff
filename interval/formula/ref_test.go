package formula

import (
	"fmt"
	"math"
	"math/big"
)

// A reference evaluator over big.Float, for tests only: every operation at
// refPrec bits, elementary functions by argument reduction and Taylor
// series (or Newton's method for log) carried well beyond the precision
// compared against, so its results are accurate to far more than the
// 2⁻¹⁸⁰ relative tolerance the tests allow.

const refPrec = 256

func bf(x float64) *big.Float { return new(big.Float).SetPrec(refPrec).SetFloat64(x) }

func bnew() *big.Float { return new(big.Float).SetPrec(refPrec) }

func badd(a, b *big.Float) *big.Float { return bnew().Add(a, b) }
func bsub(a, b *big.Float) *big.Float { return bnew().Sub(a, b) }
func bmul(a, b *big.Float) *big.Float { return bnew().Mul(a, b) }
func bquo(a, b *big.Float) *big.Float { return bnew().Quo(a, b) }

// tiny term threshold 2⁻³⁰⁰ (relative to arguments of size ≤ 1).
var bEps = new(big.Float).SetMantExp(big.NewFloat(1), -300)

func bexp(x *big.Float) *big.Float {
	// exp(x) = exp(x/2^k)^(2^k) with |x/2^k| < 2⁻⁸.
	if x.Sign() == 0 {
		return bf(1)
	}
	k := 0
	r := bnew().Set(x)
	for r.MantExp(nil) > -8 {
		r.SetMantExp(r, -1)
		k++
	}
	sum, term := bf(1), bf(1)
	for n := 1; ; n++ {
		term = bquo(bmul(term, r), bf(float64(n)))
		sum = badd(sum, term)
		if bnew().Abs(term).Cmp(bEps) < 0 {
			break
		}
	}
	for ; k > 0; k-- {
		sum = bmul(sum, sum)
	}
	return sum
}

func blog(x *big.Float) *big.Float {
	if x.Sign() <= 0 {
		panic("blog of non-positive")
	}
	// Halley's iteration y ← y + 2(x − e^y)/(x + e^y) from a float guess.
	mant := bnew()
	e := x.MantExp(mant)
	m, _ := mant.Float64()
	y := bf(math.Log(m))
	for i := 0; i < 6; i++ {
		ey := bexp(y)
		y = badd(y, bquo(bmul(bf(2), bsub(mant, ey)), badd(mant, ey)))
	}
	return badd(y, bmul(bf(float64(e)), bln2()))
}

func bln2() *big.Float {
	// ln 2 = 2 atanh(1/3) = 2 Σ (1/3)^(2n+1)/(2n+1)
	third := bquo(bf(1), bf(3))
	sum, p := bnew(), bnew().Set(third)
	ninth := bmul(third, third)
	for n := 0; ; n++ {
		t := bquo(p, bf(float64(2*n+1)))
		sum = badd(sum, t)
		if t.Cmp(bEps) < 0 {
			break
		}
		p = bmul(p, ninth)
	}
	return bmul(sum, bf(2))
}

// batanSmall sums the series for |x| ≤ 1/4.
func batanSmall(x *big.Float) *big.Float {
	sum, p := bnew(), bnew().Set(x)
	x2 := bmul(x, x)
	for n := 0; ; n++ {
		t := bquo(p, bf(float64(2*n+1)))
		if n%2 == 0 {
			sum = badd(sum, t)
		} else {
			sum = bsub(sum, t)
		}
		if bnew().Abs(t).Cmp(bEps) < 0 {
			break
		}
		p = bmul(p, x2)
	}
	return sum
}

func batan(x *big.Float) *big.Float {
	// atan x = 2 atan(x/(1 + √(1 + x²))), applied until |x| < 1/4.
	k := 0
	r := bnew().Set(x)
	for bnew().Abs(r).Cmp(bf(0.25)) > 0 {
		r = bquo(r, badd(bf(1), bnew().Sqrt(badd(bf(1), bmul(r, r)))))
		k++
	}
	s := batanSmall(r)
	return s.SetMantExp(s, k)
}

func bpi() *big.Float {
	// Machin: π = 16 atan(1/5) − 4 atan(1/239).
	return bsub(bmul(bf(16), batanSmall(bquo(bf(1), bf(5)))), bmul(bf(4), batanSmall(bquo(bf(1), bf(239)))))
}

func bsincos(x *big.Float) (s, c *big.Float) {
	twoPi := bmul(bf(2), bpi())
	z := badd(bquo(x, twoPi), bf(0.5))
	nInt, acc := z.Int(nil)
	if z.Sign() < 0 && acc != big.Exact {
		nInt.Sub(nInt, big.NewInt(1))
	}
	r := bsub(x, bmul(twoPi, bnew().SetInt(nInt))) // x − 2π·round(x/2π), |r| ≤ π
	const k = 10
	r.SetMantExp(r, -k)
	s, c = bnew(), bnew()
	term := bf(1)
	for n := 0; ; n++ {
		if n > 0 {
			term = bquo(bmul(term, r), bf(float64(n)))
		}
		switch n % 4 {
		case 0:
			c = badd(c, term)
		case 1:
			s = badd(s, term)
		case 2:
			c = bsub(c, term)
		case 3:
			s = bsub(s, term)
		}
		if n > 4 && bnew().Abs(term).Cmp(bEps) < 0 {
			break
		}
	}
	for i := 0; i < k; i++ {
		s, c = bmul(bf(2), bmul(s, c)), bsub(bmul(c, c), bmul(s, s))
	}
	return s, c
}

// refEvalOK is refEval that reports false where the reference arithmetic
// itself breaks down (big.Float overflow to ∞ followed by ∞/∞ or ∞−∞).
func refEvalOK(n *node, env map[string]*big.Float) (v *big.Float, ok bool) {
	defer func() {
		if r := recover(); r != nil {
			if _, nan := r.(big.ErrNaN); !nan {
				panic(r)
			}
			v, ok = nil, false
		}
	}()
	v = refEval(n, env)
	return v, !v.IsInf()
}

// refEval evaluates n at the point env (exact values) in big.Float.
// Interval constants evaluate to their lower end.
func refEval(n *node, env map[string]*big.Float) *big.Float {
	switch n.kind {
	case kNum:
		return bnew().SetRat(n.rat)
	case kConst:
		if n.name == "pi" {
			return bpi()
		}
		return bexp(bf(1))
	case kInterval:
		return refEval(n.a, env)
	case kVar:
		v, ok := env[n.name]
		if !ok {
			panic("refEval: unbound " + n.name)
		}
		return v
	}
	a := refEval(n.a, env)
	var b *big.Float
	if n.b != nil {
		b = refEval(n.b, env)
	}
	switch n.kind {
	case kNeg:
		return bnew().Neg(a)
	case kAdd:
		return badd(a, b)
	case kSub:
		return bsub(a, b)
	case kMul:
		return bmul(a, b)
	case kDiv:
		return bquo(a, b)
	case kPow:
		if r := n.b.rat; r != nil && r.IsInt() {
			k := r.Num().Int64()
			p := bf(1)
			for i := int64(0); i < abs64(k); i++ {
				p = bmul(p, a)
			}
			if k < 0 {
				p = bquo(bf(1), p)
			}
			return p
		}
		if a.Sign() == 0 && b.Sign() > 0 {
			return bnew() // 0^b = 0 for b > 0
		}
		return bexp(bmul(b, blog(a)))
	}
	switch n.fn {
	case fExp:
		return bexp(a)
	case fLog:
		return blog(a)
	case fSin:
		s, _ := bsincos(a)
		return s
	case fCos:
		_, c := bsincos(a)
		return c
	case fTan:
		s, c := bsincos(a)
		return bquo(s, c)
	case fAtan:
		return batan(a)
	case fTanh:
		// tanh a = 1 − 2/(e^{2a} + 1), also for large |a|.
		return bsub(bf(1), bquo(bf(2), badd(bexp(bmul(bf(2), a)), bf(1))))
	case fSinh, fCosh:
		ea := bexp(a)
		ei := bquo(bf(1), ea)
		sh, ch := bquo(bsub(ea, ei), bf(2)), bquo(badd(ea, ei), bf(2))
		if n.fn == fSinh {
			return sh
		}
		return ch
	case fSqrt:
		return bnew().Sqrt(a)
	case fAbs:
		return bnew().Abs(a)
	case fMin:
		if a.Cmp(b) < 0 {
			return a
		}
		return b
	case fMax:
		if a.Cmp(b) > 0 {
			return a
		}
		return b
	}
	panic(fmt.Sprint("refEval: unknown node ", n.kind))
}

func abs64(k int64) int64 {
	if k < 0 {
		return -k
	}
	return k
}

// refContains reports whether the interval x contains v up to a relative
// tolerance of 2⁻¹⁸⁰ (far below one ulp of float64) plus an absolute one
// of 2⁻²⁴⁰ for the error of the reference evaluation (log near 1, for
// example, is accurate to about 2⁻²⁵⁰ absolutely, not relatively).
func refContains(x [2]float64, v *big.Float) bool {
	tol := bnew().Abs(v)
	tol.SetMantExp(tol, -180)
	tol = badd(tol, new(big.Float).SetMantExp(big.NewFloat(1), -240))
	lo := bsub(v, tol)
	hi := badd(v, tol)
	return !(math.IsNaN(x[0]) || math.IsNaN(x[1])) &&
		(math.IsInf(x[0], -1) || bf(x[0]).Cmp(hi) <= 0) &&
		(math.IsInf(x[1], 1) || bf(x[1]).Cmp(lo) >= 0)
}
