package certify

import (
	"errors"
	"fmt"
	"math"
	"time"

	"gapcert/certs/certify/proof"
	"gapcert/fem/boundary"
	"gapcert/fem/discrete"
	"gapcert/fem/mesh3"
	"gapcert/fem/problem"
	"gapcert/fem/tet"
	"gapcert/interval"
)

// This file is the choosing side of polyhedra: the meshes and spaces of a
// recipe (package fem/tet through fem/discrete) and the choice of the next
// recipe. Nothing here is a bound.

// polyhedron is the discretisation of a problem on a polyhedron:
// conforming P_p on the cone tetrahedra of the polyhedron (fem/problem's
// Tetrahedra: apex joined to the faces' triangles) refined uniformly (Bey's
// red refinement, package fem/mesh3) for Rayleigh–Ritz, (enriched)
// Crouzeix–Raviart elements on a finer uniform refinement for stage A,
// Raviart–Thomas fluxes RT_k on the trial mesh for stage B with its own
// shift γ_B ≥ γ (as on polygons).
type polyhedron struct{ p *problem.Problem }

// polyhedronRecord is what a polyhedron computation records besides its
// bounds.
type polyhedronRecord struct {
	stageASpace                  string
	tetrahedra, stageATetrahedra int
	trialUnknowns                int
	stageAUnknowns               int
	fluxUnknowns                 int
}

// Recipe ranges on polyhedra: the trial degree p (the flux degree is k =
// p), and uniform levels of the trial and stage-A meshes (each level has
// eight times the tetrahedra; the memory estimate stops a run long before
// the caps). The degree cap bounds the cost of a step, whose element
// blocks are dense (RT_12 has 1456 basis functions per tetrahedron, P_12
// 455): a P_12 step on the regular tetrahedron's 8 tetrahedra took 21 s
// and 1.23 GB, and check replays it.
const (
	maxPolyhedronDegree = 12
	maxPolyhedronRefine = 7
)

// polyhedronSmoothDegree is the degree up to which the driver raises p
// two at a time (and with it decides on stage A's level, rhoLimits). Measured on the unit cube (12 cone
// tetrahedra refined once, 96 tetrahedra; stage A on three levels), the
// Lehmann–Goerisch error of λ1 falls from 7.6e-4 at p = 3 to 3.2e-7 at 5,
// 3.2e-9 at 6 and 1.1e-12 at 8 (λ2, three times: 3.4e-2, 6.9e-5, 3.4e-6,
// 1.3e-9) at 14, 15, 20 and 56 s of CPU time, while a level costs eight
// times the unknowns. Past it the degree rises one at a time up to
// maxPolyhedronDegree before the trial mesh is refined (next).
const polyhedronSmoothDegree = 8

// polyhedronSeparationDegree is the degree up to which the trial space is
// raised, two at a time, together with the stage-A level while no N
// separates: separation needs the Ritz upper bound of Λ_N below the
// stage-A bound of Λ_(N+1), and P_3 on the 8 tetrahedra of a refined
// tetrahedron has 10 unknowns (its Ritz bound of λ2 on the orthoscheme
// 0 ≤ x ≤ y ≤ z ≤ 1 lies far above λ3).
const polyhedronSeparationDegree = 5

// polyhedronMaxAmplification is the amplification Λ_m/(ρ̂ − Λ_m) above
// which the driver, at the degree polyhedronSmoothDegree, refines the
// stage-A mesh before the trial mesh: the Lehmann–Goerisch width of Λ_m
// grows with it (chooseN). On the Dirichlet cube with stage A on 6144
// tetrahedra ρ̂ is 64.6 against Λ_2 = 62.5 (amplification 30): the
// projection bound λ_h/(1 + C²λ_h) loses 28% there; one level halves C.
const polyhedronMaxAmplification = 4

// maxRhoStageATetrahedra caps the stage-A mesh refined for ρ̂ alone (about
// 2·10⁵ Crouzeix–Raviart unknowns, one sparse factorization about a
// minute of CPU per verified count; the cube's fourth level has 49,152
// tetrahedra): beyond it the trial mesh is refined instead.
const maxRhoStageATetrahedra = 1 << 16

// first: P_3 on the cone tetrahedra refined once, RT_3 fluxes (k = p:
// measured on the cube, the Lehmann–Goerisch error is about 1.3 times the
// Ritz error at k = p and 4 times at k = p − 1), stage A on two levels
// (768 tetrahedra on the cube; a third level, eight times the cost, follows
// when these do not separate λ_N from λ_(N+1), as for the Dirichlet cube).
func (polyhedron) first(taylor int, scale float64) recipe {
	return recipe{degree: 3, fluxDegree: 3, taylor: min(taylor, polygonModelOrder), weightTaylor: polygonWeightOrder,
		scale: scale, refine: 1, stageARefine: 2, extra: defaultExtraIndices}
}

// fluxShift: V + γ_B ≥ 10 osc V, five times the polygons' rule
// (polygon.fluxShift): the Taylor models of the weight 1/(V + γ_B) on a
// tetrahedron span the box [0, 1]³ of three barycentric coordinates, and
// with a small γ_B their remainders grow with the order. Measured on the
// unit cube (96 tetrahedra, order 12): for V = e^x the weight's remainder
// width is 4.5 at γ_B = 2.44 (2 osc V − inf V; its range width 0.075),
// 2.2e-4 at 10, 2.3e-6 at 20, and at P_3 stage B gives no bound at 2.44
// and λ1 within 1.1e-4 of its Ritz bound at 16.2 (10 osc V − inf V); for
// V = x² + y² + z² the λ1 deficit is 1.8e-2 at γ_B = 6, 4.5e-6 at 30. Any
// γ_B ≥ γ is sound (a choice).
func (polyhedron) fluxShift(gamma, inf, sup float64) float64 {
	if osc := sup - inf; osc > 0 && !math.IsInf(osc, 0) {
		if gb := roundShift(interval.SubUp(10*osc, inf)); gb > gamma && !math.IsInf(gb, 0) {
			return gb
		}
	}
	return gamma
}

// located: as on polygons, the first indices are located in floating
// point and the further ones bounded by slicing.
func (d polyhedron) located(want int) int {
	return min(want, d.p.Eigenvalues+defaultExtraIndices+1)
}

func (d polyhedron) trial(r recipe, out *outcome) (discrete.Trial, error) {
	out.polyhedron = &polyhedronRecord{}
	m, err := polyhedronTrialMesh(d.p, r)
	if err != nil {
		return nil, err
	}
	pot, err := tet.NewPotential(m, d.p.Potential, r.taylor)
	if err != nil {
		return nil, err
	}
	s := tet.NewLagrange(m, r.degree, faceConditions(d.p))
	out.polyhedron.tetrahedra, out.polyhedron.trialUnknowns = m.NumTets(), s.N()
	return tet.NewTrial(s, pot), nil
}

func (d polyhedron) stageA(r recipe, gamma interval.I, _ []float64, located int, out *outcome) (discrete.StageA, error) {
	ma, err := polyhedronMesh(d.p, r.stageARefine)
	if err != nil {
		return nil, err
	}
	potA, err := tet.NewPotential(ma, d.p.Potential, min(r.taylor, stageATaylor))
	if err != nil {
		return nil, err
	}
	bcs := faceConditions(d.p)
	var proj *tet.Projection
	if usesCR(d.p) {
		proj, out.polyhedron.stageASpace = tet.NewCR(ma, bcs), "crouzeix-raviart"
	} else {
		proj, out.polyhedron.stageASpace = tet.NewECR(ma, bcs), "enriched-crouzeix-raviart"
	}
	out.polyhedron.stageATetrahedra = ma.NumTets()
	out.polyhedron.stageAUnknowns = proj.N()
	want := d.p.Eigenvalues + r.extra
	if proj.N() < want+1 {
		return nil, fmt.Errorf("the stage-A space of dimension %d is too small for %d eigenvalues (refine its mesh)", proj.N(), want+1)
	}
	return tet.NewStageA(proj, potA, gamma, located)
}

// search: as on polygons (a sparse factorization costs much).
func (polyhedron) search() discrete.ShiftSearch { return polygon{}.search() }

// stageBShift: stage B uses its own shift γ_B (recipe fluxGamma).
func (polyhedron) stageBShift(r recipe) proof.StageBShift { return polygon{}.stageBShift(r) }

func (d polyhedron) flux(r recipe, t discrete.Trial, gammaB interval.I) (discrete.Flux, error) {
	return tet.NewFluxSpace(t.(*tet.Trial), r.fluxDegree, faceConditions(d.p), gammaB, r.weightTaylor)
}

func (polyhedron) signFailure(err error) (interval.I, bool) {
	var sign *tet.SignError
	if errors.As(err, &sign) {
		return sign.Range, true
	}
	return interval.I{}, false
}

// cellLower returns min over the tetrahedra of the first stage-A mesh of
// the lower end of the enclosure of V there.
func (d polyhedron) cellLower(r recipe) (float64, error) {
	m, err := polyhedronMesh(d.p, r.stageARefine)
	if err != nil {
		return 0, err
	}
	pot, err := tet.NewPotential(m, d.p.Potential, min(r.taylor, stageATaylor))
	if err != nil {
		return 0, err
	}
	lo := math.Inf(1)
	for t := 0; t < m.NumTets(); t++ {
		lo = math.Min(lo, pot.Range(t).Lo)
	}
	return lo, nil
}

// stalls: as on polygons without singular corners, a step with stage B
// that gains less than stallGain counts toward a stall.
func (polyhedron) stalls(gain float64, out *outcome, _ *result) bool {
	return gain < stallGain && out.lg != nil
}

func (polyhedron) stallSteps() int { return 2 }

func (polyhedron) stallNote() string {
	return "; edge and vertex singularities of a polyhedron slow refinement (isotropic grading toward edges adds tetrahedra along each whole edge)"
}

// next chooses the next polyhedron recipe, or says why there is none (a
// Stop reason). While stage B does not run, stage A (which converges like
// h²) is refined, and the degree raised up to polyhedronSeparationDegree.
// Once it runs, the degree is raised by two up to polyhedronSmoothDegree
// (the flux degree follows, k = p); when ρ̂ limits (rhoLimits), the
// stage-A mesh is refined, with the step to that degree, and the indices
// extended past the next cluster; otherwise the degree is raised by one up
// to maxPolyhedronDegree, and then the trial mesh is refined.
//
// Degree before mesh: on a fixed mesh whose edges include the singular
// edges of the polyhedron (the cone tetrahedra and their refinements
// have the polyhedron's edges as element edges), the p-version's
// eigenvalue error falls like p^(−4α) for the edge exponent α = π/ω of a
// Dirichlet edge of dihedral angle ω, and exponentially for analytic
// eigenfunctions, while the h-version's falls like h^(2 min(p, α))
// (Babuška and Suri, The p and h-p versions of the finite element method,
// basic principles and properties, SIAM Review 36 (1994); Schwab, p- and
// hp-Finite Element Methods, Oxford 1998; the rates recalled from memory).
// A level costs about 64 times the step (eight times the unknowns, sparse
// factorizations about N²), a degree step two to three times (stepTime):
// for the regular tetrahedron (α = π/arccos(1/3) ≈ 2.55) a level gains
// about 2^5.1 ≈ 34 for a 64-fold cost, a degree step at p = 8 about
// (9/8)^10.2 ≈ 3.3 for a 2.5-fold cost (measured 3.4, λ1), the better rate
// up to p ≈ 12.
//
// A stage-A level costs eight times the unknowns; its verified
// counts cost about one sparse factorization each since their residual
// is bounded a priori (package enclose/sparse; measured on the cube's
// Kuhn meshes: 0.36 s of which 0.02 s for the bound at 11k unknowns,
// where the interval residual took 1.4 s more; 70 s at 94k, where it
// took about 1000 s). A choice; every recipe gives sound bounds.
func (d polyhedron) next(r recipe, out *outcome, _ float64) (recipe, string) {
	p := d.p
	if out.n > 0 && r.extra > defaultExtraIndices {
		r.extra = max(defaultExtraIndices, min(r.extra, out.n-p.Eigenvalues+1))
	}
	if out.n == 0 {
		if L := len(out.ritz); L > p.Eigenvalues && out.ritz[L-1]-out.ritz[p.Eigenvalues-1] < 0.02*out.ritz[L-1] && r.extra < maxExtraIndices {
			// Every index bounded lies in the cluster of the last one
			// wanted: no stage-A level separates it before more indices
			// reach past the cluster.
			r.extra = min(2*r.extra+2, maxExtraIndices)
			return r, ""
		}
		if r.stageARefine >= maxPolyhedronRefine {
			return r, StopNoSeparation
		}
		r.stageARefine++
		if r.degree < polyhedronSeparationDegree {
			r.degree = min(r.degree+2, polyhedronSeparationDegree)
			r.fluxDegree = r.degree
		}
		return r, ""
	}
	rhoLimits := polyhedronRhoLimits(out, p.Eigenvalues) && polyhedronTetrahedra(p, r.stageARefine+1) <= maxRhoStageATetrahedra
	refineStageA := func() {
		// ρ̂ limits: a finer stage A raises it, and the indices past the
		// next cluster let chooseN pass it (maxRaiseN3D).
		r.stageARefine++
		r.extra = min(max(r.extra, out.n+maxRaiseN3D-p.Eigenvalues), maxExtraIndices)
	}
	switch {
	case gradeBeforeDegree(p, r):
		r.graded++
	case r.degree < polyhedronSmoothDegree:
		r.degree = min(r.degree+2, polyhedronSmoothDegree)
		if r.degree == polyhedronSmoothDegree && rhoLimits {
			// ρ̂ does not depend on the degree: refine stage A with the
			// last degree step rather than in a step of its own.
			refineStageA()
		}
	case rhoLimits:
		refineStageA()
	case r.degree < maxPolyhedronDegree:
		r.degree++
	case r.refine < r.stageARefine && r.refine < maxPolyhedronRefine:
		r.refine++
	default:
		return r, StopCap
	}
	r.fluxDegree = r.degree
	return r, ""
}

// fallback replaces a step of the trial mesh (a uniform or graded level)
// that is predicted not to fit in the time left by a stage-A level, when
// ρ̂ amplifies the Lehmann–Goerisch bound of Λ_m and a level is expected
// to widen ρ̂ − Λ_m at least polyhedronMinFallbackGain times
// (polyhedronRhoGain), within maxRhoStageATetrahedra: a trial level costs
// about 64 times the step, a stage-A level 64 times stage A alone, which
// at the end of the degree line is the smaller part. Measured on the
// regular tetrahedron at P_12 (8 tetrahedra; expected gain 4.7): stage A
// on 32,768 tetrahedra instead of 4096 raised ρ̂ from 38.97 to 48.86 and
// narrowed λ1 from 1.04e-8 to 8.5e-9 and λ2 from 1.5e-7 to 4.1e-8, the
// step taking 38 s instead of 21 s. A choice; every recipe is sound.
func (d polyhedron) fallback(r, next recipe, out *outcome) (recipe, bool) {
	if next.refine == r.refine && next.graded == r.graded {
		return next, false
	}
	if out.n == 0 || r.stageARefine >= maxPolyhedronRefine || polyhedronTetrahedra(d.p, r.stageARefine+1) > maxRhoStageATetrahedra {
		return next, false
	}
	if polyhedronRhoGain(out, d.p.Eigenvalues) < polyhedronMinFallbackGain {
		return next, false
	}
	r.stageARefine++
	r.extra = min(max(r.extra, out.n+maxRaiseN3D-d.p.Eigenvalues), maxExtraIndices)
	return r, true
}

// polyhedronMinFallbackGain is the least expected widening of ρ̂ − Λ_m
// for which fallback takes a stage-A level.
const polyhedronMinFallbackGain = 2

// polyhedronRhoLimits reports whether ρ̂, the stage-A lower bound of
// Λ_(N+1), limits the Lehmann–Goerisch bound of Λ_m (m requested
// eigenvalues) enough to pay for a stage-A level: its amplification
// Λ_m/(ρ̂ − Λ_m) exceeds polyhedronMaxAmplification, and a level is
// expected to widen ρ̂ − Λ_m at least polyhedronMinRhoGain times. The
// Lehmann–Goerisch (Temple) defect of Λ_m is about η²/(ρ̂ − Λ_m) for the
// residual η of its approximate eigenvector, and a level brings ρ̂ about
// three quarters of the way to Λ_(N+1) (stage A converges like h²), whose
// Ritz upper bound stands in for it; without one (N is the last index
// bounded) ρ̂ is taken to limit. Measured with N = 4: the Dirichlet cube
// at P_7 (96 tetrahedra, stage A on 6144) expects 10.3 (ρ̂ 64.71, Λ_2
// 62.51, Λ_5 ≤ 92.12), and its level narrowed λ2 from 5.3e-6 to 2.3e-9
// with the step to P_8; the regular tetrahedron (8 tetrahedra, stage A on 4096) expects 4.7
// (ρ̂ 38.97, Λ_2 36.07, Λ_5 ≤ 53.42), and its level narrowed λ2 at P_8
// from 1.1e-3 to 2.4e-4 for 100 s of stage A, where the step to P_9
// without it gave 2.4e-5 for 30 s. A choice; every recipe is sound.
func polyhedronRhoLimits(out *outcome, m int) bool {
	return polyhedronRhoGain(out, m) >= polyhedronMinRhoGain
}

// polyhedronRhoGain returns the expected widening of ρ̂ − Λ_m by a
// stage-A level as polyhedronRhoLimits estimates it: +Inf when N is the
// last index bounded, and 0 when ρ̂ does not amplify (Λ_m/(ρ̂ − Λ_m) ≤
// polyhedronMaxAmplification).
func polyhedronRhoGain(out *outcome, m int) float64 {
	lm := out.ritz[m-1]
	if !(lm/(out.rho-lm) > polyhedronMaxAmplification) {
		return 0
	}
	if out.n >= len(out.ritz) {
		return math.Inf(1)
	}
	expected := out.rho + 0.75*(out.ritz[out.n]-out.rho)
	return (expected - lm) / (out.rho - lm)
}

// polyhedronMinRhoGain is the least expected widening of ρ̂ − Λ_m for
// which a stage-A level is taken (polyhedronRhoLimits).
const polyhedronMinRhoGain = 8

// polyhedronMesh returns the cone tetrahedra of the polyhedron (apex
// joined to the outward triangles of its faces, in the order of
// fem/mesh3's Cones, which depends only on the set of triangles, so that
// a problem read from its canonical form (Check) has the same mesh as the
// problem file it came from; Cones proves that they tile it), or the
// polyhedron itself when it is a tetrahedron, refined uniformly levels
// times.
func polyhedronMesh(p *problem.Problem, levels int) (*tet.Mesh, error) {
	ph := p.Polyhedron
	m, err := mesh3.Cones(ph.Nodes(), len(ph.Vertices), ph.Triangles(), ph.TriangleFaces())
	if err != nil {
		return nil, err
	}
	for range levels {
		m = m.Refine()
	}
	return tet.NewMesh(m, len(ph.Faces))
}

// faceConditions returns the problem's condition of each polyhedron face.
func faceConditions(p *problem.Problem) []boundary.Condition {
	bcs := make([]boundary.Condition, len(p.Boundary))
	for i, bc := range p.Boundary {
		bcs[i] = bc.Condition()
	}
	return bcs
}

// polyhedronTetrahedra is the number of tetrahedra of polyhedronMesh(p,
// levels) (each level has eight times the tetrahedra).
func polyhedronTetrahedra(p *problem.Problem, levels int) int64 {
	t := int64(len(p.Polyhedron.Tetrahedra()))
	if len(p.Polyhedron.Vertices) == 4 {
		t = 1
	}
	for range levels {
		t *= 8
	}
	return t
}

// stepTime predicts the time of the step from r to next (stepTimer) from
// the time last of r's step, split into its stage A and the rest: a level
// of either mesh has eight times the unknowns and the sparse
// factorizations of a 3D mesh cost about N² (so a level costs up to 64
// times as much; measured with the verified counts of the cheap residual
// bound on the Dirichlet cube, stage A went from about 5 s at 11,904
// unknowns to about 250 s at 96,768 with the up-looking factorization;
// the multifrontal one of package enclose/sparse cuts the latter to
// about 40 s of CPU, so the factor 64 is now on the safe side). On a
// degree step the rest grows like the cube of the dimension of RT_k on a
// tetrahedron (the element blocks of the flux choice and of the
// Lehmann–Goerisch matrix are dense in it), with a margin of a quarter.
// Measured on the regular tetrahedron (8 tetrahedra, stage A on 4096,
// idle machine): the steps from P_8 to P_12 took 3.6, 5.2, 8.3, 13.4 and
// 21.3 s, ratios 1.46 to 1.62 where the model predicts 2.4 to 2.9.
func (d polyhedron) stepTime(r, next recipe, out *outcome, last time.Duration) time.Duration {
	stageA := min(out.stageATime, last)
	rest := last - stageA
	switch {
	case next.graded > r.graded:
		rest = gradedStepTime(d.p, r, next, rest)
	case next.refine > r.refine:
		rest *= 64
	case next.fluxDegree != r.fluxDegree:
		q := float64(tet.RTDim(max(next.fluxDegree, 0))) / float64(tet.RTDim(max(r.fluxDegree, 0)))
		rest = time.Duration(float64(rest) * 1.25 * q * q * q)
	}
	if next.stageARefine > r.stageARefine {
		stageA *= 64
	}
	return rest + stageA
}
