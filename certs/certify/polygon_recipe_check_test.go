package certify

import (
	"context"
	"errors"
	"fmt"
	"strings"
	"testing"

	"gapcert/certs"
)

// trapezoidDN117Source is a trapezoid with a Dirichlet–Neumann corner of
// π − atan 2 ≈ 116.57° (exponent ≈ 0.772) and a Robin–Dirichlet corner of
// atan 2 (exponent ≈ 1.42): the driver grades toward both and chooses its
// steps by gain per second (chooseStep).
const trapezoidDN117Source = `{"domain":{"polygon":[["0","0"],["3/2","0"],["1","1"],["0","1"]]},"potential":"x*y","boundary":[{"robin":"1"},"dirichlet","neumann","dirichlet"],"eigenvalues":2}`

// TestCheckReplaysDrivenPolygonRecipe: a certificate that the polygon
// driver produced on a polygon with singular corners (graded levels > 0;
// at this target the hp line keeps degree 4, and the degree edit goes to
// 2, a degree the driver never records but Check accepts) verifies, and Check finds every edit of its graded
// levels, degree and stage-A levels: a recipe within the caps recomputes
// to other bounds (a mismatch), and one past them (degree 11, graded 25,
// a flux degree above degree cap − 1, which the driver never records) is
// refused before any computation as a format error that names the field.
func TestCheckReplaysDrivenPolygonRecipe(t *testing.T) {
	p := parseProblem(t, trapezoidDN117Source)
	c, err := Certify(context.Background(), p, Options{RelWidth: "1e-5", Now: fixedTime, Tool: "gapcert test"})
	if err != nil {
		t.Fatal(err)
	}
	data, err := c.Marshal()
	if err != nil {
		t.Fatal(err)
	}
	m := methodOf(t, c)
	if m.GradedLevels == 0 || m.Degree < 3 {
		t.Fatalf("the driver recorded graded_levels %d and degree %d; the test needs a graded step of degree 3 or more", m.GradedLevels, m.Degree)
	}
	if err := Check(data); err != nil {
		t.Fatalf("the driven certificate does not verify: %v", err)
	}
	for _, e := range []struct {
		name string
		edit func(m *Method)
	}{
		{"graded_levels − 2", func(m *Method) { m.GradedLevels -= 2 }},
		{"graded_levels + 2", func(m *Method) { m.GradedLevels += 2 }},
		{"degree − 2", func(m *Method) { m.Degree, m.FluxDegree = m.Degree-2, m.FluxDegree-2 }},
		{"stage_a_refinements − 1", func(m *Method) { m.StageARefinements-- }},
	} {
		err := Check(editMethod(t, data, e.edit))
		var fe *certs.FormatError
		if err == nil || errors.As(err, &fe) {
			t.Errorf("%s: %v, want a mismatch of the recomputed bounds", e.name, err)
		}
	}
	for _, e := range []struct {
		name, want string
		edit       func(m *Method)
	}{
		{"degree 11", "method.degree 11 out of range", func(m *Method) { m.Degree, m.FluxDegree = 11, 10 }},
		{"graded_levels 25", "method.graded_levels 25 out of range", func(m *Method) { m.GradedLevels = 25 }},
		{"graded_levels −1", "method.graded_levels -1 out of range", func(m *Method) { m.GradedLevels = -1 }},
		{fmt.Sprintf("flux_degree %d", maxPolygonDegree), fmt.Sprintf("method.flux_degree %d out of range", maxPolygonDegree),
			func(m *Method) { m.FluxDegree = maxPolygonDegree }},
		{"flux_degree 16", "method.flux_degree 16 out of range", func(m *Method) { m.FluxDegree = 16 }},
	} {
		err := Check(editMethod(t, data, e.edit))
		var fe *certs.FormatError
		if !errors.As(err, &fe) || !strings.Contains(err.Error(), e.want) {
			t.Errorf("%s: %v, want a format error saying %q", e.name, err, e.want)
		}
	}
}
