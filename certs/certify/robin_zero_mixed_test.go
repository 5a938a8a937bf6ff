package certify

import (
	"fmt"
	"strings"
	"testing"

	"gapcert/interval"
)

// Adversarial boundary conditions and shifts through the one pipeline:
// Robin conditions with α = 0 written as robin (which must act as
// Neumann in every space: the trial space keeps its boundary values, the
// flux must vanish there), mixed conditions on a square and a large
// constant potential (negative shift γ), compared with closed forms: on
// (0, L) the eigenvalues of −u″ are (kπ/L)² (Dirichlet–Dirichlet,
// k ≥ 1; Neumann–Neumann, k ≥ 0) and ((k − ½)π/L)² (Neumann–Dirichlet,
// k ≥ 1), and on a rectangle they are sums of those of its sides
// (separation of variables; common practice).

// piSq returns an enclosure of (cπ)² for an exact float c.
func piSq(c float64) interval.I { return interval.Pi().MulF(c).Sqr() }

func TestRobinZeroInterval(t *testing.T) {
	for _, tc := range []struct {
		bc, potential string
		truth         []interval.I
	}{
		// (0, 1), robin 0 left, Dirichlet right: ((k − ½)π)².
		{`[{"robin":"0"},"dirichlet"]`, "0", []interval.I{piSq(0.5), piSq(1.5), piSq(2.5)}},
		// (0, 1), robin 0 on both ends: (kπ)², k ≥ 0.
		{`[{"robin":"0"},{"robin":"0"}]`, "0", []interval.I{interval.Point(0), piSq(1), piSq(2)}},
		// robin 0 and neumann mixed, V = 1000 (γ < 0): 1000 + (kπ)².
		{`[{"robin":"0"},"neumann"]`, "1000", []interval.I{interval.Point(1000), piSq(1).AddF(1000), piSq(2).AddF(1000)}},
		// Dirichlet left, robin 0 right, V = 1000.
		{`["dirichlet",{"robin":"0"}]`, "1000", []interval.I{piSq(0.5).AddF(1000), piSq(1.5).AddF(1000), piSq(2.5).AddF(1000)}},
	} {
		src := fmt.Sprintf(`{"domain":{"interval":["0","1"]},"potential":%q,"boundary":%s,"eigenvalues":3}`, tc.potential, tc.bc)
		p, c := certifyLimited(t, src, 1e-9)
		scale := scaleOf(p)
		for k, truth := range tc.truth {
			requireEnclosure(t, fmt.Sprintf("%s lambda%d", src, k+1), eigenEnclosure(t, c, k+1), truth, scale, 1e-7)
		}
	}
}

func TestMixedSquare(t *testing.T) {
	sq := `[["0","0"],["1","0"],["1","1"],["0","1"]]`
	for _, tc := range []struct {
		sides     []string // bottom, right, top, left
		potential string
		truth     []interval.I
	}{
		// x: Dirichlet–Dirichlet (mπ)², m ≥ 1; y: robin 0 / Neumann (nπ)², n ≥ 0.
		{[]string{`{"robin":"0"}`, `"dirichlet"`, `"neumann"`, `"dirichlet"`}, "0",
			[]interval.I{piSq(1), piSq(1).Add(piSq(1)), piSq(2)}},
		// the same with V = 1000 (γ < 0).
		{[]string{`{"robin":"0"}`, `"dirichlet"`, `{"robin":"0"}`, `"dirichlet"`}, "1000",
			[]interval.I{piSq(1).AddF(1000), piSq(1).Add(piSq(1)).AddF(1000), piSq(2).AddF(1000)}},
		// x: robin 0 / Dirichlet ((m − ½)π)²; y: Dirichlet–Dirichlet (nπ)²:
		// (¼ + 1)π², (9/4 + 1)π², (¼ + 4)π².
		{[]string{`"dirichlet"`, `"dirichlet"`, `"dirichlet"`, `{"robin":"0"}`}, "0",
			[]interval.I{piSq(0.5).Add(piSq(1)), piSq(1.5).Add(piSq(1)), piSq(0.5).Add(piSq(2))}},
	} {
		src := polygonText(sq, tc.potential, tc.sides, 3)
		p, _, lambda := certifyPolygon(t, src, 1e-5)
		scale := scaleOf(p)
		for k, truth := range tc.truth {
			requireEnclosure(t, fmt.Sprintf("%s lambda%d", strings.Join(tc.sides, ","), k+1), lambda[k], truth, scale, 1e-3)
		}
	}
}
