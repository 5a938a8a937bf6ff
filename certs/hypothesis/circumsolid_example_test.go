package hypothesis_test

import (
	"fmt"

	"gapcert/certs/hypothesis"
	"gapcert/fem/problem"
)

// A kite (two pairs of equal adjacent sides) has an incircle; the
// trapezoid with sides 3, √2, 1, √2 has none (3 + 1 ≠ 2√2, Pitot) and is
// no rectangle, so it is not a product of circumsolids.
func ExampleTangential() {
	for _, polygon := range []string{
		`[["0","0"],["1","-1"],["3","0"],["1","1"]]`,
		`[["0","0"],["3","0"],["2","1"],["1","1"]]`,
	} {
		p, err := problem.Parse([]byte(`{"domain":{"polygon":` + polygon + `},"boundary":{"robin":"1"}}`))
		if err != nil {
			fmt.Println(err)
			return
		}
		t, c := hypothesis.Tangential(p), hypothesis.ProductOfCircumsolids(p)
		fmt.Printf("%s: %s (%s); %s: %s\n", t.Name, t.Verdict, t.Detail, c.Name, c.Verdict)
	}
	// Output:
	// tangential_polygon: proven (convex, and the circle tangent to the lines of sides 0, 1 and 2 is tangent to the lines of all 4 sides (decided exactly)); circumsolid_product: proven
	// tangential_polygon: disproven (the line of side 3 is not tangent to the circle tangent to the lines of sides 0, 1 and 2 on the polygon's side); circumsolid_product: disproven
}

// The truncated square pyramid with bottom side 4, top side 1 and height
// 2 has an inscribed ball (of radius 1: its section through the axis is a
// tangential trapezoid, 2·√(2² + (3/2)²) = 4 + 1); the box 1 × 1 × 2 has
// none but is a product of intervals.
func ExampleCircumsolid() {
	for _, solid := range []string{
		`{"vertices": [["-2","-2","0"],["2","-2","0"],["2","2","0"],["-2","2","0"],["-1/2","-1/2","2"],["1/2","-1/2","2"],["1/2","1/2","2"],["-1/2","1/2","2"]],
		  "faces": [[0,3,2,1],[4,5,6,7],[0,1,5,4],[1,2,6,5],[2,3,7,6],[3,0,4,7]]}`,
		`{"vertices": [["0","0","0"],["1","0","0"],["1","1","0"],["0","1","0"],["0","0","2"],["1","0","2"],["1","1","2"],["0","1","2"]],
		  "faces": [[0,3,2,1],[4,5,6,7],[0,1,5,4],[1,2,6,5],[2,3,7,6],[3,0,4,7]]}`,
	} {
		p, err := problem.Parse([]byte(`{"domain":{"polyhedron":` + solid + `},"boundary":"dirichlet"}`))
		if err != nil {
			fmt.Println(err)
			return
		}
		b, c := hypothesis.Circumsolid(p), hypothesis.ProductOfCircumsolids(p)
		fmt.Printf("%s: %s; %s: %s (%s)\n", b.Name, b.Verdict, c.Name, c.Verdict, c.Detail)
	}
	// Output:
	// circumsolid: proven; circumsolid_product: proven (a circumsolid: convex, and the ball tangent to the planes of faces 0, 1, 2 and 3 is tangent to the planes of all 6 faces (decided exactly); its radius 3·volume/surface area ∈ [1, 1])
	// circumsolid: disproven; circumsolid_product: proven (a box: the right prism over the rectangle face 0 (decided exactly))
}
