package line

import (
	"errors"

	"gapcert/interval"
	"gapcert/interval/formula"
)

// FromExpr returns the Potential of the expression e (free variable x only;
// parameters bound) on m, from its Taylor models of the given order
// (formula.Expr.Model1, whose contract is that of ModelFunc; order ≥ 1).
func FromExpr(m *Mesh, e *formula.Expr, order int) (*Potential, error) {
	if order < 1 {
		order = 1
	}
	v, err := NewPotential(m, func(a, b interval.I, q int) ([]interval.I, interval.I, error) {
		mod, err := e.Model1(a, b, q)
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
