package line

import (
	"errors"

	"gapcert/interval"
	"gapcert/interval/formula"
)

// FromExpr returns the Potential of the expression e (free variable x only;
// parameters bound) on m, from its Taylor models of the given order
// (formula.Expr.Model1, whose contract is that of ModelFunc; order ≥ 1).
//
// A kink of abs, min or max at a node is no obstacle (Model1 takes the
// branch that equals e on the closed cell). On a cell with a kink inside
// (Model1 fails with a *formula.SmoothnessError) the cell gets the range
// model: e ∈ m + (r − m) on the cell, r the interval evaluation of e over
// the cell's hull and m the float nearest its midpoint, valid for any e
// with a bounded range there (its remainder is O(h) times the Lipschitz
// constant, against O(h^(q+1)) for a Taylor model). Meshes with a node at
// each kink avoid it.
func FromExpr(m *Mesh, e *formula.Expr, order int) (*Potential, error) {
	if order < 1 {
		order = 1
	}
	v, err := NewPotential(m, func(a, b interval.I, q int) ([]interval.I, interval.I, error) {
		mod, err := e.Model1(a, b, q)
		var kink *formula.SmoothnessError
		if err != nil && errors.As(err, &kink) {
			if r, rerr := e.Eval(map[string]interval.I{"x": a.Hull(b)}); rerr == nil && r.IsBounded() {
				mid := interval.Point(r.Mid())
				return []interval.I{mid}, r.Sub(mid), nil
			}
		}
		return mod.C, mod.R, err
	}, order)
	if err != nil {
		return nil, err
	}
	v.expr, v.order = e, order
	return v, nil
}

// InverseShiftedExpr is InverseShifted for a Potential made by FromExpr,
// with the models of w = 1/(V + γ) taken from the Taylor models of the
// expression formula.Div(1, V + γ) instead (often tighter for smooth V far
// from a zero of V + γ; the caller may try both). It returns a *SignError
// unless V + γ > 0 is verified on every cell, and an error if v was not
// made by FromExpr.
func (v *Potential) InverseShiftedExpr(gamma interval.I, order int) (*Potential, error) {
	if v.expr == nil {
		return nil, errors.New("line: InverseShiftedExpr needs a Potential made by FromExpr")
	}
	m := v.mesh
	for k := 0; k < m.Cells(); k++ {
		if g := v.rng[k].Add(gamma); !(g.Lo > 0) || !g.IsBounded() {
			return nil, &SignError{What: "V + γ", Cell: k, Cell0: m.Nodes[k], Cell1: m.Nodes[k+1], Range: g, Need: "> 0"}
		}
	}
	we := formula.Div(formula.Const(interval.I{Lo: 1, Hi: 1}), formula.Add(v.expr, formula.Const(gamma)))
	w, err := FromExpr(m, we, order)
	if err != nil {
		return nil, err
	}
	w.inverseOf, w.shift = v, gamma
	return w, nil
}
