package certify

import (
	"fmt"
	"math"

	"gapcert/certs"
	"gapcert/certs/hypothesis"
	"gapcert/fem/claim/named"
	"gapcert/fem/problem"
	"gapcert/fem/tri"
	"gapcert/interval"
	"gapcert/interval/decimalio"
	"gapcert/interval/formula"
	"gapcert/temple/groundstate"
)

// The ground state on a polygon (results.ground_state). Every number
// reported is a bound from package temple/groundstate; the floating-point
// search of groundstate_polygon_search_approx.go only chooses where to look.
//
// The chain, for the approximate ground state ũ (the trial function with
// coefficients in.u) and u = P₁ũ its projection on the first eigenspace:
//
//  1. (E1) of package temple/groundstate with the certified λ1 and λ2
//     (not the cluster form: P₁ must be the projection on the eigenspace of
//     a simple λ1) gives ‖ũ − u‖² ≤ L·‖ũ‖², so E := √(L·‖ũ‖²) bounds
//     ‖ũ − u‖_{L²(Ω)}, hence on every disc.
//  2. Pythagoras: ũ − u ⊥ u, so ‖u‖² = ‖ũ‖² − ‖ũ − u‖² ∈ ‖ũ‖²·[1 − L, 1].
//  3. At a point x0 inside a mesh triangle, the largest disc inside it
//     (groundstate.InscribedRadius), the polynomial of ũ there
//     (tri.Lagrange.Monomials) and E give an enclosure of u(x0)
//     (groundstate.EnclosePoint). Divided by ‖u‖ it encloses the value of
//     u/‖u‖, the ground state with unit L² norm, up to the sign of u.
//  4. Sign: u = cφ1 with φ1 ≥ 0 (λ1 simple); an enclosure of u(x0) with a
//     positive lower end shows c > 0. Without one the values are reported
//     symmetrised (the hull of ±enclosure), which holds for either sign.
//  5. Witness: groundstate.CertifyMidpoint on a triple x, y, m = (x + y)/2
//     shows u(m)² < u(x)u(y); with Ω convex (decided by certs/hypothesis)
//     the ground state is not log-concave. The margin is reported for u/‖u‖:
//     (u(x)u(y) − u(m)²)/‖u‖².
//
// Two dimensions never give a proof of log-concavity here: without a
// witness the verdict is undecided.

// polygonCandidates is how many of the best float candidates are certified.
const polygonCandidates = 8

// groundStatePolygon certifies the ground-state block of a polygon problem
// with the values at the problem's points.
func groundStatePolygon(in groundStateInputs) (*certs.GroundState, error) {
	points, err := polygonPoints(in.p)
	if err != nil {
		return nil, err
	}
	return polygonGroundState(in, points)
}

// polygonPoints returns the problem's points as coordinate pairs, or an
// error naming the first point whose coordinates are not float64 values
// exactly (the disc enclosures are centred at float points). Certify calls
// it before computing anything.
func polygonPoints(p *problem.Problem) ([][2]problem.Number, error) {
	var out [][2]problem.Number
	for i, pt := range p.Points {
		if len(pt) != 2 || !pt[0].Val.IsPoint() || !pt[1].Val.IsPoint() {
			return nil, fmt.Errorf("points[%d] is not a pair of binary floating-point numbers (hint: give coordinates such as 0.5 or 0.375 = 3/8, sums of powers of 2)", i)
		}
		out = append(out, [2]problem.Number{pt[0], pt[1]})
	}
	return out, nil
}

// polygonGroundState is groundStatePolygon with the points at which the
// values of the ground state are reported (exact coordinates; each must be
// a pair of float64 values exactly, else an error names it).
func polygonGroundState(in groundStateInputs, points [][2]problem.Number) (*certs.GroundState, error) {
	trial, ok := in.trial.(*tri.Trial)
	if !ok {
		return nil, fmt.Errorf("the ground state of a polygon needs a conforming triangle trial space, not %T", in.trial)
	}
	centres := make([][2]float64, len(points))
	for i, pt := range points {
		if !pt[0].Val.IsPoint() || !pt[1].Val.IsPoint() {
			return nil, fmt.Errorf("points[%d] = (%s, %s) is not a pair of binary floating-point numbers (hint: give coordinates such as 0.5 or 0.375 = 3/8, sums of powers of 2)", i, pt[0].Text, pt[1].Text)
		}
		centres[i] = [2]float64{pt[0].Val.Lo, pt[1].Val.Lo}
	}
	gs := &certs.GroundState{Normalization: certs.NormalizationL2, LogConcavity: certs.Undecided}

	// 1. The L² error bound. EigenvectorError needs ‖ũ‖² > 0 (as
	// groundStateL2, which gives the reason for the block).
	if !in.norm2.Positive() || !in.energy.IsBounded() {
		gs.Reason = "no values and no verdict without an L2 error bound"
		return gs, nil
	}
	aUU := in.energy.Sub(in.norm2.MulF(in.gamma))
	ve, err := groundstate.EigenvectorError(aUU, in.norm2, in.lambda1, in.lambda2, in.gamma)
	if err != nil {
		// A *NotSeparatedError; groundStateL2 gives its numbers.
		gs.Reason = "lambda1 is not shown to be separated from lambda2: no values and no verdict are given"
		return gs, nil
	}
	if !(ve.L2 < 1) {
		gs.Reason = fmt.Sprintf("the L2 error bound of the approximate ground state (%.3g relative) is too wide to say anything", math.Sqrt(ve.L2))
		return gs, nil
	}
	rel, _ := interval.Point(ve.L2).Sqrt()
	gs.L2Error = decimalio.FormatUpper(rel.Hi, Digits)
	errL2, _ := interval.Point(ve.L2).Mul(interval.Point(in.norm2.Hi)).Sqrt()
	// 2. ‖u‖ ∈ ‖ũ‖·√[1 − L, 1].
	normU2 := in.norm2.Mul(interval.New(interval.SubDown(1, ve.L2), 1))
	normU, _ := normU2.Sqrt()

	gd := &polygonGS{space: trial.Space, vec: in.u, v: in.p.Potential, lambda: in.lambda1, errL2: errL2.Hi}
	// ũ has the sign of the float eigenvector; the search wants ũ > 0
	// inside. Negating the vector (exact) negates P₁ũ and keeps every
	// bound above, so the enclosures below are of P₁ of the oriented ũ.
	gd.orient()

	// 3.–5. The witness search.
	convex := hypothesis.ConvexDomain(in.p)
	best, tried, skipped, err := gd.bestTriple()
	if err != nil {
		return nil, err
	}
	skipNote := ""
	if skipped > 0 {
		skipNote = fmt.Sprintf("; %d of the %d candidate triples tried were skipped: V could not be modelled on one of their discs", skipped, tried)
	}
	signKnown := false
	if best != nil {
		signKnown = best.res.X.U.Positive() || best.res.Y.U.Positive() || best.res.M.U.Positive()
	}
	// Points.
	vals := make([]interval.I, len(centres))
	for i, c := range centres {
		pe, err := gd.enclose(c)
		if err != nil {
			return nil, err
		}
		vals[i] = pe
		signKnown = signKnown || pe.Positive()
	}
	normalise := func(x interval.I) interval.I {
		if !signKnown {
			x = x.Hull(x.Neg())
		}
		return x.Div(normU)
	}
	for i, pt := range points {
		gs.Points = append(gs.Points, certs.PointValue{At: []string{pt[0].Text, pt[1].Text}, Value: bound(normalise(vals[i]))})
	}
	if best == nil {
		gs.Reason = fmt.Sprintf("no candidate triple could be enclosed (%d tried); log-concavity is not decided in two dimensions without a witness", tried) + skipNote
		return gs, nil
	}
	r := best.res
	margin := interval.New(r.Margin, interval.SubUp(r.X.U.Mul(r.Y.U).Hi, r.M.U.Sqr().Lo)).Div(normU2)
	mb := bound(margin)
	switch {
	case r.Certified && convex.Verdict == certs.Proven:
		gs.LogConcavity = certs.Disproven
		gs.Reason = "certified triple u((x+y)/2)^2 < u(x)u(y) with u(x), u(y) > 0 on a convex domain: log u is not concave on the segment [x, y]; " +
			"lambda1 is simple (separated from lambda2) and the three values are of the same u, the projection of the approximate ground state on the first eigenspace"
		gs.Witness = &certs.ShapeWitness{Kind: certs.WitnessMidpoint,
			Points: [][]string{exactPoint(best.x), exactPoint(best.y), exactPoint(best.m)},
			Values: []certs.Bound{bound(normalise(r.X.U)), bound(normalise(r.Y.U)), bound(normalise(r.M.U))},
			Margin: mb}
	case r.Certified:
		gs.Margin = &mb
		gs.Reason = "a triple with u((x+y)/2)^2 < u(x)u(y) is certified, but the domain is not shown convex (" + convex.Verdict + ": " + convex.Detail +
			"), so it does not show that the ground state is not log-concave; log-concavity is not decided in two dimensions without a witness"
	default:
		gs.Margin = &mb
		gs.Reason = fmt.Sprintf("no certified witness among the %d best candidates of the search; the margin is the best candidate's (x = (%s), y = (%s)); "+
			"log-concavity is not proven in two dimensions", tried, joinPoint(best.x), joinPoint(best.y))
		if bl := brascampLieb(in.p); bl != "" {
			gs.Reason += "; " + bl
		}
	}
	gs.Reason += skipNote
	return gs, nil
}

// brascampLieb returns a note naming the theorem that gives log-concavity
// when its hypotheses are decided (convex domain, Dirichlet conditions,
// convex V), else "".
func brascampLieb(p *problem.Problem) string {
	for _, name := range []string{named.ConvexDomain, named.DirichletBoundary, named.ConvexPotential} {
		h, ok := hypothesis.Decide(name, p)
		if !ok || h.Verdict != certs.Proven {
			return ""
		}
	}
	return "the ground state is log-concave by Brascamp and Lieb (J. Funct. Anal. 22 (1976)): convex domain, Dirichlet conditions and convex V are proven; the verdict field records only what was certified here"
}

// polygonGS holds what the enclosures of u = P₁ũ on a polygon share.
type polygonGS struct {
	space  *tri.Lagrange
	vec    []float64
	v      *formula.Expr
	lambda interval.I
	errL2  float64
}

// enclose returns an enclosure of u(x0) with the largest disc about
// x0 inside a triangle of the mesh; the whole line when x0 is in no
// triangle's interior (on an edge or outside the domain).
func (g *polygonGS) enclose(x0 [2]float64) (interval.I, error) {
	d, ok := g.disc(x0)
	if !ok {
		return interval.New(math.Inf(-1), math.Inf(1)), nil
	}
	pe, err := groundstate.EnclosePoint(g.v, g.lambda, g.errL2, d, groundstate.DiscOptions{})
	if err != nil {
		return interval.I{}, err
	}
	return pe.U, nil
}

// disc returns the largest disc about x0 inside one mesh triangle and the
// polynomial of ũ there.
func (g *polygonGS) disc(x0 [2]float64) (groundstate.Disc, bool) {
	m := g.space.Mesh()
	bestR, bestT := 0.0, -1
	for t := range m.Tris {
		if R, ok := groundstate.InscribedRadius(m.Vertices(t), x0); ok && R > bestR {
			bestR, bestT = R, t
		}
	}
	if bestT < 0 {
		return groundstate.Disc{}, false
	}
	c, ok := g.space.Monomials(g.vec, bestT, x0)
	if !ok {
		return groundstate.Disc{}, false
	}
	return groundstate.Disc{Centre: x0, Radius: bestR, Coef: c}, true
}

// exactPoint returns the exact decimal text of the coordinates of x.
func exactPoint(x [2]float64) []string {
	return []string{decimalio.FormatExact(x[0]), decimalio.FormatExact(x[1])}
}

func joinPoint(x [2]float64) string {
	return decimalio.FormatExact(x[0]) + ", " + decimalio.FormatExact(x[1])
}

// bound returns the decimal ends of an enclosure, rounded outward.
func bound(x interval.I) certs.Bound {
	lo, hi := decimalio.FormatInterval(x, Digits)
	return certs.Bound{Lower: lo, Upper: hi}
}
