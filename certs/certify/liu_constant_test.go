package certify

import (
	"fmt"
	"math"
	"os"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"
	"gonum.org/v1/gonum/mat"
)

// dual is a number with its two partial derivatives (forward-mode
// automatic differentiation in the reference coordinates ξ, η).
type dual struct{ v, dx, dy float64 }

func dconst(c float64) dual         { return dual{v: c} }
func dadd(a, b dual) dual           { return dual{a.v + b.v, a.dx + b.dx, a.dy + b.dy} }
func dsub(a, b dual) dual           { return dual{a.v - b.v, a.dx - b.dx, a.dy - b.dy} }
func dscale(c float64, a dual) dual { return dual{c * a.v, c * a.dx, c * a.dy} }
func dmul(a, b dual) dual {
	return dual{a.v * b.v, a.dx*b.v + a.v*b.dx, a.dy*b.v + a.v*b.dy}
}
func ddiv(a, b dual) dual {
	q := a.v / b.v
	return dual{q, (a.dx - q*b.dx) / b.v, (a.dy - q*b.dy) / b.v}
}

// dubiner returns the values and reference gradients of the Dubiner
// (Koornwinder) orthogonal polynomials φ_pq, p + q ≤ deg, on the reference
// triangle {ξ, η ≥ 0, ξ + η ≤ 1} at an interior point:
//
//	φ_pq = P_p(a) (1 − η)^p P_q^(2p+1,0)(2η − 1),  a = (2ξ − 1 + η)/(1 − η),
//
// P_p the Legendre and P_q^(α,0) the Jacobi polynomials (three-term
// recurrences, Abramowitz–Stegun 22.7.1 and 22.7.10). Each φ_pq is a
// polynomial of degree p + q in (ξ, η), and they are L²-orthogonal on the
// triangle (M. Dubiner, J. Sci. Comput. 6 (1991) 345–390), which keeps the
// Gram matrices well conditioned at high degree.
func dubiner(xi, eta float64, deg int, out []dual) []dual {
	out = out[:0]
	x := dual{xi, 1, 0}
	y := dual{eta, 0, 1}
	one := dconst(1)
	omy := dsub(one, y)
	a := ddiv(dadd(dsub(dscale(2, x), one), y), omy)
	b := dsub(dscale(2, y), one)
	// Legendre P_p(a) times (1 − η)^p.
	leg := make([]dual, deg+1)
	leg[0] = one
	if deg >= 1 {
		leg[1] = a
	}
	for n := 1; n < deg; n++ {
		leg[n+1] = dscale(1/float64(n+1), dsub(dscale(float64(2*n+1), dmul(a, leg[n])), dscale(float64(n), leg[n-1])))
	}
	pw := one
	for p := 0; p <= deg; p++ {
		alpha := float64(2*p + 1)
		jac := make([]dual, deg-p+1)
		jac[0] = one
		if deg-p >= 1 {
			jac[1] = dscale(0.5, dadd(dscale(alpha+2, b), dconst(alpha)))
		}
		for n := 2; n <= deg-p; n++ {
			fn := float64(n)
			c := 2*fn + alpha
			a1 := 2 * fn * (fn + alpha) * (c - 2)
			a2 := (c - 1) * alpha * alpha
			a3 := (c - 2) * (c - 1) * c
			a4 := 2 * (fn + alpha - 1) * (fn - 1) * c
			jac[n] = dscale(1/a1, dsub(dmul(dadd(dconst(a2), dscale(a3, b)), jac[n-1]), dscale(a4, jac[n-2])))
		}
		lp := dmul(leg[p], pw)
		for q := 0; q <= deg-p; q++ {
			out = append(out, dmul(lp, jac[q]))
		}
		pw = dmul(pw, omy)
	}
	return out
}

// crQuotient returns the largest ‖u‖²/‖∇u‖² over the polynomials u of
// degree ≤ deg on the triangle v with zero mean on each edge (and, if
// mean, zero mean over the triangle), in floating point: a lower estimate
// of the supremum over H¹, which is the square of the optimal constant of
// the Crouzeix–Raviart interpolation error bound on v.
func crQuotient(v [3][2]float64, deg int, mean bool) float64 {
	nq := deg + 4
	d1 := [2]float64{v[1][0] - v[0][0], v[1][1] - v[0][1]}
	d2 := [2]float64{v[2][0] - v[0][0], v[2][1] - v[0][1]}
	det := d1[0]*d2[1] - d1[1]*d2[0]
	inv := [2][2]float64{{d2[1] / det, -d1[1] / det}, {-d2[0] / det, d1[0] / det}}
	xs, ws := make([]float64, nq), make([]float64, nq)
	quad.Legendre{}.FixedLocations(xs, ws, 0, 1)
	nb := (deg + 1) * (deg + 2) / 2
	mm, kk := mat.NewSymDense(nb, nil), mat.NewSymDense(nb, nil)
	buf := make([]dual, 0, nb)
	gx, gy := make([]float64, nb), make([]float64, nb)
	absDet := math.Abs(det)
	for i, s := range xs {
		for j, u := range xs {
			xi, eta := (1-s)*u, s // collapse toward the vertex (0, 1)
			w := ws[i] * ws[j] * (1 - s) * absDet
			f := dubiner(xi, eta, deg, buf)
			for k, fk := range f {
				gx[k] = inv[0][0]*fk.dx + inv[0][1]*fk.dy
				gy[k] = inv[1][0]*fk.dx + inv[1][1]*fk.dy
			}
			for a := 0; a < nb; a++ {
				for b := 0; b <= a; b++ {
					mm.SetSym(a, b, mm.At(a, b)+w*f[a].v*f[b].v)
					kk.SetSym(a, b, kk.At(a, b)+w*(gx[a]*gx[b]+gy[a]*gy[b]))
				}
			}
		}
	}
	var rows [][]float64
	ends := [3][2][2]float64{{{1, 0}, {0, 1}}, {{0, 1}, {0, 0}}, {{0, 0}, {1, 0}}}
	for _, e := range ends {
		row := make([]float64, nb)
		for i, s := range xs {
			xi, eta := e[0][0]+s*(e[1][0]-e[0][0]), e[0][1]+s*(e[1][1]-e[0][1])
			// Keep the point off η = 1 where the collapsed form divides by
			// 1 − η (the polynomial is continuous there).
			if eta > 1-1e-12 {
				eta = 1 - 1e-12
			}
			for k, fk := range dubiner(xi, eta, deg, buf) {
				row[k] += ws[i] * fk.v
			}
		}
		rows = append(rows, row)
	}
	if mean {
		row := make([]float64, nb)
		row[0] = 1 // φ_00 = 1 and the others are orthogonal to it
		rows = append(rows, row)
	}
	return largestQuotientOnNullSpace(rows, mm, kk, nb)
}

func longestEdge(v [3][2]float64) float64 {
	h := 0.0
	for i := 0; i < 3; i++ {
		a, b := v[i], v[(i+1)%3]
		h = math.Max(h, math.Hypot(a[0]-b[0], a[1]-b[1]))
	}
	return h
}

// TestLiuConstantQuotients: Liu's bound C_T = 0.1893 h_T (h_T the
// longest edge) must exceed sqrt(sup ‖e‖²/‖∇e‖²) over e ∈ H¹(T) with zero
// edge means. Polynomial trial spaces give lower estimates of that
// supremum (a refutation test; it cannot prove the bound). With the
// orthogonal Dubiner basis the estimate is stable to high degree; the
// degree-12 values are converged to 8 digits (measured: degrees 8 to 20
// agree on the equilateral triangle, 0.18917693 h_T, the largest over a
// grid of shapes with step 0.01 in the apex coordinates, which
// GAPCERT_LONG=1 scans; thin triangles tend to 0.18864 h_T). The
// equilateral value must exceed 0.1891 h_T, so the test would notice a
// trial space that no longer comes close to the supremum.
func TestLiuConstantQuotients(t *testing.T) {
	const liu = 0.1893
	check := func(what string, v [3][2]float64, deg int) float64 {
		r := math.Sqrt(crQuotient(v, deg, false)) / longestEdge(v)
		if !(r < liu) {
			t.Errorf("%s: trial quotient gives C_T ≥ %.8f h_T, above Liu's 0.1893 h_T", what, r)
		}
		// The enriched space's errors (zero element mean too) are a
		// subset, so their quotient cannot be larger.
		if re := math.Sqrt(crQuotient(v, deg, true)) / longestEdge(v); re > r*(1+1e-12) {
			t.Errorf("%s: quotient with the element mean %.8f above the one without %.8f", what, re, r)
		}
		return r
	}
	eq := [3][2]float64{{0, 0}, {1, 0}, {0.5, math.Sqrt(3) / 2}}
	if r := check("equilateral", eq, 12); !(r > 0.1891) {
		t.Errorf("equilateral: trial quotient %.8f h_T, want > 0.1891 h_T (the trial space is too weak to test the bound)", r)
	}
	for _, v := range [][3][2]float64{
		{{0, 0}, {1, 0}, {0, 1e-4}},     // thin, right angle
		{{0, 0}, {1, 0}, {0.5, 1e-4}},   // thin, obtuse apex
		{{0, 0}, {1, 0}, {0.999, 1e-3}}, // needle
		{{0, 0}, {1, 0}, {0.3, 0.9}},
		{{1e3, -2e3}, {7e3, 1e3}, {-2e3, 3e3}},
	} {
		check(fmt.Sprintf("triangle %v", v), v, 10)
	}
	if os.Getenv("GAPCERT_LONG") == "" {
		return
	}
	best := 0.0
	for i := 0; i <= 50; i++ {
		a := float64(i) / 100
		bmax := math.Sqrt(2*a - a*a) // apex (a, b) with the base as longest edge
		for j := 1; ; j++ {
			b := math.Min(float64(j)/100, bmax)
			if b <= 0 {
				break
			}
			best = math.Max(best, check(fmt.Sprintf("apex (%g, %g)", a, b), [3][2]float64{{0, 0}, {1, 0}, {a, b}}, 8))
			if b >= bmax {
				break
			}
		}
	}
	t.Logf("largest quotient over the shapes: %.8f h_T", best)
}
