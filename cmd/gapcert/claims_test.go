package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"gapcert/certs"
	"gapcert/certs/sweep"
	"gapcert/fem/claim"
	"gapcert/fem/problem"
)

// writeFile writes body to dir/name and returns its path.
func writeFile(t *testing.T, dir, name, body string) string {
	t.Helper()
	path := filepath.Join(dir, name)
	if err := os.WriteFile(path, []byte(body), 0o644); err != nil {
		t.Fatal(err)
	}
	return path
}

// TestUnavailableQuantityRefused: a claim naming a quantity the problem
// does not provide makes validate, certify and sweep exit with status 2
// before any computation, naming the claim's JSON path and giving a hint;
// certify and sweep write nothing.
func TestUnavailableQuantityRefused(t *testing.T) {
	const (
		unit     = `"domain": {"interval": ["0", "1"]}, "boundary": "dirichlet"`
		square   = `"domain": {"polygon": [["0", "0"], ["1", "0"], ["1", "1"], ["0", "1"]]}`
		dirichle = `"boundary": "dirichlet"`
	)
	for _, tc := range []struct {
		name     string
		template string // the problem without its claims
		claim    string
		want     string // the message after the claim's path
		hint     string // part of the hint
	}{
		{"lambda5 of two eigenvalues", unit, "lambda5 >= lambda2", `claim "lambda5 >= lambda2", column 1: lambda5 is not certified: the problem asks for 2 eigenvalues`, `set "eigenvalues": 5 or more`},
		{"inradius of a square", square + `, ` + dirichle, "12*inradius^2 < 1", `claim "12*inradius^2 < 1", column 4: inradius is defined for triangles only`, "area, perimeter or D"},
		{"alpha without a Robin side", square + `, ` + dirichle, "gap >= alpha", `claim "gap >= alpha", column 8: alpha has no value: no side has a Robin condition`, "Robin coefficient shared by every Robin side"},
		{"alpha of two coefficients", square + `, "boundary": [{"robin": "1"}, "dirichlet", {"robin": "2"}, "neumann"]`, "alpha > 0", `claim "alpha > 0", column 1: alpha has no value: the Robin sides have different coefficients, 1 (side 0) and 2 (side 2)`, "declare it as a parameter"},
		{"area of an interval", unit, "area > 0", `claim "area > 0", column 1: area is defined for polygons only`, "use D, its length"},
		{"perimeter of an interval", unit, "gap*perimeter^2 > 1", `claim "gap*perimeter^2 > 1", column 5: perimeter is defined for polygons only`, "use D, its length"},
		{"unknown name", unit, "gap > diameter", `claim "gap > diameter", column 7: unknown name "diameter"`, "known names: lambda1…lambda2, gap, D, pi, e"},
		{"eigenvalue beyond 20", unit, "lambda21 > 0", `claim "lambda21 > 0", column 1: unknown name "lambda21"`, "at most 20 eigenvalues"},
	} {
		dir := t.TempDir()
		body := `{` + tc.template + `, "claims": ["gap > 0", "` + tc.claim + `"]}`
		file := writeFile(t, dir, "p.json", body)
		wantLine := file + ": claims[1]: " + tc.want

		code, out, errs := execute("validate", file)
		if code != exitInvalid || out != "" || !strings.Contains(errs, wantLine) || !strings.Contains(errs, tc.hint) {
			t.Errorf("%s: validate: exit %d, stdout %q, stderr %q; want exit 2 and %q with hint %q", tc.name, code, out, errs, wantLine, tc.hint)
		}

		cert := filepath.Join(dir, "c.cert.json")
		start := time.Now()
		code, out, errs = execute("certify", file, "-o", cert)
		if code != exitInvalid || out != "" || !strings.Contains(errs, wantLine) || !strings.Contains(errs, "(hint: ") {
			t.Errorf("%s: certify: exit %d, stdout %q, stderr %q; want exit 2 and %q", tc.name, code, out, errs, wantLine)
		}
		if d := time.Since(start); d > 5*time.Second {
			t.Errorf("%s: certify took %v to refuse: it computed first", tc.name, d)
		}
		if _, err := os.Stat(cert); err == nil {
			t.Errorf("%s: certify wrote %s", tc.name, cert)
		}

		// The same claim as a family's second claim: reported at the
		// family's own path, claims[1], for the first point.
		family := writeFile(t, dir, "family.json", `{"template": {`+strings.Replace(tc.template, `"1"]}`, `"L"]}`, 1)+`},
			"parameters": [{"name": "L", "values": ["1", "2"]}], "claims": ["gap > 0", "`+tc.claim+`"]}`)
		outDir := filepath.Join(dir, "sweep")
		code, out, errs = execute("sweep", family, "--out", outDir)
		if code != exitInvalid || out != "" || !strings.Contains(errs, family+": claims[1]: point 0 (L=1): "+tc.want) || !strings.Contains(errs, tc.hint) {
			t.Errorf("%s: sweep: exit %d, stdout %q, stderr %q; want exit 2 and claims[1]: point 0 (L=1): %s", tc.name, code, out, errs, tc.want)
		}
		if _, err := os.Stat(outDir); err == nil {
			t.Errorf("%s: sweep created %s", tc.name, outDir)
		}
	}
}

// TestClaimGrammarEverywhere runs one table of claim texts through every
// path that reads claims: the grammar itself (claim.Parse), problem files
// (problem.Parse, gapcert validate), certification (gapcert certify, then
// check on its certificate) and families (sweep.ParseFamily). Each path
// accepts exactly the texts the grammar accepts, and ≥, ≤ give the same
// verdict and margin as >=, <=.
func TestClaimGrammarEverywhere(t *testing.T) {
	// Dirichlet (0, 1): λ1 = π² ≈ 9.87, λ2 = 4π² ≈ 39.48, gap = 3π² ≈ 29.61
	// (common practice).
	for _, tc := range []struct {
		text    string
		verdict string // "" when the grammar refuses the text
		same    string // an ASCII spelling with the same margin, or ""
	}{
		{"lambda2 >= 1", certs.Holds, ""},
		{"lambda2 ≥ 1", certs.Holds, "lambda2 >= 1"},
		{"lambda2≥1", certs.Holds, "lambda2 >= 1"},
		{"gap ≤ 100", certs.Holds, "gap <= 100"},
		{"gap <= 29", certs.Fails, ""},
		{"lambda1 > 9", certs.Holds, ""},
		{"lambda1 < 10", certs.Holds, ""},
		{"(lambda2 - lambda1)*D^2/pi^2 ≥ 2.9", certs.Holds, "(lambda2 - lambda1)*D^2/pi^2 >= 2.9"},
		{"lambda2 = 1", "", ""},
		{"lambda2 == 1", "", ""},
		{"lambda2 => 1", "", ""},
		{"lambda2 =< 1", "", ""},
		{"lambda2 != 1", "", ""},
		{"lambda2 ≠ 1", "", ""},
		{"lambda2 ⩾ 1", "", ""},
		{"0 < gap < 100", "", ""},
		{"0 < gap ≤ 100", "", ""},
		{"(gap > 1)", "", ""},
		{"gap >=", "", ""},
		{"≥ 1", "", ""},
		{"gap", "", ""},
		{"gap >= 1 +", "", ""},
	} {
		_, grammarErr := claim.Parse(tc.text)
		accepted := grammarErr == nil
		if accepted != (tc.verdict != "") {
			t.Errorf("%q: claim.Parse error %v, want accepted %v", tc.text, grammarErr, tc.verdict != "")
			continue
		}
		text, _ := json.Marshal(tc.text)
		list := string(text)
		if tc.same != "" {
			same, _ := json.Marshal(tc.same)
			list += ", " + string(same) // the same claim in ASCII, to compare margins
		}
		src := `{"domain": {"interval": ["0", "1"]}, "boundary": "dirichlet", "target": {"relative_width": "1e-4"}, "claims": [` + list + `]}`
		if _, err := problem.Parse([]byte(src)); (err == nil) != accepted {
			t.Errorf("%q: problem.Parse error %v, want accepted %v", tc.text, err, accepted)
		}
		fam := `{"template": {"domain": {"interval": ["0", "L"]}, "boundary": "dirichlet"}, "parameters": [{"name": "L", "values": ["1"]}], "claims": [` + string(text) + `]}`
		if _, err := sweep.ParseFamily([]byte(fam)); (err == nil) != accepted {
			t.Errorf("%q: sweep.ParseFamily error %v, want accepted %v", tc.text, err, accepted)
		}
		dir := t.TempDir()
		file := writeFile(t, dir, "p.json", src)
		wantCode := exitInvalid
		if accepted {
			wantCode = exitOK
		}
		if code, _, errs := execute("validate", file); code != wantCode || !accepted && !strings.Contains(errs, file+": claims[0]: ") {
			t.Errorf("%q: validate exit %d (%q), want %d", tc.text, code, errs, wantCode)
		}
		cert := filepath.Join(dir, "c.cert.json")
		code, _, errs := execute("certify", file, "-o", cert)
		if code != wantCode || !accepted && !strings.Contains(errs, file+": claims[0]: ") {
			t.Errorf("%q: certify exit %d (%q), want %d", tc.text, code, errs, wantCode)
			continue
		}
		if !accepted {
			continue
		}
		if code, _, errs := execute("check", cert); code != exitOK {
			t.Errorf("%q: check exit %d (%q)", tc.text, code, errs)
		}
		data, err := os.ReadFile(cert)
		if err != nil {
			t.Fatal(err)
		}
		c, err := certs.Unmarshal(data)
		if err != nil {
			t.Fatal(err)
		}
		r := c.Claims[0]
		if r.Text != tc.text || r.Verdict != tc.verdict {
			t.Errorf("%q: recorded %q %s (%s), want %s", tc.text, r.Text, r.Verdict, r.Reason, tc.verdict)
		}
		if tc.same != "" {
			if other := c.Claims[1]; other.Text != tc.same || other.Margin != r.Margin || other.Verdict != r.Verdict {
				t.Errorf("%q: %s, margin %v; %q: %s, margin %v", tc.text, r.Verdict, r.Margin, other.Text, other.Verdict, other.Margin)
			}
		}
	}
}
