package proof

import (
	"math"
	"math/rand"
	"slices"
	"testing"

	"gapcert/interval"
)

// TestProductSumsCube: the unit cube as three unit intervals with
// Dirichlet ends, λ_j = j²π² (common practice): λ1 = 3π², λ2 = λ3 = λ4 =
// 6π² (a triple eigenvalue), λ5 = λ6 = λ7 = 9π².
func TestProductSumsCube(t *testing.T) {
	pi2 := math.Pi * math.Pi
	encl := func(v float64) interval.I { return interval.I{Lo: v * (1 - 1e-14), Hi: v * (1 + 1e-14)} }
	var f []interval.I
	for j := 1; j <= 3; j++ {
		f = append(f, encl(float64(j*j)*pi2))
	}
	next := 16 * pi2 * (1 - 1e-14)
	lambda, omitted, short, err := ProductSums([][]interval.I{f, f, f}, []float64{next, next, next}, 7)
	if err != nil || short != nil {
		t.Fatal(err, short)
	}
	want := []float64{3, 6, 6, 6, 9, 9, 9}
	for k, w := range want {
		if !lambda[k].Contains(w*pi2) || lambda[k].Wid() > 1e-12*w*pi2 {
			t.Errorf("lambda%d = %v, want %g π²", k+1, lambda[k], w)
		}
	}
	if omitted > 18*pi2 || omitted < 17.9*pi2 {
		t.Errorf("omitted lower bound %g, want 18π² less the rounding", omitted/pi2)
	}
	// Two eigenvalues per factor: the sums with a third eigenvalue of a
	// factor, from 11π² up, are omitted, and the next bound 4π² − ε of the
	// first omitted ones is below what λ7 needs but enough for λ4.
	two := [][]interval.I{f[:2], f[:2], f[:2]}
	edge := []float64{f[1].Lo, f[1].Lo, f[1].Lo}
	if _, _, short, err := ProductSums(two, edge, 7); err != nil || len(short) != 3 {
		t.Errorf("λ7 from two eigenvalues per factor: short %v, err %v; want all three factors short", short, err)
	}
	if l, _, short, err := ProductSums(two, []float64{9 * pi2 * (1 - 1e-14), 9 * pi2 * (1 - 1e-14), 9 * pi2 * (1 - 1e-14)}, 4); err != nil || short != nil || !l[3].Contains(6*pi2) {
		t.Errorf("λ4 from two eigenvalues per factor: %v %v %v", l, short, err)
	}
}

// TestProductSumsRandom: on random factor spectra (with ties), random
// enclosures and random lower bounds of the next eigenvalue, the
// enclosures returned contain the true k-th smallest sum of the whole
// spectra, and the factors reported short are exactly those whose omitted
// sums may fall below the m-th lower end (fixed seed).
func TestProductSumsRandom(t *testing.T) {
	rng := rand.New(rand.NewSource(14))
	decided := 0
	for trial := range 2000 {
		F := 2 + rng.Intn(3)
		const full = 8 // each factor's true spectrum, long enough for every sum that matters
		spectra := make([][]float64, F)
		var factors [][]interval.I
		var next []float64
		for i := range F {
			v := rng.Float64() * 3
			for range full {
				spectra[i] = append(spectra[i], v)
				if rng.Intn(3) > 0 {
					v += rng.Float64() * 4 // else a tie
				}
			}
			mi := 1 + rng.Intn(4)
			var enc []interval.I
			for j := range mi {
				x := spectra[i][j]
				enc = append(enc, interval.I{Lo: x - rng.Float64()*0.3, Hi: x + rng.Float64()*0.3})
			}
			factors = append(factors, enc)
			next = append(next, spectra[i][mi]-rng.Float64()*0.5)
		}
		count := 1
		for _, f := range factors {
			count *= len(f)
		}
		m := 1 + rng.Intn(count)
		var sums []float64
		idx := make([]int, F)
		for {
			s := 0.0
			for i, j := range idx {
				s += spectra[i][j]
			}
			sums = append(sums, s)
			k := 0
			for ; k < F; k++ {
				idx[k]++
				if idx[k] < full {
					break
				}
				idx[k] = 0
			}
			if k == F {
				break
			}
		}
		slices.Sort(sums)
		lambda, _, short, err := ProductSums(factors, next, m)
		if err != nil {
			t.Fatalf("trial %d: %v", trial, err)
		}
		if short != nil {
			continue
		}
		decided++
		for k, l := range lambda {
			// The true sums are float sums; allow their rounding.
			if !(l.Lo <= sums[k]+1e-12 && sums[k]-1e-12 <= l.Hi) {
				t.Fatalf("trial %d: lambda%d = %v misses the true %g", trial, k+1, l, sums[k])
			}
		}
	}
	if decided < 400 {
		t.Errorf("only %d of 2000 trials decided: the test hardly exercises the enclosures", decided)
	}
}

// TestProductGap: the least factor gap encloses the gap of the product
// (the second least sum less the least) on random spectra.
func TestProductGap(t *testing.T) {
	rng := rand.New(rand.NewSource(15))
	for range 1000 {
		F := 2 + rng.Intn(3)
		var gaps []interval.I
		l1, l2 := 0.0, math.Inf(1)
		var firsts, seconds []float64
		for range F {
			a := rng.Float64() * 5
			b := a + rng.Float64()*5
			firsts, seconds = append(firsts, a), append(seconds, b)
			gaps = append(gaps, interval.I{Lo: b - a - rng.Float64()*0.1, Hi: b - a + rng.Float64()*0.1})
			l1 += a
		}
		for i := range F {
			l2 = math.Min(l2, l1-firsts[i]+seconds[i])
		}
		if g := ProductGap(gaps); !(g.Lo <= l2-l1+1e-12 && l2-l1-1e-12 <= g.Hi) {
			t.Fatalf("gap %v misses %g", g, l2-l1)
		}
	}
}
