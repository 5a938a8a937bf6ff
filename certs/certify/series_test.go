package certify

import (
	"math"
	"math/big"
	"testing"
)

// The reference eigenvalues of the linear potential: on (0, L) the
// equation −u″ + x u = μ u has the entire solutions u = Σ_n a_n x^n with
//
//	a_(n+2) = (a_(n−1) − μ a_n)/((n + 2)(n + 1)),  a_(−1) = 0,
//
// (common practice: substitute the power series), a_0 = u(0), a_1 = u′(0).
// seriesShoot sums the series and its derivative at x = L in math/big
// (seriesPrec bits) and reports the size of the last term, so that a test
// can require the truncation to be negligible. Root finding in μ by
// bisection on a bracket with one sign change gives the eigenvalues with
// the boundary condition at L (u(L) = 0 Dirichlet, u′(L) = 0 Neumann).
// This is independent of the finite elements of the package: one power
// series per trial μ.
const (
	seriesPrec  = 320
	seriesTerms = 400
)

// seriesShoot returns u(L), u′(L) of the solution with u(0) = u0,
// u′(0) = du0, and an upper bound of the magnitude of the last 3 terms
// of the value series (the recursion reaches back three terms).
func seriesShoot(mu, l *big.Float, u0, du0 float64) (u, du *big.Float, tail float64) {
	nf := func() *big.Float { return new(big.Float).SetPrec(seriesPrec) }
	a := make([]*big.Float, seriesTerms)
	a[0], a[1] = nf().SetFloat64(u0), nf().SetFloat64(du0)
	for n := 0; n+2 < seriesTerms; n++ {
		t := nf().Mul(mu, a[n])
		t.Neg(t)
		if n >= 1 {
			t.Add(t, a[n-1])
		}
		a[n+2] = t.Quo(t, nf().SetInt64(int64((n+2)*(n+1))))
	}
	u, du = nf(), nf()
	pow := nf().SetInt64(1) // L^n
	powPrev := nf()         // L^(n−1)
	for n := 0; n < seriesTerms; n++ {
		u.Add(u, nf().Mul(a[n], pow))
		if n >= 1 {
			du.Add(du, nf().Mul(nf().Mul(a[n], nf().SetInt64(int64(n))), powPrev))
		}
		if n >= seriesTerms-3 {
			x, _ := nf().Mul(a[n], pow).Float64()
			tail = math.Max(tail, math.Abs(x))
		}
		powPrev.Set(pow)
		pow.Mul(pow, l)
	}
	return u, du, tail
}

// linearRoot returns the μ in [lo, hi] where the shooting solution from
// (u0, du0) at 0 meets u(L) = 0 (neumann false) or u′(L) = 0 (neumann
// true), by 200 bisection steps in math/big; the bracket must contain one
// sign change. It fails the test if the series tail is not below 1e-60 or
// the bracket has no sign change.
func linearRoot(t *testing.T, lo, hi float64, l *big.Float, u0, du0 float64, neumann bool) *big.Float {
	t.Helper()
	eval := func(mu *big.Float) int {
		u, du, tail := seriesShoot(mu, l, u0, du0)
		if !(tail < 1e-60) {
			t.Fatalf("series tail %g too large at μ = %s", tail, mu.Text('g', 10))
		}
		if neumann {
			return du.Sign()
		}
		return u.Sign()
	}
	a, b := new(big.Float).SetPrec(seriesPrec).SetFloat64(lo), new(big.Float).SetPrec(seriesPrec).SetFloat64(hi)
	sa := eval(a)
	if sa == 0 || sa == eval(b) {
		t.Fatalf("no sign change of the shooting function on [%g, %g]", lo, hi)
	}
	half := new(big.Float).SetPrec(seriesPrec).SetFloat64(0.5)
	for i := 0; i < 200; i++ {
		m := new(big.Float).SetPrec(seriesPrec).Add(a, b)
		m.Mul(m, half)
		if s := eval(m); s == sa {
			a = m
		} else {
			b = m
		}
	}
	return a
}

// TestSeriesShootingFreeCase checks the reference solver on V = 0 in
// disguise: with μ = λ the series solves −u″ + x u = μu, but at L = 1 and
// with the x-term present no closed form exists, so the solver is checked
// on a limit it must reproduce: the first Dirichlet eigenvalue on (0, L)
// tends to π²/L² as L → 0 (the potential x ≤ L is a perturbation of size
// at most L, so π²/L² ≤ μ_1 ≤ π²/L² + L by monotonicity in V, common
// practice).
func TestSeriesShootingFreeCase(t *testing.T) {
	l := 0.01
	pi2 := math.Pi * math.Pi / (l * l)
	mu := linearRoot(t, pi2-1, pi2+1, new(big.Float).SetPrec(seriesPrec).SetFloat64(l), 0, 1, false)
	got, _ := mu.Float64()
	if !(got >= pi2*(1-1e-15) && got <= pi2+l) {
		t.Fatalf("μ_1 on (0, %g) = %.17g, want within [π²/L², π²/L² + L] = [%.17g, %.17g]", l, got, pi2, pi2+l)
	}
}
