package certify

import (
	"fmt"
	"math/big"
	"strings"
	"testing"

	"gapcert/certs"
	"gapcert/interval"
)

// TestProductPartsRenamedToFactorCoordinates: each factor's part of the
// potential is renamed to the factor's own coordinates. On (0, 1) × the
// rectangle (0, 2) × (0, 1) (a polygon), V = y² is the polygon's first
// coordinate squared, so the product's λ_k are the lowest sums
// π²j² + μ_i + π²l² with μ_i the eigenvalues of −u″ + x²u on (0, 2)
// (separation of variables, common practice); a wrong renaming (y² kept as
// the polygon's second coordinate, on (0, 1)) moves λ1 by about 0.3 and
// λ2 by several units. The polygon × interval order, V = z², gives the
// interval its x. The 1D certifier's enclosures of μ_i (and of the
// interval's eigenvalues with x²) must overlap the product's.
func TestProductPartsRenamedToFactorCoordinates(t *testing.T) {
	pi2 := interval.Pi().Sqr()
	oneD := func(length string, n int) []interval.I {
		src := `{"domain":{"interval":["0","` + length + `"]},"boundary":"dirichlet","potential":"x^2","eigenvalues":` + fmt.Sprint(n) + `}`
		_, c, _ := certifyProductText(t, src, "1e-12")
		var out []interval.I
		for _, e := range c.Results.Eigenvalues {
			x, err := e.Bound().Interval()
			if err != nil {
				t.Fatal(err)
			}
			out = append(out, x)
		}
		return out
	}
	overlaps := func(what string, c *certs.Certificate, want []interval.I) {
		t.Helper()
		for k, w := range want {
			got, err := c.Results.Eigenvalues[k].Bound().Interval()
			if err != nil {
				t.Fatal(err)
			}
			if _, ok := got.Intersection(w); !ok || got.Wid() > 1e-8*got.Mid() {
				t.Errorf("%s: lambda%d = %v, the 1D certifier's sum is %v", what, k+1, got, w)
			}
		}
	}

	// Interval × polygon: V = y² lives on the polygon's x ∈ (0, 2).
	mu := oneD("2", 3)
	// λ1 = π² + μ1 + π²; λ2 = π² + μ2 + π² (μ2 − μ1 ≈ 3π²/4 is below the
	// other steps, 3π² in either unit direction).
	src := `{"domain":{"product":[{"interval":["0","1"]},{"polygon":[["0","0"],["2","0"],["2","1"],["0","1"]]}]},"boundary":"dirichlet","potential":"y^2","eigenvalues":2}`
	_, c, data := certifyProductText(t, src, "1e-9")
	overlaps("interval × rectangle, V = y^2", c, []interval.I{pi2.Add(mu[0]).Add(pi2), pi2.Add(mu[1]).Add(pi2)})
	if err := Check(data); err != nil {
		t.Fatal(err)
	}

	// Polygon × interval: V = z² lives on the interval's x ∈ (0, 2); the
	// unit square's λ = 2π², 5π² (double).
	src = `{"domain":{"product":[{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},{"interval":["0","2"]}]},"boundary":"dirichlet","potential":"z^2","eigenvalues":2}`
	_, c, _ = certifyProductText(t, src, "1e-9")
	two := pi2.MulF(2)
	overlaps("square × interval, V = z^2", c, []interval.I{two.Add(mu[0]), two.Add(mu[1])})
}

// TestProductConstantsAndLargeFactorPotential: constants go to the first
// factor, and a constant written in a factor's own coordinate stays with
// that factor. On the unit cube with Neumann faces, V = 100 gives
// λ1 = 100 and λ2 = λ3 = λ4 = 100 + π² (triple). On the box (0, 1) ×
// (0, 2) × (0, 1), Dirichlet on the first two intervals and Neumann on the
// third, V = 40·(z − z + 1) is 40 on the third factor, whose λ1 = 0 then
// becomes 40; the five lowest eigenvalues are the lowest sums of the
// intervals' closed forms (separation of variables, common practice).
func TestProductConstantsAndLargeFactorPotential(t *testing.T) {
	src := `{"domain":{"product":[{"interval":["0","1"]},{"interval":["0","1"]},{"interval":["0","1"]}]},"boundary":"neumann","potential":"100","eigenvalues":4}`
	p, c, data := certifyProductText(t, src, "1e-11")
	hundred := bigDec("100")
	plus := func(a, b *big.Float) *big.Float { return new(big.Float).SetPrec(oraclePrec).Add(a, b) }
	requireEnclosures(t, "Neumann cube, V = 100", p, c, []*big.Float{hundred, plus(hundred, piSquaredTimes("1")), plus(hundred, piSquaredTimes("1")), plus(hundred, piSquaredTimes("1"))}, 1e-11)
	if err := Check(data); err != nil {
		t.Fatal(err)
	}

	src = `{"domain":{"product":[{"interval":["0","1"]},{"interval":["0","2"]},{"interval":["0","1"]}]},"boundary":["dirichlet","dirichlet","neumann"],"potential":"40*(z - z + 1)","eigenvalues":5}`
	p, c, _ = certifyProductText(t, src, "1e-11")
	forty := bigDec("40")
	lists := [][]*big.Float{
		intervalList("1", dirichletEnd, dirichletEnd, 5),
		intervalList("2", dirichletEnd, dirichletEnd, 5),
	}
	var third []*big.Float
	for _, v := range intervalList("1", neumannEnd, neumannEnd, 5) {
		third = append(third, plus(v, forty))
	}
	lists = append(lists, third)
	requireEnclosures(t, "box with V = 40 on its third factor", p, c, lowestSums(lists, 5), 1e-11)
	// The third factor's part is its own constant, not the first's.
	m, err := decodeProductMethod(c.Method)
	if err != nil {
		t.Fatal(err)
	}
	for i, want := range []string{`"potential":"0"`, `"potential":"0"`, `"potential":"40*(x-x+1)"`} {
		if !strings.Contains(strings.ReplaceAll(string(m.Factors[i].Certificate), " ", ""), want) {
			t.Errorf("factor %d: its problem lacks %s", i, want)
		}
	}
}

// TestProductFourCoordinatesGap: the unit 4-cube with Dirichlet faces,
// λ1 = 4π², λ2 = … = λ5 = 7π² (multiplicity 4), and the box (0, 1) ×
// (0, 1/2) × (0, 1) × (0, 3/2) with Dirichlet–Neumann ends on the last two
// (((k − ½)π/L)²) and Dirichlet on the first two, where the gap comes from
// the factor with the least step, not from the one with the largest λ1
// (closed forms, common practice): contained at width 1e-11.
func TestProductFourCoordinatesGap(t *testing.T) {
	src := `{"domain":{"product":[{"interval":["0","1"]},{"interval":["0","1"]},{"interval":["0","1"]},{"interval":["0","1"]}]},"boundary":"dirichlet","eigenvalues":5}`
	p, c, data := certifyProductText(t, src, "1e-11")
	seven := piSquaredTimes("7")
	requireEnclosures(t, "4-cube", p, c, []*big.Float{piSquaredTimes("4"), seven, seven, seven, seven}, 1e-11)
	if err := Check(data); err != nil {
		t.Fatal(err)
	}

	src = `{"domain":{"product":[{"interval":["0","1"]},{"interval":["0","1/2"]},{"interval":["0","1"]},{"interval":["0","3/2"]}]},"boundary":["dirichlet","dirichlet",["dirichlet","neumann"],["neumann","dirichlet"]],"eigenvalues":4}`
	p, c, _ = certifyProductText(t, src, "1e-11")
	lists := [][]*big.Float{
		intervalList("1", dirichletEnd, dirichletEnd, 4),
		intervalList("1/2", dirichletEnd, dirichletEnd, 4),
		intervalList("1", dirichletEnd, neumannEnd, 4),
		intervalList("3/2", neumannEnd, dirichletEnd, 4),
	}
	// The closed forms themselves: λ_k((0, L), D–N) = ((k − ½)π/L)².
	for k, want := range []string{"1/9", "1", "25/9", "49/9"} {
		if d := new(big.Float).Sub(lists[3][k], piSquaredTimes(want)); d.Abs(d).Cmp(big.NewFloat(1e-40)) > 0 {
			t.Fatalf("oracle: lambda%d of (0, 3/2), D–N, is not %s π²", k+1, want)
		}
	}
	requireEnclosures(t, "4D box with D–N factors", p, c, lowestSums(lists, 4), 1e-11)
}

// TestProductMeasureClaims: the prism over the equilateral triangle of unit
// side times (0, 2) has volume √3/2, surface area 2·√3/4 + 3·2 and
// diameter √5; the 4D box 1 × 2 × 1 × 3 has volume 6, boundary measure
// 2(2·1·3 + 1·1·3 + 1·2·3 + 1·2·1) = 34 and diameter √15 (products of the
// factors' measures; common practice). Claims that pin each to within
// 1e-13 of the exact value hold, with @fundamental_gap and its hypotheses
// proven.
func TestProductMeasureClaims(t *testing.T) {
	for _, tc := range []struct {
		name, domain string
		claims       []string
	}{
		{"prism", `{"product":[{"polygon":[["0","0"],["1","0"],["1/2","sqrt(3)/2"]]},{"interval":["0","2"]}]}`, []string{
			"volume >= sqrt(3)/2 - 1e-13", "volume <= sqrt(3)/2 + 1e-13",
			"surface_area >= sqrt(3)/2 + 6 - 1e-13", "surface_area <= sqrt(3)/2 + 6 + 1e-13",
			"D >= sqrt(5) - 1e-13", "D <= sqrt(5) + 1e-13", "@fundamental_gap"}},
		{"4D box", `{"product":[{"interval":["0","1"]},{"interval":["0","2"]},{"interval":["0","1"]},{"interval":["0","3"]}]}`, []string{
			"volume >= 6 - 1e-13", "volume <= 6 + 1e-13",
			"surface_area >= 34 - 1e-13", "surface_area <= 34 + 1e-13",
			"D >= sqrt(15) - 1e-13", "D <= sqrt(15) + 1e-13", "@fundamental_gap"}},
	} {
		src := `{"domain":` + tc.domain + `,"boundary":"dirichlet","claims":["` + strings.Join(tc.claims, `","`) + `"]}`
		_, c, data := certifyProductText(t, src, "1e-4")
		for _, cl := range c.Claims {
			if cl.Verdict != certs.Holds {
				t.Errorf("%s: claim %s: %s (%s)", tc.name, cl.Text, cl.Verdict, cl.Reason)
			}
			for _, h := range cl.Hypotheses {
				if h.Verdict != certs.Proven {
					t.Errorf("%s: claim %s: hypothesis %s %s (%s)", tc.name, cl.Text, h.Name, h.Verdict, h.Detail)
				}
			}
		}
		if err := Check(data); err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
	}
}
