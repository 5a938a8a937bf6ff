package certify

import (
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"strings"
	"sync"
	"testing"
	"time"

	"gapcert/certs"
	"gapcert/fem/problem"
)

// neumannCubeCertificate returns the certificate of the unit cube given
// as a polyhedron with Neumann faces (λ1 = 0, λ2 = π² three times;
// separation of variables, common practice) at the relative width 1e-3,
// which its first step reaches (P_3 on 96 tetrahedra, stage A on 768,
// N = 4), and its method. It is certified once for the tests of this file.
func neumannCubeCertificate(t *testing.T) ([]byte, Method) {
	t.Helper()
	neumannCube.once.Do(func() {
		p, err := problem.Parse([]byte(cubePolyhedron("neumann", "0")))
		if err != nil {
			neumannCube.err = err
			return
		}
		c, err := Certify(context.Background(), p, Options{RelWidth: "1e-3", TimeLimit: 20 * time.Minute, Now: fixedTime})
		if err != nil {
			neumannCube.err = err
			return
		}
		if neumannCube.data, neumannCube.err = c.Marshal(); neumannCube.err == nil {
			neumannCube.err = json.Unmarshal(c.Method, &neumannCube.method)
		}
	})
	if neumannCube.err != nil {
		t.Fatal(neumannCube.err)
	}
	data, m := neumannCube.data, neumannCube.method
	if m.Kind != KindPolyhedron || m.Degree != 3 || m.FluxDegree != 3 || m.Refinements != 1 || m.StageARefinements != 2 || m.N != 4 {
		t.Fatalf("the Neumann cube's recipe changed (kind %s, degree %d, flux degree %d, refinements %d, stage-A refinements %d, N %d): update the edits below",
			m.Kind, m.Degree, m.FluxDegree, m.Refinements, m.StageARefinements, m.N)
	}
	return data, m
}

var neumannCube struct {
	once   sync.Once
	data   []byte
	method Method
	err    error
}

// TestPolyhedronCheckAcceptsNeumannCube: the untampered certificate
// verifies.
func TestPolyhedronCheckAcceptsNeumannCube(t *testing.T) {
	data, _ := neumannCubeCertificate(t)
	if err := Check(data); err != nil {
		t.Fatalf("the untampered certificate does not verify: %v", err)
	}
}

// TestPolyhedronCheckReportsRecipeEdits: every edit of a polyhedron
// certificate's recipe (the inputs Check replays) or of its records (the
// sizes and stage bounds it recomputes) within range is reported as a
// mismatch, and the record edits name their field. The recipe edits are
// toward cheaper recipes, so that each recomputation is short.
func TestPolyhedronCheckReportsRecipeEdits(t *testing.T) {
	data, _ := neumannCubeCertificate(t)
	for _, c := range []struct {
		name  string
		edit  func(m *Method)
		field string // the path the mismatch must name ("" for any)
	}{
		{"degree 3 to 2", func(m *Method) { m.Degree = 2 }, "results.eigenvalues"},
		{"flux degree 3 to 2", func(m *Method) { m.FluxDegree = 2 }, "results.eigenvalues"},
		{"refinements 1 to 0", func(m *Method) { m.Refinements = 0 }, "results.eigenvalues"},
		{"stage-A refinements 2 to 1", func(m *Method) { m.StageARefinements = 1 }, "results.eigenvalues"},
		{"extra indices 3 to 1", func(m *Method) { m.ExtraIndices = 1 }, ""},
		{"gamma doubled", func(m *Method) { m.Gamma, m.FluxGamma = "6.5797367095947265625", "6.5797367095947265625" }, "results.eigenvalues"},
		{"flux gamma raised", func(m *Method) { m.FluxGamma = "100" }, "results.eigenvalues"},
	} {
		err := Check(editMethod(t, data, c.edit))
		var mm *MismatchError
		if !errors.As(err, &mm) {
			t.Errorf("%s: error %v, want a mismatch", c.name, err)
			continue
		}
		if c.field != "" && !strings.Contains(err.Error(), c.field) {
			t.Errorf("%s: the mismatch does not name %s:\n%v", c.name, c.field, err)
		}
	}
	// The records, all edited at once (one recomputation): each is named.
	records := []struct {
		name  string
		edit  func(m *Method)
		field string
	}{
		{"N 4 to 3", func(m *Method) { m.N = 3 }, "method.n"},
		{"tetrahedra recorded 97", func(m *Method) { m.Tetrahedra = 97 }, "method.tetrahedra"},
		{"stage-A tetrahedra recorded 767", func(m *Method) { m.StageATetrahedra = 767 }, "method.stage_a_tetrahedra"},
		{"flux unknowns recorded one more", func(m *Method) { m.FluxUnknowns++ }, "method.flux_unknowns"},
		{"stage-A space", func(m *Method) { m.StageASpace = "crouzeix-raviart" }, "method.stage_a_space"},
		{"projection constant", func(m *Method) { m.ProjectionConstant = "0.001" }, "method.projection_constant"},
		{"rho", func(m *Method) { m.Rho = "1e9" }, "method.rho"},
		{"a Ritz bound", func(m *Method) { m.Stages.RitzUpper[1].Bound = "1" }, "method.stages.ritz_upper[1].bound"},
		{"a projection bound", func(m *Method) { m.Stages.ProjectionLower[1].Bound = "1" }, "method.stages.projection_lower[1].bound"},
		{"a Lehmann-Goerisch bound", func(m *Method) { m.Stages.LehmannGoerisch[1].Bound = "1" }, "method.stages.lehmann_goerisch_lower[1].bound"},
		{"theorems", func(m *Method) { m.Theorems = theoremsPolygon }, "method.theorems[1]"},
	}
	err := Check(editMethod(t, data, func(m *Method) {
		for _, r := range records {
			r.edit(m)
		}
	}))
	var mm *MismatchError
	if !errors.As(err, &mm) {
		t.Fatalf("edited records: error %v, want a mismatch", err)
	}
	for _, r := range records {
		if !strings.Contains(err.Error(), r.field+" ") {
			t.Errorf("%s: the mismatch does not name %s:\n%v", r.name, r.field, err)
		}
	}
}

// TestPolyhedronCheckRefusesOutOfRangeRecipe: a polyhedron certificate
// whose recipe is out of range, or of another domain's kind, is a format
// error naming the field, returned before anything is computed.
func TestPolyhedronCheckRefusesOutOfRangeRecipe(t *testing.T) {
	data, _ := neumannCubeCertificate(t)
	for _, c := range []struct {
		edit func(m *Method)
		want string
	}{
		{func(m *Method) { m.Degree = 0 }, "method.degree 0 out of range"},
		{func(m *Method) { m.Degree = -3 }, "method.degree -3 out of range"},
		{func(m *Method) { m.Degree = maxPolyhedronDegree + 1 }, fmt.Sprintf("method.degree %d out of range (1 to %d on polyhedra)", maxPolyhedronDegree+1, maxPolyhedronDegree)},
		{func(m *Method) { m.FluxDegree = maxPolyhedronDegree + 1 }, fmt.Sprintf("method.flux_degree %d out of range (0 to %d on polyhedra)", maxPolyhedronDegree+1, maxPolyhedronDegree)},
		{func(m *Method) { m.FluxDegree = -1 }, "method.flux_degree -1 out of range"},
		{func(m *Method) { m.Refinements = -1 }, "method.refinements -1 out of range"},
		{func(m *Method) { m.Refinements = 8 }, "method.refinements 8 out of range (0 to 7 on polyhedra)"},
		{func(m *Method) { m.StageARefinements = -1 }, "method.stage_a_refinements -1 out of range"},
		{func(m *Method) { m.StageARefinements = 8 }, "method.stage_a_refinements 8 out of range (0 to 7 on polyhedra)"},
		{func(m *Method) { m.ExtraIndices = -1 }, "method.extra_indices -1 out of range"},
		{func(m *Method) { m.ExtraIndices = maxExtraIndices + 1 }, "method.extra_indices 65 out of range"},
		{func(m *Method) { m.TaylorOrder = 0 }, "method.taylor_order 0 out of range"},
		{func(m *Method) { m.TaylorOrder = 33 }, "method.taylor_order 33 out of range"},
		{func(m *Method) { m.WeightOrder = 0 }, "method.weight_taylor_order 0 out of range"},
		{func(m *Method) { m.WeightOrder = 33 }, "method.weight_taylor_order 33 out of range"},
		{func(m *Method) { m.GradedLevels = 1 }, "method.graded_levels"},
		{func(m *Method) { m.AdaptiveMarks = [][]int{{0}} }, "method.adaptive_marks"},
		{func(m *Method) { m.Gamma = "1e400" }, "method.gamma"},
		{func(m *Method) { m.Gamma = "0.1" }, "method.gamma"}, // not a float64 exactly
		{func(m *Method) { m.FluxGamma = "0" }, "method.flux_gamma"},
		{func(m *Method) { m.FluxGamma = "" }, "method.flux_gamma"},
		{func(m *Method) { m.Kind = KindPolygon }, "method.kind"},
		{func(m *Method) { m.Kind = KindInterval }, "method.kind"},
		{func(m *Method) { m.Kind = "tetrahedra" }, "method.kind"},
	} {
		edited := editMethod(t, data, c.edit)
		err := Check(edited)
		var fe *certs.FormatError
		if !errors.As(err, &fe) || !strings.Contains(err.Error(), c.want) {
			t.Errorf("error %v, want a format error naming %q", err, c.want)
		}
	}
}

// TestPolyhedronCheckRefusesRecomputationBeyondMemory: a recipe within
// the ranges whose recomputation would need more than the memory budget
// (the sizes of the spaces grow eightfold per level) is refused with the
// estimate, before anything is allocated or computed.
func TestPolyhedronCheckRefusesRecomputationBeyondMemory(t *testing.T) {
	data, _ := neumannCubeCertificate(t)
	for _, c := range []struct {
		name string
		edit func(m *Method)
	}{
		{"stage-A refinements 7", func(m *Method) { m.StageARefinements = maxPolyhedronRefine }},
		{"stage-A refinements 5", func(m *Method) { m.StageARefinements = 5 }},
		{"refinements 7", func(m *Method) { m.Refinements = maxPolyhedronRefine }},
		{"refinements 4", func(m *Method) { m.Refinements = 4 }},
		{"degree 8 on three levels", func(m *Method) { m.Degree, m.FluxDegree, m.Refinements = 8, 8, 3 }},
	} {
		err := Check(editMethod(t, data, c.edit))
		var budget *BudgetError
		if !errors.As(err, &budget) || budget.Need <= budget.Budget || !strings.Contains(err.Error(), "GiB") {
			t.Errorf("%s: error %v, want a refusal with the memory estimate", c.name, err)
		}
	}
}

// rehashed returns the certificate with its problem replaced by the
// canonical form of edited(problem text) and problem_sha256 set to that
// problem's hash, so that only the recomputation can tell the edit.
func rehashed(t *testing.T, data []byte, edited func(string) string) []byte {
	t.Helper()
	c, err := certs.Unmarshal(data)
	if err != nil {
		t.Fatal(err)
	}
	src := edited(string(c.Problem))
	if src == string(c.Problem) {
		t.Fatal("the edit changed nothing")
	}
	p, err := problem.Parse([]byte(src))
	if err != nil {
		t.Fatalf("the edited problem does not parse: %v", err)
	}
	c.Problem, c.ProblemSHA256 = json.RawMessage(p.Canonical()), p.SHA256()
	out, err := c.Marshal()
	if err != nil {
		t.Fatal(err)
	}
	return out
}

// TestPolyhedronCheckCatchesProblemEdits: an edit of the recorded
// polyhedron problem (a face's condition, the vertices) is caught by the
// hash, and, when the hash is recomputed to match, by the recomputation
// (the edited problem has other eigenvalues: one Dirichlet face makes
// λ1 = π²/4 · … > 0; the box 1 × 1 × 2 has λ2 = π²/4). A vertex edit that
// makes a face non-planar and a face listed inward (not the canonical
// form) are reported too.
func TestPolyhedronCheckCatchesProblemEdits(t *testing.T) {
	data, _ := neumannCubeCertificate(t)
	c, err := certs.Unmarshal(data)
	if err != nil {
		t.Fatal(err)
	}
	text := string(c.Problem)
	firstFace := func(s string) string {
		return strings.Replace(s, `"boundary": [
      "neumann"`, `"boundary": [
      "dirichlet"`, 1)
	}
	// The top face z = 1 holds vertices 4 to 7; moving all four to z = 2
	// keeps every face planar.
	taller := func(s string) string {
		for _, v := range []string{"0\",\n            \"0", "1\",\n            \"0", "1\",\n            \"1", "0\",\n            \"1"} {
			s = strings.Replace(s, v+"\",\n            \"1\"", v+"\",\n            \"2\"", 1)
		}
		return s
	}
	if firstFace(text) == text || taller(text) == text || strings.Count(taller(text), `"2"`) != 4 {
		t.Fatalf("the recorded problem's layout changed; update the edits:\n%s", text)
	}
	var mm *MismatchError
	for name, edit := range map[string]func(string) string{"a face's condition": firstFace, "the height": taller} {
		tampered := strings.Replace(string(data), text, edit(text), 1)
		if err := Check([]byte(tampered)); !errors.As(err, &mm) || !strings.Contains(err.Error(), "problem_sha256") {
			t.Errorf("%s edited: error %v, want a mismatch of problem_sha256", name, err)
		}
		if err := Check(rehashed(t, data, edit)); !errors.As(err, &mm) || !strings.Contains(err.Error(), "results.eigenvalues") {
			t.Errorf("%s edited and rehashed: error %v, want a mismatch of the results", name, err)
		}
	}
	// One vertex moved off its faces' planes: the recorded problem is
	// invalid, a format error at its path.
	moved := strings.Replace(text, "\"1\",\n            \"1\",\n            \"1\"", "\"1\",\n            \"1\",\n            \"3/2\"", 1)
	if moved == text {
		t.Fatal("no vertex (1, 1, 1) in the recorded problem")
	}
	var fe *certs.FormatError
	if err := Check([]byte(strings.Replace(string(data), text, moved, 1))); !errors.As(err, &fe) || !strings.Contains(err.Error(), "problem.domain.polyhedron") {
		t.Errorf("a vertex off its faces' planes: error %v, want a format error in problem.domain.polyhedron", err)
	}
	// Face 0 listed inward: the same polyhedron, but not the canonical form.
	inward := strings.Replace(text, "[\n          [\n            0,\n            3,\n            2,\n            1\n          ]", "[\n          [\n            0,\n            1,\n            2,\n            3\n          ]", 1)
	if inward == text {
		t.Fatal("no face [0, 3, 2, 1] in the recorded problem")
	}
	if err := Check([]byte(strings.Replace(string(data), text, inward, 1))); !errors.As(err, &mm) || !strings.Contains(err.Error(), "canonical form") {
		t.Errorf("a face listed inward: error %v, want a mismatch naming the canonical form", err)
	}
}
