package mesh

import (
	"fmt"
	"math"
	"math/rand/v2"
	"os"
	"strings"
	"testing"
)

// TestRandomPolygons triangulates random star-shaped polygons (simple by
// construction: vertices at increasing angles around the origin; usually
// not convex) with fem/problem, and checks every invariant of checkMesh
// after a random sequence of red and graded refinements. GAPCERT_LONG=1
// runs 25 times as many polygons.
func TestRandomPolygons(t *testing.T) {
	count := 20
	if os.Getenv("GAPCERT_LONG") == "1" {
		count = 500
	}
	rng := rand.New(rand.NewPCG(7, 11))
	for c := 0; c < count; c++ {
		n := 3 + rng.IntN(10)
		var vs []string
		for k := 0; k < n; k++ {
			theta := 2 * math.Pi * (float64(k) + 0.8*rng.Float64()) / float64(n)
			r := 0.3 + rng.Float64()
			// Decimal text with 6 digits: the polygon is the exact decimal one.
			vs = append(vs, fmt.Sprintf(`["%.6f","%.6f"]`, r*math.Cos(theta), r*math.Sin(theta)))
		}
		file := `{"domain":{"polygon":[` + strings.Join(vs, ",") + `]},"boundary":"dirichlet"}`
		p, m := parsePolygon(t, file)
		for step := 0; step < 3; step++ {
			if rng.IntN(2) == 0 && len(m.Tris) < 2000 {
				m = m.Refine()
			} else {
				m = m.RefineGraded(rng.IntN(n), 1+rng.IntN(4))
			}
			checkMesh(t, p, m)
		}
	}
}
