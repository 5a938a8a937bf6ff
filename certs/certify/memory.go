package certify

import (
	"math"

	"gapcert/fem/problem"
	"gapcert/fem/tet"
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

// memory estimates the peak memory of a polyhedron recipe from the sizes
// of its spaces, before anything is built: the larger of the stage-A and
// the trial-and-flux estimates. A sparse LDLᵀ factor under nested
// dissection of a 3D mesh has about fillPerUnknown43·N^(4/3) entries
// (measured, see the constants), 8 bytes each, kept once with the
// matrices and vectors around it (bytesPerUnknown3D per unknown).
func (d polyhedron) memory(r recipe) int64 {
	tets := float64(polyhedronTetrahedra(d.p, r.stageARefine))
	// Faces ≈ 2 per tetrahedron, plus one mean per tetrahedron (ECR).
	nA := 3 * tets
	stageA := nA*bytesPerUnknown3D + 8*fillPerUnknown43*math.Pow(nA, 4.0/3)
	tt := float64(polyhedronTrialTetrahedra(d.p, r))
	p := float64(r.degree)
	// P_p has about p³/6 unknowns per tetrahedron; each couples with the
	// (p + 1)(p + 2)(p + 3)/6 of a tetrahedron and its neighbours.
	nT := tt * p * p * p / 6
	trial := nT*bytesPerUnknown3D*p + 8*fillPerUnknown43*p*math.Pow(nT, 4.0/3)
	k := float64(max(r.fluxDegree, 0))
	fluxUnknowns := tt * (k + 1) * (k + 2) * (k + 3) / 2
	// The flux choice keeps element blocks that grow with k: measured
	// bytes per flux unknown grow about like k/2 times the polygons' rate.
	flux := fluxUnknowns * bytesPerFluxUnknown * math.Max(1, k/2)
	want := float64(d.p.Eigenvalues + r.extra)
	vectors := (12*(want+8)*nT + want*fluxUnknowns) * 8
	return int64(math.Min(math.Max(stageA, trial+flux+vectors+rtTableBytes(r.fluxDegree)), math.MaxInt64/2))
}

// rtTableBytes estimates the peak memory of the reference tables of RT_k
// (package fem/tet): the exact rational Bernstein coefficients of the n =
// dim RT_k basis functions (3n(k+2)(k+3)(k+4)/6 entries, most sharing
// one zero, 64 bytes each) and the nine float mass blocks of the flux
// choice (9n² entries), times 3 for the exact triple tables of the trial
// and flux spaces built at the same degree. Measured peak RSS of building
// the RT_k tables and mass blocks alone: 45 MB at k = 8, 118 MB at k = 10,
// 269 MB at k = 12; of whole steps of the regular tetrahedron (8
// tetrahedra, stage A on 4096) at P_8, P_10, P_11, P_12: 176, 529, 924 MB
// and 1.23 GB (estimates of the whole step 0.28, 0.70, 1.07 and 1.57 GB).
func rtTableBytes(k int) float64 {
	if k <= 0 {
		return 0
	}
	n := float64(tet.RTDim(k))
	nn := float64((k + 2) * (k + 3) * (k + 4) / 6)
	return 3 * (9*n*n*8 + 3*n*nn*64)
}

// Memory of polyhedron computations (polyhedron.memory). Measured peak
// RSS on the unit cube (96 trial tetrahedra, stage A on 6144 with 11,904
// unknowns): 150 MB at p = k = 3, 179 MB at 5, 286 MB at 6, 1.09 GB at 8
// (44,280 flux unknowns); the estimate gives 178, 320, 602 MB and 1.7 GB
// (it must not be below: the budget is checked before allocating).
const (
	bytesPerUnknown3D = 8000
	fillPerUnknown43  = 10
)
