package sweep

import (
	"testing"
)

// TestFamilyOfPolyhedra: a family whose points are polyhedra is read like
// any other (each point a valid polyhedron problem).
func TestFamilyOfPolyhedra(t *testing.T) {
	f, err := ParseFamily([]byte(`{"template": {"domain": {"polyhedron": {
		"vertices": [["0","0","0"],["L","0","0"],["0","1","0"],["0","0","1"]],
		"faces": [[0,2,1],[0,1,3],[0,3,2],[1,2,3]]}}, "boundary": "dirichlet"},
		"parameters": [{"name": "L", "values": ["1", "2"]}]}`))
	if err != nil {
		t.Fatal(err)
	}
	if len(f.Points) != 2 {
		t.Errorf("%d points, want 2", len(f.Points))
	}
}
