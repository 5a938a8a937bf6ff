package certify

import (
	"math"
	"math/big"
	"sort"
	"testing"

	"gapcert/fem/problem"
	"gapcert/interval"
)

// Adversarial checks of stage B on polygons through the driver: ρ̂ is the
// stage-A lower bound of Λ_(N+1) and never anything else, every stage
// bound lies on the right side of the exact eigenvalues for several
// recipes, and separable potentials agree with the 1D certifier.

// TestChooseNUsesOnlyStageA: ρ̂ must be the stage-A lower bound of
// Λ_(N+1) for an N ≥ the requested count whose ρ̂ exceeds the Ritz upper
// bound of Λ_N (the least such N, raised by up to two where that at least
// halves the amplification Λ_m/(ρ̂ − Λ_m) of a least N whose amplification
// exceeds 2), and stage B must not run when there is none (the
// Lehmann–Goerisch theorem needs ρ̂ ≤ Λ_(N+1); only stage A bounds
// Λ_(N+1) from below). Synthetic bounds, index k−1 holding Λ_k.
func TestChooseNUsesOnlyStageA(t *testing.T) {
	p := &problem.Problem{Eigenvalues: 2}
	cases := []struct {
		name         string
		stageA, ritz []float64
		n            int // 0: stage B must not run
		rho          float64
	}{
		{"separated at N = 2", []float64{1, 2, 3.5, 4, 5, 6}, []float64{1.1, 2.1, 3.6, 4.1, 5.1}, 2, 3.5},
		{"cluster up to N = 4", []float64{1, 2, 2.05, 2.08, 7, 8}, []float64{1.1, 2.1, 2.1, 2.1, 7.1}, 4, 7},
		// The Ritz bound of Λ_3 (3.6) is above the stage-A bound of
		// Λ_3 (3.5): N = 2 cannot be certified; N = 3 can.
		// N = 3 would amplify by 3.6/(4 − 3.6) = 9, N = 4 by 2.6.
		{"overlap at N = 2, raised", []float64{1, 2, 3.5, 4, 5, 6}, []float64{1.1, 3.6, 3.7, 4.1, 5.1}, 4, 5},
		// N = 2 amplifies by 2.1/(2.3 − 2.1) = 10.5, N = 3 by 1.1 and N =
		// 4 by 0.72 (not half of 1.1).
		{"close lambda_3, raised", []float64{1, 2, 2.3, 4, 5, 6}, []float64{1.1, 2.1, 2.2, 4.1, 5.1}, 3, 4},
		// The cluster Λ_2..Λ_4 ends at the largest N the bounds allow.
		{"cluster, no room to raise", []float64{1, 2, 2.05, 2.08, 2.09, 9}, []float64{1.1, 2.1, 2.1, 2.1, 2.1}, 5, 9},
		{"never separated", []float64{1, 1, 1, 1, 1, 1}, []float64{2, 2, 2, 2, 2}, 0, 0},
		// The last stage-A bound is for Λ_(len(ritz)+1): N may reach len(ritz).
		{"separated only at the end", []float64{1, 1, 1, 1, 1, 9}, []float64{2, 2, 2, 2, 2}, 5, 9},
	}
	for _, c := range cases {
		out := &outcome{stageA: c.stageA, ritz: c.ritz}
		ok := chooseN(p, out)
		if ok != (c.n > 0) || out.n != c.n || (ok && out.rho != c.rho) {
			t.Errorf("%s: chooseN = %v, N = %d, ρ̂ = %g; want N = %d, ρ̂ = %g", c.name, ok, out.n, out.rho, c.n, c.rho)
		}
		if ok && out.rho != out.stageA[out.n] {
			t.Errorf("%s: ρ̂ = %g is not the stage-A bound %g of Λ_%d", c.name, out.rho, out.stageA[out.n], out.n+1)
		}
	}
}

// equilateralEigenvalues returns the lowest count eigenvalues of the
// equilateral triangle of side 1: (16π²/9)(m² + mn + n²), m, n ≥ 1
// (Dirichlet) or m, n ≥ 0 (Neumann), pairs (m, n) and (n, m) counted
// separately for m ≠ n (Lamé; M. A. Pinsky, SIAM J. Math. Anal. 11 (1980)
// 819–827).
func equilateralEigenvalues(dirichlet bool, count int) []*big.Float {
	start := 0
	if dirichlet {
		start = 1
	}
	var q []int
	for m := start; m < 12; m++ {
		for n := start; n < 12; n++ {
			q = append(q, m*m+m*n+n*n)
		}
	}
	sort.Ints(q)
	pi := bigPi()
	c := new(big.Float).SetPrec(oraclePrec).Mul(pi, pi)
	c.Mul(c, big.NewFloat(16).SetPrec(oraclePrec))
	c.Quo(c, big.NewFloat(9).SetPrec(oraclePrec))
	out := make([]*big.Float, count)
	for i := range out {
		out[i] = new(big.Float).SetPrec(oraclePrec).Mul(c, new(big.Float).SetInt64(int64(q[i])))
	}
	return out
}

// bigBelow reports whether the float x is ≤ the exact value v.
func bigBelow(x float64, v *big.Float) bool {
	return math.IsInf(x, -1) || new(big.Float).SetFloat64(x).Cmp(v) <= 0
}

// TestStageBBoundsAcrossRecipes: for closed-form polygons and several
// recipes of compute (trial degree 3..6, flux degree p − 1 and p, weight
// order 4 and 12, stage-A refinements 2..4), every stage-B bound, ρ̂ and
// every stage-A bound lie below the exact Λ_k = λ_k + γ and every Ritz
// bound above it; and for at least one recipe of each problem stage B
// runs and its bound of Λ_1 is within 10⁻⁵ of the truth (these recipes
// are coarse: refinement 1 of the initial triangulation). Exact values:
// rectangles by separation of variables (rectangleEigenvalues, common
// practice) and the equilateral triangle (equilateralEigenvalues).
func TestStageBBoundsAcrossRecipes(t *testing.T) {
	D, N, R := end{dirichlet: true}, end{}, end{alpha: "1/3"}
	cases := []struct {
		name  string
		src   string
		exact []*big.Float
	}{
		{"Dirichlet 2×1", polygonText(`[["0","0"],["2","0"],["2","1"],["0","1"]]`, "0", []string{sideJSON(D), sideJSON(D), sideJSON(D), sideJSON(D)}, 2),
			rectangleEigenvalues("2", "1", [4]end{D, D, D, D}, 8)},
		{"mixed 2×1", polygonText(`[["0","0"],["2","0"],["2","1"],["0","1"]]`, "0", []string{sideJSON(D), sideJSON(N), sideJSON(R), sideJSON(N)}, 2),
			rectangleEigenvalues("2", "1", [4]end{D, N, R, N}, 8)},
		{"Neumann equilateral", polygonText(`[["0","0"],["1","0"],["1/2","sqrt(3)/2"]]`, "0", []string{sideJSON(N), sideJSON(N), sideJSON(N)}, 2),
			equilateralEigenvalues(false, 8)},
		{"Dirichlet equilateral", polygonText(`[["0","0"],["1","0"],["1/2","sqrt(3)/2"]]`, "0", []string{sideJSON(D), sideJSON(D), sideJSON(D)}, 2),
			equilateralEigenvalues(true, 8)},
	}
	type variant struct{ degree, flux, weight, stageA int }
	variants := []variant{{3, 2, 4, 2}, {4, 3, 12, 3}, {4, 4, 12, 4}, {6, 5, 4, 3}}
	for _, c := range cases {
		p, err := problem.Parse([]byte(c.src))
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		base, err := initialRecipe(p)
		if err != nil {
			t.Fatal(err)
		}
		gamma := new(big.Float).SetFloat64(base.gamma)
		exactL := make([]*big.Float, len(c.exact))
		for i, e := range c.exact {
			exactL[i] = new(big.Float).SetPrec(oraclePrec).Add(e, gamma)
		}
		sharp := false
		for _, v := range variants {
			r := base
			r.degree, r.fluxDegree, r.weightTaylor, r.stageARefine = v.degree, v.flux, v.weight, v.stageA
			out, err := compute(p, r)
			if err != nil {
				t.Fatalf("%s %+v: %v", c.name, v, err)
			}
			for k, u := range out.ritz {
				if new(big.Float).SetFloat64(u).Cmp(exactL[k]) < 0 {
					t.Errorf("%s %+v: Ritz Λ_%d ≤ %.17g below the exact value", c.name, v, k+1, u)
				}
			}
			for k, l := range out.stageA {
				if !bigBelow(l, exactL[k]) {
					t.Errorf("%s %+v: stage A Λ_%d ≥ %.17g above the exact value", c.name, v, k+1, l)
				}
			}
			if out.n == 0 {
				continue
			}
			if out.rho != out.stageA[out.n] || !bigBelow(out.rho, exactL[out.n]) {
				t.Errorf("%s %+v: ρ̂ = %.17g is not a certified lower bound of Λ_%d", c.name, v, out.rho, out.n+1)
			}
			for k, l := range out.lg {
				if !bigBelow(l, exactL[k]) {
					t.Errorf("%s %+v: stage B Λ_%d ≥ %.17g above the exact value", c.name, v, k+1, l)
				}
			}
			if len(out.lg) > 0 {
				e, _ := exactL[0].Float64()
				if (e-out.lg[0])/e < 1e-5 {
					sharp = true
				}
			}
		}
		if !sharp {
			t.Errorf("%s: no recipe gave a stage-B bound of Λ_1 within 1e-5", c.name)
		}
	}
}

// TestStageBSeparablePotentials: on the unit square with Dirichlet sides,
// V = x² + y² and V = 20x separate (common practice): the eigenvalues are
// μ_i + ν_j with μ, ν those of the 1D problems on (0, 1) with potentials x²
// (both directions) or 20x and 0 (ν_j = j²π²). The 2D enclosures from
// stage B must meet the sums of the 1D certifier's enclosures (both
// contain the truth), and be narrow: 10⁻⁵ for 20x; for x² + y² the
// driver stops at 7·10⁻⁵ (λ2 = λ3 double, limited by the weight model's
// remainder), so 2·10⁻⁴ is demanded there.
func TestStageBSeparablePotentials(t *testing.T) {
	one := func(v string) []interval.I {
		src := `{"domain":{"interval":["0","1"]},"potential":"` + v + `","boundary":["dirichlet","dirichlet"],"eigenvalues":3}`
		lambda, _ := enclosures(t, src, 1e-10)
		return lambda
	}
	sq := `[["0","0"],["1","0"],["1","1"],["0","1"]]`
	dir := []string{`"dirichlet"`, `"dirichlet"`, `"dirichlet"`, `"dirichlet"`}
	pi2 := interval.Pi().Sqr()
	for _, c := range []struct {
		v      string
		vx, vy string
		width  float64
	}{{"x^2+y^2", "x^2", "x^2", 2e-4}, {"20*x", "20*x", "0", 1e-5}} {
		mu, nu := one(c.vx), one(c.vy)
		if c.vy == "0" {
			nu = []interval.I{pi2, pi2.MulF(4), pi2.MulF(9)}
		}
		var sums []interval.I
		for _, a := range mu {
			for _, b := range nu {
				sums = append(sums, a.Add(b))
			}
		}
		sort.Slice(sums, func(i, j int) bool { return sums[i].Mid() < sums[j].Mid() })
		p, cert, lambda := certifyPolygon(t, polygonText(sq, c.v, dir, 2), 1e-6)
		if !usedStageB(t, cert) {
			t.Errorf("V = %s: stage B gave no bound", c.v)
		}
		for k, l := range lambda {
			requireOverlap(t, "V = "+c.v+" λ", l, sums[k])
			if w := relWidth(l, scaleOf(p)); w > c.width {
				t.Errorf("V = %s: λ%d = %v is %.2g wide", c.v, k+1, l, w)
			}
		}
	}
}
