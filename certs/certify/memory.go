package certify

import (
	"gapcert/fem/problem"
)

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
// allocated (discretisation.memory).
func memoryEstimate(p *problem.Problem, r recipe) int64 {
	return discretisationOf(p).memory(r)
}

// memory estimates the peak memory of a polygon recipe: the larger of the
// stage-A and the stage-B estimates.
func (d polygon) memory(r recipe) int64 {
	p := d.p
	triangles := func(levels int, corners []corner) int64 { return estimatedTriangles(p, levels, corners) }
	// Edges ≈ 1.5 per triangle plus one mean per triangle (ECR).
	stageA := triangles(r.stageARefine, stageACorners(p, r)) * 5 / 2 * bytesPerUnknown
	k := int64(max(r.fluxDegree, 0))
	trial := triangles(r.refine, trialCorners(p, r))
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

// estimatedTriangles estimates the triangles of polygonMesh(p, levels,
// corners) without building it: each uniform level has four times the
// triangles, and each grading level adds a few dozen per corner.
func estimatedTriangles(p *problem.Problem, levels int, corners []corner) int64 {
	t := int64(len(startMesh(p).tris))
	for i := 0; i < levels; i++ {
		t *= 4
	}
	for _, c := range corners {
		t += int64(c.levels) * 40
	}
	return t
}
