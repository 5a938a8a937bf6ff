package certify

import (
	"math"

	"gapcert/fem/problem"
)

// polygonRitzLag is how many levels the trial mesh may lag behind the
// stage-A mesh (measured on the unit square: P4 on the lagging mesh keeps
// the Ritz slack far below the stage-A slack).
const polygonRitzLag = 3

// maxPolygonRefine bounds the uniform refinement levels of a polygon's
// stage-A mesh (each level has four times the triangles).
const maxPolygonRefine = 9

// Adaptive refinement of the trial mesh: Dörfler's bulk parameter θ and
// the most rounds a recipe may have; maxGraded caps the grading levels
// toward the strongest corner (singularCorners). Measured on the L-shape
// (Ritz relative error of λ1, one uniform level): degree 8 gains down to
// 1.2e-10 by 20 levels and stalls there, degree 10 reaches 1.1e-12 at 24;
// deeper grading is limited by the outer elements, which uniform levels
// and degree raises serve.
const (
	adaptiveTheta     = 0.5
	maxAdaptiveRounds = 40
	maxGraded         = 24
)

// maxPolygonDegree is the largest degree of the polygon trial space the
// driver chooses near singular corners (the flux degree is one less);
// maxSmoothDegree the largest on polygons without singular corners, whose
// widths reach 1e-13 by degree 8 (measured on the unit square and the
// equilateral triangle).
const (
	maxPolygonDegree = 10
	maxSmoothDegree  = 8
)

// gradedDegree is the degree up to which singular exponents count when
// the trial mesh is graded (trialCorners): a corner is graded when one of
// its exponents below gradedDegree is not an integer. It is fixed, not the
// recipe's degree, so that raising the degree keeps the trial mesh (and
// the triangles that adaptive marks refer to); it is part of what a
// recorded graded_levels means, and changing it changes the meshes of
// recorded recipes.
const gradedDegree = maxPolygonDegree

// next chooses the next polygon recipe, or says why there is none (a Stop
// reason). While stage B does not run, stage A (which converges like h²)
// is refined. Once it runs, polygons without singular corners raise the
// degree by 2 up to maxSmoothDegree while a raise gains 10 or more, then
// refine uniformly; polygons with singular corners choose among the kinds
// of step by measured gain per second (chooseStep). Any step is followed
// by a stage-A level while ρ̂ is within 10% of the Ritz bound of Λ_N
// (Lehmann–Goerisch bounds sharpen as ρ̂ moves away from Λ_N). gain is
// the factor by which the last step narrowed the worst width.
func (d polygon) next(r recipe, out *outcome, gain float64) (recipe, string) {
	p := d.p
	corners := hasSingularCorners(p)
	h := d.hist
	if !corners && gain < 0.5 && out.lg != nil && len(r.marks) > 0 {
		// The widths doubled with stage B running on a refined mesh: the
		// float64 solves that choose eigenvectors and fluxes degrade, and
		// finer meshes only make it worse. The best step is kept.
		return r, StopStalled
	}
	if out.n > 0 && r.extra > defaultExtraIndices {
		// Once N separates, the indices past N + 1 only cost time.
		r.extra = max(defaultExtraIndices, min(r.extra, out.n-p.Eigenvalues+1))
	}
	// Adaptive marks refer to the triangles of the mesh they were computed
	// on, so once there are marks the uniform and graded levels stay fixed.
	fixed := len(r.marks) > 0
	if out.n > 0 && out.lg == nil && h.hasBest() {
		// N separates but stage B gave no bound (the flux choice failed
		// on this mesh): the step is dropped and another kind of step is
		// taken from the best one (chooseStep).
		return h.chooseStep(d, r, out)
	}
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
			// A paced run has no other time check (Certify).
			if !h.expect(d, kindStageA, r, r) {
				return r, StopTime
			}
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
		if !h.expect(d, kindStageA, r, r) {
			return r, StopTime
		}
		return r, ""
	}
	if corners {
		if next, ok := d.mildStep(r, out); ok {
			return next, ""
		}
		return h.chooseStep(d, r, out)
	}
	switch {
	case r.degree < maxSmoothDegree && gain >= 10:
		r.degree += 2
	case r.refine < maxPolygonRefine && !fixed:
		r.refine++
	default:
		return r, StopCap
	}
	return withStageARider(r, out.rho, out.ritz[out.n-1]), ""
}

// withStageARider returns r with the flux degree one below the trial
// degree and, while ρ̂ (rho) is within 10% of the Ritz bound ritzN of
// Λ_N, one more stage-A level. With raised extra indices N lies past a
// cluster whose spacing keeps ρ̂ within 10% of Λ_N at every stage-A
// level, so the rule is kept to the default count.
func withStageARider(r recipe, rho, ritzN float64) recipe {
	r.fluxDegree = r.degree - 1
	if r.extra == defaultExtraIndices && rho-ritzN < 0.1*ritzN && r.stageARefine < maxPolygonRefine {
		r.stageARefine++
	}
	return r
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

// stalls: on polygons without singular corners the widths stall when
// polygonStalls steps in a row with stage B gain less than stallGain,
// whatever the width. With singular corners chooseStep decides the stall
// itself (every kind of step spent from the best step), so no count of
// steps applies.
func (d polygon) stalls(gain float64, out *outcome, _ *result) bool {
	return gain < stallGain && out.lg != nil && !hasSingularCorners(d.p)
}

func (polygon) stallSteps() int { return polygonStalls }

// stallNote is what the stall warning adds: with singular corners, the
// last gain of each kind of step (stepHistory.note).
func (d polygon) stallNote() string { return d.hist.note() }

const polygonStalls = 5
