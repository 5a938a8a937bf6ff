package hypothesis

import (
	"math/big"

	"gapcert/fem/problem"
	"gapcert/interval"
)

// numberSurd returns the exact value of n as a surd, and whether it could
// be read: a rational, or a constant formula whose every step stays among
// the surds (readConst with surdAlgebra): a divisor must be a single
// nonzero term q·√r, √ needs a rational argument ≥ 0, and cos, sin need
// an integer multiple of π/12.
func numberSurd(n problem.Number) (surd, bool) {
	if n.Rat != nil {
		return ratSurd(n.Rat), true
	}
	return readConst[surd](surdAlgebra{}, n.Text, n.Val)
}

// surdAlgebra is the algebra of surds for readConst.
type surdAlgebra struct{}

func (surdAlgebra) fromRat(q *big.Rat) surd         { return ratSurd(q) }
func (surdAlgebra) add(a, b surd) surd              { return a.add(b) }
func (surdAlgebra) mul(a, b surd) surd              { return a.mul(b) }
func (surdAlgebra) neg(a surd) surd                 { return a.neg() }
func (surdAlgebra) rat(a surd) (*big.Rat, bool)     { return a.rat() }
func (surdAlgebra) sqrtRat(q *big.Rat) (surd, bool) { return sqrtRatSurd(q), true }
func (surdAlgebra) enclose(a surd) interval.I       { return a.enclose() }

// maxSurdTerms bounds the number of terms of a surd read: 2^6, the terms
// of a product of sums over six pairwise inequivalent radicands.
const maxSurdTerms = 64

// fits bounds the number of terms and the size of every rational.
func (surdAlgebra) fits(a surd) bool {
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
func (surdAlgebra) inv(a surd) (surd, bool) {
	if len(a) != 1 {
		return nil, false // 0, or a sum of two or more terms
	}
	q, r := a[0].q, a[0].r
	return surd{{q: new(big.Rat).Inv(new(big.Rat).Mul(q, r)), r: new(big.Rat).Set(r)}}, true
}

// cosPi returns cos(tπ) when 12t is an integer.
func (surdAlgebra) cosPi(t *big.Rat) (surd, bool) {
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
func cosPiTwelfths(m int64) surd {
	if m > 12 {
		m = 24 - m
	}
	sign := int64(1)
	if m > 6 {
		m, sign = 12-m, -1
	}
	sq := func(a int64) surd { return sqrtRatSurd(big.NewRat(a, 1)) }
	var v surd
	switch m {
	case 0:
		v = ratSurd(big.NewRat(1, 1))
	case 1:
		v = sq(6).add(sq(2)).scale(big.NewRat(1, 4))
	case 2:
		v = sq(3).scale(big.NewRat(1, 2))
	case 3:
		v = sq(2).scale(big.NewRat(1, 2))
	case 4:
		v = ratSurd(big.NewRat(1, 2))
	case 5:
		v = sq(6).sub(sq(2)).scale(big.NewRat(1, 4))
	case 6:
		v = nil
	}
	return v.scale(big.NewRat(sign, 1))
}
