package groundstate

import (
	"math"

	"gapcert/interval"
	"gapcert/interval/formula"
)

// This file builds, for the tests of EnclosePoint, exact eigenfunctions
// with closed forms, their Taylor polynomials at a point (the approximate
// ũ on a disc) and an independent bound of ‖u − ũ‖_{L²(B)}.

// series returns enclosures of the Taylor coefficients c_0, …, c_n of a
// function f of one variable at every point s of the interval s:
// f(s + t) = Σ c_k t^k.
type series func(s interval.I, n int) []interval.I

// sinSeries is f(s) = sin(k·s + phase): c_j = k^j/j!·sin(k s + phase + jπ/2).
func sinSeries(k, phase interval.I) series {
	return func(s interval.I, n int) []interval.I {
		th := k.Mul(s).Add(phase)
		sn, cs := interval.Sin(th), interval.Cos(th)
		cyc := [4]interval.I{sn, cs, sn.Neg(), cs.Neg()}
		c := make([]interval.I, n+1)
		p := interval.Point(1)
		for j := range c {
			c[j] = p.Mul(cyc[j%4])
			p = p.Mul(k).DivF(float64(j + 1))
		}
		return c
	}
}

// coshSeries is f(s) = cosh(k·s): c_j = k^j/j!·(cosh or sinh)(k s).
func coshSeries(k interval.I) series {
	return func(s interval.I, n int) []interval.I {
		ch, sh := interval.Cosh(k.Mul(s)), interval.Sinh(k.Mul(s))
		c := make([]interval.I, n+1)
		p := interval.Point(1)
		for j := range c {
			if j%2 == 0 {
				c[j] = p.Mul(ch)
			} else {
				c[j] = p.Mul(sh)
			}
			p = p.Mul(k).DivF(float64(j + 1))
		}
		return c
	}
}

// sechSeries is f = 1/cosh, by the recursion of the reciprocal series
// (g f = 1: f_0 = 1/g_0, f_k = −(Σ_{j=1}^{k} g_j f_{k−j})/g_0).
func sechSeries() series {
	ch := coshSeries(interval.Point(1))
	return func(s interval.I, n int) []interval.I {
		g := ch(s, n)
		f := make([]interval.I, n+1)
		f[0] = interval.Point(1).Div(g[0])
		for k := 1; k <= n; k++ {
			var acc interval.I
			for j := 1; j <= k; j++ {
				acc = acc.Add(g[j].Mul(f[k-j]))
			}
			f[k] = acc.Neg().Div(g[0])
		}
		return f
	}
}

// expPolySeries is f(s) = exp(p(s)), p(s) = Σ p[i] s^i: with q(t) =
// p(s + t) = Σ q_j t^j (binomial shift) the recursion of f′ = q′f is
// (k+1) f_{k+1} = Σ_{j=0}^{k} (j+1) q_{j+1} f_{k−j}.
func expPolySeries(p []float64) series {
	return func(s interval.I, n int) []interval.I {
		q := make([]interval.I, len(p))
		for i, pi := range p {
			// p_i (s + t)^i = p_i Σ_j C(i, j) s^{i−j} t^j
			bin := 1.0
			for j := 0; j <= i; j++ {
				q[j] = q[j].Add(interval.Point(pi).MulF(bin).Mul(s.PowInt(i - j)))
				bin = bin * float64(i-j) / float64(j+1) // exact for these small i
			}
		}
		f := make([]interval.I, n+1)
		f[0] = interval.Exp(q[0])
		for k := 0; k < n; k++ {
			var acc interval.I
			for j := 0; j <= k && j+1 < len(q); j++ {
				acc = acc.Add(q[j+1].MulF(float64(j + 1)).Mul(f[k-j]))
			}
			f[k+1] = acc.DivF(float64(k + 1))
		}
		return f
	}
}

// exactCase is an exact eigenfunction u with −Δu + Vu = λu near the
// test points, and its Taylor polynomials.
type exactCase struct {
	name   string
	v      *formula.Expr
	lambda interval.I // an enclosure of λ
	u      *formula.Expr
	// taylor returns the Taylor polynomial of u at x0 (the approximate ũ
	// on B_R(x0)) and an upper bound of sup_B |u − ũ|.
	taylor func(x0 [2]float64, R float64, n int) ([][]interval.I, float64)
}

// value encloses u at a point by interval evaluation of its formula.
func (c exactCase) value(p [2]float64) interval.I {
	v, err := c.u.Eval(map[string]interval.I{"x": interval.Point(p[0]), "y": interval.Point(p[1])})
	if err != nil {
		panic(err)
	}
	return v
}

// widened returns [l·(1 − rel), l·(1 + rel)] rounded outward around the
// enclosure l > 0, standing in for a certified enclosure of λ1.
func widened(l interval.I, rel float64) interval.I {
	return interval.New(interval.SubDown(l.Lo, math.Abs(l.Lo)*rel), interval.AddUp(l.Hi, math.Abs(l.Hi)*rel))
}

// productTaylor is the Taylor data of u = f(x)·g(y): ũ = T_n f ⊗ T_n g
// (coefficients f_a(x0) g_b(y0), a, b ≤ n). By Taylor's theorem with the
// Lagrange remainder, |f(x0 + t) − T_n f(t)| = |c_{n+1}(ζ)|·|t|^{n+1} for
// some ζ between x0 and x0 + t, so on |t| ≤ R it is at most
// Mf = mag c_{n+1}([x0 − R, x0 + R])·R^{n+1}. With F ≥ sup |f| on the same
// interval and G, Mg likewise for g,
//
//	|fg − T_n f·T_n g| ≤ |f − T_n f|·|g| + |T_n f|·|g − T_n g| ≤ Mf G + (F + Mf) Mg.
func productTaylor(f, g series) func(x0 [2]float64, R float64, n int) ([][]interval.I, float64) {
	return func(x0 [2]float64, R float64, n int) ([][]interval.I, float64) {
		fx, gy := f(interval.Point(x0[0]), n), g(interval.Point(x0[1]), n)
		coef := make([][]interval.I, n+1)
		for a := range coef {
			coef[a] = make([]interval.I, n+1)
			for b := range coef[a] {
				coef[a][b] = fx[a].Mul(gy[b])
			}
		}
		hx := interval.New(interval.SubDown(x0[0], R), interval.AddUp(x0[0], R))
		hy := interval.New(interval.SubDown(x0[1], R), interval.AddUp(x0[1], R))
		fh, gh := f(hx, n+1), g(hy, n+1)
		rn := interval.Point(R).PowInt(n + 1)
		mf := interval.Point(fh[n+1].Mag()).Mul(rn)
		mg := interval.Point(gh[n+1].Mag()).Mul(rn)
		F, G := interval.Point(fh[0].Mag()), interval.Point(gh[0].Mag())
		return coef, mf.Mul(G).Add(F.Add(mf).Mul(mg)).Hi
	}
}

// wave is amp·sin(k1 x + k2 y).
type wave struct{ amp, k1, k2 interval.I }

// wavesTaylor is the Taylor data of a sum of plane waves: with θ0 = k·x0
// and s = k·d, sin(θ0 + s) = Σ_m sin(θ0 + mπ/2) s^m/m!, and the
// coefficient of d_x^a d_y^b (a + b = m ≤ n) is
// sin(θ0 + mπ/2)·k1^a k2^b/(a! b!). The remainder of the sine's Taylor
// series is at most |s|^{n+1}/(n+1)! ≤ (|k| R)^{n+1}/(n+1)! on |d| ≤ R.
func wavesTaylor(ws []wave) func(x0 [2]float64, R float64, n int) ([][]interval.I, float64) {
	return func(x0 [2]float64, R float64, n int) ([][]interval.I, float64) {
		coef := make([][]interval.I, n+1)
		for a := range coef {
			coef[a] = make([]interval.I, n+1-a)
		}
		var bound interval.I
		for _, w := range ws {
			th := w.k1.MulF(x0[0]).Add(w.k2.MulF(x0[1]))
			sn, cs := interval.Sin(th), interval.Cos(th)
			cyc := [4]interval.I{sn, cs, sn.Neg(), cs.Neg()}
			// pa[a] = k1^a/a!, pb[b] = k2^b/b!
			pa := make([]interval.I, n+1)
			pb := make([]interval.I, n+1)
			pa[0], pb[0] = interval.Point(1), interval.Point(1)
			for j := 1; j <= n; j++ {
				pa[j] = pa[j-1].Mul(w.k1).DivF(float64(j))
				pb[j] = pb[j-1].Mul(w.k2).DivF(float64(j))
			}
			for a := 0; a <= n; a++ {
				for b := 0; a+b <= n; b++ {
					coef[a][b] = coef[a][b].Add(w.amp.Mul(cyc[(a+b)%4]).Mul(pa[a]).Mul(pb[b]))
				}
			}
			k, _ := w.k1.Sqr().Add(w.k2.Sqr()).Sqrt()
			kr := k.MulF(R)
			tail := interval.Point(1)
			for j := 1; j <= n+1; j++ {
				tail = tail.Mul(kr).DivF(float64(j))
			}
			bound = bound.Add(w.amp.Abs().Mul(tail))
		}
		return coef, bound.Hi
	}
}

// errL2 returns an upper bound of ‖u − ũ‖_{L²(B_R)} ≤ sup|u − ũ|·√(πR²).
func errL2(sup, R float64) float64 {
	s, _ := interval.Pi().Sqrt()
	return interval.Point(sup).Mul(s).MulF(R).Hi
}

// squareCase: the unit square with Dirichlet conditions, V = 0,
// u = sin πx sin πy, λ1 = 2π² (closed form, common practice).
func squareCase() exactCase {
	pi := interval.Pi()
	s := sinSeries(pi, interval.I{})
	return exactCase{
		name:   "unit square",
		v:      formula.MustParse("0"),
		lambda: widened(pi.Sqr().MulF(2), 1e-10),
		u:      formula.MustParse("sin(pi*x)*sin(pi*y)"),
		taylor: productTaylor(s, s),
	}
}

// triangleCase: the equilateral triangle with vertices (0, 0), (1, 0),
// (1/2, √3/2), Dirichlet conditions, V = 0. Lamé's ground state (McCartin,
// "Eigenstructure of the equilateral triangle, Part I: The Dirichlet
// problem", SIAM Rev. 45 (2003); Pinsky, SIAM J. Math. Anal. 11 (1980))
// is the sum of three plane waves
//
//	u = sin(4πy/√3) − sin(2π(x + y/√3)) + sin(2π(x − y/√3)),
//
// each with |k|² = 16π²/3, so −Δu = (16π²/3)u, equal to
// 4 sin(2πy/√3)·sin(π(x + y/√3))·sin(π(x − y/√3)); the form (the exact
// statement in those papers recalled from memory) is checked in
// TestEquilateralGroundStateFormula: it vanishes on the three sides and is
// positive inside, and a positive Dirichlet eigenfunction is the ground
// state.
func triangleCase() exactCase {
	pi := interval.Pi()
	s3, _ := interval.Point(3).Sqrt()
	twoPi := pi.MulF(2)
	ws := []wave{
		{interval.Point(1), interval.I{}, pi.MulF(4).Div(s3)},
		{interval.Point(-1), twoPi, twoPi.Div(s3)},
		{interval.Point(1), twoPi, twoPi.Div(s3).Neg()},
	}
	return exactCase{
		name:   "equilateral triangle",
		v:      formula.MustParse("0"),
		lambda: widened(pi.Sqr().MulF(16).DivF(3), 1e-10),
		// The same function as a product (sum-to-product identities; no
		// cancellation, so its interval value is narrow near the sides).
		u:      formula.MustParse("4*sin(2*pi*y/sqrt(3))*sin(pi*(x + y/sqrt(3)))*sin(pi*(x - y/sqrt(3)))"),
		taylor: wavesTaylor(ws),
	}
}

// oscillatorCase: −Δu + (x² + y²)u = 2u for u = exp(−(x² + y²)/2), the
// ground state of the two-dimensional harmonic oscillator (common
// practice; checked by differentiation: Δu = (x² + y² − 2)u).
func oscillatorCase() exactCase {
	g := expPolySeries([]float64{0, 0, -0.5})
	return exactCase{
		name:   "harmonic oscillator",
		v:      formula.MustParse("x^2 + y^2"),
		lambda: widened(interval.Point(2), 1e-10),
		u:      formula.MustParse("exp(-(x^2 + y^2)/2)"),
		taylor: productTaylor(g, g),
	}
}

// poschlTellerCase: −Δu − 2(sech²x + sech²y)u = −2u for u = sech x sech y
// (the Pöschl–Teller ground state in each variable, common practice;
// checked by differentiation: (sech)″ = sech − 2 sech³). A potential that
// is not a polynomial, so its model has a remainder.
func poschlTellerCase() exactCase {
	s := sechSeries()
	return exactCase{
		name:   "Pöschl–Teller",
		v:      formula.MustParse("-2/cosh(x)^2 - 2/cosh(y)^2"),
		lambda: interval.New(-2-1e-10, -2+1e-10),
		u:      formula.MustParse("1/(cosh(x)*cosh(y))"),
		taylor: productTaylor(s, s),
	}
}

// quarticWellCase: u = exp(−φ), φ = x⁴/4 − x²/2 + y²/2, solves
// −Δu + V u = 0 with V = |∇φ|² − Δφ = (x³ − x)² + y² − 3x² (from
// Δe^{−φ} = (|∇φ|² − Δφ)e^{−φ}; a construction of this file). log u = −φ
// is convex in x near 0 (φ_xx = 3x² − 1 < 0 for |x| < 1/√3), so u is not
// log-concave.
func quarticWellCase() exactCase {
	return exactCase{
		name:   "quartic double well",
		v:      formula.MustParse("(x^3 - x)^2 + y^2 - 3*x^2"),
		lambda: interval.New(-1e-10, 1e-10),
		u:      formula.MustParse("exp(x^2/2 - x^4/4 - y^2/2)"),
		taylor: productTaylor(expPolySeries([]float64{0, 0, 0.5, 0, -0.25}), expPolySeries([]float64{0, 0, -0.5})),
	}
}

// coshCosCase: u = cosh(x)·cos(2y) solves −Δu = 3u (V = 0; −Δ gives
// −cosh·cos + 4 cosh·cos); log u = log cosh x + log cos 2y is strictly
// convex in x, so u is not log-concave (positive for |y| < π/4).
func coshCosCase() exactCase {
	return exactCase{
		name:   "cosh·cos",
		v:      formula.MustParse("0"),
		lambda: widened(interval.Point(3), 1e-10),
		u:      formula.MustParse("cosh(x)*cos(2*y)"),
		taylor: productTaylor(coshSeries(interval.Point(1)), sinSeries(interval.Point(2), interval.Pi().DivF(2))),
	}
}
