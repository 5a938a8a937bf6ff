package plot

import (
	"bytes"
	"encoding/json"
	"errors"
	"flag"
	"image"
	"image/color"
	_ "image/png"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"slices"
	"strings"
	"testing"
)

var update = flag.Bool("update", false, "rewrite the golden files in testdata/")

// sineModes is the Dirichlet Laplacian on (0, 1): λ_k = k²π² with
// eigenfunctions sin(kπx) (closed form). Eval returns the modes with
// alternating signs, as an eigensolver may.
func sineModes() *Modes {
	return &Modes{
		Title:    "Dirichlet Laplacian on (0, 1)",
		Interval: [2]float64{0, 1},
		Labels:   []string{"λ1 ∈ [9.8696, 9.8697]", "λ2 ∈ [39.478, 39.479]", "λ3 ∈ [88.826, 88.827]"},
		Eval: func(k int, x, _ float64) float64 {
			return math.Pow(-1, float64(k)) * math.Sin(float64(k+1)*math.Pi*x)
		},
	}
}

// unitSquare is the Dirichlet Laplacian on (0, 1)²: λ1 = 2π² with
// eigenfunction sin(πx)sin(πy) (closed form), on a 2-triangle mesh.
func unitSquare() *Modes {
	return &Modes{
		Title:     "unit square",
		Polygon:   [][2]float64{{0, 0}, {1, 0}, {1, 1}, {0, 1}},
		Triangles: [][3][2]float64{{{0, 0}, {1, 0}, {1, 1}}, {{0, 0}, {1, 1}, {0, 1}}},
		Labels:    []string{"λ1 ∈ [19.739, 19.740]"},
		Eval: func(_ int, x, y float64) float64 {
			return math.Sin(math.Pi*x) * math.Sin(math.Pi*y)
		},
	}
}

// lShape is the L of three unit squares, (0, 2)² minus [1, 2]². Its
// Dirichlet Laplacian has the eigenvalue 2π² with eigenfunction
// sin(πx)sin(πy): directly, −Δ of it is 2π² times it, and it vanishes on
// x ∈ {0, 1, 2} and y ∈ {0, 1, 2}, so on every edge of the L. It changes
// sign from square to square.
func lShape() *Modes {
	return &Modes{
		Title:   "L-shape",
		Polygon: [][2]float64{{0, 0}, {2, 0}, {2, 1}, {1, 1}, {1, 2}, {0, 2}},
		Triangles: [][3][2]float64{
			{{0, 0}, {1, 0}, {1, 1}}, {{0, 0}, {1, 1}, {0, 1}},
			{{1, 0}, {2, 0}, {2, 1}}, {{1, 0}, {2, 1}, {1, 1}},
			{{0, 1}, {1, 1}, {1, 2}}, {{0, 1}, {1, 2}, {0, 2}},
		},
		Labels: []string{"2π² (sin πx sin πy)"},
		Eval: func(_ int, x, y float64) float64 {
			return math.Sin(math.Pi*x) * math.Sin(math.Pi*y)
		},
	}
}

// lShapeTwoModes is lShape without a mesh and with a second exact
// eigenfunction, sin(2πx)sin(πy) for 5π², which also vanishes on x = 1
// and y = 1.
func lShapeTwoModes() *Modes {
	m := lShape()
	m.Triangles = nil
	m.Labels = append(m.Labels, "5π² (sin 2πx sin πy)")
	m.Eval = func(k int, x, y float64) float64 {
		return math.Sin(float64(k+1)*math.Pi*x) * math.Sin(math.Pi*y)
	}
	return m
}

// lShapeMixed is lShape with a boundary condition of every kind, two
// Robin coefficients and kinds that repeat.
func lShapeMixed() *Modes {
	m := lShape()
	m.Title = "L-shape, mixed conditions"
	m.Boundary = []Side{
		{Kind: DirichletSide}, {Kind: NeumannSide}, {Kind: RobinSide, Alpha: "5"},
		{Kind: RobinSide, Alpha: "1/2"}, {Kind: DirichletSide}, {Kind: NeumannSide},
	}
	return m
}

// sineMixed is sineModes with a Dirichlet left end and a Robin right end
// (the curves are not its modes; only the drawing of the ends matters).
func sineMixed() *Modes {
	m := sineModes()
	m.Boundary = []Side{{Kind: DirichletSide}, {Kind: RobinSide, Alpha: "2"}}
	return m
}

func TestWriteFiles(t *testing.T) {
	for _, tc := range []struct {
		name  string
		modes *Modes
		files []string
		// PNG sizes at 150 dpi: 12 cm is 708.66 pixels, rounded up.
		pngWidth int
	}{
		{"interval", sineModes(), []string{"modes.png", "modes.svg"}, 709},
		{"square", unitSquare(), []string{"mesh.png", "mesh.svg", "mode1.png", "mode1.svg"}, 709},
		{"L-shape", lShape(), []string{"mesh.png", "mesh.svg", "mode1.png", "mode1.svg"}, 709},
		{"L-shape, no mesh, two modes", lShapeTwoModes(), []string{"mode1.png", "mode1.svg", "mode2.png", "mode2.svg"}, 709},
	} {
		t.Run(tc.name, func(t *testing.T) {
			dir := t.TempDir()
			paths, err := Write(dir, tc.modes, []string{"png", "svg"})
			if err != nil {
				t.Fatal(err)
			}
			var want []string
			for _, f := range tc.files {
				want = append(want, filepath.Join(dir, f))
			}
			if !slices.Equal(paths, want) {
				t.Fatalf("paths = %q, want %q", paths, want)
			}
			for _, p := range paths {
				switch filepath.Ext(p) {
				case ".png":
					img := decodePNG(t, p)
					if w := img.Bounds().Dx(); w != tc.pngWidth {
						t.Errorf("%s: width %d pixels, want %d", p, w, tc.pngWidth)
					}
				case ".svg":
					elems := parseSVG(t, p)
					if !slices.Contains(texts(elems), Caption) {
						t.Errorf("%s: no caption %q", p, Caption)
					}
					if w := elems[0].attrs["width"]; w != "340.16pt" { // 12 cm = 340.157 pt
						t.Errorf("%s: width %s, want 340.16pt", p, w)
					}
				}
			}
		})
	}
}

func decodePNG(t *testing.T, path string) image.Image {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	img, format, err := image.Decode(f)
	if err != nil || format != "png" {
		t.Fatalf("%s: not a PNG image (format %q): %v", path, format, err)
	}
	return img
}

// TestLineCurves reads the curves back from the SVG and checks them
// against the closed form sin(kπx), normalised by the package's rule
// (the sample of largest magnitude, first on ties, becomes +1).
func TestLineCurves(t *testing.T) {
	m := sineModes()
	dir := t.TempDir()
	if _, err := Write(dir, m, []string{"svg"}); err != nil {
		t.Fatal(err)
	}
	elems := parseSVG(t, filepath.Join(dir, "modes.svg"))
	var curves [][][2]float64
	for _, e := range elems {
		if subs, ok := parsePath(e.attrs["d"]); ok && len(subs) == 1 && len(subs[0].pts) == DefaultSamples1D {
			curves = append(curves, subs[0].pts)
		}
	}
	if len(curves) != len(m.Labels) {
		t.Fatalf("%d curves of %d points, want %d", len(curves), DefaultSamples1D, len(m.Labels))
	}
	// The canvas map is affine per axis; fix it from mode 1, whose
	// normalised form is sin(πx): x = 0 ↦ first point, u = 1 at x = 1/2.
	first := curves[0]
	x0, x1 := first[0][0], first[len(first)-1][0]
	yZero, yOne := first[0][1], first[DefaultSamples1D/2][1]
	for k, pts := range curves {
		n := float64(k + 1)
		// Closed form at the samples, divided by the first sample of
		// largest magnitude.
		ref := make([]float64, len(pts))
		peak := 0.0
		for i := range ref {
			ref[i] = math.Sin(n * math.Pi * float64(i) / float64(len(pts)-1))
			if abs(ref[i]) > abs(peak) {
				peak = ref[i]
			}
		}
		iPeak := slices.Index(ref, peak)
		for i := range ref {
			ref[i] /= peak
		}
		worst := 0.0
		for i, p := range pts {
			x := (p[0] - x0) / (x1 - x0)
			u := (p[1] - yZero) / (yOne - yZero)
			worst = max(worst, abs(x-float64(i)/float64(len(pts)-1)), abs(u-ref[i]))
		}
		// SVG coordinates carry five significant digits of a few hundred
		// points: about 0.005 pt on an axis of about 100 pt per unit, in
		// the point and in the two reference points.
		if worst > 3e-4 {
			t.Errorf("mode %d: curve differs from sin(%dπx) normalised by %.2g", k+1, k+1, worst)
		}
		if got := (pts[iPeak][1] - yZero) / (yOne - yZero); abs(got-1) > 3e-4 {
			t.Errorf("mode %d: peak drawn at %v, want +1", k+1, got)
		}
	}
}

// TestOutlineAspect finds the polygon outline and the mesh in the SVG and
// checks that one scale serves both axes (the aspect ratio is kept).
func TestOutlineAspect(t *testing.T) {
	for _, m := range []*Modes{unitSquare(), lShape()} {
		t.Run(m.Title, func(t *testing.T) {
			dir := t.TempDir()
			if _, err := Write(dir, m, []string{"svg"}); err != nil {
				t.Fatal(err)
			}
			for _, name := range []string{"mesh.svg", "mode1.svg"} {
				elems := parseSVG(t, filepath.Join(dir, name))
				s, _, _, ok := findOutline(elems, m.Polygon)
				if !ok {
					t.Fatalf("%s: no closed path through the polygon's %d vertices with one scale for x and y", name, len(m.Polygon))
				}
				if s < 50 {
					t.Errorf("%s: the domain is drawn at %.3g pt per unit, too small", name, s)
				}
			}
			// The mesh: one path of len(Triangles) closed triangles.
			elems := parseSVG(t, filepath.Join(dir, "mesh.svg"))
			found := false
			for _, e := range elems {
				subs, ok := parsePath(e.attrs["d"])
				if !ok || len(subs) != len(m.Triangles) {
					continue
				}
				found = true
				for _, sp := range subs {
					if len(sp.pts) != 3 || !sp.closed {
						found = false
					}
				}
			}
			if !found {
				t.Errorf("mesh.svg: no path of %d closed triangles", len(m.Triangles))
			}
		})
	}
}

// TestColourMap decodes the raster colour map embedded in the SVG and
// checks the colour of grid cells against the closed form
// sin(πx)sin(πy) at the cell centre, divided by its largest value on the
// grid: the colour of that value on the scale ScaleFor the range of these
// values (within one palette step, for rounding at a step's edge), and
// transparent outside the polygon. The sign of the picture follows the
// first largest sample, so both signs are tried, but one sign must fit
// every cell. The square's mode has one sign, so its scale is sequential
// (the viridis colours, yellow at the peak); the L-shape's changes sign,
// so its scale is diverging and symmetric about 0.
func TestColourMap(t *testing.T) {
	closedForm := func(x, y float64) float64 { return math.Sin(math.Pi*x) * math.Sin(math.Pi*y) }
	for _, tc := range []struct {
		m         *Modes
		points    [][2]float64
		diverging bool
	}{
		{unitSquare(), [][2]float64{{0.5, 0.5}, {0.001, 0.5}, {0.5, 0.999}, {0.25, 0.75}, {0.9, 0.1}}, false},
		{lShape(), [][2]float64{
			{0.5, 0.5}, {1.5, 0.5}, {0.5, 1.5}, // the three squares
			{1.5, 1.5}, {1.9, 1.9}, {1.001, 1.5}, {1.5, 1.001}, // outside
			{0.999, 1.5}, {1.2, 0.3}, {0.3, 1.7},
		}, true},
	} {
		t.Run(tc.m.Title, func(t *testing.T) {
			dir := t.TempDir()
			if _, err := Write(dir, tc.m, []string{"svg"}); err != nil {
				t.Fatal(err)
			}
			imgs := embeddedImages(t, parseSVG(t, filepath.Join(dir, "mode1.svg")))
			if len(imgs) != 2 {
				t.Fatalf("%d embedded images, want 2 (colour map and colour bar)", len(imgs))
			}
			img := imgs[0]
			b := img.Bounds()
			x0, x1, y0, y1 := boundingBox(tc.m.Polygon)
			dx, dy := (x1-x0)/float64(b.Dx()), (y1-y0)/float64(b.Dy())
			if b.Dx() != DefaultSamples2D && b.Dy() != DefaultSamples2D {
				t.Errorf("colour map of %d×%d cells, want %d along the longer side", b.Dx(), b.Dy(), DefaultSamples2D)
			}
			centre := func(c, r int) (x, y float64) { // r counts rows from the top
				return x0 + (float64(c)+0.5)*dx, y1 - (float64(r)+0.5)*dy
			}
			peak, low := 0.0, math.Inf(1)
			for r := range b.Dy() {
				for c := range b.Dx() {
					if x, y := centre(c, r); inside(tc.m.Polygon, x, y) {
						peak = max(peak, abs(closedForm(x, y)))
						low = min(low, closedForm(x, y))
					}
				}
			}
			if (low < 0) != tc.diverging {
				t.Fatalf("closed form's least value %g: test case misdescribed", low)
			}
			fits := func(sign float64) bool {
				lo, hi := low/peak, 1.0
				if sign < 0 {
					lo, hi = -1, -low/peak
				}
				if lo < 0 && hi < 1 {
					return false // the largest magnitude is drawn +1
				}
				cm, lo, hi := ScaleFor(lo, hi)
				if (lo == -hi) != tc.diverging {
					return false
				}
				pal := cm.Palette(colourLevels).Colors()
				for _, p := range tc.points {
					c, r := int((p[0]-x0)/dx), int((y1-p[1])/dy)
					got := img.At(b.Min.X+c, b.Min.Y+r)
					x, y := centre(c, r)
					if !inside(tc.m.Polygon, x, y) {
						if !sameColour(got, color.RGBA{}) {
							return false
						}
						continue
					}
					i := int(math.Round((sign*closedForm(x, y)/peak - lo) / (hi - lo) * (colourLevels - 1)))
					ok := false
					for j := max(0, i-1); j <= min(colourLevels-1, i+1); j++ {
						ok = ok || sameColour(got, pal[j])
					}
					if !ok {
						return false
					}
				}
				return true
			}
			if !fits(1) && !fits(-1) {
				for _, p := range tc.points {
					t.Logf("colour at (%g, %g) = %v", p[0], p[1], img.At(b.Min.X+int((p[0]-x0)/dx), b.Min.Y+int((y1-p[1])/dy)))
				}
				t.Error("the colour map matches sin(πx)sin(πy) with neither sign")
			}
			if tc.m.Title == "unit square" {
				if !fits(1) {
					t.Error("a positive mode is not drawn positive")
				}
				// The peak is the top of the sequential scale: viridis yellow.
				if got := img.At(b.Min.X+b.Dx()/2, b.Min.Y+b.Dy()/2); !sameColour(got, viridisControls[len(viridisControls)-1]) {
					t.Errorf("colour at the peak %v, want viridis yellow %v", got, viridisControls[len(viridisControls)-1])
				}
			}
		})
	}
}

func sameColour(a, b color.Color) bool {
	r1, g1, b1, a1 := a.RGBA()
	r2, g2, b2, a2 := b.RGBA()
	// PNG stores 8 or 16 bits a channel; compare at 8 bits.
	return r1>>8 == r2>>8 && g1>>8 == g2>>8 && b1>>8 == b2>>8 && a1>>8 == a2>>8
}

// TestGolden compares the structure of the SVG pictures (see svgSummary)
// with testdata/*.golden.json; run with -update to rewrite them.
func TestGolden(t *testing.T) {
	for _, tc := range []struct {
		golden string
		modes  *Modes
		file   string
	}{
		{"interval_modes", sineModes(), "modes.svg"},
		{"square_mesh", unitSquare(), "mesh.svg"},
		{"square_mode1", unitSquare(), "mode1.svg"},
		{"lshape_mesh", lShape(), "mesh.svg"},
		{"lshape_mode1", lShape(), "mode1.svg"},
		{"lshape_mixed_mesh", lShapeMixed(), "mesh.svg"},
		{"interval_mixed_modes", sineMixed(), "modes.svg"},
	} {
		t.Run(tc.golden, func(t *testing.T) {
			dir := t.TempDir()
			if _, err := Write(dir, tc.modes, []string{"svg"}); err != nil {
				t.Fatal(err)
			}
			got := summarise(t, filepath.Join(dir, tc.file))
			compareGolden(t, got, filepath.Join("testdata", tc.golden+".golden.json"))
		})
	}
}

// TestBoundarySides finds each side of the mixed L-shape in the SVG of its
// mesh, as one segment in the style of its condition (the Okabe–Ito colour
// and dash pattern of its kind, a colour per Robin coefficient), and the
// legend with one entry per kind and coefficient.
func TestBoundarySides(t *testing.T) {
	m := lShapeMixed()
	dir := t.TempDir()
	if _, err := Write(dir, m, []string{"svg"}); err != nil {
		t.Fatal(err)
	}
	elems := parseSVG(t, filepath.Join(dir, "mesh.svg"))
	type segment struct {
		a, b  [2]float64
		style string
	}
	var segs []segment
	for _, e := range elems {
		subs, ok := parsePath(e.attrs["d"])
		if e.name == "path" && ok && len(subs) == 1 && len(subs[0].pts) == 2 && strings.Contains(e.attrs["style"], "stroke-width:2.6") {
			segs = append(segs, segment{subs[0].pts[0], subs[0].pts[1], e.attrs["style"]})
		}
	}
	want := []string{
		"stroke:#000000;stroke-width:2.6\"",
		"stroke:#0072B2;stroke-width:2.6;stroke-dasharray:7,3.5",
		"stroke:#D55E00;stroke-width:2.6;stroke-dasharray:7,2.5,1.5,2.5",
		"stroke:#009E73;stroke-width:2.6;stroke-dasharray:7,2.5,1.5,2.5",
		"stroke:#000000;stroke-width:2.6\"",
		"stroke:#0072B2;stroke-width:2.6;stroke-dasharray:7,3.5",
	}
	n := len(m.Polygon)
	// Try each segment as side 0 to fix the map (x, y) ↦ o + s·(x, y).
	matched := false
	for _, first := range segs {
		v0, v1 := m.Polygon[0], m.Polygon[1]
		scale := math.Hypot(first.b[0]-first.a[0], first.b[1]-first.a[1]) / math.Hypot(v1[0]-v0[0], v1[1]-v0[1])
		ox, oy := first.a[0]-scale*v0[0], first.a[1]-scale*v0[1]
		at := func(v [2]float64) [2]float64 { return [2]float64{ox + scale*v[0], oy + scale*v[1]} }
		near := func(p, q [2]float64) bool { return abs(p[0]-q[0]) < 0.02 && abs(p[1]-q[1]) < 0.02 }
		all := true
		for i := range n {
			a, b := at(m.Polygon[i]), at(m.Polygon[(i+1)%n])
			found := slices.ContainsFunc(segs, func(s segment) bool {
				return near(s.a, a) && near(s.b, b) && strings.Contains(s.style+"\"", want[i])
			})
			all = all && found
		}
		if all {
			matched = true
			break
		}
	}
	if !matched {
		for _, s := range segs {
			t.Logf("segment %v–%v %s", s.a, s.b, s.style)
		}
		t.Error("the sides are not drawn one segment each in the style of their condition")
	}
	text := texts(elems)
	legend := []string{"Dirichlet: u = 0", "Neumann: ∂u/∂n = 0", "Robin: ∂u/∂n + αu = 0, α = 5", "Robin: ∂u/∂n + αu = 0, α = 1/2"}
	for _, w := range legend {
		if c := strings.Count(strings.Join(text, "\n")+"\n", w+"\n"); c != 1 {
			t.Errorf("legend entry %q appears %d times, want once", w, c)
		}
	}
	// Without conditions the mesh has no legend.
	plain := t.TempDir()
	if _, err := Write(plain, lShape(), []string{"svg"}); err != nil {
		t.Fatal(err)
	}
	for _, s := range texts(parseSVG(t, filepath.Join(plain, "mesh.svg"))) {
		if strings.Contains(s, "Dirichlet") {
			t.Errorf("legend %q without boundary conditions", s)
		}
	}
}

// TestDeterministic writes every picture twice and compares the bytes.
func TestDeterministic(t *testing.T) {
	for _, m := range []*Modes{sineModes(), unitSquare(), lShape(), lShapeMixed(), sineMixed()} {
		d1, d2 := t.TempDir(), t.TempDir()
		p1, err1 := Write(d1, m, Formats())
		p2, err2 := Write(d2, m, Formats())
		if err1 != nil || err2 != nil {
			t.Fatal(err1, err2)
		}
		for i := range p1 {
			b1, _ := os.ReadFile(p1[i])
			b2, _ := os.ReadFile(p2[i])
			if len(b1) == 0 || !bytes.Equal(b1, b2) {
				t.Errorf("%s: %d and %d bytes, not identical", filepath.Base(p1[i]), len(b1), len(b2))
			}
		}
	}
}

func TestWriteErrors(t *testing.T) {
	nan := func(m *Modes) *Modes {
		m.Eval = func(k int, x, y float64) float64 {
			if k == 1 && x > 0.5 {
				return math.NaN()
			}
			return math.Sin(math.Pi * x)
		}
		return m
	}
	zero := func(m *Modes) *Modes {
		m.Eval = func(int, float64, float64) float64 { return 0 }
		return m
	}
	inf := func(m *Modes) *Modes {
		m.Eval = func(_ int, x, y float64) float64 { return 1 / (x - 0.5) }
		m.Samples = 11 // hits x = 0.5 exactly
		return m
	}
	for _, tc := range []struct {
		name    string
		modes   *Modes
		formats []string
		want    string
		mode    int // for a *ModeError, else -1
	}{
		{"no formats", sineModes(), nil, "no formats", -1},
		{"unknown format", sineModes(), []string{"png", "pdf"}, `formats[1]: unknown format "pdf"`, -1},
		{"upper case", sineModes(), []string{"SVG"}, `unknown format "SVG"`, -1},
		{"repeated", sineModes(), []string{"svg", "png", "svg"}, `formats[2]: format "svg" repeats formats[0]`, -1},
		{"NaN 1D", nan(sineModes()), []string{"png"}, "mode 2 (Eval index 1) is NaN at x = 0.5025", 1},
		{"zero 1D", zero(sineModes()), []string{"png"}, "mode 1 (Eval index 0) is zero at every sample point", 0},
		{"Inf 1D", inf(sineModes()), []string{"svg"}, "is +Inf at x = 0.5", 0},
		{"zero 2D", zero(unitSquare()), []string{"svg"}, "mode 1 (Eval index 0) is zero", 0},
		{"NaN 2D", nan(lShape()), []string{"svg"}, "is NaN at (x, y) = (", 1},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if tc.name == "NaN 2D" {
				tc.modes.Labels = append(tc.modes.Labels, "second")
			}
			dir := filepath.Join(t.TempDir(), "out")
			paths, err := Write(dir, tc.modes, tc.formats)
			if err == nil || !strings.Contains(err.Error(), tc.want) || strings.HasPrefix(err.Error(), "plot: ") {
				t.Fatalf("error %v, want one containing %q", err, tc.want)
			}
			if paths != nil {
				t.Errorf("paths %q written despite the error", paths)
			}
			if _, statErr := os.Stat(dir); !os.IsNotExist(statErr) {
				t.Errorf("output directory created despite the error")
			}
			var me *ModeError
			if errors.As(err, &me) != (tc.mode >= 0) || (me != nil && me.Mode != tc.mode) {
				t.Errorf("error %#v, want a *ModeError of mode %d", err, tc.mode)
			}
		})
	}
}

func TestWriteIOError(t *testing.T) {
	// A file where the directory should be.
	file := filepath.Join(t.TempDir(), "taken")
	if err := os.WriteFile(file, nil, 0o644); err != nil {
		t.Fatal(err)
	}
	if _, err := Write(file, sineModes(), []string{"png"}); err == nil {
		t.Error("no error writing into a regular file")
	}
}

func TestMisusePanics(t *testing.T) {
	for _, tc := range []struct {
		name   string
		modify func(m *Modes) *Modes
		want   string
	}{
		{"nil modes", func(*Modes) *Modes { return nil }, "plot: nil Modes"},
		{"nil eval", func(m *Modes) *Modes { m.Eval = nil; return m }, "plot: nil Eval"},
		{"no labels", func(m *Modes) *Modes { m.Labels = nil; return m }, "plot: no modes"},
		{"one sample", func(m *Modes) *Modes { m.Samples = 1; return m }, "plot: Samples"},
		{"negative samples", func(m *Modes) *Modes { m.Samples = -3; return m }, "plot: Samples"},
		{"empty interval", func(m *Modes) *Modes { m.Interval = [2]float64{1, 1}; return m }, "plot: Interval"},
		{"reversed interval", func(m *Modes) *Modes { m.Interval = [2]float64{1, 0}; return m }, "plot: Interval"},
		{"infinite interval", func(m *Modes) *Modes { m.Interval[1] = math.Inf(1); return m }, "plot: Interval"},
		{"1D triangles", func(m *Modes) *Modes { m.Triangles = unitSquare().Triangles; return m }, "plot: Triangles given"},
		{"two vertices", func(m *Modes) *Modes { m.Polygon = [][2]float64{{0, 0}, {1, 1}}; return m }, "plot: Polygon has fewer"},
		{"flat polygon", func(m *Modes) *Modes { m.Polygon = [][2]float64{{0, 0}, {1, 0}, {2, 0}}; return m }, "plot: Polygon has an empty"},
		{"NaN vertex", func(m *Modes) *Modes { m.Polygon = [][2]float64{{0, 0}, {1, math.NaN()}, {0, 1}}; return m }, "plot: Polygon vertex"},
		{"1D boundary of 3", func(m *Modes) *Modes { m.Boundary = make([]Side, 3); return m }, "plot: Boundary has 3 sides, want 2"},
		{"unknown side kind", func(m *Modes) *Modes { m.Boundary = []Side{{Kind: "Dirichlet"}, {Kind: NeumannSide}}; return m }, `plot: Boundary[0]: unknown kind "Dirichlet"`},
		{"Robin without alpha", func(m *Modes) *Modes { m.Boundary = []Side{{Kind: RobinSide}, {Kind: NeumannSide}}; return m }, "plot: Boundary[0]: Alpha"},
		{"alpha without Robin", func(m *Modes) *Modes {
			m.Boundary = []Side{{Kind: DirichletSide}, {Kind: NeumannSide, Alpha: "1"}}
			return m
		}, "plot: Boundary[1]: Alpha"},
		{"2D boundary short", func(m *Modes) *Modes {
			m.Polygon = unitSquare().Polygon
			m.Boundary = make([]Side, 3)
			return m
		}, "plot: Boundary has 3 sides, want 4"},
		{"NaN triangle", func(m *Modes) *Modes {
			m.Polygon = unitSquare().Polygon
			m.Triangles = [][3][2]float64{{{0, 0}, {1, 0}, {math.NaN(), 1}}}
			return m
		}, "plot: Triangles vertex"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			m := tc.modify(sineModes())
			defer func() {
				r := recover()
				if msg, _ := r.(string); !strings.HasPrefix(msg, tc.want) {
					t.Errorf("panic %v, want %q", r, tc.want)
				}
			}()
			Write(t.TempDir(), m, []string{"png"})
		})
	}
}

func TestInside(t *testing.T) {
	lPoly := lShape().Polygon
	triangle := [][2]float64{{0, 0}, {4, 0}, {0, 3}}
	clockwise := [][2]float64{{0, 0}, {0, 3}, {4, 0}}
	for _, tc := range []struct {
		poly [][2]float64
		x, y float64
		want bool
	}{
		{lPoly, 0.5, 0.5, true},
		{lPoly, 1.5, 0.5, true},
		{lPoly, 0.5, 1.5, true},
		{lPoly, 1.5, 1.5, false}, // the removed square
		{lPoly, 0.99, 1.99, true},
		{lPoly, 1.01, 1.01, false},
		{lPoly, -0.1, 0.5, false},
		{lPoly, 2.1, 0.5, false},
		{lPoly, 0.5, 2.1, false},
		{triangle, 1, 1, true}, // 3x + 4y = 7 < 12
		{triangle, 2, 1.4, true},
		{triangle, 2, 1.6, false}, // 6 + 6.4 > 12
		{clockwise, 2, 1.4, true}, // orientation does not matter
		{clockwise, 3, 1, false},
	} {
		if got := inside(tc.poly, tc.x, tc.y); got != tc.want {
			t.Errorf("inside(%v, %g, %g) = %v, want %v", tc.poly, tc.x, tc.y, got, tc.want)
		}
	}
}

func TestNormalise(t *testing.T) {
	nan := math.NaN()
	for _, tc := range []struct {
		in, want []float64
		ok       bool
	}{
		{[]float64{1, -4, 2}, []float64{-0.25, 1, -0.5}, true},
		{[]float64{3, -3}, []float64{1, -1}, true}, // first of equal magnitudes
		{[]float64{nan, 0.5, nan, -0.25}, []float64{nan, 1, nan, -0.5}, true},
		{[]float64{0, 0}, []float64{0, 0}, false},
		{[]float64{nan}, []float64{nan}, false},
		{[]float64{0.1, 0.3, 0.7}, nil, true}, // checked by the bound below
	} {
		u := slices.Clone(tc.in)
		if ok := normalise(u); ok != tc.ok {
			t.Errorf("normalise(%v) ok = %v, want %v", tc.in, ok, tc.ok)
		}
		if tc.want != nil && !slices.EqualFunc(u, tc.want, func(a, b float64) bool { return a == b || math.IsNaN(a) && math.IsNaN(b) }) {
			t.Errorf("normalise(%v) = %v, want %v", tc.in, u, tc.want)
		}
		for _, v := range u {
			if abs(v) > 1 {
				t.Errorf("normalise(%v) = %v: entry beyond 1", tc.in, u)
			}
		}
	}
}

func TestDrawable(t *testing.T) {
	for _, tc := range []struct{ in, want string }{
		{"λ1 ∈ [9.8696, 9.8697]", "λ1 in [9.8696, 9.8697]"},
		{"λ2 − λ1 ≥ 3π²/D²", "λ2 − λ1 ≥ 3π²/D²"}, // all in the font
		{"x ∉ A ⊆ B", "x not in A subset of B"},
		{"a ⊗ b\nc", "a ? b\nc"},
	} {
		if got := drawable(tc.in); got != tc.want {
			t.Errorf("drawable(%q) = %q, want %q", tc.in, got, tc.want)
		}
	}
}

func BenchmarkWrite(b *testing.B) {
	for _, bc := range []struct {
		name   string
		modes  *Modes
		format string
	}{
		{"interval/png", sineModes(), "png"},
		{"interval/svg", sineModes(), "svg"},
		{"lshape/png", lShape(), "png"},
		{"lshape/svg", lShape(), "svg"},
	} {
		b.Run(bc.name, func(b *testing.B) {
			dir := b.TempDir()
			for b.Loop() {
				if _, err := Write(dir, bc.modes, []string{bc.format}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// compareGolden compares the structure of a picture with its golden file
// (written instead with -update).
func compareGolden(t *testing.T, got svgSummary, golden string) {
	t.Helper()
	if *update {
		data, err := json.MarshalIndent(got, "", "\t")
		if err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(golden, append(data, '\n'), 0o644); err != nil {
			t.Fatal(err)
		}
		return
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
		b, _ := json.MarshalIndent(got, "", "\t")
		t.Errorf("structure differs from %s; got\n%s", golden, b)
	}
}
