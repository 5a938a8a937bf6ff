package problem

import (
	"fmt"
	"strconv"
)

// Polyhedron is the domain of a three-dimensional problem read from
// "domain": {"polyhedron": {"vertices": […], "faces": […]}}: a bounded
// solid whose boundary is a closed embedded surface of planar polygonal
// faces. Parse verifies every property listed here (see the validation in
// polyhedron_check.go); a file that lacks one is refused with the face or
// vertex at fault.
//
//   - Vertices are pairwise distinct exact points, each on some face.
//   - Every face is a simple planar polygon of at least three vertices
//     with no two consecutive edges collinear, listed as a cycle of
//     vertex indices; Faces lists every face counterclockwise seen from
//     outside the solid (its area vector points outward). A face the file
//     lists the other way round is reversed as f0, f(n−1), …, f1, keeping
//     its first vertex (see Flipped).
//   - Every edge lies in exactly two faces, traversed in opposite
//     directions; the faces around every vertex form a single fan; the
//     faces form one connected surface.
//   - Two faces meet only in common vertices and edges (no
//     self-intersection), and the solid has positive volume.
//   - The solid is star-shaped with respect to an exact interior point
//     (Apex) that lies strictly on the inner side of every face's plane.
//     Solids without such a point are refused as not supported yet.
type Polyhedron struct {
	Vertices [][3]Number
	// Faces holds each face's vertex indices, outward oriented, in the
	// file's face order (which the boundary conditions follow).
	Faces [][]int
	// Flipped[i] reports that the file listed face i inward, so Faces[i]
	// is the file's cycle reversed (keeping its first vertex).
	Flipped []bool

	pts       []vec3    // vertices, exact when possible
	triangles [][3]int  // outward triangles of the faces
	triFace   []int     // face of each triangle
	apex      vec3      // a point strictly on the inner side of every face plane
	apexText  [3]string // its coordinates, as exact text when known
	convex    string
	outside   [2]int // a vertex strictly outside a face's plane (vertex, face) when not convex
}

// Limits of the polyhedron reader.
const maxFaces = 2 * maxVertices

const polyhedronHint = `write "polyhedron": {"vertices": [["0", "0", "0"], …], "faces": [[0, 3, 2, 1], …]}`

// polyhedron reads the structure of "domain.polyhedron": the vertex
// coordinates and the faces as index cycles (in range, at least three
// distinct indices each). ok reports that both were read; the geometry is
// checked by checkPolyhedron once the boundary is known.
func (r *reader) polyhedron(n *node, p *Problem) bool {
	const path = "domain.polyhedron"
	p.Dim = 3
	if n.kind != kindObject {
		r.iss.add(path, "a polyhedron is an object with vertices and faces, not "+n.kind.String(), polyhedronHint)
		return false
	}
	r.checkKeys(n, path, []string{"vertices", "faces"})
	vn, fn := n.get("vertices"), n.get("faces")
	if vn == nil || fn == nil {
		miss := "vertices"
		if vn != nil {
			miss = "faces"
		}
		r.iss.add(path, "the polyhedron has no "+miss, polyhedronHint)
		return false
	}
	ph := &Polyhedron{}
	ok := r.polyhedronVertices(vn, ph, p.Params)
	if !r.polyhedronFaces(fn, ph, len(ph.Vertices), ok) || !ok {
		return false
	}
	p.Polyhedron = ph
	return true
}

func (r *reader) polyhedronVertices(n *node, ph *Polyhedron, params map[string]Number) bool {
	const path = "domain.polyhedron.vertices"
	if n.kind != kindArray {
		r.iss.add(path, "the vertices are a list of points, not "+n.kind.String(), `write "vertices": [["0", "0", "0"], ["1", "0", "0"], …]`)
		return false
	}
	if len(n.vals) < 4 {
		r.iss.addf(path, "a polyhedron needs at least four vertices", "polyhedron has %d vertices", len(n.vals))
		return false
	}
	if len(n.vals) > maxVertices {
		r.iss.addf(path, "simplify the domain", "polyhedron has %d vertices, at most %d are supported", len(n.vals), maxVertices)
		return false
	}
	ok := true
	for i, v := range n.vals {
		vp := fmt.Sprintf("%s[%d]", path, i)
		if v.kind != kindArray || len(v.vals) != 3 {
			r.iss.add(vp, "a vertex is a list of three numbers [x, y, z]", `write ["0.5", "0", "sqrt(2)/2"]`)
			ok = false
			continue
		}
		var q [3]Number
		good := true
		for k := range 3 {
			c, g := r.number(v.vals[k], fmt.Sprintf("%s[%d]", vp, k), params)
			q[k] = c
			good = good && g
		}
		if !good {
			ok = false
			continue
		}
		ph.Vertices = append(ph.Vertices, q)
	}
	return ok
}

// polyhedronFaces reads the faces; nv is the number of vertices (checked
// against the indices only when verticesOK).
func (r *reader) polyhedronFaces(n *node, ph *Polyhedron, nv int, verticesOK bool) bool {
	const path = "domain.polyhedron.faces"
	if n.kind != kindArray {
		r.iss.add(path, "the faces are a list of vertex-index cycles, not "+n.kind.String(), `write "faces": [[0, 3, 2, 1], …]`)
		return false
	}
	if len(n.vals) < 4 {
		r.iss.addf(path, "a closed surface needs at least four faces", "polyhedron has %d faces", len(n.vals))
		return false
	}
	if len(n.vals) > maxFaces {
		r.iss.addf(path, "simplify the domain", "polyhedron has %d faces, at most %d are supported", len(n.vals), maxFaces)
		return false
	}
	ok := true
	for i, f := range n.vals {
		fp := fmt.Sprintf("%s[%d]", path, i)
		if f.kind != kindArray {
			r.iss.add(fp, "a face is a list of vertex indices, not "+f.kind.String(), `write [0, 1, 2]`)
			ok = false
			continue
		}
		if len(f.vals) < 3 {
			r.iss.addf(fp, "a face needs at least three vertices", "face %d has %d vertices", i, len(f.vals))
			ok = false
			continue
		}
		if len(f.vals) > maxVertices {
			r.iss.addf(fp, "simplify the face", "face %d has %d vertices, at most %d are supported", i, len(f.vals), maxVertices)
			ok = false
			continue
		}
		face := make([]int, 0, len(f.vals))
		seen := map[int]int{}
		good := true
		for j, e := range f.vals {
			ep := fmt.Sprintf("%s[%d]", fp, j)
			k, err := strconv.Atoi(string(e.num))
			if e.kind != kindNumber || err != nil {
				r.iss.add(ep, "a vertex index is a non-negative integer", "indices count from 0 in the order of \"vertices\"")
				good = false
				continue
			}
			if k < 0 || verticesOK && k >= nv {
				r.iss.addf(ep, fmt.Sprintf("indices run from 0 to %d", nv-1), "vertex index %d out of range", k)
				good = false
				continue
			}
			if prev, dup := seen[k]; dup {
				r.iss.addf(ep, "a face visits each of its vertices once", "vertex %d repeats in face %d (positions %d and %d)", k, i, prev, j)
				good = false
				continue
			}
			seen[k] = j
			face = append(face, k)
		}
		if !good {
			ok = false
			continue
		}
		ph.Faces = append(ph.Faces, face)
	}
	return ok
}
