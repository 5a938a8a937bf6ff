package certify

import (
	"fmt"
	"math"
	"strings"
	"time"

	"gapcert/fem/problem"
)

// This file chooses the kind of the next step on polygons with singular
// corners by measured gain per second (chooseStep). Nothing here is a
// bound: every recipe it returns is computed and verified like any other,
// and Check replays the recorded recipe, not the choice.

// stepKind is a kind of refinement step of the polygon driver.
type stepKind int

const (
	kindNone     stepKind = iota
	kindStageA            // one more stage-A level (while stage B does not run)
	kindDegree            // trial degree + 2 (at most maxPolygonDegree)
	kindGrade             // two more grading levels toward the corners
	kindUniform           // one more uniform level of the trial mesh
	kindAdaptive          // one round of Dörfler marks on the trial mesh
	numStepKinds
)

// stepKindNames name the kinds in progress lines and warnings.
var stepKindNames = [numStepKinds]string{"", "stage-A level", "degree", "grading", "uniform level", "adaptive round"}

// priorGain is the factor by which a kind not yet tried in the run is
// assumed to narrow the worst width (a choice). A degree raise gains 10 or
// more while the corners are resolved (the smooth rule of next); a
// grading or uniform level about 4 (h^(2ν) with ν ≈ 1 near the corners);
// an adaptive round about 2 (Dörfler marking with θ = ½).
var priorGain = [numStepKinds]float64{kindStageA: 4, kindDegree: 10, kindGrade: 4, kindUniform: 4, kindAdaptive: 2}

// choiceOrder is the order in which kinds are considered (ties keep the
// first).
var choiceOrder = []stepKind{kindGrade, kindDegree, kindUniform, kindAdaptive}

// stageAWorkPerTriangle is the work (in the units of stepWork: flux
// unknowns times the squared flux degree + 1) of one stage-A triangle.
// Measured: a Crouzeix–Raviart stage A of 16,384 triangles on the L-shape
// took 1.2 s, and stage B on 2,048 triangles at degree 8 (139,520 flux
// unknowns) 24 s, 2.7 µs per unit, so one stage-A triangle costs about 26
// units.
const stageAWorkPerTriangle = 26

// timeMargin: a step is started only if its predicted time times this
// margin fits in the time left (a choice: with the measured ratios of
// each kind, predictions of steps over a second were within about 25% on
// the measured cases; with 1.5 the generic triangle stopped at 21 s of
// 30 with a step predicted at 7.2 s).
const timeMargin = 1.25

// minLearnSeconds: a step shorter than this does not set its kind's
// ratio of measured to predicted time (a choice: below about half a
// second the fixed costs of a step, which the work does not count,
// dominate; measured on the trapezoid with the 117° corner: uniform
// levels of 0.1 to 0.5 s on the first meshes took 4× or more their
// prediction, so that a later level on 400 triangles was predicted at
// 16 s and not started with 12 s left).
const minLearnSeconds = 0.5

// kindRecord is what the run measured of the last step of one kind.
type kindRecord struct {
	tried   bool    // gain is measured (false again once a spent kind is renewed)
	gain    float64 // factor by which it narrowed the worst width of the step it started from (0: no bound or no stage B)
	seconds float64 // its wall time
	ratio   float64 // wall time over the predicted one of its last step of minLearnSeconds or more (0: none), clamped to [¼, 4]
	spent   bool    // it gained less than stallGain, and no other kind has gained since (observe)
}

// bestStep is the step with the narrowest worst width that stage B ran
// on, with what choosing its successors needs.
type bestStep struct {
	r          recipe
	score      float64 // −log of its worst width
	rho, ritzN float64 // ρ̂ and the Ritz bound of Λ_N
	indicators []float64
}

// stepHistory is what the polygon driver measured of the steps of one
// run: per kind the last gain and wall time, the cost of a unit of work
// (stepWork), the best step, and the time and memory left. A nil
// *stepHistory is a run without measurements: the choice rests on the
// priors (priorGain) and the predicted work alone.
type stepHistory struct {
	deadline time.Time // zero: no limit
	memory   int64     // memory budget in bytes (0: none)

	steps       int
	score       float64 // −log of the last step's worst width
	perWork     float64 // seconds per unit of work of the last step (0: unknown)
	pending     stepKind
	pendingBase float64 // score of the step the pending one started from
	pendingCost float64 // its predicted seconds (0: no prediction)
	best        *bestStep
	kinds       [numStepKinds]kindRecord
	triangles   map[[2]int]int // meshTriangles by (uniform, graded) levels
}

// pace gives the driver the run's deadline and memory budget, and reports
// whether it checks the time itself (Certify then starts a step only when
// the driver chose one that fits).
func (d polygon) pace(deadline time.Time, memory int64) bool {
	if d.hist == nil {
		return false
	}
	d.hist.deadline, d.hist.memory = deadline, memory
	return true
}

// observe records a computed step: its recipe, outcome, worst relative
// width and wall time.
func (d polygon) observe(r recipe, out *outcome, worst, seconds float64) {
	h := d.hist
	if h == nil {
		return
	}
	h.steps++
	score := math.Inf(-1)
	if worst > 0 && !math.IsInf(worst, 1) {
		score = -math.Log(worst)
	}
	failed := out.lg == nil && h.pending != kindStageA
	if k := h.pending; k != kindNone {
		rec := &h.kinds[k]
		rec.tried, rec.seconds = true, seconds
		switch {
		case failed || math.IsInf(score, -1):
			rec.gain = 0
		case math.IsInf(h.pendingBase, -1):
			rec.gain = math.Inf(1)
		default:
			rec.gain = math.Exp(score - h.pendingBase)
		}
		if h.pendingCost > 0 && seconds >= minLearnSeconds {
			rec.ratio = math.Min(4, math.Max(0.25, seconds/h.pendingCost))
		}
		rec.spent = rec.gain < stallGain
		if !rec.spent {
			// What limits the widths may have moved: every other kind
			// whose last step narrowed them, but by less than its prior
			// gain, may pay more again, and its last gain no longer
			// predicts its next one (its prior does again; measured on
			// the Neumann L-shape: two grading levels gained 2.6 while a
			// uniform level limited λ2, and 6 after that level). A kind
			// that widened them or lost stage B stays spent: on the
			// measured cases that comes from the float64 choices on small
			// elements, which steps elsewhere do not repair.
			for j := range h.kinds {
				if o := &h.kinds[j]; stepKind(j) != k && o.tried && o.gain >= 1 && o.gain < priorGain[j] {
					o.spent, o.tried = false, false
				}
			}
		}
	}
	if w := h.stepWork(d.p, r); w > 0 && seconds > 0 {
		h.perWork = seconds / w
	}
	h.score, h.pending = score, kindNone
	if out.lg != nil && (h.best == nil || score >= h.best.score) {
		h.best = &bestStep{r: r, score: score, rho: out.rho, ritzN: out.ritz[out.n-1]}
		if out.polygon != nil {
			h.best.indicators = out.polygon.indicators
		}
	}
}

// hasBest reports whether a step with stage B has been recorded.
func (h *stepHistory) hasBest() bool { return h != nil && h.best != nil }

// expect records the kind of the step about to be computed from the last
// one (r is its recipe), and reports whether its predicted time fits in
// the time left.
func (h *stepHistory) expect(d polygon, k stepKind, r recipe) bool {
	if h == nil {
		return true
	}
	h.pending, h.pendingBase, h.pendingCost = k, h.score, 0
	if h.perWork > 0 {
		h.pendingCost = h.perWork * h.stepWork(d.p, r) * h.kinds[k].ratioOrOne()
	}
	return !h.exceeds(h.pendingCost)
}

// ratioOrOne is the kind's measured ratio of wall time to predicted time,
// 1 before it is measured.
func (rec kindRecord) ratioOrOne() float64 {
	if rec.ratio == 0 {
		return 1
	}
	return rec.ratio
}

// exceeds reports whether a step of the predicted seconds, with the time
// margin, would end after the deadline.
func (h *stepHistory) exceeds(seconds float64) bool {
	return !h.deadline.IsZero() && time.Now().Add(time.Duration(timeMargin*seconds*float64(time.Second))).After(h.deadline)
}

// chooseStep chooses the next recipe on a polygon with singular corners
// once stage B has run, or says why there is none (a Stop reason). The
// step starts from the last recipe r, or from the best step when the last
// one widened the worst width or gave no stage-B bound (so a failed step,
// such as a flux choice that float64 could not make on tiny elements,
// costs one step and is not built upon). Each kind of step (kindDegree,
// kindGrade, kindUniform, kindAdaptive) not at its cap is a candidate
// unless spent (it last gained less than stallGain, and no other kind has
// gained since); it is scored by log(gain)/seconds, gain being its last
// measured gain (priorGain before it is tried) and seconds its predicted
// wall time: the work of its recipe (stepWork) times the measured seconds
// per unit of work of the last step and the kind's own ratio of measured
// to predicted time. Candidates that would exceed the memory budget are
// taken only when nothing else remains (Certify then stops for memory),
// and those whose predicted time does not fit in the time left are
// dropped. The stop reason says what remained: StopCap when every kind is
// at its cap, StopTime when the only useful kinds left do not fit in the
// time, StopStalled when every kind left is spent. The chosen step gets
// the stage-A rider (withStageARider). The first adaptive round waits
// until grading is spent or at its cap.
func (h *stepHistory) chooseStep(d polygon, r recipe, out *outcome) (recipe, string) {
	base, baseScore := r, 0.0
	rho, ritzN, indicators := out.rho, 0.0, []float64(nil)
	if out.n > 0 {
		ritzN = out.ritz[out.n-1]
	}
	if out.polygon != nil {
		indicators = out.polygon.indicators
	}
	if h != nil {
		baseScore = h.score
		if h.best != nil && (h.score < h.best.score || out.lg == nil) {
			b := h.best
			base, baseScore, rho, ritzN, indicators = b.r, b.score, b.rho, b.ritzN, b.indicators
		}
	}
	baseWork := 0.0 // computed when first needed
	type candidate struct {
		kind  stepKind
		r     recipe
		cost  float64
		score float64
	}
	var best, overMemory *candidate
	available, tooSlow := false, false
	for _, k := range choiceOrder {
		c, ok := applyStep(k, base, indicators)
		if !ok {
			continue
		}
		if k == kindAdaptive && h != nil && !h.kinds[kindGrade].spent && base.graded < maxGraded && len(base.marks) == 0 {
			// Marks fix the uniform and graded levels: the first round
			// waits until grading, the structured refinement toward the
			// corners, is spent or at its cap.
			available = true
			continue
		}
		available = true
		gain := priorGain[k]
		if baseWork == 0 {
			baseWork = h.stepWork(d.p, base)
		}
		cost := h.stepWork(d.p, c) / baseWork // relative to the base step
		if h != nil {
			rec := h.kinds[k]
			if rec.spent {
				continue
			}
			if rec.tried {
				gain = rec.gain
			}
			if h.perWork > 0 {
				cost = h.perWork * h.stepWork(d.p, c) * rec.ratioOrOne()
				if h.exceeds(cost) {
					tooSlow = true
					continue
				}
			}
		}
		cand := &candidate{kind: k, r: c, cost: cost, score: math.Log(gain) / math.Max(cost, 1e-9)}
		if h != nil && h.memory > 0 && memoryEstimate(d.p, c) > h.memory {
			if overMemory == nil || cand.score > overMemory.score {
				overMemory = cand
			}
			continue
		}
		if best == nil || cand.score > best.score {
			best = cand
		}
	}
	if best == nil {
		best = overMemory
	}
	switch {
	case best != nil:
	case !available:
		return r, StopCap
	case tooSlow:
		return r, StopTime
	default:
		return r, StopStalled
	}
	if h != nil {
		h.pending, h.pendingBase, h.pendingCost = best.kind, baseScore, 0
		if h.perWork > 0 {
			h.pendingCost = best.cost
		}
	}
	return withStageARider(best.r, rho, ritzN), ""
}

// applyStep returns r after one step of kind k, or false when k is at its
// cap. The degree rises by 2, as on smooth polygons (a raise by 1 gains
// too little at the coarse first meshes: measured on the triangle with
// apex (1/2, 1), the gap's width after the second step is 2.6e-2 at
// degree 5 and 8.6e-4 at degree 6, for a time of 0.2 s and 0.6 s).
// Uniform and graded levels stay fixed once there are adaptive marks
// (they refer to the triangles of the mesh they were computed on;
// dropping them lost more than the level gained: measured on the
// L-shape, 5e-8 → 3e-5); an adaptive round needs the indicators of r's
// step.
func applyStep(k stepKind, r recipe, indicators []float64) (recipe, bool) {
	fixed := len(r.marks) > 0
	switch k {
	case kindDegree:
		if r.degree >= maxPolygonDegree {
			return r, false
		}
		r.degree = min(r.degree+2, maxPolygonDegree)
	case kindGrade:
		if fixed || r.graded >= maxGraded {
			return r, false
		}
		r.graded = min(r.graded+2, maxGraded)
	case kindUniform:
		if fixed || r.refine >= maxPolygonRefine {
			return r, false
		}
		r.refine++
	case kindAdaptive:
		if indicators == nil || len(r.marks) >= maxAdaptiveRounds {
			return r, false
		}
		r.marks = append(append([][]int(nil), r.marks...), dorflerMarks(indicators, adaptiveTheta))
	default:
		panic("certify: unknown step kind")
	}
	return r, true
}

// stepWork predicts the work of computing recipe r, in units of about
// 2.7 µs (stageAWorkPerTriangle): the flux unknowns times (k + 1)² for
// RT_k (the element matrices of stage B and the flux solve grow like
// that: measured on the Robin trapezoid, degree 6 → 8 took 3.0× the time
// for 3.1× this work, and each uniform level 4× for 4×), plus the
// stage-A triangles. The trial mesh before its adaptive rounds is built
// to count its triangles (meshTriangles; a grading level adds from a few
// to a few dozen triangles, which decides whether grading is cheap), the
// adaptive rounds and the stage-A mesh are estimated as in the memory
// estimate (polygon.memory). A prediction only.
func (h *stepHistory) stepWork(p *problem.Problem, r recipe) float64 {
	trial := float64(h.meshTriangles(p, r.refine, r.graded))
	for _, marks := range r.marks {
		trial += 6 * float64(len(marks))
	}
	k := float64(max(r.fluxDegree, r.degree-1))
	flux := trial * (3*(k+1)/2 + k*(k+1))
	stageA := float64(estimatedTriangles(p, r.stageARefine, stageACorners(p, r)))
	return flux*(k+1)*(k+1) + stageAWorkPerTriangle*stageA
}

// meshTriangles returns the number of triangles of the trial mesh with
// refine uniform and graded grading levels before adaptive rounds,
// remembered per run (the meshes are built again by the computation);
// meshes estimated above maxCountedTriangles are not built, their
// estimate (estimatedTriangles) is returned.
func (h *stepHistory) meshTriangles(p *problem.Problem, refine, graded int) int {
	key := [2]int{refine, graded}
	if h != nil {
		if n, ok := h.triangles[key]; ok {
			return n
		}
	}
	cs := singularCorners(p, gradedDegree, graded)
	n := int(estimatedTriangles(p, refine, cs))
	if n <= maxCountedTriangles {
		if m, err := polygonMesh(p, refine, cs); err == nil {
			n = len(m.Tris)
		}
	}
	if h != nil {
		if h.triangles == nil {
			h.triangles = make(map[[2]int]int)
		}
		h.triangles[key] = n
	}
	return n
}

// maxCountedTriangles bounds the meshes meshTriangles builds to count
// (building one costs a small part of computing on it).
const maxCountedTriangles = 1 << 16

// note is what a stall warning adds about the kinds of step: the last
// gain and time of each.
func (h *stepHistory) note() string {
	if h == nil {
		return ""
	}
	var parts []string
	for _, k := range choiceOrder {
		rec := h.kinds[k]
		if rec.seconds == 0 {
			parts = append(parts, stepKindNames[k]+" not tried")
			continue
		}
		parts = append(parts, fmt.Sprintf("%s gained %.3g in %.1f s", stepKindNames[k], rec.gain, rec.seconds))
	}
	note := "; the last step of each kind: " + strings.Join(parts, ", ")
	if h.best != nil && len(h.best.r.marks) > 0 {
		note += " (the best step's adaptive marks fix its uniform and graded levels)"
	}
	return note
}
