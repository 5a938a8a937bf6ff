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
type polygon struct{ p *problem.Problem }

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
	ma, err := polygonMesh(d.p, r.stageARefine, r.graded)
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
	m, err := polygonMesh(d.p, r.stageARefine, r.graded)
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
