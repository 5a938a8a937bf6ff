package hypothesis

import (
	"math/big"

	"gapcert/interval"
	"gapcert/interval/decimalio"
)

// This file holds exact arithmetic on surds: finite sums Σ q_i √r_i with
// rational q_i and positive rational r_i. They are the numbers of the
// multiquadratic fields Q(√r_1, …, √r_k), closed under +, − and ·, and
// they hold every coordinate, edge vector, squared side length and
// determinant of a polygon whose vertices are rational or built from
// rationals with +, −, ·, division by a nonzero q·√r, √ of a
// nonnegative rational, and cos, sin of integer multiples of π/12
// (other rational multiples of π: cyclotomic.go).
//
// Zero test. Call r and s equivalent when r/s is the square of a
// rational. A surd is kept normalised: terms with equivalent radicands are
// merged (q√r + q'√s = (q + q'·√(s/r))·√r, with √(s/r) rational) and zero
// coefficients dropped. A normalised surd is zero if and only if it has no
// term, because square roots of positive rationals from distinct classes
// are linearly independent over Q: r = a/b ↦ √r = √(ab)/b maps the
// classes one-to-one onto the squarefree parts of the integers ab, and
// the square roots of distinct squarefree positive integers are linearly
// independent over Q (A. S. Besicovitch, On the linear independence of
// fractional powers of integers, J. London Math. Soc. 15 (1940), 3–6).
// Equivalence is decided by exact integer square roots, so no factoring
// is needed.

// surdTerm is q·√r with r > 0.
type surdTerm struct {
	q, r *big.Rat
}

// surd is a normalised sum of terms with pairwise inequivalent radicands
// and nonzero coefficients; the empty surd is 0.
type surd []surdTerm

// ratSurd returns the surd of the rational x.
func ratSurd(x *big.Rat) surd {
	if x.Sign() == 0 {
		return nil
	}
	return surd{{q: new(big.Rat).Set(x), r: big.NewRat(1, 1)}}
}

// sqrtRatSurd returns √x for a rational x ≥ 0.
func sqrtRatSurd(x *big.Rat) surd {
	switch x.Sign() {
	case -1:
		panic("hypothesis: square root of a negative rational")
	case 0:
		return nil
	}
	return normalise(surd{{q: big.NewRat(1, 1), r: new(big.Rat).Set(x)}})
}

// ratSqrt returns √x and true when x ≥ 0 is the square of a rational.
func ratSqrt(x *big.Rat) (*big.Rat, bool) {
	if x.Sign() < 0 {
		return nil, false
	}
	n, d := x.Num(), x.Denom()
	sn, sd := new(big.Int).Sqrt(n), new(big.Int).Sqrt(d)
	if new(big.Int).Mul(sn, sn).Cmp(n) != 0 || new(big.Int).Mul(sd, sd).Cmp(d) != 0 {
		return nil, false
	}
	return new(big.Rat).SetFrac(sn, sd), true
}

// normalise merges the terms of s with equivalent radicands, moves
// rational square radicands to 1 and drops zero coefficients. It returns
// a new surd.
func normalise(s surd) surd {
	var out surd
	for _, t := range s {
		if t.q.Sign() == 0 {
			continue
		}
		merged := false
		for i := range out {
			if f, ok := ratSqrt(new(big.Rat).Quo(t.r, out[i].r)); ok {
				out[i].q.Add(out[i].q, new(big.Rat).Mul(t.q, f))
				merged = true
				break
			}
		}
		if merged {
			continue
		}
		q, r := new(big.Rat).Set(t.q), new(big.Rat).Set(t.r)
		if f, ok := ratSqrt(r); ok {
			q.Mul(q, f)
			r.SetInt64(1)
		}
		out = append(out, surdTerm{q: q, r: r})
	}
	k := 0
	for _, t := range out {
		if t.q.Sign() != 0 {
			out[k] = t
			k++
		}
	}
	return out[:k]
}

func (s surd) isZero() bool { return len(s) == 0 }

// sqrtRat returns √q (q ≥ 0), always a surd.
func (surd) sqrtRat(q *big.Rat) (surd, bool) { return sqrtRatSurd(q), true }

// rat returns the value of s and true when s is rational.
func (s surd) rat() (*big.Rat, bool) {
	switch {
	case len(s) == 0:
		return new(big.Rat), true
	case len(s) == 1 && s[0].r.Cmp(big.NewRat(1, 1)) == 0:
		return new(big.Rat).Set(s[0].q), true
	}
	return nil, false
}

func (s surd) add(t surd) surd { return normalise(append(append(surd{}, s...), t...)) }

func (s surd) neg() surd {
	out := make(surd, len(s))
	for i, a := range s {
		out[i] = surdTerm{q: new(big.Rat).Neg(a.q), r: a.r}
	}
	return out
}

func (s surd) sub(t surd) surd { return s.add(t.neg()) }

func (s surd) mul(t surd) surd {
	var out surd
	for _, a := range s {
		for _, b := range t {
			out = append(out, surdTerm{q: new(big.Rat).Mul(a.q, b.q), r: new(big.Rat).Mul(a.r, b.r)})
		}
	}
	return normalise(out)
}

// scale returns c·s for a rational c.
func (s surd) scale(c *big.Rat) surd { return s.mul(ratSurd(c)) }

// ratioSquare returns a rational w > 0 with s = w²·t and true, if there
// is one (t ≠ 0).
func (s surd) ratioSquare(t surd) (*big.Rat, bool) {
	if len(s) != len(t) || len(t) == 0 {
		return nil, false
	}
	// s = c·t forces c from the term of s equivalent to t's first term.
	var c *big.Rat
	for _, a := range s {
		if f, ok := ratSqrt(new(big.Rat).Quo(a.r, t[0].r)); ok {
			c = new(big.Rat).Quo(new(big.Rat).Mul(a.q, f), t[0].q)
			break
		}
	}
	if c == nil || c.Sign() <= 0 || !s.sub(t.scale(c)).isZero() {
		return nil, false
	}
	return ratSqrt(c)
}

// enclose encloses the value of s in outward-rounded interval arithmetic.
func (s surd) enclose() interval.I {
	var v interval.I
	for _, t := range s {
		r, _ := decimalio.FromRat(t.r).Sqrt() // r > 0
		v = v.Add(decimalio.FromRat(t.q).Mul(r))
	}
	return v
}
