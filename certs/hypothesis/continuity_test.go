package hypothesis

import (
	"strings"
	"testing"

	"gapcert/certs"
	"gapcert/interval/formula"
)

// TestContinuousPotential: potentials that fem/problem accepts are
// continuous on the closed domain, including sqrt(x) at the end x = 0 of
// (0, 1), 1/(x − 2) on (0, 1) (pole outside) and sqrt(1 − x − y) on the
// triangle whose hypotenuse lies on x + y = 1 (defined on the closed
// triangle, not on its bounding box).
func TestContinuousPotential(t *testing.T) {
	for _, tc := range []struct{ domain, v string }{
		{`{"interval":["0","1"]}`, "0"},
		{`{"interval":["0","1"]}`, "sqrt(x)"},
		{`{"interval":["0","1"]}`, "1/(x - 2)"},
		{`{"interval":["-5/2","5/2"]}`, "6*(x^2-1)^2"},
		{`{"interval":["-3","3"]}`, "abs(x) + max(x, 1/2)"},
		{square, "1/(1 + x^2 + y^2)"},
		{unitTriangle, "sqrt(1 - x - y)"},
		{lshape, "log(1 + x*y)"},
	} {
		h := ContinuousPotential(parse(t, problemText(tc.domain, tc.v, `"neumann"`)))
		requireVerdict(t, tc.v, h, certs.Proven)
		if h.Name != "continuous_potential" || !strings.Contains(h.Detail, "closed") {
			t.Errorf("%s: %+v", tc.v, h)
		}
	}
}

// TestContinuousPotentialUndecided: a cell the subdivision cannot settle
// is named, never a guess. V = 1/(x − 3/2), which fem/problem refuses on
// [3/2, 2] (pole at the end), is set on a read problem by hand: undecided
// there, proven on [0, 1] (pole outside).
func TestContinuousPotentialUndecided(t *testing.T) {
	pole := formula.MustParse("1/(x - 3/2)")
	p := parse(t, problemText(`{"interval":["3/2","2"]}`, "0", `"neumann"`))
	p.Potential = pole
	h := ContinuousPotential(p)
	requireVerdict(t, "pole at an end", h, certs.Undecided)
	if !strings.Contains(h.Detail, "could not show V to be defined") || !strings.Contains(h.Detail, "[1.5, ") {
		t.Errorf("detail %q", h.Detail)
	}
	q := parse(t, problemText(`{"interval":["0","1"]}`, "0", `"neumann"`))
	q.Potential = pole
	requireVerdict(t, "pole outside", ContinuousPotential(q), certs.Proven)
}

// TestRobinOrNeumannSides: Robin with different coefficients and Neumann
// ends qualify; a Dirichlet side is the witness.
func TestRobinOrNeumannSides(t *testing.T) {
	for _, bc := range []string{`"neumann"`, `{"robin":"1"}`, `["neumann",{"robin":"5/2"}]`, `[{"robin":"1"},{"robin":"2"}]`} {
		requireVerdict(t, bc, RobinOrNeumannSides(parse(t, problemText(`{"interval":["0","1"]}`, "0", bc))), certs.Proven)
	}
	h := RobinOrNeumannSides(parse(t, problemText(`{"interval":["0","1"]}`, "0", `[{"robin":"1"},"dirichlet"]`)))
	requireVerdict(t, "Dirichlet right end", h, certs.Disproven)
	if *h.Witness.Side != 1 {
		t.Errorf("witness side %d, want 1", *h.Witness.Side)
	}
	requireVerdict(t, "square", RobinOrNeumannSides(parse(t, problemText(square, "0", `[{"robin":"1"},"neumann",{"robin":"1/3"},"neumann"]`))), certs.Proven)
}
