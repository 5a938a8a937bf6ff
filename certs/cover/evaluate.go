package cover

import (
	"fmt"
	"math/big"

	"gapcert/certs"
	"gapcert/fem/boundary"
	"gapcert/fem/claim"
	"gapcert/fem/claim/named"
	"gapcert/fem/problem"
	"gapcert/interval"
)

// boundDigits is the number of significant digits of printed bounds.
const boundDigits = 17

func newBound(x interval.I) certs.Bound { return certs.NewBound(x, boundDigits) }

// Corners returns the two corners of the cell b that the order of the
// eigenvalues (the family's Dependences) makes extreme: low takes, for
// each parameter, the end where the operator is smallest (lo for a
// nondecreasing dependence, hi for a nonincreasing one), high the other
// end; a parameter the eigenvalues do not depend on takes the box's lo in
// both (so that every cell shares those corners' values). For
// every point p of b, λ_k(low) ≤ λ_k(p) ≤ λ_k(high) for every k (the
// comparison lemma, package documentation).
//
// A parameter that moves the domain (GeometryRule) takes the cell's
// centre in both, so low and high are one problem: the reference
// triangle of the cell, whose eigenvalues bound those of the cell through
// the singular values of the affine maps (cellQuantities).
func (f *Family) Corners(b Box) (low, high []*big.Rat) {
	for j, d := range f.Dependences {
		switch {
		case d.geometric():
			mid := new(big.Rat).Add(b.Lo[j], b.Hi[j])
			mid.Quo(mid, big.NewRat(2, 1))
			low, high = append(low, mid), append(high, mid)
		case d.Direction > 0:
			low, high = append(low, b.Lo[j]), append(high, b.Hi[j])
		case d.Direction < 0:
			low, high = append(low, b.Hi[j]), append(high, b.Lo[j])
		default:
			low, high = append(low, f.Params[j].Lo), append(high, f.Params[j].Lo)
		}
	}
	return low, high
}

// corner is a certified corner problem.
type corner struct {
	problem *problem.Problem
	cert    *certs.Certificate
}

// eigen returns the enclosure of λ_k recorded in the corner certificate.
func (c corner) eigen(k int) (interval.I, error) {
	return eigenOf(c.cert.Results, k)
}

func eigenOf(r certs.Results, k int) (interval.I, error) {
	for _, e := range r.Eigenvalues {
		if e.Index == k {
			return e.Bound().Interval()
		}
	}
	return interval.I{}, fmt.Errorf("no enclosure of lambda%d", k)
}

// cellQuantities encloses the claim quantities over every point of the
// cell b from its two corner certificates:
//
//   - λ_k ∈ [lower end of λ_k(low), upper end of λ_k(high)], by the order
//     λ_k(low) ≤ λ_k(p) ≤ λ_k(high) (Corners);
//   - gap = λ₂ − λ₁ ∈ [ℓ₂(low) − u₁(high), u₂(high) − ℓ₁(low)], each end
//     from the bounds above with outward rounding;
//   - D, area, perimeter, inradius: the geometry's, which no covered
//     parameter changes (a family whose domain uses one is refused);
//   - alpha, when the Robin sides share one coefficient formula:
//     [α(low), α(high)], since α is monotone along the same order (its
//     uses have the dependence's sign);
//   - the covered parameters: their cell ranges; fixed ones: their values;
//     pi and e.
//
// In a family whose domain moves (GeometryRule), low and high are the
// reference triangle at the cell's centre, and instead:
//
//   - λ_k ∈ ([ℓ_k, u_k] − c)·[1/(1+r)², 1/(1−r)²] + c with [ℓ_k, u_k]
//     the reference's enclosure, V ≡ c, and r ≥ ‖A − I‖_F over the cell
//     (geometryOver);
//     when r ≥ 1 the eigenvalues and the gap have no enclosure and the
//     claims naming them are undecided with that reason;
//   - gap: λ₂'s lower end minus λ₁'s upper end, and the other way round;
//   - D, area, perimeter, inradius: enclosed over the cell from the vertex
//     formulas (triangleQuantities).
//
// missing maps a quantity without a value to the reason: alpha when the
// Robin sides do not share one coefficient; the eigenvalues and the gap
// on a cell where the geometry rule proves no bound.
func (f *Family) cellQuantities(b Box, low, high corner) (env map[string]interval.I, missing map[string]string, err error) {
	ref := low.problem
	m := ref.Eigenvalues
	env = map[string]interval.I{"pi": interval.Pi(), "e": interval.E()}
	missing = map[string]string{}
	if f.geometric() {
		if err := f.geometryQuantities(b, low, env, missing); err != nil {
			return nil, nil, err
		}
		if why := sharedAlpha(ref); why != "" {
			missing[claim.Alpha] = why
		}
		f.paramQuantities(b, ref, env, missing)
		return env, missing, nil
	}
	lows, highs := make([]interval.I, m+1), make([]interval.I, m+1)
	for k := 1; k <= m; k++ {
		if lows[k], err = low.eigen(k); err != nil {
			return nil, nil, fmt.Errorf("low corner: %v", err)
		}
		if highs[k], err = high.eigen(k); err != nil {
			return nil, nil, fmt.Errorf("high corner: %v", err)
		}
		if highs[k].Hi < lows[k].Lo {
			return nil, nil, fmt.Errorf("the corner enclosures of lambda%d contradict the order: %v at the low corner, %v at the high one", k, lows[k], highs[k])
		}
		env[claim.Eigenvalue(k)] = interval.I{Lo: lows[k].Lo, Hi: highs[k].Hi}
	}
	env[claim.Gap] = gapOver(lows, highs)
	env[claim.Diameter] = ref.Diameter()
	if ref.Dim == 2 {
		env[claim.Area], env[claim.Perimeter] = ref.Area(), ref.Perimeter()
		if len(ref.Vertices) == 3 {
			// The inradius of a triangle is 2·area/perimeter (common
			// practice; as in certs/certify).
			env[claim.Inradius] = ref.Area().MulF(2).Div(ref.Perimeter())
		}
	}
	if why := sharedAlpha(ref); why != "" {
		missing[claim.Alpha] = why
	} else {
		aLow, whyLow := low.problem.RobinAlpha()
		aHigh, whyHigh := high.problem.RobinAlpha()
		switch {
		case whyLow != "":
			missing[claim.Alpha] = "alpha at the low corner: " + whyLow
		case whyHigh != "":
			missing[claim.Alpha] = "alpha at the high corner: " + whyHigh
		case aHigh.Val.Hi < aLow.Val.Lo:
			return nil, nil, fmt.Errorf("the Robin coefficient contradicts the order: %v at the low corner, %v at the high one", aLow.Val, aHigh.Val)
		default:
			env[claim.Alpha] = interval.I{Lo: aLow.Val.Lo, Hi: aHigh.Val.Hi}
		}
	}
	f.paramQuantities(b, ref, env, missing)
	return env, missing, nil
}

// paramQuantities sets the covered parameters to their cell ranges and
// the fixed ones to their values; a parameter named alpha is no longer
// missing.
func (f *Family) paramQuantities(b Box, ref *problem.Problem, env map[string]interval.I, missing map[string]string) {
	for name, v := range ref.Params {
		env[name] = v.Val
	}
	for j, p := range f.Params {
		env[p.Name] = b.Enclosure(j)
	}
	if _, ok := ref.Params[claim.Alpha]; ok {
		// A parameter named alpha is what claims mean by alpha (as in
		// certs/certify), with a value on the cell.
		delete(missing, claim.Alpha)
	}
}

// geometryQuantities fills env with the eigenvalues, the gap and the
// geometry over the cell b of a family whose domain moves, from the
// reference certificate ref at the cell's centre (GeometryRule); a
// quantity it cannot enclose goes to missing with the reason.
func (f *Family) geometryQuantities(b Box, ref corner, env map[string]interval.I, missing map[string]string) error {
	centre, _ := f.Corners(b)
	g, err := f.geometryOver(b, ref.problem, centre)
	if err != nil {
		return err
	}
	d, area, perimeter, inradius, err := triangleQuantities(g.Vertices)
	if err != nil {
		return err
	}
	env[claim.Diameter], env[claim.Area], env[claim.Perimeter], env[claim.Inradius] = d, area, perimeter, inradius
	m := ref.problem.Eigenvalues
	if !(g.R < 1) {
		why := fmt.Sprintf("the affine maps from the reference triangle to the cell's triangles are not proved nonsingular (the bound r of ‖A − I‖_F over the cell is about %.3g, not below 1, which allows a degenerate triangle), so the cell's eigenvalues are not bounded", g.R)
		for k := 1; k <= m; k++ {
			missing[claim.Eigenvalue(k)] = why
		}
		missing[claim.Gap] = why
		return nil
	}
	c, err := constantPotential(f, ref.problem)
	if err != nil {
		return err
	}
	eig := make([]interval.I, m+1)
	for k := 1; k <= m; k++ {
		e, err := ref.eigen(k)
		if err != nil {
			return fmt.Errorf("reference: %v", err)
		}
		// V ≡ c shifts every eigenvalue by c (GeometryRule).
		eig[k] = e.Sub(c).Mul(g.Scale).Add(c)
		env[claim.Eigenvalue(k)] = eig[k]
	}
	env[claim.Gap] = gapOver(eig, eig)
	return nil
}

// gapOver encloses λ₂ − λ₁ over the cell: [ℓ₂(low) − u₁(high), u₂(high) −
// ℓ₁(low)] rounded outward.
func gapOver(lows, highs []interval.I) interval.I {
	// With ℓ_k(low) ≤ u_k(high) (checked by the callers), hi − lo =
	// (u₂(high) − ℓ₂(low)) + (u₁(high) − ℓ₁(low)) ≥ 0.
	lo := interval.SubDown(lows[2].Lo, highs[1].Hi)
	hi := interval.SubUp(highs[2].Hi, lows[1].Lo)
	return interval.I{Lo: lo, Hi: hi}
}

// sharedAlpha returns "" when the problem has a Robin side and all its
// Robin sides have the same coefficient formula (so one α for every
// parameter value), else why alpha has no value over a cell.
func sharedAlpha(p *problem.Problem) string {
	text := ""
	for _, bc := range p.Boundary {
		if bc.Kind != boundary.Robin {
			continue
		}
		if text == "" {
			text = bc.Alpha.Text
		} else if bc.Alpha.Text != text {
			return fmt.Sprintf("alpha has no single value over a cell: the Robin sides have different coefficient formulas (%s, %s)", text, bc.Alpha.Text)
		}
	}
	if text == "" {
		return "alpha has no value: no side has a Robin condition"
	}
	return ""
}

// cellClaims decides every claim of the family over the cell b from its
// corners (cellQuantities). A claim is decided by certs.EvaluateClaim over
// the cell's enclosures: it holds (or fails) at every point of the cell. A
// built-in claim also gets its hypotheses over the cell (cellHypotheses)
// and, for a reference quantity, the reference's enclosure over the cell
// from the reference certificates in the corner certificates
// (referenceOver).
func (f *Family) cellClaims(b Box, low, high corner) (map[string]interval.I, []certs.ClaimResult, error) {
	env, missing, err := f.cellQuantities(b, low, high)
	if err != nil {
		return nil, nil, err
	}
	var out []certs.ClaimResult
	for i, text := range f.Claims {
		if !named.IsNamed(text) {
			cl, err := claim.Parse(text)
			if err != nil {
				return nil, nil, fmt.Errorf("claim %q: %v", text, err)
			}
			out = append(out, evaluate(cl, env, missing))
			continue
		}
		c, err := named.Lookup(text)
		if err != nil {
			return nil, nil, fmt.Errorf("claim %q: %v", text, err)
		}
		local := env
		reason := ""
		if c.Reference != "" {
			ref, why := f.referenceOver(c, i, low, high)
			if why != "" {
				reason = why
			} else {
				// Recorded with the cell's quantities; no other claim can
				// name it (the reader's scope check).
				env[c.Reference] = ref
			}
		}
		r := evaluate(c.Parse(), local, missing)
		if reason != "" {
			r.Verdict, r.Reason = certs.Undecided, reason
		}
		r.Text, r.Inequality = c.Text(), c.Inequality
		r.Hypotheses = f.cellHypotheses(c, i, low, high)
		out = append(out, r)
	}
	return env, out, nil
}

// evaluate is certs.EvaluateClaim, undecided with the reason when the
// claim names a quantity without a value (missing; the first such name
// in the claim's order gives the reason).
func evaluate(cl *claim.Claim, env map[string]interval.I, missing map[string]string) certs.ClaimResult {
	r := certs.EvaluateClaim(cl, env)
	for _, v := range cl.Vars() {
		if why, ok := missing[v]; ok {
			r.Verdict, r.Reason = certs.Undecided, why
			break
		}
	}
	return r
}

// referenceOver encloses the reference quantity of the built-in claim c
// (claim i) over the cell. Its problem is written with the inputs alpha
// and D only: D is fixed, and α is monotone along the cell's order, so
// the reference eigenvalues obey the same order (comparison lemma) and the
// reference gap lies in [ℓ₂(low) − u₁(high), u₂(high) − ℓ₁(low)] of the
// reference certificates stored in the corner certificates (each verified
// with its corner). Any other reference, or D in a family whose domain
// moves, gives the reason it is not enclosed.
func (f *Family) referenceOver(c named.Claim, i int, low, high corner) (interval.I, string) {
	if c.ReferenceProblem == nil {
		return interval.I{}, "the reference has no problem"
	}
	for _, in := range c.ReferenceProblem.Inputs {
		if in == claim.Diameter && f.geometric() {
			return interval.I{}, fmt.Sprintf("the reference %s depends on D, which the covered geometry changes", c.Reference)
		}
		if in != claim.Alpha && in != claim.Diameter {
			return interval.I{}, fmt.Sprintf("the reference %s depends on %s, which a cover does not order", c.Reference, in)
		}
	}
	var lows, highs []interval.I
	for _, cn := range []corner{low, high} {
		if i >= len(cn.cert.Claims) {
			return interval.I{}, fmt.Sprintf("a corner certificate has no claim %d", i)
		}
		if cn.cert.Claims[i].Reference == nil {
			return interval.I{}, fmt.Sprintf("a corner certificate has no reference %s (%s)", c.Reference, cn.cert.Claims[i].Reason)
		}
		rc, err := certs.Unmarshal(cn.cert.Claims[i].Reference.Certificate)
		if err != nil {
			return interval.I{}, "the reference certificate does not read: " + err.Error()
		}
		e := make([]interval.I, 3)
		for k := 1; k <= 2; k++ {
			if e[k], err = eigenOf(rc.Results, k); err != nil {
				return interval.I{}, "the reference certificate: " + err.Error()
			}
		}
		if lows == nil {
			lows = e
		} else {
			highs = e
		}
	}
	for k := 1; k <= 2; k++ {
		if highs[k].Hi < lows[k].Lo {
			return interval.I{}, fmt.Sprintf("the reference enclosures of lambda%d contradict the order (%v at the low corner, %v at the high one)", k, lows[k], highs[k])
		}
	}
	switch c.ReferenceResult {
	case claim.Gap:
		return gapOver(lows, highs), ""
	case claim.Eigenvalue(1), claim.Eigenvalue(2):
		k := 1
		if c.ReferenceResult == claim.Eigenvalue(2) {
			k = 2
		}
		return interval.I{Lo: lows[k].Lo, Hi: highs[k].Hi}, ""
	}
	return interval.I{}, fmt.Sprintf("the reference result %s is not enclosed over a cell", c.ReferenceResult)
}

// Hypotheses whose verdict does not depend on the covered parameters: they
// are decided from the geometry and the kinds of the boundary conditions,
// which a cover changes only through the geometry rule (with α ≥ 0 for
// robin_or_neumann_sides, which holds on the cell since α(low) ≥ 0 at the
// lowest corner).
var geometryHypotheses = map[string]bool{
	named.ConvexDomain: true, named.Triangle: true, named.Rectangle: true, named.CircumsolidProduct: true,
	named.DirichletBoundary: true, named.NeumannBoundary: true, named.RobinOrNeumannSides: true,
}

// affineHypotheses are those of geometryHypotheses that every
// nondegenerate affine image of a triangle shares with it (a triangle's
// image is a convex triangle; the sides keep their boundary kinds), so
// they hold over a cell of the geometry rule when they hold at its
// reference triangle. Rectangle and circumsolid_product are not among
// them.
var affineHypotheses = map[string]bool{
	named.ConvexDomain: true, named.Triangle: true,
	named.DirichletBoundary: true, named.NeumannBoundary: true, named.RobinOrNeumannSides: true,
}

// potentialHypotheses depend on V only.
var potentialHypotheses = map[string]bool{
	named.ConvexPotential: true, named.ContinuousPotential: true, named.ZeroPotential: true,
}

// cellHypotheses decides the hypotheses of the built-in claim c over the
// whole cell from their verdicts at the two corners:
//
//   - disproven at a corner: disproven (the corner is a point of the cell);
//   - proven at both corners and decided by the geometry and the boundary
//     kinds (geometryHypotheses): proven; in a family whose domain moves
//     (both corners are the reference triangle) only those that every
//     affine image of the triangle shares (affineHypotheses);
//   - zero_potential proven at both corners: proven, since V(low) ≤ V(p) ≤
//     V(high) pointwise (the potential's order) and both ends are 0;
//   - another hypothesis on V, proven at both corners, when V uses no
//     covered parameter: proven (V is the same at every point);
//   - robin_boundary, positive_robin_alpha proven at both corners when the
//     Robin sides share one coefficient formula: proven (positive: α(p) ≥
//     α(low) > 0);
//   - otherwise undecided, saying that it was decided at the corners only.
func (f *Family) cellHypotheses(c named.Claim, i int, low, high corner) []certs.Hypothesis {
	var out []certs.Hypothesis
	vFixed := true
	for _, d := range f.Dependences {
		for _, u := range d.Uses {
			if u.Path == "potential" {
				vFixed = false
			}
		}
	}
	for hi, name := range c.Hypotheses {
		var hl, hh *certs.Hypothesis
		if i < len(low.cert.Claims) && hi < len(low.cert.Claims[i].Hypotheses) {
			hl = &low.cert.Claims[i].Hypotheses[hi]
		}
		if i < len(high.cert.Claims) && hi < len(high.cert.Claims[i].Hypotheses) {
			hh = &high.cert.Claims[i].Hypotheses[hi]
		}
		h := certs.Hypothesis{Name: name, Verdict: certs.Undecided}
		switch {
		case hl == nil || hh == nil || hl.Name != name || hh.Name != name:
			h.Detail = "a corner certificate does not record this hypothesis"
		case hl.Verdict == certs.Disproven:
			h.Verdict, h.Detail, h.Witness = certs.Disproven, "disproven at the low corner: "+hl.Detail, hl.Witness
		case hh.Verdict == certs.Disproven:
			h.Verdict, h.Detail, h.Witness = certs.Disproven, "disproven at the high corner: "+hh.Detail, hh.Witness
		case hl.Verdict != certs.Proven || hh.Verdict != certs.Proven:
			h.Detail = "not proven at both corners: " + hl.Detail
		case geometryHypotheses[name] && f.geometric() && !affineHypotheses[name]:
			h.Detail = "proven at the cell's reference triangle only; the covered geometry may change it"
		case geometryHypotheses[name] && f.geometric():
			h.Verdict, h.Detail = certs.Proven, "proven at the cell's reference triangle; every affine image of a triangle shares it: "+hl.Detail
		case geometryHypotheses[name]:
			h.Verdict, h.Detail = certs.Proven, "proven at both corners; decided by the geometry and the boundary kinds, which no covered parameter changes: "+hl.Detail
		case name == named.ZeroPotential:
			h.Verdict, h.Detail = certs.Proven, "V = 0 at both corners and V(low) ≤ V ≤ V(high) on the cell"
		case potentialHypotheses[name] && vFixed:
			h.Verdict, h.Detail = certs.Proven, "proven at both corners; V uses no covered parameter: "+hl.Detail
		case (name == named.RobinBoundary || name == named.PositiveRobinAlpha) && sharedAlpha(low.problem) == "":
			h.Verdict, h.Detail = certs.Proven, "proven at both corners; the Robin sides share one coefficient formula, monotone on the cell: "+hl.Detail
		default:
			h.Detail = "proven at both corners only; not decided between them"
		}
		out = append(out, h)
	}
	return out
}

// worstVerdict returns fails if a claim fails, else undecided if one is
// undecided, else holds ("" for no claims).
func worstVerdict(claims []certs.ClaimResult) string {
	v := ""
	for _, c := range claims {
		switch {
		case c.Verdict == certs.Fails:
			return certs.Fails
		case c.Verdict == certs.Undecided:
			v = certs.Undecided
		case v == "":
			v = certs.Holds
		}
	}
	return v
}

// decided reports whether every claim holds or fails.
func decided(claims []certs.ClaimResult) bool {
	for _, c := range claims {
		if c.Verdict == certs.Undecided {
			return false
		}
	}
	return true
}
