package cover

import (
	"context"
	"errors"
	"math/big"
	"math/rand"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"gapcert/certs"
	"gapcert/certs/certify"
	"gapcert/certs/sweep"
)

func fixedNow() time.Time { return time.Date(2026, 1, 2, 3, 4, 5, 0, time.UTC) }

func testOptions() RunOptions {
	return RunOptions{FamilyName: "family.json", Tool: "gapcert test", Now: fixedNow, Jobs: 2}
}

func mustFamily(t *testing.T, text string) *Family {
	t.Helper()
	f, err := ParseFamily([]byte(text))
	if err != nil {
		t.Fatal(err)
	}
	return f
}

// harmonicFamily is V = c·x² on (0, 1) with Dirichlet ends, c ∈ [0, 5],
// and the claim gap ≥ 3π²/D². For V convex the gap of a Dirichlet
// interval is at least 3π²/D² (B. Andrews and J. Clutterbuck, Proof of the
// fundamental gap conjecture, J. Amer. Math. Soc. 24 (2011) 899–916; on an
// interval the earlier theorem of M. S. Ashbaugh and R. Benguria, Optimal
// lower bound for the gap between the first two eigenvalues of
// one-dimensional Schrödinger operators with symmetric single-well
// potentials, Proc. AMS 105 (1989) 419–424), with equality at V = 0
// (λ_k = k²π²), so the claim holds for c > 0 and is an equality at c = 0.
const harmonicFamily = `{
  "name": "harmonic",
  "template": {"domain": {"interval": ["0", "1"]}, "potential": "c*x^2", "boundary": "dirichlet"},
  "parameters": [{"name": "c", "range": {"lo": "0", "hi": "5", "count": 4}, "min_cell": "1/256"}],
  "claims": ["gap >= 3*pi^2/D^2"],
  "relative_width": "1e-10"
}`

func TestHarmonicFamilyHoldsExceptAtZero(t *testing.T) {
	f := mustFamily(t, harmonicFamily)
	if d := f.Dependences[0]; d.Direction != 1 || len(d.Uses) != 1 || d.Uses[0].Rule != "potential_coefficient" {
		t.Fatalf("dependence on c: %+v, want nondecreasing through the potential", d)
	}
	dir := t.TempDir()
	s, err := Run(f, dir, testOptions())
	if err != nil {
		t.Fatal(err)
	}
	cov := s.Claims[0].Coverage
	if cov.Fails != "0" || s.Covered != "1" {
		t.Fatalf("coverage %+v, covered %s", cov, s.Covered)
	}
	und, _ := new(big.Rat).SetString(cov.Undecided)
	holds, _ := new(big.Rat).SetString(cov.Holds)
	// Undecided only near c = 0 (equality there): positive measure, at
	// most 1% of the box, and every undecided cell lies in c ≤ 1/8.
	if und.Sign() <= 0 || und.Cmp(big.NewRat(1, 100)) > 0 {
		t.Errorf("undecided fraction %s, want in (0, 0.01]", cov.Undecided)
	}
	if new(big.Rat).Add(und, holds).Cmp(big.NewRat(1, 1)) != 0 {
		t.Errorf("holds %s + undecided %s ≠ 1", cov.Holds, cov.Undecided)
	}
	zero := false
	for _, r := range s.Cells {
		b := mustBox(&Cell{Bounds: r.Bounds}, f)
		if r.Verdict == certs.Undecided {
			if b.Hi[0].Cmp(big.NewRat(1, 8)) > 0 {
				t.Errorf("undecided cell %s away from c = 0", b.Text(f.ParamNames()))
			}
			zero = zero || b.Lo[0].Sign() == 0
		}
	}
	if !zero {
		t.Error("the cell at c = 0 is not undecided")
	}
	// Tiling of one run's cells.
	var boxes []Box
	for _, r := range s.Cells {
		boxes = append(boxes, mustBox(&Cell{Bounds: r.Bounds}, f))
	}
	if iss := f.Tile(boxes); len(iss) > 0 {
		t.Fatalf("the run's cells do not tile: %v", iss)
	}
	// A rerun reuses every cell.
	s2, err := Run(f, dir, testOptions())
	if err != nil {
		t.Fatal(err)
	}
	for _, r := range s2.Cells {
		if r.Status != StatusReused {
			t.Fatalf("rerun: cell %v status %s", r.Bounds, r.Status)
		}
	}
	t.Logf("harmonic: %d cells, %d corners, coverage %+v", len(s.Cells), s.Corners, cov)
}

// robinFamily is the 2×1 rectangle with one Robin coefficient α on every
// side and the built-in claim @robin_comparison (the Robin gap of the
// rectangle is at least that of the interval (0, D) with the same α:
// R. S. Laugesen, The Robin Laplacian — spectral conjectures, rectangular
// theorems, J. Math. Phys. 60 (2019) 121507, arXiv:1905.07658).
func robinFamily(hi string, count int) string {
	return `{
  "name": "Robin rectangle",
  "template": {"domain": {"polygon": [["0","0"],["2","0"],["2","1"],["0","1"]]}, "boundary": {"robin": "alpha"},
               "claims": ["@robin_comparison"]},
  "parameters": [{"name": "alpha", "range": {"lo": "0", "hi": "` + hi + `", "count": ` + itoa(count) + `}, "min_cell": "1/64"}],
  "relative_width": "1e-4"
}`
}

func itoa(n int) string { return big.NewInt(int64(n)).String() }

func TestRobinRectangleComparisonHoldsOnTheWholeRange(t *testing.T) {
	hi, count := "2", 2
	if os.Getenv("GAPCERT_LONG") == "1" {
		hi, count = "10", 10
	}
	f := mustFamily(t, robinFamily(hi, count))
	d := f.Dependences[0]
	if d.Direction != 1 || len(d.Uses) != 4 {
		t.Fatalf("dependence on alpha: %+v, want nondecreasing through the four sides", d)
	}
	for _, u := range d.Uses {
		if u.Rule != "robin_coefficient" || u.Sign != 1 {
			t.Fatalf("use %+v, want robin_coefficient with sign +1", u)
		}
	}
	dir := t.TempDir()
	s, err := Run(f, dir, testOptions())
	if err != nil {
		t.Fatal(err)
	}
	if c := s.Claims[0].Coverage; c.Holds != "1" || s.Covered != "1" {
		t.Fatalf("coverage %+v, covered %s", c, s.Covered)
	}
	for _, r := range s.Cells {
		data, err := os.ReadFile(filepath.Join(dir, r.File))
		if err != nil {
			t.Fatal(err)
		}
		c, _, err := CheckCell(data, dir, nil)
		if err != nil {
			t.Fatal(err)
		}
		for _, h := range c.Claims[0].Hypotheses {
			if h.Verdict != certs.Proven {
				t.Errorf("cell %v: hypothesis %s %s", r.Bounds, h.Name, h.Verdict)
			}
		}
		break // one cell re-verified: each costs its two corners again
	}
	t.Logf("Robin rectangle α ∈ [0, %s]: %d cells, %d corners", hi, len(s.Cells), s.Corners)
}

// TestCellEnclosesEveryPoint certifies random points inside random cells
// separately and demands that each point's eigenvalue and gap enclosures
// lie inside the cell's (the cell's enclosures hold for every parameter
// value of the cell): cells of the harmonic family (c nondecreasing), and
// of a two-parameter family with a Robin end α = a (nondecreasing) and V =
// −c·x (nonincreasing in c), so that the product order and a reversed
// direction are exercised. 30 cells per family by default, 1000 with
// GAPCERT_LONG=1.
func TestCellEnclosesEveryPoint(t *testing.T) {
	cells := 30
	if os.Getenv("GAPCERT_LONG") == "1" {
		cells = 1000
	}
	t.Run("harmonic", func(t *testing.T) {
		f := mustFamily(t, strings.Replace(harmonicFamily, `"1e-10"`, `"1e-6"`, 1))
		pointsInsideCells(t, f, cells, 15)
	})
	t.Run("robin and reversed potential", func(t *testing.T) {
		f := mustFamily(t, `{
		  "template": {"domain": {"interval": ["0", "1"]}, "potential": "-c*x", "boundary": [{"robin": "a"}, "dirichlet"]},
		  "parameters": [{"name": "a", "range": {"lo": "0", "hi": "4"}, "min_cell": "1/64"},
		                 {"name": "c", "range": {"lo": "0", "hi": "4"}, "min_cell": "1/64"}],
		  "relative_width": "1e-6"}`)
		if f.Dependences[0].Direction != 1 || f.Dependences[1].Direction != -1 {
			t.Fatalf("directions %d, %d; want +1 (Robin a) and −1 (V = −c·x)", f.Dependences[0].Direction, f.Dependences[1].Direction)
		}
		pointsInsideCells(t, f, cells, 16)
	})
}

// pointsInsideCells draws n random cells with dyadic bounds inside the
// family's box, certifies their corners, then one random point strictly
// inside each, and demands that the point's λ1, λ2, gap and D enclosures
// lie inside the cell's.
func pointsInsideCells(t *testing.T, f *Family, n int, seed int64) {
	dir := t.TempDir()
	rng := rand.New(rand.NewSource(seed))
	e := &engine{f: f, dir: dir, opt: testOptions(), verifier: NewCornerVerifier(0), corners: map[string]*cornerEntry{}}
	box := f.Box()
	for i := 0; i < n; i++ {
		var b Box
		var point []*big.Rat
		for j := range f.Params {
			w := box.Width(j)
			lo := new(big.Rat).Mul(w, big.NewRat(int64(rng.Intn(1024)), 1024))
			lo.Add(lo, box.Lo[j])
			hi := new(big.Rat).Mul(w, big.NewRat(int64(1+rng.Intn(64)), 1024))
			hi.Add(hi, lo)
			if hi.Cmp(box.Hi[j]) > 0 {
				hi.Set(box.Hi[j])
			}
			b.Lo, b.Hi = append(b.Lo, lo), append(b.Hi, hi)
			tpt := big.NewRat(int64(1+rng.Intn(999)), 1000)
			p := new(big.Rat).Mul(tpt, new(big.Rat).Sub(hi, lo))
			point = append(point, p.Add(p, lo))
		}
		if err := e.certifyCorners([]Box{b}); err != nil {
			t.Fatal(err)
		}
		lv, hv := f.Corners(b)
		pl, _ := f.Problem(lv)
		ph, _ := f.Problem(hv)
		cl, ch := e.corners[pl.SHA256()], e.corners[ph.SHA256()]
		if cl.err != nil || ch.err != nil {
			t.Fatal(cl.err, ch.err)
		}
		env, _, err := f.cellQuantities(b, cl.corner, ch.corner)
		if err != nil {
			t.Fatal(err)
		}
		p, err := f.Problem(point)
		if err != nil {
			t.Fatal(err)
		}
		cert, err := certify.Certify(context.Background(), p, certify.Options{Now: fixedNow})
		if err != nil {
			t.Fatal(err)
		}
		for _, name := range []string{"lambda1", "lambda2", "gap", "D"} {
			got := cert.Results.Gap
			switch name {
			case "D":
				got = cert.Results.Diameter
			case "lambda1", "lambda2":
				got = cert.Results.Eigenvalues[name[len(name)-1]-'1'].Bound()
			}
			iv, err := got.Interval()
			if err != nil {
				t.Fatal(err)
			}
			if cellIv := env[name]; !(cellIv.Lo <= iv.Lo && iv.Hi <= cellIv.Hi) {
				t.Errorf("point %s of the cell %s: %s %v not inside the cell's %v", f.describe(point), b.Text(f.ParamNames()), name, iv, cellIv)
			}
		}
	}
}

func TestBadFamilies(t *testing.T) {
	cases := []struct {
		name, text, want string
	}{
		{"min_cell missing", `{"template": {"domain": {"interval": ["0","1"]}, "potential": "c*x^2", "boundary": "dirichlet"},
		  "parameters": [{"name": "c", "range": {"lo": "0", "hi": "5"}}]}`, "has no min_cell"},
		{"min_cell larger than the box", `{"template": {"domain": {"interval": ["0","1"]}, "potential": "c*x^2", "boundary": "dirichlet"},
		  "parameters": [{"name": "c", "range": {"lo": "0", "hi": "5"}, "min_cell": "6"}]}`, "larger than the range"},
		{"non-positive range", `{"template": {"domain": {"interval": ["0","1"]}, "potential": "c*x^2", "boundary": "dirichlet"},
		  "parameters": [{"name": "c", "range": {"lo": "5", "hi": "5"}, "min_cell": "1"}]}`, "empty range"},
		{"non-monotone potential", `{"template": {"domain": {"interval": ["0","2"]}, "potential": "sin(c*x)", "boundary": "dirichlet"},
		  "parameters": [{"name": "c", "range": {"lo": "0", "hi": "5"}, "min_cell": "1/64"}]}`, `parameter "c": ∂V/∂c takes both signs`},
		{"opposite signs", `{"template": {"domain": {"interval": ["0","1"]}, "potential": "-c", "boundary": [{"robin": "c"}, "dirichlet"]},
		  "parameters": [{"name": "c", "range": {"lo": "0", "hi": "1"}, "min_cell": "1/8"}]}`, "raises the operator through boundary[0].robin but lowers it through potential"},
		{"unknown key", `{"template": {"domain": {"interval": ["0","1"]}, "potential": "c*x^2", "boundary": "dirichlet"},
		  "parameters": [{"name": "c", "range": {"lo": "0", "hi": "5"}, "min_cell": "1", "mincell": "1"}]}`, "mincell"},
		{"duplicate key", `{"template": {"domain": {"interval": ["0","1"]}, "potential": "c*x^2", "boundary": "dirichlet"},
		  "parameters": [{"name": "c", "range": {"lo": "0", "hi": "5"}, "min_cell": "1", "min_cell": "2"}]}`, "min_cell"},
		{"case variant", `{"template": {"domain": {"interval": ["0","1"]}, "potential": "c*x^2", "boundary": "dirichlet"},
		  "Parameters": [{"name": "c", "range": {"lo": "0", "hi": "5"}, "min_cell": "1"}]}`, "Parameters"},
		{"count with a factor 3", `{"template": {"domain": {"interval": ["0","1"]}, "potential": "c*x^2", "boundary": "dirichlet"},
		  "parameters": [{"name": "c", "range": {"lo": "0", "hi": "3", "count": 3}, "min_cell": "1/8"}]}`, "prime factor other than 2 and 5"},
		{"values instead of a range", `{"template": {"domain": {"interval": ["0","1"]}, "potential": "c*x^2", "boundary": "dirichlet"},
		  "parameters": [{"name": "c", "values": ["0", "1"], "min_cell": "1"}]}`, "values"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := ParseFamily([]byte(c.text))
			var inv *InvalidError
			if !errors.As(err, &inv) {
				t.Fatalf("error %v, want *InvalidError", err)
			}
			if !strings.Contains(err.Error(), c.want) {
				t.Errorf("error %q does not say %q", err, c.want)
			}
		})
	}
}

// TestTileRefusesOverlapsAndGaps crafts cell sets of the harmonic family
// (four roots [0, 5/4], …) that overlap, leave a gap or are not leaves.
func TestTileRefusesOverlapsAndGaps(t *testing.T) {
	f := mustFamily(t, harmonicFamily)
	r := func(lo, hi string) Box {
		a, _ := new(big.Rat).SetString(lo)
		b, _ := new(big.Rat).SetString(hi)
		return Box{Lo: []*big.Rat{a}, Hi: []*big.Rat{b}}
	}
	whole := []Box{r("0", "5/4"), r("5/4", "5/2"), r("5/2", "15/4"), r("15/4", "5")}
	if iss := f.Tile(whole); len(iss) > 0 {
		t.Fatalf("the roots do not tile: %v", iss)
	}
	halves := []Box{r("0", "5/8"), r("5/8", "5/4"), r("5/4", "5/2"), r("5/2", "15/4"), r("15/4", "5")}
	if iss := f.Tile(halves); len(iss) > 0 {
		t.Fatalf("a bisected root does not tile: %v", iss)
	}
	for _, c := range []struct {
		name  string
		cells []Box
		kind  string
	}{
		{"missing cell", whole[:3], IssueGap},
		{"overlap", append([]Box{r("0", "5/8"), r("5/16", "15/16"), r("5/8", "5/4")}, whole[1:]...), IssueOverlap},
		{"cell equal to a bisected box", append([]Box{r("0", "5/4"), r("0", "5/8")}, whole[1:]...), IssueOverlap},
		{"crossing a root", append([]Box{r("0", "5/2")}, whole[2:]...), IssueOutside},
		{"duplicate", append(whole, whole[0]), IssueDup},
	} {
		iss := f.Tile(c.cells)
		found := false
		for _, is := range iss {
			found = found || is.Kind == c.kind
		}
		if !found {
			t.Errorf("%s: issues %v, want one of kind %s", c.name, iss, c.kind)
		}
	}
}

// TestMergeOfShards runs two shards, merges them, and refuses a merge with
// a cell removed or a cell certificate edited.
func TestMergeOfShards(t *testing.T) {
	text := strings.Replace(harmonicFamily, `"1/256"`, `"1/16"`, 1)
	f := mustFamily(t, text)
	d0, d1 := t.TempDir(), t.TempDir()
	for i, d := range []string{d0, d1} {
		opt := testOptions()
		opt.Shard = sweep.Shard{Index: i, Count: 2}
		if _, err := Run(f, d, opt); err != nil {
			t.Fatal(err)
		}
	}
	out := t.TempDir()
	s, err := Merge([]string{d0, d1}, out, MergeOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if s.Covered != "1" || s.Tiling == "" {
		t.Fatalf("merged: covered %s, tiling %q", s.Covered, s.Tiling)
	}
	cells, _ := filepath.Glob(filepath.Join(d1, "cell-*"+cellSuffix))
	data, _ := os.ReadFile(cells[0])
	edited := strings.Replace(string(data), `"verdict": "holds"`, `"verdict": "fails"`, 1)
	if edited == string(data) {
		edited = strings.Replace(string(data), `"verdict": "undecided"`, `"verdict": "holds"`, 1)
	}
	if err := os.WriteFile(cells[0], []byte(edited), 0o644); err != nil {
		t.Fatal(err)
	}
	_, err = Merge([]string{d0, d1}, t.TempDir(), MergeOptions{})
	var me *MergeError
	if !errors.As(err, &me) || !strings.Contains(err.Error(), IssueTampered) || !strings.Contains(err.Error(), IssueGap) {
		t.Fatalf("edited cell: error %v, want tampered and uncovered", err)
	}
	if err := os.Remove(cells[0]); err != nil {
		t.Fatal(err)
	}
	_, err = Merge([]string{d0, d1}, t.TempDir(), MergeOptions{})
	if !errors.As(err, &me) || !strings.Contains(err.Error(), IssueGap) {
		t.Fatalf("missing cell: error %v, want uncovered", err)
	}
}

// TestParameterInClaimsOnly covers a parameter that enters only a claim:
// on (0, 1) with V = 0 and Dirichlet ends the gap is 3π² (λ_k = k²π²,
// common practice), so "gap >= k*pi^2" holds for k < 3 and fails for
// k > 3; the eigenvalues do not depend on k (direction 0, one corner per
// cell), and only the cells next to k = 3 stay undecided.
func TestParameterInClaimsOnly(t *testing.T) {
	f := mustFamily(t, `{
	  "template": {"domain": {"interval": ["0", "1"]}, "boundary": "dirichlet"},
	  "parameters": [{"name": "k", "range": {"lo": "2", "hi": "4"}, "min_cell": "1/64"}],
	  "claims": ["gap >= k*pi^2"], "relative_width": "1e-8"}`)
	if d := f.Dependences[0]; d.Direction != 0 || len(d.Uses) != 0 {
		t.Fatalf("dependence on k: %+v, want none", d)
	}
	s, err := Run(f, t.TempDir(), testOptions())
	if err != nil {
		t.Fatal(err)
	}
	if s.Corners != 1 {
		t.Errorf("%d corner certificates, want 1 (the eigenvalues do not depend on k)", s.Corners)
	}
	three := big.NewRat(3, 1)
	for _, r := range s.Cells {
		b := mustBox(&Cell{Bounds: r.Bounds}, f)
		switch r.Verdict {
		case certs.Holds:
			if b.Hi[0].Cmp(three) > 0 {
				t.Errorf("holds on %s, beyond k = 3", b.Text(f.ParamNames()))
			}
		case certs.Fails:
			if b.Lo[0].Cmp(three) < 0 {
				t.Errorf("fails on %s, below k = 3", b.Text(f.ParamNames()))
			}
		case certs.Undecided:
			if b.Lo[0].Cmp(three) > 0 || b.Hi[0].Cmp(three) < 0 {
				t.Errorf("undecided on %s, away from k = 3", b.Text(f.ParamNames()))
			}
		}
	}
	c := s.Claims[0].Coverage
	if c.Undecided != "0.015625" || c.Holds != "0.4921875" || c.Fails != "0.4921875" {
		t.Errorf("coverage %+v, want 0.4921875 holds and fails, 0.015625 undecided (two cells of width 1/64 at k = 3)", c)
	}
}
