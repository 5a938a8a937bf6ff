package groundstate

import (
	"errors"
	"math"
	"math/rand"
	"os"
	"sort"
	"testing"

	"gapcert/interval"
	"gapcert/interval/formula"
)

// kernelQuad returns ∫_0^1 k(t) t^(n+1) dt and ∫_0^1 k(t)² t dt for
// k(t) = −log t − (1 − t²)/2 by the composite Gauss–Legendre rule (3 points)
// on a geometric grid towards 0 (float; an independent check of the closed
// forms, whose integrands have a log singularity at 0).
func kernelQuad(n int) (moment, square float64) {
	k := func(t float64) float64 { return -math.Log(t) - (1-t*t)/2 }
	nodes := [3]float64{-math.Sqrt(0.6), 0, math.Sqrt(0.6)}
	weights := [3]float64{5.0 / 9, 8.0 / 9, 5.0 / 9}
	hi := 1.0
	for hi > 1e-30 {
		lo := hi / 2
		for s := 0; s < 64; s++ {
			a := lo + (hi-lo)*float64(s)/64
			b := lo + (hi-lo)*float64(s+1)/64
			for q := range nodes {
				t := (a+b)/2 + (b-a)/2*nodes[q]
				w := weights[q] * (b - a) / 2
				moment += w * k(t) * math.Pow(t, float64(n+1))
				square += w * k(t) * k(t) * t
			}
		}
		hi = lo
	}
	return moment, square
}

// The mean-value kernel K(r) = (1/2π)(log(R/r) − (1 − r²/R²)/2): its
// closed-form integrals (D2), (D4) against quadrature of the definition,
// its sign, and the identity (D1) on monomials.
func TestKernelClosedForms(t *testing.T) {
	for _, tc := range []struct {
		name string
		k    func(t float64) float64
	}{{"k", func(t float64) float64 { return -math.Log(t) - (1-t*t)/2 }}} {
		for i := 1; i <= 1000; i++ {
			if v := tc.k(float64(i) / 1000); v < 0 {
				t.Fatalf("%s(%g) = %g < 0", tc.name, float64(i)/1000, v)
			}
		}
	}
	// ∫_0^1 k t^(n+1) dt = 2/((n+2)²(n+4)) and ∫_0^1 k² t dt = 5/48.
	for n := 0; n <= 12; n += 2 {
		m, sq := kernelQuad(n)
		want := 2 / (float64(n+2) * float64(n+2) * float64(n+4))
		if math.Abs(m-want) > 1e-12 {
			t.Errorf("n=%d: quadrature %.15g, closed form %.15g", n, m, want)
		}
		if math.Abs(sq-5.0/48) > 1e-12 {
			t.Errorf("∫k²t = %.15g, want 5/48", sq)
		}
	}
	// ‖K‖₂ = R√(5/(96π)) = R·√((1/(2π))·(5/48)) and ∫K = R²/8 (n = 0).
	_, sq := kernelQuad(0)
	if f := kernelL2Factor(); !(f.Lo <= math.Sqrt(sq/(2*math.Pi))*(1+1e-12) && math.Sqrt(sq/(2*math.Pi)) <= f.Hi*(1+1e-12)) || f.Wid() > 1e-15 {
		t.Errorf("‖K‖₂ factor %v, quadrature %.17g", f, math.Sqrt(sq/(2*math.Pi)))
	}
	for _, R := range []float64{1, 0.3, 1e-3} {
		if m := kernelMoment(0, 0, R); !m.Contains(R*R/8) && !(m.Lo <= R*R/8*(1+1e-15) && R*R/8*(1-1e-15) <= m.Hi) {
			t.Errorf("∫K over B_%g = %v, want R²/8", R, m)
		}
		// Angular factor: ∫K d_x^a d_y^b against a polar quadrature.
		for _, ab := range [][2]int{{2, 0}, {0, 2}, {2, 2}, {4, 2}, {6, 0}, {1, 2}, {3, 3}} {
			a, b := ab[0], ab[1]
			n := a + b
			rad, _ := kernelQuad(n)
			var ang float64
			const m = 4096
			for i := range m {
				th := 2 * math.Pi * (float64(i) + 0.5) / m
				ang += math.Pow(math.Cos(th), float64(a)) * math.Pow(math.Sin(th), float64(b))
			}
			ang *= 2 * math.Pi / m
			want := math.Pow(R, float64(n+2)) / (2 * math.Pi) * rad * ang
			got := kernelMoment(a, b, R)
			if math.Abs(got.Mid()-want) > 1e-12*math.Pow(R, float64(n+2)) || got.Wid() > 1e-15*math.Pow(R, float64(n+2)) {
				t.Errorf("R=%g a=%d b=%d: moment %v, quadrature %.15g", R, a, b, got, want)
			}
		}
	}
	// (D1) on p = d_x^a d_y^b (a, b even, a + b ≥ 2): p(0) = 0 must equal
	// mean(p) + ∫K(−Δp), with mean(p) = (1/(πR²))∫_B p =
	// R^n·2(a−1)!!(b−1)!!/((n+2)·n!!) (polar coordinates).
	R := 0.7
	for a := 0; a <= 16; a += 2 {
		for b := 0; a+b <= 16; b += 2 {
			if a+b == 0 {
				continue
			}
			n := a + b
			mean := interval.Point(2)
			for k := 1; k < a; k += 2 {
				mean = mean.MulF(float64(k))
			}
			for k := 1; k < b; k += 2 {
				mean = mean.MulF(float64(k))
			}
			for k := 2; k <= n; k += 2 {
				mean = mean.DivF(float64(k))
			}
			mean = mean.DivF(float64(n + 2)).Mul(interval.Point(R).PowInt(n))
			var lap interval.I
			if a >= 2 {
				lap = lap.Add(kernelMoment(a-2, b, R).MulF(float64(a * (a - 1))))
			}
			if b >= 2 {
				lap = lap.Add(kernelMoment(a, b-2, R).MulF(float64(b * (b - 1))))
			}
			sum := mean.Sub(lap)
			if !sum.ContainsZero() || sum.Mag() > 1e-14 {
				t.Errorf("a=%d b=%d: mean + ∫K(−Δp) = %v, want 0", a, b, sum)
			}
		}
	}
}

// TestEquilateralGroundStateFormula checks Lamé's form of triangleCase:
// zero on the three sides, positive inside, equal to its product form,
// and −Δu = (16π²/3)u by a fourth-order difference quotient (float).
func TestEquilateralGroundStateFormula(t *testing.T) {
	s3 := math.Sqrt(3)
	u := func(x, y float64) float64 {
		return math.Sin(4*math.Pi*y/s3) - math.Sin(2*math.Pi*(x+y/s3)) + math.Sin(2*math.Pi*(x-y/s3))
	}
	lam := 16 * math.Pi * math.Pi / 3
	rng := rand.New(rand.NewSource(11))
	for range 200 {
		s := rng.Float64()
		for _, p := range [][2]float64{{s, 0}, {s / 2, s * s3 / 2}, {1 - s/2, s * s3 / 2}} {
			if v := u(p[0], p[1]); math.Abs(v) > 1e-13 {
				t.Fatalf("u = %g on the side at %v", v, p)
			}
		}
		p := randomInTriangle(rng)
		if u(p[0], p[1]) <= 0 {
			t.Fatalf("u ≤ 0 inside at %v", p)
		}
		prod := 4 * math.Sin(2*math.Pi*p[1]/s3) * math.Sin(math.Pi*(p[0]+p[1]/s3)) * math.Sin(math.Pi*(p[0]-p[1]/s3))
		if math.Abs(prod-u(p[0], p[1])) > 1e-13 {
			t.Fatalf("product form %g, sum of waves %g at %v", prod, u(p[0], p[1]), p)
		}
		const h = 1e-3
		d2 := func(f func(s float64) float64) float64 {
			return (-f(2*h) + 16*f(h) - 30*f(0) + 16*f(-h) - f(-2*h)) / (12 * h * h)
		}
		lap := d2(func(s float64) float64 { return u(p[0]+s, p[1]) }) + d2(func(s float64) float64 { return u(p[0], p[1]+s) })
		if r := -lap - lam*u(p[0], p[1]); math.Abs(r) > 1e-5 {
			t.Fatalf("−Δu − λu = %g at %v", r, p)
		}
	}
}

// randomInTriangle returns a uniform random point of the equilateral
// triangle (0, 0), (1, 0), (1/2, √3/2).
func randomInTriangle(rng *rand.Rand) [2]float64 {
	a, b := rng.Float64(), rng.Float64()
	if a+b > 1 {
		a, b = 1-a, 1-b
	}
	return [2]float64{a + b/2, b * math.Sqrt(3) / 2}
}

// distTriangle is the distance from p to the boundary of that triangle.
func distTriangle(p [2]float64) float64 {
	s3 := math.Sqrt(3)
	return min(p[1], (s3*p[0]-p[1])/2, (s3*(1-p[0])-p[1])/2)
}

func distSquare(p [2]float64) float64 {
	return min(p[0], 1-p[0], p[1], 1-p[1])
}

// enclosureRun is one pointwise enclosure with its exact value.
type enclosureRun struct {
	dist, R float64
	enc     PointEnclosure
	exact   interval.I
	sup     float64 // sup_B |u − ũ| bound of the test
	// lamTerm ≥ (wid([λ]) + wid(τ))·∫_B K |ũ|, the width the residual
	// integral owes to the width of the enclosure of λ1 and to the
	// remainder τ of V's model.
	lamTerm float64
}

// runEnclosures encloses u at n random points (radius frac·distance to
// the boundary, frac cycling through fracs) and checks containment.
func runEnclosures(t *testing.T, c exactCase, n, deg int, fracs []float64, point func(*rand.Rand) [2]float64, dist func([2]float64) float64, seed int64) []enclosureRun {
	t.Helper()
	rng := rand.New(rand.NewSource(seed))
	runs := make([]enclosureRun, 0, n)
	strong := 0
	for i := range n {
		p := point(rng)
		d := dist(p)
		if d <= 1e-9 {
			continue
		}
		R := fracs[i%len(fracs)] * d
		coef, sup := c.taylor(p, R, deg)
		enc, err := EnclosePoint(c.v, c.lambda, errL2(sup, R), Disc{Centre: p, Radius: R, Coef: coef}, DiscOptions{})
		if err != nil {
			t.Fatalf("%s at %v: %v", c.name, p, err)
		}
		ex := c.value(p)
		if !contains(enc.U, ex) {
			t.Fatalf("%s at %v (R = %g): enclosure %v does not contain u = %v", c.name, p, R, enc.U, ex)
		}
		if ex.Wid() <= enc.U.Wid()/4 {
			strong++
		}
		// ∫_B K |ũ| (wid [λ] + wid τ) ≤ (R²/8)·sup|ũ|·(…): the width the
		// residual integral owes to the widths of [λ] and of V's remainder.
		lamTerm := (c.lambda.Wid() + enc.VRemainder.Wid()) * R * R / 8 * rangeOnBox(coef, R).Mag() * (1 + 1e-9)
		runs = append(runs, enclosureRun{dist: d, R: R, enc: enc, exact: ex, sup: sup, lamTerm: lamTerm})
	}
	// The exact values are interval evaluations of closed forms; where such
	// an enclosure is as wide as ours (cancellation in the formula near a
	// zero of u) only overlap can be asked. Most points must be in the
	// strong case.
	if strong < len(runs)*9/10 {
		t.Errorf("%s: only %d of %d exact values narrow enough for the subset test", c.name, strong, len(runs))
	}
	return runs
}

// contains reports whether the enclosure enc is consistent with the exact
// value known only as the enclosure ex: ex ⊆ enc when ex is at most a
// quarter as wide as enc, else enc ∩ ex ≠ ∅ (the exact value lies in both;
// when the widths are alike, the exact value may sit at an end of ex
// outside enc without any fault of enc).
func contains(enc, ex interval.I) bool {
	if ex.Wid() <= enc.Wid()/4 {
		return ex.Subset(enc)
	}
	_, ok := enc.Intersection(ex)
	return ok
}

// checkNarrow checks that the width is what (D3) predicts from the test's
// own bound of sup|u − ũ| (MeanBound = that sup when E_B = sup·√(πR²)),
// with the residual integral adding no more than the width of [λ] times
// ∫_B K|ũ| plus slack (rounding), and logs widths near the centre and near
// the boundary.
func checkNarrow(t *testing.T, name string, runs []enclosureRun, slack float64) {
	t.Helper()
	var centre, edge []float64
	var maxDist float64
	for _, r := range runs {
		maxDist = max(maxDist, r.dist)
	}
	for _, r := range runs {
		want := 2*(r.enc.MeanBound+r.enc.KernelBound)*(1+1e-9) + r.lamTerm + slack
		if w := r.enc.U.Wid(); w > want {
			t.Errorf("%s: width %g at distance %g (R = %g), want ≤ %g (residual %v)", name, w, r.dist, r.R, want, r.enc.Residual)
		}
		if r.enc.MeanBound > r.sup*(1+1e-9) {
			t.Errorf("%s: mean term %g above sup|u − ũ| = %g", name, r.enc.MeanBound, r.sup)
		}
		switch {
		case r.dist > 0.8*maxDist:
			centre = append(centre, r.enc.U.Wid())
		case r.dist < 0.05*maxDist:
			edge = append(edge, r.enc.U.Wid())
		}
	}
	med := func(s []float64) float64 {
		if len(s) == 0 {
			return math.NaN()
		}
		sort.Float64s(s)
		return s[len(s)/2]
	}
	if len(edge) > 0 {
		t.Logf("%s: %d points; median width near the centre %.3g (%d points), near the boundary %.3g (%d points)",
			name, len(runs), med(centre), len(centre), med(edge), len(edge))
		return
	}
	byR := map[float64][]float64{}
	for _, r := range runs {
		byR[r.R] = append(byR[r.R], r.enc.U.Wid())
	}
	radii := make([]float64, 0, len(byR))
	for R := range byR {
		radii = append(radii, R)
	}
	sort.Float64s(radii)
	for _, R := range radii {
		t.Logf("%s: R = %g: median width %.3g (%d points)", name, R, med(byR[R]), len(byR[R]))
	}
}

// pointCount is the number of random points of the containment tests:
// 1,200, or 24,000 with GAPCERT_LONG=1.
func pointCount() int {
	if os.Getenv("GAPCERT_LONG") == "1" {
		return 24000
	}
	return 1200
}

// Unit square, u = sin πx sin πy: containment at 1,200 random points with
// discs of radius 0.95, 0.5 and 0.1 times the distance to the boundary,
// ũ the Taylor polynomial of degree 16 in each variable.
func TestEnclosePointUnitSquare(t *testing.T) {
	c := squareCase()
	runs := runEnclosures(t, c, pointCount(), 16, []float64{0.95, 0.5, 0.1},
		func(r *rand.Rand) [2]float64 { return [2]float64{r.Float64(), r.Float64()} }, distSquare, 1)
	if len(runs) < 1000 {
		t.Fatalf("only %d points", len(runs))
	}
	checkNarrow(t, c.name, runs, 1e-13)
	// Absolute target: width ≤ 2e-10 for R ≥ 0.2 (mostly the relative
	// width 2e-10 of [λ] times ∫_B K ũ ≈ R²/8).
	for _, r := range runs {
		if r.R >= 0.2 && r.enc.U.Wid() > 2e-10 {
			t.Errorf("width %g at R = %g", r.enc.U.Wid(), r.R)
		}
	}
	// With a fixed global bound E = 1e-6 (above every E_B of the Taylor
	// polynomials here), as a certified ‖ũ − P₁ũ‖ would give: the widths
	// near the centre and near the boundary, absolute and relative to u.
	const E = 1e-6
	rng := rand.New(rand.NewSource(4))
	var centre, edge [][2]float64
	for range 1000 {
		p := [2]float64{rng.Float64(), rng.Float64()}
		d := distSquare(p)
		if d < 1e-6 {
			continue
		}
		R := 0.95 * d
		coef, sup := c.taylor(p, R, 16)
		if errL2(sup, R) > E {
			t.Fatalf("Taylor error above E at %v", p)
		}
		enc, err := EnclosePoint(c.v, c.lambda, E, Disc{Centre: p, Radius: R, Coef: coef}, DiscOptions{})
		if err != nil {
			t.Fatal(err)
		}
		ex := c.value(p)
		if !ex.Subset(enc.U) {
			t.Fatalf("E = %g at %v: %v misses u = %v", E, p, enc.U, ex)
		}
		w := [2]float64{enc.U.Wid(), enc.U.Wid() / ex.Mid()}
		switch {
		case d > 0.4:
			centre = append(centre, w)
		case d < 0.02:
			edge = append(edge, w)
		}
	}
	med := func(s [][2]float64, k int) float64 {
		v := make([]float64, len(s))
		for i := range s {
			v[i] = s[i][k]
		}
		sort.Float64s(v)
		return v[len(v)/2]
	}
	t.Logf("E = %g, R = 0.95·distance: median width near the centre (d > 0.4) %.3g (relative %.3g), near the boundary (d < 0.02) %.3g (relative %.3g)",
		E, med(centre, 0), med(centre, 1), med(edge, 0), med(edge, 1))
	if m := med(centre, 0); m > 2*E/(math.Sqrt(math.Pi)*0.38)*(1+4.6*0.25) {
		t.Errorf("median width near the centre %g", m)
	}
}

// Equilateral triangle, Lamé's ground state: containment at 1,200 random
// points, ũ the total-degree-16 Taylor polynomial.
func TestEnclosePointEquilateralTriangle(t *testing.T) {
	c := triangleCase()
	runs := runEnclosures(t, c, pointCount(), 16, []float64{0.95, 0.5, 0.1}, randomInTriangle, distTriangle, 2)
	if len(runs) < 1000 {
		t.Fatalf("only %d points", len(runs))
	}
	checkNarrow(t, c.name, runs, 1e-12)
}

// Potentials: the harmonic oscillator and the quartic double well
// (polynomial V, exact model) with discs of radius 0.6, 0.3, 0.05, and
// Pöschl–Teller (V not a polynomial, model with a remainder) with radius
// 0.15, 0.08, 0.02, at 300 random points of [−2, 2]² each (the identity is
// local: these u solve the equation on all of R²).
func TestEnclosePointWithPotential(t *testing.T) {
	for _, tc := range []struct {
		c     exactCase
		radii []float64
	}{
		{oscillatorCase(), []float64{0.6, 0.3, 0.05}},
		{quarticWellCase(), []float64{0.6, 0.3, 0.05}},
		{poschlTellerCase(), []float64{0.15, 0.08, 0.02}},
	} {
		runs := runEnclosures(t, tc.c, 300, 12, tc.radii,
			func(r *rand.Rand) [2]float64 { return [2]float64{4*r.Float64() - 2, 4*r.Float64() - 2} },
			func([2]float64) float64 { return 1 }, 3)
		checkNarrow(t, tc.c.name, runs, 1e-12)
		var worstRho float64
		for _, r := range runs {
			worstRho = max(worstRho, r.enc.VRemainder.Mag())
		}
		t.Logf("%s: largest |remainder of V's model| %.3g", tc.c.name, worstRho)
	}
}

// The width for a fixed global bound E: MeanBound = E/√(πR²) grows like
// 1/R as the disc shrinks, so the largest disc is best (package doc).
func TestEnclosePointWidthScalesInverselyWithRadius(t *testing.T) {
	c := squareCase()
	p := [2]float64{0.5, 0.5}
	const E = 1e-6
	prev := 0.0
	for _, R := range []float64{0.45, 0.2, 0.1, 0.01, 0.001} {
		coef, sup := c.taylor(p, R, 16)
		if errL2(sup, R) > E {
			t.Fatalf("the Taylor error at R = %g exceeds E", R)
		}
		enc, err := EnclosePoint(c.v, c.lambda, E, Disc{Centre: p, Radius: R, Coef: coef}, DiscOptions{})
		if err != nil {
			t.Fatal(err)
		}
		if !c.value(p).Subset(enc.U) {
			t.Fatalf("R = %g: %v misses u", R, enc.U)
		}
		w := enc.U.Wid()
		ideal := 2 * E / (math.Sqrt(math.Pi) * R)
		t.Logf("E = %g, R = %g: width %.4g (2E/√(πR²) = %.4g, kernel term %.3g)", E, R, w, ideal, 2*enc.KernelBound)
		// 2·KernelBound/ideal = √(5/96)·|λ|·R² ≈ 4.5R² (λ = 2π²), and the
		// width of [λ] adds at most 1e-10·2π²·R²/8·2.
		hi := ideal*(1+4.6*R*R) + 5e-10*R*R
		if w < ideal || w > hi {
			t.Errorf("R = %g: width %g, want in [%g, %g]", R, w, ideal, hi)
		}
		if w <= prev {
			t.Errorf("width did not grow as R shrank")
		}
		prev = w
	}
}

// The hypotheses matter: with the honest bound E_B and λ1 ∈ [λ] the
// enclosure holds; with E_B = 0 for a ũ that is off by δ at x0, or with
// an interval [λ] that misses λ1, it is false, in the way the doc says
// (the mean term drops, or the residual shifts by (λ − λ1)∫_B K ũ).
func TestEnclosePointNeedsItsHypotheses(t *testing.T) {
	c := squareCase()
	p := [2]float64{0.5, 0.5}
	R := 0.45
	coef, sup := c.taylor(p, R, 16)
	const delta = 1e-3
	coef[0][0] = coef[0][0].AddF(delta) // ũ = Taylor + δ: |u − ũ| ≤ sup + δ
	honest := errL2(interval.Point(sup).AddF(delta).Hi, R)
	d := Disc{Centre: p, Radius: R, Coef: coef}
	exact := c.value(p)
	good, err := EnclosePoint(c.v, c.lambda, honest, d, DiscOptions{})
	if err != nil || !exact.Subset(good.U) {
		t.Fatalf("honest data: %v, %v (u = %v)", good.U, err, exact)
	}
	small, _ := EnclosePoint(c.v, c.lambda, 0, d, DiscOptions{})
	if small.U.Contains(exact.Mid()) {
		t.Errorf("E_B = 0 should exclude u here, got %v ∋ %v", small.U, exact)
	}
	wrong := c.lambda.AddF(5)
	shifted, _ := EnclosePoint(c.v, wrong, honest, d, DiscOptions{})
	if shifted.U.Contains(exact.Mid()) {
		t.Errorf("a wrong λ should exclude u here, got %v", shifted.U)
	}
	// The shift is 5·∫_B K ũ (the moments are checked in
	// TestKernelClosedForms).
	var kU interval.I
	for a, row := range coef {
		for b, cf := range row {
			kU = kU.Add(cf.Mul(kernelMoment(a, b, R)))
		}
	}
	want := 5 * kU.Mid()
	if got := shifted.Residual.Mid() - good.Residual.Mid(); math.Abs(got-want) > 1e-9*want {
		t.Errorf("residual shift %g, want ≈ %g", got, want)
	}
}

// Misuse EnclosePoint can detect panics; a V without a model on the
// triangle around the disc is an error.
func TestEnclosePointRefusals(t *testing.T) {
	c := squareCase()
	p := [2]float64{0.5, 0.5}
	coef, _ := c.taylor(p, 0.3, 6)
	ok := Disc{Centre: p, Radius: 0.3, Coef: coef}
	for _, tc := range []struct {
		name   string
		v      *formula.Expr
		lambda interval.I
		e      float64
		d      Disc
	}{
		{"nil V", nil, c.lambda, 0, ok},
		{"unbounded λ", c.v, interval.New(0, math.Inf(1)), 0, ok},
		{"negative E_B", c.v, c.lambda, -1e-9, ok},
		{"NaN E_B", c.v, c.lambda, math.NaN(), ok},
		{"infinite E_B", c.v, c.lambda, math.Inf(1), ok},
		{"zero R", c.v, c.lambda, 0, Disc{Centre: p, Radius: 0, Coef: coef}},
		{"negative R", c.v, c.lambda, 0, Disc{Centre: p, Radius: -1, Coef: coef}},
		{"NaN R", c.v, c.lambda, 0, Disc{Centre: p, Radius: math.NaN(), Coef: coef}},
		{"infinite R", c.v, c.lambda, 0, Disc{Centre: p, Radius: math.Inf(1), Coef: coef}},
		{"NaN centre", c.v, c.lambda, 0, Disc{Centre: [2]float64{math.NaN(), 0}, Radius: 0.3, Coef: coef}},
		{"no coefficients", c.v, c.lambda, 0, Disc{Centre: p, Radius: 0.3}},
		{"unbounded coefficient", c.v, c.lambda, 0, Disc{Centre: p, Radius: 0.3, Coef: [][]interval.I{{interval.Entire()}}}},
	} {
		func() {
			defer func() {
				if recover() == nil {
					t.Errorf("%s: no panic", tc.name)
				}
			}()
			_, _ = EnclosePoint(tc.v, tc.lambda, tc.e, tc.d, DiscOptions{})
		}()
	}
	for _, src := range []string{"1/x", "log(x)", "sqrt(x)"} {
		_, err := EnclosePoint(formula.MustParse(src), c.lambda, 0, Disc{Centre: [2]float64{0.02, 0.5}, Radius: 0.05, Coef: coef}, DiscOptions{})
		var pe *PotentialError
		if !errors.As(err, &pe) {
			t.Errorf("V = %s across x = 0: error %v, want *PotentialError", src, err)
		}
	}
	// exp(exp(x)) near x = 7 (about e^1097): defined and smooth, but its
	// model's enclosures overflow, so boundedness of V is not shown.
	_, err := EnclosePoint(formula.MustParse("exp(exp(x))"), c.lambda, 0, Disc{Centre: [2]float64{7, 0}, Radius: 0.5, Coef: coef}, DiscOptions{})
	if !errors.Is(err, errUnboundedModel) {
		t.Errorf("V = exp(exp(x)) at x = 7: error %v, want the unbounded-model refusal", err)
	}
}

// A potential with a kink: u = exp(−|x|³/6 − y²/2) = e^{−φ} solves
// −Δu + V u = 0 with V = |∇φ|² − Δφ = x⁴/4 + y² − |x| − 1 (φ is C², so u
// is a classical solution; a construction of this file). V has no Taylor
// model on a disc across x = 0, and the range model is used. ũ = (f(x0) +
// f′(x0)d_x)·T_N g(d_y) with f = exp(−|x|³/6), g = exp(−y²/2); by Taylor's
// theorem for f ∈ C², |f − T_1 f| ≤ sup|f″|·R²/2 with
// f″ = (x⁴/4 − |x|)·f.
func TestEnclosePointKinkedPotential(t *testing.T) {
	v := formula.MustParse("x^4/4 + y^2 - abs(x) - 1")
	u := formula.MustParse("exp(-abs(x)^3/6 - y^2/2)")
	f := formula.MustParse("exp(-abs(x)^3/6)")
	df := formula.MustParse("-x*abs(x)/2*exp(-abs(x)^3/6)")
	d2f := formula.MustParse("(x^4/4 - abs(x))*exp(-abs(x)^3/6)")
	g := expPolySeries([]float64{0, 0, -0.5})
	lambda := interval.New(-1e-12, 1e-12)
	at := func(e *formula.Expr, x interval.I) interval.I {
		r, err := e.Eval(map[string]interval.I{"x": x})
		if err != nil {
			t.Fatal(err)
		}
		return r
	}
	const N = 12
	rng := rand.New(rand.NewSource(5))
	for i := range 200 {
		p := [2]float64{0.2 * (2*rng.Float64() - 1), 2*rng.Float64() - 1}
		R := []float64{0.3, 0.1, 0.02}[i%3]
		hx := interval.New(interval.SubDown(p[0], R), interval.AddUp(p[0], R))
		hy := interval.New(interval.SubDown(p[1], R), interval.AddUp(p[1], R))
		f0, f1 := at(f, interval.Point(p[0])), at(df, interval.Point(p[0]))
		gy := g(interval.Point(p[1]), N)
		coef := [][]interval.I{make([]interval.I, N+1), make([]interval.I, N+1)}
		for b := range gy {
			coef[0][b] = f0.Mul(gy[b])
			coef[1][b] = f1.Mul(gy[b])
		}
		r2 := interval.Point(R).Sqr()
		mf := interval.Point(at(d2f, hx).Mag()).Mul(r2).DivF(2)
		gh := g(hy, N+1)
		mg := interval.Point(gh[N+1].Mag()).Mul(interval.Point(R).PowInt(N + 1))
		F, G := interval.Point(at(f, hx).Mag()), interval.Point(gh[0].Mag())
		sup := mf.Mul(G).Add(F.Add(mf).Mul(mg)).Hi
		enc, err := EnclosePoint(v, lambda, errL2(sup, R), Disc{Centre: p, Radius: R, Coef: coef}, DiscOptions{})
		if err != nil {
			t.Fatalf("at %v: %v", p, err)
		}
		ex, _ := u.Eval(map[string]interval.I{"x": interval.Point(p[0]), "y": interval.Point(p[1])})
		if !contains(enc.U, ex) {
			t.Fatalf("at %v (R = %g): %v misses u = %v", p, R, enc.U, ex)
		}
		owed := (lambda.Wid() + enc.VRemainder.Wid()) * r2.Hi / 8 * rangeOnBox(coef, R).Mag() * (1 + 1e-9)
		if w := enc.U.Wid(); w > 2*(enc.MeanBound+enc.KernelBound)*(1+1e-9)+owed+1e-12 {
			t.Errorf("at %v (R = %g): width %g (mean %g, kernel %g, remainder %v)", p, R, w, enc.MeanBound, enc.KernelBound, enc.VRemainder)
		}
		if i < 3 {
			t.Logf("R = %g: width %.3g, |τ| = %.3g", R, enc.U.Wid(), enc.VRemainder.Mag())
		}
	}
}

func BenchmarkEnclosePoint(b *testing.B) {
	for _, c := range []exactCase{squareCase(), quarticWellCase(), poschlTellerCase()} {
		p := [2]float64{0.3, 0.4}
		coef, sup := c.taylor(p, 0.25, 8)
		d := Disc{Centre: p, Radius: 0.25, Coef: coef}
		e := errL2(sup, 0.25)
		b.Run(c.name, func(b *testing.B) {
			for b.Loop() {
				if _, err := EnclosePoint(c.v, c.lambda, e, d, DiscOptions{}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
