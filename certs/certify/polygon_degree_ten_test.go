package certify

import (
	"fmt"
	"math"
	"testing"

	"gapcert/fem/problem"
)

// closedFormPolygon is a polygon whose λ1 and λ2 lie in [lo[k], hi[k]]
// (equal ends for a closed form; a bracket from domain monotonicity
// otherwise), with the widest relative widths a degree-10 step on one
// uniform level must reach.
type closedFormPolygon struct {
	name      string
	src       string
	lo, hi    [2]float64
	maxWidths [2]float64 // relative widths of λ1 and λ2 at degree 10
}

// robinRoot returns the k-th positive root of tan x = −x (k = 1, 2), by
// Newton's method from a start within 1e-9 of it, in float64: the
// eigenvalues of X″ = −x²X on (0, 1) with X(0) = 0 and X′(1) + X(1) = 0.
// Starts: 2.0287578381 and 4.9131804394 (roots of tan x = −x, recalled
// from memory; Newton converges to the float nearest the root, about
// 1e-16 relative, from any start this close).
func robinRoot(k int) float64 {
	x := [3]float64{0, 2.0287578381, 4.9131804394}[k]
	for i := 0; i < 20; i++ {
		c := math.Cos(x)
		x -= (math.Tan(x) + x) / (1/(c*c) + 1)
	}
	return x
}

// closedFormPolygons: the separable and reflection-built cases, their
// values derived by separation of variables (unit square: (m² + n²)π²,
// Dirichlet m, n ≥ 1, Neumann m, n ≥ 0; right isosceles triangle with
// legs 1: the square's modes antisymmetric (Dirichlet hypotenuse) or
// symmetric (Neumann hypotenuse) under the reflection across the
// hypotenuse, so legs Dirichlet: 5π², 10π² (hypotenuse Dirichlet) and
// 2π², 5π² (hypotenuse Neumann), legs Neumann, hypotenuse Dirichlet: π²
// (cos πx + cos πy) and 4π² (cos 2πx − cos 2πy); equilateral triangle of
// side 1, Dirichlet: (16π²/9)(m² + mn + n²), m, n ≥ 1, so 16π²/3 and
// the double 112π²/9 (Lamé's formulas, rederived in B. J. McCartin,
// Eigenstructure of the equilateral triangle, Part III, IJMMS 2004:16,
// 807–825; the formula recalled from memory); a square with Dirichlet
// sides y = 0, 1, x = 0 and the Robin side x = 1, ∂u/∂n + u = 0:
// κ_k² + π² with κ_k the roots of tan κ = −κ, λ1 = κ_1² + π²,
// λ2 = κ_2² + π² (κ_1² + 4π² is larger)), and a quadrilateral with
// corners of exactly 90° ± atan 1e-12, whose λ_k lie between those of the
// unit square (a subdomain: Dirichlet monotonicity, Courant–Hilbert vol.
// 1, ch. VI, recalled from memory) and of the rectangle of width
// 1 + 1e-12 containing it, and which the driver does not grade (its
// exponents are within 1e-9 of 2).
func closedFormPolygons() []closedFormPolygon {
	pi2 := math.Pi * math.Pi
	eq := func(a, b float64) [2]float64 { return [2]float64{a, b} }
	k1, k2 := robinRoot(1), robinRoot(2)
	wide := 1 + 1e-12
	return []closedFormPolygon{
		{"unit square, Dirichlet", `{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},"boundary":"dirichlet","eigenvalues":2}`,
			eq(2*pi2, 5*pi2), eq(2*pi2, 5*pi2), eq(1e-12, 1e-10)},
		{"unit square rotated by π/7 and shifted, Dirichlet", `{"domain":{"polygon":[["3","-2"],["3+cos(pi/7)","-2+sin(pi/7)"],["3+cos(pi/7)-sin(pi/7)","-2+sin(pi/7)+cos(pi/7)"],["3-sin(pi/7)","-2+cos(pi/7)"]]},"boundary":"dirichlet","eigenvalues":2}`,
			eq(2*pi2, 5*pi2), eq(2*pi2, 5*pi2), eq(1e-12, 1e-10)},
		{"unit square, Neumann", `{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},"boundary":"neumann","eigenvalues":2}`,
			eq(0, pi2), eq(0, pi2), eq(1e-12, 1e-11)},
		{"right isosceles triangle, Dirichlet", `{"domain":{"polygon":[["0","0"],["1","0"],["0","1"]]},"boundary":"dirichlet","eigenvalues":2}`,
			eq(5*pi2, 10*pi2), eq(5*pi2, 10*pi2), eq(1e-10, 1e-7)},
		{"right isosceles triangle, legs Dirichlet, hypotenuse Neumann", `{"domain":{"polygon":[["0","0"],["1","0"],["0","1"]]},"boundary":["dirichlet","neumann","dirichlet"],"eigenvalues":2}`,
			eq(2*pi2, 5*pi2), eq(2*pi2, 5*pi2), eq(1e-12, 1e-10)},
		{"right isosceles triangle rotated by 2π/9, legs Neumann, hypotenuse Dirichlet", `{"domain":{"polygon":[["1/3","1/5"],["1/3+cos(2*pi/9)","1/5+sin(2*pi/9)"],["1/3-sin(2*pi/9)","1/5+cos(2*pi/9)"]]},"boundary":["neumann","dirichlet","neumann"],"eigenvalues":2}`,
			eq(pi2, 4*pi2), eq(pi2, 4*pi2), eq(1e-12, 1e-11)},
		{"equilateral triangle, Dirichlet", `{"domain":{"polygon":[["0","0"],["1","0"],["1/2","sqrt(3)/2"]]},"boundary":"dirichlet","eigenvalues":2}`,
			eq(16*pi2/3, 112*pi2/9), eq(16*pi2/3, 112*pi2/9), eq(1e-12, 1e-8)},
		{"unit square with a Robin side", `{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},"boundary":["dirichlet",{"robin":"1"},"dirichlet","dirichlet"],"eigenvalues":2}`,
			eq(k1*k1+pi2, k2*k2+pi2), eq(k1*k1+pi2, k2*k2+pi2), eq(1e-12, 1e-11)},
		{"quadrilateral with a corner of 90° + atan 1e-12", `{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["-1e-12","1"]]},"boundary":"dirichlet","eigenvalues":2}`,
			eq(pi2*(1/(wide*wide)+1), pi2*(4/(wide*wide)+1)), eq(2*pi2, 5*pi2), eq(1e-12, 1e-10)},
	}
}

// certifyRecipe computes and assembles the hand-made recipe: trial
// degree `degree` (fluxes one less) on `refine` uniform levels and
// `graded` grading levels, stage A as the first recipe has it.
func certifyRecipe(t *testing.T, src string, degree, refine, graded int) (*problem.Problem, *result) {
	t.Helper()
	p := parseProblem(t, src)
	r := firstRecipe(t, p)
	r.degree, r.fluxDegree, r.refine, r.graded = degree, degree-1, refine, graded
	_, res := assembleRecipe(t, p, r, true)
	return p, res
}

// checkBracket reports enclosures of λ_k that miss [lo[k], hi[k]] (for
// lo = hi: do not contain the value) and relative widths above widest.
func checkBracket(t *testing.T, name string, res *result, lo, hi, widest [2]float64) {
	t.Helper()
	for k := 0; k < 2; k++ {
		l := res.lambda[k]
		if l.Lo > hi[k] || l.Hi < lo[k] {
			t.Errorf("%s: lambda%d %v misses [%.17g, %.17g]", name, k+1, l, lo[k], hi[k])
		}
		if !(res.widths[k] <= widest[k]) {
			t.Errorf("%s: lambda%d relative width %.3g, want at most %.3g", name, k+1, res.widths[k], widest[k])
		}
	}
	if lo == hi && !res.gap.Contains(hi[1]-lo[0]) {
		t.Errorf("%s: gap %v misses %.17g", name, res.gap, hi[1]-lo[0])
	}
}

// TestDegreeTenEnclosesClosedForms: at the driver's largest trial degrees
// (9 and 10, fluxes RT_8 and RT_9) on one uniform level and the largest
// grading depth (maxGraded, which grades none of these corners: every
// exponent below the degree is an integer, or within 1e-9 of one), the
// enclosures of λ1, λ2 and the gap contain the closed-form values, and
// at degree 10 they are narrow (widths measured: 5e-14 to 3e-12 for λ1,
// 5e-13 to 5e-9 for λ2; bounds set 4× to 20× above).
func TestDegreeTenEnclosesClosedForms(t *testing.T) {
	for _, c := range closedFormPolygons() {
		for _, degree := range []int{9, maxPolygonDegree} {
			name := fmt.Sprintf("%s, degree %d", c.name, degree)
			_, res := certifyRecipe(t, c.src, degree, 1, maxGraded)
			widest := [2]float64{1, 1}
			if degree == maxPolygonDegree {
				widest = c.maxWidths
			}
			checkBracket(t, name, res, c.lo, c.hi, widest)
		}
	}
}

// TestDeepGradedDegreeTenEnclosesCorners (GAPCERT_LONG=1): degree 10 on
// one uniform level graded 16, 20 and 24 levels (maxGraded) toward a
// singular corner. The L-shape of three unit squares (Dirichlet;
// λ1 = 9.63972384402194105271, R. S. Jones, Adv. Comput. Math. 2017;
// λ2 = 15.197251926454308, secondary source, 14 digits): contained, and
// λ1 narrow at 24 levels (measured 5.0e-12; 6.9e-10 at 16). The
// quadrilateral with corners of 90° ± atan 1e-8, whose exponents
// π/ω ≈ 2 ∓ 1.3e-8 are graded (both by all the levels): λ_k between the unit square's and those of
// the rectangle of width 1 + 1e-8 (Dirichlet monotonicity), and narrow
// (measured 1.2e-13 to 3.1e-13). About 2 minutes of CPU.
func TestDeepGradedDegreeTenEnclosesCorners(t *testing.T) {
	if !longPolygons() {
		t.Skip("set GAPCERT_LONG=1")
	}
	pi2 := math.Pi * math.Pi
	wide := 1 + 1e-8
	cases := []struct {
		name    string
		src     string
		lo, hi  [2]float64
		max     map[int][2]float64 // graded → widest relative widths
		corners int                // graded corners, each by all the levels
	}{
		{"L-shape", lshapeSource, [2]float64{lshapeLambda1, 15.197251926454308}, [2]float64{lshapeLambda1, 15.197251926454308},
			map[int][2]float64{16: {5e-9, 2e-11}, 20: {2e-10, 2e-11}, 24: {3e-11, 2e-11}}, 1},
		{"quadrilateral with a corner of 90° + atan 1e-8", `{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["-1e-8","1"]]},"boundary":"dirichlet","eigenvalues":2}`,
			[2]float64{pi2 * (1/(wide*wide) + 1), pi2 * (4/(wide*wide) + 1)}, [2]float64{2 * pi2, 5 * pi2},
			map[int][2]float64{16: {1e-12, 2e-12}, 20: {1e-12, 2e-12}, 24: {1e-12, 2e-12}}, 2},
	}
	for _, c := range cases {
		p := parseProblem(t, c.src)
		cs := trialCorners(p, recipe{graded: maxGraded})
		if len(cs) != c.corners {
			t.Fatalf("%s: graded corners %+v, want %d", c.name, cs, c.corners)
		}
		for _, k := range cs {
			if k.levels != maxGraded {
				t.Fatalf("%s: graded corners %+v, want %d levels each", c.name, cs, maxGraded)
			}
		}
		for _, g := range []int{16, 20, maxGraded} {
			_, res := certifyRecipe(t, c.src, maxPolygonDegree, 1, g)
			checkBracket(t, fmt.Sprintf("%s, graded %d", c.name, g), res, c.lo, c.hi, c.max[g])
		}
	}
}
