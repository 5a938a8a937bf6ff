package line

import (
	"gapcert/enclose/band"
	"gapcert/fem/boundary"
	"gapcert/fem/internal/ritz"
)

// Everything the 1D spaces do with the end conditions is in this file
// (package fem/boundary: Dirichlet ends are essential, natural ends add
// α u(e)v(e) to the form with α = 0 for Neumann, and a flux is free at an
// end exactly when Condition.FluxFree).

// ends holds the conditions at the left and right end.
type ends struct {
	left, right boundary.Condition
}

// newEnds checks both conditions (boundary.Condition.Check panics on
// misuse) and returns them.
func newEnds(left, right boundary.Condition) ends {
	left.Check()
	right.Check()
	return ends{left: left, right: right}
}

// endCondition is the condition at one end.
type endCondition struct {
	side Side
	c    boundary.Condition
}

// both returns the left and the right end, in this order.
func (e ends) both() [2]endCondition {
	return [2]endCondition{{Left, e.left}, {Right, e.right}}
}

// endDof returns the global index of the vertex function at the end side,
// −1 if it is removed.
func (s *space) endDof(side Side) int {
	if side == Left {
		return s.dof(0, 0)
	}
	return s.dof(s.mesh.Cells()-1, s.p)
}

// endTermsApprox adds α u(e)v(e) at the natural ends to k (midpoints; a
// choice).
func (s *Lagrange) endTermsApprox(k *band.Sym) {
	for _, e := range s.ends.both() {
		if e.c.Essential() {
			continue
		}
		g := s.endDof(e.side)
		k.Add(g, g, e.c.WeakAlpha().Mid())
	}
}

// endTerms adds α u_i(e)u_j(e) ⊇ the natural end terms of a(u_i, u_j) to
// a, from the exact end values of the vecs.
func (s *Lagrange) endTerms(a *ritz.Accumulator, vecs [][]float64) {
	for _, e := range s.ends.both() {
		if e.c.Essential() {
			continue
		}
		alpha := e.c.WeakAlpha()
		for i := range vecs {
			ui := s.endValue(vecs[i], e.side)
			for j := 0; j <= i; j++ {
				uj := s.endValue(vecs[j], e.side)
				a.Add(i, j, alpha.MulF(ui).MulF(uj))
			}
		}
	}
}

// fluxConstrained reports whether a flux must vanish at an end with
// condition c.
func fluxConstrained(c boundary.Condition) bool { return !c.FluxFree() }

// endTerms adds σ_i(e)σ_j(e)/α ⊇ the end terms of ‖w‖²_X at the ends with
// α verified > 0 to a, from the exact end values of the fluxes.
func (f *Flux) endTerms(a *ritz.Accumulator, flux [][]float64) {
	for _, e := range f.ends.both() {
		if !e.c.AlphaPositive() {
			continue
		}
		inv := e.c.WeakAlpha().Recip()
		for i := range flux {
			si := f.endValue(flux[i], e.side)
			for j := 0; j <= i; j++ {
				a.Add(i, j, inv.MulF(si).MulF(f.endValue(flux[j], e.side)))
			}
		}
	}
}

// endTermsApprox adds σ(e)τ(e)/α at the ends with α verified > 0 to g
// (midpoints; a choice).
func (f *Flux) endTermsApprox(g *band.Sym) {
	for _, e := range f.ends.both() {
		if !e.c.AlphaPositive() {
			continue
		}
		gi := f.endDof(e.side)
		g.Add(gi, gi, 1/e.c.WeakAlpha().Mid())
	}
}

// endRemoved reports whether the nodal value at node k of the MeanP2
// space is removed (a Dirichlet end).
func (s *MeanP2) endRemoved(k int) bool {
	return (k == 0 && s.ends.left.Essential()) || (k == s.mesh.Cells() && s.ends.right.Essential())
}

// endTerms adds α ⊇ the coefficient of u(e)v(e) at the natural ends to k.
func (s *MeanP2) endTerms(k *band.ISym) {
	for _, e := range s.ends.both() {
		if e.c.Essential() {
			continue
		}
		g := 0
		if e.side == Right {
			g = s.NodeDof(s.mesh.Cells())
		}
		k.Add(g, g, e.c.WeakAlpha())
	}
}
