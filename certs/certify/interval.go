package certify

import (
	"errors"
	"fmt"
	"math"

	"gapcert/certs/certify/proof"
	"gapcert/fem/boundary"
	"gapcert/fem/discrete"
	"gapcert/fem/line"
	"gapcert/fem/problem"
	"gapcert/interval"
)

// This file is the choosing side of intervals: the meshes and spaces of a
// recipe (package fem/line through fem/discrete) and the choice of the
// next recipe. Nothing here is a bound.

// intervalDomain is the discretisation of a problem on an interval: P_p on
// a uniform mesh for Rayleigh–Ritz, the mean-preserving P2 space on a
// finer uniform mesh for stage A, continuous P_q fluxes on the trial mesh
// for stage B.
type intervalDomain struct{ p *problem.Problem }

func (d intervalDomain) trial(r recipe, _ *outcome) (discrete.Trial, error) {
	mesh := intervalMesh(d.p, r.cells)
	pot, err := line.FromExpr(mesh, d.p.Potential, r.taylor)
	if err != nil {
		return nil, err
	}
	left, right := ends(d.p)
	return line.NewTrial(line.NewLagrange(mesh, r.degree, left, right), pot), nil
}

// first: P_8 on 8 cells, fluxes of degree 9, stage A on
// firstStageACells cells.
func (intervalDomain) first(taylor int, scale float64) recipe {
	return recipe{cells: 8, degree: 8, fluxDegree: 9, taylor: taylor, weightTaylor: modelOrder, stageACells: firstStageACells, scale: scale,
		extra: defaultExtraIndices}
}

// fluxShift: stage B on intervals uses γ.
func (intervalDomain) fluxShift(_, _, _ float64) float64 { return 0 }

// located: every stage-A index is located by bisection.
func (intervalDomain) located(want int) int { return want }

func (d intervalDomain) stageA(r recipe, gamma interval.I, ritz []float64, _ int, _ *outcome) (discrete.StageA, error) {
	mesh := intervalMesh(d.p, r.stageACells)
	// Only the cell ranges of V matter here; a low-order model gives them.
	pot, err := line.FromExpr(mesh, d.p.Potential, min(r.taylor, stageATaylor))
	if err != nil {
		return nil, err
	}
	left, right := ends(d.p)
	return line.NewStageA(line.NewMeanP2(mesh, left, right), pot, gamma, ritz)
}

// search: the banded factorizations are cheap, so many shifts stepping
// away geometrically from the bisected eigenvalue are tried and the best
// verified σ′ is kept; the search stops once eight verified shifts in a
// row did not improve (measured on (0, 1), Dirichlet, 256 cells: three
// were too few for λ_{h,2}).
func (intervalDomain) search() discrete.ShiftSearch {
	return discrete.ShiftSearch{First: 1e-13, Factor: 4, Tries: 30, Stale: 8}
}

// stageBShift: stage B on intervals uses γ itself.
func (intervalDomain) stageBShift(r recipe) proof.StageBShift {
	return proof.StageBShift{Gamma: r.gamma, GammaB: r.gamma}
}

func (d intervalDomain) flux(r recipe, t discrete.Trial, gammaB interval.I) (discrete.Flux, error) {
	left, right := ends(d.p)
	return line.NewFluxSpace(t.(*line.Trial), r.fluxDegree, left, right, gammaB, r.weightTaylor)
}

func (intervalDomain) signFailure(err error) (interval.I, bool) {
	var sign *line.SignError
	if errors.As(err, &sign) {
		return sign.Range, true
	}
	return interval.I{}, false
}

// memory: interval problems are small.
func (intervalDomain) memory(recipe) int64 { return 0 }

// stalls: on intervals the widths stall when two steps in a row with
// stage B gain less than stallGain while the best width is below
// stallWidth (where float64 rounding, growing with the mesh, outweighs
// the discretization error: measured on the harmonic oscillator, the best
// relative width 4e-13 at 128 cells grows to 2e-11 at 4096).
func (intervalDomain) stalls(gain float64, out *outcome, best *result) bool {
	return gain < stallGain && out.lg != nil && best.worst() < stallWidth
}

func (intervalDomain) stallSteps() int { return 2 }

const stallWidth = 1e-10

func (intervalDomain) stallNote() string {
	return "; near relative width 1e-12 the float64 rounding of finer meshes outweighs their gain"
}

// next raises the degree up to 10, then halves the cells; while stage B
// cannot start, it refines both the stage-A mesh and the trial mesh
// (either may keep the stage-A bound of λ_{N+1} below the Ritz bound of
// λ_N: stage A converges like h², and the Ritz matrices are widened by
// the Taylor remainders of V, which shrink with the cells).
func (d intervalDomain) next(r recipe, out *outcome, _ float64) (recipe, string) {
	p := d.p
	if out.n == 0 {
		grew := false
		if r.stageACells < maxStageACells && meshable1D(p, 4*r.stageACells) {
			r.stageACells *= 4
			grew = true
		}
		if r.cells < maxCells && meshable1D(p, 2*r.cells) {
			r.cells *= 2
			grew = true
		}
		if !grew {
			return r, StopNoSeparation
		}
		return r, ""
	}
	switch {
	case r.degree < 10:
		r.degree += 2
	case r.cells < maxCells && meshable1D(p, 2*r.cells):
		r.cells *= 2
	default:
		return r, StopCap
	}
	r.fluxDegree = r.degree + 1
	return r, ""
}

// cellLower returns min over the cells of the first stage-A mesh of the
// lower end of the enclosure of V there.
func (d intervalDomain) cellLower(r recipe) (float64, error) {
	mesh := intervalMesh(d.p, r.stageACells)
	pot, err := line.FromExpr(mesh, d.p.Potential, min(r.taylor, stageATaylor))
	if err != nil {
		return 0, err
	}
	lo := math.Inf(1)
	for k := 0; k < mesh.Cells(); k++ {
		lo = math.Min(lo, pot.Range(k).Lo)
	}
	return lo, nil
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

// Caps of the 1D meshes: trial cells and stage-A cells.
const (
	maxCells       = 1 << 12
	maxStageACells = 1 << 16
)

// minRelativeCell is the smallest cell length, relative to the largest
// |endpoint|, of a 1D mesh: cells must span many float64 spacings so that
// the node enclosures stay disjoint and narrow (an interval such as
// (1e15, 1e15 + 1) cannot be meshed in float64 near 1e15).
const minRelativeCell = 1e-9

// checkMeshable refuses an interval too short for its distance from 0 to
// be meshed in float64 (its first stage-A mesh would not be meshable1D).
func checkMeshable(p *problem.Problem) error {
	if p.Dim != 1 || meshable1D(p, firstStageACells) {
		return nil
	}
	return fmt.Errorf("certify: the interval (%s, %s) is too short for its distance from 0: float64 cannot mesh it (hint: translate the variable: take the interval (0, L), L its length, and replace x by x + %s in the potential)",
		p.Interval[0].Text, p.Interval[1].Text, p.Interval[0].Text)
}

// firstStageACells is the number of stage-A cells of the first 1D recipe
// (the finest first mesh; see initialRecipe).
const firstStageACells = 256

// meshable1D reports whether the interval can be divided into n uniform
// cells of length at least minRelativeCell times the largest |endpoint|
// (a choice; float midpoints).
func meshable1D(p *problem.Problem, n int) bool {
	a, b := p.Interval[0].Val.Mid(), p.Interval[1].Val.Mid()
	scale := math.Max(math.Abs(a), math.Abs(b))
	return (b-a)/float64(n) >= minRelativeCell*scale
}
