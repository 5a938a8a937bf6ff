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

	named.ContinuousPotential: ContinuousPotential, named.RobinOrNeumannSides: RobinOrNeumannSides,
	named.PositiveRobinAlpha: PositiveRobinAlpha,

	TangentialPolygon: Tangential, CircumsolidProduct: ProductOfCircumsolids,
}

// groundStateDeciders maps each hypothesis about the ground state itself
// to its decision procedure, which reads the certificate's own
// results.ground_state (nil when the certificate has none) instead of the
// problem.
var groundStateDeciders = map[string]func(*certs.GroundState) certs.Hypothesis{
	named.LogConcaveGroundState: LogConcaveGroundState,
}

// Decide returns the verdict on the hypothesis called name for p; ok is
// false if the name is unknown or names a hypothesis about the ground
// state (DecideCertified).
func Decide(name string, p *problem.Problem) (h certs.Hypothesis, ok bool) {
	if p.Polyhedron != nil {
		return decidePolyhedron(name, p)
	}
	f, ok := deciders[name]
	if !ok {
		return certs.Hypothesis{}, false
	}
	if p.Dim > 2 {
		if h, ok := decideProduct(name, p); ok {
			return h, true
		}
	}
	return f(p), true
}

// DecideCertified returns the verdict on the hypothesis called name for p,
// whose certificate has the ground-state block gs (nil if it has none): a
// hypothesis about the ground state is decided from gs, any other from p
// (Decide). ok is false if the name is unknown.
func DecideCertified(name string, p *problem.Problem, gs *certs.GroundState) (h certs.Hypothesis, ok bool) {
	if f, ok := groundStateDeciders[name]; ok {
		return f(gs), true
	}
	return Decide(name, p)
}
