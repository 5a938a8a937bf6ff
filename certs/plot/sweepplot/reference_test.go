package sweepplot

import (
	"encoding/json"
	"math"
	"math/big"
	"os"
	"path/filepath"
	"reflect"
	"slices"
	"testing"

	"gapcert/certs"
	"gapcert/certs/sweep"
	"gapcert/fem/claim/named"
	"gapcert/interval"
)

// robinBand is the two-band picture of the Robin sweep: the pentagon's gap
// and the gap of the interval of its diameter.
func robinBand(t *testing.T) *Band {
	t.Helper()
	b, err := load(t, "robin").Band("alpha", BandSpec{Quantity: "gap", Reference: "robin_interval_gap"})
	if err != nil {
		t.Fatal(err)
	}
	return b
}

// pi2 is a narrow enclosure of π² from piDigits (OEIS A000796).
func pi2(t *testing.T) interval.I {
	t.Helper()
	pi, ok := new(big.Rat).SetString(piDigits)
	if !ok {
		t.Fatal("piDigits")
	}
	sq, _ := new(big.Rat).Mul(pi, pi).Float64()
	return interval.I{Lo: math.Nextafter(sq, 0), Hi: math.Nextafter(sq, 10)}
}

// TestReferenceAtNeumann: at α = 0 the Robin condition is Neumann. The
// pentagon's diameter is 8 (from (−1, 1) to (7, 1); the other pairs of
// vertices are at most √50 apart), and the Neumann interval (0, 8) has
// λ1 = 0 and λ2 = π²/8² (cosines; common practice), so the reference band
// must contain π²/64 and be narrow (the reference certificates are asked
// for a relative width of 1e-10). The pentagon's λ1 is 0 (constants) and
// its gap is its Neumann λ2 ≥ π²/D² (L. E. Payne and H. F. Weinberger,
// Arch. Rational Mech. Anal. 5 (1960) 286–292), so there the main band
// lies above the reference band; the certified claim says the same at
// every point.
func TestReferenceAtNeumann(t *testing.T) {
	b := robinBand(t)
	if len(b.Points) != 3 || b.Points[0].XText != "0" {
		t.Fatalf("%d points, first at alpha = %s; want 3 from 0", len(b.Points), b.Points[0].XText)
	}
	want := pi2(t).DivF(64)
	ref := b.Points[0].Reference
	if !(ref.Lo <= want.Lo && want.Hi <= ref.Hi) || ref.Hi-ref.Lo > 1e-9*want.Hi {
		t.Errorf("alpha = 0: robin_interval_gap ∈ %v, want a narrow enclosure of π²/64 ∈ %v", ref, want)
	}
	s := load(t, "robin")
	env, err := s.env(0)
	if err != nil {
		t.Fatal(err)
	}
	if d, l1 := env["D"], env["lambda1"]; !(d.Lo <= 8 && 8 <= d.Hi) || !(l1.Lo <= 0 && 0 <= l1.Hi && l1.Hi < 1e-12) {
		t.Errorf("alpha = 0: D ∈ %v, λ1 ∈ %v; want 8 and 0", d, l1)
	}
	for _, p := range b.Points {
		if !(p.Quantity.Lo > p.Reference.Hi) {
			t.Errorf("alpha = %s: gap ∈ %v is not above robin_interval_gap ∈ %v", p.XText, p.Quantity, p.Reference)
		}
		if p.Verdict != certs.Holds {
			t.Errorf("alpha = %s: verdict %s, want holds", p.XText, p.Verdict)
		}
	}
}

// robinIntervalGap returns k2² − k1² for the Robin problem −u″ = k²u on
// (0, d) with ∂u/∂n + αu = 0 at both ends, α > 0: u = k cos kx + α sin kx
// satisfies the condition at 0, and the one at d holds iff
// f(k) = (α² − k²) sin kd + 2αk cos kd = 0, which has exactly one root k_n
// in ((n − 1)π/d, nπ/d) for n ≥ 1 (separation of variables; common
// practice). The roots are found by bisection in floating point, to a few
// units in the last place, far below the 1e-10 width of the reference
// certificates.
func robinIntervalGap(alpha, d float64) float64 {
	f := func(k float64) float64 { return (alpha*alpha-k*k)*math.Sin(k*d) + 2*alpha*k*math.Cos(k*d) }
	root := func(lo, hi float64) float64 {
		flo := f(lo)
		for range 200 {
			mid := (lo + hi) / 2
			if mid == lo || mid == hi {
				break
			}
			if fm := f(mid); (fm > 0) == (flo > 0) {
				lo, flo = mid, fm
			} else {
				hi = mid
			}
		}
		return (lo + hi) / 2
	}
	k1 := root(1e-12, math.Pi/d)
	k2 := root(math.Pi/d, 2*math.Pi/d)
	return k2*k2 - k1*k1
}

// TestReferenceSecularEquation: for α = 5 and 10 the reference band
// contains the gap of the Robin interval (0, 8) from the roots of its
// secular equation (robinIntervalGap).
func TestReferenceSecularEquation(t *testing.T) {
	for _, p := range robinBand(t).Points[1:] {
		alpha := map[string]float64{"5": 5, "10": 10}[p.XText]
		want := robinIntervalGap(alpha, 8)
		if !(p.Reference.Lo <= want && want <= p.Reference.Hi) || p.Reference.Hi-p.Reference.Lo > 1e-9*want {
			t.Errorf("alpha = %s: robin_interval_gap ∈ %v, want a narrow enclosure of %.17g", p.XText, p.Reference, want)
		}
	}
}

// TestReferenceIsTheClaimsReference: with robin_interval_gap as threshold
// the band's verdicts are those the certificates record for
// @robin_comparison, and its enclosure of gap − robin_interval_gap
// contains the certified margin of the claim (both are enclosures of the
// same difference, over the same stored enclosures).
func TestReferenceIsTheClaimsReference(t *testing.T) {
	s := load(t, "robin")
	b, err := s.Band("alpha", BandSpec{Quantity: "gap - robin_interval_gap", Threshold: "0"})
	if err != nil {
		t.Fatal(err)
	}
	for _, p := range b.Points {
		cr := s.Summary.Points[p.Index].Claims[0]
		margin, err := cr.Margin.Interval()
		if err != nil {
			t.Fatal(err)
		}
		if cr.Text != "@robin_comparison" || p.Verdict != cr.Verdict {
			t.Errorf("alpha = %s: verdict %s, the certificate's %s is %s", p.XText, p.Verdict, cr.Text, cr.Verdict)
		}
		if !(p.Quantity.Lo <= margin.Lo && margin.Hi <= p.Quantity.Hi) {
			t.Errorf("alpha = %s: gap − robin_interval_gap ∈ %v does not contain the claim's margin %v", p.XText, p.Quantity, margin)
		}
	}
}

// TestReferenceMissing: a formula naming robin_interval_gap at a point
// without that reference is an error that says why.
func TestReferenceMissing(t *testing.T) {
	_, err := load(t, "convex").Band("c", BandSpec{Quantity: "gap", Reference: "robin_interval_gap"})
	wantError(t, "sweep without the claim", err, `point 0: reference "robin_interval_gap" names robin_interval_gap, which the point does not have: the point has no claim @robin_comparison (hint: add "@robin_comparison" to the family's claims)`)
	_, err = load(t, "convex").Band("c", BandSpec{Quantity: "gap", Threshold: "2*robin_interval_gap"})
	wantError(t, "threshold without the claim", err, `point 0: threshold "2*robin_interval_gap" names robin_interval_gap`)
	_, err = load(t, "robin_mixed").Band("alpha", BandSpec{Quantity: "gap", Reference: "robin_interval_gap"})
	wantError(t, "claim without a reference", err, "the claim @robin_comparison has no reference certificate: the reference gap is not defined for this problem: the sides do not have one common Robin coefficient")
	_, err = load(t, "robin").Band("alpha", BandSpec{Quantity: "gap", Reference: "robin_interval"})
	wantError(t, "misspelt name", err, `unknown name "robin_interval"`)

	dir := copySweep(t, "robin")
	s := load(t, "robin")
	if err := os.Remove(filepath.Join(dir, s.Summary.Points[1].File)); err != nil {
		t.Fatal(err)
	}
	s, err = Load(dir)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := s.Band("alpha", BandSpec{Quantity: "gap"}); err != nil {
		t.Errorf("a band without the reference needs no certificate file: %v", err)
	}
	_, err = s.Band("alpha", BandSpec{Quantity: "gap", Reference: "robin_interval_gap"})
	wantError(t, "missing certificate file", err, "point 1: reference \"robin_interval_gap\" names robin_interval_gap, which the point does not have: its certificate file was not found")
}

// TestReferenceFromCertificateFile: the reference is read from the
// certificate file, so a summary without the reference certificates
// still gives it; a summary whose reference certificate differs from the
// file's is a cross-check error.
func TestReferenceFromCertificateFile(t *testing.T) {
	want := robinBand(t)
	dir := copySweep(t, "robin")
	editSummary(t, dir, func(s *sweep.Summary) {
		for i := range s.Points {
			s.Points[i].Claims[0].Reference = nil
		}
	})
	s, err := Load(dir)
	if err != nil {
		t.Fatal(err)
	}
	got, err := s.Band("alpha", BandSpec{Quantity: "gap", Reference: "robin_interval_gap"})
	if err != nil {
		t.Fatal(err)
	}
	for i, p := range got.Points {
		if p.Reference != want.Points[i].Reference {
			t.Errorf("alpha = %s: reference %v without the summary's copy, %v with it", p.XText, p.Reference, want.Points[i].Reference)
		}
	}

	dir = copySweep(t, "robin")
	editSummary(t, dir, func(s *sweep.Summary) {
		ref := s.Points[2].Claims[0].Reference
		inner, err := certs.Unmarshal(ref.Certificate)
		if err != nil {
			t.Fatal(err)
		}
		inner.Results.Gap.Lower = "0.1"
		if ref.Certificate, err = inner.Marshal(); err != nil {
			t.Fatal(err)
		}
	})
	_, err = Load(dir)
	wantError(t, "edited reference in the summary", err, "point 2 and its certificate")
	wantError(t, "edited reference in the summary", err, "claims differ")
}

// TestReferenceNamesCoverCatalogue: every reference quantity of a
// built-in claim can be named in a formula.
func TestReferenceNamesCoverCatalogue(t *testing.T) {
	for _, c := range named.All() {
		if c.Reference != "" && !slices.Contains(referenceNames(), c.Reference) {
			t.Errorf("%s: its reference %s has no entry in referenceQuantities", c.Text(), c.Reference)
		}
	}
	if referenceOwner(named.RobinIntervalGap) != "@robin_comparison" {
		t.Errorf("robin_interval_gap belongs to %q", referenceOwner(named.RobinIntervalGap))
	}
}

// robinExample is the Robin example family of the repository.
const robinExample = "../../../testdata/examples/robin_pentagon_family.json"

// TestRobinExampleIsTheTestSweep: the committed Robin sweep samples the
// example family (each of its points is, name and width target aside, the
// example's point with the same α), so the tests of its pictures are tests
// of the example's.
func TestRobinExampleIsTheTestSweep(t *testing.T) {
	read := func(path string) *sweep.Family {
		data, err := os.ReadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		f, err := sweep.ParseFamily(data)
		if err != nil {
			t.Fatalf("%s: %v", path, err)
		}
		return f
	}
	// withoutName is the canonical problem without its name and target.
	withoutName := func(pt *sweep.FamilyPoint) map[string]any {
		var m map[string]any
		if err := json.Unmarshal(pt.Problem.Canonical(), &m); err != nil {
			t.Fatal(err)
		}
		delete(m, "name")
		delete(m, "target")
		return m
	}
	example, test := read(robinExample), read(filepath.Join("testdata", "families", "robin.json"))
	if len(example.Points) != 21 {
		t.Errorf("the example has %d points, want 21", len(example.Points))
	}
	for _, pt := range test.Points {
		alpha := test.ParamText(pt)["alpha"]
		k := slices.IndexFunc(example.Points, func(q *sweep.FamilyPoint) bool { return example.ParamText(q)["alpha"] == alpha })
		if k < 0 {
			t.Errorf("alpha = %s is not a point of the example", alpha)
			continue
		}
		if got, want := withoutName(pt), withoutName(example.Points[k]); !reflect.DeepEqual(got, want) {
			t.Errorf("alpha = %s: test problem %v, example %v", alpha, got, want)
		}
	}
}

// TestRobinExampleLong (GAPCERT_LONG=1) runs the whole example (21 points;
// 12 s on the 2-core machine, 24 s under load) and checks every point as the
// committed sweep is checked: the claim holds, the reference encloses
// π²/64 at α = 0 and the root of the secular equation elsewhere, narrowly.
func TestRobinExampleLong(t *testing.T) {
	if os.Getenv("GAPCERT_LONG") == "" {
		t.Skip("set GAPCERT_LONG=1 to run the Robin example")
	}
	data, err := os.ReadFile(robinExample)
	if err != nil {
		t.Fatal(err)
	}
	f, err := sweep.ParseFamily(data)
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	if _, err := sweep.Run(f, dir, sweep.RunOptions{FamilyName: filepath.Base(robinExample), Tool: "gapcert 0.1.0-dev"}); err != nil {
		t.Fatal(err)
	}
	s, err := Load(dir)
	if err != nil {
		t.Fatal(err)
	}
	b, err := s.Band("alpha", BandSpec{Quantity: "gap", Reference: "robin_interval_gap"})
	if err != nil {
		t.Fatal(err)
	}
	if len(b.Points) != 21 {
		t.Fatalf("%d points drawn, want 21", len(b.Points))
	}
	for _, p := range b.Points {
		var want interval.I
		if p.XText == "0" {
			want = pi2(t).DivF(64)
		} else {
			w := robinIntervalGap(p.X, 8) // α is a multiple of 1/2, exact in float64
			want = interval.I{Lo: w, Hi: w}
		}
		if !(p.Reference.Lo <= want.Lo && want.Hi <= p.Reference.Hi) || p.Reference.Hi-p.Reference.Lo > 1e-9*want.Hi {
			t.Errorf("alpha = %s: robin_interval_gap ∈ %v, want a narrow enclosure of %v", p.XText, p.Reference, want)
		}
		if p.Verdict != certs.Holds || !(p.Quantity.Lo > p.Reference.Hi) {
			t.Errorf("alpha = %s: verdict %s, gap ∈ %v, reference ∈ %v", p.XText, p.Verdict, p.Quantity, p.Reference)
		}
	}
}
