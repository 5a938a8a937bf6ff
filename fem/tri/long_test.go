package tri

import (
	"math/big"
	"math/rand/v2"
	"os"
	"testing"

	"gapcert/fem/mesh"
	"gapcert/interval"
)

// Opt-in campaign (GAPCERT_LONG=1): exact containment of the Ritz
// matrices on random trapezoids (0,0), (a,0), (b,h), (c,h) with dyadic
// coordinates, refined once or twice, random side conditions (Robin only
// on the horizontal sides, where |e| is rational) and p = 1..4; and, on
// each, verified stage-A lower bounds below verified Ritz upper bounds
// for the three lowest eigenvalues (min–max on one side, the projection
// theorem on the other: they can only cross if one of them is wrong).
func TestLongRandomTrapezoids(t *testing.T) {
	if os.Getenv("GAPCERT_LONG") != "1" {
		t.Skip("set GAPCERT_LONG=1")
	}
	rng := rand.New(rand.NewPCG(11, 12))
	dy := func(n int) float64 { return float64(rng.IntN(n)+1) / 8 }
	for trial := 0; trial < 40; trial++ {
		a := 1 + dy(16)
		h := dy(12)
		c := dy(8) - 0.5
		b := c + dy(16)
		if b >= a+2 {
			b = a + 1
		}
		m, err := mesh.FromPolygon([][2]interval.I{pt(0, 0), pt(a, 0), pt(b, h), pt(c, h)}, [][3]int{{0, 1, 2}, {0, 2, 3}})
		if err != nil {
			t.Fatalf("trial %d: %v", trial, err)
		}
		for r := 0; r <= trial%2; r++ {
			m = m.Refine()
		}
		bc := allBC(4, neumann)
		alpha := make([]*big.Rat, 4)
		for side := range bc {
			switch k := rng.IntN(3); {
			case k == 0:
				bc[side] = dirichlet
			case side%2 == 0 && k == 1:
				al := big.NewRat(int64(rng.IntN(8)+1), 4)
				f, _ := al.Float64()
				bc[side], alpha[side] = robin(interval.Point(f)), al
			}
		}
		checkRitzExact(t, m, bc, alpha, []int{1 + trial%4}, rng)
		lo, up := verifiedBounds(t, m.Refine(), bc, 2, 3, true)
		for i := range lo {
			if lo[i] > up[i] {
				t.Errorf("trial %d (a=%g b=%g c=%g h=%g, bc %v) λ_%d: lower %g > upper %g", trial, a, b, c, h, bc, i+1, lo[i], up[i])
			}
		}
	}
}
