package mesh3

import (
	"fmt"
	"math"
	"testing"

	"gapcert/interval"
)

// faceNormal encloses (P_b − P_a) × (P_c − P_a) for three nodes of m.
func faceNormal(m *Mesh, a, b, c int) [3]interval.I {
	return cross(sub3(m.Nodes[b], m.Nodes[a]), sub3(m.Nodes[c], m.Nodes[a]))
}

// areaVector encloses twice the area vector Σ_i (P_i − P_0) × (P_(i+1) − P_0)
// of the face with the given vertex cycle, normal to its plane and pointing
// outward (the face may be non-convex).
func areaVector(m *Mesh, cycle []int) [3]interval.I {
	var n [3]interval.I
	for i := 1; i+1 < len(cycle); i++ {
		c := faceNormal(m, cycle[0], cycle[i], cycle[i+1])
		for k := range 3 {
			n[k] = n[k].Add(c[k])
		}
	}
	return n
}

// TestRefineTowardBoundaryOnFaces checks, on graded meshes, what the
// boundary conditions rely on: every boundary triangle lies in the plane
// of the polyhedron face it is labelled with (each node's enclosure meets
// the plane through the face's first vertex normal to its area vector),
// is oriented outward like that face (its normal has a positive dot
// product with the face's area vector), and the triangles
// of each face cover its area (the sum of their areas equals that of the
// ungraded mesh's triangles of the face, relative 1e-12). A triangle
// labelled with another face, or a midpoint off its face, fails the
// first check; a lost or doubled piece, the third.
func TestRefineTowardBoundaryOnFaces(t *testing.T) {
	cases := []struct {
		s       solid
		targets []Target
	}{
		{lPrism, []Target{{3, 9, 4}}},
		{fichera, []Target{{7, 8, 3}, {7, 9, 3}, {7, 10, 2}}},
		{solids[0], []Target{{0, 1, 3}, {6, 6, 4}}}, // unit cube: an edge and a vertex
		{solids[3], []Target{{8, 8, 4}, {4, 5, 2}}}, // dented cube: the dent's apex (slanted faces) and an edge
		{solids[5], []Target{{0, 5, 3}, {1, 2, 2}}}, // pentagonal prism: a vertical edge and a bottom edge
		{starPrism(16, "1/64"), starTargets(16, 2)}, // thin slivers, many faces
	}
	for _, c := range cases {
		m0 := fromSolid(t, c.s)
		m, err := m0.RefineToward(c.targets)
		if err != nil {
			t.Fatalf("%s: %v", c.s.name, err)
		}
		faceArea := func(m *Mesh) map[int]float64 {
			area := map[int]float64{}
			for _, b := range m.Bnd {
				n := faceNormal(m, b.A, b.B, b.C)
				area[b.Face] += math.Sqrt(n[0].Mid()*n[0].Mid()+n[1].Mid()*n[1].Mid()+n[2].Mid()*n[2].Mid()) / 2
			}
			return area
		}
		bad := 0
		for j, b := range m.Bnd {
			f := c.s.faces[b.Face]
			nf := areaVector(m, f)
			for _, k := range []int{b.A, b.B, b.C} {
				if d := dot(nf, sub3(m.Nodes[k], m.Nodes[f[0]])); !(d.Lo <= 0 && 0 <= d.Hi) {
					if bad++; bad <= 5 {
						t.Errorf("%s: boundary triangle %d (face %d): node %d %v is off the face's plane by %v", c.s.name, j, b.Face, k, mid3(m.Nodes[k]), d)
					}
				}
			}
			if o := dot(nf, faceNormal(m, b.A, b.B, b.C)); !(o.Lo > 0) {
				if bad++; bad <= 5 {
					t.Errorf("%s: boundary triangle %d (face %d) is not oriented like its face: %v", c.s.name, j, b.Face, o)
				}
			}
		}
		want, got := faceArea(m0), faceArea(m)
		for f, a := range want {
			if math.Abs(got[f]-a) > 1e-12*a {
				t.Errorf("%s: the triangles of face %d have the area %.17g, want %.17g", c.s.name, f, got[f], a)
			}
		}
		t.Logf("%s: %d tetrahedra, %d boundary triangles on %d faces", c.s.name, len(m.Tets), len(m.Bnd), len(got))
	}
}

// TestRefineTowardCorruptionsRefused checks that the tiling proof refuses
// corrupted graded meshes beyond those of
// TestRefineTowardCorruptedRefused: a hanging node (one of the two
// tetrahedra on an interior face bisected at the midpoint of an edge of
// that face, the other not), a duplicated tetrahedron, an interior
// midpoint moved near a far corner (the tetrahedra around it turn over), and a boundary midpoint moved to the middle of the polyhedron.
// A midpoint moved within the tetrahedra around it keeps a tiling and is
// no defect; boundary midpoints are computed from their parents, never
// read (TestRefineTowardBoundaryOnFaces checks they stay on their faces).
func TestRefineTowardCorruptionsRefused(t *testing.T) {
	m, err := fromSolid(t, lPrism).RefineToward([]Target{{3, 9, 3}})
	if err != nil {
		t.Fatal(err)
	}
	onBoundary := make([]bool, len(m.Nodes))
	for _, b := range m.Bnd {
		onBoundary[b.A], onBoundary[b.B], onBoundary[b.C] = true, true, true
	}
	// An interior face shared by tetrahedra t1 and t2, and an edge (a, b) of it.
	faces, tetFaces := m.Faces()
	owners := make([][]int, len(faces))
	for tt, tf := range tetFaces {
		for _, f := range tf {
			owners[f] = append(owners[f], tt)
		}
	}
	t1 := -1
	var a, b int
	for f, o := range owners {
		if fc := faces[f]; len(o) == 2 && !onBoundary[fc[0]] {
			t1, a, b = o[0], fc[0], fc[1] // (a, b) is on no boundary triangle
			break
		}
	}
	if t1 < 0 {
		t.Fatal("no interior face")
	}
	hanging := func() ([][3]interval.I, [][4]int) {
		nodes := append([][3]interval.I(nil), m.Nodes...)
		p, q := m.Nodes[a], m.Nodes[b]
		nodes = append(nodes, [3]interval.I{p[0].Add(q[0]).MulF(0.5), p[1].Add(q[1]).MulF(0.5), p[2].Add(q[2]).MulF(0.5)})
		mid := len(nodes) - 1
		var tets [][4]int
		for tt, tet := range m.Tets {
			if tt != t1 {
				tets = append(tets, tet)
				continue
			}
			x, y := tet, tet
			for i := range 4 {
				if tet[i] == a {
					x[i] = mid
				}
				if tet[i] == b {
					y[i] = mid
				}
			}
			tets = append(tets, x, y)
		}
		return nodes, tets
	}
	moved := func(interior bool) ([][3]interval.I, [][4]int) {
		nodes := append([][3]interval.I(nil), m.Nodes...)
		for k := len(nodes) - 1; k >= m.NumGiven(); k-- { // the last midpoints are at the re-entrant edge
			if onBoundary[k] != interior {
				if interior {
					nodes[k] = [3]interval.I{interval.Point(-0.875), interval.Point(-0.875), interval.Point(0.125)}
				} else {
					nodes[k] = [3]interval.I{interval.Point(-0.5), interval.Point(-0.5), interval.Point(0.5)}
				}
				return nodes, m.Tets
			}
		}
		t.Fatal("no such midpoint")
		return nil, nil
	}
	for name, mk := range map[string]func() ([][3]interval.I, [][4]int){
		"hanging node": hanging,
		"duplicated tetrahedron": func() ([][3]interval.I, [][4]int) {
			return m.Nodes, append(append([][4]int(nil), m.Tets...), m.Tets[7])
		},
		"moved interior midpoint": func() ([][3]interval.I, [][4]int) { return moved(true) },
		"moved boundary midpoint": func() ([][3]interval.I, [][4]int) { return moved(false) },
	} {
		nodes, tets := mk()
		if _, err := FromPolyhedron(nodes, tets, m.Bnd); err == nil {
			t.Errorf("%s: the corrupted graded mesh passed the tiling proof", name)
		} else {
			t.Logf("%s: %v", name, err)
		}
	}
}

// starPrism is the prism of height h over the star polygon with 2n
// vertices alternately on the circles of radii 1 and 3/10 (angle kπ/n):
// many faces, n re-entrant vertical edges (the odd vertices), and for a
// small h, cone tetrahedra that are thin slivers.
func starPrism(n int, h string) solid {
	var v [][3]string
	for _, z := range []string{"0", h} {
		for k := range 2 * n {
			r := "1"
			if k%2 == 1 {
				r = "3/10"
			}
			v = append(v, [3]string{fmt.Sprintf("%s*cos(%d*pi/%d)", r, k, n), fmt.Sprintf("%s*sin(%d*pi/%d)", r, k, n), z})
		}
	}
	m := 2 * n
	var bottom, top []int
	for k := range m {
		bottom = append(bottom, m-1-k)
		top = append(top, m+k)
	}
	faces := [][]int{bottom, top}
	for k := range m {
		faces = append(faces, []int{k, (k + 1) % m, m + (k+1)%m, m + k})
	}
	return solid{fmt.Sprintf("star prism (%d points, height %s)", n, h), v, faces, 0}
}

// starTargets are the re-entrant edges of starPrism(n, ·), each with the
// given levels.
func starTargets(n, levels int) []Target {
	var ts []Target
	for k := 1; k < 2*n; k += 2 {
		ts = append(ts, Target{k, 2*n + k, levels})
	}
	return ts
}

// TestRefineTowardStarPrismSize grades the thin star prism (32 faces of
// slivers, 16 re-entrant edges) round by round: the closure ends, the
// tiling proof passes every round, no round has more than eight times
// the tetrahedra (a tetrahedron bisected at all six edges has eight
// pieces), the factor falls after the first rounds (measured 8.0, 7.2,
// 4.3, 2.9: the closure's spread ends once the slivers at the edges are
// split), and the tetrahedra at the edges shrink.
func TestRefineTowardStarPrismSize(t *testing.T) {
	s := starPrism(16, "1/64")
	m := fromSolid(t, s)
	ts := starTargets(16, 1)
	var segs [][2]int
	for _, tg := range ts {
		segs = append(segs, [2]int{tg.A, tg.B})
	}
	h0 := touchingDiam(m, segs)
	var factors []float64
	for round := 1; round <= 4; round++ {
		g, err := m.RefineToward(ts)
		if err != nil {
			t.Fatalf("round %d: %v", round, err)
		}
		f := float64(len(g.Tets)) / float64(len(m.Tets))
		factors = append(factors, f)
		if f > 8 {
			t.Errorf("round %d: %d tetrahedra from %d", round, len(g.Tets), len(m.Tets))
		}
		m = g
	}
	if factors[3] > 3.5 {
		t.Errorf("factors of the rounds %.3g: the fourth does not fall below 3.5", factors)
	}
	if h := touchingDiam(m, segs); h > math.Ldexp(h0, -1) {
		t.Errorf("after 4 rounds the tetrahedra at the edges have diameter %.3g, ungraded %.3g", h, h0)
	}
	t.Logf("%d tetrahedra after 4 rounds, factors %.3g", len(m.Tets), factors)
}
