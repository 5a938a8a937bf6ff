package hypothesis

import (
	"fmt"

	"gapcert/certs"
	"gapcert/fem/boundary"
	"gapcert/fem/claim/named"
	"gapcert/fem/problem"
)

// RobinOrNeumannSides decides whether every side has a Robin or a Neumann
// condition, ∂u/∂n + α_i·u = 0 on side i, where, unlike RobinBoundary, the
// coefficients α_i ≥ 0 may differ from side to side (Neumann is α_i = 0).
// The witness of a failure is the first Dirichlet side. The decision is
// exact: it reads only the kinds of the conditions.
func RobinOrNeumannSides(p *problem.Problem) certs.Hypothesis {
	h := certs.Hypothesis{Name: named.RobinOrNeumannSides}
	for i, bc := range p.Boundary {
		if bc.Kind == boundary.Dirichlet {
			return disproven(h, fmt.Sprintf("%s %d has the Dirichlet condition", piece(p), i), &certs.Witness{Side: intPtr(i)})
		}
	}
	return proven(h, "every "+piece(p)+" has a Robin or a Neumann condition")
}
