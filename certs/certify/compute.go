package certify

import (
	"errors"
	"fmt"
	"math"

	"gapcert/enclose"
	"gapcert/enclose/band"
	"gapcert/fem/line"
	"gapcert/fem/problem"
	"gapcert/interval"
	"gapcert/temple"
)

// recipe is the input of one deterministic computation.
type recipe struct {
	cells, degree, fluxDegree int
	taylor                    int // order of the Taylor models of V
	weightTaylor              int // order of the Taylor models of 1/(V + γ)
	stageACells               int
	gamma                     float64
}

// outcome holds the verified one-sided bounds of Λ_k = λ_k + γ that one
// computation produced (0-based: index k−1 holds Λ_k).
type outcome struct {
	ritz   []float64 // upper bounds, k = 1..len
	stageA []float64 // lower bounds, k = 1..len
	lg     []float64 // lower bounds, k = 1..n (−Inf where none)
	n      int       // trial functions used by stage B (0 if it did not run)
	rho    float64
	ch     interval.I
	notes  []string
}

// extraIndices is how many eigenvalues past the requested ones are bounded,
// so that N can be raised past a cluster that meets the last requested one.
const extraIndices = 3

// stageATaylor caps the Taylor order of the stage-A potential models, of
// which only the cell ranges inf_T(V + γ) are used.
const stageATaylor = 4

// compute runs the three stages once. Every number it returns as a bound is
// verified; the floating-point parts only choose vectors, shifts and fluxes.
func compute(p *problem.Problem, r recipe) (*outcome, error) {
	if p.Dim != 1 {
		return nil, errors.New("certify: only interval problems are supported by this driver")
	}
	want := p.Eigenvalues + extraIndices
	gamma := interval.Point(r.gamma)
	left, right := ends(p)

	out := &outcome{}

	// Stage 1: Rayleigh–Ritz upper bounds.
	mesh := line.Uniform(p.Interval[0].Val, p.Interval[1].Val, r.cells)
	pot, err := line.FromExpr(mesh, p.Potential, r.taylor)
	if err != nil {
		return nil, err
	}
	space := line.NewLagrange(mesh, r.degree, left, right)
	if space.N() < want+1 {
		return nil, fmt.Errorf("certify: trial space of dimension %d is too small for %d eigenvalues", space.N(), want)
	}
	kApprox, mApprox := space.AssembleApprox(pot, r.gamma)
	_, vecs, err := band.LowestEigs(kApprox, mApprox, want)
	if err != nil {
		return nil, fmt.Errorf("certify: approximate eigenvectors: %w", err)
	}
	a0, a1, err := space.RitzMatrices(vecs, pot, gamma)
	if err != nil {
		return nil, err
	}
	mu, err := enclose.Eigenvalues(a0, a1)
	if err != nil {
		return nil, fmt.Errorf("certify: Ritz pencil: %w", err)
	}
	out.ritz = make([]float64, want)
	for k := range out.ritz {
		out.ritz[k] = mu[k].Hi // min–max: Λ_k ≤ μ_k for every member
	}

	// Stage A: projection lower bounds for Λ_1 … Λ_{want+1}.
	out.stageA, out.ch, err = stageA(p, r, gamma, left, right, want+1)
	if err != nil {
		return nil, err
	}

	// Stage B: Lehmann–Goerisch with the smallest N ≥ requested whose
	// ρ̂ = (stage-A lower bound of Λ_{N+1}) exceeds the Ritz upper bound of Λ_N.
	for n := p.Eigenvalues; n <= want; n++ {
		if out.stageA[n] > out.ritz[n-1] {
			out.n, out.rho = n, out.stageA[n]
			break
		}
	}
	if out.n == 0 {
		out.notes = append(out.notes, "stage B skipped: no N with a stage-A lower bound of lambda_{N+1} above the Ritz upper bound of lambda_N; lower bounds are from stage A only")
		return out, nil
	}
	weight, err := pot.InverseShifted(gamma, r.weightTaylor)
	if err != nil {
		return nil, err
	}
	flux := line.NewFlux(mesh, r.fluxDegree, left, right)
	fluxes := make([][]float64, out.n)
	for i := range fluxes {
		fluxes[i] = flux.MinimizeApprox(space, vecs[i], weight)
	}
	l0, l1, l2, err := line.LGMatrices(space, vecs[:out.n], flux, fluxes, pot, weight, gamma)
	if err != nil {
		return nil, err
	}
	out.lg, err = temple.LehmannGoerisch(l0, l1, l2, out.rho)
	if err != nil {
		out.notes = append(out.notes, "stage B gave no bound: "+err.Error())
		out.lg = nil
	}
	return out, nil
}

// stageA returns verified lower bounds of Λ_1..Λ_count from the projection
// bound of Liu (2015) on the mean-preserving P2 space (METHODS §5):
// Λ_k ≥ λ_{h,k}/(1 + C_h² λ_{h,k}), where λ_{h,k} ≥ σ' is proved by the
// verified inertia count #{λ_h < σ'} ≤ k − 1 (METHODS §7).
func stageA(p *problem.Problem, r recipe, gamma interval.I, left, right line.End, count int) ([]float64, interval.I, error) {
	mesh := line.Uniform(p.Interval[0].Val, p.Interval[1].Val, r.stageACells)
	// Only the cell ranges of V matter here; a low-order model gives them.
	pot, err := line.FromExpr(mesh, p.Potential, min(r.taylor, stageATaylor))
	if err != nil {
		return nil, interval.I{}, err
	}
	space := line.NewMeanP2(mesh, left, right)
	k, m, mMin, err := space.Matrices(pot, gamma)
	if err != nil {
		return nil, interval.I{}, err
	}
	ch := space.ProjectionConstant()
	approx, _, err := band.LowestEigs(k.Mid(), m.Mid(), count)
	if err != nil {
		return nil, interval.I{}, fmt.Errorf("certify: stage A approximate eigenvalues: %w", err)
	}
	lower := make([]float64, count)
	for i := range lower {
		lh := verifiedDiscreteLower(k, m, mMin, approx[i], i+1)
		lower[i] = enclose.ProjectionLower(lh, ch)
	}
	return lower, ch, nil
}

// verifiedDiscreteLower returns a float ℓ with λ_{h,k} ≥ ℓ for every member
// of the interval pencil ([K], [M]): it tries shifts σ just below the
// approximation and accepts σ' once the verified count of eigenvalues below
// σ' is at most k − 1. It falls back to 0 (the pencil is positive
// semidefinite: a_lo ≥ 0 as c_T ≥ 0 and α ≥ 0) if no shift succeeds.
func verifiedDiscreteLower(k, m *band.ISym, mMin, approx float64, index int) float64 {
	delta := 1e-12*math.Abs(approx) + 1e-300
	for try := 0; try < 40; try++ {
		sigma := approx - delta
		n, sigmaPrime, ok := band.CountBelow(k, m, mMin, sigma)
		if ok && n <= index-1 {
			return math.Max(sigmaPrime, 0)
		}
		delta *= 4
	}
	return 0
}

// ends converts the problem's boundary conditions to the 1D element ends.
func ends(p *problem.Problem) (left, right line.End) {
	conv := func(bc problem.BC) line.End {
		switch bc.Kind {
		case problem.Dirichlet:
			return line.End{Dirichlet: true}
		case problem.Robin:
			return line.End{Alpha: bc.Alpha.Val}
		}
		return line.End{} // Neumann: α = 0
	}
	return conv(p.Boundary[0]), conv(p.Boundary[1])
}

// potentialRange encloses V over the whole interval.
func potentialRange(p *problem.Problem) (interval.I, error) {
	dom := p.Interval[0].Val.Hull(p.Interval[1].Val)
	return p.Potential.Eval(map[string]interval.I{"x": dom})
}
