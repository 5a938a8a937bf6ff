package problem

import (
	"bufio"
	"errors"
	"math"
	"math/big"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gapcert/fem/boundary"
	"gapcert/interval"
)

const testdata = "../../testdata/problems"

// TestBadFiles reads every file testdata/problems/bad/NAME.json and checks
// that Parse reports exactly the issues listed in NAME.err, one per line,
// in order, each line being a prefix of the issue's "path: message (hint)"
// text.
func TestBadFiles(t *testing.T) {
	files, err := filepath.Glob(filepath.Join(testdata, "bad", "*.json"))
	if err != nil {
		t.Fatal(err)
	}
	if len(files) < 20 {
		t.Fatalf("only %d bad files", len(files))
	}
	for _, file := range files {
		name := strings.TrimSuffix(filepath.Base(file), ".json")
		t.Run(name, func(t *testing.T) {
			want := readLines(t, strings.TrimSuffix(file, ".json")+".err")
			p, err := ReadFile(file)
			if err == nil {
				t.Fatalf("accepted: %s", p.Canonical())
			}
			var perr *Error
			if !errors.As(err, &perr) {
				t.Fatalf("error %T %v, want *Error", err, err)
			}
			if len(perr.Issues) != len(want) {
				t.Fatalf("%d issues, want %d:\n%v", len(perr.Issues), len(want), err)
			}
			for i, is := range perr.Issues {
				if !strings.HasPrefix(is.String(), want[i]) {
					t.Errorf("issue %d:\n got %s\nwant %s…", i, is, want[i])
				}
				if is.Hint == "" {
					t.Errorf("issue %d has no hint: %s", i, is)
				}
			}
		})
	}
}

func readLines(t *testing.T, path string) []string {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	var lines []string
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		if l := sc.Text(); l != "" {
			lines = append(lines, l)
		}
	}
	if err := sc.Err(); err != nil {
		t.Fatal(err)
	}
	return lines
}

// refValue computes a reference value with math/big at 256 bits (about 77
// digits).
type refValue func() *big.Float

func bigSqrt(r *big.Rat) *big.Float {
	x := new(big.Float).SetPrec(256).SetRat(r)
	return x.Sqrt(x)
}

func rat(s string) *big.Rat {
	r, ok := new(big.Rat).SetString(s)
	if !ok {
		panic("bad rational " + s)
	}
	return r
}

// sum returns the 256-bit sum of the terms.
func sum(terms ...*big.Float) *big.Float {
	s := new(big.Float).SetPrec(256)
	for _, t := range terms {
		s.Add(s, t)
	}
	return s
}

func ratF(s string) *big.Float { return new(big.Float).SetPrec(256).SetRat(rat(s)) }

// checkEnclosure fails unless x contains ref and is at most maxULP units
// in the last place of its upper end wide.
func checkEnclosure(t *testing.T, what string, x interval.I, ref *big.Float, maxULP float64) {
	t.Helper()
	if new(big.Float).SetFloat64(x.Lo).Cmp(ref) > 0 || new(big.Float).SetFloat64(x.Hi).Cmp(ref) < 0 {
		t.Errorf("%s: %v does not contain %s", what, x, ref.Text('g', 40))
	}
	ulp := math.Nextafter(math.Abs(x.Hi), math.Inf(1)) - math.Abs(x.Hi)
	if w := x.Hi - x.Lo; w > maxULP*ulp {
		t.Errorf("%s: %v is %g ulps wide, want ≤ %g", what, x, w/ulp, maxULP)
	}
}

// TestGoodFiles checks geometry of the example files against closed forms
// of elementary geometry (Pythagoras for distances, the trapezoid area
// (a+c)h/2, the equilateral triangle area √3ℓ²/4), evaluated with math/big.
func TestGoodFiles(t *testing.T) {
	for _, c := range []struct {
		file                 string
		dim, sides           int
		reversed             bool
		convex               string
		diameter, area, peri *big.Float
		maxULP               float64 // allowed width of the enclosures
		polynomial           bool
	}{
		{"interval_harmonic.json", 1, 2, false, "convex", ratF("4"), ratF("4"), ratF("2"), 0, true},
		{"square.json", 2, 4, false, "convex", bigSqrt(rat("2")), ratF("1"), ratF("4"), 1, true},
		// Diameter 3 (the base); area (3+1)·1/2; perimeter 3 + 1 + 2√2.
		{"trapezoid_robin.json", 2, 4, false, "convex", ratF("3"), ratF("2"), sum(ratF("4"), bigSqrt(rat("8"))), 4, true},
		// Side 1: diameter 1, area √3/4, perimeter 3.
		{"equilateral.json", 2, 3, false, "convex", ratF("1"), bigSqrt(rat("3/16")), ratF("3"), 8, true},
		// 3 × 2 rectangle: diameter √13, area 6, perimeter 10.
		{"clockwise_rectangle.json", 2, 4, true, "convex", bigSqrt(rat("13")), ratF("6"), ratF("10"), 1, true},
		// L-shape from the 2 × 2 square minus the unit square at (1, 1):
		// diameter 2√2, area 3, perimeter 8.
		{"lshape.json", 2, 6, false, "not convex", bigSqrt(rat("8")), ratF("3"), ratF("8"), 1, false},
	} {
		t.Run(c.file, func(t *testing.T) {
			p, err := ReadFile(filepath.Join(testdata, c.file))
			if err != nil {
				t.Fatal(err)
			}
			if p.Dim != c.dim || len(p.Boundary) != c.sides || p.Reversed() != c.reversed || p.Convex() != c.convex {
				t.Errorf("dim %d sides %d reversed %v convex %q, want %d %d %v %q",
					p.Dim, len(p.Boundary), p.Reversed(), p.Convex(), c.dim, c.sides, c.reversed, c.convex)
			}
			checkEnclosure(t, "diameter", p.Diameter(), c.diameter, c.maxULP)
			checkEnclosure(t, "area", p.Area(), c.area, c.maxULP)
			checkEnclosure(t, "perimeter", p.Perimeter(), c.peri, c.maxULP)
			if p.PotentialIsPolynomial() != c.polynomial {
				t.Errorf("PotentialIsPolynomial = %v", !c.polynomial)
			}
			if p.Dim == 2 {
				if s, ok := signOf(signedArea2(p.Vertices)); !ok || s <= 0 {
					t.Errorf("vertices not counterclockwise")
				}
				checkTriangulation(t, p)
			}
		})
	}
}

// checkTriangulation checks n − 2 counterclockwise triangles whose areas
// add up to the polygon's area (enclosures must overlap).
func checkTriangulation(t *testing.T, p *Problem) {
	t.Helper()
	tri := p.Triangles()
	if len(tri) != len(p.Vertices)-2 {
		t.Fatalf("%d triangles for %d vertices", len(tri), len(p.Vertices))
	}
	var total interval.I
	for _, k := range tri {
		a := [][2]Number{p.Vertices[k[0]], p.Vertices[k[1]], p.Vertices[k[2]]}
		s := signedArea2(a)
		if s.Lo <= 0 {
			t.Errorf("triangle %v not counterclockwise: %v", k, s)
		}
		total = total.Add(s.Mul(interval.Point(0.5)))
	}
	if _, ok := total.Intersection(p.Area()); !ok {
		t.Errorf("triangle areas add up to %v, polygon area %v", total, p.Area())
	}
}

// TestReversedBoundary checks that after reversing a clockwise polygon
// each edge keeps the condition the file gave to the same segment.
func TestReversedBoundary(t *testing.T) {
	data, err := os.ReadFile(filepath.Join(testdata, "clockwise_rectangle.json"))
	if err != nil {
		t.Fatal(err)
	}
	p, err := Parse(data)
	if err != nil {
		t.Fatal(err)
	}
	// The file's vertices and conditions, edge i from vertex i to i+1.
	fileV := [][2]int64{{0, 0}, {0, 2}, {3, 2}, {3, 0}}
	fileBC := []string{"dirichlet", "neumann", "robin 1", "robin 2"}
	key := func(a, b [2]int64) [4]int64 {
		if a[0] > b[0] || a[0] == b[0] && a[1] > b[1] {
			a, b = b, a
		}
		return [4]int64{a[0], a[1], b[0], b[1]}
	}
	want := map[[4]int64]string{}
	for i := range fileV {
		want[key(fileV[i], fileV[(i+1)%4])] = fileBC[i]
	}
	n := len(p.Vertices)
	for k, bc := range p.Boundary {
		a, b := p.Vertices[k], p.Vertices[(k+1)%n]
		seg := key([2]int64{a[0].Rat.Num().Int64(), a[1].Rat.Num().Int64()}, [2]int64{b[0].Rat.Num().Int64(), b[1].Rat.Num().Int64()})
		got := bc.Kind.String()
		if bc.Kind == boundary.Robin {
			got += " " + bc.Alpha.Text
		}
		if want[seg] != got {
			t.Errorf("edge %d %v: %s, want %s", k, seg, got, want[seg])
		}
	}
	if p.Vertices[0][0].Text != "0" || p.Vertices[0][1].Text != "0" {
		t.Errorf("vertex 0 moved")
	}
}

// TestCanonicalRoundTrip checks Parse(Canonical()) = the same Canonical()
// for every example, and that equivalent spellings of one problem give the
// same text and hash.
func TestCanonicalRoundTrip(t *testing.T) {
	files, err := filepath.Glob(filepath.Join(testdata, "*.json"))
	if err != nil {
		t.Fatal(err)
	}
	for _, f := range files {
		p, err := ReadFile(f)
		if err != nil {
			t.Fatalf("%s: %v", f, err)
		}
		c := p.Canonical()
		q, err := Parse(c)
		if err != nil {
			t.Fatalf("%s: canonical text rejected: %v\n%s", f, err, c)
		}
		if string(q.Canonical()) != string(c) || q.SHA256() != p.SHA256() {
			t.Errorf("%s: round trip changed\n%s\n%s", f, c, q.Canonical())
		}
		if q.Reversed() {
			t.Errorf("%s: canonical polygon is not counterclockwise", f)
		}
	}

	spellings := []string{
		`{"domain":{"polygon":[["0","0"],["1","0"],["1/2","1/2"]]},"boundary":"dirichlet"}`,
		`{ "boundary" : ["dirichlet", "dirichlet", "dirichlet"],
		   "domain": {"polygon": [[0, 0], [1.0, 0], [0.50, 0.5e0]]},
		   "potential": "0", "eigenvalues": 2, "target": {"relative_width": "0.000001"},
		   "name": "", "claims": [], "parameters": {} }`,
		// clockwise, starting at the same vertex
		`{"domain":{"polygon":[["0","0"],["2/4","5e-1"],["1","-0"]]},"boundary":"dirichlet"}`,
	}
	want := `{"boundary":["dirichlet","dirichlet","dirichlet"],"claims":[],"domain":{"polygon":[["0","0"],["1","0"],["0.5","0.5"]]},"eigenvalues":2,"name":"","parameters":{},"potential":"0","target":{"relative_width":"0.000001"}}`
	for i, s := range spellings {
		p, err := Parse([]byte(s))
		if err != nil {
			t.Fatalf("spelling %d: %v", i, err)
		}
		if got := string(p.Canonical()); got != want {
			t.Errorf("spelling %d:\n got %s\nwant %s", i, got, want)
		}
	}
}

// TestRatText checks canonical rational texts and that they read back to
// the same rational.
func TestRatText(t *testing.T) {
	for _, c := range []struct{ in, want string }{
		{"0.1", "0.1"},
		{"2/4", "0.5"},
		{"4/6", "2/3"},
		{"1/2", "0.5"},
		{"-6/4", "-1.5"},
		{"-1/3", "-1/3"},
		{"0", "0"},
		{"-0", "0"},
		{"100", "100"},
		{"1e-6", "0.000001"},
		{"1e-7", "1e-7"},
		{"-2.5e-3", "-0.0025"},
		{"123456789012345678901", "123456789012345678901"},
		{"1e21", "1e21"},
		{"1.5e300", "1.5e300"},
		{"22/7", "22/7"},
		{"7/20", "0.35"},
	} {
		r := rat(c.in)
		got := RatText(r)
		if got != c.want {
			t.Errorf("RatText(%s) = %s, want %s", c.in, got, c.want)
		}
		back, err := parseRatLiteral(got)
		if err != nil || back.Cmp(r) != 0 {
			t.Errorf("RatText(%s) = %s reads back as %v, %v", c.in, got, back, err)
		}
	}
}

// TestNumbers checks exact and enclosed values of number texts. Closed
// forms: sin(π/3) = √3/2, cos(π/5) = (1 + √5)/4 (common practice:
// elementary trigonometry).
func TestNumbers(t *testing.T) {
	params := map[string]Number{}
	a, err := parseNumber("1/4", nil)
	if err != nil {
		t.Fatal(err)
	}
	params["a"] = a
	for _, c := range []struct {
		in     string
		ref    *big.Float
		exact  bool
		maxULP float64
	}{
		{"0.1", ratF("1/10"), true, 1},
		{"1/3", ratF("1/3"), true, 1},
		{"a", ratF("1/4"), true, 0},
		{"  -7 ", ratF("-7"), true, 0},
		{"1e-300", ratF("1/1" + strings.Repeat("0", 300)), true, 1},
		{"sqrt(3)/2", new(big.Float).Quo(bigSqrt(rat("3")), ratF("2")), false, 4},
		{"a+1", ratF("5/4"), false, 1},
		{"sin(pi/3)", new(big.Float).Quo(bigSqrt(rat("3")), ratF("2")), false, 16},
		{"cos(pi/5)", new(big.Float).Quo(sum(ratF("1"), bigSqrt(rat("5"))), ratF("4")), false, 16},
	} {
		n, err := parseNumber(c.in, params)
		if err != nil {
			t.Errorf("%q: %v", c.in, err)
			continue
		}
		if (n.Rat != nil) != c.exact {
			t.Errorf("%q: Rat = %v", c.in, n.Rat)
		}
		if n.Rat != nil && new(big.Float).SetPrec(256).SetRat(n.Rat).Cmp(c.ref) != 0 {
			t.Errorf("%q: Rat = %v", c.in, n.Rat)
		}
		checkEnclosure(t, c.in, n.Val, c.ref, c.maxULP)
	}
}

// TestPotentialRange checks the potential range against closed forms:
// x² on [−2, 2] has range [0, 4]; x·y on the unit square [0, 1].
func TestPotentialRange(t *testing.T) {
	for _, c := range []struct {
		src      string
		min, max float64
	}{
		{`{"domain":{"interval":["-2","2"]},"potential":"x^2","boundary":"dirichlet"}`, 0, 4},
		{`{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},"potential":"x*y","boundary":"dirichlet"}`, 0, 1},
		{`{"domain":{"interval":["1","2"]},"potential":"1/x","boundary":"neumann"}`, 0.5, 1},
	} {
		p, err := Parse([]byte(c.src))
		if err != nil {
			t.Fatal(err)
		}
		r := p.PotentialRange()
		// The enclosure must contain the exact range and may overestimate
		// (interval evaluation) but not by more than the range's size.
		if r.Lo > c.min || r.Hi < c.max || r.Lo < c.min-(c.max-c.min) || r.Hi > c.max+(c.max-c.min) {
			t.Errorf("%s: range %v, exact [%g, %g]", c.src, r, c.min, c.max)
		}
	}
}

// TestIntervalDecisions checks polygon predicates decided by enclosures
// of irrational coordinates: √2 − 1.4142135 ≈ 6.2e-8 > 0 (math/big can
// confirm: 1.4142135² = 1.99999982358225 < 2), so a notch vertex at that
// height stays above the base edge, and at the negative height it crosses
// it.
func TestIntervalDecisions(t *testing.T) {
	const tmpl = `{"domain": {"polygon": [["0", "0"], ["4", "0"], ["4", "2"], ["2", "%s"], ["0", "2"]]}, "boundary": "dirichlet"}`
	p, err := Parse([]byte(strings.Replace(tmpl, "%s", "sqrt(2)-1.4142135", 1)))
	if err != nil {
		t.Fatalf("above: %v", err)
	}
	if p.Convex() != "not convex" || p.Vertices[3][1].Rat != nil || len(p.Triangles()) != 3 {
		t.Errorf("above: convex %q, Rat %v, %d triangles", p.Convex(), p.Vertices[3][1].Rat, len(p.Triangles()))
	}
	_, err = Parse([]byte(strings.Replace(tmpl, "%s", "1.4142135-sqrt(2)", 1)))
	var perr *Error
	if !errors.As(err, &perr) || len(perr.Issues) != 2 ||
		!strings.HasPrefix(perr.Issues[0].String(), "domain.polygon: edges 0 and 2 intersect") ||
		!strings.HasPrefix(perr.Issues[1].String(), "domain.polygon: edges 0 and 3 intersect") {
		t.Errorf("below: %v", err)
	}
}

// TestBuiltinClaimCanonical: a built-in claim may be spelt with upper case,
// '-' for '_' and surrounding spaces; the canonical form records
// "@name", and the canonical text parses back to itself.
func TestBuiltinClaimCanonical(t *testing.T) {
	p, err := Parse([]byte(`{"domain":{"polygon":[["0","0"],["1","0"],["0","1"]]},"boundary":"dirichlet","claims":[" @Triangle-Gap ","gap >= 1","@fundamental_gap"]}`))
	if err != nil {
		t.Fatal(err)
	}
	want := []string{"@triangle_gap", "gap >= 1", "@fundamental_gap"}
	if strings.Join(p.Claims, "|") != strings.Join(want, "|") {
		t.Errorf("claims %q, want %q", p.Claims, want)
	}
	q, err := Parse(p.Canonical())
	if err != nil || string(q.Canonical()) != string(p.Canonical()) {
		t.Errorf("canonical round trip: %v", err)
	}
}

// TestRobinAlpha: alpha of claims is the coefficient shared by the Robin
// sides (other sides do not count), decided exactly; when it is not
// defined the claim "alpha > 0" is refused at claims[0] with the reason.
func TestRobinAlpha(t *testing.T) {
	const square = `"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]}`
	for _, tc := range []struct {
		boundary string
		alpha    string // the coefficient's text, or "" when undefined
		why      string
	}{
		{`{"robin":"3/2"}`, "1.5", ""},
		{`[{"robin":"1/2"},"dirichlet",{"robin":"0.5"},"neumann"]`, "0.5", ""},
		{`[{"robin":"sqrt(2)"},"dirichlet",{"robin":"sqrt(2)"},"neumann"]`, "sqrt(2)", ""},
		{`[{"robin":"0"},"neumann","neumann","neumann"]`, "0", ""},
		{`"neumann"`, "", "no side has a Robin condition"},
		{`[{"robin":"1"},{"robin":"1"},{"robin":"2"},{"robin":"1"}]`, "", "different coefficients, 1 (side 0) and 2 (side 2)"},
		{`[{"robin":"sqrt(2)"},{"robin":"2^(1/2)"},"dirichlet","dirichlet"]`, "", "cannot decide whether the Robin coefficients sqrt(2) (side 0) and 2^(1/2) (side 1) are equal"},
	} {
		p, err := Parse([]byte(`{` + square + `,"boundary":` + tc.boundary + `}`))
		if err != nil {
			t.Fatalf("%s: %v", tc.boundary, err)
		}
		a, why := p.RobinAlpha()
		if a.Text != tc.alpha || !strings.Contains(why, tc.why) || (why == "") != (tc.why == "") {
			t.Errorf("%s: alpha %q, why %q; want %q, %q", tc.boundary, a.Text, why, tc.alpha, tc.why)
		}
		_, err = Parse([]byte(`{` + square + `,"boundary":` + tc.boundary + `,"claims":["alpha > 0"]}`))
		if (err == nil) != (tc.why == "") || err != nil && (!strings.Contains(err.Error(), `claims[0]: claim "alpha > 0", column 1: alpha has no value: `) || !strings.Contains(err.Error(), tc.why)) {
			t.Errorf("%s: claim alpha > 0: %v", tc.boundary, err)
		}
	}
}
