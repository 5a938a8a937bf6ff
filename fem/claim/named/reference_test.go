package named_test

import (
	"slices"
	"strings"
	"testing"

	"gapcert/fem/claim"
	"gapcert/fem/claim/named"
	"gapcert/fem/problem"
)

// TestReferenceProblems: every built-in claim with a reference quantity
// has a reference problem and every reference problem belongs to one; its
// inputs are quantities; its file is a valid problem that names the
// claim's parameters.
func TestReferenceProblems(t *testing.T) {
	for _, c := range named.All() {
		if (c.Reference == "") != (c.ReferenceProblem == nil) {
			t.Errorf("%s: reference %q with reference problem %v", c.Text(), c.Reference, c.ReferenceProblem)
			continue
		}
		if c.ReferenceProblem == nil {
			continue
		}
		inputs := map[string]string{}
		for _, q := range c.ReferenceProblem.Inputs {
			if !claim.IsQuantity(q) {
				t.Errorf("%s: input %q is not a quantity", c.Text(), q)
			}
			inputs[q] = "5/2*s"
		}
		src := c.ReferenceProblem.File(inputs, map[string]string{"s": "3/2"})
		if _, err := problem.Parse(src); err != nil {
			t.Errorf("%s: the reference problem %s does not parse: %v", c.Text(), src, err)
		}
	}
}

// TestRobinReferenceProblemText: the reference problem of
// @robin_comparison, byte for byte, as the certificates that store its
// certificate hash it (problem_sha256 of the embedded certificate): a
// change here changes every such certificate.
func TestRobinReferenceProblemText(t *testing.T) {
	c, err := named.Lookup("@robin_comparison")
	if err != nil {
		t.Fatal(err)
	}
	got := string(c.ReferenceProblem.File(map[string]string{claim.Diameter: "sqrt(10)", claim.Alpha: "alpha"}, map[string]string{"alpha": "3/2"}))
	const want = `{"boundary":{"robin":"alpha"},"domain":{"interval":["0","sqrt(10)"]},"eigenvalues":2,"name":"interval (0, D) with the Robin coefficient of the polygon","parameters":{"alpha":"3/2"},"target":{"relative_width":"1e-10"}}`
	if got != want {
		t.Errorf("reference problem\n%s\nwant\n%s", got, want)
	}
	if !slices.Equal(c.ReferenceProblem.Inputs, []string{claim.Alpha, claim.Diameter}) {
		t.Errorf("inputs %q: the reason a reference cannot be stated names the Robin coefficient first", c.ReferenceProblem.Inputs)
	}
	func() {
		defer func() {
			if r := recover(); r == nil || !strings.Contains(r.(string), "alpha") {
				t.Errorf("a missing input: recovered %v, want a panic naming alpha", r)
			}
		}()
		c.ReferenceProblem.File(map[string]string{claim.Diameter: "1"}, nil)
	}()
}
