package tet

import (
	"math/rand/v2"
	"os"
	"testing"
)

// This file checks the scaled reference tables of rtReference at every
// degree the polyhedron driver may use (k ≤ 12), modulo the prime
// p = 2³¹ − 1, where the exact tests in math/big are too slow:
//
//   - membership in RT_k = P_k³ + x P̃_k: a field σ ∈ P_(k+1)³ lies in
//     RT_k iff its homogeneous part v of degree k + 1 is x h with h
//     homogeneous of degree k, iff x × v(x) = 0 (x_i v_j = x_j v_i and
//     x_i prime to x_j give x_i | v_i; common practice). The coefficient
//     of t^(k+1) in t ↦ x × σ(tx) is x × v(x), and (k + 1)! times it is
//     the (k + 1)-th forward difference of t ↦ x × σ(tx) at t = 0, 1, …,
//     k + 1, evaluated at random x mod p;
//   - the divergence table is the divergence of the component table:
//     ∂_c σ_c(x) = Σ_m L′_m(0) σ_c(x + m e_c) for the Lagrange basis of
//     the nodes m = 0..k + 1 (exact for degree ≤ k + 1), with L′_0(0) =
//     −(1 + 1/2 + … + 1/(k + 1)) and L′_m(0) = (−1)^(m+1) C(k + 1, m)/m
//     (common practice), all mod p;
//   - independence at k = 4, 5 (the degrees between the exact check of
//     TestRTBasisSpansRaviartThomas and the long rank check of
//     TestRTBasisIndependentModPrime): full row rank mod p of the integer
//     coefficient matrix, so a nonzero maximal minor, so independence over
//     the rationals.
//
// Membership and independence of RTDim(k) functions make the basis span
// RT_k; a reduction mod p that vanishes where the rational value does not
// would need p to divide it, so a failure here is a real defect and a
// pass at random points is the check of a polynomial identity mod p.

const rtModPrime = 1<<31 - 1

// rtModP returns v mod p in [0, p) for an integer-valued float.
func rtModP(v float64) uint64 {
	x := int64(v) % rtModPrime
	if x < 0 {
		x += rtModPrime
	}
	return uint64(x)
}

func rtModInv(a uint64) uint64 {
	r, e := uint64(1), uint64(rtModPrime-2)
	for ; e > 0; e >>= 1 {
		if e&1 == 1 {
			r = r * a % rtModPrime
		}
		a = a * a % rtModPrime
	}
	return r
}

// rtModBernstein returns B^n_α(λ) mod p for every α of rtMulti(n).
func rtModBernstein(n int, x [3]uint64) []uint64 {
	var lam [4]uint64
	lam[0] = 1
	for c := 0; c < 3; c++ {
		lam[c+1] = x[c]
		lam[0] = (lam[0] + rtModPrime - x[c]) % rtModPrime
	}
	ix := rtMulti(n)
	out := make([]uint64, len(ix.alpha))
	for m, a := range ix.alpha {
		v := uint64(rtMultinom(a[:]...).Int64() % rtModPrime)
		for j := 0; j < 4; j++ {
			for e := 0; e < a[j]; e++ {
				v = v * lam[j] % rtModPrime
			}
		}
		out[m] = v
	}
	return out
}

// rtModField returns, for every basis function l, the value mod p at the
// point with Bernstein values bern of the table (rows α, columns l).
func rtModField(table []float64, ndof int, bern []uint64) []uint64 {
	out := make([]uint64, ndof)
	for a, b := range bern {
		if b == 0 {
			continue
		}
		row := table[a*ndof : (a+1)*ndof]
		for l, v := range row {
			if v != 0 {
				out[l] = (out[l] + rtModP(v)*b) % rtModPrime
			}
		}
	}
	return out
}

// rtModScaled returns t·x mod p componentwise.
func rtModScaled(t uint64, x [3]uint64) [3]uint64 {
	return [3]uint64{t * x[0] % rtModPrime, t * x[1] % rtModPrime, t * x[2] % rtModPrime}
}

// TestRTBasisInRaviartThomasModPrime checks membership in RT_k and the
// divergence table of every basis function mod p (this file's comment)
// at two random points, for k = 0..8, and with GAPCERT_LONG=1 up to 12.
func TestRTBasisInRaviartThomasModPrime(t *testing.T) {
	kmax := 8
	if os.Getenv("GAPCERT_LONG") == "1" {
		kmax = 12
	}
	rng := rand.New(rand.NewPCG(14, 12))
	for k := 0; k <= kmax; k++ {
		ref := rtReference(k)
		n, nd := ref.n, ref.ndof
		binom := func(a, b int) uint64 { return uint64(rtMultinom(a-b, b).Int64() % rtModPrime) }
		for trial := 0; trial < 2; trial++ {
			var x [3]uint64
			for c := range x {
				x[c] = uint64(rng.Int64N(rtModPrime))
			}
			// Forward difference of order n of t ↦ x × σ(tx).
			var cross [3][]uint64
			for c := range cross {
				cross[c] = make([]uint64, nd)
			}
			for j := 0; j <= n; j++ {
				bern := rtModBernstein(n, rtModScaled(uint64(j), x))
				var s [3][]uint64
				for c := 0; c < 3; c++ {
					s[c] = rtModField(ref.compT[c], nd, bern)
				}
				w := binom(n, j)
				if (n-j)%2 == 1 {
					w = (rtModPrime - w) % rtModPrime
				}
				for l := 0; l < nd; l++ {
					for c := 0; c < 3; c++ {
						a, b := (c+1)%3, (c+2)%3
						v := (x[a]*s[b][l]%rtModPrime + rtModPrime - x[b]*s[a][l]%rtModPrime) % rtModPrime
						cross[c][l] = (cross[c][l] + w*v) % rtModPrime
					}
				}
			}
			for l := 0; l < nd; l++ {
				for c := 0; c < 3; c++ {
					if cross[c][l] != 0 {
						t.Fatalf("k=%d: basis function %d is not in RT_k (x × top part, component %d, is %d mod p)", k, l, c, cross[c][l])
					}
				}
			}
			// Divergence: Σ_c Σ_m L′_m(0) σ_c(x + m e_c) against the table.
			dl := make([]uint64, n+1)
			for m := 1; m <= n; m++ {
				v := binom(n, m) * rtModInv(uint64(m)) % rtModPrime
				if m%2 == 0 {
					v = (rtModPrime - v) % rtModPrime
				}
				dl[m] = v
				dl[0] = (dl[0] + rtModPrime - rtModInv(uint64(m))) % rtModPrime
			}
			diff := make([]uint64, nd)
			for c := 0; c < 3; c++ {
				for m := 0; m <= n; m++ {
					y := x
					y[c] = (y[c] + uint64(m)) % rtModPrime
					s := rtModField(ref.compT[c], nd, rtModBernstein(n, y))
					for l := range diff {
						diff[l] = (diff[l] + dl[m]*s[l]) % rtModPrime
					}
				}
			}
			table := rtModField(ref.divT, nd, rtModBernstein(k, x))
			for l := range diff {
				if diff[l] != table[l] {
					t.Fatalf("k=%d: divergence table of basis function %d is %d mod p, differentiation gives %d", k, l, table[l], diff[l])
				}
			}
		}
	}
}

// TestRTBasisIndependentModPrimeMiddleDegrees checks independence at k =
// 4 and 5 by the rank mod p of the scaled coefficient matrix (this file's
// comment).
func TestRTBasisIndependentModPrimeMiddleDegrees(t *testing.T) {
	for k := 4; k <= 5; k++ {
		if r, nd := rtScaledRankModPrime(k); r != nd {
			t.Fatalf("k=%d: rank %d mod p, want %d", k, r, nd)
		}
	}
}
