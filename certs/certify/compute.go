package certify

import (
	"fmt"

	"gapcert/enclose"
	"gapcert/enclose/band"
	"gapcert/fem/boundary"
	"gapcert/fem/line"
	"gapcert/fem/problem"
	"gapcert/interval"
	"gapcert/temple"
)

// recipe is the input of one deterministic computation.
type recipe struct {
	degree int // p of the conforming trial space
	taylor int // order of the Taylor models of V
	gamma  float64
	scale  float64 // π²/D² rounded down; only for choosing shifts

	// fluxGamma is the shift γ_B ≥ γ of stage B on polygons (0 on
	// intervals, where stage B uses γ).
	fluxGamma float64

	// marks lists, per adaptive round on the polygon trial mesh (after the
	// uniform and graded levels), the triangles marked for bisection.
	marks [][]int

	// Intervals.
	cells, fluxDegree int // polygons: fluxDegree −1 runs stage A alone (convergence studies)
	weightTaylor      int // order of the Taylor models of 1/(V + γ)
	stageACells       int

	// Polygons: uniform refinements of the initial triangulation for the
	// trial space and for stage A, and extra levels toward re-entrant
	// corners (both meshes).
	refine, stageARefine, graded int

	// extra is how many eigenvalues past the requested ones are bounded
	// (Ritz upper bounds of Λ_1..Λ_(m+extra), stage-A lower bounds of
	// Λ_1..Λ_(m+extra+1)), so that N can be raised past a cluster that
	// meets the last requested eigenvalue.
	extra int
}

// describe is a one-line summary of the recipe for progress lines.
func (r recipe) describe() string {
	if r.refine > 0 || r.stageARefine > 0 {
		return fmt.Sprintf("refinements %d, degree %d, stage-A refinements %d, graded %d, extra indices %d", r.refine, r.degree, r.stageARefine, r.graded, r.extra)
	}
	return fmt.Sprintf("cells %d, degree %d, stage-A cells %d", r.cells, r.degree, r.stageACells)
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

	polygon *polygonRecord // nil for intervals
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
	if out.polygon == nil {
		return " (" + stage + ")"
	}
	return fmt.Sprintf(" (%d triangles, %d stage-A and %d flux unknowns, %s)",
		out.polygon.triangles, out.polygon.stageAUnknowns, out.polygon.fluxUnknowns, stage)
}

// Extra indices (recipe.extra): the first recipe bounds
// defaultExtraIndices eigenvalues past the requested ones; the polygon
// driver raises the count up to maxExtraIndices when no N separates
// (refinePolygon).
const (
	defaultExtraIndices = 3
	maxExtraIndices     = 64
)

// stageATaylor caps the Taylor order of the stage-A potential models, of
// which only the cell ranges inf_T(V + γ) are used.
const stageATaylor = 4

// compute runs the three stages once. Every number it returns as a bound is
// verified; the floating-point parts only choose vectors, shifts and fluxes.
func compute(p *problem.Problem, r recipe) (*outcome, error) {
	if p.Dim == 2 {
		return computePolygon(p, r)
	}
	want := p.Eigenvalues + r.extra
	gamma := interval.Point(r.gamma)
	left, right := ends(p)

	out := &outcome{}

	// Stage 1: Rayleigh–Ritz upper bounds.
	mesh := intervalMesh(p, r.cells)
	pot, err := line.FromExpr(mesh, p.Potential, r.taylor)
	if err != nil {
		return nil, err
	}
	space := line.NewLagrange(mesh, r.degree, left, right)
	if space.N() < want+1 {
		return nil, fmt.Errorf("the trial space of dimension %d is too small for %d eigenvalues", space.N(), want)
	}
	kApprox, mApprox := space.AssembleApprox(pot, r.gamma)
	_, vecs, err := band.LowestEigs(kApprox, mApprox, want)
	if err != nil {
		return nil, fmt.Errorf("the approximate eigenvectors could not be computed: %w", err)
	}
	a0, a1, err := space.RitzMatrices(vecs, pot, gamma)
	if err != nil {
		return nil, err
	}
	if out.ritz, err = ritzUpper(a0, a1); err != nil {
		return nil, err
	}

	// Stage A: projection lower bounds for Λ_1 … Λ_{want+1}.
	out.stageA, out.ch, err = stageA(p, r, gamma, left, right, out.ritz, want+1)
	if err != nil {
		return nil, err
	}

	// Stage B: Lehmann–Goerisch.
	if !chooseN(p, out) {
		return out, nil
	}
	weight, err := pot.InverseShifted(gamma, r.weightTaylor)
	if err != nil {
		return nil, err
	}
	flux := line.NewFlux(mesh, r.fluxDegree, left, right)
	trial := vecs[:out.n]
	fluxes, err := flux.MinimizeApprox(space, trial, weight)
	if err != nil {
		out.notes = append(out.notes, "stage B skipped: "+err.Error())
		return out, nil
	}
	l2, err := flux.LGMatrix(space, trial, fluxes, pot, weight, gamma)
	if err != nil {
		return nil, err
	}
	// The Ritz matrices of the first N vectors are, bit for bit, the
	// leading blocks of those of all vectors (fem/line, Flux.LGMatrix).
	out.lg, err = temple.LehmannGoerisch(leading(a0, out.n), leading(a1, out.n), l2, out.rho)
	if err != nil {
		out.notes = append(out.notes, "stage B gave no bound: "+err.Error())
		out.lg = nil
	}
	return out, nil
}

// chooseN sets out.n to the smallest N ≥ the requested count whose
// ρ̂ = (stage-A lower bound of Λ_{N+1}) exceeds the Ritz upper bound of Λ_N,
// and out.rho to that ρ̂ (certified ≤ Λ_{N+1}, as Lehmann–Goerisch needs).
// It reports false, with a note, when no such N is within the bounds
// computed; then no bound may rely on stage B.
func chooseN(p *problem.Problem, out *outcome) bool {
	for n := p.Eigenvalues; n < len(out.stageA) && n <= len(out.ritz); n++ {
		if out.stageA[n] > out.ritz[n-1] {
			out.n, out.rho, out.lgRho = n, out.stageA[n], out.stageA[n]
			return true
		}
	}
	out.notes = append(out.notes, "stage B skipped: no N with a stage-A lower bound of lambda_{N+1} above the Ritz upper bound of lambda_N; lower bounds are from stage A only")
	return false
}

// ritzUpper returns upper bounds of Λ_1..Λ_n from the enclosed Ritz pencil
// (a0, a1) of n trial functions: by the min–max principle Λ_k ≤ μ_k for the
// exact pencil, which is a member of the interval one, and μ_k is at most
// the upper end of its enclosure.
func ritzUpper(a0, a1 *enclose.Sym) ([]float64, error) {
	mu, err := enclose.Eigenvalues(a0, a1)
	if err != nil {
		return nil, fmt.Errorf("the Ritz pencil could not be enclosed: %w", err)
	}
	upper := make([]float64, len(mu))
	for k := range upper {
		upper[k] = mu[k].Hi
	}
	return upper, nil
}

// stageA returns verified lower bounds of Λ_1..Λ_count from the projection
// bound of Liu (2015) on the mean-preserving P2 space (packages enclose and
// fem/line, package docs):
// Λ_k ≥ λ_{h,k}/(1 + C_h² λ_{h,k}), where λ_{h,k} ≥ σ' is proved by the
// verified inertia count #{λ_h < σ'} ≤ k − 1 (package enclose/band, Verified
// counts). upper holds the
// Ritz upper bounds of Λ_k, used only to choose the search brackets.
func stageA(p *problem.Problem, r recipe, gamma interval.I, left, right boundary.Condition, upper []float64, count int) ([]float64, interval.I, error) {
	mesh := intervalMesh(p, r.stageACells)
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
	c2 := ch.Hi * ch.Hi
	lower := make([]float64, count)
	prev := 0.0
	for i := range lower {
		// λ_h/(1 + C²λ_h) ≤ Λ_k gives λ_{h,k} ≤ Λ_k/(1 − C²Λ_k): a bracket
		// end for the search (a choice; a wrong guess costs only width).
		guess := 2 * upper[len(upper)-1]
		if i < len(upper) && c2*upper[i] < 0.5 {
			guess = upper[i] / (1 - c2*upper[i]) * (1 + 1e-9)
		}
		lh := verifiedDiscreteLower(k, m, mMin, max(prev, 0), guess, i+1)
		prev = lh
		lower[i] = enclose.ProjectionLower(lh, ch)
	}
	return lower, ch, nil
}

// verifiedDiscreteLower returns a float ℓ with λ_{h,index} ≥ ℓ for every
// member of the interval pencil ([K], [M]). A floating-point Sturm
// bisection on the midpoint pencil in [lo, hi] locates λ_{h,index} (a
// choice); then shifts σ below it are verified: when band.CountBelow
// shows at most index − 1 eigenvalues below the corrected shift σ', then
// λ_{h,index} ≥ σ'. The largest verified σ' is returned, lo if nothing
// verifies (lo must be a known lower bound: 0 always is, since the stage-A
// pencil is positive semidefinite as c_T ≥ 0 and α ≥ 0).
func verifiedDiscreteLower(k, m *band.ISym, mMin, lo, hi float64, index int) float64 {
	km, mm := k.Mid(), m.Mid()
	shifted := band.NewSym(km.N, km.W)
	var f band.LDL
	below := func(sigma float64) int { // approximate count, a choice
		for i := range shifted.Data {
			shifted.Data[i] = km.Data[i] - sigma*mm.Data[i]
		}
		if !f.Factorize(shifted) {
			return index // treat a breakdown as "too high"
		}
		return f.NegCount()
	}
	a, b := lo, hi
	for it := 0; it < 100 && b-a > 1e-15*b; it++ {
		mid := a + (b-a)/2
		if below(mid) <= index-1 {
			a = mid
		} else {
			b = mid
		}
	}
	// Near an eigenvalue the factorization without pivoting has tiny
	// pivots and a large residual, so σ' can fall far below σ; shifts
	// further from λ_{h,index} lose distance but may gain residual. Shifts
	// stepping away geometrically are tried and the best verified σ' is
	// kept. The search stops once eight verified shifts in a row did not improve
	// (σ' is not monotone in the shift: measured on (0, 1), Dirichlet, 256
	// cells, three were too few for λ_{h,2}).
	best, stale := lo, 0
	delta := 1e-13 * a
	for try := 0; try < 30 && a-delta > lo && stale < 8; try++ {
		n, sigmaPrime, ok := band.CountBelow(k, m, mMin, a-delta)
		if ok && n <= index-1 {
			if sigmaPrime > best {
				best, stale = sigmaPrime, 0
			} else {
				stale++
			}
		}
		delta *= 4
	}
	return best
}

// intervalMesh returns the n-cell uniform mesh of the problem's interval
// with a node at every kink of the potential that formula.Expr.Kinks
// finds (abs, min, max of affine arguments vanishing at an exact float), so
// that the Taylor models of V are formed on both sides of the kink; a cell
// with any other kink inside gets a range model (line.FromExpr). The mesh
// depends only on the problem and n, so Check rebuilds it.
func intervalMesh(p *problem.Problem, n int) *line.Mesh {
	return line.UniformWith(p.Interval[0].Val, p.Interval[1].Val, n, p.Potential.Kinks())
}

// ends returns the problem's conditions at the two ends.
func ends(p *problem.Problem) (left, right boundary.Condition) {
	return p.Boundary[0].Condition(), p.Boundary[1].Condition()
}
