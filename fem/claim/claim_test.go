package claim

import (
	"errors"
	"strings"
	"testing"

	"gapcert/interval"
)

// TestParseRelations: each relation, in its ASCII and Unicode spellings,
// is read as one of the four relations, and the sides are split around it.
func TestParseRelations(t *testing.T) {
	for _, tc := range []struct {
		text, rel, lhs, rhs string
	}{
		{"lambda2 >= 1", AtLeast, "lambda2", "1"},
		{"lambda2 ≥ 1", AtLeast, "lambda2", "1"},
		{"lambda2≥1", AtLeast, "lambda2", "1"},
		{"gap <= 2*pi", AtMost, "gap", "2*pi"},
		{"gap ≤ 2*pi", AtMost, "gap", "2*pi"},
		{"D^2*gap > 64*pi^2/9", Greater, "D^2*gap", "64*pi^2/9"},
		{"(lambda1) < (lambda2)", Less, "lambda1", "lambda2"},
	} {
		c, err := Parse(tc.text)
		if err != nil {
			t.Errorf("%q: %v", tc.text, err)
			continue
		}
		if c.Rel != tc.rel || c.LHS.String() != tc.lhs || c.RHS.String() != tc.rhs || c.Text != tc.text {
			t.Errorf("%q: %q %s %q (text %q), want %q %s %q", tc.text, c.LHS, c.Rel, c.RHS, c.Text, tc.lhs, tc.rel, tc.rhs)
		}
	}
}

func TestParseErrors(t *testing.T) {
	tests := []struct {
		text string
		col  int
		msg  string
	}{
		{"pi", 1, "no relation"},
		{"a > b > c", 7, "more than one relation"},
		{"a >= b <= c", 8, "more than one relation"},
		{"a ≥ b ≤ c", 9, "more than one relation"},
		{"(a > b)", 4, "inside parentheses"},
		{"a = b", 3, "not a relation"},
		{"a == b", 3, "not a relation"},
		{"a != b", 3, "not a relation"},
		{"a ≠ b", 3, "not a relation"},
		{"a => b", 3, "not a relation"},
		{"a =< b", 3, "not a relation"},
		{"a >== b", 5, "not a relation"},
		{" >= 1", 2, "missing expression"},
		{"a >= ", 5, "missing expression"},
		{"a ≥ ", 6, "missing expression"},
		{"a ⩾ b", 3, "not a relation"},
		{"a ⩽ b", 3, "not a relation"},
		{strings.Repeat("1+", MaxLen/2) + "1 > 0", 1, "too long"},
	}
	for _, tc := range tests {
		_, err := Parse(tc.text)
		var ce *Error
		if !errors.As(err, &ce) {
			t.Errorf("%q: err = %v, want *Error", tc.text, err)
			continue
		}
		if ce.Col != tc.col || !strings.Contains(ce.Msg, tc.msg) || ce.Hint == "" {
			t.Errorf("%q: col %d msg %q hint %q; want col %d msg containing %q and a hint", tc.text, ce.Col, ce.Msg, ce.Hint, tc.col, tc.msg)
		}
	}
}

// TestParseSideErrorColumns: a formula error in a side is reported at its
// column in the whole claim.
func TestParseSideErrorColumns(t *testing.T) {
	for _, tc := range []struct {
		text   string
		minCol int
	}{
		{"lambda1 >= 3*", 12},
		{"lambda1 >= (2", 12},
		{"lambda1 + * 2 > 0", 9},
	} {
		_, err := Parse(tc.text)
		var ce *Error
		if !errors.As(err, &ce) {
			t.Errorf("%q: err = %v, want *Error", tc.text, err)
			continue
		}
		if ce.Col < tc.minCol || ce.Col > len(tc.text)+1 {
			t.Errorf("%q: col %d, want in [%d, %d]", tc.text, ce.Col, tc.minCol, len(tc.text)+1)
		}
	}
}

// TestDecide: the four relations on enclosures that lie above, below and
// across 0 (and touch it).
func TestDecide(t *testing.T) {
	type verdict struct{ holds, fails bool }
	for _, tc := range []struct {
		rel  string
		d    interval.I
		want verdict
	}{
		{AtLeast, interval.New(0, 1), verdict{true, false}},
		{AtLeast, interval.New(-2, -1), verdict{false, true}},
		{AtLeast, interval.New(-1, 0), verdict{false, false}},
		{Greater, interval.New(0, 1), verdict{false, false}},
		{Greater, interval.New(-1, 0), verdict{false, true}},
		{Greater, interval.New(1, 2), verdict{true, false}},
		{AtMost, interval.New(-1, 0), verdict{true, false}},
		{AtMost, interval.New(0, 1), verdict{false, false}},
		{AtMost, interval.New(1, 2), verdict{false, true}},
		{Less, interval.New(-1, 0), verdict{false, false}},
		{Less, interval.New(0, 1), verdict{false, true}},
		{Less, interval.New(-2, -1), verdict{true, false}},
	} {
		c := &Claim{Rel: tc.rel}
		if h, f := c.Decide(tc.d); (verdict{h, f}) != tc.want {
			t.Errorf("%s on %v: holds %v fails %v, want %+v", tc.rel, tc.d, h, f, tc.want)
		}
	}
}

// TestCheckScope: each quantity is available exactly where it is defined;
// refusals name the quantity at its first column and carry a hint.
func TestCheckScope(t *testing.T) {
	square := Scope{Dim: 2, Vertices: 4, Eigenvalues: 2, NoAlpha: "no side has a Robin condition", Params: []string{"k"}}
	triangle := Scope{Dim: 2, Vertices: 3, Eigenvalues: 5}
	line := Scope{Dim: 1, Eigenvalues: 3, NoAlpha: "the Robin sides have different coefficients"}
	robinParam := Scope{Dim: 1, Eigenvalues: 2, NoAlpha: "no side has a Robin condition", Params: []string{"alpha"}}
	box := Scope{Dim: 3, Eigenvalues: 2, NoAlpha: "no side has a Robin condition"}
	for _, tc := range []struct {
		text  string
		scope Scope
		col   int    // 0: available
		msg   string // part of the message
	}{
		{"lambda2 - lambda1 >= k*pi^2/D^2 + gap*0", square, 0, ""},
		{"area + perimeter > pi + e", square, 0, ""},
		{"lambda3 > lambda2", square, 1, "lambda3 is not certified: the problem asks for 2 eigenvalues"},
		{"gap > lambda5 - lambda3", triangle, 0, ""},
		{"lambda6 > 0", triangle, 1, "asks for 5 eigenvalues"},
		{"12*inradius^2 <= 1", square, 4, "triangles only"},
		{"12*inradius^2 <= 1", triangle, 0, ""},
		{"inradius > 0", square, 1, "triangles only"},
		{"inradius > 0", box, 1, "tetrahedra only among domains of three coordinates"},
		{"inradius > 0", Scope{Dim: 3, Vertices: 4, Eigenvalues: 2}, 0, ""},
		{"inradius > 0", Scope{Dim: 3, Vertices: 8, Eigenvalues: 2}, 1, "tetrahedra only"},
		{"gap >= alpha", Scope{Dim: 3, Vertices: 8, Eigenvalues: 2, NoAlpha: "no face has a Robin condition"}, 8, "no face has a Robin condition"},
		{"alpha > 0", triangle, 0, ""},
		{"gap >= alpha", square, 8, "no side has a Robin condition"},
		{"gap >= alpha", line, 8, "different coefficients"},
		{"gap >= alpha", robinParam, 0, ""},
		{"area > 0", line, 1, "polygons only"},
		{"D >= perimeter", line, 6, "polygons only"},
		{"gap > k", line, 7, `unknown name "k"`},
		{"lambda0 > 0", square, 1, "unknown name"},
		{"lambda21 > 0", triangle, 1, "unknown name"},
		{"Lambda1 > 0", square, 1, "unknown name"},
		{"diameter > 0", square, 1, "unknown name"},
		{"robin_interval_gap > 0", square, 1, "unknown name"},
		{"robin_interval_gap > 0", Scope{Dim: 2, Vertices: 4, Eigenvalues: 2, Extra: []string{"robin_interval_gap"}}, 0, ""},
		{"shape_margin > 0", square, 0, ""},
		{"gap + shape_margin > 0", line, 7, "polygons only"},
		{"lambda4 + area > zeta", line, 1, "lambda4"}, // the first defect in the text
		{"volume*surface_area > D + gap", box, 0, ""},
		{"gap*D^2 > 0*area", box, 13, "polygons only"},
		{"volume > 0", square, 1, "three-dimensional domains only"},
		{"surface_area > 0", line, 1, "three-dimensional domains only"},
		{"shape_margin > 0", box, 1, "polygons only"},
	} {
		c, err := Parse(tc.text)
		if err != nil {
			t.Fatal(err)
		}
		err = c.CheckScope(tc.scope)
		if tc.col == 0 {
			if err != nil {
				t.Errorf("%q: %v", tc.text, err)
			}
			continue
		}
		var ce *Error
		if !errors.As(err, &ce) || ce.Col != tc.col || !strings.Contains(ce.Msg, tc.msg) || ce.Hint == "" {
			t.Errorf("%q: %v; want column %d, a message with %q and a hint", tc.text, err, tc.col, tc.msg)
		}
	}
}

func TestQuantities(t *testing.T) {
	q := Quantities()
	if len(q) != MaxEigenvalue+9 || q[0] != "lambda1" || q[MaxEigenvalue-1] != "lambda20" || !IsQuantity("inradius") || !IsQuantity("shape_margin") || !IsQuantity("volume") || !IsQuantity("surface_area") || IsQuantity("lambda21") || IsQuantity("pi") {
		t.Errorf("Quantities() = %v", q)
	}
}

// TestScopeThreeDimensions: volume and surface_area exist in three
// dimensions only, area and perimeter on polygons only.
func TestScopeThreeDimensions(t *testing.T) {
	solid := Scope{Dim: 3, Eigenvalues: 2, NoAlpha: "no side has a Robin condition"}
	plane := Scope{Dim: 2, Vertices: 4, Eigenvalues: 2, NoAlpha: "no side has a Robin condition"}
	for _, c := range []struct {
		scope Scope
		text  string
		want  string // "" when the claim is in scope
	}{
		{solid, "gap*D^2 >= 3*pi^2", ""},
		{solid, "lambda1*volume^(2/3) > surface_area/10", ""},
		{solid, "lambda1*area > 1", "area is defined for polygons only"},
		{plane, "lambda1*volume > 1", "volume is defined for three-dimensional domains only"},
		{plane, "surface_area > 1", "surface_area is defined for three-dimensional domains only"},
	} {
		cl, err := Parse(c.text)
		if err != nil {
			t.Fatal(err)
		}
		err = cl.CheckScope(c.scope)
		switch {
		case c.want == "" && err != nil:
			t.Errorf("%q: %v", c.text, err)
		case c.want != "" && (err == nil || !strings.Contains(err.Error(), c.want)):
			t.Errorf("%q: %v, want %q", c.text, err, c.want)
		}
	}
}

// TestScopeMessagesThreeDimensions: on a domain of three coordinates the
// refusals name its own quantities and pieces (volume, surface_area,
// faces), never the polygon's.
func TestScopeMessagesThreeDimensions(t *testing.T) {
	solid := Scope{Dim: 3, Vertices: 8, Eigenvalues: 2, NoAlpha: "no face has a Robin condition"}
	why, hint := solid.Unavailable(Inradius)
	if !strings.Contains(hint, "volume, surface_area") || strings.Contains(why+hint, "perimeter") {
		t.Errorf("inradius on a polyhedron: %q, hint %q", why, hint)
	}
	why, hint = solid.Unavailable(Alpha)
	if !strings.Contains(hint, "every Robin face") || strings.Contains(why+hint, "side") {
		t.Errorf("alpha on a polyhedron: %q, hint %q", why, hint)
	}
}
