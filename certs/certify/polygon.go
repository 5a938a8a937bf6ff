package certify

import (
	"errors"
	"fmt"
	"math"
	"sort"

	"gapcert/certs/certify/proof"
	"gapcert/fem/boundary"
	"gapcert/fem/discrete"
	"gapcert/fem/mesh"
	"gapcert/fem/problem"
	"gapcert/fem/tri"
	"gapcert/interval"
)

// This file is the choosing side of polygons: the meshes and spaces of a
// recipe (package fem/tri through fem/discrete), where to grade and mark;
// polygon_refine.go chooses the next recipe. Nothing here is a bound.

// polygon is the discretisation of a problem on a polygon: conforming
// P_p on a triangle mesh for Rayleigh–Ritz, (enriched) Crouzeix–Raviart
// elements on another for stage A, Raviart–Thomas fluxes on the trial
// mesh for stage B, which has its own shift γ_B ≥ γ.
//
// hist is what the driver measured of the steps of one run (nil when no
// run is behind the choice, as in Check: the choice then rests on the
// priors of chooseStep); Certify creates it for polygons with singular
// corners (discretisationOf).
type polygon struct {
	p    *problem.Problem
	hist *stepHistory
}

// first: P_4 on the first mesh refined once, RT_3 fluxes, stage A on
// three refinements.
func (polygon) first(taylor int, scale float64) recipe {
	return recipe{degree: 4, fluxDegree: 3, taylor: min(taylor, polygonModelOrder), weightTaylor: polygonWeightOrder,
		scale: scale, refine: 1, stageARefine: 3, extra: defaultExtraIndices}
}

// fluxShift: stage B on polygons has its own shift γ_B ≥ γ. Its weight
// 1/(V + γ_B) is modelled by Taylor models on triangles, whose remainders
// shrink like (h·|∇V|/(V + γ_B))^(order+1): keeping V + γ_B ≥ 2 osc V
// makes them converge on coarse meshes, while stage A keeps the small γ
// (its projection bound loses accuracy like C_h²(λ + γ)). Measured on a
// trapezoid with V = x² + y² (osc 2.5) at degree 6: γ = 1.6 gives no
// stage-B bound below 128 triangles, 6.3 relative width 9e-6 at 32 and
// 9e-10 at 128. Any γ_B ≥ γ is sound (a choice; inf V and sup V here are
// only enclosure ends).
func (polygon) fluxShift(gamma, inf, sup float64) float64 {
	if osc := sup - inf; osc > 0 && !math.IsInf(osc, 0) {
		if gb := roundShift(interval.SubUp(2*osc, inf)); gb > gamma && !math.IsInf(gb, 0) {
			return gb
		}
	}
	return gamma
}

// located: approximate stage-A eigenvalues locate the shifts of the
// verified counts of the first indices (at most the default count); the
// further ones are bounded by slicing (sliceStageA), which needs no
// eigenvectors.
func (d polygon) located(want int) int {
	return min(want, d.p.Eigenvalues+defaultExtraIndices+1)
}

func (d polygon) trial(r recipe, out *outcome) (discrete.Trial, error) {
	out.polygon = &polygonRecord{}
	m, err := trialMesh(d.p, r)
	if err != nil {
		return nil, err
	}
	pot, err := tri.NewPotential(m, d.p.Potential, r.taylor)
	if err != nil {
		return nil, err
	}
	out.polygon.triangles = len(m.Tris)
	return tri.NewTrial(tri.NewLagrange(m, r.degree, sideConditions(d.p)), pot), nil
}

func (d polygon) stageA(r recipe, gamma interval.I, _ []float64, located int, out *outcome) (discrete.StageA, error) {
	ma, err := polygonMesh(d.p, r.stageARefine, stageACorners(d.p, r))
	if err != nil {
		return nil, err
	}
	potA, err := tri.NewPotential(ma, d.p.Potential, min(r.taylor, stageATaylor))
	if err != nil {
		return nil, err
	}
	bcs := sideConditions(d.p)
	var proj *tri.Projection
	if usesCR(d.p) {
		proj, out.polygon.stageASpace = tri.NewCR(ma, bcs), "crouzeix-raviart"
	} else {
		proj, out.polygon.stageASpace = tri.NewECR(ma, bcs), "enriched-crouzeix-raviart"
	}
	out.polygon.stageATriangles = len(ma.Tris)
	out.polygon.stageAUnknowns = proj.N()
	want := d.p.Eigenvalues + r.extra
	if proj.N() < want+1 {
		return nil, fmt.Errorf("the stage-A space of dimension %d is too small for %d eigenvalues (refine its mesh)", proj.N(), want+1)
	}
	return tri.NewStageA(proj, potA, gamma, located)
}

// search: a sparse factorization costs much, so the first shift that
// verifies is kept, starting just below the approximation.
func (polygon) search() discrete.ShiftSearch {
	return discrete.ShiftSearch{First: 1e-10, Factor: 10, Tries: 12}
}

// stageBShift: stage B on polygons uses its own shift γ_B (recipe
// fluxGamma; γ when it is 0), chosen in initialRecipe.
func (polygon) stageBShift(r recipe) proof.StageBShift {
	gB := r.fluxGamma
	if gB == 0 {
		gB = r.gamma
	}
	return proof.StageBShift{Gamma: r.gamma, GammaB: gB, Own: true}
}

func (d polygon) flux(r recipe, t discrete.Trial, gammaB interval.I) (discrete.Flux, error) {
	return tri.NewFluxSpace(t.(*tri.Trial), r.fluxDegree, sideConditions(d.p), gammaB, r.weightTaylor)
}

func (polygon) signFailure(err error) (interval.I, bool) {
	var sign *tri.SignError
	if errors.As(err, &sign) {
		return sign.Range, true
	}
	return interval.I{}, false
}

// cellLower returns min over the triangles of the first stage-A mesh of
// the lower end of the enclosure of V there.
func (d polygon) cellLower(r recipe) (float64, error) {
	m, err := polygonMesh(d.p, r.stageARefine, stageACorners(d.p, r))
	if err != nil {
		return 0, err
	}
	pot, err := tri.NewPotential(m, d.p.Potential, min(r.taylor, stageATaylor))
	if err != nil {
		return 0, err
	}
	lo := math.Inf(1)
	for t := range m.Tris {
		lo = math.Min(lo, pot.Range(t).Lo)
	}
	return lo, nil
}

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
// `levels` times and grades it toward each of the corners by its levels.
func polygonMesh(p *problem.Problem, levels int, corners []corner) (*mesh.Mesh, error) {
	f := startMesh(p)
	m, err := mesh.FromPolygon(f.verts, f.tris)
	if err != nil {
		return nil, err
	}
	for i := 0; i < levels; i++ {
		m = m.Refine()
	}
	for _, c := range corners {
		if c.levels > 0 {
			m = m.RefineGraded(f.vertex[c.vertex], c.levels)
		}
	}
	return m, nil
}

// maxStageAGraded caps the grading levels of the stage-A mesh toward one
// corner. Measured on the L-shape (Dirichlet, Crouzeix–Raviart, relative
// deficit of the stage-A lower bound of λ1 at 3 to 6 uniform levels):
// grading gains up to 1.8× by 3 to 4 levels and nothing beyond 6; at 12
// levels the bounds widen (2× at 5 uniform levels, 30× at 6), at 16 to 20
// they are lost, and at 28 the verified lower bound of the mass matrix
// fails (triangles too small for float64).
const maxStageAGraded = 6

// stageACorners lists the corners toward which the stage-A mesh of r is
// graded, with their levels: the corners with ν < 1 (cornerExponent at
// degree 1), each by ⌈s·(1/ν − 1)⌉ + 1 levels for s = r.stageARefine, at
// most maxStageAGraded. Stage A only supplies ρ̂ and the slicing; its
// Crouzeix–Raviart eigenvalues converge like h² on smooth eigenfunctions
// (its projection bound has C_h² ∝ h² in any case, package fem/tri), and
// a corner term r^ν limits them to h_c^(2ν) on the corner element of size
// h_c (singularCorners), so h_c = h^(1/ν), s·(1/ν − 1) levels below the
// uniform mesh of size h ∝ 2^(−s), keeps the corner at the uniform rate
// (one level more as a margin); exponents ν > 1 do not limit a
// first-order space (common practice). On the L-shape this gives 3 to 4
// levels at 3 to 6 uniform levels, where the measured gain ends
// (maxStageAGraded). The levels depend only on the problem and
// r.stageARefine, not on the trial mesh's grading, so a check replays
// them and deep grading of the trial mesh leaves stage A verifiable.
func stageACorners(p *problem.Problem, r recipe) []corner {
	cs := singularCorners(p, 1, 0)
	for k := range cs {
		cs[k].levels = min(maxStageAGraded, 1+int(math.Ceil(float64(r.stageARefine)*(1/cs[k].nu-1)-exponentTolerance)))
	}
	return cs
}

// cornerVertices returns the vertices of the corners.
func cornerVertices(cs []corner) []int {
	var out []int
	for _, c := range cs {
		out = append(out, c.vertex)
	}
	return out
}

// hasSingularCorners reports whether the trial mesh of p is graded
// (trialCorners) at any grading depth.
func hasSingularCorners(p *problem.Problem) bool {
	return len(singularCorners(p, gradedDegree, 0)) > 0
}

// trialCorners lists the corners toward which the trial mesh of r is
// graded (singularCorners at the trial degree with r.graded levels for
// the strongest; at gradedDegree, whatever the recipe's degree).
func trialCorners(p *problem.Problem, r recipe) []corner {
	return singularCorners(p, gradedDegree, r.graded)
}

// trialMesh is the mesh of the trial space and the fluxes: polygonMesh
// followed by the recipe's adaptive rounds (mesh.RefineMarked).
func trialMesh(p *problem.Problem, r recipe) (*mesh.Mesh, error) {
	m, err := polygonMesh(p, r.refine, trialCorners(p, r))
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

// corner is a vertex near which eigenfunctions are singular, with the
// number of grading levels it gets (a choice).
type corner struct {
	vertex int     // index in p.Vertices
	nu     float64 // its leading singular exponent ν (cornerExponent)
	levels int     // grading levels toward it
}

// exponentTolerance: an exponent within this distance of an integer is
// taken as that integer (a choice; the angle comes from float64 midpoints
// of the exact vertices, accurate to about 1e-15 relative, so exact
// integer exponents such as π/(π/4) = 4 are never missed; a corner whose
// exponent is within 1e-9 of an integer k has a singular part
// r^k·(r^ε − 1) ≈ ε r^k log r of relative size ε ≤ 1e-9, which the trial
// space's polynomials approximate to far below that.)
const exponentTolerance = 1e-9

// cornerExponent returns the leading singular exponent ν of the corner at
// vertex i for trial degree p, and whether it is singular there: the least
// non-integer exponent below p of the harmonic functions r^ν Φ(θ) that
// satisfy the sides' conditions on a sector of the corner's interior angle
// ω, or false when every exponent below p is an integer (then the terms
// r^ν Φ(θ) are harmonic polynomials, Re or Im of z^ν, and do not limit
// P_p). Separation of variables in the sector 0 < θ < ω gives
// Φ” + ν²Φ = 0, and (Grisvard, Elliptic Problems in Nonsmooth Domains,
// Pitman 1985, ch. 4–5):
//
//	Dirichlet–Dirichlet  Φ = sin νθ          ν_k = kπ/ω,        k ≥ 1
//	Neumann–Neumann      Φ = cos νθ          ν_k = kπ/ω,        k ≥ 1 (k = 0: constants)
//	Dirichlet–Neumann    Φ = sin νθ, cos νθ  ν_k = (k − ½)π/ω,  k ≥ 1
//
// (D–N: Φ(0) = 0 gives sin νθ, Φ'(ω) = ν cos νω = 0 gives νω = (k − ½)π.)
// A Robin side acts as a Neumann side at leading order: with a constant
// coefficient the Robin term is one power of r smaller, and the expansion
// is the Neumann one plus shadow terms r^(ν+1)(log r)^q (Piña-León,
// Mantič, Jiménez-Alfaro, arXiv:2505.22585, 2025, for Dirichlet–Robin
// corners). The shadow terms and those of a potential V (also one power
// of r smaller) are left to the polynomials. The angle is computed in
// floating point from the vertices' midpoints: a choice of where to grade,
// never a bound.
func cornerExponent(p *problem.Problem, i, degree int) (float64, bool) {
	n := len(p.Vertices)
	omega := cornerAngle(p, i)
	dirichletBefore := p.Boundary[(i+n-1)%n].Condition().Essential()
	dirichletAfter := p.Boundary[i].Condition().Essential()
	return sectorExponent(omega, dirichletBefore != dirichletAfter, degree)
}

// cornerAngle returns the interior angle ω ∈ (0, 2π) at vertex i of the
// counterclockwise polygon (from the vertices' midpoints; a choice): the
// angle from the direction of the next vertex counterclockwise to that of
// the previous one.
func cornerAngle(p *problem.Problem, i int) float64 {
	n := len(p.Vertices)
	a, b, c := p.Vertices[(i+n-1)%n], p.Vertices[i], p.Vertices[(i+1)%n]
	bx, by := b[0].Val.Mid(), b[1].Val.Mid()
	nx, ny := c[0].Val.Mid()-bx, c[1].Val.Mid()-by // to the next vertex
	px, py := a[0].Val.Mid()-bx, a[1].Val.Mid()-by // to the previous vertex
	omega := math.Atan2(nx*py-ny*px, nx*px+ny*py)
	if omega <= 0 {
		omega += 2 * math.Pi
	}
	return omega
}

// singularCorners lists the corners at which eigenfunctions are singular
// for trial degree `degree` (cornerExponent), in vertex order,, with the grading levels of
// each when the strongest one (least ν) gets `graded` levels: corner c
// gets ⌈graded·ν_min/ν_c⌉. Near a corner the eigenfunction's singular term
// r^ν Φ(θ) is approximated on the corner's element of size h_c with an
// energy error ≈ h_c^ν whatever the degree, so the eigenvalue error it
// causes is ≈ h_c^(2ν); each grading level halves h_c, and with these
// levels every corner's contribution is about that of the strongest
// corner, h^(2ν_min) (common practice of graded meshes: Babuška, Kellogg,
// Pitkäranta, Numer. Math. 33 (1979) 447–471, recalled from memory). The
// recipe records only `graded`; the levels of the other corners follow
// from the problem and the degree, so a check replays them.
func singularCorners(p *problem.Problem, degree, graded int) []corner {
	var out []corner
	nuMin := math.Inf(1)
	for i := range p.Vertices {
		if nu, ok := cornerExponent(p, i, degree); ok {
			out = append(out, corner{vertex: i, nu: nu})
			nuMin = math.Min(nuMin, nu)
		}
	}
	for k := range out {
		out[k].levels = int(math.Ceil(float64(graded)*nuMin/out[k].nu - exponentTolerance))
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
