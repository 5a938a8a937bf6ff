package certify

import (
	"fmt"
	"math/big"
	"slices"
	"time"

	"gapcert/certs"
	"gapcert/certs/hypothesis"
	"gapcert/fem/claim"
	"gapcert/fem/claim/named"
	"gapcert/fem/problem"
	"gapcert/interval"
)

// evaluateClaims returns the verdicts on p's claims over the certified
// enclosures of res (certs.EvaluateClaim: holds, fails or undecided, from
// the interval enclosure of lhs − rhs). problem.Parse has checked that p
// provides every quantity its claims name (claim.Claim.CheckScope), and
// claimEnv gives each of them a value.
//
// A built-in claim "@name" (package fem/claim/named) is its catalogue
// inequality, evaluated the same way, together with the verdicts on the
// hypotheses of its theorem (package certs/hypothesis) and, for a claim
// with a reference quantity, the certificate of that quantity. A
// hypothesis about the ground state itself (log-concavity) is decided from
// gs, the certificate's own results.ground_state (nil when it was not
// asked for: the hypothesis is then undecided and says how to ask for
// it; hypothesis.DecideCertified). The
// reference certificate is computed by Certify, or, when opt.recorded is
// set (the re-check), taken from the recorded claim and verified by Check;
// a recorded reference that is missing, of another problem or does not
// verify is a *MismatchError.
//
// The quantity shape_margin (polygons) is read from gs (shapeMargin); a
// claim that names it while gs provides none is undecided with the reason.
func evaluateClaims(p *problem.Problem, res *result, gs *certs.GroundState, opt Options) ([]certs.ClaimResult, error) {
	env := claimEnv(p, res)
	shape, shapeWhy := shapeMargin(gs)
	if shapeWhy == "" {
		env[claim.ShapeMargin] = shape
	}
	var out []certs.ClaimResult
	for i, text := range p.Claims {
		if named.IsNamed(text) {
			r, err := evaluateNamed(p, gs, env, shapeWhy, i, text, opt)
			if err != nil {
				return nil, err
			}
			out = append(out, r)
			continue
		}
		cl, err := claim.Parse(text)
		if err != nil {
			return nil, fmt.Errorf("claim %q: %w", text, err)
		}
		out = append(out, evaluateClaim(cl, env, shapeWhy))
	}
	return out, nil
}

// evaluateClaim is certs.EvaluateClaim, except that a claim naming
// shape_margin when it has no value (shapeWhy, from shapeMargin) is
// undecided with that reason.
func evaluateClaim(cl *claim.Claim, env map[string]interval.I, shapeWhy string) certs.ClaimResult {
	r := certs.EvaluateClaim(cl, env)
	if shapeWhy != "" && slices.Contains(cl.Vars(), claim.ShapeMargin) {
		r.Verdict, r.Reason = certs.Undecided, shapeWhy
	}
	return r
}

// shapeMargin returns the enclosure of the claim quantity shape_margin
// (package fem/claim) from the ground-state block gs of a polygon's
// certificate, or the reason it has none. It is the recorded margin of a
// midpoint triple x, y, m = (x + y)/2, an enclosure of u(x)u(y) − u(m)²
// for the ground state u with unit L² norm (the block's normalisation),
// read back outward from its printed bound:
//
//   - the witness's margin when the block has a witness of kind
//     midpoint_triple (then its lower end is positive);
//   - else the block's Margin, the margin of the best candidate triple of
//     the search, when it has one (an enclosure all the same, computed by
//     the same chain as the witness's: groundstate_polygon.go);
//   - else none: no block (the ground state was not asked for), or a block
//     without a candidate (λ1 not separated from λ2, an L2 bound too wide,
//     no candidate enclosed).
//
// A positive lower end says that u(m)² < u(x)u(y) at the recorded triple;
// with a convex domain log u is then not concave (the block's own verdict
// says so when it has a witness). A value that is not positive says nothing
// about log-concavity.
func shapeMargin(gs *certs.GroundState) (interval.I, string) {
	const name = "shape_margin has no value: "
	if gs == nil {
		return interval.I{}, name + "the certificate has no results.ground_state (certify with --ground-state, Options.GroundState)"
	}
	var b *certs.Bound
	switch {
	case gs.Witness != nil && gs.Witness.Kind == certs.WitnessMidpoint:
		b = &gs.Witness.Margin
	case gs.Witness != nil:
		return interval.I{}, name + "the witness in results.ground_state is of kind " + gs.Witness.Kind + ", not a midpoint triple"
	case gs.Margin != nil:
		b = gs.Margin
	default:
		return interval.I{}, name + "results.ground_state (--ground-state) has neither a witness nor a best candidate's margin: " + gs.Reason
	}
	m, err := b.Interval()
	if err != nil {
		return interval.I{}, name + "the margin in results.ground_state is not an interval: " + err.Error()
	}
	return m, ""
}

// GroundStateClaim returns the index of the first claim of p that names
// shape_margin (directly or through a built-in claim's inequality), or −1.
// Certify refuses such a problem without Options.GroundState before
// computing, and package certs/sweep a family without "ground_state":
// only results.ground_state gives shape_margin a value.
func GroundStateClaim(p *problem.Problem) int {
	for i, text := range p.Claims {
		var cl *claim.Claim
		if named.IsNamed(text) {
			c, err := named.Lookup(text)
			if err != nil {
				continue // the reader accepted it; evaluateClaims reports a defect
			}
			cl = c.Parse()
		} else if cl, _ = claim.Parse(text); cl == nil {
			continue
		}
		if slices.Contains(cl.Vars(), claim.ShapeMargin) {
			return i
		}
	}
	return -1
}

// claimEnv returns a value for every quantity p provides to its claims
// (p.ClaimScope, package fem/claim): the certified eigenvalues and gap of res,
// the diameter, area and perimeter of a polygon, volume and surface area of
// a polyhedron, the inradius of a triangle or a tetrahedron, the common
// Robin coefficient (p.RobinAlpha), pi, e and the
// parameters. A parameter named alpha is the value of alpha.
func claimEnv(p *problem.Problem, res *result) map[string]interval.I {
	env := map[string]interval.I{
		claim.Gap:      res.gap,
		claim.Diameter: p.Diameter(),
		"pi":           interval.Pi(),
		"e":            interval.E(),
	}
	for k, l := range res.lambda {
		env[claim.Eigenvalue(k+1)] = l
	}
	if p.Dim == 2 {
		env[claim.Area], env[claim.Perimeter] = p.Area(), p.Perimeter()
	}
	if ph := p.Polyhedron; ph != nil {
		env[claim.Volume], env[claim.SurfaceArea] = ph.Volume(), ph.SurfaceArea()
	}
	if p.IsProduct() && p.Dim > 2 {
		env[claim.Volume], env[claim.SurfaceArea] = p.Volume(), p.SurfaceArea()
	}
	if p.Dim == 2 && len(p.Vertices) == 3 {
		// The inradius of a triangle is 2·area/perimeter (common practice:
		// the area is the sum of the three triangles on the sides with
		// apex at the incentre, each of height r).
		env[claim.Inradius] = p.Area().MulF(2).Div(p.Perimeter())
	}
	if ph := p.Polyhedron; ph != nil && len(ph.Vertices) == 4 {
		// Every tetrahedron has an inscribed ball, of radius
		// 3·volume/surface area (common practice: the volume is the sum of
		// the four cones on the faces with apex at the incentre, each of
		// height r; certs/hypothesis.Circumsolid proves the same formula
		// for every circumsolid).
		env[claim.Inradius] = ph.Volume().MulF(3).Div(ph.SurfaceArea())
	}
	if alpha, why := p.RobinAlpha(); why == "" {
		env[claim.Alpha] = alpha.Val
	}
	for name, v := range p.Params {
		env[name] = v.Val
	}
	return env
}

// evaluateNamed evaluates the built-in claim text, the i-th claim of p,
// whose certificate has the ground-state block gs (or nil); shapeWhy says
// why shape_margin has no value ("" when env holds it).
func evaluateNamed(p *problem.Problem, gs *certs.GroundState, env map[string]interval.I, shapeWhy string, i int, text string, opt Options) (certs.ClaimResult, error) {
	c, err := named.Lookup(text)
	if err != nil {
		return certs.ClaimResult{}, fmt.Errorf("claim %q: %w", text, err)
	}
	cl := c.Parse()
	var hyps []certs.Hypothesis
	for _, name := range c.Hypotheses {
		h, ok := hypothesis.DecideCertified(name, p, gs)
		if !ok {
			return certs.ClaimResult{}, fmt.Errorf("built-in claim %s: no decision procedure for the hypothesis %q", c.Text(), name)
		}
		hyps = append(hyps, h)
	}
	local := env
	var ref *certs.Reference
	reason := ""
	if c.Reference != "" {
		var gap interval.I
		ref, gap, reason, err = reference(p, c, i, opt)
		if err != nil {
			return certs.ClaimResult{}, err
		}
		if ref != nil {
			local = make(map[string]interval.I, len(env)+1)
			for k, v := range env {
				local[k] = v
			}
			local[c.Reference] = gap
		}
	}
	r := evaluateClaim(cl, local, shapeWhy)
	if reason != "" {
		r.Reason = reason
	}
	r.Text, r.Inequality, r.Hypotheses, r.Reference = c.Text(), c.Inequality, hyps, ref
	return r, nil
}

// referenceTimeLimit is the budget of a reference computation (its target
// is part of its problem, named.ReferenceProblem).
const referenceTimeLimit = 20 * time.Second

// reference returns the certificate of the reference quantity of the
// built-in claim c (the i-th claim of p) and its certified enclosure. When
// the reference cannot be stated for p (no common Robin coefficient, a
// diameter that cannot be written exactly), ref is nil and reason says
// why; the claim is then undecided.
func reference(p *problem.Problem, c named.Claim, i int, opt Options) (ref *certs.Reference, gap interval.I, reason string, err error) {
	if c.ReferenceProblem == nil {
		return nil, gap, "", fmt.Errorf("built-in claim %s: no problem for the reference %q", c.Text(), c.Reference)
	}
	sub, why := referenceProblem(p, c.ReferenceProblem)
	if sub == nil {
		return nil, gap, "the reference gap is not defined for this problem: " + why, nil
	}
	if opt.recorded != nil {
		ref, gap, err = recordedReference(opt.recorded, i, c, sub)
		return ref, gap, "", err
	}
	cert, err := Certify(opt.context(), sub, Options{TimeLimit: referenceTimeLimit, Tool: opt.Tool, Now: opt.Now, Memory: opt.Memory})
	if err != nil {
		return nil, gap, "", fmt.Errorf("reference %s of %s: %w", c.Reference, c.Text(), err)
	}
	data, err := cert.Marshal()
	if err != nil {
		return nil, gap, "", err
	}
	gap, err = referenceValue(cert.Results, c)
	if err != nil {
		return nil, gap, "", err
	}
	return &certs.Reference{Name: c.Reference, Certificate: data}, gap, "", nil
}

// recordedReference takes the reference of the i-th recorded claim,
// demands that it certifies the problem sub and verifies it by Check; the
// enclosure is its recorded gap (which Check has just reproduced).
func recordedReference(rec *certs.Certificate, i int, c named.Claim, sub *problem.Problem) (*certs.Reference, interval.I, error) {
	path := fmt.Sprintf("claims[%d].reference", i)
	mismatch := func(format string, args ...any) error {
		return &MismatchError{Problems: []string{path + ": " + fmt.Sprintf(format, args...)}}
	}
	if i >= len(rec.Claims) || rec.Claims[i].Text != c.Text() || rec.Claims[i].Reference == nil || rec.Claims[i].Reference.Name != c.Reference {
		return nil, interval.I{}, mismatch("the certificate of %s for %s is missing", c.Reference, c.Text())
	}
	ref := rec.Claims[i].Reference
	inner, err := certs.Unmarshal(ref.Certificate)
	if err != nil {
		return nil, interval.I{}, mismatch("%v", err)
	}
	if inner.ProblemSHA256 != sub.SHA256() {
		return nil, interval.I{}, mismatch("certifies another problem than %s", sub.Canonical())
	}
	if err := Check(ref.Certificate); err != nil {
		return nil, interval.I{}, mismatch("%v", err)
	}
	gap, err := referenceValue(inner.Results, c)
	if err != nil {
		return nil, interval.I{}, mismatch("%v", err)
	}
	return ref, gap, nil
}

// referenceValue reads the reference quantity of the built-in claim c from
// the results of its reference certificate: the result the catalogue names
// (named.Claim.ReferenceResult), read back outward.
func referenceValue(r certs.Results, c named.Claim) (interval.I, error) {
	b, ok := r.Quantity(c.ReferenceResult)
	if !ok {
		return interval.I{}, fmt.Errorf("the reference certificate of %s records no %s", c.Text(), c.ReferenceResult)
	}
	return b.Interval()
}

// referenceProblem returns the reference problem r (package
// fem/claim/named) of p, written with the exact texts of the quantities it
// needs (parameters carried over, since those texts may name them), or nil
// and the reason it cannot be stated.
func referenceProblem(p *problem.Problem, r *named.ReferenceProblem) (*problem.Problem, string) {
	inputs := map[string]string{}
	for _, q := range r.Inputs {
		text, why := exactText(p, q)
		if why != "" {
			return nil, why
		}
		inputs[q] = text
	}
	params := map[string]string{}
	for name, v := range p.Params {
		params[name] = v.Text
	}
	sub, err := problem.Parse(r.File(inputs, params))
	if err != nil {
		return nil, "the reference problem is not valid: " + err.Error()
	}
	return sub, ""
}

// exactText returns the exact text of the quantity q of the polygon p (the
// common Robin coefficient, the diameter), or the reason it has none. A
// reference problem in the catalogue that needs another quantity is a
// defect of this package and panics.
func exactText(p *problem.Problem, q string) (string, string) {
	switch q {
	case claim.Alpha:
		alpha, ok := hypothesis.CommonAlpha(p)
		if !ok {
			return "", "the sides do not have one common Robin coefficient"
		}
		return alpha.Text, ""
	case claim.Diameter:
		return diameterText(p)
	}
	panic("certify: no exact text of the quantity " + q + " for a reference problem")
}

// diameterText returns an exact text of the diameter of the polygon, the
// largest distance between two vertices: for rational vertices the square
// root of the largest squared distance (computed exactly), else the square
// root of the max of the squared distances of the pairs whose enclosure
// reaches the largest lower bound (the other pairs are verified shorter, so
// the max over the candidates is the diameter).
func diameterText(p *problem.Problem) (string, string) {
	v := p.Vertices
	rational := true
	for _, q := range v {
		rational = rational && q[0].Rat != nil && q[1].Rat != nil
	}
	if rational {
		best := new(big.Rat)
		for i := range v {
			for j := i + 1; j < len(v); j++ {
				var dx, dy big.Rat
				dx.Sub(v[i][0].Rat, v[j][0].Rat)
				dy.Sub(v[i][1].Rat, v[j][1].Rat)
				dx.Mul(&dx, &dx)
				dy.Mul(&dy, &dy)
				if d2 := dx.Add(&dx, &dy); d2.Cmp(best) > 0 {
					best = new(big.Rat).Set(d2)
				}
			}
		}
		if root, ok := ratSqrt(best); ok {
			return problem.RatText(root), ""
		}
		return "sqrt(" + problem.RatText(best) + ")", ""
	}
	type pair struct {
		d2   interval.I
		text string
	}
	var pairs []pair
	lower := 0.0
	for i := range v {
		for j := i + 1; j < len(v); j++ {
			dx, dy := v[i][0].Val.Sub(v[j][0].Val), v[i][1].Val.Sub(v[j][1].Val)
			d2 := dx.Sqr().Add(dy.Sqr())
			text := fmt.Sprintf("((%s)-(%s))^2+((%s)-(%s))^2", v[i][0].Text, v[j][0].Text, v[i][1].Text, v[j][1].Text)
			pairs = append(pairs, pair{d2, text})
			lower = max(lower, d2.Lo)
		}
	}
	var cand []string
	for _, q := range pairs {
		if q.d2.Hi >= lower {
			cand = append(cand, q.text)
		}
	}
	expr := cand[len(cand)-1]
	for k := len(cand) - 2; k >= 0; k-- {
		expr = "max(" + cand[k] + "," + expr + ")"
	}
	text := "sqrt(" + expr + ")"
	if len(text) > 400 {
		return "", fmt.Sprintf("the diameter's exact text would be %d bytes long (%d candidate pairs of vertices), more than a number may have", len(text), len(cand))
	}
	return text, ""
}

// ratSqrt returns √r when it is rational.
func ratSqrt(r *big.Rat) (*big.Rat, bool) {
	n, d := new(big.Int).Sqrt(r.Num()), new(big.Int).Sqrt(r.Denom())
	if new(big.Int).Mul(n, n).Cmp(r.Num()) != 0 || new(big.Int).Mul(d, d).Cmp(r.Denom()) != 0 {
		return nil, false
	}
	return new(big.Rat).SetFrac(n, d), true
}
