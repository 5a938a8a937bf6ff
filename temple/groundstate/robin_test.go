package groundstate

import (
	"math/rand"
	"testing"

	"gapcert/interval"
	"gapcert/interval/decimalio"
	"gapcert/interval/formula"
)

// Robin V = 0 on (−1, 1) with α = 1/3 at both ends (not a float: α is the
// tightest enclosure of the rational, so the initial data are intervals). Derivation: the even
// functions u = cos(k x) satisfy −u′(−1) + αu(−1) = 0 iff
// −k sin k + α cos k = 0, i.e. k tan k = α; for k ∈ (0, π/2) this has one
// root (k tan k increases from 0 to ∞ there), and u > 0 on [−1, 1], so by
// Sturm's theorem it is the ground state and λ1 = k². With the left
// normalisation u(−1) = 1 of the package, u = cos(kx)/cos k.
func robinAlpha() interval.I {
	a, err := decimalio.Parse("1/3")
	if err != nil {
		panic(err)
	}
	return a
}

// robinRoot encloses the root k of k tan k = α in (0, π/2) by bisection
// with interval evaluations: the invariant is f(lo) < 0 < f(hi) for
// f(k) = k tan k − α certified by the enclosures, and f increases, so the
// root lies in [lo, hi].
func robinRoot(t testing.TB) interval.I {
	f := func(k float64) interval.I {
		K := interval.Point(k)
		tan, err := interval.Tan(K)
		if err != nil {
			t.Fatal(err)
		}
		return K.Mul(tan).Sub(robinAlpha())
	}
	lo, hi := 0.1, 1.5
	if !(f(lo).Hi < 0 && f(hi).Lo > 0) {
		t.Fatal("robinRoot: bad bracket")
	}
	for i := 0; i < 200; i++ {
		mid := lo + (hi-lo)/2
		if mid == lo || mid == hi {
			break
		}
		v := f(mid)
		switch {
		case v.Hi < 0:
			lo = mid
		case v.Lo > 0:
			hi = mid
		default:
			return interval.New(lo, hi)
		}
	}
	return interval.New(lo, hi)
}

func robinCase(t testing.TB) (Problem, interval.I) {
	alpha := robinAlpha()
	p := Problem{V: formula.MustParse("0"), A: interval.Point(-1), B: interval.Point(1),
		Left: Boundary{Kind: Robin, Alpha: alpha}, Right: Boundary{Kind: Robin, Alpha: alpha}}
	return p, robinRoot(t).Sqr()
}

func TestEncloseRobinContainsCosine(t *testing.T) {
	p, lambda := robinCase(t)
	k := robinRoot(t)
	t.Logf("k ∈ %v (width %.3g), λ1 ∈ %v", k, k.Wid(), lambda)
	enc, err := Enclose(p, lambda, Options{})
	if err != nil {
		t.Fatal(err)
	}
	rng := rand.New(rand.NewSource(2))
	cosK := interval.Cos(k)
	var centre, ends float64
	for i := 0; i < 2000; i++ {
		x := 2*rng.Float64() - 1
		u, du, ok := enc.At(x)
		if !ok {
			t.Fatalf("x = %v not covered", x)
		}
		// Both normalisations give cos(kx)/cos k (the problem is even).
		kx := k.MulF(x)
		want := interval.Cos(kx).Div(cosK)
		wantD := k.Neg().Mul(interval.Sin(kx)).Div(cosK)
		if _, meet := want.Intersection(u); !meet {
			t.Fatalf("u(%v) ∈ %v misses cos(kx)/cos k ∈ %v", x, u, want)
		}
		if _, meet := wantD.Intersection(du); !meet {
			t.Fatalf("u′(%v) ∈ %v misses −k sin(kx)/cos k ∈ %v", x, du, wantD)
		}
		if want.Wid() < u.Wid()/4 && !want.Subset(u) {
			t.Fatalf("u(%v) ∈ %v does not contain cos(kx)/cos k ∈ %v", x, u, want)
		}
		if x > -0.1 && x < 0.1 {
			centre = max(centre, u.Wid())
		}
		if x < -0.9 || x > 0.9 {
			ends = max(ends, u.Wid())
		}
	}
	t.Logf("width of u: |x| < 0.1 %.3g, |x| > 0.9 %.3g", centre, ends)
	if centre > 1e-13 || ends > 1e-13 {
		t.Errorf("widths %.3g (centre), %.3g (ends) above 1e-13", centre, ends)
	}
}
