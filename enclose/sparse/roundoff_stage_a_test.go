package sparse_test

import (
	"math"
	"slices"
	"testing"

	"gapcert/enclose/sparse"
)

// TestRoundoffBoundCubeStageA: on the stage-A pencil of the Dirichlet unit
// cube as the certifier builds it (Crouzeix–Raviart elements on the cone
// mesh refined once and twice: 168 and 1,440 unknowns, interval entries),
// at shifts between the discrete eigenvalues, next to the lowest one and
// next to the threefold second one (relative 1e-12: tiny pivots), the
// a-priori residual bound r is at least the exact residual norm over all
// members, for both algorithms, and the multifrontal factors are the same
// bits on 1 and 8 CPUs. It logs the smallest ratio r/‖R‖∞.
func TestRoundoffBoundCubeStageA(t *testing.T) {
	if testing.Short() {
		t.Skip("exact arithmetic on pencils of up to 1,440 unknowns")
	}
	minRatio, cases := math.Inf(1), 0
	for _, levels := range []int{1, 2} {
		k, m, _ := cubeStageA(t, levels)
		vals, _, err := sparse.LowestEigs(k.Mid(), m.Mid(), 5)
		if err != nil {
			t.Fatal(err)
		}
		// λ_h,1 simple, λ_h,2…4 threefold up to the mesh's asymmetry.
		for _, sigma := range []float64{0.5 * (vals[0] + vals[1]), vals[0] * (1 + 1e-12), vals[2] * (1 - 1e-12), 0.5 * (vals[3] + vals[4])} {
			for _, mf := range []bool{false, true} {
				ratio, d, l, ok := sparse.RoundoffRatio(t, k, m, sigma, mf, 1)
				if !ok {
					t.Errorf("levels %d, σ = %v: factorization failed or r = +∞", levels, sigma)
					continue
				}
				cases++
				minRatio = math.Min(minRatio, ratio)
				t.Logf("levels %d (n = %d), σ = %.10g, multifrontal %v: r/‖R‖∞ = %.4g", levels, k.N(), sigma, mf, ratio)
				if !mf {
					continue
				}
				_, d8, l8, ok := sparse.RoundoffRatio(t, k, m, sigma, mf, 8)
				if !ok || !slices.Equal(d, d8) || !slices.Equal(l, l8) {
					t.Errorf("levels %d, σ = %v: the multifrontal factors on 8 CPUs differ from those on 1", levels, sigma)
				}
			}
		}
	}
	t.Logf("%d factorizations checked, smallest r/‖R‖∞ %.4g", cases, minRatio)
}
