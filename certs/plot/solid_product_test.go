package plot

import (
	"bytes"
	"context"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"
	"time"

	"gapcert/certs"
	"gapcert/certs/certify"
	"gapcert/fem/problem"
)

func parseProblem(t *testing.T, text string) *problem.Problem {
	t.Helper()
	p, err := problem.Parse([]byte(text))
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// faceAxis returns the axis c and value on which every vertex of face f
// of s lies (c = −1 if none).
func faceAxis(s *Solid, f []int) (int, float64) {
	for c := range 3 {
		v := s.Vertices[f[0]][c]
		if !slices.ContainsFunc(f, func(k int) bool { return s.Vertices[k][c] != v }) {
			return c, v
		}
	}
	return -1, 0
}

// TestProductPolyhedron checks the polyhedra of a box with a condition
// of every kind and of the prisms over a triangle in both factor orders:
// each face lies in the plane of the facet it comes from and carries
// that facet's condition, and the exact volume (the reader's enclosure)
// is the product's.
func TestProductPolyhedron(t *testing.T) {
	box := parseProblem(t, `{"name": "box", "domain": {"product": [{"interval": ["0", "1"]}, {"interval": ["0", "2"]}, {"interval": ["0", "1/2"]}]},
		"parameters": {"a": "3/2"}, "boundary": ["dirichlet", ["neumann", {"robin": "a"}], ["dirichlet", "neumann"]]}`)
	ph, err := ProductPolyhedron(box)
	if err != nil {
		t.Fatal(err)
	}
	s := SolidOf(ph)
	// Faces: z = 0, z = 1/2, then the rectangle's sides y = 0, x = 1,
	// y = 2, x = 0.
	type plane struct {
		axis  int
		value float64
		side  Side
	}
	want := []plane{{2, 0, Side{Kind: DirichletSide}}, {2, 0.5, Side{Kind: NeumannSide}}, {1, 0, Side{Kind: NeumannSide}},
		{0, 1, Side{Kind: DirichletSide}}, {1, 2, Side{Kind: RobinSide, Alpha: "a = 1.5"}}, {0, 0, Side{Kind: DirichletSide}}}
	if len(s.Faces) != len(want) || len(s.Vertices) != 8 {
		t.Fatalf("%d vertices, faces %v", len(s.Vertices), s.Faces)
	}
	for i, w := range want {
		if c, v := faceAxis(s, s.Faces[i]); c != w.axis || v != w.value || s.Boundary[i] != w.side {
			t.Errorf("face %d: axis %d = %v, %v; want axis %d = %v, %v", i, c, v, s.Boundary[i], w.axis, w.value, w.side)
		}
	}
	if v, w := ph.Polyhedron.Volume(), box.Volume(); !v.Contains(1) || !w.Contains(1) {
		t.Errorf("volume %v, want 1 (the product's %v)", v, box.Volume())
	}

	triangle := `{"polygon": [["0","0"], ["1","0"], ["3/10","7/10"]]}`
	for _, tc := range []struct {
		name, domain, boundary string
		axis                   int // the interval's coordinate
	}{
		{"triangle × interval", triangle + `, {"interval": ["0", "2"]}`, `[["dirichlet", "neumann", {"robin": "1"}], ["neumann", "dirichlet"]]`, 2},
		{"interval × triangle", `{"interval": ["0", "2"]}, ` + triangle, `[["neumann", "dirichlet"], ["dirichlet", "neumann", {"robin": "1"}]]`, 0},
	} {
		t.Run(tc.name, func(t *testing.T) {
			p := parseProblem(t, `{"domain": {"product": [`+tc.domain+`]}, "boundary": `+tc.boundary+`}`)
			ph, err := ProductPolyhedron(p)
			if err != nil {
				t.Fatal(err)
			}
			s := SolidOf(ph)
			if len(s.Faces) != 5 || len(s.Vertices) != 6 {
				t.Fatalf("%d vertices, faces %v", len(s.Vertices), s.Faces)
			}
			// The ends of the interval: Neumann at 0, Dirichlet at 2;
			// the side faces: the triangle's conditions in order.
			for i, w := range []struct {
				value float64
				side  Side
			}{{0, Side{Kind: NeumannSide}}, {2, Side{Kind: DirichletSide}}} {
				if c, v := faceAxis(s, s.Faces[i]); c != tc.axis || v != w.value || s.Boundary[i] != w.side {
					t.Errorf("end face %d: axis %d = %v, %v", i, c, v, s.Boundary[i])
				}
			}
			sides := []Side{{Kind: DirichletSide}, {Kind: NeumannSide}, {Kind: RobinSide, Alpha: "1"}}
			if !slices.Equal(s.Boundary[2:], sides) {
				t.Errorf("side conditions %v, want %v", s.Boundary[2:], sides)
			}
			// Volume: the triangle's area 7/20 times 2.
			if v := ph.Polyhedron.Volume(); !v.Contains(0.7) || v.Wid() > 1e-15 {
				t.Errorf("volume %v, want 7/10", v)
			}
		})
	}

	for _, tc := range []struct{ text, want string }{
		{`{"domain": {"product": [{"interval": ["0","1"]}, {"interval": ["0","1"]}, {"interval": ["0","1"]}, {"interval": ["0","1"]}]}, "boundary": ["dirichlet", "dirichlet", "dirichlet", "dirichlet"]}`,
			"a product with 4 coordinates is not drawn"},
	} {
		if _, err := ProductPolyhedron(parseProblem(t, tc.text)); err == nil || !strings.HasPrefix(err.Error(), tc.want) {
			t.Errorf("error %v, want %q", err, tc.want)
		}
	}
}

// certified returns the certificate of p at the relative width target.
func certified(t *testing.T, p *problem.Problem, target string) *certs.Certificate {
	t.Helper()
	c, err := certify.Certify(context.Background(), p, certify.Options{RelWidth: target, TimeLimit: time.Minute})
	if err != nil {
		t.Fatal(err)
	}
	return c
}

// sliceValues samples mode k of s on its section (40 cells a side) and
// returns the values inside it with f at the same points of the plane.
func sliceValues(t *testing.T, s *Solid, k int, f func(u, v float64) float64) (got, want []float64) {
	t.Helper()
	s.Samples = 40
	g, err := sampleSection(s, k)
	if err != nil {
		t.Fatal(err)
	}
	for r := range g.ny {
		for c := range g.nx {
			if z := g.Z(c, r); !math.IsNaN(z) {
				got = append(got, z)
				want = append(want, f(g.X(c), g.Y(r)))
			}
		}
	}
	return got, want
}

// TestProductModesOnSlice checks the modes of the unit cube given as a
// product of three Dirichlet intervals on the section z = 1/2 against the
// exact eigenfunctions (separation of variables, common practice): λ1's
// is sin(πx) sin(πy) sin(πz), sin(πx) sin(πy) there; λ2 = 6π² is triple,
// and with the three factors' gaps certified equal, the mode doubles the
// frequency of the first factor, sin(2πx) sin(πy) sin(πz). Both
// correlations exceed 0.999 in magnitude.
func TestProductModesOnSlice(t *testing.T) {
	p := parseProblem(t, `{"name": "cube", "domain": {"product": [{"interval": ["0","1"]}, {"interval": ["0","1"]}, {"interval": ["0","1"]}]},
		"boundary": ["dirichlet", "dirichlet", "dirichlet"]}`)
	c := certified(t, p, "1e-6")
	modes, err := ProductModesOf(p, c)
	if err != nil {
		t.Fatal(err)
	}
	if modes.Second != 0 {
		t.Errorf("λ2 from factor %d's second mode, want factor 0 (the first of three equal gaps)", modes.Second)
	}
	ph, err := ProductPolyhedron(p)
	if err != nil {
		t.Fatal(err)
	}
	s := SolidOf(ph)
	if s.Section, err = MidSection(ph.Polyhedron); err != nil {
		t.Fatal(err)
	}
	s.Eval, s.Labels = modes.Eval, []string{"λ1", "λ2"}
	for k, f := range []func(x, y float64) float64{
		func(x, y float64) float64 { return math.Sin(math.Pi*x) * math.Sin(math.Pi*y) },
		func(x, y float64) float64 { return math.Sin(2*math.Pi*x) * math.Sin(math.Pi*y) },
	} {
		got, want := sliceValues(t, s, k, f)
		if r := correlation(got, want); !(math.Abs(r) > 0.999) {
			t.Errorf("mode %d: correlation %v with the exact eigenfunction, want |r| > 0.999", k+1, r)
		}
	}
}

// TestSolidModesFor checks that the modes of a polyhedron certificate
// are solved on its recorded trial space (degree and refinements of its
// method) when that is small, with the first correlating with the exact
// sin(πx) sin(πy) on z = 1/2 (as TestCubeModeOnSlice), and on the
// picture's own space, with the reason, when it is larger than
// certifiedModeUnknowns (refused before anything is solved).
func TestSolidModesFor(t *testing.T) {
	p := polyhedronProblem(t, "cube", cubeVertices, cubeFaces, `"dirichlet"`)
	method := func(degree, refinements int) *certs.Certificate {
		m, _ := json.Marshal(certify.Method{Kind: certify.KindPolyhedron, Degree: degree, Refinements: refinements})
		return &certs.Certificate{Method: m}
	}
	modes, own, err := SolidModesFor(p, method(4, 1), 1)
	if err != nil || own != nil || modes.Degree != 4 || modes.Levels != 1 {
		t.Fatalf("modes %+v, own %v, error %v; want P_4 on 1 refinement", modes, own, err)
	}
	s := SolidOf(p)
	s.Section, _ = MidSection(p.Polyhedron)
	s.Eval, s.Labels = modes.Eval, []string{"λ1"}
	got, want := sliceValues(t, s, 0, func(x, y float64) float64 { return math.Sin(math.Pi*x) * math.Sin(math.Pi*y) })
	if r := correlation(got, want); !(r > 0.99) {
		t.Errorf("correlation %v with sin(πx)sin(πy), want > 0.99", r)
	}
	own2, _ := SolidModesOf(p, 1)
	modes, own, err = SolidModesFor(p, method(8, 2), 1)
	if err != nil || own == nil || own.Unknowns <= certifiedModeUnknowns || modes.Degree != own2.Degree || modes.Levels != own2.Levels {
		t.Errorf("P_8 on 2 refinements: modes P_%d on %d, own %v, error %v; want the picture's own space with the reason", modes.Degree, modes.Levels, own, err)
	}
	if _, _, err := SolidModesFor(p, method(0, 1), 1); err == nil {
		t.Error("a method of degree 0 is accepted")
	}
}

// TestGoldenProductSolid compares the structure of the SVG picture of a
// prism over a triangle given as a product (its polyhedron, faces by
// condition, the default section, with a line of text in the place of
// the certified enclosures) with testdata/prism_product_solid.golden.json; run with
// -update to rewrite it.
func TestGoldenProductSolid(t *testing.T) {
	p := parseProblem(t, `{"name": "prism over a triangle", "domain": {"product": [{"polygon": [["0","0"], ["1","0"], ["3/10","7/10"]]}, {"interval": ["0", "1"]}]},
		"boundary": [["dirichlet", {"robin": "2"}, "neumann"], ["dirichlet", "neumann"]]}`)
	ph, err := ProductPolyhedron(p)
	if err != nil {
		t.Fatal(err)
	}
	s := SolidOf(ph)
	if s.Section, err = MidSection(ph.Polyhedron); err != nil {
		t.Fatal(err)
	}
	s.Certified = []string{"the caller's certified line of λ1"}
	paths, err := WriteSolidDir(t.TempDir(), s, []string{"svg"})
	if err != nil {
		t.Fatal(err)
	}
	compareGolden(t, summarise(t, paths[0]), filepath.Join("testdata", "prism_product_solid.golden.json"))
}

// TestWriteSolidDirDeterministic draws a certified box's solid and the
// products of its factors' modes twice, in both formats, and checks that
// the files are the same, byte for byte, in the order of WriteSolidDir.
func TestWriteSolidDirDeterministic(t *testing.T) {
	p := parseProblem(t, `{"name": "box", "domain": {"product": [{"interval": ["0","1"]}, {"interval": ["0","2"]}, {"interval": ["0","1/2"]}]},
		"potential": "x^2 + z", "boundary": ["dirichlet", ["neumann", {"robin": "1"}], ["dirichlet", "neumann"]]}`)
	c := certified(t, p, "1e-4")
	var runs [2][][]byte
	var names [2][]string
	for i := range runs {
		modes, err := ProductModesOf(p, c)
		if err != nil {
			t.Fatal(err)
		}
		ph, err := ProductPolyhedron(p)
		if err != nil {
			t.Fatal(err)
		}
		s := SolidOf(ph)
		secs, err := DefaultSections(ph.Polyhedron)
		if err != nil {
			t.Fatal(err)
		}
		s.Eval, s.Labels, s.Samples = modes.Eval, []string{"λ1", "λ2"}, 40
		s.Section = PickSection(s, secs)
		paths, err := WriteSolidDir(t.TempDir(), s, Formats())
		if err != nil {
			t.Fatal(err)
		}
		for _, path := range paths {
			data, err := os.ReadFile(path)
			if err != nil {
				t.Fatal(err)
			}
			runs[i] = append(runs[i], data)
			names[i] = append(names[i], filepath.Base(path))
		}
	}
	want := []string{"solid.png", "solid.svg", "solid-mode1.png", "solid-mode1.svg", "solid-mode2.png", "solid-mode2.svg"}
	if !slices.Equal(names[0], want) || !slices.Equal(names[1], want) {
		t.Fatalf("files %q and %q, want %q", names[0], names[1], want)
	}
	for k := range runs[0] {
		if !bytes.Equal(runs[0][k], runs[1][k]) {
			t.Errorf("%s differs between two runs", want[k])
		}
	}
}

// TestSolidModesForGraded checks that the modes of a graded polyhedron
// certificate are solved on its graded trial mesh (the L-shaped prism
// [−1, 1]² ∖ [0, 1]² × [0, 1] graded once toward its re-entrant edge), as
// certify.PolyhedronTrialMesh builds it, not on the ungraded mesh of the
// same degree, and that a grading the certifier would refuse (on the
// cube, which has no singular edge) is refused here too.
func TestSolidModesForGraded(t *testing.T) {
	p := polyhedronProblem(t, "L-shaped prism", lPrismVertices, lPrismFaces, `"dirichlet"`)
	method := func(graded int) *certs.Certificate {
		m, _ := json.Marshal(certify.Method{Kind: certify.KindPolyhedron, Degree: 2, Refinements: 0, GradedLevels: graded})
		return &certs.Certificate{Method: m}
	}
	graded, own, err := SolidModesFor(p, method(1), 1)
	if err != nil || own != nil {
		t.Fatalf("graded: own %v, error %v", own, err)
	}
	plain, _, err := SolidModesFor(p, method(0), 1)
	if err != nil {
		t.Fatal(err)
	}
	mesh, err := certify.PolyhedronTrialMesh(p, 0, 1)
	if err != nil {
		t.Fatal(err)
	}
	if graded.Graded != 1 || graded.Levels != 0 || graded.Degree != 2 || len(graded.Triangles) != len(mesh.Mesh3().Bnd) {
		t.Errorf("graded modes: P_%d on %d refinements graded %d with %d boundary triangles; want P_2, 0, 1 and the %d of the certifier's graded mesh",
			graded.Degree, graded.Levels, graded.Graded, len(graded.Triangles), len(mesh.Mesh3().Bnd))
	}
	if !(graded.Unknowns > plain.Unknowns) || plain.Graded != 0 {
		t.Errorf("graded space %d unknowns, plain %d (graded %d); want more on the graded mesh", graded.Unknowns, plain.Unknowns, plain.Graded)
	}
	cube := polyhedronProblem(t, "cube", cubeVertices, cubeFaces, `"dirichlet"`)
	if _, _, err := SolidModesFor(cube, method(1), 1); err == nil || !strings.Contains(err.Error(), "without singular edges") {
		t.Errorf("graded cube: error %v, want the grading refused", err)
	}
}
