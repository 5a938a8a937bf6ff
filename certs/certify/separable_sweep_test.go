package certify

import (
	"fmt"
	"math/rand"
	"sort"
	"testing"

	"gapcert/interval"
)

// kthSmallest returns an enclosure of the k-th smallest (k = 1, 2) of
// values known only by enclosures: order statistics are monotone in each
// argument, so the k-th smallest lower end and the k-th smallest upper end
// bound it.
func kthSmallest(xs []interval.I, k int) interval.I {
	lo, hi := make([]float64, len(xs)), make([]float64, len(xs))
	for i, x := range xs {
		lo[i], hi[i] = x.Lo, x.Hi
	}
	sort.Float64s(lo)
	sort.Float64s(hi)
	return interval.I{Lo: lo[k-1], Hi: hi[k-1]}
}

// TestSeparableRectangleSweep: random rectangles with random Dirichlet,
// Neumann or Robin sides and V = c1(x − x0)² + c2(y − y0)², so that stage B
// runs with its own shift γ_B > γ. By separation of variables (common
// practice) the eigenvalues are the sums μ_i + ν_j of the 1D problems in x
// and in y, which the 1D certifier encloses; λ1 and λ2 are the smallest
// and second smallest sums, enclosed by kthSmallest. Every 2D enclosure
// must meet its truth enclosure. 8 problems by default, 60 with
// GAPCERT_LONG=1.
func TestSeparableRectangleSweep(t *testing.T) {
	count := 8
	if longPolygons() {
		count = 60
	}
	rng := rand.New(rand.NewSource(11))
	dec := func(lo, hi float64) string { return fmt.Sprintf("%.2f", lo+(hi-lo)*rng.Float64()) }
	side := func() (string, string) { // 2D side text and 1D end text
		switch rng.Intn(3) {
		case 0:
			return `"dirichlet"`, `"dirichlet"`
		case 1:
			return `"neumann"`, `"neumann"`
		}
		a := dec(0.1, 5)
		return fmt.Sprintf(`{"robin":%q}`, a), fmt.Sprintf(`{"robin":%q}`, a)
	}
	misses, stageB := 0, 0
	for i := 0; i < count; i++ {
		a, b := dec(0.5, 2), dec(0.5, 2)
		x0, y0 := dec(0, 1), dec(0, 1)
		c1, c2 := dec(0.5, 8), dec(0.5, 8)
		var s2 [4]string
		var s1 [4]string
		for k := range s2 {
			s2[k], s1[k] = side()
		}
		// Sides: 0 bottom (y = 0), 1 right (x = a), 2 top (y = b), 3 left (x = 0).
		src := fmt.Sprintf(`{"domain":{"polygon":[["0","0"],[%q,"0"],[%q,%q],["0",%q]]},"potential":"%s*(x-%s)^2 + %s*(y-%s)^2","boundary":[%s,%s,%s,%s],"eigenvalues":2}`,
			a, a, b, b, c1, x0, c2, y0, s2[0], s2[1], s2[2], s2[3])
		_, c := certifyText(t, src, 1e-5)
		if usedStageB(t, c) {
			stageB++
		}
		_, cx := certifyText(t, fmt.Sprintf(`{"domain":{"interval":["0",%q]},"potential":"%s*(x-%s)^2","boundary":[%s,%s],"eigenvalues":2}`, a, c1, x0, s1[3], s1[1]), 1e-11)
		_, cy := certifyText(t, fmt.Sprintf(`{"domain":{"interval":["0",%q]},"potential":"%s*(x-%s)^2","boundary":[%s,%s],"eigenvalues":2}`, b, c2, y0, s1[0], s1[2]), 1e-11)
		var sums []interval.I
		for _, m := range []int{1, 2} {
			for _, n := range []int{1, 2} {
				sums = append(sums, eigenEnclosure(t, cx, m).Add(eigenEnclosure(t, cy, n)))
			}
		}
		for k := 1; k <= 2; k++ {
			got, truth := eigenEnclosure(t, c, k), kthSmallest(sums, k)
			if got.Lo > truth.Hi || got.Hi < truth.Lo {
				misses++
				t.Errorf("%s: lambda%d %v misses %v", src, k, got, truth)
			}
		}
	}
	t.Logf("%d separable problems, %d with stage-B bounds, %d misses", count, stageB, misses)
	if stageB < count/2 {
		t.Errorf("only %d of %d problems used stage B", stageB, count)
	}
}
