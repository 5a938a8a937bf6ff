package tet

import (
	"math"
	"math/big"
	"math/rand/v2"
	"testing"

	"gapcert/fem/boundary"
	"gapcert/interval"
)

// gmRule returns the Grundmann–Möller rule of index s on the standard
// n-simplex (volume 1/n!): weights and points in barycentric coordinates
// (n + 1 of them), exact for polynomials of degree ≤ 2s + 1 (A. Grundmann,
// H. M. Möller, Invariant integration formulas for the n-simplex by
// combinatorial methods, SIAM J. Numer. Anal. 15 (1978) 282–290; details
// recalled from memory, the rule is checked on monomials below):
//
//	Q(f) = Σ_(i=0..s) (−1)^i 2^(−2s) (d + n − 2i)^d / (i! (d + n − i)!) Σ_(|β| = s − i) f((2β + 1)/(d + n − 2i)),  d = 2s + 1.
//
// All in exact rationals. The tests check it on monomials first.
func gmRule(n, s int) (w []*big.Rat, pts [][]*big.Rat) {
	d := 2*s + 1
	var comps func(k, left int, prefix []int, emit func([]int))
	comps = func(k, left int, prefix []int, emit func([]int)) {
		if k == 1 {
			emit(append(append([]int(nil), prefix...), left))
			return
		}
		for a := 0; a <= left; a++ {
			comps(k-1, left-a, append(prefix, a), emit)
		}
	}
	for i := 0; i <= s; i++ {
		den := int64(d + n - 2*i)
		num := new(big.Int).Exp(big.NewInt(den), big.NewInt(int64(d)), nil)
		if i%2 == 1 {
			num.Neg(num)
		}
		q := new(big.Int).Mul(factorial(i), factorial(d+n-i))
		q.Lsh(q, uint(2*s))
		wi := new(big.Rat).SetFrac(num, q)
		comps(n+1, s-i, nil, func(beta []int) {
			pt := make([]*big.Rat, n+1)
			for j, b := range beta {
				pt[j] = big.NewRat(int64(2*b+1), den)
			}
			w = append(w, wi)
			pts = append(pts, pt)
		})
	}
	return w, pts
}

func TestGrundmannMollerRuleOnMonomials(t *testing.T) {
	w, pts := gmRule(3, 3)
	for _, a := range [][4]int{{0, 0, 0, 0}, {0, 2, 1, 0}, {3, 1, 0, 2}, {1, 1, 1, 4}} {
		sum := new(big.Rat)
		for q := range w {
			v := new(big.Rat).Set(w[q])
			for i, e := range a {
				for k := 0; k < e; k++ {
					v.Mul(v, pts[q][i])
				}
			}
			sum.Add(sum, v)
		}
		// ∫ over the standard simplex = a!/(|a| + 3)! (volume 1/6 times baryIntegralRat).
		want := baryIntegralRat(4, a)
		want.Quo(want, big.NewRat(6, 1))
		if sum.Cmp(want) != 0 {
			t.Errorf("monomial %v: rule %s, exact %s", a, sum.RatString(), want.RatString())
		}
	}
}

// ratVec is a 3-vector of exact rationals.
type ratVec [3]*big.Rat

func rsub(a, b ratVec) ratVec {
	return ratVec{new(big.Rat).Sub(a[0], b[0]), new(big.Rat).Sub(a[1], b[1]), new(big.Rat).Sub(a[2], b[2])}
}

func rcross(a, b ratVec) ratVec {
	m := func(x, y *big.Rat) *big.Rat { return new(big.Rat).Mul(x, y) }
	return ratVec{
		new(big.Rat).Sub(m(a[1], b[2]), m(a[2], b[1])),
		new(big.Rat).Sub(m(a[2], b[0]), m(a[0], b[2])),
		new(big.Rat).Sub(m(a[0], b[1]), m(a[1], b[0])),
	}
}

func rdot(a, b ratVec) *big.Rat {
	s := new(big.Rat)
	for i := 0; i < 3; i++ {
		s.Add(s, new(big.Rat).Mul(a[i], b[i]))
	}
	return s
}

// exactElement returns ∫_T ∇u_i·∇u_j + ∫_T (V + γ) u_i u_j and ∫_T u_i u_j
// exactly for functions of degree p given by their local Bernstein
// coefficients c[i] on the tetrahedron with float vertices f, V(x, y, z) =
// 1 + xy + z² and γ = 1/2, by the Grundmann–Möller rule in math/big (an
// independent computation: point values of the Bernstein polynomials and
// their λ-derivatives, exact barycentric gradients by Cramer's rule).
func exactElement(f [4][3]float64, p int, c [][]float64) (a, b [][]*big.Rat) {
	var v [4]ratVec
	for i := range v {
		for k := 0; k < 3; k++ {
			v[i][k] = new(big.Rat).SetFloat64(f[i][k])
		}
	}
	d1, d2, d3 := rsub(v[1], v[0]), rsub(v[2], v[0]), rsub(v[3], v[0])
	det := rdot(d1, rcross(d2, d3))
	vol := new(big.Rat).Quo(det, big.NewRat(6, 1))
	var grad [4]ratVec
	for k, cr := range []ratVec{rcross(d2, d3), rcross(d3, d1), rcross(d1, d2)} {
		for c := 0; c < 3; c++ {
			grad[k+1][c] = new(big.Rat).Quo(cr[c], det)
		}
	}
	for c := 0; c < 3; c++ {
		grad[0][c] = new(big.Rat).Neg(new(big.Rat).Add(grad[1][c], new(big.Rat).Add(grad[2][c], grad[3][c])))
	}
	ix := multiIndex(4, p)
	w, pts := gmRule(3, 3) // degree 7 ≥ 2p + 2 for p ≤ 2
	nv := len(c)
	a, b = make([][]*big.Rat, nv), make([][]*big.Rat, nv)
	for i := range a {
		a[i], b[i] = make([]*big.Rat, nv), make([]*big.Rat, nv)
		for j := range a[i] {
			a[i][j], b[i][j] = new(big.Rat), new(big.Rat)
		}
	}
	pow := func(x *big.Rat, e int) *big.Rat {
		r := big.NewRat(1, 1)
		for k := 0; k < e; k++ {
			r.Mul(r, x)
		}
		return r
	}
	for q := range w {
		lam := pts[q]
		var x ratVec
		for k := 0; k < 3; k++ {
			x[k] = new(big.Rat)
			for i := 0; i < 4; i++ {
				x[k].Add(x[k], new(big.Rat).Mul(lam[i], v[i][k]))
			}
		}
		V := new(big.Rat).Add(big.NewRat(3, 2), new(big.Rat).Mul(x[0], x[1]))
		V.Add(V, new(big.Rat).Mul(x[2], x[2]))
		val := make([]*big.Rat, nv)
		gr := make([]ratVec, nv)
		for i := 0; i < nv; i++ {
			val[i] = new(big.Rat)
			gr[i] = ratVec{new(big.Rat), new(big.Rat), new(big.Rat)}
			for l, al := range ix.alpha {
				if c[i][l] == 0 {
					continue
				}
				coef := new(big.Rat).SetFloat64(c[i][l])
				coef.Mul(coef, new(big.Rat).SetInt(multinom(al)))
				m := new(big.Rat).Set(coef)
				for k := 0; k < 4; k++ {
					m.Mul(m, pow(lam[k], al[k]))
				}
				val[i].Add(val[i], m)
				for k := 0; k < 4; k++ {
					if al[k] == 0 {
						continue
					}
					dk := new(big.Rat).Mul(coef, big.NewRat(int64(al[k]), 1))
					for j := 0; j < 4; j++ {
						e := al[j]
						if j == k {
							e--
						}
						dk.Mul(dk, pow(lam[j], e))
					}
					for c := 0; c < 3; c++ {
						gr[i][c].Add(gr[i][c], new(big.Rat).Mul(dk, grad[k][c]))
					}
				}
			}
		}
		// weight on T: the rule is on the standard simplex (volume 1/6).
		wq := new(big.Rat).Mul(w[q], new(big.Rat).Mul(vol, big.NewRat(6, 1)))
		for i := 0; i < nv; i++ {
			for j := 0; j < nv; j++ {
				uv := new(big.Rat).Mul(val[i], val[j])
				b[i][j].Add(b[i][j], new(big.Rat).Mul(wq, uv))
				e := new(big.Rat).Add(rdot(gr[i], gr[j]), new(big.Rat).Mul(V, uv))
				a[i][j].Add(a[i][j], new(big.Rat).Mul(wq, e))
			}
		}
	}
	return a, b
}

// The interval Ritz matrices of P_2 on one random tetrahedron (Neumann
// faces, so every coefficient is free) with V = 1 + xy + z² and γ = 1/2
// contain the exact integrals computed in math/big by an exact quadrature
// rule, and are narrow (relative width ≤ 1e-12).
func TestRitzMatricesContainExactElementIntegrals(t *testing.T) {
	rng := rand.New(rand.NewPCG(14, 1))
	checked := 0
	defer func() {
		if checked < 10 {
			t.Errorf("only %d of 20 random tetrahedra checked", checked)
		}
	}()
	for trial := 0; trial < 20; trial++ {
		var f [4][3]float64
		var nodes [][3]interval.I
		for i := range f {
			for c := range f[i] {
				f[i][c] = rng.Float64()*2 - 1
			}
		}
		tt := [4]int{0, 1, 2, 3}
		d := func(i, c int) float64 { return f[i][c] - f[0][c] }
		if d(1, 0)*(d(2, 1)*d(3, 2)-d(2, 2)*d(3, 1))-d(1, 1)*(d(2, 0)*d(3, 2)-d(2, 2)*d(3, 0))+d(1, 2)*(d(2, 0)*d(3, 1)-d(2, 1)*d(3, 0)) < 0 {
			f[1], f[2] = f[2], f[1] // positive orientation (a choice; geometry verifies it)
		}
		for i := range f {
			nodes = append(nodes, [3]interval.I{interval.Point(f[i][0]), interval.Point(f[i][1]), interval.Point(f[i][2])})
		}
		if vol := testVolume(nodes); !(vol.Lo >= 1e-3) {
			continue // near-degenerate: draw again
		}
		checked++
		m := meshOfTets(t, nodes, [][4]int{tt}, 1, func([3]int) int { return 0 })
		s := NewLagrange(m, 2, []boundary.Condition{neumann})
		v, err := NewPotential(m, mustExpr(t, "1 + x*y + z^2"), 2)
		if err != nil {
			t.Fatal(err)
		}
		if !v.Exact() {
			t.Fatal("a quadratic potential has a nonzero remainder at order 2")
		}
		vecs := make([][]float64, 3)
		loc := make([][]float64, 3)
		for i := range vecs {
			vecs[i] = make([]float64, s.N())
			for k := range vecs[i] {
				vecs[i][k] = rng.NormFloat64()
			}
			loc[i] = make([]float64, len(s.LocalDofs(0)))
			for l, g := range s.LocalDofs(0) {
				loc[i][l] = vecs[i][g]
			}
		}
		a0, a1, err := s.RitzMatrices(vecs, v, interval.Point(0.5))
		if err != nil {
			t.Fatal(err)
		}
		ea, eb := exactElement(f, 2, loc)
		for i := range vecs {
			for j := range vecs {
				for _, c := range []struct {
					name string
					got  interval.I
					want *big.Rat
				}{{"a0", a0.At(i, j), ea[i][j]}, {"a1", a1.At(i, j), eb[i][j]}} {
					if !ratIn(c.got, c.want) {
						x, _ := c.want.Float64()
						t.Fatalf("trial %d: %s(%d, %d) = %v misses the exact %.17g", trial, c.name, i, j, c.got, x)
					}
					if w := c.got.Wid(); w > 1e-12*math.Max(1, math.Abs(c.got.Mid())) {
						t.Errorf("trial %d: %s(%d, %d) = %v too wide", trial, c.name, i, j, c.got)
					}
				}
			}
		}
	}
}

func ratIn(x interval.I, r *big.Rat) bool {
	return new(big.Rat).SetFloat64(x.Lo).Cmp(r) <= 0 && r.Cmp(new(big.Rat).SetFloat64(x.Hi)) <= 0
}

// The polar moment used by ProjectionConstant: ∫_T |x − x_c|²/|T| =
// (Σ_edges ℓ²)/80, checked exactly in math/big with the Grundmann–Möller
// rule on random tetrahedra; and ProjectionConstant is √(h²/π² + Σℓ²/720)
// rounded up on the Kuhn tetrahedra of the unit cube.
func TestPolarMomentAndProjectionConstant(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 5))
	w, pts := gmRule(3, 1)
	for trial := 0; trial < 10; trial++ {
		var v [4]ratVec
		for i := range v {
			for c := 0; c < 3; c++ {
				v[i][c] = new(big.Rat).SetFloat64(rng.Float64())
			}
		}
		var xc ratVec
		for c := 0; c < 3; c++ {
			xc[c] = new(big.Rat)
			for i := range v {
				xc[c].Add(xc[c], v[i][c])
			}
			xc[c].Quo(xc[c], big.NewRat(4, 1))
		}
		mom := new(big.Rat)
		for q := range w {
			var x ratVec
			for c := 0; c < 3; c++ {
				x[c] = new(big.Rat)
				for i := range v {
					x[c].Add(x[c], new(big.Rat).Mul(pts[q][i], v[i][c]))
				}
			}
			d := rsub(x, xc)
			mom.Add(mom, new(big.Rat).Mul(w[q], rdot(d, d)))
		}
		mom.Mul(mom, big.NewRat(6, 1)) // the rule integrates over volume 1/6
		sum := new(big.Rat)
		for _, e := range localEdges {
			d := rsub(v[e[1]], v[e[0]])
			sum.Add(sum, rdot(d, d))
		}
		if want := new(big.Rat).Quo(sum, big.NewRat(80, 1)); mom.Cmp(want) != 0 {
			t.Fatalf("polar moment %s, Σℓ²/80 = %s", mom.RatString(), want.RatString())
		}
	}
	m := unitCube(t, 1)
	ch := NewCR(m, allBC(6, dirichlet)).ProjectionConstant()
	// The Kuhn tetrahedra of the unit cube: edges 1, 1, 1, √2, √2, √3
	// (Σℓ² = 10, h = √3): C² = 3/π² + 10/720.
	want := math.Sqrt(3/(math.Pi*math.Pi) + 10.0/720)
	if !(ch.Hi >= want*(1-1e-15)) || ch.Hi > want*(1+1e-13) {
		t.Errorf("projection constant %v, want ≈ %.17g", ch, want)
	}
}

// Robin face terms on one random tetrahedron (α = 1 on every face, V = 0):
// for u = λ_1 (Bernstein coefficients α_1/p), a(u, u) = ∫_T |∇λ_1|² +
// Σ_F ∫_F λ_1², and ∫_F λ_1² = |F|/6 on the three faces containing vertex
// 1 (the triangle integral 2·2!/4! of tables.go), 0 on the fourth. The
// areas are computed independently in math/big (big.Float square roots of
// exact squared norms at 200 bits); the enclosure contains the exact value
// up to that precision and is narrow.
func TestRobinFaceTermsOnRandomTetrahedron(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 4))
	checked := 0
	defer func() {
		if checked < 5 {
			t.Errorf("only %d of 10 random tetrahedra checked", checked)
		}
	}()
	for trial := 0; trial < 10; trial++ {
		var f [4][3]float64
		for i := range f {
			for c := range f[i] {
				f[i][c] = rng.Float64()
			}
		}
		d := func(i, c int) float64 { return f[i][c] - f[0][c] }
		if d(1, 0)*(d(2, 1)*d(3, 2)-d(2, 2)*d(3, 1))-d(1, 1)*(d(2, 0)*d(3, 2)-d(2, 2)*d(3, 0))+d(1, 2)*(d(2, 0)*d(3, 1)-d(2, 1)*d(3, 0)) < 0 {
			f[1], f[2] = f[2], f[1]
		}
		var nodes [][3]interval.I
		var v [4]ratVec
		for i := range f {
			nodes = append(nodes, [3]interval.I{interval.Point(f[i][0]), interval.Point(f[i][1]), interval.Point(f[i][2])})
			for c := 0; c < 3; c++ {
				v[i][c] = new(big.Rat).SetFloat64(f[i][c])
			}
		}
		if vol := testVolume(nodes); !(vol.Lo >= 1e-3) {
			continue
		}
		checked++
		tt := [4]int{0, 1, 2, 3}
		m := meshOfTets(t, nodes, [][4]int{tt}, 1, func([3]int) int { return 0 })
		p := 2
		s := NewLagrange(m, p, []boundary.Condition{{Kind: boundary.Robin, Alpha: interval.Point(1)}})
		u := make([]float64, s.N())
		for l, al := range s.MultiIndices() {
			u[s.LocalDofs(0)[l]] = float64(al[1]) / float64(p)
		}
		pot, err := NewPotential(m, mustExpr(t, "0"), 1)
		if err != nil {
			t.Fatal(err)
		}
		a0, _, err := s.RitzMatrices([][]float64{u}, pot, interval.I{})
		if err != nil {
			t.Fatal(err)
		}
		// Exact: volume·|∇λ_1|² = |d_2 × d_3|²/(6 D) plus the face terms.
		d1, d2, d3 := rsub(v[1], v[0]), rsub(v[2], v[0]), rsub(v[3], v[0])
		cr := rcross(d2, d3)
		det := rdot(d1, cr)
		grad2 := new(big.Rat).Quo(rdot(cr, cr), new(big.Rat).Mul(det, big.NewRat(6, 1)))
		want := new(big.Float).SetPrec(200).SetRat(grad2)
		for i := 0; i < 4; i++ {
			if i == 1 {
				continue
			}
			fn := faceNodes(tt, i)
			n := rcross(rsub(v[fn[1]], v[fn[0]]), rsub(v[fn[2]], v[fn[0]]))
			area := new(big.Float).SetPrec(200).SetRat(rdot(n, n))
			area.Sqrt(area)
			area.Quo(area, big.NewFloat(12)) // |F|/6 = |n|/12
			want.Add(want, area)
		}
		got := a0.At(0, 0)
		lo, hi := new(big.Float).SetFloat64(got.Lo), new(big.Float).SetFloat64(got.Hi)
		if lo.Cmp(want) > 0 || hi.Cmp(want) < 0 {
			w, _ := want.Float64()
			t.Fatalf("trial %d: a(λ_1, λ_1) = %v misses %.17g", trial, got, w)
		}
		if got.Wid() > 1e-12*got.Mid() {
			t.Errorf("trial %d: %v too wide", trial, got)
		}
	}
}
