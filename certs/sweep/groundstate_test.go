package sweep

import (
	"encoding/csv"
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gapcert/certs"
	"gapcert/certs/certify"
)

// humpFamily is −u″ + 2(1 − x²)u = λu on (−1, 1) with the Robin condition
// u′ = ±αu at both ends, over α. The problem is symmetric under x ↦ −x and
// λ1 is simple, so the ground state u is even and u′(0) = 0; with
// (log u)″ = u″/u − (u′/u)² = V − λ1 − (u′/u)² this gives
// (log u)″(0) = V(0) − λ1 = 2 − λ1. Hence λ1 < 2 means u is not log-concave
// at 0, and λ1 > 2 = max V means (log u)″ ≤ V − λ1 < 0 everywhere: u is
// log-concave. At α = 0 (Neumann) λ1 is at most the Rayleigh quotient of
// the constant, the mean 4/3 of V, below 2; λ1 grows with α towards the
// Dirichlet λ1 ≥ π²/4 > 2 (V ≥ 0; min–max). The certified λ1 crosses 2
// between α = 0.7 and α = 0.75 (measured with this family), so the
// verdicts change along the sweep.
const humpFamily = `{
  "name": "hump under Robin ends",
  "template": {"name": "hump", "domain": {"interval": ["-1", "1"]}, "potential": "2*(1-x^2)",
               "boundary": {"robin": "alpha"}, "points": [["-1"], ["0"], ["1/2"]]},
  "parameters": [{"name": "alpha", "values": ["0", "1/2", "7/10", "3/4", "1", "4"]}],
  "relative_width": "1e-8",
  "ground_state": true
}`

// checkHumpVerdicts demands, at every point of s, a ground-state block whose
// verdict agrees with the certified λ1 as humpFamily derives it.
func checkHumpVerdicts(t *testing.T, s *Summary) {
	t.Helper()
	if !s.GroundState {
		t.Error("summary: ground_state not set")
	}
	seen := map[string]int{}
	for _, p := range s.Points {
		gs := p.GroundState
		if gs == nil {
			t.Errorf("point %d: no ground_state", p.Index)
			continue
		}
		l1, err := p.Eigenvalues[0].Bound().Interval()
		if err != nil {
			t.Fatal(err)
		}
		want := certs.Undecided
		switch {
		case l1.Hi < 2:
			want = certs.Disproven
		case l1.Lo > 2:
			want = certs.Proven
		}
		if gs.LogConcavity != want {
			t.Errorf("point %d (alpha %s): lambda1 in %v, verdict %s, want %s", p.Index, p.Params["alpha"], l1, gs.LogConcavity, want)
		}
		seen[gs.LogConcavity]++
		if want == certs.Disproven {
			m := ShapeMargin(gs)
			if m == nil || gs.Witness == nil {
				t.Errorf("point %d: disproven without a witness margin", p.Index)
				continue
			}
			lo, err := m.Interval()
			if err != nil || !(lo.Lo > 0) {
				t.Errorf("point %d: witness margin [%s, %s] not positive", p.Index, m.Lower, m.Upper)
			}
		}
		if len(gs.Points) != 3 || gs.L2Error == "" {
			t.Errorf("point %d: %d values, L2 error %q", p.Index, len(gs.Points), gs.L2Error)
		}
	}
	if seen[certs.Proven] == 0 || seen[certs.Disproven] == 0 {
		t.Errorf("verdicts %v: want both proven and disproven points", seen)
	}
}

// TestGroundStateSweep: a family with "ground_state": true certifies the
// ground state at every point; the summary (JSON and CSV) carries each
// point's verdict, witness kind and margin; a rerun keeps them; a
// certificate without the block is not the family's (rejected by a rerun,
// refused by merge); the merged summary keeps the verdicts.
func TestGroundStateSweep(t *testing.T) {
	f := mustFamily(t, []byte(humpFamily))
	if !f.GroundState {
		t.Fatal("family: GroundState not read")
	}
	dir := t.TempDir()
	first, err := Run(f, dir, testOptions())
	if err != nil {
		t.Fatal(err)
	}
	checkHumpVerdicts(t, first)

	// The CSV has the ground-state columns, row for row as the JSON.
	data, err := os.ReadFile(filepath.Join(dir, "summary.csv"))
	if err != nil {
		t.Fatal(err)
	}
	rows, err := csv.NewReader(strings.NewReader(string(data))).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	col := map[string]int{}
	for i, h := range rows[0] {
		col[h] = i
	}
	for _, name := range []string{"log_concavity", "witness", "shape_margin_lower", "shape_margin_upper", "l2_error_upper"} {
		if _, ok := col[name]; !ok {
			t.Fatalf("summary.csv lacks the column %s: %v", name, rows[0])
		}
	}
	for i, p := range first.Points {
		row := rows[i+1]
		want := groundStateColumns(p.GroundState)
		got := []string{row[col["log_concavity"]], row[col["witness"]], row[col["shape_margin_lower"]], row[col["shape_margin_upper"]], row[col["l2_error_upper"]]}
		if strings.Join(got, "|") != strings.Join(want, "|") {
			t.Errorf("csv row %d: %v, want %v", i, got, want)
		}
		if p.GroundState.LogConcavity == certs.Disproven && (got[1] != certs.WitnessConvexInterval || got[2] == "") {
			t.Errorf("csv row %d: disproven without witness kind or margin: %v", i, got)
		}
	}

	// A rerun reuses every certificate and reports the same blocks.
	second, err := Run(f, dir, testOptions())
	if err != nil {
		t.Fatal(err)
	}
	for i, p := range second.Points {
		if p.Status != StatusReused {
			t.Errorf("rerun point %d: status %s", i, p.Status)
		}
	}
	checkHumpVerdicts(t, second)

	// A certificate of point 0 certified without the ground state verifies
	// but is not the family's: the rerun does not reuse it, merge refuses it.
	bare := t.TempDir()
	if err := os.WriteFile(filepath.Join(bare, FamilyFileName), f.data, 0o644); err != nil {
		t.Fatal(err)
	}
	for _, pt := range f.Points {
		var opt certify.Options
		opt.Tool, opt.Now = "gapcert test", fixedNow
		opt.GroundState = pt.Index != 0
		c, err := certify.Certify(t.Context(), pt.Problem, opt)
		if err != nil {
			t.Fatal(err)
		}
		raw, err := c.Marshal()
		if err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(filepath.Join(bare, CertFileName(pt.Index, pt.Problem.SHA256())), raw, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	_, err = Merge([]string{bare}, t.TempDir(), MergeOptions{})
	var me *MergeError
	if !errors.As(err, &me) || me.Issues[0].Kind != IssueNoGround || me.Issues[0].Index != 0 {
		t.Errorf("merge of a certificate without ground_state: %v, want an %s issue at point 0", err, IssueNoGround)
	} else {
		for _, is := range me.Issues {
			if is.Index != 0 {
				t.Errorf("merge: issue %v at another point", is)
			}
		}
	}
	rerun, err := Run(f, bare, testOptions())
	if err != nil {
		t.Fatal(err)
	}
	if p := rerun.Points[0]; p.Status != StatusRejected || !strings.Contains(p.Error, "results.ground_state") {
		t.Errorf("rerun over a certificate without ground_state: status %s, error %q", p.Status, p.Error)
	}

	// An edited verdict in a certificate of the directory is caught by
	// the re-check of both a rerun and merge.
	edited := t.TempDir()
	for _, name := range append(certFiles(t, dir), filepath.Join(dir, FamilyFileName)) {
		data, err := os.ReadFile(name)
		if err != nil {
			t.Fatal(err)
		}
		if strings.HasPrefix(filepath.Base(name), "p0000-") {
			changed := strings.Replace(string(data), `"log_concavity": "disproven"`, `"log_concavity": "undecided"`, 1)
			if changed == string(data) {
				t.Fatal("the edit changed nothing")
			}
			data = []byte(changed)
		}
		if err := os.WriteFile(filepath.Join(edited, filepath.Base(name)), data, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	_, err = Merge([]string{edited}, t.TempDir(), MergeOptions{})
	if !errors.As(err, &me) || me.Issues[0].Kind != IssueTampered || me.Issues[0].Index != 0 || !strings.Contains(me.Issues[0].Msg, "ground_state") {
		t.Errorf("merge of an edited verdict: %v, want a tampered issue at point 0 naming ground_state", err)
	}
	rerun, err = Run(f, edited, testOptions())
	if err != nil {
		t.Fatal(err)
	}
	if p := rerun.Points[0]; p.Status != StatusRejected || !strings.Contains(p.Error, "ground_state") {
		t.Errorf("rerun over an edited verdict: status %s, error %q", p.Status, p.Error)
	}

	// The summary is read strictly inside the block too.
	sumData, err := os.ReadFile(filepath.Join(dir, "summary.json"))
	if err != nil {
		t.Fatal(err)
	}
	if _, err := UnmarshalSummary(sumData); err != nil {
		t.Fatal(err)
	}
	variant := strings.Replace(string(sumData), `"log_concavity"`, `"Log_Concavity"`, 1)
	if _, err := UnmarshalSummary([]byte(variant)); err == nil || !strings.Contains(err.Error(), "Log_Concavity") {
		t.Errorf("a case variant inside ground_state: %v", err)
	}

	// Merge re-verifies and keeps the blocks.
	merged, err := Merge([]string{dir}, filepath.Join(t.TempDir(), "merged"), MergeOptions{})
	if err != nil {
		t.Fatal(err)
	}
	checkHumpVerdicts(t, merged)
	for i, p := range merged.Points {
		if p.Status != StatusVerified {
			t.Errorf("merged point %d: status %s", i, p.Status)
		}
	}
}
