package decimalio

import (
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"strconv"
	"strings"
	"testing"

	"gapcert/interval"
)

func TestParseRatValues(t *testing.T) {
	// Exact values by hand arithmetic (common practice of decimal notation).
	tests := []struct {
		in       string
		num, den int64
		exp10    int // value = num/den · 10^exp10
	}{
		{"0", 0, 1, 0},
		{"-0", 0, 1, 0},
		{"7", 7, 1, 0},
		{"+3.", 3, 1, 0},
		{".5", 1, 2, 0},
		{"0.1", 1, 10, 0},
		{"-2.5e-3", -25, 10, -3},
		{"1/3", 1, 3, 0},
		{"-1/3", -1, 3, 0},
		{"1.5/2.5", 3, 5, 0},
		{"1e3/7", 1000, 7, 0},
		{"007.50", 15, 2, 0},
		{"1E+2", 100, 1, 0},
		{"1e400", 1, 1, 400},
		{"1e-400", 1, 1, -400},
		{"6/0.3e1", 2, 1, 0},
		{"1e100000", 1, 1, 100000},
	}
	for _, tt := range tests {
		got, err := ParseRat(tt.in)
		if err != nil {
			t.Errorf("ParseRat(%q): %v", tt.in, err)
			continue
		}
		want := big.NewRat(tt.num, tt.den)
		p := new(big.Rat).SetInt(new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(abs(tt.exp10))), nil))
		if tt.exp10 >= 0 {
			want.Mul(want, p)
		} else {
			want.Quo(want, p)
		}
		if got.Cmp(want) != 0 {
			t.Errorf("ParseRat(%q) = %s, want %s", tt.in, got, want)
		}
	}
}

func abs(n int) int {
	if n < 0 {
		return -n
	}
	return n
}

func TestParseRatErrors(t *testing.T) {
	tests := []struct {
		in  string
		col int
		msg string // substring of Msg
	}{
		{"", 1, "empty"},
		{"NaN", 1, "not a finite number"},
		{"Inf", 1, "not a finite number"},
		{"-Infinity", 2, "not a finite number"},
		{"0x1p3", 2, "hexadecimal"},
		{"1_000", 2, "digit separators"},
		{"1..2", 3, "second decimal point"},
		{"--1", 2, "repeated sign"},
		{"+-1", 2, "repeated sign"},
		{"1/0", 3, "division by zero"},
		{"1/0.0e7", 3, "division by zero"},
		{" 1", 1, "space"},
		{"1 ", 2, "space"},
		{"1 /3", 2, "space"},
		{"1/ 3", 3, "space after '/'"},
		{"1/-3", 3, "sign in the denominator"},
		{"1/", 3, "missing denominator"},
		{"1/3/4", 4, "more than one '/'"},
		{"1e", 3, "missing exponent digits"},
		{"1e+", 4, "missing exponent digits"},
		{"1ex", 3, "unexpected 'x'"},
		{"1e1.5", 4, "fractional exponent"},
		{"1e999999999", 2, "exponent out of range"},
		{"1e100001", 2, "exponent out of range"},
		{"2/3e-100001", 4, "exponent out of range"},
		{".", 2, "missing digits"},
		{"-", 2, "missing digits"},
		{"1,5", 2, "unexpected ','"},
		{"1-2", 2, "misplaced sign"},
		{"−1", 1, "U+2212"},
		{"π", 1, "non-ASCII"},
		{"sqrt(3)", 1, "unexpected 's'"},
		{"e5", 1, "unexpected 'e'"},
		{"1.5x", 4, "unexpected 'x'"},
	}
	for _, tt := range tests {
		_, err := ParseRat(tt.in)
		var se *SyntaxError
		if !errors.As(err, &se) {
			t.Errorf("ParseRat(%q): error %v, want *SyntaxError", tt.in, err)
			continue
		}
		if se.Col != tt.col || !strings.Contains(se.Msg, tt.msg) || se.Hint == "" || se.Input != tt.in {
			t.Errorf("ParseRat(%q): col %d msg %q hint %q, want col %d msg ~%q and a hint",
				tt.in, se.Col, se.Msg, se.Hint, tt.col, tt.msg)
		}
		if _, err := Parse(tt.in); err == nil {
			t.Errorf("Parse(%q) accepted", tt.in)
		}
	}
	err := &SyntaxError{Input: "1..2", Col: 3, Msg: "second decimal point", Hint: "write one '.' at most: 1.25"}
	if got, want := err.Error(), `decimalio: "1..2": column 3: second decimal point (hint: write one '.' at most: 1.25)`; got != want {
		t.Errorf("Error() = %q, want %q", got, want)
	}
}

func TestParseTable(t *testing.T) {
	const maxF, minSub = math.MaxFloat64, 0x1p-1074
	tests := []struct {
		in     string
		lo, hi float64
	}{
		// Exactly representable values are points (binary expansions by hand).
		{"0.5", 0.5, 0.5},
		{"3", 3, 3},
		{"-0.375", -0.375, -0.375},
		{"1/4", 0.25, 0.25},
		{"9007199254740993", 9007199254740992, 9007199254740994}, // 2^53+1, between two floats
		{"0.1", 0.09999999999999999, 0.1},                        // 0.1 float64 = 0.1000000000000000055511…
		{"-0.1", -0.1, -0.09999999999999999},
		{"1/3", 0.3333333333333333, 0.33333333333333337},
		// Overflow and underflow (IEEE 754 binary64 limits).
		{"1e400", maxF, math.Inf(1)},
		{"-1e400", math.Inf(-1), -maxF},
		{"1e-400", 0, minSub},
		{"-1e-400", -minSub, 0},
		{"1e100000", maxF, math.Inf(1)},
		{"1e-100000", 0, minSub},
		// 2^-1074 = 4.94065645841246544176…e-324 (exact binary expansion).
		{"4.9406564584124654e-324", 0, minSub},          // just below 2^-1074
		{"4.9406564584124655e-324", minSub, 2 * minSub}, // just above 2^-1074
		{"2.4703282292062327e-324", 0, minSub},          // just below 2^-1075
	}
	for _, tt := range tests {
		got, err := Parse(tt.in)
		if err != nil {
			t.Errorf("Parse(%q): %v", tt.in, err)
			continue
		}
		if got != (interval.I{Lo: tt.lo, Hi: tt.hi}) {
			t.Errorf("Parse(%q) = %v, want [%g, %g]", tt.in, got, tt.lo, tt.hi)
		}
		checkTight(t, tt.in, got, refRat(t, tt.in))
	}
}

// randomDecimal returns a decimal string with 1..40 significant digits and
// exponent in [−400, 400], sometimes with a sign, a point or a fraction.
func randomDecimal(rng *rand.Rand) string {
	var b strings.Builder
	switch rng.IntN(4) {
	case 0:
		b.WriteByte('-')
	case 1:
		b.WriteByte('+')
	}
	b.WriteString(randomUnsigned(rng))
	if rng.IntN(8) == 0 {
		b.WriteByte('/')
		d := randomUnsigned(rng)
		for strings.Trim(d, "0.eE+-") == "" || isZeroDecimal(d) {
			d = randomUnsigned(rng)
		}
		b.WriteString(d)
	}
	return b.String()
}

func randomUnsigned(rng *rand.Rand) string {
	n := 1 + rng.IntN(40)
	digits := make([]byte, n)
	for i := range digits {
		digits[i] = byte('0' + rng.IntN(10))
	}
	digits[0] = byte('1' + rng.IntN(9))
	s := string(digits)
	if p := rng.IntN(n + 1); p < n && rng.IntN(2) == 0 {
		s = s[:p] + "." + s[p:]
	}
	return s + "e" + strconv.Itoa(rng.IntN(801)-400)
}

func isZeroDecimal(s string) bool {
	m, _, _ := strings.Cut(s, "e")
	return strings.Trim(m, "0.") == ""
}

func TestParseRandomTight(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for i := 0; i < cases(20000); i++ {
		s := randomDecimal(rng)
		r, err := ParseRat(s)
		if err != nil {
			t.Fatalf("ParseRat(%q): %v", s, err)
		}
		want := refRat(t, s)
		if r.Cmp(want) != 0 {
			t.Fatalf("ParseRat(%q) = %s, big.Rat.SetString gives %s", s, r, want)
		}
		x := FromRat(r)
		checkTight(t, s, x, want)
		if strings.Contains(s, "/") {
			continue
		}
		// strconv.ParseFloat (correctly rounded to nearest, the Go
		// standard library) must give one of the two ends.
		f, _ := strconv.ParseFloat(s, 64)
		if f == 0 {
			f = 0
		}
		if f != x.Lo && f != x.Hi {
			t.Fatalf("Parse(%q) = %v, nearest float64 %g is not an end", s, x, f)
		}
	}
}

// TestParseHalfway feeds exact midpoints between adjacent float64 values
// (normal, subnormal and at the overflow threshold) and values one unit in
// their 1100th decimal place away.
func TestParseHalfway(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	var lows []float64
	for i := 0; i < cases(300); i++ {
		lows = append(lows, math.Float64frombits(rng.Uint64()>>1))        // positive, mostly normal
		lows = append(lows, math.Float64frombits(rng.Uint64()&(1<<52-1))) // subnormal
	}
	lows = append(lows, 0, 0x1p-1074, 0x1p-1022-0x1p-1074, 1, math.Nextafter(1, 0))
	for _, a := range lows {
		if math.IsInf(a, 0) || math.IsNaN(a) || a == math.MaxFloat64 {
			continue
		}
		b := math.Nextafter(a, math.Inf(1))
		mid := new(big.Rat).Add(new(big.Rat).SetFloat64(a), new(big.Rat).SetFloat64(b))
		mid.Quo(mid, big.NewRat(2, 1))
		for _, sign := range []float64{1, -1} {
			m := new(big.Rat).Mul(mid, big.NewRat(int64(sign), 1))
			s := m.FloatString(1100) // exact: the midpoint has ≤ 1075 decimals
			want := interval.I{Lo: a, Hi: b}
			if sign < 0 {
				want = interval.I{Lo: -b, Hi: -a}
			}
			if got, err := Parse(s); err != nil || got != want {
				t.Fatalf("Parse(midpoint of %g, %g) = %v, %v; want %v", sign*a, sign*b, got, err, want)
			}
			// One unit in the last place of s away from the midpoint.
			for _, d := range []string{"1", "-1"} {
				nudged := s + "e0"
				r := refRat(t, nudged)
				r.Add(r, refRat(t, d+"e-1100"))
				if got := FromRat(r); got != want {
					t.Fatalf("FromRat(midpoint%se-1100) of %g = %v, want %v", d, sign*a, got, want)
				}
			}
		}
	}
	// Midpoint between MaxFloat64 and 2^1024: above every float64.
	top := new(big.Rat).SetFloat64(math.MaxFloat64)
	top.Add(top, new(big.Rat).SetFloat64(0x1p970))
	if got := FromRat(top); got != (interval.I{Lo: math.MaxFloat64, Hi: math.Inf(1)}) {
		t.Errorf("FromRat(MaxFloat64 + ulp/2) = %v", got)
	}
}

func TestParseExactRoundTrip(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	xs := []float64{0.1, -0.1, math.MaxFloat64, -math.MaxFloat64, 0x1p-1074, 0x1p-1022, math.Pi, 1e23}
	for i := 0; i < cases(3000); i++ {
		xs = append(xs, math.Float64frombits(rng.Uint64()))
	}
	for _, x := range xs {
		if math.IsInf(x, 0) || math.IsNaN(x) {
			continue
		}
		s := FormatExact(x)
		got, err := Parse(s)
		if err != nil || got != interval.Point(x) {
			t.Fatalf("Parse(FormatExact(%g)) = %v, %v (text %s)", x, got, err, s)
		}
	}
}

func TestParseJSONNumber(t *testing.T) {
	var v struct{ A, B json.Number }
	d := json.NewDecoder(strings.NewReader(`{"A": 0.1, "B": -2.5e-3}`))
	d.UseNumber()
	if err := d.Decode(&v); err != nil {
		t.Fatal(err)
	}
	for _, n := range []json.Number{v.A, v.B, "1e400"} {
		got, err := ParseJSONNumber(n)
		if err != nil {
			t.Fatalf("ParseJSONNumber(%s): %v", n, err)
		}
		checkTight(t, string(n), got, refRat(t, string(n)))
	}
	if _, err := ParseJSONNumber("0x10"); err == nil {
		t.Error("ParseJSONNumber accepted 0x10")
	}
}

func TestParseLowerUpper(t *testing.T) {
	tests := []struct {
		in     string
		lo, hi float64
	}{
		{"Infinity", math.Inf(1), math.Inf(1)},
		{"-Infinity", math.Inf(-1), math.Inf(-1)},
		{"0.1", 0.09999999999999999, 0.1},
		{"2", 2, 2},
	}
	for _, tt := range tests {
		lo, err1 := ParseLower(tt.in)
		hi, err2 := ParseUpper(tt.in)
		if err1 != nil || err2 != nil || lo != tt.lo || hi != tt.hi {
			t.Errorf("ParseLower/Upper(%q) = %g, %g (%v, %v); want %g, %g", tt.in, lo, hi, err1, err2, tt.lo, tt.hi)
		}
	}
	if _, err := ParseLower("inf"); err == nil {
		t.Error(`ParseLower("inf") accepted`)
	}
	if _, err := ParseUpper("1/0"); err == nil {
		t.Error(`ParseUpper("1/0") accepted`)
	}
}

func TestFromRatNilPanics(t *testing.T) {
	defer func() {
		if r := recover(); r == nil || !strings.HasPrefix(fmt.Sprint(r), "decimalio: ") {
			t.Errorf("FromRat(nil) panic = %v", r)
		}
	}()
	FromRat(nil)
}
