package proof

import (
	"math"
	"math/big"
	"strings"
	"testing"

	"gapcert/enclose"
	"gapcert/interval"
)

// countAt is a Counter whose pencil has the given eigenvalues and whose
// corrected shift is sigma(1 − 1e-12), as a verified count would report.
type countAt []float64

func (c countAt) CountBelow(mMin, sigma float64) (int, float64, bool) {
	sp := sigma * (1 - 1e-12)
	n := 0
	for _, l := range c {
		if l < sp {
			n++
		}
	}
	return n, sp, true
}

// TestCountLower checks that a count proves λ_index ≥ σ′ exactly when it
// shows at most index − 1 eigenvalues below σ′.
func TestCountLower(t *testing.T) {
	c := countAt{1, 4, 9}
	for _, tc := range []struct {
		sigma float64
		index int
		ok    bool
	}{{0.9, 1, true}, {1.1, 1, false}, {3.9, 2, true}, {4.1, 2, false}, {4.1, 3, true}, {9.5, 3, false}} {
		sp, ok := CountLower(c, 1, tc.sigma, tc.index)
		if ok != tc.ok {
			t.Errorf("shift %v, index %d: ok %v, want %v", tc.sigma, tc.index, ok, tc.ok)
		}
		if ok && sp > c[tc.index-1] {
			t.Errorf("shift %v, index %d: bound %v above the eigenvalue %v", tc.sigma, tc.index, sp, c[tc.index-1])
		}
	}
}

// TestSliceLower checks that a count of n eigenvalues below σ′ raises the
// bounds of the indices n + 1 and up only, and never lowers a bound.
func TestSliceLower(t *testing.T) {
	lower := []float64{1, 2, 3, 3, 3}
	SliceLower(lower, 2, 3, 5)
	want := []float64{1, 2, 3, 5, 5}
	for i := range want {
		if lower[i] != want[i] {
			t.Fatalf("after a count of 3 below 5: %v, want %v", lower, want)
		}
	}
	SliceLower(lower, 2, 1, 4) // indices 3.. (from = 2 limits it): 5 stays 5
	if lower[2] != 4 || lower[3] != 5 {
		t.Fatalf("after a count of 1 below 4 from index 3: %v", lower)
	}
}

// TestProjectionLowerShift checks the CR form of the projection bound
// against exact rational arithmetic: c + f(lh − c), f(x) = x/(1 + C²x), is
// at or below its exact value, within 1e-14 of it, and at or above the
// plain bound f(lh) (g(c) = c + f(lh − c) increases in c).
func TestProjectionLowerShift(t *testing.T) {
	ch := interval.Point(0.01)
	for _, tc := range []struct{ lh, c float64 }{{10, 0}, {10, 1}, {100, 50}, {3, 3}, {2, 5}} {
		got := ProjectionLower(tc.lh, tc.c, ch)
		x := math.Max(tc.lh-tc.c, 0) // exact for these inputs
		c2 := new(big.Rat).Mul(new(big.Rat).SetFloat64(0.01), new(big.Rat).SetFloat64(0.01))
		f := new(big.Rat).SetFloat64(x)
		den := new(big.Rat).Add(big.NewRat(1, 1), new(big.Rat).Mul(c2, f))
		exact := new(big.Rat).Add(new(big.Rat).Quo(f, den), new(big.Rat).SetFloat64(tc.c))
		e, _ := exact.Float64()
		if new(big.Rat).SetFloat64(got).Cmp(exact) > 0 {
			t.Errorf("lh %v, c %v: %v is above the exact %v", tc.lh, tc.c, got, e)
		}
		if (e-got)/e > 1e-14 {
			t.Errorf("lh %v, c %v: %v is %.2g below the exact %v", tc.lh, tc.c, got, (e-got)/e, e)
		}
		if plain := ProjectionLower(tc.lh, 0, ch); tc.c <= tc.lh && got < plain {
			t.Errorf("lh %v, c %v: %v is below the plain bound %v", tc.lh, tc.c, got, plain)
		}
	}
}

// TestStageBShift checks the conversions between the shifts γ and γ_B
// against exact rational arithmetic: ρ̂_B ≤ ρ̂ − γ + γ_B, and a stage-B
// bound ℓ of Λ^B becomes ≤ ℓ − γ_B + γ, each within one rounding.
func TestStageBShift(t *testing.T) {
	s := StageBShift{Gamma: 0.1, GammaB: 3.7, Own: true}
	rat := func(x float64) *big.Rat { return new(big.Rat).SetFloat64(x) }
	rho := 12.3
	got := s.Rho(rho)
	exact := new(big.Rat).Add(new(big.Rat).Sub(rat(rho), rat(s.Gamma)), rat(s.GammaB))
	if rat(got).Cmp(exact) > 0 {
		t.Errorf("rho_B %v above the exact %s", got, exact.FloatString(20))
	}
	if e, _ := exact.Float64(); e-got > 4*math.Abs(e)*0x1p-52 {
		t.Errorf("rho_B %v, exact %v", got, e)
	}
	if same := (StageBShift{Gamma: 0.1, GammaB: 0.1}); same.Rho(rho) != rho {
		t.Errorf("without its own shift, rho changed to %v", same.Rho(rho))
	}

	// One trial function with Rayleigh quotient 2 and a small residual:
	// Temple's bound lies below 2; converted back it must lie below
	// 2 − γ_B + γ exactly.
	one := func(x interval.I) *enclose.Sym { a := enclose.NewSym(1); a.Set(0, 0, x); return a }
	a0, a1, a2 := one(interval.Point(2)), one(interval.Point(1)), one(interval.Point(0.5+1e-9))
	lg, err := s.StageB(a0, a1, a2, 5)
	if err != nil {
		t.Fatal(err)
	}
	if len(lg) != 1 || math.IsInf(lg[0], -1) {
		t.Fatalf("no stage-B bound: %v", lg)
	}
	bound := new(big.Rat).Add(new(big.Rat).Sub(rat(2), rat(s.GammaB)), rat(s.Gamma))
	if rat(lg[0]).Cmp(bound) > 0 {
		t.Errorf("converted bound %v above 2 - gamma_B + gamma = %s", lg[0], bound.FloatString(20))
	}
	if b, _ := bound.Float64(); b-lg[0] > 1e-6 {
		t.Errorf("converted bound %v, far below %v", lg[0], b)
	}
}

// TestEnclose checks the assembly of the enclosures: the better lower
// bound is used, the ends are rounded outward, and a lower end above an
// upper end is refused.
func TestEnclose(t *testing.T) {
	l, err := Enclose(2, []float64{3, 6}, []float64{2, 5, 7}, []float64{2.5}, 0.1)
	if err != nil {
		t.Fatal(err)
	}
	if l[0].Lo > 2.4 || l[0].Lo < 2.4-1e-15 || l[0].Hi < 2.9 || l[1].Lo > 4.9 || l[1].Hi < 5.9 {
		t.Errorf("enclosures %v", l)
	}
	g := Gap(l[0], l[1])
	if g.Lo > l[1].Lo-l[0].Hi || g.Hi < l[1].Hi-l[0].Lo {
		t.Errorf("gap %v of %v", g, l)
	}
	if _, err := Enclose(1, []float64{3}, []float64{3.5}, nil, 0); err == nil || !strings.Contains(err.Error(), "internal inconsistency") {
		t.Errorf("crossed bounds: error %v", err)
	}
}
