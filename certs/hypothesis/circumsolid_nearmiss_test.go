package hypothesis

import (
	"testing"

	"gapcert/certs"
)

// TestTangentialNearMisses moves one coordinate of tangential polygons by
// 10^-40, far below what the enclosures resolve, and checks that no such
// polygon is proven tangential; where the exact test applies it must be
// disproven. The rotated square and the pentagon stay undecided: their
// moved sides' lengths are square roots outside the field, of squared
// lengths that are not rational multiples of one another (for the square
// 1 + 2·10^-40·cos(π/12) + 10^-80), so D_j is a sum of field elements
// times distinct such roots, decided ≠ 0 only by its float64 enclosure,
// which cannot resolve 10^-40. The moved polygons are not tangential: for the
// quadrilaterals by Pitot's theorem (a + c = b + d fails once one side
// changes, see TestTangentialCases), for the regular pentagon because the
// moved side's line is no longer at the inradius from the centre fixed by
// the other sides (checked by the exact decision itself).
func TestTangentialNearMisses(t *testing.T) {
	pentagon := regularPolygon(5)
	pentagon[2] += "+1e-40"
	rotated := []string{"0", "0", "cos(pi/12)", "sin(pi/12)", "cos(pi/12)-sin(pi/12)", "sin(pi/12)+cos(pi/12)", "-sin(pi/12)", "cos(pi/12)+1e-40"}
	for _, tc := range []struct {
		name string
		xy   []string
		want string
	}{
		{"square, vertex 2 moved", []string{"0", "0", "1", "0", "1+1e-40", "1", "0", "1"}, certs.Disproven},
		{"square rotated by pi/12, vertex 3 moved", rotated, certs.Undecided},
		{"regular pentagon, vertex 1 moved", pentagon, certs.Undecided},
	} {
		requireVerdict(t, tc.name, Tangential(polygonProblem(t, tc.xy...)), tc.want)
	}
	// The kite A = (0, 0), B = (1, 0), C = ((3 + √3)/2, (3 + √3)/2),
	// D = (0, 1): |AB| = |AD| = 1 and |BC|² = |CD|² = 4 + 2√3 = (1 + √3)²,
	// so it is a convex kite, tangential (TestTangentialCases' sources).
	kite := polygonProblem(t, "0", "0", "1", "0", "(3+sqrt(3))/2", "(3+sqrt(3))/2", "0", "1")
	requireVerdict(t, "kite with sides 1 and 1+sqrt(3)", Tangential(kite), certs.Proven)
}
