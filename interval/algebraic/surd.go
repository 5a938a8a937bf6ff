package algebraic

import (
	"math/big"
	"slices"

	"gapcert/interval"
	"gapcert/interval/decimalio"
)

// This file holds the arithmetic of surds; the zero test rests on
// Besicovitch's theorem (see the package documentation).

// surdTerm is q·√r with r > 0.
type surdTerm struct {
	q, r *big.Rat
}

// Surd is an exact real number Σ q_i·√r_i, kept as a normalised sum of
// terms with pairwise inequivalent radicands and nonzero coefficients; the
// empty (nil) Surd is 0. Values are immutable: operations return new ones.
type Surd []surdTerm

// NewSurd returns the surd of the rational x.
func NewSurd(x *big.Rat) Surd {
	if x.Sign() == 0 {
		return nil
	}
	return Surd{{q: new(big.Rat).Set(x), r: big.NewRat(1, 1)}}
}

// SqrtSurd returns √x for a rational x ≥ 0; it panics if x < 0.
func SqrtSurd(x *big.Rat) Surd {
	switch x.Sign() {
	case -1:
		panic("algebraic: square root of a negative rational")
	case 0:
		return nil
	}
	return normalise(Surd{{q: big.NewRat(1, 1), r: new(big.Rat).Set(x)}})
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
func normalise(s Surd) Surd {
	var out Surd
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
	return slices.DeleteFunc(out, func(t surdTerm) bool { return t.q.Sign() == 0 })
}

// IsZero reports whether s is 0, exactly.
func (s Surd) IsZero() bool { return len(s) == 0 }

// SqrtRat returns √q (q ≥ 0), always a surd.
func (Surd) SqrtRat(q *big.Rat) (Surd, bool) { return SqrtSurd(q), true }

// Rat returns the value of s and true when s is rational.
func (s Surd) Rat() (*big.Rat, bool) {
	switch {
	case len(s) == 0:
		return new(big.Rat), true
	case len(s) == 1 && s[0].r.Cmp(big.NewRat(1, 1)) == 0:
		return new(big.Rat).Set(s[0].q), true
	}
	return nil, false
}

// Add returns s + t.
func (s Surd) Add(t Surd) Surd { return normalise(append(append(Surd{}, s...), t...)) }

// Neg returns −s.
func (s Surd) Neg() Surd {
	out := make(Surd, len(s))
	for i, a := range s {
		out[i] = surdTerm{q: new(big.Rat).Neg(a.q), r: a.r}
	}
	return out
}

// Sub returns s − t.
func (s Surd) Sub(t Surd) Surd { return s.Add(t.Neg()) }

// Mul returns s·t.
func (s Surd) Mul(t Surd) Surd {
	var out Surd
	for _, a := range s {
		for _, b := range t {
			out = append(out, surdTerm{q: new(big.Rat).Mul(a.q, b.q), r: new(big.Rat).Mul(a.r, b.r)})
		}
	}
	return normalise(out)
}

// Scale returns c·s for a rational c.
func (s Surd) Scale(c *big.Rat) Surd { return s.Mul(NewSurd(c)) }

// RatioSquare returns a rational w > 0 with s = w²·t and true, if there
// is one (t ≠ 0).
func (s Surd) RatioSquare(t Surd) (*big.Rat, bool) {
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
	if c == nil || c.Sign() <= 0 || !s.Sub(t.Scale(c)).IsZero() {
		return nil, false
	}
	return ratSqrt(c)
}

// Enclose encloses the value of s in outward-rounded interval arithmetic.
func (s Surd) Enclose() interval.I {
	var v interval.I
	for _, t := range s {
		r, _ := decimalio.FromRat(t.r).Sqrt() // r > 0
		v = v.Add(decimalio.FromRat(t.q).Mul(r))
	}
	return v
}
