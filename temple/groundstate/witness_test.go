package groundstate

import (
	"math"
	"math/rand"
	"testing"

	"gapcert/interval"
)

// triple builds the three discs of a midpoint test for the case c: centres
// x, y and their exact midpoint, radii rx, ry, rm, ũ the Taylor polynomial
// of degree deg on each, and the common bound E: the largest of the three
// local bounds sup|u − ũ|·√(πR²) and floor (one bound for all three discs,
// as a global ‖ũ − P₁ũ‖ would be).
func triple(c exactCase, x, y [2]float64, rx, ry, rm float64, deg int, floor float64) (dx, dy, dm Disc, E float64) {
	m, ok := ExactMidpoint(x, y)
	if !ok {
		panic("test: midpoint not exact")
	}
	E = floor
	mk := func(p [2]float64, R float64) Disc {
		coef, sup := c.taylor(p, R, deg)
		E = max(E, errL2(sup, R))
		return Disc{Centre: p, Radius: R, Coef: coef}
	}
	return mk(x, rx), mk(y, ry), mk(m, rm), E
}

// exactMargin encloses u(x)u(y) − u(m)² from the closed form.
func exactMargin(c exactCase, x, y, m [2]float64) interval.I {
	return c.value(x).Mul(c.value(y)).Sub(c.value(m).Sqr())
}

// u = cosh(x)·cos(2y) is not log-concave: on the x-axis log u = log cosh x
// is strictly convex, and u(1, 0)·u(−1, 0) − u(0, 0)² = cosh²1 − 1 =
// sinh²1 ≈ 1.3811. The witness is certified with the Taylor data and with
// a global bound E = 1e-6, the margin is below the truth and close to it.
func TestCertifyMidpointCoshCos(t *testing.T) {
	c := coshCosCase()
	x, y := [2]float64{-1, 0}, [2]float64{1, 0}
	for _, floor := range []float64{0, 1e-6} {
		dx, dy, dm, E := triple(c, x, y, 0.5, 0.5, 0.5, 14, floor)
		res, err := CertifyMidpoint(c.v, c.lambda, E, dx, dy, dm, DiscOptions{})
		if err != nil {
			t.Fatal(err)
		}
		truth := exactMargin(c, x, y, dm.Centre)
		// The gap to the truth: the mean terms (≈ E/√(πR²) each, times
		// |u| ≈ 1.5) and the width 2e-10 relative of [λ] in the residuals.
		if !res.Certified || !(res.Margin <= truth.Lo) || truth.Lo-res.Margin > 10*E+1e-9 {
			t.Fatalf("E = %g: certified %v, margin %g, truth %v", E, res.Certified, res.Margin, truth)
		}
		for i, p := range [][2]float64{x, y, dm.Centre} {
			enc := [3]PointEnclosure{res.X, res.Y, res.M}[i]
			if !contains(enc.U, c.value(p)) {
				t.Fatalf("u(%v) = %v not in %v", p, c.value(p), enc.U)
			}
		}
		t.Logf("cosh·cos, E = %.3g: margin %.10g (truth %.10g), widths %.3g %.3g %.3g", E, res.Margin, truth.Mid(),
			res.X.U.Wid(), res.Y.U.Wid(), res.M.U.Wid())
	}
	// Close points: the strict convexity of log cosh gives a margin of
	// order |x − y|²; with |x − y| = 1/8 around x = 0.5 it is still
	// certified with E = 1e-9.
	x, y = [2]float64{0.4375, 0.125}, [2]float64{0.5625, 0.125}
	dx, dy, dm, E := triple(c, x, y, 0.25, 0.25, 0.25, 14, 1e-9)
	res, err := CertifyMidpoint(c.v, c.lambda, E, dx, dy, dm, DiscOptions{})
	if err != nil {
		t.Fatal(err)
	}
	truth := exactMargin(c, x, y, dm.Centre)
	if !res.Certified || !(res.Margin <= truth.Lo) {
		t.Fatalf("close points: certified %v, margin %g, truth %v", res.Certified, res.Margin, truth)
	}
	t.Logf("cosh·cos, |x − y| = 1/8, E = %.3g: margin %.6g (truth %.6g)", E, res.Margin, truth.Mid())
}

// The quartic double well u = exp(x²/2 − x⁴/4 − y²/2) with
// V = (x³ − x)² + y² − 3x² (a polynomial potential): log u is convex in x
// near 0, and the triple (±1/2, 1/10), (0, 1/10) is a certified witness.
func TestCertifyMidpointQuarticWell(t *testing.T) {
	c := quarticWellCase()
	x, y := [2]float64{-0.5, 0.1}, [2]float64{0.5, 0.1}
	dx, dy, dm, E := triple(c, x, y, 0.3, 0.3, 0.3, 14, 0)
	res, err := CertifyMidpoint(c.v, c.lambda, E, dx, dy, dm, DiscOptions{})
	if err != nil {
		t.Fatal(err)
	}
	truth := exactMargin(c, x, y, dm.Centre)
	if !res.Certified || !(res.Margin <= truth.Lo) || truth.Lo-res.Margin > 1e-3*truth.Lo {
		t.Fatalf("certified %v, margin %g, truth %v", res.Certified, res.Margin, truth)
	}
	t.Logf("quartic well, E = %.3g: margin %.10g (truth %.10g)", E, res.Margin, truth.Mid())
}

// sin πx sin πy is log-concave (a product of log-concave factors; also
// Brascamp–Lieb for the convex square), and so is Lamé's ground state of
// the equilateral triangle (Brascamp–Lieb: Dirichlet, convex domain,
// V = 0): at 200 random triples each (4,000 with GAPCERT_LONG=1), half of
// them with |x − y| < 0.01, no witness is certified and the margin is
// below the exact one.
func TestCertifyMidpointNoWitnessWhenLogConcave(t *testing.T) {
	for _, tc := range []struct {
		c     exactCase
		point func(*rand.Rand) [2]float64
		dist  func([2]float64) float64
	}{
		{squareCase(), func(r *rand.Rand) [2]float64 { return [2]float64{r.Float64(), r.Float64()} }, distSquare},
		{triangleCase(), randomInTriangle, distTriangle},
	} {
		rng := rand.New(rand.NewSource(7))
		n, closest := 0, math.Inf(-1)
		total := pointCount() / 6 // 200, or 4,000 with GAPCERT_LONG=1
		for n < total {
			x := tc.point(rng)
			y := tc.point(rng)
			if n%2 == 1 {
				// a close pair: y within 0.01 of x, in the domain
				y = [2]float64{x[0] + 0.01*(2*rng.Float64()-1), x[1] + 0.01*(2*rng.Float64()-1)}
			}
			m, ok := ExactMidpoint(x, y)
			if !ok || tc.dist(x) < 1e-3 || tc.dist(y) < 1e-3 || tc.dist(m) < 1e-3 {
				continue
			}
			dx, dy, dm, E := triple(tc.c, x, y, 0.9*tc.dist(x), 0.9*tc.dist(y), 0.9*tc.dist(m), 12, 0)
			res, err := CertifyMidpoint(tc.c.v, tc.c.lambda, E, dx, dy, dm, DiscOptions{})
			if err != nil {
				t.Fatal(err)
			}
			truth := exactMargin(tc.c, x, y, m)
			if res.Certified || res.Margin > truth.Hi {
				t.Fatalf("%s: x %v y %v: certified %v, margin %g, exact %v", tc.c.name, x, y, res.Certified, res.Margin, truth)
			}
			closest = max(closest, res.Margin)
			n++
		}
		t.Logf("%s: %d triples, no witness; largest margin %.3g (negative: u(m)² > u(x)u(y))", tc.c.name, total, closest)
	}
}

func TestExactMidpoint(t *testing.T) {
	if m, ok := ExactMidpoint([2]float64{0.25, -1}, [2]float64{0.5, 3}); !ok || m != [2]float64{0.375, 1} {
		t.Errorf("got %v, %v", m, ok)
	}
	// 0.1 + 0.2 is not a float64.
	if _, ok := ExactMidpoint([2]float64{0.1, 0}, [2]float64{0.2, 0}); ok {
		t.Error("0.1 + 0.2 reported exact")
	}
	c := coshCosCase()
	dx, dy, dm, E := triple(c, [2]float64{-1, 0}, [2]float64{1, 0}, 0.5, 0.5, 0.5, 6, 0)
	dm.Centre[0] = 0.001
	defer func() {
		if recover() == nil {
			t.Error("no panic for a middle disc off the midpoint")
		}
	}()
	_, _ = CertifyMidpoint(c.v, c.lambda, E, dx, dy, dm, DiscOptions{})
}

func BenchmarkCertifyMidpoint(b *testing.B) {
	c := quarticWellCase()
	dx, dy, dm, E := triple(c, [2]float64{-0.5, 0.1}, [2]float64{0.5, 0.1}, 0.3, 0.3, 0.3, 12, 0)
	for b.Loop() {
		if _, err := CertifyMidpoint(c.v, c.lambda, E, dx, dy, dm, DiscOptions{}); err != nil {
			b.Fatal(err)
		}
	}
}
