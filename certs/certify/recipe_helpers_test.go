package certify

import (
	"testing"

	"gapcert/fem/problem"
)

// computeRecipe validates the hand-made recipe r on p and computes it.
func computeRecipe(t testing.TB, p *problem.Problem, r recipe) *outcome {
	t.Helper()
	if err := r.validate(p); err != nil {
		t.Fatalf("hand-made recipe refused: %v", err)
	}
	out, err := compute(p, r)
	if err != nil {
		t.Fatal(err)
	}
	return out
}

// assembleRecipe computes the hand-made recipe r on p (computeRecipe) and
// assembles its result; stageB demands a stage-B bound.
func assembleRecipe(t testing.TB, p *problem.Problem, r recipe, stageB bool) (*outcome, *result) {
	t.Helper()
	out := computeRecipe(t, p, r)
	if stageB && out.lg == nil {
		t.Fatalf("degree %d, graded %d: stage B gave no bound (%v)", r.degree, r.graded, out.notes)
	}
	res, err := assemble(p, r, out)
	if err != nil {
		t.Fatal(err)
	}
	return out, res
}

// recipeCertificate returns the bytes of the certificate of res, recorded
// as a run toward target stopped by its time limit records it.
func recipeCertificate(t testing.TB, p *problem.Problem, res *result, target string) []byte {
	t.Helper()
	res.refinement = &Refinement{Target: target, TargetRule: TargetRule, StopReason: StopTime}
	c, err := res.certificate(p, Options{})
	if err != nil {
		t.Fatal(err)
	}
	data, err := c.Marshal()
	if err != nil {
		t.Fatal(err)
	}
	return data
}
