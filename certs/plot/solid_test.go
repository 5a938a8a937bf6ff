package plot

import (
	"encoding/json"
	"errors"
	"math"
	"math/big"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"gapcert/fem/problem"
	"gapcert/interval"
)

// polyhedronProblem returns the problem of the given polyhedron with the
// given boundary entry (JSON).
func polyhedronProblem(t testing.TB, name string, vertices [][3]string, faces [][]int, bnd string) *problem.Problem {
	t.Helper()
	v, _ := json.Marshal(vertices)
	f, _ := json.Marshal(faces)
	p, err := problem.Parse([]byte(`{"name": "` + name + `", "domain": {"polyhedron": {"vertices": ` + string(v) +
		`, "faces": ` + string(f) + `}}, "boundary": ` + bnd + `}`))
	if err != nil {
		t.Fatal(err)
	}
	return p
}

var (
	cubeVertices = [][3]string{{"0", "0", "0"}, {"1", "0", "0"}, {"1", "1", "0"}, {"0", "1", "0"}, {"0", "0", "1"}, {"1", "0", "1"}, {"1", "1", "1"}, {"0", "1", "1"}}
	cubeFaces    = [][]int{{0, 3, 2, 1}, {4, 5, 6, 7}, {0, 1, 5, 4}, {1, 2, 6, 5}, {2, 3, 7, 6}, {3, 0, 4, 7}}
	// Regular tetrahedron of unit edge; apex height √6/3 (elementary
	// geometry, common practice).
	tetVertices = [][3]string{{"0", "0", "0"}, {"1", "0", "0"}, {"1/2", "sqrt(3)/2", "0"}, {"1/2", "sqrt(3)/6", "sqrt(6)/3"}}
	tetFaces    = [][]int{{0, 2, 1}, {0, 1, 3}, {1, 2, 3}, {2, 0, 3}}
	// Prism of height 1 over the equilateral triangle of unit edge.
	prismVertices = [][3]string{{"0", "0", "0"}, {"1", "0", "0"}, {"1/2", "sqrt(3)/2", "0"}, {"0", "0", "1"}, {"1", "0", "1"}, {"1/2", "sqrt(3)/2", "1"}}
	prismFaces    = [][]int{{0, 2, 1}, {3, 4, 5}, {0, 1, 4, 3}, {1, 2, 5, 4}, {2, 0, 3, 5}}
	// The L-shaped prism [−1, 1]² ∖ [0, 1]² × [0, 1]; its re-entrant edge
	// joins vertices 3 and 9.
	lPrismVertices = [][3]string{{"-1", "-1", "0"}, {"1", "-1", "0"}, {"1", "0", "0"}, {"0", "0", "0"}, {"0", "1", "0"}, {"-1", "1", "0"},
		{"-1", "-1", "1"}, {"1", "-1", "1"}, {"1", "0", "1"}, {"0", "0", "1"}, {"0", "1", "1"}, {"-1", "1", "1"}}
	lPrismFaces = [][]int{{0, 5, 4, 3, 2, 1}, {6, 7, 8, 9, 10, 11}, {0, 1, 7, 6}, {1, 2, 8, 7}, {2, 3, 9, 8}, {3, 4, 10, 9}, {4, 5, 11, 10}, {5, 0, 6, 11}}
	// The unit cube with a pyramid dent of apex (1/2, 1/2, 3/4) in its top
	// face: not convex.
	dentVertices = append(slices.Clone(cubeVertices), [3]string{"1/2", "1/2", "3/4"})
	dentFaces    = [][]int{{0, 3, 2, 1}, {0, 1, 5, 4}, {1, 2, 6, 5}, {2, 3, 7, 6}, {3, 0, 4, 7}, {4, 5, 8}, {5, 6, 8}, {6, 7, 8}, {7, 4, 8}}
)

// TestWriteSolidFiles draws the cube (mixed conditions), the regular
// tetrahedron and the prism with their first two approximate modes on
// the default section, and checks that every file is written, nonempty,
// of the picture's width, and that the SVG texts say what is an
// approximation.
func TestWriteSolidFiles(t *testing.T) {
	for _, tc := range []struct {
		name     string
		vertices [][3]string
		faces    [][]int
		bnd      string
	}{
		{"cube", cubeVertices, cubeFaces, `["dirichlet", "neumann", "dirichlet", {"robin": "2"}, "dirichlet", "dirichlet"]`},
		{"regular tetrahedron", tetVertices, tetFaces, `"dirichlet"`},
		{"prism", prismVertices, prismFaces, `"dirichlet"`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			p := polyhedronProblem(t, tc.name, tc.vertices, tc.faces, tc.bnd)
			s := SolidOf(p)
			sec, err := MidSection(p.Polyhedron)
			if err != nil {
				t.Fatal(err)
			}
			modes, err := SolidModesOf(p, 2)
			if err != nil {
				t.Fatal(err)
			}
			s.Section, s.Eval, s.Triangles = sec, modes.Eval, modes.Triangles
			s.Labels = []string{"λ1 (approximate)", "λ2 (approximate)"}
			s.Samples = 60
			dir := t.TempDir()
			for _, ext := range []string{".png", ".svg"} {
				path := filepath.Join(dir, "solid"+ext)
				paths, err := WriteSolid(path, s)
				if err != nil {
					t.Fatal(err)
				}
				want := []string{path, filepath.Join(dir, "solid-mode1"+ext), filepath.Join(dir, "solid-mode2"+ext)}
				if !slices.Equal(paths, want) || !slices.Equal(SolidPaths(path, 2), want) {
					t.Fatalf("paths = %q, want %q", paths, want)
				}
				for i, p := range paths {
					st, err := os.Stat(p)
					if err != nil || st.Size() == 0 {
						t.Fatalf("%s: not written or empty (%v)", p, err)
					}
					if ext == ".png" {
						if w := decodePNG(t, p).Bounds().Dx(); w != 709 {
							t.Errorf("%s: width %d pixels, want 709", p, w)
						}
						continue
					}
					txt := texts(parseSVG(t, p))
					if !slices.Contains(txt, Caption) {
						t.Errorf("%s: no caption", p)
					}
					if i > 0 && !slices.Contains(txt, SliceNote) {
						t.Errorf("%s: no note %q in %q", p, SliceNote, txt)
					}
					if i == 0 && !slices.ContainsFunc(txt, func(s string) bool { return strings.HasPrefix(s, "slice z = ") }) {
						t.Errorf("%s: the slice is not in the legend: %q", p, txt)
					}
				}
			}
		})
	}
}

// ratIn reports whether the exact r lies in x.
func ratIn(r *big.Rat, x interval.I) bool {
	lo, hi := new(big.Rat).SetFloat64(x.Lo), new(big.Rat).SetFloat64(x.Hi)
	return lo.Cmp(r) <= 0 && r.Cmp(hi) <= 0
}

// checkLoop checks that loop encloses the exact points want (rationals
// "p/q"), in order, each coordinate within width tol.
func checkLoop(t *testing.T, loop [][2]interval.I, want [][2]string, tol float64) {
	t.Helper()
	if len(loop) != len(want) {
		t.Fatalf("loop %v has %d points, want %d (%v)", loop, len(loop), len(want), want)
	}
	for i, w := range want {
		for c := range 2 {
			r, _ := new(big.Rat).SetString(w[c])
			if !ratIn(r, loop[i][c]) || loop[i][c].Wid() > tol {
				t.Errorf("point %d coordinate %d: %v, want %s within width %g", i, c, loop[i][c], w[c], tol)
			}
		}
	}
}

// TestSectionCube checks the cross-sections of the unit cube by the
// planes x, y, z = 1/2: the unit square in the plane's coordinates,
// exactly (zero width: the crossing points are dyadic), counterclockwise
// from its lowest-left corner, each side on the face that holds it.
func TestSectionCube(t *testing.T) {
	p := polyhedronProblem(t, "cube", cubeVertices, cubeFaces, `"dirichlet"`)
	square := [][2]string{{"0", "0"}, {"1", "0"}, {"1", "1"}, {"0", "1"}}
	// The faces holding the sides (0,0)→(1,0), (1,0)→(1,1), … in (u, v):
	// for z = 1/2, y = 0 (face 2), x = 1 (3), y = 1 (4), x = 0 (5); for
	// x = 1/2, in (y, z): z = 0 (0), y = 1 (4), z = 1 (1), y = 0 (2).
	wantFaces := map[string][]int{"x": {0, 4, 1, 2}, "y": {0, 3, 1, 5}, "z": {2, 3, 4, 5}}
	for _, axis := range []string{"x", "y", "z"} {
		s, err := ParseSlice(axis + "=1/2")
		if err != nil {
			t.Fatal(err)
		}
		sec, err := NewSection(p.Polyhedron, s)
		if err != nil {
			t.Fatal(err)
		}
		if len(sec.Loops) != 1 {
			t.Fatalf("%s: %d loops, want 1", s, len(sec.Loops))
		}
		checkLoop(t, sec.Loops[0], square, 0)
		if !slices.Equal(sec.Faces[0], wantFaces[axis]) {
			t.Errorf("%s: faces of the sides %v, want %v", s, sec.Faces[0], wantFaces[axis])
		}
	}
	sec, err := MidSection(p.Polyhedron)
	if err != nil {
		t.Fatal(err)
	}
	if got := sec.Slice.String(); got != "z = 0.5" {
		t.Errorf("default slice %q, want z = 0.5", got)
	}
}

// TestSectionShapes checks sections whose corners are not dyadic: the
// regular tetrahedron at z = 1/4 (the base triangle shrunk toward the
// apex's foot (1/2, √3/6) by 1 − z/H, H = √6/3; elementary geometry), and
// the dented cube across y = 2/5, a hexagon with a reentrant corner: the
// dent's edges from (1, 0, 1) and (0, 0, 1) to the apex (1/2, 1/2, 3/4)
// cross y = 2/5 at 4/5 of their length, at (3/5, 4/5) and (2/5, 4/5) in
// (x, z) (hand computation).
func TestSectionShapes(t *testing.T) {
	tet := polyhedronProblem(t, "tetrahedron", tetVertices, tetFaces, `"dirichlet"`)
	s, _ := ParseSlice("z = 1/4")
	sec, err := NewSection(tet.Polyhedron, s)
	if err != nil {
		t.Fatal(err)
	}
	if len(sec.Loops) != 1 || len(sec.Loops[0]) != 3 {
		t.Fatalf("loops %v, want one triangle", sec.Loops)
	}
	f := 1 - 0.25/(math.Sqrt(6)/3)
	foot := [2]float64{0.5, math.Sqrt(3) / 6}
	base := [][2]float64{{0, 0}, {1, 0}, {0.5, math.Sqrt(3) / 2}}
	for i, b := range base {
		for c := range 2 {
			want := foot[c] + f*(b[c]-foot[c])
			got := sec.Loops[0][i][c]
			if math.Abs(got.Mid()-want) > 1e-14 || got.Wid() > 1e-14 {
				t.Errorf("corner %d coordinate %d: %v, want %v (within 1e-14)", i, c, got, want)
			}
		}
	}

	dent := polyhedronProblem(t, "dented cube", dentVertices, dentFaces, `"dirichlet"`)
	s, _ = ParseSlice("y=2/5")
	sec, err = NewSection(dent.Polyhedron, s)
	if err != nil {
		t.Fatal(err)
	}
	if len(sec.Loops) != 1 {
		t.Fatalf("%d loops, want 1", len(sec.Loops))
	}
	checkLoop(t, sec.Loops[0], [][2]string{{"0", "0"}, {"1", "0"}, {"1", "1"}, {"3/5", "4/5"}, {"2/5", "4/5"}, {"0", "1"}}, 1e-15)
}

// TestSliceRefusals checks that slices outside the solid, through a
// vertex, or badly written are refused with the reason, before any mode
// is computed (NewSection only reads the polyhedron).
func TestSliceRefusals(t *testing.T) {
	p := polyhedronProblem(t, "cube", cubeVertices, cubeFaces, `"dirichlet"`)
	for _, tc := range []struct{ slice, want string }{
		{"z=2", "slice z = 2: the plane misses the solid, whose z runs from 0 to 1 (hint: give a value strictly between 0 and 1)"},
		{"x=-1/3", "slice x = -1/3: the plane misses the solid, whose x runs from 0 to 1"},
		{"y=1", "slice y = 1: the plane misses the solid"},
		{"z=0", "slice z = 0: the plane misses the solid"},
	} {
		s, err := ParseSlice(tc.slice)
		if err != nil {
			t.Fatal(err)
		}
		_, err = NewSection(p.Polyhedron, s)
		var se *SliceError
		if !errors.As(err, &se) || !strings.HasPrefix(err.Error(), tc.want) {
			t.Errorf("%s: error %v, want a *SliceError starting %q", tc.slice, err, tc.want)
		}
	}
	dent := polyhedronProblem(t, "dented cube", dentVertices, dentFaces, `"dirichlet"`)
	s, _ := ParseSlice("z=0.75")
	if _, err := NewSection(dent.Polyhedron, s); err == nil || !strings.Contains(err.Error(), "passes through vertex 8") {
		t.Errorf("z = 3/4 through the dent's apex: error %v", err)
	}
	for _, bad := range []string{"w=1", "z", "z=abc", "=1", "z=1e"} {
		if _, err := ParseSlice(bad); err == nil || !strings.Contains(err.Error(), "hint: --slice") {
			t.Errorf("ParseSlice(%q): error %v, want one with a hint", bad, err)
		}
	}
}

// TestMidSectionAvoidsVertices checks that the default plane of the
// regular octahedron with vertices ±e_i, whose middle z = 0 holds four
// vertices, is moved off them, by a step of 0.01 (its height is 2) up.
func TestMidSectionAvoidsVertices(t *testing.T) {
	oct := polyhedronProblem(t, "octahedron", [][3]string{{"1", "0", "0"}, {"-1", "0", "0"}, {"0", "1", "0"}, {"0", "-1", "0"}, {"0", "0", "1"}, {"0", "0", "-1"}},
		[][]int{{0, 2, 4}, {2, 1, 4}, {1, 3, 4}, {3, 0, 4}, {2, 0, 5}, {1, 2, 5}, {3, 1, 5}, {0, 3, 5}}, `"dirichlet"`)
	sec, err := MidSection(oct.Polyhedron)
	if err != nil {
		t.Fatal(err)
	}
	if got := sec.Slice.String(); got != "z = 0.01" {
		t.Errorf("default slice %q, want z = 0.01", got)
	}
	if len(sec.Loops) != 1 || len(sec.Loops[0]) != 4 {
		t.Errorf("section %v, want one square", sec.Loops)
	}
}

// TestCubeModeOnSlice checks the approximate first Dirichlet mode of the
// unit cube on the section z = 1/2 against the exact eigenfunction
// sin(πx) sin(πy) sin(πz) (separation of variables, common practice),
// which is sin(πx) sin(πy) there: the correlation of the sampled values
// exceeds 0.99.
func TestCubeModeOnSlice(t *testing.T) {
	p := polyhedronProblem(t, "cube", cubeVertices, cubeFaces, `"dirichlet"`)
	modes, err := SolidModesOf(p, 1)
	if err != nil {
		t.Fatal(err)
	}
	s := SolidOf(p)
	s.Section, _ = MidSection(p.Polyhedron)
	s.Eval, s.Labels, s.Samples = modes.Eval, []string{"λ1"}, 40
	g, err := sampleSection(s, 0)
	if err != nil {
		t.Fatal(err)
	}
	var a, b []float64
	for r := range g.ny {
		for c := range g.nx {
			if z := g.Z(c, r); !math.IsNaN(z) {
				a = append(a, z)
				b = append(b, math.Sin(math.Pi*g.X(c))*math.Sin(math.Pi*g.Y(r)))
			}
		}
	}
	if len(a) != 40*40 {
		t.Fatalf("%d samples inside the square, want 1600", len(a))
	}
	if r := correlation(a, b); !(r > 0.99) {
		t.Errorf("correlation with sin(πx)sin(πy) = %v, want > 0.99", r)
	} else {
		t.Logf("correlation %.6f (P_%d, %d unknowns, %d refinements)", r, modes.Degree, modes.Unknowns, modes.Levels)
	}
}

// correlation returns Pearson's correlation coefficient of a and b.
func correlation(a, b []float64) float64 {
	n := float64(len(a))
	var ma, mb float64
	for i := range a {
		ma += a[i] / n
		mb += b[i] / n
	}
	var sab, saa, sbb float64
	for i := range a {
		sab += (a[i] - ma) * (b[i] - mb)
		saa += (a[i] - ma) * (a[i] - ma)
		sbb += (b[i] - mb) * (b[i] - mb)
	}
	return sab / math.Sqrt(saa*sbb)
}

// cubeSolid is the unit cube with a condition of every kind and the
// exact first Dirichlet mode sin(πx) sin(πy) sin(πz) (closed form; the
// mode of a cube with these conditions is not, but only the drawing
// matters), sectioned at z = 1/2, with the 12 triangles of its faces as
// the mesh.
func cubeSolid(t *testing.T) *Solid {
	p := polyhedronProblem(t, "unit cube, mixed conditions", cubeVertices, cubeFaces,
		`["dirichlet", "neumann", "dirichlet", {"robin": "2"}, "dirichlet", {"robin": "1/2"}]`)
	s := SolidOf(p)
	var err error
	if s.Section, err = MidSection(p.Polyhedron); err != nil {
		t.Fatal(err)
	}
	for k, tr := range p.Polyhedron.Triangles() {
		ft := FaceTriangle{Face: p.Polyhedron.TriangleFaces()[k]}
		for j, v := range tr {
			ft.Corners[j] = s.Vertices[v]
		}
		s.Triangles = append(s.Triangles, ft)
	}
	s.Labels = []string{"sin(πx) sin(πy) sin(πz)"}
	s.Eval = func(_ int, x, y, z float64) float64 {
		return math.Sin(math.Pi*x) * math.Sin(math.Pi*y) * math.Sin(math.Pi*z)
	}
	s.Samples = 50
	return s
}

// TestGoldenSolid compares the structure of the SVG pictures of
// cubeSolid with testdata/cube_solid*.golden.json; run with -update to
// rewrite them.
func TestGoldenSolid(t *testing.T) {
	dir := t.TempDir()
	paths, err := WriteSolid(filepath.Join(dir, "cube.svg"), cubeSolid(t))
	if err != nil {
		t.Fatal(err)
	}
	for i, golden := range []string{"cube_solid", "cube_solid_mode1"} {
		compareGolden(t, summarise(t, paths[i]), filepath.Join("testdata", golden+".golden.json"))
	}
}

// TestSolidFrontFaces checks which faces of the unit cube the view shows
// from the front: the top (face 1), y = 0 (face 2) and x = 1 (face 3), as
// the viewer looks from the front right and above.
func TestSolidFrontFaces(t *testing.T) {
	s := cubeSolid(t)
	var front []int
	for i, f := range s.Faces {
		var pts [][3]float64
		for _, k := range f {
			pts = append(pts, s.Vertices[k])
		}
		if dot3(faceNormal(pts), view.eye) > 0 {
			front = append(front, i)
		}
	}
	if !slices.Equal(front, []int{1, 2, 3}) {
		t.Errorf("front faces %v, want [1 2 3]", front)
	}
}

// TestSolidOfBoundary checks the face conditions of SolidOf: kinds in
// the order of the faces, a Robin coefficient as written, and a
// parameter's name with its value.
func TestSolidOfBoundary(t *testing.T) {
	v, _ := json.Marshal(tetVertices)
	f, _ := json.Marshal(tetFaces)
	p, err := problem.Parse([]byte(`{"domain": {"polyhedron": {"vertices": ` + string(v) + `, "faces": ` + string(f) +
		`}}, "parameters": {"a": "3/4"}, "boundary": ["dirichlet", {"robin": "a"}, {"robin": "2.5"}, "neumann"]}`))
	if err != nil {
		t.Fatal(err)
	}
	want := []Side{{Kind: DirichletSide}, {Kind: RobinSide, Alpha: "a = 0.75"}, {Kind: RobinSide, Alpha: "2.5"}, {Kind: NeumannSide}}
	if got := SolidOf(p).Boundary; !slices.Equal(got, want) {
		t.Errorf("sides %v, want %v", got, want)
	}
}

// TestPickSectionAvoidsNodalPlanes checks the default section of the box
// [0, 1]² × [0, 2] with its first two Dirichlet eigenfunctions
// sin(πx) sin(πy) sin(πz/2) and sin(πx) sin(πy) sin(πz) (separation of
// variables, common practice): the second vanishes on z = 1, the first
// candidate, so the section across x about halfway is drawn; with the
// first mode alone, z = 1 is.
func TestPickSectionAvoidsNodalPlanes(t *testing.T) {
	tall := slices.Clone(cubeVertices)
	for i := 4; i < 8; i++ {
		tall[i][2] = "2"
	}
	p := polyhedronProblem(t, "tall box", tall, cubeFaces, `"dirichlet"`)
	secs, err := DefaultSections(p.Polyhedron)
	if err != nil {
		t.Fatal(err)
	}
	var names []string
	for _, sec := range secs {
		names = append(names, sec.Slice.String())
	}
	if want := []string{"z = 1", "x = 0.5", "y = 0.5"}; !slices.Equal(names, want) {
		t.Fatalf("candidates %q, want %q", names, want)
	}
	s := SolidOf(p)
	s.Eval = func(k int, x, y, z float64) float64 {
		return math.Sin(math.Pi*x) * math.Sin(math.Pi*y) * math.Sin(float64(k+1)*math.Pi*z/2)
	}
	s.Labels = []string{"λ1", "λ2"}
	if got := PickSection(s, secs).Slice.String(); got != "x = 0.5" {
		t.Errorf("two modes: section %s, want x = 0.5", got)
	}
	s.Labels = s.Labels[:1]
	if got := PickSection(s, secs).Slice.String(); got != "z = 1" {
		t.Errorf("first mode: section %s, want z = 1", got)
	}
}
