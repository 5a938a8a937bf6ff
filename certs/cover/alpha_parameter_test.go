package cover

import (
	"testing"

	"gapcert/certs"
)

// TestParameterNamedAlphaWithoutRobinSides: on the Dirichlet interval
// (0, 1) with V = alpha·x², alpha ∈ [0, 1], the claim "lambda1 >= alpha"
// names the parameter alpha (claims mean the parameter by that name, as
// at a single problem), which has a value on every cell; λ1 ≥ π² > 1
// (V ≥ 0, λ1 of the interval with V = 0 is π², common practice), so it
// holds on every cell (before: undecided, "alpha has no value: no side has
// a Robin condition").
func TestParameterNamedAlphaWithoutRobinSides(t *testing.T) {
	f := mustFamily(t, `{"template": {"domain": {"interval": ["0", "1"]}, "potential": "alpha*x^2", "boundary": "dirichlet"},
	  "parameters": [{"name": "alpha", "range": {"lo": "0", "hi": "1"}, "min_cell": "1/2"}],
	  "claims": ["lambda1 >= alpha"], "relative_width": "1e-6"}`)
	s, err := Run(f, t.TempDir(), testOptions())
	if err != nil {
		t.Fatal(err)
	}
	for _, r := range s.Cells {
		if r.Verdict != certs.Holds {
			t.Errorf("cell %v: %s, want holds", r.Bounds, r.Verdict)
		}
	}
}
