package certify

import (
	"math"
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
// relative to the step: about 1.16 for two grading levels, 1.02 for an
// adaptive round of one triangle, 6.2 for a degree raise by 2 (which on
// the hp line also grades to 17 levels, hpGraded) and 3 for a uniform
// level (stepWork).
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

// measured returns a record of a tried kind with the gain (of two
// levels, for grading).
func measured(gain float64) kindRecord {
	return kindRecord{tried: true, gain: gain, seconds: 1, ratio: 1, spent: gain < stallGain, levels: 2}
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
	// The degree measured at 1e9: log(1e9)/6.2 beats log(30)/1.16.
	h.kinds[kindDegree] = measured(1e9)
	if next, why := h.chooseStep(d, r, out); why != "" || next.degree != r.degree+2 || next.fluxDegree != r.degree+1 || next.graded != 17 {
		t.Errorf("the degree pays most: got degree %d flux degree %d graded %d (%q), want 8, 7, 17", next.degree, next.fluxDegree, next.graded, why)
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

// TestChooseStepDegreeOnTheHPLine: on the L-shape (ν = 2/3) a degree
// raise from 6 to 8 also grades to the depth of degree 8 on the hp line,
// ⌈1.35·8·3/2⌉ = 17 levels (hpGraded), and grading alone stops at the
// depth of degree 6, 13 levels, until the degree reaches its cap. The
// history is that of the 117° trapezoid at degree 6 (grading last gained
// 2.0, the degree 4.9 on a coarse first mesh), transposed to the L-shape
// fixture. With a corner share of 0.99 (the corners limit) the raise
// alone is predicted to gain less than 2.5, which made the one-step
// chooser grade at degree 6; with the 13 levels it brings, far more, and
// the raise is taken, unless grading on its own gained little.
func TestChooseStepDegreeOnTheHPLine(t *testing.T) {
	d, r, out := stepFixture(t)
	h := d.hist
	h.perWork = 10 / h.stepWork(d.p, r)
	h.degrees = 1<<6 | 1<<8 // the tables of degree 8 are built: no setup
	h.kinds[kindGrade], h.kinds[kindDegree] = measured(2.0), measured(4.9)
	h.kinds[kindUniform], h.kinds[kindAdaptive] = measured(1.01), measured(1.01)
	for _, c := range []struct{ k, graded int }{{6, 13}, {8, 17}, {10, 21}} {
		if n, ok := hpGraded(d.p, c.k); !ok || n != c.graded {
			t.Errorf("hp depth of degree %d: %d (%v), want %d", c.k, n, ok, c.graded)
		}
	}
	corners := share{corner: 0.99, ok: true}
	raised := r
	raised.degree, raised.fluxDegree = 8, 7
	if g := h.predictedGain(d.p, kindDegree, r, raised, corners); !(g < 2.5) {
		t.Errorf("share 0.99, the raise alone: predicted gain %.3g, want < 2.5", g)
	}
	raised.graded = 17
	if g := (&stepHistory{}).predictedGain(d.p, kindDegree, r, raised, corners); !(g < 2.5) {
		t.Errorf("share 0.99, grading not yet measured: predicted gain of the raise with 13 levels %.3g, want < 2.5 (no credit for the levels)", g)
	}
	if g := h.predictedGain(d.p, kindDegree, r, raised, corners); !(g > 100) {
		t.Errorf("share 0.99, the raise with 13 levels: predicted gain %.3g, want > 100", g)
	}
	h.share = corners
	if next, why := h.chooseStep(d, r, out); why != "" || next.degree != r.degree+2 || next.graded != 17 {
		t.Errorf("share 0.99: got degree %d graded %d (%q), want degree 8 with 17 levels", next.degree, next.graded, why)
	}
	// The levels gain no more than grading gained on its own: after two
	// levels gained 1.3 (the widths limited elsewhere) the raise is
	// predicted to gain about 12.
	h.kinds[kindGrade] = measured(1.3)
	if g := h.predictedGain(d.p, kindDegree, r, raised, corners); !(g > 10 && g < 15) {
		t.Errorf("grading measured at 1.3: predicted gain of the raise with 13 levels %.3g, want about 12", g)
	}
	// At the depth of degree 6 grading alone is no candidate, however
	// much it last gained; at degree 10 (the cap) it is.
	h.share = share{}
	h.kinds[kindGrade], h.kinds[kindDegree], h.kinds[kindUniform] = measured(1e6), measured(1.5), measured(1.01)
	deep := r
	deep.graded = 13
	if next, why := h.chooseStep(d, deep, out); why != "" || next.graded != 17 || next.degree != 8 {
		t.Errorf("at the depth of degree 6: got degree %d graded %d (%q), want degree 8 with 17 levels", next.degree, next.graded, why)
	}
	// There, with the raise not fitting in the time left, the adaptive
	// round (measured at 2) no longer waits for it.
	h.kinds[kindAdaptive] = measured(2)
	h.deadline = time.Now().Add(time.Duration(float64(time.Second) * 1.5 * timeMargin * h.perWork * h.stepWork(d.p, deep)))
	if next, why := h.chooseStep(d, deep, out); why != "" || len(next.marks) != 1 {
		t.Errorf("at the depth of degree 6 with the raise too slow: got degree %d graded %d, %d rounds (%q), want an adaptive round", next.degree, next.graded, len(next.marks), why)
	}
	h.deadline = time.Time{}
	top := deep
	top.degree, top.fluxDegree, top.graded = maxPolygonDegree, maxPolygonDegree-1, 21
	if next, why := h.chooseStep(d, top, out); why != "" || next.graded != 23 {
		t.Errorf("at degree %d: got graded %d (%q), want 23", maxPolygonDegree, next.graded, why)
	}
	// Without a corner of ν < 1 (the Robin trapezoid, ν = 4/3) there is
	// no hp line: the steps are applyStep's.
	mild := parseProblem(t, robinTrapezoidSource)
	if n, ok := hpGraded(mild, 8); ok {
		t.Errorf("Robin trapezoid: hp depth %d at degree 8, want none", n)
	}
	if next, ok := onHPLine(mild, kindDegree, r, recipe{degree: 8, graded: 4}); !ok || next.graded != 4 {
		t.Errorf("Robin trapezoid: a degree raise grades to %d (%v), want 4", next.graded, ok)
	}
	if next, ok := onHPLine(mild, kindGrade, r, recipe{degree: 6, graded: 24}); !ok || next.graded != 24 {
		t.Errorf("Robin trapezoid: grading to 24 at degree 6 gives %d (%v), want 24", next.graded, ok)
	}
	// Below the depth of degree 6 grading stops at it.
	below := r
	below.graded = 12
	if next, ok := onHPLine(d.p, kindGrade, below, recipe{degree: 6, graded: 14}); !ok || next.graded != 13 {
		t.Errorf("grading from 12 levels at degree 6: %d (%v), want 13", next.graded, ok)
	}
}

// TestChooseStepCheapestToTarget: gains past the target are worth
// nothing, so of two steps predicted to reach it the cheaper is taken. A
// uniform level measured at 1e6 (cost about 3 times the step) and two
// grading levels measured at 30 (cost about 1.15): without a target the
// uniform level scores more per second; with the worst width 5 times the
// target both reach it, and grading is taken.
func TestChooseStepCheapestToTarget(t *testing.T) {
	d, r, out := stepFixture(t)
	h := d.hist
	h.perWork = 10 / h.stepWork(d.p, r)
	h.degrees = 1<<6 | 1<<8
	h.kinds[kindGrade], h.kinds[kindUniform] = measured(30), measured(1e6)
	h.kinds[kindDegree], h.kinds[kindAdaptive] = measured(1.01), measured(1.01)
	h.score = -math.Log(5e-9)
	if next, why := h.chooseStep(d, r, out); why != "" || next.refine != r.refine+1 {
		t.Errorf("no target: got refine %d graded %d (%q), want the uniform level", next.refine, next.graded, why)
	}
	h.target = 1e-9
	if next, why := h.chooseStep(d, r, out); why != "" || next.graded != r.graded+2 || next.refine != r.refine {
		t.Errorf("target 1e-9 from 5e-9: got refine %d graded %d (%q), want the cheaper grading step", next.refine, next.graded, why)
	}
	// Far from the target the rates decide again.
	h.score = -math.Log(1e-3)
	if next, why := h.chooseStep(d, r, out); why != "" || next.refine != r.refine+1 {
		t.Errorf("target 1e-9 from 1e-3: got refine %d graded %d (%q), want the uniform level", next.refine, next.graded, why)
	}
}

// TestDegreeSetupIsNotWork: the first step at a degree pays for building
// its tables (setupWork); the prediction of a step at a degree new to the
// run adds it, and the step's measured time sets the cost of a unit of
// work counting it. Made-up: a degree-8 step of 3 s.
func TestDegreeSetupIsNotWork(t *testing.T) {
	d, r, out := stepFixture(t)
	h := d.hist
	setup := 0.4 / 2.7e-6 * 1.8 * 1.8
	if s := h.setupWork(8); math.Abs(s-setup) > 1e-9*setup {
		t.Fatalf("setup of degree 8 %g, want %g", s, setup)
	}
	h.perWork = 1e-6
	r8 := r
	r8.degree, r8.fluxDegree = 8, 7
	work := h.stepWork(d.p, r8)
	if c := h.predict(d.p, kindDegree, r8); math.Abs(c-1e-6*(work+setup)) > 1e-9 {
		t.Errorf("predicted %g s for a step at a new degree, want work %g s plus setup %g s", c, 1e-6*work, 1e-6*setup)
	}
	d.observe(r8, out, 1e-6, 3)
	if got, want := h.perWork, 3/(work+setup); math.Abs(got-want) > 1e-9*want {
		t.Errorf("seconds per unit of work %g, want %g (the setup counted)", got, want)
	}
	if s := h.setupWork(8); s != 0 {
		t.Errorf("setup of degree 8 after a degree-8 step %g, want 0", s)
	}
	if c := h.predict(d.p, kindDegree, r8); math.Abs(c-h.perWork*work) > 1e-9 {
		t.Errorf("predicted %g s for a step at a degree already built, want %g", c, h.perWork*work)
	}
	// A kind's measured ratio scales its prediction, a degree step's
	// only when it is 1 or more.
	h.kinds[kindDegree].ratio, h.kinds[kindUniform].ratio = 0.5, 0.5
	if c := h.predict(d.p, kindDegree, r8); math.Abs(c-h.perWork*work) > 1e-9 {
		t.Errorf("degree ratio 0.5: predicted %g s, want %g (the ratio counts from 1)", c, h.perWork*work)
	}
	if c := h.predict(d.p, kindUniform, r8); math.Abs(c-0.5*h.perWork*work) > 1e-9 {
		t.Errorf("uniform ratio 0.5: predicted %g s, want %g", c, 0.5*h.perWork*work)
	}
	h.kinds[kindDegree].ratio = 2
	if c := h.predict(d.p, kindDegree, r8); math.Abs(c-2*h.perWork*work) > 1e-9 {
		t.Errorf("degree ratio 2: predicted %g s, want %g", c, 2*h.perWork*work)
	}
}

// robinTrapezoidSource is the trapezoid with two 135° Neumann–Robin
// corners (ν = 4/3) and a Dirichlet base.
const robinTrapezoidSource = `{"domain":{"polygon":[["0","0"],["3","0"],["2","1"],["1","1"]]},"potential":"x*y","boundary":["dirichlet",{"robin":"3/2"},"neumann",{"robin":"1/4"}]}`

// TestMildCornersStartSmooth: on a polygon whose singular corners all
// have ν ≥ 1 (the Robin trapezoid, ν = 4/3) the driver starts with the
// rule of smooth polygons: the degree rises while a raise gains 10 or
// more, then uniform levels follow; grading becomes a candidate
// (chooseStep) once a uniform level gains less than twice 4^ν ≈ 12.7,
// which the corners cause. On the L-shape (ν = 2/3), which has an hp
// line (hpGraded), the choice is chooseStep's from the first step.
// Made-up outcomes and gains (observe).
func TestMildCornersStartSmooth(t *testing.T) {
	p := parseProblem(t, robinTrapezoidSource)
	if nu := (&stepHistory{}).nuMin(p); math.Abs(nu-4.0/3) > 1e-9 {
		t.Fatalf("least exponent of the Robin trapezoid %g, want 4/3", nu)
	}
	d := polygon{p: p, hist: &stepHistory{}}
	h := d.hist
	r := firstRecipe(t, p)
	out := &outcome{n: 2, rho: 40, ritz: []float64{10, 16, 20}, lg: []float64{9, 15}}
	step := func(worst float64) recipe {
		t.Helper()
		d.observe(r, out, worst, 0.1)
		next, why := d.next(r, out, 1)
		if why != "" {
			t.Fatalf("stop %q", why)
		}
		return next
	}
	next := step(1e-2)
	if next.degree != r.degree+2 || next.refine != r.refine || next.graded != 0 {
		t.Fatalf("first step: degree %d refine %d graded %d, want the degree raised", next.degree, next.refine, next.graded)
	}
	r = next
	next = step(9e-4) // the raise gained 11
	if next.degree != r.degree+2 {
		t.Fatalf("after a raise that gained 11: degree %d, want %d", next.degree, r.degree+2)
	}
	r = next
	next = step(5e-4) // the raise gained 2
	if next.degree != r.degree || next.refine != r.refine+1 || next.graded != 0 {
		t.Fatalf("after a raise that gained 2: degree %d refine %d graded %d, want a uniform level", next.degree, next.refine, next.graded)
	}
	r = next
	next = step(5e-6) // the uniform level gained 100: the smooth part limits
	if next.refine != r.refine+1 || next.graded != 0 {
		t.Fatalf("after a uniform level that gained 100: refine %d graded %d, want another uniform level", next.refine, next.graded)
	}
	r = next
	h.kinds[kindGrade] = measured(100) // so that chooseStep takes grading
	next = step(1e-6)                  // the uniform level gained 5 < 2·4^(4/3)
	if next.graded != r.graded+2 {
		t.Fatalf("after a uniform level that gained 5: graded %d refine %d degree %d, want grading (chooseStep)", next.graded, next.refine, next.degree)
	}
	// A smooth step over the memory budget is left to chooseStep.
	fresh := polygon{p: p, hist: &stepHistory{memory: 1}}
	fresh.observe(firstRecipe(t, p), out, 1e-2, 0.1)
	if next, ok := fresh.mildStep(firstRecipe(t, p), out); ok {
		t.Errorf("over the memory budget: the smooth rule chose degree %d refine %d", next.degree, next.refine)
	}
	// The L-shape (ν = 2/3): no smooth start.
	dl, rl, outl := stepFixture(t)
	rl.degree, rl.fluxDegree = 4, 3
	dl.observe(rl, outl, 1e-3, 0.1)
	if next, ok := dl.mildStep(rl, outl); ok {
		t.Errorf("L-shape at degree 4: the smooth start chose degree %d refine %d graded %d, want chooseStep's choice", next.degree, next.refine, next.graded)
	}
}

// trapezoid117Source is the trapezoid with a 117° Dirichlet–Neumann
// corner (ν ≈ 0.772) of the corner benchmarks (cornerCases).
const trapezoid117Source = `{"domain":{"polygon":[["0","0"],["3/2","0"],["1","1"],["0","1"]]},"potential":"x*y","boundary":[{"robin":"1"},"dirichlet","neumann","dirichlet"],"eigenvalues":2}`

// runHPTrap drives the polygon chooser (next, with observe) on a
// made-up model of the errors and times of the 117°
// trapezoid in which grading pays only once the degree is high, and the
// degree only once the grading is deep (the hp trap). The error of the
// recipe with degree p, u uniform and n graded levels is the sum of
//
//	corner   c·4^(−ν(u+n))·(4/p)^(4ν)   the corner element (singularCorners, cornerFactor)
//	layers   l·4^(−νu)·e^(−2p)          the graded layers around it: no grading helps, the degree does
//	smooth   s·4^(−pu)                  the rest of the polygon
//
// with c = 9e-3, l = 4.2e-3 and s = 1e-4, so that at degree 6 and 2
// uniform levels two grading levels gain about 8.5 up to 10 levels, and
// the widths stall near 3e-9 after 12, and the raise from degree 6 with
// 11 levels to 8 with 14 at 3 uniform levels gains about 30 (measured on
// the trapezoid: 8.5 per two levels up to 12, 9.6e-10 at 14, and 57 for
// that raise). The indicators put the corner part on the triangles at the
// corner and the rest on the others, evenly. A step takes the work of its
// recipe (stepWork) at 2.0 µs per unit, plus the setup of a degree new to
// the run (setupWork): the chooser's own model, with the unit a little
// cheaper than its prior of 2.7 µs (the degree-10 step of 3 uniform and
// 18 graded levels took 9.2 s on an idle machine, where the prior
// predicts 13.2 s).
//
// It starts from the first recipe of the trapezoid, with a budget of 30
// model seconds and a target of 1e-12, and returns the worst width
// reached within the budget, the model seconds it took and the recipes.
func runHPTrap(t *testing.T, budget float64) (float64, float64, []recipe) {
	t.Helper()
	p := parseProblem(t, trapezoid117Source)
	nu := (&stepHistory{}).nuMin(p)
	d, ok := discretisationOf(p).(polygon)
	if !ok || d.hist == nil {
		t.Fatal("the trapezoid's discretisation does not pace itself")
	}
	const target, perWork = 1e-12, 2.0e-6
	errorOf := func(r recipe) (corner, rest float64) {
		pp, u, n := float64(r.degree), float64(r.refine), float64(r.graded)
		corner = 9e-3 * math.Pow(4, -nu*(u+n)) * math.Pow(4/pp, 4*nu)
		rest = 4.2e-3*math.Pow(4, -nu*u)*math.Exp(-2*pp) + 1e-4*math.Pow(4, -pp*u)
		return corner, rest
	}
	r := firstRecipe(t, p)
	elapsed, best := 0.0, math.Inf(1)
	var path []recipe
	for step := 0; step < 40; step++ {
		work := d.hist.stepWork(p, r) + d.hist.setupWork(r.degree)
		seconds := perWork * work
		if elapsed+seconds > budget {
			break
		}
		elapsed += seconds
		path = append(path, r)
		corner, rest := errorOf(r)
		worst := corner + rest
		best = math.Min(best, worst)
		m, err := trialMesh(p, r)
		if err != nil {
			t.Fatal(err)
		}
		atCorner := make([]bool, len(m.Tris))
		nc := 0
		f := startMesh(p)
		for ti, tri := range m.Tris {
			for _, c := range trialCorners(p, r) {
				v := f.vertex[c.vertex]
				if tri[0] == v || tri[1] == v || tri[2] == v {
					atCorner[ti] = true
				}
			}
			if atCorner[ti] {
				nc++
			}
		}
		ind := make([]float64, len(m.Tris))
		for ti := range ind {
			if atCorner[ti] {
				ind[ti] = corner / float64(nc)
			} else {
				ind[ti] = rest / float64(len(m.Tris)-nc)
			}
		}
		out := &outcome{n: 2, rho: 40, ritz: []float64{10, 16, 20}, lg: []float64{9, 15},
			polygon: &polygonRecord{indicators: ind}}
		d.observe(r, out, worst, seconds)
		if worst <= target {
			break
		}
		d.pace(time.Now().Add(time.Duration((budget-elapsed)*float64(time.Second))), 0, target)
		next, why := d.next(r, out, 1)
		if why != "" {
			break
		}
		r = next
	}
	return best, elapsed, path
}

// TestChooserLeavesTheHPTrap: on the model of runHPTrap the driver
// reaches the target within the budget, raising the degree to 10 on the
// hp line (hpGraded). A chooser that rates grading and the degree one
// step ahead and apart grades at degree 6 while grading gains, and then
// raises the degree on a mesh made dear by the levels between: the
// chooser before the hp line reached 1.13e-12 on this model after 25.8
// model seconds, with no step left that fits (measured on the trapezoid
// itself: 2.6e-12 after 28 s).
func TestChooserLeavesTheHPTrap(t *testing.T) {
	worst, seconds, path := runHPTrap(t, 30)
	for _, r := range path {
		t.Logf("degree %d, %d uniform, %d graded levels", r.degree, r.refine, r.graded)
	}
	t.Logf("worst width %.3g after %.1f model seconds", worst, seconds)
	if worst > 1e-12 {
		t.Errorf("reached %.3g in %.1f model seconds, want 1e-12 within 30", worst, seconds)
	}
	if last := path[len(path)-1]; last.degree != maxPolygonDegree {
		t.Errorf("last step at degree %d, want %d", last.degree, maxPolygonDegree)
	}
}

// trapezoidAtDepth returns the 117° trapezoid (ν ≈ 0.772) at degree 4 on 2
// uniform levels, graded to the depth of degree 4 on the hp line (7
// levels, hpGraded, so grading alone is no candidate), a history with the
// tables of degree 4 built and the chooser's prior cost of a unit of work
// (2.7 µs, stageAWorkPerTriangle), and an outcome whose ρ̂ is far above
// the Ritz bound of Λ_N (no stage-A level rides along), without
// indicators. Predicted seconds (stepWork): a uniform level 0.2; the
// raises along the hp line 0.9, 3.5 and 10.4 on 2 uniform levels and 1.3,
// 4.6 and 13.2 on 3, plus the setups of degrees 6, 8 and 10 (0.4, 1.3 and
// 3.9, setupWork).
func trapezoidAtDepth(t *testing.T) (polygon, recipe, *outcome) {
	t.Helper()
	p := parseProblem(t, trapezoid117Source)
	r := firstRecipe(t, p)
	r.degree, r.fluxDegree, r.refine = 4, 3, 2
	if n, ok := hpGraded(p, 4); !ok || n != 7 {
		t.Fatalf("hp depth of degree 4 on the trapezoid: %d (%v), want 7", n, ok)
	}
	r.graded = 7
	h := &stepHistory{perWork: 2.7e-6, degrees: 1 << 4}
	out := &outcome{n: 2, rho: 40, ritz: []float64{10, 16, 20}, lg: []float64{9, 15}}
	return polygon{p: p, hist: h}, r, out
}

// TestUniformLevelCountsTheRaisesAhead: on the hp line a uniform level
// makes every raise of the degree still ahead dearer, and its score
// counts that (uniformLookahead). Made-up history on the 117° trapezoid
// at the depth of degree 4 (trapezoidAtDepth): the last uniform level
// gained 16, the degree is not yet tried (prior gain 10). Rated one step
// ahead the level (0.2 s, log 16 / 0.2 s) beats the raise (1.3 s with its
// setup); counted with the 4.3 s by which it makes the three raises to
// degree 10 dearer, it does not, and the raise to degree 6 with 11 levels
// is taken. With no time for any raise the level is taken.
func TestUniformLevelCountsTheRaisesAhead(t *testing.T) {
	d, r, out := trapezoidAtDepth(t)
	h := d.hist
	h.kinds[kindUniform] = measured(16)
	up := r
	up.refine++
	if s := h.uniformLookahead(d.p, r, up); !(s > 3.5 && s < 5) {
		t.Errorf("the raises to degree 10 get dearer by %.3g s, want about 4.3", s)
	}
	if next, why := h.chooseStep(d, r, out); why != "" || next.degree != 6 || next.graded != 11 || next.refine != 2 {
		t.Errorf("got degree %d, %d uniform, %d graded levels (%q), want the raise to degree 6 with 11 levels", next.degree, next.refine, next.graded, why)
	}
	if h.pendingCost > 2 {
		t.Errorf("the raise's predicted time %.3g s, want its own time, about 1.3 s", h.pendingCost)
	}
	// 1.5 s left: the raise (1.3 s, 1.6 with the margin) does not fit,
	// and the level costs no more than itself.
	h.pending = kindNone
	h.deadline = time.Now().Add(1500 * time.Millisecond)
	if s := h.uniformLookahead(d.p, r, up); s != 0 {
		t.Errorf("with no time for a raise the level is charged %.3g s more, want 0", s)
	}
	if next, why := h.chooseStep(d, r, out); why != "" || next.refine != 3 || next.degree != 4 {
		t.Errorf("with 1.5 s left: got degree %d, %d uniform levels (%q), want the uniform level", next.degree, next.refine, why)
	}
}

// TestRaiseOnTheHPLineGainsAsTheLast: a degree raise that grades with it
// (the hp line) is predicted to gain at least what the last raise that
// graded gained, however little grading alone last gained. Made-up
// history after the 117° trapezoid's measured raise from degree 4 to 6
// with 4 levels (gain 3,300) and a grading level taken while λ2 was
// limited away from the corners (gain 1.07): with a corner share of 0.9
// the split alone predicts the raise to degree 8 with 3 levels at about
// 3, and the chooser took uniform levels instead.
func TestRaiseOnTheHPLineGainsAsTheLast(t *testing.T) {
	d, r, out := trapezoidAtDepth(t)
	h := d.hist
	r.degree, r.fluxDegree, r.graded = 6, 5, 11
	h.degrees |= 1 << 6
	h.kinds[kindGrade] = kindRecord{tried: true, gain: 1.07, seconds: 0.4, ratio: 1, levels: 1}
	h.kinds[kindDegree] = kindRecord{tried: true, gain: 3300, seconds: 2.3, ratio: 1, levels: 4, rest: maxRestGain}
	h.kinds[kindUniform] = measured(6.7)
	h.share = share{corner: 0.9, ok: true}
	raised, _ := applyStep(kindDegree, r, nil)
	raised, _ = onHPLine(d.p, kindDegree, r, raised)
	if raised.graded != 14 {
		t.Fatalf("the raise to degree 8 grades to %d, want 14", raised.graded)
	}
	if g := h.predictedGain(d.p, kindDegree, r, raised, h.share); g < 3300 {
		t.Errorf("predicted gain of the raise with 3 levels %.3g, want at least 3300", g)
	}
	alone := r
	alone.degree, alone.fluxDegree = 8, 7
	if g := h.predictedGain(d.p, kindDegree, r, alone, h.share); g > 10 {
		t.Errorf("predicted gain of the raise without levels %.3g, want the split's (below 10)", g)
	}
	if next, why := h.chooseStep(d, r, out); why != "" || next.degree != 8 || next.graded != 14 || next.refine != 2 {
		t.Errorf("got degree %d, %d uniform, %d graded levels (%q), want the raise to degree 8 with 14 levels", next.degree, next.refine, next.graded, why)
	}
}
