package formula

import (
	"math"
	"testing"

	"gapcert/interval"
)

// TestSummands: the summands of top-level sums, differences and negations
// add up to the expression at sample points, and are the expected terms.
func TestSummands(t *testing.T) {
	for _, tc := range []struct {
		text string
		want []string
	}{
		{"x^2 + y^2 + z^2", []string{"x^2", "y^2", "z^2"}},
		{"x - (y - z)", []string{"x", "-y", "z"}},
		{"-(x + 2*y) + 3", []string{"-x", "-2*y", "3"}},
		{"-(-x)", []string{"x"}},
		{"x*y + sin(z)", []string{"x*y", "sin(z)"}},
		{"(x + y)*z", []string{"(x+y)*z"}},
		{"a*x - w", []string{"a*x", "-w"}},
	} {
		e, err := Parse(tc.text)
		if err != nil {
			t.Fatal(err)
		}
		s, neg := e.Summands()
		if len(s) != len(tc.want) {
			t.Errorf("%s: %d summands, want %v", tc.text, len(s), tc.want)
			continue
		}
		for i, w := range tc.want {
			got := s[i].String()
			if neg[i] {
				got = "-" + got
			}
			if got != w {
				t.Errorf("%s: summand %d is %s, want %s", tc.text, i, s[i], w)
			}
		}
		env := map[string]interval.I{"x": interval.Point(0.3), "y": interval.Point(-1.25), "z": interval.Point(2), "w": interval.Point(0.5), "a": interval.Point(3)}
		whole, _ := e.Eval(env)
		var sum interval.I
		for i, u := range s {
			v, err := u.Eval(env)
			if err != nil {
				t.Fatal(err)
			}
			if neg[i] {
				v = v.Neg()
			}
			sum = sum.Add(v)
		}
		if _, ok := whole.Intersection(sum); !ok || sum.Wid() > 1e-12*math.Max(1, math.Abs(whole.Mid())) {
			t.Errorf("%s: the summands add to %v, the expression is %v", tc.text, sum, whole)
		}
	}
}

// TestRename: variables are renamed all at once; constants and other names
// stay.
func TestRename(t *testing.T) {
	e, err := Parse("y^2 + sin(z) + a*x")
	if err != nil {
		t.Fatal(err)
	}
	got := e.Rename(map[string]string{"y": "x", "z": "y", "x": "z"}).String()
	if want := "x^2+sin(y)+a*z"; got != want {
		t.Errorf("Rename = %s, want %s", got, want)
	}
	if s := e.Rename(nil).String(); s != e.String() {
		t.Errorf("Rename(nil) = %s", s)
	}
}
