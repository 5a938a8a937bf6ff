package algebraic

import (
	"math/big"

	"gapcert/interval"
)

// ReadSurd reads the constant formula text (in the canonical form of
// package formula) as a surd, exactly; ok is false if some step leaves the
// surds — a divisor must be a single nonzero term q·√r, √ needs a rational
// argument ≥ 0, cos and sin an integer multiple of π/12 — or if the
// value's enclosure misses val, the enclosure of the same text by package
// formula.
func ReadSurd(text string, val interval.I) (s Surd, ok bool) {
	return readConst[Surd](surdAlgebra{}, text, val)
}

// surdAlgebra is the algebra of surds for readConst.
type surdAlgebra struct{}

func (surdAlgebra) fromRat(q *big.Rat) Surd         { return NewSurd(q) }
func (surdAlgebra) add(a, b Surd) Surd              { return a.Add(b) }
func (surdAlgebra) mul(a, b Surd) Surd              { return a.Mul(b) }
func (surdAlgebra) neg(a Surd) Surd                 { return a.Neg() }
func (surdAlgebra) rat(a Surd) (*big.Rat, bool)     { return a.Rat() }
func (surdAlgebra) sqrtRat(q *big.Rat) (Surd, bool) { return SqrtSurd(q), true }
func (surdAlgebra) enclose(a Surd) interval.I       { return a.Enclose() }

// maxSurdTerms bounds the number of terms of a surd read: 2^6, the terms
// of a product of sums over six pairwise inequivalent radicands.
const maxSurdTerms = 64

// fits bounds the number of terms and the size of every rational.
func (surdAlgebra) fits(a Surd) bool {
	if len(a) > maxSurdTerms {
		return false
	}
	for _, t := range a {
		if !ratFits(t.q) || !ratFits(t.r) {
			return false
		}
	}
	return true
}

// inv inverts a single nonzero term: 1/(q·√r) = √r/(q·r).
func (surdAlgebra) inv(a Surd) (Surd, bool) {
	if len(a) != 1 {
		return nil, false // 0, or a sum of two or more terms
	}
	q, r := a[0].q, a[0].r
	return Surd{{q: new(big.Rat).Inv(new(big.Rat).Mul(q, r)), r: new(big.Rat).Set(r)}}, true
}

// cosPi returns cos(tπ) when 12t is an integer.
func (surdAlgebra) cosPi(t *big.Rat) (Surd, bool) {
	k := new(big.Rat).Mul(t, big.NewRat(12, 1)) // the angle in units of π/12
	if !k.IsInt() {
		return nil, false
	}
	return cosPiTwelfths(new(big.Int).Mod(k.Num(), big.NewInt(24)).Int64()), true
}

// cosPiTwelfths returns cos(mπ/12) for 0 ≤ m < 24 from the values at
// 0, π/12, …, π/2: 1, (√6 + √2)/4, √3/2, √2/2, 1/2, (√6 − √2)/4, 0 (the
// angles of the 30-60-90 and 45-45-90 triangles and the difference formula
// cos(π/4 − π/6); common practice), with cos(2π − θ) = cos θ and
// cos(π − θ) = −cos θ.
func cosPiTwelfths(m int64) Surd {
	if m > 12 {
		m = 24 - m
	}
	sign := int64(1)
	if m > 6 {
		m, sign = 12-m, -1
	}
	sq := func(a int64) Surd { return SqrtSurd(big.NewRat(a, 1)) }
	var v Surd
	switch m {
	case 0:
		v = NewSurd(big.NewRat(1, 1))
	case 1:
		v = sq(6).Add(sq(2)).Scale(big.NewRat(1, 4))
	case 2:
		v = sq(3).Scale(big.NewRat(1, 2))
	case 3:
		v = sq(2).Scale(big.NewRat(1, 2))
	case 4:
		v = NewSurd(big.NewRat(1, 2))
	case 5:
		v = sq(6).Sub(sq(2)).Scale(big.NewRat(1, 4))
	case 6:
		v = nil
	}
	return v.Scale(big.NewRat(sign, 1))
}
