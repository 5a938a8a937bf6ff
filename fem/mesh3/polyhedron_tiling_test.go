package mesh3

import (
	"math"
	"strconv"
	"testing"

	"gapcert/interval"
)

// Solids at the edge of what the polyhedron reader accepts: a kernel that
// is a thin slab, planarity that holds only by an exact identity, and a
// cube in general position (exact rational rotation). Each must be meshed
// by the cone tetrahedra, which tile it (FromPolyhedron's proof), and the
// tiling must survive refinement with every boundary triangle in the plane
// of its face and the face areas conserved per label.
var edgeSolids = []struct {
	solid
	area []float64 // exact area of each face (rounded)
}{
	// The unit cube with a pyramid dent of depth 999/1000 in its top face:
	// the kernel (points strictly inside every face plane) is a slab of
	// height below 1/1000 above the bottom face, which the apex must find.
	// Volume 1 − (1/3)(999/1000) = 667/1000; the dent triangles have base 1
	// and height √((1/2)² + (999/1000)²).
	{solid{"deep dent", append(append([][3]string{}, cube...), [3]string{"1/2", "1/2", "1/1000"}),
		[][]int{{0, 3, 2, 1}, {0, 1, 5, 4}, {1, 2, 6, 5}, {2, 3, 7, 6}, {3, 0, 4, 7}, {4, 5, 8}, {5, 6, 8}, {6, 7, 8}, {7, 4, 8}}, 0.667},
		[]float64{1, 1, 1, 1, 1, dentArea, dentArea, dentArea, dentArea}},
	// The unit cube whose vertex 6 is written 1 + sin(π) (exactly 1 in the
	// cyclotomic numbers) and whose vertex 7 has z = √2·√8 − 3 (exactly 1 as
	// a surd): the top face is planar only by these identities.
	{solid{"identities", append(append(append([][3]string{}, cube[:6]...), [3]string{"1", "1", "1 + sin(pi)"}), [3]string{"0", "1", "sqrt(2)*sqrt(8) - 3"}),
		[][]int{{0, 3, 2, 1}, {4, 5, 6, 7}, {0, 1, 5, 4}, {1, 2, 6, 5}, {2, 3, 7, 6}, {3, 0, 4, 7}}, 1},
		[]float64{1, 1, 1, 1, 1, 1}},
	// The cube [0, 2]³ rotated by R = R_x R_z (R_z: cos = 3/5, sin = 4/5;
	// R_x: cos = 5/13, sin = 12/13, Pythagorean triples, so R is an exact
	// rational rotation) and translated by (1/3, −2/7, 5): volume 8, every
	// face of area 4.
	{solid{"rotated cube", rotatedCube(), [][]int{{0, 3, 2, 1}, {4, 5, 6, 7}, {0, 1, 5, 4}, {1, 2, 6, 5}, {2, 3, 7, 6}, {3, 0, 4, 7}}, 8},
		[]float64{4, 4, 4, 4, 4, 4}},
}

var dentArea = 0.5 * math.Sqrt(0.25+0.999*0.999)

// rotatedCube returns the vertices of the rotated cube of edgeSolids, in
// the order of cube, as exact rational text.
func rotatedCube() [][3]string {
	// R = R_x R_z with numerators over 65 = 5·13.
	rz := [3][3]int{{39, -52, 0}, {52, 39, 0}, {0, 0, 65}} // 13·(3, −4; 4, 3), 65 on z: R_z·65
	rx := [3][3]int{{13, 0, 0}, {0, 5, -12}, {0, 12, 5}}   // R_x·13
	var r [3][3]int                                        // R·845 = (R_x·13)(R_z·65)
	for i := range 3 {
		for j := range 3 {
			for k := range 3 {
				r[i][j] += rx[i][k] * rz[k][j]
			}
		}
	}
	shift := [3][2]int{{1, 3}, {-2, 7}, {5, 1}}
	var out [][3]string
	for _, v := range cube {
		var p [3]int // 2·vertex of the unit cube: a vertex of [0, 2]³
		for c := range 3 {
			if v[c] == "1" {
				p[c] = 2
			}
		}
		var w [3]string
		for i := range 3 {
			num := 0
			for j := range 3 {
				num += r[i][j] * p[j]
			}
			// num/845 + a/b = (num·b + 845·a)/(845·b)
			w[i] = strconv.Itoa(num*shift[i][1]+845*shift[i][0]) + "/" + strconv.Itoa(845*shift[i][1])
		}
		out = append(out, w)
	}
	return out
}

// TestConeTetrahedraTileEdgeSolids checks, at levels 0–2, that the volume
// enclosures sum to an enclosure of the exact volume, that the face check
// passes, that each boundary triangle's nodes lie in the plane of its
// face (the enclosure of n·(x − v0) contains 0) and that the areas of the
// boundary triangles of each face sum to an enclosure of its area.
func TestConeTetrahedraTileEdgeSolids(t *testing.T) {
	for _, s := range edgeSolids {
		t.Run(s.name, func(t *testing.T) {
			m := fromSolid(t, s.solid)
			// The plane of each face from its first three boundary
			// triangles' nodes at level 0 (exact vertices, enclosed).
			var normal [][3]interval.I
			var origin [][3]interval.I
			for f := range s.area {
				for _, b := range m.Bnd {
					if b.Face == f {
						a, bb, c := m.Nodes[b.A], m.Nodes[b.B], m.Nodes[b.C]
						normal = append(normal, cross(sub3(bb, a), sub3(c, a)))
						origin = append(origin, a)
						break
					}
				}
			}
			if len(normal) != len(s.area) {
				t.Fatalf("%d faces carry boundary triangles, want %d", len(normal), len(s.area))
			}
			for level := 0; level <= 2; level++ {
				if level > 0 {
					m = m.Refine()
				}
				var sum interval.I
				for k := range m.Tets {
					sum = sum.Add(m.Geom(k).Volume)
				}
				tol := 8 * s.volume * 0x1p-52
				if !(sum.Lo <= s.volume+tol && s.volume-tol <= sum.Hi) || sum.Wid() > 1e-12*s.volume {
					t.Errorf("level %d: volumes sum to %v, exact %v", level, sum, s.volume)
				}
				if err := m.checkFaces(); err != nil {
					t.Errorf("level %d: %v", level, err)
				}
				checkTopology(t, m)
				area := make([]interval.I, len(s.area))
				for j, b := range m.Bnd {
					for _, k := range []int{b.A, b.B, b.C} {
						if d := dot(normal[b.Face], sub3(m.Nodes[k], origin[b.Face])); !(d.Lo <= 0 && 0 <= d.Hi) {
							t.Fatalf("level %d: boundary triangle %d node %d off the plane of face %d: %v", level, j, k, b.Face, d)
						}
					}
					n := cross(sub3(m.Nodes[b.B], m.Nodes[b.A]), sub3(m.Nodes[b.C], m.Nodes[b.A]))
					a2, _ := dot(n, n).Sqrt()
					area[b.Face] = area[b.Face].Add(a2.MulF(0.5))
				}
				for f, a := range area {
					want := s.area[f]
					tol := 16 * want * 0x1p-52
					if !(a.Lo <= want+tol && want-tol <= a.Hi) || a.Wid() > 1e-11*want {
						t.Errorf("level %d: face %d area %v, exact %v", level, f, a, want)
					}
				}
			}
		})
	}
}

func sub3(a, b [3]interval.I) [3]interval.I {
	return [3]interval.I{a[0].Sub(b[0]), a[1].Sub(b[1]), a[2].Sub(b[2])}
}
