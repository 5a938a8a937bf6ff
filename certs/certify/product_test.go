package certify

import (
	"context"
	"encoding/json"
	"fmt"
	"math"
	"math/big"
	"math/rand"
	"os"
	"sort"
	"strings"
	"testing"
	"time"

	"gapcert/certs"
	"gapcert/fem/problem"
	"gapcert/interval"
)

// certifyProductText certifies the problem src with target relWidth and
// returns its certificate, marshalled.
func certifyProductText(t *testing.T, src string, relWidth string) (*problem.Problem, *certs.Certificate, []byte) {
	t.Helper()
	p, err := problem.Parse([]byte(src))
	if err != nil {
		t.Fatalf("problem %s: %v", src, err)
	}
	c, err := Certify(context.Background(), p, Options{RelWidth: relWidth, TimeLimit: ampleLimit})
	if err != nil {
		t.Fatalf("certify %s: %v", src, err)
	}
	data, err := c.Marshal()
	if err != nil {
		t.Fatal(err)
	}
	return p, c, data
}

// requireEnclosures checks that the certificate's λ_1..λ_m contain want
// (reference values to about 55 digits) and have target-rule widths at
// most maxWidth, and that the gap contains want[1] − want[0].
func requireEnclosures(t *testing.T, what string, p *problem.Problem, c *certs.Certificate, want []*big.Float, maxWidth float64) {
	t.Helper()
	scale := interval.Pi().Sqr().Div(p.Diameter().Sqr()).Lo
	check := func(name string, b certs.Bound, v *big.Float) {
		x, err := b.Interval()
		if err != nil {
			t.Fatalf("%s %s: %v", what, name, err)
		}
		if !bigInside(v, x) {
			t.Errorf("%s: %s = %v misses %.20g", what, name, x, v)
		}
		if w := relWidthUpper(x, scale); w > maxWidth {
			t.Errorf("%s: %s = %v has width %.3g, want at most %.3g", what, name, x, w, maxWidth)
		}
	}
	if len(c.Results.Eigenvalues) != len(want) {
		t.Fatalf("%s: %d eigenvalues, want %d", what, len(c.Results.Eigenvalues), len(want))
	}
	for k, e := range c.Results.Eigenvalues {
		check(fmt.Sprintf("lambda%d", k+1), e.Bound(), want[k])
	}
	check("gap", c.Results.Gap, new(big.Float).SetPrec(oraclePrec).Sub(want[1], want[0]))
}

var (
	dirichletEnd = end{dirichlet: true}
	neumannEnd   = end{}
)

func robinEnd(alpha string) end { return end{alpha: alpha} }

// endJSON is the boundary condition of an oracle end in a problem file.
func endJSON(e end) string {
	switch {
	case e.dirichlet:
		return `"dirichlet"`
	case e.alpha == "":
		return `"neumann"`
	}
	return `{"robin":"` + e.alpha + `"}`
}

// intervalList returns the n lowest eigenvalues of −u″ on (0, L) with the
// given ends (constantPotentialEigenvalue, about 55 digits).
func intervalList(length string, a, b end, n int) []*big.Float {
	var out []*big.Float
	for k := 1; k <= n; k++ {
		out = append(out, constantPotentialEigenvalue(k, length, "0", a, b))
	}
	return out
}

// piSquaredTimes returns π²·r for the rational text r.
func piSquaredTimes(r string) *big.Float {
	x := new(big.Float).SetPrec(oraclePrec).Mul(bigPi(), bigPi())
	return x.Mul(x, bigDec(r))
}

// lowestSums returns the m smallest sums of one value from each list
// (each list long enough), with multiplicity.
func lowestSums(lists [][]*big.Float, m int) []*big.Float {
	sums := []*big.Float{new(big.Float).SetPrec(oraclePrec)}
	for _, l := range lists {
		var next []*big.Float
		for _, s := range sums {
			for _, v := range l {
				next = append(next, new(big.Float).SetPrec(oraclePrec).Add(s, v))
			}
		}
		sort.Slice(next, func(i, j int) bool { return next[i].Cmp(next[j]) < 0 })
		if len(next) > 4*m+16 {
			next = next[:4*m+16]
		}
		sums = next
	}
	return sums[:m]
}

// TestProductCube: the unit cube as a product of three unit intervals with
// Dirichlet faces: λ1 = 3π², λ2 = λ3 = λ4 = 6π² (a triple eigenvalue),
// separation of variables (common practice); contained and narrow, and
// the certificate verifies.
func TestProductCube(t *testing.T) {
	src := `{"name":"unit cube","domain":{"product":[{"interval":["0","1"]},{"interval":["0","1"]},{"interval":["0","1"]}]},"boundary":"dirichlet","eigenvalues":4,
		"claims":["@fundamental_gap","volume <= 1","surface_area >= 6","D^2*gap >= 9*pi^2 - 1e-6"]}`
	p, c, data := certifyProductText(t, src, "1e-10")
	requireEnclosures(t, "cube", p, c, []*big.Float{piSquaredTimes("3"), piSquaredTimes("6"), piSquaredTimes("6"), piSquaredTimes("6")}, 1e-10)
	for _, cl := range c.Claims {
		if cl.Verdict != certs.Holds {
			t.Errorf("claim %s: %s (%s)", cl.Text, cl.Verdict, cl.Reason)
		}
		for _, h := range cl.Hypotheses {
			if h.Verdict != certs.Proven {
				t.Errorf("claim %s: hypothesis %s %s (%s)", cl.Text, h.Name, h.Verdict, h.Detail)
			}
		}
	}
	if err := Check(data); err != nil {
		t.Fatal(err)
	}
}

// TestProductBoxes: boxes with Dirichlet, Neumann and Robin faces, in 3
// and 4 coordinates, against the sums of the intervals' eigenvalues
// (constantPotentialEigenvalue: the closed forms and the roots of the
// characteristic equations), contained and narrow.
func TestProductBoxes(t *testing.T) {
	for _, tc := range []struct {
		name    string
		lengths []string
		ends    [][2]end
	}{
		{"D–N, N–N, D–D", []string{"1", "2", "3/2"}, [][2]end{{dirichletEnd, neumannEnd}, {neumannEnd, neumannEnd}, {dirichletEnd, dirichletEnd}}},
		{"Robin faces", []string{"1", "1/2", "1"}, [][2]end{{robinEnd("1"), dirichletEnd}, {neumannEnd, robinEnd("2")}, {robinEnd("1/2"), robinEnd("3")}}},
		{"4D box", []string{"1", "2", "1", "3"}, [][2]end{{dirichletEnd, dirichletEnd}, {dirichletEnd, neumannEnd}, {robinEnd("1"), robinEnd("1")}, {neumannEnd, dirichletEnd}}},
	} {
		var factors, bcs []string
		var lists [][]*big.Float
		for i, l := range tc.lengths {
			factors = append(factors, `{"interval":["0","`+l+`"]}`)
			bcs = append(bcs, "["+endJSON(tc.ends[i][0])+","+endJSON(tc.ends[i][1])+"]")
			lists = append(lists, intervalList(l, tc.ends[i][0], tc.ends[i][1], 4))
		}
		src := `{"domain":{"product":[` + strings.Join(factors, ",") + `]},"boundary":[` + strings.Join(bcs, ",") + `],"eigenvalues":3}`
		p, c, _ := certifyProductText(t, src, "1e-9")
		requireEnclosures(t, tc.name, p, c, lowestSums(lists, 3), 1e-9)
	}
}

// TestProductPrismEquilateral: the prism over the equilateral triangle of
// unit side times (0, 1), Dirichlet: the triangle's eigenvalues 16π²/3,
// 112π²/9 (double), 64π²/3 (B. J. McCartin, Eigenstructure of the
// equilateral triangle, Part I: the Dirichlet problem, SIAM Review 45
// (2003) 267–287) plus those of the interval, (kπ)²: 19π²/3, 28π²/3,
// 121π²/9 (double).
func TestProductPrismEquilateral(t *testing.T) {
	src := `{"domain":{"product":[{"polygon":[["0","0"],["1","0"],["1/2","sqrt(3)/2"]]},{"interval":["0","1"]}]},"boundary":"dirichlet","eigenvalues":4}`
	p, c, data := certifyProductText(t, src, "1e-8")
	requireEnclosures(t, "prism", p, c, []*big.Float{piSquaredTimes("19/3"), piSquaredTimes("28/3"), piSquaredTimes("121/9"), piSquaredTimes("121/9")}, 1e-8)
	if err := Check(data); err != nil {
		t.Fatal(err)
	}
}

// TestProductHarmonicBox: V = x² + y² + z² on the unit cube separates into
// three copies of −u″ + x²u on (0, 1); the product's λ1 and λ2 overlap the
// 1D certifier's 3μ1 and 2μ1 + μ2, and both are narrow.
func TestProductHarmonicBox(t *testing.T) {
	src := `{"domain":{"product":[{"interval":["0","1"]},{"interval":["0","1"]},{"interval":["0","1"]}]},"boundary":"dirichlet","potential":"x^2 + y^2 + z^2"}`
	_, c, _ := certifyProductText(t, src, "1e-10")
	_, one, _ := certifyProductText(t, `{"domain":{"interval":["0","1"]},"boundary":"dirichlet","potential":"x^2"}`, "1e-12")
	mu1, _ := one.Results.Eigenvalues[0].Bound().Interval()
	mu2, _ := one.Results.Eigenvalues[1].Bound().Interval()
	for k, want := range []interval.I{mu1.Add(mu1).Add(mu1), mu1.Add(mu1).Add(mu2)} {
		got, _ := c.Results.Eigenvalues[k].Bound().Interval()
		if _, ok := got.Intersection(want); !ok || got.Wid() > 1e-9*got.Mid() {
			t.Errorf("lambda%d = %v, the 1D certifier's sum is %v", k+1, got, want)
		}
	}
}

// TestProductRectangle: a product of two intervals with a potential that
// does not separate as written (x*y − y*x, which is 0) is certified as the
// rectangle: π²(1/4 + 1), π²(1 + 1) and π²(9/4 + 1) for (0, 2) × (0, 1)
// with Dirichlet edges (common practice); the certificate verifies.
func TestProductRectangle(t *testing.T) {
	src := `{"domain":{"product":[{"interval":["0","2"]},{"interval":["0","1"]}]},"boundary":"dirichlet","potential":"x*y - y*x","eigenvalues":3}`
	p, c, data := certifyProductText(t, src, "1e-8")
	m, err := decodeProductMethod(c.Method)
	if err != nil || m.Combination != CombineRectangle || len(m.Factors) != 1 {
		t.Fatalf("method %+v, %v", m, err)
	}
	requireEnclosures(t, "rectangle", p, c, []*big.Float{piSquaredTimes("5/4"), piSquaredTimes("2"), piSquaredTimes("13/4")}, 1e-8)
	if err := Check(data); err != nil {
		t.Fatal(err)
	}
}

// TestProductRefusals: the ground state is refused on products before
// anything is computed.
func TestProductRefusals(t *testing.T) {
	p := parseProblem(t, `{"domain":{"product":[{"interval":["0","1"]},{"interval":["0","1"]},{"interval":["0","1"]}]},"boundary":"dirichlet"}`)
	start := time.Now()
	if _, err := Certify(context.Background(), p, Options{GroundState: true}); err == nil || !strings.Contains(err.Error(), "not available on product domains") || time.Since(start) > time.Second {
		t.Errorf("ground state on a product: %v", err)
	}
}

// TestProductCheckTampered: Check verifies a box's certificate and reports
// an edited factor certificate, an edited combination (results, next
// bounds, the omitted bound), a factor certificate of another problem and
// unknown keys of the method.
func TestProductCheckTampered(t *testing.T) {
	src := `{"domain":{"product":[{"interval":["0","1"]},{"interval":["0","2"]},{"interval":["0","1"]}]},"boundary":[["dirichlet","neumann"],"dirichlet","dirichlet"]}`
	_, c, data := certifyProductText(t, src, "1e-8")
	if err := Check(data); err != nil {
		t.Fatal(err)
	}
	m, err := decodeProductMethod(c.Method)
	if err != nil {
		t.Fatal(err)
	}
	edit := func(f func(m *ProductMethod, c *certs.Certificate)) []byte {
		cc := *c
		mm := m
		mm.Factors = append([]ProductFactor(nil), m.Factors...)
		f(&mm, &cc)
		raw, err := json.Marshal(mm)
		if err != nil {
			t.Fatal(err)
		}
		cc.Method = raw
		out, err := cc.Marshal()
		if err != nil {
			t.Fatal(err)
		}
		return out
	}
	editFactor := func(i int, f func(fc *certs.Certificate)) func(m *ProductMethod, c *certs.Certificate) {
		return func(m *ProductMethod, c *certs.Certificate) {
			fc, err := certs.Unmarshal(m.Factors[i].Certificate)
			if err != nil {
				t.Fatal(err)
			}
			f(fc)
			if m.Factors[i].Certificate, err = fc.Marshal(); err != nil {
				t.Fatal(err)
			}
		}
	}
	for _, tc := range []struct {
		name, want string
		data       []byte
	}{
		{"a factor's eigenvalue", "method.factors[1].certificate: results.eigenvalues[0]", edit(editFactor(1, func(fc *certs.Certificate) {
			fc.Results.Eigenvalues[0].Upper = fc.Results.Eigenvalues[0].Lower
		}))},
		{"the product's eigenvalue", "results.eigenvalues[1].upper", edit(func(m *ProductMethod, c *certs.Certificate) {
			e := append([]certs.Eigen(nil), c.Results.Eigenvalues...)
			e[1].Upper = e[1].Lower
			c.Results.Eigenvalues = e
		})},
		{"a next bound", "method.factors[2].next_lower", edit(func(m *ProductMethod, c *certs.Certificate) { m.Factors[2].NextLower = "1e9" })},
		{"the omitted bound", "method.omitted_lower", edit(func(m *ProductMethod, c *certs.Certificate) { m.OmittedLower = "1e9" })},
		{"swapped factors", "certifies another problem than factor 0", edit(func(m *ProductMethod, c *certs.Certificate) {
			m.Factors[0].Certificate, m.Factors[1].Certificate = m.Factors[1].Certificate, m.Factors[0].Certificate
		})},
		{"a factor's target", "certifies another problem than factor 0", edit(func(m *ProductMethod, c *certs.Certificate) { m.Factors[0].Target = "1e-3" })},
		{"the stop reason", "method.refinement.stop_reason", edit(func(m *ProductMethod, c *certs.Certificate) {
			r := *m.Refinement
			r.StopReason = StopTime
			if m.Refinement.StopReason != StopTarget {
				r.StopReason = StopTarget
			}
			m.Refinement = &r
		})},
	} {
		err := Check(tc.data)
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%s: %v, want a report of %s", tc.name, err, tc.want)
		}
	}
	// Keys the format does not define, at the method and in a factor.
	for _, tc := range []struct{ from, to, path string }{
		{`"combination": "sums"`, `"combination": "sums", "stage_c": 1`, "method.stage_c"},
		{`"next_lower"`, `"Next_Lower"`, "method.factors[0].Next_Lower"},
		{`"combination": "sums"`, `"combination": "sum"`, "method.combination"},
	} {
		bad := []byte(strings.Replace(string(data), tc.from, tc.to, 1))
		var fe *certs.FormatError
		if err := Check(bad); err == nil || !asFormatError(err, &fe) || fe.Path != tc.path {
			t.Errorf("%s → %s: %v, want a format error at %s", tc.from, tc.to, err, tc.path)
		}
	}
}

func asFormatError(err error, fe **certs.FormatError) bool {
	e, ok := err.(*certs.FormatError)
	*fe = e
	return ok
}

// TestProductSweep: random boxes and prisms (random sides, random face
// conditions; fixed seed) against closed forms: sums of the intervals'
// eigenvalues (intervalEigenvalues) and of the equilateral triangle's
// (McCartin 2003, Dirichlet: 16π²/(3s²), 112π²/(9s²); B. J. McCartin,
// Eigenstructure of the equilateral triangle, Part II: the Neumann problem,
// Math. Probl. Eng. 8 (2002) 517–539: 0, 16π²/(9s²); recalled from
// memory), λ1, λ2 and the gap contained and narrow, 0 misses. 20 cases,
// 240 with GAPCERT_LONG=1; every fifth certificate is also re-checked.
func TestProductSweep(t *testing.T) {
	n := 20
	if os.Getenv("GAPCERT_LONG") == "1" {
		n = 240
	}
	rng := rand.New(rand.NewSource(2026))
	lengths := []string{"1/2", "3/4", "1", "5/4", "3/2", "2"}
	ends := []end{dirichletEnd, neumannEnd, robinEnd("1/2"), robinEnd("1"), robinEnd("3")}
	randomInterval := func() (string, string, []*big.Float) {
		l := lengths[rng.Intn(len(lengths))]
		a, b := ends[rng.Intn(len(ends))], ends[rng.Intn(len(ends))]
		return `{"interval":["0","` + l + `"]}`, "[" + endJSON(a) + "," + endJSON(b) + "]", intervalList(l, a, b, 2)
	}
	for i := range n {
		var factors, bcs []string
		var lists [][]*big.Float
		if i%4 == 3 { // a prism over an equilateral triangle of side s
			s := []struct{ text, inverseSquare string }{{"1", "1"}, {"3/2", "4/9"}, {"2/3", "9/4"}}[rng.Intn(3)]
			tri := `{"polygon":[["0","0"],["` + s.text + `","0"],["(` + s.text + `)/2","sqrt(3)*(` + s.text + `)/2"]]}`
			scaled := func(r string) *big.Float {
				return new(big.Float).SetPrec(oraclePrec).Mul(piSquaredTimes(r), bigDec(s.inverseSquare))
			}
			if rng.Intn(2) == 0 {
				factors, bcs = append(factors, tri), append(bcs, `"dirichlet"`)
				lists = append(lists, []*big.Float{scaled("16/3"), scaled("112/9")})
			} else {
				factors, bcs = append(factors, tri), append(bcs, `"neumann"`)
				lists = append(lists, []*big.Float{new(big.Float).SetPrec(oraclePrec), scaled("16/9")})
			}
			f, b, l := randomInterval()
			factors, bcs, lists = append(factors, f), append(bcs, b), append(lists, l)
		} else {
			for range 3 {
				f, b, l := randomInterval()
				factors, bcs, lists = append(factors, f), append(bcs, b), append(lists, l)
			}
		}
		src := `{"domain":{"product":[` + strings.Join(factors, ",") + `]},"boundary":[` + strings.Join(bcs, ",") + `]}`
		p, c, data := certifyProductText(t, src, "1e-7")
		// λ1 and λ2 need only the first two values of each list.
		requireEnclosures(t, fmt.Sprintf("case %d %s", i, src), p, c, lowestSums(lists, 2), 1e-7)
		if i%5 == 0 {
			if err := Check(data); err != nil {
				t.Errorf("case %d: %v", i, err)
			}
		}
	}
}

// TestProductInterrupted: a run interrupted at the start of its final
// pass returns the coarse pass's factors, combined, with the stop reason
// "interrupted" (the target 1e-15 is beyond the coarse enclosures, whose
// 1D steps reach about 1e-13 at once), and the certificate verifies.
func TestProductInterrupted(t *testing.T) {
	p := parseProblem(t, `{"domain":{"product":[{"interval":["0","1"]},{"interval":["0","2"]},{"interval":["0","1"]}]},"boundary":"dirichlet"}`)
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	progress := func(format string, args ...any) {
		if strings.Contains(fmt.Sprintf(format, args...), "time limit") { // the first line of the final pass
			cancel()
		}
	}
	c, err := Certify(ctx, p, Options{RelWidth: "1e-15", TimeLimit: ampleLimit, Progress: progress})
	if err != nil {
		t.Fatal(err)
	}
	ref, err := RefinementOf(c)
	if err != nil || ref.StopReason != StopInterrupted {
		t.Fatalf("refinement %+v, %v", ref, err)
	}
	m, _ := decodeProductMethod(c.Method)
	for i, f := range m.Factors {
		if f.Target != coarseTarget {
			t.Errorf("factor %d: target %s, want the coarse pass's %s", i, f.Target, coarseTarget)
		}
	}
	pi2 := math.Pi * math.Pi
	for k, want := range []float64{2.25 * pi2, 3 * pi2} { // π²(1 + 1/4 + 1), π²(1 + 1 + 1)
		x, _ := c.Results.Eigenvalues[k].Bound().Interval()
		if !x.Contains(want) {
			t.Errorf("lambda%d = %v misses %g", k+1, x, want)
		}
	}
	data, err := c.Marshal()
	if err != nil {
		t.Fatal(err)
	}
	if err := Check(data); err != nil {
		t.Fatal(err)
	}
}
