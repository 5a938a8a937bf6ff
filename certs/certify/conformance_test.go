package certify_test

// The conformance suite of discretisations: one table of tests, run
// through the public API (certify.Certify, certify.Check, the tampered
// copies of certs/tampertest) against every kind of domain the certifier
// meshes. Each row of discretisations says how the suite's problems are
// written for its kind of domain; a further discretisation (boxes in three
// dimensions, say) joins every test with one row.

import (
	"context"
	"errors"
	"fmt"
	"math"
	"regexp"
	"runtime"
	"slices"
	"strings"
	"testing"
	"time"

	"gapcert/certs"
	"gapcert/certs/certify"
	"gapcert/certs/tampertest"
	"gapcert/fem/problem"
	"gapcert/interval"
	"gapcert/interval/decimalio"
)

// discretisation is one row of the conformance table.
type discretisation struct {
	name string
	// coords are the coordinate names of the dimension.
	coords []string
	// box returns the JSON "domain" of the box ∏ (lo, lo + L_i), its
	// sides of exact lengths ls (one per dimension), lo an exact text;
	// when moved is set, a congruent copy of it (turned by one radian
	// about the origin in the plane, mirrored in one dimension), whose
	// eigenvalues are the same.
	box func(lo string, ls []string, moved bool) string
	// extra are the closed forms that only this kind of domain has.
	extra []closedForm
	// boxWidth is the relative width asked of, and required of, the
	// box cases' enclosures; extraWidth likewise for the extra cases.
	boxWidth, extraWidth float64
}

var discretisations = []discretisation{
	{name: "interval", coords: []string{"x"}, box: intervalBox, boxWidth: 1e-9, extraWidth: 1e-8,
		extra: []closedForm{harmonicInterval}},
	{name: "polygon", coords: []string{"x", "y"}, box: rectangleBox, boxWidth: 1e-5, extraWidth: 1e-5,
		extra: []closedForm{equilateralTriangle}},
}

// intervalBox is the interval (lo, lo + L), or (−lo − L, −lo) moved.
func intervalBox(lo string, ls []string, moved bool) string {
	if moved {
		return fmt.Sprintf(`{"interval": ["-(%s)-(%s)", "-(%s)"]}`, lo, ls[0], lo)
	}
	return fmt.Sprintf(`{"interval": [%q, "(%s)+(%s)"]}`, lo, lo, ls[0])
}

// rectangleBox is the rectangle (lo, lo + L1) × (lo, lo + L2), or its
// image under the rotation by one radian about the origin.
func rectangleBox(lo string, ls []string, moved bool) string {
	a, b := "("+lo+")", "("+lo+")"
	x1, y1 := fmt.Sprintf("%s+(%s)", a, ls[0]), fmt.Sprintf("%s+(%s)", b, ls[1])
	corners := [][2]string{{a, b}, {x1, b}, {x1, y1}, {a, y1}}
	var vs []string
	for _, c := range corners {
		x, y := c[0], c[1]
		if moved {
			x, y = fmt.Sprintf("(%s)*cos(1)-(%s)*sin(1)", c[0], c[1]), fmt.Sprintf("(%s)*sin(1)+(%s)*cos(1)", c[0], c[1])
		}
		vs = append(vs, fmt.Sprintf("[%q, %q]", x, y))
	}
	return `{"polygon": [` + strings.Join(vs, ", ") + `]}`
}

// closedForm is a problem with known eigenvalues.
type closedForm struct {
	name   string
	source string
	// problem is the problem file without its "eigenvalues" entry.
	problem string
	// truth returns enclosures of the true λ1, λ2.
	truth func() [2]interval.I
	// scale is the magnitude that widths of λ near 0 are measured
	// against (π²/D², the target rule of the certifier).
	scale float64
}

// harmonicInterval: −u″ + x²u = λu on (−8, 8) with Dirichlet ends. On
// the whole line λ_k = 2k − 1 (the harmonic oscillator, common practice:
// u = H_{k−1}(x)e^{−x²/2}). Cutting the line at ±8 raises each eigenvalue
// (domain monotonicity, from min–max, common practice), by an amount of
// the order of the eigenfunction's square at the cut, L^{2k}e^{−L²} ≈
// 10⁻²⁴ for k ≤ 2 (an estimate of this test, not a proved bound; the room
// left, 10⁻¹⁵, is nine orders above it and seven below the width 10⁻⁸
// asked), so λ_k ∈ [2k − 1, 2k − 1 + 10⁻¹⁵].
var harmonicInterval = closedForm{
	name:    "harmonic oscillator on (-8, 8)",
	source:  "harmonic oscillator 2k-1 (common practice), truncation raises it by < 1e-15 (domain monotonicity; size estimated here)",
	problem: `{"domain": {"interval": ["-8", "8"]}, "potential": "x^2", "boundary": "dirichlet"}`,
	truth: func() [2]interval.I {
		return [2]interval.I{interval.New(1, 1+1e-15), interval.New(3, 3+1e-15)}
	},
	scale: 1,
}

// equilateralTriangle: the equilateral triangle of side 1 with Dirichlet
// sides has λ = (16π²/9)(m² + mn + n²), m, n ≥ 1: λ1 = 16π²/3 and
// λ2 = 112π²/9 (G. Lamé, 1833; M. A. Pinsky, The eigenvalues of an
// equilateral triangle, SIAM J. Math. Anal. 11 (1980) 819–827).
var equilateralTriangle = closedForm{
	name:    "equilateral triangle of side 1",
	source:  "Lamé; M. A. Pinsky, SIAM J. Math. Anal. 11 (1980) 819-827",
	problem: `{"domain": {"polygon": [["0", "0"], ["1", "0"], ["1/2", "sqrt(3)/2"]]}, "boundary": "dirichlet"}`,
	truth: func() [2]interval.I {
		unit := interval.Pi().Sqr().MulF(16).DivF(9)
		return [2]interval.I{unit.MulF(3), unit.MulF(7)}
	},
	scale: math.Pi * math.Pi,
}

// boxCase is a box with V = 0 and one kind of condition on every side.
type boxCase struct {
	name     string
	lo       string
	ls       []string // exact side lengths, one per dimension
	boundary string   // "dirichlet" or "neumann"
	moved    bool
}

// boxCases are the box problems of every row, with the side lengths of
// the row's dimension taken from the front of ls.
func boxCases(dim int) []boxCase {
	sides := func(ls ...string) []string { return ls[:dim] }
	return []boxCase{
		{"unit box, Dirichlet", "0", sides("1", "1"), "dirichlet", false},
		{"box, Neumann", "0", sides("2", "1"), "neumann", false},
		{"small box, Dirichlet, moved", "-7/3", sides("1/1000", "1/1000"), "dirichlet", true},
		{"large box, Neumann, moved", "5/2", sides("1000", "500"), "neumann", true},
	}
}

// boxTruth returns enclosures of the two lowest eigenvalues of −Δ on the
// box with sides ls: π² Σ k_i²/L_i² over k_i ≥ 1 (Dirichlet) or k_i ≥ 0
// (Neumann) (separation of variables, common practice), and π²/D², D the
// box's diameter.
func boxTruth(t *testing.T, ls []string, dirichlet bool) ([2]interval.I, float64) {
	t.Helper()
	var lengths []interval.I
	d2 := interval.Point(0)
	for _, l := range ls {
		x, err := decimalio.Parse(l)
		if err != nil {
			t.Fatal(err)
		}
		lengths = append(lengths, x)
		d2 = d2.Add(x.Sqr())
	}
	first := 0
	if dirichlet {
		first = 1
	}
	// Every multi-index k with k_i ≤ first + 2 (the two lowest values lie
	// among them).
	var values []interval.I
	k := make([]int, len(ls))
	for i := range k {
		k[i] = first
	}
	for {
		v := interval.Point(0)
		for i, l := range lengths {
			v = v.Add(interval.Point(float64(k[i])).Div(l).Sqr())
		}
		values = append(values, v.Mul(interval.Pi().Sqr()))
		i := 0
		for i < len(k) && k[i] == first+2 {
			k[i] = first
			i++
		}
		if i == len(k) {
			break
		}
		k[i]++
	}
	slices.SortFunc(values, func(a, b interval.I) int { return cmpFloat(a.Mid(), b.Mid()) })
	return [2]interval.I{values[0], values[1]}, interval.Pi().Sqr().Div(d2).Lo
}

func cmpFloat(a, b float64) int {
	switch {
	case a < b:
		return -1
	case a > b:
		return 1
	}
	return 0
}

// certifyConformance certifies a problem file with two eigenvalues at the
// relative width target and returns the certificate and its bytes. Each
// run ends by reaching its target (within 1 s, measured); the time limit
// is far above that, so that the widths checked do not depend on the
// machine's load.
func certifyConformance(t *testing.T, src string, target float64) (*certs.Certificate, []byte) {
	t.Helper()
	p, err := problem.Parse([]byte(src))
	if err != nil {
		t.Fatalf("problem %s: %v", src, err)
	}
	c, err := certify.Certify(context.Background(), p, certify.Options{RelWidth: fmt.Sprintf("%g", target), TimeLimit: 10 * time.Minute})
	if err != nil {
		t.Fatalf("certify %s: %v", src, err)
	}
	data, err := c.Marshal()
	if err != nil {
		t.Fatal(err)
	}
	return c, data
}

// withEigenvalues adds "eigenvalues": 2 to a problem file.
func withEigenvalues(src string) string {
	return strings.Replace(src, "{", `{"eigenvalues": 2, `, 1)
}

// requireClosedForm fails unless each certified enclosure of λ1, λ2 and
// the gap contains the truth and has a relative width (to max(|truth|,
// scale)) of at most maxWidth.
func requireClosedForm(t *testing.T, c *certs.Certificate, truth [2]interval.I, scale, maxWidth float64, source string) {
	t.Helper()
	got := func(b certs.Bound) interval.I {
		x, err := b.Interval()
		if err != nil {
			t.Fatal(err)
		}
		return x
	}
	if n := len(c.Results.Eigenvalues); n < 2 {
		t.Fatalf("%d eigenvalues certified, want 2", n)
	}
	check := func(what string, enc, want interval.I) {
		t.Helper()
		if !want.Subset(enc) {
			t.Errorf("%s: enclosure %v misses the true value %v (%s)", what, enc, want, source)
			return
		}
		if w := (enc.Hi - enc.Lo) / math.Max(want.Mag(), scale); w > maxWidth {
			t.Errorf("%s: enclosure %v has relative width %.3g > %.3g", what, enc, w, maxWidth)
		}
	}
	for k := range 2 {
		e := c.Results.Eigenvalues[k]
		check(fmt.Sprintf("lambda%d", k+1), got(certs.Bound{Lower: e.Lower, Upper: e.Upper}), truth[k])
	}
	check("gap", got(c.Results.Gap), truth[1].Sub(truth[0]))
}

// TestConformanceClosedForms: on every discretisation, boxes with
// Dirichlet and with Neumann sides, small, large, moved by a rigid motion
// (separation of variables, common practice), and the closed forms of the
// row's own kind of domain: every enclosure contains the truth and is at
// most the row's width wide.
func TestConformanceClosedForms(t *testing.T) {
	for _, d := range discretisations {
		t.Run(d.name, func(t *testing.T) {
			for _, bc := range boxCases(len(d.coords)) {
				t.Run(bc.name, func(t *testing.T) {
					src := withEigenvalues(fmt.Sprintf(`{"domain": %s, "boundary": %q}`, d.box(bc.lo, bc.ls, bc.moved), bc.boundary))
					c, _ := certifyConformance(t, src, d.boxWidth)
					truth, scale := boxTruth(t, bc.ls, bc.boundary == "dirichlet")
					requireClosedForm(t, c, truth, scale, d.boxWidth, "separation of variables, common practice")
				})
			}
			for _, cf := range d.extra {
				t.Run(cf.name, func(t *testing.T) {
					c, _ := certifyConformance(t, withEigenvalues(cf.problem), d.extraWidth)
					requireClosedForm(t, c, cf.truth(), cf.scale, d.extraWidth, cf.source)
				})
			}
		})
	}
}

// tamperProblem is the problem of the tamper and determinism tests on a
// row: the unit box with Dirichlet sides and V = 100 Σ x_i (a potential,
// so that the certificate records Taylor orders and shifts; on the square
// at tamperWidth its stage-A count is large enough, about 7·10⁴ units of
// work, for the parallel residual of enclose/sparse, which starts at
// 2¹⁶; the interval problems of the suite stay below the 2¹⁵ entries at
// which enclose/band's count goes parallel).
func tamperProblem(d discretisation) string {
	ls := make([]string, len(d.coords))
	for i := range ls {
		ls[i] = "1"
	}
	return withEigenvalues(fmt.Sprintf(`{"domain": %s, "potential": %q, "boundary": "dirichlet"}`, d.box("0", ls, false), "100*("+strings.Join(d.coords, "+")+")"))
}

// tamperWidth is the target of the tamper and determinism tests.
const tamperWidth = 1e-4

// TestConformanceTamperDetection: on every discretisation, Check accepts
// the certificate as written and refuses it with one digit of a result
// changed, with a method field changed, with the problem changed (alone,
// and together with its hash), and in every tampered copy of package
// tampertest (as a *certs.FormatError at the variant's path).
func TestConformanceTamperDetection(t *testing.T) {
	for _, d := range discretisations {
		t.Run(d.name, func(t *testing.T) {
			_, data := certifyConformance(t, tamperProblem(d), tamperWidth)
			if err := certify.Check(data); err != nil {
				t.Fatalf("the untampered certificate does not verify: %v", err)
			}
			// refuse fails unless Check refuses edited: with a
			// *certify.MismatchError naming the field mismatchAt when
			// it is not "", else with a mismatch or a format error.
			refuse := func(what string, edited []byte, mismatchAt string) {
				t.Helper()
				if string(edited) == string(data) {
					t.Fatalf("%s: the edit changed nothing", what)
				}
				err := certify.Check(edited)
				var mismatch *certify.MismatchError
				var format *certs.FormatError
				switch {
				case err == nil:
					t.Errorf("%s: Check accepts the tampered certificate", what)
				case mismatchAt != "" && (!errors.As(err, &mismatch) || !strings.Contains(err.Error(), mismatchAt)):
					t.Errorf("%s: error %v, want a *certify.MismatchError at %s", what, err, mismatchAt)
				case !errors.As(err, &mismatch) && !errors.As(err, &format):
					t.Errorf("%s: error %v, want a mismatch or a format error", what, err)
				}
			}
			refuse("a digit of the upper bound of lambda1", editResultDigit(t, data), "results.eigenvalues[0].upper")
			refuse("the method's gamma", editMatch(t, data, `"gamma": "([^"]*)"`, func(g string) string { return g + "5" }), "")
			refuse("the method's degree", editMatch(t, data, `"degree": ([0-9]+)`, func(n string) string { return n + "1" }), "")
			// The potential V + 1/8: the recorded hash no longer fits.
			forged := editMatch(t, data, `"potential": "([^"]*)"`, func(v string) string { return v + "+1/8" })
			refuse("the problem", forged, "problem_sha256")
			// The new problem in its canonical form with its hash: the
			// recorded results are not those of the new problem.
			c, err := certs.Unmarshal(forged)
			if err != nil {
				t.Fatal(err)
			}
			p, err := problem.Parse(c.Problem)
			if err != nil {
				t.Fatal(err)
			}
			c.Problem, c.ProblemSHA256 = p.Canonical(), p.SHA256()
			consistent, err := c.Marshal()
			if err != nil {
				t.Fatal(err)
			}
			refuse("the problem and its hash", consistent, "results.eigenvalues")
			for _, v := range tampertest.Variants(-1) {
				edited := v.Edit(data)
				if edited == nil {
					continue // the variant edits an embedded reference
				}
				var fe *certs.FormatError
				if err := certify.Check(edited); !errors.As(err, &fe) || fe.Path != v.Path {
					t.Errorf("%s: error %v, want a *certs.FormatError at %s (a reader keeping the last key sees %s)", v.Name, err, v.Path, v.Seen)
				}
			}
		})
	}
}

// editResultDigit changes the last digit of the upper bound of λ1 in the
// results of a certificate.
func editResultDigit(t *testing.T, data []byte) []byte {
	t.Helper()
	results := strings.Index(string(data), `"results": {`)
	if results < 0 {
		t.Fatal("no results in the certificate")
	}
	head, tail := string(data[:results]), string(data[results:])
	edited := editMatch(t, []byte(tail), `"upper": "([^"]*[0-9])"`, func(s string) string {
		last := s[len(s)-1]
		return s[:len(s)-1] + string('0'+(last-'0'+1)%10)
	})
	return append([]byte(head), edited...)
}

// editMatch replaces the first submatch of pattern in data by edit of it.
func editMatch(t *testing.T, data []byte, pattern string, edit func(string) string) []byte {
	t.Helper()
	re := regexp.MustCompile(pattern)
	loc := re.FindSubmatchIndex(data)
	if loc == nil {
		t.Fatalf("no %s in the certificate", pattern)
	}
	out := append([]byte{}, data[:loc[2]]...)
	out = append(out, edit(string(data[loc[2]:loc[3]]))...)
	return append(out, data[loc[3]:]...)
}

// TestConformanceDeterminism: on every discretisation, the certificate of
// the same problem computed with GOMAXPROCS 1 and 2 is the same, byte for
// byte, except the time in its provenance.
func TestConformanceDeterminism(t *testing.T) {
	for _, d := range discretisations {
		t.Run(d.name, func(t *testing.T) {
			var out [2][]byte
			for i, procs := range []int{1, 2} {
				prev := runtime.GOMAXPROCS(procs)
				c, _ := certifyConformance(t, tamperProblem(d), tamperWidth)
				runtime.GOMAXPROCS(prev)
				c.Provenance.Time = ""
				data, err := c.Marshal()
				if err != nil {
					t.Fatal(err)
				}
				out[i] = data
			}
			if string(out[0]) != string(out[1]) {
				t.Errorf("the certificates differ:\nGOMAXPROCS 1:\n%s\nGOMAXPROCS 2:\n%s", out[0], out[1])
			}
		})
	}
}
