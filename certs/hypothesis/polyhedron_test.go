package hypothesis

import (
	"testing"

	"gapcert/certs"
	"gapcert/fem/claim/named"
	"gapcert/fem/problem"
)

// TestPolyhedronHypotheses: convexity of a cube (proven) and of a cube
// with a pyramid dent in its top face (disproven, the witness lies outside
// a face's plane); the face conditions are read as sides; polygon-only
// procedures are undecided rather than run on a polyhedron.
func TestPolyhedronHypotheses(t *testing.T) {
	const cube = `"vertices": [["0","0","0"],["1","0","0"],["1","1","0"],["0","1","0"],["0","0","1"],["1","0","1"],["1","1","1"],["0","1","1"]`
	p, err := problem.Parse([]byte(`{"domain": {"polyhedron": {` + cube + `], "faces": [[0,3,2,1],[4,5,6,7],[0,1,5,4],[1,2,6,5],[2,3,7,6],[3,0,4,7]]}}, "boundary": "dirichlet"}`))
	if err != nil {
		t.Fatal(err)
	}
	for name, want := range map[string]string{
		named.ConvexDomain: certs.Proven, named.DirichletBoundary: certs.Proven, named.NeumannBoundary: certs.Disproven,
		named.ZeroPotential: certs.Proven, named.Triangle: certs.Undecided, named.Rectangle: certs.Undecided, named.ConvexPotential: certs.Undecided,
	} {
		if h, ok := Decide(name, p); !ok || h.Verdict != want {
			t.Errorf("%s: %+v, want %v", name, h, want)
		}
	}
	dented, err := problem.Parse([]byte(`{"domain": {"polyhedron": {` + cube + `, ["1/2","1/2","3/4"]],
		"faces": [[0,3,2,1],[0,1,5,4],[1,2,6,5],[2,3,7,6],[3,0,4,7],[4,5,8],[5,6,8],[6,7,8],[7,4,8]]}}, "boundary": "neumann"}`))
	if err != nil {
		t.Fatal(err)
	}
	h, _ := Decide(named.ConvexDomain, dented)
	if h.Verdict != certs.Disproven || h.Witness == nil || h.Witness.Vertex == nil {
		t.Fatalf("dented cube: %+v", h)
	}
	// Exactly the four top corners lie outside a dent triangle's plane.
	if v := *h.Witness.Vertex; v < 4 || v > 7 {
		t.Errorf("witness vertex %d", v)
	}
}
