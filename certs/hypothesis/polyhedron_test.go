package hypothesis

import (
	"strconv"
	"testing"

	"gapcert/certs"
	"gapcert/fem/claim/named"
	"gapcert/fem/problem"
)

// TestPolyhedronHypotheses: convexity of a cube (proven) and of a cube
// with a pyramid dent in its top face (disproven, the witness lies outside
// a face's plane); the face conditions are read as sides; the polygon
// shapes are undecided rather than run on a polyhedron.
func TestPolyhedronHypotheses(t *testing.T) {
	const cube = `"vertices": [["0","0","0"],["1","0","0"],["1","1","0"],["0","1","0"],["0","0","1"],["1","0","1"],["1","1","1"],["0","1","1"]`
	p, err := problem.Parse([]byte(`{"domain": {"polyhedron": {` + cube + `], "faces": [[0,3,2,1],[4,5,6,7],[0,1,5,4],[1,2,6,5],[2,3,7,6],[3,0,4,7]]}}, "boundary": "dirichlet"}`))
	if err != nil {
		t.Fatal(err)
	}
	for name, want := range map[string]string{
		named.ConvexDomain: certs.Proven, named.DirichletBoundary: certs.Proven, named.NeumannBoundary: certs.Disproven,
		named.ZeroPotential: certs.Proven, named.Triangle: certs.Undecided, named.Rectangle: certs.Undecided, named.ConvexPotential: certs.Proven,
		named.ContinuousPotential: certs.Proven, TangentialPolygon: certs.Undecided,
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
	if h, _ := Decide(named.DirichletBoundary, dented); h.Detail != "face 0 has a neumann condition" {
		t.Errorf("boundary detail on a polyhedron: %q", h.Detail)
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

const (
	unitCube  = `{"polyhedron": {"vertices": [["0","0","0"],["1","0","0"],["1","1","0"],["0","1","0"],["0","0","1"],["1","0","1"],["1","1","1"],["0","1","1"]], "faces": [[0,3,2,1],[4,5,6,7],[0,1,5,4],[1,2,6,5],[2,3,7,6],[3,0,4,7]]}}`
	dentedTop = `{"polyhedron": {"vertices": [["0","0","0"],["1","0","0"],["1","1","0"],["0","1","0"],["0","0","1"],["1","0","1"],["1","1","1"],["0","1","1"],["1/2","1/2","3/4"]],
		"faces": [[0,3,2,1],[0,1,5,4],[1,2,6,5],[2,3,7,6],[3,0,4,7],[4,5,8],[5,6,8],[6,7,8],[7,4,8]]}}`
	// The tetrahedron with vertices 0, e1, e2, e3.
	cornerTetrahedron = `{"polyhedron": {"vertices": [["0","0","0"],["1","0","0"],["0","1","0"],["0","0","1"]], "faces": [[0,2,1],[0,1,3],[0,3,2],[1,2,3]]}}`
)

// TestPolyhedronPotentialHypotheses: convexity, continuity and vanishing
// of V on polyhedra, decided over the cone tetrahedra. The Hessians are
// closed forms: x² + y² + z² has 2I (positive definite); x² − z² has
// diag(2, 0, −2) (H33 < 0 everywhere, so a witness is found at once);
// exp(x + y + z) has e^s·J, J the all-ones matrix, whose principal 2×2
// minors e^{2s} − e^{2s} are 0 exactly but enclosed with both signs, so
// it is undecided, never proven or disproven by rounding; (x + y + z)^4
// is convex but its Hessian 12s²J is singular likewise. √(x + y + z) is
// continuous on the closed corner tetrahedron and concave (H11 =
// −s^(−3/2)/4 < 0 inside).
func TestPolyhedronPotentialHypotheses(t *testing.T) {
	for _, c := range []struct {
		domain, v, name, want string
	}{
		{unitCube, "x^2+y^2+z^2", named.ConvexPotential, certs.Proven},
		{unitCube, "x^2-z^2", named.ConvexPotential, certs.Disproven},
		{unitCube, "exp(x+y+z)", named.ConvexPotential, certs.Undecided},
		{unitCube, "(x+y+z)^4", named.ConvexPotential, certs.Undecided},
		{dentedTop, "x^2+y^2+z^2+x*y", named.ConvexPotential, certs.Proven},
		{dentedTop, "-(x-1/2)^2-(y-1/2)^2", named.ConvexPotential, certs.Disproven},
		{unitCube, "sin(x*y*z)", named.ContinuousPotential, certs.Proven},
		{cornerTetrahedron, "sqrt(x+y+z)", named.ContinuousPotential, certs.Proven},
		{cornerTetrahedron, "0*x", named.ZeroPotential, certs.Proven},
		{cornerTetrahedron, "x*y*z", named.ZeroPotential, certs.Disproven},
		{cornerTetrahedron, "sqrt(x+y+z)", named.ConvexPotential, certs.Disproven},
	} {
		p := parse(t, problemText(c.domain, c.v, `"dirichlet"`))
		h, ok := Decide(c.name, p)
		if !ok {
			t.Fatalf("%s: not decided", c.name)
		}
		requireVerdict(t, c.v+": "+c.name, h, c.want)
		if h.Verdict != certs.Disproven {
			continue
		}
		if h.Witness == nil || len(h.Witness.Point) != 3 {
			t.Fatalf("%s, %s: witness %+v", c.v, c.name, h.Witness)
		}
		pt := make([]float64, 3)
		for i, text := range h.Witness.Point {
			pt[i], _ = strconv.ParseFloat(text, 64) // FormatExact of a float64: exact
		}
		in := false
		for _, s := range topSimplices(p) {
			in = in || insideSimplex(s, pt)
		}
		if !in {
			t.Errorf("%s, %s: witness %v not verified inside", c.v, c.name, pt)
		}
	}
}
