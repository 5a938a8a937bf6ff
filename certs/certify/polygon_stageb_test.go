package certify

import (
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"

	"gapcert/certs"
	"gapcert/fem/problem"
	"gapcert/interval"
)

// TestCheckPolygonStageB: a polygon certificate whose lower bounds come
// from stage B verifies, and edits of the stage-B recipe (flux degree,
// weight order, ρ̂, a Lehmann–Goerisch bound) are detected.
func TestCheckPolygonStageB(t *testing.T) {
	src := `{"domain":{"polygon":[["0","0"],["3/2","0"],["1","1"],["0","1"]]},"potential":"x*y","boundary":[{"robin":"1"},"dirichlet","neumann","dirichlet"],"eigenvalues":2}`
	p, err := problem.Parse([]byte(src))
	if err != nil {
		t.Fatal(err)
	}
	c, err := Certify(context.Background(), p, Options{RelWidth: "1e-4", TimeLimit: ampleLimit, Now: fixedTime})
	if err != nil {
		t.Fatal(err)
	}
	data, err := c.Marshal()
	if err != nil {
		t.Fatal(err)
	}
	if !usedStageB(t, c) {
		t.Fatal("the certificate has no stage-B bounds")
	}
	if err := Check(data); err != nil {
		t.Fatalf("fresh polygon certificate does not verify: %v", err)
	}
	m := methodOf(t, c)
	lg := m.Stages.LehmannGoerisch[0].Bound
	for _, tc := range []struct{ name, old, new string }{
		{"flux degree", fmt.Sprintf(`"flux_degree": %d`, m.FluxDegree), fmt.Sprintf(`"flux_degree": %d`, m.FluxDegree-1)},
		{"weight order", fmt.Sprintf(`"weight_taylor_order": %d`, m.WeightOrder), fmt.Sprintf(`"weight_taylor_order": %d`, m.WeightOrder-2)},
		{"rho", `"rho": "` + m.Rho + `"`, `"rho": "` + m.Rho + `1"`},
		{"stage-B bound", `"bound": "` + lg + `"`, `"bound": "` + lg[:len(lg)-2] + `99"`},
	} {
		edited := strings.Replace(string(data), tc.old, tc.new, 1)
		if edited == string(data) {
			t.Fatalf("%s: the edit changed nothing", tc.name)
		}
		err := Check([]byte(edited))
		var mm *MismatchError
		if !errors.As(err, &mm) {
			t.Errorf("%s: want a mismatch report, got %v", tc.name, err)
		}
	}
}

func methodOf(t *testing.T, c *certs.Certificate) Method {
	t.Helper()
	var m Method
	if err := json.Unmarshal(c.Method, &m); err != nil {
		t.Fatal(err)
	}
	return m
}

// TestNoSeparationFallsBackToStageA: with a stage-A mesh too coarse for any
// ρ̂ to separate (the square's two triangles refined once),
// stage B must not run, the outcome says so, and the bounds are the
// stage-A ones, still containing the truth (2π², 5π²; common practice). A
// stage-A space smaller than the eigenvalues asked for is an error.
func TestNoSeparationFallsBackToStageA(t *testing.T) {
	p, err := problem.Parse([]byte(`{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},"boundary":"dirichlet","eigenvalues":2}`))
	if err != nil {
		t.Fatal(err)
	}
	r, err := initialRecipe(p)
	if err != nil {
		t.Fatal(err)
	}
	r.stageARefine = 0
	if _, err := compute(p, r); err == nil || !strings.Contains(err.Error(), "too small") {
		t.Errorf("a stage-A space of one unknown: want an error, got %v", err)
	}
	r.stageARefine = 1
	out, err := compute(p, r)
	if err != nil {
		t.Fatal(err)
	}
	if out.n != 0 || out.lg != nil {
		t.Fatalf("stage B ran with N = %d, ρ̂ = %g from a two-triangle stage A (stage A %v, Ritz %v)", out.n, out.rho, out.stageA, out.ritz)
	}
	if len(out.notes) == 0 || !strings.Contains(out.notes[0], "stage B skipped") {
		t.Errorf("notes %q do not say that stage B was skipped", out.notes)
	}
	res, err := assemble(p, r, out)
	if err != nil {
		t.Fatal(err)
	}
	for k, m := range []float64{2, 5} {
		truth := m * math.Pi * math.Pi
		if l := res.lambda[k]; l.Lo > truth || l.Hi < truth || l.Lo != interval.SubDown(out.stageA[k], r.gamma) {
			t.Errorf("lambda%d = %v: not the stage-A enclosure of %g", k+1, l, truth)
		}
	}
}

// TestCheckSeparateStageBShift: with V = x² + y² on (−1, 1)² stage B uses
// its own shift γ_B > γ (V + γ_B ≥ 2 osc V); the certificate records it,
// verifies, and edits of it are caught (a γ_B below γ is refused). The
// bounds contain the separable values μ_i + μ_j of the 1D certifier
// (common practice), as in TestSeparablePotential.
func TestCheckSeparateStageBShift(t *testing.T) {
	_, c1 := certifyText(t, `{"domain":{"interval":["-1","1"]},"potential":"x^2","boundary":"dirichlet","eigenvalues":2}`, 1e-12)
	mu1, mu2 := eigenEnclosure(t, c1, 1), eigenEnclosure(t, c1, 2)
	p, err := problem.Parse([]byte(`{"domain":{"polygon":[["-1","-1"],["1","-1"],["1","1"],["-1","1"]]},"potential":"x^2 + y^2","boundary":"dirichlet","eigenvalues":2}`))
	if err != nil {
		t.Fatal(err)
	}
	c, err := Certify(context.Background(), p, Options{RelWidth: "1e-5", TimeLimit: ampleLimit, Now: fixedTime})
	if err != nil {
		t.Fatal(err)
	}
	m := methodOf(t, c)
	if m.FluxGamma == m.Gamma || !usedStageB(t, c) {
		t.Fatalf("want stage B with its own shift: gamma %s, flux_gamma %s, stage B %v", m.Gamma, m.FluxGamma, usedStageB(t, c))
	}
	for k, truth := range []interval.I{mu1.Add(mu1), mu1.Add(mu2)} {
		requireEnclosure(t, fmt.Sprintf("lambda%d", k+1), eigenEnclosure(t, c, k+1), truth, 1, 1e-5)
	}
	data, err := c.Marshal()
	if err != nil {
		t.Fatal(err)
	}
	if err := Check(data); err != nil {
		t.Fatalf("fresh certificate does not verify: %v", err)
	}
	edited := strings.Replace(string(data), `"flux_gamma": "`+m.FluxGamma+`"`, `"flux_gamma": "`+m.FluxGamma+`5"`, 1)
	var mm *MismatchError
	if err := Check([]byte(edited)); !errors.As(err, &mm) {
		t.Errorf("edited flux_gamma: want a mismatch report, got %v", err)
	}
	below := strings.Replace(string(data), `"flux_gamma": "`+m.FluxGamma+`"`, `"flux_gamma": "0.5"`, 1)
	if err := Check([]byte(below)); err == nil || !strings.Contains(err.Error(), "flux_gamma") {
		t.Errorf("flux_gamma below gamma: want a refusal, got %v", err)
	}
}

// TestDorflerMarks: the fewest largest indicators holding half the total,
// in index order (common practice: Dörfler marking).
func TestDorflerMarks(t *testing.T) {
	got := dorflerMarks([]float64{1, 5, 0, 3, 1}, 0.5)
	if fmt.Sprint(got) != "[1]" { // 5 ≥ 0.5·10
		t.Errorf("marks %v", got)
	}
	got = dorflerMarks([]float64{1, 4, 0, 3, 2}, 0.5)
	if fmt.Sprint(got) != "[1 3]" { // 4 < 5 ≤ 4 + 3
		t.Errorf("marks %v", got)
	}
}

// TestCheckAdaptiveMarks: a certificate whose trial mesh has an adaptive
// round (Dörfler marks from the indicators of a first computation, on a
// trapezoid with a Dirichlet–Neumann corner of about 117°) verifies; an
// edited mark is caught and a mark outside the mesh is an error. Its
// bounds contain those of a finer uniform computation's enclosure (both
// are verified, so they must intersect).
func TestCheckAdaptiveMarks(t *testing.T) {
	p, err := problem.Parse([]byte(`{"domain":{"polygon":[["0","0"],["3/2","0"],["1","1"],["0","1"]]},"potential":"x*y","boundary":[{"robin":"1"},"dirichlet","neumann","dirichlet"],"eigenvalues":2}`))
	if err != nil {
		t.Fatal(err)
	}
	r, err := initialRecipe(p)
	if err != nil {
		t.Fatal(err)
	}
	r.graded, r.degree, r.fluxDegree = 4, 5, 4
	first, err := compute(p, r)
	if err != nil || first.polygon.indicators == nil {
		t.Fatalf("first computation: %v (indicators %v)", err, first.polygon.indicators != nil)
	}
	r.marks = [][]int{dorflerMarks(first.polygon.indicators, adaptiveTheta)}
	out, err := compute(p, r)
	if err != nil {
		t.Fatal(err)
	}
	if out.polygon.triangles <= first.polygon.triangles {
		t.Fatalf("the adaptive round did not refine: %d → %d triangles", first.polygon.triangles, out.polygon.triangles)
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
	data, err := c.Marshal()
	if err != nil {
		t.Fatal(err)
	}
	if err := Check(data); err != nil {
		t.Fatalf("certificate with adaptive marks does not verify: %v", err)
	}
	m := methodOf(t, c)
	if len(m.AdaptiveMarks) != 1 || len(m.AdaptiveMarks[0]) == 0 {
		t.Fatalf("recorded marks %v", m.AdaptiveMarks)
	}
	var doc map[string]any
	if err := json.Unmarshal(data, &doc); err != nil {
		t.Fatal(err)
	}
	method := doc["method"].(map[string]any)
	marks := method["adaptive_marks"].([]any)[0].([]any)
	first0 := marks[0].(float64)
	marks[0] = first0 + 1
	if first0+1 == marks[len(marks)-1].(float64) || len(marks) == 1 {
		marks[0] = first0 + 2
	}
	edited, _ := json.Marshal(doc)
	var mm *MismatchError
	if err := Check(edited); err == nil || (!errors.As(err, &mm) && !strings.Contains(err.Error(), "adaptive")) {
		t.Errorf("edited mark: want a mismatch, got %v", err)
	}
	marks[0] = 1e6
	edited, _ = json.Marshal(doc)
	if err := Check(edited); err == nil || !strings.Contains(err.Error(), "adaptive round") {
		t.Errorf("mark outside the mesh: want an error naming the adaptive round, got %v", err)
	}
	// A uniform computation's enclosures must meet these.
	_, cu := certifyText(t, `{"domain":{"polygon":[["0","0"],["3/2","0"],["1","1"],["0","1"]]},"potential":"x*y","boundary":[{"robin":"1"},"dirichlet","neumann","dirichlet"],"eigenvalues":2}`, 1e-4)
	for k := 1; k <= 2; k++ {
		a, b := eigenEnclosure(t, c, k), eigenEnclosure(t, cu, k)
		if a.Lo > b.Hi || b.Lo > a.Hi {
			t.Errorf("lambda%d: adaptive %v and uniform %v are disjoint", k, a, b)
		}
	}
}
