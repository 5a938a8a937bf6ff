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

// next chooses the next polygon recipe, or says why there is none (a Stop
// reason). While stage B does not run, stage A (which converges like h²)
// is refined; once it runs, the trial space limits the widths and its
// degree is raised to maxPolygonDegree (unless a step stalled), then its
// mesh refined, with stage A refined too while ρ̂ is within 10% of the
// Ritz bound of Λ_N (Lehmann–Goerisch bounds sharpen as ρ̂ moves away
// from Λ_N); re-entrant corners get more grading levels every step, where
// the eigenfunctions are singular. gain is the factor by which the
// last step narrowed the worst width: a degree raise that gained less than
// 10 stalled (a model remainder or a singularity limits the widths, so the
// mesh is refined instead), and grading continues while it gains more
// than 1.5.
func (d polygon) next(r recipe, out *outcome, gain float64) (recipe, string) {
	p := d.p
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

// stalls: on polygons the widths stall when polygonStalls steps in a
// row with stage B gain less than stallGain, whatever the width: each
// kind of step (degree, grading, adaptive rounds, uniform levels) has
// then been tried. Measured on the L-shape at 1e-12: λ1 stays at
// relative width 3.6e-4 from step 3 to step 17 (degree 4 to 8, grading 2
// to 6, 10 adaptive rounds, 108 s).
func (polygon) stalls(gain float64, out *outcome, _ *result) bool {
	return gain < stallGain && out.lg != nil
}

func (polygon) stallSteps() int { return polygonStalls }

func (polygon) stallNote() string { return "" }

const polygonStalls = 5
