package sparse

import (
	"math/rand/v2"
	"runtime"
	"slices"
	"testing"
)

// TestMultifrontalBitsOnProcs: the multifrontal factors, the verified
// count and its σ' (a-priori residual bound), and the block solves are
// the same bits on 1, 2 and 8 CPUs, each repeated five times (different
// schedules of the subtrees and of the split updates) with one Counter
// whose kept fronts are dirtied by factorizations at another shift
// between the runs, on a 27-point 3D
// grid whose top fronts are large enough for the panel updates to be
// split over the CPUs and on a dense indefinite matrix of one front.
// Run with -race too.
func TestMultifrontalBitsOnProcs(t *testing.T) {
	rnd := rand.New(rand.NewPCG(71, 72))
	grid := perturbed(grid27(8), 0.2, rnd)
	eig := denseGeneralizedEigs(t, grid, identity(grid.N()))
	denseM := randomScaledSym(rnd, 240, 1, -2, 2)
	cases := []struct {
		name  string
		k     *Sym
		sigma float64
		perm  []int
	}{
		{"grid27 8³", grid, 0.5 * (eig[6] + eig[7]), nil},
		{"dense 240", denseM, 0, naturalOrderOf(240)},
	}
	defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(0))
	for _, tc := range cases {
		k, m := toISym(tc.k), toISym(identity(tc.k.N()))
		var first *LDL
		var firstN int
		var firstSP float64
		var firstX [][]float64
		b := newVectors(2*solveWidth+3, tc.k.N())
		for _, v := range b {
			for i := range v {
				v[i] = rnd.Float64() - 0.5
			}
		}
		// One Counter for all runs: its LDL keeps the workers' fronts
		// across factorizations, dirtied in between by a factorization at
		// another shift.
		c := roundoffCounter(k, m)
		c.f.algorithm = multifrontal
		if tc.perm != nil {
			c.sym = analyzePattern(c.c.Pat, tc.perm)
		}
		for _, procs := range []int{1, 2, 8} {
			runtime.GOMAXPROCS(procs)
			for rep := 0; rep < 5; rep++ {
				if rep%2 == 1 {
					if _, _, ok := c.CountBelow(1, 0.75*tc.sigma+1); !ok {
						t.Fatalf("%s: factorization at the other shift failed", tc.name)
					}
				}
				if rep == 0 && procs == 1 {
					longest := 0
					for j := 0; j < c.sym.pat.n; j++ {
						longest = max(longest, c.sym.colPtr[j+1]-c.sym.colPtr[j])
					}
					if work := longest * (longest - panelWidth) / 2 * panelWidth; work < parallelFrontWork {
						t.Fatalf("%s: largest front %d rows, too small for a split update", tc.name, longest+1)
					}
				}
				n, sp, ok := c.CountBelow(1, tc.sigma)
				if !ok {
					t.Fatalf("%s: factorization failed", tc.name)
				}
				x := newVectors(len(b), tc.k.N())
				var work []float64
				c.f.solveBlockTo(x, b, &work)
				if first == nil {
					first = &LDL{D: slices.Clone(c.f.D), Val: slices.Clone(c.f.Val)}
					firstN, firstSP, firstX = n, sp, x
					continue
				}
				if !slices.Equal(first.D, c.f.D) || !slices.Equal(first.Val, c.f.Val) {
					t.Errorf("%s, GOMAXPROCS %d, run %d: factors differ from the first run", tc.name, procs, rep)
				}
				if n != firstN || sp != firstSP {
					t.Errorf("%s, GOMAXPROCS %d, run %d: count %d, σ' %v; first run %d, %v", tc.name, procs, rep, n, sp, firstN, firstSP)
				}
				for q := range x {
					if !slices.Equal(x[q], firstX[q]) {
						t.Errorf("%s, GOMAXPROCS %d, run %d: block solve %d differs", tc.name, procs, rep, q)
						break
					}
				}
			}
		}
	}
}
