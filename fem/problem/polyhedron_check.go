package problem

import (
	"fmt"
	"math/big"
	"slices"
	"sort"
)

// This file validates a polyhedron read by polyhedron (polyhedron.go) and
// builds what the rest of the package needs from it: the outward
// orientation, the triangles of the faces and the apex of the cone
// tetrahedra. Every predicate is decided exactly (surds) or by intervals
// that decide it for every exact point (polyhedron_exact.go).

const polyExactHint = "rational coordinates, or square roots of rationals, decide every such test exactly"

// vec2 is a point of a face projected to a coordinate plane.
type vec2 [2]xnum

// orient2 returns the sign of (b − a) × (c − a).
func orient2(a, b, c vec2) (int, bool) {
	f := func(a, b, c vec2) xnum {
		return b[0].sub(a[0]).mul(c[1].sub(a[1])).sub(b[1].sub(a[1]).mul(c[0].sub(a[0])))
	}
	if s, ok := filtered2(f, a, b, c); ok {
		return s, true
	}
	return f(a, b, c).sign()
}

// filtered2 is filtered for points of a plane.
func filtered2(f func(a, b, c vec2) xnum, a, b, c vec2) (int, bool) {
	s, ok := filtered(func(a, b, c, _ vec3) xnum { return f(vec2{a[0], a[1]}, vec2{b[0], b[1]}, vec2{c[0], c[1]}) },
		vec3{a[0], a[1], a[1]}, vec3{b[0], b[1], b[1]}, vec3{c[0], c[1], c[1]})
	return s, ok
}

// dot2 returns the sign of (b − a)·(c − a).
func dot2(a, b, c vec2) (int, bool) {
	f := func(a, b, c vec2) xnum {
		return b[0].sub(a[0]).mul(c[0].sub(a[0])).add(b[1].sub(a[1]).mul(c[1].sub(a[1])))
	}
	if s, ok := filtered2(f, a, b, c); ok {
		return s, true
	}
	return f(a, b, c).sign()
}

// segmentsMeet2 decides whether the closed segments [p1, p2] and [p3, p4]
// of the plane share a point (the orientation test of Cormen, Leiserson,
// Rivest, Stein, Introduction to Algorithms, 3rd ed., MIT Press 2009,
// §33.1, as segmentsIntersect).
func segmentsMeet2(p1, p2, p3, p4 vec2) (meet, ok bool) {
	d1, ok1 := orient2(p3, p4, p1)
	d2, ok2 := orient2(p3, p4, p2)
	d3, ok3 := orient2(p1, p2, p3)
	d4, ok4 := orient2(p1, p2, p4)
	if ok1 && ok2 && d1*d2 > 0 || ok3 && ok4 && d3*d4 > 0 {
		return false, true
	}
	if !(ok1 && ok2 && ok3 && ok4) {
		return false, false
	}
	if d1*d2 < 0 && d3*d4 < 0 {
		return true, true
	}
	undecided := false
	for _, c := range []struct {
		d       int
		a, b, p vec2
	}{{d1, p3, p4, p1}, {d2, p3, p4, p2}, {d3, p1, p2, p3}, {d4, p1, p2, p4}} {
		if c.d != 0 {
			continue
		}
		s1, ok1 := dot2(c.a, c.b, c.p)
		s2, ok2 := dot2(c.b, c.a, c.p)
		if ok1 && ok2 && s1 >= 0 && s2 >= 0 {
			return true, true
		}
		undecided = undecided || !(ok1 && ok2)
	}
	return false, !undecided
}

// inTriangle2 decides whether p lies in the closed triangle abc (either
// orientation, nondegenerate).
func inTriangle2(a, b, c, p vec2) (in, ok bool) {
	s1, ok1 := orient2(a, b, p)
	s2, ok2 := orient2(b, c, p)
	s3, ok3 := orient2(c, a, p)
	if !(ok1 && ok2 && ok3) {
		return false, false
	}
	return !(s1 > 0 || s2 > 0 || s3 > 0) || !(s1 < 0 || s2 < 0 || s3 < 0), true
}

// project drops coordinate k: the point (a_{k+1}, a_{k+2}) (indices mod
// 3). The map is a bijection from any plane whose normal has n_k ≠ 0, and
// it multiplies the orientation of that plane's triangles (about n) by the
// sign of n_k.
func project(a vec3, k int) vec2 { return vec2{a[(k+1)%3], a[(k+2)%3]} }

// dominantAxis returns a coordinate k whose component of n is decided
// nonzero, preferring the largest enclosure; zero reports that n is
// decided to be the zero vector.
func dominantAxis(n vec3) (k int, zero, ok bool) {
	order := []int{0, 1, 2}
	mag := func(i int) float64 { return n[i].enclose().Mag() }
	sort.SliceStable(order, func(i, j int) bool { return mag(order[i]) > mag(order[j]) })
	zeros := 0
	for _, i := range order {
		s, good := n[i].sign()
		if good && s != 0 {
			return i, false, true
		}
		if good {
			zeros++
		}
	}
	return 0, zeros == 3, zeros == 3
}

// faceGeometry is one face in the file's orientation.
type faceGeometry struct {
	normal vec3     // twice the area vector Σ (v_i − v_0) × (v_{i+1} − v_0)
	tris   [][3]int // ear-clipping triangles, oriented as the cycle
}

// checkFace checks face i (planar, simple, no collinear consecutive
// edges) and triangulates it; it reports defects and returns ok.
func (r *reader) checkFace(pts []vec3, face []int, i int) (faceGeometry, bool) {
	path := fmt.Sprintf("domain.polyhedron.faces[%d]", i)
	m := len(face)
	v0 := pts[face[0]]
	var n vec3
	for j := 1; j+1 < m; j++ {
		n = n.add(pts[face[j]].sub(v0).cross(pts[face[j+1]].sub(v0)))
	}
	k, zero, ok := dominantAxis(n)
	switch {
	case zero:
		r.iss.addf(path, "a face must enclose a positive area", "face %d is degenerate: its vertices are collinear or its cycle encloses no area", i)
		return faceGeometry{}, false
	case !ok:
		r.iss.addf(path, polyExactHint, "cannot decide the plane of face %d", i)
		return faceGeometry{}, false
	}
	// The plane through v0 and the first two consecutive vertices that
	// span one with it (n ≠ 0 guarantees a pair whose cross product is
	// nonzero).
	plane := -1
	var n0 vec3
	for j := 1; j+1 < m && plane < 0; j++ {
		c := pts[face[j]].sub(v0).cross(pts[face[j+1]].sub(v0))
		if _, zero, ok := dominantAxis(c); ok && !zero {
			plane, n0 = j, c
		}
	}
	if plane < 0 {
		r.iss.addf(path, polyExactHint, "cannot decide the plane of face %d", i)
		return faceGeometry{}, false
	}
	for j := 1; j < m; j++ {
		if j == plane || j == plane+1 {
			continue // on the plane they define (n0 is their cross product)
		}
		s, ok := pts[face[j]].sub(v0).dot(n0).sign()
		switch {
		case !ok:
			r.iss.addf(path, polyExactHint, "cannot decide whether face %d is planar (vertex %d)", i, face[j])
			return faceGeometry{}, false
		case s != 0:
			r.iss.addf(path, "every vertex of a face must lie in one plane; split the face into triangles",
				"face %d is not planar: vertex %d lies off the plane through vertices %d, %d and %d", i, face[j], face[0], face[plane], face[plane+1])
			return faceGeometry{}, false
		}
	}
	sg, _ := n[k].sign()
	q := make([]vec2, m)
	for j, vi := range face {
		q[j] = project(pts[vi], k)
	}
	// turn returns the turn at position j of the cycle, counterclockwise
	// about n counting positive.
	turn := func(a, b, c int) (int, bool) {
		s, ok := orient2(q[a], q[b], q[c])
		return s * sg, ok
	}
	for j := range m {
		s, ok := turn((j+m-1)%m, j, (j+1)%m)
		switch {
		case !ok:
			r.iss.addf(path, polyExactHint, "cannot decide whether vertex %d of face %d is collinear with its neighbours", face[j], i)
			return faceGeometry{}, false
		case s == 0:
			r.iss.addf(path, "remove the vertex from the face (and from its neighbour), or split the face", "vertex %d of face %d is collinear with its neighbours in the face", face[j], i)
			return faceGeometry{}, false
		}
	}
	for a := range m {
		for b := a + 2; b < m; b++ {
			if a == 0 && b == m-1 {
				continue
			}
			meet, ok := segmentsMeet2(q[a], q[(a+1)%m], q[b], q[(b+1)%m])
			switch {
			case !ok:
				r.iss.addf(path, polyExactHint, "cannot decide whether edges %d and %d of face %d intersect", a, b, i)
				return faceGeometry{}, false
			case meet:
				r.iss.addf(path, "a face must be a simple polygon: its edges meet only at shared vertices", "face %d crosses itself: its edges %d and %d intersect", i, a, b)
				return faceGeometry{}, false
			}
		}
	}
	tris, ok := earClip(m, turn, func(a, b, c, p int) bool {
		// p strictly outside the closed triangle abc (counterclockwise about n).
		for _, e := range [][2]int{{a, b}, {b, c}, {c, a}} {
			if s, ok := turn(e[0], e[1], p); ok && s < 0 {
				return true
			}
		}
		return false
	})
	if !ok {
		r.iss.addf(path, polyExactHint, "cannot triangulate face %d with the given coordinates", i)
		return faceGeometry{}, false
	}
	g := faceGeometry{normal: n}
	for _, t := range tris {
		g.tris = append(g.tris, [3]int{face[t[0]], face[t[1]], face[t[2]]})
	}
	return g, true
}

// earClip triangulates a simple polygon of m vertices, counterclockwise
// for turn, by ear clipping (Meisters, Polygons have ears, Amer. Math.
// Monthly 82, 1975, 648–651: every simple polygon with at least four
// vertices has an ear). A vertex is clipped only when its turn is decided
// strictly convex and every other remaining vertex is decided strictly
// outside the ear (outside). ok is false if no ear can be decided. The
// triangles are positions in the cycle, oriented as it.
func earClip(m int, turn func(a, b, c int) (int, bool), outside func(a, b, c, p int) bool) (tri [][3]int, ok bool) {
	idx := make([]int, m)
	for i := range idx {
		idx[i] = i
	}
	for len(idx) > 3 {
		l := len(idx)
		found := false
		for k := 0; k < l && !found; k++ {
			a, b, c := idx[(k+l-1)%l], idx[k], idx[(k+1)%l]
			if s, ok := turn(a, b, c); !ok || s <= 0 {
				continue
			}
			ear := true
			for _, p := range idx {
				if p != a && p != b && p != c && !outside(a, b, c, p) {
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
	if s, ok := turn(idx[0], idx[1], idx[2]); !ok || s <= 0 {
		return nil, false
	}
	return append(tri, [3]int{idx[0], idx[1], idx[2]}), true
}

// checkPolyhedron validates p.Polyhedron as read (see Polyhedron for the
// properties), orients its faces outward and finds the apex. It reports
// defects and returns ok.
func (r *reader) checkPolyhedron(p *Problem) bool {
	const path = "domain.polyhedron"
	ph := p.Polyhedron
	pts := exactPoints(ph.Vertices)
	nv, nf := len(pts), len(ph.Faces)
	before := r.iss.count()

	// Distinct and used vertices.
	for i := range nv {
		for j := i + 1; j < nv; j++ {
			same, ok := samePoint3(pts[i], pts[j])
			switch {
			case !ok:
				r.iss.addf(fmt.Sprintf("%s.vertices[%d]", path, j), polyExactHint, "cannot decide whether vertices %d and %d coincide", i, j)
			case same:
				r.iss.addf(fmt.Sprintf("%s.vertices[%d]", path, j), "list each point once and refer to it by its index", "vertex %d equals vertex %d", j, i)
			}
		}
	}
	used := make([]bool, nv)
	for _, f := range ph.Faces {
		for _, k := range f {
			used[k] = true
		}
	}
	for k, u := range used {
		if !u {
			r.iss.addf(fmt.Sprintf("%s.vertices[%d]", path, k), "remove it, or use it in the faces", "vertex %d is on no face", k)
		}
	}
	if r.iss.count() > before {
		return false
	}

	// Faces: planar simple polygons, triangulated.
	geo := make([]faceGeometry, nf)
	good := true
	for i, f := range ph.Faces {
		g, ok := r.checkFace(pts, f, i)
		geo[i] = g
		good = good && ok
	}
	if !good {
		return false
	}

	// Closed surface: every edge in exactly two faces.
	type use struct{ face, pos int } // the edge runs f[pos] → f[pos+1]
	edges := map[[2]int][]use{}
	for i, f := range ph.Faces {
		for j := range f {
			a, b := f[j], f[(j+1)%len(f)]
			edges[key2(a, b)] = append(edges[key2(a, b)], use{i, j})
		}
	}
	keys := make([][2]int, 0, len(edges))
	for e := range edges {
		keys = append(keys, e)
	}
	sort.Slice(keys, func(i, j int) bool {
		return keys[i][0] < keys[j][0] || keys[i][0] == keys[j][0] && keys[i][1] < keys[j][1]
	})
	for _, e := range keys {
		if u := edges[e]; len(u) != 2 {
			hint := "the surface must be closed: every edge is shared by exactly two faces"
			if len(u) > 2 {
				hint = "an edge may border only two faces"
			}
			r.iss.addf(fmt.Sprintf("%s.faces[%d]", path, u[0].face), hint, "edge %d–%d lies in %d face(s)", e[0], e[1], len(u))
		}
	}
	if r.iss.count() > before {
		return false
	}

	// Consistent orientation by a walk over the faces.
	flip := make([]bool, nf)
	seen := make([]bool, nf)
	dir := func(f, pos int) (int, int) { // the edge at pos in the current orientation
		face := ph.Faces[f]
		a, b := face[pos], face[(pos+1)%len(face)]
		if flip[f] {
			a, b = b, a
		}
		return a, b
	}
	seen[0] = true
	queue := []int{0}
	for len(queue) > 0 {
		f := queue[0]
		queue = queue[1:]
		for pos := range ph.Faces[f] {
			a, b := dir(f, pos)
			for _, u := range edges[key2(a, b)] {
				if u.face == f {
					continue
				}
				c, _ := dir(u.face, u.pos)
				same := c == a // traversed a → b as well: orientation must flip
				if !seen[u.face] {
					seen[u.face] = true
					flip[u.face] = same
					queue = append(queue, u.face)
					continue
				}
				if same {
					r.iss.addf(fmt.Sprintf("%s.faces[%d]", path, u.face), "the surface is not orientable (like a Möbius strip); check the faces around this one", "face %d cannot be oriented consistently with face %d across edge %d–%d", u.face, f, a, b)
					return false
				}
			}
		}
	}
	for i, s := range seen {
		if !s {
			r.iss.addf(fmt.Sprintf("%s.faces[%d]", path, i), "give one solid: its faces form one connected surface", "face %d is not connected to face 0 through edges", i)
			return false
		}
	}
	if msg, v := pinchedVertex(ph.Faces, nv); msg != "" {
		r.iss.add(fmt.Sprintf("%s.vertices[%d]", path, v), msg, "the faces around a vertex must form one fan")
		return false
	}

	// Orient: apply flips, then the sign of the volume.
	faces := make([][]int, nf)
	for i, f := range ph.Faces {
		faces[i] = f
		if flip[i] {
			faces[i], geo[i] = reverseFace(f), reverseGeometry(geo[i])
		}
	}
	vol, ok := signedVolume6(pts, geo).sign()
	switch {
	case !ok:
		r.iss.add(path, "cannot decide the sign of the volume", polyExactHint)
		return false
	case vol == 0:
		r.iss.add(path, "the faces enclose zero volume", "a polyhedron must enclose a solid")
		return false
	case vol < 0:
		for i := range faces {
			faces[i], geo[i] = reverseFace(faces[i]), reverseGeometry(geo[i])
			flip[i] = !flip[i]
		}
	}
	var tris [][3]int
	var triFace []int
	for i, g := range geo {
		for _, t := range g.tris {
			tris = append(tris, t)
			triFace = append(triFace, i)
		}
	}
	if msg := selfIntersection(pts, tris, triFace); msg != "" {
		r.iss.add(path+".faces", msg, "faces may meet only in their shared edges and vertices")
		return false
	}
	normals := make([]vec3, len(geo))
	for i, g := range geo {
		normals[i] = g.normal
	}
	apex, ok := findApex(pts, faces, tris, normals)
	if !ok {
		r.iss.add(path, "no tried point lies strictly on the inner side of every face's plane: polyhedra that are not star-shaped from such a point are not supported yet",
			"split the solid, or give a star-shaped polyhedron (every convex polyhedron is one)")
		return false
	}
	ph.Faces, ph.Flipped = faces, flip
	ph.pts, ph.triangles, ph.triFace, ph.apex = pts, tris, triFace, apex
	ph.convex, ph.outside[0], ph.outside[1] = convexity(pts, faces, geo)
	return true
}

func key2(a, b int) [2]int {
	if a > b {
		a, b = b, a
	}
	return [2]int{a, b}
}

// reverseFace returns f0, f(n−1), …, f1.
func reverseFace(f []int) []int {
	n := len(f)
	g := make([]int, n)
	for k := range n {
		g[k] = f[(n-k)%n]
	}
	return g
}

func reverseGeometry(g faceGeometry) faceGeometry {
	h := faceGeometry{normal: vec3{}.sub(g.normal)}
	for _, t := range g.tris {
		h.tris = append(h.tris, [3]int{t[0], t[2], t[1]})
	}
	return h
}

// samePoint3 decides whether a and b are the same point.
func samePoint3(a, b vec3) (same, ok bool) {
	allZero := true
	for k := range 3 {
		s, ok := a[k].sub(b[k]).sign()
		if ok && s != 0 {
			return false, true
		}
		allZero = allZero && ok
	}
	return allZero, allZero
}

// pinchedVertex returns a message and the vertex when the faces around
// some vertex form more than one fan. On a closed surface (every edge in
// two faces) the faces at v, each contributing the link edge between v's
// two neighbours in it, form disjoint cycles; one cycle is one fan.
func pinchedVertex(faces [][]int, nv int) (string, int) {
	link := make([][][2]int, nv)
	for _, f := range faces {
		m := len(f)
		for j, v := range f {
			link[v] = append(link[v], [2]int{f[(j+m-1)%m], f[(j+1)%m]})
		}
	}
	for v, l := range link {
		adj := map[int][]int{}
		for _, e := range l {
			adj[e[0]] = append(adj[e[0]], e[1])
			adj[e[1]] = append(adj[e[1]], e[0])
		}
		start := l[0][0]
		seen := map[int]bool{start: true}
		stack := []int{start}
		for len(stack) > 0 {
			u := stack[len(stack)-1]
			stack = stack[:len(stack)-1]
			for _, w := range adj[u] {
				if !seen[w] {
					seen[w] = true
					stack = append(stack, w)
				}
			}
		}
		if len(seen) != len(adj) {
			return fmt.Sprintf("vertex %d is pinched: the faces around it form more than one fan", v), v
		}
	}
	return "", 0
}

// signedVolume6 returns Σ det(a − o, b − o, c − o) over the faces'
// triangles (a, b, c), o the first vertex: six times the signed volume
// enclosed by the oriented closed surface (divergence theorem; for an
// embedded surface it is ±6|P|, positive when the faces are outward).
func signedVolume6(pts []vec3, geo []faceGeometry) xnum {
	o := pts[0]
	s := o[0].sub(o[0])
	for _, g := range geo {
		for _, t := range g.tris {
			s = s.add(pts[t[0]].sub(o).cross(pts[t[1]].sub(o)).dot(pts[t[2]].sub(o)))
		}
	}
	return s
}

// convexity decides convexity: an embedded polyhedron P is convex if and
// only if every vertex lies on the closed inner side of every face's
// plane. If so, P ⊆ conv(V) ⊆ ∩ H_f (H_f the closed inner half-space of
// face f); and a point x ∈ ∩ H_f outside P would be joined to an interior
// point y (chosen so that the segment avoids the edges) by a segment that
// leaves P through the relative interior of some face f and then stays
// strictly on the outer side of f's plane, so x ∉ H_f. Conversely, if P is
// convex, near a point of the relative interior of f, P is the inner side
// of f's plane; the segments from a vertex strictly on the outer side to
// the points of P there would put points of the outer side near f into P.
// The vertices of f itself lie on its plane (checkFace proved each face
// planar), so only the others are tested.
//
// The verdict "not convex" comes with its witness: a vertex strictly on
// the outer side of a face's plane.
func convexity(pts []vec3, faces [][]int, geo []faceGeometry) (verdict string, vertex, face int) {
	undecided := false
	encl, _ := enclosedPoints(pts)
	for i, f := range faces {
		v0, n := pts[f[0]], geo[i].normal
		var ne vec3
		for c := range 3 {
			ne[c] = xnum{v: n[c].enclose()}
		}
		for k, q := range pts {
			if slices.Contains(f, k) {
				continue // on the plane: checkFace proved every face planar
			}
			s, ok := encl[k].sub(encl[f[0]]).dot(ne).sign()
			if !ok {
				s, ok = q.sub(v0).dot(n).sign()
			}
			switch {
			case !ok:
				undecided = true
			case s > 0:
				return "not convex", k, i
			}
		}
	}
	if undecided {
		return "undecided", 0, 0
	}
	return "convex", 0, 0
}

// selfIntersection returns a message naming two faces whose triangles
// meet outside their common vertices and edges, or "" when the closed
// triangles of different faces meet exactly in the convex hull of their
// common vertices (see trianglesOverlap). Triangles of one face come from
// the triangulation of a simple polygon and do not overlap.
func selfIntersection(pts []vec3, tris [][3]int, triFace []int) string {
	box := make([][3][2]float64, len(tris))
	for t, tr := range tris {
		for k := range 3 {
			lo, hi := pts[tr[0]][k].enclose().Lo, pts[tr[0]][k].enclose().Hi
			for _, v := range tr[1:] {
				e := pts[v][k].enclose()
				lo, hi = min(lo, e.Lo), max(hi, e.Hi)
			}
			box[t][k] = [2]float64{lo, hi}
		}
	}
	encl, exact := enclosedPoints(pts)
	for s := range tris {
		for t := s + 1; t < len(tris); t++ {
			if triFace[s] == triFace[t] {
				continue
			}
			apart := false
			for k := range 3 {
				if box[s][k][1] < box[t][k][0] || box[t][k][1] < box[s][k][0] {
					apart = true
				}
			}
			if apart {
				continue
			}
			// First on the enclosures (every sign they decide holds
			// for the exact points), then exactly.
			meet, ok := trianglesOverlap(encl, tris[s], tris[t])
			if !ok && exact {
				meet, ok = trianglesOverlap(pts, tris[s], tris[t])
			}
			switch {
			case !ok:
				return fmt.Sprintf("cannot decide whether faces %d and %d intersect (%s)", triFace[s], triFace[t], polyExactHint)
			case meet:
				return fmt.Sprintf("faces %d and %d intersect (self-intersecting surface)", triFace[s], triFace[t])
			}
		}
	}
	return ""
}

// trianglesOverlap decides whether the closed triangles s and t (vertex
// indices of distinct points) meet outside the convex hull of their common
// vertices.
//
//   - No common vertex: two closed triangles meet if and only if an edge
//     of one meets the other closed triangle. (If they meet and are not
//     coplanar, T_s ∩ T_t lies on the line L of the two planes and is the
//     intersection of the segments T_s ∩ L and T_t ∩ L, whose end points
//     lie on edges; an end of the intersection is an end of one of them.
//     If coplanar, their intersection is a convex polygon whose vertices
//     are vertices of one triangle or crossings of edges.)
//   - One common vertex v: since both triangles are convex, a common point
//     p ≠ v gives the common segment [v, p]; so they meet beyond v if and
//     only if their angles at v, the wedges W_s and W_t spanned by the
//     edge vectors at v, share a direction d ≠ 0. Not coplanar: d is
//     ±(n_s × n_t), n the normals. Coplanar: two convex wedges share a
//     direction if and only if one contains a boundary ray of the other.
//     d lies in the wedge of u, w (in its plane) iff (u × d)·n ≥ 0 and
//     (d × w)·n ≥ 0, n = u × w (write d = αu + βw: these are β|n|², α|n|²).
//   - Common edge vw: not coplanar, each triangle meets the other's plane
//     only in the line vw, where both are the edge; coplanar, they overlap
//     if and only if the third vertices lie on the same side of vw.
//   - Three common vertices: the triangles coincide.
func trianglesOverlap(pts []vec3, s, t [3]int) (meet, ok bool) {
	var common []int
	for _, a := range s {
		for _, b := range t {
			if a == b {
				common = append(common, a)
			}
		}
	}
	P := func(i int) vec3 { return pts[i] }
	others := func(tr [3]int) []int {
		var o []int
		for _, a := range tr {
			isCommon := false
			for _, c := range common {
				isCommon = isCommon || a == c
			}
			if !isCommon {
				o = append(o, a)
			}
		}
		return o
	}
	switch len(common) {
	case 3:
		return true, true
	case 2:
		v, w := P(common[0]), P(common[1])
		a, b := P(others(s)[0]), P(others(t)[0])
		c, ok := orient3(v, w, a, b)
		if !ok || c != 0 {
			return false, ok
		}
		e := w.sub(v)
		side, ok := e.cross(a.sub(v)).dot(e.cross(b.sub(v))).sign()
		return ok && side > 0, ok
	case 1:
		v := P(common[0])
		os, ot := others(s), others(t)
		u1, w1 := P(os[0]).sub(v), P(os[1]).sub(v)
		u2, w2 := P(ot[0]).sub(v), P(ot[1]).sub(v)
		n1, n2 := u1.cross(w1), u2.cross(w2)
		l := n1.cross(n2)
		parallel := true
		for k := range 3 {
			sg, ok := l[k].sign()
			if !ok {
				return false, false
			}
			parallel = parallel && sg == 0
		}
		if !parallel {
			for _, d := range []vec3{l, vec3{}.sub(l)} {
				in1, ok1 := inWedge(u1, w1, n1, d)
				in2, ok2 := inWedge(u2, w2, n2, d)
				if !ok1 || !ok2 {
					return false, false
				}
				if in1 && in2 {
					return true, true
				}
			}
			return false, true
		}
		for _, c := range []struct{ u, w, n, d vec3 }{{u1, w1, n1, u2}, {u1, w1, n1, w2}, {u2, w2, n2, u1}, {u2, w2, n2, w1}} {
			in, ok := inWedge(c.u, c.w, c.n, c.d)
			if !ok {
				return false, false
			}
			if in {
				return true, true
			}
		}
		return false, true
	}
	for _, c := range []struct{ e, tr [3]int }{{s, t}, {t, s}} {
		for j := range 3 {
			meet, ok := segmentMeetsTriangle(P(c.e[j]), P(c.e[(j+1)%3]), P(c.tr[0]), P(c.tr[1]), P(c.tr[2]))
			if !ok || meet {
				return meet, ok
			}
		}
	}
	return false, true
}

// inWedge decides (u × d)·n ≥ 0 and (d × w)·n ≥ 0 (see trianglesOverlap).
func inWedge(u, w, n, d vec3) (in, ok bool) {
	s1, ok1 := u.cross(d).dot(n).sign()
	s2, ok2 := d.cross(w).dot(n).sign()
	if ok1 && s1 < 0 || ok2 && s2 < 0 {
		return false, true
	}
	return ok1 && ok2, ok1 && ok2
}

// segmentMeetsTriangle decides whether the closed segment pq meets the
// closed nondegenerate triangle abc. If p and q lie strictly on one side
// of the plane abc, no. If both lie in it, the question is planar (in a
// projection that keeps the plane's orientation up to sign): the segment
// meets the triangle iff an end lies in it or the segment meets an edge.
// Otherwise the line pq meets the plane in one point X of the segment,
// and X lies in the closed triangle iff the orientations (p, q, a, b),
// (p, q, b, c), (p, q, c, a) are not of strictly opposite signs (X lies on
// the inner side of the three edges as seen along pq).
func segmentMeetsTriangle(p, q, a, b, c vec3) (meet, ok bool) {
	sp, okp := orient3(a, b, c, p)
	sq, okq := orient3(a, b, c, q)
	if okp && okq && sp*sq > 0 {
		return false, true
	}
	if !okp || !okq {
		return false, false
	}
	if sp == 0 && sq == 0 {
		k, _, ok := dominantAxis(b.sub(a).cross(c.sub(a)))
		if !ok {
			return false, false
		}
		P, Q, A, B, C := project(p, k), project(q, k), project(a, k), project(b, k), project(c, k)
		for _, x := range []vec2{P, Q} {
			in, ok := inTriangle2(A, B, C, x)
			if !ok || in {
				return in, ok
			}
		}
		for _, e := range [][2]vec2{{A, B}, {B, C}, {C, A}} {
			meet, ok := segmentsMeet2(P, Q, e[0], e[1])
			if !ok || meet {
				return meet, ok
			}
		}
		return false, true
	}
	var pos, neg bool
	for _, e := range [][2]vec3{{a, b}, {b, c}, {c, a}} {
		s, ok := orient3(p, q, e[0], e[1])
		if !ok {
			return false, false
		}
		pos, neg = pos || s > 0, neg || s < 0
	}
	return !(pos && neg), true
}

// findApex returns a point strictly on the inner side of every face's
// plane, trying in turn the vertex centroid, the midpoints between it and
// each face's vertex centroid, the midpoints between it and each vertex,
// and a rational point chosen in floating point (chooseKernelPoint). A
// point c qualifies when det(a − c, b − c, d − c) > 0 is decided for every
// outward triangle (a, b, d), so that every cone tetrahedron (c, a, b, d)
// is positively oriented; the choices only propose, the decision is exact.
// normals are the faces' outward normals.
func findApex(pts []vec3, faces [][]int, tris [][3]int, normals []vec3) (vec3, bool) {
	centroid := func(idx []int) vec3 {
		var s vec3
		for k := range 3 {
			s[k] = pts[idx[0]][k].sub(pts[idx[0]][k])
		}
		for _, i := range idx {
			s = s.add(pts[i])
		}
		return s.scale(big.NewRat(1, int64(len(idx))))
	}
	all := make([]int, len(pts))
	for i := range all {
		all[i] = i
	}
	g := centroid(all)
	half := big.NewRat(1, 2)
	cands := []vec3{g}
	for _, f := range faces {
		cands = append(cands, g.add(centroid(f)).scale(half))
	}
	for _, v := range pts {
		cands = append(cands, g.add(v).scale(half))
	}
	for _, q := range chooseKernelPoints(pts, faces, normals) {
		cands = append(cands, ratPoint(pts[0][0], q))
	}
	for _, c := range cands {
		c = c.withEnclosure()
		good := true
		for _, t := range tris {
			if s, ok := orient3(c, pts[t[0]], pts[t[1]], pts[t[2]]); !ok || s <= 0 {
				good = false
				break
			}
		}
		if good {
			return c, true
		}
	}
	return vec3{}, false
}

// enclosedPoints returns the points as enclosures only, and whether the
// given points are exact (so that an undecided sign may be retried
// exactly).
func enclosedPoints(pts []vec3) ([]vec3, bool) {
	out := make([]vec3, len(pts))
	exact := len(pts) > 0 && pts[0][0].kind != enclosed
	for i, p := range pts {
		for k := range 3 {
			out[i][k] = xnum{v: p[k].enclose()}
		}
	}
	return out, exact
}
