package hypothesis

import (
	"fmt"
	"slices"
	"testing"

	"gapcert/certs"
	"gapcert/fem/claim/named"
	"gapcert/fem/problem"
)

// undecidable returns, for the claims cs, one line per hypothesis that has
// no decision procedure (Decide or DecideCertified) on a problem of a
// dimension the claim applies to (problems[dim]), or whose verdict does
// not name it or is not one of the three verdicts, decided with and
// without a ground-state block.
func undecidable(cs []named.Claim, problems map[int]*problem.Problem) []string {
	blocks := []*certs.GroundState{nil, {LogConcavity: certs.Proven, Reason: "log-concave"}}
	var bad []string
	for _, c := range cs {
		for _, dim := range c.Dims {
			p, ok := problems[dim]
			if !ok {
				bad = append(bad, fmt.Sprintf("%s: no test problem of dimension %d", c.Text(), dim))
				continue
			}
			for _, name := range c.Hypotheses {
				for _, gs := range blocks {
					h, ok := DecideCertified(name, p, gs)
					switch {
					case !ok:
						bad = append(bad, fmt.Sprintf("%s: no decision procedure for %s", c.Text(), name))
					case h.Name != name:
						bad = append(bad, fmt.Sprintf("%s: the verdict on %s names %q", c.Text(), name, h.Name))
					case !slices.Contains([]string{certs.Proven, certs.Disproven, certs.Undecided}, h.Verdict):
						bad = append(bad, fmt.Sprintf("%s: verdict %q on %s", c.Text(), h.Verdict, name))
					}
				}
			}
		}
	}
	return bad
}

// TestCatalogueHypothesesDecidable: every hypothesis named by a built-in
// claim has a decision procedure on each dimension the claim applies to,
// so that a catalogue entry without one fails here rather than in a
// user's run.
func TestCatalogueHypothesesDecidable(t *testing.T) {
	problems := map[int]*problem.Problem{
		1: parse(t, problemText(`{"interval":["0","1"]}`, "0", `{"robin":"1"}`)),
		2: parse(t, problemText(square, "0", `{"robin":"1"}`)),
		3: parse(t, problemText(`{"product":[{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},{"interval":["0","1"]}]}`, "x^2+z", `[{"robin":"1"},"neumann"]`)),
		4: parse(t, problemText(`{"product":[{"interval":["0","1"]},{"interval":["0","2"]},{"interval":["0","1"]},{"interval":["0","1"]}]}`, "w^2", `["dirichlet","neumann","dirichlet","dirichlet"]`)),
	}
	if len(named.All()) == 0 {
		t.Fatal("the catalogue is empty")
	}
	for _, line := range undecidable(named.All(), problems) {
		t.Error(line)
	}
	// The check fails on an entry whose hypothesis has no procedure.
	made := named.Claim{Name: "made_up", Inequality: "gap > 0", Dims: []int{1, 2}, Hypotheses: []string{named.ConvexDomain, "no_such_hypothesis"}}
	if bad := undecidable([]named.Claim{made}, problems); len(bad) != 4 {
		t.Errorf("a hypothesis without a procedure gives %q, want 4 lines (2 dimensions, with and without a block)", bad)
	}
}
