package sweepplot

import (
	"encoding/json"
	"image/png"
	"math"
	"math/big"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"gonum.org/v1/plot/vg"

	"gapcert/certs"
	"gapcert/certs/plot"
	"gapcert/certs/sweep"
	"gapcert/interval/decimalio"
)

func load(t *testing.T, name string) *Sweep {
	t.Helper()
	s, err := Load(sweepDir(name))
	if err != nil {
		t.Fatal(err)
	}
	return s
}

// The pictures of the golden tests: the band of D²·gap/π² over c with a
// threshold that makes c = 0 undecided (the quantity is exactly 3 there),
// c = 4 hold and the larger c fail, and the map of the second triangle
// claim.
func goldenBand(t *testing.T) *Band {
	b, err := load(t, "convex").Band("c", BandSpec{Quantity: "D^2*gap/pi^2", Threshold: "3 + c^2/100", Rel: ">="})
	if err != nil {
		t.Fatal(err)
	}
	return b
}

func goldenMap(t *testing.T) *Map {
	m, err := load(t, "triangle").Map("a", "b", "2")
	if err != nil {
		t.Fatal(err)
	}
	return m
}

// TestGoldenSVG compares the structure of the SVG pictures with
// testdata/*.golden.json (run with -update to rewrite them).
func TestGoldenSVG(t *testing.T) {
	dir := t.TempDir()
	for _, c := range []struct {
		golden string
		write  func(string) error
	}{
		{"band", goldenBand(t).Write},
		{"map", goldenMap(t).Write},
		{"robin_band", robinBand(t).Write},
		{"band_width", func(path string) error { return goldenBand(t).WritePanel(path, WidthPanel) }},
		{"band_margin", func(path string) error { return goldenBand(t).WritePanel(path, MarginPanel) }},
		{"robin_band_width", func(path string) error { return robinBand(t).WritePanel(path, WidthPanel) }},
		{"map_sequential", sequentialMap(t).Write},
		{"shape", goldenShape(t).Write},
	} {
		path := filepath.Join(dir, c.golden+".svg")
		if err := c.write(path); err != nil {
			t.Fatal(err)
		}
		got := summarise(t, path)
		golden := filepath.Join("testdata", c.golden+".golden.json")
		if *update {
			data, err := json.MarshalIndent(got, "", "  ")
			if err != nil {
				t.Fatal(err)
			}
			if err := os.WriteFile(golden, append(data, '\n'), 0o644); err != nil {
				t.Fatal(err)
			}
			continue
		}
		data, err := os.ReadFile(golden)
		if err != nil {
			t.Fatal(err)
		}
		var want svgSummary
		if err := json.Unmarshal(data, &want); err != nil {
			t.Fatal(err)
		}
		if !reflect.DeepEqual(got, want) {
			gotJSON, _ := json.MarshalIndent(got, "", "  ")
			t.Errorf("%s: SVG structure differs from %s:\n%s", c.golden, golden, gotJSON)
		}
	}
}

// TestSVGLabels checks that the pictures say what is certified and mark
// each verdict.
func TestSVGLabels(t *testing.T) {
	dir := t.TempDir()
	band, cells, robin := filepath.Join(dir, "band.svg"), filepath.Join(dir, "map.svg"), filepath.Join(dir, "robin.svg")
	if err := goldenBand(t).Write(band); err != nil {
		t.Fatal(err)
	}
	if err := goldenMap(t).Write(cells); err != nil {
		t.Fatal(err)
	}
	if err := robinBand(t).Write(robin); err != nil {
		t.Fatal(err)
	}
	for path, want := range map[string][]string{
		band: {"certified enclosures of D²·gap/π²", "threshold 3 + c²/100", "holds: D²·gap/π² ≥ 3 + c²/100 for all values in the enclosures (1)",
			"undecided: neither holds nor fails on the whole enclosures (1)", "fails: D²·gap/π² < 3 + c²/100 for all values in the enclosures (4)",
			"nothing is certified between the sampled parameter values.", "The enclosures are narrower than a line at this scale (a width panel shows their widths).",
			"\nD²·gap/π²\n", "\nc\n"},
		cells: {"claim D²·gap ≥ 75.35", "colour: certified lower bound of lhs − rhs", "undecided: the enclosure of lhs − rhs does not settle the claim (1)",
			"fails: certified for the whole enclosure (1)", "unmarked cells hold", "Colour scale diverging about 0", "\na\n", "\nb\n"},
		robin: {"certified enclosures of gap and of robin_interval_gap", "gap, robin_interval_gap", "reference: certified enclosure of robin_interval_gap at each point",
			"certified enclosure of gap at each point", "every claim holds (the point's certificate) (3)", "the orange reference bars likewise enclose robin_interval_gap at each point;",
			"The enclosures are narrower than a line at this scale (a width panel shows their widths).", "\nα\n"},
	} {
		text := "\n" + strings.Join(summarise(t, path).Texts, "\n") + "\n"
		for _, w := range want {
			if !strings.Contains(text, w) {
				t.Errorf("%s lacks %q; texts:\n%s", filepath.Base(path), w, text)
			}
		}
	}
}

// TestPNG decodes the PNG pictures and checks their size: width and height
// in inches times plot.PNGDPI, rounded (vgimg's rule).
func TestPNG(t *testing.T) {
	dir := t.TempDir()
	for name, pic := range map[string]picture{
		"band": goldenBand(t).picture(NoPanel), "map": goldenMap(t).picture(), "robin band": robinBand(t).picture(NoPanel),
		"band and widths": goldenBand(t).picture(WidthPanel), "band and margins": goldenBand(t).picture(MarginPanel),
		"log-concavity": goldenShape(t).picture(),
	} {
		path := filepath.Join(dir, name+".png")
		if err := pic.write(path); err != nil {
			t.Fatal(err)
		}
		f, err := os.Open(path)
		if err != nil {
			t.Fatal(err)
		}
		img, err := png.Decode(f)
		f.Close()
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		px := func(l vg.Length) int { return int(float64(l/vg.Inch)*plot.PNGDPI + 0.5) }
		if b := img.Bounds(); b.Dx() != px(pic.width) || b.Dy() != px(pic.height) {
			t.Errorf("%s: %d×%d pixels, want %d×%d", name, b.Dx(), b.Dy(), px(pic.width), px(pic.height))
		}
		if b := img.Bounds(); b.Dx() != 709 {
			t.Errorf("%s: %d pixels wide, want 709 (12 cm at 150 dpi)", name, b.Dx())
		}
	}
}

// piDigits is π to 50 decimals (OEIS A000796).
const piDigits = "3.14159265358979323846264338327950288419716939937510"

// TestBandContainsTruth: for c = 0 the problem is −u″ = λu on (−1, 1) with
// Dirichlet ends, λk = k²π²/4, so D²·gap/π² = 4·(3π²/4)/π² = 3 exactly
// (common practice); the band must contain 3 and be narrow there, and
// the verdict against the threshold 3 must be undecided (neither side can
// be certified at equality).
func TestBandContainsTruth(t *testing.T) {
	b, err := load(t, "convex").Band("c", BandSpec{Quantity: "D^2*gap/pi^2", Threshold: "3", Rel: ">="})
	if err != nil {
		t.Fatal(err)
	}
	p := b.Points[0]
	if p.XText != "0" || !(p.Quantity.Lo <= 3 && 3 <= p.Quantity.Hi) || p.Quantity.Hi-p.Quantity.Lo > 1e-5 {
		t.Errorf("c = %s: D²·gap/π² ∈ %v, want a narrow enclosure of 3", p.XText, p.Quantity)
	}
	if p.Verdict != certs.Undecided {
		t.Errorf("c = 0: verdict %s, want undecided", p.Verdict)
	}
	// λ1 at c = 0 is π²/4.
	b1, err := load(t, "convex").Band("c", BandSpec{Quantity: "lambda1"})
	if err != nil {
		t.Fatal(err)
	}
	pi, _ := new(big.Rat).SetString(piDigits)
	want, _ := new(big.Rat).Quo(new(big.Rat).Mul(pi, pi), big.NewRat(4, 1)).Float64()
	if q := b1.Points[0].Quantity; !(q.Lo <= want && want <= q.Hi) || q.Hi-q.Lo > 1e-5*want {
		t.Errorf("c = 0: λ1 ∈ %v, want a narrow enclosure of π²/4 = %.17g", q, want)
	}
}

// TestMapContainsTruth: the apex (0, 1) and (1, 1) give the isosceles right
// triangle with legs 1, whose Dirichlet eigenvalues are π²(m² + n²),
// m > n ≥ 1 (the antisymmetric modes of the unit square; common
// practice): λ1 = 5π², λ2 = 10π², D = √2, so D²·gap = 10π² and the first
// claim's margin is 10π² − 64π²/9 = 26π²/9. The certified lower bound must
// be below it, within the 5% width the sweep asked for.
func TestMapContainsTruth(t *testing.T) {
	m, err := load(t, "triangle").Map("a", "b", "D^2*gap >= 64*pi^2/9")
	if err != nil {
		t.Fatal(err)
	}
	pi, _ := decimalio.ParseRat(piDigits)
	truth, _ := new(big.Rat).Mul(new(big.Rat).Mul(pi, pi), big.NewRat(26, 9)).Float64()
	found := 0
	for _, c := range m.Cells {
		if c.Y != 1 || (c.X != 0 && c.X != 1) {
			continue
		}
		found++
		if !(c.Margin <= truth && c.Margin >= truth-0.1*10*math.Pi*math.Pi) {
			t.Errorf("apex (%g, 1): margin lower bound %g, want in [%g − 10%% of D²·gap, %g]", c.X, c.Margin, truth, truth)
		}
		if c.Verdict != certs.Holds {
			t.Errorf("apex (%g, 1): verdict %s, want holds", c.X, c.Verdict)
		}
	}
	if found != 2 {
		t.Fatalf("found %d of the two right-angled apexes", found)
	}
}

// TestBandWithoutThreshold: without a threshold each point carries the
// least favourable verdict of its own claims from the summary; at c = 0
// the second claim, D²·gap/π² ≥ 3.3, fails (the quantity is 3) and at
// c = 20 both hold.
func TestBandWithoutThreshold(t *testing.T) {
	b, err := load(t, "convex").Band("c", BandSpec{Quantity: "gap"})
	if err != nil {
		t.Fatal(err)
	}
	first, last := b.Points[0], b.Points[len(b.Points)-1]
	if first.XText != "0" || first.Verdict != certs.Fails || last.XText != "20" || last.Verdict != certs.Holds {
		t.Errorf("verdicts c=%s %s, c=%s %s; want c=0 fails, c=20 holds", first.XText, first.Verdict, last.XText, last.Verdict)
	}
	svg := filepath.Join(t.TempDir(), "band.svg")
	if err := b.Write(svg); err != nil {
		t.Fatal(err)
	}
	if text := strings.Join(summarise(t, svg).Texts, "\n"); !strings.Contains(text, "a claim fails (the point's certificate) (2)") {
		t.Errorf("legend lacks the summary verdicts:\n%s", text)
	}
}

// TestMapOfBuiltInClaim: a map of the built-in claim @triangle_gap (which
// stands for D²·gap ≥ 64π²/9, Z. Lu and J. Rowlett, Comm. Math. Phys. 319
// (2013)) over a 2 × 2 triangle sweep in two shards, drawn from one shard
// directory and from the merged one. The margin of each cell is the lower
// end of the certificate's stored enclosure of lhs − rhs, read back
// downward; at apex (1, 1), the isosceles right triangle with legs 1
// (λ1 = 5π², λ2 = 10π², D = √2; common practice), the margin
// 10π² − 64π²/9 = 26π²/9 lies in the cell's certified margin.
func TestMapOfBuiltInClaim(t *testing.T) {
	f, err := sweep.ParseFamily([]byte(`{"template": {"domain": {"polygon": [["0","0"],["1","0"],["a","b"]]},
		"boundary": "dirichlet", "claims": ["@triangle_gap"]},
		"parameters": [{"name": "a", "values": ["1/2", "1"]}, {"name": "b", "values": ["1/2", "1"]}],
		"relative_width": "0.05", "time_limit": "60s"}`))
	if err != nil {
		t.Fatal(err)
	}
	root := t.TempDir()
	shards := []string{filepath.Join(root, "shard-0"), filepath.Join(root, "shard-1")}
	for i, dir := range shards {
		if _, err := sweep.Run(f, dir, sweep.RunOptions{Shard: sweep.Shard{Index: i, Count: 2}}); err != nil {
			t.Fatal(err)
		}
	}
	merged := filepath.Join(root, "merged")
	if _, err := sweep.Merge(shards, merged, sweep.MergeOptions{}); err != nil {
		t.Fatal(err)
	}
	pi, _ := decimalio.ParseRat(piDigits)
	truth := new(big.Rat).Mul(new(big.Rat).Mul(pi, pi), big.NewRat(26, 9))
	for _, c := range []struct {
		dir   string
		cells int
	}{{merged, 4}, {shards[1], 2}} {
		s, err := Load(c.dir)
		if err != nil {
			t.Fatal(err)
		}
		if s.Missing != 0 {
			t.Errorf("%s: %d certificate files not found", c.dir, s.Missing)
		}
		for _, claim := range []string{"1", "@triangle_gap"} {
			m, err := s.Map("a", "b", claim)
			if c.cells == 2 {
				// Shard 1/2 holds the points 1 and 3, both at b = 1.
				if err == nil || !strings.Contains(err.Error(), "at least two values") {
					t.Errorf("%s: map of one shard: %v, want too few values", c.dir, err)
				}
				continue
			}
			if err != nil {
				t.Fatalf("%s: Map(%q): %v", c.dir, claim, err)
			}
			if m.Rel != ">=" || m.Claim != "@triangle_gap" || len(m.Cells) != c.cells {
				t.Fatalf("%s: map of %q: rel %q, claim %q, %d cells", c.dir, claim, m.Rel, m.Claim, len(m.Cells))
			}
			for i, cell := range m.Cells {
				cr := s.Summary.Points[i].Claims[0]
				lo, _ := decimalio.ParseLower(cr.Margin.Lower)
				if cell.Margin != lo || cell.Verdict != cr.Verdict {
					t.Errorf("cell %d: margin %g %s, certificate %s %s", i, cell.Margin, cell.Verdict, cr.Margin.Lower, cr.Verdict)
				}
				if cell.X == 1 && cell.Y == 1 {
					lo, err1 := decimalio.ParseRat(cr.Margin.Lower)
					hi, err2 := decimalio.ParseRat(cr.Margin.Upper)
					if err1 != nil || err2 != nil {
						t.Fatal(err1, err2)
					}
					if lo.Cmp(truth) > 0 || hi.Cmp(truth) < 0 {
						t.Errorf("apex (1, 1): margin [%s, %s] does not contain 26π²/9", cr.Margin.Lower, cr.Margin.Upper)
					}
				}
			}
		}
	}
}
