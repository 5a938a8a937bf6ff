package line

import (
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
	return NewPotential(m, func(a, b interval.I, q int) ([]interval.I, interval.I, error) {
		mod, err := e.Model1(a, b, q)
		return mod.C, mod.R, err
	}, order)
}
