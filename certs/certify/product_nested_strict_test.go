package certify

import (
	"strings"
	"testing"

	"gapcert/certs"
)

// TestProductCheckNestedKeys: a factor's certificate inside a product's
// certificate is read as strictly as a lone one: a duplicate key, a key in
// another case and an unknown key at any depth of the factor's
// certificate, and a duplicate key of the factor entry itself, are format
// errors at their full path, before anything is recomputed.
func TestProductCheckNestedKeys(t *testing.T) {
	src := `{"domain":{"product":[{"interval":["0","1"]},{"interval":["0","2"]},{"interval":["0","1"]}]},"boundary":"dirichlet"}`
	_, _, data := certifyProductText(t, src, "1e-6")
	text := string(data)
	factors := strings.Index(text, `"factors"`)
	if factors < 0 || !strings.Contains(text[factors:], `"ritz_upper": [`) {
		t.Fatalf("the certificate's layout changed:\n%s", text)
	}
	// insertBefore inserts s before the first occurrence of key after the
	// factors' list begins (in factor 0).
	insertBefore := func(key, s string) string {
		i := factors + strings.Index(text[factors:], key)
		return text[:i] + s + text[i:]
	}
	replaceFirst := func(from, to string) string {
		return text[:factors] + strings.Replace(text[factors:], from, to, 1)
	}
	for _, tc := range []struct {
		name, data, path string
	}{
		{"duplicate stage list", replaceFirst(`"ritz_upper": [`, `"ritz_upper": [], "ritz_upper": [`), "method.factors[0].certificate.method.stages.ritz_upper"},
		{"case-variant stage list", replaceFirst(`"ritz_upper"`, `"Ritz_upper"`), "method.factors[0].certificate.method.stages.Ritz_upper"},
		{"unknown stage list", insertBefore(`"ritz_upper"`, `"ritz_lower": [], `), "method.factors[0].certificate.method.stages.ritz_lower"},
		{"duplicate format", insertBefore(`"format"`, `"format": "x", `), "method.factors[0].certificate.format"},
		{"case-variant results", insertBefore(`"results"`, `"Results": {}, `), "method.factors[0].certificate.Results"},
		{"duplicate factor count", insertBefore(`"eigenvalues"`, `"eigenvalues": 2, `), "method.factors[0].eigenvalues"},
	} {
		err := Check([]byte(tc.data))
		fe, ok := err.(*certs.FormatError)
		if !ok || fe.Path != tc.path {
			t.Errorf("%s: %v, want a format error at %s", tc.name, err, tc.path)
		}
	}
}
