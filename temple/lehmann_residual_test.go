package temple

import (
	"math"
	"math/big"
	"math/rand/v2"
	"os"
	"testing"

	"gapcert/enclose"
	"gapcert/interval"
)

// exactLehmann returns the tightest enclosure of the exact Lehmann matrix
// B_ij = Σ_k c_ik c_jk (Λ_k − ρ)²/Λ_k (= A0 − 2ρA1 + ρ²A2 for the pencil
// of package tests, the residual form ρ²(w_i − Tũ_i/ρ, w_j − Tũ_j/ρ) with
// w_i = Kũ_i) for the float ρ, each entry widened by rel of its size.
func exactLehmann(lam []*big.Rat, c [][]*big.Rat, rho float64, rel float64) *enclose.Sym {
	n := len(c)
	b := enclose.NewSym(n)
	r := new(big.Rat).SetFloat64(rho)
	for i := 0; i < n; i++ {
		for j := 0; j <= i; j++ {
			s := new(big.Rat)
			for k := range lam {
				d := new(big.Rat).Sub(lam[k], r)
				d.Mul(d, d).Quo(d, lam[k])
				s.Add(s, d.Mul(d, new(big.Rat).Mul(c[i][k], c[j][k])))
			}
			x := ratInterval(s)
			if rel > 0 {
				h := rel * x.Mag()
				x = interval.I{Lo: interval.SubDown(x.Lo, h), Hi: interval.AddUp(x.Hi, h)}
			}
			b.Set(i, j, x)
		}
	}
	return b
}

// TestRandomSoundnessFromB is TestRandomSoundness for
// LehmannGoerischFromB: random spectra with repeated eigenvalues (so that
// Λ_N = Λ_(N+1) occurs, and ρ̂ = Λ_(N+1) exactly), trial vectors from
// 10⁻¹² to 10⁻¹ away from the eigenvectors (B of size (Λ − ρ̂)²/Λ, narrow
// against A0 and A1) and B enclosed to the ulp or widened up to 10⁻⁸:
// every bound must be ≤ the exact Λ_k, and most must be finite.
// GAPCERT_LONG=1 runs a longer sweep.
func TestRandomSoundnessFromB(t *testing.T) {
	cases := 300
	if os.Getenv("GAPCERT_LONG") == "1" {
		cases = 10000
	}
	rng := rand.New(rand.NewPCG(2026, 1205))
	bounded := 0
	for c := 0; c < cases; c++ {
		dim := 3 + rng.IntN(6)
		n := 1 + rng.IntN(dim-1)
		lam := make([]*big.Rat, dim)
		cur := big.NewRat(int64(1+rng.IntN(5)), int64(1+rng.IntN(3)))
		for k := range lam {
			if k > 0 && rng.IntN(3) != 0 {
				cur = new(big.Rat).Add(cur, big.NewRat(int64(1+rng.IntN(40)), 8))
			}
			lam[k] = cur
		}
		rho, _ := lam[n].Float64()
		if !below(rho, lam[n]) {
			rho = math.Nextafter(rho, 0)
		}
		if rng.IntN(3) == 0 {
			rho *= 0.5 + 0.5*rng.Float64()
		}
		eps := new(big.Rat).SetFloat64(math.Pow(10, -1-11*rng.Float64()))
		coef := trial(n, dim, eps, uint64(c)+7)
		a0, a1, _ := pencil(lam, coef)
		rel := 0.0
		if rng.IntN(2) == 0 {
			rel = math.Pow(10, -8-6*rng.Float64())
		}
		lower, err := LehmannGoerischFromB(a0, a1, exactLehmann(lam, coef, rho, rel), rho)
		if err != nil {
			continue // an undecided case is allowed; a false bound is not
		}
		for k, l := range lower {
			if !below(l, lam[k]) {
				t.Fatalf("case %d: lower[%d] = %v exceeds Λ = %v (ρ = %v, N = %d)", c, k, l, lam[k].RatString(), rho, n)
			}
			if !math.IsInf(l, -1) {
				bounded++
			}
		}
	}
	if bounded < cases/2 {
		t.Errorf("only %d finite bounds in %d cases", bounded, cases)
	}
}
