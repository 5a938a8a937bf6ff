package tet

import (
	"math"

	"gapcert/fem/discrete"
)

var _ discrete.Indicators = (*FluxSpace)(nil)

// Indicators returns FluxIndicators for the trial functions and their
// fluxes (a choice).
func (f *FluxSpace) Indicators(trial, fluxes [][]float64, lambda []float64) []float64 {
	return f.flux.Indicators(f.trial, trial, fluxes, lambda)
}

// Indicators returns, for each cell T, η_T² = Σ_i ‖σ_i − ∇ũ_i/Λ_i‖²_T
// for the trial functions ũ_i (coefficients trial[i] in s), their fluxes
// σ_i and approximations Λ_i of the shifted eigenvalues: where the flux
// differs from the gradient of the exact eigenfunction over Λ (the flux
// of least norm for an exact eigenpair, package doc, Lehmann–Goerisch),
// the bound loses. Floating point, a choice (for marking cells to refine).
// With D = det J, K = JᵀJ, ∇̂ the reference gradient (∇̂ũ has the
// Bernstein coefficients p(ũ_(β+e_(c+1)) − ũ_(β+e_0)) in component c) and
// the tables normalised by |T| (∫_T̂ = 1/6 of them):
//
//	‖σ‖²_T = (1/(6D)) Σ K_rs ĉ_rᵀ G ĉ_s,   (σ, ∇ũ)_T = (1/6) Σ_c ĉ_cᵀ G′ ∇̂_c ũ,
//	‖∇ũ‖²_T = (D/6) Σ (K⁻¹)_ce ∇̂_c ũᵀ G″ ∇̂_e ũ
//
// (σ = Jσ̂/D and ∇ũ = J^(−T) ∇̂ũ, so σ·∇ũ = σ̂·∇̂ũ/D and ∇ũ·∇ũ = ∇̂ũᵀK⁻¹∇̂ũ).
func (f *Flux) Indicators(s FluxTrial, trial, flux [][]float64, lambda []float64) []float64 {
	if len(trial) != len(flux) || len(lambda) != len(trial) {
		panic("tet: indicator inputs do not match")
	}
	ref := f.ref
	p, nb := s.Degree(), ref.n
	nd, np, nn, nq := ref.ndof, rtDim(p), rtDim(nb), rtDim(p-1)
	tPerm := fluxPermutation(s.MultiIndices(), p)
	ip, iq := rtMulti(p), rtMulti(p-1)
	gn := rtTriple(0, nb, nb).FL
	gnq := rtTriple(0, nb, p-1).FL
	gq := rtTriple(0, p-1, p-1).FL
	x := make([]float64, nd)
	uraw, uc := make([]float64, np), make([]float64, np)
	var c, du [3][]float64
	for r := 0; r < 3; r++ {
		c[r], du[r] = make([]float64, nn), make([]float64, nq)
	}
	quad := func(a, g, b []float64) float64 {
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
	out := make([]float64, len(f.cells))
	for t := range f.cells {
		g := f.geom[t]
		det := g.det.Mid()
		var k [3][3]float64
		for r := 0; r < 3; r++ {
			for q := 0; q < 3; q++ {
				k[r][q] = g.k[r][q].Mid()
			}
		}
		kinv := fluxInverse3(k)
		for i := range trial {
			f.local(x, flux[i], t)
			for r := 0; r < 3; r++ {
				for b := range c[r] {
					acc := 0.0
					row := ref.compT[r][b*nd : (b+1)*nd]
					for l, xl := range x {
						acc += row[l] * xl
					}
					c[r][b] = acc
				}
			}
			s.Local(uraw, trial[i], t)
			for m, pm := range tPerm {
				uc[pm] = uraw[m]
			}
			for b, be := range iq.alpha {
				up0 := be
				up0[0]++
				for r := 0; r < 3; r++ {
					up := be
					up[r+1]++
					du[r][b] = float64(p) * (uc[ip.pos[up]] - uc[ip.pos[up0]])
				}
			}
			ss, sg, gg := 0.0, 0.0, 0.0
			for r := 0; r < 3; r++ {
				sg += quad(c[r], gnq, du[r])
				for q := 0; q < 3; q++ {
					ss += k[r][q] * quad(c[r], gn, c[q])
					gg += kinv[r][q] * quad(du[r], gq, du[q])
				}
			}
			ss /= 6 * det
			sg /= 6
			gg *= det / 6
			li := lambda[i]
			out[t] += math.Max(ss-2*sg/li+gg/(li*li), 0)
		}
	}
	return out
}

// fluxInverse3 returns the inverse of a 3×3 matrix by cofactors (floating
// point; a choice).
func fluxInverse3(a [3][3]float64) [3][3]float64 {
	var co [3][3]float64
	for r := 0; r < 3; r++ {
		for q := 0; q < 3; q++ {
			r1, r2 := (r+1)%3, (r+2)%3
			q1, q2 := (q+1)%3, (q+2)%3
			co[r][q] = a[r1][q1]*a[r2][q2] - a[r1][q2]*a[r2][q1]
		}
	}
	det := a[0][0]*co[0][0] + a[0][1]*co[0][1] + a[0][2]*co[0][2]
	var inv [3][3]float64
	for r := 0; r < 3; r++ {
		for q := 0; q < 3; q++ {
			inv[r][q] = co[q][r] / det
		}
	}
	return inv
}
