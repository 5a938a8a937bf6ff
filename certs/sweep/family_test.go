package sweep

import (
	"errors"
	"math/big"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

const examples = "../../testdata/examples"

func readExample(t *testing.T, name string) []byte {
	t.Helper()
	data, err := os.ReadFile(filepath.Join(examples, name))
	if err != nil {
		t.Fatal(err)
	}
	return data
}

// TestExamplesExpand parses and expands every example family and checks
// the point count, the expansion order (first parameter slowest) and the
// exact values of sample points.
func TestExamplesExpand(t *testing.T) {
	for _, c := range []struct {
		file  string
		count int
		// probes: point index → parameter values as exact text
		probes map[int]map[string]string
		name   string // name of a probed point
	}{
		{"triangle_apex_family.json", 200, map[int]map[string]string{
			0:   {"a": "0.05", "b": "0.3"},
			13:  {"a": "0.1", "b": "0.6"},
			199: {"a": "1", "b": "1.2"},
		}, "triangle [a=0.1, b=0.6]"},
		{"robin_trapezoid_family.json", 11, map[int]map[string]string{
			0: {"alpha": "0"}, 3: {"alpha": "3"}, 10: {"alpha": "10"},
		}, "trapezoid (0,0) (4,0) (3,1) (1,1) [alpha=3]"},
		{"convex_potential_family.json", 11, map[int]map[string]string{
			0: {"c": "0"}, 1: {"c": "2"}, 10: {"c": "20"},
		}, "V = c x^2 [c=2]"},
	} {
		f, err := ParseFamily(readExample(t, c.file))
		if err != nil {
			t.Fatalf("%s: %v", c.file, err)
		}
		if len(f.Points) != c.count {
			t.Fatalf("%s: %d points, want %d", c.file, len(f.Points), c.count)
		}
		named := false
		for k, want := range c.probes {
			pt := f.Points[k]
			got := f.ParamText(pt)
			for name, v := range want {
				if got[name] != v {
					t.Errorf("%s point %d: %s = %s, want %s", c.file, k, name, got[name], v)
				}
				if pt.Problem.Params[name].Text != v {
					t.Errorf("%s point %d: the problem has %s = %s, want %s", c.file, k, name, pt.Problem.Params[name].Text, v)
				}
			}
			named = named || pt.Problem.Name == c.name
		}
		if !named {
			t.Errorf("%s: no probed point is named %q", c.file, c.name)
		}
		hashes := map[string]bool{}
		for i, pt := range f.Points {
			if pt.Index != i {
				t.Fatalf("%s: point %d has index %d", c.file, i, pt.Index)
			}
			hashes[pt.Problem.SHA256()] = true
		}
		if len(hashes) != c.count {
			t.Errorf("%s: %d distinct problems among %d points", c.file, len(hashes), c.count)
		}
	}
}

// TestFamilyClaimsAppended: the family's claims follow the template's.
func TestFamilyClaimsAppended(t *testing.T) {
	f, err := ParseFamily([]byte(`{"template": {"domain": {"interval": ["0", "L"]}, "boundary": "dirichlet", "claims": ["gap > 0"]},
		"parameters": [{"name": "L", "values": ["1", "2.5"]}], "claims": ["gap >= 3*pi^2/D^2"]}`))
	if err != nil {
		t.Fatal(err)
	}
	got := strings.Join(f.Points[1].Problem.Claims, " | ")
	if got != "gap > 0 | gap >= 3*pi^2/D^2" {
		t.Errorf("claims %q", got)
	}
	if r := f.Points[1].Problem.Interval[1].Rat; r == nil || r.Cmp(big.NewRat(5, 2)) != 0 {
		t.Errorf("right end %v, want exactly 5/2", r)
	}
}

// TestFamilyErrors: invalid family files are reported with the path of
// the defect.
func TestFamilyErrors(t *testing.T) {
	const tmpl = `"template": {"domain": {"interval": ["0", "L"]}, "boundary": "dirichlet"}`
	for _, c := range []struct {
		name, text, want string
	}{
		{"count 0", `{` + tmpl + `, "parameters": [{"name": "L", "range": {"lo": "1", "hi": "2", "count": 0}}]}`, "parameters[0].range.count: empty range: count is 0"},
		{"lo above hi", `{` + tmpl + `, "parameters": [{"name": "L", "range": {"lo": "3", "hi": "2", "count": 4}}]}`, "parameters[0].range: empty range: lo 3 is above hi 2"},
		{"count 1 of a wide range", `{` + tmpl + `, "parameters": [{"name": "L", "range": {"lo": "1", "hi": "2", "count": 1}}]}`, "count 1 needs lo = hi"},
		{"empty values", `{` + tmpl + `, "parameters": [{"name": "L", "values": []}]}`, "empty list of values"},
		{"repeated value", `{` + tmpl + `, "parameters": [{"name": "L", "values": ["1/2", "0.5"]}]}`, "value 0.5 is listed twice"},
		{"unknown parameter", `{"template": {"domain": {"interval": ["0", "L"]}, "potential": "k*x", "boundary": "dirichlet"}, "parameters": [{"name": "L", "values": ["1"]}]}`, "template.potential: point 0 (L=1): "},
		{"invalid point", `{` + tmpl + `, "parameters": [{"name": "L", "values": ["1", "-1"]}]}`, "template.domain.interval: point 1 (L=-1): reversed interval"},
		{"no parameters", `{` + tmpl + `, "parameters": []}`, "parameters: no parameters to sweep"},
		{"swept twice", `{` + tmpl + `, "parameters": [{"name": "L", "values": ["1"]}, {"name": "L", "values": ["2"]}]}`, `parameter "L" is swept twice`},
		{"fixed and swept", `{"template": {"domain": {"interval": ["0", "L"]}, "boundary": "dirichlet", "parameters": {"L": "1"}}, "parameters": [{"name": "L", "values": ["2"]}]}`, "also fixed in template.parameters"},
		{"range and values", `{` + tmpl + `, "parameters": [{"name": "L", "values": ["1"], "range": {"lo": "1", "hi": "1", "count": 1}}]}`, "both a range and a list of values"},
		{"float text", `{` + tmpl + `, "parameters": [{"name": "L", "values": ["0x10"]}]}`, "parameters[0].values[0]"},
		{"unknown key", `{` + tmpl + `, "parameters": [{"name": "L", "values": ["1"]}], "width": "0.1"}`, `width: unknown key "width"`},
		{"duplicate key", `{` + tmpl + `, "parameters": [{"name": "L", "values": ["1"], "name": "M"}]}`, `parameters[0].name: duplicate key "name"`},
		{"case variant at the top", `{` + tmpl + `, "Parameters": [{"name": "L", "values": ["1"]}]}`, `Parameters: unknown key "Parameters": keys are case-sensitive, the key here is "parameters"`},
		{"case variant in a parameter", `{` + tmpl + `, "parameters": [{"name": "L", "Values": ["1"]}]}`, `parameters[0].Values: unknown key "Values"`},
		{"case variant in a range", `{` + tmpl + `, "parameters": [{"name": "L", "range": {"lo": "1", "hi": "2", "COUNT": 3}}]}`, `parameters[0].range.COUNT: unknown key`},
		{"duplicate key in the template", `{"template": {"domain": {"interval": ["0", "L"]}, "boundary": "dirichlet", "boundary": "neumann"}, "parameters": [{"name": "L", "values": ["1"]}]}`, `template.boundary: duplicate key "boundary"`},
		{"case variant in the template", `{"template": {"domain": {"interval": ["0", "L"]}, "Boundary": "dirichlet"}, "parameters": [{"name": "L", "values": ["1"]}]}`, `template.Boundary: point 0 (L=1): unknown key "Boundary"`},
		{"trailing data", `{` + tmpl + `, "parameters": [{"name": "L", "values": ["1"]}]} {}`, "data after the top-level value"},
		{"missing template", `{"parameters": [{"name": "L", "values": ["1"]}]}`, "template: missing template"},
		{"huge value", `{` + tmpl + `, "parameters": [{"name": "L", "values": ["1e-5000"]}]}`, "too large or too finely divided"},
		{"bad width", `{` + tmpl + `, "parameters": [{"name": "L", "values": ["1"]}], "relative_width": "1"}`, "relative_width: must lie in (0, 1)"},
		{"ground state not a boolean", `{` + tmpl + `, "parameters": [{"name": "L", "values": ["1"]}], "ground_state": "yes"}`, "ground_state"},
		{"ground state case variant", `{` + tmpl + `, "parameters": [{"name": "L", "values": ["1"]}], "Ground_State": true}`, `unknown key "Ground_State"`},
		{"bad time limit", `{` + tmpl + `, "parameters": [{"name": "L", "values": ["1"]}], "time_limit": "soon"}`, "time_limit:"},
		{"family claim beyond the eigenvalues", `{` + tmpl + `, "parameters": [{"name": "L", "values": ["1"]}], "claims": ["gap > 0", "lambda5 >= 1"]}`, `claims[1]: point 0 (L=1): claim "lambda5 >= 1", column 1: lambda5 is not certified: the problem asks for 2 eigenvalues (hint: set "eigenvalues": 5 or more)`},
		{"family claim of a polygon quantity", `{` + tmpl + `, "parameters": [{"name": "L", "values": ["1", "2"]}], "claims": ["area > 0"]}`, `claims[0]: point 0 (L=1): claim "area > 0", column 1: area is defined for polygons only (hint: on an interval use D, its length)`},
		{"template claim without alpha", `{"template": {"domain": {"interval": ["0", "L"]}, "boundary": "dirichlet", "claims": ["gap > 0", "gap >= alpha"]}, "parameters": [{"name": "L", "values": ["1"]}], "claims": ["gap > 1"]}`, `template.claims[1]: point 0 (L=1): claim "gap >= alpha", column 8: alpha has no value: no side has a Robin condition (hint: `},
		{"shape_margin without the ground state", `{"template": {"domain": {"polygon": [["0", "0"], ["L", "0"], ["0", "1"]]}, "boundary": {"robin": "1"}, "claims": ["gap > 0"]}, "parameters": [{"name": "L", "values": ["1"]}], "claims": ["@robin_ground_state_not_log_concave"]}`, `claims[0]: claim "@robin_ground_state_not_log_concave" names shape_margin, which only results.ground_state provides (hint: set "ground_state": true)`},
		{"template shape_margin, ground state false", `{"template": {"domain": {"polygon": [["0", "0"], ["L", "0"], ["0", "1"]]}, "boundary": {"robin": "1"}, "claims": ["shape_margin > 0"]}, "parameters": [{"name": "L", "values": ["1"]}], "ground_state": false}`, `template.claims[0]: claim "shape_margin > 0" names shape_margin`},
		{"family claim grammar", `{` + tmpl + `, "parameters": [{"name": "L", "values": ["1"]}], "claims": ["gap = 1"]}`, `claims[0]: point 0 (L=1): claim "gap = 1", column 5: "=" is not a relation of a claim (hint: `},
	} {
		_, err := ParseFamily([]byte(c.text))
		var inv *InvalidError
		if !errors.As(err, &inv) {
			t.Errorf("%s: error %v, want an *InvalidError", c.name, err)
			continue
		}
		if !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: error\n%v\nlacks %q", c.name, err, c.want)
		}
	}
}

// TestFamilyGridLimit: a grid beyond MaxPoints is refused before it is
// expanded.
func TestFamilyGridLimit(t *testing.T) {
	_, err := ParseFamily([]byte(`{"template": {"domain": {"interval": ["0", "1"]}, "potential": "a*b*c*x", "boundary": "dirichlet"},
		"parameters": [{"name": "a", "range": {"lo": "0", "hi": "1", "count": 100}},
		               {"name": "b", "range": {"lo": "0", "hi": "1", "count": 100}},
		               {"name": "c", "range": {"lo": "0", "hi": "1", "count": 100}}]}`))
	if err == nil || !strings.Contains(err.Error(), "more than 100000 points") {
		t.Errorf("error %v", err)
	}
}

// TestFamilyShapeMarginWithGroundState: with "ground_state": true a claim
// naming shape_margin is accepted (the refusal in TestFamilyErrors is
// about the missing block only).
func TestFamilyShapeMarginWithGroundState(t *testing.T) {
	f, err := ParseFamily([]byte(`{"template": {"domain": {"polygon": [["0", "0"], ["L", "0"], ["0", "1"]]}, "boundary": {"robin": "1"}}, "parameters": [{"name": "L", "values": ["1", "2"]}], "claims": ["@robin_ground_state_not_log_concave", "shape_margin > -1"], "ground_state": true}`))
	if err != nil || len(f.Points) != 2 {
		t.Fatalf("%v", err)
	}
}
