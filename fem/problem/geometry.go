package problem

import (
	"fmt"
	"math/big"

	"gapcert/interval"
	"gapcert/interval/decimalio"
)

// This file holds the exact geometric predicates of the coarse polygon.
// Each predicate is decided exactly with big.Rat when every coordinate
// involved is rational, and otherwise from the interval enclosures of the
// coordinates, which decide a sign only when the enclosure of the
// determinant excludes 0 or is the point 0 (in both cases every exact
// value inside the enclosures has that sign). An undecided predicate is
// reported as such; it is never guessed.

// vertexAt returns the two coordinates of vertex i (indices mod n).
func vertexAt(v [][2]Number, i int) [2]Number {
	n := len(v)
	return v[((i%n)+n)%n]
}

func allRat(ps ...[2]Number) bool {
	for _, p := range ps {
		if p[0].Rat == nil || p[1].Rat == nil {
			return false
		}
	}
	return true
}

// Orient returns the sign of the cross product (b − a) × (c − a) (equal
// to (b − a) × (c − b), the turn at b): +1 if a, b, c turn
// counterclockwise, −1 clockwise, 0 collinear. It is exact when all
// coordinates are rational; otherwise ok reports whether the interval
// enclosure of the product decides the sign for every exact point.
func Orient(a, b, c [2]Number) (sign int, ok bool) {
	if allRat(a, b, c) {
		var u, v, w, z, s big.Rat
		u.Sub(b[0].Rat, a[0].Rat)
		v.Sub(c[1].Rat, a[1].Rat)
		w.Sub(b[1].Rat, a[1].Rat)
		z.Sub(c[0].Rat, a[0].Rat)
		u.Mul(&u, &v)
		w.Mul(&w, &z)
		s.Sub(&u, &w)
		return s.Sign(), true
	}
	d := b[0].Val.Sub(a[0].Val).Mul(c[1].Val.Sub(a[1].Val)).Sub(
		b[1].Val.Sub(a[1].Val).Mul(c[0].Val.Sub(a[0].Val)))
	return signOf(d)
}

// Dot returns the sign of (b − a)·(c − a), decided as in Orient.
func Dot(a, b, c [2]Number) (sign int, ok bool) {
	if allRat(a, b, c) {
		var u, v, w, z, s big.Rat
		u.Sub(b[0].Rat, a[0].Rat)
		v.Sub(c[0].Rat, a[0].Rat)
		w.Sub(b[1].Rat, a[1].Rat)
		z.Sub(c[1].Rat, a[1].Rat)
		u.Mul(&u, &v)
		w.Mul(&w, &z)
		s.Add(&u, &w)
		return s.Sign(), true
	}
	d := b[0].Val.Sub(a[0].Val).Mul(c[0].Val.Sub(a[0].Val)).Add(
		b[1].Val.Sub(a[1].Val).Mul(c[1].Val.Sub(a[1].Val)))
	return signOf(d)
}

// samePoint decides whether a and b are the same point.
func samePoint(a, b [2]Number) (same, ok bool) {
	cx, okx := cmpKnown(a[0], b[0])
	cy, oky := cmpKnown(a[1], b[1])
	if okx && cx != 0 || oky && cy != 0 {
		return false, true
	}
	if okx && oky {
		return true, true
	}
	return false, false
}

// onSegment decides, for p collinear with a and b, whether p lies on the
// closed segment [a, b]: (p − a)·(b − a) ≥ 0 and (p − b)·(a − b) ≥ 0.
func onSegment(a, b, p [2]Number) (on, ok bool) {
	s1, ok1 := Dot(a, b, p)
	s2, ok2 := Dot(b, a, p)
	if ok1 && s1 < 0 || ok2 && s2 < 0 {
		return false, true
	}
	if ok1 && ok2 {
		return true, true
	}
	return false, false
}

// segmentsIntersect decides whether the closed segments [p1, p2] and
// [p3, p4] have a point in common (the standard orientation test, e.g.
// Cormen, Leiserson, Rivest, Stein, Introduction to Algorithms, 3rd ed.,
// MIT Press 2009, §33.1).
func segmentsIntersect(p1, p2, p3, p4 [2]Number) (meet, ok bool) {
	d1, ok1 := Orient(p3, p4, p1)
	d2, ok2 := Orient(p3, p4, p2)
	d3, ok3 := Orient(p1, p2, p3)
	d4, ok4 := Orient(p1, p2, p4)
	// Both ends strictly on one side of the other segment's line: apart.
	if ok1 && ok2 && d1*d2 > 0 || ok3 && ok4 && d3*d4 > 0 {
		return false, true
	}
	if !(ok1 && ok2 && ok3 && ok4) {
		return false, false
	}
	if d1*d2 < 0 && d3*d4 < 0 {
		return true, true
	}
	// Some end lies on the other segment's line.
	undecided := false
	for _, c := range []struct {
		d       int
		a, b, p [2]Number
	}{{d1, p3, p4, p1}, {d2, p3, p4, p2}, {d3, p1, p2, p3}, {d4, p1, p2, p4}} {
		if c.d != 0 {
			continue
		}
		on, ok := onSegment(c.a, c.b, c.p)
		if ok && on {
			return true, true
		}
		undecided = undecided || !ok
	}
	return false, !undecided
}

const exactHint = "decimal or rational coordinates decide every such test exactly"

// polygon checks the vertices of p as written (at least three, no repeated
// or collinear consecutive vertices, simple), normalises the orientation to
// counterclockwise (reversing p.Boundary with the vertices when bcOK),
// decides convexity and triangulates. It reports defects and returns ok.
func (r *reader) polygon(p *Problem, bcOK bool) bool {
	return r.polygonAt(p, bcOK, "domain.polygon")
}

// polygonAt is polygon for the polygon at path (a JSON path of the file).
func (r *reader) polygonAt(p *Problem, bcOK bool, path string) bool {
	v := p.Vertices
	n := len(v)
	before := r.iss.count()
	repeated := make([]bool, n)
	for i := range n {
		same, ok := samePoint(v[i], vertexAt(v, i+1))
		switch {
		case !ok:
			r.iss.addf(fmt.Sprintf("%s[%d]", path, (i+1)%n), exactHint, "cannot decide whether vertices %d and %d coincide", i, (i+1)%n)
			repeated[i], repeated[(i+1)%n] = true, true
		case same:
			r.iss.addf(fmt.Sprintf("%s[%d]", path, (i+1)%n), "remove one of the two equal vertices", "repeated vertex: vertex %d equals vertex %d", (i+1)%n, i)
			repeated[i], repeated[(i+1)%n] = true, true
		}
	}
	turn := make([]int, n)
	for i := range n {
		if repeated[i] || repeated[(i+n-1)%n] || repeated[(i+1)%n] {
			continue
		}
		s, ok := Orient(vertexAt(v, i-1), v[i], vertexAt(v, i+1))
		switch {
		case !ok:
			r.iss.addf(fmt.Sprintf("%s[%d]", path, i), exactHint, "cannot decide whether vertex %d is collinear with its neighbours", i)
		case s == 0:
			r.iss.addf(fmt.Sprintf("%s[%d]", path, i), "remove the vertex: it lies on the line through its neighbours", "vertex %d is collinear with its neighbours (zero-area turn)", i)
		}
		turn[i] = s
	}
	if r.iss.count() > before {
		return false
	}
	for i := range n {
		for j := i + 2; j < n; j++ {
			if i == 0 && j == n-1 {
				continue // adjacent through vertex 0
			}
			meet, ok := segmentsIntersect(v[i], vertexAt(v, i+1), v[j], vertexAt(v, j+1))
			switch {
			case !ok:
				r.iss.addf(path, exactHint, "cannot decide whether edges %d and %d intersect; give exact coordinates", i, j)
			case meet:
				r.iss.addf(path, "the polygon must be simple: edges may meet only at their shared vertex", "edges %d and %d intersect (self-intersecting polygon)", i, j)
			}
		}
	}
	if r.iss.count() > before {
		return false
	}
	sa := signedArea2(v)
	s, ok := signOf(sa)
	if allRat(v...) {
		s, ok = signedArea2Rat(v).Sign(), true
	}
	if !ok || s == 0 {
		r.iss.add(path, "cannot decide the orientation of the polygon", exactHint)
		return false
	}
	if s < 0 {
		p.reversed = true
		w := make([][2]Number, n)
		t := make([]int, n)
		for k := range n {
			w[k] = v[(n-k)%n]
			t[k] = -turn[(n-k)%n]
		}
		p.Vertices, turn = w, t
		if bcOK {
			b := make([]BC, n)
			for k := range n {
				b[k] = p.Boundary[(2*n-1-k)%n]
			}
			p.Boundary = b
		}
	}
	p.convex = "convex"
	for _, t := range turn {
		if t < 0 {
			p.convex = "not convex"
		}
	}
	tri, ok := triangulate(p.Vertices)
	if !ok {
		r.iss.add(path, "cannot triangulate the polygon with the given coordinates", exactHint)
		return false
	}
	p.triangles = tri
	return true
}

// signedArea2 encloses twice the signed area Σ x_i y_{i+1} − x_{i+1} y_i.
func signedArea2(v [][2]Number) interval.I {
	var s interval.I
	for i := range v {
		a, b := v[i], vertexAt(v, i+1)
		s = s.Add(a[0].Val.Mul(b[1].Val).Sub(b[0].Val.Mul(a[1].Val)))
	}
	return s
}

// signedArea2Rat is signedArea2 in exact arithmetic (all vertices rational).
func signedArea2Rat(v [][2]Number) *big.Rat {
	s := new(big.Rat)
	var t, u big.Rat
	for i := range v {
		a, b := v[i], vertexAt(v, i+1)
		t.Mul(a[0].Rat, b[1].Rat)
		u.Mul(b[0].Rat, a[1].Rat)
		s.Add(s, t.Sub(&t, &u))
	}
	return s
}

// triangulate splits the simple counterclockwise polygon v into n − 2
// counterclockwise triangles by ear clipping (Meisters, Polygons have
// ears, Amer. Math. Monthly 82, 1975, 648–651: every simple polygon with
// n ≥ 4 vertices has an ear). A vertex is clipped only when its turn is
// decided strictly convex and every other remaining vertex is decided to
// lie strictly outside the closed ear triangle. ok is false if no ear can
// be decided.
func triangulate(v [][2]Number) (tri [][3]int, ok bool) {
	idx := make([]int, len(v))
	for i := range idx {
		idx[i] = i
	}
	for len(idx) > 3 {
		m := len(idx)
		found := false
		for k := 0; k < m && !found; k++ {
			a, b, c := idx[(k+m-1)%m], idx[k], idx[(k+1)%m]
			if s, ok := Orient(v[a], v[b], v[c]); !ok || s <= 0 {
				continue
			}
			ear := true
			for _, q := range idx {
				if q == a || q == b || q == c {
					continue
				}
				if !strictlyOutside(v[a], v[b], v[c], v[q]) {
					ear = false
					break
				}
			}
			if ear {
				tri = append(tri, [3]int{a, b, c})
				idx = append(idx[:k], idx[k+1:]...)
				found = true
			}
		}
		if !found {
			return nil, false
		}
	}
	if s, ok := Orient(v[idx[0]], v[idx[1]], v[idx[2]]); !ok || s <= 0 {
		return nil, false
	}
	return append(tri, [3]int{idx[0], idx[1], idx[2]}), true
}

// strictlyOutside reports that q is decided to lie outside the closed
// counterclockwise triangle abc (strictly right of one of its edges).
func strictlyOutside(a, b, c, q [2]Number) bool {
	for _, e := range [][2][2]Number{{a, b}, {b, c}, {c, a}} {
		if s, ok := Orient(e[0], e[1], q); ok && s < 0 {
			return true
		}
	}
	return false
}

// Reversed reports whether the file listed the polygon clockwise, so that
// Vertices and Boundary were reversed: Vertices[k] is the file's vertex
// (n − k) mod n and Boundary[k] is the file's boundary entry
// (n − 1 − k) mod n (the same edge, traversed the other way).
func (p *Problem) Reversed() bool { return p.reversed }

// Convex returns "convex" or "not convex" for a polygon or a polyhedron, decided exactly
// (or by intervals that decide every turn), and "undecided" otherwise. An
// interval is convex.
func (p *Problem) Convex() (verdict string) {
	if p.Polyhedron != nil {
		return p.Polyhedron.Convex()
	}
	if p.product != nil {
		return p.productConvex()
	}
	if p.Dim == 1 {
		return "convex"
	}
	if p.convex == "" {
		return "undecided"
	}
	return p.convex
}

// Triangles returns a triangulation of the polygon into len(Vertices) − 2
// counterclockwise triangles, as indices into Vertices, using no new
// vertices. It is nil for an interval. The caller must not modify it.
func (p *Problem) Triangles() [][3]int { return p.triangles }

// Area encloses the area of the polygon (the length of the interval).
func (p *Problem) Area() interval.I {
	if p.product != nil && p.Dim > 2 {
		panic("problem: Area of a product of 3 or 4 coordinates (Volume is its measure)")
	}
	if p.Dim == 1 {
		return p.length()
	}
	if allRat(p.Vertices...) {
		a := signedArea2Rat(p.Vertices)
		return decimalio.FromRat(a.Quo(a, big.NewRat(2, 1)))
	}
	return signedArea2(p.Vertices).Mul(interval.Point(0.5))
}

// Perimeter encloses the perimeter of the polygon (2 for an interval: the
// measure of its boundary, two points).
func (p *Problem) Perimeter() interval.I {
	if p.product != nil && p.Dim > 2 {
		panic("problem: Perimeter of a product of 3 or 4 coordinates (SurfaceArea is its boundary's measure)")
	}
	if p.Dim == 1 {
		return interval.Point(2)
	}
	var s interval.I
	for i := range p.Vertices {
		s = s.Add(distance(p.Vertices[i], vertexAt(p.Vertices, i+1)))
	}
	return s
}

// Diameter encloses the diameter of the domain: the largest distance
// between two vertices (which is the diameter of a polygon, since the
// distance is convex and so maximal at extreme points), or b − a.
func (p *Problem) Diameter() interval.I {
	if p.Polyhedron != nil {
		return p.Polyhedron.Diameter()
	}
	if p.product != nil {
		return p.productDiameter()
	}
	if p.Dim == 1 {
		return p.length()
	}
	v := p.Vertices
	if allRat(v...) {
		best := new(big.Rat)
		for i := range v {
			for j := i + 1; j < len(v); j++ {
				if d := dist2Rat(v[i], v[j]); d.Cmp(best) > 0 {
					best = d
				}
			}
		}
		d, _ := decimalio.FromRat(best).Sqrt()
		return d
	}
	var best interval.I
	for i := range v {
		for j := i + 1; j < len(v); j++ {
			best = best.Max(distance(v[i], v[j]))
		}
	}
	return best
}

func (p *Problem) length() interval.I {
	a, b := p.Interval[0], p.Interval[1]
	if a.Rat != nil && b.Rat != nil {
		return decimalio.FromRat(new(big.Rat).Sub(b.Rat, a.Rat))
	}
	return b.Val.Sub(a.Val)
}

func dist2Rat(a, b [2]Number) *big.Rat {
	var dx, dy big.Rat
	dx.Sub(a[0].Rat, b[0].Rat)
	dy.Sub(a[1].Rat, b[1].Rat)
	dx.Mul(&dx, &dx)
	dy.Mul(&dy, &dy)
	return dx.Add(&dx, &dy)
}

// distance encloses |a − b|, exactly rounded from the rational square when
// both points are rational.
func distance(a, b [2]Number) interval.I {
	var d2 interval.I
	if allRat(a, b) {
		d2 = decimalio.FromRat(dist2Rat(a, b))
	} else {
		d2 = a[0].Val.Sub(b[0].Val).Sqr().Add(a[1].Val.Sub(b[1].Val).Sqr())
	}
	d, _ := d2.Sqrt() // d2 ≥ 0
	return d
}
