package tet

import (
	"runtime"
	"sync"
	"sync/atomic"

	"gapcert/enclose"
	"gapcert/enclose/sparse"
	"gapcert/fem/boundary"
	"gapcert/fem/internal/bernstein"
	"gapcert/fem/internal/ritz"
	"gapcert/interval"
)

// Lagrange is the conforming space of continuous piecewise polynomials of
// degree p on a tetrahedral mesh, in the Bernstein basis, with u = 0
// exactly on Dirichlet faces. It carries the forms of −Δu + Vu = λu:
//
//	a(u, v) = ∫∇u·∇v + ∫Vuv + Σ_(F ⊂ Γ_R) α_F ∫_F uv,   b(u, v) = ∫uv.
//
// Basis and conformity. On a tetrahedron a function is Σ_α u_α B^p_α(λ)
// with one coefficient per domain point x_α = Σ_i α_i v_i / p. On the face
// opposite vertex i (λ_i = 0) the restriction is the Bernstein polynomial
// of degree p on that triangle (in its own barycentric coordinates, the
// other three λ_j) whose coefficients are the u_α with α_i = 0: it depends
// only on the coefficients at the domain points of that face. Each domain
// point is one global degree of freedom shared by every tetrahedron that
// contains it, identified by its position only (a node by its number; a
// point inside an edge by the edge and the exponent of its larger node; a
// point inside a face by the face and the exponents of its three nodes in
// increasing node order), so the same from either side of a face. The two
// restrictions to a shared face therefore coincide, the function is
// continuous, piecewise polynomial, and lies in H¹. Interior points
// belong to one tetrahedron.
//
// Dirichlet faces: the coefficients at all domain points of a face on a
// Dirichlet side (its nodes and edge points included) are removed (set to
// exactly 0); the triangle's Bernstein polynomials are a basis, so the
// restriction to that face is then exactly 0, and conversely.
//
// DOF order: nodes, then edge points, then face points, then interior
// points, with the removed ones skipped.
type Lagrange struct {
	mesh  *Mesh
	p     int
	bc    []boundary.Condition
	n     int
	dofs  [][]int // per tetrahedron, global index of each local multi-index (−1: removed)
	robin []robinFace
	pairs [3][][2]int
}

// robinFace is a boundary face with a term: the global DOFs of its domain
// points in the order of the triangle multi-indices of degree p in the
// face's local vertices (increasing local order), α and the area.
type robinFace struct {
	dofs  []int
	alpha interval.I
	area  interval.I
}

// checkBC panics unless bc holds one valid condition per side of m.
func checkBC(m *Mesh, bc []boundary.Condition) {
	if len(bc) != m.sides {
		panic("tet: one boundary condition per polyhedron face required")
	}
	for _, c := range bc {
		c.Check()
	}
}

// NewLagrange returns the degree-p space on m with bc[i] the condition on
// polyhedron face i. It panics if p < 1, len(bc) is not the number of
// sides or a condition is not valid (boundary.Condition.Check).
func NewLagrange(m *Mesh, p int, bc []boundary.Condition) *Lagrange {
	if p < 1 {
		panic("tet: polynomial degree must be ≥ 1")
	}
	checkBC(m, bc)
	nNodes, nE, nF, nI := len(m.nodes), p-1, max(0, dim2(p-3)), max(0, dim3(p-4))
	if p < 3 {
		nF = 0
	}
	if p < 4 {
		nI = 0
	}
	baseE := nNodes
	baseF := baseE + len(m.edges)*nE
	baseI := baseF + len(m.faces)*nF
	raw := baseI + len(m.tets)*nI
	ix := multiIndex(4, p)
	fx := multiIndex(3, max(p-3, 0))
	rawDofs := make([][]int, len(m.tets))
	for t, tt := range m.tets {
		d := make([]int, len(ix.alpha))
		interior := 0
		for l, a := range ix.alpha {
			var sup []int
			for i := 0; i < 4; i++ {
				if a[i] > 0 {
					sup = append(sup, i)
				}
			}
			switch len(sup) {
			case 1:
				d[l] = tt[sup[0]]
			case 2:
				i, j := sup[0], sup[1]
				e := m.tetEdges[t][localEdgeOf(i, j)]
				expMax := a[j]
				if tt[i] > tt[j] {
					expMax = a[i]
				}
				d[l] = baseE + e*nE + expMax - 1
			case 3:
				missing := 6 - sup[0] - sup[1] - sup[2]
				f := m.tetFaces[t][missing]
				// exponents of the face's nodes in increasing node order
				type ne struct{ node, exp int }
				s := []ne{{tt[sup[0]], a[sup[0]]}, {tt[sup[1]], a[sup[1]]}, {tt[sup[2]], a[sup[2]]}}
				for x := 1; x < 3; x++ {
					for y := x; y > 0 && s[y].node < s[y-1].node; y-- {
						s[y], s[y-1] = s[y-1], s[y]
					}
				}
				d[l] = baseF + f*nF + fx.pos[[4]int{s[0].exp - 1, s[1].exp - 1, s[2].exp - 1, 0}]
			default:
				d[l] = baseI + t*nI + interior
				interior++
			}
		}
		rawDofs[t] = d
	}
	removed := make([]bool, raw)
	for k, b := range m.bnd {
		if !bc[b.Face].Essential() {
			continue
		}
		t, i := m.bndOwner[k][0], m.bndOwner[k][1]
		for l, a := range ix.alpha {
			if a[i] == 0 {
				removed[rawDofs[t][l]] = true
			}
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
	s := &Lagrange{mesh: m, p: p, bc: bc, n: n, dofs: rawDofs, pairs: diffPairs(p)}
	for _, d := range rawDofs {
		for l := range d {
			d[l] = renum[d[l]]
		}
	}
	tx := multiIndex(3, p)
	for k, b := range m.bnd {
		c := bc[b.Face]
		if !c.HasTerm() {
			continue
		}
		t, i := m.bndOwner[k][0], m.bndOwner[k][1]
		fv := faceNodes([4]int{0, 1, 2, 3}, i)
		along := make([]int, len(tx.alpha))
		for q, beta := range tx.alpha {
			var a [4]int
			for r := 0; r < 3; r++ {
				a[fv[r]] = beta[r]
			}
			along[q] = s.dofs[t][ix.pos[a]]
		}
		s.robin = append(s.robin, robinFace{dofs: along, alpha: c.WeakAlpha(), area: m.faceArea(t, i)})
	}
	return s
}

// localEdgeOf returns the local edge joining local vertices i < j.
func localEdgeOf(i, j int) int {
	for k, e := range localEdges {
		if e == [2]int{i, j} {
			return k
		}
	}
	panic("tet: no such local edge")
}

// N returns the dimension of the space.
func (s *Lagrange) N() int { return s.n }

// Degree returns p.
func (s *Lagrange) Degree() int { return s.p }

// Mesh returns the mesh.
func (s *Lagrange) Mesh() *Mesh { return s.mesh }

// LocalDofs returns the global index of each local Bernstein coefficient
// of tetrahedron t (multi-indices of multiIndex order; −1 where removed).
// The slice must not be modified.
func (s *Lagrange) LocalDofs(t int) []int { return s.dofs[t] }

// MultiIndices returns the multi-indices α (|α| = p, α_j the power of the
// barycentric coordinate of local vertex j) in the order of LocalDofs and
// Local (a new slice).
func (s *Lagrange) MultiIndices() [][4]int {
	return append([][4]int(nil), multiIndex(4, s.p).alpha...)
}

// Local sets dst[l] to the Bernstein coefficient of multi-index l on
// tetrahedron t of the function with global coefficients vec: a copy of
// the float coefficient, or exactly 0 where the DOF was removed.
func (s *Lagrange) Local(dst, vec []float64, t int) {
	for l, g := range s.dofs[t] {
		dst[l] = 0
		if g >= 0 {
			dst[l] = vec[g]
		}
	}
}

func (s *Lagrange) checkPotential(v *Potential) {
	if v == nil || v.mesh != s.mesh {
		panic("tet: potential is not on the space's mesh")
	}
}

// RitzMatrices returns interval matrices with
//
//	a0_ij ⊇ a(u_i, u_j) + γ b(u_i, u_j),   a1_ij ⊇ b(u_i, u_j)
//
// for the functions u_i of the space with the exact float coefficients
// vecs[i], for every γ ∈ gamma and every exact mesh inside the node
// enclosures. The integrals are exact tetrahedron by tetrahedron: with c_i
// the local Bernstein coefficients of u_i on T,
//
//	∫_T u_i u_j = |T| c_iᵀ G^p c_j,
//	∫_T ∇u_i·∇u_j = p² |T| Σ_(k,l=1..3) g_kl (D_k c_i)ᵀ G^(p−1) (D_l c_j),
//	∫_T (V + γ) u_i u_j = |T| c_iᵀ W c_j + ∫_T (V − P − r_mid) u_i u_j,
//
// (the gradient identity: ∇u = p Σ_β Σ_(k=1..3) (u_(β+e_k) − u_(β+e_0))
// ∇λ_k B^(p−1)_β, from ∂B^p_α/∂λ_k and Σ_k ∇λ_k = 0; g_kl = ∇λ_k·∇λ_l),
// W the weighted Gram of P + γ + r_mid (V ∈ P + R on T, R ⊆ [r_mid ±
// r_rad]); the last integral lies in ±r_rad ‖u_i‖_T ‖u_j‖_T
// (Cauchy–Schwarz; package doc, Remainders). On a Robin face F,
// α ∫_F u_i u_j = α |F| d_iᵀ G_F d_j with d_i the triangle Bernstein
// coefficients on F and G_F the exact triangle Gram matrix. It returns an
// error if a model of V is not bounded.
func (s *Lagrange) RitzMatrices(vecs [][]float64, v *Potential, gamma interval.I) (a0, a1 *enclose.Sym, err error) {
	s.checkPotential(v)
	if len(vecs) == 0 {
		panic("tet: no vectors")
	}
	for _, x := range vecs {
		if len(x) != s.n {
			panic("tet: coefficient vector length mismatch")
		}
	}
	nv := len(vecs)
	// The tetrahedra are summed in fixed blocks of ritzBlock (each block
	// in order, then the blocks in order), so the result does not depend
	// on how many goroutines share the blocks.
	nt := len(s.mesh.tets)
	blocks := (nt + ritzBlock - 1) / ritzBlock
	accA, accB := make([]*ritz.Accumulator, blocks), make([]*ritz.Accumulator, blocks)
	errs := make([]error, blocks)
	var next atomic.Int64
	var wg sync.WaitGroup
	for range min(runtime.GOMAXPROCS(0), blocks) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			w := newRitzWork(s.p, nv)
			for {
				bl := int(next.Add(1)) - 1
				if bl >= blocks {
					return
				}
				accA[bl], accB[bl] = ritz.NewAccumulator(nv), ritz.NewAccumulator(nv)
				for t := bl * ritzBlock; t < min(nt, (bl+1)*ritzBlock); t++ {
					if errs[bl] = s.ritzTet(w, vecs, v, gamma, t, accA[bl], accB[bl]); errs[bl] != nil {
						break
					}
				}
			}
		}()
	}
	wg.Wait()
	a, b := ritz.NewAccumulator(nv), ritz.NewAccumulator(nv)
	for bl := range blocks {
		if errs[bl] != nil {
			return nil, nil, errs[bl]
		}
		sa, sb := accA[bl].Sym(), accB[bl].Sym()
		for i := 0; i < nv; i++ {
			for j := 0; j <= i; j++ {
				a.Add(i, j, sa.At(i, j))
				b.Add(i, j, sb.At(i, j))
			}
		}
	}
	s.faceTerms(a, vecs)
	return a.Sym(), b.Sym(), nil
}

// ritzBlock is the number of tetrahedra per block of RitzMatrices.
const ritzBlock = 32

// ritzTet adds the contributions of tetrahedron t to a and b (see
// RitzMatrices), with w as workspace.
func (s *Lagrange) ritzTet(w *ritzWork, vecs [][]float64, v *Potential, gamma interval.I, t int, a, b *ritz.Accumulator) error {
	if !w.load(s, vecs, t) {
		return nil
	}
	nv := len(vecs)
	np := dim3(s.p)
	pp := float64(s.p * s.p)
	g := s.mesh.Geom(t)
	bern, rem := v.Model(t)
	if !rem.IsBounded() || !hull(bern).IsBounded() {
		return errUnboundedModel
	}
	// A constant polynomial part P = w_0 (every coefficient the same
	// exact float w_0, so P = w_0 by the partition of unity) gives
	// W = (w_0 + γ + r_mid) G^p: the weighted Gram matrix is not needed.
	// (Equal non-point enclosures would not do: the exact coefficients
	// inside them may differ from each other.)
	constant := bern[0].Lo == bern[0].Hi
	for _, c := range bern[1:] {
		constant = constant && c == bern[0]
	}
	shift := gamma.AddF(rem.Mid())
	if !constant {
		bernstein.WeightedGram(w.wg, tripleTable(4, v.q, s.p, s.p).IV, bern, shift, np)
	}
	w.derived(s, gradGram(g.Grad), !constant)
	rrad := rem.Rad()
	for i := 0; i < nv; i++ {
		for j := 0; j <= i; j++ {
			mass := bernstein.DotF(w.cf[j], w.gu[i])
			st := bernstein.DotI(w.d[j][0], w.h[i][0]).Add(bernstein.DotI(w.d[j][1], w.h[i][1])).Add(bernstein.DotI(w.d[j][2], w.h[i][2])).MulF(pp)
			var pot interval.I
			if constant {
				pot = bern[0].Add(shift).Mul(mass)
			} else {
				pot = bernstein.DotF(w.cf[j], w.wu[i])
			}
			b.Add(i, j, g.Volume.Mul(mass))
			e := st.Add(pot)
			if r := bernstein.RemainderBound(rrad, w.mii[i].Hi, w.mii[j].Hi); r != 0 {
				e = e.Add(interval.I{Lo: -r, Hi: r})
			}
			a.Add(i, j, g.Volume.Mul(e))
		}
	}
	return nil
}

// ritzWork holds, for one tetrahedron, the data of nv functions of degree
// p: local coefficients cf (exact floats), gu = G^p cf, wu = W cf, mii ⊇
// ∫_T u_i²/|T|, the differences d[i][k] = D_k cf, and
// h[i][k] = Σ_l g_kl G^(p−1) D_l cf.
type ritzWork struct {
	cf           [][]float64
	gu, wu       [][]interval.I
	d, h         [][3][]interval.I
	mii          []interval.I
	wg, tmp      []interval.I
	gramP, gramQ []interval.I
}

func newRitzWork(p, nv int) *ritzWork {
	np, nq := dim3(p), dim3(p-1)
	w := &ritzWork{mii: make([]interval.I, nv), wg: make([]interval.I, np*np), tmp: make([]interval.I, nq),
		gramP: tripleTable(4, 0, p, p).IV, gramQ: tripleTable(4, 0, p-1, p-1).IV}
	w.cf = make([][]float64, nv)
	w.gu, w.wu = make([][]interval.I, nv), make([][]interval.I, nv)
	w.d, w.h = make([][3][]interval.I, nv), make([][3][]interval.I, nv)
	for i := 0; i < nv; i++ {
		w.cf[i] = make([]float64, np)
		w.gu[i], w.wu[i] = make([]interval.I, np), make([]interval.I, np)
		for k := 0; k < 3; k++ {
			w.d[i][k], w.h[i][k] = make([]interval.I, nq), make([]interval.I, nq)
		}
	}
	return w
}

// load gathers the local coefficients of every vector on tetrahedron t and
// computes gu and mii; it reports whether any coefficient is nonzero.
func (w *ritzWork) load(s *Lagrange, vecs [][]float64, t int) bool {
	nz := false
	for i, x := range vecs {
		s.Local(w.cf[i], x, t)
		for _, c := range w.cf[i] {
			nz = nz || c != 0
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

// derived computes d, h and, if weighted, wu (after wg is set).
func (w *ritzWork) derived(s *Lagrange, g [3][3]interval.I, weighted bool) {
	for i := range w.cf {
		if weighted {
			bernstein.ApplyF(w.wu[i], w.wg, w.cf[i])
		}
		for k := 0; k < 3; k++ {
			diffF(w.d[i][k], s.pairs[k], w.cf[i])
			for b := range w.h[i][k] {
				w.h[i][k][b] = interval.I{}
			}
		}
		for l := 0; l < 3; l++ {
			bernstein.ApplyI(w.tmp, w.gramQ, w.d[i][l])
			for k := 0; k < 3; k++ {
				for b, x := range w.tmp {
					w.h[i][k][b] = w.h[i][k][b].Add(g[k][l].Mul(x))
				}
			}
		}
	}
}

// diffPairs returns, for degree p and k = 1, 2, 3, the index pairs
// (pos(β + e_k), pos(β + e_0)) over the multi-indices β of degree p − 1.
func diffPairs(p int) [3][][2]int {
	ip, iq := multiIndex(4, p), multiIndex(4, p-1)
	var out [3][][2]int
	for k := 1; k <= 3; k++ {
		var ek [4]int
		ek[k] = 1
		for _, b := range iq.alpha {
			out[k-1] = append(out[k-1], [2]int{ip.pos[add4(b, ek)], ip.pos[add4(b, [4]int{1, 0, 0, 0})]})
		}
	}
	return out
}

// gradGram returns g_kl ⊇ ∇λ_k·∇λ_l for k, l ∈ {1, 2, 3} (index k−1, l−1).
func gradGram(grad [4][3]interval.I) [3][3]interval.I {
	var g [3][3]interval.I
	for k := 0; k < 3; k++ {
		for l := 0; l <= k; l++ {
			g[k][l] = dot(grad[k+1], grad[l+1])
			g[l][k] = g[k][l]
		}
		if g[k][k].Lo < 0 {
			g[k][k].Lo = 0
		}
	}
	return g
}

// diffF sets dst[β] ⊇ c[pair[β][0]] − c[pair[β][1]] for exact floats c.
func diffF(dst []interval.I, pairs [][2]int, c []float64) {
	for b, pr := range pairs {
		dst[b] = interval.Point(c[pr[0]]).Sub(interval.Point(c[pr[1]]))
	}
}

// faceTerms adds α ∫_F u_i u_j = α |F| d_iᵀ G_F d_j for every face with a
// term to a (d_i the triangle Bernstein coefficients of u_i on F, exact
// floats; G_F the exact triangle Gram matrix).
func (s *Lagrange) faceTerms(a *ritz.Accumulator, vecs [][]float64) {
	nv := len(vecs)
	gf := tripleTable(3, 0, s.p, s.p).IV
	nf := dim2(s.p)
	di := make([][]float64, nv)
	for i := range di {
		di[i] = make([]float64, nf)
	}
	gd := make([]interval.I, nf)
	for _, rf := range s.robin {
		for i := 0; i < nv; i++ {
			for k, g := range rf.dofs {
				di[i][k] = 0
				if g >= 0 {
					di[i][k] = vecs[i][g]
				}
			}
		}
		scale := rf.alpha.Mul(rf.area)
		for i := 0; i < nv; i++ {
			bernstein.ApplyF(gd, gf, di[i])
			for j := 0; j <= i; j++ {
				a.Add(i, j, scale.Mul(bernstein.DotF(di[j], gd)))
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
	np := dim3(s.p)
	kb, mb := sparse.NewBuilder(s.n), sparse.NewBuilder(s.n)
	refK := s.refStiffness()
	gp := tripleTable(4, 0, s.p, s.p).FL
	tr := tripleTable(4, v.q, s.p, s.p).FL
	nn := np * np
	wloc := make([]float64, nn)
	pp := float64(s.p * s.p)
	for t := range s.mesh.tets {
		g := s.mesh.Geom(t)
		vol := g.Volume.Mid()
		gg := gradGram(g.Grad)
		var gm [3][3]float64
		for a := range gm {
			for b := range gm[a] {
				gm[a][b] = gg[a][b].Mid()
			}
		}
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
				for kk := 0; kk < 3; kk++ {
					for l := 0; l < 3; l++ {
						st += gm[kk][l] * refK[kk][l][a*np+b]
					}
				}
				kb.Add(d[a], d[b], vol*(pp*st+wloc[a*np+b]))
				mb.Add(d[a], d[b], vol*gp[a*np+b])
			}
		}
	}
	gf := tripleTable(3, 0, s.p, s.p).FL
	nf := dim2(s.p)
	for _, rf := range s.robin {
		sc := rf.alpha.Mid() * rf.area.Mid()
		for a := 0; a < nf; a++ {
			if rf.dofs[a] < 0 {
				continue
			}
			for b := 0; b <= a; b++ {
				if rf.dofs[b] < 0 {
					continue
				}
				kb.Add(rf.dofs[a], rf.dofs[b], sc*gf[a*nf+b])
			}
		}
	}
	return kb.Build(), mb.Build()
}

// refStiffness returns R^(kl)[a·N_p + b] = (D_k e_a)ᵀ G^(p−1) (D_l e_b) in
// floating point (a choice: used by AssembleApprox only).
func (s *Lagrange) refStiffness() [3][3][]float64 {
	np, nq := dim3(s.p), dim3(s.p-1)
	gq := tripleTable(4, 0, s.p-1, s.p-1).FL
	var out [3][3][]float64
	for k := 0; k < 3; k++ {
		for l := 0; l < 3; l++ {
			r := make([]float64, np*np)
			// (D_k e_a)_x = [pair_k[x][0] = a] − [pair_k[x][1] = a]
			for x, px := range s.pairs[k] {
				for y, py := range s.pairs[l] {
					g := gq[x*nq+y]
					r[px[0]*np+py[0]] += g
					r[px[0]*np+py[1]] -= g
					r[px[1]*np+py[0]] -= g
					r[px[1]*np+py[1]] += g
				}
			}
			out[k][l] = r
		}
	}
	return out
}
