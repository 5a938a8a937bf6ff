package mesh_test

import (
	"fmt"

	"gapcert/fem/mesh"
	"gapcert/interval"
)

// The unit square, split along its diagonal, refined three times: the 128
// triangles' areas add up to exactly 1 and the longest edge is √2/8.
func ExampleFromPolygon() {
	p := func(x, y float64) [2]interval.I { return [2]interval.I{interval.Point(x), interval.Point(y)} }
	m, err := mesh.FromPolygon([][2]interval.I{p(0, 0), p(1, 0), p(1, 1), p(0, 1)}, [][3]int{{0, 1, 2}, {0, 2, 3}})
	if err != nil {
		fmt.Println(err)
		return
	}
	m = m.Refine().Refine().Refine()
	area := interval.Point(0)
	for t := range m.Tris {
		area = area.Add(m.Geom(t).Area)
	}
	edges, _ := m.Edges()
	fmt.Println(len(m.Nodes), "nodes,", len(edges), "edges,", len(m.Tris), "triangles,", len(m.Bnd), "boundary edges")
	fmt.Println("area", area, "h_max", m.HMax())
	g := m.RefineGraded(0, 4)
	fmt.Println("graded toward (0, 0):", len(g.Tris), "triangles")
	// Output:
	// 81 nodes, 208 edges, 128 triangles, 32 boundary edges
	// area [1, 1] h_max 0.1767766952966369
	// graded toward (0, 0): 176 triangles
}
