package hypothesis

import (
	"strings"
	"testing"

	"gapcert/certs"
	"gapcert/fem/claim/named"
)

// TestProductHypotheses: on products of three or four coordinates the
// hypotheses about the domain and the potential are decided from the
// factors (proven when every factor's is; convexity of the domain and of V
// disproven with the factor's witness; undecided with the factor named
// otherwise), those about the conditions from the faces, the product of
// circumsolids from the factors, and the polygon shapes are undecided.
func TestProductHypotheses(t *testing.T) {
	const square = `{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]}`
	const lshape = `{"polygon":[["0","0"],["2","0"],["2","1"],["1","1"],["1","2"],["0","2"]]}`
	box := parse(t, problemText(`{"product":[`+square+`,{"interval":["0","1"]}]}`, "x^2+y^2+z^4", `"dirichlet"`))
	for _, name := range []string{named.ConvexDomain, named.ConvexPotential, named.ContinuousPotential, named.DirichletBoundary} {
		h, _ := Decide(name, box)
		requireVerdict(t, "square prism: "+name, h, certs.Proven)
	}
	h, _ := Decide(named.ZeroPotential, box)
	requireVerdict(t, "square prism: zero potential", h, certs.Undecided)
	h, _ = Decide(named.NeumannBoundary, box)
	requireVerdict(t, "square prism: neumann", h, certs.Disproven)

	// An L-shaped prism is not convex: disproven, at the re-entrant
	// vertex (1, 1) of the L-shape with z = 0.
	l := parse(t, problemText(`{"product":[`+lshape+`,{"interval":["0","1"]}]}`, "0", `"dirichlet"`))
	h, _ = Decide(named.ConvexDomain, l)
	requireVerdict(t, "L prism: convex domain", h, certs.Disproven)
	if !strings.Contains(h.Detail, "factor 0") || strings.Join(h.Witness.Point, ",") != "1,1,0" {
		t.Errorf("L prism: detail %q, witness %v", h.Detail, h.Witness.Point)
	}
	h, _ = Decide(named.ZeroPotential, l)
	requireVerdict(t, "L prism: zero potential", h, certs.Proven)

	// A concave part (−w², second derivative −2) makes V not convex on
	// the product: the witness lies on the w axis of the box, with the
	// other coordinates 0.
	c := parse(t, problemText(`{"product":[{"interval":["0","1"]},{"interval":["0","1"]},{"interval":["0","1"]},{"interval":["0","1"]}]}`, "x^2-w^2", `"neumann"`))
	h, _ = Decide(named.ConvexPotential, c)
	requireVerdict(t, "4D box: convex potential", h, certs.Disproven)
	if pt := h.Witness.Point; !strings.Contains(h.Detail, "factor 3") || len(pt) != 4 || pt[0] != "0" || pt[1] != "0" || pt[2] != "0" {
		t.Errorf("4D box: detail %q, witness %v", h.Detail, pt)
	}
	h, _ = Decide(named.NeumannBoundary, c)
	requireVerdict(t, "4D box: neumann", h, certs.Proven)
	h, _ = Decide(named.Triangle, c)
	requireVerdict(t, "4D box: triangle", h, certs.Undecided)
	h, _ = Decide(CircumsolidProduct, c)
	requireVerdict(t, "4D box: product of circumsolids", h, certs.Proven)

	// A prism over a square is a product of circumsolids; over the
	// L-shape (not convex, so neither tangential nor a rectangle) it is
	// not, naming the factor.
	h, _ = Decide(CircumsolidProduct, box)
	requireVerdict(t, "square prism: product of circumsolids", h, certs.Proven)
	h, _ = Decide(CircumsolidProduct, l)
	requireVerdict(t, "L prism: product of circumsolids", h, certs.Disproven)
	if !strings.Contains(h.Detail, "factor 0") {
		t.Errorf("L prism: detail %q", h.Detail)
	}
	// The prism over the trapezoid (0,0), (3,0), (2,1), (0,1) (Pitot:
	// 3 + 1 ≠ 1 + √2, so not tangential; the corner at (3, 0) is not
	// right) is no product of circumsolids; the witness is the product's
	// face over the factor's witness side (faces of factor 0 come first).
	trap := parse(t, problemText(`{"product":[{"polygon":[["0","0"],["3","0"],["2","1"],["0","1"]]},{"interval":["0","1"]}]}`, "0", `"neumann"`))
	h, _ = Decide(CircumsolidProduct, trap)
	requireVerdict(t, "trapezoid prism: product of circumsolids", h, certs.Disproven)
	if h.Witness == nil || h.Witness.Side == nil || *h.Witness.Side > 3 {
		t.Errorf("trapezoid prism: witness %+v", h.Witness)
	}
	// A prism over a non-convex factor in four coordinates: undecided.
	l4 := parse(t, problemText(`{"product":[`+lshape+`,{"interval":["0","1"]},{"interval":["0","1"]}]}`, "0", `"dirichlet"`))
	h, _ = Decide(CircumsolidProduct, l4)
	requireVerdict(t, "L × square: product of circumsolids", h, certs.Undecided)
}
