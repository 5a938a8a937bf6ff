package plot

import (
	"strings"
	"unicode/utf8"
)

// greek are the names that formulas and parameters spell out and pictures
// draw as letters.
var greek = map[string]string{
	"pi": "π", "alpha": "α", "beta": "β", "gamma": "γ", "delta": "δ",
	"epsilon": "ε", "theta": "θ", "kappa": "κ", "mu": "μ", "nu": "ν",
	"sigma": "σ", "tau": "τ", "phi": "φ", "omega": "ω",
}

// subscripts and superscripts are the digits as drawn below and above the
// line.
var (
	subscripts   = []rune("₀₁₂₃₄₅₆₇₈₉")
	superscripts = []rune("⁰¹²³⁴⁵⁶⁷⁸⁹")
)

// MathText returns the formula text src (the grammar of package
// interval/formula, and the relations of claims) as mathematical
// notation for a picture: lambdaN as λ with the index N as subscript
// (lambda1 → λ₁), pi and Greek parameter names as letters (pi → π,
// alpha → α), "*" as "·", "-" as the minus sign "−", ">=" and "<=" as
// "≥" and "≤", and an integer exponent as superscript digits (D^2 → D²)
// when the picture font has them; anything else (other names, numbers,
// spaces, brackets) is kept as written. Every rune of the result can be
// drawn (see Drawable), so
//
//	MathText("D^2*gap/pi^2") == "D²·gap/π²"
//	MathText("lambda2 - lambda1 >= 3*pi^2/D^2") == "λ₂ − λ₁ ≥ 3·π²/D²"
//
// The result is for reading only; it is not meant to be parsed again.
func MathText(src string) string {
	var b strings.Builder
	for i := 0; i < len(src); {
		c := src[i]
		switch {
		case isNameStart(c):
			j := i + 1
			for j < len(src) && isNameChar(src[j]) {
				j++
			}
			b.WriteString(mathName(src[i:j]))
			i = j
		case isDigit(c) || c == '.' && i+1 < len(src) && isDigit(src[i+1]):
			j := numberEnd(src, i)
			b.WriteString(src[i:j])
			i = j
		case c == '^':
			if sup, n, ok := superscript(src[i+1:]); ok {
				b.WriteString(sup)
				i += 1 + n
			} else {
				b.WriteByte('^')
				i++
			}
		case c == '*':
			b.WriteString("·")
			i++
		case c == '-':
			b.WriteString("−")
			i++
		case (c == '>' || c == '<') && i+1 < len(src) && src[i+1] == '=':
			b.WriteString(map[byte]string{'>': "≥", '<': "≤"}[c])
			i += 2
		default:
			r, n := utf8.DecodeRuneInString(src[i:])
			b.WriteRune(r)
			i += n
		}
	}
	return drawable(b.String())
}

// mathName draws one name of a formula.
func mathName(name string) string {
	if g, ok := greek[name]; ok {
		return g
	}
	if digits, ok := strings.CutPrefix(name, "lambda"); ok && digits != "" && allDigits(digits) {
		return "λ" + withDigits(digits, subscripts)
	}
	return name
}

// superscript reads an exponent that is an unsigned integer literal at the
// start of s and returns it in superscript digits and its length in s; ok
// is false when s does not start with one, when the exponent has an
// exponent of its own (2^3^4 is 2^(3^4), and "2³⁴" would read as 2^34),
// or when the font lacks one of its digits (the exponent is then written
// with "^").
func superscript(s string) (sup string, n int, ok bool) {
	for n < len(s) && isDigit(s[n]) {
		n++
	}
	if n == 0 || n < len(s) && (s[n] == '.' || s[n] == 'e' || s[n] == 'E' || s[n] == '^' || isNameChar(s[n])) {
		return "", 0, false
	}
	sup = withDigits(s[:n], superscripts)
	if drawable(sup) != sup {
		return "", 0, false
	}
	return sup, n, true
}

// LambdaSubscripts returns s with each "λ" followed by ASCII digits written
// with subscript digits (λ1 → λ₁), for labels that are text rather than
// formulas.
func LambdaSubscripts(s string) string {
	var b strings.Builder
	for i := 0; i < len(s); {
		r, n := utf8.DecodeRuneInString(s[i:])
		b.WriteRune(r)
		i += n
		if r != 'λ' {
			continue
		}
		j := i
		for j < len(s) && isDigit(s[j]) {
			j++
		}
		b.WriteString(withDigits(s[i:j], subscripts))
		i = j
	}
	return b.String()
}

// withDigits returns the ASCII digits s written with the given digit runes.
func withDigits(s string, digits []rune) string {
	var b strings.Builder
	for i := range len(s) {
		b.WriteRune(digits[s[i]-'0'])
	}
	return b.String()
}

// numberEnd returns the end of the number literal starting at s[i]:
// digits, a fraction and an exponent, as in package interval/formula.
func numberEnd(s string, i int) int {
	for i < len(s) && (isDigit(s[i]) || s[i] == '.') {
		i++
	}
	if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
		j := i + 1
		if j < len(s) && (s[j] == '+' || s[j] == '-') {
			j++
		}
		if j < len(s) && isDigit(s[j]) {
			for j < len(s) && isDigit(s[j]) {
				j++
			}
			return j
		}
	}
	return i
}

func isDigit(c byte) bool     { return '0' <= c && c <= '9' }
func isNameStart(c byte) bool { return c == '_' || 'a' <= c && c <= 'z' || 'A' <= c && c <= 'Z' }
func isNameChar(c byte) bool  { return isNameStart(c) || isDigit(c) }

func allDigits(s string) bool {
	for i := range len(s) {
		if !isDigit(s[i]) {
			return false
		}
	}
	return true
}
