package proof

import (
	"testing"

	"gapcert/interval"
)

// TestProductSumsOmittedEdge: crafted factor data at the edge of the
// omitted-sum rule. Two factors with exact spectra {0, 1, 1, 2, …}: their
// certified eigenvalues are 0 and 1, and the first omitted one of each is
// 1 (a tie with the last certified one). The true product spectrum is
// 0, 1, 1, 1, 1, 2, … (the sums j + l). With next = 1 the omitted sums are
// ≥ 1 = L_(3): λ3 is decided and [1, 1] contains it, though two of the
// four sums equal to 1 are omitted; λ4 needs L_(4) = 2 ≤ 1, so both
// factors are short. With next = 1 − 2⁻⁵² (just below the tie) λ2 and λ3
// are short, λ1 is decided. Every decided enclosure contains the truth.
func TestProductSumsOmittedEdge(t *testing.T) {
	exact := func(v float64) interval.I { return interval.Point(v) }
	f := []interval.I{exact(0), exact(1)}
	truth := []float64{0, 1, 1, 1, 1, 2}
	below := 1 - 0x1p-52
	for _, tc := range []struct {
		next    float64
		m       int
		decided bool
	}{
		{1, 1, true}, {1, 2, true}, {1, 3, true}, {1, 4, false},
		{below, 1, true}, {below, 2, false}, {below, 3, false},
	} {
		lambda, omitted, short, err := ProductSums([][]interval.I{f, f}, []float64{tc.next, tc.next}, tc.m)
		if err != nil {
			t.Fatalf("next %v, m %d: %v", tc.next, tc.m, err)
		}
		if omitted != tc.next {
			t.Errorf("next %v, m %d: omitted bound %v, want next + λ1 of the other factor = %v", tc.next, tc.m, omitted, tc.next)
		}
		if decided := short == nil; decided != tc.decided {
			t.Errorf("next %v, m %d: short %v, want decided %v", tc.next, tc.m, short, tc.decided)
			continue
		}
		if !tc.decided && len(short) != 2 {
			t.Errorf("next %v, m %d: short %v, want both factors", tc.next, tc.m, short)
		}
		for k, l := range lambda {
			if !l.Contains(truth[k]) {
				t.Errorf("next %v, m %d: lambda%d = %v misses %v", tc.next, tc.m, k+1, l, truth[k])
			}
		}
	}
}

// TestProductGapFactorOrder: the product's gap is the least factor gap
// whichever factor has the largest or the least λ1, with a Neumann-like
// factor (λ1 = 0), three and four factors and overlapping gap enclosures:
// against the second least sum less the least over the exact spectra.
func TestProductGapFactorOrder(t *testing.T) {
	for _, tc := range []struct {
		firsts, seconds []float64
	}{
		{[]float64{100, 0, 5}, []float64{100.5, 9, 6}},        // the large-λ1 factor has the least gap
		{[]float64{0, 2, 7}, []float64{0.25, 2.5, 7.1}},       // λ1 = 0 factor is not the least gap
		{[]float64{3, 3, 3, 3}, []float64{4, 4, 4, 4}},        // four equal factors: gap of multiplicity 4
		{[]float64{1, 20, 0, 2}, []float64{3, 21.5, 4, 2.75}}, // the last factor's gap
	} {
		var gaps []interval.I
		l1 := 0.0
		for i := range tc.firsts {
			g := tc.seconds[i] - tc.firsts[i]
			gaps = append(gaps, interval.I{Lo: g - 0.01, Hi: g + 0.01})
			l1 += tc.firsts[i]
		}
		l2 := -1.0
		for i := range tc.firsts {
			s := l1 - tc.firsts[i] + tc.seconds[i]
			if l2 < 0 || s < l2 {
				l2 = s
			}
		}
		g := ProductGap(gaps)
		if !g.Contains(l2-l1) || g.Wid() > 0.0200001 {
			t.Errorf("%v / %v: gap %v, want %v within 0.02", tc.firsts, tc.seconds, g, l2-l1)
		}
	}
}
