package certify

import (
	"math"
	"testing"

	"gapcert/interval"
)

// robinNeumannRoot returns the least positive root of μ tan μ = alpha
// (alpha > 0), in (0, π/2), by bisection to the last bit: −u″ = μ²u on
// (0, 1) with u′(0) = 0 and u′(1) + alpha·u(1) = 0 has u = cos(μz) and
// −μ sin μ + alpha cos μ = 0 (elementary).
func robinNeumannRoot(alpha float64) float64 {
	lo, hi := 0.0, math.Pi/2
	for hi-lo > 0 {
		mid := lo + (hi-lo)/2
		if mid == lo || mid == hi {
			break
		}
		if mid*math.Tan(mid) < alpha {
			lo = mid
		} else {
			hi = mid
		}
	}
	return lo
}

// TestLPrismMixedGradedRitz checks that every boundary triangle of a
// graded trial mesh gets its face's condition: on the L-shaped prism with
// Dirichlet sides, a Neumann bottom and a Robin top (α = 1), graded once
// toward the re-entrant edge, the Ritz upper bounds of λ1 and λ2 at P_3
// lie above λ_i(L) + μ1² (separation of variables; μ1 = 0.86033… the
// least root of μ tan μ = 1, robinNeumannRoot; λ1(L), λ2(L) as in
// lPrismNeumannEnds) and within 5e-3 relative of them (measured 1.8e-3
// and 1.1e-3 on 491 tetrahedra). The top taken as Neumann would give λ1 near 9.64, below
// λ1(L) + μ1² = 10.38; taken as Dirichlet, near λ1(L) + π²/4 = 12.11
// (bottom Neumann) or 19.5.
func TestLPrismMixedGradedRitz(t *testing.T) {
	p := parseProblem(t, lPrismPolyhedron(`["neumann", {"robin": "1"}, "dirichlet", "dirichlet", "dirichlet", "dirichlet", "dirichlet", "dirichlet"]`))
	r := firstRecipe(t, p)
	r.degree, r.fluxDegree, r.refine, r.stageARefine, r.graded = 3, 3, 1, 1, 1
	out := computeRecipe(t, p, r)
	mu := robinNeumannRoot(1)
	for i, l := range []float64{lShapeLambda1, lShapeLambda2} {
		want := l + mu*mu
		upper := interval.Point(out.ritz[i]).Sub(interval.Point(r.gamma)).Hi
		rel := (upper - want) / want
		t.Logf("λ%d: Ritz upper bound %.17g, λ%d(L) + μ1² = %.17g, relative error %.2e (%d tetrahedra)", i+1, upper, i+1, want, rel, out.polyhedron.tetrahedra)
		if upper < want || rel > 5e-3 {
			t.Errorf("λ%d: Ritz upper bound %.17g, want at most 5e-3 above %.17g", i+1, upper, want)
		}
	}
}
