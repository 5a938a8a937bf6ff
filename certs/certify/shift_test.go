package certify

import (
	"math"
	"math/big"
	"strings"
	"testing"

	"gapcert/interval"
)

// TestLargeConstantPotentialInterval: V = 1e8 + x on (0, 1), Dirichlet. Adding a
// constant shifts every eigenvalue by it (common practice), so λ_k =
// 1e8 + μ_k with μ_k the Dirichlet eigenvalues of −u″ + x u on (0, 1),
// computed here by power-series shooting in math/big (series_test.go). The
// shift γ is negative (V is bounded below by 1e8), the λ_k are contained,
// and the gap is certified to relative width ≤ 1e-8 of itself.
func TestLargeConstantPotentialInterval(t *testing.T) {
	one := new(big.Float).SetPrec(seriesPrec).SetInt64(1)
	var mu [3]*big.Float
	for k := 1; k <= 3; k++ {
		// π²k² ≤ μ_k ≤ π²k² + 1 since 0 ≤ x ≤ 1 (monotonicity in V), one
		// eigenvalue per bracket.
		base := math.Pi * math.Pi * float64(k*k)
		mu[k-1] = linearRoot(t, base-1e-9, base+1+1e-9, one, 0, 1, false)
	}
	p, c := certifyText(t, `{"domain":{"interval":["0","1"]},"potential":"1e8 + x","boundary":"dirichlet","eigenvalues":3}`, 1e-8)
	r, err := initialRecipe(p)
	if err != nil {
		t.Fatal(err)
	}
	if !(r.gamma < -9e7) {
		t.Errorf("shift γ = %g, want a negative shift near −1e8", r.gamma)
	}
	offset := new(big.Float).SetPrec(seriesPrec).SetInt64(100000000)
	for k := 1; k <= 3; k++ {
		truth := new(big.Float).SetPrec(seriesPrec).Add(offset, mu[k-1])
		got := eigenEnclosure(t, c, k)
		if !bigInside(truth, got) {
			t.Errorf("lambda%d: enclosure %v misses 1e8 + μ_%d = %s", k, got, k, truth.Text('g', 25))
		}
		// Each end is within a few ulps of 1e8 (ulp 1.49e-8).
		if got.Wid() > 2e-7 {
			t.Errorf("lambda%d: enclosure %v wider than 2e-7", k, got)
		}
	}
	gapTruth := new(big.Float).SetPrec(seriesPrec).Sub(mu[1], mu[0])
	gap, err := c.Results.Gap.Interval()
	if err != nil {
		t.Fatal(err)
	}
	if !bigInside(gapTruth, gap) {
		t.Errorf("gap: enclosure %v misses μ_2 − μ_1 = %s", gap, gapTruth.Text('g', 25))
	}
	if w := gap.Wid() / gap.Mid(); !(w <= 1e-8) {
		t.Errorf("gap: enclosure %v has width %.3g relative to itself, want ≤ 1e-8", gap, w)
	}
	t.Logf("γ = %g; μ_1 = %s, μ_2 = %s; gap %v (relative width %.3g); warnings %v",
		r.gamma, mu[0].Text('g', 20), mu[1].Text('g', 20), gap, gap.Wid()/gap.Mid(), c.Warnings)
}

// TestRoundShiftNegative: roundShift returns a float ≥ g with at most 24
// significant bits, for either sign, within 2⁻²³|g| of g.
func TestRoundShiftNegative(t *testing.T) {
	for _, g := range []float64{-99999990.130395, -1, -0.3, 0, 1e-300, 9.8696044010893586, 3e8 + 1.5} {
		got := roundShift(g)
		if got < g || got-g > math.Ldexp(math.Abs(g), -23) {
			t.Errorf("roundShift(%g) = %g", g, got)
		}
		if m, _ := math.Frexp(got); m != 0 && math.Ldexp(m, 24) != math.Trunc(math.Ldexp(m, 24)) {
			t.Errorf("roundShift(%g) = %g has more than 24 significant bits", g, got)
		}
	}
}

// TestRaiseShift: a nonnegative shift follows the doubling rule; a
// negative one is raised by the failed cell's deficit plus π²/D², and never
// beyond the doubling rule from 0.
func TestRaiseShift(t *testing.T) {
	const scale = 9.8
	if got, want := raiseShift(2, scale, interval.I{Lo: -1, Hi: 3}), roundShift(2*2+scale); got != want {
		t.Errorf("raiseShift(2) = %g, want %g", got, want)
	}
	g := roundShift(-1e8)
	got := raiseShift(g, scale, interval.I{Lo: -0.5, Hi: 3})
	if !(got >= g+0.5+scale && got < g+0.5+scale+100) {
		t.Errorf("raiseShift(%g, deficit 0.5) = %g", g, got)
	}
	if got := raiseShift(-1, scale, interval.I{Lo: math.Inf(-1), Hi: 3}); got != roundShift(scale) {
		t.Errorf("raiseShift with an unbounded deficit = %g, want %g", got, roundShift(scale))
	}
}

// TestLargeConstantPotentialSquare: V = 1e8 + x + y on the unit square,
// Dirichlet, separates (common practice): λ_1 = 1e8 + 2μ_1, λ_2 = λ_3 =
// 1e8 + μ_1 + μ_2 with μ_k those of −u″ + xu on (0, 1) (series shooting).
// Both shifts are negative and the gap is certified to 1e-6 of itself.
func TestLargeConstantPotentialSquare(t *testing.T) {
	one := new(big.Float).SetPrec(seriesPrec).SetInt64(1)
	mu1 := linearRoot(t, math.Pi*math.Pi-1e-9, math.Pi*math.Pi+1, one, 0, 1, false)
	mu2 := linearRoot(t, 4*math.Pi*math.Pi-1e-9, 4*math.Pi*math.Pi+1, one, 0, 1, false)
	p, c := certifyText(t, `{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},"potential":"1e8 + x + y","boundary":"dirichlet","eigenvalues":2}`, 1e-6)
	if r, err := initialRecipe(p); err != nil || !(r.gamma < -9e7 && r.fluxGamma < -9e7) {
		t.Errorf("shifts γ = %g, γ_B = %g (%v), want both near −1e8", r.gamma, r.fluxGamma, err)
	}
	offset := new(big.Float).SetPrec(seriesPrec).SetInt64(100000000)
	l1 := new(big.Float).SetPrec(seriesPrec).Add(offset, mu1)
	l1.Add(l1, mu1)
	l2 := new(big.Float).SetPrec(seriesPrec).Add(offset, mu1)
	l2.Add(l2, mu2)
	for k, truth := range []*big.Float{l1, l2} {
		if got := eigenEnclosure(t, c, k+1); !bigInside(truth, got) {
			t.Errorf("lambda%d: enclosure %v misses %s", k+1, got, truth.Text('g', 25))
		}
	}
	gap, err := c.Results.Gap.Interval()
	if err != nil {
		t.Fatal(err)
	}
	if !bigInside(new(big.Float).SetPrec(seriesPrec).Sub(mu2, mu1), gap) {
		t.Errorf("gap: enclosure %v misses μ_2 − μ_1", gap)
	}
	if w := gap.Wid() / gap.Mid(); !(w <= 1e-6) {
		t.Errorf("gap: enclosure %v has width %.3g relative to itself, want ≤ 1e-6", gap, w)
	}
}

// TestCheckNegativeShift: a certificate with a negative γ verifies by
// recomputation, and the same certificate with γ raised by 2⁻⁴ (still
// sound, but not what was computed) does not.
func TestCheckNegativeShift(t *testing.T) {
	_, c := certifyText(t, `{"domain":{"interval":["0","1"]},"potential":"1e8 + x","boundary":"dirichlet","eigenvalues":2}`, 1e-8)
	data, err := c.Marshal()
	if err != nil {
		t.Fatal(err)
	}
	if err := Check(data); err != nil {
		t.Fatalf("certificate with γ < 0 does not verify: %v", err)
	}
	edited := strings.Replace(string(data), `"gamma": "-99999984"`, `"gamma": "-99999983.9375"`, 1)
	if edited == string(data) {
		t.Fatalf("γ = -99999984 not found in the certificate")
	}
	if err := Check([]byte(edited)); err == nil {
		t.Errorf("a certificate with an edited γ verifies")
	}
}

// TestRaiseShiftsKeepsFluxShiftAbove: after a failed sign check on a
// polygon both shifts rise and γ_B stays ≥ γ (Check refuses flux_gamma <
// gamma); before raiseShifts, γ alone was raised, so γ = 1, γ_B = 5 became
// γ = 11.8 > γ_B = 5. On intervals γ_B is unused and stays 0.
func TestRaiseShiftsKeepsFluxShiftAbove(t *testing.T) {
	const scale = 9.8
	failed := interval.I{Lo: -0.5, Hi: 3}
	for _, r := range []recipe{
		{gamma: 1, fluxGamma: 5, scale: scale},
		{gamma: roundShift(-1e8), fluxGamma: roundShift(-1e8), scale: scale},
		{gamma: roundShift(-1e8), fluxGamma: roundShift(-1e8 + 40), scale: scale},
	} {
		got := raiseShifts(r, 2, failed)
		if !(got.gamma > r.gamma && got.fluxGamma > r.fluxGamma && got.fluxGamma >= got.gamma) {
			t.Errorf("raiseShifts(γ = %g, γ_B = %g) = (%g, %g), want both raised and γ_B ≥ γ", r.gamma, r.fluxGamma, got.gamma, got.fluxGamma)
		}
	}
	if got := raiseShifts(recipe{gamma: 1, scale: scale}, 1, failed); got.fluxGamma != 0 || got.gamma != roundShift(2+scale) {
		t.Errorf("interval: raiseShifts = (%g, %g), want (%g, 0)", got.gamma, got.fluxGamma, roundShift(2+scale))
	}
}
