package tri

import (
	"errors"
	"math"

	"gapcert/enclose"
	"gapcert/fem/boundary"
	"gapcert/fem/internal/bernstein"
	"gapcert/fem/internal/ritz"
	"gapcert/fem/mesh"
	"gapcert/interval"
)

// Flux is the Raviart–Thomas space RT_k ⊂ H(div; Ω) on a triangle mesh,
// the space of fluxes σ of the Lehmann–Goerisch bounds (package temple;
// package doc, Lehmann–Goerisch fluxes).
//
// Piola transform. On a counterclockwise triangle T with vertices v_0, v_1,
// v_2, x = v_0 + Jξ, J = [v_1 − v_0, v_2 − v_0], det J = 2|T| > 0, a
// member is σ(x) = J σ̂(ξ)/det J with σ̂ ∈ RT_k(T̂) (raviart.go). Then
// (Brezzi–Fortin 1991, §III.1; elementary): div σ = (div̂ σ̂)/det J, and
// for an edge traversed from A to B with outward normal times length
// ν = R(B − A), R(a, b) = (b, −a), the flux density satisfies
// σ(x(t))·ν = σ̂(ξ(t))·ν̂ exactly, because R J = det J · J^(−T) R for 2×2
// matrices. So the flux density of σ along a mesh edge is the reference
// one, fixed by the edge DOFs of raviart.go.
//
// Conformity. The global DOFs of an edge (a, b), a < b, are the k + 1
// Bernstein coefficients of the flux density σ·R(P_b − P_a) in the
// parameter t from P_a to P_b. A triangle that traverses the edge from a to
// b uses them as they are; one that traverses it from b to a has the
// opposite normal and the reversed parameter, so its local DOF m is minus
// the global DOF k − m. Both triangles then see the same normal flux
// σ·n on the edge, the normal component is continuous, and the piecewise
// field lies in H(div; Ω) (Brezzi–Fortin, Prop. III.1.2). This holds for
// the exact mesh inside the node enclosures and any float coefficients.
//
// Boundary. On sides where the flux must vanish (Neumann, or Robin with α
// not verified > 0) the edge DOFs are removed (set to exactly 0), which
// makes σ·n = 0 there. On Dirichlet sides they are free, and on Robin sides
// with α > 0 they are free and enter the norm with the weight 1/α.
type Flux struct {
	mesh  *mesh.Mesh
	k     int
	ref   *rtRef
	n     int
	nEdge int         // kept edge DOFs, numbered 0 … nEdge−1 before the interior ones
	dofs  [][]int     // per triangle, global index of each local DOF (−1: removed)
	sign  [][]float64 // per triangle, ±1 for each local DOF
	robin []sideEdge  // boundary edges with α > 0
}

// NewFlux returns RT_k on m with the side conditions bc (as for
// NewLagrange). It panics if k < 0 or bc does not fit the mesh.
func NewFlux(m *mesh.Mesh, k int, bc []boundary.Condition) *Flux {
	checkBC(m, bc)
	ref := rtReference(k)
	edges, triEdges := m.Edges()
	ne, ni := k+1, k*(k+1)
	raw := len(edges)*ne + len(m.Tris)*ni
	removed := make([]bool, raw)
	edgeOf := make(map[[2]int]int, len(edges))
	for e, ab := range edges {
		edgeOf[ab] = e
	}
	for _, be := range m.Bnd {
		if bc[be.Side].FluxFree() {
			continue
		}
		e := edgeOf[[2]int{min(be.A, be.B), max(be.A, be.B)}]
		for j := 0; j < ne; j++ {
			removed[e*ne+j] = true
		}
	}
	renum := make([]int, raw)
	n := 0
	nEdge := 0
	for r := range renum {
		renum[r] = -1
		if !removed[r] {
			renum[r] = n
			n++
		}
		if r == len(edges)*ne-1 {
			nEdge = n
		}
	}
	f := &Flux{mesh: m, k: k, ref: ref, n: n, nEdge: nEdge, dofs: make([][]int, len(m.Tris)), sign: make([][]float64, len(m.Tris))}
	for t, tri := range m.Tris {
		d, s := make([]int, ref.ndof), make([]float64, ref.ndof)
		for i := 0; i < 3; i++ {
			a, b := tri[(i+1)%3], tri[(i+2)%3]
			e := triEdges[t][i]
			if edges[e] != [2]int{min(a, b), max(a, b)} {
				panic("tri: mesh edge table does not match its triangles")
			}
			for j := 0; j < ne; j++ {
				l := i*ne + j
				if a < b {
					d[l], s[l] = renum[e*ne+j], 1
				} else {
					d[l], s[l] = renum[e*ne+k-j], -1
				}
			}
		}
		for j := 0; j < ni; j++ {
			d[3*ne+j], s[3*ne+j] = renum[len(edges)*ne+t*ni+j], 1
		}
		f.dofs[t], f.sign[t] = d, s
	}
	f.robin = termEdges(m, bc, boundary.Condition.AlphaPositive)
	return f
}

// N returns the dimension.
func (f *Flux) N() int { return f.n }

// Degree returns k.
func (f *Flux) Degree() int { return f.k }

// Mesh returns the mesh.
func (f *Flux) Mesh() *mesh.Mesh { return f.mesh }

// local sets x[l] = sign_l · vec[dof_l] (0 where removed), the coefficients
// of the local reference basis on triangle t, and reports whether any is
// nonzero. The values are exact (a sign change).
func (f *Flux) local(x []float64, vec []float64, t int) bool {
	nz := false
	for l, g := range f.dofs[t] {
		x[l] = 0
		if g >= 0 {
			x[l] = f.sign[t][l] * vec[g]
			nz = nz || x[l] != 0
		}
	}
	return nz
}

// piolaMetric returns K ⊇ JᵀJ for J = [v_1 − v_0, v_2 − v_0] = [e_2, −e_1]
// (mesh.Geom edge vectors): K_00 = e_2·e_2, K_01 = −e_2·e_1, K_11 = e_1·e_1.
func piolaMetric(g mesh.Geom) [2][2]interval.I {
	e1, e2 := g.Edge[1], g.Edge[2]
	k00 := e2[0].Sqr().Add(e2[1].Sqr())
	k11 := e1[0].Sqr().Add(e1[1].Sqr())
	k01 := e2[0].Mul(e1[0]).Add(e2[1].Mul(e1[1])).Neg()
	return [2][2]interval.I{{k00, k01}, {k01, k11}}
}

// ErrWeightMismatch is returned by LGMatrix when the weight was not made
// by v.InverseShifted(gamma, ·): only then is it known to enclose 1/(V + γ).
var ErrWeightMismatch = errors.New("tri: the weight must be v.InverseShifted(gamma) for the same v and gamma")

// LGMatrix returns the interval matrix A2 of the Lehmann–Goerisch method
// (package doc, Lehmann–Goerisch fluxes) for the trial functions ũ_i
// (coefficients trial[i] in s)
// and the fluxes σ_i (coefficients flux[i] in f):
//
//	a2_ij ⊇ (σ_i, σ_j) + ((ũ_i + div σ_i)/c, ũ_j + div σ_j) + Σ_(Robin, α>0) ∫_e (σ_i·n)(σ_j·n)/α,
//
// c = V + γ, for every exact input inside the enclosures. w must be
// v.InverseShifted(gamma, ·) (else ErrWeightMismatch). On a triangle T,
// with ĉ_i the Bernstein coefficients (degree k + 1) of σ̂_i and K ⊇ JᵀJ,
//
//	(σ_i, σ_j)_T = (1/(4|T|)) Σ_(r,s) K_rs ĉ_(i,r)ᵀ G ĉ_(j,s)          (∫_T̂ = ½ G, dx = 2|T| dξ),
//	ũ_i + div σ_i = ũ_i + (div̂ σ̂_i)/(2|T|) = f_i, in degree d = max(p, k) by exact elevation,
//	∫_T f_i f_j/c = |T| f_iᵀ W f_j + ∫_T (R − r_mid) f_i f_j,
//
// W the weighted Gram of the Bernstein part Q + r_mid of the model
// 1/c ∈ Q + R; the last term lies in ±r_rad ‖f_i‖_T ‖f_j‖_T
// (Cauchy–Schwarz, package doc, Remainders). On a Robin edge e the flux
// density g_i(t)
// = σ_i·ν has the local edge DOFs as Bernstein coefficients, σ·n = g/|e|
// and ds = |e| dt, so the edge term is (1/(α|e|)) g_iᵀ G_e g_j.
func (f *Flux) LGMatrix(s *Lagrange, trial [][]float64, flux [][]float64, v, w *Potential, gamma interval.I) (*enclose.Sym, error) {
	if f.mesh != s.mesh {
		panic("tri: flux and trial spaces on different meshes")
	}
	if len(trial) != len(flux) || len(trial) == 0 {
		panic("tri: one flux per trial function is needed")
	}
	for i := range flux {
		if len(flux[i]) != f.n || len(trial[i]) != s.n {
			panic("tri: coefficient vector length mismatch")
		}
	}
	if w == nil || v == nil || w.inverseOf != v || w.shift != gamma || w.mesh != f.mesh {
		return nil, ErrWeightMismatch
	}
	ref := f.ref
	nv := len(trial)
	p, k, nb := s.p, f.k, ref.n
	d := max(p, k)
	np, nn, nk, nd := dim(p), dim(nb), dim(k), dim(d)
	gn := tripleTable(0, nb, nb).IV
	gd := tripleTable(0, d, d).IV
	elevP, elevK := elevationTable(p, d).IV, elevationTable(k, d).IV
	acc := ritz.NewAccumulator(nv)
	x := make([][]float64, nv)
	uc := make([][]float64, nv)
	type vecs struct{ c, gc [2][]interval.I }
	sv := make([]vecs, nv)
	dv := make([][]interval.I, nv)
	fi, wfi := make([][]interval.I, nv), make([][]interval.I, nv)
	ffi := make([]interval.I, nv)
	for i := 0; i < nv; i++ {
		x[i], uc[i] = make([]float64, ref.ndof), make([]float64, np)
		for c := 0; c < 2; c++ {
			sv[i].c[c], sv[i].gc[c] = make([]interval.I, nn), make([]interval.I, nn)
		}
		dv[i] = make([]interval.I, nk)
		fi[i], wfi[i] = make([]interval.I, nd), make([]interval.I, nd)
	}
	tmp, gtmp := make([]interval.I, nd), make([]interval.I, nd)
	wg := make([]interval.I, nd*nd)
	for t := range f.mesh.Tris {
		g := f.mesh.Geom(t)
		kk := piolaMetric(g)
		quarter := g.Area.MulF(4).Recip() // 1/(4|T|)
		half := g.Area.MulF(2).Recip()    // 1/(2|T|) = 1/det J
		for i := 0; i < nv; i++ {
			f.local(x[i], flux[i], t)
			for l, gl := range s.dofs[t] {
				uc[i][l] = 0
				if gl >= 0 {
					uc[i][l] = trial[i][gl]
				}
			}
			for c := 0; c < 2; c++ {
				exactCombination(sv[i].c[c], ref.compT[c], x[i])
				bernstein.ApplyI(sv[i].gc[c], gn, sv[i].c[c])
			}
			exactCombination(dv[i], ref.divT, x[i])
			for b := range dv[i] {
				dv[i][b] = dv[i][b].Mul(half)
			}
			if d == p {
				for b, u := range uc[i] {
					fi[i][b] = interval.Point(u)
				}
			} else {
				bernstein.ApplyF(fi[i], elevP, uc[i])
			}
			if d == k {
				copy(tmp, dv[i])
			} else {
				bernstein.ApplyI(tmp, elevK, dv[i])
			}
			for b := range fi[i] {
				fi[i][b] = fi[i][b].Add(tmp[b])
			}
			bernstein.ApplyI(gtmp, gd, fi[i])
			ffi[i] = bernstein.DotI(fi[i], gtmp)
		}
		bern, rem := w.Model(t)
		if !rem.IsBounded() || !hull(bern).IsBounded() {
			return nil, errUnbounded
		}
		weightedGramOf(wg, w.q, d, bern, interval.Point(rem.Mid()))
		for i := 0; i < nv; i++ {
			bernstein.ApplyI(wfi[i], wg, fi[i])
		}
		rrad := rem.Rad()
		for i := 0; i < nv; i++ {
			for j := 0; j <= i; j++ {
				m := kk[0][0].Mul(bernstein.DotI(sv[j].c[0], sv[i].gc[0])).
					Add(kk[0][1].Mul(bernstein.DotI(sv[j].c[0], sv[i].gc[1]).Add(bernstein.DotI(sv[j].c[1], sv[i].gc[0])))).
					Add(kk[1][1].Mul(bernstein.DotI(sv[j].c[1], sv[i].gc[1])))
				e := bernstein.DotI(fi[j], wfi[i])
				if r := bernstein.RemainderBound(rrad, ffi[i].Hi, ffi[j].Hi); r != 0 {
					e = e.Add(interval.I{Lo: -r, Hi: r})
				}
				acc.Add(i, j, quarter.Mul(m).Add(g.Area.Mul(e)))
			}
		}
	}
	f.edgeTerms(acc, flux, x)
	return acc.Sym(), nil
}

// weightedGramOf sets dst ⊇ (∫_T (P + s) B^d_a B^d_b / |T|)_ab for the
// model P = Σ_k p_k B^q_k with p_k ∈ bern[k]: bernstein.WeightedGram with
// the triple table of degree q, or, when every bern[k] is the same interval
// I (the model of a constant), with the table of degree 0 and I alone.
// That is sound: the triple integrals T_k = ∫ B^q_k B^d_a B^d_b / |T| are
// ≥ 0 (Bernstein polynomials are nonnegative) and sum over k to the Gram
// entry T⁰ (partition of unity), so Σ_k (p_k + s) T_k lies in (I + s)·T⁰
// whatever the p_k ∈ I; it costs 1/dim(q) of the work (on a mesh of 700
// triangles at d = 10 and q = 12, seconds).
func weightedGramOf(dst []interval.I, q, d int, bern []interval.I, s interval.I) {
	if constantModel(bern) {
		q, bern = 0, bern[:1]
	}
	bernstein.WeightedGram(dst, tripleTable(q, d, d).IV, bern, s, dim(d))
}

// constantModel reports whether every coefficient of a Bernstein model is
// the same interval.
func constantModel(bern []interval.I) bool {
	for _, b := range bern[1:] {
		if b != bern[0] {
			return false
		}
	}
	return true
}

// exactCombination sets dst[β] ⊇ Σ_l a[β·len(x) + l] x_l for exact floats
// a and x, enclosing each sum to within a few ulps of its value however
// much its terms cancel (the reference RT coefficients are integers of up
// to 23 bits with alternating signs, so plain interval sums would lose
// several digits). Each product is split error-free, a·x = p + e with
// e = fma(a, x, −p) (exact unless p is subnormal-range or not finite;
// Ogita–Rump–Oishi, Accurate sum and dot product, SIAM J. Sci. Comput. 26
// (2005), TwoProduct), and the p are summed by TwoSum (Knuth, TAOCP vol. 2,
// §4.2.2: s + p = t + q exactly for finite floats without overflow). The
// exact sum is then t plus the exact sum of all e and q, which an interval
// sum encloses; each e and q is at most an ulp of a product or a partial
// sum, so the width is about n²·2⁻¹⁰⁰ times the largest term (a few ulps
// of the result unless the terms cancel by many orders of magnitude).
// Terms whose product is tiny or not finite go into the interval sum
// directly (outward rounded), and a partial sum that overflows falls back
// to the plain interval sum; both are sound. Every product and sum is
// written float64(·) so that the compiler cannot fuse them (a fused
// multiply-add would break TwoSum).
func exactCombination(dst []interval.I, a, x []float64) {
	nx := len(x)
	for b := range dst {
		row := a[b*nx : (b+1)*nx]
		s := 0.0
		var rest interval.I
		overflow := false
		for l, xl := range x {
			al := row[l]
			if al == 0 || xl == 0 {
				continue
			}
			p := float64(al * xl) // no fused multiply-add: p must be the rounded product
			if !(math.Abs(p) >= 0x1p-900) || math.IsInf(p, 0) {
				rest = rest.Add(interval.Point(al).MulF(xl))
				continue
			}
			e := math.FMA(al, xl, -p)
			t := float64(s + p)
			if math.IsInf(t, 0) {
				overflow = true
				break
			}
			bb := float64(t - s)
			q := float64(float64(s-float64(t-bb)) + float64(p-bb))
			s = t
			rest = rest.Add(interval.I{Lo: e, Hi: e}).Add(interval.I{Lo: q, Hi: q})
		}
		if overflow {
			bernstein.ApplyF(dst[b:b+1], intervalRow(row), x)
			continue
		}
		dst[b] = rest.AddF(s)
	}
}

// intervalRow returns the floats of row as point intervals.
func intervalRow(row []float64) []interval.I {
	out := make([]interval.I, len(row))
	for i, v := range row {
		out[i] = interval.Point(v)
	}
	return out
}

// congruence returns C[l·nd + m] = Σ_(β,γ) A[β·nd + l] G[β·nb + γ] B[γ·nd + m]
// for nd functions with nb coefficients each (floating point; a choice).
func congruence(a, b, g []float64, nd, nb int) []float64 {
	return congruenceTo(make([]float64, nd*nd), make([]float64, nb*nd), a, b, g, nd, nb)
}

// congruenceTo sets dst (nd×nd) to what congruence returns, with work
// (length ≥ nb·nd) as scratch, and returns dst.
func congruenceTo(dst, work, a, b, g []float64, nd, nb int) []float64 {
	gb := work[:nb*nd]
	clear(gb)
	for be := 0; be < nb; be++ {
		for ga := 0; ga < nb; ga++ {
			gv := g[be*nb+ga]
			if gv == 0 {
				continue
			}
			for m := 0; m < nd; m++ {
				gb[be*nd+m] += gv * b[ga*nd+m]
			}
		}
	}
	out := dst[:nd*nd]
	clear(out)
	for be := 0; be < nb; be++ {
		for l := 0; l < nd; l++ {
			al := a[be*nd+l]
			if al == 0 {
				continue
			}
			for m := 0; m < nd; m++ {
				out[l*nd+m] += al * gb[be*nd+m]
			}
		}
	}
	return out
}

// weightedGramF sets dst[a·dim(n) + b] ≈ ∫_T (Q + s) B^m_a B^n_b / |T|
// with the midpoints of the Bernstein coefficients of Q (degree q), each
// raised to 0 if negative (a poor model of a positive weight may have
// negative midpoints; nonnegative coefficients keep the weight ≥ 0 and the
// flux system positive definite): floating point, a choice.
//
// When every w[k] is the same interval (the model of a constant) the
// table of degree 0 serves with that one coefficient (partition of unity;
// the same weight, 1/dim(q) of the work).
func weightedGramF(dst []float64, w []interval.I, q int, s float64, m, n int) {
	if constantModel(w) {
		q, w = 0, w[:1]
	}
	t := tripleTable(q, m, n).FL
	sz := dim(m) * dim(n)
	for ab := range dst[:sz] {
		dst[ab] = 0
	}
	for kk := range w {
		wk := math.Max(w[kk].Mid()+s, 0)
		blk := t[kk*sz : (kk+1)*sz]
		for ab := range dst[:sz] {
			dst[ab] += wk * blk[ab]
		}
	}
}

// Indicators returns, for each triangle T, η_T² = Σ_i ‖σ_i − ∇ũ_i/Λ_i‖²_T
// for the trial functions ũ_i (coefficients trial[i] in s), their fluxes
// σ_i and approximations Λ_i of the shifted eigenvalues: where the flux
// differs from the gradient of the exact eigenfunction over Λ (the optimal
// flux of an exact eigenpair, package doc, Lehmann–Goerisch fluxes), the
// Lehmann–Goerisch bound
// loses. Floating point, a choice (for marking triangles to refine). With
// J the Piola matrix, K = JᵀJ and ∇_ξ the reference gradient,
//
//	‖σ‖²_T = (1/(4|T|)) Σ K_rs ĉ_rᵀ G ĉ_s,  (σ, ∇ũ)_T = ½ Σ_c ĉ_cᵀ G' ∂_c ũ,
//	‖∇ũ‖²_T = |T| Σ (K⁻¹)_rs ∂_r ũᵀ G'' ∂_s ũ
//
// (∫_T̂ = ½ × the tables normalised by |T|, dx = 2|T| dξ).
func (f *Flux) Indicators(s *Lagrange, trial, flux [][]float64, lambda []float64) []float64 {
	if f.mesh != s.mesh || len(trial) != len(flux) || len(lambda) != len(trial) {
		panic("tri: indicator inputs do not match")
	}
	ref := f.ref
	p, nb := s.p, ref.n
	nd, np, nn, nq := ref.ndof, dim(p), dim(nb), dim(p-1)
	gn := tripleTable(0, nb, nb).FL
	gnq := tripleTable(0, nb, p-1).FL
	gq := tripleTable(0, p-1, p-1).FL
	x := make([]float64, nd)
	uc := make([]float64, np)
	var c [2][]float64
	var du [2][]float64
	for r := 0; r < 2; r++ {
		c[r], du[r] = make([]float64, nn), make([]float64, nq)
	}
	quad := func(a []float64, g []float64, b []float64) float64 {
		acc := 0.0
		for i, ai := range a {
			if ai == 0 {
				continue
			}
			row := g[i*len(b) : (i+1)*len(b)]
			for j, bj := range b {
				acc += ai * row[j] * bj
			}
		}
		return acc
	}
	out := make([]float64, len(f.mesh.Tris))
	for t := range f.mesh.Tris {
		g := f.mesh.Geom(t)
		kk := piolaMetric(g)
		k00, k01, k11 := kk[0][0].Mid(), kk[0][1].Mid(), kk[1][1].Mid()
		det := k00*k11 - k01*k01
		kinv := [2][2]float64{{k11 / det, -k01 / det}, {-k01 / det, k00 / det}}
		area := g.Area.Mid()
		for i := range trial {
			f.local(x, flux[i], t)
			for r := 0; r < 2; r++ {
				for b := range c[r] {
					acc := 0.0
					row := ref.compT[r][b*nd : (b+1)*nd]
					for l, xl := range x {
						acc += row[l] * xl
					}
					c[r][b] = acc
				}
			}
			for a, gl := range s.dofs[t] {
				uc[a] = 0
				if gl >= 0 {
					uc[a] = trial[i][gl]
				}
			}
			for r := 0; r < 2; r++ {
				for b, pr := range s.pairs[r] {
					du[r][b] = float64(p) * (uc[pr[0]] - uc[pr[1]])
				}
			}
			ss, sg, gg := 0.0, 0.0, 0.0
			for r := 0; r < 2; r++ {
				sg += quad(c[r], gnq, du[r])
				for q := 0; q < 2; q++ {
					ss += kk[r][q].Mid() * quad(c[r], gn, c[q])
					gg += kinv[r][q] * quad(du[r], gq, du[q])
				}
			}
			ss /= 4 * area
			sg /= 2
			gg *= area
			li := lambda[i]
			out[t] += math.Max(ss-2*sg/li+gg/(li*li), 0)
		}
	}
	return out
}
