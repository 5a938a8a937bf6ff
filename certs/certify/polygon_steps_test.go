package certify

import (
	"testing"
	"time"
)

// stepFixture is a polygon with a singular corner (the L-shape), a
// recipe graded 4 levels at degree 6, and the outcome of a step with stage
// B running whose ρ̂ is far above the Ritz bound of Λ_N (so no stage-A
// level rides along), with made-up indicators (only their order matters
// to the marks).
//
// The trial mesh has 3 uniform levels (376 triangles); predicted costs
// relative to the step: about 1.15 for two grading levels, 1.02 for an
// adaptive round of one triangle, 2.8 for a degree raise by 2 and 3 for
// a uniform level (stepWork).
func stepFixture(t *testing.T) (polygon, recipe, *outcome) {
	t.Helper()
	p := parseProblem(t, lshapeSource)
	r := firstRecipe(t, p)
	r.degree, r.fluxDegree, r.graded, r.refine = 6, 5, 4, 3
	m, err := trialMesh(p, r)
	if err != nil {
		t.Fatal(err)
	}
	ind := make([]float64, len(m.Tris))
	for i := range ind {
		ind[i] = 1e-3
	}
	ind[0] = 1 // Dörfler marking with θ = ½ marks triangle 0 alone
	out := &outcome{n: 2, rho: 40, ritz: []float64{10, 16, 20}, lg: []float64{9, 15},
		polygon: &polygonRecord{indicators: ind}}
	return polygon{p: p, hist: &stepHistory{}}, r, out
}

// measured returns a record of a tried kind with the gain.
func measured(gain float64) kindRecord {
	return kindRecord{tried: true, gain: gain, seconds: 1, ratio: 1, spent: gain < stallGain}
}

// TestChooseStepByGainPerSecond drives chooseStep on made-up histories:
// the kind with the largest log(gain)/seconds is taken; spent kinds are
// skipped; a kind that does not fit in the time left gives way to a
// cheaper one instead of stopping; the stop says whether the kinds are
// capped, spent or too slow; and after a step that widened the widths the
// next one starts from the best step.
func TestChooseStepByGainPerSecond(t *testing.T) {
	d, r, out := stepFixture(t)
	h := d.hist
	h.perWork = 10 / h.stepWork(d.p, r) // the base step takes 10 s

	// Grading measured at 30, the degree at 1.5: grading.
	h.kinds[kindGrade], h.kinds[kindDegree] = measured(30), measured(1.5)
	h.kinds[kindUniform], h.kinds[kindAdaptive] = measured(1.2), measured(1.1)
	if next, why := h.chooseStep(d, r, out); why != "" || next.graded != r.graded+2 || next.degree != r.degree {
		t.Errorf("grading pays most: got graded %d degree %d (%q)", next.graded, next.degree, why)
	}
	// The degree measured at 1e5: log(1e5)/2.8 beats log(30)/1.15.
	h.kinds[kindDegree] = measured(1e5)
	if next, why := h.chooseStep(d, r, out); why != "" || next.degree != r.degree+2 || next.fluxDegree != r.degree+1 {
		t.Errorf("the degree pays most: got degree %d flux degree %d (%q)", next.degree, next.fluxDegree, why)
	}
	// Grading and the degree spent: an adaptive round (gain 1.1, cost
	// 1.02) against a uniform level (gain 1.2, cost 3).
	h.kinds[kindGrade], h.kinds[kindDegree] = measured(1.01), measured(1.0)
	if next, why := h.chooseStep(d, r, out); why != "" || len(next.marks) != 1 {
		t.Errorf("an adaptive round pays most: got %d rounds (%q)", len(next.marks), why)
	}
	// A uniform level measured at 1e6 but not fitting in the time left,
	// an adaptive round fitting: the adaptive round, not a stop.
	h.kinds[kindUniform] = measured(1e6)
	uniform, _ := applyStep(kindUniform, r, nil)
	adaptive, _ := applyStep(kindAdaptive, r, out.polygon.indicators)
	costU, costA := h.perWork*h.stepWork(d.p, uniform), h.perWork*h.stepWork(d.p, adaptive)
	if !(costA < costU/2) {
		t.Fatalf("fixture: predicted %.3g s for a uniform level, %.3g s for an adaptive round", costU, costA)
	}
	h.deadline = time.Now().Add(time.Duration(timeMargin * (costA + costU) / 2 * float64(time.Second)))
	if next, why := h.chooseStep(d, r, out); why != "" || len(next.marks) != 1 || next.refine != r.refine {
		t.Errorf("the cheaper step must be taken: got refine %d, %d rounds (%q)", next.refine, len(next.marks), why)
	}
	// Nothing fits: a stop for time.
	h.deadline = time.Now().Add(time.Second)
	if _, why := h.chooseStep(d, r, out); why != StopTime {
		t.Errorf("no step fits: stop %q, want %q", why, StopTime)
	}
	// Every kind spent: a stall.
	h.deadline = time.Time{}
	h.kinds[kindUniform], h.kinds[kindAdaptive] = measured(1.0), measured(0.5)
	if _, why := h.chooseStep(d, r, out); why != StopStalled {
		t.Errorf("every kind spent: stop %q, want %q", why, StopStalled)
	}
	// Every kind at its cap: a cap, also without a history (as in Check).
	capped := r
	capped.degree, capped.graded, capped.refine = maxPolygonDegree, maxGraded, maxPolygonRefine
	capped.marks = make([][]int, maxAdaptiveRounds)
	for _, hist := range []*stepHistory{h, nil} {
		if _, why := hist.chooseStep(polygon{p: d.p, hist: hist}, capped, out); why != StopCap {
			t.Errorf("every kind capped (history %v): stop %q, want %q", hist != nil, why, StopCap)
		}
	}
	// After a step that widened the widths (score below the best's), the
	// next step starts from the best recipe.
	h.kinds = [numStepKinds]kindRecord{}
	h.kinds[kindDegree], h.kinds[kindUniform], h.kinds[kindAdaptive] = measured(1), measured(1), measured(1)
	best := r
	best.graded = 2
	h.best = &bestStep{r: best, score: 5, rho: 40, ritzN: 16}
	h.score = 3
	if next, why := h.chooseStep(d, r, out); why != "" || next.graded != best.graded+2 {
		t.Errorf("after a widening step: got graded %d (%q), want %d from the best step", next.graded, why, best.graded+2)
	}
}

// TestObserveSpendsAndRenewsKinds: a step of a kind that gains less than
// stallGain spends the kind; a later step of another kind that gains
// renews it, and returns kinds that gained less than their prior to the
// prior (what limits the widths may have moved); a step without a
// stage-B bound counts as gain 0, spends its kind and is not the best
// step.
func TestObserveSpendsAndRenewsKinds(t *testing.T) {
	d, r, out := stepFixture(t)
	h := d.hist
	d.observe(r, out, 1e-4, 1)
	if h.best == nil || h.best.r.graded != r.graded {
		t.Fatalf("the first step with stage B is the best: %+v", h.best)
	}
	h.pending, h.pendingBase = kindGrade, h.score
	d.observe(r, out, 0.99e-4, 1)
	if !h.kinds[kindGrade].spent {
		t.Errorf("grading gained 1.01: not spent")
	}
	h.kinds[kindAdaptive], h.kinds[kindDegree] = measured(1.5), measured(50)
	h.pending, h.pendingBase = kindUniform, h.score
	d.observe(r, out, 1e-5, 1)
	if a, g := h.kinds[kindAdaptive], h.kinds[kindDegree]; a.tried || !g.tried {
		t.Errorf("after a gain elsewhere: adaptive %+v (gained 1.5 < its prior: want its prior again), degree %+v (gained 50: want kept)", a, g)
	}
	if g := h.kinds[kindGrade]; g.spent || g.tried || h.kinds[kindUniform].spent {
		t.Errorf("a uniform level gained 9.9: grading %+v (want renewed to its prior), uniform spent %v", g, h.kinds[kindUniform].spent)
	}
	if g := h.kinds[kindUniform].gain; g < 9.8 || g > 10 {
		t.Errorf("uniform gain %g, want 9.9", g)
	}
	failed := *out
	failed.lg = nil
	h.pending, h.pendingBase = kindDegree, h.score
	d.observe(r, &failed, 1e-6, 1)
	if rec := h.kinds[kindDegree]; rec.gain != 0 || !rec.spent {
		t.Errorf("a step without stage B: degree record %+v, want gain 0 and spent", rec)
	}
	if h.best.score >= h.score {
		t.Errorf("the step without stage B (narrower widths, from stage A) became the best: best score %g, last %g", h.best.score, h.score)
	}
}
