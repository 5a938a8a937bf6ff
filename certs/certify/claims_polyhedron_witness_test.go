package certify

import (
	"strconv"
	"strings"
	"testing"

	"gapcert/certs"
	"gapcert/fem/claim/named"
	"gapcert/fem/problem"
)

// TestFundamentalGapOnPolyhedronHypothesesFail certifies @fundamental_gap
// on the unit cube with a Neumann face (face 2 of the list) and the
// potential x² − z², whose Hessian diag(2, 0, −2) is not positive
// semidefinite anywhere (derived here): the theorem of Andrews and
// Clutterbuck does not apply, and the record must say why with
// witnesses — dirichlet_boundary disproven at face 2, convex_domain
// proven, convex_potential disproven at a point of three coordinates that
// lies in the closed cube and where H33 = −2 < 0 — whatever the
// inequality's verdict; the certificate verifies (Check decides the
// hypotheses again and compares).
func TestFundamentalGapOnPolyhedronHypothesesFail(t *testing.T) {
	src := cubePolyhedron("dirichlet", "x^2-z^2")
	src = strings.Replace(src, `"boundary": "dirichlet"`, `"boundary": ["dirichlet","dirichlet","neumann","dirichlet","dirichlet","dirichlet"]`, 1)
	data, c := certifyFirstStep(t, withClaims(src, `"@fundamental_gap"`))
	r := claimByText(t, c, "@fundamental_gap")
	hyps := map[string]certs.Hypothesis{}
	for _, h := range r.Hypotheses {
		hyps[h.Name] = h
	}
	if h := hyps[named.DirichletBoundary]; h.Verdict != certs.Disproven || h.Witness == nil || h.Witness.Side == nil || *h.Witness.Side != 2 {
		t.Errorf("dirichlet_boundary %+v, want disproven at face 2", h)
	}
	if h := hyps[named.ConvexDomain]; h.Verdict != certs.Proven {
		t.Errorf("convex_domain %+v, want proven", h)
	}
	h := hyps[named.ConvexPotential]
	if h.Verdict != certs.Disproven || h.Witness == nil || len(h.Witness.Point) != 3 {
		t.Fatalf("convex_potential %+v, want disproven at a point of three coordinates", h)
	}
	for i, text := range h.Witness.Point {
		x, err := strconv.ParseFloat(text, 64)
		if err != nil || x < 0 || x > 1 {
			t.Errorf("witness coordinate %d = %q is not in [0, 1]", i, text)
		}
	}
	requireVerifies(t, "cube with a Neumann face and x² − z²", data)
}

// TestInradiusScopeOnProducts: inradius is 3·volume/surface area on a
// tetrahedron only; a product of three coordinates has no inradius even
// when its polygon factor is a triangle or a quadrilateral (the claim
// scope's vertex count must not come from the factor), so the claim is
// refused before any computation.
func TestInradiusScopeOnProducts(t *testing.T) {
	for _, polygon := range []string{
		`[["0","0"],["1","0"],["0","1"]]`,
		`[["0","0"],["1","0"],["1","1"],["0","1"]]`,
	} {
		src := `{"domain": {"product": [{"polygon": ` + polygon + `}, {"interval": ["0","1"]}]}, "boundary": ["dirichlet", "dirichlet"], "claims": ["gap*inradius^2 > 0"]}`
		_, err := problem.Parse([]byte(src))
		if err == nil || !strings.Contains(err.Error(), "inradius") {
			t.Errorf("%s: %v, want a refusal of inradius", polygon, err)
		}
	}
}
