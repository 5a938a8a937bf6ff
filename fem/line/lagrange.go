package line

import (
	"gapcert/enclose"
	"gapcert/enclose/band"
	"gapcert/fem/boundary"
	"gapcert/fem/internal/bernstein"
	"gapcert/fem/internal/ritz"
	"gapcert/interval"
)

// Lagrange is the conforming space of continuous piecewise polynomials of
// degree p on a mesh, with u = 0 exactly at Dirichlet ends (see space for
// the basis, the DOF ordering and why the space lies in H¹). It carries the
// forms of −u″ + Vu = λu:
//
//	a(u, v) = ∫u'v' + ∫Vuv + α_L u(a)v(a) + α_R u(b)v(b),   b(u, v) = ∫uv,
//
// the end terms present at natural ends (α = 0 for Neumann; package
// fem/boundary).
type Lagrange struct {
	space
	ends
}

// NewLagrange returns the degree-p space on m with the given end
// conditions. It panics if p < 1 or a condition is not valid
// (boundary.Condition.Check).
func NewLagrange(m *Mesh, p int, left, right boundary.Condition) *Lagrange {
	e := newEnds(left, right)
	return &Lagrange{space: newSpace(m, p, left.Essential(), right.Essential()), ends: e}
}

// N returns the dimension of the space.
func (s *Lagrange) N() int { return s.n }

// Degree returns p.
func (s *Lagrange) Degree() int { return s.p }

// Mesh returns the mesh.
func (s *Lagrange) Mesh() *Mesh { return s.mesh }

// Eval returns the value at x of the function with coefficients vec, in
// floating point (approximate; for plots and tests).
func (s *Lagrange) Eval(vec []float64, x float64) float64 { return s.eval(vec, x) }

// AssembleApprox returns float64 matrices (half-bandwidth p) of
// a(·,·) + shift·b(·,·) and b(·,·) in the basis, using midpoints of all
// enclosures and the polynomial parts of the potential's models. They are
// for choosing (approximate eigenpairs), never for bounds.
func (s *Lagrange) AssembleApprox(v *Potential, shift float64) (k, m *band.Sym) {
	s.checkPotential(v)
	p, p1 := s.p, s.p+1
	k, m = band.NewSym(s.n, p), band.NewSym(s.n, p)
	T := s.basis.FL
	// Derivative of each basis function in Bernstein form of degree p−1.
	D := make([]float64, p*p1)
	for i := 0; i < p; i++ {
		for l := 0; l < p1; l++ {
			D[i*p1+l] = float64(p) * (T[(i+1)*p1+l] - T[i*p1+l])
		}
	}
	kref := congruenceF(D, tripleTable(0, p-1, p-1).FL, p, p1)
	g := tripleTable(0, p, p).FL
	mref := congruenceF(T, g, p1, p1)
	w := make([]float64, p1*p1)
	wloc, work := make([]float64, p1*p1), make([]float64, p1*p1)
	for c := 0; c < s.mesh.Cells(); c++ {
		h := s.mesh.H(c).Mid()
		bern, rem := v.Model(c)
		q := len(bern) - 1
		tr := tripleTable(q, p, p).FL
		for ab := range w {
			w[ab] = (shift + rem.Mid()) * g[ab]
		}
		for j := 0; j <= q; j++ {
			pj := bern[j].Mid()
			for ab := range w {
				w[ab] += pj * tr[j*p1*p1+ab]
			}
		}
		congruenceFTo(wloc, work, T, w, p1, p1)
		for a := 0; a < p1; a++ {
			ga := s.dof(c, a)
			if ga < 0 {
				continue
			}
			for b := 0; b <= a; b++ {
				gb := s.dof(c, b)
				if gb < 0 {
					continue
				}
				k.Add(ga, gb, kref[a*p1+b]/h+h*wloc[a*p1+b])
				m.Add(ga, gb, h*mref[a*p1+b])
			}
		}
	}
	s.endTermsApprox(k)
	return k, m
}

// congruenceF returns Xᵀ G X for X r×c (row-major) and G r×r, in floating
// point (a choice).
func congruenceF(x, g []float64, r, c int) []float64 {
	return congruenceFTo(make([]float64, c*c), make([]float64, r*c), x, g, r, c)
}

// congruenceFTo sets dst (c×c) to Xᵀ G X as congruenceF does, with work
// (length ≥ r·c) as scratch, and returns dst.
func congruenceFTo(dst, work, x, g []float64, r, c int) []float64 {
	gx := work[:r*c]
	for i := 0; i < r; i++ {
		for l := 0; l < c; l++ {
			acc := 0.0
			for j := 0; j < r; j++ {
				acc += g[i*r+j] * x[j*c+l]
			}
			gx[i*c+l] = acc
		}
	}
	out := dst[:c*c]
	for a := 0; a < c; a++ {
		for b := 0; b < c; b++ {
			acc := 0.0
			for i := 0; i < r; i++ {
				acc += x[i*c+a] * gx[i*c+b]
			}
			out[a*c+b] = acc
		}
	}
	return out
}

func (s *Lagrange) checkPotential(v *Potential) {
	if v == nil || v.mesh != s.mesh {
		panic("line: potential is not on the space's mesh")
	}
}

func (s *Lagrange) checkVecs(vecs [][]float64) {
	if len(vecs) == 0 {
		panic("line: no vectors")
	}
	for _, x := range vecs {
		if len(x) != s.n {
			panic("line: coefficient vector length mismatch")
		}
	}
}

// RitzMatrices returns interval matrices with
//
//	a0_ij ⊇ a(u_i, u_j) + γ b(u_i, u_j),   a1_ij ⊇ b(u_i, u_j)
//
// for the functions u_i = Σ_l vecs[i][l] φ_l of the space (the vecs are
// exact float coefficients), for every γ ∈ gamma. The integrals are exact
// cell by cell: on cell k (exact length h ∈ H(k)), with ũ_i(ξ) = u_i(x_k + ξh)
// and c_i its local hierarchical coefficients,
//
//	∫u_i'u_j' = (1/h) c_iᵀ K_loc c_j,   ∫u_i u_j = h c_iᵀ M_loc c_j
//
// with the exact local matrices of hierarchicalGramTables (enclosed), and,
// with ũ_i in Bernstein form (coefficients enclosed from the exact basis),
//
//	∫(V+γ)u_i u_j = h∫_0^1 (P + γ + r_mid) ũ_i ũ_j + h∫_0^1 (R − r_mid) ũ_i ũ_j,
//
// where V(x_k + ξh) − P(ξ) ∈ R = [r_mid ± r_rad]; the last integral lies in
// ±r_rad ‖ũ_i‖‖ũ_j‖ (Cauchy–Schwarz; package doc, Remainders). The Robin terms
// α u_i(e)u_j(e) use the exact end values (the end vertex coefficients).
func (s *Lagrange) RitzMatrices(vecs [][]float64, v *Potential, gamma interval.I) (a0, a1 *enclose.Sym, err error) {
	s.checkPotential(v)
	s.checkVecs(vecs)
	nv := len(vecs)
	a, b := ritz.NewAccumulator(nv), ritz.NewAccumulator(nv)
	w := newCellWork(s.p, nv)
	for c := 0; c < s.mesh.Cells(); c++ {
		w.load(&s.space, vecs, c)
		h := s.mesh.H(c)
		bern, rem := v.Model(c)
		bernstein.WeightedGram(w.wg, tripleTable(len(bern)-1, s.p, s.p).IV, bern, gamma.AddF(rem.Mid()), s.p+1)
		w.weighted()
		hinv := h.Recip()
		rrad := rem.Rad()
		for i := 0; i < nv; i++ {
			for j := 0; j <= i; j++ {
				mass := bernstein.DotF(w.cf[j], w.gu[i])
				st := bernstein.DotF(w.cf[j], w.gd[i])
				pot := bernstein.DotI(w.u[j], w.wu[i])
				b.Add(i, j, h.Mul(mass))
				t := hinv.Mul(st).Add(h.Mul(pot))
				if r := bernstein.RemainderBound(rrad, w.mii[i].Hi, w.mii[j].Hi); r != 0 {
					r = interval.MulUp(r, h.Hi)
					t = t.Add(interval.I{Lo: -r, Hi: r})
				}
				a.Add(i, j, t)
			}
		}
	}
	s.endTerms(a, vecs)
	return a.Sym(), b.Sym(), nil
}

// cellWork holds, for one cell, the data of nv functions of a degree-p
// space: local hierarchical coefficients cf (exact floats), Bernstein
// coefficients u, derivative coefficients d (filled by callers that need
// them), gu = M_loc·cf and gd = K_loc·cf with the exact local mass and
// stiffness matrices, wu = (weighted Gram)·u, and mii ⊇ ∫ũ_i².
type cellWork struct {
	p          int
	cf         [][]float64
	u, d       [][]interval.I
	gu, gd, wu [][]interval.I
	mii        []interval.I
	wg         []interval.I
	kloc, mloc []interval.I
}

func newCellWork(p, nv int) *cellWork {
	k, m := hierarchicalGramTables(p)
	w := &cellWork{p: p, mii: make([]interval.I, nv), wg: make([]interval.I, (p+1)*(p+1)), kloc: k.IV, mloc: m.IV}
	mk := func(n int) [][]interval.I {
		out := make([][]interval.I, nv)
		for i := range out {
			out[i] = make([]interval.I, n)
		}
		return out
	}
	w.cf = make([][]float64, nv)
	for i := range w.cf {
		w.cf[i] = make([]float64, p+1)
	}
	w.u, w.gu, w.wu, w.gd = mk(p+1), mk(p+1), mk(p+1), mk(p+1)
	w.d = mk(p)
	return w
}

// load computes cf, u, gu, gd and mii of the vecs on cell k of s.
func (w *cellWork) load(s *space, vecs [][]float64, k int) {
	for i, x := range vecs {
		s.localCoef(w.cf[i], x, k)
		bernstein.ApplyF(w.u[i], s.basis.IV, w.cf[i])
		bernstein.ApplyF(w.gu[i], w.mloc, w.cf[i])
		bernstein.ApplyF(w.gd[i], w.kloc, w.cf[i])
		w.mii[i] = bernstein.DotF(w.cf[i], w.gu[i])
	}
}

// weighted computes wu = wg·u for every function.
func (w *cellWork) weighted() {
	for i := range w.u {
		bernstein.ApplyI(w.wu[i], w.wg, w.u[i])
	}
}
