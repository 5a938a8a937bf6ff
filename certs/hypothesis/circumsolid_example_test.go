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
