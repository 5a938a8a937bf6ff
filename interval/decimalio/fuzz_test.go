package decimalio

import (
	"errors"
	"regexp"
	"strings"
	"testing"
)

// grammar is the accepted language written independently of the scanner.
var grammar = regexp.MustCompile(`^[+-]?([0-9]+(\.[0-9]*)?|\.[0-9]+)([eE][+-]?[0-9]+)?` +
	`(/([0-9]+(\.[0-9]*)?|\.[0-9]+)([eE][+-]?[0-9]+)?)?$`)

var exponentRE = regexp.MustCompile(`[eE][+-]?([0-9]+)`)

// grammarAccepts reports whether s must parse: it is in the grammar, no
// written exponent exceeds MaxExponent and the denominator is not zero.
func grammarAccepts(t *testing.T, s string) bool {
	if !grammar.MatchString(s) {
		return false
	}
	for _, m := range exponentRE.FindAllStringSubmatch(s, -1) {
		d := strings.TrimLeft(m[1], "0")
		if len(d) > 6 || len(d) == 6 && d > "100000" {
			return false
		}
	}
	if _, den, ok := strings.Cut(s, "/"); ok && refRat(t, den).Sign() == 0 {
		return false
	}
	return true
}

// FuzzParse checks that ParseRat never panics, accepts exactly the
// grammar, agrees with big.Rat.SetString (math/big) on the value, and that
// Parse returns the tightest enclosure of it.
func FuzzParse(f *testing.F) {
	for _, s := range []string{"0", "-0", "0.1", "1/3", "-2.5e-3", "+3.", ".5", "1e400", "1e-400",
		"4.9406564584124654e-324", "1.7976931348623158e308", "NaN", "0x1p3", "1_000", "1..2", "--1",
		"1/0", " 1", "1 ", "1e100001", "007/010", "1.5/2.5e-3", "−1"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		r, err := ParseRat(s)
		want := grammarAccepts(t, s)
		if err != nil {
			var se *SyntaxError
			if !errors.As(err, &se) || se.Col < 1 || se.Col > len(s)+1 || se.Msg == "" || se.Hint == "" {
				t.Fatalf("ParseRat(%q): malformed error %v", s, err)
			}
			if want {
				t.Fatalf("ParseRat(%q) rejected a number of the grammar: %v", s, err)
			}
			return
		}
		if !want {
			t.Fatalf("ParseRat(%q) = %s accepted text outside the grammar", s, r)
		}
		exact := refRat(t, s)
		if r.Cmp(exact) != 0 {
			t.Fatalf("ParseRat(%q) = %s, big.Rat.SetString gives %s", s, r, exact)
		}
		x, err := Parse(s)
		if err != nil {
			t.Fatalf("Parse(%q): %v after ParseRat succeeded", s, err)
		}
		checkTight(t, s, x, exact)
	})
}
