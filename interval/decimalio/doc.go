// Package decimalio implements exact conversion between decimal text and
// float64 intervals.
//
// Reading never goes through strconv.ParseFloat. ParseRat reads a decimal
// ("-2.5e-3", ".5", "+3.") or a fraction of two decimals ("1/3",
// "1.5/2e3") into the exact rational it denotes; Parse and FromRat return
// the tightest float64 interval containing that rational: the point [x, x]
// when the rational is the float64 x, otherwise the two neighbouring
// float64 values around it (subnormals and signs included; beyond
// ±MaxFloat64 the outer end is ±Inf). Malformed text gives a *SyntaxError
// with the 1-based byte column of the first bad byte and a hint.
//
// Writing is directed: FormatLower(x, d) prints the largest decimal with d
// significant digits whose exact value is ≤ x, FormatUpper the smallest
// whose value is ≥ x, so a printed enclosure [FormatLower(lo, d),
// FormatUpper(hi, d)] contains [lo, hi]. FormatExact prints the complete
// decimal expansion of a float64 (every float64 is a finite decimal), so
// Parse(FormatExact(x)) is the point x.
//
// Guarantees and how they are obtained: every decision about a bound is an
// exact comparison or an exact floor/ceiling of a quotient of integers in
// math/big. In particular FromRat takes big.Rat.Float64 only as a guess and
// decides on which side of the exact value it lies by an exact big.Rat
// comparison, so the enclosure is sound whatever the accuracy of the guess;
// the guess (documented as nearest) only makes it tight.
//
// Output style: plain positional notation when the decimal exponent E of
// the leading digit satisfies −5 ≤ E ≤ 15 ("9.8696044010", "0.000125",
// "1200"), scientific notation "d.ddde±N" otherwise ("-1.25e-7",
// "6.02e+23"). In plain notation an integer part longer than the
// requested digits is padded with zeros ("1200" is 1234.5 rounded down to
// two digits). Zero prints as "0". The infinities print as "Infinity" and
// "-Infinity"; they are not numbers and Parse rejects them, but
// ParseLower and ParseUpper read them back.
//
// References:
//
//	IEEE Std 754-2019, Standard for Floating-Point Arithmetic: §3.3
//	(binary64 parameters, subnormals) and §5.12 (conversion between
//	decimal character sequences and binary formats).
package decimalio
