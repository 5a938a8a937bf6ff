package certify

import (
	"fmt"
	"math"
	"sort"

	"gapcert/enclose"
	"gapcert/enclose/sparse"
	"gapcert/fem/boundary"
	"gapcert/fem/mesh"
	"gapcert/fem/problem"
	"gapcert/fem/tri"
	"gapcert/interval"
	"gapcert/temple"
)

// computePolygon runs the polygon pipeline once: Rayleigh–Ritz upper bounds
// from conforming P_p on one mesh and projection lower bounds (stage A,
// package fem/tri doc) from Crouzeix–Raviart or enriched Crouzeix–Raviart
// elements on another, and Lehmann–Goerisch lower bounds (stage B, packages
// temple and fem/tri docs) with
// Raviart–Thomas fluxes on the trial mesh. As in 1D, every number returned as a bound is verified and
// the floating-point parts only choose vectors and shifts.
func computePolygon(p *problem.Problem, r recipe) (*outcome, error) {
	want := p.Eigenvalues + r.extra
	gamma := interval.Point(r.gamma)
	bcs := sideConditions(p)
	out := &outcome{polygon: &polygonRecord{}}

	// Upper bounds.
	m, err := trialMesh(p, r)
	if err != nil {
		return nil, err
	}
	pot, err := tri.NewPotential(m, p.Potential, r.taylor)
	if err != nil {
		return nil, err
	}
	space := tri.NewLagrange(m, r.degree, bcs)
	if space.N() < want+1 {
		return nil, fmt.Errorf("the trial space of dimension %d is too small for %d eigenvalues", space.N(), want)
	}
	kApprox, mApprox := space.AssembleApprox(pot, r.gamma)
	_, vecs, err := sparse.LowestEigs(kApprox, mApprox, want)
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

	// Lower bounds, stage A.
	ma, err := polygonMesh(p, r.stageARefine, r.graded)
	if err != nil {
		return nil, err
	}
	potA, err := tri.NewPotential(ma, p.Potential, min(r.taylor, stageATaylor))
	if err != nil {
		return nil, err
	}
	var proj *tri.Projection
	if usesCR(p) {
		proj, out.polygon.stageASpace = tri.NewCR(ma, bcs), "crouzeix-raviart"
	} else {
		proj, out.polygon.stageASpace = tri.NewECR(ma, bcs), "enriched-crouzeix-raviart"
	}
	out.polygon.triangles, out.polygon.stageATriangles = len(m.Tris), len(ma.Tris)
	out.polygon.stageAUnknowns = proj.N()
	if proj.N() < want+1 {
		return nil, fmt.Errorf("the stage-A space of dimension %d is too small for %d eigenvalues (refine its mesh)", proj.N(), want+1)
	}
	k, mass, mMin, err := proj.Matrices(potA, gamma)
	if err != nil {
		return nil, err
	}
	out.ch = proj.ProjectionConstant()
	// Approximate stage-A eigenvalues locate the shifts of the verified
	// counts of the first indices (at most the default count); the
	// further ones are bounded by slicing (sliceStageA), which needs no
	// eigenvectors.
	solved := min(want+1, p.Eigenvalues+defaultExtraIndices+1)
	approx, _, err := sparse.LowestEigs(k.Mid(), mass.Mid(), solved)
	if err != nil {
		return nil, fmt.Errorf("the approximate stage-A eigenvalues could not be computed: %w", err)
	}
	lhs := make([]float64, want+1) // verified lower bounds of λ_{h,1..want+1}
	counter := sparse.NewCounter(k, mass)
	prev := 0.0
	for i := range approx {
		lhs[i] = verifiedSparseLower(counter, mMin, approx[i], prev, i+1)
		prev = lhs[i]
	}
	if want+1 > solved {
		sliceStageA(counter, mMin, approx[solved-1], out.ritz, lhs, solved)
	}
	out.stageA = make([]float64, want+1)
	c := proj.CRShift(potA, gamma) // 0 for ECR
	for i, lh := range lhs {
		out.stageA[i] = shiftedProjectionLower(lh, c, out.ch)
	}

	// Stage B: Lehmann–Goerisch with Raviart–Thomas fluxes on the trial mesh.
	if r.fluxDegree < 0 || !chooseN(p, out) {
		return out, nil
	}
	// Stage B works with Λ^B_k = λ_k + γ_B. From stageA[N] ≤ λ_{N+1} + γ
	// (γ, γ_B exact floats), ρ̂_B = (stageA[N] − γ) + γ_B rounded down is
	// ≤ Λ^B_{N+1}; its bounds ℓ ≤ Λ^B_k are stored as (ℓ − γ_B) + γ
	// rounded down ≤ Λ_k.
	gB := r.fluxGamma
	if gB == 0 {
		gB = r.gamma
	}
	gammaB := interval.Point(gB)
	out.lgRho = interval.AddDown(interval.SubDown(out.rho, r.gamma), gB)
	trial := vecs[:out.n]
	b0, b1 := leading(a0, out.n), leading(a1, out.n)
	if gB != r.gamma {
		if b0, b1, err = space.RitzMatrices(trial, pot, gammaB); err != nil {
			return nil, err
		}
	}
	weight, err := pot.InverseShifted(gammaB, r.weightTaylor)
	if err != nil {
		return nil, err
	}
	flux := tri.NewFlux(m, r.fluxDegree, bcs)
	out.polygon.fluxUnknowns = flux.N()
	fluxes, err := flux.MinimizeApprox(space, trial, weight)
	if err != nil {
		out.notes = append(out.notes, "stage B skipped: "+err.Error())
		return out, nil
	}
	a2, err := flux.LGMatrix(space, trial, fluxes, pot, weight, gammaB)
	if err != nil {
		return nil, err
	}
	lg, err := temple.LehmannGoerisch(b0, b1, a2, out.lgRho)
	if err != nil {
		out.notes = append(out.notes, "stage B gave no bound: "+err.Error())
		return out, nil
	}
	lamB := make([]float64, out.n) // approximate Λ^B_i, for the indicators only
	for i := range lamB {
		lamB[i] = out.ritz[i] - r.gamma + gB
	}
	out.polygon.indicators = flux.Indicators(space, trial, fluxes, lamB)
	out.lg = make([]float64, len(lg))
	for k, l := range lg {
		out.lg[k] = l // −Inf stays −Inf
		if !math.IsInf(l, -1) {
			out.lg[k] = interval.AddDown(interval.SubDown(l, gB), r.gamma)
		}
	}
	return out, nil
}

// leading returns the leading n×n block of a.
func leading(a *enclose.Sym, n int) *enclose.Sym {
	b := enclose.NewSym(n)
	for i := 0; i < n; i++ {
		for j := 0; j <= i; j++ {
			b.Set(i, j, a.At(i, j))
		}
	}
	return b
}

// shiftedProjectionLower returns a float ≤ c + f(Λ_h − c) for every
// Λ_h ≥ lh, f(x) = x/(1 + C²x) with C ∈ ch: the CR pencil's eigenvalues
// are μ_h + c with μ_h ≥ 0 those of the Laplacian part, and Λ ≥ c + f(μ_h)
// (fem/tri, Projection.Matrices). As g(c) = c + f(lh − c) increases in c
// (f′ ≤ 1), any 0 ≤ c ≤ the form's constant is sound, and c = 0 is the
// plain bound f(Λ_h) used for ECR.
func shiftedProjectionLower(lh, c float64, ch interval.I) float64 {
	if c == 0 {
		return enclose.ProjectionLower(lh, ch)
	}
	mu := math.Max(interval.SubDown(lh, c), 0)
	return interval.AddDown(enclose.ProjectionLower(mu, ch), c)
}

// verifiedSparseLower returns a float ℓ ≥ lo with λ_{h,index} ≥ ℓ for every
// member of ([K], [M]): shifts σ just below the approximation are tried
// until the verified count (sparse.CountBelow; package enclose/sparse,
// Verified counts) shows at most
// index − 1 eigenvalues below the corrected shift σ', and then
// λ_{h,index} ≥ σ'. lo must be a known lower bound (0, or the bound of the
// previous index; the stage-A pencil is positive semidefinite since
// c_T ≥ 0 and α ≥ 0).
func verifiedSparseLower(c *sparse.Counter, mMin, approx, lo float64, index int) float64 {
	delta := 1e-10 * approx
	for try := 0; try < 12 && approx-delta > lo; try++ {
		n, sigmaPrime, ok := c.CountBelow(mMin, approx-delta)
		if ok && n <= index-1 {
			return max(sigmaPrime, lo)
		}
		delta *= 10
	}
	return lo
}

// sliceStageA fills lhs[solved:] (0-based: lhs[i] bounds λ_{h,i+1})
// with verified lower bounds of the stage-A eigenvalues beyond the
// first solved ones, whose bounds lhs[:solved] are given (lastApprox
// approximates λ_{h,solved}), by spectrum slicing: a verified count
// (sparse.Counter.CountBelow, package enclose/sparse, Verified counts)
// showing at most n eigenvalues below σ′ gives λ_{h,j} ≥ σ′ for every
// j ≥ n + 1, and λ_{h,j} ≥ λ_{h,solved} ≥ lhs[solved−1] for every
// j ≥ solved. Each bound is the largest such σ′ found. One count per
// index costs one sparse factorization, where approximate eigenpairs
// of many indices would cost a block of vectors each.
//
// The shifts are choices: the Ritz upper bounds ritz[j−1] of Λ_j, scaled
// by lastApprox/ritz[solved−1] (the ratio of the discrete to the exact
// eigenvalue at the last solved index), estimate λ_{h,j}; the shift for
// index j lies a quarter of the estimated spacing below the estimate of
// λ_{h,j}, and half-way down the spacing when that counted too many. At
// most maxSliceCounts indices get shifts of their own (every stride-th
// from the last; the others keep the bound of a lower shift).
func sliceStageA(c *sparse.Counter, mMin, lastApprox float64, ritz, lhs []float64, solved int) {
	ratio := lastApprox / ritz[solved-1]
	est := func(j int) float64 { // estimate of λ_{h,j}, j > solved
		if j == solved {
			return lastApprox
		}
		if j <= len(ritz) {
			return ratio * ritz[j-1]
		}
		n := len(ritz) // extrapolate linearly past the last Ritz bound
		return ratio * (2*ritz[n-1] - ritz[n-2])
	}
	for j := solved + 1; j <= len(lhs); j++ {
		lhs[j-1] = lhs[solved-1]
	}
	// At most maxSliceCounts indices, every stride-th down from the last,
	// get a count of their own.
	stride := (len(lhs) - solved + maxSliceCounts - 1) / maxSliceCounts
	for j := len(lhs); j > solved; j -= stride {
		lo, hi := est(j-1), est(j)
		for _, frac := range []float64{0.25, 0.5} {
			sigma := hi - frac*(hi-lo)
			if !(sigma > lhs[j-1]) {
				break
			}
			n, sp, ok := c.CountBelow(mMin, sigma)
			if !ok {
				continue
			}
			for i := max(n, solved); i < len(lhs); i++ { // λ_{h,i+1} ≥ σ′ for i + 1 ≥ n + 1
				lhs[i] = max(lhs[i], sp)
			}
			if n <= j-1 {
				break
			}
		}
	}
}

// maxSliceCounts bounds the shifts of sliceStageA (measured on the 1:200
// rectangle: 1.3 s per count with 6·10⁵ stage-A unknowns).
const maxSliceCounts = 32

// usesCR reports whether the plain Crouzeix–Raviart space serves stage A:
// it is chosen for constant V and no Neumann side (a choice: both spaces
// are sound for every V and side condition, package fem/tri doc); otherwise the
// enriched space (which also preserves element means) is used.
func usesCR(p *problem.Problem) bool {
	poly, ok := p.Potential.Polynomial()
	if !ok || poly.Degree() > 0 {
		return false
	}
	for _, bc := range p.Boundary {
		if c := bc.Condition(); !c.Essential() && !c.HasTerm() {
			return false
		}
	}
	return true
}

// sideConditions converts the problem's per-side conditions to those of
// the sides of the first mesh's polygon (startMesh).
func sideConditions(p *problem.Problem) []boundary.Condition {
	f := startMesh(p)
	bcs := make([]boundary.Condition, len(f.side))
	for j, i := range f.side {
		bcs[j] = p.Boundary[i].Condition()
	}
	return bcs
}

// polygonMesh triangulates the polygon (startMesh), refines it uniformly
// `levels` times and grades it `graded` more levels toward every singular
// corner.
func polygonMesh(p *problem.Problem, levels, graded int) (*mesh.Mesh, error) {
	f := startMesh(p)
	m, err := mesh.FromPolygon(f.verts, f.tris)
	if err != nil {
		return nil, err
	}
	for i := 0; i < levels; i++ {
		m = m.Refine()
	}
	if graded > 0 {
		for _, c := range singularCorners(p) {
			m = m.RefineGraded(f.vertex[c], graded)
		}
	}
	return m, nil
}

// trialMesh is the mesh of the trial space and the fluxes: polygonMesh
// followed by the recipe's adaptive rounds (mesh.RefineMarked).
func trialMesh(p *problem.Problem, r recipe) (*mesh.Mesh, error) {
	m, err := polygonMesh(p, r.refine, r.graded)
	if err != nil {
		return nil, err
	}
	for round, marks := range r.marks {
		marked := make([]bool, len(m.Tris))
		for _, t := range marks {
			if t < 0 || t >= len(m.Tris) {
				return nil, fmt.Errorf("adaptive round %d marks triangle %d of %d", round+1, t, len(m.Tris))
			}
			marked[t] = true
		}
		m = m.RefineMarked(marked)
	}
	return m, nil
}

// dorflerMarks returns the fewest triangles (largest indicators first, ties
// by index) whose indicators sum to at least θ of the total (Dörfler
// marking, W. Dörfler, SIAM J. Numer. Anal. 33 (1996)), in increasing
// order; a choice of where to refine.
func dorflerMarks(eta []float64, theta float64) []int {
	idx := make([]int, len(eta))
	total := 0.0
	for i, e := range eta {
		idx[i] = i
		total += e
	}
	sort.SliceStable(idx, func(a, b int) bool { return eta[idx[a]] > eta[idx[b]] })
	var out []int
	acc := 0.0
	for _, i := range idx {
		if acc >= theta*total && len(out) > 0 {
			break
		}
		out = append(out, i)
		acc += eta[i]
	}
	sort.Ints(out)
	return out
}

// reentrantCorners lists the vertices with interior angle > π: for a
// counterclockwise polygon, those where the turn (v_i − v_{i−1}) × (v_{i+1} − v_i)
// is negative. The sign is only used to choose where to grade the mesh.
func reentrantCorners(p *problem.Problem) []int {
	var out []int
	for i := range p.Vertices {
		if cross, _ := cornerTurn(p, i); cross < 0 {
			out = append(out, i)
		}
	}
	return out
}

// singularCorners lists the vertices near which eigenfunctions are
// singular, where the driver grades the mesh: near a corner of interior
// angle θ they behave like r^(π/θ) when both sides are Dirichlet or both
// not (Neumann, Robin), and like r^(π/(2θ)) when exactly one side is
// Dirichlet (Grisvard, Elliptic Problems in Nonsmooth Domains, Pitman
// 1985, §§4–5; Robin sides have the Neumann exponents), so gradients are
// unbounded for θ > π and for mixed corners with θ > π/2. The angle test
// is in floating point: it only chooses meshes.
func singularCorners(p *problem.Problem) []int {
	n := len(p.Vertices)
	var out []int
	for i := range p.Vertices {
		cross, dot := cornerTurn(p, i)
		mixed := p.Boundary[(i+n-1)%n].Condition().Essential() != p.Boundary[i].Condition().Essential()
		// θ > π/2 ⇔ the edges' outgoing directions from v_i have a negative dot product or the corner is re-entrant.
		if cross < 0 || (mixed && dot < 0) {
			out = append(out, i)
		}
	}
	return out
}

// cornerTurn returns the turn (v_i − v_{i−1}) × (v_{i+1} − v_i) and the dot
// product (v_{i−1} − v_i)·(v_{i+1} − v_i) at vertex i (midpoints).
func cornerTurn(p *problem.Problem, i int) (cross, dot float64) {
	n := len(p.Vertices)
	a, b, c := p.Vertices[(i+n-1)%n], p.Vertices[i], p.Vertices[(i+1)%n]
	ax, ay := a[0].Val.Mid(), a[1].Val.Mid()
	bx, by := b[0].Val.Mid(), b[1].Val.Mid()
	cx, cy := c[0].Val.Mid(), c[1].Val.Mid()
	cross = (bx-ax)*(cy-by) - (by-ay)*(cx-bx)
	dot = (ax-bx)*(cx-bx) + (ay-by)*(cy-by)
	return cross, dot
}
