package sweep

import (
	"strings"
	"testing"
)

// TestFamilyOfPolyhedraRefused: a family whose points are polyhedra is
// refused when it is read, before anything is computed, at the template's
// domain and with the true reason (no tetrahedral elements yet).
func TestFamilyOfPolyhedraRefused(t *testing.T) {
	_, err := ParseFamily([]byte(`{"template": {"domain": {"polyhedron": {
		"vertices": [["0","0","0"],["L","0","0"],["0","1","0"],["0","0","1"]],
		"faces": [[0,2,1],[0,1,3],[0,3,2],[1,2,3]]}}, "boundary": "dirichlet"},
		"parameters": [{"name": "L", "values": ["1", "2"]}]}`))
	if err == nil || !strings.Contains(err.Error(), "template.domain.polyhedron: point 0 (L=1): polyhedra cannot be certified yet") {
		t.Fatalf("error %v", err)
	}
	if strings.Count(err.Error(), "cannot be certified yet") != 1 {
		t.Errorf("the reason is repeated for every point:\n%v", err)
	}
}
