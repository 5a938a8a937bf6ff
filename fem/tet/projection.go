package tet

import (
	"errors"
	"fmt"
	"math"

	"gapcert/enclose/sparse"
	"gapcert/fem/boundary"
	"gapcert/interval"
)

// Projection is the Crouzeix–Raviart space CR on a tetrahedral mesh, the
// stage-A space of a projection lower bound (package doc, Projection
// lower bound): piecewise P1, continuous in the mean over every interior
// face, with the degrees of freedom the face means, Dirichlet face means
// removed (exactly 0). On a tetrahedron the basis function of the face
// opposite local vertex i is φ_i = 1 − 3λ_i: λ_i has mean 1/3 over each
// face containing vertex i (the mean of a barycentric coordinate over a
// triangle) and 0 on the face opposite it, so m_(F_j)(φ_i) = δ_ij.
//
// References:
//
//	M. Crouzeix, P.-A. Raviart, Conforming and nonconforming finite element
//	methods for solving the stationary Stokes equations I, RAIRO Anal.
//	Numér. 7 (1973) 33–75.
type Projection struct {
	mesh    *Mesh
	bc      []boundary.Condition
	n       int
	faceDof []int // DOF of each mesh face (−1: Dirichlet)
	robin   []projectionFace
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
func NewCR(m *Mesh, bc []boundary.Condition) *Projection {
	checkBC(m, bc)
	s := &Projection{mesh: m, bc: bc, faceDof: make([]int, len(m.faces))}
	dir := make([]bool, len(m.faces))
	for k, b := range m.bnd {
		if bc[b.Side].Essential() {
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
	for k, b := range m.bnd {
		c := bc[b.Side]
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

// Matrices returns interval matrices k and mass of the form a_h + c b and
// of b on the space, c = CRShift(v, gamma), with
//
//	a_h(u, v) = Σ_T (∇u, ∇v)_T + Σ_(F ⊂ Γ_R) α_F |F| m_F(u) m_F(v),
//
// and mMin, a positive lower bound of the least eigenvalue of every member
// of mass. It returns a *SignError when V + γ ≥ 0 is not verified on some
// tetrahedron (the theorem needs V + γ ≥ c ≥ 0).
//
// Entries, with φ_i = 1 − 3λ_i and ∫_T λ_i λ_j = |T|(1 + δ_ij)/20,
// ∫_T λ_i = |T|/4 (tables.go, integral):
//
//	(∇φ_i, ∇φ_j)_T = 9 |T| ∇λ_i·∇λ_j,   (φ_i, φ_j)_T = |T| (1 − 3/4 − 3/4 + 9(1 + δ_ij)/20) = |T| (2/5 if i = j, −1/20 else).
//
// Mass bound: the local mass matrix is |T|(9I − J)/20 (J all ones), with
// eigenvalues 9|T|/20 and |T|/4, so it is ≥ |T|/4 · I, and so is every
// principal submatrix (Dirichlet faces removed). Summing, the exact global
// mass matrix M has xᵀMx ≥ Σ_i x_i² Σ_(T ∋ i) |T|/4 ≥ s |x|², s the least
// such sum (from lower ends of the volume enclosures, rounded down). Every
// member of mass differs from M entrywise by at most the entry's width,
// so its least eigenvalue is ≥ s − max_i Σ_j wid(mass_ij) (Gershgorin on
// the difference), which is mMin.
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
	for t := range m.tets {
		g := m.geom[t]
		var d [4]int
		for i := range d {
			d[i] = s.faceDof[m.tetFaces[t][i]]
		}
		quarter := interval.DivDown(g.Volume.Lo, 4)
		for i := 0; i < 4; i++ {
			if d[i] < 0 {
				continue
			}
			diag[d[i]] = interval.AddDown(diag[d[i]], quarter)
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

// CRShift returns the constant c = max(0, min_T c_T) of the form of
// Matrices (c_T the lower end of Range_T(V) + γ), computed exactly as
// Matrices computes it.
func (s *Projection) CRShift(v *Potential, gamma interval.I) float64 {
	c := math.Inf(1)
	for t := range s.mesh.tets {
		c = math.Min(c, v.Range(t).Add(gamma).Lo)
	}
	return math.Max(c, 0)
}

// ProjectionConstant returns an interval whose upper end is ≥ C_h =
// max_T C_T with
//
//	C_T² = h_T²/π² + (Σ_(edges) ℓ²)/720 ≤ (1/π² + 1/120) h_T²,
//
// h_T the diameter of T (its longest edge) and ℓ its six edge lengths, the
// constant of ‖e‖_T ≤ C_T ‖∇e‖_T for every e ∈ H¹(T) with zero mean over
// each face of T (package doc, Projection lower bound, where it is
// derived from the Payne–Weinberger inequality).
func (s *Projection) ProjectionConstant() interval.I {
	best := interval.I{}
	invPi2 := interval.Pi().Sqr().Recip()
	for t := range s.mesh.tets {
		g := s.mesh.geom[t]
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
