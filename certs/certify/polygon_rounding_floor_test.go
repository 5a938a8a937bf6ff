package certify

import (
	"fmt"
	"math"
	"testing"
)

// TestManyTrianglesKeepClosedFormsNarrow: at degree 10 (fluxes RT_9) on
// meshes of a few hundred triangles, where the discretisation error is
// far below 1e-12, the widths are those of rounding: each Ritz and
// Lehmann–Goerisch entry sums one contribution per triangle, and the
// Lehmann–Goerisch pencil amplifies their widths (package temple). The
// enclosures of λ1, λ2 (double for the square and the equilateral
// triangle) and the gap contain the closed forms, and λ1, λ2 are
// narrower than 1e-12: measured widths 4.3e-14 to 5.3e-14 (λ1) and
// 6.3e-14 to 1.3e-13 (λ2), bounds 1e-13 and 3e-13. With plain interval
// sums of the per-triangle contributions and B combined from A0, A1 and
// A2 they were 1.1e-13 to 1.5e-13 and 4.6e-13 to 8.4e-13. Closed forms (closedFormPolygons): unit square,
// Dirichlet, 2π² and 5π²; equilateral triangle of side 1, 16π²/3 and
// 112π²/9 (Lamé; McCartin 2003); right isosceles triangle with legs 1,
// 5π² and 10π².
func TestManyTrianglesKeepClosedFormsNarrow(t *testing.T) {
	pi2 := math.Pi * math.Pi
	cases := []struct {
		name     string
		src      string
		refine   int
		lambda   [2]float64
		maxWidth [2]float64
	}{
		{"unit square, Dirichlet", `{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},"boundary":"dirichlet","eigenvalues":2}`,
			3, [2]float64{2 * pi2, 5 * pi2}, [2]float64{1e-13, 3e-13}},
		{"equilateral triangle, Dirichlet", `{"domain":{"polygon":[["0","0"],["1","0"],["1/2","sqrt(3)/2"]]},"boundary":"dirichlet","eigenvalues":2}`,
			4, [2]float64{16 * pi2 / 3, 112 * pi2 / 9}, [2]float64{1e-13, 3e-13}},
		{"right isosceles triangle, Dirichlet", `{"domain":{"polygon":[["0","0"],["1","0"],["0","1"]]},"boundary":"dirichlet","eigenvalues":2}`,
			4, [2]float64{5 * pi2, 10 * pi2}, [2]float64{1e-13, 3e-13}},
	}
	for _, c := range cases {
		_, res := certifyRecipe(t, c.src, maxPolygonDegree, c.refine, 0)
		checkBracket(t, fmt.Sprintf("%s, %d uniform levels", c.name, c.refine), res, c.lambda, c.lambda, c.maxWidth)
	}
}
