package certify

import "testing"

// TestSmallStageASpace computes with stage-A spaces smaller than
// the number of bounded eigenvalues (a recipe a certificate may record:
// stage_a_cells 1 or 2): every lower bound of Λ_k must stay ≤ the exact
// Λ_k = (kπ)² + γ of −u″ on (0, 1) with Dirichlet ends (common practice).
func TestSmallStageASpace(t *testing.T) {
	p := parseProblem(t, `{"domain":{"interval":["0","1"]},"potential":"0","boundary":["dirichlet","dirichlet"],"eigenvalues":2}`)
	for _, cells := range []int{1, 2, 3} {
		r, err := initialRecipe(p)
		if err != nil {
			t.Fatal(err)
		}
		r.stageACells = cells
		out, err := compute(p, r)
		if err != nil {
			t.Logf("stage-A cells %d: %v", cells, err)
			continue
		}
		for k, l := range out.stageA {
			exact := piSq(float64(k + 1)).AddF(r.gamma).Hi
			if l > exact {
				t.Errorf("stage-A cells %d: lower bound %v of Lambda_%d above the exact %v", cells, l, k+1, exact)
			}
		}
		for k, l := range out.lg {
			exact := piSq(float64(k + 1)).AddF(r.gamma).Hi
			if l > exact {
				t.Errorf("stage-A cells %d: stage-B bound %v of Lambda_%d above the exact %v", cells, l, k+1, exact)
			}
		}
		t.Logf("cells %d gamma %v: stageA %v lg %v n %d", cells, r.gamma, out.stageA, out.lg, out.n)
	}
}
