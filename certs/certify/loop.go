package certify

import (
	"context"
	"errors"
	"fmt"
	"math"
	"time"

	"gapcert/certs"
	"gapcert/fem/problem"
)

// maxShiftRaises bounds how often Certify enlarges γ when the cell
// enclosures of V + γ could not be shown nonnegative.
const maxShiftRaises = 8

// DefaultTimeLimit is the refinement budget when Options.TimeLimit is 0.
const DefaultTimeLimit = 60 * time.Second

// Certify encloses λ_1..λ_m (m = p.Eigenvalues) and the gap λ₂ − λ₁ of the
// problem, refining until every relative width (TargetRule) is at most the
// target or no step can help within the budget, and returns the
// certificate of the best step. Its method records the target and why
// refinement stopped (method.refinement, see the Stop constants) and each
// enclosure's widths (method.widths); when the target is not met the
// certificate also says so in a warning. Its bounds are verified either
// way.
//
// A target or time limit out of range is refused with a *TargetError
// before anything is computed, and so is Options.GroundState on a problem
// with fewer than two eigenvalues (the reader refuses such files; a
// problem edited in Go may have one) or, on a polygon, with a point whose
// coordinates are not float64 values exactly, and a problem with a claim
// naming shape_margin without Options.GroundState (GroundStateClaim). When ctx is cancelled, Certify returns at
// once the certificate of the best step finished so far, with stop reason
// StopInterrupted (its bounds are verified and Check reproduces them), or
// ctx's error if no step has finished; the step in progress is abandoned
// and runs to its end in the background (its memory is freed then). The
// time limit is not a hard one: a step starts only if it is expected to
// end within the limit (a few times the last step), and then finishes.
//
// A product domain is certified by separation of variables (product.go:
// each factor by this function, then combined; its certificate embeds the
// factors'); the ground state is refused on it before computing.
func Certify(ctx context.Context, p *problem.Problem, opt Options) (*certs.Certificate, error) {
	if err := Supported(p); err != nil {
		return nil, err
	}
	targetText := p.RelWidth.Text
	if opt.RelWidth != "" {
		targetText = opt.RelWidth
	}
	target, err := ParseTarget(targetText)
	if err != nil {
		return nil, err
	}
	if opt.GroundState && p.Eigenvalues < 2 {
		return nil, fmt.Errorf("the ground state needs lambda2, but the problem asks for %d eigenvalue (hint: ask for \"eigenvalues\": 2 or more)", p.Eigenvalues)
	}
	if opt.GroundState && p.Polyhedron != nil {
		return nil, fmt.Errorf("the ground-state block is not available on polyhedra (hint: certify without --ground-state, Options.GroundState)")
	}
	if opt.GroundState && p.Dim == 2 {
		if _, err := polygonPoints(p); err != nil {
			return nil, err
		}
	}
	if i := GroundStateClaim(p); i >= 0 && !opt.GroundState {
		return nil, fmt.Errorf("claims[%d] %q names shape_margin, which only results.ground_state provides (hint: certify with --ground-state, Options.GroundState)", i, p.Claims[i])
	}
	limit := opt.TimeLimit
	switch {
	case limit == 0:
		limit = DefaultTimeLimit
	case limit < 0:
		return nil, &TargetError{Option: "time limit", Value: limit.String(), Msg: "is negative", Hint: "give a positive duration such as 60s"}
	}
	if p.IsProduct() {
		return certifyProduct(ctx, p, opt, target, targetText, limit)
	}
	budget := opt.Memory
	if budget == 0 {
		budget = DefaultMemory
	}
	if err := checkMeshable(p); err != nil {
		return nil, err
	}
	opt.ctx = ctx
	d := discretisationOf(p)
	start := time.Now()
	r, err := initialRecipe(p)
	if err != nil {
		return nil, err
	}
	if est := memoryEstimate(p, r); est > budget {
		return nil, &BudgetError{What: "the first mesh", Need: est, Budget: budget}
	}
	// A discretisation that paces itself (polygons with singular corners)
	// starts a step only when its predicted time fits (chooseStep);
	// otherwise the next step is expected to cost a few times the last.
	type pacer interface {
		pace(deadline time.Time, memory int64, target float64) bool
	}
	type observer interface {
		observe(r recipe, out *outcome, worst, seconds float64)
	}
	paced := false
	if pc, ok := d.(pacer); ok {
		paced = pc.pace(start.Add(limit), budget, target.Mid())
	}
	var best *result
	reason, bestStep := "", 0
	prevWorst, steps, stalls := 0.0, 0, 0
	for raised := 0; ; {
		t0 := time.Now()
		out, err := computeCtx(ctx, p, r)
		if errors.Is(err, errAbandoned) {
			if best == nil {
				return nil, ctx.Err()
			}
			reason = StopInterrupted
			break
		}
		if failed, ok := d.signFailure(err); ok && raised < maxShiftRaises {
			// The cell enclosures of V + γ were too wide to show V + γ ≥ 0:
			// a larger shift is as sound and may be provable.
			r = raiseShifts(r, p.Dim, failed)
			raised++
			continue
		}
		if err != nil {
			return nil, err
		}
		res, err := assemble(p, r, out)
		if err != nil {
			return nil, err
		}
		steps++
		if opt.Progress != nil {
			opt.Progress("[%6.1fs] step %d (%s%s, %.2fs): widths lambda1 %.2g, lambda2 %.2g, gap %.2g; target %s\n",
				time.Since(start).Seconds(), steps, r.describe(), out.describe(), time.Since(t0).Seconds(),
				res.widths[0], res.widths[1], res.gapWidth, targetText)
		}
		if ob, ok := d.(observer); ok {
			ob.observe(r, out, res.worst(), time.Since(t0).Seconds())
		}
		last := res
		if best == nil || res.worst() <= best.worst() {
			best, bestStep = res, steps
		}
		if res.reached(target) {
			best, reason = res, StopTarget
			break
		}
		// The factor by which the last step narrowed the worst width
		// steers the polygon driver (+Inf on the first step).
		gain := math.Inf(1)
		if prevWorst > 0 {
			gain = prevWorst / res.worst()
		}
		prevWorst = res.worst()
		if d.stalls(gain, out, best) {
			stalls++
		} else {
			stalls = 0
		}
		if stalls >= d.stallSteps() {
			reason = StopStalled
			break
		}
		next, why := d.next(r, out, gain)
		if why != "" {
			// A cap, a stall or the time ends the run. A cap is recorded as
			// such only when the best step is the last one (Check verifies
			// it on the recorded step); after steps that only widened the
			// widths it is a stall.
			reason = why
			if best != last && (why == StopCap || why == StopNoSeparation) {
				reason = StopStalled
			}
			if reason == StopNoSeparation && best.out.n > 0 {
				reason = StopCap
			}
			break
		}
		if need := memoryEstimate(p, next); need > budget {
			best.warnings = append(best.warnings, fmt.Sprintf("the next refinement would need about %s, more than the memory budget of %s", byteSize(need), byteSize(budget)))
			reason = StopMemory
			break
		}
		// The next step costs a few times the last one (a discretisation
		// may predict it, stepTimer); stop if it would not fit, unless the
		// discretisation offers a cheaper step that does (stepFallback).
		stepDur := time.Since(t0)
		fits := func(next recipe) bool {
			predicted := 4 * stepDur
			if st, ok := d.(stepTimer); ok {
				predicted = st.stepTime(r, next, out, stepDur)
			}
			return paced || time.Since(start)+predicted <= limit
		}
		if !fits(next) {
			fb, ok := d.(stepFallback)
			var alt recipe
			if ok {
				alt, ok = fb.fallback(r, next, out)
			}
			if !ok || memoryEstimate(p, alt) > budget || !fits(alt) {
				reason = StopTime
				break
			}
			next = alt
		}
		if ctx.Err() != nil {
			reason = StopInterrupted
			break
		}
		r = next
	}
	if reason == StopStalled {
		msg := fmt.Sprintf("the widths stalled: the best step is step %d of %d, and the steps after it widened the widths", bestStep, steps)
		if paced {
			msg = fmt.Sprintf("the widths stalled: every kind of step not at its cap narrowed them by less than 5%% or gave no bound (best: step %d of %d)", bestStep, steps)
			msg += d.stallNote()
		} else if stalls >= d.stallSteps() {
			msg = fmt.Sprintf("the widths stalled: steps %d to %d narrowed them by less than 5%% each (best: step %d)", steps-stalls+1, steps, bestStep)
			msg += d.stallNote()
		}
		best.warnings = append(best.warnings, msg)
	}
	best.warnings = append(best.warnings, wideWarnings(p, best, reason)...)
	if reason != StopTarget {
		best.warnings = append(best.warnings, fmt.Sprintf("target relative width %s not reached (stopped: %s); the widths reached are in results.relative_widths and method.widths", targetText, reason))
	}
	best.refinement = &Refinement{Target: targetText, TargetRule: TargetRule, StopReason: reason}
	return best.certificate(p, opt)
}

// stepFallback is a discretisation that offers a cheaper step when the
// one it chose (next) is predicted not to fit in the time left (a
// choice).
type stepFallback interface {
	fallback(r, next recipe, out *outcome) (recipe, bool)
}

// stepTimer is a discretisation that predicts the time of the step from r
// to next from the time last of r's step and its outcome (a choice: the
// time limit is not a hard one).
type stepTimer interface {
	stepTime(r, next recipe, out *outcome, last time.Duration) time.Duration
}

// Widths stall when the discretisation's number of steps in a row
// (discretisation.stallSteps) narrow the widths by less than the factor
// stallGain (discretisation.stalls; interval.go, polygon_refine.go).
const stallGain = 1.05

// refine chooses the next recipe, or says why there is none (a Stop
// reason): discretisation.next (interval.go, polygon_refine.go).
func refine(p *problem.Problem, r recipe, out *outcome, gain float64) (recipe, string) {
	return discretisationOf(p).next(r, out, gain)
}

// errAbandoned reports a step abandoned because its context ended.
var errAbandoned = errors.New("certify: step abandoned")

// computeCtx runs compute, returning errAbandoned as soon as ctx ends (the
// computation then finishes in the background and its outcome is dropped).
func computeCtx(ctx context.Context, p *problem.Problem, r recipe) (*outcome, error) {
	if ctx.Err() != nil {
		return nil, errAbandoned
	}
	type done struct {
		out *outcome
		err error
	}
	ch := make(chan done, 1)
	go func() {
		out, err := compute(p, r)
		ch <- done{out, err}
	}()
	select {
	case d := <-ch:
		return d.out, d.err
	case <-ctx.Done():
		return nil, errAbandoned
	}
}
