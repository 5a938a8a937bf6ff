package certify

import (
	"testing"

	"gapcert/fem/problem"
	"gapcert/interval"
)

// polygonGroundStateInputs builds the inputs of the ground-state
// certification the way the certified step does: one computation of the
// driver (compute, assemble) on the first recipe with refine uniform
// refinements of the trial mesh, followed by steps − 1 refinements chosen
// by the driver (its next recipe), the certified λ1 and λ2 of the last
// step, and the first
// approximate eigenvector of its trial space with the [0, 0] entries of
// its Ritz matrices.
func polygonGroundStateInputs(t testing.TB, src string, refine, steps int) groundStateInputs {
	t.Helper()
	p, err := problem.Parse([]byte(src))
	if err != nil {
		t.Fatal(err)
	}
	r, err := initialRecipe(p)
	if err != nil {
		t.Fatal(err)
	}
	r.refine = refine
	var res *result
	for step := 1; ; step++ {
		out, err := compute(p, r)
		if err != nil {
			t.Fatal(err)
		}
		if res, err = assemble(p, r, out); err != nil {
			t.Fatal(err)
		}
		if step >= steps {
			break
		}
		next, why := polygon{p: p}.next(r, out, 2)
		if why != "" {
			t.Fatalf("no refinement after step %d: %s", step, why)
		}
		r = next
	}
	trial, err := polygon{p: p}.trial(r, &outcome{})
	if err != nil {
		t.Fatal(err)
	}
	vecs, err := trial.ApproxEigenvectors(1, r.gamma)
	if err != nil {
		t.Fatal(err)
	}
	a0, a1, err := trial.RitzMatrices(vecs[:1], interval.Point(r.gamma))
	if err != nil {
		t.Fatal(err)
	}
	return groundStateInputs{p: p, lambda1: res.lambda[0], lambda2: res.lambda[1], gamma: r.gamma,
		trial: trial, u: vecs[0], energy: a0.At(0, 0), norm2: a1.At(0, 0)}
}
