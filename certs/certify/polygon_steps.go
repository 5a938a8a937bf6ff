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
	rest    float64 // degree steps: the factor by which the last one with a meaningful corner share narrowed the error away from the corners (restGain; 0: not measured)
	levels  int     // the grading levels its last step added
}

// bestStep is the step with the narrowest worst width that stage B ran
// on, with what choosing its successors needs.
type bestStep struct {
	r          recipe
	score      float64 // −log of its worst width
	rho, ritzN float64 // ρ̂ and the Ritz bound of Λ_N
	indicators []float64
	share      share // its corner share
}

// stepHistory is what the polygon driver measured of the steps of one
// run: per kind the last gain and wall time, the cost of a unit of work
// (stepWork), the best step, and the time and memory left. A nil
// *stepHistory is a run without measurements: the choice rests on the
// priors (priorGain) and the predicted work alone.
type stepHistory struct {
	deadline time.Time // zero: no limit
	memory   int64     // memory budget in bytes (0: none)

	steps         int
	score         float64 // −log of the last step's worst width
	perWork       float64 // seconds per unit of work of the last step (0: unknown)
	pending       stepKind
	pendingBase   float64 // score of the step the pending one started from
	pendingCost   float64 // its predicted seconds (0: no prediction)
	pendingSetup  float64 // the part of pendingCost that is the setup of a new degree (setupWork)
	pendingShare  share   // the corner share of the step the pending one started from
	pendingDeg    int     // the trial degree of that step
	pendingLevels int     // the grading levels the pending step adds to that step's (a degree step on the hp line, hpGraded)
	best          *bestStep
	kinds         [numStepKinds]kindRecord
	triangles     map[[2]int]int // meshTriangles by (uniform, graded) levels

	target  float64 // the relative width sought (0: none): gains beyond it are worth nothing (chooseStep)
	degrees uint64  // bit k: trial degree k has been computed in this run (its tables are built)
	share   share   // the corner share of the last step

	// The mild phase (mildStep) on polygons whose corners all have ν ≥ 1.
	degreeSlowed  bool // a degree step of the mild phase gained less than mildDegreeGain
	cornerLimited bool // a uniform level gained less than twice its corner-limited rate 4^ν_min
}

// pace gives the driver the run's deadline and memory budget, and reports
// whether it checks the time itself (Certify then starts a step only when
// the driver chose one that fits).
func (d polygon) pace(deadline time.Time, memory int64, target float64) bool {
	if d.hist == nil {
		return false
	}
	d.hist.deadline, d.hist.memory, d.hist.target = deadline, memory, target
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
	// The setup of a degree new to the run is counted apart from the
	// step's work: work is the part of the seconds the work took.
	w, setup := h.stepWork(d.p, r), h.setupWork(r.degree)
	h.degrees |= 1 << uint(r.degree)
	work := seconds
	if w+setup > 0 {
		work = seconds * w / (w + setup)
	}
	var sh share
	if out.lg != nil && out.polygon != nil && out.polygon.indicators != nil {
		sh = cornerShare(d.p, r, out.polygon.indicators)
	}
	if k := h.pending; k != kindNone {
		rec := &h.kinds[k]
		rec.tried, rec.seconds, rec.levels = true, seconds, h.pendingLevels
		switch {
		case failed || math.IsInf(score, -1):
			rec.gain = 0
		case math.IsInf(h.pendingBase, -1):
			rec.gain = math.Inf(1)
		default:
			rec.gain = math.Exp(score - h.pendingBase)
		}
		if c := h.pendingCost - h.pendingSetup; c > 0 && work >= minLearnSeconds {
			rec.ratio = math.Min(4, math.Max(0.25, work/c))
		}
		if c, ok := cornerFactor(k, h.pendingDeg, h.pendingLevels, h.nuMin(d.p), h.levelGain()); ok && h.pendingShare.ok && rec.gain > 0 && !math.IsInf(rec.gain, 1) {
			rec.rest = restGain(rec.gain, h.pendingShare.corner, c)
		}
		if k == kindDegree && rec.gain < mildDegreeGain {
			h.degreeSlowed = true
		}
		if k == kindUniform && rec.gain < 2*math.Pow(4, h.nuMin(d.p)) {
			h.cornerLimited = true
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
	if w > 0 && seconds > 0 {
		h.perWork = seconds / (w + setup)
	}
	h.score, h.pending, h.share = score, kindNone, sh
	if out.lg != nil && (h.best == nil || score >= h.best.score) {
		h.best = &bestStep{r: r, score: score, rho: out.rho, ritzN: out.ritz[out.n-1], share: sh}
		if out.polygon != nil {
			h.best.indicators = out.polygon.indicators
		}
	}
}

// hasBest reports whether a step with stage B has been recorded.
func (h *stepHistory) hasBest() bool { return h != nil && h.best != nil }

// expect records the kind of the step about to be computed from the last
// one (from is the last recipe, r the next one), and reports whether its
// predicted time fits in the time left.
func (h *stepHistory) expect(d polygon, k stepKind, from, r recipe) bool {
	if h == nil {
		return true
	}
	h.pending, h.pendingBase, h.pendingCost, h.pendingSetup = k, h.score, 0, 0
	h.pendingShare, h.pendingDeg, h.pendingLevels = h.share, from.degree, r.graded-from.graded
	if h.perWork > 0 {
		h.pendingCost = h.predict(d.p, k, r)
		h.pendingSetup = h.perWork * h.setupWork(r.degree)
	}
	return !h.exceeds(h.pendingCost)
}

// predict returns the predicted wall time of computing recipe r as a step
// of kind k: its work (stepWork) times the kind's ratio, plus the setup of
// a degree new to the run (setupWork), times the measured seconds per
// unit of work. A degree step's ratio counts only when it is 1 or more:
// a ratio below 1 learned at a low degree on a small mesh (where stage A,
// whose work is a rough count, takes much of the time) made the raises
// to degree 8 of the Neumann L-shape and the 117° trapezoid look half as
// dear as they were, and they ended 28 s and 3.6 s after the time limit
// (loaded machine).
func (h *stepHistory) predict(p *problem.Problem, k stepKind, r recipe) float64 {
	ratio := h.kinds[k].ratioOrOne()
	if k == kindDegree {
		ratio = math.Max(1, ratio)
	}
	return h.perWork * (h.stepWork(p, r)*ratio + h.setupWork(r.degree))
}

// setupWork is the predicted work (in the units of stepWork) of building
// the exact tables of trial degree k and flux degree k − 1 (the
// divergence-adapted Raviart–Thomas basis, the Lagrange and product
// tables, built once per process), or 0 when a step of the run has used
// the degree. Measured on an otherwise idle machine (the Robin trapezoid
// on 8 and 32 triangles, a step at a new degree less the same step at a
// degree already built): 0.4 s at degree 6, 1.3 s at 8, 3.9 s at 10, a
// factor of about 1.8 per degree, at 2.7 µs per unit of work
// (stageAWorkPerTriangle). In units of work it follows the machine's load
// as the steps do: in seconds, the first degree-8 step of the 117°
// trapezoid on a loaded machine (4.0 s, predicted setup 1.3 s) made the
// next uniform level look 7× dearer than it was. Counted in no step's
// work, the first degree-10 step on 8 triangles (4.1 s, of which 0.2 s of
// work) made every degree step look 4× (the ratio's clamp) dearer than it
// is. A prediction only (a process that built the tables before, as in a
// test, takes less).
func (h *stepHistory) setupWork(k int) float64 {
	if h == nil || k < 0 || k >= 64 || h.degrees&(1<<uint(k)) != 0 {
		return 0
	}
	return 0.4 / 2.7e-6 * math.Pow(1.8, float64(k-6))
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
// gained since); it is scored by log(gain)/seconds, with
//
//   - gain its predicted gain (predictedGain: from the base step's corner
//     share for degree steps, else its last measured gain or priorGain
//     before it is tried), counted at most up to the gain that
//     reaches the target width with a margin (targetMargin), so that of
//     the steps predicted to reach the target the cheapest is taken;
//   - seconds its predicted wall time: the work of its recipe (stepWork)
//     times the kind's own ratio of measured to predicted time, plus the
//     setup of a degree new to the run, times the measured seconds per
//     unit of work of the last step (predict).
//
// Candidates that would exceed the memory budget are taken only when
// nothing else remains (Certify then stops for memory), and those whose
// predicted time does not fit in the time left are dropped. The stop
// reason says what remained: StopCap when every kind is at its cap,
// StopTime when the only useful kinds left do not fit in the time,
// StopStalled when every kind left is spent. The chosen step gets the
// stage-A rider (withStageARider). On a polygon with a corner of ν < 1
// the steps follow the hp line (onHPLine: a degree raise grades to the
// depth of its degree, grading alone stops at the depth of the present
// one). The first adaptive round waits while grading, or on the hp line
// the degree, is a candidate that fits in the time. Candidates scored
// within closeCallMargin of the best are settled by their log gain per
// unit of work, which no measured time enters.
func (h *stepHistory) chooseStep(d polygon, r recipe, out *outcome) (recipe, string) {
	base, baseScore, sh := r, 0.0, share{}
	rho, ritzN, indicators := out.rho, 0.0, []float64(nil)
	if out.n > 0 {
		ritzN = out.ritz[out.n-1]
	}
	if out.polygon != nil {
		indicators = out.polygon.indicators
	}
	if h != nil {
		baseScore, sh = h.score, h.share
		if h.best != nil && (h.score < h.best.score || out.lg == nil) {
			b := h.best
			base, baseScore, rho, ritzN, indicators, sh = b.r, b.score, b.rho, b.ritzN, b.indicators, b.share
		}
	}
	// Gains past the target (with its margin) are worth nothing.
	maxLog := math.Inf(1)
	if h != nil && h.target > 0 && !math.IsInf(baseScore, 0) {
		if need := -baseScore - math.Log(h.target); need > 0 {
			maxLog = need + math.Log(targetMargin)
		}
	}
	baseWork := 0.0 // computed when first needed
	type candidate struct {
		kind    stepKind
		r       recipe
		cost    float64 // its predicted seconds
		score   float64 // log gain per predicted second
		perWork float64 // log gain per unit of work (stepWork and setupWork)
	}
	var best, overMemory *candidate
	var fitting []*candidate
	available, tooSlow, structured := false, false, false
	_, line := hpGraded(d.p, base.degree)
	for _, k := range choiceOrder {
		c, ok := applyStep(k, base, indicators)
		if ok {
			c, ok = onHPLine(d.p, k, base, c)
		}
		if !ok {
			continue
		}
		if k == kindAdaptive && h != nil && len(base.marks) == 0 && structured {
			// Marks fix the uniform and graded levels: the first round
			// waits while a structured step toward the corners is a
			// candidate that fits: grading, or on the hp line the degree
			// (each raise grades further; measured on the 117°
			// trapezoid, a round at degree 6 with 20 levels gained 8.5,
			// to 2.6e-12 for the gap, and left the run no step toward
			// degree 10, where one step reaches 1.4e-12).
			available = true
			continue
		}
		available = true
		if baseWork == 0 {
			baseWork = h.stepWork(d.p, base)
		}
		cost := h.stepWork(d.p, c) / baseWork // relative to the base step
		if h != nil {
			if h.kinds[k].spent {
				continue
			}
			if h.perWork > 0 {
				cost = h.predict(d.p, k, c)
				if h.exceeds(cost) {
					tooSlow = true
					continue
				}
			}
		}
		if k == kindGrade || (k == kindDegree && line) {
			structured = true
		}
		gain := h.predictedGain(d.p, k, base, c, sh)
		// The setup of a new degree counts in the score: left out, the
		// degree rose to 8 on the first mesh of the 117° trapezoid, and
		// the grading steps that followed at degree 8 cost more than at
		// 6 (7.7e-9 at 26 s against 1.4e-10 at 24 s for grading at
		// degree 6, measured under the same load).
		charged := cost
		if k == kindUniform && line {
			charged += h.uniformLookahead(d.p, base, c)
		}
		logGain := math.Min(math.Log(gain), maxLog)
		rate := logGain / math.Max(charged, 1e-9)
		perWork := logGain / math.Max(h.stepWork(d.p, c)+h.setupWork(c.degree), 1e-9)
		cand := &candidate{kind: k, r: c, cost: cost, score: rate, perWork: perWork}
		if h != nil && h.memory > 0 && memoryEstimate(d.p, c) > h.memory {
			if overMemory == nil || cand.score > overMemory.score {
				overMemory = cand
			}
			continue
		}
		fitting = append(fitting, cand)
		if best == nil || cand.score > best.score {
			best = cand
		}
	}
	// A close call is settled by the log gain per unit of work
	// (closeCallMargin).
	top := best
	for _, c := range fitting {
		if c.score*closeCallMargin >= top.score && c.perWork > best.perWork {
			best = c
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
		h.pending, h.pendingBase, h.pendingCost, h.pendingSetup = best.kind, baseScore, 0, 0
		h.pendingShare, h.pendingDeg, h.pendingLevels = sh, base.degree, best.r.graded-base.graded
		if h.perWork > 0 {
			h.pendingCost, h.pendingSetup = best.cost, h.perWork*h.setupWork(best.r.degree)
		}
	}
	return withStageARider(best.r, rho, ritzN), ""
}

// uniformLookahead returns the predicted seconds by which a uniform level
// from base (to next) on the hp line makes dearer the degree steps still
// ahead of it (onHPLine: each raises the degree by 2 and grades to the
// depth of the new degree, up to maxPolygonDegree): the sum over those
// steps of the predicted time of the step from next less that of the same
// step from base (predict). Only the steps from base that fit, one after
// the other, in the time left after the uniform level (with the margin)
// count: a step the run has no time for costs nothing more. 0 without a
// measured cost per unit of work, off the hp line, with adaptive marks,
// or once the degree is spent or at its cap.
//
// chooseStep adds it to a uniform level's cost in the score (not to the
// predicted time that checks the deadline or sets the kind's ratio): the
// level multiplies the cost of every later raise about by the factor it
// multiplies the triangles, which a rating one step ahead does not see.
// Without it the 117° trapezoid took the third and fourth uniform levels
// at degree 4 (the third gained 16) and raised the degree to 6 on 716
// triangles, after which no raise fitted in 30 s (gap 9.5e-11, loaded
// machine), while degree 10 on 3 uniform and 18 graded levels reaches
// 1.4e-12 in one step of 9.2 s. With it (and the gain of the last raise
// that graded, predictedGain) the run goes to degree 8 on 2 uniform
// levels, takes the third there and then degree 10 with 18 levels: gap
// 3.4e-13 at 26 s, where it stopped at 3.9e-12 at 24 s (two runs each,
// machine lightly loaded). A choice, never a bound.
func (h *stepHistory) uniformLookahead(p *problem.Problem, base, next recipe) float64 {
	if h == nil || h.perWork <= 0 || len(base.marks) > 0 || h.kinds[kindDegree].spent {
		return 0
	}
	if _, line := hpGraded(p, base.degree); !line {
		return 0
	}
	left := math.Inf(1)
	if !h.deadline.IsZero() {
		left = time.Until(h.deadline).Seconds()/timeMargin - h.predict(p, kindUniform, next)
	}
	extra, planned := 0.0, 0.0
	from, to := base, next
	for from.degree < maxPolygonDegree {
		f, okF := applyStep(kindDegree, from, nil)
		t, okT := applyStep(kindDegree, to, nil)
		if !okF || !okT {
			break
		}
		f, _ = onHPLine(p, kindDegree, from, f)
		t, _ = onHPLine(p, kindDegree, to, t)
		cf := h.predict(p, kindDegree, f)
		if planned += cf; planned > left {
			break
		}
		extra += h.predict(p, kindDegree, t) - cf
		from, to = f, t
	}
	return math.Max(0, extra)
}

// targetMargin: a step predicted to narrow the worst width to the target
// divided by this factor counts as reaching it (a choice: the predicted
// gains of the measured cases were within a factor of about 2 of the
// measured ones).
const targetMargin = 2

// closeCallMargin: candidates whose scores (log gain per predicted
// second) are within this factor of the best one are a close call, which
// chooseStep settles by the log gain (capped at the target, as in the
// score) per unit of work, the step's work and the setup of a degree new
// to the run (stepWork, setupWork): counts of the recipes that no
// measured time enters (a choice). The scores rest on measured times,
// which vary by ±10 to 20% from run to run on the same machine, through
// the seconds per unit of work (common to all candidates), each kind's
// ratio of measured to predicted time, and the time left, which decides
// whether a raise counts in a uniform level's lookahead
// (uniformLookahead: it counts only if it fits after the level); scores
// this close picked the step by the load of the moment. Outside close
// calls the scores decide, since only they see the time left and what
// each kind has cost. Measured on the 117° trapezoid after the raise to
// degree 8 on 2 uniform and 14 graded levels (gap 7.1e-11 at 8 s, a
// 1e-12 target within 30 s): the raise to degree 10 with 18 levels
// (predicted 15 s, gain 60 from the last raise) scored 1.09 times the
// uniform level (5 s, gain 6.6) when the run was 10 to 20% faster and the
// lookahead counted the raise after the level, 0.69 times when the raise
// did not fit after it. Taken, the raise gained 7 and the gap stalled at
// 1e-11; the uniform level (gain 3.4) and then the raise on 3 uniform
// levels (gain 62) reached the gap 3.4e-13 at 27 s. Per unit of work the
// level gains 1.5 times as much as the raise.
const closeCallMargin = 1.5

// predictedGain returns the factor by which a step of kind k from the
// base step to next is predicted to narrow the worst width, given the
// base step's corner share φ (cornerShare). For a degree step with a
// meaningful share the error is split into the part on the triangles at
// the graded corners, φ, and the rest, 1 − φ; the raise shrinks the
// corner part by cornerFactor and the rest by the factor measured on the
// run's last degree step with a meaningful share (restGain),
// priorRestGain before, so
//
//	gain = 1 / (φ·corner + (1 − φ)/rest).
//
// After deep grading, when the rest limits the widths, this predicts the
// degree's exponential convergence on the smooth part (measured on the
// 117° trapezoid at degree 6, 2 uniform and 14 graded levels: share 0.31,
// the degree raise gained 14.7 while the last measured degree gain, from
// the first mesh, was 4.9), and while the corners limit, that it gains
// little (share 0.99 at degree 8: predicted 2.0, measured 1.7 and 1.9).
// A degree step that grades with the raise (on the hp line, onHPLine) is
// predicted to gain at least what the last degree step that graded gained:
// along the hp line the error falls exponentially in the degree, by about
// the same factor per raise (hpGraded). Without that floor the 117°
// trapezoid, whose raise from degree 4 to 6 with 4 levels gained 3,300,
// had the raise to 8 predicted at about 3 (the last grading level, taken
// while λ2 was limited away from the corners, gained 1.07, which bounds
// the levels' credit, levelGain) and took uniform levels at degree 6
// instead. Otherwise, and for the other kinds, the kind's last measured
// gain, priorGain before it is tried. A nil history has the priors.
//
// Grading is not predicted from the share: the corner part of the error
// lies on the graded layers around the corner too, not only on the
// triangles at it, and the share underestimated it (on the L-shape at
// degree 6, 3 uniform and 6 graded levels, where λ1's corner term
// limits the widths, the driver took uniform levels instead and reached
// 2.8e-6 in the time in which grading chosen by its measured gain reached
// 2.4e-9).
func (h *stepHistory) predictedGain(p *problem.Problem, k stepKind, base, next recipe, sh share) float64 {
	gain := priorGain[k]
	if h == nil {
		return gain
	}
	rec := h.kinds[k]
	if rec.tried {
		gain = rec.gain
	}
	if !sh.ok {
		return gain
	}
	corner, ok := cornerFactor(k, base.degree, next.graded-base.graded, h.nuMin(p), h.levelGain())
	if !ok {
		return gain
	}
	rest := priorRestGain[k]
	if rec.rest > 0 {
		rest = rec.rest
	}
	gain = 1 / (sh.corner*corner + (1-sh.corner)/rest)
	if k == kindDegree && next.graded > base.graded && rec.tried && rec.levels > 0 {
		// Along the hp line each raise by 2 with its levels gains about
		// the same factor (hpGraded: the error falls exponentially in
		// the degree there), so a raise with levels gains at least what
		// the last one with levels gained.
		gain = math.Max(gain, rec.gain)
	}
	return gain
}

// cornerFactor returns the factor by which a step of kind k from trial
// degree p that adds `levels` grading levels (a degree step on the hp
// line, hpGraded; 0 otherwise) shrinks the corner part of the error, for
// the least exponent ν of the graded corners, and whether the kind is
// modelled so:
//
//	degree p → p + 2      (p/(p + 2))^(4ν)  the p version approximates r^ν on the corner element with an
//	                                        energy error ≈ p^(−2ν) (Babuška and Suri, RAIRO Modél. Math.
//	                                        Anal. Numér. 21 (1987) 199–238, recalled from memory); the
//	                                        eigenvalue error is its square
//	and levels more       × max(4^(−ν·levels), g^(−levels))
//	                                        each level halves the corner element, whose eigenvalue error
//	                                        is ≈ h_c^(2ν) (singularCorners), but the levels gain no more
//	                                        than grading gained on its own, g per level (levelGain)
//
// The bound by g keeps the model to what the run measured: on the
// Neumann L-shape with V = exp(−r²) the widths are first limited by the
// weight's Taylor models on the coarse mesh, which only uniform levels
// narrow; without the bound the raise to degree 8 with 15 more levels
// was taken there after two grading levels had gained 1.3, and it took
// 76 s (loaded machine) for a gain of 1.07.
//
// Grading alone is not modelled (predictedGain); nor are uniform levels and
// adaptive rounds. A uniform level halves the corner elements once
// (2^(−2ν)) but also narrows the graded layers around them far more than
// that model says (measured on the 117°
// trapezoid at degree 10, 2 uniform and 18 graded levels: share 0.98, a
// uniform level gained 12.7 where the split predicts 2.9), and with the
// split its predictions chose uniform levels at degree 4 until they no
// longer fitted in the time (1.2e-8 at 24 s against 1.4e-11 at 22 s with
// the measured gain).
func cornerFactor(k stepKind, p, levels int, nu, g float64) (float64, bool) {
	switch k {
	case kindDegree:
		n := float64(max(0, levels))
		return math.Pow(float64(p)/float64(p+2), 4*nu) * math.Max(math.Pow(4, -nu*n), math.Pow(g, -n)), true
	}
	return 0, false
}

// levelGain is the factor by which one grading level is expected to
// narrow the worst width when a degree raise brings it: the last grading
// step's gain per level, at least 1, and 1 before a grading step is
// measured (also for a nil history): the levels earn credit once grading
// has shown that the corners limit (before, the Neumann L-shape took the
// raise to degree 6 with 11 more levels first, 8 s for a gain of 2, where
// grading at degree 4 gains 2 to 6 per step at a third of the cost).
func (h *stepHistory) levelGain() float64 {
	if h == nil {
		return 1
	}
	rec := h.kinds[kindGrade]
	if rec.seconds == 0 || rec.levels < 1 {
		return 1
	}
	return math.Pow(math.Max(1, rec.gain), 1/float64(rec.levels))
}

// hpLevelsPerDegree is κ of the hp line (hpGraded), a choice: the
// grading depth at which, at trial degree p, the corner element and the
// graded layers around it are about equally accurate. On a geometric
// mesh with factor ½ the eigenvalue error of the corner element of n
// levels is ≈ 4^(−νn) (singularCorners), and that of the layers, on which
// the eigenfunction is analytic at a distance from the corner comparable
// to their size, falls exponentially in p, ≈ e^(−2bp); the two balance at
// n = (2b/ln 4)·p/ν (a model of the trade, not a theorem). The constant
// b depends on the elements' shapes and is not known in closed form for
// these meshes; κ = 2b/ln 4 = 1.35 is calibrated on two measured recipes
// at degree 10: on the 117° trapezoid (ν ≈ 0.772) 18 graded levels at 3
// uniform levels gave the gap 1.4e-12 in one step of 9.2 s, and on the
// L-shape (ν = 2/3) the driver's narrowest step had 20 levels (λ1 1.9e-12;
// deeper grading gains little there, maxGraded), κ = 1.39 and 1.33.
const hpLevelsPerDegree = 1.35

// hpGraded returns the grading depth the hp line pairs with trial degree
// k on p, ⌈κ·k/ν_min⌉ (κ = hpLevelsPerDegree, ν_min the least exponent of
// the graded corners) at most maxGraded, and whether p has such a line:
// polygons with a corner of ν_min < 1. The hp version of the finite
// element method converges exponentially on meshes geometrically refined
// toward the singular corners when the number of refinement layers grows
// in proportion to the (uniform) polynomial degree (Schötzau and Schwab,
// Math. Models Methods Appl. Sci. 25 (2015) 1617–1661, uniform degrees on
// σ-geometric meshes of polyhedra; for regular simplicial meshes
// geometrically refined by bisection trees, as here, Numer. Math. (2019),
// doi:10.1007/s00211-019-01085-z; in two dimensions Schwab, p- and
// hp-Finite Element Methods, Oxford 1998, ch. 4; the proportionality of
// layers and degree is recalled from memory),
// while grading past the layers' accuracy or raising the degree with a
// coarse corner element gains little: a chooser that looks one step
// ahead, rating grading and the degree apart, finds neither (measured on
// the 117° trapezoid: graded 20 levels at degree 6 and stopped at 2.6e-12
// after 28 s, where degree 10 with 18 levels gives 1.4e-12 in one step of
// 9.2 s). Corners with ν ≥ 1, whose singular terms are in H², keep the
// rules of the mild phase (mildStep): their widths are limited by the
// smooth part first (the regular pentagon reaches 1e-12 at degree 10 with
// 0 to 6 levels). A choice of where to go, never a bound.
func hpGraded(p *problem.Problem, k int) (int, bool) {
	nu := (*stepHistory)(nil).nuMin(p)
	if !(nu < 1) {
		return 0, false
	}
	return min(maxGraded, int(math.Ceil(hpLevelsPerDegree*float64(k)/nu-exponentTolerance))), true
}

// onHPLine returns the step of kind k from r (next, from applyStep) on the
// hp line of p (hpGraded), and whether the kind is a candidate there:
// without adaptive marks (which fix the levels), a degree raise also
// grades to the depth of its new degree, and grading alone stops at the
// depth of the present degree until the degree is at its cap (from there
// only grading serves the corners). On polygons without an hp line the
// step is next as it is.
func onHPLine(p *problem.Problem, k stepKind, r, next recipe) (recipe, bool) {
	if len(r.marks) > 0 {
		return next, true
	}
	switch k {
	case kindDegree:
		if n, ok := hpGraded(p, next.degree); ok {
			next.graded = max(next.graded, n)
		}
	case kindGrade:
		if n, ok := hpGraded(p, r.degree); ok && r.degree < maxPolygonDegree && next.graded > max(n, r.graded) {
			if r.graded >= n {
				return r, false
			}
			next.graded = n
		}
	}
	return next, true
}

// priorRestGain is the factor by which a step of each modelled kind is
// assumed to narrow the error away from the corners before one with a
// meaningful corner share is measured (a choice): the smooth part
// converges exponentially in the degree (degree 6 → 8 narrowed the
// widths of the unit square 30× or more).
var priorRestGain = [numStepKinds]float64{kindDegree: 30}

// maxRestGain bounds a measured rest gain (restGain): a degree step whose
// gain the corner part alone explains says only that the rest gained
// much.
const maxRestGain = 1e4

// restGain returns the factor by which a step that narrowed the worst
// width by gain, from a step with corner share φ, narrowed the rest of
// the error when it shrank the corner part by the factor corner (solving
// 1/gain = φ·corner + (1 − φ)/rest), within [1, maxRestGain].
func restGain(gain, share, corner float64) float64 {
	if share >= 1 {
		return maxRestGain
	}
	inv := (1/gain - share*corner) / (1 - share)
	if inv <= 1/maxRestGain {
		return maxRestGain
	}
	return math.Max(1, 1/inv)
}

// nuMin returns the least singular exponent of the graded corners of p
// (singularCorners; +Inf without one).
func (h *stepHistory) nuMin(p *problem.Problem) float64 {
	nu := math.Inf(1)
	for _, c := range singularCorners(p, gradedDegree, 0) {
		nu = math.Min(nu, c.nu)
	}
	return nu
}

// mildDegreeGain: in the mild phase (mildStep) the degree rises while a
// raise narrows the widths by this factor or more, as on polygons without
// singular corners (next).
const mildDegreeGain = 10

// mildStep chooses the next step on a polygon whose singular corners all
// have ν ≥ 1 while no uniform level has shown that a corner limits the
// widths: the rule of polygons without singular corners (next), the
// degree by 2 while a raise gains mildDegreeGain or more (up to
// maxPolygonDegree), then uniform levels. Such a corner's term r^ν is in
// H² and limits a uniform level's gain only to 4^ν (≥ 4), so on the
// first meshes the smooth part, which the degree and uniform levels
// serve, limits the widths; grading toward the corners first cost time
// for nothing at loose targets (measured on the Robin trapezoid, ν = 4/3,
// at 1e-6: 13.6 s against 9.0 s with the smooth rule). Once a uniform
// level gains less than twice 4^ν_min (observe), or the rule's step does
// not fit in the time or the memory, or the last step widened the widths,
// the choice is chooseStep's (which takes another kind that fits, or
// says why none does).
//
// A polygon with a corner of ν < 1 has no mild phase: its steps follow
// the hp line (onHPLine) from the first. The line's cap on grading at
// degree 4 (hpGraded) ends the grading that kept the degree at 4 for nine
// steps on the 117° trapezoid, so the degree is not raised ahead of the
// corners: with a first raise to degree 6 the Neumann L-shape with
// V = exp(−r²) graded at degree 6 on 4 uniform levels, 12 to 17 s a step,
// where at degree 4 the same levels took 3.6 to 5 s and gained as much
// (measured on a nearly idle machine: λ2 3.8e-9 at 82 s against 3.0e-10
// at 94 s; the later run also had N = 7 trial functions against 5,
// chooseN, about 14% more time per step). It reports false when it does
// not choose.
func (d polygon) mildStep(r recipe, out *outcome) (recipe, bool) {
	h := d.hist
	if h == nil || h.cornerLimited || out.lg == nil || (h.best != nil && h.score < h.best.score) {
		return r, false
	}
	if _, line := hpGraded(d.p, r.degree); line {
		return r, false
	}
	k := kindUniform
	if !h.degreeSlowed && r.degree < maxPolygonDegree {
		k = kindDegree
	}
	next, ok := applyStep(k, r, nil)
	if !ok {
		return r, false
	}
	next = withStageARider(next, out.rho, out.ritz[out.n-1])
	if h.memory > 0 && memoryEstimate(d.p, next) > h.memory {
		return r, false
	}
	if !h.expect(d, k, r, next) {
		h.pending = kindNone
		return r, false
	}
	return next, true
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

// share is the corner share of a step's indicators (cornerShare).
type share struct {
	corner float64 // the share φ ∈ [0, 1] of the indicators on the triangles at the graded corners
	ok     bool    // it is meaningful (false: not computed, or the corner triangles are more than a quarter of the mesh)
}

// cornerShare returns the share of the indicators (η_T², package fem/tri)
// of recipe r's step on the triangles of its trial mesh that have a vertex
// at a graded corner (trialCorners). It is meaningful when those
// triangles are at most a quarter of the mesh (on the first meshes every
// triangle touches a corner, and the share says nothing of the corners).
// The indicators measure where the Lehmann–Goerisch fluxes miss, which
// the widths follow; a choice, never a bound.
func cornerShare(p *problem.Problem, r recipe, indicators []float64) share {
	m, err := trialMesh(p, r)
	if err != nil || len(m.Tris) != len(indicators) {
		return share{}
	}
	f := startMesh(p)
	isCorner := make(map[int]bool)
	for _, c := range trialCorners(p, r) {
		isCorner[f.vertex[c.vertex]] = true
	}
	total, corner, n := 0.0, 0.0, 0
	for t, tri := range m.Tris {
		total += indicators[t]
		if isCorner[tri[0]] || isCorner[tri[1]] || isCorner[tri[2]] {
			corner += indicators[t]
			n++
		}
	}
	if !(total > 0) || 4*n > len(m.Tris) {
		return share{}
	}
	return share{corner: corner / total, ok: true}
}
