package certify

import (
	"math"
	"sync"

	"gapcert/fem/problem"
	"gapcert/interval"
)

// firstMesh is the polygon the meshes start from: the problem's polygon,
// or for a thin polygon the same polygon with extra vertices on its long
// sides (see splitThin), and a triangulation of it.
type firstMesh struct {
	verts  [][2]interval.I // enclosures of the exact vertices, counterclockwise
	tris   [][3]int
	side   []int // side j (verts[j] to verts[j+1]) lies on the problem's side side[j]
	vertex []int // the problem's vertex i is verts[vertex[i]]
}

// Thin polygons: a polygon whose diameter² exceeds thinRatio times its
// area gets extra vertices on its sides, at most maxThinVertices of them.
const (
	thinRatio       = 16
	maxThinVertices = 512
)

// thinCache keeps the first meshes of the last few thin problems (a
// computation builds several meshes from the same problem; a sweep goes
// through many problems, so the cache is bounded).
var thinCache struct {
	sync.Mutex
	keys []*problem.Problem
	vals []*firstMesh
}

const thinCacheSize = 8

// startMesh returns the first mesh of a polygon (the choice depends only
// on the problem).
func startMesh(p *problem.Problem) *firstMesh {
	thinCache.Lock()
	for i, k := range thinCache.keys {
		if k == p {
			f := thinCache.vals[i]
			thinCache.Unlock()
			return f
		}
	}
	thinCache.Unlock()
	n := len(p.Vertices)
	f := &firstMesh{tris: p.Triangles(), side: make([]int, n), vertex: make([]int, n)}
	for i, v := range p.Vertices {
		f.verts = append(f.verts, [2]interval.I{v[0].Val, v[1].Val})
		f.side[i], f.vertex[i] = i, i
	}
	g := splitThin(p, f)
	if g == nil {
		return f
	}
	thinCache.Lock()
	thinCache.keys = append(thinCache.keys, p)
	thinCache.vals = append(thinCache.vals, g)
	if len(thinCache.keys) > thinCacheSize {
		thinCache.keys, thinCache.vals = thinCache.keys[1:], thinCache.vals[1:]
	}
	thinCache.Unlock()
	return g
}

// splitThin returns, for a thin polygon with four or more sides, the
// polygon with each side of length ℓ divided into about ℓ/w equal parts
// (w = area/diameter, the polygon's width) and a triangulation of it whose
// smallest angle beats that of the problem's triangulation fourfold; nil
// when the polygon is not thin or nothing better is found. Uniform
// refinement keeps the shapes of the first triangles, and a thin polygon
// triangulated by its vertices alone (a 1:200 rectangle cut along a
// diagonal) has slivers whose longest edges, on which the projection
// bounds of stage A depend, stay far above the polygon's width.
//
// Everything here is a choice: the new vertex between the exact vertices
// A and B is the exact point A + (j/k)(B − A), enclosed in interval
// arithmetic, which lies on the side, so the polygon is the same set and
// mesh.FromPolygon proves that the triangles tile it.
func splitThin(p *problem.Problem, f *firstMesh) *firstMesh {
	n := len(p.Vertices)
	if n < 4 {
		return nil
	}
	d, area := p.Diameter().Mid(), p.Area().Mid()
	if !(d*d > thinRatio*area) || !(area > 0) {
		return nil
	}
	w := area / d
	lens := make([]float64, n)
	total := 0.0
	for i := 0; i < n; i++ {
		a, b := f.verts[i], f.verts[(i+1)%n]
		lens[i] = math.Hypot(b[0].Mid()-a[0].Mid(), b[1].Mid()-a[1].Mid())
		total += lens[i]
	}
	if total/w > maxThinVertices {
		w = total / maxThinVertices
	}
	g := &firstMesh{vertex: make([]int, n)}
	for i := 0; i < n; i++ {
		a, b := f.verts[i], f.verts[(i+1)%n]
		k := max(1, int(math.Round(lens[i]/w)))
		g.vertex[i] = len(g.verts)
		g.verts = append(g.verts, a)
		g.side = append(g.side, i)
		for j := 1; j < k; j++ {
			t := interval.Point(float64(j)).Div(interval.Point(float64(k)))
			g.verts = append(g.verts, [2]interval.I{
				a[0].Add(b[0].Sub(a[0]).Mul(t)),
				a[1].Add(b[1].Sub(a[1]).Mul(t)),
			})
			g.side = append(g.side, i)
		}
	}
	tris, ok := bestEarTriangulation(g.verts)
	if !ok || minAngle(g.verts, tris) < 4*minAngle(f.verts, f.tris) {
		return nil
	}
	g.tris = tris
	return g
}

// bestEarTriangulation triangulates a simple counterclockwise polygon by
// ear clipping, always clipping the ear whose smallest angle is largest
// (floating point: a choice, checked by mesh.FromPolygon).
func bestEarTriangulation(v [][2]interval.I) ([][3]int, bool) {
	pts := make([][2]float64, len(v))
	for i, q := range v {
		pts[i] = [2]float64{q[0].Mid(), q[1].Mid()}
	}
	idx := make([]int, len(v))
	for i := range idx {
		idx[i] = i
	}
	var tris [][3]int
	for len(idx) > 3 {
		best, bestAngle := -1, -1.0
		m := len(idx)
		for e := 0; e < m; e++ {
			a, b, c := idx[(e+m-1)%m], idx[e], idx[(e+1)%m]
			if cross(pts[a], pts[b], pts[c]) <= 1e-12*sqDist(pts[a], pts[c]) {
				continue // reflex or flat
			}
			inside := false
			for _, q := range idx {
				if q != a && q != b && q != c && inTriangleClosed(pts[a], pts[b], pts[c], pts[q]) {
					inside = true
					break
				}
			}
			if inside {
				continue
			}
			if ang := triMinAngle(pts[a], pts[b], pts[c]); ang > bestAngle {
				best, bestAngle = e, ang
			}
		}
		if best < 0 {
			return nil, false
		}
		tris = append(tris, [3]int{idx[(best+m-1)%m], idx[best], idx[(best+1)%m]})
		idx = append(idx[:best], idx[best+1:]...)
	}
	if cross(pts[idx[0]], pts[idx[1]], pts[idx[2]]) <= 0 {
		return nil, false
	}
	return append(tris, [3]int{idx[0], idx[1], idx[2]}), true
}

func cross(a, b, c [2]float64) float64 {
	return (b[0]-a[0])*(c[1]-a[1]) - (b[1]-a[1])*(c[0]-a[0])
}

func sqDist(a, b [2]float64) float64 {
	dx, dy := b[0]-a[0], b[1]-a[1]
	return dx*dx + dy*dy
}

// inTriangleClosed reports whether q lies in the closed triangle abc
// (counterclockwise), with a small tolerance toward "inside".
func inTriangleClosed(a, b, c, q [2]float64) bool {
	tol := -1e-12 * (sqDist(a, b) + sqDist(b, c) + sqDist(c, a))
	return cross(a, b, q) >= tol && cross(b, c, q) >= tol && cross(c, a, q) >= tol
}

// triMinAngle returns the smallest angle of the triangle abc.
func triMinAngle(a, b, c [2]float64) float64 {
	angle := func(p, q, r [2]float64) float64 { // at p
		ux, uy := q[0]-p[0], q[1]-p[1]
		vx, vy := r[0]-p[0], r[1]-p[1]
		return math.Abs(math.Atan2(ux*vy-uy*vx, ux*vx+uy*vy))
	}
	return math.Min(angle(a, b, c), math.Min(angle(b, c, a), angle(c, a, b)))
}

// minAngle returns the smallest angle of the triangles.
func minAngle(v [][2]interval.I, tris [][3]int) float64 {
	out := math.Pi
	for _, t := range tris {
		p := func(i int) [2]float64 { return [2]float64{v[i][0].Mid(), v[i][1].Mid()} }
		out = math.Min(out, triMinAngle(p(t[0]), p(t[1]), p(t[2])))
	}
	return out
}
