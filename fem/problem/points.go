package problem

import (
	"fmt"
)

// maxPoints bounds the number of entries of "points".
const maxPoints = 1000

const pointsHint = `write "points": [["0.5"], ["1/3"]] on an interval, [["0.5", "0.25"]] on a polygon`

// points reads "points": a list of points of the closed domain, each a list
// of exact numbers (one per coordinate, written as the domain's are). Each
// point is decided to lie in the closed domain exactly (rationals) or by
// disjoint enclosures; a point outside, or one whose position the
// enclosures cannot settle (an irrational point on the boundary), is
// refused with its position. domainOK reports that the domain is valid
// (else the points are read but not placed).
func (r *reader) points(n *node, p *Problem, domainOK bool) {
	if n == nil {
		return
	}
	if n.kind != kindArray {
		r.iss.add("points", "points must be a list of points, not "+n.kind.String(), pointsHint)
		return
	}
	if p.product != nil {
		r.iss.add("points", "points are not available on product domains", "points give values of the ground state, which gapcert does not certify on products yet; remove \"points\"")
		return
	}
	if len(n.vals) > maxPoints {
		r.iss.addf("points", "ask for fewer points", "%d points, at most %d", len(n.vals), maxPoints)
		return
	}
	dim := p.Dim
	var list [][]Number
	ok := true
	for i, e := range n.vals {
		path := fmt.Sprintf("points[%d]", i)
		if e.kind != kindArray || (dim != 0 && len(e.vals) != dim) {
			want := "a point is a list of one number [x] on an interval"
			if dim == 2 {
				want = "a point is a list of two numbers [x, y] on a polygon"
			}
			if dim == 3 {
				want = "a point is a list of three numbers [x, y, z] in three dimensions"
			}
			r.iss.add(path, want, pointsHint)
			ok = false
			continue
		}
		var pt []Number
		good := true
		for j, c := range e.vals {
			v, g := r.number(c, fmt.Sprintf("%s[%d]", path, j), p.Params)
			good = good && g
			pt = append(pt, v)
		}
		if !good {
			ok = false
			continue
		}
		if domainOK {
			if msg, hint := placePoint(p, pt); msg != "" {
				r.iss.add(path, msg, hint)
				ok = false
				continue
			}
		}
		list = append(list, pt)
	}
	if ok {
		p.Points = list
	}
}

// placePoint decides that pt lies in the closed domain of p; it returns
// the defect and a hint otherwise. On an interval a ≤ x ≤ b is decided
// by cmpKnown, or by Equal for an end written as the point is (pi and pi). On a polygon pt lies in the closed polygon iff it lies in
// one closed triangle of its triangulation (the triangles tile the
// polygon), that is Orient(v_i, v_j, pt) ≥ 0 on the three edges of a
// counterclockwise triangle; it lies outside iff it lies strictly outside
// every triangle (Orient < 0 on some edge of each).
func placePoint(p *Problem, pt []Number) (msg, hint string) {
	const undecidedHint = "give the point with rational coordinates, or move it off the boundary"
	if p.Dim == 1 {
		ca, okA := cmpOrEqual(p.Interval[0], pt[0])
		cb, okB := cmpOrEqual(pt[0], p.Interval[1])
		switch {
		case okA && okB && ca <= 0 && cb <= 0:
			return "", ""
		case okA && ca > 0 || okB && cb > 0:
			return fmt.Sprintf("the point %s lies outside the interval [%s, %s]", pt[0].Text, p.Interval[0].Text, p.Interval[1].Text), "give a point of the closed domain"
		}
		return fmt.Sprintf("cannot decide whether the point %s lies in the interval", pt[0].Text), undecidedHint
	}
	if p.Polyhedron != nil {
		return p.Polyhedron.placePoint(pt)
	}
	q := [2]Number{pt[0], pt[1]}
	outside := true
	for _, t := range p.triangles {
		a, b, c := p.Vertices[t[0]], p.Vertices[t[1]], p.Vertices[t[2]]
		in := true
		for _, e := range [][2][2]Number{{a, b}, {b, c}, {c, a}} {
			s, ok := Orient(e[0], e[1], q)
			if !ok || s < 0 {
				in = false
			}
		}
		if in {
			return "", ""
		}
		if !strictlyOutside(a, b, c, q) {
			outside = false
		}
	}
	where := fmt.Sprintf("(%s, %s)", pt[0].Text, pt[1].Text)
	if outside {
		return "the point " + where + " lies outside the polygon", "give a point of the closed domain"
	}
	return "cannot decide whether the point " + where + " lies in the polygon", undecidedHint
}

// cmpOrEqual is cmpKnown, which also settles x = y when Equal does.
func cmpOrEqual(x, y Number) (c int, ok bool) {
	if c, ok := cmpKnown(x, y); ok {
		return c, true
	}
	if eq, decided := Equal(x, y); decided && eq {
		return 0, true
	}
	return 0, false
}
