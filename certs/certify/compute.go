package certify

import (
	"errors"
	"fmt"
	"time"

	"gapcert/certs/certify/proof"
	"gapcert/enclose"
	"gapcert/fem/discrete"
	"gapcert/fem/problem"
	"gapcert/interval"
)

// This file is the method, written once for every discretisation: the
// Ritz step, the verified stage-A search, the choice of N, stage B with
// its shift, in this order. The bounds come from package proof; the
// spaces, and every choice of a dimension, from a discretisation.

// discretisation is the choosing side of one kind of domain (interval.go,
// polygon.go): it builds the spaces of a recipe (package fem/discrete)
// and chooses the next recipe. compute and Certify are written against it.
type discretisation interface {
	// trial builds the trial space of r (recording its sizes in out).
	trial(r recipe, out *outcome) (discrete.Trial, error)
	// located is how many of the want stage-A eigenvalues the stage-A
	// space locates in floating point; the others are bounded by
	// spectrum slicing (sliceStageA).
	located(want int) int
	// stageA builds the stage-A space of r for V + γ (recording its sizes
	// in out). ritz holds the Ritz upper bounds, which may place brackets.
	stageA(r recipe, gamma interval.I, ritz []float64, located int, out *outcome) (discrete.StageA, error)
	// search is the placement of the shifts of the verified counts.
	search() discrete.ShiftSearch
	// stageBShift is the shift of stage B for r.
	stageBShift(r recipe) proof.StageBShift
	// flux builds the flux space of r for the trial space t with the
	// weight 1/(V + γ_B).
	flux(r recipe, t discrete.Trial, gammaB interval.I) (discrete.Flux, error)
	// signFailure reports whether err says that V + γ ≥ 0 (or > 0) could
	// not be verified on a cell, and the cell's enclosure of V + γ.
	signFailure(err error) (interval.I, bool)
	// next chooses the recipe after r (refine).
	next(r recipe, out *outcome, gain float64) (recipe, string)
	// memory estimates the peak memory of r in bytes (memoryEstimate).
	memory(r recipe) int64
	// stalls reports whether a step that narrowed the widths by the
	// factor gain counts toward a stall, and stallSteps how many such
	// steps in a row stop the run (Certify).
	stalls(gain float64, out *outcome, best *result) bool
	stallSteps() int
	// stallNote is what the stall warning adds about the cause ("" or
	// text starting with "; ").
	stallNote() string
	// first is the first recipe of the domain, without its shifts, for
	// Taylor models of order taylor and π²/D² ≥ scale.
	first(taylor int, scale float64) recipe
	// fluxShift is the shift γ_B of stage B recorded in the recipe for
	// the shift γ and bounds inf ≤ V ≤ sup on the domain (0: stage B
	// uses γ).
	fluxShift(gamma, inf, sup float64) float64
	// cellLower returns min over the cells of the first stage-A mesh of
	// r of the lower end of the enclosure of V there (initialRecipe).
	cellLower(r recipe) (float64, error)
}

// discretisationOf returns the discretisation of the problem's domain.
func discretisationOf(p *problem.Problem) discretisation {
	if p.Polyhedron != nil {
		return polyhedron{p}
	}
	if p.Dim == 2 {
		d := polygon{p: p}
		if hasSingularCorners(p) {
			d.hist = &stepHistory{}
		}
		return d
	}
	return intervalDomain{p}
}

// outcome holds the verified one-sided bounds of Λ_k = λ_k + γ that one
// computation produced (0-based: index k−1 holds Λ_k).
type outcome struct {
	ritz   []float64 // upper bounds, k = 1..len
	stageA []float64 // lower bounds, k = 1..len
	lg     []float64 // lower bounds, k = 1..n (−Inf where none)
	n      int       // trial functions used by stage B (0 if it did not run)
	rho    float64   // the stage-A lower bound of Λ_{N+1} that separates
	lgRho  float64   // ρ̂ given to Lehmann–Goerisch: ≤ λ_{N+1} + (its shift)
	ch     interval.I
	notes  []string

	stageATime time.Duration // the wall time of stage A (steers the time predictions only)

	// The approximate ground state ũ of the step, kept for the ground-state
	// block (groundStateInputs): the trial space, ũ's coefficients (the
	// first approximate eigenvector) and the [0, 0] entries of the Ritz
	// matrices, enclosing a(ũ, ũ) + γ‖ũ‖² and ‖ũ‖².
	trial        discrete.Trial
	ground       []float64
	groundEnergy interval.I
	groundNorm2  interval.I

	polygon    *polygonRecord    // set by the polygon discretisation; nil otherwise
	polyhedron *polyhedronRecord // set by the polyhedron discretisation; nil otherwise
}

// polygonRecord is what a polygon computation records besides its bounds.
type polygonRecord struct {
	stageASpace                string
	triangles, stageATriangles int
	stageAUnknowns             int
	fluxUnknowns               int
	indicators                 []float64 // per trial triangle, for marking (nil if stage B did not run)
}

// describe is a summary of the sizes and of the stage that gave the lower
// bounds, for progress lines.
func (out *outcome) describe() string {
	stage := "stage A only"
	if out.lg != nil {
		stage = fmt.Sprintf("stage B with N = %d", out.n)
	}
	if ph := out.polyhedron; ph != nil {
		return fmt.Sprintf(" (%d tetrahedra, %d trial, %d stage-A and %d flux unknowns, %s)",
			ph.tetrahedra, ph.trialUnknowns, ph.stageAUnknowns, ph.fluxUnknowns, stage)
	}
	if out.polygon == nil {
		return " (" + stage + ")"
	}
	return fmt.Sprintf(" (%d triangles, %d stage-A and %d flux unknowns, %s)",
		out.polygon.triangles, out.polygon.stageAUnknowns, out.polygon.fluxUnknowns, stage)
}

// compute runs the three stages once. Every number it returns as a bound is
// verified (package proof); the floating-point parts only choose vectors,
// shifts and fluxes.
func compute(p *problem.Problem, r recipe) (*outcome, error) {
	d := discretisationOf(p)
	want := p.Eigenvalues + r.extra
	gamma := interval.Point(r.gamma)
	out := &outcome{}

	// Upper bounds: Rayleigh–Ritz.
	trial, err := d.trial(r, out)
	if err != nil {
		return nil, err
	}
	if trial.N() < want+1 {
		return nil, fmt.Errorf("the trial space of dimension %d is too small for %d eigenvalues", trial.N(), want)
	}
	vecs, err := trial.ApproxEigenvectors(want, r.gamma)
	if err != nil {
		return nil, fmt.Errorf("the approximate eigenvectors could not be computed: %w", err)
	}
	a0, a1, err := trial.RitzMatrices(vecs, gamma)
	if err != nil {
		return nil, err
	}
	if out.ritz, err = proof.RitzUpper(a0, a1); err != nil {
		return nil, err
	}
	out.trial, out.ground = trial, vecs[0]
	out.groundEnergy, out.groundNorm2 = a0.At(0, 0), a1.At(0, 0)

	// Lower bounds, stage A: projection bounds of Λ_1..Λ_(want+1).
	located := d.located(want + 1)
	startA := time.Now()
	sa, err := d.stageA(r, gamma, out.ritz, located, out)
	if err != nil {
		return nil, err
	}
	out.ch = sa.ProjectionConstant()
	lhs, err := stageALower(sa, d.search(), out.ritz, want+1, located)
	if err != nil {
		return nil, err
	}
	out.stageA = make([]float64, want+1)
	for i, lh := range lhs {
		out.stageA[i] = proof.ProjectionLower(lh, sa.FormShift(), out.ch)
	}
	out.stageATime = time.Since(startA)

	// Lower bounds, stage B: Lehmann–Goerisch with the first N trial
	// functions.
	if r.fluxDegree < 0 || !chooseN(p, out) {
		return out, nil
	}
	shift := d.stageBShift(r)
	out.lgRho = shift.Rho(out.rho)
	trialN := vecs[:out.n]
	b0, b1 := proof.Leading(a0, out.n), proof.Leading(a1, out.n)
	if shift.GammaB != r.gamma {
		if b0, b1, err = trial.RitzMatrices(trialN, interval.Point(shift.GammaB)); err != nil {
			return nil, err
		}
	}
	flux, err := d.flux(r, trial, interval.Point(shift.GammaB))
	if err != nil {
		return nil, err
	}
	if out.polygon != nil {
		out.polygon.fluxUnknowns = flux.N()
	}
	if out.polyhedron != nil {
		out.polyhedron.fluxUnknowns = flux.N()
	}
	fluxes, err := flux.Choose(trialN)
	if err != nil {
		out.notes = append(out.notes, "stage B skipped: "+err.Error())
		return out, nil
	}
	lg, err := stageB(shift, flux, b0, b1, trialN, fluxes, out.lgRho)
	var me matrixError
	if errors.As(err, &me) {
		return nil, me.err
	}
	if err != nil {
		out.notes = append(out.notes, "stage B gave no bound: "+err.Error())
		return out, nil
	}
	if ind, ok := flux.(discrete.Indicators); ok && out.polygon != nil {
		lamB := make([]float64, out.n) // approximate Λ^B_i, for the indicators only
		for i := range lamB {
			lamB[i] = out.ritz[i] - r.gamma + shift.GammaB
		}
		out.polygon.indicators = ind.Indicators(trialN, fluxes, lamB)
	}
	out.lg = lg
	return out, nil
}

// stageB returns the Lehmann–Goerisch bounds of stage B for the Ritz
// matrices b0, b1 of the first N trial functions, their fluxes and ρ̂_B:
// with the flux space's own enclosure of the Lehmann matrix B when it has
// one (discrete.LehmannMatrix: the residual form, narrower), else with
// A2 (Flux.LGMatrix). An error of the matrices themselves is returned as a
// matrixError (the step fails); one of the theorem's decision (B not
// verified positive definite) as it is (stage B gives no bound).
func stageB(shift proof.StageBShift, flux discrete.Flux, b0, b1 *enclose.Sym, trialN, fluxes [][]float64, rhoB float64) ([]float64, error) {
	if lm, ok := flux.(discrete.LehmannMatrix); ok {
		if b, err := lm.LehmannMatrix(trialN, fluxes, rhoB); err == nil {
			return shift.StageBFromB(b0, b1, b, rhoB)
		}
	}
	a2, err := flux.LGMatrix(trialN, fluxes)
	if err != nil {
		return nil, matrixError{err}
	}
	return shift.StageB(b0, b1, a2, rhoB)
}

// matrixError is an error of the interval matrices of stage B (as opposed
// to a failed decision of the theorem).
type matrixError struct{ err error }

func (e matrixError) Error() string { return e.err.Error() }
func (e matrixError) Unwrap() error { return e.err }

// chooseN sets out.n to an N ≥ the requested count m whose
// ρ̂ = (stage-A lower bound of Λ_{N+1}) exceeds the Ritz upper bound of Λ_N,
// and out.rho to that ρ̂ (certified ≤ Λ_{N+1}, as Lehmann–Goerisch needs).
// It reports false, with a note, when no such N is within the bounds
// computed; then no bound may rely on stage B.
//
// Which N (a choice; every such N is sound): the least one, N₀, unless
// its amplification Λ_m/(ρ̂ − Λ_m) (Λ_m its Ritz upper bound) exceeds
// maxAmplification and a larger N, at most N₀ + maxRaiseN (maxRaiseN3D in
// three dimensions), at least halves
// it (the largest such N whose amplification halves the previous pick's). For an approximate
// eigenpair, the Lehmann–Goerisch bound t = ρ̂ − ρ̂/(1 − μ) of Λ_m moves by
// about Λ_m/(ρ̂ − Λ_m) times the relative widths of the pencil's entries
// (package temple: μ ≈ Λ/(Λ − ρ̂), B ≈ (ρ̂ − Λ)²/Λ); with ρ̂ just below a
// close Λ_{m+1} that factor dominates the width. Measured on the generic
// triangle (0,0), (1,0), (3/10,7/10) at degree 10 on 292 triangles, with
// B combined from A0, A1 and A2: N = 2 (ρ̂ 14% above Λ_2) gives λ2 a
// relative width of 2.6e-13, N = 3 (ρ̂ 56% above) 9.2e-14.
func chooseN(p *problem.Problem, out *outcome) bool {
	m := p.Eigenvalues
	separates := func(n int) bool { return n < len(out.stageA) && n <= len(out.ritz) && out.stageA[n] > out.ritz[n-1] }
	n0 := m
	for ; n0 < len(out.stageA) && n0 <= len(out.ritz) && !separates(n0); n0++ {
	}
	if !separates(n0) {
		out.notes = append(out.notes, "stage B skipped: no N with a stage-A lower bound of lambda_{N+1} above the Ritz upper bound of lambda_N; lower bounds are from stage A only")
		return false
	}
	lm := out.ritz[m-1]
	amplification := func(n int) float64 { return lm / (out.stageA[n] - lm) }
	best, raise := n0, maxRaiseN
	if p.Dim == 3 {
		raise = maxRaiseN3D
	}
	for n := n0 + 1; n <= n0+raise && amplification(n0) > maxAmplification; n++ {
		if separates(n) && amplification(n) <= amplification(best)/2 {
			best = n
		}
	}
	out.n, out.rho, out.lgRho = best, out.stageA[best], out.stageA[best]
	return true
}

// maxRaiseN is how far chooseN raises N past the least separating one,
// and maxAmplification the amplification below which it keeps the least
// (choices: each trial function more costs a flux).
const (
	maxRaiseN        = 2
	maxAmplification = 2
)

// maxRaiseN3D is maxRaiseN in three dimensions, where symmetric domains
// have triple eigenvalues (the cube's 6π², 9π², 11π²): passing one takes
// three more trial functions.
const maxRaiseN3D = 3
