package decimalio

import (
	"encoding/json"
	"fmt"
	"math"
	"math/big"
	"unicode/utf8"

	"gapcert/interval"
)

// MaxExponent is the largest absolute value of a written decimal exponent
// ("1e100000" is accepted, "1e100001" is not). It keeps a few bytes of
// text from asking for a number with billions of digits.
const MaxExponent = 100000

const generalHint = "write a decimal such as -2.5e-3 or a fraction such as 1/3"

// ParseRat returns the exact rational denoted by s. Accepted forms:
//
//	decimal  = [sign] mantissa [("e" | "E") [sign] digits]
//	mantissa = digits ["." [digits]] | "." digits
//	fraction = decimal "/" unsigned-decimal     (denominator ≠ 0)
//
// with digits the ASCII 0–9, sign "+" or "-". Nothing else is accepted:
// no spaces anywhere (also not around "/"), no digit separators, no hex,
// no NaN or infinities, no sign on the denominator, and no written
// exponent beyond ±MaxExponent. Errors are *SyntaxError.
func ParseRat(s string) (*big.Rat, error) {
	p := scanner{s: s}
	if s == "" {
		return nil, p.fail(0, "empty number", generalHint)
	}
	num, err := p.decimal(true)
	if err != nil {
		return nil, err
	}
	if p.i == len(s) {
		return num, nil
	}
	if s[p.i] != '/' {
		return nil, p.unexpected(p.i)
	}
	p.i++
	start := p.i
	if start == len(s) {
		return nil, p.fail(start, "missing denominator after '/'", "write a fraction as 1/3")
	}
	switch s[start] {
	case '+', '-':
		return nil, p.fail(start, "sign in the denominator", "put the sign in front of the fraction: -1/3")
	case ' ', '\t', '\n', '\r':
		return nil, p.fail(start, "space after '/'", "spaces around '/' are not allowed: write 1/3")
	}
	den, err := p.decimal(false)
	if err != nil {
		return nil, err
	}
	if p.i < len(s) {
		if s[p.i] == '/' {
			return nil, p.fail(p.i, "more than one '/'", "write a single fraction p/q with decimal p and q")
		}
		return nil, p.unexpected(p.i)
	}
	if den.Sign() == 0 {
		return nil, p.fail(start, "division by zero", "the denominator of p/q must not be 0")
	}
	return num.Quo(num, den), nil
}

// Parse returns the tightest float64 interval containing the exact value
// of s (see ParseRat for the accepted text and FromRat for the interval).
func Parse(s string) (interval.I, error) {
	r, err := ParseRat(s)
	if err != nil {
		return interval.I{}, err
	}
	return FromRat(r), nil
}

// ParseJSONNumber is Parse applied to the text of n. JSON numbers are a
// subset of what Parse accepts, so every valid JSON number is read exactly.
func ParseJSONNumber(n json.Number) (interval.I, error) { return Parse(string(n)) }

// ParseLower returns a float64 ≤ the exact value of s: the lower end of
// Parse(s), or ±Inf for the texts "Infinity" and "-Infinity" written by
// FormatLower. So ParseLower(FormatLower(x, d)) ≤ x for every x.
func ParseLower(s string) (float64, error) {
	if v, ok := infinity(s); ok {
		return v, nil
	}
	x, err := Parse(s)
	return x.Lo, err
}

// ParseUpper returns a float64 ≥ the exact value of s: the upper end of
// Parse(s), or ±Inf for "Infinity" and "-Infinity". So
// ParseUpper(FormatUpper(x, d)) ≥ x for every x.
func ParseUpper(s string) (float64, error) {
	if v, ok := infinity(s); ok {
		return v, nil
	}
	x, err := Parse(s)
	return x.Hi, err
}

func infinity(s string) (float64, bool) {
	switch s {
	case "Infinity":
		return math.Inf(1), true
	case "-Infinity":
		return math.Inf(-1), true
	}
	return 0, false
}

// FromRat returns the tightest float64 interval containing r: [r, r] if r
// is a float64 (zero as +0), otherwise [f⁻, f⁺] with f⁻ < r < f⁺ adjacent
// float64 values (subnormals and zero included), [MaxFloat64, +Inf] above
// MaxFloat64 and [−Inf, −MaxFloat64] below −MaxFloat64.
//
// Soundness rests only on exact comparison: the nearest float64 from
// big.Rat.Float64 is compared with r exactly (big.Rat.Cmp) and the other
// end is its neighbour on the other side of r. FromRat panics if r is nil.
func FromRat(r *big.Rat) interval.I {
	if r == nil {
		panic("decimalio: nil rational")
	}
	if r.Sign() == 0 {
		return interval.Point(0)
	}
	f, exact := r.Float64()
	if exact {
		return interval.Point(f)
	}
	switch {
	case math.IsInf(f, 1):
		return interval.I{Lo: math.MaxFloat64, Hi: math.Inf(1)}
	case math.IsInf(f, -1):
		return interval.I{Lo: math.Inf(-1), Hi: -math.MaxFloat64}
	}
	if f == 0 {
		f = 0 // +0 for either sign of r: the ends of an I need no signed zero
	}
	if new(big.Rat).SetFloat64(f).Cmp(r) < 0 {
		return interval.I{Lo: f, Hi: math.Nextafter(f, math.Inf(1))}
	}
	return interval.I{Lo: math.Nextafter(f, math.Inf(-1)), Hi: f}
}

// scanner reads s from byte i on.
type scanner struct {
	s string
	i int
}

func (p *scanner) fail(at int, msg, hint string) error {
	return &SyntaxError{Input: p.s, Col: at + 1, Msg: msg, Hint: hint}
}

func isDigit(c byte) bool { return '0' <= c && c <= '9' }

// decimal reads [sign] mantissa [exponent] at p.i and returns its exact
// value; the sign is allowed only if signed.
func (p *scanner) decimal(signed bool) (*big.Rat, error) {
	s := p.s
	neg := false
	if signed && p.i < len(s) && (s[p.i] == '+' || s[p.i] == '-') {
		neg = s[p.i] == '-'
		p.i++
		if p.i < len(s) && (s[p.i] == '+' || s[p.i] == '-') {
			return nil, p.fail(p.i, "repeated sign", "write at most one sign: -1")
		}
	}
	intStart := p.i
	for p.i < len(s) && isDigit(s[p.i]) {
		p.i++
	}
	intDigits := s[intStart:p.i]
	var fracDigits string
	if p.i < len(s) && s[p.i] == '.' {
		p.i++
		fracStart := p.i
		for p.i < len(s) && isDigit(s[p.i]) {
			p.i++
		}
		fracDigits = s[fracStart:p.i]
	}
	if intDigits == "" && fracDigits == "" {
		if p.i == len(s) {
			return nil, p.fail(p.i, "missing digits", generalHint)
		}
		return nil, p.unexpected(p.i)
	}
	exp := 0
	if p.i < len(s) && (s[p.i] == 'e' || s[p.i] == 'E') {
		ePos := p.i
		p.i++
		expNeg := false
		if p.i < len(s) && (s[p.i] == '+' || s[p.i] == '-') {
			expNeg = s[p.i] == '-'
			p.i++
		}
		digStart := p.i
		for p.i < len(s) && isDigit(s[p.i]) {
			if exp <= MaxExponent { // stop growing once out of range; no overflow
				exp = 10*exp + int(s[p.i]-'0')
			}
			p.i++
		}
		if p.i == digStart {
			if p.i == len(s) {
				return nil, p.fail(p.i, "missing exponent digits", "write an exponent as 1e-3")
			}
			return nil, p.unexpected(p.i)
		}
		if exp > MaxExponent {
			return nil, p.fail(ePos, "exponent out of range",
				fmt.Sprintf("written exponents must lie in [-%d, %d]", MaxExponent, MaxExponent))
		}
		if expNeg {
			exp = -exp
		}
	}
	mant, ok := new(big.Int).SetString(intDigits+fracDigits, 10) // ASCII digits only, checked above
	if !ok {
		panic("decimalio: internal error: digit string rejected")
	}
	if neg {
		mant.Neg(mant)
	}
	exp -= len(fracDigits)
	r := new(big.Rat)
	if exp >= 0 {
		return r.SetInt(mant.Mul(mant, pow10(exp))), nil
	}
	return r.SetFrac(mant, pow10(-exp)), nil
}

// unexpected describes the bad byte at i.
func (p *scanner) unexpected(i int) error {
	c := p.s[i]
	switch {
	case c == ' ' || c == '\t' || c == '\n' || c == '\r':
		return p.fail(i, "unexpected space", "remove the spaces; none are allowed in a number, also not around '/'")
	case c == '_':
		return p.fail(i, "digit separators are not accepted", "write 1000, not 1_000")
	case c == ',':
		return p.fail(i, "unexpected ','", "use '.' as the decimal point and no thousands separators")
	case c == '.':
		if p.inExponent(i) {
			return p.fail(i, "fractional exponent", "the exponent must be an integer: 1.5e3, not 1e1.5")
		}
		return p.fail(i, "second decimal point", "write one '.' at most: 1.25")
	case c == '+' || c == '-':
		return p.fail(i, "misplaced sign", "a sign may only start the number or its exponent: -1.5e-3")
	case (c == 'x' || c == 'X') && i > 0 && p.s[i-1] == '0':
		return p.fail(i, "hexadecimal numbers are not accepted", "write 1/3 or 0.333…; hex floats are not accepted")
	case c == 'n' || c == 'N' || c == 'i' || c == 'I':
		return p.fail(i, "not a finite number", "NaN and infinities are not accepted; "+generalHint)
	case c >= utf8.RuneSelf:
		r, _ := utf8.DecodeRuneInString(p.s[i:])
		if r == '−' {
			return p.fail(i, "non-ASCII minus sign U+2212", "use the ASCII hyphen-minus '-'")
		}
		return p.fail(i, fmt.Sprintf("non-ASCII character %q", r), generalHint)
	}
	return p.fail(i, fmt.Sprintf("unexpected %q", c), generalHint)
}

// inExponent reports whether byte i follows an exponent marker of the
// current decimal (digits and a sign may lie between).
func (p *scanner) inExponent(i int) bool {
	for j := i - 1; j >= 0; j-- {
		switch c := p.s[j]; {
		case c == 'e' || c == 'E':
			return true
		case isDigit(c) || c == '+' || c == '-':
		default:
			return false
		}
	}
	return false
}

// pow10 returns 10ⁿ for n ≥ 0.
func pow10(n int) *big.Int {
	return new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(n)), nil)
}
