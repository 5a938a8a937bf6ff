package certify

import (
	"fmt"
	"testing"

	"gapcert/interval"
)

// TestSeparableShifted compares the polygon pipeline with the
// interval pipeline on separable problems: on the unit square with
// V(x, y) = W(x), the eigenvalues are the sorted sums μ_i + ν_j of the
// eigenvalues μ_i of −u″ + Wu on (0, 1) and ν_j of −u″ on (0, 1) with the
// conditions of the matching sides (separation of variables; common
// practice). W = 1000 + 10x² makes γ < 0 and gives stage B its own shift
// γ_B ≠ γ (the potential oscillates); μ_2 + π² and μ_1 + 4π² lie within
// about 0.1 of each other (a near cluster at λ2, λ3). Both enclosures of
// each eigenvalue are true, so they must intersect.
func TestSeparableShifted(t *testing.T) {
	for _, tc := range []struct {
		w        string
		x, y     [2]string // conditions at x = 0, 1 and y = 0, 1
		nu1, nu2 interval.I
	}{
		{"1000 + 10*x^2", [2]string{`"dirichlet"`, `"dirichlet"`}, [2]string{`"dirichlet"`, `"dirichlet"`}, piSq(1), piSq(2)},
		{"1000 + 10*x^2", [2]string{`"dirichlet"`, `{"robin":"0"}`}, [2]string{`"neumann"`, `{"robin":"0"}`}, interval.Point(0), piSq(1)},
	} {
		src1 := fmt.Sprintf(`{"domain":{"interval":["0","1"]},"potential":%q,"boundary":[%s,%s],"eigenvalues":3}`, tc.w, tc.x[0], tc.x[1])
		_, c1 := certifyLimited(t, src1, 1e-11)
		mu := []interval.I{eigenEnclosure(t, c1, 1), eigenEnclosure(t, c1, 2), eigenEnclosure(t, c1, 3)}
		// The three lowest sums: μ1 + ν1, then the two lowest of
		// μ2 + ν1, μ1 + ν2 (μ3 + ν1 and μ2 + ν2 are larger here).
		a, b := mu[1].Add(tc.nu1), mu[0].Add(tc.nu2)
		want := []interval.I{mu[0].Add(tc.nu1), a.Min(b), a.Max(b)}
		if c := mu[2].Add(tc.nu1); c.Lo < want[2].Hi {
			t.Fatalf("%s: μ3 + ν1 = %v is not above %v", tc.w, c, want[2])
		}
		// Sides of the square: bottom (y = 0), right (x = 1), top (y = 1), left (x = 0).
		src2 := polygonText(`[["0","0"],["1","0"],["1","1"],["0","1"]]`, tc.w, []string{tc.y[0], tc.x[1], tc.y[1], tc.x[0]}, 3)
		_, _, lambda := certifyPolygon(t, src2, 1e-7)
		for k := range want {
			if _, ok := lambda[k].Intersection(want[k]); !ok {
				t.Errorf("%s: lambda%d: polygon enclosure %v and interval-derived enclosure %v are disjoint", src2, k+1, lambda[k], want[k])
			}
			if lambda[k].Wid() > 1e-4 {
				t.Errorf("%s: lambda%d: polygon enclosure %v too wide", src2, k+1, lambda[k])
			}
		}
	}
}
