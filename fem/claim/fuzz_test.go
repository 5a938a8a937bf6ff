package claim

import (
	"errors"
	"slices"
	"testing"
)

// FuzzParse: Parse never panics; it returns a claim or an *Error with a
// column inside the text (or one past its end), and an accepted claim
// written back as "lhs REL rhs" from its parsed sides reads as the same
// relation.
func FuzzParse(f *testing.F) {
	for _, s := range []string{"lambda2 - lambda1 >= 3*pi^2/D^2", "gap ≥ 1", "a ≤ b", "(a) < (b)", "a > b > c", "a = b", "a ≠ b", "≥", "((a >", "a >== b"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, text string) {
		c, err := Parse(text)
		if err != nil {
			var ce *Error
			if !errors.As(err, &ce) || ce.Col < 1 || ce.Col > len(text)+1 {
				t.Fatalf("%q: %v", text, err)
			}
			return
		}
		if !slices.Contains([]string{AtLeast, AtMost, Greater, Less}, c.Rel) || c.Text != text {
			t.Fatalf("%q: relation %q, text %q", text, c.Rel, c.Text)
		}
		back, err := Parse("(" + c.LHS.String() + ") " + c.Rel + " (" + c.RHS.String() + ")")
		if err != nil || back.Rel != c.Rel {
			t.Fatalf("%q: written back: %v", text, err)
		}
	})
}
