package problem

import (
	"strings"
	"testing"
)

// TestClaimScopeOnPolyhedra: a polyhedron tells its claims its vertex
// count (so that inradius exists on a tetrahedron and nowhere else in
// three dimensions), and the reasons why alpha has no value speak of
// faces, not sides.
func TestClaimScopeOnPolyhedra(t *testing.T) {
	tetra := [][3]string{{"0", "0", "0"}, {"1", "0", "0"}, {"0", "1", "0"}, {"0", "0", "1"}}
	tetraFaces := [][]int{{0, 2, 1}, {0, 1, 3}, {0, 3, 2}, {1, 2, 3}}
	withClaims := func(file []byte, claims string) []byte {
		s := string(file)
		return []byte(s[:len(s)-1] + `, "claims": [` + claims + `]}`)
	}
	if _, err := Parse(withClaims(polyFile(tetra, tetraFaces, `"dirichlet"`), `"gap*inradius^2 > 0"`)); err != nil {
		t.Errorf("inradius on a tetrahedron: %v", err)
	}
	_, err := Parse(withClaims(polyFile(cubeVertices, cubeFaces, `"dirichlet"`), `"gap*inradius^2 > 0"`))
	if err == nil || !strings.Contains(err.Error(), "tetrahedra only") || !strings.Contains(err.Error(), "volume, surface_area or D") || strings.Contains(err.Error(), "perimeter") {
		t.Errorf("inradius on a cube: %v", err)
	}
	for _, c := range []struct{ boundary, why string }{
		{`"neumann"`, "no face has a Robin condition"},
		{`[{"robin":"1"},{"robin":"2"},"neumann","neumann","neumann","neumann"]`, "different coefficients, 1 (face 0) and 2 (face 1)"},
	} {
		p, err := Parse(polyFile(cubeVertices, cubeFaces, c.boundary))
		if err != nil {
			t.Fatal(err)
		}
		s := p.ClaimScope()
		if s.Vertices != 8 || !strings.Contains(s.NoAlpha, c.why) {
			t.Errorf("%s: scope %+v, want 8 vertices and %q", c.boundary, s, c.why)
		}
	}
}
