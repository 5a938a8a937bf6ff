package tri

import (
	"gapcert/enclose/sparse"
	"gapcert/fem/boundary"
	"gapcert/fem/internal/bernstein"
	"gapcert/fem/internal/ritz"
	"gapcert/fem/mesh"
	"gapcert/interval"
)

// The side conditions in the 2D spaces (package fem/boundary): the spaces
// remove their degrees of freedom on essential sides (Lagrange: every
// domain point of the edge; CR/ECR: the edge mean) and, for the fluxes, on
// sides where Condition.FluxFree is false; the natural sides with a term
// add α ∫_e u v (Lagrange, CR/ECR) and the flux norm adds ∫_e (σ·n)²/α on
// sides with α verified > 0. The constructors ask only the Condition
// methods; every boundary term is assembled in this file.

// checkBC panics unless bc holds one valid condition per polygon side of m.
func checkBC(m *mesh.Mesh, bc []boundary.Condition) {
	if len(bc) != m.NumCorners() {
		panic("tri: one boundary condition per polygon side required")
	}
	for _, c := range bc {
		c.Check()
	}
}

// sideEdge is a boundary edge: local edge i (opposite local vertex i) of
// triangle t, with the coefficient α of its side's term and its length.
type sideEdge struct {
	t, i   int
	alpha  interval.I
	length interval.I
}

// termEdges returns the boundary edges of m, in the order of m.Bnd, whose
// side condition satisfies keep, each found in its (counterclockwise)
// triangle, with α = WeakAlpha of the side (keep must reject essential
// sides).
func termEdges(m *mesh.Mesh, bc []boundary.Condition, keep func(boundary.Condition) bool) []sideEdge {
	var out []sideEdge
	owners := m.BoundaryOwners()
	for k, be := range m.Bnd {
		c := bc[be.Side]
		if !keep(c) {
			continue
		}
		t, i := owners[k][0], owners[k][1]
		out = append(out, sideEdge{t: t, i: i, alpha: c.WeakAlpha(), length: m.Geom(t).EdgeLen[i]})
	}
	return out
}

// robinEdge is a boundary edge on a side with a term, for the Lagrange
// space: the global DOFs of the domain points along the edge from A to B
// (−1: removed).
type robinEdge struct {
	dofs   []int
	alpha  interval.I
	length interval.I
}

// edgeTerms adds α ∫_e u_i u_j = α |e| d_iᵀ G_e d_j (d_i the univariate
// Bernstein coefficients of u_i along e, exact floats; G_e the exact edge
// Gram matrix) for every edge with a term to a.
func (s *Lagrange) edgeTerms(a *ritz.Accumulator, vecs [][]float64) {
	nv := len(vecs)
	ge := s.ref.edgeGram.IV
	p1 := s.p + 1
	di := make([][]float64, nv)
	for i := range di {
		di[i] = make([]float64, p1)
	}
	gd := make([]interval.I, p1)
	for _, re := range s.robin {
		for i := 0; i < nv; i++ {
			for k, g := range re.dofs {
				di[i][k] = 0
				if g >= 0 {
					di[i][k] = vecs[i][g]
				}
			}
		}
		scale := re.alpha.Mul(re.length)
		for i := 0; i < nv; i++ {
			bernstein.ApplyF(gd, ge, di[i])
			for j := 0; j <= i; j++ {
				a.Add(i, j, scale.Mul(bernstein.DotF(di[j], gd)))
			}
		}
	}
}

// edgeTermsApprox adds the edge terms to kb in floating point (midpoints;
// a choice).
func (s *Lagrange) edgeTermsApprox(kb *sparse.Builder) {
	ge := s.ref.edgeGram.FL
	p1 := s.p + 1
	for _, re := range s.robin {
		sc := re.alpha.Mid() * re.length.Mid()
		for a := 0; a < p1; a++ {
			if re.dofs[a] < 0 {
				continue
			}
			for b := 0; b <= a; b++ {
				if re.dofs[b] < 0 {
					continue
				}
				kb.Add(re.dofs[a], re.dofs[b], sc*ge[a*p1+b])
			}
		}
	}
}

// projectionEdge is a boundary edge on a side with a term, for the CR/ECR
// spaces: the DOF of its edge mean (−1: removed).
type projectionEdge struct {
	dof    int
	alpha  interval.I
	length interval.I
}

// edgeTerms adds α |e| ⊇ the coefficient of m_e(u) m_e(v) in the form of
// the projection spaces to kb (see Matrices).
func (s *Projection) edgeTerms(kb *sparse.IBuilder) {
	for _, r := range s.robin {
		if r.dof >= 0 {
			kb.Add(r.dof, r.dof, r.alpha.Mul(r.length))
		}
	}
}

// edgeTerms adds ⊇ ∫_e (σ_i·n)(σ_j·n)/α for every edge with α > 0 to acc;
// x holds one buffer of local coefficients per flux.
func (f *Flux) edgeTerms(acc *ritz.Accumulator, flux [][]float64, x [][]float64) {
	ref, k, nv := f.ref, f.k, len(flux)
	ge := edgeGramTable(k).IV
	gi := make([][]interval.I, nv)
	for i := range gi {
		gi[i] = make([]interval.I, k+1)
	}
	for _, re := range f.robin {
		// g = edgeScale · (local edge DOFs): the stored basis is scaled.
		scale := re.alpha.Mul(re.length).Recip().MulF(ref.edgeScale * ref.edgeScale)
		for i := 0; i < nv; i++ {
			f.local(x[i], flux[i], re.t)
			bernstein.ApplyF(gi[i], ge, x[i][re.i*(k+1):(re.i+1)*(k+1)])
		}
		for i := 0; i < nv; i++ {
			for j := 0; j <= i; j++ {
				acc.Add(i, j, scale.Mul(bernstein.DotF(x[j][re.i*(k+1):(re.i+1)*(k+1)], gi[i])))
			}
		}
	}
}

// edgeTermsApprox adds the edge terms of the flux norm to b in floating
// point (midpoints; a choice).
func (f *Flux) edgeTermsApprox(b *sparse.Builder) {
	k := f.k
	ge := edgeGramTable(k).FL
	for _, rb := range f.robin {
		sc := f.ref.edgeScale * f.ref.edgeScale / (rb.alpha.Mid() * rb.length.Mid())
		d, sg := f.dofs[rb.t], f.sign[rb.t]
		for a := 0; a <= k; a++ {
			la := rb.i*(k+1) + a
			for c := 0; c <= a; c++ {
				lc := rb.i*(k+1) + c
				if d[la] >= 0 && d[lc] >= 0 {
					b.Add(d[la], d[lc], sg[la]*sg[lc]*sc*ge[a*(k+1)+c])
				}
			}
		}
	}
}
