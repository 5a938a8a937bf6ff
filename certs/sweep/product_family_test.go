package sweep

import (
	"strings"
	"testing"
)

// TestFamilyOfProducts: a family whose template is a product domain
// expands into products, each with its factors' parameters bound, and a
// point whose factor is invalid is reported with the factor's path.
func TestFamilyOfProducts(t *testing.T) {
	f, err := ParseFamily([]byte(`{"template": {"domain": {"product": [{"interval": ["0", "L"]}, {"interval": ["0", "1"]}, {"interval": ["0", "1"]}]},
		"boundary": ["dirichlet", "neumann", {"robin": "1"}], "potential": "x^2 + z"},
		"parameters": [{"name": "L", "values": ["1", "3/2"]}], "claims": ["@fundamental_gap", "volume > 0"]}`))
	if err != nil {
		t.Fatal(err)
	}
	if len(f.Points) != 2 {
		t.Fatalf("%d points", len(f.Points))
	}
	p := f.Points[1].Problem
	if !p.IsProduct() || p.Dim != 3 || len(p.Boundary) != 6 {
		t.Fatalf("point 1: product %v, dim %d, %d faces", p.IsProduct(), p.Dim, len(p.Boundary))
	}
	if v := p.Volume(); !v.Contains(1.5) || v.Wid() != 0 {
		t.Errorf("point 1: volume %v, want 3/2", v)
	}
	_, err = ParseFamily([]byte(`{"template": {"domain": {"product": [{"interval": ["0", "L"]}, {"interval": ["0", "1"]}]}, "boundary": "dirichlet"},
		"parameters": [{"name": "L", "values": ["1", "-1"]}]}`))
	if err == nil || !strings.Contains(err.Error(), "template.domain.product[0].interval: point 1 (L=-1): reversed interval") {
		t.Errorf("invalid factor at a point: %v", err)
	}
}
