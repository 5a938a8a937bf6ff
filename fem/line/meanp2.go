package line

import (
	"fmt"
	"math"
	"math/big"

	"gapcert/enclose/band"
	"gapcert/fem/boundary"
	"gapcert/interval"
	"gapcert/interval/decimalio"
)

// MeanP2 is the stage-A space of the projection lower bound (package doc)
// in one dimension: continuous
// piecewise quadratics (the same space as conforming P2) with the degrees
// of freedom nodal values and cell means. On a cell with reference
// coordinate ξ the local basis is
//
//	N_L = (1 − ξ) − ½B = (1 − ξ)(1 − 3ξ),  N_R = ξ − ½B = ξ(3ξ − 2),  B = 6ξ(1 − ξ),
//
// N_L, N_R with value 1 at their node and cell mean 0, B with nodal values 0
// and mean 1; the global N_k is N_R on the cell left of node k and N_L on
// the cell right of it. So the coefficients of a function are exactly its
// nodal values and cell means. Ordering: node 0, mean 0, node 1, mean 1, …,
// node n (half-bandwidth 2); nodal values at Dirichlet ends are removed.
//
// The form is
//
//	a_lo(u, v) = Σ_T (u', v')_T + Σ_T c_T |T| m_T(u) m_T(v) + α_L u(a)v(a) + α_R u(b)v(b),
//
// with c_T the lower end of an enclosure of V + γ on T, required ≥ 0. Since
// 0 ≤ c_T ≤ V + γ on T and |T| m_T(u)² ≤ ∫_T u² (Jensen / Cauchy–Schwarz),
// a_lo(u, u) ≤ a(u, u) + γ‖u‖² on H, so λ_k(a_lo) ≤ λ_k + γ by min–max.
//
// Projection bound (the abstract theorem of Liu 2015, proved in the doc of
// package enclose, with a_h = a_lo, b the L²
// product): let P_h u be the function of the space with the nodal values
// and cell means of u ∈ H (nodal values exist in 1D; P_h u = 0 at Dirichlet
// ends), e = u − P_h u. Then e vanishes at every node and has zero mean on
// every cell.
//
// (H2) a_lo(e, v_h) = 0 for v_h in the space: the mean and end terms vanish
// since m_T(e) = 0 and e(a) = e(b) = 0; on a cell, v_h″ is constant, so
// ∫_T e'v_h' = [e v_h']_∂T − v_h″ ∫_T e = 0.
//
// (H3) ‖e‖ ≤ C_h ‖e‖_(a_lo) with C_h = h_max/(2π): a_lo(e, e) = ‖e'‖², and
// on a cell of length h the smallest Rayleigh quotient ∫e'²/∫e² over
// e ∈ H¹ with e = 0 at both ends and zero mean is (2π/h)². Its minimiser
// solves −e″ = μe + κ (κ a Lagrange multiplier for the mean). Modes odd
// about the centre have κ = 0 and are sin(2πj(x − x_T)/h), the smallest
// being j = 1, μ = (2π/h)²; even modes e = cos(s(x − c)) − cos(sh/2) (c the
// centre) have zero mean iff tan(sh/2) = sh/2, whose least positive root
// sh/2 ≈ 4.4934 > π gives a larger μ. Summing ∫_T e² ≤ (h_T/2π)² ∫_T e'²
// over cells gives (H3).
//
// Liu's theorem then gives λ_k + γ ≥ λ_k(a_lo) ≥ λ_(h,k)/(1 + C_h² λ_(h,k))
// for the k-th eigenvalue λ_(h,k) of (a_lo, b) on the space.
//
// References:
//
//	X. Liu, A framework of verified eigenvalue bounds for self-adjoint
//	differential operators, Appl. Math. Comput. 267 (2015).
//	C. Carstensen, J. Gedicke, Guaranteed lower bounds for eigenvalues,
//	Math. Comp. 83 (2014).
type MeanP2 struct {
	mesh *Mesh
	ends
	n     int
	shift int
}

// NewMeanP2 returns the stage-A space on m (conditions as for NewLagrange).
func NewMeanP2(m *Mesh, left, right boundary.Condition) *MeanP2 {
	s := &MeanP2{mesh: m, ends: newEnds(left, right), n: 2*m.Cells() + 1}
	if left.Essential() {
		s.n--
		s.shift = 1
	}
	if right.Essential() {
		s.n--
	}
	return s
}

// N returns the dimension.
func (s *MeanP2) N() int { return s.n }

// Mesh returns the mesh.
func (s *MeanP2) Mesh() *Mesh { return s.mesh }

// NodeDof returns the index of the nodal value at node k, −1 if removed.
func (s *MeanP2) NodeDof(k int) int {
	if s.endRemoved(k) {
		return -1
	}
	return 2*k - s.shift
}

// MeanDof returns the index of the mean of cell k.
func (s *MeanP2) MeanDof(k int) int { return 2*k + 1 - s.shift }

// meanP2Ref returns the exact local stiffness and mass matrices on [0, 1]
// in the order (N_L, B, N_R):
//
//	K_ref = [4 −6 2; −6 12 −6; 2 −6 4],
//	M_ref = [2/15 −1/10 −1/30; −1/10 6/5 −1/10; −1/30 −1/10 2/15].
//
// (Direct integration of the polynomials above.)
func meanP2Ref() (k, m [3][3]*big.Rat) {
	ki := [3][3]int64{{4, -6, 2}, {-6, 12, -6}, {2, -6, 4}}
	mn := [3][3][2]int64{{{2, 15}, {-1, 10}, {-1, 30}}, {{-1, 10}, {6, 5}, {-1, 10}}, {{-1, 30}, {-1, 10}, {2, 15}}}
	for i := 0; i < 3; i++ {
		for j := 0; j < 3; j++ {
			k[i][j] = big.NewRat(ki[i][j], 1)
			m[i][j] = big.NewRat(mn[i][j][0], mn[i][j][1])
		}
	}
	return k, m
}

// meanP2MassSplit is d = (2/25, 4/25, 2/25), with M_ref − diag(d) verified
// positive definite by an exact rational LDLᵀ at package initialisation,
// so that M_ref ⪰ diag(d) on each cell: nodal values get 2/25 from each
// adjacent cell, cell means 4/25. (The largest admissible t in
// diag(t/2, t, t/2) is (1.4 − √1.16)/2 ≈ 0.1615; the plain bound
// λ_min(M_ref) I = (13 − √129)/20 I ≈ 0.0821 I would be about half as good
// at cell means.)
var meanP2MassSplit = func() [3]*big.Rat {
	d := [3]*big.Rat{big.NewRat(2, 25), big.NewRat(4, 25), big.NewRat(2, 25)}
	_, m := meanP2Ref()
	if !ratPositiveDefiniteShifted(m, d) {
		panic("line: mass splitting not verified")
	}
	return d
}()

// ratPositiveDefiniteShifted reports whether A − diag(d) is positive
// definite, by exact symmetric Gaussian elimination (all pivots > 0 ⇔ PD;
// Sylvester's criterion in LDLᵀ form).
func ratPositiveDefiniteShifted(a [3][3]*big.Rat, d [3]*big.Rat) bool {
	var w [3][3]*big.Rat
	for i := 0; i < 3; i++ {
		for j := 0; j < 3; j++ {
			w[i][j] = new(big.Rat).Set(a[i][j])
		}
		w[i][i].Sub(w[i][i], d[i])
	}
	for k := 0; k < 3; k++ {
		if w[k][k].Sign() <= 0 {
			return false
		}
		for i := k + 1; i < 3; i++ {
			f := new(big.Rat).Quo(w[i][k], w[k][k])
			for j := k; j < 3; j++ {
				w[i][j].Sub(w[i][j], new(big.Rat).Mul(f, w[k][j]))
			}
		}
	}
	return true
}

// Matrices returns the interval stiffness matrix k ⊇ a_lo and mass matrix
// mass ⊇ b of the space, for every exact mesh and γ ∈ gamma, and mMin > 0
// with mMin ≤ λ_min(M) for every member M of mass.
//
// c_T = lower end of v.Range(T) + gamma; a *SignError is returned if it is
// not ≥ 0 on some cell (the Jensen step needs 0 ≤ c_T ≤ V + γ).
//
// mMin: the exact mass matrix is M = Σ_T h_T M_T (M_T = M_ref on the DOFs
// of T, restricted where an end value is removed, which keeps
// M_T ⪰ diag(d) on the remaining DOFs), so with meanP2MassSplit d,
// xᵀMx ≥ Σ_T h_T Σ_(i∈T) d_i x_i² ≥ min_i(Σ_(T∋i) h_T d_i) |x|², the
// elementwise bound M ⪰ diag(Σ_(T∋i) ·) (package enclose/band, Mass
// bounds). Any member
// M' of the interval matrix differs from M by a symmetric E with
// |E_ij| ≤ wid(mass_ij), so λ_min(M') ≥ that minimum − ‖E‖∞ (Weyl;
// ‖E‖₂ ≤ ‖E‖∞ for symmetric E). mMin is this bound rounded down.
func (s *MeanP2) Matrices(v *Potential, gamma interval.I) (k, mass *band.ISym, mMin float64, err error) {
	if v == nil || v.mesh != s.mesh {
		panic("line: potential is not on the space's mesh")
	}
	kr, mr := meanP2Ref()
	var kref, mref [3][3]interval.I
	for i := 0; i < 3; i++ {
		for j := 0; j < 3; j++ {
			kref[i][j] = decimalio.FromRat(kr[i][j])
			mref[i][j] = decimalio.FromRat(mr[i][j])
		}
	}
	k, mass = band.NewISym(s.n, 2), band.NewISym(s.n, 2)
	nc := s.mesh.Cells()
	for c := 0; c < nc; c++ {
		h := s.mesh.H(c)
		hinv := h.Recip()
		ct := v.Range(c).Add(gamma).Lo
		if !(ct >= 0) || math.IsInf(ct, 0) {
			return nil, nil, 0, &SignError{What: "V + γ", Cell: c, Cell0: s.mesh.Nodes[c], Cell1: s.mesh.Nodes[c+1],
				Range: v.Range(c).Add(gamma), Need: "≥ 0"}
		}
		idx := [3]int{s.NodeDof(c), s.MeanDof(c), s.NodeDof(c + 1)}
		for i := 0; i < 3; i++ {
			if idx[i] < 0 {
				continue
			}
			for j := 0; j <= i; j++ {
				if idx[j] < 0 {
					continue
				}
				k.Add(idx[i], idx[j], hinv.Mul(kref[i][j]))
				mass.Add(idx[i], idx[j], h.Mul(mref[i][j]))
			}
		}
		k.Add(idx[1], idx[1], h.MulF(ct))
	}
	s.endTerms(k)
	var split [3]float64
	for i, r := range meanP2MassSplit {
		split[i] = decimalio.FromRat(r).Lo
	}
	diag := make([]float64, s.n)
	for c := 0; c < nc; c++ {
		hlo := s.mesh.H(c).Lo
		for i, g := range [3]int{s.NodeDof(c), s.MeanDof(c), s.NodeDof(c + 1)} {
			if g >= 0 {
				diag[g] = interval.AddDown(diag[g], interval.MulDown(split[i], hlo))
			}
		}
	}
	structured := math.Inf(1)
	for _, d := range diag {
		structured = math.Min(structured, d)
	}
	rowMax := 0.0
	for i := 0; i < s.n; i++ {
		r := 0.0
		for j := max(0, i-2); j <= min(s.n-1, i+2); j++ {
			r = interval.AddUp(r, mass.At(i, j).Wid())
		}
		rowMax = math.Max(rowMax, r)
	}
	mMin = interval.SubDown(structured, rowMax)
	if !(mMin > 0) {
		return nil, nil, 0, fmt.Errorf("line: mass matrix lower bound %g not positive (cells too short for float64)", mMin)
	}
	return k, mass, mMin, nil
}

// ProjectionConstant returns an interval whose upper end is ≥ C_h =
// h_max/(2π) for the exact mesh (the constant of (H3) above): the
// enclosure of max_T h_T divided by 2π, with π ∈ [math.Pi, next(math.Pi)]
// (math.Pi = 3.141592653589793116 is the float64 just below π =
// 3.14159265358979323846…).
func (s *MeanP2) ProjectionConstant() interval.I {
	lo := 0.0
	for c := 0; c < s.mesh.Cells(); c++ {
		lo = math.Max(lo, s.mesh.H(c).Lo)
	}
	twoPi := interval.I{Lo: 2 * math.Pi, Hi: 2 * math.Nextafter(math.Pi, 4)}
	return interval.I{Lo: lo, Hi: s.mesh.HMax()}.Div(twoPi)
}
