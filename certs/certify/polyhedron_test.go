package certify

import (
	"context"
	"errors"
	"strings"
	"testing"

	"gapcert/certs"
	"gapcert/fem/problem"
)

// TestPolyhedronRefused: a valid polyhedron problem is refused by every
// entry point with an *UnsupportedError naming the domain, before anything
// is computed.
func TestPolyhedronRefused(t *testing.T) {
	p, err := problem.Parse([]byte(`{"domain": {"polyhedron": {
		"vertices": [["0","0","0"],["1","0","0"],["0","1","0"],["0","0","1"]],
		"faces": [[0,2,1],[0,1,3],[0,3,2],[1,2,3]]}}, "boundary": "dirichlet", "claims": ["gap > 0"]}`))
	if err != nil {
		t.Fatal(err)
	}
	var ue *UnsupportedError
	if _, err := Certify(context.Background(), p, Options{}); !errors.As(err, &ue) || ue.Path != "domain.polyhedron" {
		t.Errorf("Certify: %v", err)
	}
	if _, err := FirstPlan(p); !errors.As(err, &ue) {
		t.Errorf("FirstPlan: %v", err)
	}
	if _, err := ApproximateModes(p, &certs.Certificate{}, 2); !errors.As(err, &ue) {
		t.Errorf("ApproximateModes: %v", err)
	}

	// A certificate of an interval whose problem is replaced by the
	// polyhedron: Check reports that its method does not fit the problem,
	// without computing.
	q, err := problem.Parse([]byte(`{"domain": {"interval": ["0", "1"]}, "boundary": "dirichlet"}`))
	if err != nil {
		t.Fatal(err)
	}
	c, err := Certify(context.Background(), q, Options{RelWidth: "1e-4"})
	if err != nil {
		t.Fatal(err)
	}
	c.Problem = p.Canonical()
	c.ProblemSHA256 = p.SHA256()
	data, err := c.Marshal()
	if err != nil {
		t.Fatal(err)
	}
	var fe *certs.FormatError
	if err := Check(data); !errors.As(err, &fe) || !strings.Contains(err.Error(), "3-dimensional") {
		t.Errorf("Check: %v", err)
	}
}
