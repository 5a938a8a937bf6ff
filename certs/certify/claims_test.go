package certify

import (
	"context"
	"encoding/json"
	"errors"
	"math/big"
	"strings"
	"testing"

	"gapcert/certs"
	"gapcert/fem/claim"
	"gapcert/fem/claim/named"
	"gapcert/fem/problem"
	"gapcert/interval"
)

// certifyClaims certifies src at relWidth with a fixed time and the ample
// time limit and returns the certificate as written and as read back.
func certifyClaims(t *testing.T, src string, relWidth float64) ([]byte, *certs.Certificate) {
	t.Helper()
	return certifyClaimsWith(t, src, Options{RelWidth: widthText(relWidth), TimeLimit: ampleLimit})
}

// certifyClaimsWith certifies src with opt (at the fixed time, named as
// a test) and returns the certificate as written and as read back.
func certifyClaimsWith(t *testing.T, src string, opt Options) ([]byte, *certs.Certificate) {
	t.Helper()
	p, err := problem.Parse([]byte(src))
	if err != nil {
		t.Fatalf("problem %s: %v", src, err)
	}
	opt.Now, opt.Tool = fixedTime, "gapcert test"
	c, err := Certify(context.Background(), p, opt)
	if err != nil {
		t.Fatalf("certify %s: %v", src, err)
	}
	data, err := c.Marshal()
	if err != nil {
		t.Fatal(err)
	}
	back, err := certs.Unmarshal(data)
	if err != nil {
		t.Fatalf("certificate does not read back: %v", err)
	}
	return data, back
}

func claimByText(t *testing.T, c *certs.Certificate, text string) certs.ClaimResult {
	t.Helper()
	for _, r := range c.Claims {
		if r.Text == text {
			return r
		}
	}
	t.Fatalf("no claim %q", text)
	return certs.ClaimResult{}
}

func hypothesisVerdicts(r certs.ClaimResult) map[string]string {
	m := map[string]string{}
	for _, h := range r.Hypotheses {
		m[h.Name] = h.Verdict
	}
	return m
}

func requireAllProven(t *testing.T, r certs.ClaimResult) {
	t.Helper()
	c, err := named.Lookup(r.Text)
	if err != nil {
		t.Fatal(err)
	}
	v := hypothesisVerdicts(r)
	for _, name := range c.Hypotheses {
		if v[name] != certs.Proven {
			t.Errorf("%s: hypothesis %s is %q, want proven", r.Text, name, v[name])
		}
	}
}

func marginOf(t *testing.T, r certs.ClaimResult) interval.I {
	t.Helper()
	m, err := r.Margin.Interval()
	if err != nil {
		t.Fatal(err)
	}
	return m
}

func requireVerifies(t *testing.T, what string, data []byte) {
	t.Helper()
	if err := Check(data); err != nil {
		t.Fatalf("%s: fresh certificate does not verify: %v", what, err)
	}
}

// TestEquilateralTriangleGapEquality: for the equilateral triangle with
// Dirichlet conditions and V = 0, D²(λ2 − λ1) = 64π²/9 exactly (λ1, λ2 =
// 3, 7 times 16π²/9ℓ², Pinsky 1980; Lu and Rowlett, Comm. Math. Phys. 319
// (2013) 111–145, equality case of their bound). So the strict claim may
// never hold, the claim with a 1e-6 allowance must hold (the enclosure is
// narrow enough), and the built-in claim must not hold either; its
// hypotheses are proven. The inradius √3/6 (common practice) gives
// 12·inradius² = 1.
func TestEquilateralTriangleGapEquality(t *testing.T) {
	src := `{"domain":{"polygon":[["0","0"],["1","0"],["1/2","sqrt(3)/2"]]},"boundary":"dirichlet",
		"claims":["D^2*gap > 64*pi^2/9","D^2*gap >= 64*pi^2/9 - 1e-6","@triangle_gap","12*inradius^2 >= 0.9999999","12*inradius^2 <= 1.0000001"]}`
	data, c := certifyClaims(t, src, 1e-9)
	if v := c.Claims[0].Verdict; v == certs.Holds {
		t.Errorf("strict equality claim holds: margin %v", c.Claims[0].Margin)
	}
	if v := c.Claims[1].Verdict; v != certs.Holds {
		t.Errorf("claim with allowance 1e-6: %s, margin %v", v, c.Claims[1].Margin)
	}
	r := claimByText(t, c, "@triangle_gap")
	if r.Verdict == certs.Holds || r.Inequality != "D^2*gap >= 64*pi^2/9" {
		t.Errorf("@triangle_gap: %s (%s)", r.Verdict, r.Inequality)
	}
	if m := marginOf(t, r); !m.ContainsZero() || m.Wid() > 1e-6 {
		t.Errorf("@triangle_gap margin %v does not enclose 0 narrowly", m)
	}
	requireAllProven(t, r)
	for _, k := range []int{3, 4} {
		if c.Claims[k].Verdict != certs.Holds {
			t.Errorf("%s: %s (%s)", c.Claims[k].Text, c.Claims[k].Verdict, c.Claims[k].Reason)
		}
	}
	requireVerifies(t, "equilateral", data)
}

// TestUnitSquareFundamentalGap: Dirichlet unit square, λ1 = 2π², λ2 = 5π²
// (separation of variables, common practice), so gap = 3π² and
// 3π²/D² = 3π²/2: the built-in claim holds with margin 3π²/2 and proven
// hypotheses (convex square, V = 0 convex).
func TestUnitSquareFundamentalGap(t *testing.T) {
	data, c := certifyClaims(t, `{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},"boundary":"dirichlet","claims":["@fundamental_gap"]}`, 1e-5)
	r := claimByText(t, c, "@fundamental_gap")
	if r.Verdict != certs.Holds {
		t.Fatalf("verdict %s, margin %v", r.Verdict, r.Margin)
	}
	requireAllProven(t, r)
	requireEnclosure(t, "margin", marginOf(t, r), interval.Pi().Sqr().MulF(1.5), 1, 1e-4)
	requireVerifies(t, "square", data)
}

// TestLShapeNotConvex: the L-shape of three unit squares is not convex; the
// fundamental-gap claim reports the re-entrant vertex (1, 1), index 3
// (elementary geometry, common practice).
func TestLShapeNotConvex(t *testing.T) {
	data, c := certifyClaims(t, `{"domain":{"polygon":[["0","0"],["2","0"],["2","1"],["1","1"],["1","2"],["0","2"]]},"boundary":"dirichlet","claims":["@fundamental_gap"]}`, 0.1)
	r := claimByText(t, c, "@fundamental_gap")
	var convex *certs.Hypothesis
	for i := range r.Hypotheses {
		if r.Hypotheses[i].Name == named.ConvexDomain {
			convex = &r.Hypotheses[i]
		}
	}
	if convex == nil || convex.Verdict != certs.Disproven || convex.Witness == nil || convex.Witness.Vertex == nil {
		t.Fatalf("convexity of the L-shape: %+v", convex)
	}
	if *convex.Witness.Vertex != 3 || strings.Join(convex.Witness.Point, ",") != "1,1" {
		t.Errorf("witness vertex %d at %v, want 3 at (1, 1)", *convex.Witness.Vertex, convex.Witness.Point)
	}
	requireVerifies(t, "L-shape", data)
}

// TestIntervalPotentialConvexity: on intervals the built-in fundamental
// gap claim decides convexity of V: x² is convex, −x² and sin x on (0, 4)
// are not (V″ = −2, −sin x; calculus, common practice). The gap of the
// harmonic oscillator on (−2, 2) exceeds 3π²/D² (Lavine 1994; the claim
// holds) and each certificate verifies.
func TestIntervalPotentialConvexity(t *testing.T) {
	for _, tc := range []struct {
		domain, v, want string
	}{
		{`["-2","2"]`, "x^2", certs.Proven},
		{`["-2","2"]`, "-x^2", certs.Disproven},
		{`["0","4"]`, "sin(x)", certs.Disproven},
	} {
		src := `{"domain":{"interval":` + tc.domain + `},"potential":"` + tc.v + `","boundary":"dirichlet","claims":["@fundamental_gap"]}`
		data, c := certifyClaims(t, src, 1e-8)
		r := claimByText(t, c, "@fundamental_gap")
		if got := hypothesisVerdicts(r)[named.ConvexPotential]; got != tc.want {
			t.Errorf("%s: convexity %s, want %s", tc.v, got, tc.want)
		}
		if tc.want == certs.Proven {
			requireAllProven(t, r)
			if r.Verdict != certs.Holds {
				t.Errorf("%s: fundamental gap %s, margin %v", tc.v, r.Verdict, r.Margin)
			}
		}
		requireVerifies(t, tc.v, data)
	}
}

// TestUnitSquarePayneWeinberger: Neumann unit square, λ2 = π² (common
// practice), D² = 2: λ2 ≥ π²/D² (Payne and Weinberger 1960) holds with
// margin π²/2 and proven hypotheses.
func TestUnitSquarePayneWeinberger(t *testing.T) {
	data, c := certifyClaims(t, `{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},"boundary":"neumann","claims":["@payne_weinberger"]}`, 1e-6)
	r := claimByText(t, c, "@payne_weinberger")
	if r.Verdict != certs.Holds {
		t.Fatalf("verdict %s, margin %v", r.Verdict, r.Margin)
	}
	requireAllProven(t, r)
	requireEnclosure(t, "margin", marginOf(t, r), interval.Pi().Sqr().MulF(0.5), 1, 1e-5)
	requireVerifies(t, "Neumann square", data)
}

// robinRectangle is a rectangle of our own, (0, 3/2) × (0, 1), α = 1 on
// every side; its diameter is √13/2.
// Its second claim has a disproven hypothesis (Neumann sides), with a
// witness side.
const robinRectangle = `{"domain":{"polygon":[["0","0"],["3/2","0"],["3/2","1"],["0","1"]]},"boundary":{"robin":"1"},"claims":["@robin_comparison","@payne_weinberger"]}`

// TestRobinComparisonRectangle: on a rectangle the Robin gap is at least
// the gap of the interval (0, D) with the same α (Laugesen,
// arXiv:1905.07658, rectangular boxes): the claim holds, all hypotheses
// are proven, and the recorded reference gap contains the gap of the Robin
// interval of length √13/2 computed independently (roots of the Robin
// secular equation in big.Float, oracle_test.go); the rectangle's gap
// contains μ2 − μ1 of its long side (separation of variables).
func TestRobinComparisonRectangle(t *testing.T) {
	data, c := certifyClaims(t, robinRectangle, 1e-6)
	r := claimByText(t, c, "@robin_comparison")
	if r.Verdict != certs.Holds {
		t.Fatalf("verdict %s, margin %v (%s)", r.Verdict, r.Margin, r.Reason)
	}
	requireAllProven(t, r)
	if r.Reference == nil || r.Reference.Name != named.RobinIntervalGap {
		t.Fatalf("no reference recorded")
	}
	inner, err := certs.Unmarshal(r.Reference.Certificate)
	if err != nil {
		t.Fatal(err)
	}
	sub, err := problem.Parse(inner.Problem)
	if err != nil {
		t.Fatal(err)
	}
	if sub.Dim != 1 || sub.Interval[0].Text != "0" || sub.Interval[1].Text != "sqrt(3.25)" || sub.Boundary[0].Alpha.Text != "1" || sub.Boundary[1].Alpha.Text != "1" {
		t.Errorf("reference problem %s", sub.Canonical())
	}
	length := new(big.Float).SetPrec(oraclePrec).Sqrt(bigDec("3.25"))
	one := end{alpha: "1"}
	gapOf := func(l string) *big.Float {
		g := constantPotentialEigenvalue(2, l, "0", one, one)
		return g.Sub(g, constantPotentialEigenvalue(1, l, "0", one, one))
	}
	refGap, _ := inner.Results.Gap.Interval()
	requireBig(t, "reference gap", refGap, gapOf(length.Text('g', 60)), 1, 1e-9)
	gap, _ := c.Results.Gap.Interval()
	requireBig(t, "rectangle gap", gap, gapOf("1.5"), 1, 1e-5)
	requireVerifies(t, "Robin rectangle", data)
}

// TestRobinComparisonTampering: check re-verifies the reference
// certificate, so editing its gap, replacing it by a certificate of
// another interval, or dropping it are all detected, and so are edits of
// the hypotheses, witnesses and inequalities of built-in claims.
func TestRobinComparisonTampering(t *testing.T) {
	data, _ := certifyClaims(t, robinRectangle, 1e-4)
	_, other := certifyClaims(t, `{"domain":{"interval":["0","2"]},"boundary":{"robin":"1"},"target":{"relative_width":"1e-10"}}`, 0)
	otherData, _ := other.Marshal()
	for _, tc := range []struct {
		name string
		edit func(c *certs.Certificate)
	}{
		{"edited reference gap", func(c *certs.Certificate) {
			inner, _ := certs.Unmarshal(c.Claims[0].Reference.Certificate)
			inner.Results.Gap.Lower = "4.05"
			c.Claims[0].Reference.Certificate, _ = inner.Marshal()
		}},
		{"reference of another interval", func(c *certs.Certificate) { c.Claims[0].Reference.Certificate = otherData }},
		{"dropped reference", func(c *certs.Certificate) { c.Claims[0].Reference = nil }},
		{"edited hypothesis", func(c *certs.Certificate) { c.Claims[0].Hypotheses[3].Verdict = certs.Undecided }},
		{"edited hypothesis detail", func(c *certs.Certificate) { c.Claims[0].Hypotheses[0].Detail = "every side is fine" }},
		{"edited witness", func(c *certs.Certificate) { *c.Claims[1].Hypotheses[0].Witness.Side = 1 }},
		{"edited inequality", func(c *certs.Certificate) { c.Claims[1].Inequality = "lambda2 >= 0" }},
	} {
		c, err := certs.Unmarshal(data)
		if err != nil {
			t.Fatal(err)
		}
		tc.edit(c)
		edited, err := c.Marshal()
		if err != nil {
			t.Fatal(err)
		}
		err = Check(edited)
		var mm *MismatchError
		if !errors.As(err, &mm) {
			t.Errorf("%s: want a mismatch report, got %v", tc.name, err)
		}
	}
}

// TestRobinComparisonOtherPolygons: on the equilateral triangle (irrational
// vertices) the diameter is written as an exact max of squared distances,
// and the rectangle hypothesis is disproven (the comparison is then the
// open conjecture); with unequal Robin coefficients the reference is not
// defined and the claim is undecided with a reason. Both verify.
func TestRobinComparisonOtherPolygons(t *testing.T) {
	data, c := certifyClaims(t, `{"domain":{"polygon":[["0","0"],["1","0"],["1/2","sqrt(3)/2"]]},"boundary":{"robin":"2"},"claims":["@robin_comparison"]}`, 1e-3)
	r := claimByText(t, c, "@robin_comparison")
	if hypothesisVerdicts(r)[named.Rectangle] != certs.Disproven || r.Reference == nil {
		t.Fatalf("triangle: %+v", r)
	}
	inner, _ := certs.Unmarshal(r.Reference.Certificate)
	if !strings.Contains(string(inner.Problem), "sqrt(max(") {
		t.Errorf("reference problem %s", inner.Problem)
	}
	// D = 1 (common practice): the reference interval is (0, 1).
	d, _ := inner.Results.Diameter.Interval()
	requireEnclosure(t, "reference length", d, interval.Point(1), 1, 1e-15)
	requireVerifies(t, "Robin triangle", data)

	data, c = certifyClaims(t, `{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},"boundary":[{"robin":"1"},{"robin":"2"},{"robin":"1"},{"robin":"2"}],"claims":["@robin_comparison"]}`, 1e-2)
	r = claimByText(t, c, "@robin_comparison")
	if r.Verdict != certs.Undecided || r.Reference != nil || !strings.Contains(r.Reason, "common Robin coefficient") {
		t.Errorf("unequal Robin: %s, %q", r.Verdict, r.Reason)
	}
	requireVerifies(t, "unequal Robin", data)
}

// TestBuiltinClaimJSON: a certificate with built-in claims writes the
// hypotheses and the reference, and a claim's fields survive the round
// trip (the reference certificate is itself a complete certificate).
func TestBuiltinClaimJSON(t *testing.T) {
	data, c := certifyClaims(t, robinRectangle, 1e-3)
	var raw struct {
		Claims []map[string]json.RawMessage `json:"claims"`
	}
	if err := json.Unmarshal(data, &raw); err != nil {
		t.Fatal(err)
	}
	for _, key := range []string{"text", "inequality", "verdict", "margin", "hypotheses", "reference"} {
		if _, ok := raw.Claims[0][key]; !ok {
			t.Errorf("claim key %q missing", key)
		}
	}
	again, err := c.Marshal()
	if err != nil || string(again) != string(data) {
		t.Errorf("round trip changed the certificate (%v)", err)
	}
}

// TestClaimEnvMatchesScope: claimEnv gives a value to exactly the
// quantities that problem.Parse lets a claim name (ClaimScope), so a valid
// problem's claims never meet a name without a value. The exception is
// shape_margin, a value of the ground-state block: evaluateClaims takes it
// from shapeMargin, or records why there is none
// (TestShapeMarginWithoutValue).
func TestClaimEnvMatchesScope(t *testing.T) {
	for _, src := range []string{
		`{"domain":{"interval":["0","1"]},"boundary":"dirichlet"}`,
		`{"domain":{"interval":["0","1"]},"boundary":["neumann",{"robin":"2"}],"eigenvalues":4}`,
		`{"domain":{"interval":["0","1"]},"boundary":[{"robin":"1"},{"robin":"2"}]}`,
		`{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},"boundary":"dirichlet","eigenvalues":3}`,
		`{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},"boundary":[{"robin":"1/2"},"dirichlet",{"robin":"0.5"},"neumann"]}`,
		`{"domain":{"polygon":[["0","0"],["1","0"],["0","1"]]},"boundary":{"robin":"a"},"parameters":{"a":"3"}}`,
		`{"domain":{"polygon":[["0","0"],["1","0"],["0","1"]]},"boundary":"dirichlet","parameters":{"alpha":"3"},"eigenvalues":20}`,
		cubePolyhedron("dirichlet", "0"),
		`{"domain": {"polyhedron": {"vertices": [["0","0","0"],["1","0","0"],["0","1","0"],["0","0","1"]], "faces": [[0,2,1],[0,1,3],[0,3,2],[1,2,3]]}}, "boundary": {"robin": "1"}}`,
		`{"domain": {"product": [{"polygon": [["0","0"],["1","0"],["0","1"]]}, {"interval": ["0","1"]}]}, "boundary": ["dirichlet", "neumann"]}`,
	} {
		p, err := problem.Parse([]byte(src))
		if err != nil {
			t.Fatalf("%s: %v", src, err)
		}
		res := &result{lambda: make([]interval.I, p.Eigenvalues), gap: interval.Point(1)}
		env := claimEnv(p, res)
		scope := p.ClaimScope()
		for _, name := range append(claim.Quantities(), scope.Params...) {
			why, _ := scope.Unavailable(name)
			if name == claim.ShapeMargin {
				if _, has := env[name]; has {
					t.Errorf("%s: claimEnv gives shape_margin a value without the ground-state block", src)
				}
				continue
			}
			if _, has := env[name]; has != (why == "") {
				t.Errorf("%s: %s has a value %v, available %v (%s)", src, name, has, why == "", why)
			}
		}
	}
}
