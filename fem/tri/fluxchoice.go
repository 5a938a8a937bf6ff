package tri

import (
	"fmt"

	"gapcert/enclose/sparse"

	"gonum.org/v1/gonum/mat"
)

// MinimizeApprox returns, for each trial function ũ (coefficients in s),
// the flux σ of this space that minimises
//
//	‖w‖²_X = ‖σ‖² + ‖(ũ + div σ)/√c‖² + Σ_Robin ∫ (σ·n)²/α,
//
// with 1/c taken from the midpoints of the models of w, in floating
// point; a choice: any σ is admissible in LGMatrix.
//
// Why not the normal equations of this space. On a triangle of diameter h
// the divergence term is about 1/h² times the mass term (Piola:
// div σ = div̂ σ̂/det J), and it vanishes on the divergence-free fields.
// A matrix M + D with ‖D‖ ≈ ‖M‖/h² formed in float64 keeps M on the
// kernel of D only to an absolute error of about ε‖D‖: on a mesh graded
// 16 levels toward a corner (h ≈ 1e-5) that is all of M's information,
// and the choice failed (interior block singular) or lost the
// Lehmann–Goerisch bound. The same holds for the net flux of each
// triangle in any system of the edge DOFs alone.
//
// Hybridised solve (the hybridisation of mixed methods: D. N. Arnold and
// F. Brezzi, RAIRO Modél. Math. Anal. Numér. 19 (1985) 7–32; Brezzi and
// Fortin, Mixed and Hybrid Finite Element Methods, 1991). The normal
// continuity of σ and the zero normal flux on flux-free sides are dropped
// from the space and imposed by multipliers μ (one per edge DOF there):
//
//	minimise Σ_T (½ x_Tᵀ A_T x_T − r_Tᵀ x_T)  subject to  Σ_T E_T x_T = 0,
//
// with x_T the local coefficients of σ on T (outward orientation), A_T and
// r_T the local normal equations, and E_T x_T the outward flux DOFs of T on
// the constrained edges (two triangles' outward fluxes sum to zero on an
// interior edge). Then x_T = A_T⁻¹(r_T − E_Tᵀμ) and
//
//	(Σ_T E_T A_T⁻¹ E_Tᵀ) μ = Σ_T E_T A_T⁻¹ r_T,
//
// a sparse symmetric positive definite system on the edges. On each
// triangle A_T is written in the divergence-adapted basis of rtSplit,
// where the divergence term is a block on the divergence coordinates
// only, and A_T⁻¹ is applied through its Cholesky factor, which keeps the
// mass term on the divergence-free fields to its own relative accuracy
// (the large block is eliminated first and its Schur complement is a
// small correction). The edge matrix is then of the size of a stiffness
// matrix on every triangle (scale invariant), not 1/h².
//
// The flux in the global basis takes, on an interior edge, the mean of the
// two triangles' coefficients (they agree up to the rounding of the
// solve), and on every other edge and inside the triangles the local
// ones.
func (f *Flux) MinimizeApprox(s *Lagrange, trial [][]float64, w *Potential) ([][]float64, error) {
	if s.mesh != f.mesh || w.mesh != f.mesh {
		panic("tri: spaces and weight on different meshes")
	}
	h := newHybridFlux(f, s, w, len(trial))
	mult, err := h.assemble(trial)
	if err != nil {
		return nil, err
	}
	for step := 0; step < consistencySteps; step++ {
		if err := h.correct(trial, mult); err != nil {
			return nil, err
		}
	}
	return h.recover(trial, mult)
}

// consistencySteps is the number of corrections of the multipliers by the
// local fluxes' disagreement (see correct). Measured on the L-shape graded
// 24 levels at degree 10: the Lehmann–Goerisch deficit of λ1 is 1.4e-10
// with none and 6.4e-12 with one (Ritz error 1.9e-12); a second step
// changes nothing there.
const consistencySteps = 1

// hybridFlux holds the multiplier numbering of a flux space, the factored
// multiplier matrix, and, for one triangle at a time, the Cholesky factor
// of its local matrix in the divergence-adapted basis and the local
// right-hand sides (floating point; a choice).
type hybridFlux struct {
	f      *Flux
	s      *Lagrange
	w      *Potential
	split  *rtSplit
	mult   [][]int   // per triangle, multiplier of each local edge DOF (−1: none)
	shared [][3]bool // per triangle, whether local edge i is interior
	nMult  int       // number of multipliers
	robin  [][]int   // per triangle, indices into f.robin
	fac    *sparse.LDL

	// For the triangle of the last factor call: the local right-hand side
	// (ρ, 0) of each trial function, the weighted Grams, H = UᵀU.
	rhs      [][]float64
	wkk, wpk []float64
	uc, v, x []float64
	hm       *mat.SymDense
	chol     mat.Cholesky
	u        mat.TriDense
}

func newHybridFlux(f *Flux, s *Lagrange, w *Potential, nTrial int) *hybridFlux {
	k := f.k
	ne := 3 * (k + 1)
	nd := f.ref.ndof
	nk := dim(k)
	m := f.mesh
	edges, triEdges := m.Edges()
	count := make([]int, len(edges))
	for _, te := range triEdges {
		for _, e := range te {
			count[e]++
		}
	}
	h := &hybridFlux{f: f, s: s, w: w, split: rtDivSplit(k), mult: make([][]int, len(m.Tris)),
		shared: make([][3]bool, len(m.Tris)), robin: make([][]int, len(m.Tris)), rhs: make([][]float64, nTrial),
		wkk: make([]float64, nk*nk), wpk: make([]float64, dim(s.p)*nk), uc: make([]float64, dim(s.p)),
		v: make([]float64, nd), x: make([]float64, nd), hm: mat.NewSymDense(nd, nil)}
	for i := range h.rhs {
		h.rhs[i] = make([]float64, nd)
	}
	base := make([]int, len(edges))
	for e := range base {
		base[e] = -1
	}
	for t, tri := range m.Tris {
		mu := make([]int, ne)
		for i := 0; i < 3; i++ {
			e := triEdges[t][i]
			// A multiplier ties the two triangles of an interior edge, or
			// holds the flux of a flux-free boundary edge at zero.
			constrained := count[e] == 2 || f.dofs[t][i*(k+1)] < 0
			h.shared[t][i] = count[e] == 2
			if constrained && base[e] < 0 {
				base[e] = h.nMult
				h.nMult += k + 1
			}
			a, bb := tri[(i+1)%3], tri[(i+2)%3]
			for jl := 0; jl <= k; jl++ {
				mu[i*(k+1)+jl] = -1
				if !constrained {
					continue
				}
				j := jl
				if a > bb {
					j = k - jl
				}
				mu[i*(k+1)+jl] = base[e] + j
			}
		}
		h.mult[t] = mu
	}
	for ri, rb := range f.robin {
		h.robin[rb.t] = append(h.robin[rb.t], ri)
	}
	return h
}

// assemble builds and factors the multiplier matrix
// S = Σ_T E_T A_T⁻¹ E_Tᵀ (on each triangle V_e H⁻¹ V_eᵀ = XᵀX with
// X = U⁻ᵀ V_eᵀ, V_e the edge rows of B) and returns the multipliers of
// S μ = Σ_T E_T A_T⁻¹ r_T for each trial function.
func (h *hybridFlux) assemble(trial [][]float64) ([][]float64, error) {
	f := h.f
	ne, nd := 3*(f.k+1), f.ref.ndof
	mult := make([][]float64, len(trial))
	for i := range mult {
		mult[i] = make([]float64, h.nMult)
	}
	if h.nMult == 0 {
		return mult, nil
	}
	b := sparse.NewBuilder(h.nMult)
	x := make([]float64, nd*ne) // column a at x[l·ne + a]
	r := h.v
	for t := range f.mesh.Tris {
		if err := h.factor(t, trial); err != nil {
			return nil, err
		}
		mu := h.mult[t]
		for a := 0; a < ne; a++ {
			if mu[a] < 0 {
				continue
			}
			copy(r, h.split.b[a*nd:(a+1)*nd])
			h.lowerSolve(r)
			for l := 0; l < nd; l++ {
				x[l*ne+a] = r[l]
			}
		}
		for a := 0; a < ne; a++ {
			if mu[a] < 0 {
				continue
			}
			for c := 0; c <= a; c++ {
				if mu[c] < 0 {
					continue
				}
				acc := 0.0
				for l := 0; l < nd; l++ {
					acc += x[l*ne+a] * x[l*ne+c]
				}
				b.Add(mu[a], mu[c], acc)
			}
		}
		for i := range trial {
			copy(r, h.rhs[i])
			h.lowerSolve(r)
			for a := 0; a < ne; a++ {
				if mu[a] < 0 {
					continue
				}
				acc := 0.0
				for l := 0; l < nd; l++ {
					acc += x[l*ne+a] * r[l]
				}
				// mult holds the right-hand side until the solve below.
				mult[i][mu[a]] += acc
			}
		}
	}
	sys := b.Build()
	fac, ok := sparse.Factor(sys, sparse.Order(sys))
	if !ok {
		return nil, fmt.Errorf("tri: the flux multiplier system of dimension %d could not be factored", h.nMult)
	}
	h.fac = fac
	rhs := make([]float64, h.nMult)
	for i := range mult {
		copy(rhs, mult[i])
		fac.SolveTo(mult[i], rhs)
	}
	return mult, nil
}

// correct adds to the multipliers S⁻¹ Σ_T E_T x_T, x_T = A_T⁻¹(r_T − E_Tᵀμ)
// the local fluxes of the current multipliers: their disagreement on the
// constrained edges is the residual of the multiplier system, computed
// from the local solves rather than from the assembled S (one step of
// iterative refinement, e.g. N. J. Higham, Accuracy and Stability of
// Numerical Algorithms, 2nd ed., SIAM 2002, ch. 12). On a graded mesh the
// sparse solve leaves disagreements of relative size about 1e-8; averaged
// into one flux, they change the net flux of a triangle, whose cost grows
// like 1/h².
func (h *hybridFlux) correct(trial, mult [][]float64) error {
	if h.nMult == 0 {
		return nil
	}
	f := h.f
	ne := 3 * (f.k + 1)
	res := make([][]float64, len(trial))
	for i := range res {
		res[i] = make([]float64, h.nMult)
	}
	for t := range f.mesh.Tris {
		if err := h.factor(t, trial); err != nil {
			return err
		}
		mu := h.mult[t]
		for i := range trial {
			x := h.localFlux(t, i, mult[i])
			for a := 0; a < ne; a++ {
				if mu[a] >= 0 {
					res[i][mu[a]] += x[a]
				}
			}
		}
	}
	corr := make([]float64, h.nMult)
	for i := range mult {
		h.fac.SolveTo(corr, res[i])
		for j, c := range corr {
			mult[i][j] += c
		}
	}
	return nil
}

// recover returns the global coefficients of the local fluxes of the
// multipliers: on an interior edge the mean of the two triangles' values,
// elsewhere the local ones.
func (h *hybridFlux) recover(trial, mult [][]float64) ([][]float64, error) {
	f := h.f
	ne := 3 * (f.k + 1)
	out := make([][]float64, len(trial))
	for i := range out {
		out[i] = make([]float64, f.n)
	}
	for t := range f.mesh.Tris {
		if err := h.factor(t, trial); err != nil {
			return nil, err
		}
		d, sg := f.dofs[t], f.sign[t]
		for i := range trial {
			x := h.localFlux(t, i, mult[i])
			for a, xa := range x {
				switch {
				case d[a] < 0:
				case a < ne && h.shared[t][a/(f.k+1)]:
					out[i][d[a]] += 0.5 * sg[a] * xa
				default:
					out[i][d[a]] = sg[a] * xa
				}
			}
		}
	}
	return out, nil
}

// localFlux returns the local coefficients (outward orientation, the basis
// of rtRef) of x_T = B H⁻¹((ρ, 0) − V_eᵀ μ_T) for trial function i on the
// last factored triangle t. The slice is reused by the next call.
func (h *hybridFlux) localFlux(t, i int, mult []float64) []float64 {
	f := h.f
	ne, nd := 3*(f.k+1), f.ref.ndof
	mu := h.mult[t]
	v := h.v
	copy(v, h.rhs[i])
	for a := 0; a < ne; a++ {
		if mu[a] < 0 || mult[mu[a]] == 0 {
			continue
		}
		m := mult[mu[a]]
		row := h.split.b[a*nd : (a+1)*nd]
		for l := range v {
			v[l] -= row[l] * m
		}
	}
	h.lowerSolve(v)
	h.upperSolve(v)
	x := h.x
	for a := 0; a < nd; a++ {
		acc := 0.0
		row := h.split.b[a*nd : (a+1)*nd]
		for l, wl := range v {
			acc += row[l] * wl
		}
		x[a] = acc
	}
	return x
}

// factor sets the Cholesky factor of triangle t's local matrix
//
//	H = Bᵀ (M_K/(4|T|) + R_T) B + [W_kk/(4|T|), 0; 0, 0]
//
// (B the divergence-adapted basis, M_K = Σ K_rs M_rs the mass of the Piola
// metric K ⊇ JᵀJ, R_T the Robin edge terms, W_kk the weighted Gram of
// 1/c on P_k normalised by |T|, as in LGMatrix) and the right-hand sides
// (ρ, 0), ρ_β = −½ Σ_a ũ_a (W_pk)_(aβ): the linear term −(ũ/c, div φ) of
// the normal equations written in the divergence coordinates.
func (h *hybridFlux) factor(t int, trial [][]float64) error {
	f, sp := h.f, h.split
	k, nd, nk := f.k, f.ref.ndof, sp.nk
	g := f.mesh.Geom(t)
	kk := piolaMetric(g)
	quarter := 1 / (4 * g.Area.Mid())
	bern, rem := h.w.Model(t)
	weightedGramF(h.wkk, bern, h.w.q, rem.Mid(), k, k)
	weightedGramF(h.wpk, bern, h.w.q, rem.Mid(), h.s.p, k)
	c0, c1, c2 := quarter*kk[0][0].Mid(), quarter*kk[0][1].Mid(), quarter*kk[1][1].Mid()
	raw := h.hm.RawSymmetric()
	for i := 0; i < nd; i++ {
		row := raw.Data[i*raw.Stride : i*raw.Stride+nd]
		for j := i; j < nd; j++ {
			ij := i*nd + j
			row[j] = c0*sp.mass[0][ij] + c1*sp.mass[1][ij] + c2*sp.mass[2][ij]
		}
		if i < nk {
			for j := i; j < nk; j++ {
				row[j] += quarter * h.wkk[i*nk+j]
			}
		}
	}
	ge := edgeGramTable(k).FL
	for _, ri := range h.robin[t] {
		rb := f.robin[ri]
		sc := f.ref.edgeScale * f.ref.edgeScale / (rb.alpha.Mid() * rb.length.Mid())
		// Bᵀ (sc G_e) B on the rows of edge rb.i.
		for a := 0; a <= k; a++ {
			ra := sp.b[(rb.i*(k+1)+a)*nd : (rb.i*(k+1)+a+1)*nd]
			for c := 0; c <= k; c++ {
				gv := sc * ge[a*(k+1)+c]
				if gv == 0 {
					continue
				}
				rc := sp.b[(rb.i*(k+1)+c)*nd : (rb.i*(k+1)+c+1)*nd]
				for i := 0; i < nd; i++ {
					if ra[i] == 0 {
						continue
					}
					row := raw.Data[i*raw.Stride : i*raw.Stride+nd]
					x := gv * ra[i]
					for j := i; j < nd; j++ {
						row[j] += x * rc[j]
					}
				}
			}
		}
	}
	if !h.chol.Factorize(h.hm) {
		return fmt.Errorf("tri: the local flux matrix on triangle %d is not positive definite in floating point", t)
	}
	h.chol.UTo(&h.u)
	np := dim(h.s.p)
	for i, u := range trial {
		for a, gl := range h.s.dofs[t] {
			h.uc[a] = 0
			if gl >= 0 {
				h.uc[a] = u[gl]
			}
		}
		r := h.rhs[i]
		clear(r)
		for a := 0; a < np; a++ {
			if h.uc[a] == 0 {
				continue
			}
			for c := 0; c < nk; c++ {
				r[c] += h.uc[a] * h.wpk[a*nk+c]
			}
		}
		for c := 0; c < nk; c++ {
			r[c] *= -0.5
		}
	}
	return nil
}

// lowerSolve overwrites v with U⁻ᵀ v (H = UᵀU).
func (h *hybridFlux) lowerSolve(v []float64) {
	raw := h.u.RawTriangular()
	n := raw.N
	for i := 0; i < n; i++ {
		acc := v[i]
		for j := 0; j < i; j++ {
			acc -= raw.Data[j*raw.Stride+i] * v[j]
		}
		v[i] = acc / raw.Data[i*raw.Stride+i]
	}
}

// upperSolve overwrites v with U⁻¹ v.
func (h *hybridFlux) upperSolve(v []float64) {
	raw := h.u.RawTriangular()
	n := raw.N
	for i := n - 1; i >= 0; i-- {
		acc := v[i]
		row := raw.Data[i*raw.Stride : i*raw.Stride+n]
		for j := i + 1; j < n; j++ {
			acc -= row[j] * v[j]
		}
		v[i] = acc / row[i]
	}
}
