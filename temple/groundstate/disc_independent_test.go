package groundstate

import (
	"fmt"
	"math"
	"math/big"
	"math/rand"
	"testing"

	"gapcert/interval"
	"gapcert/interval/formula"
)

// Independent checks of the two-dimensional enclosure: the identity (D1)
// on a function that is not a polynomial, the moments (D4) of every
// parity against quadrature and, for extreme radii, against math/big, the
// models of V at points on and near the circle for adversarial V, the
// inscribed radius against exact rational arithmetic, and the enclosures
// with coarse ũ (large signed residual) and log-concave u (no witness).

// besselI returns I_ν(z) for ν = 0, 1 by its power series (float; an
// independent check, z ≤ 20 here).
func besselI(nu int, z float64) float64 {
	term := math.Pow(z/2, float64(nu))
	for k := 1; k <= nu; k++ {
		term /= float64(k)
	}
	s := 0.0
	for k := 0; k < 200; k++ {
		s += term
		term *= (z / 2) * (z / 2) / (float64(k+1) * float64(k+1+nu))
	}
	return s
}

// radialQuad returns ∫_0^1 k(t) f(t) dt, k(t) = −log t − (1 − t²)/2, by
// composite Gauss–Legendre (5 points) on a geometric grid towards 0
// (float; the integrand has a log singularity at 0 only).
func radialQuad(f func(float64) float64) float64 {
	x := [5]float64{-0.9061798459386640, -0.5384693101056831, 0, 0.5384693101056831, 0.9061798459386640}
	w := [5]float64{0.2369268850561891, 0.4786286704993665, 0.5688888888888889, 0.4786286704993665, 0.2369268850561891}
	s := 0.0
	hi := 1.0
	for range 80 {
		lo := hi / 2
		for sub := range 8 {
			a := lo + (hi-lo)*float64(sub)/8
			b := lo + (hi-lo)*float64(sub+1)/8
			for i := range x {
				t := (a+b)/2 + (b-a)/2*x[i]
				s += (b - a) / 2 * w[i] * (-math.Log(t) - (1-t*t)/2) * f(t)
			}
		}
		hi = lo
	}
	return s
}

// (D1) on w(d) = exp(k d_x), which is not a polynomial: Δw = k²w, w(0) = 1,
// the mean of w over B_R is 2I₁(kR)/(kR) (polar coordinates and
// ∫_0^{2π} e^{z cos θ} dθ = 2πI₀(z), common practice) and
// ∫_B K w = 2πR²∫_0^1 K(Rt) t I₀(kRt) dt, so (D1) reads
// 1 = 2I₁(kR)/(kR) − k²R²∫_0^1 k(t) t I₀(kRt) dt.
func TestIdentityD1OnExponential(t *testing.T) {
	for _, kr := range []float64{0.1, 1, 3, 7, 15} {
		mean := 2 * besselI(1, kr) / kr
		src := kr * kr * radialQuad(func(s float64) float64 { return s * besselI(0, kr*s) })
		if got := mean - src; math.Abs(got-1) > 1e-11*math.Max(1, mean) {
			t.Errorf("kR = %g: mean − ∫K(−Δw) = %.16g, want 1 (mean %g)", kr, got, mean)
		}
	}
}

// kernelMoment against an independent quadrature for every parity:
// radial part by radialQuad, angular part by the trapezoid rule with 64
// nodes (exact for trigonometric polynomials of degree < 64), so
// ∫_B K d_x^a d_y^b = (R^{n+2}/2π)·∫_0^1 k t^{n+1} dt·∫ cos^a sin^b dθ.
func TestKernelMomentsAllParities(t *testing.T) {
	for _, R := range []float64{0.37, 1, 2.5} {
		for a := range 9 {
			for b := range 9 {
				n := a + b
				rad := radialQuad(func(s float64) float64 { return math.Pow(s, float64(n+1)) })
				ang := 0.0
				for i := range 64 {
					th := 2 * math.Pi * float64(i) / 64
					ang += math.Pow(math.Cos(th), float64(a)) * math.Pow(math.Sin(th), float64(b))
				}
				ang *= 2 * math.Pi / 64
				want := math.Pow(R, float64(n+2)) / (2 * math.Pi) * rad * ang
				got := kernelMoment(a, b, R)
				scale := math.Pow(R, float64(n+2)) * 1e-12
				if a%2 != 0 || b%2 != 0 {
					if got != (interval.I{}) || math.Abs(want) > scale {
						t.Errorf("R = %g, (%d, %d): got %v, quadrature %g (odd: want 0)", R, a, b, got, want)
					}
					continue
				}
				if !(got.Lo-scale <= want && want <= got.Hi+scale) || got.Wid() > 1e-14*math.Abs(want) {
					t.Errorf("R = %g, (%d, %d): got %v, quadrature %.17g", R, a, b, got, want)
				}
			}
		}
	}
}

// kernelMoment at radii whose powers underflow or overflow: the enclosure
// must contain 2R^{n+2}(a−1)!!(b−1)!!/((n+2)²(n+4)n!!) computed in
// math/big (exact rational times R^{n+2} to 400 bits).
func TestKernelMomentExtremeRadius(t *testing.T) {
	dfact := func(k int) int64 {
		p := int64(1)
		for j := k; j > 1; j -= 2 {
			p *= int64(j)
		}
		return p
	}
	for _, R := range []float64{1e-200, 3e-160, 5e-324, 1e-10, 1e100, 1e150} {
		for _, ab := range [][2]int{{0, 0}, {2, 0}, {2, 2}, {4, 6}, {10, 2}} {
			a, b := ab[0], ab[1]
			n := a + b
			got := kernelMoment(a, b, R)
			num := new(big.Float).SetPrec(400).SetInt64(2 * dfact(a-1) * dfact(b-1))
			den := new(big.Float).SetPrec(400).SetInt64(int64((n+2)*(n+2)*(n+4)) * dfact(n))
			exact := new(big.Float).SetPrec(400).Quo(num, den)
			r := new(big.Float).SetPrec(400).SetFloat64(R)
			for range n + 2 {
				exact.Mul(exact, r)
			}
			lo := new(big.Float).SetFloat64(got.Lo)
			if math.IsInf(got.Hi, 1) {
				if lo.Cmp(exact) > 0 {
					t.Errorf("R = %g, (%d, %d): %v above %v", R, a, b, got, exact)
				}
				continue
			}
			hi := new(big.Float).SetFloat64(got.Hi)
			if lo.Cmp(exact) > 0 || hi.Cmp(exact) < 0 {
				t.Errorf("R = %g, (%d, %d): %v misses %v", R, a, b, got, exact)
			}
		}
	}
}

// The models of V at points on and just inside the circle |d| = R (where
// the remainder bounds are tightest), for adversarial V: kinks along and
// across the disc, a kink line through the centre, a polynomial of degree
// 13 (above the exact-model degree), huge values, centres far from the
// origin, tiny and large radii.
func TestPotentialModelsOnCircle(t *testing.T) {
	rng := rand.New(rand.NewSource(77))
	type tc struct {
		src string
		x0  [2]float64
		R   float64
	}
	cases := []tc{
		{"abs(x + y - 1)", [2]float64{0.5, 0.5}, 0.3},
		{"abs(x + y - 1)", [2]float64{0.2, 0.2}, 0.25},
		{"max(x, y)", [2]float64{0.1, 0.1}, 0.4},
		{"min(x^2, y)", [2]float64{0.3, 0.2}, 0.2},
		{"abs(x)*y + abs(y - 0.25)", [2]float64{0.01, 0.3}, 0.2},
		{"x^13 - 7*y^13 + x*y", [2]float64{0.9, -0.4}, 0.6},
		{"1e12*x^2 - 1e12*y^2", [2]float64{3, 1}, 0.5},
		{"exp(x)", [2]float64{700, 0}, 0.4},
		{"exp(-x^2 - y^2)", [2]float64{1e6 + 0.5, -2e6}, 1e-3},
		{"sin(40*x)*cos(30*y)", [2]float64{0.3, 0.7}, 0.9},
		{"1/(x^2 + y^2)", [2]float64{1, 1}, 1.2},
		{"sqrt(x)", [2]float64{0.5, 0}, 0.45},
		{"log(1 + x^2 + y^2)", [2]float64{-3, 2}, 2},
		{"cos(x*y)", [2]float64{0, 0}, 1e-150},
		{"x^2 + y^2", [2]float64{1e8, 1e8}, 1e-9},
		{"(x^2)^0.75", [2]float64{0.05, 0}, 0.3},
		{"(x^2 + y^2)^0.25", [2]float64{0.01, -0.02}, 0.2},
		{"abs(x)^2.5 + y", [2]float64{0, 0}, 0.5},
		{"x^(1/3) + 2", [2]float64{1, 0}, 0.9},
		{"atan(1e6*x)", [2]float64{1e-4, 0}, 2e-4},
		{"tanh(50*(x - y))", [2]float64{0.1, 0.1}, 0.3},
		{"x*y*(1 + x*y)^2", [2]float64{0, 0}, 0.7},
		{"sinh(2*x*y)", [2]float64{0.3, -0.3}, 0.8},
	}
	for _, c := range cases {
		v := formula.MustParse(c.src)
		type cand struct {
			name string
			p    [][]interval.I
			rho  interval.I
			err  error
		}
		var cs []cand
		for _, q := range []int{1, 2, 5, 8, 12} {
			p, rho, err := triangleModel(v, c.x0, c.R, q)
			cs = append(cs, cand{"triangle", p, rho, err})
		}
		p, rho, err := hessianModel(v, c.x0, c.R)
		cs = append(cs, cand{"hessian", p, rho, err})
		p, rho, err = rangeModel(v, c.x0, c.R)
		cs = append(cs, cand{"range", p, rho, err})
		p, rho, err = potentialOnDisc(v, c.x0, c.R, 8)
		cs = append(cs, cand{"chosen", p, rho, err})
		usable, checked := 0, 0
		for _, m := range cs {
			if m.err != nil {
				continue
			}
			usable++
			for i := range 400 {
				th := 2 * math.Pi * rng.Float64()
				s := 1 - math.Ldexp(rng.Float64(), -20)
				if i%4 == 0 {
					s = math.Sqrt(rng.Float64())
				}
				px := c.x0[0] + c.R*s*math.Cos(th)
				py := c.x0[1] + c.R*s*math.Sin(th)
				dx := interval.Point(px).Sub(interval.Point(c.x0[0]))
				dy := interval.Point(py).Sub(interval.Point(c.x0[1]))
				// Only points of the open disc (the float point may leave it).
				if dx.Sqr().Add(dy.Sqr()).Hi >= interval.Point(c.R).Sqr().Lo {
					continue
				}
				ex, err := v.Eval(map[string]interval.I{"x": interval.Point(px), "y": interval.Point(py)})
				if err != nil {
					t.Fatalf("%s: V at (%g, %g): %v", c.src, px, py, err)
				}
				checked++
				mod := evalPoly(m.p, dx, dy).Add(m.rho)
				if mod.Hi < ex.Lo || ex.Hi < mod.Lo {
					t.Fatalf("%s, x0 = %v, R = %g, %s model: V(%.17g, %.17g) ∈ %v outside %v", c.src, c.x0, c.R, m.name, px, py, ex, mod)
				}
			}
		}
		if usable == 0 {
			t.Logf("%s at %v, R = %g: no model (refused)", c.src, c.x0, c.R)
		} else if checked < 300*usable {
			t.Errorf("%s: only %d points checked for %d models", c.src, checked, usable)
		}
		t.Logf("%s: %d models, %d points checked; chosen remainder %v", c.src, usable, checked, cs[len(cs)-1].rho)
	}
}

// InscribedRadius against exact rational arithmetic: for random float
// triangles and points, R ≤ the distance to each side line (R² ≤
// cross²/|q − p|² exactly, in big.Rat), and R is within 1e-13 times the
// triangle's size of the true nearest distance; x0 outside or on a side gives ok = false.
func TestInscribedRadiusExact(t *testing.T) {
	rng := rand.New(rand.NewSource(5))
	rat := func(f float64) *big.Rat { return new(big.Rat).SetFloat64(f) }
	inside, outside := 0, 0
	for range 3000 {
		var vf [3][2]float64
		var v [3][2]interval.I
		scale := math.Ldexp(1, rng.Intn(40)-20)
		for k := range 3 {
			for i := range 2 {
				vf[k][i] = (rng.Float64()*2 - 1) * scale
				v[k][i] = interval.Point(vf[k][i])
			}
		}
		x0 := [2]float64{(rng.Float64()*2 - 1) * scale, (rng.Float64()*2 - 1) * scale}
		if rng.Intn(4) == 0 { // on a side (up to rounding of the point)
			s := rng.Float64()
			x0 = [2]float64{vf[0][0] + s*(vf[1][0]-vf[0][0]), vf[0][1] + s*(vf[1][1]-vf[0][1])}
		}
		R, ok := InscribedRadius(v, x0)
		// Exact signed distances (orientation from the exact area).
		cross := func(p, q, r [2]float64) *big.Rat {
			a := new(big.Rat).Mul(new(big.Rat).Sub(rat(q[0]), rat(p[0])), new(big.Rat).Sub(rat(r[1]), rat(p[1])))
			b := new(big.Rat).Mul(new(big.Rat).Sub(rat(q[1]), rat(p[1])), new(big.Rat).Sub(rat(r[0]), rat(p[0])))
			return a.Sub(a, b)
		}
		area := cross(vf[0], vf[1], vf[2])
		if area.Sign() == 0 {
			if ok {
				t.Fatalf("degenerate triangle %v: ok", vf)
			}
			continue
		}
		in := true
		minD2 := (*big.Rat)(nil)
		for k := range 3 {
			p, q := vf[k], vf[(k+1)%3]
			c := cross(p, q, x0)
			if area.Sign() < 0 {
				c.Neg(c)
			}
			if c.Sign() <= 0 {
				in = false
				break
			}
			l2 := new(big.Rat).Add(
				new(big.Rat).Mul(new(big.Rat).Sub(rat(q[0]), rat(p[0])), new(big.Rat).Sub(rat(q[0]), rat(p[0]))),
				new(big.Rat).Mul(new(big.Rat).Sub(rat(q[1]), rat(p[1])), new(big.Rat).Sub(rat(q[1]), rat(p[1]))))
			d2 := new(big.Rat).Quo(new(big.Rat).Mul(c, c), l2)
			if minD2 == nil || d2.Cmp(minD2) < 0 {
				minD2 = d2
			}
		}
		if !in {
			outside++
			if ok {
				t.Fatalf("triangle %v, x0 %v outside or on a side: ok with R = %g", vf, x0, R)
			}
			continue
		}
		if !ok {
			continue // allowed near a side (rounding), counted below
		}
		inside++
		r2 := new(big.Rat).Mul(rat(R), rat(R))
		if r2.Cmp(minD2) > 0 {
			t.Fatalf("triangle %v, x0 %v: R = %g above the distance %v", vf, x0, R, minD2.FloatString(20))
		}
		d, _ := minD2.Float64()
		// Narrowness: the cross product loses about ulp(scale²) to
		// cancellation, so the slack is relative to the triangle's size.
		if R < math.Sqrt(d)-1e-13*scale {
			t.Errorf("triangle %v, x0 %v: R = %g far below the distance %g", vf, x0, R, math.Sqrt(d))
		}
	}
	if inside < 300 || outside < 300 {
		t.Fatalf("only %d inside and %d outside", inside, outside)
	}
}

// Coarse ũ (Taylor degree 1 to 5 on large discs): the residual ∫_B K r̃ is
// large and signed, and the enclosure with the honest bound E_B must still
// contain u(x0); for the square, the triangle, the oscillator, Pöschl–Teller
// and the quartic double well.
func TestEnclosePointCoarseApproximation(t *testing.T) {
	rng := rand.New(rand.NewSource(11))
	type dom struct {
		c     exactCase
		point func() [2]float64
		dist  func([2]float64) float64
	}
	doms := []dom{
		{squareCase(), func() [2]float64 { return [2]float64{rng.Float64(), rng.Float64()} }, distSquare},
		{triangleCase(), func() [2]float64 { return randomInTriangle(rng) }, distTriangle},
		{oscillatorCase(), func() [2]float64 { return [2]float64{4*rng.Float64() - 2, 4*rng.Float64() - 2} }, func([2]float64) float64 { return 1 }},
		// V not a polynomial (Taylor models with remainders) and a
		// polynomial V of degree 6, on discs of radius up to 1.2.
		{poschlTellerCase(), func() [2]float64 { return [2]float64{4*rng.Float64() - 2, 4*rng.Float64() - 2} }, func([2]float64) float64 { return 0.05 + 1.2*rng.Float64() }},
		{quarticWellCase(), func() [2]float64 { return [2]float64{3*rng.Float64() - 1.5, 3*rng.Float64() - 1.5} }, func([2]float64) float64 { return 0.05 + 0.8*rng.Float64() }},
	}
	maxRes := 0.0
	for _, d := range doms {
		for i := range 300 {
			p := d.point()
			R := 0.95 * d.dist(p)
			if R < 1e-3 {
				continue
			}
			deg := 1 + i%5
			coef, sup := d.c.taylor(p, R, deg)
			E := errL2(sup, R)
			enc, err := EnclosePoint(d.c.v, d.c.lambda, E, Disc{Centre: p, Radius: R, Coef: coef}, DiscOptions{})
			if err != nil {
				t.Fatal(err)
			}
			if !contains(enc.U, d.c.value(p)) {
				t.Fatalf("%s, degree %d, p = %v, R = %g: %v misses u = %v (residual %v)", d.c.name, deg, p, R, enc.U, d.c.value(p), enc.Residual)
			}
			maxRes = max(maxRes, enc.Residual.Mag())
		}
	}
	t.Logf("largest |∫K r̃| %.3g", maxRes)
	if maxRes < 0.05 {
		t.Errorf("the residual term never mattered (largest %g)", maxRes)
	}
}

// No witness where u is log-concave: the square, the equilateral triangle
// (Dirichlet, V = 0, convex: Brascamp–Lieb) and the harmonic oscillator
// (Gaussian), with coarse and fine ũ and a range of bounds E, 600 random
// triples each. Any certified triple would be a false witness.
func TestNoWitnessForLogConcave(t *testing.T) {
	rng := rand.New(rand.NewSource(13))
	type dom struct {
		c     exactCase
		point func() [2]float64
		dist  func([2]float64) float64
	}
	doms := []dom{
		{squareCase(), func() [2]float64 { return [2]float64{rng.Float64(), rng.Float64()} }, distSquare},
		{triangleCase(), func() [2]float64 { return randomInTriangle(rng) }, distTriangle},
		{oscillatorCase(), func() [2]float64 { return [2]float64{6*rng.Float64() - 3, 6*rng.Float64() - 3} }, func([2]float64) float64 { return 1 }},
	}
	best := math.Inf(-1)
	for _, d := range doms {
		tried := 0
		for tried < 600 {
			x, y := d.point(), d.point()
			if rng.Intn(3) == 0 { // close pairs: the margin is of order |x − y|²
				y = [2]float64{x[0] + 0.01*(rng.Float64()-0.5), x[1] + 0.01*(rng.Float64()-0.5)}
			}
			m, ok := ExactMidpoint(x, y)
			if !ok || d.dist(x) < 1e-3 || d.dist(y) < 1e-3 || d.dist(m) < 1e-3 {
				continue
			}
			if d.c.name == "equilateral triangle" && (distTriangle(y) <= 0 || !insideTriangle(y)) {
				continue
			}
			tried++
			deg := []int{2, 6, 14}[tried%3]
			floor := []float64{0, 1e-12, 1e-6}[(tried/3)%3]
			dx, dy, dm, E := triple(d.c, x, y, 0.9*d.dist(x), 0.9*d.dist(y), 0.9*d.dist(m), deg, floor)
			res, err := CertifyMidpoint(d.c.v, d.c.lambda, E, dx, dy, dm, DiscOptions{})
			if err != nil {
				t.Fatal(err)
			}
			if res.Certified {
				t.Fatalf("%s: false witness x = %v, y = %v (degree %d, E = %g): margin %g, truth %v",
					d.c.name, x, y, deg, E, res.Margin, exactMargin(d.c, x, y, m))
			}
			best = max(best, res.Margin)
		}
	}
	t.Logf("largest margin over log-concave triples %.3g (must stay ≤ 0)", best)
}

// insideTriangle reports whether p is inside the equilateral triangle
// (0, 0), (1, 0), (1/2, √3/2) (float; only to pick test points).
func insideTriangle(p [2]float64) bool {
	s3 := math.Sqrt(3)
	return p[1] > 0 && s3*p[0]-p[1] > 0 && s3*(1-p[0])-p[1] > 0
}

// Degenerate but legal inputs: a point λ, E = 0, a constant ũ, a tiny
// radius. u = 1 solves −Δu + V u = λu for V = λ = 3; with ũ = 1 exactly
// and E = 0 the enclosure is [1, 1] up to rounding, and with ũ = 1 + δ and
// E = 0 (a false hypothesis) it is shifted, as documented.
func TestEnclosePointDegenerate(t *testing.T) {
	v := formula.MustParse("3")
	for _, R := range []float64{1e-300, 1e-5, 1, 1e5} {
		enc, err := EnclosePoint(v, interval.Point(3), 0, Disc{Centre: [2]float64{0.25, -4}, Radius: R, Coef: [][]interval.I{{interval.Point(1)}}}, DiscOptions{})
		if err != nil {
			t.Fatal(err)
		}
		if !enc.U.Contains(1) || enc.U.Wid() > 1e-15 {
			t.Errorf("R = %g: %v", R, enc.U)
		}
	}
}

// Extreme scales with a genuine u (the square's sin πx sin πy): discs of
// radius 1e-150 and 1e-30, and u scaled by 2^600 and 2^-600 (ũ, E and the
// exact value scaled alike; powers of two keep the scaling exact).
func TestEnclosePointExtremeScales(t *testing.T) {
	c := squareCase()
	p := [2]float64{0.3, 0.6}
	for _, R := range []float64{1e-150, 1e-30, 0.25} {
		for _, sc := range []float64{0x1p600, 1, 0x1p-600} {
			coef, sup := c.taylor(p, R, 12)
			for a := range coef {
				for b := range coef[a] {
					coef[a][b] = coef[a][b].MulF(sc)
				}
			}
			E := interval.Point(errL2(sup, R)).MulF(sc).Hi
			enc, err := EnclosePoint(c.v, c.lambda, E, Disc{Centre: p, Radius: R, Coef: coef}, DiscOptions{})
			if err != nil {
				t.Fatal(err)
			}
			ex := c.value(p).MulF(sc)
			if !contains(enc.U, ex) {
				t.Fatalf("R = %g, scale %g: %v misses %v", R, sc, enc.U, ex)
			}
			// A bound E at the bottom of the subnormal range is no longer
			// relative to u; only containment is asked there.
			if rel := enc.U.Wid() / ex.Mid(); rel > 1e-8 && E > 0x1p-1000 {
				t.Errorf("R = %g, scale %g: relative width %g", R, sc, rel)
			}
		}
	}
}

// (D2) against quadrature: ∫_0^1 k(t)² t dt = 5/48, so ‖K‖²_{L²(B_1)} =
// 5/(96π), and kernelL2Factor encloses its square root.
func TestKernelL2Norm(t *testing.T) {
	q := radialQuad(func(s float64) float64 { return (-math.Log(s) - (1-s*s)/2) * s })
	if math.Abs(q-5.0/48) > 1e-13 {
		t.Errorf("∫k²t = %.17g, want 5/48", q)
	}
	want := math.Sqrt(q / (2 * math.Pi))
	f := kernelL2Factor()
	if !(f.Lo-1e-13 <= want && want <= f.Hi+1e-13) || f.Wid() > 1e-15 {
		t.Errorf("kernelL2Factor %v, quadrature %.17g", f, want)
	}
}

// Random kinked potentials |a x + b y − c| + min(x, s) − max(y, s′) with
// the kink lines through, beside or tangent to the disc and crossing the
// triangle around it: every model that is returned satisfies (M) at 150
// points of the disc (200 random cases).
func TestPotentialModelsRandomKinks(t *testing.T) {
	rng := rand.New(rand.NewSource(21))
	used := map[string]int{}
	for range 200 {
		x0 := [2]float64{rng.Float64()*2 - 1, rng.Float64()*2 - 1}
		R := math.Ldexp(0.5+rng.Float64()/2, -rng.Intn(8))
		th := 2 * math.Pi * rng.Float64()
		a, b := math.Cos(th), math.Sin(th)
		// The kink line at signed distance off·R from x0 (off in [−3, 3]).
		off := 6*rng.Float64() - 3
		c := a*x0[0] + b*x0[1] + off*R
		s1 := x0[0] + (6*rng.Float64()-3)*R
		s2 := x0[1] + (6*rng.Float64()-3)*R
		src := fmt.Sprintf("abs(%.17g*x + %.17g*y - %.17g) + min(x, %.17g) - max(y, %.17g)", a, b, c, s1, s2)
		v := formula.MustParse(src)
		type cand struct {
			name string
			p    [][]interval.I
			rho  interval.I
			err  error
		}
		var cs []cand
		for _, q := range []int{1, 3, 8} {
			p, rho, err := triangleModel(v, x0, R, q)
			cs = append(cs, cand{fmt.Sprintf("triangle %d", q), p, rho, err})
		}
		p, rho, err := hessianModel(v, x0, R)
		cs = append(cs, cand{"hessian", p, rho, err})
		p, rho, err = potentialOnDisc(v, x0, R, 8)
		cs = append(cs, cand{"chosen", p, rho, err})
		for _, m := range cs {
			if m.err != nil {
				continue
			}
			used[m.name]++
			for i := range 150 {
				phi := 2 * math.Pi * rng.Float64()
				sr := 1 - math.Ldexp(rng.Float64(), -30)
				if i%3 == 0 {
					sr = math.Sqrt(rng.Float64())
				}
				px, py := x0[0]+R*sr*math.Cos(phi), x0[1]+R*sr*math.Sin(phi)
				dx := interval.Point(px).Sub(interval.Point(x0[0]))
				dy := interval.Point(py).Sub(interval.Point(x0[1]))
				if dx.Sqr().Add(dy.Sqr()).Hi >= interval.Point(R).Sqr().Lo {
					continue
				}
				ex, err := v.Eval(map[string]interval.I{"x": interval.Point(px), "y": interval.Point(py)})
				if err != nil {
					t.Fatal(err)
				}
				mod := evalPoly(m.p, dx, dy).Add(m.rho)
				if mod.Hi < ex.Lo || ex.Hi < mod.Lo {
					t.Fatalf("%s, x0 = %v, R = %g, %s model: V(%.17g, %.17g) ∈ %v outside %v", src, x0, R, m.name, px, py, ex, mod)
				}
			}
		}
	}
	t.Logf("models returned (of 200 cases): %v", used)
	if used["triangle 8"] < 10 || used["hessian"] < 30 {
		t.Errorf("too few smooth models exercised: %v", used)
	}
}
