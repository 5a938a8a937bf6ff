package mesh3_test

import (
	"fmt"

	"gapcert/fem/mesh3"
	"gapcert/interval"
)

// The unit tetrahedron with vertices 0, e_1, e_2, e_3, refined twice: the
// enclosures of the 64 tetrahedra's volumes add up to an enclosure of 1/6
// (a few ulps wide: 1/6 is not a float), and the longest edge is √3/4, a
// diagonal of the inner octahedra.
func ExampleFromPolyhedron() {
	p := func(x, y, z float64) [3]interval.I {
		return [3]interval.I{interval.Point(x), interval.Point(y), interval.Point(z)}
	}
	nodes := [][3]interval.I{p(0, 0, 0), p(1, 0, 0), p(0, 1, 0), p(0, 0, 1)}
	bnd := []mesh3.BoundaryFace{{A: 1, B: 2, C: 3, Face: 0}, {A: 0, B: 3, C: 2, Face: 1}, {A: 0, B: 1, C: 3, Face: 2}, {A: 0, B: 2, C: 1, Face: 3}}
	m, err := mesh3.FromPolyhedron(nodes, [][4]int{{0, 1, 2, 3}}, bnd)
	if err != nil {
		fmt.Println(err)
		return
	}
	m = m.Refine().Refine()
	vol := interval.Point(0)
	for t := range m.Tets {
		vol = vol.Add(m.Geom(t).Volume)
	}
	edges, _ := m.Edges()
	faces, _ := m.Faces()
	fmt.Println(len(m.Nodes), "nodes,", len(edges), "edges,", len(faces), "faces,", len(m.Tets), "tetrahedra,", len(m.Bnd), "boundary faces")
	fmt.Println("6·volume", vol.MulF(6), "h_max", m.HMax())
	// Output:
	// 35 nodes, 130 edges, 160 faces, 64 tetrahedra, 64 boundary faces
	// 6·volume [0.9999999999999974, 1.000000000000003] h_max 0.43301270189221935
}
