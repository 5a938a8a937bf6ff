package hypothesis

import (
	"fmt"

	"gapcert/certs"
	"gapcert/fem/claim/named"
	"gapcert/fem/problem"
	"gapcert/interval"
)

// ContinuousPotential decides whether V is continuous on the closed
// domain.
//
// Proven: every sub-expression of V is defined at every point of each
// closed cell of a finite cover of the closed domain. On an interval the
// cells are [A.Lo, B.Hi] ⊇ [a, b], bisected where the interval evaluation
// fails (at most maxIntervalCells evaluations); on a polygon they are the
// triangles of problem.Triangles, each evaluated by formula.RangeTriangle
// (which checks every domain on enclosures of the sub-expressions over
// the triangle itself, subdividing where needed); on a polyhedron they
// are the cone tetrahedra of problem.Polyhedron.Tetrahedra, each
// evaluated over its coordinate box and split into Bey's eight
// tetrahedra where that fails (at most maxSplits times, within
// maxSimplices evaluations). Package formula returns
// an error instead of clipping when a sub-expression is not defined on
// all of its argument enclosure, so a successful evaluation over a cell
// shows V to be a composition, defined at every point of the cell, of the
// operations of the formula grammar: + − × ÷, integer and real powers,
// exp, log, sin, cos, tan, atan, sinh, cosh, tanh, sqrt, abs, min, max,
// pow (fem/problem refuses interval constants in a potential). Each of
// these is continuous on its domain (common practice), so V is continuous
// on each cell, and a function continuous on each closed set of a finite
// closed cover is continuous on their union (the pasting lemma, common
// practice).
//
// Never disproven: a failed evaluation does not show a discontinuity.
// fem/problem refuses a potential it cannot enclose on the closed domain
// by the same kind of evaluation, so on a valid problem the verdict is
// proven unless the subdivision here stops first (undecided, naming the
// cell).
func ContinuousPotential(p *problem.Problem) certs.Hypothesis {
	h := certs.Hypothesis{Name: named.ContinuousPotential}
	if p.Dim == 1 {
		return continuousOnInterval(h, p)
	}
	if p.Polyhedron != nil {
		return continuousOnPolyhedron(h, p)
	}
	for k, s := range topSimplices(p) {
		t := [3][2]interval.I{{s[0][0], s[0][1]}, {s[1][0], s[1][1]}, {s[2][0], s[2][1]}}
		if _, err := p.Potential.RangeTriangle(t); err != nil {
			return undecidedAt(h, fmt.Sprintf("could not show V to be defined on all of triangle %d of the triangulation: %v", k, err))
		}
	}
	return proven(h, fmt.Sprintf("V is defined on each of the %d closed triangles covering the polygon, a composition of functions continuous on their domains", len(p.Triangles())))
}

func continuousOnInterval(h certs.Hypothesis, p *problem.Problem) certs.Hypothesis {
	queue := []cell{{lo: p.Interval[0].Val.Lo, hi: p.Interval[1].Val.Hi}} // ⊇ the closed domain
	evaluated := 0
	for len(queue) > 0 {
		c := queue[0]
		queue = queue[1:]
		evaluated++
		_, err := p.Potential.Eval(map[string]interval.I{"x": interval.New(c.lo, c.hi)})
		if err == nil {
			continue
		}
		m := c.lo/2 + c.hi/2 // a choice: any float strictly inside splits the cover
		if c.lo < m && m < c.hi && evaluated+len(queue)+2 <= maxIntervalCells {
			queue = append(queue, cell{lo: c.lo, hi: m}, cell{lo: m, hi: c.hi})
			continue
		}
		return undecidedAt(h, fmt.Sprintf("could not show V to be defined on all of [%g, %g]: %v", c.lo, c.hi, err))
	}
	return proven(h, fmt.Sprintf("V is defined on each of %d closed cells covering the interval, a composition of functions continuous on their domains", evaluated))
}

func continuousOnPolyhedron(h certs.Hypothesis, p *problem.Problem) certs.Hypothesis {
	var queue []cell
	for k, t := range topSimplices(p) {
		queue = append(queue, cell{simplex: t, top: k, depth: maxSplits})
	}
	evaluated := 0
	for len(queue) > 0 {
		c := queue[0]
		queue = queue[1:]
		evaluated++
		box := c.simplex.box()
		_, err := p.Potential.Eval(box)
		if err == nil {
			continue
		}
		if c.depth > 0 && evaluated+len(queue)+children(3) <= maxSimplices {
			for _, s := range c.simplex.split() {
				queue = append(queue, cell{simplex: s, top: c.top, depth: c.depth - 1})
			}
			continue
		}
		return undecidedAt(h, fmt.Sprintf("could not show V to be defined on all of a tetrahedron in cone tetrahedron %d (x ∈ %v, y ∈ %v, z ∈ %v): %v", c.top, box["x"], box["y"], box["z"], err))
	}
	return proven(h, fmt.Sprintf("V is defined on each of %d closed tetrahedra covering the polyhedron, a composition of functions continuous on their domains", evaluated))
}
