package certify

import (
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"runtime"
	"strings"
	"time"

	"gapcert/certs"
	"gapcert/fem/line"
	"gapcert/fem/problem"
	"gapcert/fem/tri"
	"gapcert/interval"
	"gapcert/interval/decimalio"
)

// Digits is the number of significant digits of every bound in a
// certificate (lower ends rounded down, upper ends up).
const Digits = 17

// Options controls the refinement loop. The zero value asks for the
// problem's own target with the default budget.
type Options struct {
	// RelWidth is the target relative width (see TargetRule) as exact
	// decimal or rational text, such as "1e-8" or "1/1000"; "" means the
	// problem's target. It must lie in [MinRelWidth, 1).
	RelWidth  string
	TimeLimit time.Duration // budget for refinement; 0 = DefaultTimeLimit; negative is refused
	Tool      string        // tool name and version for the provenance block
	Now       func() time.Time
	Progress  func(format string, args ...any) // nil = quiet
	Memory    int64                            // memory budget in bytes; 0 = DefaultMemory

	recorded *certs.Certificate // set by Check: reference certificates of claims are taken from it, not computed
	ctx      context.Context    // set by Certify: reference certifications of claims run under it
}

// context returns the context of the run (Background outside Certify).
func (opt Options) context() context.Context {
	if opt.ctx == nil {
		return context.Background()
	}
	return opt.ctx
}

// BudgetError reports a computation refused before allocation because its
// estimated memory exceeds the budget.
type BudgetError struct {
	What         string
	Need, Budget int64 // bytes
}

func (e *BudgetError) Error() string {
	return fmt.Sprintf("%s would need about %.1f GiB, more than the memory budget of %.1f GiB (hint: ask for a coarser target or a smaller problem)",
		e.What, float64(e.Need)/(1<<30), float64(e.Budget)/(1<<30))
}

// DefaultMemory is the memory budget when Options.Memory is 0.
const DefaultMemory = 16 << 30

// bytesPerUnknown is the peak memory per stage-A unknown of a polygon
// computation: measured 3.3 GiB of heap at 1.3·10⁶ unknowns (about 2,700
// bytes each; BenchmarkPolygonStageA), with a margin for the garbage
// collector's headroom.
const bytesPerUnknown = 5000

// bytesPerFluxUnknown is the peak memory per Raviart–Thomas unknown of
// stage B: measured (peak RSS, unit square) 4.5 kB at degree 8 with 1.4·10⁵
// unknowns and 1.9 kB at degree 4 with 1.5·10⁵, with a margin.
const bytesPerFluxUnknown = 6000

// memoryEstimate estimates the peak memory of a recipe before anything is
// allocated (polygons only; interval problems are small): the larger of
// the stage-A and the stage-B estimates.
func memoryEstimate(p *problem.Problem, r recipe) int64 {
	if p.Dim != 2 {
		return 0
	}
	triangles := func(levels int) int64 {
		t := int64(len(startMesh(p).tris))
		for i := 0; i < levels; i++ {
			t *= 4
		}
		// Each grading level adds a few dozen triangles per corner.
		return t + int64(r.graded*len(singularCorners(p)))*40
	}
	// Edges ≈ 1.5 per triangle plus one mean per triangle (ECR).
	stageA := triangles(r.stageARefine) * 5 / 2 * bytesPerUnknown
	k := int64(max(r.fluxDegree, 0))
	trial := triangles(r.refine)
	for _, marks := range r.marks {
		trial += 6 * int64(len(marks)) // a bisected triangle and its closure
	}
	fluxUnknowns := trial * (3*(k+1)/2 + k*(k+1))
	flux := fluxUnknowns * bytesPerFluxUnknown
	// The vectors of the Ritz space and of stage B, m + extra of each
	// (negligible at the default count): the approximate eigensolver
	// keeps 3(want + 8) Krylov vectors in three copies and want + 8 Ritz
	// vectors in three more (package enclose/sparse, LowestEigs); P_p has
	// about p²/2 unknowns per triangle; each trial function has a flux.
	want := int64(p.Eigenvalues + r.extra)
	trialUnknowns := trial * int64(r.degree*r.degree) / 2
	vectors := (12*(want+8)*trialUnknowns + want*fluxUnknowns) * 8
	return max(stageA, flux+vectors)
}

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
// before anything is computed. When ctx is cancelled, Certify returns at
// once the certificate of the best step finished so far, with stop reason
// StopInterrupted (its bounds are verified and Check reproduces them), or
// ctx's error if no step has finished; the step in progress is abandoned
// and runs to its end in the background (its memory is freed then). The
// time limit is not a hard one: a step starts only if it is expected to
// end within the limit (a few times the last step), and then finishes.
func Certify(ctx context.Context, p *problem.Problem, opt Options) (*certs.Certificate, error) {
	targetText := p.RelWidth.Text
	if opt.RelWidth != "" {
		targetText = opt.RelWidth
	}
	target, err := ParseTarget(targetText)
	if err != nil {
		return nil, err
	}
	limit := opt.TimeLimit
	switch {
	case limit == 0:
		limit = DefaultTimeLimit
	case limit < 0:
		return nil, &TargetError{Option: "time limit", Value: limit.String(), Msg: "is negative", Hint: "give a positive duration such as 60s"}
	}
	budget := opt.Memory
	if budget == 0 {
		budget = DefaultMemory
	}
	if err := checkMeshable(p); err != nil {
		return nil, err
	}
	opt.ctx = ctx
	start := time.Now()
	r, err := initialRecipe(p)
	if err != nil {
		return nil, err
	}
	if est := memoryEstimate(p, r); est > budget {
		return nil, &BudgetError{What: "the first mesh", Need: est, Budget: budget}
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
		var lineSign *line.SignError
		var triSign *tri.SignError
		if (errors.As(err, &lineSign) || errors.As(err, &triSign)) && raised < maxShiftRaises {
			// The cell enclosures of V + γ were too wide to show V + γ ≥ 0:
			// a larger shift is as sound and may be provable.
			failed := interval.I{}
			if lineSign != nil {
				failed = lineSign.Range
			} else {
				failed = triSign.Range
			}
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
		switch {
		case p.Dim == 1 && gain < stallGain && out.lg != nil && best.worst() < stallWidth:
			stalls++
		case p.Dim == 2 && gain < stallGain && out.lg != nil:
			stalls++
		default:
			stalls = 0
		}
		if p.Dim == 1 && stalls >= 2 || stalls >= polygonStalls {
			reason = StopStalled
			break
		}
		next, why := refine(p, r, out, gain)
		if why != "" {
			// A cap or a stall ends the run. A cap is recorded as such only
			// when the best step is the last one (Check verifies it on the
			// recorded step); after steps that only widened the widths it is
			// a stall.
			reason = why
			if best != last && why != StopStalled {
				reason = StopStalled
			}
			if reason == StopNoSeparation && best.out.n > 0 {
				reason = StopCap
			}
			break
		}
		if memoryEstimate(p, next) > budget {
			best.warnings = append(best.warnings, fmt.Sprintf("the next refinement would need about %.1f GiB, more than the memory budget", float64(memoryEstimate(p, next))/(1<<30)))
			reason = StopMemory
			break
		}
		// The next step costs a few times the last one; stop if it would not fit.
		if time.Since(start)+4*time.Since(t0) > limit {
			reason = StopTime
			break
		}
		if ctx.Err() != nil {
			reason = StopInterrupted
			break
		}
		r = next
	}
	if reason == StopStalled {
		msg := fmt.Sprintf("the widths stalled: the best step is step %d of %d, and the steps after it widened the widths", bestStep, steps)
		if p.Dim == 1 && stalls >= 2 || stalls >= polygonStalls {
			msg = fmt.Sprintf("the widths stalled: steps %d to %d narrowed them by less than 5%% each (best: step %d)", steps-stalls+1, steps, bestStep)
			if p.Dim == 1 {
				msg += "; near relative width 1e-12 the float64 rounding of finer meshes outweighs their gain"
			}
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

// Widths stall on intervals when two steps in a row with stage B gain
// less than stallGain while the best width is below stallWidth (where
// float64 rounding, growing with the mesh, outweighs the discretization
// error: measured on the harmonic oscillator, the best relative width
// 4e-13 at 128 cells grows to 2e-11 at 4096).
//
// On polygons the widths stall when polygonStalls steps in a row with
// stage B gain less than stallGain, whatever the width: each kind of step
// (degree, grading, adaptive rounds, uniform levels) has then been tried.
// Measured on the L-shape at 1e-12: λ1 stays at relative width 3.6e-4
// from step 3 to step 17 (degree 4 to 8, grading 2 to 6, 10 adaptive
// rounds, 108 s).
const (
	stallGain     = 1.05
	stallWidth    = 1e-10
	polygonStalls = 5
)

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

// veryThin is the diameter²/area beyond which a polygon's lower bounds
// cannot be made useful by refinement (its width is below diameter/10⁴).
const veryThin = 1e8

// wideWarnings warns about the enclosures wider than the quantity's own
// size (target-rule relative width above 1) and says what would help.
func wideWarnings(p *problem.Problem, res *result, reason string) []string {
	var names []string
	for k, l := range res.lambda {
		if relWidthUpper(l, res.scale) > 1 {
			names = append(names, fmt.Sprintf("lambda%d", k+1))
		}
	}
	if relWidthUpper(res.gap, res.scale) > 1 {
		names = append(names, "gap")
	}
	if len(names) == 0 {
		return nil
	}
	var help string
	switch reason {
	case StopTime:
		help = "a longer time limit (--time-limit) lets refinement continue"
	case StopMemory:
		help = "a larger memory budget (Options.Memory) lets refinement continue"
	case StopInterrupted:
		help = "let the run finish"
	default:
		help = "the meshes reached their caps before the stage-A lower bounds became useful"
	}
	if p.Dim == 2 {
		d := p.Diameter()
		if thin := d.Sqr().Div(p.Area()).Lo; thin > veryThin {
			help = fmt.Sprintf("the polygon is very thin (diameter²/area ≥ %.2g): the stage-A lower bounds need triangles whose longest edges are below its width, about (diameter/width)² of them, which is beyond what a longer budget can give; a less extreme shape is within reach", thin)
		}
	}
	return []string{fmt.Sprintf("%s: the enclosure is wider than the quantity itself (relative width above 1, stopped: %s); %s", strings.Join(names, ", "), reason, help)}
}

// initialRecipe chooses the first mesh, degrees, Taylor order and shift.
//
// The shift γ is an exact float64 with γ ≥ π²/D² − inf V, so that
// c = V + γ ≥ π²/D² > 0 on the domain (required by stage A, c_T ≥ 0, and by
// stage B, whose weight is 1/c). inf V is a verified lower bound of V over
// the whole domain. γ is negative when inf V > π²/D²: a potential bounded
// below by a large constant is shifted down to c ≥ π²/D², so that the
// shifted eigenvalues Λ_k = λ_k + γ stay of the size of the spectral gaps
// rather than of V (stage A loses accuracy like C_h²Λ_k, and Λ_k ≈ 1e8
// would leave no stage-A bound above the Ritz bounds). Every theorem used
// needs only c = V + γ ≥ 0 (stage A) or > 0 (stage B), never γ ≥ 0, and
// the bounds of λ_k = Λ_k − γ are rounded outward (assemble).
func initialRecipe(p *problem.Problem) (recipe, error) {
	vr := p.PotentialRange()
	if !vr.IsBounded() {
		return recipe{}, fmt.Errorf("the potential is not bounded on the domain: its enclosure is %v (hint: give a potential that is finite on the closed domain)", vr)
	}
	d := p.Diameter()
	scale := interval.Pi().Sqr().Div(d.Sqr()) // π²/D²
	if !(scale.Lo > 0) || !scale.IsBounded() {
		return recipe{}, fmt.Errorf("the domain's size (diameter %v) is outside what float64 can handle (hint: rescale the problem to a diameter near 1)", d)
	}
	taylor := modelOrder
	if poly, ok := p.Potential.Polynomial(); ok {
		taylor = max(poly.Degree(), 1) // exact model
	}
	r := recipe{cells: 8, degree: 8, fluxDegree: 9, taylor: taylor, weightTaylor: modelOrder, stageACells: 256, scale: scale.Lo,
		extra: defaultExtraIndices}
	if p.Dim == 2 {
		r = recipe{degree: 4, fluxDegree: 3, taylor: min(taylor, polygonModelOrder), weightTaylor: polygonWeightOrder,
			scale: scale.Lo, refine: 1, stageARefine: 3, extra: defaultExtraIndices}
	}
	// inf V ≥ both the enclosure over the domain and the least cell
	// enclosure over the first stage-A mesh (the cells tile the domain);
	// the larger one is the tighter bound.
	inf := vr.Lo
	if cells, err := cellLowerBound(p, r); err == nil {
		inf = math.Max(inf, cells)
	}
	g := interval.Point(inf).Neg().Add(scale).Hi
	if math.IsInf(g, 0) || math.IsNaN(g) {
		return recipe{}, fmt.Errorf("the potential's range %v is outside what float64 can handle (hint: rescale the potential or the domain)", vr)
	}
	r.gamma = roundShift(g)
	if p.Dim == 2 {
		// Stage B on polygons has its own shift γ_B ≥ γ. Its weight
		// 1/(V + γ_B) is modelled by Taylor models on triangles, whose
		// remainders shrink like (h·|∇V|/(V + γ_B))^(order+1): keeping
		// V + γ_B ≥ 2 osc V makes them converge on coarse meshes, while
		// stage A keeps the small γ (its projection bound loses accuracy
		// like C_h²(λ + γ)). Measured on a trapezoid with V = x² + y²
		// (osc 2.5) at degree 6: γ = 1.6 gives no stage-B bound below 128
		// triangles, 6.3 relative width 9e-6 at 32 and 9e-10 at 128. Any
		// γ_B ≥ γ is sound (a choice; inf V and sup V here are only
		// enclosure ends).
		r.fluxGamma = r.gamma
		if osc := vr.Hi - inf; osc > 0 && !math.IsInf(osc, 0) {
			if gb := roundShift(interval.SubUp(2*osc, inf)); gb > r.gamma && !math.IsInf(gb, 0) {
				r.fluxGamma = gb
			}
		}
	}
	return r, nil
}

// cellLowerBound returns min over the cells (triangles) of the first
// stage-A mesh of the lower end of the enclosure of V there.
func cellLowerBound(p *problem.Problem, r recipe) (float64, error) {
	lo := math.Inf(1)
	if p.Dim == 1 {
		mesh := intervalMesh(p, r.stageACells)
		pot, err := line.FromExpr(mesh, p.Potential, min(r.taylor, stageATaylor))
		if err != nil {
			return 0, err
		}
		for k := 0; k < mesh.Cells(); k++ {
			lo = math.Min(lo, pot.Range(k).Lo)
		}
		return lo, nil
	}
	m, err := polygonMesh(p, r.stageARefine, r.graded)
	if err != nil {
		return 0, err
	}
	pot, err := tri.NewPotential(m, p.Potential, min(r.taylor, stageATaylor))
	if err != nil {
		return 0, err
	}
	for t := range m.Tris {
		lo = math.Min(lo, pot.Range(t).Lo)
	}
	return lo, nil
}

// roundShift returns a float ≥ g (of either sign) with a 24-bit
// significand (so that the certificate's γ is short, and γ exceeds g by
// less than 2⁻²³|g|); any float ≥ g is sound. Zero stays zero.
func roundShift(g float64) float64 {
	if g == 0 || math.IsInf(g, 0) || math.IsNaN(g) {
		return g
	}
	e := math.Ilogb(g)
	unit := math.Ldexp(1, e-23)
	return math.Ceil(g/unit) * unit
}

// raiseShift returns the next shift after the computation could not verify
// V + γ ≥ 0 (or > 0) on a cell whose enclosure of V + γ was failed. A
// nonnegative γ is doubled plus π²/D² (scale). A negative γ (V bounded
// below by a large constant) is raised by the deficit −failed.Lo of that
// cell plus scale, so that the shift keeps V's large constant removed; if
// the deficit is not finite, or the raised shift would exceed the
// nonnegative rule, the nonnegative rule applies from max(γ, 0). Any
// shift is sound (a choice); the next computation checks its hypotheses
// again.
func raiseShift(gamma, scale float64, failed interval.I) float64 {
	plain := roundShift(2*math.Max(gamma, 0) + scale)
	if gamma >= 0 {
		return plain
	}
	deficit := math.Max(-failed.Lo, 0)
	g := roundShift(interval.AddUp(gamma, interval.AddUp(deficit, scale)))
	if math.IsInf(g, 0) || math.IsNaN(g) || g > plain {
		return plain
	}
	return g
}

// raiseShifts returns r with its shifts raised after a computation could
// not verify V + γ ≥ 0 (stage A) or V + γ_B > 0 (stage B on polygons) on a
// cell whose enclosure was failed (raiseShift). On polygons the error does
// not say which of the two checks failed, so both shifts are raised, and
// γ_B is kept ≥ γ: a raised γ above the old γ_B would otherwise be
// recorded with flux_gamma < gamma, which Check refuses, and a failure of
// stage B's check would recur however often γ alone is raised. Any shifts
// are sound (a choice); the next computation checks its hypotheses again.
func raiseShifts(r recipe, dim int, failed interval.I) recipe {
	r.gamma = raiseShift(r.gamma, r.scale, failed)
	if dim == 2 {
		r.fluxGamma = math.Max(raiseShift(r.fluxGamma, r.scale, failed), r.gamma)
	}
	return r
}

// polygonRitzLag is how many levels the trial mesh may lag behind the
// stage-A mesh (measured on the unit square: P4 on the lagging mesh keeps
// the Ritz slack far below the stage-A slack).
const polygonRitzLag = 3

// maxPolygonRefine bounds the uniform refinement levels of a polygon's
// stage-A mesh (each level has four times the triangles).
const maxPolygonRefine = 9

// modelOrder is the Taylor order of the models of a non-polynomial V and of
// the weight 1/(V + γ). Measured on the Mathieu case (V = 2cos 2x on (0, π),
// 16 cells, degree 8): the Lehmann–Goerisch width falls from 1e-6 at order 6
// to 2.5e-13 at order 14 and rises again beyond it as the interval
// coefficients of high-order models widen; refinement of the mesh shrinks
// the remainder instead.
const modelOrder = 14

// polygonModelOrder is the Taylor order of the models of a non-polynomial
// V on triangles (stage A needs only ranges; the Ritz matrices converge
// at the rate of the P_p space, which the remainder must not spoil).
const polygonModelOrder = 8

// polygonWeightOrder is the Taylor order of the models of 1/(V + γ) on
// triangles. Their remainder enters the Lehmann–Goerisch matrix A2 times
// ‖ũ + div σ‖², so it limits the lower bounds: measured on a trapezoid
// with V = x² + y² and 128 triangles, the stage-B deficit of λ1 is 9e-5 at
// order 8, 6e-6 at 12 and 4e-7 at 16 (the cost grows like the order²).
const polygonWeightOrder = 12

// refine chooses the next recipe, or says why there is none (a Stop
// reason). Intervals: raise the degree up to 10, then halve the cells;
// while stage B cannot start, refine both the stage-A mesh and the trial
// mesh (either may keep the stage-A bound of λ_{N+1} below the Ritz bound
// of λ_N: stage A converges like h², and the Ritz matrices are widened by
// the Taylor remainders of V, which shrink with the cells). Polygons:
// while stage B does not run, stage A (which converges like h²) is
// refined; once it runs, the trial space limits the widths and its degree
// is raised to maxPolygonDegree (unless a step stalled), then its mesh
// refined, with stage A refined too while ρ̂ is within 10% of the Ritz
// bound of Λ_N (Lehmann–Goerisch bounds sharpen as ρ̂ moves away from
// Λ_N); re-entrant corners get more grading levels every step, where the
// eigenfunctions are singular.
func refine(p *problem.Problem, r recipe, out *outcome, gain float64) (recipe, string) {
	if p.Dim == 2 {
		return refinePolygon(p, r, out, gain)
	}
	if out.n == 0 {
		grew := false
		if r.stageACells < maxStageACells && meshable1D(p, 4*r.stageACells) {
			r.stageACells *= 4
			grew = true
		}
		if r.cells < maxCells && meshable1D(p, 2*r.cells) {
			r.cells *= 2
			grew = true
		}
		if !grew {
			return r, StopNoSeparation
		}
		return r, ""
	}
	switch {
	case r.degree < 10:
		r.degree += 2
	case r.cells < maxCells && meshable1D(p, 2*r.cells):
		r.cells *= 2
	default:
		return r, StopCap
	}
	r.fluxDegree = r.degree + 1
	return r, ""
}

// Caps of the 1D meshes: trial cells and stage-A cells.
const (
	maxCells       = 1 << 12
	maxStageACells = 1 << 16
)

// minRelativeCell is the smallest cell length, relative to the largest
// |endpoint|, of a 1D mesh: cells must span many float64 spacings so that
// the node enclosures stay disjoint and narrow (an interval such as
// (1e15, 1e15 + 1) cannot be meshed in float64 near 1e15).
const minRelativeCell = 1e-9

// checkMeshable refuses an interval too short for its distance from 0 to
// be meshed in float64 (its first stage-A mesh would not be meshable1D).
func checkMeshable(p *problem.Problem) error {
	if p.Dim != 1 || meshable1D(p, firstStageACells) {
		return nil
	}
	return fmt.Errorf("certify: the interval (%s, %s) is too short for its distance from 0: float64 cannot mesh it (hint: translate the variable: take the interval (0, L), L its length, and replace x by x + %s in the potential)",
		p.Interval[0].Text, p.Interval[1].Text, p.Interval[0].Text)
}

// firstStageACells is the number of stage-A cells of the first 1D recipe
// (the finest first mesh; see initialRecipe).
const firstStageACells = 256

// meshable1D reports whether the interval can be divided into n uniform
// cells of length at least minRelativeCell times the largest |endpoint|
// (a choice; float midpoints).
func meshable1D(p *problem.Problem, n int) bool {
	a, b := p.Interval[0].Val.Mid(), p.Interval[1].Val.Mid()
	scale := math.Max(math.Abs(a), math.Abs(b))
	return (b-a)/float64(n) >= minRelativeCell*scale
}

// Adaptive refinement of the trial mesh: Dörfler's bulk parameter θ and
// the most rounds a recipe may have; maxGraded caps the grading levels
// the driver chooses (beyond about 12 at degree 8 the float64 solves that
// choose eigenvectors and fluxes break down: measured on the L-shape and a
// mixed-condition trapezoid).
const (
	adaptiveTheta     = 0.5
	maxAdaptiveRounds = 40
	maxGraded         = 12
)

// maxPolygonDegree is the largest degree of the polygon trial space the
// driver chooses (the flux degree is one less).
const maxPolygonDegree = 8

// refinePolygon is refine for polygons. gain is the factor by which the
// last step narrowed the worst width: a degree raise that gained less than
// 10 stalled (a model remainder or a singularity limits the widths, so the
// mesh is refined instead), and grading continues while it gains more
// than 1.5.
func refinePolygon(p *problem.Problem, r recipe, out *outcome, gain float64) (recipe, string) {
	if gain < 0.5 && out.lg != nil && (r.graded > 0 || len(r.marks) > 0) {
		// The widths doubled with stage B running on a graded mesh: on
		// strongly graded meshes at high degree the float64 solves that
		// choose eigenvectors and fluxes degrade, and finer meshes only
		// make it worse. The best step is kept. (Without stage B, stage
		// A's widths do not grow with refinement, and other steps help.)
		return r, StopStalled
	}
	if out.n > 0 && r.extra > defaultExtraIndices {
		// Once N separates, the indices past N + 1 only cost time.
		r.extra = max(defaultExtraIndices, min(r.extra, out.n-p.Eigenvalues+1))
	}
	corners := len(singularCorners(p)) > 0
	// Adaptive marks refer to the triangles of the mesh they were computed
	// on, so once there are marks the uniform and graded levels stay fixed.
	fixed := len(r.marks) > 0
	if out.n == 0 {
		// No N separates: a cluster meets the last requested eigenvalue
		// and the stage-A bounds are too wide to pass it with the indices
		// bounded. If the indices needed at the present stage-A accuracy
		// are within maxExtraIndices, raise their count alone (one
		// verified count per index, sliceStageA, far cheaper than a
		// stage-A level, which has four times the unknowns); otherwise
		// refine stage A and raise the count to what its expected
		// accuracy (a quarter of the deficit, stage A converging like h²)
		// needs.
		if extra := neededExtra(p, out, 1); extra > r.extra && extra <= maxExtraIndices {
			r.extra = extra
			return r, ""
		}
		if extra := neededExtra(p, out, 0.25); extra > r.extra && extra <= maxExtraIndices && r.stageARefine < maxPolygonRefine {
			r.extra = extra
		}
	}
	if out.n == 0 || out.lg == nil {
		if r.stageARefine >= maxPolygonRefine {
			if out.n == 0 {
				return r, StopNoSeparation
			}
			return r, StopCap
		}
		r.stageARefine++
		// With raised extra indices the trial mesh waits for the
		// separation: the Ritz space's cost grows with the count, and its
		// slack is far below the stage-A deficit (measured on the 1:200
		// rectangle: 62 eigenpairs took 111 s with 6400 triangles).
		if r.stageARefine-r.refine > polygonRitzLag && !fixed && r.extra == defaultExtraIndices {
			r.refine++
		}
		if corners && !fixed && r.graded < maxGraded {
			r.graded++
		}
		return r, ""
	}
	switch {
	case corners && !fixed && r.graded < maxGraded && gain > 1.5:
		r.graded += 2
		if r.degree < maxPolygonDegree && r.graded%4 == 0 {
			r.degree++
		}
	case corners && r.degree < maxPolygonDegree:
		// Deeper grading stalled: the flux least-squares system on tiny
		// elements is too ill-conditioned for float64 to choose good
		// fluxes (measured on the L-shape: 14 levels at degree 8 lose
		// three digits against 12). Raise the degree instead.
		r.degree++
	case r.degree < maxPolygonDegree && gain >= 10:
		r.degree += 2
	case corners && out.polygon.indicators != nil && len(r.marks) < maxAdaptiveRounds:
		// Near singular corners, once grading and the degree are spent,
		// refine where the flux misses the gradient (Dörfler marking;
		// recorded in the recipe, so check replays it). Smooth problems
		// refine uniformly instead, which gains 2^(2p) per level (measured
		// on the Robin trapezoid: adaptive rounds took 74 s for a gap
		// width of 1.6e-9 where uniform levels take 16 s for 1.9e-9; on a
		// trapezoid with a Dirichlet–Neumann corner of 117° they reach
		// 1.1e-8 in 30 s where grading alone stopped at 1.6e-7).
		r.marks = append(append([][]int(nil), r.marks...), dorflerMarks(out.polygon.indicators, adaptiveTheta))
	case r.refine < maxPolygonRefine && !fixed:
		r.refine++
	default:
		return r, StopCap
	}
	r.fluxDegree = r.degree - 1
	// With raised extra indices N lies past a cluster whose spacing keeps
	// ρ̂ within 10% of Λ_N at every stage-A level, so the rule is kept to
	// the default count.
	if r.extra == defaultExtraIndices && out.rho-out.ritz[out.n-1] < 0.1*out.ritz[out.n-1] && r.stageARefine < maxPolygonRefine {
		r.stageARefine++
	}
	return r, ""
}

// neededExtra predicts the extra indices with which an N would separate
// when the stage-A deficits shrink by the factor shrink, or 0 when none
// up to maxExtraIndices would (a choice, from floating-point estimates).
// The relative deficit δ = (Ritz − stage A)/Ritz is the largest over the
// indices with approximate stage-A eigenvalues (the first
// m + defaultExtraIndices + 1); the Ritz bounds are extended past the
// last one by its first and (nonnegative) second differences, which
// continue a spectrum growing like k² (a thin rectangle's, whose cluster
// π²(1/w² + k²/L²) is the case of need) or like k (Weyl's law). The
// least n ≥ m whose estimated spacing Λ_(n+1) − Λ_n exceeds 2δΛ_(n+1)
// (twice: the slicing shifts lose up to half a spacing, and δ grows with
// the index) is taken, with a quarter more indices as a margin.
func neededExtra(p *problem.Problem, out *outcome, shrink float64) int {
	m, L := p.Eigenvalues, len(out.ritz)
	if L < 3 {
		return 0
	}
	delta := 0.0
	for i := 0; i < min(L, len(out.stageA), m+defaultExtraIndices+1); i++ {
		delta = math.Max(delta, (out.ritz[i]-out.stageA[i])/out.ritz[i])
	}
	delta *= shrink
	d1 := out.ritz[L-1] - out.ritz[L-2]
	d2 := math.Max(0, d1-(out.ritz[L-2]-out.ritz[L-3]))
	lambda := func(k int) float64 { // estimate of Λ_k, k ≥ 1
		if k <= L {
			return out.ritz[k-1]
		}
		j := float64(k - L)
		return out.ritz[L-1] + j*d1 + d2*j*(j+1)/2
	}
	for n := m; n-m <= maxExtraIndices; n++ {
		if lambda(n+1)-lambda(n) > 2*delta*lambda(n+1) {
			if extra := max(defaultExtraIndices, (5*(n-m)+3)/4+1); extra <= maxExtraIndices {
				return extra
			}
			return 0
		}
	}
	return 0
}

// result is one computation turned into certified enclosures of λ_k.
type result struct {
	r          recipe
	scale      float64     // π²/D² rounded down, the floor of the target rule
	refinement *Refinement // set by Certify on the certified step
	out        *outcome
	lambda     []interval.I // λ_1..λ_m
	gap        interval.I
	widths     []float64
	gapWidth   float64
	warnings   []string
}

func (res *result) worst() float64 {
	w := res.gapWidth
	for _, x := range res.widths {
		w = math.Max(w, x)
	}
	return w
}

// assemble combines the stages: λ_k ∈ [max(stage A, stage B) − γ, Ritz − γ].
// A lower end above an upper end would contradict the theorems; it is
// reported as an error and never certified.
func assemble(p *problem.Problem, r recipe, out *outcome) (*result, error) {
	m := p.Eigenvalues
	scale := interval.Pi().Sqr().Div(p.Diameter().Sqr()).Lo
	res := &result{r: r, out: out, scale: scale, warnings: append([]string(nil), out.notes...)}
	for k := 0; k < m; k++ {
		lo := out.stageA[k]
		if k < len(out.lg) {
			lo = math.Max(lo, out.lg[k])
		}
		l := interval.I{Lo: interval.SubDown(lo, r.gamma), Hi: interval.SubUp(out.ritz[k], r.gamma)}
		if l.Lo > l.Hi {
			return nil, fmt.Errorf("internal inconsistency (please report it): lower bound %g above upper bound %g for lambda%d", l.Lo, l.Hi, k+1)
		}
		res.lambda = append(res.lambda, l)
		res.widths = append(res.widths, relWidth(l, scale))
	}
	res.gap = interval.I{
		Lo: interval.SubDown(res.lambda[1].Lo, res.lambda[0].Hi),
		Hi: interval.SubUp(res.lambda[1].Hi, res.lambda[0].Lo),
	}
	res.gapWidth = relWidth(res.gap, scale)
	return res, nil
}

// relWidth is the width of x relative to max(|mid x|, scale), with
// scale = π²/D² the natural size of the eigenvalues; it stays finite for
// enclosures of 0 (Neumann λ₁) and of tiny gaps.
func relWidth(x interval.I, scale float64) float64 {
	return x.Wid() / math.Max(math.Abs(x.Mid()), scale)
}

// certificate writes the result as a certificate.
func (res *result) certificate(p *problem.Problem, opt Options) (*certs.Certificate, error) {
	d := p.Diameter()
	pi2 := interval.Pi().Sqr()
	c := &certs.Certificate{
		Format:        certs.Format,
		Problem:       json.RawMessage(p.Canonical()),
		ProblemSHA256: p.SHA256(),
		Warnings:      res.warnings,
	}
	for k, l := range res.lambda {
		b := certs.NewBound(l, Digits)
		c.Results.Eigenvalues = append(c.Results.Eigenvalues, certs.Eigen{Index: k + 1, Lower: b.Lower, Upper: b.Upper})
	}
	c.Results.Gap = certs.NewBound(res.gap, Digits)
	c.Results.Diameter = certs.NewBound(d, Digits)
	c.Results.GapD2OverPi2 = certs.NewBound(res.gap.Mul(d.Sqr()).Div(pi2), Digits)
	c.Results.RelativeWidths = map[string]string{"gap": fmt.Sprintf("%.3g", res.gapWidth)}
	for k, w := range res.widths {
		c.Results.RelativeWidths[fmt.Sprintf("lambda%d", k+1)] = fmt.Sprintf("%.3g", w)
	}
	claims, err := evaluateClaims(p, res, opt)
	if err != nil {
		return nil, err
	}
	c.Claims = claims
	method, err := json.Marshal(res.method())
	if err != nil {
		return nil, err
	}
	c.Method = method
	now := time.Now
	if opt.Now != nil {
		now = opt.Now
	}
	c.Provenance = certs.Provenance{
		Tool:      opt.Tool,
		GoVersion: runtime.Version(),
		OS:        runtime.GOOS,
		Arch:      runtime.GOARCH,
		Time:      now().UTC().Format(time.RFC3339),
	}
	return c, nil
}

// method records the recipe and each stage's bounds.
func (res *result) method() Method {
	r, out := res.r, res.out
	m := Method{
		Kind:               KindInterval,
		Degree:             r.degree,
		TaylorOrder:        r.taylor,
		Gamma:              decimalio.FormatExact(r.gamma),
		ExtraIndices:       r.extra,
		N:                  out.n,
		ProjectionConstant: decimalio.FormatUpper(out.ch.Hi, Digits),
		Theorems:           theorems1D,
		Widths:             res.widthRecords(),
		Refinement:         res.refinement,
	}
	if out.polygon != nil {
		m.Kind, m.Theorems = KindPolygon, theoremsPolygon
		m.Refinements, m.StageARefinements, m.GradedLevels = r.refine, r.stageARefine, r.graded
		m.StageASpace = out.polygon.stageASpace
		m.Triangles, m.StageATriangles = out.polygon.triangles, out.polygon.stageATriangles
		m.FluxDegree, m.WeightOrder, m.FluxUnknowns = r.fluxDegree, r.weightTaylor, out.polygon.fluxUnknowns
		m.FluxGamma = decimalio.FormatExact(r.fluxGamma)
		m.AdaptiveMarks = r.marks
	} else {
		m.Cells, m.FluxDegree, m.WeightOrder, m.StageACells = r.cells, r.fluxDegree, r.weightTaylor, r.stageACells
	}
	if out.n > 0 {
		m.Rho = decimalio.FormatExact(out.lgRho)
	}
	for k, u := range out.ritz {
		m.Stages.RitzUpper = append(m.Stages.RitzUpper, StageBound{k + 1, decimalio.FormatUpper(u, Digits)})
	}
	for k, l := range out.stageA {
		m.Stages.ProjectionLower = append(m.Stages.ProjectionLower, StageBound{k + 1, decimalio.FormatLower(l, Digits)})
	}
	for k, l := range out.lg {
		if !math.IsInf(l, -1) {
			m.Stages.LehmannGoerisch = append(m.Stages.LehmannGoerisch, StageBound{k + 1, decimalio.FormatLower(l, Digits)})
		}
	}
	return m
}

// Plan describes the first computation Certify would run on a problem:
// the sizes of its meshes and spaces and an estimate of its peak memory
// (larger meshes follow if the target width is not met).
type Plan struct {
	Kind             string
	Degree           int
	Cells            int // intervals: P_p cells
	StageACells      int
	Triangles        int // polygons: trial-mesh triangles
	StageATriangles  int
	StageASpace      string
	MemoryEstimate   int64 // bytes, polygons only
	ReentrantCorners []int
	SingularCorners  []int // vertices the trial mesh is graded (and adaptively refined) toward
}

// FirstPlan returns the plan of the first computation of Certify.
func FirstPlan(p *problem.Problem) (Plan, error) {
	if err := checkMeshable(p); err != nil {
		return Plan{}, err
	}
	r, err := initialRecipe(p)
	if err != nil {
		return Plan{}, err
	}
	if p.Dim == 1 {
		return Plan{Kind: KindInterval, Degree: r.degree, Cells: r.cells, StageACells: r.stageACells}, nil
	}
	m, err := polygonMesh(p, r.refine, r.graded)
	if err != nil {
		return Plan{}, err
	}
	ma, err := polygonMesh(p, r.stageARefine, r.graded)
	if err != nil {
		return Plan{}, err
	}
	space := "enriched-crouzeix-raviart"
	if usesCR(p) {
		space = "crouzeix-raviart"
	}
	return Plan{Kind: KindPolygon, Degree: r.degree, Triangles: len(m.Tris), StageATriangles: len(ma.Tris),
		StageASpace: space, MemoryEstimate: memoryEstimate(p, r), ReentrantCorners: reentrantCorners(p),
		SingularCorners: singularCorners(p)}, nil
}
