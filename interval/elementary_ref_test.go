package interval

import (
	"math"
	"math/big"
	"sync"
)

// Reference evaluations in math/big at ≥ 400 bits (> 120 digits), written
// independently of the implementation: other series and identities than the
// package uses (Gauss's formula for π, ln 2 = Σ 1/(k 2^k), exp by argument
// halving and squaring, log by Newton's method on exp, sin/cos by their
// Taylor series after exact reduction, atan by argument halving). The
// precision grows with the argument's binary exponent so that tiny
// arguments (sin x = x − x³/6…) keep their relative correction terms.
// Every reference is cross-checked with a second formula in
// TestReferenceSelfConsistency.

const refBasePrec = 400

func refPrec(x float64) uint {
	p := uint(refBasePrec)
	if x != 0 && !math.IsInf(x, 0) {
		_, e := math.Frexp(x)
		if e < 0 {
			p += uint(-2 * e)
		}
	}
	return p
}

func elBF(prec uint) *big.Float { return new(big.Float).SetPrec(prec) }

func elBFFloat(x float64, prec uint) *big.Float { return elBF(prec).SetFloat64(x) }

func elBFInt(n int64, prec uint) *big.Float { return elBF(prec).SetInt64(n) }

// refAtanInv returns atan(1/n) by its alternating series.
func refAtanInv(n int64, prec uint) *big.Float {
	sum := elBF(prec)
	pw := elBFInt(n, prec) // n^{2k+1}
	nn := elBFInt(n*n, prec)
	eps := new(big.Float).SetMantExp(big.NewFloat(1), -int(prec)-4)
	for k := int64(0); ; k++ {
		t := elBF(prec).Quo(elBFInt(1, prec), elBF(prec).Mul(pw, elBFInt(2*k+1, prec)))
		if t.Cmp(eps) < 0 {
			return sum
		}
		if k%2 == 0 {
			sum.Add(sum, t)
		} else {
			sum.Sub(sum, t)
		}
		pw.Mul(pw, nn)
	}
}

// refMaxPrec bounds every precision the references ask for (400 + 2·1074
// bits for subnormal arguments, 464 + 1024 for the largest ones).
const refMaxPrec = 2800

var (
	refConstOnce sync.Once
	refPiMax     *big.Float
	refLn2Max    *big.Float
)

func refConsts() {
	refConstOnce.Do(func() {
		w := uint(refMaxPrec + 20)
		// Gauss: π = 48 atan(1/18) + 32 atan(1/57) − 20 atan(1/239)
		// (Borwein & Borwein, Pi and the AGM, Wiley, 1987).
		s := elBF(w).Mul(elBFInt(48, w), refAtanInv(18, w))
		s.Add(s, elBF(w).Mul(elBFInt(32, w), refAtanInv(57, w)))
		s.Sub(s, elBF(w).Mul(elBFInt(20, w), refAtanInv(239, w)))
		refPiMax = s
		// ln 2 = Σ_{k≥1} 1/(k 2^k).
		sum := elBF(w)
		eps := new(big.Float).SetMantExp(big.NewFloat(1), -int(w))
		for k := int64(1); ; k++ {
			t := elBF(w).Quo(elBFInt(1, w), new(big.Float).SetMantExp(elBFInt(k, w), int(k)))
			if t.Cmp(eps) < 0 {
				break
			}
			sum.Add(sum, t)
		}
		refLn2Max = sum
	})
}

// refPi returns π (Gauss's formula) rounded to prec ≤ refMaxPrec bits.
func refPi(prec uint) *big.Float {
	refConsts()
	return elBF(prec).Set(refPiMax)
}

// refLn2 returns ln 2 (Σ 1/(k 2^k)) rounded to prec ≤ refMaxPrec bits.
func refLn2(prec uint) *big.Float {
	refConsts()
	return elBF(prec).Set(refLn2Max)
}

// refExp returns e^x: x = k ln 2 + r, e^r = (e^{r/2^16})^{2^16} with the
// Taylor series for the small argument.
func refExp(x *big.Float, prec uint) *big.Float {
	w := prec + 40
	ln2 := refLn2(w + 64)
	q, _ := elBF(w).Quo(x, ln2).Float64()
	k := math.Round(q)
	r := elBF(w+64).Sub(x, elBF(w+64).Mul(elBFFloat(k, w+64), ln2))
	const halvings = 16
	r.SetMantExp(r, -halvings)
	sum, term := elBFInt(1, w), elBFInt(1, w)
	eps := new(big.Float).SetMantExp(big.NewFloat(1), -int(w))
	for n := int64(1); ; n++ {
		term.Mul(term, r)
		term.Quo(term, elBFInt(n, w))
		if new(big.Float).Abs(term).Cmp(eps) < 0 {
			break
		}
		sum.Add(sum, term)
	}
	for i := 0; i < halvings; i++ {
		sum.Mul(sum, sum)
	}
	return sum.SetMantExp(sum, int(k))
}

// refLog returns ln x (x > 0) by Newton's method y ← y − 1 + x e^{−y}.
func refLog(x *big.Float, prec uint) *big.Float {
	w := prec + 20
	m := new(big.Float)
	e := x.MantExp(m) // x = m·2^e, m ∈ [0.5, 1)
	mf, _ := m.Float64()
	y := elBFFloat(math.Log(mf), w) // a starting guess only
	eps := new(big.Float).SetMantExp(big.NewFloat(1), -int(w))
	for range 12 {
		d := elBF(w).Mul(m, refExp(elBF(w).Neg(y), w))
		d.Sub(d, elBFInt(1, w))
		y.Add(y, d)
		if new(big.Float).Abs(d).Cmp(eps) < 0 {
			break
		}
	}
	return y.Add(y, elBF(w).Mul(elBFInt(int64(e), w), refLn2(w)))
}

// refSinCos returns sin x and cos x: x = k π/2 + r exactly (π to enough
// bits for the exponent of x), then Taylor series.
func refSinCos(x float64) (s, c *big.Float) {
	return refSinCosBig(elBFFloat(x, 64), refPrec(x))
}

func refSinCosBig(x *big.Float, prec uint) (s, c *big.Float) {
	pw := prec + 64
	if ex := x.MantExp(nil); ex > 0 {
		pw += uint(ex)
	}
	hp := new(big.Float).SetMantExp(refPi(pw), -1)
	X := elBF(pw).Set(x)
	q := elBF(pw).Quo(X, hp)
	kInt, _ := q.Int(nil) // truncation: |r| < π/2
	r := elBF(pw).Sub(X, elBF(pw).Mul(new(big.Float).SetInt(kInt), hp))
	w := prec + 20
	r.SetPrec(w)
	sr, cr := elBFInt(0, w), elBFInt(1, w)
	term := elBFInt(1, w)
	eps := new(big.Float).SetMantExp(big.NewFloat(1), -int(w)-10)
	if r.Sign() != 0 && r.MantExp(nil) < 0 {
		eps.SetMantExp(eps, r.MantExp(nil)) // relative to |r| for tiny r
	}
	for n := int64(1); ; n++ {
		term.Mul(term, r)
		term.Quo(term, elBFInt(n, w))
		if term.Sign() == 0 || new(big.Float).Abs(term).Cmp(eps) < 0 && n > 2 {
			break
		}
		switch n % 4 {
		case 1:
			sr.Add(sr, term)
		case 2:
			cr.Sub(cr, term)
		case 3:
			sr.Sub(sr, term)
		case 0:
			cr.Add(cr, term)
		}
	}
	switch new(big.Int).And(kInt, big.NewInt(3)).Int64() {
	case 0:
		return sr, cr
	case 1:
		return cr, elBF(w).Neg(sr)
	case 2:
		return elBF(w).Neg(sr), elBF(w).Neg(cr)
	default:
		return elBF(w).Neg(cr), sr
	}
}

// refAtan returns atan x: three halvings atan t = 2 atan(t/(1 + √(1+t²)))
// bring |t| below tan(π/16) < 0.2, then the alternating series.
func refAtan(x float64) *big.Float {
	prec := refPrec(x)
	w := prec + 20
	t := elBFFloat(x, w)
	if math.IsInf(x, 0) {
		hp := new(big.Float).SetMantExp(refPi(w), -1)
		if x < 0 {
			hp.Neg(hp)
		}
		return hp
	}
	for range 3 {
		d := elBF(w).Mul(t, t)
		d.Add(d, elBFInt(1, w))
		d.Sqrt(d)
		d.Add(d, elBFInt(1, w))
		t.Quo(t, d)
	}
	t2 := elBF(w).Mul(t, t)
	sum, term := elBF(w).Set(t), elBF(w).Set(t)
	eps := new(big.Float).SetMantExp(big.NewFloat(1), -int(w)-10)
	for k := int64(1); ; k++ {
		term.Mul(term, t2)
		a := elBF(w).Quo(term, elBFInt(2*k+1, w))
		if a.Sign() == 0 || new(big.Float).Abs(a).Cmp(new(big.Float).Mul(eps, new(big.Float).Abs(sum))) < 0 {
			break
		}
		if k%2 == 1 {
			sum.Sub(sum, a)
		} else {
			sum.Add(sum, a)
		}
	}
	return sum.SetMantExp(sum, 3)
}

// refSinhCosh returns sinh x and cosh x: the Taylor series for |x| < 1/2,
// otherwise (e^x ∓ e^{−x})/2.
func refSinhCosh(x float64) (s, c *big.Float) {
	prec := refPrec(x)
	w := prec + 40
	X := elBFFloat(x, w)
	if math.Abs(x) < 0.5 {
		s, c = elBF(w).Set(X), elBFInt(1, w)
		term := elBFInt(1, w)
		eps := new(big.Float).SetMantExp(big.NewFloat(1), -int(w)-10)
		if x != 0 {
			eps.SetMantExp(eps, X.MantExp(nil)) // relative to |x|
		}
		for n := int64(1); ; n++ {
			term.Mul(term, X)
			term.Quo(term, elBFInt(n, w))
			if n > 1 {
				if n%2 == 1 {
					s.Add(s, term)
				} else {
					c.Add(c, term)
				}
			}
			if term.Sign() == 0 || n > 3 && new(big.Float).Abs(term).Cmp(eps) < 0 {
				return s, c
			}
		}
	}
	ep := refExp(X, w)
	em := elBF(w).Quo(elBFInt(1, w), ep)
	s = elBF(w).Sub(ep, em)
	c = elBF(w).Add(ep, em)
	return s.SetMantExp(s, -1), c.SetMantExp(c, -1)
}
