package sweep

import (
	"bytes"
	"context"
	"encoding/csv"
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"sync"
	"testing"
	"time"

	"gapcert/certs"
	"gapcert/certs/certify"
	"gapcert/fem/problem"
	"gapcert/interval/decimalio"
)

// fixedNow makes certificates byte-identical between runs.
func fixedNow() time.Time { return time.Date(2026, 1, 2, 3, 4, 5, 0, time.UTC) }

// testOptions fixes the provenance time and gives a budget that the
// families here never reach, so that the refinement stops at the width
// target and not at a load-dependent time.
func testOptions() RunOptions {
	return RunOptions{FamilyName: "family.json", Tool: "gapcert test", Now: fixedNow, TimeLimit: 10 * time.Minute}
}

func mustFamily(t *testing.T, text []byte) *Family {
	t.Helper()
	f, err := ParseFamily(text)
	if err != nil {
		t.Fatal(err)
	}
	return f
}

// triangleFamily is the family of triangles with base [0, 1] and apex
// (a, b): by default a 5 × 5 grid (a, b) ∈ {0, 1/4, …, 1} × {1/2, 3/4, …, 3/2}
// that holds three right isosceles triangles; with GAPCERT_LONG=1 the 200
// points of the example file (a 20 × 10 grid, two right isosceles
// triangles). The 200 points cost about 21 s on two idle cores, 40 s on
// loaded ones, too much for the default suite.
func triangleFamily(t *testing.T) []byte {
	if os.Getenv("GAPCERT_LONG") == "1" {
		return readExample(t, "triangle_apex_family.json")
	}
	return []byte(`{
	  "template": {"name": "triangle", "domain": {"polygon": [["0", "0"], ["1", "0"], ["a", "b"]]},
	               "boundary": "dirichlet", "claims": ["D^2*gap >= 64*pi^2/9"]},
	  "parameters": [{"name": "a", "range": {"lo": "0", "hi": "1", "count": 5}},
	                 {"name": "b", "range": {"lo": "0.5", "hi": "1.5", "count": 5}}],
	  "relative_width": "0.05"}`)
}

// samePoint reports how two summaries of the same point differ in what was
// certified (not in status, file location or provenance).
func samePoint(a, b Point) string {
	ja, _ := json.Marshal([]any{a.Index, a.Params, a.ProblemSHA256, a.CertificateSHA256, a.Eigenvalues, a.Gap, a.Diameter, a.GapD2OverPi2, a.Claims, a.Verdict})
	jb, _ := json.Marshal([]any{b.Index, b.Params, b.ProblemSHA256, b.CertificateSHA256, b.Eigenvalues, b.Gap, b.Diameter, b.GapD2OverPi2, b.Claims, b.Verdict})
	if bytes.Equal(ja, jb) {
		return ""
	}
	return string(ja) + "\n  vs\n" + string(jb)
}

// contains reports whether the printed bound b contains x·π² and has
// relative width at most w (read back outward, so the test is sound).
func contains(t *testing.T, b certs.Bound, x, w float64) bool {
	t.Helper()
	iv, err := b.Interval()
	if err != nil {
		t.Fatal(err)
	}
	truth := x * math.Pi * math.Pi
	// math.Pi² is within 1e-15 relative of π²; the margins below are far wider.
	return iv.Lo <= truth*(1+1e-14) && truth*(1-1e-14) <= iv.Hi && iv.Wid() <= w*truth
}

// TestShardsMergeEqualsWhole runs a family of triangles (base [0, 1],
// apex (a, b) over a grid; see triangleFamily) unsharded and in four shards, merges the shards and demands the same certified results
// and verdicts at every point. The Lu–Rowlett bound D²(λ2 − λ1) ≥ 64π²/9
// for every triangle (Z. Lu, J. Rowlett, The fundamental gap of simplices,
// Comm. Math. Phys. 319 (2013) 111–145) must hold or be undecided at every
// point, never fail. At the right isosceles apexes of the grid the
// Dirichlet eigenvalues are known: for legs 1 (apex (0, 1) or (1, 1)) they
// are π²(m² + n²), m > n ≥ 1, the antisymmetric modes of the unit square,
// so λ1 = 5π², λ2 = 10π²; for apex (1/2, 1/2) (legs √2/2) twice that
// (common practice).
func TestShardsMergeEqualsWhole(t *testing.T) {
	f := mustFamily(t, triangleFamily(t))
	root := t.TempDir()
	opt := testOptions()
	opt.Jobs = 2
	whole, err := Run(f, filepath.Join(root, "whole"), opt)
	if err != nil {
		t.Fatal(err)
	}
	// The four shards run at the same time, as on four nodes.
	dirs := make([]string, 4)
	shards := make([]*Summary, 4)
	errs := make([]error, 4)
	var wg sync.WaitGroup
	for i := range dirs {
		dirs[i] = filepath.Join(root, "shard", string(rune('0'+i)))
		opt := testOptions()
		opt.Shard = Shard{Index: i, Count: 4}
		wg.Add(1)
		go func() {
			defer wg.Done()
			shards[i], errs[i] = Run(f, dirs[i], opt)
		}()
	}
	wg.Wait()
	for i, s := range shards {
		if errs[i] != nil {
			t.Fatal(errs[i])
		}
		if want := (len(f.Points) - i + 3) / 4; len(s.Points) != want {
			t.Errorf("shard %d/4 has %d points, want %d", i, len(s.Points), want)
		}
	}
	merged, err := Merge(dirs, filepath.Join(root, "merged"), MergeOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if len(whole.Points) != len(f.Points) || len(merged.Points) != len(f.Points) {
		t.Fatalf("%d points unsharded, %d merged, want %d", len(whole.Points), len(merged.Points), len(f.Points))
	}
	known := map[[2]string][2]float64{{"0", "1"}: {5, 10}, {"1", "1"}: {5, 10}, {"0.5", "0.5"}: {10, 20}}
	checked := 0
	for i, p := range whole.Points {
		if p.Status != StatusComputed {
			t.Errorf("point %d: status %s (%s)", i, p.Status, p.Error)
		}
		if diff := samePoint(p, merged.Points[i]); diff != "" {
			t.Errorf("point %d differs between the unsharded and the merged run:\n%s", i, diff)
		}
		if p.Verdict != certs.Holds && p.Verdict != certs.Undecided {
			t.Errorf("point %d (%v): Lu–Rowlett bound verdict %q", i, p.Params, p.Verdict)
		}
		if ev, ok := known[[2]string{p.Params["a"], p.Params["b"]}]; ok {
			checked++
			for k := 0; k < 2; k++ {
				if !contains(t, p.Eigenvalues[k].Bound(), ev[k], 0.05) {
					t.Errorf("point %d (%v): lambda%d ∈ [%s, %s] does not contain %gπ² within relative width 0.05",
						i, p.Params, k+1, p.Eigenvalues[k].Lower, p.Eigenvalues[k].Upper, ev[k])
				}
			}
		}
	}
	if want := map[bool]int{false: 3, true: 2}[len(f.Points) == 200]; checked != want {
		t.Errorf("checked %d right isosceles points, want %d", checked, want)
	}
	data, err := os.ReadFile(filepath.Join(root, "merged", "summary.json"))
	if err != nil {
		t.Fatal(err)
	}
	back, err := UnmarshalSummary(data)
	if err != nil {
		t.Fatal(err)
	}
	if back.FamilySHA256 != f.SHA256 || back.TotalPoints != len(f.Points) || back.Shard != (Shard{0, 1}) {
		t.Errorf("merged summary header %+v", back)
	}
	// The merged directory stands alone: every file the summary names is a
	// plain name of a copy in it, with the family file beside them.
	for _, p := range back.Points {
		if filepath.Base(p.File) != p.File {
			t.Errorf("merged summary names %q, not a plain file name", p.File)
		}
		if b, err := os.ReadFile(filepath.Join(root, "merged", p.File)); err != nil || sha256Hex(b) != p.CertificateSHA256 {
			t.Errorf("merged summary file %s does not lead to its certificate (%v)", p.File, err)
		}
	}
	if fam, err := os.ReadFile(filepath.Join(root, "merged", FamilyFileName)); err != nil || !bytes.Equal(fam, f.data) {
		t.Errorf("merged directory lacks the family file (%v)", err)
	}
	if got := certFiles(t, filepath.Join(root, "merged")); len(got) != len(f.Points) {
		t.Errorf("merged directory holds %d certificates, want %d", len(got), len(f.Points))
	}
	// The merged directory is itself a sweep directory of the family.
	if _, err := Merge([]string{filepath.Join(root, "merged")}, filepath.Join(root, "again"), MergeOptions{}); err != nil {
		t.Errorf("merging the merged directory: %v", err)
	}
}

const convexFamily = "convex_potential_family.json"

// certFiles lists the certificate files of dir.
func certFiles(t *testing.T, dir string) []string {
	t.Helper()
	files, err := filepath.Glob(filepath.Join(dir, "*"+certSuffix))
	if err != nil {
		t.Fatal(err)
	}
	return files
}

// tamper lowers the recorded lower end of the gap of a certificate (still
// a true bound, but not what the recorded method gives).
func tamper(t *testing.T, path string) {
	t.Helper()
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	c, err := certs.Unmarshal(data)
	if err != nil {
		t.Fatal(err)
	}
	lo, err := decimalio.ParseLower(c.Results.Gap.Lower)
	if err != nil {
		t.Fatal(err)
	}
	c.Results.Gap.Lower = decimalio.FormatLower(lo*0.999, 17)
	out, err := c.Marshal()
	if err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(path, out, 0o644); err != nil {
		t.Fatal(err)
	}
}

// TestResume: a rerun after an interruption (half of the certificates
// missing, a stray temporary file) computes only the missing points and
// leaves the others byte for byte; a tampered certificate is reported and
// left in place, or set aside on request.
func TestResume(t *testing.T) {
	f := mustFamily(t, readExample(t, convexFamily))
	dir := t.TempDir()
	first, err := Run(f, dir, testOptions())
	if err != nil {
		t.Fatal(err)
	}
	files := certFiles(t, dir)
	if len(files) != len(f.Points) {
		t.Fatalf("%d certificates for %d points", len(files), len(f.Points))
	}
	checkCSV(t, filepath.Join(dir, "summary.csv"), first)
	// c = 0: −u″ on (−1, 1) with Dirichlet ends has λ_k = k²π²/4, so the
	// gap is 3π²/4, where Lavine's bound gap ≥ 3π²/D² for convex V
	// (R. Lavine, The eigenvalue gap for one-dimensional convex potentials,
	// Proc. Amer. Math. Soc. 121 (1994) 815–821) is an equality: undecided.
	if p := first.Points[0]; !contains(t, p.Gap, 0.75, 1e-6) || p.Verdict != certs.Undecided {
		t.Errorf("c = 0: gap [%s, %s], verdict %s; want 3π²/4 within 1e-6 and undecided", p.Gap.Lower, p.Gap.Upper, p.Verdict)
	}
	for _, p := range first.Points[1:] {
		if p.Verdict != certs.Holds {
			t.Errorf("c = %s: Lavine's bound is %s, want holds", p.Params["c"], p.Verdict)
		}
	}
	kept := map[string][]byte{}
	for i, file := range files {
		if i%2 == 1 {
			if err := os.Remove(file); err != nil {
				t.Fatal(err)
			}
			continue
		}
		data, _ := os.ReadFile(file)
		kept[filepath.Base(file)] = data
		old := time.Now().Add(-time.Hour)
		if err := os.Chtimes(file, old, old); err != nil {
			t.Fatal(err)
		}
	}
	stray := filepath.Join(dir, ".p0001-000000000000.cert.json.123.tmp")
	if err := os.WriteFile(stray, []byte(`{"format": "gapcert.cert`), 0o644); err != nil {
		t.Fatal(err)
	}
	second, err := Run(f, dir, testOptions())
	if err != nil {
		t.Fatal(err)
	}
	for i, p := range second.Points {
		want := StatusComputed
		if _, ok := kept[p.File]; ok {
			want = StatusReused
		}
		if p.Status != want {
			t.Errorf("point %d: status %s, want %s", i, p.Status, want)
		}
		if diff := samePoint(p, first.Points[i]); diff != "" {
			t.Errorf("point %d differs from the first run:\n%s", i, diff)
		}
	}
	for name, data := range kept {
		path := filepath.Join(dir, name)
		now, _ := os.ReadFile(path)
		st, _ := os.Stat(path)
		if !bytes.Equal(now, data) || time.Since(st.ModTime()) < 30*time.Minute {
			t.Errorf("%s was rewritten by the rerun", name)
		}
	}

	victim := filepath.Join(dir, first.Points[3].File)
	tamper(t, victim)
	tampered, _ := os.ReadFile(victim)
	third, err := Run(f, dir, testOptions())
	if err != nil {
		t.Fatal(err)
	}
	p := third.Points[3]
	if p.Status != StatusRejected || !strings.Contains(p.Error, "does not verify") || !strings.Contains(p.Error, "not overwritten") {
		t.Errorf("tampered point: status %s, error %q", p.Status, p.Error)
	}
	if now, _ := os.ReadFile(victim); !bytes.Equal(now, tampered) {
		t.Error("the tampered certificate was overwritten")
	}
	opt := testOptions()
	opt.SetAsideInvalid = true
	fourth, err := Run(f, dir, opt)
	if err != nil {
		t.Fatal(err)
	}
	if p := fourth.Points[3]; p.Status != StatusComputed || samePoint(p, first.Points[3]) != "" {
		t.Errorf("set-aside point: status %s, error %q", p.Status, p.Error)
	}
	if aside, _ := os.ReadFile(victim + rejectedSuffix); !bytes.Equal(aside, tampered) {
		t.Error("the tampered certificate was not set aside unchanged")
	}
	if got, _ := os.ReadFile(stray); !bytes.HasPrefix(got, []byte(`{"format"`)) {
		t.Error("the stray temporary file was touched")
	}
}

// checkCSV compares summary.csv with the summary: one row per point with
// the parameter values, the verdict and the bounds of the JSON summary.
func checkCSV(t *testing.T, path string, s *Summary) {
	t.Helper()
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	rows, err := csv.NewReader(bytes.NewReader(data)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) != len(s.Points)+1 {
		t.Fatalf("%d CSV rows for %d points", len(rows), len(s.Points))
	}
	col := map[string]int{}
	for i, h := range rows[0] {
		col[h] = i
	}
	for _, h := range []string{"index", "c", "status", "verdict", "lambda1_lower", "lambda2_upper", "gap_lower", "gap_upper", "gap >= 3*pi^2/D^2", "file", "certificate_sha256"} {
		if _, ok := col[h]; !ok {
			t.Fatalf("CSV header %v lacks %q", rows[0], h)
		}
	}
	for i, p := range s.Points {
		r := rows[i+1]
		if r[col["index"]] != strconv.Itoa(p.Index) || r[col["c"]] != p.Params["c"] || r[col["verdict"]] != p.Verdict ||
			r[col["gap_lower"]] != p.Gap.Lower || r[col["lambda2_upper"]] != p.Eigenvalues[1].Upper ||
			r[col["gap >= 3*pi^2/D^2"]] != p.Claims[0].Verdict || r[col["certificate_sha256"]] != p.CertificateSHA256 {
			t.Errorf("CSV row %d %v does not match point %+v", i+1, r, p)
		}
	}
}

// TestRunRefusesOtherFamily: a directory of one family is not reused for
// another.
func TestRunRefusesOtherFamily(t *testing.T) {
	dir := t.TempDir()
	if _, err := Run(mustFamily(t, readExample(t, convexFamily)), dir, testOptions()); err != nil {
		t.Fatal(err)
	}
	before := certFiles(t, dir)
	other := mustFamily(t, []byte(`{"template": {"domain": {"interval": ["0", "L"]}, "boundary": "dirichlet"}, "parameters": [{"name": "L", "values": ["1"]}]}`))
	_, err := Run(other, dir, testOptions())
	if err == nil || !strings.Contains(err.Error(), "holds another family") {
		t.Errorf("error %v", err)
	}
	if after := certFiles(t, dir); len(after) != len(before) {
		t.Errorf("%d certificates before, %d after", len(before), len(after))
	}
}

// TestMergeFlags: merge reports a foreign certificate (of another
// problem, and one with a name not of a sweep), a tampered one, a missing
// point and a duplicate, and writes nothing.
func TestMergeFlags(t *testing.T) {
	f := mustFamily(t, readExample(t, convexFamily))
	root := t.TempDir()
	var dirs []string
	var sums []*Summary
	for i := 0; i < 3; i++ {
		dir := filepath.Join(root, string(rune('a'+i)))
		opt := testOptions()
		opt.Shard = Shard{Index: i, Count: 3}
		s, err := Run(f, dir, opt)
		if err != nil {
			t.Fatal(err)
		}
		dirs, sums = append(dirs, dir), append(sums, s)
	}
	out := filepath.Join(root, "merged")
	if _, err := Merge(dirs, out, MergeOptions{}); err != nil {
		t.Fatalf("clean merge: %v", err)
	}
	if got, err := SummaryIn(out); err != nil || got != filepath.Join(out, "summary.json") {
		t.Errorf("SummaryIn(merged) = %q, %v", got, err)
	}
	if got, err := SummaryIn(dirs[1]); err != nil || got != filepath.Join(dirs[1], "summary-shard-1-of-3.json") {
		t.Errorf("SummaryIn(shard 1) = %q, %v", got, err)
	}
	if _, err := SummaryIn(root); err == nil || !strings.Contains(err.Error(), "not a sweep directory") {
		t.Errorf("SummaryIn(not a sweep directory) = %v", err)
	}
	if err := os.RemoveAll(out); err != nil {
		t.Fatal(err)
	}
	// An output directory that holds another certificate, or another file
	// under a merged name, is refused and left as it was.
	for _, c := range []struct{ name, want string }{
		{"other.cert.json", "not one of the merged certificates"},
		{FamilyFileName, "differs from the merged file"},
		{sums[1].Points[0].File, "differs from the merged file"},
	} {
		if err := os.MkdirAll(out, 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(filepath.Join(out, c.name), []byte("{}"), 0o644); err != nil {
			t.Fatal(err)
		}
		if _, err := Merge(dirs, out, MergeOptions{}); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("merge into a directory holding %s: %v, want %q", c.name, err, c.want)
		}
		if files, _ := os.ReadDir(out); len(files) != 1 {
			t.Errorf("merge into a directory holding %s wrote %d files", c.name, len(files)-1)
		}
		if err := os.RemoveAll(out); err != nil {
			t.Fatal(err)
		}
	}
	// Shards that shared one directory merge into it.
	shared := filepath.Join(root, "shared")
	for i := 0; i < 2; i++ {
		opt := testOptions()
		opt.Shard = Shard{Index: i, Count: 2}
		if _, err := Run(f, shared, opt); err != nil {
			t.Fatal(err)
		}
	}
	if _, err := SummaryIn(shared); err == nil || !strings.Contains(err.Error(), "2 shard summaries") {
		t.Errorf("SummaryIn(shared) = %v", err)
	}
	if _, err := Merge([]string{shared}, shared, MergeOptions{}); err != nil {
		t.Errorf("merging a shared directory into itself: %v", err)
	}
	if got, err := SummaryIn(shared); err != nil || got != filepath.Join(shared, "summary.json") {
		t.Errorf("SummaryIn(shared, merged) = %q, %v", got, err)
	}
	if _, err := Merge(append(dirs, dirs[0]), out, MergeOptions{}); err == nil || !strings.Contains(err.Error(), "listed twice") {
		t.Errorf("merge with a directory listed twice: %v", err)
	}

	// A certificate of another problem under a sweep name.
	p, err := problem.Parse([]byte(`{"domain": {"interval": ["-1", "1"]}, "potential": "x^2", "boundary": "dirichlet"}`))
	if err != nil {
		t.Fatal(err)
	}
	c, err := certify.Certify(context.Background(), p, certify.Options{Now: fixedNow})
	if err != nil {
		t.Fatal(err)
	}
	foreign, _ := c.Marshal()
	write := func(path string, data []byte) {
		if err := os.WriteFile(path, data, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	write(filepath.Join(dirs[2], CertFileName(2, p.SHA256())), foreign)
	write(filepath.Join(dirs[1], "notes.cert.json"), foreign)
	tamper(t, filepath.Join(dirs[0], sums[0].Points[0].File)) // point 0
	if err := os.Remove(filepath.Join(dirs[1], sums[1].Points[0].File)); err != nil {
		t.Fatal(err) // point 1
	}
	dup, _ := os.ReadFile(filepath.Join(dirs[2], sums[2].Points[0].File)) // point 2
	write(filepath.Join(dirs[0], sums[2].Points[0].File), dup)

	_, err = Merge(dirs, out, MergeOptions{})
	var me *MergeError
	if !errors.As(err, &me) {
		t.Fatalf("error %v, want a *MergeError", err)
	}
	kinds := map[string][]MergeIssue{}
	for _, is := range me.Issues {
		kinds[is.Kind] = append(kinds[is.Kind], is)
	}
	if len(kinds[IssueForeign]) != 2 {
		t.Errorf("foreign: %v", kinds[IssueForeign])
	}
	if is := kinds[IssueTampered]; len(is) != 1 || is[0].Index != 0 || !strings.Contains(is[0].Msg, "does not verify") {
		t.Errorf("tampered: %v", is)
	}
	if is := kinds[IssueDuplicate]; len(is) != 1 || is[0].Index != 2 {
		t.Errorf("duplicate: %v", is)
	}
	missing := map[int]bool{}
	for _, is := range kinds[IssueMissing] {
		missing[is.Index] = true
	}
	if len(missing) != 2 || !missing[0] || !missing[1] {
		t.Errorf("missing points %v, want 0 (tampered) and 1 (deleted)", missing)
	}
	if _, err := os.Stat(out); err == nil {
		t.Error("a failed merge created its output directory")
	}
	if _, err := Merge(append(dirs, t.TempDir()), out, MergeOptions{}); !errors.As(err, &me) || me.Issues[0].Kind != IssueFamily {
		t.Errorf("merge with a directory without a family: %v", err)
	}
}

// TestRefineUndecided: with a loose width (0.05) the claims
// 4.999π² ≤ λ2 − λ1 ≤ 5.001π² on the right isosceles triangle with legs 1
// (gap exactly 10π² − 5π², common practice: the antisymmetric modes of
// the unit square) are undecided; --refine-undecided decides them, and the
// refined enclosure still contains 5π².
func TestRefineUndecided(t *testing.T) {
	f := mustFamily(t, []byte(`{"template": {"domain": {"polygon": [["0", "0"], ["1", "0"], ["a", "1"]]}, "boundary": "dirichlet",
		"claims": ["gap <= 5.001*pi^2", "gap >= 4.999*pi^2"]},
		"parameters": [{"name": "a", "values": ["0"]}], "relative_width": "0.05", "time_limit": "60s"}`))
	dir := t.TempDir()
	loose, err := Run(f, dir, testOptions())
	if err != nil {
		t.Fatal(err)
	}
	if v := loose.Points[0].Verdict; v != certs.Undecided {
		t.Fatalf("loose run: verdict %q, want undecided (the test needs an undecided start)", v)
	}
	opt := testOptions()
	opt.RefineUndecided = true
	tight, err := Run(f, dir, opt)
	if err != nil {
		t.Fatal(err)
	}
	p := tight.Points[0]
	if p.Status != StatusRefined || p.Verdict != certs.Holds {
		t.Fatalf("refined run: status %s, verdict %q, error %q", p.Status, p.Verdict, p.Error)
	}
	if !contains(t, p.Gap, 5, 1e-3) {
		t.Errorf("refined gap [%s, %s] does not contain 5π² within relative width 1e-3", p.Gap.Lower, p.Gap.Upper)
	}
	data, err := os.ReadFile(filepath.Join(dir, p.File))
	if err != nil {
		t.Fatal(err)
	}
	if err := certify.Check(data); err != nil || sha256Hex(data) != p.CertificateSHA256 {
		t.Errorf("refined certificate: %v", err)
	}
}

// TestRobinExample runs three points (α = 0, 5, 10; shard 0/5) of the
// Robin example. At α = 0 the condition is Neumann and λ1 = 0 (constants).
// λ1 increases with α (the form a(u, u) + α∫u² grows with α; min–max) and
// stays below the Dirichlet λ1 of the rectangle [1, 3] × [0, 1] inside the
// trapezoid, π²(1/4 + 1) = 5π²/4 (Robin ≤ Dirichlet on the same domain by
// min–max, and Dirichlet domain monotonicity; common practice), the
// claim of the example.
func TestRobinExample(t *testing.T) {
	f := mustFamily(t, readExample(t, "robin_trapezoid_family.json"))
	opt := testOptions()
	opt.Shard = Shard{Index: 0, Count: 5}
	s, err := Run(f, t.TempDir(), opt)
	if err != nil {
		t.Fatal(err)
	}
	if len(s.Points) != 3 || s.Points[1].Params["alpha"] != "5" {
		t.Fatalf("shard 0/5 of 11 points: %d points", len(s.Points))
	}
	var prev float64
	for i, p := range s.Points {
		l1, err := p.Eigenvalues[0].Bound().Interval()
		if err != nil {
			t.Fatal(err)
		}
		if p.Verdict != certs.Holds {
			t.Errorf("alpha = %s: claim %s", p.Params["alpha"], p.Verdict)
		}
		if i == 0 && !(l1.Lo <= 0 && 0 <= l1.Hi && l1.Hi < 1e-3) {
			t.Errorf("alpha = 0: lambda1 ∈ [%s, %s], want 0", p.Eigenvalues[0].Lower, p.Eigenvalues[0].Upper)
		}
		if i > 0 && !(l1.Lo > prev) {
			t.Errorf("alpha = %s: lambda1 ∈ [%s, %s] not above the previous point's", p.Params["alpha"], p.Eigenvalues[0].Lower, p.Eigenvalues[0].Upper)
		}
		prev = l1.Hi
	}
}

// TestProgressNumbering: progress lines name points by the index of their
// file names and summaries, from 0.
func TestProgressNumbering(t *testing.T) {
	f := mustFamily(t, []byte(`{"template": {"domain": {"interval": ["0", "1"]}, "potential": "c", "boundary": "dirichlet",
		"target": {"relative_width": "1e-3"}}, "parameters": [{"name": "c", "values": ["0", "1", "2"]}]}`))
	var lines []string
	opt := testOptions()
	opt.Shard = Shard{Index: 0, Count: 2}
	opt.Progress = func(format string, args ...any) { lines = append(lines, fmt.Sprintf(format, args...)) }
	s, err := Run(f, t.TempDir(), opt)
	if err != nil {
		t.Fatal(err)
	}
	if len(lines) != 2 || len(s.Points) != 2 {
		t.Fatalf("%d progress lines, %d points", len(lines), len(s.Points))
	}
	for i, p := range s.Points {
		want := fmt.Sprintf("point %d of 0…2 (c=%s): computed", p.Index, p.Params["c"])
		if !strings.HasPrefix(lines[i], want) || !strings.HasPrefix(p.File, fmt.Sprintf("p%04d-", p.Index)) {
			t.Errorf("progress line %q, file %s; want %q", lines[i], p.File, want)
		}
	}
}
