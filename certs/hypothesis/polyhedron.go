package hypothesis

import (
	"fmt"

	"gapcert/certs"
	"gapcert/fem/claim/named"
	"gapcert/fem/problem"
)

// polyhedronDeciders are the decision procedures that apply to a
// polyhedron: those that read only the face conditions, convexity (exact,
// from fem/problem), the procedures on V (over the cone tetrahedra of the
// polyhedron, the three-dimensional cells of the polygon's triangles) and
// the product of circumsolids. The polygon shapes (triangle, rectangle,
// tangential polygon) are undecided, with that reason.
var polyhedronDeciders = map[string]func(*problem.Problem) certs.Hypothesis{
	named.DirichletBoundary:   DirichletBoundary,
	named.NeumannBoundary:     NeumannBoundary,
	named.RobinBoundary:       RobinBoundary,
	named.PositiveRobinAlpha:  PositiveRobinAlpha,
	named.RobinOrNeumannSides: RobinOrNeumannSides,
	named.ConvexDomain:        convexPolyhedron,
	named.ZeroPotential:       ZeroPotential,
	named.ConvexPotential:     ConvexPotential,
	named.ContinuousPotential: ContinuousPotential,
	CircumsolidProduct:        ProductOfCircumsolids,
	CircumsolidPolyhedron:     Circumsolid,
}

// decidePolyhedron is Decide on a polyhedron.
func decidePolyhedron(name string, p *problem.Problem) (certs.Hypothesis, bool) {
	if f, ok := polyhedronDeciders[name]; ok {
		return f(p), true
	}
	if _, ok := deciders[name]; !ok {
		return certs.Hypothesis{}, false
	}
	return undecidedAt(certs.Hypothesis{Name: name}, "a shape of polygons; the domain is a polyhedron"), true
}

// convexPolyhedron decides convexity of a polyhedron: it is convex if and
// only if every vertex lies on the closed inner side of every face's plane
// (the proof is in fem/problem, Polyhedron.Convex), each sign decided
// exactly or by enclosures. The witness of a failure is a vertex strictly
// outside a face's plane.
func convexPolyhedron(p *problem.Problem) certs.Hypothesis {
	h := certs.Hypothesis{Name: named.ConvexDomain}
	ph := p.Polyhedron
	switch ph.Convex() {
	case "convex":
		return proven(h, fmt.Sprintf("every vertex lies on the closed inner side of each of the %d face planes", len(ph.Faces)))
	case "not convex":
		v, f, _ := ph.ReentrantVertex()
		q := ph.Vertices[v]
		return disproven(h, fmt.Sprintf("vertex %d lies strictly outside the plane of face %d", v, f),
			&certs.Witness{Vertex: intPtr(v), Point: []string{q[0].Text, q[1].Text, q[2].Text}})
	}
	return undecidedAt(h, "cannot decide on which side of a face's plane some vertex lies")
}
