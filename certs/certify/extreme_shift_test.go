package certify

import (
	"fmt"
	"math"
	"math/big"
	"testing"

	"gapcert/certs"
)

// Adversarial tests of the shift γ (of either sign) and of potentials with
// kinks, each against a reference computed independently of the finite
// elements.

// bigDecimal is the exact decimal s as a seriesPrec-bit big.Float.
func bigDecimal(t *testing.T, s string) *big.Float {
	x, ok := new(big.Float).SetPrec(seriesPrec).SetString(s)
	if !ok {
		t.Fatalf("bad decimal %q", s)
	}
	return x
}

// TestConstantPotentialShifts: V = c constant on (0, 1). Adding a
// constant to the operator adds it to every eigenvalue (common practice),
// so with Dirichlet ends λ_k = c + k²π², and with Neumann ends λ_1 = c,
// λ_2 = c + π² (the Laplacian eigenvalues of an interval: common
// practice). c ranges over large positive constants (negative shifts γ,
// whose 24-bit rounding grows with |c|), a large negative one (γ > 0) and
// a constant that is not a float. Containment is required in every case;
// the widths are checked where the shift leaves room for them (for
// c = 1e15 the rounded shift leaves V + γ ≈ 1.3e7, and only the stage-A
// bounds remain: measured λ widths ≈ 1.6e4, relative 1.6e-11, and gap
// [−15920, 15979]).
//
// No run is stopped by the time limit. The λ widths (about 1 ulp) are
// reached at the first step, where the gap's width relative to its own
// size (3π², or π² for Neumann ends) is larger by about |λ|/gap (3·10⁶
// for c = 1e8); so each run asks for the gap width at which its λ widths
// are at most maxWidth (the gap's absolute width is the sum of theirs),
// and reaches it at the first step: for c = 1e8, 3e-9·3π² ≤ 1e-15·1e8.
// Asking for 1e-15 would refine to the cap (about 4 s per case,
// measured) without narrowing anything. The stage-A case c = 1e15 never
// separates its eigenvalues (relative gap width 67 at best), so its run
// is ended at the first step with λ widths below maxWidth (certifyUntil:
// step 4, about 1 s; stage A alone runs to its cap in about 20 s).
func TestConstantPotentialShifts(t *testing.T) {
	pi2 := new(big.Float).SetPrec(seriesPrec).Mul(bigPi(), bigPi())
	for _, tc := range []struct {
		c, bc    string
		target   float64 // the run's target, met at the first step (0: stage A, see above)
		maxWidth float64 // of λ_1, λ_2 relative to max(|λ|, π²)
	}{
		{"1e8", "dirichlet", 3e-9, 1e-15},
		{"1e8", "neumann", 1e-8, 1e-15},
		{"1e12", "dirichlet", 3e-5, 1e-15},
		{"1e15", "dirichlet", 0, 1e-10},
		{"-1e8", "dirichlet", 3e-9, 1e-15},
		{"123456789.123456789", "dirichlet", 4e-9, 1e-15},
	} {
		src := fmt.Sprintf(`{"domain":{"interval":["0","1"]},"potential":"%s","boundary":"%s","eigenvalues":2}`, tc.c, tc.bc)
		var cert *certs.Certificate
		if tc.target == 0 {
			_, cert = certifyUntil(t, src, 1e-15, func(_ int, w1, w2 float64) bool { return w1 <= tc.maxWidth && w2 <= tc.maxWidth })
		} else {
			_, cert = certifyText(t, src, tc.target)
			if ref, err := RefinementOf(cert); err != nil || ref.StopReason != StopTarget {
				t.Errorf("%s %s: stopped: %v (%v), want the target reached at the first step", tc.c, tc.bc, ref, err)
			}
		}
		c := bigDecimal(t, tc.c)
		for k := 1; k <= 2; k++ {
			m := float64(k * k)
			if tc.bc == "neumann" {
				m = float64((k - 1) * (k - 1))
			}
			truth := new(big.Float).SetPrec(seriesPrec).Mul(pi2, bigF(m))
			truth.Add(truth, c)
			requireContains(t, fmt.Sprintf("%s %s lambda%d", tc.c, tc.bc, k), eigenEnclosure(t, cert, k), truth, math.Pi*math.Pi, tc.maxWidth)
		}
		gap, err := cert.Results.Gap.Interval()
		if err != nil {
			t.Fatal(err)
		}
		gapTruth := new(big.Float).SetPrec(seriesPrec).Mul(pi2, bigF(3))
		if tc.bc == "neumann" {
			gapTruth = pi2
		}
		if !bigInside(gapTruth, gap) {
			t.Errorf("%s %s: gap %v misses %s", tc.c, tc.bc, gap, gapTruth.Text('g', 20))
		}
		var m Method
		if err := decodeMethodInto(cert, &m); err != nil {
			t.Fatal(err)
		}
		t.Logf("%s %s: γ = %s, gap %v, widths %v", tc.c, tc.bc, m.Gamma, gap, cert.Results.RelativeWidths)
	}
}

func decodeMethodInto(c *certs.Certificate, m *Method) error {
	got, err := decodeMethod(c.Method)
	*m = got
	return err
}

// TestConstantPotentialSquare: V = 1e12 on the unit square,
// Dirichlet (stage A on the plain Crouzeix–Raviart space, with its
// constant shift c = min_T (V + γ)): λ = 1e12 + π²(m² + n²) (separation
// of variables, common practice), so λ_1 = 1e12 + 2π², λ_2 = 1e12 + 5π².
// The target 3e-4 is the gap's width (relative to 3π²) at which the λ
// widths are at most 1e-14 of 1e12 (3e-4·3π² ≤ 1e-2); the run reaches it
// at step 3 (gap 8.2e-6, λ 1.2e-16; about 1 s measured), where a target
// of 1e-14 would refine on for minutes without narrowing λ.
func TestConstantPotentialSquare(t *testing.T) {
	_, cert := certifyText(t, `{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},"potential":"1e12","boundary":"dirichlet","eigenvalues":2}`, 3e-4)
	if ref, err := RefinementOf(cert); err != nil || ref.StopReason != StopTarget {
		t.Errorf("stopped: %v (%v), want the target reached", ref, err)
	}
	pi2 := new(big.Float).SetPrec(seriesPrec).Mul(bigPi(), bigPi())
	for k, m := range []float64{2, 5} {
		truth := new(big.Float).SetPrec(seriesPrec).Mul(pi2, bigF(m))
		truth.Add(truth, bigF(1e12))
		requireContains(t, fmt.Sprintf("lambda%d", k+1), eigenEnclosure(t, cert, k+1), truth, math.Pi*math.Pi/2, 1e-14)
	}
	t.Logf("widths %v; warnings %v", cert.Results.RelativeWidths, cert.Warnings)
}

// TestShiftedKinkInsideCell: V = 1e8 + |x − 1/3| on (0, 1),
// Dirichlet. inf V = 1e8 is attained at the kink, which is not a float and
// lies inside a cell (range model there), and the shift is negative.
// Reference: λ_k = 1e8 + μ_k with μ_k those of |x − 1/3| by series
// shooting (kinkReference); V − 1e8 ∈ [0, 2/3] brackets μ_k in
// [k²π², k²π² + 2/3]. The run ends at the refinement cap (about 5 s
// measured) well inside the ample time limit, so the narrowness checked
// does not depend on the machine's load.
func TestShiftedKinkInsideCell(t *testing.T) {
	third := new(big.Float).SetPrec(seriesPrec).Quo(bigF(1), bigF(3))
	twoThirds := new(big.Float).SetPrec(seriesPrec).Quo(bigF(2), bigF(3))
	q := math.Pi * math.Pi
	mu := [2]*big.Float{kinkReference(t, third, twoThirds, q-1e-9, q+2.0/3), kinkReference(t, third, twoThirds, 4*q-1e-9, 4*q+2.0/3)}
	_, cert := certifyText(t, `{"domain":{"interval":["0","1"]},"potential":"1e8 + abs(x - 1/3)","boundary":"dirichlet","eigenvalues":2}`, 1e-14)
	for k := 1; k <= 2; k++ {
		truth := new(big.Float).SetPrec(seriesPrec).Add(bigF(1e8), mu[k-1])
		requireContains(t, fmt.Sprintf("lambda%d", k), eigenEnclosure(t, cert, k), truth, q, 1e-13)
	}
	gap, _ := cert.Results.Gap.Interval()
	gapTruth := new(big.Float).SetPrec(seriesPrec).Sub(mu[1], mu[0])
	requireContains(t, "gap", gap, gapTruth, q, 1e-5)
	t.Logf("gap %v; widths %v; warnings %v", gap, cert.Results.RelativeWidths, cert.Warnings)
}

// cubeRootTwo is 2^(1/3) to seriesPrec bits (Newton's iteration for
// x³ = 2 from 1.26, quadratically convergent; 12 steps are plenty).
func cubeRootTwo() *big.Float {
	x := bigF(1.26)
	for i := 0; i < 12; i++ {
		x2 := new(big.Float).SetPrec(seriesPrec).Mul(x, x)
		num := new(big.Float).SetPrec(seriesPrec).Quo(bigF(2), x2)
		num.Sub(x, num)
		num.Quo(num, bigF(3))
		x = new(big.Float).SetPrec(seriesPrec).Sub(x, num)
	}
	return x
}

// diamondReference returns the two lowest Dirichlet eigenvalues of
// −Δu + |x − y − c|u on the diamond |x| + |y| < 1. In the rotated
// coordinates s = (x − y)/√2, t = (x + y)/√2 the diamond is the square
// (−1/√2, 1/√2)² and V = √2|s − s0|, s0 = c/√2, so the eigenvalues are
// μ_i + j²π²/2 (separation of variables, common practice) with μ_i those of
// −w″ + √2|s − s0|w on (−1/√2, 1/√2) and j²π²/2 those of the t-interval of
// length √2. With s − s0 = βz, β³ = 1/√2, the s-problem becomes
// −w_zz + |z|w = β²μ w on (−(1/√2 + s0)/β, (1/√2 − s0)/β), solved by
// series shooting (kinkReference); β² = 2^(−1/3). Each μ_i lies in
// [i²π²/2, i²π²/2 + 1 + |c|] since 0 ≤ √2|s − s0| ≤ 1 + |c| on the
// s-interval (monotonicity in V).
func diamondReference(t *testing.T, c float64) [2]*big.Float {
	sqrt2 := new(big.Float).SetPrec(seriesPrec).Sqrt(bigF(2))
	invSqrt2 := new(big.Float).SetPrec(seriesPrec).Quo(bigF(1), sqrt2)
	s0 := new(big.Float).SetPrec(seriesPrec).Mul(bigF(c), invSqrt2)
	cbrt2 := cubeRootTwo()
	beta2 := new(big.Float).SetPrec(seriesPrec).Quo(bigF(1), cbrt2) // 2^(−1/3)
	beta := new(big.Float).SetPrec(seriesPrec).Sqrt(beta2)          // 2^(−1/6)
	l1 := new(big.Float).SetPrec(seriesPrec).Add(invSqrt2, s0)      // left of the kink
	l2 := new(big.Float).SetPrec(seriesPrec).Sub(invSqrt2, s0)      // right of it
	l1.Quo(l1, beta)
	l2.Quo(l2, beta)
	b2, _ := beta2.Float64()
	vmax := 1 + math.Abs(c)
	var mu [2]*big.Float
	for i := 1; i <= 2; i++ {
		base := float64(i*i) * math.Pi * math.Pi / 2
		nu := kinkReference(t, l1, l2, (base-1e-9)*b2, (base+vmax+1e-9)*b2)
		mu[i-1] = new(big.Float).SetPrec(seriesPrec).Quo(nu, beta2)
	}
	pi2half := new(big.Float).SetPrec(seriesPrec).Mul(bigPi(), bigPi())
	pi2half.Quo(pi2half, bigF(2))
	var all []*big.Float
	for i := 0; i < 2; i++ {
		for j := 1; j <= 2; j++ {
			v := new(big.Float).SetPrec(seriesPrec).Mul(pi2half, bigF(float64(j*j)))
			all = append(all, v.Add(v, mu[i]))
		}
	}
	for i := range all {
		for j := i + 1; j < len(all); j++ {
			if all[j].Cmp(all[i]) < 0 {
				all[i], all[j] = all[j], all[i]
			}
		}
	}
	return [2]*big.Float{all[0], all[1]}
}

// TestDiamondKinks: V = |x − y − c| on the diamond |x| + |y| < 1,
// Dirichlet, against the separable reference diamondReference. c = 0
// puts the kink on mesh edges that are not axis-parallel (the branch is
// decided on each triangle itself); c = 1/10 makes it cross triangles on
// every uniform refinement (range models there; 1/8 would lie on mesh
// lines from the fourth level on). Also with 1e8 added (negative shift).
// Each run ends by reaching its target (within 1 s, measured), where the
// widths are: 1.7e-3 for c = 0 (the Taylor remainder of the weight
// 1/(V + γ) with V + γ ≥ 2.47 on 8 trial triangles limits stage B at that
// step; with 1e8 added the rounded shift leaves V + γ ≥ 8 and the widths
// fall to 1e-8), 6e-3 for c = 1/10.
func TestDiamondKinks(t *testing.T) {
	scale := math.Pi * math.Pi / 4 // π²/D², D = 2
	for _, tc := range []struct {
		pot      string
		c        float64
		offset   float64
		target   float64 // target relative width of the run
		maxWidth float64 // of λ_k relative to λ_k − offset
	}{
		{"abs(x - y)", 0, 0, 2e-2, 5e-3},
		{"abs(x - y - 1/10)", 0.1, 0, 2e-2, 1e-2},
		{"1e8 + abs(x - y)", 0, 1e8, 1e-6, 1e-5},
	} {
		ref := diamondReference(t, tc.c)
		src := fmt.Sprintf(`{"domain":{"polygon":[["1","0"],["0","1"],["-1","0"],["0","-1"]]},"potential":"%s","boundary":"dirichlet","eigenvalues":2}`, tc.pot)
		_, cert := certifyText(t, src, tc.target)
		for k := 1; k <= 2; k++ {
			truth := new(big.Float).SetPrec(seriesPrec).Add(ref[k-1], bigF(tc.offset))
			got := eigenEnclosure(t, cert, k)
			if !bigInside(truth, got) {
				t.Errorf("%s lambda%d: enclosure %v misses %s", tc.pot, k, got, truth.Text('g', 20))
				continue
			}
			if w := got.Wid() / math.Max(scale, bigPoint(ref[k-1])); w > tc.maxWidth {
				t.Errorf("%s lambda%d: enclosure %v has width %.3g relative to λ − offset", tc.pot, k, got, w)
			}
		}
		t.Logf("%s: reference %s, %s; λ1 %v λ2 %v; warnings %v", tc.pot, ref[0].Text('g', 15), ref[1].Text('g', 15),
			eigenEnclosure(t, cert, 1), eigenEnclosure(t, cert, 2), cert.Warnings)
	}
}

// TestConstantPotentialEquilateral: V = c on the equilateral
// triangle of side 1 (vertices 0, 1, (1 + i√3)/2), Dirichlet, so that every
// triangle of the meshes is equilateral, where the quotient of Liu's
// constant is tightest (0.18918 h_T against 0.1893 h_T). The Dirichlet
// eigenvalues of that triangle are (16π²/9)(m² + mn + n²), m, n ≥ 1
// (Lamé; M. A. Pinsky, The eigenvalues of an equilateral triangle, SIAM
// J. Math. Anal. 11 (1980) 819–827, recalled from memory): λ_1 = c +
// 16π²/3, λ_2 = λ_3 = c + 112π²/9.
func TestConstantPotentialEquilateral(t *testing.T) {
	pi2 := new(big.Float).SetPrec(seriesPrec).Mul(bigPi(), bigPi())
	for _, c := range []string{"0", "1e8"} {
		src := fmt.Sprintf(`{"domain":{"polygon":[["0","0"],["1","0"],["1/2","sqrt(3)/2"]]},"potential":"%s","boundary":"dirichlet","eigenvalues":2}`, c)
		_, cert := certifyText(t, src, 1e-6)
		for k, m := range []int64{3, 7} {
			truth := new(big.Float).SetPrec(seriesPrec).Mul(pi2, big.NewFloat(float64(16*m)))
			truth.Quo(truth, bigF(9))
			truth.Add(truth, bigDecimal(t, c))
			// Widths relative to λ − c (measured 1e-8 and below).
			got := eigenEnclosure(t, cert, k+1)
			if !bigInside(truth, got) {
				t.Errorf("V = %s lambda%d: enclosure %v misses %s", c, k+1, got, truth.Text('g', 20))
			}
			if w := got.Wid() / (16 * float64(m) * math.Pi * math.Pi / 9); w > 1e-6 {
				t.Errorf("V = %s lambda%d: enclosure %v has width %.3g relative to λ − c", c, k+1, got, w)
			}
		}
		t.Logf("V = %s: λ1 %v, λ2 %v; warnings %v", c, eigenEnclosure(t, cert, 1), eigenEnclosure(t, cert, 2), cert.Warnings)
	}
}
