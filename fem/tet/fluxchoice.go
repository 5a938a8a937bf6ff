package tet

import (
	"fmt"
	"math"
	"sync"

	"gapcert/enclose/sparse"
)

// ChooseApprox returns, for each trial function ũ (coefficients trial[i]
// in s), the flux σ of this space that minimises
//
//	‖w‖²_X = ‖σ‖² + ‖(ũ + div σ)/√c‖² + Σ_Robin ∫_F (σ·n)²/α,
//
// with 1/c taken from the midpoints of the model w (each coefficient
// raised to 0 if negative), in floating point; a choice: any σ is
// admissible in LGMatrix. It solves the normal equations (A + D + R) σ =
// −b, A the mass matrix of the Piola fields, D the weighted divergence
// term, R the Robin face terms and b_l = ∫ (ũ/c) div φ_l, assembled from
// the same element formulas as LGMatrix and factored by the sparse LDLᵀ of
// package enclose/sparse. This plain solve suits the quasi-uniform meshes
// it is used on: the divergence term grows like 1/h² against the mass
// term, and on strongly graded meshes a divergence-adapted hybridised
// solve (as the triangle package does) would be needed to keep the mass
// term on the divergence-free fields.
func (f *Flux) ChooseApprox(s FluxTrial, trial [][]float64, w FluxWeight) ([][]float64, error) {
	ref := f.ref
	nd, k := ref.ndof, f.k
	p, q := s.Degree(), w.Degree()
	np, nk, nq := rtDim(p), rtDim(k), rtDim(q)
	tPerm, wPerm := fluxPermutation(s.MultiIndices(), p), fluxPermutation(w.MultiIndices(), q)
	mass := rtMassBlocks(k)
	wkk, wpk := make([]float64, nk*nk), make([]float64, np*nk)
	tkk, tpk := rtTriple(q, k, k).FL, rtTriple(q, p, k).FL
	wc := make([]float64, nq)
	loc := make([]float64, nd*nd)
	dw := make([]float64, nk*nd) // W_kk divT, column l at dw[β·nd + l]
	b := sparse.NewBuilder(f.n)
	rhs := make([][]float64, len(trial))
	for i := range rhs {
		rhs[i] = make([]float64, f.n)
	}
	robinOf := map[int][]int{} // cell → indices into f.robin
	for ri, rf := range f.robin {
		robinOf[rf.t] = append(robinOf[rf.t], ri)
	}
	uraw, uc := make([]float64, np), make([]float64, np)
	wu := make([]float64, nk)
	for t := range f.cells {
		g := f.geom[t]
		det := g.det.Mid()
		vol := det / 6
		coef, rem := w.Model(t)
		for m, pm := range wPerm {
			wc[pm] = math.Max(coef[m].Mid()+rem.Mid(), 0)
		}
		fluxWeightedGramF(wkk, tkk, wc, nk, nk)
		fluxWeightedGramF(wpk, tpk, wc, np, nk)
		// Local matrix: (1/(6 det)) Σ K_rs M_rs + (|T|/det²) divTᵀ W_kk divT.
		for ij := range loc {
			acc := 0.0
			for r := 0; r < 3; r++ {
				for c := 0; c < 3; c++ {
					acc += g.k[r][c].Mid() * mass[r*3+c][ij]
				}
			}
			loc[ij] = acc / (6 * det)
		}
		clear(dw)
		// The divergence of a basis function has few nonzero coefficients
		// (rtRef.divCols).
		for l, col := range ref.divCols {
			for _, e := range col {
				for be := 0; be < nk; be++ {
					dw[be*nd+l] += wkk[be*nk+e.row] * e.v
				}
			}
		}
		dsc := vol / (det * det)
		for l, col := range ref.divCols {
			row := loc[l*nd : (l+1)*nd]
			for _, e := range col {
				a := dsc * e.v
				for m, v := range dw[e.row*nd : (e.row+1)*nd] {
					row[m] += a * v
				}
			}
		}
		for _, ri := range robinOf[t] {
			f.robinLocalApprox(loc, f.robin[ri])
		}
		dof, sg := f.dofs[t], f.sign[t]
		for l := 0; l < nd; l++ {
			if dof[l] < 0 {
				continue
			}
			for m := 0; m <= l; m++ {
				if dof[m] < 0 {
					continue
				}
				b.Add(dof[l], dof[m], sg[l]*sg[m]*loc[l*nd+m])
			}
		}
		// b_l = ∫_T (ũ/c) div φ_l = |T| uᵀ W_pk divT_l / det.
		for i := range trial {
			s.Local(uraw, trial[i], t)
			for m, pm := range tPerm {
				uc[pm] = uraw[m]
			}
			clear(wu)
			for a := 0; a < np; a++ {
				if uc[a] == 0 {
					continue
				}
				for be := 0; be < nk; be++ {
					wu[be] += uc[a] * wpk[a*nk+be]
				}
			}
			for l := 0; l < nd; l++ {
				if dof[l] < 0 {
					continue
				}
				acc := 0.0
				for be := 0; be < nk; be++ {
					acc += wu[be] * ref.divT[be*nd+l]
				}
				rhs[i][dof[l]] -= sg[l] * acc * vol / det
			}
		}
	}
	sys := b.Build()
	fac, ok := sparse.Factor(sys, sparse.Order(sys))
	if !ok {
		return nil, fmt.Errorf("tet: the flux system of dimension %d could not be factored", f.n)
	}
	out := make([][]float64, len(trial))
	for i := range out {
		out[i] = make([]float64, f.n)
		fac.SolveTo(out[i], rhs[i])
	}
	return out, nil
}

// robinLocalApprox adds the term of the Robin face rf to the local matrix
// of its cell (floating point; a choice): (faceScale²/(4α|F|)) G_F on the
// face DOFs.
func (f *Flux) robinLocalApprox(loc []float64, rf fluxFace) {
	nf, nd := f.ref.nFace, f.ref.ndof
	ge := rtFaceGram(f.k).FL
	sc := f.ref.faceScale * f.ref.faceScale / (4 * rf.alpha.Mid() * rf.area.Mid())
	for a := 0; a < nf; a++ {
		for c := 0; c < nf; c++ {
			loc[(rf.i*nf+a)*nd+rf.i*nf+c] += sc * ge[a*nf+c]
		}
	}
}

// fluxWeightedGramF sets dst[a·nb + b] = Σ_κ w_κ T[(κ·na + a)·nb + b]
// (floating point; a choice).
func fluxWeightedGramF(dst, triple, w []float64, na, nb int) {
	sz := na * nb
	clear(dst[:sz])
	for kk, wk := range w {
		if wk == 0 {
			continue
		}
		blk := triple[kk*sz : (kk+1)*sz]
		for ab := range dst[:sz] {
			dst[ab] += wk * blk[ab]
		}
	}
}

var (
	rtMassMu    sync.Mutex
	rtMassCache = map[int][][]float64{}
)

// rtMassBlocks returns, for each pair (r, s) at index 3r + s, the float
// matrix M_rs[l·ndof + m] = ĉ_(l,r)ᵀ G ĉ_(m,s) of the scaled reference
// basis (G the Gram matrix of degree k + 1 normalised by |T|; a choice).
// Each component of a basis function has at most three nonzero
// coefficients (rtRef.compCols), so the entries are short sums.
func rtMassBlocks(k int) [][]float64 {
	rtMassMu.Lock()
	defer rtMassMu.Unlock()
	if m, ok := rtMassCache[k]; ok {
		return m
	}
	ref := rtReference(k)
	nd, nn := ref.ndof, rtDim(ref.n)
	g := rtTriple(0, ref.n, ref.n).FL
	out := make([][]float64, 9)
	for r := 0; r < 3; r++ {
		for s := 0; s < 3; s++ {
			blk := make([]float64, nd*nd)
			for l := 0; l < nd; l++ {
				for m := 0; m < nd; m++ {
					acc := 0.0
					for _, x := range ref.compCols[r][l] {
						for _, y := range ref.compCols[s][m] {
							acc += x.v * g[x.row*nn+y.row] * y.v
						}
					}
					blk[l*nd+m] = acc
				}
			}
			out[r*3+s] = blk
		}
	}
	rtMassCache[k] = out
	return out
}
