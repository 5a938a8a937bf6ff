package plot

import (
	"context"
	"math"
	"math/big"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"gonum.org/v1/plot/vg"

	"gapcert/certs"
	"gapcert/certs/certify"
	"gapcert/fem/problem"
	"gapcert/interval"
)

// humpProblem is −u″ + 2(1 − x²)u = λu on (−1, 1) with Neumann ends. The
// ground state is even (the problem is symmetric and λ1 simple), so
// (log u)″(0) = V(0) − λ1 = 2 − λ1, and λ1 is at most the mean 4/3 of V
// (the Rayleigh quotient of the constant): u is not log-concave, and the
// certificate holds a witness. The points lie on the axis in order.
const humpProblem = `{"name": "hump", "domain": {"interval": ["-1", "1"]}, "potential": "2*(1-x^2)",
  "boundary": "neumann", "points": [["-1"], ["-1/2"], ["0"], ["1/2"], ["1"]], "target": {"relative_width": "1e-8"}}`

// certifiedGroundState certifies src with its ground state and returns the
// certificate and its problem.
func certifiedGroundState(t *testing.T, src string) (*certs.Certificate, *problem.Problem) {
	t.Helper()
	p, err := problem.Parse([]byte(src))
	if err != nil {
		t.Fatal(err)
	}
	c, err := certify.Certify(context.Background(), p, certify.Options{GroundState: true, Tool: "gapcert test"})
	if err != nil {
		t.Fatal(err)
	}
	return c, p
}

// TestGroundStateInterval: the picture of the hump's certificate carries
// the verdict, the witness interval, and the values of u read back from
// the certificate (each containing the printed enclosure), against x; its
// SVG structure is compared with testdata/ground_state_interval.golden.json
// (-update rewrites it).
func TestGroundStateInterval(t *testing.T) {
	c, p := certifiedGroundState(t, humpProblem)
	g, err := NewGroundState(c, p)
	if err != nil {
		t.Fatal(err)
	}
	if g.Verdict != certs.Disproven || g.WitnessKind != certs.WitnessConvexInterval || len(g.Witness) != 2 || g.Margin == nil || !(g.Margin.Lo > 0) {
		t.Fatalf("verdict %s, witness %s %v, margin %v", g.Verdict, g.WitnessKind, g.Witness, g.Margin)
	}
	if !reflect.DeepEqual(g.Arc, []float64{0, 0.5, 1, 1.5, 2}) {
		t.Errorf("arc lengths %v", g.Arc)
	}
	for k, v := range c.Results.GroundState.Points {
		lo, _ := new(big.Rat).SetString(v.Value.Lower)
		hi, _ := new(big.Rat).SetString(v.Value.Upper)
		glo, ghi := new(big.Rat).SetFloat64(g.Values[k].Lo), new(big.Rat).SetFloat64(g.Values[k].Hi)
		if glo.Cmp(lo) > 0 || ghi.Cmp(hi) < 0 {
			t.Errorf("point %d: drawn enclosure %v does not contain the certificate's [%s, %s]", k, g.Values[k], v.Value.Lower, v.Value.Upper)
		}
	}
	dir := t.TempDir()
	path := filepath.Join(dir, "gs.svg")
	if err := g.Write(path); err != nil {
		t.Fatal(err)
	}
	again := filepath.Join(dir, "again.svg")
	if err := g.Write(again); err != nil {
		t.Fatal(err)
	}
	if a, b := mustRead(t, path), mustRead(t, again); string(a) != string(b) {
		t.Error("two writes of the same picture differ")
	}
	got := summarise(t, path)
	text := "\n" + strings.Join(got.Texts, "\n") + "\n"
	for _, w := range []string{
		"log-concave: disproven (certified witness)",
		"witness: (log u)'' > 0 on [",
		"certified enclosure of u at the marked points only",
		"The values are certified at the marked points only: nothing is drawn between them.",
		"the problem's points (5)",
	} {
		if !strings.Contains(text, w) {
			t.Errorf("picture lacks %q; texts:\n%s", w, text)
		}
	}
	compareGolden(t, got, filepath.Join("testdata", "ground_state_interval.golden.json"))
}

// TestGroundStateWithoutBlock: a certificate without results.ground_state
// is refused with a hint.
func TestGroundStateWithoutBlock(t *testing.T) {
	c, p := certifiedGroundState(t, humpProblem)
	c.Results.GroundState = nil
	if _, err := NewGroundState(c, p); err == nil || !strings.Contains(err.Error(), "--ground-state") {
		t.Errorf("error %v, want one with the hint --ground-state", err)
	}
}

// TestGroundStateUndecided: an undecided block without values (λ1 not
// separated from λ2: the symmetric double well 200(x² − 1)² on (−3, 3),
// whose two lowest eigenvalues, near 27.76, differ by less than the widths
// of their enclosures at the target 1e-3; measured) says why under the
// picture, and draws no value panel; the picture is also written as PNG.
func TestGroundStateUndecided(t *testing.T) {
	c, p := certifiedGroundState(t, `{"name": "deep double well", "domain": {"interval": ["-3", "3"]}, "potential": "200*(x^2-1)^2",
	  "boundary": "dirichlet", "points": [["0"], ["1"]], "target": {"relative_width": "1e-3"}}`)
	g, err := NewGroundState(c, p)
	if err != nil {
		t.Fatal(err)
	}
	if g.Verdict != certs.Undecided || len(g.Values) != 0 {
		t.Fatalf("verdict %s with %d values, want undecided without values", g.Verdict, len(g.Values))
	}
	dir := t.TempDir()
	path := filepath.Join(dir, "gs.svg")
	if err := g.Write(path); err != nil {
		t.Fatal(err)
	}
	text := strings.Join(texts(parseSVG(t, path)), "\n")
	for _, w := range []string{"log-concave: undecided", "Undecided: lambda1 is not shown to be separated", "The certificate gives no values of u at the points"} {
		if !strings.Contains(text, w) {
			t.Errorf("picture lacks %q; texts:\n%s", w, text)
		}
	}
	if strings.Contains(text, "\nu\n") {
		t.Error("a value panel was drawn without values")
	}
	png := filepath.Join(dir, "gs.png")
	if err := g.Write(png); err != nil {
		t.Fatal(err)
	}
	if img := decodePNG(t, png); img.Bounds().Dx() != int(math.Round(float64(pictureWidth/vg.Inch)*PNGDPI)) {
		t.Errorf("PNG width %d", img.Bounds().Dx())
	}
}

// TestWrapWords: lines of at most the width, words kept whole, the rest
// cut with an ellipsis.
func TestWrapWords(t *testing.T) {
	got := wrapWords("aa bb cc dddddd ee", 5, 3)
	want := []string{"aa bb", "cc", "dddddd …"}
	if !reflect.DeepEqual(got, want) {
		t.Errorf("wrapWords: %q, want %q", got, want)
	}
}

// TestSegmentArc decides exactly whether points lie on one segment in
// order.
func TestSegmentArc(t *testing.T) {
	pts := func(src string) [][]problem.Number {
		p, err := problem.Parse([]byte(`{"domain": {"polygon": [["0", "0"], ["1", "0"], ["1", "1"], ["0", "1"]]}, "boundary": "dirichlet", "points": ` + src + `}`))
		if err != nil {
			t.Fatal(err)
		}
		return p.Points
	}
	for _, c := range []struct {
		name, points string
		want         []float64
	}{
		{"diagonal in order", `[["0", "0"], ["1/4", "1/4"], ["1", "1"]]`, []float64{0, math.Hypot(0.25, 0.25), math.Sqrt2}},
		{"diagonal backwards", `[["1", "1"], ["1/2", "1/2"], ["0", "0"]]`, []float64{0, math.Hypot(0.5, 0.5), math.Sqrt2}},
		{"out of order", `[["0", "0"], ["1", "1"], ["1/2", "1/2"]]`, nil},
		{"repeated point", `[["0", "0"], ["0", "0"], ["1", "1"]]`, nil},
		{"off the line by 1e-30", `[["0", "0"], ["0.5", "0.500000000000000000000000000001"], ["1", "1"]]`, nil},
		{"not rational", `[["0", "0"], ["sqrt(2)/2", "sqrt(2)/2"], ["1", "1"]]`, nil},
		{"one point", `[["1/2", "1/2"]]`, nil},
	} {
		got := segmentArc(pts(c.points))
		if len(got) != len(c.want) {
			t.Errorf("%s: %v, want %v", c.name, got, c.want)
			continue
		}
		for k := range got {
			if math.Abs(got[k]-c.want[k]) > 1e-15 {
				t.Errorf("%s: %v, want %v", c.name, got, c.want)
				break
			}
		}
	}
}

// TestGroundStatePolygonPicture draws a midpoint witness and values along
// a segment on a square. The numbers are made up for the drawing (no
// certificate of a polygon witness is computed here): the test checks what
// the picture says and that it keeps the domain's aspect ratio.
func TestGroundStatePolygonPicture(t *testing.T) {
	sq := [][2]float64{{0, 0}, {2, 0}, {2, 1}, {0, 1}}
	margin := interval.New(1e-4, 2e-4)
	g := &GroundState{
		Title: "made-up drawing data", Dim: 2, Polygon: sq, Verdict: certs.Disproven,
		WitnessKind: certs.WitnessMidpoint, Witness: [][2]float64{{0.2, 0.2}, {1.8, 0.6}, {1, 0.4}}, Margin: &margin,
		Points: [][2]float64{{0.5, 0.5}, {1, 0.5}, {1.5, 0.5}},
		Values: []interval.I{interval.New(0.9, 0.91), interval.New(1.1, 1.12), interval.New(0.9, 0.91)},
		Arc:    []float64{0, 0.5, 1},
	}
	path := filepath.Join(t.TempDir(), "gs.svg")
	if err := g.Write(path); err != nil {
		t.Fatal(err)
	}
	elems := parseSVG(t, path)
	text := "\n" + strings.Join(texts(elems), "\n") + "\n"
	for _, w := range []string{
		"witness x, y: u(m)² < u(x)·u(y), certified",
		"witness m = (x + y)/2",
		"segment through the marked points",
		"arc length from the first point",
		"Witness margin: u(x)·u(y) - u(m)² lies in [0.0001, 0.0002].",
		"The values are certified at the marked points only",
	} {
		if !strings.Contains(text, drawable(w)) {
			t.Errorf("picture lacks %q; texts:\n%s", w, text)
		}
	}
	if _, _, _, ok := findOutline(elems, sq); !ok {
		t.Error("the square is not drawn as a closed outline at equal scales")
	}
	// Points off one segment: no value panel, and the caption says why.
	g.Arc = nil
	if err := g.Write(path); err != nil {
		t.Fatal(err)
	}
	text = strings.Join(texts(parseSVG(t, path)), "\n")
	if strings.Contains(text, "arc length") || !strings.Contains(text, "do not lie on one segment in order") {
		t.Errorf("without a segment: texts\n%s", text)
	}
}

func mustRead(t *testing.T, path string) []byte {
	t.Helper()
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	return data
}
