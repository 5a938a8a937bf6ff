package problem

import (
	"bytes"
	"fmt"
	"math/big"
	"strconv"

	"gapcert/interval"
	"gapcert/interval/algebraic"
	"gapcert/interval/decimalio"
	"gapcert/interval/formula"
)

// Convex returns "convex" or "not convex", decided exactly (or by
// intervals that decide every sign), and "undecided" otherwise (see
// convexity).
func (ph *Polyhedron) Convex() string { return ph.convex }

// ReentrantVertex returns, when Convex is "not convex", a vertex that lies
// strictly on the outer side of the plane of a face (the witness of
// non-convexity), and ok = true.
func (ph *Polyhedron) ReentrantVertex() (vertex, face int, ok bool) {
	return ph.outside[0], ph.outside[1], ph.convex == "not convex"
}

// Volume encloses the volume: a sixth of Σ det(a − o, b − o, c − o) over
// the outward triangles (a, b, c) of the faces, o the first vertex (the
// divergence theorem applied to the field (x − o)/3, whose divergence is
// 1). The sum is exact for surd coordinates.
func (ph *Polyhedron) Volume() interval.I {
	s := ph.volume6()
	if r, ok := s.rat(); ok {
		return decimalio.FromRat(r.Quo(r, big.NewRat(6, 1)))
	}
	return s.enclose().Div(interval.Point(6))
}

func (ph *Polyhedron) volume6() xnum {
	o := ph.pts[0]
	var s xnum
	for _, t := range ph.triangles {
		p := ph.pts
		s = s.add(p[t[0]].sub(o).cross(p[t[1]].sub(o)).dot(p[t[2]].sub(o)))
	}
	return s
}

// SurfaceArea encloses the area of the boundary: Σ_f |A_f|/2 over the
// faces, A_f = Σ (b − a) × (c − a) over the face's triangles (the area
// vectors of coplanar triangles with one orientation add; |A_f|² is exact
// for surd coordinates).
func (ph *Polyhedron) SurfaceArea() interval.I {
	a := make([]vec3, len(ph.Faces))
	for k, t := range ph.triangles {
		p := ph.pts
		f := ph.triFace[k]
		a[f] = a[f].add(p[t[1]].sub(p[t[0]]).cross(p[t[2]].sub(p[t[0]])))
	}
	var s interval.I
	for _, v := range a {
		l, _ := v.dot(v).enclose().Sqrt() // a sum of squares
		s = s.Add(l)
	}
	return s.MulF(0.5)
}

// Diameter encloses the diameter: the largest distance between two
// vertices (the distance is convex, so its maximum over the solid, which
// lies in the convex hull of the vertices, is attained at vertices).
func (ph *Polyhedron) Diameter() interval.I {
	var best interval.I
	for i := range ph.pts {
		for j := i + 1; j < len(ph.pts); j++ {
			d := ph.pts[i].sub(ph.pts[j])
			best = best.Max(d.dot(d).enclose())
		}
	}
	r, _ := best.Sqrt()
	return r
}

// Triangles returns the outward triangles of the faces' triangulations
// (as vertex indices; counterclockwise seen from outside), and
// TriangleFaces the face of each. The caller must not modify them.
func (ph *Polyhedron) Triangles() [][3]int { return ph.triangles }

// TriangleFaces returns the face index of each of Triangles.
func (ph *Polyhedron) TriangleFaces() []int { return ph.triFace }

// Nodes returns enclosures of the vertices followed by the apex, an exact
// point strictly on the inner side of every face's plane (chosen among a
// few exact candidates, see findApex).
func (ph *Polyhedron) Nodes() [][3]interval.I {
	out := make([][3]interval.I, 0, len(ph.pts)+1)
	for _, v := range ph.Vertices {
		out = append(out, [3]interval.I{v[0].Val, v[1].Val, v[2].Val})
	}
	return append(out, ph.apex.enclose())
}

// Tetrahedra returns the cone tetrahedra (c, a, b, d) over the outward
// triangles (a, b, d), with c the apex (node len(Vertices) of Nodes).
// Every one is positively oriented: det(a − c, b − c, d − c) > 0 is
// decided for the exact points. Since the surface is embedded, closed and
// outward, they tile the polyhedron (the proof is fem/mesh3's
// FromPolyhedron, which checks the orientation and the face matching
// again on the enclosures).
func (ph *Polyhedron) Tetrahedra() [][4]int {
	c := len(ph.Vertices)
	out := make([][4]int, len(ph.triangles))
	for k, t := range ph.triangles {
		out[k] = [4]int{c, t[0], t[1], t[2]}
	}
	return out
}

// potentialRange encloses the range of V over the closed polyhedron as
// the hull of V over the coordinate boxes of the cone tetrahedra, which
// cover it (each box holds its tetrahedron).
func (ph *Polyhedron) potentialRange(v *formula.Expr) (interval.I, string) {
	nodes := ph.Nodes()
	var rng interval.I
	for k, t := range ph.Tetrahedra() {
		var box [3]interval.I
		for j, n := range t {
			for c := range 3 {
				if j == 0 {
					box[c] = nodes[n][c]
				} else {
					box[c] = box[c].Hull(nodes[n][c])
				}
			}
		}
		r, err := v.Eval(map[string]interval.I{"x": box[0], "y": box[1], "z": box[2]})
		where := fmt.Sprintf(" on the box [%g, %g]×[%g, %g]×[%g, %g]", box[0].Lo, box[0].Hi, box[1].Lo, box[1].Hi, box[2].Lo, box[2].Hi)
		if err != nil {
			return interval.I{}, "the potential may be undefined" + where + ": " + evalReason(err)
		}
		if msg := unbounded(r); msg != "" {
			return interval.I{}, msg + where
		}
		if k == 0 {
			rng = r
		} else {
			rng = rng.Hull(r)
		}
	}
	return rng, ""
}

// placePoint decides that pt lies in the closed polyhedron: it does iff it
// lies in one closed cone tetrahedron (they tile it), that is, replacing
// any one vertex of the positively oriented tetrahedron by pt leaves the
// orientation ≥ 0; it lies outside iff in each tetrahedron some such
// orientation is < 0.
func (ph *Polyhedron) placePoint(pt []Number) (msg, hint string) {
	pts, apex := ph.pts, ph.apex
	var q vec3
	exact := pts[0][0].kind == surd
	if exact {
		sq, ok := readExact([][3]Number{{pt[0], pt[1], pt[2]}}, algebraic.NewSurd, algebraic.ReadSurd)
		exact = ok
		for k := range 3 {
			if ok {
				q[k] = xnum{kind: surd, s: sq[0][k]}
			}
		}
	}
	if !exact {
		inexact := func(a vec3) vec3 {
			e := a.enclose()
			return vec3{{v: e[0]}, {v: e[1]}, {v: e[2]}}
		}
		q = vec3{{v: pt[0].Val}, {v: pt[1].Val}, {v: pt[2].Val}}
		pts = make([]vec3, len(ph.pts))
		for i, v := range ph.pts {
			pts[i] = inexact(v)
		}
		apex = inexact(apex)
	}
	outside := true
	for _, t := range ph.triangles {
		v := [4]vec3{apex, pts[t[0]], pts[t[1]], pts[t[2]]}
		in, out := true, false
		for i := range 4 {
			w := v
			w[i] = q
			s, ok := orient3(w[0], w[1], w[2], w[3])
			in = in && ok && s >= 0
			out = out || ok && s < 0
		}
		if in {
			return "", ""
		}
		outside = outside && out
	}
	where := fmt.Sprintf("(%s, %s, %s)", pt[0].Text, pt[1].Text, pt[2].Text)
	if outside {
		return "the point " + where + " lies outside the polyhedron", "give a point of the closed domain"
	}
	return "cannot decide whether the point " + where + " lies in the polyhedron", "give the point with rational coordinates, or move it off the boundary"
}

// writeCanonical writes "polyhedron":{"faces":[…],"vertices":[…]} with
// the faces outward.
func (ph *Polyhedron) writeCanonical(b *bytes.Buffer) {
	b.WriteString(`"polyhedron":{"faces":[`)
	for i, f := range ph.Faces {
		if i > 0 {
			b.WriteByte(',')
		}
		b.WriteByte('[')
		for j, k := range f {
			if j > 0 {
				b.WriteByte(',')
			}
			b.WriteString(strconv.Itoa(k))
		}
		b.WriteByte(']')
	}
	b.WriteString(`],"vertices":[`)
	for i, v := range ph.Vertices {
		if i > 0 {
			b.WriteByte(',')
		}
		b.WriteByte('[')
		for k := range 3 {
			if k > 0 {
				b.WriteByte(',')
			}
			writeString(b, v[k].Text)
		}
		b.WriteByte(']')
	}
	b.WriteString(`]}`)
}
