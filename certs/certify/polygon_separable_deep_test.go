package certify

import (
	"testing"

	"gapcert/interval"
)

// TestDeepSeparablePotentialMeetsOneDimensionalSums: V = x² + y² on the
// unit square with Dirichlet sides separates (common practice): λ1 = 2μ1
// and λ2 = λ3 = μ1 + μ2 with μ_k those of −d²u/dx² + x²u on (0, 1), u(0) =
// u(1) = 0. At degree 10 on 128 triangles the 2D enclosures (stage B with
// the residual form of the Lehmann matrix and V ≠ 0 weights) must meet
// the sums of the 1D certifier's enclosures (both contain the truth) and
// be narrow: relative widths measured 5.9e-14 (λ1) and 1.5e-13 (λ2),
// bounds 3e-13 and 1e-12 (the 1D sums at target 1e-12 are about 3e-13
// wide, so the overlap tests agreement at that level).
func TestDeepSeparablePotentialMeetsOneDimensionalSums(t *testing.T) {
	mu, _ := enclosures(t, `{"domain":{"interval":["0","1"]},"potential":"x^2","boundary":["dirichlet","dirichlet"],"eigenvalues":2}`, 1e-12)
	want := [2]interval.I{mu[0].MulF(2), mu[0].Add(mu[1])}
	_, res := certifyRecipe(t, `{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},"potential":"x^2+y^2","boundary":"dirichlet","eigenvalues":2}`, maxPolygonDegree, 3, 0)
	for k := 0; k < 2; k++ {
		requireOverlap(t, "V = x² + y², λ", res.lambda[k], want[k])
		t.Logf("λ%d: 2D %v (relative width %.2g), 1D sums %v", k+1, res.lambda[k], res.widths[k], want[k])
	}
	if !(res.widths[0] <= 3e-13 && res.widths[1] <= 1e-12) {
		t.Errorf("relative widths %.2g, %.2g, want ≤ 3e-13 and 1e-12", res.widths[0], res.widths[1])
	}
}
