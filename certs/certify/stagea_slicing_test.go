package certify

import (
	"math/rand"
	"sort"
	"testing"

	"gapcert/fem/discrete"
	"gapcert/interval"
)

// fakeStageA is a stage-A space whose pencil has the eigenvalues eig
// (sorted): its count at σ is the number of eigenvalues below σ and its
// corrected shift σ(1 − 1e-9) (so #{λ < σ′} ≤ n, as a verified count
// guarantees), and every third count breaks down (ok = false). Locate
// returns the eigenvalue itself (a perfect float approximation).
type fakeStageA struct {
	eig   []float64
	calls int
}

func (f *fakeStageA) CountBelow(mMin, sigma float64) (int, float64, bool) {
	f.calls++
	if f.calls%3 == 0 {
		return 0, sigma, false
	}
	n := sort.SearchFloat64s(f.eig, sigma) // #{λ < σ}
	return n, sigma * (1 - 1e-9), true
}
func (f *fakeStageA) MassMin() float64                          { return 1 }
func (f *fakeStageA) ProjectionConstant() interval.I            { return interval.Point(0.01) }
func (f *fakeStageA) FormShift() float64                        { return 0 }
func (f *fakeStageA) Locate(i int, lo float64) (float64, error) { return f.eig[i-1], nil }

// TestStageALowerNeverAbove checks the stage-A search with spectrum
// slicing on random spectra with clusters (repeated eigenvalues, as on a
// square) and breakdowns: every returned bound of λ_{h,j} must be ≤ λ_{h,j}.
// The Ritz bounds given to the slicing are deliberately poor estimates
// (they only place shifts).
func TestStageALowerNeverAbove(t *testing.T) {
	rng := rand.New(rand.NewSource(11))
	for trial := 0; trial < 300; trial++ {
		count := 3 + rng.Intn(80)
		eig := make([]float64, 0, count+10)
		x := 1 + rng.Float64()
		for len(eig) < count+5 {
			mult := 1 + rng.Intn(4)
			for m := 0; m < mult; m++ {
				eig = append(eig, x)
			}
			x += rng.Float64() * 3 * float64(rng.Intn(2))
			x += 1e-6
		}
		sort.Float64s(eig)
		ritz := make([]float64, count-1)
		for i := range ritz {
			ritz[i] = eig[i] * (0.5 + rng.Float64())
		}
		sort.Float64s(ritz)
		located := 1 + rng.Intn(count)
		f := &fakeStageA{eig: eig}
		search := []discrete.ShiftSearch{{First: 1e-10, Factor: 10, Tries: 12}, {First: 1e-13, Factor: 4, Tries: 30, Stale: 8}}[trial%2]
		lhs, err := stageALower(f, search, ritz, count, located)
		if err != nil {
			t.Fatal(err)
		}
		for j, l := range lhs {
			if l > eig[j] {
				t.Fatalf("trial %d (located %d of %d): bound %v of lambda_h%d above the eigenvalue %v; spectrum %v", trial, located, count, l, j+1, eig[j], eig[:count])
			}
		}
	}
}
