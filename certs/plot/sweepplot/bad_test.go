package sweepplot

import (
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"gapcert/certs/sweep"
)

// copySweep copies a testdata sweep into a temporary directory.
func copySweep(t *testing.T, name string) string {
	t.Helper()
	dir := t.TempDir()
	entries, err := os.ReadDir(sweepDir(name))
	if err != nil {
		t.Fatal(err)
	}
	for _, e := range entries {
		data, err := os.ReadFile(filepath.Join(sweepDir(name), e.Name()))
		if err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(filepath.Join(dir, e.Name()), data, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	return dir
}

// editSummary rewrites dir/summary.json through edit.
func editSummary(t *testing.T, dir string, edit func(*sweep.Summary)) {
	t.Helper()
	path := filepath.Join(dir, "summary.json")
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	s, err := sweep.UnmarshalSummary(data)
	if err != nil {
		t.Fatal(err)
	}
	edit(s)
	if data, err = sweep.MarshalSummary(s); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(path, data, 0o644); err != nil {
		t.Fatal(err)
	}
}

func wantError(t *testing.T, what string, err error, substr string) {
	t.Helper()
	if err == nil || !strings.Contains(err.Error(), substr) {
		t.Errorf("%s: error %v, want one containing %q", what, err, substr)
	}
}

func TestBadInput(t *testing.T) {
	convex, triangle := load(t, "convex"), load(t, "triangle")
	_, err := convex.Band("k", BandSpec{Quantity: "gap"})
	wantError(t, "unknown parameter", err, `unknown parameter "k" (hint: the sweep's parameters are c)`)
	_, err = convex.Band("c", BandSpec{Quantity: "gap*("})
	wantError(t, "syntax error", err, `quantity "gap*("`)
	_, err = convex.Band("c", BandSpec{Quantity: "gap/lambda"})
	wantError(t, "unknown name", err, `unknown name "lambda"`)
	_, err = convex.Band("c", BandSpec{Quantity: "gap", Threshold: "3*pi^2/DD"})
	wantError(t, "unknown name in the threshold", err, `threshold "3*pi^2/DD": unknown name "DD"`)
	_, err = convex.Band("c", BandSpec{Quantity: "gap", Threshold: "3", Rel: "="})
	wantError(t, "relation", err, `unknown relation "="`)
	_, err = convex.Band("c", BandSpec{Quantity: "gap/(D-2)"})
	wantError(t, "no finite enclosure", err, "point 0")
	_, err = convex.Band("c", BandSpec{Quantity: "area"})
	wantError(t, "area of an interval", err, `"area"`)
	_, err = triangle.Band("a", BandSpec{Quantity: "gap"})
	wantError(t, "band of two parameters", err, "a band needs a one-parameter sweep")
	_, err = convex.Map("c", "c", "1")
	wantError(t, "map of one parameter", err, `x and y are both "c"`)
	_, err = triangle.Map("a", "z", "1")
	wantError(t, "unknown map parameter", err, `unknown parameter "z"`)
	_, err = triangle.Map("a", "b", "3")
	wantError(t, "claim number", err, "claim number 3 is not in 1…2")
	_, err = triangle.Map("a", "b", "gap >= 0")
	wantError(t, "claim text", err, `no claim "gap >= 0"`)

	b, err := convex.Band("c", BandSpec{Quantity: "gap"})
	if err != nil {
		t.Fatal(err)
	}
	wantError(t, "picture format", b.Write(filepath.Join(t.TempDir(), "band.pdf")), `unknown picture format "pdf"`)

	// An empty sweep, and one whose only points have no certificate.
	dir := copySweep(t, "convex")
	editSummary(t, dir, func(s *sweep.Summary) { s.Points = nil })
	s, err := Load(dir)
	if err != nil {
		t.Fatal(err)
	}
	_, err = s.Band("c", BandSpec{Quantity: "gap"})
	wantError(t, "empty sweep", err, "empty sweep")
	dir = copySweep(t, "convex")
	editSummary(t, dir, func(s *sweep.Summary) {
		for i := range s.Points {
			s.Points[i] = sweep.Point{Index: i, Params: s.Points[i].Params, Status: sweep.StatusError, Error: "budget"}
		}
	})
	if s, err = Load(dir); err != nil {
		t.Fatal(err)
	}
	_, err = s.Band("c", BandSpec{Quantity: "gap"})
	wantError(t, "sweep of errors", err, "empty sweep")

	// Not a summary.
	_, err = Load(filepath.Join(sweepDir("convex"), "family.json"))
	wantError(t, "not a summary", err, "not a sweep summary")
	_, err = Load(t.TempDir())
	wantError(t, "directory without summary", err, "summary.json")
}

// TestCrossCheck: a summary whose enclosure differs from its certificate
// file, or a certificate file that was edited, is an error naming both; a
// missing file is counted and said in the caption.
func TestCrossCheck(t *testing.T) {
	dir := copySweep(t, "convex")
	editSummary(t, dir, func(s *sweep.Summary) { s.Points[2].Gap.Upper = "100" })
	_, err := Load(dir)
	wantError(t, "edited summary", err, "point 2 and its certificate")
	wantError(t, "edited summary", err, "gap differ")

	dir = copySweep(t, "convex")
	s, err := Load(dir)
	if err != nil {
		t.Fatal(err)
	}
	file := filepath.Join(dir, s.Summary.Points[1].File)
	data, err := os.ReadFile(file)
	if err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(file, append(data, ' '), 0o644); err != nil {
		t.Fatal(err)
	}
	_, err = Load(dir)
	wantError(t, "edited certificate", err, "the file's SHA-256 is")

	dir = copySweep(t, "convex")
	if err := os.Remove(filepath.Join(dir, s.Summary.Points[3].File)); err != nil {
		t.Fatal(err)
	}
	if s, err = Load(dir); err != nil {
		t.Fatal(err)
	}
	b, err := s.Band("c", BandSpec{Quantity: "gap"})
	if err != nil {
		t.Fatal(err)
	}
	if b.Missing != 1 || len(b.Points) != 6 {
		t.Fatalf("Missing %d, %d points; want 1 and 6", b.Missing, len(b.Points))
	}
	svg := filepath.Join(t.TempDir(), "band.svg")
	if err := b.Write(svg); err != nil {
		t.Fatal(err)
	}
	if text := strings.Join(summarise(t, svg).Texts, "\n"); !strings.Contains(text, "1 certificate file(s) not found (enclosures from the summary).") {
		t.Errorf("the caption does not say that a file is missing:\n%s", text)
	}
	// A map over a sweep with a missing file says so too.
	dir = copySweep(t, "triangle")
	tri, err := Load(dir)
	if err != nil {
		t.Fatal(err)
	}
	if err := os.Remove(filepath.Join(dir, tri.Summary.Points[0].File)); err != nil {
		t.Fatal(err)
	}
	if tri, err = Load(dir); err != nil {
		t.Fatal(err)
	}
	m, err := tri.Map("a", "b", "1")
	if err != nil || m.Missing != 1 {
		t.Errorf("map without one file: %v, Missing %d", err, m.Missing)
	}
	// Area and perimeter come from the certificate files: without the
	// file of point 0 they are not available there.
	env, err := tri.env(0)
	if err != nil {
		t.Fatal(err)
	}
	if _, ok := env["area"]; ok {
		t.Error("point 0 has an area without its certificate file")
	}
}

// TestAreaPerimeter: the triangle (0, 0), (1, 0), (a, b) has area b/2 and
// perimeter 1 + √(a² + b²) + √((1 − a)² + b²) (common practice).
func TestAreaPerimeter(t *testing.T) {
	s := load(t, "triangle")
	for i, pt := range s.Summary.Points {
		env, err := s.env(i)
		if err != nil {
			t.Fatal(err)
		}
		a, _ := strconv.ParseFloat(pt.Params["a"], 64) // the grid values are short decimals; a float check suffices here
		b, _ := strconv.ParseFloat(pt.Params["b"], 64)
		area, perimeter := b/2, 1+math.Hypot(a, b)+math.Hypot(1-a, b)
		if got := env["area"]; !(got.Lo <= area*(1+1e-15) && area*(1-1e-15) <= got.Hi) || got.Hi-got.Lo > 1e-14 {
			t.Errorf("apex (%s, %s): area %v, want about %g", pt.Params["a"], pt.Params["b"], got, area)
		}
		if got := env["perimeter"]; !(got.Lo <= perimeter*(1+1e-15) && perimeter*(1-1e-15) <= got.Hi) || got.Hi-got.Lo > 1e-13 {
			t.Errorf("apex (%s, %s): perimeter %v, want about %g", pt.Params["a"], pt.Params["b"], got, perimeter)
		}
	}
}
