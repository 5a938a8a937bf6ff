package certify

import (
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"runtime"
	"strconv"
	"strings"
	"testing"
	"time"

	"gapcert/certs"
	"gapcert/fem/problem"
)

const checkProblem = `{"name":"check","domain":{"interval":["0","3/2"]},"potential":"x^2 - x","boundary":["dirichlet",{"robin":"1/2"}],"eigenvalues":2,"claims":["gap >= 3*pi^2/D^2"]}`

// fixedTime makes provenance deterministic in tests.
func fixedTime() time.Time { return time.Date(2026, 1, 2, 3, 4, 5, 0, time.UTC) }

func certifyBytes(t *testing.T, src string) []byte {
	t.Helper()
	p, err := problem.Parse([]byte(src))
	if err != nil {
		t.Fatal(err)
	}
	c, err := Certify(context.Background(), p, Options{RelWidth: "1e-9", Now: fixedTime, Tool: "gapcert test"})
	if err != nil {
		t.Fatal(err)
	}
	data, err := c.Marshal()
	if err != nil {
		t.Fatal(err)
	}
	return data
}

func TestCheckAcceptsFreshCertificate(t *testing.T) {
	if err := Check(certifyBytes(t, checkProblem)); err != nil {
		t.Fatalf("fresh certificate does not verify: %v", err)
	}
	// Without claims (an empty list read back must equal none computed).
	if err := Check(certifyBytes(t, `{"domain":{"interval":["0","1"]},"potential":"x","boundary":"dirichlet","eigenvalues":2}`)); err != nil {
		t.Fatalf("fresh claim-less certificate does not verify: %v", err)
	}
}

// TestCheckRejectsTampering edits a fresh certificate in several ways; each
// must be detected.
func TestCheckRejectsTampering(t *testing.T) {
	data := certifyBytes(t, checkProblem)
	c, err := certs.Unmarshal(data)
	if err != nil {
		t.Fatal(err)
	}
	lower := c.Results.Eigenvalues[0].Lower
	for _, tc := range []struct {
		name     string
		edit     func(string) string
		mismatch bool // a *MismatchError (else any error)
	}{
		{"edited bound", func(s string) string {
			return strings.Replace(s, `"lower": "`+lower+`"`, `"lower": "`+lower[:len(lower)-3]+`999"`, 1)
		}, true},
		{"edited gap", func(s string) string {
			return strings.Replace(s, c.Results.Gap.Upper, c.Results.Gap.Lower, 1)
		}, true},
		{"edited problem", func(s string) string { return strings.Replace(s, `"x^2-x"`, `"x^2-x+0.001"`, 1) }, true},
		{"edited hash", func(s string) string {
			return strings.Replace(s, c.ProblemSHA256, strings.Repeat("0", 64), 1)
		}, true},
		{"edited claim verdict", func(s string) string {
			other := certs.Holds
			if c.Claims[0].Verdict == certs.Holds {
				other = certs.Fails
			}
			return strings.Replace(s, `"verdict": "`+c.Claims[0].Verdict+`"`, `"verdict": "`+other+`"`, 1)
		}, true},
		{"changed format version", func(s string) string {
			return strings.Replace(s, certs.Format, "gapcert.certificate/v2", 1)
		}, false},
		{"edited method degree", func(s string) string { return strings.Replace(s, `"degree": 8`, `"degree": 9`, 1) }, true},
	} {
		edited := tc.edit(string(data))
		if edited == string(data) {
			t.Fatalf("%s: the edit changed nothing", tc.name)
		}
		err := Check([]byte(edited))
		var mm *MismatchError
		switch {
		case err == nil:
			t.Errorf("%s: tampered certificate verifies", tc.name)
		case tc.mismatch && !errors.As(err, &mm):
			t.Errorf("%s: want a mismatch report, got %v", tc.name, err)
		}
	}
}

// TestCertifyDeterministic: two runs give byte-identical certificates
// (with the time field fixed), also under GOMAXPROCS=1 and 2.
func TestCertifyDeterministic(t *testing.T) {
	first := certifyBytes(t, checkProblem)
	if again := certifyBytes(t, checkProblem); !bytes.Equal(first, again) {
		t.Error("two runs differ")
	}
	for _, procs := range []int{1, 2} {
		old := runtime.GOMAXPROCS(procs)
		got := certifyBytes(t, checkProblem)
		runtime.GOMAXPROCS(old)
		if !bytes.Equal(first, got) {
			t.Errorf("GOMAXPROCS=%d changes the certificate", procs)
		}
	}
}

// TestBudgetExhausted: a target that cannot be met in the budget gives a
// certificate with the widths reached and a warning; its bounds still
// contain the truth (Dirichlet on (0, 1): λ_k = k²π², common practice).
func TestBudgetExhausted(t *testing.T) {
	p, err := problem.Parse([]byte(`{"domain":{"interval":["0","1"]},"potential":"exp(sin(7*x))","boundary":"dirichlet","eigenvalues":2,"claims":["lambda1 > 0"]}`))
	if err != nil {
		t.Fatal(err)
	}
	c, err := Certify(context.Background(), p, Options{RelWidth: "1e-15", TimeLimit: time.Millisecond})
	if err != nil {
		t.Fatal(err)
	}
	if len(c.Warnings) == 0 || !strings.Contains(c.Warnings[len(c.Warnings)-1], "not reached") {
		t.Errorf("want a warning that the target was not reached, got %q", c.Warnings)
	}
	if c.Claims[0].Verdict != certs.Holds {
		t.Errorf("lambda1 > 0: %s", c.Claims[0].Verdict)
	}
	// exp(sin 7x) ∈ [1/e, e], so λ_k ∈ [k²π² + 1/e, k²π² + e] (min–max).
	for k := 1; k <= 2; k++ {
		got := eigenEnclosure(t, c, k)
		base := float64(k*k) * 9.869604401089358
		if got.Hi < base+0.36 || got.Lo > base+2.72 {
			t.Errorf("lambda%d enclosure %v outside [k²π² + 1/e, k²π² + e]", k, got)
		}
	}
}

// TestCheckRefusesHugeRecipe: a certificate whose method asks for a mesh
// beyond the memory budget is refused with the estimate, before anything
// is allocated.
func TestCheckRefusesHugeRecipe(t *testing.T) {
	// A cross of five unit squares: ten initial triangles, so nine
	// refinement levels mean about 2.6·10⁶ triangles and some 20 GiB.
	p, err := problem.Parse([]byte(`{"domain":{"polygon":[["1","0"],["2","0"],["2","1"],["3","1"],["3","2"],["2","2"],["2","3"],["1","3"],["1","2"],["0","2"],["0","1"],["1","1"]]},"boundary":"dirichlet","eigenvalues":2}`))
	if err != nil {
		t.Fatal(err)
	}
	c, err := Certify(context.Background(), p, Options{RelWidth: "0.5", Now: fixedTime})
	if err != nil {
		t.Fatal(err)
	}
	data, _ := c.Marshal()
	var m Method
	if err := json.Unmarshal(c.Method, &m); err != nil {
		t.Fatal(err)
	}
	edited := strings.Replace(string(data), fmt.Sprintf(`"stage_a_refinements": %d`, m.StageARefinements), `"stage_a_refinements": 9`, 1)
	err = Check([]byte(edited))
	var budget *BudgetError
	if !errors.As(err, &budget) || !strings.Contains(err.Error(), "GiB") {
		t.Errorf("want a refusal with a memory estimate, got %v", err)
	}
}

// widthText writes a float64 target as the exact text of its shortest
// decimal (what Options.RelWidth takes); 0 is "" (the problem's target).
func widthText(w float64) string {
	if w == 0 {
		return ""
	}
	return strconv.FormatFloat(w, 'g', -1, 64)
}
