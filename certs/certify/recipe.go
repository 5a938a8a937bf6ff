package certify

import (
	"fmt"
	"math"

	"gapcert/fem/problem"
	"gapcert/interval"
)

// recipe is the input of one deterministic computation.
type recipe struct {
	degree int // p of the conforming trial space
	taylor int // order of the Taylor models of V
	gamma  float64
	scale  float64 // π²/D² rounded down; only for choosing shifts

	// fluxGamma is the shift γ_B ≥ γ of stage B on polygons and
	// polyhedra (0 on intervals, where stage B uses γ).
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
	// corners (both meshes). Polyhedra: uniform (Bey) refinements of the
	// cone tetrahedra for the trial space and for stage A.
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

// initialRecipe chooses the first mesh, degrees and Taylor order
// (discretisation.first), the shift γ and the shift of stage B
// (discretisation.fluxShift).
//
// The shift γ is an exact float64 with γ ≥ π²/D² − inf V, so that
// c = V + γ ≥ π²/D² > 0 on the domain (required by stage A, c_T ≥ 0, and by
// stage B, whose weight is 1/c). inf V is a verified lower bound of V over
// the whole domain. γ is negative when inf V > π²/D²: a potential bounded
// below by a large constant is shifted down to c ≥ π²/D², so that the
// shifted eigenvalues Λ_k = λ_k + γ stay of the size of the spectral gaps
// rather than of V (stage A loses accuracy like C_h²Λ_k, and Λ_k ≈ 1e8
// would leave no stage-A bound above the Ritz bounds). Every theorem used
// needs only c = V + γ ≥ 0 (stage A) or > 0 (stage B), never γ ≥ 0, and
// the bounds of λ_k = Λ_k − γ are rounded outward (assemble).
func initialRecipe(p *problem.Problem) (recipe, error) {
	vr := p.PotentialRange()
	if !vr.IsBounded() {
		return recipe{}, fmt.Errorf("the potential is not bounded on the domain: its enclosure is %v (hint: give a potential that is finite on the closed domain)", vr)
	}
	d := p.Diameter()
	scale := interval.Pi().Sqr().Div(d.Sqr()) // π²/D²
	if !(scale.Lo > 0) || !scale.IsBounded() {
		return recipe{}, fmt.Errorf("the domain's size (diameter %v) is outside what float64 can handle (hint: rescale the problem to a diameter near 1)", d)
	}
	taylor := modelOrder
	if poly, ok := p.Potential.Polynomial(); ok {
		taylor = max(poly.Degree(), 1) // exact model
	}
	dom := discretisationOf(p)
	r := dom.first(taylor, scale.Lo)
	// inf V ≥ both the enclosure over the domain and the least cell
	// enclosure over the first stage-A mesh (the cells tile the domain);
	// the larger one is the tighter bound.
	inf := vr.Lo
	if cells, err := cellLowerBound(p, r); err == nil {
		inf = math.Max(inf, cells)
	}
	g := interval.Point(inf).Neg().Add(scale).Hi
	if math.IsInf(g, 0) || math.IsNaN(g) {
		return recipe{}, fmt.Errorf("the potential's range %v is outside what float64 can handle (hint: rescale the potential or the domain)", vr)
	}
	r.gamma = roundShift(g)
	r.fluxGamma = dom.fluxShift(r.gamma, inf, vr.Hi)
	return r, nil
}

// cellLowerBound returns min over the cells (triangles) of the first
// stage-A mesh of the lower end of the enclosure of V there
// (discretisation.cellLower).
func cellLowerBound(p *problem.Problem, r recipe) (float64, error) {
	return discretisationOf(p).cellLower(r)
}

// roundShift returns a float ≥ g (of either sign) with a 24-bit
// significand (so that the certificate's γ is short, and γ exceeds g by
// less than 2⁻²³|g|); any float ≥ g is sound. Zero stays zero.
func roundShift(g float64) float64 {
	if g == 0 || math.IsInf(g, 0) || math.IsNaN(g) {
		return g
	}
	e := math.Ilogb(g)
	unit := math.Ldexp(1, e-23)
	return math.Ceil(g/unit) * unit
}

// raiseShift returns the next shift after the computation could not verify
// V + γ ≥ 0 (or > 0) on a cell whose enclosure of V + γ was failed. A
// nonnegative γ is doubled plus π²/D² (scale). A negative γ (V bounded
// below by a large constant) is raised by the deficit −failed.Lo of that
// cell plus scale, so that the shift keeps V's large constant removed; if
// the deficit is not finite, or the raised shift would exceed the
// nonnegative rule, the nonnegative rule applies from max(γ, 0). Any
// shift is sound (a choice); the next computation checks its hypotheses
// again.
func raiseShift(gamma, scale float64, failed interval.I) float64 {
	plain := roundShift(2*math.Max(gamma, 0) + scale)
	if gamma >= 0 {
		return plain
	}
	deficit := math.Max(-failed.Lo, 0)
	g := roundShift(interval.AddUp(gamma, interval.AddUp(deficit, scale)))
	if math.IsInf(g, 0) || math.IsNaN(g) || g > plain {
		return plain
	}
	return g
}

// raiseShifts returns r with its shifts raised after a computation could
// not verify V + γ ≥ 0 (stage A) or V + γ_B > 0 (stage B on polygons) on a
// cell whose enclosure was failed (raiseShift). On polygons the error does
// not say which of the two checks failed, so both shifts are raised, and
// γ_B is kept ≥ γ: a raised γ above the old γ_B would otherwise be
// recorded with flux_gamma < gamma, which Check refuses, and a failure of
// stage B's check would recur however often γ alone is raised. Any shifts
// are sound (a choice); the next computation checks its hypotheses again.
func raiseShifts(r recipe, dim int, failed interval.I) recipe {
	r.gamma = raiseShift(r.gamma, r.scale, failed)
	if dim >= 2 {
		r.fluxGamma = math.Max(raiseShift(r.fluxGamma, r.scale, failed), r.gamma)
	}
	return r
}

// modelOrder is the Taylor order of the models of a non-polynomial V and of
// the weight 1/(V + γ). Measured on the Mathieu case (V = 2cos 2x on (0, π),
// 16 cells, degree 8): the Lehmann–Goerisch width falls from 1e-6 at order 6
// to 2.5e-13 at order 14 and rises again beyond it as the interval
// coefficients of high-order models widen; refinement of the mesh shrinks
// the remainder instead.
const modelOrder = 14

// polygonModelOrder is the Taylor order of the models of a non-polynomial
// V on triangles (stage A needs only ranges; the Ritz matrices converge
// at the rate of the P_p space, which the remainder must not spoil).
const polygonModelOrder = 8

// polygonWeightOrder is the Taylor order of the models of 1/(V + γ) on
// triangles. Their remainder enters the Lehmann–Goerisch matrix A2 times
// ‖ũ + div σ‖², so it limits the lower bounds: measured on a trapezoid
// with V = x² + y² and 128 triangles, the stage-B deficit of λ1 is 9e-5 at
// order 8, 6e-6 at 12 and 4e-7 at 16 (the cost grows like the order²).
const polygonWeightOrder = 12
