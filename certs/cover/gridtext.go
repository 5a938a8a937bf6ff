package cover

import "math/big"

// gridTextBound bounds the length of the exact text (problem.RatText) of
// every point lo + j·(hi − lo)/N, j = 0 … N, N = count·2^depth: every
// bound a bisection down to depth can give a cell, and so every value a
// corner problem can be given. Each such point has a denominator dividing
// L = lcm(den lo, den hi)·N (both lo and (hi − lo)/N do) and absolute
// value at most M = max(|lo|, |hi|). Written as a fraction n/d, |n| ≤ M·d
// ≤ M·L and d ≤ L; written as a decimal (d = 2^a·5^b), the digits are
// those of |x|·10^k with k = max(a, b) ≤ max(v₂(L), v₅(L)), at most the
// digits of ⌊M·10^k⌋, plus at most 8 characters of point, leading zeros
// or exponent (or 21 characters for a plain integer), and the sign.
func gridTextBound(lo, hi *big.Rat, count, depth int) int {
	den := new(big.Int).GCD(nil, nil, lo.Denom(), hi.Denom())
	L := new(big.Int).Mul(lo.Denom(), hi.Denom())
	L.Quo(L, den)
	N := new(big.Int).Lsh(big.NewInt(int64(count)), uint(depth))
	L.Mul(L, N)
	M := new(big.Rat).Abs(lo)
	if a := new(big.Rat).Abs(hi); a.Cmp(M) > 0 {
		M = a
	}
	sign := 0
	if lo.Sign() < 0 {
		sign = 1
	}
	floorDigits := func(x *big.Rat) int {
		q := new(big.Int).Quo(x.Num(), x.Denom())
		return len(q.String())
	}
	v2 := int(L.TrailingZeroBits())
	v5, rest := 0, new(big.Int).Rsh(L, uint(v2))
	five, m := big.NewInt(5), new(big.Int)
	for {
		q, r := new(big.Int).QuoRem(rest, five, m)
		if r.Sign() != 0 {
			break
		}
		rest, v5 = q, v5+1
	}
	k := max(v2, v5)
	scaled := new(big.Rat).Mul(M, new(big.Rat).SetInt(new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(k)), nil)))
	bound := sign + max(21, floorDigits(scaled)+8)
	if rest.Cmp(big.NewInt(1)) != 0 {
		// Some point may be written as a fraction.
		frac := sign + floorDigits(new(big.Rat).Mul(M, new(big.Rat).SetInt(L))) + 1 + len(L.String())
		bound = max(bound, frac)
	}
	return bound
}
