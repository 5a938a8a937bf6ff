package cover

import "testing"

// TestPotentialOrderOnAPolyhedron decides the sign of ∂V/∂c over the
// bounding box of a polyhedron, the unit cube moved to x ∈ [−1, 0]: there
// ∂(c·tanh x)/∂c = tanh x ≤ 0 and ∂(c·atan x)/∂c = atan x ≤ 0 (the
// eigenvalues decrease in c), and ∂(c·z)/∂c = z ≥ 0 with z ∈ [0, 1].
func TestPotentialOrderOnAPolyhedron(t *testing.T) {
	const cube = `{"polyhedron": {"vertices": [["-1","0","0"],["0","0","0"],["0","1","0"],["-1","1","0"],["-1","0","1"],["0","0","1"],["0","1","1"],["-1","1","1"]],
	  "faces": [[0,3,2,1],[4,5,6,7],[0,1,5,4],[1,2,6,5],[2,3,7,6],[3,0,4,7]]}}`
	for _, c := range []struct {
		potential string
		direction int
	}{
		{"c*tanh(x)", -1},
		{"c*atan(x)", -1},
		{"c*z", 1},
		{"c*(x+1)*y*z", 1},
	} {
		f, err := ParseFamily([]byte(`{"template": {"domain": ` + cube + `, "potential": "` + c.potential + `", "boundary": "dirichlet"},
		  "parameters": [{"name": "c", "range": {"lo": "0", "hi": "1"}, "min_cell": "1/8"}]}`))
		if err != nil {
			t.Errorf("V = %s: %v", c.potential, err)
			continue
		}
		if d := f.Dependences[0]; d.Direction != c.direction {
			t.Errorf("V = %s: direction %d (derivative %v), want %d", c.potential, d.Direction, d.Uses[0].Derivative, c.direction)
		}
	}
}
