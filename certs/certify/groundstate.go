package certify

import (
	"errors"
	"fmt"
	"math"
	"sort"

	"gapcert/certs"
	"gapcert/fem/boundary"
	"gapcert/fem/problem"
	"gapcert/interval"
	"gapcert/interval/decimalio"
	"gapcert/temple/groundstate"
)

// This file is results.ground_state (Options.GroundState): the common part
// (the L2 error of the approximate ground state, the normalisation) and the
// one-dimensional part (the log-concavity verdict and the values at the
// problem's points, from the validated shooting of package
// temple/groundstate). The polygon part is groundStatePolygon.

// groundState certifies the ground-state block of the certified step's
// certificate: the dimension's verdict and values (groundStateInterval,
// groundStatePolygon), then the common part, which it sets itself: the
// normalisation (u > 0 with ∫u² = 1, certs.NormalizationL2) and the L2
// error bound of ũ (groundStateL2; when λ1 is not shown to be separated
// from λ2 there is none, and Reason says so).
func groundState(in groundStateInputs) (*certs.GroundState, error) {
	var gs *certs.GroundState
	var err error
	switch in.p.Dim {
	case 1:
		gs, err = groundStateInterval(in)
	case 2:
		gs, err = groundStatePolygon(in)
	default:
		panic(fmt.Sprintf("certify: ground state of a problem of dimension %d", in.p.Dim))
	}
	if err != nil {
		return nil, err
	}
	gs.Normalization = certs.NormalizationL2
	l2, why := groundStateL2(in)
	gs.L2Error = l2
	if why != "" {
		gs.Reason += "; " + why
	}
	return gs, nil
}

// groundStateL2 returns an upper bound of ‖ũ − P₁ũ‖/‖ũ‖ for the first Ritz
// vector ũ of the certified step, as decimal text rounded up, or "" and the
// reason when there is none.
//
// By inequality (E1) of package temple/groundstate (EigenvectorError; the
// Rayleigh-quotient bound of Liu and Vejchodský, arXiv:1904.07903),
//
//	‖ũ − P₁ũ‖²/‖ũ‖² ≤ (R(ũ) − λ1)/(λ2 − λ1)   when λ2 > R(ũ),
//
// with R(ũ) = a(ũ, ũ)/‖ũ‖² enclosed from the [0, 0] entries of the Ritz
// matrices: a(ũ, ũ) ∈ energy − γ·norm2, since energy ⊇ a(ũ, ũ) + γ‖ũ‖²
// (fem/discrete, Trial.RitzMatrices), and λ1, λ2 the certified enclosures.
// The bound needs λ2's lower end above R(ũ)'s upper end; otherwise (in
// particular when λ1 is not shown to be simple) there is none.
func groundStateL2(in groundStateInputs) (upper, why string) {
	if !in.norm2.Positive() || !in.energy.IsBounded() {
		return "", "no L2 error bound: the norm of the approximate ground state is not enclosed away from 0"
	}
	aUU := in.energy.Sub(interval.Point(in.gamma).Mul(in.norm2))
	ve, err := groundstate.EigenvectorError(aUU, in.norm2, in.lambda1, in.lambda2, in.gamma)
	var ns *groundstate.NotSeparatedError
	if errors.As(err, &ns) {
		return "", fmt.Sprintf("no L2 error bound: the lower end of lambda2 (%s) is not above the upper end of the Rayleigh quotient of the approximate ground state (%s)",
			decimalio.FormatLower(ns.Lambda2.Lo, 6), decimalio.FormatUpper(ns.Rayleigh.Hi, 6))
	}
	if err != nil {
		return "", "no L2 error bound: " + err.Error()
	}
	return decimalio.FormatUpper(interval.SqrtUp(ve.L2), Digits), ""
}

// shootingProblem is p as package temple/groundstate states a problem on
// an interval: V with its parameters bound, the enclosed ends, and the two
// end conditions (Robin with its enclosed α).
func shootingProblem(p *problem.Problem) groundstate.Problem {
	end := func(bc problem.BC) groundstate.Boundary {
		switch bc.Kind {
		case boundary.Dirichlet:
			return groundstate.Boundary{Kind: groundstate.Dirichlet}
		case boundary.Neumann:
			return groundstate.Boundary{Kind: groundstate.Neumann}
		case boundary.Robin:
			return groundstate.Boundary{Kind: groundstate.Robin, Alpha: bc.Alpha.Val}
		}
		panic(fmt.Sprintf("certify: boundary kind %v on an interval", bc.Kind))
	}
	return groundstate.Problem{V: p.Potential, A: p.Interval[0].Val, B: p.Interval[1].Val,
		Left: end(p.Boundary[0]), Right: end(p.Boundary[1])}
}

// groundStateInterval certifies the verdict on log-concavity and the
// values at the problem's points of the ground state on an interval.
//
// Both come from validated shooting (groundstate.LogConcavity,
// groundstate.Enclose) with the certified enclosure of λ1: the ground state
// is the member λ = λ1 of each shot's family. The verdict is given only
// when the gap's lower bound is positive (λ2 − λ1 > 0 certified); else the
// block is Undecided with that reason and has no values, so that a λ1
// enclosure that also holds λ2 never yields a statement about the second
// eigenfunction.
//
// The enclosure of λ1 is first cut at inf V (the verified lower end of V's
// range over the domain): with Robin coefficients α ≥ 0 (the reader
// refuses others) every u in the form domain has
//
//	a(u, u) = ∫u′² + ∫V u² + Σ α u(end)² ≥ inf V·∫u²,
//
// so λ1 = min a(u, u)/∫u² ≥ inf V (the Rayleigh quotient; common
// practice; robinNonnegative checks α ≥ 0 again). Where V is constant and equal to λ1 (Neumann with V = c) the
// exact g is 0, and only a λ1 enclosure that does not reach below V lets
// the verdict show g ≤ 0.
//
// A proven verdict needs only the sign of g, not the normalisation of u:
// when the normalisation fails (newShotValues), the verdict is kept
// without values and Reason says why. A witness (disproven) states values
// of the normalised ground state, so without the normalisation the block
// is Undecided.
func groundStateInterval(in groundStateInputs) (*certs.GroundState, error) {
	gs := &certs.GroundState{LogConcavity: certs.Undecided}
	if gap := in.lambda2.Sub(in.lambda1); gap.Lo <= 0 {
		gs.Reason = fmt.Sprintf("lambda1 is not shown to be separated from lambda2 (the lower bound of the gap, %s, is not positive): no verdict and no values are given",
			decimalio.FormatLower(gap.Lo, 6))
		return gs, nil
	}
	lambda := in.lambda1
	if robinNonnegative(in.p) {
		if cut, ok := lambda.Intersection(interval.New(in.p.PotentialRange().Lo, math.Inf(1))); ok {
			lambda = cut
		}
	}
	gp := shootingProblem(in.p)
	lc, err := groundstate.LogConcavity(gp, lambda, groundstate.Options{})
	var ie *groundstate.IntegrationError
	if errors.As(err, &ie) {
		gs.Reason = "the validated integration of the ground state failed: " + err.Error()
		return gs, nil
	}
	if err != nil {
		// An *InconsistentError: u certified negative inside, so the
		// certified λ1 enclosure would be wrong. Stop with the reason.
		return nil, fmt.Errorf("ground state: %w", err)
	}
	proven := fmt.Sprintf("log-concave: g = (V - lambda1)u^2 - u'^2 <= 0 on all %d pieces covering the interval, so (log u)'' = g/u^2 <= 0 (validated shooting with lambda1 in its certified enclosure)", lc.Pieces)
	sv, err := newShotValues(gp, lambda)
	if err != nil {
		why := "the ground state could not be normalised, so no values are given: " + err.Error()
		if lc.Verdict == groundstate.Proven {
			// The sign of g does not depend on the normalisation: the
			// verdict stands without it.
			gs.LogConcavity = certs.Proven
			why = proven + "; " + why
		}
		gs.Reason = why
		return gs, nil
	}
	n, _ := sv.norm2.Sqrt() // ∫u_L² > 0, checked by newShotValues
	switch lc.Verdict {
	case groundstate.Proven:
		gs.LogConcavity = certs.Proven
		gs.Reason = proven
	case groundstate.Disproven:
		w := lc.Witness
		g := w.G
		if w.From == groundstate.RightEnd {
			g = g.Mul(sv.ratio.Sqr()) // g scales as u²: u_L = ratio·u_R
		}
		g = g.Div(sv.norm2) // u = u_L/N
		lo, hi := inwardEnds(w.X)
		gs.LogConcavity = certs.Disproven
		gs.Reason = fmt.Sprintf("not log-concave: g = (V - lambda1)u^2 - u'^2 > 0 on the witness interval, where (log u)'' = g/u^2 > 0 (validated shooting, %d pieces evaluated)", lc.Pieces)
		gs.Witness = &certs.ShapeWitness{
			Kind:   certs.WitnessConvexInterval,
			Points: [][]string{{lo}, {hi}},
			Values: []certs.Bound{certs.NewBound(g, Digits)},
			Margin: certs.NewBound(interval.Point(g.Lo), Digits),
		}
	default:
		gs.Reason = fmt.Sprintf("undecided after %d pieces: %s (largest upper end of g on an undecided piece: %.3g, near x in %v)", lc.Pieces, lc.Reason, lc.WorstUpper, lc.WorstAt)
	}
	for _, pt := range in.p.Points {
		u, err := sv.value(pt[0].Val)
		if err != nil {
			return nil, fmt.Errorf("ground state at %s: %w", pt[0].Text, err)
		}
		gs.Points = append(gs.Points, certs.PointValue{At: []string{pt[0].Text}, Value: certs.NewBound(u.Div(n), Digits)})
	}
	return gs, nil
}

// robinNonnegative reports that every Robin coefficient of p is enclosed
// in [0, ∞), so that λ1 ≥ inf V (groundStateInterval).
func robinNonnegative(p *problem.Problem) bool {
	for _, bc := range p.Boundary {
		if bc.Kind == boundary.Robin && !(bc.Alpha.Val.Lo >= 0) {
			return false
		}
	}
	return true
}

// inwardEnds returns decimal texts lo, hi with x.Lo ≤ lo ≤ hi ≤ x.Hi: a
// witness interval states something about each of its points, so its ends
// are rounded inward (17 digits, or exact when that would cross).
func inwardEnds(x interval.I) (lo, hi string) {
	lo, hi = decimalio.FormatUpper(x.Lo, Digits), decimalio.FormatLower(x.Hi, Digits)
	l, errL := decimalio.ParseRat(lo)
	h, errH := decimalio.ParseRat(hi)
	if errL != nil || errH != nil || l.Cmp(h) > 0 {
		return decimalio.FormatExact(x.Lo), decimalio.FormatExact(x.Hi)
	}
	return lo, hi
}

// normPieces is the number of trapezoid pieces of the normalisation
// integral (a choice: the relative width of ∫u² is of the order of
// (b − a)²/normPieces² times max|V − λ1| + max(u′/u)², about 1e-8 for the
// tests' problems).
const normPieces = 1 << 13

// shotValues is the ground state in the normalisation u_L of the left
// shot, on all of [a, b]: the shots of groundstate.Enclose meet at the
// split point s, where u_L(s) and u_R(s) are enclosed and positive, and
// the ground state's two normalisations differ by the factor
//
//	ratio = u_L(s)/u_R(s) ∈ U_L(s)/U_R(s),
//
// so u_L = ratio·u_R on [s, b] (every enclosure of u_R is multiplied by
// the enclosure of ratio: the exact factor is one of its points).
type shotValues struct {
	e     *groundstate.Enclosure
	p     groundstate.Problem
	ratio interval.I
	cells []shotCell // every cell of both shots, in u_L's normalisation, sorted by X.Lo
	norm2 interval.I // ∫_a^b u_L²
	lam   interval.I // the enclosure of λ1
}

// shotCell encloses u_L and u_L′ on the points X of one cell.
type shotCell struct{ x, u, du interval.I }

// newShotValues shoots (groundstate.Enclose) and encloses ∫_a^b u_L² as
// in norm2.
func newShotValues(gp groundstate.Problem, lambda interval.I) (*shotValues, error) {
	e, err := groundstate.Enclose(gp, lambda, groundstate.Options{})
	if err != nil {
		return nil, err
	}
	uL, _, okL := e.Left.At(e.Split)
	uR, _, okR := e.Right.At(e.Split)
	if !okL || !okR || !uL.Positive() || !uR.Positive() {
		return nil, fmt.Errorf("the shots are not certified positive at the split point %g (left %v, right %v)", e.Split, uL, uR)
	}
	sv := &shotValues{e: e, p: gp, ratio: uL.Div(uR), lam: lambda}
	for _, c := range e.Left.Cells {
		sv.cells = append(sv.cells, shotCell{c.X, c.U, c.DU})
	}
	for _, c := range e.Right.Cells {
		sv.cells = append(sv.cells, shotCell{c.X, c.U.Mul(sv.ratio), c.DU.Mul(sv.ratio)})
	}
	sort.SliceStable(sv.cells, func(i, j int) bool { return sv.cells[i].x.Lo < sv.cells[j].x.Lo })
	if sv.norm2, err = sv.integral(); err != nil {
		return nil, err
	}
	if !sv.norm2.Positive() {
		return nil, fmt.Errorf("the integral of u^2 is not enclosed away from 0: %v", sv.norm2)
	}
	return sv, nil
}

// at encloses u_L(x) and u_L′(x) at the float x (false outside the shots).
func (sv *shotValues) at(x float64) (u, du interval.I, ok bool) {
	if x <= sv.e.Split {
		return sv.e.Left.At(x)
	}
	u, du, ok = sv.e.Right.At(x)
	return u.Mul(sv.ratio), du.Mul(sv.ratio), ok
}

// hull encloses u_L and u_L′ on the points of x: the hull over every cell
// whose points meet x. The true cells tile [a, b] and each lies in its
// enclosure X, so every point of x in [a, b] lies in a cell counted here.
// ok is false when no cell meets x.
func (sv *shotValues) hull(x interval.I) (u, du interval.I, ok bool) {
	for _, c := range sv.cells {
		if c.x.Hi < x.Lo || c.x.Lo > x.Hi {
			continue
		}
		if !ok {
			u, du, ok = c.u, c.du, true
			continue
		}
		u, du = u.Hull(c.u), du.Hull(c.du)
	}
	return u, du, ok
}

// value encloses u_L(x*) for the exact point x* ∈ x ⊂ [a, b]: at the float
// g nearest to x's midpoint within the grid's range [A.Hi, B.Lo],
//
//	u_L(x*) ∈ U_L(g) + (x − g)·hull(u_L′ on hull(x, g))
//
// by the mean value theorem (x − g = 0 when x* = g is a float).
func (sv *shotValues) value(x interval.I) (interval.I, error) {
	g := min(max(x.Mid(), sv.p.A.Hi), sv.p.B.Lo)
	u, _, ok := sv.at(g)
	if !ok {
		return interval.I{}, fmt.Errorf("no enclosure of u at %g", g)
	}
	d := x.Sub(interval.Point(g))
	if d.IsPoint() && d.Lo == 0 {
		return u, nil
	}
	_, du, ok := sv.hull(x.HullPoint(g))
	if !ok {
		return interval.I{}, fmt.Errorf("no enclosure of u' near %g", g)
	}
	return u.Add(d.Mul(du)), nil
}

// integral encloses ∫_a^b u_L² on a grid of floats x_0 = A.Hi < … < s <
// … < x_n = B.Lo (a choice; s the split point) by the trapezoid rule with
// its remainder (common practice; e.g. K. E. Atkinson, An Introduction to
// Numerical Analysis, 2nd ed., Wiley, 1989, §5.1): for f ∈ C²[x_j, x_{j+1}],
// h = x_{j+1} − x_j,
//
//	∫ f = h·(f(x_j) + f(x_{j+1}))/2 − (h³/12)·f″(ξ),  ξ ∈ [x_j, x_{j+1}],
//
// with f = u_L² ∈ C² (u″ = (V − λ1)u with V continuous) and
//
//	f″ = 2u′² + 2u·u″ = 2u′² + 2(V − λ1)u²  ∈  2·[u′]² + 2·([V] − [λ])·[u]²,
//
// [u], [u′] the hulls of the cells meeting the piece (hull), [V] V's
// interval evaluation on the piece. The end pieces [a, x_0] and [x_n, b]
// (of length at most x_0 − A.Lo and B.Hi − x_n, 0 when the ends are
// floats) add [0, length·max [u]²], as 0 ≤ u² ≤ max [u]² there.
func (sv *shotValues) integral() (interval.I, error) {
	grid := sv.grid()
	sum := interval.Point(0)
	prev, _, ok := sv.at(grid[0])
	if !ok {
		return interval.I{}, fmt.Errorf("no enclosure of u at %g", grid[0])
	}
	f0 := prev.Sqr()
	for j := 0; j+1 < len(grid); j++ {
		x0, x1 := grid[j], grid[j+1]
		u1, _, ok := sv.at(x1)
		if !ok {
			return interval.I{}, fmt.Errorf("no enclosure of u at %g", x1)
		}
		f1 := u1.Sqr()
		piece := interval.New(x0, x1)
		hu, hdu, ok := sv.hull(piece)
		if !ok {
			return interval.I{}, fmt.Errorf("no enclosure of u on [%g, %g]", x0, x1)
		}
		v, err := sv.p.V.Eval(map[string]interval.I{"x": piece})
		if err != nil {
			return interval.I{}, fmt.Errorf("V on [%g, %g]: %w", x0, x1, err)
		}
		f2 := hdu.Sqr().Add(v.Sub(sv.lam).Mul(hu.Sqr())).MulF(2)
		h := interval.Point(x1).Sub(interval.Point(x0))
		trap := h.Mul(f0.Add(f1)).DivF(2)
		rem := h.PowInt(3).DivF(12).Mul(f2)
		sum = sum.Add(trap.Sub(rem))
		f0 = f1
	}
	ends := [2]struct{ length, points interval.I }{
		{interval.Point(grid[0]).Sub(sv.p.A), sv.p.A.HullPoint(grid[0])},
		{sv.p.B.Sub(interval.Point(grid[len(grid)-1])), sv.p.B.HullPoint(grid[len(grid)-1])},
	}
	for _, end := range ends {
		if end.length.Hi <= 0 {
			continue
		}
		hu, _, ok := sv.hull(end.points)
		if !ok {
			return interval.I{}, fmt.Errorf("no enclosure of u near an end")
		}
		sum = sum.Add(interval.New(0, end.length.Hi).Mul(interval.New(0, hu.Sqr().Hi)))
	}
	return sum, nil
}

// grid chooses the floats of integral: normPieces pieces, split between
// [A.Hi, s] and [s, B.Lo] in proportion to their lengths, strictly
// increasing.
func (sv *shotValues) grid() []float64 {
	a, s, b := sv.p.A.Hi, sv.e.Split, sv.p.B.Lo
	nl := max(1, int(float64(normPieces)*(s-a)/(b-a)))
	nr := max(1, normPieces-nl)
	out := []float64{a}
	add := func(x, upTo float64) {
		if x = min(x, upTo); x > out[len(out)-1] {
			out = append(out, x)
		}
	}
	for k := 1; k <= nl; k++ {
		add(a+(s-a)*float64(k)/float64(nl), s)
	}
	add(s, s)
	for k := 1; k <= nr; k++ {
		add(s+(b-s)*float64(k)/float64(nr), b)
	}
	add(b, b)
	return out
}
