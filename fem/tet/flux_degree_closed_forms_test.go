package tet

import (
	"math"
	"os"
	"testing"

	"gapcert/fem/boundary"
	"gapcert/interval"
)

// fluxDegreeCase is one closed-form problem of the degree line: a mesh,
// its boundary conditions, the exact λ_1..λ_N, a lower bound of λ_(N+1)
// for ρ, and the trial degree used with flux degree k.
type fluxDegreeCase struct {
	name   string
	mesh   fluxMesh
	bnd    map[int]boundary.Condition
	truth  []interval.I
	next   float64 // ≤ λ_(N+1)
	gamma  float64
	trialP func(k int) int
	// maxRel[k] is the relative width of λ_1 measured when written, times
	// about 2 (+Inf for the cube at k = 1, where the Lehmann–Goerisch
	// bound is −∞: P_3 on six cells is too coarse). Measured with the
	// Whitney basis and with the basis dual to interior moments before it:
	// the same bounds to 12 significant digits for k ≤ 8; at k = 10 the
	// Whitney basis is narrower (cube 2.4e-10 against 2.9e-10, orthoscheme
	// 2.3e-10 against 2.8e-10, Neumann face 4.2e-11 against 8.8e-11, Robin
	// face 6.3e-11 against 1.2e-9).
	maxRel map[int]float64
}

// fluxNeumannRobinRoot encloses the root μ ∈ (0, π/2) of μ tan μ = α
// (Robin condition −u′(0) + αu(0) = 0 and u′(1) = 0 on (0, 1), u =
// cos(μ(1 − x)); common practice), by bisection on the verified sign of
// μ sin μ − α cos μ, which increases from −α to π/2 on [0, π/2].
func fluxNeumannRobinRoot(t *testing.T, alpha float64) interval.I {
	g := func(s float64) int {
		x := interval.Point(s)
		return x.Mul(interval.Sin(x)).Sub(interval.Cos(x).MulF(alpha)).Sign()
	}
	lo, hi := 0.0, 1.5
	if g(lo) != -1 || g(hi) != 1 {
		t.Fatalf("fluxNeumannRobinRoot: no verified sign change on [%g, %g]", lo, hi)
	}
	for i := 0; i < 200 && hi-lo > 1e-15; i++ {
		mid := lo + (hi-lo)/2
		switch g(mid) {
		case -1:
			lo = mid
		case 1:
			hi = mid
		default:
			return interval.I{Lo: lo, Hi: hi}
		}
	}
	return interval.I{Lo: lo, Hi: hi}
}

// fluxDegreeCases returns the closed-form problems of the degree line.
//
//   - Dirichlet unit cube (0, 1)³: λ = π²(a² + b² + c²), a, b, c ≥ 1
//     (separation of variables, common practice): λ_1 = 3π², λ_2 = λ_3 =
//     λ_4 = 6π², λ_5 = 9π².
//   - Orthoscheme 0 ≤ x ≤ y ≤ z ≤ 1, Dirichlet: 14π², 21π², then 26π²
//     (derived by reflection in the cube above TestFluxLehmannGoerischOrthoscheme).
//   - Unit cube, Dirichlet but Neumann at x = 1: λ = (a − ½)²π² + π²(b² +
//     c²), a, b, c ≥ 1 (separation of variables, common practice): λ_1 =
//     2.25π², λ_2 = 4.25π².
//   - Unit cube, Robin −∂_x u + αu = 0 at x = 0 (α = 1), Neumann on the
//     other faces: λ = μ_a² + π²(b² + c²), b, c ≥ 0, with μ_1 < μ_2 < …
//     the roots of μ tan μ = α (separation of variables, common practice);
//     μ_1 ∈ (0, π/2) and μ_2 > π, so λ_1 = μ_1² and λ_2 > π².
func fluxDegreeCases(t *testing.T) []fluxDegreeCase {
	cube := fluxKuhnMesh(1, nil, nil)
	ortho := fluxKuhnMesh(2, func(c [3]float64) bool { return c[0] < c[1] && c[1] < c[2] }, nil)
	mixed := cube.boundaryWhere(func(x [3]float64) boundary.Condition {
		if x[0] == 1 {
			return boundary.Condition{Kind: boundary.Neumann}
		}
		return boundary.Condition{Kind: boundary.Dirichlet}
	})
	robin := cube.boundaryWhere(func(x [3]float64) boundary.Condition {
		if x[0] == 0 {
			return boundary.Condition{Kind: boundary.Robin, Alpha: interval.Point(1)}
		}
		return boundary.Condition{Kind: boundary.Neumann}
	})
	pi2 := math.Pi * math.Pi
	mu := fluxNeumannRobinRoot(t, 1)
	plus := func(a int) func(int) int { return func(k int) int { return k + a } }
	return []fluxDegreeCase{
		{"dirichlet cube", cube, fluxDirichletAll(cube), []interval.I{fluxPiSquaredTimes(3), fluxPiSquaredTimes(6), fluxPiSquaredTimes(6), fluxPiSquaredTimes(6)}, 9 * pi2, 10, plus(2),
			map[int]float64{1: math.Inf(1), 2: 2.7, 3: 0.2, 4: 0.01, 5: 4e-3, 6: 1e-4, 7: 3.2e-5, 8: 3.2e-7, 10: 5e-10}},
		{"orthoscheme", ortho, fluxDirichletAll(ortho), []interval.I{fluxPiSquaredTimes(14), fluxPiSquaredTimes(21)}, 26 * pi2, 100, plus(2),
			map[int]float64{1: 3.7, 2: 2.3, 3: 0.16, 4: 9e-3, 5: 1.2e-3, 6: 6.7e-5, 7: 6.8e-6, 8: 2.4e-7, 10: 4.5e-10}},
		{"neumann at x = 1", cube, mixed, []interval.I{fluxPiSquaredTimes(2.25)}, 4.25 * pi2, 10, plus(2),
			map[int]float64{1: 1.6, 2: 0.28, 3: 0.075, 4: 5.5e-3, 5: 7e-4, 6: 3.4e-5, 7: 2.1e-6, 8: 7.3e-8, 10: 8.3e-11}},
		{"robin at x = 0", cube, robin, []interval.I{mu.Sqr()}, pi2, 1, plus(1),
			map[int]float64{1: 1e-3, 2: 1e-5, 3: 1.3e-8, 4: 5e-11, 5: 7e-12, 6: 1.4e-11, 7: 2.8e-11, 8: 4.4e-11, 10: 1.3e-10}},
	}
}

// TestFluxLehmannGoerischDegreeLineClosedForms runs the Lehmann–Goerisch
// lower bounds with RT_k fluxes for k = 1..4 (with GAPCERT_LONG=1 also
// 5..8 and 10) on the closed forms of fluxDegreeCases: every enclosure
// must contain the exact value, and the relative width of λ_1 must stay
// under the value measured when written (times about 2).
func TestFluxLehmannGoerischDegreeLineClosedForms(t *testing.T) {
	ks := []int{1, 2, 3, 4}
	if os.Getenv("GAPCERT_LONG") == "1" {
		ks = append(ks, 5, 6, 7, 8, 10)
	}
	for _, c := range fluxDegreeCases(t) {
		for _, k := range ks {
			p := c.trialP(k)
			n := len(c.truth)
			rho := (c.next + c.gamma) * (1 - 1e-9)
			r := fluxLGBounds(t, c.mesh, c.bnd, p, k, n, c.gamma, rho)
			for i, tr := range c.truth {
				if !(r.lower[i] <= tr.Lo && tr.Hi <= r.upper[i]) {
					t.Fatalf("%s p=%d k=%d: λ_%d ∈ [%.15g, %.15g] misses %v", c.name, p, k, i+1, r.lower[i], r.upper[i], tr)
				}
			}
			rel := (r.upper[0] - r.lower[0]) / c.truth[0].Mid()
			t.Logf("%s p=%d k=%d: trial %d, flux %d unknowns, λ_1 ∈ [%.14g, %.14g], relative width %.3g (lower error %.3g)",
				c.name, p, k, r.trialN, r.fluxN, r.lower[0], r.upper[0], rel, c.truth[0].Mid()-r.lower[0])
			if m := c.maxRel[k]; rel > m {
				t.Errorf("%s p=%d k=%d: relative width %.3g above %.3g", c.name, p, k, rel, m)
			}
		}
	}
}
