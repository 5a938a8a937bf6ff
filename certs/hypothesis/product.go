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
//     other components fixed, leaves the product), but the witnesses of
//     this format are points of a polygon, so the verdict is then
//     undecided with that reason.
//   - convex_potential, zero_potential, continuous_potential:
//     V(x_1, …, x_F) = Σ V_i(x_i) is convex (continuous, ≡ 0) when every
//     V_i is (a sum of convex functions, each convex in the whole variable
//     since it is constant in the others; a sum of continuous functions; a
//     sum of zeros), so each is proven when every factor's is; otherwise
//     undecided, naming the first factor whose verdict is not proven.
//   - circumsolid_product: a product whose every factor is a product of
//     circumsolids (an interval always; a polygon that is tangential or a
//     rectangle, see ProductOfCircumsolids) is one, so it is proven when
//     every factor's is; otherwise undecided, naming the factor.
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
	var details []string
	for i := range p.Factors() {
		sub, err := problem.Parse(p.FactorFile(i, problem.DefaultEigenvalues, problem.DefaultRelWidth))
		if err != nil {
			return undecidedAt(h, fmt.Sprintf("the problem of factor %d does not read: %v", i, err)), true
		}
		f, ok := Decide(name, sub)
		if !ok {
			return certs.Hypothesis{}, false
		}
		if f.Verdict != certs.Proven {
			what := "not decided"
			if f.Verdict == certs.Disproven {
				what = "disproven"
				if name == named.ConvexDomain || name == named.ConvexPotential {
					what += ", so it fails on the product too, but witnesses of this format are points of a polygon"
				}
			}
			return undecidedAt(h, fmt.Sprintf("on factor %d it is %s: %s", i, what, f.Detail)), true
		}
		details = append(details, fmt.Sprintf("factor %d: %s", i, f.Detail))
	}
	return proven(h, fmt.Sprintf("proven on every factor (%s), and %s", strings.Join(details, "; "), rule)), true
}
