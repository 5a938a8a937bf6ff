package problem

import (
	"errors"
	"math"
	"strings"
	"testing"
)

// TestPolyhedronRefusesImproperSurfaces feeds closed surfaces that are not
// the boundary of a solid the cone tetrahedra can tile, each of which must
// be refused before any computation with an issue that names the part of
// the file at fault:
//
//   - a surface that winds twice around an axis (a bipyramid over a
//     pentagram: every edge in two faces, orientable, every face seen
//     positively from the origin, so only the self-intersection test can
//     refuse it; the cone tetrahedra would cover the core twice);
//   - a dent whose tip touches the opposite face, and one whose tip
//     passes through it;
//   - a face that is planar only up to 1e-17 (exact rationals decide it),
//     and one whose planarity intervals cannot decide (1 + e^(−50));
//   - a vertex inserted on an edge of two faces (a collinear run);
//   - a T-junction: a vertex on an edge used by one face only;
//   - two cubes sharing an edge, and two cubes sharing only a vertex;
//   - a dent whose tip is the centre vertex of the opposite face, split
//     into four triangles around it: a connected surface whose faces
//     around that vertex form two fans;
//   - a solid torus (a square frame), whose surface passes every
//     combinatorial test but is star-shaped from no point.
func TestPolyhedronRefusesImproperSurfaces(t *testing.T) {
	dented := func(z string) [][3]string {
		return append(append([][3]string{}, cubeVertices...), [3]string{"1/2", "1/2", z})
	}
	dentFaces := [][]int{{0, 3, 2, 1}, {0, 1, 5, 4}, {1, 2, 6, 5}, {2, 3, 7, 6}, {3, 0, 4, 7}, {4, 5, 8}, {5, 6, 8}, {6, 7, 8}, {7, 4, 8}}
	topMoved := func(z string) [][3]string {
		v := append([][3]string{}, cubeVertices...)
		v[6] = [3]string{"1", "1", z}
		return v
	}
	// Pentagram bipyramid: a convex pentagon P0..P4 in z = 0, joined in
	// the order P0 P2 P4 P1 P3 to the tips (0, 0, ±1).
	pentagram := [][3]string{{"1", "0", "0"}, {"3/10", "19/20", "0"}, {"-4/5", "3/5", "0"}, {"-4/5", "-3/5", "0"}, {"3/10", "-19/20", "0"}, {"0", "0", "1"}, {"0", "0", "-1"}}
	pentagramFaces := [][]int{{5, 0, 2}, {5, 2, 4}, {5, 4, 1}, {5, 1, 3}, {5, 3, 0}, {6, 2, 0}, {6, 4, 2}, {6, 1, 4}, {6, 3, 1}, {6, 0, 3}}
	withMid := append(append([][3]string{}, cubeVertices...), [3]string{"1/2", "0", "0"})
	// A second unit cube [1, 2] × [1, 2] × [0, 1] (sharing the edge 2–6)
	// or [1, 2]³ (sharing the vertex 6), as vertices 8–13 or 8–14.
	edgeCubes := append(append([][3]string{}, cubeVertices...),
		[3]string{"2", "1", "0"}, [3]string{"2", "2", "0"}, [3]string{"1", "2", "0"}, [3]string{"2", "1", "1"}, [3]string{"2", "2", "1"}, [3]string{"1", "2", "1"})
	edgeCubeFaces := append(append([][]int{}, cubeFaces...), []int{2, 10, 9, 8}, []int{6, 11, 12, 13}, []int{2, 8, 11, 6}, []int{8, 9, 12, 11}, []int{9, 10, 13, 12}, []int{10, 2, 6, 13})
	vertexCubes := append(append([][3]string{}, cubeVertices...),
		[3]string{"2", "1", "1"}, [3]string{"2", "2", "1"}, [3]string{"1", "2", "1"}, [3]string{"1", "1", "2"}, [3]string{"2", "1", "2"}, [3]string{"2", "2", "2"}, [3]string{"1", "2", "2"})
	vertexCubeFaces := append(append([][]int{}, cubeFaces...), []int{6, 10, 9, 8}, []int{11, 12, 13, 14}, []int{6, 8, 12, 11}, []int{8, 9, 13, 12}, []int{9, 10, 14, 13}, []int{10, 6, 11, 14})
	// The square frame [0, 3]² minus (1, 2)², times [0, 1].
	frame := [][3]string{{"0", "0", "0"}, {"3", "0", "0"}, {"3", "3", "0"}, {"0", "3", "0"}, {"1", "1", "0"}, {"2", "1", "0"}, {"2", "2", "0"}, {"1", "2", "0"},
		{"0", "0", "1"}, {"3", "0", "1"}, {"3", "3", "1"}, {"0", "3", "1"}, {"1", "1", "1"}, {"2", "1", "1"}, {"2", "2", "1"}, {"1", "2", "1"}}
	frameFaces := [][]int{{0, 1, 5, 4}, {1, 2, 6, 5}, {2, 3, 7, 6}, {3, 0, 4, 7}, {8, 9, 13, 12}, {9, 10, 14, 13}, {10, 11, 15, 14}, {11, 8, 12, 15},
		{0, 1, 9, 8}, {1, 2, 10, 9}, {2, 3, 11, 10}, {3, 0, 8, 11}, {4, 5, 13, 12}, {5, 6, 14, 13}, {6, 7, 15, 14}, {7, 4, 12, 15}}
	for _, c := range []struct {
		name     string
		vertices [][3]string
		faces    [][]int
		want     string
	}{
		{"doubly wound", pentagram, pentagramFaces, "domain.polyhedron.faces: faces 0 and 2 intersect"},
		{"touching dent", dented("0"), dentFaces, "domain.polyhedron.faces: faces 0 and 5 intersect"},
		{"piercing dent", dented("-1/10"), dentFaces, "domain.polyhedron.faces: faces 0 and 5 intersect"},
		{"planar up to 1e-17", topMoved("1 + 1/100000000000000000"), cubeFaces, "domain.polyhedron.faces[1]: face 1 is not planar"},
		{"planarity undecided", topMoved("1 + exp(-50)"), cubeFaces, "domain.polyhedron.faces[1]: cannot decide whether face 1 is planar"},
		{"collinear run", withMid, [][]int{{0, 3, 2, 1, 8}, {4, 7, 6, 5}, {0, 8, 1, 5, 4}, {1, 2, 6, 5}, {2, 3, 7, 6}, {3, 0, 4, 7}},
			"domain.polyhedron.faces[0]: vertex 8 of face 0 is collinear with its neighbours"},
		{"T-junction", withMid, [][]int{{0, 3, 2, 1}, {4, 7, 6, 5}, {0, 8, 4}, {8, 5, 4}, {8, 1, 5}, {1, 2, 6, 5}, {2, 3, 7, 6}, {3, 0, 4, 7}},
			"lies in 1 face(s)"},
		{"cubes sharing an edge", edgeCubes, edgeCubeFaces, "edge 2–6 lies in 4 face(s)"},
		{"cubes sharing a vertex", vertexCubes, vertexCubeFaces, "domain.polyhedron.faces[6]: face 6 is not connected to face 0"},
		{"pinched vertex", dented("0"), [][]int{{0, 1, 8}, {1, 2, 8}, {2, 3, 8}, {3, 0, 8}, {0, 1, 5, 4}, {1, 2, 6, 5}, {2, 3, 7, 6}, {3, 0, 4, 7}, {4, 5, 8}, {5, 6, 8}, {6, 7, 8}, {7, 4, 8}},
			"domain.polyhedron.vertices[8]: vertex 8 is pinched"},
		{"solid torus", frame, frameFaces, "domain.polyhedron: no tried point lies strictly on the inner side of every face's plane"},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, err := Parse(polyFile(c.vertices, c.faces, `"dirichlet"`))
			var perr *Error
			if !errors.As(err, &perr) {
				t.Fatalf("error %v, want *Error", err)
			}
			found := false
			for _, is := range perr.Issues {
				found = found || strings.Contains(is.String(), c.want)
			}
			if !found {
				t.Errorf("got\n%v\nwant an issue containing %q", err, c.want)
			}
		})
	}
}

// TestPolyhedronCoplanarFaces: faces that share a plane are accepted and
// measured like one face. The unit cube whose top is four triangles
// around its centre (1/2, 1/2, 1) (a "dent" of depth 0), and the unit cube
// whose top is split along a diagonal into two faces, are convex with
// volume 1, surface area 6 and diameter √3 (common practice); the apex
// lies strictly inside every face plane, so the top's centre, a vertex on
// the plane of four faces, is no obstacle.
func TestPolyhedronCoplanarFaces(t *testing.T) {
	flatDent := append(append([][3]string{}, cubeVertices...), [3]string{"1/2", "1/2", "1"})
	for _, c := range []struct {
		name     string
		vertices [][3]string
		faces    [][]int
	}{
		{"four top triangles", flatDent, [][]int{{0, 3, 2, 1}, {0, 1, 5, 4}, {1, 2, 6, 5}, {2, 3, 7, 6}, {3, 0, 4, 7}, {4, 5, 8}, {5, 6, 8}, {6, 7, 8}, {7, 4, 8}}},
		{"top split in two", cubeVertices, [][]int{{0, 3, 2, 1}, {4, 5, 6}, {4, 6, 7}, {0, 1, 5, 4}, {1, 2, 6, 5}, {2, 3, 7, 6}, {3, 0, 4, 7}}},
	} {
		t.Run(c.name, func(t *testing.T) {
			p, err := Parse(polyFile(c.vertices, c.faces, `"dirichlet"`))
			if err != nil {
				t.Fatal(err)
			}
			ph := p.Polyhedron
			if ph.Convex() != "convex" {
				t.Errorf("convexity %q, want convex", ph.Convex())
			}
			containsNarrow(t, "volume", ph.Volume(), 1)
			containsNarrow(t, "surface area", ph.SurfaceArea(), 6)
			containsNarrow(t, "diameter", ph.Diameter(), math.Sqrt(3))
		})
	}
}
