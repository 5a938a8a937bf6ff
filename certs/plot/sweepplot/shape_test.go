package sweepplot

import (
	"errors"
	"path/filepath"
	"strings"
	"testing"

	"gapcert/certs"
	"gapcert/certs/sweep"
)

// goldenShape is the log-concavity picture of the hump sweep
// (testdata/families/hump.json): −u″ + 2(1 − x²)u = λu on (−1, 1) with
// Robin ends, symmetric, so the ground state is even and
// (log u)″(0) = V(0) − λ1 = 2 − λ1: not log-concave where λ1 < 2 (small α),
// log-concave where λ1 > 2 = max V (larger α).
func goldenShape(t *testing.T) *Shape {
	sh, err := load(t, "hump").Shape("alpha")
	if err != nil {
		t.Fatal(err)
	}
	return sh
}

// TestShapeVerdicts: each point of the picture is the summary's verdict,
// which agrees with the certified λ1 as goldenShape derives it, sorted by
// the parameter.
func TestShapeVerdicts(t *testing.T) {
	s := load(t, "hump")
	sh := goldenShape(t)
	if len(sh.Points) != len(s.Summary.Points) || len(sh.Uncertified) != 0 {
		t.Fatalf("%d points drawn, %d uncertified, of %d", len(sh.Points), len(sh.Uncertified), len(s.Summary.Points))
	}
	count := map[string]int{}
	for i, sp := range sh.Points {
		if i > 0 && sh.Points[i-1].X >= sp.X {
			t.Errorf("points not increasing in alpha at %d", i)
		}
		pt := s.Summary.Points[sp.Index]
		l1, err := pt.Eigenvalues[0].Bound().Interval()
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
		if sp.Verdict != want || sp.Verdict != pt.GroundState.LogConcavity || sp.XText != pt.Params["alpha"] {
			t.Errorf("alpha %s: verdict %s (summary %s), lambda1 %v gives %s", sp.XText, sp.Verdict, pt.GroundState.LogConcavity, l1, want)
		}
		count[sp.Verdict]++
	}
	if count[certs.Proven] == 0 || count[certs.Disproven] == 0 {
		t.Errorf("verdicts %v: the hump sweep has both kinds", count)
	}
}

// TestShapeLabels: the picture says that the verdicts are certified, names
// each verdict with its count, and lists points without a verdict.
func TestShapeLabels(t *testing.T) {
	dir := t.TempDir()
	sh := goldenShape(t)
	// One point made undecided and one without a ground state, in memory,
	// so that every row and the note show.
	sh.Points[3].Verdict = certs.Undecided
	sh.Uncertified = []int{99}
	path := filepath.Join(dir, "shape.svg")
	if err := sh.Write(path); err != nil {
		t.Fatal(err)
	}
	text := "\n" + strings.Join(summarise(t, path).Texts, "\n") + "\n"
	for _, w := range []string{
		"certified verdicts: is the ground state log-concave?",
		"proven: log-concave on the whole domain (4)",
		"undecided: neither proven nor a witness certified (1)",
		"disproven: a certified witness of non-log-concavity (3)",
		"nothing is certified between",
		"1 point(s) without a certified ground state not drawn.",
		"\nproven\n", "\nundecided\n", "\ndisproven\n", "\nα\n",
	} {
		if !strings.Contains(text, w) {
			t.Errorf("picture lacks %q; texts:\n%s", w, text)
		}
	}
}

// TestShapeBadInput: a sweep without ground states, a two-parameter sweep
// and an unknown parameter are refused; a summary whose ground-state
// verdict differs from its certificate file is a cross-check error.
func TestShapeBadInput(t *testing.T) {
	_, err := load(t, "convex").Shape("c")
	wantError(t, "no ground states", err, `no point has a ground-state verdict (hint: add "ground_state": true`)
	_, err = load(t, "triangle").Shape("a")
	wantError(t, "two parameters", err, "needs a one-parameter sweep")
	_, err = load(t, "hump").Shape("beta")
	wantError(t, "unknown parameter", err, `unknown parameter "beta"`)

	dir := copySweep(t, "hump")
	editSummary(t, dir, func(s *sweep.Summary) {
		s.Points[0].GroundState.LogConcavity = certs.Proven
	})
	_, err = Load(dir)
	var cc *CrossCheckError
	if !errors.As(err, &cc) || !strings.Contains(err.Error(), "ground_state differ") {
		t.Errorf("edited verdict: %v, want a cross-check error on ground_state", err)
	}
}
