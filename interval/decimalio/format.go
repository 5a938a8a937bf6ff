package decimalio

import (
	"math"
	"math/big"
	"strconv"
	"strings"

	"gapcert/interval"
)

// FormatLower returns the largest decimal with exactly digits significant
// digits whose exact value is ≤ x ("Infinity" / "-Infinity" for ±Inf, "0"
// for ±0). The digits are floor(|x|·10^(digits−1−E)) (ceiling for x < 0)
// with E = ⌊log10 |x|⌋, computed exactly in integers. FormatLower panics if
// x is NaN or digits < 1.
func FormatLower(x float64, digits int) string { return formatDirected(x, digits, false) }

// FormatUpper returns the smallest decimal with exactly digits significant
// digits whose exact value is ≥ x, in the style of FormatLower.
func FormatUpper(x float64, digits int) string { return formatDirected(x, digits, true) }

// FormatInterval returns FormatLower(x.Lo, digits) and
// FormatUpper(x.Hi, digits): decimal ends of an interval containing x.
func FormatInterval(x interval.I, digits int) (lo, hi string) {
	return FormatLower(x.Lo, digits), FormatUpper(x.Hi, digits)
}

// FormatExact returns the complete decimal expansion of x (at most 767
// significant digits, trailing zeros dropped), in the package's style. Its
// exact value is x, so Parse(FormatExact(x)) == interval.Point(x) for every
// finite x, and it is the shortest text with that property: a text read to
// the point x must denote x exactly. (The shortest text that merely rounds
// to x at round-to-nearest, such as "0.1", is not enough for Parse, which
// encloses the exact value.) ±Inf give "Infinity" and "-Infinity";
// FormatExact panics on NaN.
func FormatExact(x float64) string {
	if s, ok := special(x); ok {
		return s
	}
	m, e := decompose(x)
	var ds string
	var exp10 int // x = ±0.ds·10^? : the last digit of ds has place value 10^exp10
	if e >= 0 {
		ds = new(big.Int).Lsh(m, uint(e)).String()
	} else {
		// m·2^e = m·5^(−e) / 10^(−e)
		five := new(big.Int).Exp(big.NewInt(5), big.NewInt(int64(-e)), nil)
		ds = five.Mul(five, m).String()
		exp10 = e
	}
	trimmed := strings.TrimRight(ds, "0")
	exp10 += len(ds) - len(trimmed)
	return layout(x < 0, trimmed, exp10+len(trimmed)-1)
}

func special(x float64) (string, bool) {
	switch {
	case math.IsNaN(x):
		panic("decimalio: NaN has no decimal form")
	case math.IsInf(x, 1):
		return "Infinity", true
	case math.IsInf(x, -1):
		return "-Infinity", true
	case x == 0:
		return "0", true
	}
	return "", false
}

// decompose returns m, e with |x| = m·2^e exactly, for finite nonzero x.
func decompose(x float64) (*big.Int, int) {
	bits := math.Float64bits(math.Abs(x))
	biased := int(bits >> 52)
	frac := bits & (1<<52 - 1)
	if biased == 0 {
		return new(big.Int).SetUint64(frac), -1074
	}
	return new(big.Int).SetUint64(frac | 1<<52), biased - 1075
}

// formatDirected rounds x to digits significant digits toward +∞ (up) or
// −∞ (!up). With |x| = m·2^e and k = digits−1−E, the integer
// n = ⌊m·2^e·10^k⌋ has exactly `digits` digits iff 10^E ≤ |x| < 10^(E+1),
// which fixes E; then n (or n+1 when the division leaves a remainder and
// the magnitude must round up) times 10^(E−digits+1) is the answer.
func formatDirected(x float64, digits int, up bool) string {
	if digits < 1 {
		panic("decimalio: digits must be at least 1")
	}
	if s, ok := special(x); ok {
		return s
	}
	neg := x < 0
	roundMagUp := up != neg // toward +∞ raises |x| for x > 0, lowers it for x < 0
	m, e := decompose(x)
	lowLimit := pow10(digits - 1)
	highLimit := pow10(digits)
	E := int(math.Floor(math.Log10(math.Abs(x)))) // a guess; corrected below
	num, den, n, rem := new(big.Int), new(big.Int), new(big.Int), new(big.Int)
	for {
		num.Lsh(m, uint(max(e, 0)))
		den.Lsh(big.NewInt(1), uint(max(-e, 0)))
		if k := digits - 1 - E; k >= 0 {
			num.Mul(num, pow10(k))
		} else {
			den.Mul(den, pow10(-k))
		}
		n.QuoRem(num, den, rem)
		switch {
		case n.Cmp(lowLimit) < 0:
			E--
			continue
		case n.Cmp(highLimit) >= 0:
			E++
			continue
		}
		break
	}
	if roundMagUp && rem.Sign() != 0 {
		n.Add(n, big.NewInt(1))
		if n.Cmp(highLimit) == 0 {
			n.Set(lowLimit)
			E++
		}
	}
	return layout(neg, n.String(), E)
}

// layout writes the digit string ds (nonzero leading digit) whose leading
// digit has place value 10^E: plain for −5 ≤ E ≤ 15, else d.ddde±N.
func layout(neg bool, ds string, E int) string {
	var b strings.Builder
	if neg {
		b.WriteByte('-')
	}
	switch {
	case E < -5 || E > 15:
		b.WriteByte(ds[0])
		if len(ds) > 1 {
			b.WriteByte('.')
			b.WriteString(ds[1:])
		}
		b.WriteByte('e')
		if E >= 0 {
			b.WriteByte('+')
		}
		b.WriteString(strconv.Itoa(E))
	case E < 0:
		b.WriteString("0.")
		b.WriteString(strings.Repeat("0", -E-1))
		b.WriteString(ds)
	case len(ds) <= E+1:
		b.WriteString(ds)
		b.WriteString(strings.Repeat("0", E+1-len(ds)))
	default:
		b.WriteString(ds[:E+1])
		b.WriteByte('.')
		b.WriteString(ds[E+1:])
	}
	return b.String()
}
