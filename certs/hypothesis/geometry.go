package hypothesis

import (
	"fmt"

	"gapcert/certs"
	"gapcert/fem/claim/named"
	"gapcert/fem/problem"
)

// ConvexDomain decides whether the domain is convex. An interval is. A
// polygon (counterclockwise, as stored by fem/problem) is convex if and
// only if every turn t_i = (v_i − v_{i−1}) × (v_{i+1} − v_i) is ≥ 0; each
// sign is decided in exact rational arithmetic when the three vertices are
// rational, else by the interval enclosure of t_i. The witness of a
// failure is the first re-entrant vertex (t_i verified < 0) with its
// coordinates.
func ConvexDomain(p *problem.Problem) certs.Hypothesis {
	h := certs.Hypothesis{Name: named.ConvexDomain}
	if p.Dim == 1 {
		return proven(h, "an interval is convex")
	}
	v := p.Vertices
	n := len(v)
	undecided := -1
	for i := range n {
		s, ok := problem.Orient(v[(i+n-1)%n], v[i], v[(i+1)%n]) // the turn at v_i
		switch {
		case ok && s < 0:
			return disproven(h, fmt.Sprintf("vertex %d (%s, %s) is re-entrant: the boundary turns clockwise there", i, v[i][0].Text, v[i][1].Text),
				&certs.Witness{Vertex: intPtr(i), Point: []string{v[i][0].Text, v[i][1].Text}})
		case !ok && undecided < 0:
			undecided = i
		}
	}
	if undecided >= 0 {
		return undecidedAt(h, fmt.Sprintf("cannot decide the sign of the turn at vertex %d", undecided))
	}
	return proven(h, fmt.Sprintf("every turn of the %d vertices is counterclockwise", n))
}

// Triangle decides whether the domain is a triangle: a polygon with three
// vertices. fem/problem rejects collinear consecutive vertices, so a
// polygon with more vertices has more corners; the witness is vertex 3.
func Triangle(p *problem.Problem) certs.Hypothesis {
	h := certs.Hypothesis{Name: named.Triangle}
	switch {
	case p.Dim == 1:
		return undecidedAt(h, "the domain is an interval, not a polygon")
	case len(p.Vertices) == 3:
		return proven(h, "the polygon has three vertices")
	}
	return disproven(h, fmt.Sprintf("the polygon has %d corners (no three consecutive vertices are collinear)", len(p.Vertices)),
		&certs.Witness{Vertex: intPtr(3), Point: []string{p.Vertices[3][0].Text, p.Vertices[3][1].Text}})
}

// Rectangle decides whether the domain is a rectangle: a polygon with four
// vertices whose every corner is a right angle, (v_i − v_{i−1})·(v_{i+1} −
// v_i) = 0, decided exactly for rational vertices or when the enclosure is
// the point 0. The witness of a failure is a corner verified not to be a
// right angle (or vertex 4 of a polygon with more than four corners).
func Rectangle(p *problem.Problem) certs.Hypothesis {
	h := certs.Hypothesis{Name: named.Rectangle}
	if p.Dim == 1 {
		return undecidedAt(h, "the domain is an interval, not a polygon")
	}
	v := p.Vertices
	n := len(v)
	if n > 4 {
		return disproven(h, fmt.Sprintf("the polygon has %d corners (no three consecutive vertices are collinear)", n),
			&certs.Witness{Vertex: intPtr(4), Point: []string{v[4][0].Text, v[4][1].Text}})
	}
	undecided := -1
	for i := range n {
		s, ok := problem.Dot(v[i], v[(i+n-1)%n], v[(i+1)%n]) // zero iff the corner at v_i is right
		switch {
		case ok && s != 0:
			return disproven(h, fmt.Sprintf("the corner at vertex %d is not a right angle", i),
				&certs.Witness{Vertex: intPtr(i), Point: []string{v[i][0].Text, v[i][1].Text}})
		case !ok && undecided < 0:
			undecided = i
		}
	}
	switch {
	case undecided >= 0:
		return undecidedAt(h, fmt.Sprintf("cannot decide whether the corner at vertex %d is a right angle", undecided))
	case n != 4:
		// A triangle has at most one right angle, so this is not reached
		// for a valid polygon; it is answered, not assumed.
		return undecidedAt(h, fmt.Sprintf("the polygon has %d vertices", n))
	}
	return proven(h, "four vertices, every corner a right angle")
}
