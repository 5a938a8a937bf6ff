package certify

import (
	"errors"
	"strings"
	"testing"

	"gapcert/certs"
	"gapcert/certs/tampertest"
	"gapcert/fem/problem"
)

// TestCheckRefusesTamperedKeys: a certificate that JSON readers read
// differently (a key given twice with the false value first or last, a
// key in another case, two problem objects, keys the format does not
// define in method and in an embedded reference certificate) is refused
// by Check as a *certs.FormatError with the path of the defect, before
// anything is recomputed; the untampered certificate verifies. Each
// variant's Seen field (package tampertest) states what a reader that
// matches keys exactly and keeps the last of two equal keys (Python's json
// module) would take from the file.
func TestCheckRefusesTamperedKeys(t *testing.T) {
	data, c := certifyClaims(t, robinRectangle, 1e-2)
	ref := -1
	for i, r := range c.Claims {
		if r.Reference != nil {
			ref = i
		}
	}
	if ref < 0 {
		t.Fatal("the fixture has no embedded reference certificate")
	}
	requireVerifies(t, "untampered", data)
	extra := []tampertest.Variant{
		{Name: "case variant in the problem", Path: "problem.Boundary",
			Seen: "a problem without \"boundary\" and with an unknown \"Boundary\"",
			Edit: func(c []byte) []byte { return []byte(strings.Replace(string(c), `"boundary":`, `"Boundary":`, 1)) }},
	}
	for _, v := range append(tampertest.Variants(ref), extra...) {
		t.Run(v.Name, func(t *testing.T) {
			edited := v.Edit(data)
			if edited == nil {
				t.Fatal("the variant does not apply to the fixture")
			}
			err := Check(edited)
			var fe *certs.FormatError
			if !errors.As(err, &fe) {
				t.Fatalf("error %v, want a *certs.FormatError (a Python reader sees %s)", err, v.Seen)
			}
			if fe.Path != v.Path {
				t.Errorf("error %q at path %q, want %q", err, fe.Path, v.Path)
			}
		})
	}
}

// TestCheckComparesEveryField: an edit of any recorded field of the
// results, the claims or the method that the file format accepts is
// reported as a mismatch naming the field.
func TestCheckComparesEveryField(t *testing.T) {
	data := certifyBytes(t, checkProblem)
	c, err := certs.Unmarshal(data)
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		name, old, new, path string
	}{
		{"relative width", `"lambda1": "`, `"lambda1": "9`, "results.relative_widths.lambda1"},
		{"diameter", `"upper": "` + c.Results.Diameter.Upper + `"`, `"upper": "2"`, "results.diameter.upper"},
		{"claim margin", `"lower": "` + c.Claims[0].Margin.Lower + `"`, `"lower": "-1e9"`, "claims[0].margin.lower"},
		{"claim reason", `"verdict": "` + c.Claims[0].Verdict + `",`, `"verdict": "` + c.Claims[0].Verdict + `", "reason": "x",`, "claims[0].reason"},
		{"method rho", `"rho": "`, `"rho": "1`, "method.rho"},
		{"method theorem", `"theorems": [`, `"theorems": ["an extra theorem", `, "method.theorems"},
		{"method stage bound", `"ritz_upper": [
        {
          "index": 1,
          "bound": "`, `"ritz_upper": [
        {
          "index": 1,
          "bound": "9`, "method.stages.ritz_upper[0].bound"},
	} {
		edited := strings.Replace(string(data), tc.old, tc.new, 1)
		if edited == string(data) {
			t.Fatalf("%s: the edit changed nothing", tc.name)
		}
		err := Check([]byte(edited))
		var mm *MismatchError
		if !errors.As(err, &mm) {
			t.Errorf("%s: error %v, want a *MismatchError", tc.name, err)
			continue
		}
		if !strings.Contains(err.Error(), tc.path) {
			t.Errorf("%s: the mismatch does not name %s:\n%v", tc.name, tc.path, err)
		}
	}
}

// TestCheckDemandsRecomputedWarnings: the warnings the recomputation gives
// (here: stage B skipped on a two-triangle stage-A mesh of the unit
// square, see TestNoSeparationFallsBackToStageA) must be in the
// certificate; one dropped or reworded is a mismatch, one added is not
// (refinement warnings depend on the budget of the run).
func TestCheckDemandsRecomputedWarnings(t *testing.T) {
	p, err := problem.Parse([]byte(`{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},"boundary":"dirichlet","eigenvalues":2}`))
	if err != nil {
		t.Fatal(err)
	}
	r, err := initialRecipe(p)
	if err != nil {
		t.Fatal(err)
	}
	r.stageARefine = 1
	out, err := compute(p, r)
	if err != nil {
		t.Fatal(err)
	}
	res, err := assemble(p, r, out)
	if err != nil {
		t.Fatal(err)
	}
	recordStep(t, res, "1e-6")
	c, err := res.certificate(p, Options{Now: fixedTime})
	if err != nil {
		t.Fatal(err)
	}
	if len(c.Warnings) != 1 || !strings.HasPrefix(c.Warnings[0], "stage B skipped") {
		t.Fatalf("warnings %q", c.Warnings)
	}
	note := c.Warnings[0]
	for _, tc := range []struct {
		name     string
		warnings []string
		ok       bool
	}{
		{"as computed", []string{note}, true},
		{"one added", []string{note, "target relative width 1e-09 not reached within the budget"}, true},
		{"dropped", nil, false},
		{"reworded", []string{"stage B ran"}, false},
	} {
		c.Warnings = tc.warnings
		data, err := c.Marshal()
		if err != nil {
			t.Fatal(err)
		}
		err = Check(data)
		var mm *MismatchError
		switch {
		case tc.ok && err != nil:
			t.Errorf("%s: %v", tc.name, err)
		case !tc.ok && (!errors.As(err, &mm) || !strings.Contains(err.Error(), "warnings lack \"stage B skipped")):
			t.Errorf("%s: error %v, want a mismatch naming the warning", tc.name, err)
		}
	}
}

// TestCheckProblemCanonical: the recorded problem must be the canonical
// form of what it parses to, compared as JSON values: re-indented, with
// keys reordered or non-ASCII text escaped (as some JSON tools write it)
// it verifies; with a number rewritten in another exact form ("1/2" for
// "0.5": the same problem, the same hash) it is a mismatch naming the
// field.
func TestCheckProblemCanonical(t *testing.T) {
	data := certifyBytes(t, `{"name":"Übung","domain":{"interval":["0","3/2"]},"potential":"x^2 - x","boundary":["dirichlet",{"robin":"0.5"}],"eigenvalues":2}`)
	c, err := certs.Unmarshal(data)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(c.Problem), `"0.5"`) || !strings.Contains(string(c.Problem), `"Übung"`) {
		t.Fatalf("the fixture's problem is %s", c.Problem)
	}
	for _, tc := range []struct {
		name, old, new string
		ok             bool
	}{
		{"escaped name", `"Übung"`, `"\u00dcbung"`, true},
		{"keys reordered", `"name": "Übung",`, ``, true}, // moved below
		{"other exact form", `"0.5"`, `"1/2"`, false},
	} {
		edited := strings.Replace(string(data), tc.old, tc.new, 1)
		if tc.name == "keys reordered" {
			edited = strings.Replace(edited, `"problem": {`, `"problem": {"name": "Übung",`, 1)
		}
		if edited == string(data) {
			t.Fatalf("%s: the edit changed nothing", tc.name)
		}
		err := Check([]byte(edited))
		var mm *MismatchError
		switch {
		case tc.ok && err != nil:
			t.Errorf("%s: %v", tc.name, err)
		case !tc.ok && (!errors.As(err, &mm) || !strings.Contains(err.Error(), "canonical form: problem.boundary[1].robin is \"1/2\", canonical \"0.5\"")):
			t.Errorf("%s: error %v, want a mismatch naming problem.boundary[1].robin", tc.name, err)
		}
	}
}
