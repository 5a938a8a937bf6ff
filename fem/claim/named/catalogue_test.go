package named

import (
	"errors"
	"slices"
	"testing"

	"gapcert/fem/claim"
)

// TestCatalogueInequalities: every inequality parses as a claim and names
// only standard quantities or the claim's own reference; names are unique.
func TestCatalogueInequalities(t *testing.T) {
	seen := map[string]bool{}
	for _, c := range All() {
		if seen[c.Name] {
			t.Errorf("duplicate name %q", c.Name)
		}
		seen[c.Name] = true
		cl, err := claim.Parse(c.Inequality)
		if err != nil {
			t.Errorf("%s: %v", c.Name, err)
			continue
		}
		// The smallest problem every catalogue entry applies to: two
		// eigenvalues, no Robin coefficient, no parameters.
		for _, dim := range c.Dims {
			if err := c.CheckScope(claim.Scope{Dim: dim, Vertices: 3 * (dim - 1), Eigenvalues: 2, NoAlpha: "no Robin side"}); err != nil {
				t.Errorf("%s on dimension %d: %v", c.Name, dim, err)
			}
		}
		if c.Reference != "" && !slices.Contains(cl.Vars(), c.Reference) {
			t.Errorf("%s: reference %q unused", c.Name, c.Reference)
		}
		if (c.Reference == "") != (c.ReferenceResult == "") || c.ReferenceResult != "" && !claim.IsQuantity(c.ReferenceResult) {
			t.Errorf("%s: reference %q denotes %q", c.Name, c.Reference, c.ReferenceResult)
		}
		if len(c.Hypotheses) == 0 || len(c.Dims) == 0 || c.Source == "" {
			t.Errorf("%s: incomplete entry", c.Name)
		}
	}
}

func TestLookup(t *testing.T) {
	for _, text := range []string{"@fundamental_gap", " @Fundamental-Gap ", "@ fundamental_gap"} {
		c, err := Lookup(text)
		if err != nil || c.Text() != "@fundamental_gap" {
			t.Errorf("Lookup(%q) = %q, %v", text, c.Text(), err)
		}
	}
	_, err := Lookup("@fundamental_gapp")
	var ne *NameError
	if !errors.As(err, &ne) || ne.Nearest != "@fundamental_gap" {
		t.Errorf("near miss: %v", err)
	}
	_, err = Lookup("@spectral_magic")
	if !errors.As(err, &ne) || ne.Nearest != "" || ne.Hint() == "" {
		t.Errorf("unknown: %v", err)
	}
	if c, _ := Lookup("@triangle_gap"); c.Applies(1) || !c.Applies(2) {
		t.Errorf("triangle_gap dimensions %v", c.Dims)
	}
	if !IsNamed("  @x") || IsNamed("gap >= 1") {
		t.Errorf("IsNamed")
	}
	c, _ := Lookup("@triangle_gap")
	var ce *claim.Error
	if err := c.CheckScope(claim.Scope{Dim: 1, Eigenvalues: 2}); !errors.As(err, &ce) || ce.Hint != "it applies to a polygon" {
		t.Errorf("@triangle_gap on an interval: %v", err)
	}
	if err := c.CheckScope(claim.Scope{Dim: 3, Vertices: 4, Eigenvalues: 2}); !errors.As(err, &ce) || ce.Msg != `built-in claim "@triangle_gap" does not apply to a polyhedron or a product of three coordinates` {
		t.Errorf("@triangle_gap on a tetrahedron: %v", err)
	}
	fg, _ := Lookup("@fundamental_gap")
	if err := fg.CheckScope(claim.Scope{Dim: 3, Vertices: 8, Eigenvalues: 2}); err != nil {
		t.Errorf("@fundamental_gap on a polyhedron: %v", err)
	}
}
