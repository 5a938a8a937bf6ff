package problem

import (
	"errors"
	"strings"
	"testing"
)

// TestPointsAccepted reads points inside the closed domain, on its
// boundary and at exact irrational positions away from it, and checks the
// canonical form and that Parse(Canonical) keeps them.
func TestPointsAccepted(t *testing.T) {
	for _, tc := range []struct {
		name, file, canon string
	}{
		{"interval ends and inside",
			`{"domain": {"interval": ["0", "pi"]}, "boundary": "dirichlet", "points": [["0"], ["1/3"], ["pi/2"], ["pi"], [1.5]]}`,
			`"points":[["0"],["1/3"],["pi/2"],["pi"],["1.5"]]`},
		{"square vertex, edge and inside",
			`{"domain": {"polygon": [["0","0"],["1","0"],["1","1"],["0","1"]]}, "boundary": "dirichlet", "points": [["0","0"], ["1/2","0"], ["sqrt(2)/2","1/3"]]}`,
			`"points":[["0","0"],["0.5","0"],["sqrt(2)/2","1/3"]]`},
		{"non-convex polygon, point in the notch's hull but inside",
			`{"domain": {"polygon": [["0","0"],["2","0"],["2","2"],["1","1"],["0","2"]]}, "boundary": "dirichlet", "points": [["1","1/2"], ["1/2","3/2"]]}`,
			`"points":[["1","0.5"],["0.5","1.5"]]`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			p, err := Parse([]byte(tc.file))
			if err != nil {
				t.Fatal(err)
			}
			c := string(p.Canonical())
			if !strings.Contains(c, tc.canon) {
				t.Fatalf("canonical %s lacks %s", c, tc.canon)
			}
			q, err := Parse(p.Canonical())
			if err != nil {
				t.Fatal(err)
			}
			if string(q.Canonical()) != c {
				t.Fatalf("round trip changed the canonical text:\n%s\n%s", c, q.Canonical())
			}
		})
	}
}

// TestNoPointsKeepsCanonical checks that a problem without points has no
// "points" key in its canonical text (so the hashes of existing
// certificates stay valid).
func TestNoPointsKeepsCanonical(t *testing.T) {
	p, err := Parse([]byte(`{"domain": {"interval": ["0", "1"]}, "boundary": "dirichlet"}`))
	if err != nil {
		t.Fatal(err)
	}
	if strings.Contains(string(p.Canonical()), "points") {
		t.Fatalf("canonical text names points: %s", p.Canonical())
	}
}

// TestPointsRefused checks each defect of "points" is refused with its
// position and a hint.
func TestPointsRefused(t *testing.T) {
	const sq = `"domain": {"polygon": [["0","0"],["1","0"],["1","1"],["0","1"]]}, "boundary": "dirichlet"`
	const iv = `"domain": {"interval": ["0", "1"]}, "boundary": "dirichlet"`
	for _, tc := range []struct {
		name, file, want string
	}{
		{"not a list", `{` + iv + `, "points": "0.5"}`, "points: points must be a list"},
		{"wrong dimension", `{` + iv + `, "points": [["0.5", "0"]]}`, "points[0]: a point is a list of one number"},
		{"outside interval", `{` + iv + `, "points": [["0.5"], ["1.0001"]]}`, "points[1]: the point 1.0001 lies outside"},
		{"undecidable", `{"domain": {"interval": ["0", "pi"]}, "boundary": "dirichlet", "points": [["355/113"]]}`, "points[0]: the point 355/113 lies outside"},
		{"bad number", `{` + iv + `, "points": [["half"]]}`, "points[0][0]"},
		{"outside polygon", `{` + sq + `, "points": [["1/2", "-1/1000"]]}`, "points[0]: the point (0.5, -0.001) lies outside the polygon"},
		{"in the notch", `{"domain": {"polygon": [["0","0"],["2","0"],["2","2"],["1","1"],["0","2"]]}, "boundary": "dirichlet", "points": [["1","3/2"]]}`, "points[0]: the point (1, 1.5) lies outside"},
		{"irrational on a slanted edge", `{"domain": {"polygon": [["0","0"],["1","0"],["0","1"]]}, "boundary": "dirichlet", "points": [["1 - sqrt(2)/2", "sqrt(2)/2"]]}`, "points[0]: cannot decide whether the point"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Parse([]byte(tc.file))
			var perr *Error
			if !errors.As(err, &perr) {
				t.Fatalf("error %v, want *Error", err)
			}
			if len(perr.Issues) != 1 || !strings.HasPrefix(perr.Issues[0].String(), tc.want) || perr.Issues[0].Hint == "" {
				t.Fatalf("got %v, want one issue starting %q with a hint", err, tc.want)
			}
		})
	}
}
