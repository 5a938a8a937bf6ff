package tet

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"

	"gapcert/enclose/sparse"
	"gapcert/fem/boundary"
	"gapcert/fem/internal/bernstein"
	"gapcert/interval"
)

// Projection is a stage-A space of a projection lower bound (package doc,
// Projection lower bound) on a tetrahedral mesh: the Crouzeix–Raviart
// space CR (NewCR; piecewise P1, continuous in the mean over every
// interior face, the degrees of freedom the face means) or the enriched
// Crouzeix–Raviart space ECR (NewECR; P1 + span{|x|²} on each
// tetrahedron, the face means and the element mean), Dirichlet face means
// removed (exactly 0). On a tetrahedron the CR basis function of the face
// opposite local vertex i is φ_i = 1 − 3λ_i: λ_i has mean 1/3 over each
// face containing vertex i (the mean of a barycentric coordinate over a
// triangle) and 0 on the face opposite it, so m_(F_j)(φ_i) = δ_ij.
//
// References:
//
//	M. Crouzeix, P.-A. Raviart, Conforming and nonconforming finite element
//	methods for solving the stationary Stokes equations I, RAIRO Anal.
//	Numér. 7 (1973) 33–75.
//	J. Hu, Y. Huang, Q. Lin, Lower bounds for eigenvalues of elliptic
//	operators: by nonconforming finite element methods, J. Sci. Comput. 61
//	(2014) 196–221.
type Projection struct {
	mesh     *Mesh
	bc       []boundary.Condition
	enriched bool
	n        int
	faceDof  []int // DOF of each mesh face (−1: Dirichlet)
	meanBase int   // ECR: DOF of the mean of tetrahedron t is meanBase + t
	robin    []projectionFace
}

// projectionFace is a boundary face with a term: the DOF of its mean
// (−1: removed), α and the area.
type projectionFace struct {
	dof   int
	alpha interval.I
	area  interval.I
}

// NewCR returns the Crouzeix–Raviart space on m with bc[i] the condition
// on polyhedron face i (panics as NewLagrange on bad conditions).
func NewCR(m *Mesh, bc []boundary.Condition) *Projection { return newProjection(m, bc, false) }

// NewECR returns the enriched Crouzeix–Raviart space on m (local basis in
// ecrBasis) with bc[i] the condition on polyhedron face i.
func NewECR(m *Mesh, bc []boundary.Condition) *Projection { return newProjection(m, bc, true) }

func newProjection(m *Mesh, bc []boundary.Condition, enriched bool) *Projection {
	checkBC(m, bc)
	s := &Projection{mesh: m, bc: bc, enriched: enriched, faceDof: make([]int, len(m.faces))}
	dir := make([]bool, len(m.faces))
	for k, b := range m.bnd {
		if bc[b.Face].Essential() {
			o := m.bndOwner[k]
			dir[m.tetFaces[o[0]][o[1]]] = true
		}
	}
	for f := range s.faceDof {
		s.faceDof[f] = -1
		if !dir[f] {
			s.faceDof[f] = s.n
			s.n++
		}
	}
	if enriched {
		s.meanBase = s.n
		s.n += len(m.tets)
	}
	for k, b := range m.bnd {
		c := bc[b.Face]
		if !c.HasTerm() {
			continue
		}
		o := m.bndOwner[k]
		s.robin = append(s.robin, projectionFace{dof: s.faceDof[m.tetFaces[o[0]][o[1]]], alpha: c.WeakAlpha(), area: m.faceArea(o[0], o[1])})
	}
	return s
}

// N returns the dimension of the space.
func (s *Projection) N() int { return s.n }

// Mesh returns the mesh.
func (s *Projection) Mesh() *Mesh { return s.mesh }

// Enriched reports whether the space is ECR (false: CR).
func (s *Projection) Enriched() bool { return s.enriched }

// localDofs returns the DOFs of tetrahedron t: the face means opposite
// local vertices 0..3, then (ECR) the element mean; −1 where removed.
func (s *Projection) localDofs(t int) [5]int {
	var d [5]int
	for i := 0; i < 4; i++ {
		d[i] = s.faceDof[s.mesh.tetFaces[t][i]]
	}
	d[4] = -1
	if s.enriched {
		d[4] = s.meanBase + t
	}
	return d
}

// ecrBasis returns enclosures of the degree-2 Bernstein coefficients (order
// of multiIndex(4, 2)) of the local ECR basis on the exact tetrahedron with
// vertices in v: Φ_0..Φ_3 with m_(F_j)(Φ_i) = δ_ij and m_T(Φ_i) = 0 (F_j
// the face opposite vertex j), and Φ_4 with zero face means and
// m_T(Φ_4) = 1. The construction, with d_k = v_k − v_0 (k = 1, 2, 3):
//
//	q = |x − v_0|² = Σ_(k,l ≥ 1) (d_k·d_l) λ_k λ_l   (∈ ECR(T); coefficient d_k·d_k at 2e_k, d_k·d_l at e_k + e_l),
//
// t_j = m_(F_j)(q) and the mean of q over T are the means of the Bernstein
// coefficients over the face (the six degree-2 Bernstein polynomials of a
// triangle have equal integrals) and over T (the ten of a tetrahedron);
// ℓ = Σ c_i λ_i with c_i = S − 3t_i, S = Σ t_j, has m_(F_j)(ℓ) =
// (S − c_j)/3 = t_j (coefficient (c_i + c_j)/2 at e_i + e_j), so ψ = q − ℓ
// has zero face means, and by the identity 3∫_T ψ = −∫_T (x − x_c)·∇ψ of
// the package doc with ∇ψ = 2(x − x_c) (∫_T ∇ψ = 0, as ∫_T ∇ψ·∇ℓ' = 0 for
// every affine ℓ'), m_T(ψ) = −(2/3)(Σ_(edges) ℓ²)/80 < 0 for every
// nondegenerate tetrahedron. The local DOF matrix is therefore
// invertible, Φ_4 = ψ/m_T(ψ), and with the CR functions φ_i = 1 − 3λ_i
// (degree-2 coefficients 1 − 3α_i/2; m_T(φ_i) = 1/4), Φ_i = φ_i − Φ_4/4.
// ok is false if the enclosure of m_T(ψ) (the mean of ψ's coefficients)
// is not verified negative.
func ecrBasis(v [4][3]interval.I) (phi [5][10]interval.I, ok bool) {
	ix := multiIndex(4, 2)
	var d [4][3]interval.I
	for k := 1; k < 4; k++ {
		for c := 0; c < 3; c++ {
			d[k][c] = v[k][c].Sub(v[0][c])
		}
	}
	var q [10]interval.I
	for a, al := range ix.alpha {
		if al[0] > 0 {
			continue
		}
		var k, l int
		for i := 1; i < 4; i++ {
			for r := 0; r < al[i]; r++ {
				if k == 0 {
					k = i
				} else {
					l = i
				}
			}
		}
		q[a] = dot(d[k], d[l])
	}
	var t [4]interval.I
	var sum interval.I
	for j := 0; j < 4; j++ {
		for a, al := range ix.alpha {
			if al[j] == 0 {
				t[j] = t[j].Add(q[a])
			}
		}
		t[j] = t[j].DivF(6)
		sum = sum.Add(t[j])
	}
	var psi [10]interval.I
	var mean interval.I
	for a, al := range ix.alpha {
		l := interval.I{}
		for i := 0; i < 4; i++ {
			if al[i] > 0 {
				l = l.Add(sum.Sub(t[i].MulF(3)).MulF(float64(al[i]) / 2))
			}
		}
		psi[a] = q[a].Sub(l)
		mean = mean.Add(psi[a])
	}
	mean = mean.DivF(10)
	if !(mean.Hi < 0) {
		return phi, false
	}
	for a := range psi {
		phi[4][a] = psi[a].Div(mean)
	}
	for i := 0; i < 4; i++ {
		for a, al := range ix.alpha {
			phi[i][a] = interval.Point(1 - 1.5*float64(al[i])).Sub(phi[4][a].DivF(4))
		}
	}
	return phi, true
}

// Matrices returns interval matrices k and mass of the form of the space
// and of b, and mMin, a positive lower bound of the least eigenvalue of
// every member of mass. The forms, with c_T the lower end of an enclosure
// of V + γ on T (verified ≥ 0, else a *SignError) and c = CRShift(v,
// gamma), are
//
//	CR:  a_h(u, v) + c b(u, v),   a_h(u, v) = Σ_T (∇u, ∇v)_T + Σ_(F ⊂ Γ_R) α_F |F| m_F(u) m_F(v),
//	ECR: Σ_T (∇u, ∇v)_T + Σ_T c_T |T| m_T(u) m_T(v) + Σ_(F ⊂ Γ_R) α_F |F| m_F(u) m_F(v).
//
// CR entries, with φ_i = 1 − 3λ_i and ∫_T λ_i λ_j = |T|(1 + δ_ij)/20,
// ∫_T λ_i = |T|/4 (tables.go, integral):
//
//	(∇φ_i, ∇φ_j)_T = 9 |T| ∇λ_i·∇λ_j,   (φ_i, φ_j)_T = |T| (1 − 3/4 − 3/4 + 9(1 + δ_ij)/20) = |T| (2/5 if i = j, −1/20 else).
//
// ECR entries (basis of ecrBasis, L = Σ_(edges) ℓ²): ∇Φ_4 = 2(x −
// x_c)/m_T(ψ) with m_T(ψ) = −L/120 and ∫_T |x − x_c|² = |T|L/80 give
// (∇Φ_4, ∇Φ_4)_T = 720|T|/L and (∇Φ_4, ∇φ_i)_T = 0 (∫_T (x − x_c) = 0), so
// with Φ_i = φ_i − Φ_4/4 the stiffness is 45|T|/L · w_a w_b, w = (1, 1, 1,
// 1, −4), plus 9|T|∇λ_a·∇λ_b for a, b < 4, plus c_T|T| at the mean DOF;
// the mass entries are |T| Φ_aᵀ G² Φ_b (exact Gram matrix of degree 2).
//
// Mass bound: each local mass matrix is ≥ t_T I on the kept DOFs, t_T =
// |T|/4 for CR (the local matrix is |T|(9I − J)/20, J all ones, with
// eigenvalues 9|T|/20 and |T|/4, and so is every principal submatrix) and
// for ECR the t_T of massFloor (an interval Cholesky factorisation of
// M_T − t_T I). Summing, the exact global mass matrix M has xᵀMx ≥
// Σ_i x_i² Σ_(T ∋ i) t_T ≥ s |x|², s the least such sum (rounded down).
// Every member of mass differs from M entrywise by at most the entry's
// width, so its least eigenvalue is ≥ s − max_i Σ_j wid(mass_ij)
// (Gershgorin on the difference), which is mMin.
func (s *Projection) Matrices(v *Potential, gamma interval.I) (k, mass *sparse.ISym, mMin float64, err error) {
	if v == nil || v.mesh != s.mesh {
		panic("tet: potential is not on the space's mesh")
	}
	if s.n == 0 {
		return nil, nil, 0, errors.New("tet: the space is empty (every face mean is a Dirichlet value)")
	}
	m := s.mesh
	for t := range m.tets {
		r := v.Range(t).Add(gamma)
		if !(r.Lo >= 0) || !r.IsBounded() {
			return nil, nil, 0, &SignError{What: "V + γ", Tetrahedron: t, Vertices: m.Vertices(t), Range: r, Need: "≥ 0"}
		}
	}
	c := s.CRShift(v, gamma)
	kb, mb := sparse.NewIBuilder(s.n), sparse.NewIBuilder(s.n)
	diag := make([]float64, s.n)
	gram := tripleTable(4, 0, 2, 2).IV
	for t := range m.tets {
		g := m.Geom(t)
		d := s.localDofs(t)
		var tT float64
		if s.enriched {
			phi, ok := ecrBasis(m.Vertices(t))
			if !ok {
				return nil, nil, 0, fmt.Errorf("tet: ECR element mean on tetrahedron %d not verified invertible (degenerate enclosure)", t)
			}
			var esum interval.I
			for _, l := range g.EdgeLen {
				esum = esum.Add(l.Sqr())
			}
			rank := g.Volume.MulF(45).Div(esum)
			w := [5]float64{1, 1, 1, 1, -4}
			var mt [5][5]interval.I
			var tmp [10]interval.I
			for i := 0; i < 5; i++ {
				bernstein.ApplyI(tmp[:], gram, phi[i][:])
				for j := 0; j <= i; j++ {
					mt[i][j] = g.Volume.Mul(bernstein.DotI(phi[j][:], tmp[:]))
					mt[j][i] = mt[i][j]
					if d[i] < 0 || d[j] < 0 {
						continue
					}
					kij := rank.MulF(w[i] * w[j])
					if i < 4 {
						kij = kij.Add(g.Volume.Mul(dot(g.Grad[i], g.Grad[j])).MulF(9))
					}
					if i == 4 && j == 4 {
						kij = kij.Add(g.Volume.MulF(v.Range(t).Add(gamma).Lo))
					}
					kb.Add(d[i], d[j], kij)
					mb.Add(d[i], d[j], mt[i][j])
				}
			}
			if tT, ok = massFloor(mt, d); !ok {
				return nil, nil, 0, fmt.Errorf("tet: local ECR mass matrix of tetrahedron %d not verified positive definite", t)
			}
		} else {
			tT = interval.DivDown(g.Volume.Lo, 4)
			for i := 0; i < 4; i++ {
				if d[i] < 0 {
					continue
				}
				for j := 0; j <= i; j++ {
					if d[j] < 0 {
						continue
					}
					mij := g.Volume.DivF(-20)
					if i == j {
						mij = g.Volume.MulF(2).DivF(5)
					}
					kij := g.Volume.Mul(dot(g.Grad[i], g.Grad[j])).MulF(9).Add(mij.MulF(c))
					kb.Add(d[i], d[j], kij)
					mb.Add(d[i], d[j], mij)
				}
			}
		}
		for _, di := range d {
			if di >= 0 {
				diag[di] = interval.AddDown(diag[di], tT)
			}
		}
	}
	for _, r := range s.robin {
		if r.dof >= 0 {
			kb.Add(r.dof, r.dof, r.alpha.Mul(r.area))
		}
	}
	k, mass = kb.Build(), mb.Build()
	structured := math.Inf(1)
	for _, x := range diag {
		structured = math.Min(structured, x)
	}
	rows := make([]float64, s.n)
	cp, ri := mass.Pat.ColPtr(), mass.Pat.RowIdx()
	for j := 0; j < s.n; j++ {
		for q := cp[j]; q < cp[j+1]; q++ {
			i := int(ri[q])
			w := mass.Val[q].Wid()
			rows[j] = interval.AddUp(rows[j], w)
			if i != j {
				rows[i] = interval.AddUp(rows[i], w)
			}
		}
	}
	rowMax := 0.0
	for _, r := range rows {
		rowMax = math.Max(rowMax, r)
	}
	mMin = interval.SubDown(structured, rowMax)
	if !(mMin > 0) {
		return nil, nil, 0, fmt.Errorf("tet: mass matrix lower bound %g not positive (tetrahedra too small for float64)", mMin)
	}
	return k, mass, mMin, nil
}

// CRShift returns the constant c = max(0, min_T c_T) of the CR form of
// Matrices (c_T the lower end of Range_T(V) + γ), computed exactly as
// Matrices computes it; 0 for ECR, whose form has no such term.
func (s *Projection) CRShift(v *Potential, gamma interval.I) float64 {
	if s.enriched {
		return 0
	}
	c := math.Inf(1)
	for t := range s.mesh.tets {
		c = math.Min(c, v.Range(t).Add(gamma).Lo)
	}
	return math.Max(c, 0)
}

// ProjectionConstant returns an interval whose upper end is ≥ C_h =
// max_T C_T with, for CR,
//
//	C_T² = h_T²/π² + (Σ_(edges) ℓ²)/720 ≤ (1/π² + 1/120) h_T²,
//
// h_T the diameter of T (its longest edge) and ℓ its six edge lengths, the
// constant of ‖e‖_T ≤ C_T ‖∇e‖_T for every e ∈ H¹(T) with zero mean over
// each face of T, and for ECR C_T = h_T/π, the constant for e with zero
// mean over T (package doc, Projection lower bound, where both are
// derived from the Payne–Weinberger inequality).
func (s *Projection) ProjectionConstant() interval.I {
	best := interval.I{}
	invPi2 := interval.Pi().Sqr().Recip()
	for t := range s.mesh.tets {
		g := s.mesh.Geom(t)
		if s.enriched {
			best = best.Max(g.Diam.Div(interval.Pi()))
			continue
		}
		var sum interval.I
		for _, l := range g.EdgeLen {
			sum = sum.Add(l.Sqr())
		}
		c2 := g.Diam.Sqr().Mul(invPi2).Add(sum.DivF(720))
		c, _ := c2.Sqrt()
		best = best.Max(c)
	}
	return best
}

// massFloor chooses t just below the smallest eigenvalue of the midpoint
// of the local mass matrix restricted to the kept DOFs (floating point, a
// choice) and returns it once M_T − tI is verified positive definite for
// every member of the enclosure mt (interval Cholesky: every pivot
// interval > 0 implies every member has a Cholesky factorisation with
// positive pivots). It halves t up to 20 times before giving up.
func massFloor(mt [5][5]interval.I, d [5]int) (float64, bool) {
	var keep []int
	for i, di := range d {
		if di >= 0 {
			keep = append(keep, i)
		}
	}
	n := len(keep)
	if n == 0 {
		return 0, true
	}
	sym := mat.NewSymDense(n, nil)
	for a, i := range keep {
		for b, j := range keep[:a+1] {
			sym.SetSym(a, b, mt[i][j].Mid())
		}
	}
	var eig mat.EigenSym
	t := 0.0
	if eig.Factorize(sym, false) {
		t = 0.95 * eig.Values(nil)[0]
	}
	if !(t > 0) {
		return 0, false
	}
	for try := 0; try < 20; try, t = try+1, t/2 {
		if choleskyPositive(mt, keep, t) {
			return t, true
		}
	}
	return 0, false
}

// choleskyPositive reports whether the interval Cholesky (LDLᵀ form) of
// mt − tI on the indices keep has only pivots with positive lower ends.
func choleskyPositive(mt [5][5]interval.I, keep []int, t float64) bool {
	n := len(keep)
	var a [5][5]interval.I
	for x, i := range keep {
		for y, j := range keep {
			a[x][y] = mt[i][j]
		}
		a[x][x] = a[x][x].AddF(-t)
	}
	for c := 0; c < n; c++ {
		if !(a[c][c].Lo > 0) {
			return false
		}
		for r := c + 1; r < n; r++ {
			f := a[r][c].Div(a[c][c])
			for q := c + 1; q <= r; q++ {
				a[r][q] = a[r][q].Sub(f.Mul(a[c][q]))
				a[q][r] = a[r][q]
			}
		}
	}
	return true
}
