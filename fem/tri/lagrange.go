package tri

import (
	"gapcert/enclose"
	"gapcert/enclose/sparse"
	"gapcert/fem/boundary"
	"gapcert/fem/internal/bernstein"
	"gapcert/fem/internal/ritz"
	"gapcert/fem/mesh"
	"gapcert/interval"
)

// Lagrange is the conforming space of continuous piecewise polynomials of
// degree p on a triangle mesh, in the Bernstein basis, with u = 0 exactly
// on Dirichlet sides. It carries the forms of −Δu + Vu = λu:
//
//	a(u, v) = ∫∇u·∇v + ∫Vuv + Σ_(e ⊂ Γ_R) α_e ∫_e uv,   b(u, v) = ∫uv.
//
// Basis and conformity. On a triangle a function is Σ_α u_α B^p_α(λ) with
// one coefficient per domain point x_α = Σ_i α_i v_i / p. On the edge
// opposite vertex i (λ_i = 0) the restriction is the univariate Bernstein
// polynomial of degree p in the edge's own parameter whose coefficients
// are the u_α with α_i = 0, in order along the edge: it depends only on
// the coefficients at the domain points of that edge. Each such domain
// point is one global degree of freedom shared by the triangles on both
// sides (vertices by node number; the p − 1 points inside an edge (a, b),
// a < b, numbered by the exponent of b, the same from either side), so
// the two restrictions coincide, the function is continuous, piecewise
// polynomial, and lies in H¹. Interior points belong to one triangle.
//
// Dirichlet sides: the coefficients at all domain points of an edge on a
// Dirichlet side (its end nodes included) are removed (set to exactly 0);
// the univariate Bernstein polynomials are a basis, so the restriction to
// that edge is then exactly 0, and conversely.
//
// DOF order: nodes, then edge points, then interior points, with the
// removed ones skipped.
type Lagrange struct {
	mesh  *mesh.Mesh
	p     int
	bc    []boundary.Condition
	n     int
	dofs  [][]int // per triangle, global index of each local multi-index (−1: removed)
	robin []robinEdge
	pairs [2][][2]int
	ref   *refTables
}

// refTables holds the reference tables a space of degree p uses.
type refTables struct {
	gramP, gramQ *table // Gram of degree p and p − 1
	edgeGram     *table
}

// NewLagrange returns the degree-p space on m with bc[i] the condition on
// polygon side i. It panics if p < 1, len(bc) is not the number of sides or
// a condition is not valid (boundary.Condition.Check).
func NewLagrange(m *mesh.Mesh, p int, bc []boundary.Condition) *Lagrange {
	if p < 1 {
		panic("tri: polynomial degree must be ≥ 1")
	}
	checkBC(m, bc)
	edges, triEdges := m.Edges()
	edgeOf := make(map[[2]int]int, len(edges))
	for e, ab := range edges {
		edgeOf[ab] = e
	}
	nNodes, nEdge, nInt := len(m.Nodes), p-1, max(0, (p-1)*(p-2)/2)
	raw := nNodes + len(edges)*nEdge + len(m.Tris)*nInt
	removed := make([]bool, raw)
	edgeRaw := func(a, b, expB int) int { // the point of edge (a, b) with exponent expB of b
		if a > b {
			a, b = b, a
			expB = p - expB
		}
		return nNodes + edgeOf[[2]int{a, b}]*nEdge + expB - 1
	}
	for _, be := range m.Bnd {
		if !bc[be.Side].Essential() {
			continue
		}
		removed[be.A], removed[be.B] = true, true
		for k := 1; k < p; k++ {
			removed[edgeRaw(be.A, be.B, k)] = true
		}
	}
	renum := make([]int, raw)
	n := 0
	for r := range renum {
		if removed[r] {
			renum[r] = -1
		} else {
			renum[r] = n
			n++
		}
	}
	ix := multiIndex(p)
	s := &Lagrange{mesh: m, p: p, bc: bc, n: n, dofs: make([][]int, len(m.Tris)), pairs: diffPairs(p),
		ref: &refTables{gramP: tripleTable(0, p, p), gramQ: tripleTable(0, p-1, p-1), edgeGram: edgeGramTable(p)}}
	for t, tri := range m.Tris {
		d := make([]int, len(ix.alpha))
		interior := 0
		for l, a := range ix.alpha {
			var r int
			zeros, zi := 0, -1
			for i := 0; i < 3; i++ {
				if a[i] == 0 {
					zeros++
					zi = i
				}
			}
			switch zeros {
			case 2: // vertex
				for i := 0; i < 3; i++ {
					if a[i] == p {
						r = tri[i]
					}
				}
			case 1: // inside the edge opposite local vertex zi
				j, k := (zi+1)%3, (zi+2)%3
				ea, eb := tri[j], tri[k]
				e := triEdges[t][zi]
				if edges[e] != [2]int{min(ea, eb), max(ea, eb)} {
					panic("tri: mesh edge table does not match its triangles")
				}
				r = edgeRaw(ea, eb, a[k])
			default:
				r = nNodes + len(edges)*nEdge + t*nInt + interior
				interior++
			}
			d[l] = renum[r]
		}
		s.dofs[t] = d
	}
	for _, e := range termEdges(m, bc, boundary.Condition.HasTerm) {
		along := make([]int, p+1)
		ja, jb := (e.i+1)%3, (e.i+2)%3
		for k := 0; k <= p; k++ {
			var a [3]int
			a[ja], a[jb] = p-k, k
			along[k] = s.dofs[e.t][ix.pos[a]]
		}
		s.robin = append(s.robin, robinEdge{dofs: along, alpha: e.alpha, length: e.length})
	}
	return s
}

// N returns the dimension of the space.
func (s *Lagrange) N() int { return s.n }

// Degree returns p.
func (s *Lagrange) Degree() int { return s.p }

// Mesh returns the mesh.
func (s *Lagrange) Mesh() *mesh.Mesh { return s.mesh }

// LocalDofs returns the global index of each local Bernstein coefficient of
// triangle t (multi-indices (p − i − j, i, j) in order; −1 where removed).
// The slice must not be modified.
func (s *Lagrange) LocalDofs(t int) []int { return s.dofs[t] }

func (s *Lagrange) checkPotential(v *Potential) {
	if v == nil || v.mesh != s.mesh {
		panic("tri: potential is not on the space's mesh")
	}
}

// RitzMatrices returns interval matrices with
//
//	a0_ij ⊇ a(u_i, u_j) + γ b(u_i, u_j),   a1_ij ⊇ b(u_i, u_j)
//
// for the functions u_i of the space with the exact float coefficients
// vecs[i], for every γ ∈ gamma and every exact mesh inside the node
// enclosures. The integrals are exact triangle by triangle: with c_i the
// local Bernstein coefficients of u_i on T,
//
//	∫_T u_i u_j = |T| c_iᵀ G^p c_j,
//	∫_T ∇u_i·∇u_j = p² |T| Σ_(k,l) g_kl (D_k c_i)ᵀ G^(p−1) (D_l c_j)      (kernel.go),
//	∫_T (V + γ) u_i u_j = |T| c_iᵀ W c_j + ∫_T (R − r_mid) u_i u_j,
//
// W the weighted Gram of P + γ + r_mid (V ∈ P + R on T, R ⊆ [r_mid ± r_rad]);
// the last integral lies in ±r_rad ‖u_i‖_T ‖u_j‖_T (Cauchy–Schwarz, package
// doc, Remainders). On a Robin edge e, α ∫_e u_i u_j = α |e| d_iᵀ G_e d_j
// with d_i the
// univariate Bernstein coefficients along e and G_e the exact edge Gram.
// It returns an error if a model of V is not bounded.
func (s *Lagrange) RitzMatrices(vecs [][]float64, v *Potential, gamma interval.I) (a0, a1 *enclose.Sym, err error) {
	s.checkPotential(v)
	if len(vecs) == 0 {
		panic("tri: no vectors")
	}
	for _, x := range vecs {
		if len(x) != s.n {
			panic("tri: coefficient vector length mismatch")
		}
	}
	nv := len(vecs)
	a, b := ritz.NewAccumulator(nv), ritz.NewAccumulator(nv)
	w := newRitzWork(s.p, v.q, nv)
	for t := range s.mesh.Tris {
		if !w.load(s, vecs, t) {
			continue
		}
		g := s.mesh.Geom(t)
		bern, rem := v.Model(t)
		if !rem.IsBounded() || !hull(bern).IsBounded() {
			return nil, nil, errUnbounded
		}
		bernstein.WeightedGram(w.wg, tripleTable(v.q, s.p, s.p).IV, bern, gamma.AddF(rem.Mid()), dim(s.p))
		gg := gradGram(g.Grad)
		w.derived(s, gg)
		rrad := rem.Rad()
		pp := float64(s.p * s.p)
		for i := 0; i < nv; i++ {
			for j := 0; j <= i; j++ {
				mass := bernstein.DotF(w.cf[j], w.gu[i])
				st := bernstein.DotI(w.d[j][0], w.h[i][0]).Add(bernstein.DotI(w.d[j][1], w.h[i][1])).MulF(pp)
				pot := bernstein.DotF(w.cf[j], w.wu[i])
				b.Add(i, j, g.Area.Mul(mass))
				e := st.Add(pot)
				if r := bernstein.RemainderBound(rrad, w.mii[i].Hi, w.mii[j].Hi); r != 0 {
					e = e.Add(interval.I{Lo: -r, Hi: r})
				}
				a.Add(i, j, g.Area.Mul(e))
			}
		}
	}
	s.edgeTerms(a, vecs)
	return a.Sym(), b.Sym(), nil
}

// ritzWork holds, for one triangle, the data of nv functions of degree p:
// local coefficients cf (exact floats), gu = G^p cf, wu = W cf, mii ⊇
// ∫_T u_i²/|T|, the differences d[i][k] = D_k cf, and
// h[i][k] = Σ_l g_kl G^(p−1) D_l cf.
type ritzWork struct {
	cf      [][]float64
	gu, wu  [][]interval.I
	d, h    [][2][]interval.I
	mii     []interval.I
	wg, tmp []interval.I
	gramP   []interval.I
	gramQ   []interval.I
}

func newRitzWork(p, q, nv int) *ritzWork {
	np, nq := dim(p), dim(p-1)
	w := &ritzWork{mii: make([]interval.I, nv), wg: make([]interval.I, np*np), tmp: make([]interval.I, nq),
		gramP: tripleTable(0, p, p).IV, gramQ: tripleTable(0, p-1, p-1).IV}
	w.cf = make([][]float64, nv)
	w.gu, w.wu = make([][]interval.I, nv), make([][]interval.I, nv)
	w.d, w.h = make([][2][]interval.I, nv), make([][2][]interval.I, nv)
	for i := 0; i < nv; i++ {
		w.cf[i] = make([]float64, np)
		w.gu[i], w.wu[i] = make([]interval.I, np), make([]interval.I, np)
		for k := 0; k < 2; k++ {
			w.d[i][k], w.h[i][k] = make([]interval.I, nq), make([]interval.I, nq)
		}
	}
	return w
}

// load gathers the local coefficients of every vector on triangle t and
// computes gu and mii; it reports whether any coefficient is nonzero.
func (w *ritzWork) load(s *Lagrange, vecs [][]float64, t int) bool {
	nz := false
	for i, x := range vecs {
		for l, g := range s.dofs[t] {
			w.cf[i][l] = 0
			if g >= 0 {
				w.cf[i][l] = x[g]
				nz = nz || x[g] != 0
			}
		}
	}
	if !nz {
		return false
	}
	for i := range vecs {
		bernstein.ApplyF(w.gu[i], w.gramP, w.cf[i])
		w.mii[i] = bernstein.DotF(w.cf[i], w.gu[i])
	}
	return true
}

// derived computes wu, d and h (after wg is set).
func (w *ritzWork) derived(s *Lagrange, g [2][2]interval.I) {
	for i := range w.cf {
		bernstein.ApplyF(w.wu[i], w.wg, w.cf[i])
		for k := 0; k < 2; k++ {
			diffF(w.d[i][k], s.pairs[k], w.cf[i])
		}
		for k := 0; k < 2; k++ {
			for b := range w.h[i][k] {
				w.h[i][k][b] = interval.I{}
			}
		}
		for l := 0; l < 2; l++ {
			bernstein.ApplyI(w.tmp, w.gramQ, w.d[i][l])
			for k := 0; k < 2; k++ {
				for b, x := range w.tmp {
					w.h[i][k][b] = w.h[i][k][b].Add(g[k][l].Mul(x))
				}
			}
		}
	}
}

// AssembleApprox returns float64 matrices of a(·,·) + shift·b(·,·) and
// b(·,·) in the basis, from midpoints of every enclosure and the
// polynomial parts of the potential's models (plus the remainder
// midpoints). They are for choosing (approximate eigenpairs), never for
// bounds.
func (s *Lagrange) AssembleApprox(v *Potential, shift float64) (k, m *sparse.Sym) {
	s.checkPotential(v)
	np := dim(s.p)
	kb, mb := sparse.NewBuilder(s.n), sparse.NewBuilder(s.n)
	refK := s.refStiffness()
	gp := s.ref.gramP.FL
	tr := tripleTable(v.q, s.p, s.p).FL
	nn := np * np
	wloc := make([]float64, nn)
	for t := range s.mesh.Tris {
		g := s.mesh.Geom(t)
		area := g.Area.Mid()
		gg := gradGram(g.Grad)
		bern, rem := v.Model(t)
		for ab := range wloc {
			wloc[ab] = 0
		}
		for kk, c := range bern {
			wk := c.Mid() + rem.Mid() + shift
			blk := tr[kk*nn : (kk+1)*nn]
			for ab := range wloc {
				wloc[ab] += wk * blk[ab]
			}
		}
		pp := float64(s.p * s.p)
		d := s.dofs[t]
		for a := 0; a < np; a++ {
			if d[a] < 0 {
				continue
			}
			for b := 0; b <= a; b++ {
				if d[b] < 0 {
					continue
				}
				st := 0.0
				for kk := 0; kk < 2; kk++ {
					for l := 0; l < 2; l++ {
						st += gg[kk][l].Mid() * refK[kk][l][a*np+b]
					}
				}
				kb.Add(d[a], d[b], area*(pp*st+wloc[a*np+b]))
				mb.Add(d[a], d[b], area*gp[a*np+b])
			}
		}
	}
	s.edgeTermsApprox(kb)
	return kb.Build(), mb.Build()
}

// refStiffness returns R^(kl)[a·N_p + b] = (D_k e_a)ᵀ G^(p−1) (D_l e_b) in
// floating point (a choice: used by AssembleApprox only).
func (s *Lagrange) refStiffness() [2][2][]float64 {
	np, nq := dim(s.p), dim(s.p-1)
	gq := s.ref.gramQ.FL
	// D_k as dense nq×np matrices.
	var dk [2][]float64
	for k := 0; k < 2; k++ {
		dk[k] = make([]float64, nq*np)
		for b, pr := range s.pairs[k] {
			dk[k][b*np+pr[0]] += 1
			dk[k][b*np+pr[1]] -= 1
		}
	}
	var out [2][2][]float64
	for k := 0; k < 2; k++ {
		for l := 0; l < 2; l++ {
			r := make([]float64, np*np)
			for a := 0; a < np; a++ {
				for b := 0; b < np; b++ {
					acc := 0.0
					for x := 0; x < nq; x++ {
						if dk[k][x*np+a] == 0 {
							continue
						}
						for y := 0; y < nq; y++ {
							acc += dk[k][x*np+a] * gq[x*nq+y] * dk[l][y*np+b]
						}
					}
					r[a*np+b] = acc
				}
			}
			out[k][l] = r
		}
	}
	return out
}
