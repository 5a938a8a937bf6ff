package hypothesis

import (
	"math"
	"strconv"
	"testing"

	"gapcert/certs"
	"gapcert/fem/problem"
)

func parse(t *testing.T, src string) *problem.Problem {
	t.Helper()
	p, err := parseProblem(src)
	if err != nil {
		t.Fatalf("%s: %v", src, err)
	}
	return p
}

func parseProblem(src string) (*problem.Problem, error) { return problem.Parse([]byte(src)) }

const (
	square = `{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]}`
	// The L-shape of three unit squares; vertex 3, (1, 1), is re-entrant.
	lshape = `{"polygon":[["0","0"],["2","0"],["2","1"],["1","1"],["1","2"],["0","2"]]}`
	// The same L-shape rotated by 1 radian (irrational coordinates, decided
	// by intervals).
	lshapeRotated = `{"polygon":[["0","0"],["2*cos(1)","2*sin(1)"],["2*cos(1)-sin(1)","2*sin(1)+cos(1)"],["cos(1)-sin(1)","sin(1)+cos(1)"],["cos(1)-2*sin(1)","sin(1)+2*cos(1)"],["-2*sin(1)","2*cos(1)"]]}`
	equilateral   = `{"polygon":[["0","0"],["1","0"],["1/2","sqrt(3)/2"]]}`
	unitTriangle  = `{"polygon":[["0","0"],["1","0"],["0","1"]]}`
)

func problemText(domain, potential, boundary string) string {
	return `{"domain":` + domain + `,"potential":"` + potential + `","boundary":` + boundary + `}`
}

func requireVerdict(t *testing.T, what string, h certs.Hypothesis, want string) {
	t.Helper()
	if h.Verdict != want {
		t.Fatalf("%s: %s (%s), want %s", what, h.Verdict, h.Detail, want)
	}
	if h.Detail == "" {
		t.Errorf("%s: no detail", what)
	}
	if (h.Witness != nil) != (want == certs.Disproven) {
		t.Errorf("%s: witness %+v with verdict %s", what, h.Witness, h.Verdict)
	}
}

// TestConvexDomain: intervals and rectangles are convex, the L-shape is not
// and its re-entrant corner is vertex 3 (1, 1) (elementary geometry, common
// practice), also after an irrational rotation.
func TestConvexDomain(t *testing.T) {
	for _, d := range []string{`{"interval":["0","1"]}`, square, equilateral} {
		requireVerdict(t, d, ConvexDomain(parse(t, problemText(d, "0", `"dirichlet"`))), certs.Proven)
	}
	h := ConvexDomain(parse(t, problemText(lshape, "0", `"dirichlet"`)))
	requireVerdict(t, "L-shape", h, certs.Disproven)
	if *h.Witness.Vertex != 3 || h.Witness.Point[0] != "1" || h.Witness.Point[1] != "1" {
		t.Errorf("L-shape witness %d %v, want vertex 3 (1, 1)", *h.Witness.Vertex, h.Witness.Point)
	}
	h = ConvexDomain(parse(t, problemText(lshapeRotated, "0", `"dirichlet"`)))
	requireVerdict(t, "rotated L-shape", h, certs.Disproven)
	if *h.Witness.Vertex != 3 {
		t.Errorf("rotated L-shape witness vertex %d, want 3", *h.Witness.Vertex)
	}
}

// hessian1D is V″ by calculus (common practice), for checking witnesses.
var hessian1D = map[string]func(float64) float64{
	"-x^2":   func(float64) float64 { return -2 },
	"sin(x)": func(x float64) float64 { return -math.Sin(x) },
	"cos(x)": func(x float64) float64 { return -math.Cos(x) },
	"x^3":    func(x float64) float64 { return 6 * x },
}

// TestConvexPotentialInterval: x², exp(x), x⁴ and cosh(x) are convex
// (V″ ≥ 0), −x², sin(x) on (0, 4) (V″ = −sin x < 0 on (0, π)), cos(x)
// and x³ on (−1, 1) are not (calculus, common practice); the witness point
// lies in the interval and V″ < 0 there. |x| and −|x| are not C² at 0 and
// must not be proven.
func TestConvexPotentialInterval(t *testing.T) {
	for _, tc := range []struct {
		domain, v, want string
	}{
		{`{"interval":["-2","2"]}`, "x^2", certs.Proven},
		{`{"interval":["-1","3"]}`, "exp(x)", certs.Proven},
		{`{"interval":["-1","1"]}`, "x^4", certs.Proven},
		{`{"interval":["-1","1"]}`, "cosh(x) + 3*x", certs.Proven},
		{`{"interval":["0","1"]}`, "2*x - 1/3", certs.Proven},
		{`{"interval":["-2","2"]}`, "-x^2", certs.Disproven},
		{`{"interval":["0","4"]}`, "sin(x)", certs.Disproven},
		{`{"interval":["-1","1"]}`, "cos(x)", certs.Disproven},
		{`{"interval":["-1","1"]}`, "x^3", certs.Disproven},
		{`{"interval":["-1","1"]}`, "-abs(x)", certs.Undecided},
		{`{"interval":["-1","1"]}`, "abs(x)", certs.Undecided},
	} {
		p := parse(t, problemText(tc.domain, tc.v, `"dirichlet"`))
		h := ConvexPotential(p)
		requireVerdict(t, tc.v, h, tc.want)
		if tc.want != certs.Disproven {
			continue
		}
		x, err := strconv.ParseFloat(h.Witness.Point[0], 64) // an exact float printed exactly
		if err != nil {
			t.Fatal(err)
		}
		if x < p.Interval[0].Val.Hi || x > p.Interval[1].Val.Lo || !(hessian1D[tc.v](x) < 0) {
			t.Errorf("%s: witness %g is not a point of the domain with V'' < 0", tc.v, x)
		}
	}
}

// TestConvexPotentialPolygon: x² + y² and e^x + y² + xy/2 are convex
// (Hessians [[2, 0], [0, 2]] and [[e^x, 1/2], [1/2, 2]] with determinant
// 2e^x − 1/4 > 0 for x ≥ 0); exp(x + y) is convex with a singular Hessian
// e^{x+y}[[1, 1], [1, 1]], which interval enclosures of the determinant
// cannot show ≥ 0, so it may stay undecided;
// x·y (det −1) and −y² (H22 = −2) are not; x⁴ − x has Hessian
// [[12x², 0], [0, 0]] ⪰ 0 and must never be disproven (calculus, common
// practice), and on a triangle around x = 0 it is proven (the enclosure
// of 12x² keeps its sign there), as is x⁴ + y⁶ (diag(12x², 30y⁴)). Witness points lie in the polygon.
func TestConvexPotentialPolygon(t *testing.T) {
	for _, tc := range []struct {
		domain, v string
		want      []string
	}{
		{square, "x^2 + y^2", []string{certs.Proven}},
		{lshape, "exp(x) + y^2 + x*y/2", []string{certs.Proven}},
		{lshape, "exp(x + y)", []string{certs.Proven, certs.Undecided}},
		{equilateral, "x^2 + y^2 - 3*x*y/2", []string{certs.Proven}},
		{unitTriangle, "x^4 - x", []string{certs.Proven, certs.Undecided}},
		{`{"polygon":[["-1","-1"],["1","-1"],["0","1"]]}`, "x^4 - x", []string{certs.Proven}},
		{`{"polygon":[["-1","-1"],["1","-1"],["0","1"]]}`, "x^4 + y^6", []string{certs.Proven}},
		{square, "x*y", []string{certs.Disproven}},
		{equilateral, "-y^2", []string{certs.Disproven}},
		{lshape, "sin(x) + y^2", []string{certs.Disproven}},
	} {
		p := parse(t, problemText(tc.domain, tc.v, `"dirichlet"`))
		h := ConvexPotential(p)
		ok := false
		for _, w := range tc.want {
			ok = ok || h.Verdict == w
		}
		if !ok {
			t.Fatalf("%s on %s: %s (%s), want one of %v", tc.v, tc.domain, h.Verdict, h.Detail, tc.want)
		}
		if h.Verdict != certs.Disproven {
			continue
		}
		x, _ := strconv.ParseFloat(h.Witness.Point[0], 64)
		y, _ := strconv.ParseFloat(h.Witness.Point[1], 64)
		inside := false
		for _, tri := range topSimplices(p) {
			inside = inside || insideSimplex(tri, []float64{x, y})
		}
		if !inside {
			t.Errorf("%s: witness (%g, %g) not verified inside", tc.v, x, y)
		}
	}
}

// TestBoundaryHypotheses: the kinds of the sides decide the boundary
// hypotheses exactly; the witness is the first offending side.
func TestBoundaryHypotheses(t *testing.T) {
	p := parse(t, problemText(square, "0", `"dirichlet"`))
	requireVerdict(t, "dirichlet", DirichletBoundary(p), certs.Proven)
	requireVerdict(t, "neumann on dirichlet", NeumannBoundary(p), certs.Disproven)
	requireVerdict(t, "robin on dirichlet", RobinBoundary(p), certs.Disproven)
	requireVerdict(t, "positive alpha on dirichlet", PositiveRobinAlpha(p), certs.Disproven)

	p = parse(t, problemText(square, "0", `["dirichlet","neumann","dirichlet","dirichlet"]`))
	h := DirichletBoundary(p)
	requireVerdict(t, "one neumann side", h, certs.Disproven)
	if *h.Witness.Side != 1 {
		t.Errorf("witness side %d, want 1", *h.Witness.Side)
	}

	p = parse(t, problemText(square, "0", `["neumann",{"robin":"0"},"neumann","neumann"]`))
	requireVerdict(t, "neumann with robin 0", NeumannBoundary(p), certs.Proven)
	requireVerdict(t, "neumann as robin 0", RobinBoundary(p), certs.Proven)
	requireVerdict(t, "positive alpha on robin 0", PositiveRobinAlpha(p), certs.Disproven)
	p = parse(t, problemText(square, "0", `"neumann"`))
	requireVerdict(t, "positive alpha on neumann", PositiveRobinAlpha(p), certs.Disproven)

	p = parse(t, problemText(square, "0", `{"robin":"sqrt(2)"}`))
	requireVerdict(t, "one robin", RobinBoundary(p), certs.Proven)
	requireVerdict(t, "positive alpha on robin sqrt(2)", PositiveRobinAlpha(p), certs.Proven)
	if a, ok := CommonAlpha(p); !ok || a.Text != "sqrt(2)" {
		t.Errorf("common alpha %q %v", a.Text, ok)
	}
	requireVerdict(t, "neumann on robin", NeumannBoundary(p), certs.Disproven)

	p = parse(t, problemText(square, "0", `[{"robin":"1"},{"robin":"1"},{"robin":"2"},{"robin":"1"}]`))
	requireVerdict(t, "positive alpha on two robin", PositiveRobinAlpha(p), certs.Disproven)
	h = RobinBoundary(p)
	requireVerdict(t, "two robin", h, certs.Disproven)
	if *h.Witness.Side != 2 {
		t.Errorf("witness side %d, want 2", *h.Witness.Side)
	}
}

// TestShapeHypotheses: squares and a rotated rectangle with rational
// corners are rectangles; a parallelogram, a triangle and the L-shape are
// not; the triangle hypothesis counts corners.
func TestShapeHypotheses(t *testing.T) {
	rotated := `{"polygon":[["0","0"],["2","1"],["1","3"],["-1","2"]]}` // sides (2, 1) and (−1, 2)
	parallelogram := `{"polygon":[["0","0"],["2","0"],["3","1"],["1","1"]]}`
	for _, d := range []string{square, rotated} {
		requireVerdict(t, d, Rectangle(parse(t, problemText(d, "0", `"dirichlet"`))), certs.Proven)
	}
	for _, d := range []string{parallelogram, unitTriangle, equilateral, lshape} {
		requireVerdict(t, d, Rectangle(parse(t, problemText(d, "0", `"dirichlet"`))), certs.Disproven)
	}
	requireVerdict(t, "triangle", Triangle(parse(t, problemText(equilateral, "0", `"dirichlet"`))), certs.Proven)
	requireVerdict(t, "square", Triangle(parse(t, problemText(square, "0", `"dirichlet"`))), certs.Disproven)
}

// TestZeroPotential: "0" and x − x are the zero polynomial; x on (0, 1)
// and 1 + sin(x·y) are not 0 at the witness point.
func TestZeroPotential(t *testing.T) {
	requireVerdict(t, "0", ZeroPotential(parse(t, problemText(square, "0", `"dirichlet"`))), certs.Proven)
	requireVerdict(t, "x - x", ZeroPotential(parse(t, problemText(square, "x - x", `"dirichlet"`))), certs.Proven)
	requireVerdict(t, "x", ZeroPotential(parse(t, problemText(`{"interval":["0","1"]}`, "x", `"dirichlet"`))), certs.Disproven)
	requireVerdict(t, "1 + sin(x*y)", ZeroPotential(parse(t, problemText(lshape, "1 + sin(x*y)", `"dirichlet"`))), certs.Disproven)
}

// TestDecideNames: every hypothesis name resolves.
func TestDecideNames(t *testing.T) {
	p := parse(t, problemText(square, "0", `"dirichlet"`))
	for name := range deciders {
		if h, ok := Decide(name, p); !ok || h.Name != name {
			t.Errorf("%s: %v %q", name, ok, h.Name)
		}
	}
	if _, ok := Decide("no_such_hypothesis", p); ok {
		t.Errorf("unknown name accepted")
	}
}
