package tri

import (
	"errors"
	"math"

	"gapcert/enclose"
	"gapcert/fem/internal/bernstein"
	"gapcert/fem/internal/ritz"
	"gapcert/interval"
)

// ErrResidualBoundaryTerm is returned by LehmannMatrix when a side has a
// Robin term: the residual form below has no boundary terms, and the
// caller uses LGMatrix instead.
var ErrResidualBoundaryTerm = errors.New("tri: the residual form of the Lehmann matrix has no Robin terms")

// LehmannMatrix returns the interval matrix B = A0 − 2ρA1 + ρ²A2 of the
// Lehmann–Goerisch theorem (package temple) for the trial functions ũ_i
// (coefficients trial[i] in s), their fluxes σ_i (coefficients flux[i] in
// f) and the float shift rho, enclosed in the residual form
//
//	b_ij ⊇ ρ² [ (σ_i − ∇ũ_i/ρ, σ_j − ∇ũ_j/ρ) + ∫ (f_i − cũ_i/ρ)(f_j − cũ_j/ρ)/c ],
//	f_i = ũ_i + div σ_i,  c = V + γ,
//
// for every exact input inside the enclosures, on a mesh without Robin
// sides (else ErrResidualBoundaryTerm). v is the potential of s and w must
// be v.InverseShifted(gamma, ·) (else ErrWeightMismatch).
//
// Why this is B. With X, T and w_i = (σ_i, f_i/√c) of the package temple
// doc (no Robin part), r_i = w_i − Tũ_i/ρ = (σ_i − ∇ũ_i/ρ, (f_i − cũ_i/ρ)/√c),
// and (★) of that doc for φ = ũ_j ∈ H gives (Tũ_j, w_i)_X = b(ũ_j, ũ_i) =
// A1_ij, so
//
//	ρ²(r_i, r_j)_X = ρ²(w_i, w_j) − ρ(Tũ_i, w_j) − ρ(w_i, Tũ_j) + (Tũ_i, Tũ_j) = ρ²A2_ij − 2ρA1_ij + A0_ij.
//
// Why it is narrower. For an approximate eigenpair σ_i ≈ ∇ũ_i/Λ_i, so the
// entries of B are about (ρ − Λ)²/Λ while A0, ρA1 and ρ²A2 are about Λ,
// ρ and ρ²/Λ: subtracting those enclosures cancels their common digits and
// keeps their widths. Here σ_i − ∇ũ_i/ρ is formed coefficient by
// coefficient on each triangle, before any integral, so its integral has
// the width of its own size.
//
// On a triangle T (notation of LGMatrix; ∇λ_1, ∇λ_2 the gradients of the
// barycentric coordinates of the vertices v_1, v_2, g_kl = ∇λ_k·∇λ_l):
// σ_i = Jσ̂_i/det J and ∇ũ_i = p Σ_k (D_k ũ_i) ∇λ_k (kernel.go), where
// (∇λ_1, ∇λ_2) are the rows of J⁻¹, so ∇ũ_i = J⁻ᵀ ∇̂ũ_i with ∇̂ũ_i =
// p(D_1 ũ_i, D_2 ũ_i) and g = J⁻¹J⁻ᵀ = K⁻¹. Hence σ_i − ∇ũ_i/ρ = J ẑ_i/det J
// with
//
//	ẑ_(i,r) = ĉ_(i,r) − (2|T| p/ρ) Σ_l g_rl D_l ũ_i       (degree e = max(k + 1, p − 1), exact elevation),
//	(σ_i − ∇ũ_i/ρ, σ_j − ∇ũ_j/ρ)_T = (1/(4|T|)) Σ_(r,s) K_rs ẑ_(i,r)ᵀ G^e ẑ_(j,s)
//
// (the identity of (σ_i, σ_j)_T in LGMatrix with ĉ replaced by ẑ), and
//
//	∫_T (f_i − cũ_i/ρ)(f_j − cũ_j/ρ)/c = ∫_T f_i f_j/c − (1/ρ)∫_T (f_i ũ_j + ũ_i f_j) + (1/ρ²)∫_T c ũ_i ũ_j,
//
// the first as in LGMatrix (weight 1/c ∈ Q + R), the second |T| f_iᵀ G^d ũ_j
// in degree d = max(p, k), the third as the potential term of
// Lagrange.RitzMatrices (V + γ ∈ P + γ + R). Remainders are bounded by
// Cauchy–Schwarz (package doc, Remainders).
func (f *Flux) LehmannMatrix(s *Lagrange, trial [][]float64, flux [][]float64, v, w *Potential, gamma interval.I, rho float64) (*enclose.Sym, error) {
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
	if !(rho > 0) || math.IsInf(rho, 1) {
		panic("tri: rho must be a positive finite float")
	}
	if w == nil || v == nil || w.inverseOf != v || w.shift != gamma || w.mesh != f.mesh || v.mesh != s.mesh {
		return nil, ErrWeightMismatch
	}
	if len(f.robin) > 0 || len(s.robin) > 0 {
		return nil, ErrResidualBoundaryTerm
	}
	ref := f.ref
	nv := len(trial)
	p, k, nb := s.p, f.k, ref.n
	d, e := max(p, k), max(nb, p-1)
	np, nq, nk, nd, ne, nn := dim(p), dim(p-1), dim(k), dim(d), dim(e), dim(nb)
	ge := tripleTable(0, e, e).IV
	gd := tripleTable(0, d, d).IV
	gp := tripleTable(0, p, p).IV
	elevP, elevK := elevationTable(p, d).IV, elevationTable(k, d).IV
	elevC, elevG := elevationTable(nb, e).IV, elevationTable(p-1, e).IV
	rhoI := interval.Point(rho)
	invRho := rhoI.Recip()
	invRho2 := invRho.Sqr()
	acc := ritz.NewAccumulator(nv)
	x := make([]float64, ref.ndof)
	type work struct {
		cf                 []float64
		c, z, gz           [2][]interval.I
		du                 [2][]interval.I
		dv, ue, fi, gf, wf []interval.I
		gu, vu             []interval.I
		ff, uu             interval.I
	}
	wk := make([]work, nv)
	for i := range wk {
		wk[i].cf = make([]float64, np)
		for r := 0; r < 2; r++ {
			wk[i].c[r], wk[i].z[r], wk[i].gz[r] = make([]interval.I, nn), make([]interval.I, ne), make([]interval.I, ne)
			wk[i].du[r] = make([]interval.I, nq)
		}
		wk[i].dv = make([]interval.I, nk)
		wk[i].ue, wk[i].fi, wk[i].gf, wk[i].wf = make([]interval.I, nd), make([]interval.I, nd), make([]interval.I, nd), make([]interval.I, nd)
		wk[i].gu, wk[i].vu = make([]interval.I, np), make([]interval.I, np)
	}
	tmpD, tmpE, grad := make([]interval.I, nd), make([]interval.I, ne), make([]interval.I, nq)
	wg := make([]interval.I, nd*nd)
	vg := make([]interval.I, np*np)
	for t := range f.mesh.Tris {
		g := f.mesh.Geom(t)
		kk := piolaMetric(g)
		gg := gradGram(g.Grad)
		quarter := g.Area.MulF(4).Recip()                    // 1/(4|T|)
		half := g.Area.MulF(2).Recip()                       // 1/(2|T|) = 1/det J
		gradScale := g.Area.MulF(2 * float64(p)).Mul(invRho) // 2|T| p/ρ
		for i := range wk {
			c := &wk[i]
			f.local(x, flux[i], t)
			for l, gl := range s.dofs[t] {
				c.cf[l] = 0
				if gl >= 0 {
					c.cf[l] = trial[i][gl]
				}
			}
			// ẑ_r = ĉ_r − (2|T| p/ρ) Σ_l g_rl D_l ũ, in degree e.
			for r := 0; r < 2; r++ {
				exactCombination(c.c[r], ref.compT[r], x)
				diffF(c.du[r], s.pairs[r], c.cf)
			}
			for r := 0; r < 2; r++ {
				for b := range grad {
					grad[b] = gg[r][0].Mul(c.du[0][b]).Add(gg[r][1].Mul(c.du[1][b])).Mul(gradScale)
				}
				if e == nb {
					copy(c.z[r], c.c[r])
				} else {
					bernstein.ApplyI(c.z[r], elevC, c.c[r])
				}
				if e == p-1 {
					copy(tmpE, grad)
				} else {
					bernstein.ApplyI(tmpE, elevG, grad)
				}
				for b := range c.z[r] {
					c.z[r][b] = c.z[r][b].Sub(tmpE[b])
				}
				bernstein.ApplyI(c.gz[r], ge, c.z[r])
			}
			// f = ũ + div σ in degree d; ũ elevated to d alone (ue).
			exactCombination(c.dv, ref.divT, x)
			for b := range c.dv {
				c.dv[b] = c.dv[b].Mul(half)
			}
			if d == p {
				for b, u := range c.cf {
					c.ue[b] = interval.Point(u)
				}
			} else {
				bernstein.ApplyF(c.ue, elevP, c.cf)
			}
			if d == k {
				copy(tmpD, c.dv)
			} else {
				bernstein.ApplyI(tmpD, elevK, c.dv)
			}
			for b := range c.fi {
				c.fi[b] = c.ue[b].Add(tmpD[b])
			}
			bernstein.ApplyI(c.gf, gd, c.fi)
			c.ff = bernstein.DotI(c.fi, c.gf)
			bernstein.ApplyF(c.gu, gp, c.cf)
			c.uu = bernstein.DotF(c.cf, c.gu)
		}
		bern, rem := w.Model(t)
		vb, vr := v.Model(t)
		if !rem.IsBounded() || !hull(bern).IsBounded() || !vr.IsBounded() || !hull(vb).IsBounded() {
			return nil, errUnbounded
		}
		weightedGramOf(wg, w.q, d, bern, interval.Point(rem.Mid()))
		weightedGramOf(vg, v.q, p, vb, gamma.AddF(vr.Mid()))
		for i := range wk {
			bernstein.ApplyI(wk[i].wf, wg, wk[i].fi)
			bernstein.ApplyF(wk[i].vu, vg, wk[i].cf)
		}
		wrad, vrad := rem.Rad(), vr.Rad()
		for i := 0; i < nv; i++ {
			ci := &wk[i]
			for j := 0; j <= i; j++ {
				cj := &wk[j]
				m := kk[0][0].Mul(bernstein.DotI(cj.z[0], ci.gz[0])).
					Add(kk[0][1].Mul(bernstein.DotI(cj.z[0], ci.gz[1]).Add(bernstein.DotI(cj.z[1], ci.gz[0])))).
					Add(kk[1][1].Mul(bernstein.DotI(cj.z[1], ci.gz[1])))
				ffw := bernstein.DotI(cj.fi, ci.wf)
				if r := bernstein.RemainderBound(wrad, ci.ff.Hi, cj.ff.Hi); r != 0 {
					ffw = ffw.Add(interval.I{Lo: -r, Hi: r})
				}
				fu := bernstein.DotI(cj.ue, ci.gf).Add(bernstein.DotI(ci.ue, cj.gf))
				cuu := bernstein.DotF(cj.cf, ci.vu)
				if r := bernstein.RemainderBound(vrad, ci.uu.Hi, cj.uu.Hi); r != 0 {
					cuu = cuu.Add(interval.I{Lo: -r, Hi: r})
				}
				e := ffw.Sub(fu.Mul(invRho)).Add(cuu.Mul(invRho2))
				acc.Add(i, j, quarter.Mul(m).Add(g.Area.Mul(e)))
			}
		}
	}
	out := acc.Sym()
	rho2 := rhoI.Sqr()
	for i := 0; i < nv; i++ {
		for j := 0; j <= i; j++ {
			out.Set(i, j, out.At(i, j).Mul(rho2))
		}
	}
	return out, nil
}
