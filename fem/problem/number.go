package problem

import (
	"errors"
	"fmt"
	"math/big"
	"strconv"
	"strings"

	"gapcert/interval"
	"gapcert/interval/decimalio"
	"gapcert/interval/formula"
)

// Number is an exact number of a problem file: a decimal, a rational or a
// constant formula.
type Number struct {
	// Text is the canonical text: the shortest exact decimal or reduced
	// "p/q" for a rational, else the canonical formula text (which may
	// name parameters).
	Text string
	// Val encloses the exact value; it is always bounded.
	Val interval.I
	// Rat is the exact value when the input is a rational literal or a
	// parameter that is one, else nil (for example for "sqrt(3)/2").
	Rat *big.Rat
}

// Limits on the size of numbers in a problem file. They keep exact
// arithmetic cheap; no physical input comes near them.
const (
	maxNumberLen   = 400 // bytes of text of one number
	maxExponent    = 400 // |n| in a decimal exponent "e±n"
	maxFormulaLen  = 4000
	maxVertices    = 100
	maxEigenvalues = 20
)

// ratNumber returns the Number holding the exact rational r.
func ratNumber(r *big.Rat) Number {
	return Number{Text: RatText(r), Val: decimalio.FromRat(r), Rat: new(big.Rat).Set(r)}
}

// RatText returns the canonical text of an exact rational: a decimal when
// the value has a finite decimal expansion ("0.1", "-2.5", "1.5e-300"),
// else the reduced fraction "p/q" with the sign in front ("-1/3"). The
// decimal is plain when its leading digit has exponent −7 < k < 21
// ("0.000001", "123.5") and scientific otherwise ("1e-7", "1.5e300").
func RatText(r *big.Rat) string {
	num := new(big.Int).Set(r.Num())
	den := r.Denom()
	// den = 2^a 5^b ⇔ the decimal expansion terminates.
	d := new(big.Int).Set(den)
	two, five := big.NewInt(2), big.NewInt(5)
	a, b := 0, 0
	m := new(big.Int)
	for d.Cmp(big.NewInt(1)) != 0 {
		if m.Mod(d, two).Sign() == 0 {
			d.Quo(d, two)
			a++
		} else if m.Mod(d, five).Sign() == 0 {
			d.Quo(d, five)
			b++
		} else {
			return r.Num().String() + "/" + den.String()
		}
	}
	k := max(a, b)
	// value = num·10^k/den · 10^-k with num·10^k/den an integer.
	pow := new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(k)), nil)
	num.Mul(num, pow).Quo(num, den)
	e := -k
	if num.Sign() == 0 {
		return "0"
	}
	ten := big.NewInt(10)
	for m.Mod(num, ten).Sign() == 0 {
		num.Quo(num, ten)
		e++
	}
	sign := ""
	if num.Sign() < 0 {
		sign = "-"
		num.Neg(num)
	}
	digits := num.String()
	// Plain notation for leading-digit exponents −7 < exp10 < 21, else
	// scientific (the convention of ECMAScript's Number.prototype.toString).
	exp10 := e + len(digits) - 1
	if -7 < exp10 && exp10 < 21 {
		switch {
		case e >= 0:
			return sign + digits + strings.Repeat("0", e)
		case len(digits) > -e:
			return sign + digits[:len(digits)+e] + "." + digits[len(digits)+e:]
		default:
			return sign + "0." + strings.Repeat("0", -e-len(digits)) + digits
		}
	}
	mant := digits[:1]
	if len(digits) > 1 {
		mant += "." + digits[1:]
	}
	return sign + mant + "e" + strconv.Itoa(exp10)
}

// numberError is a defect of one number, with a hint.
type numberError struct {
	msg, hint string
	unknown   []string // names the text uses that are not parameters
}

func (e *numberError) Error() string { return e.msg }

func numErr(msg, hint string) *numberError { return &numberError{msg: msg, hint: hint} }

const numberHint = `write a decimal ("0.25", "-1e-3"), a rational ("1/3") or a constant formula ("sqrt(3)/2")`

// isLiteralText reports whether s uses only the characters of decimal and
// rational literals.
func isLiteralText(s string) bool {
	for i := 0; i < len(s); i++ {
		c := s[i]
		if !('0' <= c && c <= '9' || c == '.' || c == '/' || c == 'e' || c == 'E' || c == '+' || c == '-') {
			return false
		}
	}
	return s != ""
}

// checkExponents rejects decimal exponents beyond ±maxExponent anywhere in
// s (a digit or '.' followed by e or E, an optional sign and digits), before
// any exact arithmetic would expand them.
func checkExponents(s string) error {
	for i := 1; i < len(s); i++ {
		c := s[i]
		if c != 'e' && c != 'E' {
			continue
		}
		if p := s[i-1]; !('0' <= p && p <= '9' || p == '.') {
			continue
		}
		j := i + 1
		if j < len(s) && (s[j] == '+' || s[j] == '-') {
			j++
		}
		k := j
		for k < len(s) && '0' <= s[k] && s[k] <= '9' {
			k++
		}
		if k == j {
			continue
		}
		digits := strings.TrimLeft(s[j:k], "0")
		if n, _ := strconv.Atoi("0" + digits); len(digits) > 4 || n > maxExponent {
			return numErr("number out of range: exponent "+s[i+1:k], "exponents must lie within ±"+strconv.Itoa(maxExponent))
		}
	}
	return nil
}

// parseRatLiteral reads a signed decimal or rational literal exactly.
func parseRatLiteral(s string) (*big.Rat, error) { return decimalio.ParseRat(s) }

// parseNumber reads the exact number text s. params are the problem's
// parameters (nil while the parameters themselves are read).
func parseNumber(s string, params map[string]Number) (Number, error) {
	s = strings.TrimSpace(s)
	if s == "" {
		return Number{}, numErr("empty number", numberHint)
	}
	if len(s) > maxNumberLen {
		return Number{}, numErr(fmt.Sprintf("number text too long (%d bytes, at most %d)", len(s), maxNumberLen), "use a shorter exact form, or a parameter")
	}
	if err := checkExponents(s); err != nil {
		return Number{}, err
	}
	var literalErr error
	if isLiteralText(s) {
		r, err := parseRatLiteral(s)
		if err == nil {
			return finite(ratNumber(r), s)
		}
		// Sums such as "1+1e-3" are formulas; a literal's own error is
		// reported if the formula reader fails too.
		literalErr = err
	}
	e, err := formula.Parse(s)
	if err != nil {
		if literalErr != nil {
			var le *decimalio.SyntaxError
			if errors.As(literalErr, &le) {
				return Number{}, numErr(fmt.Sprintf("%q is not a number: %s", s, le.Msg), firstNonEmpty(le.Hint, numberHint))
			}
			return Number{}, numErr(fmt.Sprintf("%q is not a number: %v", s, literalErr), numberHint)
		}
		var se *formula.SyntaxError
		if errors.As(err, &se) {
			return Number{}, numErr(fmt.Sprintf("%q is not a number: column %d: %s", s, se.Col, se.Msg), firstNonEmpty(se.Hint, numberHint))
		}
		return Number{}, numErr(fmt.Sprintf("%q is not a number: %v", s, err), numberHint)
	}
	if usesIntervalLiteral(e.String()) {
		return Number{}, numErr(fmt.Sprintf("%q is not a single number", s), "interval(…) denotes a set of values; give the exact value")
	}
	vals := map[string]interval.I{}
	var unknown []string
	for _, name := range e.Vars() {
		p, ok := params[name]
		if !ok {
			unknown = append(unknown, name)
			continue
		}
		vals[name] = p.Val
	}
	if len(unknown) > 0 {
		hint := `declare it under "parameters"`
		if params == nil {
			hint = "a parameter's value may not use other names"
		}
		return Number{}, &numberError{msg: fmt.Sprintf("%q is not a constant: unknown name %s", s, strings.Join(quoteAll(unknown), ", ")), hint: hint, unknown: unknown}
	}
	v, err := e.Bind(vals).EvalConst()
	if err != nil {
		return Number{}, numErr(fmt.Sprintf("%q cannot be evaluated: %v", s, err), "the formula must be defined at its value")
	}
	text := e.String()
	if r, err := parseRatLiteral(text); err == nil {
		return finite(ratNumber(r), s)
	}
	n := Number{Text: text, Val: v}
	if p, ok := params[s]; ok && p.Rat != nil {
		n.Rat = new(big.Rat).Set(p.Rat)
		n.Val = p.Val
	}
	return finite(n, s)
}

// finite rejects numbers whose enclosure is not bounded (values beyond the
// float64 range, or a formula that overflows).
func finite(n Number, s string) (Number, error) {
	if !n.Val.IsBounded() {
		return Number{}, numErr(fmt.Sprintf("%q is out of range", s), "numbers must be finite and below about 1.7e308 in magnitude")
	}
	return n, nil
}

func firstNonEmpty(a, b string) string {
	if a != "" {
		return a
	}
	return b
}

func quoteAll(names []string) []string {
	q := make([]string, len(names))
	for i, n := range names {
		q[i] = strconv.Quote(n)
	}
	return q
}

// cmpKnown compares two numbers: −1 if x < y, 0 if x = y, +1 if x > y,
// decided exactly from the rationals or from disjoint enclosures; ok is
// false when the enclosures cannot decide.
func cmpKnown(x, y Number) (c int, ok bool) {
	if x.Rat != nil && y.Rat != nil {
		return x.Rat.Cmp(y.Rat), true
	}
	return signOf(x.Val.Sub(y.Val))
}

// signOf returns the sign of every real in d when d decides it: d > 0,
// d < 0, or d the point 0.
func signOf(d interval.I) (int, bool) {
	switch {
	case d.Lo > 0:
		return 1, true
	case d.Hi < 0:
		return -1, true
	case d.Lo == 0 && d.Hi == 0:
		return 0, true
	}
	return 0, false
}

// usesIntervalLiteral reports whether the canonical formula text calls the
// interval(lo, hi) constructor, which denotes a set, not a number.
func usesIntervalLiteral(text string) bool {
	for i := 0; ; {
		j := strings.Index(text[i:], "interval(")
		if j < 0 {
			return false
		}
		j += i
		if j == 0 || !isNameByte(text[j-1]) {
			return true
		}
		i = j + 1
	}
}

func isNameByte(c byte) bool {
	return c == '_' || 'a' <= c && c <= 'z' || 'A' <= c && c <= 'Z' || '0' <= c && c <= '9'
}
