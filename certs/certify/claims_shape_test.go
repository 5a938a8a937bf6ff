package certify

import (
	"context"
	"errors"
	"fmt"
	"strings"
	"testing"

	"gapcert/certs"
	"gapcert/fem/claim"
	"gapcert/fem/claim/named"
	"gapcert/fem/problem"
	"gapcert/interval"
)

const notLogConcave = "@robin_ground_state_not_log_concave"

// certificateAtRefinement certifies src in one step of the driver on the
// first recipe with refine uniform refinements, with the ground-state
// block: the certificate of that step as Certify writes it, without the
// refinement loop (whose steps the witness of the double well does not
// need, see TestPolygonGroundStateWitnessAgainstSeparation).
func certificateAtRefinement(t *testing.T, src string, refine int) *certs.Certificate {
	t.Helper()
	p := parseProblem(t, src)
	r := firstRecipe(t, p)
	r.refine = refine
	out, err := compute(p, r)
	if err != nil {
		t.Fatal(err)
	}
	res, err := assemble(p, r, out)
	if err != nil {
		t.Fatal(err)
	}
	c, err := res.certificate(p, Options{GroundState: true, Now: fixedTime, Tool: "gapcert test"})
	if err != nil {
		t.Fatal(err)
	}
	return c
}

// TestNotLogConcaveClaimDoubleWell: the separable double well
// V = 9000((x − 1/2)² − 1/16)² on the unit square with Dirichlet
// conditions, whose ground-state block has a certified witness (checked
// against the one-dimensional block by separation in
// TestPolygonGroundStateWitnessAgainstSeparation). shape_margin is the
// witness's margin, so both the built-in claim and the same inequality
// written out hold with the witness's margin; the built-in claim's
// hypotheses say that the theorem's setting does not apply: V ≠ 0 and
// Dirichlet sides (zero_potential and robin_boundary disproven), while the
// unit square is convex and a product of circumsolids (proven).
func TestNotLogConcaveClaimDoubleWell(t *testing.T) {
	src := fmt.Sprintf(`{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},"potential":%q,"boundary":"dirichlet","claims":[%q,"shape_margin > 0","shape_margin < 0"]}`,
		separableWell("x", "0"), notLogConcave)
	c := certificateAtRefinement(t, src, 5)
	gs := c.Results.GroundState
	if gs == nil || gs.LogConcavity != certs.Disproven || gs.Witness == nil {
		t.Fatalf("ground state %+v, want a witness", gs)
	}
	w := boundInterval(t, gs.Witness.Margin)
	for _, text := range []string{notLogConcave, "shape_margin > 0"} {
		r := claimByText(t, c, text)
		if r.Verdict != certs.Holds || r.Reason != "" {
			t.Errorf("%s: %s (%s), margin %+v", text, r.Verdict, r.Reason, r.Margin)
		}
		// The margin of "shape_margin > 0" is shape_margin − 0: the
		// witness's margin, read back outward and printed outward.
		if m := marginOf(t, r); !w.Subset(m) || m.Wid() > 2*w.Wid() {
			t.Errorf("%s: margin %v, the witness's %v", text, m, w)
		}
	}
	if r := claimByText(t, c, "shape_margin < 0"); r.Verdict != certs.Fails {
		t.Errorf("shape_margin < 0: %s, margin %+v", r.Verdict, r.Margin)
	}
	r := claimByText(t, c, notLogConcave)
	if r.Inequality != "shape_margin > 0" {
		t.Errorf("inequality %q", r.Inequality)
	}
	want := map[string]string{
		named.ConvexDomain:       certs.Proven,
		named.RobinBoundary:      certs.Disproven,
		named.PositiveRobinAlpha: certs.Disproven,
		named.ZeroPotential:      certs.Disproven,
		named.CircumsolidProduct: certs.Proven,
	}
	if got := hypothesisVerdicts(r); fmt.Sprint(got) != fmt.Sprint(want) {
		t.Errorf("hypotheses %v, want %v", got, want)
	}
	t.Logf("witness margin %+v", gs.Witness.Margin)
}

// TestNotLogConcaveClaimRobinRectangle: on the Robin rectangle
// (0, 2)×(0, 1) with α = 1 and V = 0 the ground state is the product of
// the two one-dimensional Robin ground states, cosines cos(k(x − c)) with
// |k(x − c)| < π/2, each log-concave (closed form, common practice), so
// u(m)² ≥ u(x)u(y) for every midpoint triple: shape_margin's exact value is
// ≤ 0 and the claim never holds; it is undecided or fails. Its hypotheses
// are all proven except circumsolid_product, which is proven too (a
// rectangle): the theorem predicts no failure here. The best candidate's
// margin decides "shape_margin >= -1" (measured: [−0.0036, 0.0034] at
// the relative width 1e-3). The certificate verifies; an edited claim
// verdict, or the block removed, is refused.
func TestNotLogConcaveClaimRobinRectangle(t *testing.T) {
	src := fmt.Sprintf(`{"domain":{"polygon":[["0","0"],["2","0"],["2","1"],["0","1"]]},"boundary":{"robin":"1"},"claims":[%q,"shape_margin >= -1"]}`, notLogConcave)
	data, c := certifyGroundStateClaimsAt(t, src, "1e-3")
	r := claimByText(t, c, notLogConcave)
	gs := c.Results.GroundState
	if r.Verdict == certs.Holds || gs.Witness != nil {
		t.Fatalf("holds on a Robin rectangle: %+v, block %s (%s)", r, gs.LogConcavity, gs.Reason)
	}
	requireAllProven(t, r)
	if low := claimByText(t, c, "shape_margin >= -1"); low.Verdict != certs.Holds {
		t.Errorf("shape_margin >= -1: %s, margin %+v", low.Verdict, low.Margin)
	}
	if r.Verdict == certs.Undecided && gs.Margin != nil && r.Reason != "" {
		t.Errorf("undecided with a margin but a reason: %q", r.Reason)
	}
	t.Logf("Robin rectangle: %s, margin %+v; block %s: %s", r.Verdict, r.Margin, gs.LogConcavity, gs.Reason)
	requireVerifies(t, "Robin rectangle", data)

	var mm *MismatchError
	edited, _ := certs.Unmarshal(data)
	edited.Claims[0].Verdict = certs.Holds
	out, _ := edited.Marshal()
	if err := Check(out); !errors.As(err, &mm) {
		t.Errorf("edited verdict: want a mismatch report, got %v", err)
	}
	stripped, _ := certs.Unmarshal(data)
	stripped.Results.GroundState = nil
	out, _ = stripped.Marshal()
	if err := Check(out); !errors.As(err, &mm) || !strings.Contains(err.Error(), "claims") {
		t.Errorf("block removed: want a mismatch of the claims, got %v", err)
	}
}

// certifyGroundStateClaimsAt is certifyGroundStateClaims at the given
// relative width.
func certifyGroundStateClaimsAt(t *testing.T, src, relWidth string) ([]byte, *certs.Certificate) {
	t.Helper()
	return certifyClaimsWith(t, src, Options{RelWidth: relWidth, TimeLimit: ampleLimit, GroundState: true})
}

// TestShapeMarginRefused: a claim naming shape_margin is refused before
// computing when the ground state is not asked for (Certify returns at
// once; the problem has no claim the run could decide), and by the reader
// on an interval; the built-in claim does not apply to intervals.
func TestShapeMarginRefused(t *testing.T) {
	square := `{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},"boundary":{"robin":"1"},"claims":["gap > 0",%q]}`
	for _, text := range []string{"shape_margin > 0", "2*shape_margin + gap >= gap", notLogConcave, " @Robin-Ground-State-Not-Log-Concave "} {
		p, err := problem.Parse([]byte(fmt.Sprintf(square, text)))
		if err != nil {
			t.Fatalf("%q: %v", text, err)
		}
		_, err = Certify(context.Background(), p, Options{TimeLimit: ampleLimit})
		if err == nil || !strings.Contains(err.Error(), "claims[1]") || !strings.Contains(err.Error(), "--ground-state") {
			t.Errorf("%q without the ground state: %v", text, err)
		}
	}
	for _, tc := range []struct{ text, msg string }{
		{"shape_margin > 0", "polygons only"},
		{notLogConcave, "does not apply to an interval"},
	} {
		_, err := problem.Parse([]byte(fmt.Sprintf(`{"domain":{"interval":["0","1"]},"boundary":{"robin":"1"},"claims":[%q]}`, tc.text)))
		if err == nil || !strings.Contains(err.Error(), tc.msg) {
			t.Errorf("%q on an interval: %v", tc.text, err)
		}
	}
	_, err := problem.Parse([]byte(`{"domain":{"polygon":[["0","0"],["1","0"],["0","1"]]},"parameters":{"shape_margin":"1"},"boundary":"dirichlet"}`))
	if err == nil {
		t.Errorf("a parameter named shape_margin is accepted")
	}
}

// TestShapeMarginWithoutValue: where the certificate provides no
// shape_margin (no block; a block without witness or candidate, as when
// λ1 is not separated from λ2) a claim naming it is undecided with a
// reason naming --ground-state, and a claim that does not name it is
// evaluated as before. A witness's margin is preferred to a candidate's.
func TestShapeMarginWithoutValue(t *testing.T) {
	cl, err := claim.Parse("shape_margin > 0")
	if err != nil {
		t.Fatal(err)
	}
	other, _ := claim.Parse("gap > 0")
	env := map[string]interval.I{claim.Gap: interval.New(1, 2)}
	for _, gs := range []*certs.GroundState{nil, {LogConcavity: certs.Undecided, Reason: "lambda1 is not shown to be separated from lambda2"}} {
		_, why := shapeMargin(gs)
		if !strings.Contains(why, "--ground-state") {
			t.Errorf("reason %q", why)
		}
		if r := evaluateClaim(cl, env, why); r.Verdict != certs.Undecided || r.Reason != why {
			t.Errorf("%+v", r)
		}
		if r := evaluateClaim(other, env, why); r.Verdict != certs.Holds || r.Reason != "" {
			t.Errorf("gap > 0: %+v", r)
		}
	}
	candidate := certs.Bound{Lower: "-0.5", Upper: "-0.25"}
	m, why := shapeMargin(&certs.GroundState{LogConcavity: certs.Undecided, Margin: &candidate})
	if why != "" || m.Lo != -0.5 || m.Hi != -0.25 {
		t.Errorf("candidate: %v %q", m, why)
	}
	witness := &certs.ShapeWitness{Kind: certs.WitnessMidpoint, Margin: certs.Bound{Lower: "0.125", Upper: "0.25"}}
	m, why = shapeMargin(&certs.GroundState{LogConcavity: certs.Disproven, Witness: witness, Margin: &candidate})
	if why != "" || m.Lo != 0.125 || m.Hi != 0.25 {
		t.Errorf("witness: %v %q", m, why)
	}
	if _, why = shapeMargin(&certs.GroundState{Witness: &certs.ShapeWitness{Kind: certs.WitnessConvexInterval}}); why == "" {
		t.Errorf("an interval's witness gives shape_margin a value")
	}
}

// TestNotLogConcaveClaimTrapezoid: the isosceles trapezoid of
// TestPolygonGroundStateRobinTrapezoidSweep (convex, neither tangential nor
// a rectangle) with α = 1/10 and V = 0 is the theorem's setting: every
// hypothesis is proven except circumsolid_product, which is disproven.
// The theorem gives no threshold on α, so the verdict is the certificate's
// own: it holds exactly when the block has a witness (at two uniform
// refinements it has none: measured undecided, best margin
// [−0.0020, 0.0019]).
func TestNotLogConcaveClaimTrapezoid(t *testing.T) {
	src := fmt.Sprintf(`{"domain":{"polygon":[["0","0"],["2","0"],["1.1","0.9"],["0.9","0.9"]]},"boundary":{"robin":"1/10"},"claims":[%q]}`, notLogConcave)
	c := certificateAtRefinement(t, src, 2)
	r := claimByText(t, c, notLogConcave)
	want := map[string]string{
		named.ConvexDomain:       certs.Proven,
		named.RobinBoundary:      certs.Proven,
		named.PositiveRobinAlpha: certs.Proven,
		named.ZeroPotential:      certs.Proven,
		named.CircumsolidProduct: certs.Disproven,
	}
	if got := hypothesisVerdicts(r); fmt.Sprint(got) != fmt.Sprint(want) {
		t.Errorf("hypotheses %v, want %v", got, want)
	}
	gs := c.Results.GroundState
	if (r.Verdict == certs.Holds) != (gs.Witness != nil) || r.Verdict == certs.Fails && gs.Margin == nil {
		t.Errorf("verdict %s, margin %+v; block %s (%s)", r.Verdict, r.Margin, gs.LogConcavity, gs.Reason)
	}
	t.Logf("trapezoid, α = 1/10: %s, margin %+v", r.Verdict, r.Margin)
}
