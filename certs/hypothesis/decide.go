package hypothesis

import (
	"gapcert/certs"
	"gapcert/fem/claim/named"
	"gapcert/fem/problem"
)

// deciders maps each hypothesis name of package fem/claim/named to its
// decision procedure.
var deciders = map[string]func(*problem.Problem) certs.Hypothesis{
	named.DirichletBoundary: DirichletBoundary,
	named.NeumannBoundary:   NeumannBoundary,
	named.RobinBoundary:     RobinBoundary,
	named.ConvexDomain:      ConvexDomain,
	named.ConvexPotential:   ConvexPotential,
	named.ZeroPotential:     ZeroPotential,
	named.Triangle:          Triangle,
	named.Rectangle:         Rectangle,

	TangentialPolygon: Tangential, CircumsolidProduct: ProductOfCircumsolids,
}

// Decide returns the verdict on the hypothesis called name for p; ok is
// false if the name is unknown.
func Decide(name string, p *problem.Problem) (h certs.Hypothesis, ok bool) {
	f, ok := deciders[name]
	if !ok {
		return certs.Hypothesis{}, false
	}
	return f(p), true
}
