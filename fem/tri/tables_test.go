package tri

import (
	"math/big"
	"testing"
)

// iteratedIntegral returns ∫_0^1 ∫_0^(1−ξ) ξ^a η^b (1 − ξ − η)^c dη dξ over
// the reference triangle (area 1/2) by elementary calculus in math/big:
// (1 − ξ − η)^c is expanded binomially, ∫_0^(1−ξ) η^n dη = (1−ξ)^(n+1)/(n+1)
// and (1 − ξ)^k is expanded again. Independent of the factorial formula.
func iteratedIntegral(a, b, c int) *big.Rat {
	sum := new(big.Rat)
	for i := 0; i <= c; i++ { // (1 − ξ − η)^c = Σ C(c,i) (1 − ξ)^(c−i) (−η)^i
		// ∫ η^(b+i) dη over [0, 1−ξ] = (1−ξ)^(b+i+1)/(b+i+1)
		pw := c - i + b + i + 1
		coef := new(big.Rat).SetFrac(binom(c, i), big.NewInt(int64(b+i+1)))
		if i%2 == 1 {
			coef.Neg(coef)
		}
		// ∫_0^1 ξ^a (1−ξ)^pw = Σ_k C(pw,k) (−1)^k / (a+k+1)
		inner := new(big.Rat)
		for k := 0; k <= pw; k++ {
			t := new(big.Rat).SetFrac(binom(pw, k), big.NewInt(int64(a+k+1)))
			if k%2 == 1 {
				t.Neg(t)
			}
			inner.Add(inner, t)
		}
		sum.Add(sum, coef.Mul(coef, inner))
	}
	return sum
}

// ∫_T λ_0^a λ_1^b λ_2^c = 2|T| a! b! c!/(a+b+c+2)! (Eisenberg–Malvern 1973,
// common practice) against the iterated integral on the reference
// triangle (|T| = 1/2) in math/big, and the enclosed Gram table entries
// against the exact values.
func TestBarycentricIntegralExact(t *testing.T) {
	for a := 0; a <= 6; a++ {
		for b := 0; b <= 6-a; b++ {
			for c := 0; c <= 6-a-b; c++ {
				got := new(big.Rat).Mul(baryIntegralRat([3]int{c, a, b}), big.NewRat(1, 2))
				want := iteratedIntegral(a, b, c)
				if got.Cmp(want) != 0 {
					t.Errorf("∫ξ^%d η^%d λ0^%d: formula %v, iterated %v", a, b, c, got, want)
				}
			}
		}
	}
}

// The degree-1 Gram table is the P1 mass matrix (1 + δ_ij)/12 per unit
// area (common practice), enclosed by points.
func TestGramTableP1(t *testing.T) {
	g := tripleTable(0, 1, 1)
	for i := 0; i < 3; i++ {
		for j := 0; j < 3; j++ {
			want := 1.0 / 12
			if i == j {
				want = 2.0 / 12
			}
			iv := g.IV[i*3+j]
			if !iv.Contains(want) || iv.Wid() > 3e-17 {
				t.Errorf("G[%d][%d] = %v, want %g", i, j, iv, want)
			}
		}
	}
	// Rows of every Gram and triple table sum to ∫B_α/|T| = 1/C(n+2, 2)
	// (partition of unity), exactly in math/big by construction; check the
	// enclosures contain it.
	for _, n := range []int{2, 3, 4} {
		g := tripleTable(0, n, n)
		np := dim(n)
		want := 1.0 / float64(np)
		for a := 0; a < np; a++ {
			lo, hi := 0.0, 0.0
			for b := 0; b < np; b++ {
				lo += g.IV[a*np+b].Lo
				hi += g.IV[a*np+b].Hi
			}
			if !(lo <= want*(1+1e-14) && hi >= want*(1-1e-14)) {
				t.Errorf("degree %d row %d sums to [%g, %g], want %g", n, a, lo, hi, want)
			}
		}
	}
}
