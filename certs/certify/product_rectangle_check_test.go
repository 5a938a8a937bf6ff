package certify

import (
	"encoding/json"
	"strings"
	"testing"
)

// TestProductRectangleCheckTarget: a product of two intervals certified as
// its rectangle records the rectangle certificate's target in
// method.factors[0].target; Check reads it from that certificate's
// refinement record, so an edited target is reported (the factor target
// of a separable product is bound by its problem's hash instead).
func TestProductRectangleCheckTarget(t *testing.T) {
	src := `{"domain":{"product":[{"interval":["0","2"]},{"interval":["0","1"]}]},"boundary":[["dirichlet","neumann"],["neumann",{"robin":"1"}]],"potential":"x*y - y*x","eigenvalues":2}`
	_, c, data := certifyProductText(t, src, "1e-5")
	if err := Check(data); err != nil {
		t.Fatal(err)
	}
	m, err := decodeProductMethod(c.Method)
	if err != nil || m.Combination != CombineRectangle {
		t.Fatalf("method %+v, %v", m, err)
	}
	m.Factors[0].Target = "0.5"
	raw, err := json.Marshal(m)
	if err != nil {
		t.Fatal(err)
	}
	cc := *c
	cc.Method = raw
	bad, err := cc.Marshal()
	if err != nil {
		t.Fatal(err)
	}
	if err := Check(bad); err == nil || !strings.Contains(err.Error(), "method.factors[0].target") {
		t.Errorf("an edited rectangle target: %v, want a report of method.factors[0].target", err)
	}
}
