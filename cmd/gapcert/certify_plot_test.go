package main

import (
	"fmt"
	"math/big"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"strings"
	"testing"

	"gapcert/certs"
	"gapcert/interval/decimalio"
)

const cubeProblem = `{"name": "unit cube", "domain": {"polyhedron": {"vertices": [["0","0","0"],["1","0","0"],["1","1","0"],["0","1","0"],["0","0","1"],["1","0","1"],["1","1","1"],["0","1","1"]],
	"faces": [[0,3,2,1],[4,5,6,7],[0,1,5,4],[1,2,6,5],[2,3,7,6],[3,0,4,7]]}}, "boundary": "dirichlet"}`

// captionBounds matches the certified lines of a picture's title.
var captionBounds = regexp.MustCompile(`certified (λ₁|λ₂|gap λ₂ − λ₁) in \[([^,\]]+), ([^\]]+)\]`)

// checkCaption checks that the SVG picture at path carries the
// certificate's enclosures of λ1, λ2 and the gap, each as printed at most
// 8 digits and rounded outward: the caption's interval holds the
// certificate's (compared exactly) and is at most 1e-6 wider relative to
// its size.
func checkCaption(t *testing.T, path string, c *certs.Certificate) {
	t.Helper()
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	want := map[string]certs.Bound{"λ₁": c.Results.Eigenvalues[0].Bound(), "λ₂": c.Results.Eigenvalues[1].Bound(), "gap λ₂ − λ₁": c.Results.Gap}
	seen := map[string]bool{}
	for _, m := range captionBounds.FindAllStringSubmatch(string(data), -1) {
		b := want[m[1]]
		rat := func(s string) *big.Rat {
			r, err := decimalio.ParseRat(s)
			if err != nil {
				t.Fatalf("%s: %q: %v", path, s, err)
			}
			return r
		}
		lo, hi, clo, chi := rat(m[2]), rat(m[3]), rat(b.Lower), rat(b.Upper)
		slack := new(big.Rat).Sub(new(big.Rat).Sub(hi, lo), new(big.Rat).Sub(chi, clo))
		size := new(big.Rat).Abs(chi)
		size.Add(size, new(big.Rat).Abs(clo))
		size.Mul(size, big.NewRat(1, 1_000_000))
		if lo.Cmp(clo) > 0 || hi.Cmp(chi) < 0 || slack.Cmp(size) > 0 {
			t.Errorf("%s: %s in [%s, %s], the certificate's [%s, %s]", path, m[1], m[2], m[3], b.Lower, b.Upper)
		}
		seen[m[1]] = true
	}
	if len(seen) != 3 {
		t.Errorf("%s: caption shows %v, want λ1, λ2 and the gap", path, seen)
	}
}

// readCertificate reads the certificate at path.
func readCertificate(t *testing.T, path string) *certs.Certificate {
	t.Helper()
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	c, err := certs.Unmarshal(data)
	if err != nil {
		t.Fatal(err)
	}
	return c
}

// TestCertifyPlotSolid: certify --plot on a polyhedron (the unit cube,
// one step) and on a box given as a product draws the solid and the two
// modes on the slice, in PNG and SVG, each titled with the certificate's
// enclosures and the modes said to be approximations; the polyhedron's
// modes come from the certificate's trial space.
func TestCertifyPlotSolid(t *testing.T) {
	dir := t.TempDir()
	cube := filepath.Join(dir, "cube.json")
	if err := os.WriteFile(cube, []byte(cubeProblem), 0o644); err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		name, file, slice, stdout string
		args                      []string
	}{
		{"polyhedron", cube, "z = 0.5", "modes from the certificate's trial space: P_3 on 1 refinement(s)", []string{"--rel-width", "0.5", "--time-limit", "1s"}},
		{"box", filepath.Join(testdata, "box_mixed.json"), "x = 0.3", "modes: products of the factors' approximate eigenfunctions", []string{"--rel-width", "1e-6", "--slice", "x=3/10"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			pics := filepath.Join(dir, tc.name)
			cert := filepath.Join(dir, tc.name+".cert.json")
			code, out, errs := execute(append([]string{"certify", tc.file, "-q", "-o", cert, "--plot", pics}, tc.args...)...)
			if code != exitOK || !strings.Contains(out, tc.stdout) || !strings.Contains(out, "on the slice "+tc.slice) {
				t.Fatalf("exit %d, stdout %q, stderr %q", code, out, errs)
			}
			c := readCertificate(t, cert)
			var names []string
			for _, stem := range []string{"solid", "solid-mode1", "solid-mode2"} {
				for _, ext := range []string{".png", ".svg"} {
					names = append(names, stem+ext)
					st, err := os.Stat(filepath.Join(pics, stem+ext))
					if err != nil || st.Size() == 0 {
						t.Fatalf("%s%s: not written (%v)", stem, ext, err)
					}
				}
				svg := filepath.Join(pics, stem+".svg")
				checkCaption(t, svg, c)
				data, _ := os.ReadFile(svg)
				if stem != "solid" && (!strings.Contains(string(data), "approximation, not a bound") || !strings.Contains(string(data), "on the slice "+tc.slice)) {
					t.Errorf("%s does not say it is an approximation on the slice %s", svg, tc.slice)
				}
			}
			entries, _ := os.ReadDir(pics)
			var got []string
			for _, e := range entries {
				got = append(got, e.Name())
			}
			slices.Sort(names)
			if !slices.Equal(got, names) {
				t.Errorf("files %q, want %q", got, names)
			}
		})
	}
}

// TestCertifyPlotRefusals: a slice that misses the solid or is badly
// written, --slice without --plot or on a polygon, and --plot on a
// four-dimensional box are refused before computing: no certificate and
// no picture is written.
func TestCertifyPlotRefusals(t *testing.T) {
	dir := t.TempDir()
	cube := filepath.Join(dir, "cube.json")
	box4 := filepath.Join(dir, "box4.json")
	files := map[string]string{cube: cubeProblem,
		box4: `{"domain": {"product": [{"interval": ["0","1"]}, {"interval": ["0","1"]}, {"interval": ["0","1"]}, {"interval": ["0","1"]}]}, "boundary": ["dirichlet", "dirichlet", "dirichlet", "dirichlet"]}`}
	for f, body := range files {
		if err := os.WriteFile(f, []byte(body), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	cert, pics := filepath.Join(dir, "out.cert.json"), filepath.Join(dir, "pics")
	for _, c := range []struct {
		args []string
		code int
		errs string
	}{
		{[]string{cube, "--plot", pics, "--slice", "z=2"}, exitFailure, "--slice: slice z = 2: the plane misses the solid, whose z runs from 0 to 1 (hint: give a value strictly between 0 and 1)"},
		{[]string{cube, "--plot", pics, "--slice", "up=1"}, exitFailure, `slice "up=1": want AXIS=VALUE with AXIS x, y or z (hint: --slice z=1/2)`},
		{[]string{cube, "--slice", "z=1/2"}, exitFailure, "--slice chooses the plane of the pictures of --plot (hint: add --plot DIR"},
		{[]string{filepath.Join(testdata, "square.json"), "--plot", pics, "--slice", "z=1/2"}, exitFailure, "--slice belongs to three-dimensional domains; this one has 2 coordinates"},
		{[]string{box4, "--plot", pics}, exitInvalid, "--plot: a product with 4 coordinates is not drawn"},
	} {
		code, _, errs := execute(append([]string{"certify", "-q", "-o", cert}, c.args...)...)
		if code != c.code || !strings.Contains(errs, c.errs) {
			t.Errorf("%v: exit %d, stderr %q, want exit %d and %q", c.args, code, errs, c.code, c.errs)
		}
		for _, f := range []string{cert, pics} {
			if _, err := os.Stat(f); err == nil {
				t.Fatalf("%v: %s was written", c.args, f)
			}
		}
	}
}

// TestCertifyPlotRectangleProduct: certify --plot on a product of two
// intervals draws the rectangle's modes, each labelled with the
// certificate's enclosure: products of the factors' modes for a
// separable potential (no mesh), the rectangle's own (with its mesh)
// when the potential mixes x and y.
func TestCertifyPlotRectangleProduct(t *testing.T) {
	dir := t.TempDir()
	for _, tc := range []struct {
		name, potential string
		files           []string
	}{
		{"separable", "x^2 + y", []string{"mode1.png", "mode1.svg", "mode2.png", "mode2.svg"}},
		{"mixed", "x*y", []string{"mesh.png", "mesh.svg", "mode1.png", "mode1.svg", "mode2.png", "mode2.svg"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			file := filepath.Join(dir, tc.name+".json")
			body := `{"domain": {"product": [{"interval": ["0","1"]}, {"interval": ["0","2"]}]}, "boundary": ["dirichlet", ["neumann", "dirichlet"]], "potential": "` + tc.potential + `"}`
			if err := os.WriteFile(file, []byte(body), 0o644); err != nil {
				t.Fatal(err)
			}
			pics, cert := filepath.Join(dir, tc.name), filepath.Join(dir, tc.name+".cert.json")
			if code, out, errs := execute("certify", file, "-q", "--rel-width", "1e-2", "-o", cert, "--plot", pics); code != exitOK {
				t.Fatalf("exit %d, stdout %q, stderr %q", code, out, errs)
			}
			entries, _ := os.ReadDir(pics)
			var got []string
			for _, e := range entries {
				got = append(got, e.Name())
			}
			if !slices.Equal(got, tc.files) {
				t.Errorf("files %q, want %q", got, tc.files)
			}
			c := readCertificate(t, cert)
			for k, e := range c.Results.Eigenvalues[:2] {
				data, _ := os.ReadFile(filepath.Join(pics, fmt.Sprintf("mode%d.svg", k+1)))
				want := fmt.Sprintf("[%s, %s]", shortLower(e.Lower), shortUpper(e.Upper))
				if !strings.Contains(string(data), want) {
					t.Errorf("mode%d.svg does not carry the certificate's enclosure %s", k+1, want)
				}
			}
		})
	}
}
