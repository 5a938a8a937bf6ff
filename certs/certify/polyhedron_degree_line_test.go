package certify

import (
	"testing"
	"time"
)

// regularTetrahedronSource is the regular tetrahedron with vertices
// (1,1,1), (1,−1,−1), (−1,1,−1), (−1,−1,1), Dirichlet on every face.
const regularTetrahedronSource = `{"domain": {"polyhedron": {"vertices": [["1","1","1"],["1","-1","-1"],["-1","1","-1"],["-1","-1","1"]],
	"faces": [[0,1,2],[0,3,1],[0,2,3],[1,3,2]]}}, "boundary": "dirichlet", "eigenvalues": 2}`

// TestPolyhedronNextRaisesDegreeBeforeTrialMesh: past the smooth degree the
// driver raises p one at a time up to maxPolyhedronDegree and refines the
// trial mesh only then, unless ρ̂ limits. The outcomes are those measured
// (shifted Ritz bounds of Λ_1..Λ_5, ρ̂ = stage-A bound of Λ_5, N = 4): the
// regular tetrahedron at P_8 (8 tetrahedra, stage A on 4096; amplification
// 12 but a stage-A level expected to widen ρ̂ − Λ_2 only 4.7 times) takes
// the degree line; the Dirichlet cube at P_7 (96 tetrahedra, stage A on
// 6144; ρ̂ 64.71 against Λ_2 62.51, Λ_5 ≤ 92.12: 10.3 times) refines stage
// A.
func TestPolyhedronNextRaisesDegreeBeforeTrialMesh(t *testing.T) {
	d := polyhedron{parseProblem(t, regularTetrahedronSource)}
	tetra := &outcome{ritz: []float64{20.1053, 36.0711, 36.0711, 36.0744, 53.4242}, rho: 38.9664, n: 4}
	r := recipe{degree: 7, fluxDegree: 7, refine: 1, stageARefine: 4, extra: defaultExtraIndices}
	var degrees []int
	for range maxPolyhedronDegree - 6 {
		next, why := d.next(r, tetra, 3)
		if why != "" {
			t.Fatalf("at %+v: stop %q", r, why)
		}
		if next.stageARefine != r.stageARefine {
			t.Errorf("P_%d → P_%d refined stage A where ρ̂ is expected to widen 4.7 times", r.degree, next.degree)
		}
		if next.fluxDegree != next.degree {
			t.Errorf("flux degree %d with trial degree %d", next.fluxDegree, next.degree)
		}
		degrees = append(degrees, next.degree)
		r = next
	}
	var want []int
	for k := polyhedronSmoothDegree; k <= maxPolyhedronDegree; k++ {
		want = append(want, k)
	}
	want = append(want, maxPolyhedronDegree) // the trial mesh refined
	for i := range want {
		if degrees[i] != want[i] {
			t.Fatalf("degrees %v, want %v", degrees, want)
		}
	}
	if r.refine != 2 {
		t.Errorf("after the degree cap: refinements %d, want 2", r.refine)
	}

	cube := polyhedron{parseProblem(t, cubePolyhedron("dirichlet", "0"))}
	co := &outcome{ritz: []float64{32.8987, 62.5075, 62.5075, 62.5075, 92.1163}, rho: 64.7104, n: 4}
	for _, deg := range []int{7, 9} {
		r := recipe{degree: deg, fluxDegree: deg, refine: 1, stageARefine: 3, extra: defaultExtraIndices}
		next, why := cube.next(r, co, 3)
		if why != "" || next.stageARefine != 4 {
			t.Errorf("cube at P_%d with ρ̂ limiting: next %+v (%q), want stage A refined", deg, next, why)
		}
	}
}

// TestPolyhedronFallbackTakesStageALevel: when the step after the degree
// cap (a trial-mesh level) does not fit in the time left, fallback offers
// a stage-A level instead, for the regular tetrahedron at P_12 as measured
// (shifted Ritz bounds of Λ_1..Λ_5, ρ̂ = stage-A bound of Λ_5 on 4096
// tetrahedra, N = 4: amplification 12, a level expected to widen
// ρ̂ − Λ_2 4.7 times); and it offers nothing for a degree step, for a
// stage A at its tetrahedron cap, or when ρ̂ does not amplify (ρ̂ far
// above Λ_2) or a level is expected to gain less than twofold.
func TestPolyhedronFallbackTakesStageALevel(t *testing.T) {
	d := polyhedron{parseProblem(t, regularTetrahedronSource)}
	tetra := &outcome{ritz: []float64{20.1053, 36.0709, 36.0709, 36.0709, 53.4152}, rho: 38.9664, n: 4}
	r := recipe{degree: 12, fluxDegree: 12, refine: 1, stageARefine: 4, extra: defaultExtraIndices}
	next, why := d.next(r, tetra, 3)
	if why != "" || next.refine != 2 || next.stageARefine != 4 {
		t.Fatalf("at the degree cap: next %+v (%q), want the trial mesh refined", next, why)
	}
	alt, ok := d.fallback(r, next, tetra)
	if !ok {
		t.Fatal("no fallback for a trial-mesh level at the degree cap")
	}
	if alt.refine != 1 || alt.stageARefine != 5 || alt.degree != 12 || alt.fluxDegree != 12 {
		t.Errorf("fallback %+v, want stage A refined once, the rest as before", alt)
	}
	if alt.extra < tetra.n+maxRaiseN3D-d.p.Eigenvalues {
		t.Errorf("fallback keeps %d extra indices, want at least %d (past the next cluster)", alt.extra, tetra.n+maxRaiseN3D-d.p.Eigenvalues)
	}

	degreeStep := r
	degreeStep.degree, degreeStep.fluxDegree = 11, 11
	up := degreeStep
	up.degree, up.fluxDegree = 12, 12
	if _, ok := d.fallback(degreeStep, up, tetra); ok {
		t.Error("a fallback for a degree step")
	}
	capped := r
	capped.stageARefine = 5 // the next level would have 8^6 tetrahedra, over maxRhoStageATetrahedra
	if _, ok := d.fallback(capped, next, tetra); ok {
		t.Error("a fallback past the stage-A tetrahedron cap")
	}
	far := &outcome{ritz: tetra.ritz, rho: 50, n: 4} // Λ_2/(ρ̂ − Λ_2) = 2.6 ≤ 4
	if _, ok := d.fallback(r, next, far); ok {
		t.Error("a fallback where ρ̂ does not amplify")
	}
	near := &outcome{ritz: []float64{20.1053, 36.0709, 36.0709, 36.0709, 37.5}, rho: 37.0, n: 4} // gain 1.4
	if g := polyhedronRhoGain(near, 2); !(g > 1 && g < polyhedronMinFallbackGain) {
		t.Fatalf("expected gain %g, want between 1 and %d", g, polyhedronMinFallbackGain)
	}
	if _, ok := d.fallback(r, next, near); ok {
		t.Error("a fallback for a level expected to gain less than twofold")
	}
}

// TestPolyhedronStepTimeOfDegreeSteps: a degree step's rest (the step's
// time less its stage A) grows like the cube of dim RT_k with a margin of
// a quarter, and stage A is predicted unchanged: P_8 → P_9 (540 and 715
// Raviart–Thomas functions) predicts 2.90 times the rest, P_11 → P_12
// (1170 and 1456) 2.41 times; a stage-A level still costs 64 times.
func TestPolyhedronStepTimeOfDegreeSteps(t *testing.T) {
	d := polyhedron{parseProblem(t, regularTetrahedronSource)}
	out := &outcome{stageATime: 10 * time.Second}
	for _, c := range []struct {
		from, to int
		factor   float64
	}{{8, 9, 2.90}, {11, 12, 2.41}} {
		r := recipe{degree: c.from, fluxDegree: c.from, refine: 1, stageARefine: 4}
		next := r
		next.degree, next.fluxDegree = c.to, c.to
		got := d.stepTime(r, next, out, 30*time.Second)
		want := 10*time.Second + time.Duration(c.factor*float64(20*time.Second))
		if diff := (got - want).Seconds(); diff > 0.1 || diff < -0.1 {
			t.Errorf("P_%d → P_%d: predicted %v, want about %v", c.from, c.to, got, want)
		}
		next.stageARefine++
		if got := d.stepTime(r, next, out, 30*time.Second); got < 640*time.Second {
			t.Errorf("P_%d → P_%d with a stage-A level: predicted %v, want at least 64 times stage A", c.from, c.to, got)
		}
	}
}

// TestPolyhedronMemoryCoversHighDegreeTables: the memory estimate of a
// step at P_k covers the peak resident memory measured for it: whole
// steps of the regular tetrahedron (8 tetrahedra, stage A on 4096) at P_8,
// P_10, P_11 and P_12 took 176, 529, 924 MB and 1.23 GB; and it does not
// fall with the degree.
func TestPolyhedronMemoryCoversHighDegreeTables(t *testing.T) {
	p := parseProblem(t, regularTetrahedronSource)
	prev := int64(0)
	for k := 3; k <= maxPolyhedronDegree; k++ {
		r := recipe{degree: k, fluxDegree: k, refine: 1, stageARefine: 4, extra: defaultExtraIndices}
		est := memoryEstimate(p, r)
		if est < prev {
			t.Errorf("P_%d: estimate %d bytes, below P_%d's %d", k, est, k-1, prev)
		}
		prev = est
		measured := map[int]int64{8: 176e6, 10: 529e6, 11: 924e6, 12: 1228e6}[k]
		if est < measured {
			t.Errorf("P_%d: estimate %.2f GB below the measured %.2f GB", k, float64(est)/1e9, float64(measured)/1e9)
		}
	}
}
