package certify

import (
	"fmt"
	"math"
	"testing"
)

// TestManyTrianglesEncloseMoreClosedForms: at degree 10 (fluxes RT_9) on
// meshes of a hundred to a few hundred triangles, where the widths are
// those of rounding (about 1e-13), the enclosures of λ1, λ2 and the gap
// contain the closed forms of the cases the compensated sums and the
// residual form of the Lehmann matrix meet beyond the Dirichlet square and
// triangles: a rotated and moved square (irrational vertices); the Neumann
// square (λ1 = 0, the stage-B shift γ_B ≠ γ); mixed Dirichlet/Neumann
// sides (σ·n = 0 on the Neumann sides), also rotated; the equilateral
// triangle rotated by 1 radian and moved (double λ2 = 112π²/9, McCartin
// 2003); a Robin side (the
// residual form refuses it and stage B combines A0, A1 and A2); and a
// constant potential V = 7 on the Dirichlet square (λ = (m² + n²)π² + 7,
// separation of variables, common practice; the weight 1/(V + γ) is then
// a constant model). Closed forms as in closedFormPolygons. Relative widths
// measured 3.6e-14 to 9.5e-14 (λ1) and 4.3e-14 to 3.4e-13 (λ2, the rotated
// square's double λ2 widest); bounds 3e-13 and 1e-12.
func TestManyTrianglesEncloseMoreClosedForms(t *testing.T) {
	pi2 := math.Pi * math.Pi
	k1, k2 := robinRoot(1), robinRoot(2)
	cases := []struct {
		name   string
		src    string
		refine int
		lambda [2]float64
	}{
		{"unit square rotated by π/7 and moved, Dirichlet", `{"domain":{"polygon":[["3","-2"],["3+cos(pi/7)","-2+sin(pi/7)"],["3+cos(pi/7)-sin(pi/7)","-2+sin(pi/7)+cos(pi/7)"],["3-sin(pi/7)","-2+cos(pi/7)"]]},"boundary":"dirichlet","eigenvalues":2}`,
			3, [2]float64{2 * pi2, 5 * pi2}},
		{"unit square, Neumann", `{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},"boundary":"neumann","eigenvalues":2}`,
			3, [2]float64{0, pi2}},
		{"right isosceles triangle, legs Dirichlet, hypotenuse Neumann", `{"domain":{"polygon":[["0","0"],["1","0"],["0","1"]]},"boundary":["dirichlet","neumann","dirichlet"],"eigenvalues":2}`,
			4, [2]float64{2 * pi2, 5 * pi2}},
		{"right isosceles triangle rotated by 2π/9, legs Neumann, hypotenuse Dirichlet", `{"domain":{"polygon":[["1/3","1/5"],["1/3+cos(2*pi/9)","1/5+sin(2*pi/9)"],["1/3-sin(2*pi/9)","1/5+cos(2*pi/9)"]]},"boundary":["neumann","dirichlet","neumann"],"eigenvalues":2}`,
			4, [2]float64{pi2, 4 * pi2}},
		{"unit square with a Robin side", `{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},"boundary":["dirichlet",{"robin":"1"},"dirichlet","dirichlet"],"eigenvalues":2}`,
			3, [2]float64{k1*k1 + pi2, k2*k2 + pi2}},
		{"equilateral triangle rotated by 1 radian and moved, Dirichlet", `{"domain":{"polygon":[["2/7","-5/3"],["2/7+cos(1)","-5/3+sin(1)"],["2/7+cos(1+pi/3)","-5/3+sin(1+pi/3)"]]},"boundary":"dirichlet","eigenvalues":2}`,
			4, [2]float64{16 * pi2 / 3, 112 * pi2 / 9}},
		{"unit square, Dirichlet, V = 7", `{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},"potential":"7","boundary":"dirichlet","eigenvalues":2}`,
			3, [2]float64{2*pi2 + 7, 5*pi2 + 7}},
	}
	for _, c := range cases {
		name := fmt.Sprintf("%s, %d uniform levels", c.name, c.refine)
		_, res := certifyRecipe(t, c.src, maxPolygonDegree, c.refine, 0)
		checkBracket(t, name, res, c.lambda, c.lambda, [2]float64{3e-13, 1e-12})
		t.Logf("%s: λ1 %v (%.2g), λ2 %v (%.2g), gap %v", name, res.lambda[0], res.widths[0], res.lambda[1], res.widths[1], res.gap)
	}
}
