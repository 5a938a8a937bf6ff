package hypothesis

import (
	"strings"
	"testing"

	"gapcert/certs"
	"gapcert/fem/claim/named"
)

// TestLogConcaveGroundState: the verdict is the block's, with its reason;
// the witness point is the left end of a witness interval or the midpoint
// of a witness triple; without the block it is undecided and says how to
// ask for it. (The blocks are written by hand: what is decided here is the
// reading, the blocks themselves are certified in package certs/certify.)
func TestLogConcaveGroundState(t *testing.T) {
	h := LogConcaveGroundState(nil)
	requireVerdict(t, "no block", h, certs.Undecided)
	if !strings.Contains(h.Detail, "--ground-state") {
		t.Errorf("detail %q does not say how to ask for the block", h.Detail)
	}
	requireVerdict(t, "proven", LogConcaveGroundState(&certs.GroundState{LogConcavity: certs.Proven, Reason: "log-concave"}), certs.Proven)
	h = LogConcaveGroundState(&certs.GroundState{LogConcavity: certs.Undecided, Reason: "the gap is not separated"})
	requireVerdict(t, "undecided", h, certs.Undecided)
	if !strings.Contains(h.Detail, "the gap is not separated") {
		t.Errorf("detail %q lacks the block's reason", h.Detail)
	}
	interval := &certs.GroundState{LogConcavity: certs.Disproven, Reason: "not log-concave", Witness: &certs.ShapeWitness{
		Kind: certs.WitnessConvexInterval, Points: [][]string{{"-0.25"}, {"0.25"}}}}
	h = LogConcaveGroundState(interval)
	requireVerdict(t, "interval witness", h, certs.Disproven)
	if strings.Join(h.Witness.Point, ",") != "-0.25" {
		t.Errorf("witness %v, want the left end -0.25", h.Witness.Point)
	}
	triple := &certs.GroundState{LogConcavity: certs.Disproven, Reason: "not log-concave", Witness: &certs.ShapeWitness{
		Kind: certs.WitnessMidpoint, Points: [][]string{{"0", "0"}, {"1", "1/2"}, {"1/2", "1/4"}}}}
	h = LogConcaveGroundState(triple)
	requireVerdict(t, "triple witness", h, certs.Disproven)
	if strings.Join(h.Witness.Point, ",") != "1/2,1/4" {
		t.Errorf("witness %v, want the midpoint (1/2, 1/4)", h.Witness.Point)
	}
	h.Witness.Point[0] = "9"
	if triple.Witness.Points[2][0] != "1/2" {
		t.Errorf("the hypothesis's witness aliases the block's")
	}
	defer func() {
		if recover() == nil {
			t.Errorf("a disproven block without a witness did not panic")
		}
	}()
	LogConcaveGroundState(&certs.GroundState{LogConcavity: certs.Disproven})
}

// TestDecideCertified: ground-state hypotheses are read from the block,
// others from the problem; Decide does not know the ground-state ones.
func TestDecideCertified(t *testing.T) {
	p := parse(t, problemText(`{"interval":["0","1"]}`, "0", `{"robin":"1"}`))
	gs := &certs.GroundState{LogConcavity: certs.Proven, Reason: "log-concave"}
	if h, ok := DecideCertified(named.LogConcaveGroundState, p, gs); !ok || h.Verdict != certs.Proven {
		t.Errorf("log-concavity with a proven block: %v %+v", ok, h)
	}
	if h, ok := DecideCertified(named.LogConcaveGroundState, p, nil); !ok || h.Verdict != certs.Undecided {
		t.Errorf("log-concavity without a block: %v %+v", ok, h)
	}
	if h, ok := DecideCertified(named.RobinBoundary, p, nil); !ok || h.Verdict != certs.Proven {
		t.Errorf("robin_boundary: %v %+v", ok, h)
	}
	if _, ok := Decide(named.LogConcaveGroundState, p); ok {
		t.Errorf("Decide decides a ground-state hypothesis from the problem alone")
	}
	if _, ok := DecideCertified("no_such_hypothesis", p, gs); ok {
		t.Errorf("unknown name accepted")
	}
}
