package hypothesis

import (
	"fmt"
	"strings"

	"gapcert/certs"
	"gapcert/fem/claim/named"
	"gapcert/fem/problem"
)

// decideProduct decides the hypotheses about the domain and the potential
// on a product of three or four coordinates from its factors (each a lone
// interval or polygon with its part V_i of the separable potential,
// problem.Problem.FactorFile), by the rules below; ok is false for the
// hypotheses about the boundary conditions, which the general deciders
// decide from the faces' conditions (Problem.Boundary lists one per face).
//
//   - convex_domain: a product of convex sets is convex (for points a, b
//     of the product, each component of (1 − t)a + tb lies in its convex
//     factor), so it is proven when every factor's is. A non-convex factor
//     makes the product non-convex (a segment leaving that factor, the
//     other components fixed, leaves the product): disproven, with the
//     factor's witness point completed by a point of each other factor.
//   - convex_potential, zero_potential, continuous_potential:
//     V(x_1, …, x_F) = Σ V_i(x_i) is convex (continuous, ≡ 0) when every
//     V_i is (a sum of convex functions, each convex in the whole variable
//     since it is constant in the others; a sum of continuous functions; a
//     sum of zeros), so each is proven when every factor's is. A part
//     whose Hessian is not positive semidefinite at a point makes V's
//     block-diagonal Hessian indefinite at every point of the product
//     with those coordinates on its factor: disproven, with the factor's
//     witness completed as for convex_domain. Otherwise undecided, naming
//     the first factor whose verdict is not proven (a part ≠ 0 does not
//     make V ≠ 0: the parts may cancel).
//   - circumsolid_product: a product whose every factor is a product of
//     circumsolids (an interval always; a polygon that is tangential or a
//     rectangle, see ProductOfCircumsolids) is one, so it is proven when
//     every factor's is. The product Q × I of a polygon Q and an interval
//     I is disproven when Q is (neither tangential nor a rectangle): by
//     the classification of polyhedronProduct it would be a circumsolid
//     or a right prism over a tangential polygon or a rectangle. A ball
//     in Q × I touching the lateral faces (sides of Q) × I has a centre
//     whose projection to Q lies at the ball's radius from every side's
//     line, on the inner side, so Q would be tangential (the system of
//     Tangential); and Q × I is a right prism over one of its faces only
//     over Q × {end} or, when Q × {end} is a lateral rectangle of another
//     prism structure, Q is a rectangle. The witness is the face of the
//     product over the factor's witness side. Otherwise undecided,
//     naming the factor.
//   - the polygon shapes (triangle, rectangle, tangential polygon):
//     undecided, decided for polygons only.
//
// On a domain of three or four coordinates that is not a product, the
// same hypotheses are undecided (their deciders read intervals and
// polygons), with that reason.
func decideProduct(name string, p *problem.Problem) (certs.Hypothesis, bool) {
	h := certs.Hypothesis{Name: name}
	if !p.IsProduct() {
		switch name {
		case named.ConvexDomain, named.ConvexPotential, named.ZeroPotential, named.ContinuousPotential,
			named.Triangle, named.Rectangle, TangentialPolygon, CircumsolidProduct:
			return undecidedAt(h, fmt.Sprintf("decided for intervals, polygons and products only; the domain has %d coordinates and is not a product", p.Dim)), true
		}
		return certs.Hypothesis{}, false
	}
	var rule string
	switch name {
	case named.ConvexDomain:
		rule = "a product of convex sets is convex"
	case named.ConvexPotential:
		rule = "V is the sum of the parts, each convex in the whole variable"
	case named.ZeroPotential:
		rule = "V is the sum of the parts"
	case named.ContinuousPotential:
		rule = "V is the sum of the parts, each continuous"
	case CircumsolidProduct:
		rule = "a product of products of circumsolids is a product of circumsolids"
	case named.Triangle, named.Rectangle, TangentialPolygon:
		return undecidedAt(h, fmt.Sprintf("decided for polygons only; the domain is a product of %d coordinates", p.Dim)), true
	default:
		return certs.Hypothesis{}, false
	}
	subs := make([]*problem.Problem, p.Factors())
	for i := range subs {
		sub, err := problem.Parse(p.FactorFile(i, problem.DefaultEigenvalues, problem.DefaultRelWidth))
		if err != nil {
			return undecidedAt(h, fmt.Sprintf("the problem of factor %d does not read: %v", i, err)), true
		}
		subs[i] = sub
	}
	var details []string
	for i, sub := range subs {
		f, ok := Decide(name, sub)
		if !ok {
			return certs.Hypothesis{}, false
		}
		if f.Verdict == certs.Disproven && (name == named.ConvexDomain || name == named.ConvexPotential) && len(f.Witness.Point) > 0 {
			why := "a segment that leaves factor %d, the other coordinates fixed, leaves the product"
			if name == named.ConvexPotential {
				why = "the Hessian of V is block diagonal with the Hessian of the part of factor %d as a block"
			}
			return disproven(h, fmt.Sprintf("disproven on factor %d (%s), and "+why, i, f.Detail, i), &certs.Witness{Point: productPoint(subs, i, f.Witness.Point)}), true
		}
		if f.Verdict == certs.Disproven && name == CircumsolidProduct && p.Dim == 3 && sub.Dim == 2 {
			return disproven(h, fmt.Sprintf("factor %d is neither tangential nor a rectangle (%s), so the prism over it is not a product of circumsolids", i, f.Detail), productFaceWitness(subs, i, f.Witness)), true
		}
		if f.Verdict != certs.Proven {
			what := "not decided"
			if f.Verdict == certs.Disproven {
				what = "disproven"
			}
			return undecidedAt(h, fmt.Sprintf("on factor %d it is %s: %s", i, what, f.Detail)), true
		}
		details = append(details, fmt.Sprintf("factor %d: %s", i, f.Detail))
	}
	return proven(h, fmt.Sprintf("proven on every factor (%s), and %s", strings.Join(details, "; "), rule)), true
}

// productPoint returns the point of the product whose coordinates on
// factor i are pt and on every other factor those of a point of its
// closed domain (the left end of an interval, vertex 0 of a polygon), as
// exact texts in the order of the product's coordinates.
func productPoint(subs []*problem.Problem, i int, pt []string) []string {
	var out []string
	for k, sub := range subs {
		switch {
		case k == i:
			out = append(out, pt...)
		case sub.Dim == 1:
			out = append(out, sub.Interval[0].Text)
		default:
			out = append(out, sub.Vertices[0][0].Text, sub.Vertices[0][1].Text)
		}
	}
	return out
}

// productFaceWitness maps the witness of factor i (a side of its own) to
// the product's face over that side: Boundary lists the faces factor by
// factor (fem/problem), sides of factor 0 first. A witness without a side
// keeps only its point, completed to a point of the product.
func productFaceWitness(subs []*problem.Problem, i int, w *certs.Witness) *certs.Witness {
	out := &certs.Witness{}
	if w.Side != nil {
		face := *w.Side
		for _, sub := range subs[:i] {
			face += len(sub.Boundary)
		}
		out.Side = intPtr(face)
	}
	if len(w.Point) > 0 {
		out.Point = productPoint(subs, i, w.Point)
	}
	if out.Side == nil && out.Point == nil {
		panic("hypothesis: a disproven factor without a side or a point")
	}
	return out
}
