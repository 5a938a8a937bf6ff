package solvertest

import (
	"math"

	"gapcert/interval"
)

// Entry is entry (I, J), J ≤ I, of a float pencil (K, M); positions not
// listed are zero, and each position is listed at most once.
type Entry struct {
	I, J int
	K, M float64
}

// IEntry is entry (I, J), J ≤ I, of an interval pencil ([K], [M]).
type IEntry struct {
	I, J int
	K, M interval.I
}

// pencil is a float test pencil with its eigenvalues, ascending, as far as
// they are known (len(want) ≥ the count asked for).
type pencil struct {
	name    string
	n       int
	entries []Entry
	want    []float64
}

// secondDifference returns tridiag(−a, 2a, −a) and tridiag(b, 4b, b) of
// order n as entries.
func secondDifference(n int, a, b float64) []Entry {
	e := make([]Entry, 0, 2*n)
	for i := 0; i < n; i++ {
		e = append(e, Entry{i, i, 2 * a, 4 * b})
		if i > 0 {
			e = append(e, Entry{i, i - 1, -a, b})
		}
	}
	return e
}

// tridiagIdentity is T = tridiag(−1, 2, −1) with M = I, of order n. Its
// eigenvalues are λ_k = 2 − 2cos(kπ/(n+1)) = 4sin²(kπ/(2(n+1))), k = 1 … n
// (common practice; any numerical linear algebra text).
func tridiagIdentity(n int) pencil {
	e := make([]Entry, 0, 2*n)
	for i := 0; i < n; i++ {
		e = append(e, Entry{i, i, 2, 1})
		if i > 0 {
			e = append(e, Entry{i, i - 1, -1, 0})
		}
	}
	want := make([]float64, n)
	for k := 1; k <= n; k++ {
		s := math.Sin(float64(k) * math.Pi / float64(2*(n+1)))
		want[k-1] = 4 * s * s
	}
	return pencil{"tridiag(−1,2,−1), M = I", n, e, want}
}

// p1Line is the P1 finite-element pencil of −u″ = λu on (0, 1) with u = 0
// at both ends, on N uniform elements (h = 1/N, n = N − 1 interior nodes):
// K = (1/h)·tridiag(−1, 2, −1), M = (h/6)·tridiag(1, 4, 1), with K − shift·M
// in place of K. N should be a power of 2 so that K is exact in float64.
//
// Its eigenvalues (derived here): v_k = (sin(jkπh))_j, k = 1 … n, vanishes
// at j = 0 and j = N, so for every interior j, with θ = kπh,
// sin((j−1)θ) + sin((j+1)θ) = 2cos θ sin(jθ) gives
// T v_k = (2 − 2cos θ) v_k and (6I − T) v_k = (4 + 2cos θ) v_k, hence
//
//	λ_k = (6/h²)(1 − cos kπh)/(2 + cos kπh),
//
// evaluated with 1 − cos θ = 2sin²(θ/2) against cancellation.
func p1Line(nElem int, shift float64) pencil {
	h := 1 / float64(nElem)
	n := nElem - 1
	e := secondDifference(n, 1/h, h/6)
	for q := range e {
		e[q].K -= shift * e[q].M
	}
	want := make([]float64, n)
	for k := 1; k <= n; k++ {
		want[k-1] = p1Eigenvalue(k, h) - shift
	}
	return pencil{"P1 pencil of −u″ on (0, 1)", n, e, want}
}

func p1Eigenvalue(k int, h float64) float64 {
	th := float64(k) * math.Pi * h
	s := math.Sin(th / 2)
	return 6 / (h * h) * (2 * s * s) / (2 + math.Cos(th))
}

// doubled is the direct sum of two copies of p: every eigenvalue twice.
func doubled(p pencil) pencil {
	e := append([]Entry(nil), p.entries...)
	for _, x := range p.entries {
		e = append(e, Entry{x.I + p.n, x.J + p.n, x.K, x.M})
	}
	want := make([]float64, 0, 2*len(p.want))
	for _, v := range p.want {
		want = append(want, v, v)
	}
	return pencil{p.name + " twice (double eigenvalues)", 2 * p.n, e, want}
}

// p1LineInterval is the interval P1 pencil of −u″ on (0, 1) on N uniform
// elements (N a power of 2), whose entries are intervals of relative
// radius about rel around the exact entries, placed off centre: the exact
// entry a lies in [a − rel·|a|, a + 3rel·|a|] (outward rounded), so the
// exact pencil, whose spectrum p1Eigenvalue gives, is a member but not the
// midpoint. It also returns mMin ≤ λ_min(M') for every member M'.
//
// mMin: the exact M = (h/6)·tridiag(1, 4, 1) has λ_min = (h/6)(4 + 2cos(nπh))
// > h/3 (the closed form above), and a member differs from it by a
// symmetric E with ‖E‖₂ ≤ ‖E‖∞ ≤ 3·(4 rel·(2h/3)) = 8 rel·h (three entries
// a row, each of width ≤ 4 rel·|a| ≤ 4 rel·2h/3), so by Weyl's inequality
// λ_min(M') ≥ h/3 − 8 rel·h; mMin = h/3·(1 − 24 rel)·(1 − 1e-12) stays
// below it (the last factor covers the float rounding of mMin).
func p1LineInterval(nElem int, rel float64) (n int, e []IEntry, mMin float64) {
	h := interval.Point(1).DivF(float64(nElem))
	hf := 1 / float64(nElem) // exact: nElem is a power of 2
	n = nElem - 1
	around := func(a interval.I) interval.I {
		m := a.Mag()
		return interval.I{Lo: interval.SubDown(a.Lo, interval.MulUp(rel, m)), Hi: interval.AddUp(a.Hi, interval.MulUp(3*rel, m))}
	}
	inv := interval.Point(float64(nElem)) // 1/h, exact
	m4, m1 := h.MulF(4).DivF(6), h.DivF(6)
	for i := 0; i < n; i++ {
		e = append(e, IEntry{i, i, around(inv.MulF(2)), around(m4)})
		if i > 0 {
			e = append(e, IEntry{i, i - 1, around(inv.MulF(-1)), around(m1)})
		}
	}
	return n, e, hf / 3 * (1 - 24*rel) * (1 - 1e-12)
}
