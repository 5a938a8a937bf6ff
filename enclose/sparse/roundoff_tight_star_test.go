package sparse

import (
	"fmt"
	"math"
	"testing"
)

// star returns the matrix of a star with m leaves, the centre last:
// A_ii = dLeaf, A_ci = aLeaf (c = m the centre), A_cc = aCentre.
func star(m int, dLeaf, aLeaf, aCentre float64) *Sym {
	b := NewBuilder(m + 1)
	for i := 0; i < m; i++ {
		b.Add(i, i, dLeaf)
		b.Add(m, i, aLeaf)
	}
	b.Add(m, m, aCentre)
	return b.Build()
}

// TestRoundoffBoundTightOnStar: a star whose centre pivot is the sum of
// m rounded additions that each err by almost u = 2⁻⁵³ in the same
// direction, so that ‖R‖∞ ≈ m·u while r ≈ c ≈ (m + 2)u: r stays at least
// the exact residual and within a factor 1 + 3/m of it, for both
// algorithms (the multifrontal one adds the leaves' 1×1 update matrices
// into the centre's front, one extend-add per leaf). A bound with half the
// constant c fails here.
//
// Construction: the leaves have d_i = −2⁻⁹³ and A_ci = 2⁻⁷³(1 + 2⁻¹⁰), so
// L_ci = A_ci/d_i = −2²⁰(1 + 2⁻¹⁰) and ũ_ci L_ci = −2⁻⁵³(1 + 2⁻⁹ + 2⁻²⁰)
// are exact; the centre's sum starts at 1 and adds t = 2⁻⁵³(1 + 2⁻⁹ +
// 2⁻²⁰) m times: above 1 the doubles are 2u apart, so 1 + 2ju + t rounds
// up to 1 + 2(j + 1)u with an error of u − (t − u) each time. Row c of R
// is R_cc alone (R_ci = A_ci − L_ci d_i = 0), |R_cc| = m(u − (t − u)),
// and the bound's row c is c(|d_c| + Σ_i |L_ci||d_i|(1 + |L_ci|)) plus
// underflow terms below 2⁻¹⁰⁰⁰: about (m + 2)u(1 + 3mu).
func TestRoundoffBoundTightOnStar(t *testing.T) {
	for _, m := range []int{8, 40, 200} {
		s := star(m, -0x1p-93, 0x1p-73*(1+0x1p-10), 1)
		for _, alg := range []factorAlgorithm{upLooking, multifrontal} {
			tc := exactCase{name: fmt.Sprintf("star of %d leaves", m), k: toISym(s), m: toISym(identity(m + 1)),
				sigma: 0, perm: naturalOrderOf(m + 1)}
			ratio, f, ok := exactRatio(t, tc, alg, 1)
			if !ok {
				t.Fatalf("%s (algorithm %d): factorization failed", tc.name, alg)
			}
			// The centre pivot rounded up m times by u − (t − u) each.
			if want := 1 + float64(2*m)*0x1p-53; f.D[m] != want {
				t.Fatalf("%s (algorithm %d): d_c = %v, want %v (the construction is off)", tc.name, alg, f.D[m], want)
			}
			t.Logf("%s (algorithm %d): r/‖R‖∞ = %.5g", tc.name, alg, ratio)
			if limit := 1 + 3/float64(m); ratio > limit {
				t.Errorf("%s (algorithm %d): r/‖R‖∞ = %.5g above %.4g: the bound is looser than proved", tc.name, alg, ratio, limit)
			}
			if math.IsNaN(ratio) || ratio < 1 {
				t.Errorf("%s (algorithm %d): r/‖R‖∞ = %.5g", tc.name, alg, ratio)
			}
		}
	}
}
