package report

import (
	"fmt"
	"math/big"
	"strings"

	"gapcert/interval/decimalio"
)

// DefaultWidthDigits is the number of significant digits of the width
// hi − lo that Shorten keeps when the caller asks for 0.
const DefaultWidthDigits = 2

// oneSidedDigits is the number of significant digits of the finite end of
// an enclosure whose other end is infinite.
const oneSidedDigits = 8

// Shown is an enclosure [lo, hi] as it is printed: two decimal mantissas
// Lo and Hi, both scaled by 10^Exp, whose exact values satisfy
//
//	Lo·10^Exp ≤ lo   and   Hi·10^Exp ≥ hi,
//
// so the printed interval contains the certified one. Lo and Hi are plain
// decimals ("9.869604401", "-0.25", "12300"), or "-Infinity" / "Infinity"
// for unbounded ends (then Exp is 0). Common is the length of their common
// leading part when the interval can be written in the compact form
// Lo[:Common] with the tails Lo[Common:] as subscript and Hi[Common:] as
// superscript (equal lengths, a nonzero digit in the common part, no
// decimal point in the tails), and 0 otherwise. Point reports Lo == Hi (an
// exactly known value, printed once).
type Shown struct {
	Lo, Hi string
	Exp    int
	Common int
	Point  bool
}

// LoRat and HiRat return the exact values of the printed ends (nil for an
// infinite end).
func (s Shown) LoRat() *big.Rat { return scaled(s.Lo, s.Exp) }

// HiRat: see LoRat.
func (s Shown) HiRat() *big.Rat { return scaled(s.Hi, s.Exp) }

func scaled(mantissa string, exp int) *big.Rat {
	if strings.HasSuffix(mantissa, "Infinity") {
		return nil
	}
	r, err := decimalio.ParseRat(mantissa)
	if err != nil {
		panic("report: shown mantissa " + mantissa + " is not a decimal")
	}
	return r.Mul(r, pow10Rat(exp))
}

// Shorten returns the printed form of the certified enclosure [lower,
// upper] given as the decimal strings of a certificate ("Infinity" and
// "-Infinity" allowed). Every step is exact (math/big), never float64:
//
//  1. with w = upper − lower > 0 and e = ⌊log10 w⌋, the place value
//     10^q, q = e − widthDigits + 1, is chosen so that w has widthDigits
//     significant digits at that place;
//  2. L = ⌊lower/10^q⌋ and H = ⌈upper/10^q⌉, so L·10^q ≤ lower and
//     H·10^q ≥ upper; rounding widens each end by less than 10^q ≤
//     w/10^(widthDigits−1);
//  3. trailing zeros common to L and H are dropped (the values are
//     unchanged);
//  4. when the larger magnitude of the rounded ends is below 10^−3 or at
//     least 10^6, a common factor 10^Exp is taken out, an exact rescaling
//     of the mantissas.
//
// An exact value (lower = upper) is printed in full, a finite end beside an
// infinite one with 8 significant digits rounded outward. widthDigits 0
// means DefaultWidthDigits. Shorten returns an error if a string is not a
// decimal or ±Infinity or if lower > upper.
func Shorten(lower, upper string, widthDigits int) (Shown, error) {
	if widthDigits < 0 {
		panic("report: negative widthDigits")
	}
	if widthDigits == 0 {
		widthDigits = DefaultWidthDigits
	}
	lo, loInf, err := readEnd(lower, "-Infinity")
	if err != nil {
		return Shown{}, fmt.Errorf("lower end: %w", err)
	}
	hi, hiInf, err := readEnd(upper, "Infinity")
	if err != nil {
		return Shown{}, fmt.Errorf("upper end: %w", err)
	}
	if loInf || hiInf {
		s := Shown{Lo: "-Infinity", Hi: "Infinity"}
		if !loInf {
			s.Lo = directed(lo, false)
		}
		if !hiInf {
			s.Hi = directed(hi, true)
		}
		return s, nil
	}
	switch lo.Cmp(hi) {
	case 1:
		return Shown{}, fmt.Errorf("[%s, %s] is not an interval", lower, upper)
	case 0:
		n, q := exactDigits(lo)
		exp := displayExponent(lo, lo)
		t := place(n, q-exp)
		return Shown{Lo: t, Hi: t, Exp: exp, Common: len(t), Point: true}, nil
	}
	width := new(big.Rat).Sub(hi, lo)
	q := floorLog10(width) - widthDigits + 1
	L := floorDiv(lo, q)
	H := ceilDiv(hi, q)
	ten := big.NewInt(10)
	m := new(big.Int)
	for {
		if m.Rem(L, ten).Sign() != 0 || m.Rem(H, ten).Sign() != 0 {
			break
		}
		L.Quo(L, ten)
		H.Quo(H, ten)
		q++
	}
	exp := displayExponent(new(big.Rat).Mul(new(big.Rat).SetInt(L), pow10Rat(q)), new(big.Rat).Mul(new(big.Rat).SetInt(H), pow10Rat(q)))
	s := Shown{Lo: place(L, q-exp), Hi: place(H, q-exp), Exp: exp}
	s.Common = commonLead(s.Lo, s.Hi)
	return s, nil
}

// readEnd reads one end of a certified bound; inf is the spelling of the
// infinite end allowed on this side.
func readEnd(s, inf string) (*big.Rat, bool, error) {
	if s == inf {
		return nil, true, nil
	}
	r, err := decimalio.ParseRat(s)
	if err != nil {
		return nil, false, err
	}
	return r, false, nil
}

// directed prints x with oneSidedDigits significant digits, rounded up
// (up) or down, exactly.
func directed(x *big.Rat, up bool) string {
	if x.Sign() == 0 {
		return "0"
	}
	q := floorLog10(new(big.Rat).Abs(x)) - oneSidedDigits + 1
	var n *big.Int
	if up {
		n = ceilDiv(x, q)
	} else {
		n = floorDiv(x, q)
	}
	return place(n, q)
}

// exactDigits returns n and q with x = n·10^q exactly and n not divisible
// by 10 (n = 0, q = 0 for x = 0). x must be a finite decimal, as every
// certificate string is.
func exactDigits(x *big.Rat) (*big.Int, int) {
	if x.Sign() == 0 {
		return new(big.Int), 0
	}
	q := 0
	n := new(big.Rat).Set(x)
	for !n.IsInt() {
		n.Mul(n, big.NewRat(10, 1))
		q--
	}
	num := new(big.Int).Set(n.Num())
	ten, m := big.NewInt(10), new(big.Int)
	for m.Rem(num, ten).Sign() == 0 {
		num.Quo(num, ten)
		q++
	}
	return num, q
}

// displayExponent is the power of ten factored out of a printed enclosure:
// 0 when the larger magnitude M of its ends lies in [10^−3, 10^6) or is 0,
// else ⌊log10 M⌋.
func displayExponent(lo, hi *big.Rat) int {
	m := new(big.Rat).Abs(lo)
	if a := new(big.Rat).Abs(hi); a.Cmp(m) > 0 {
		m = a
	}
	if m.Sign() == 0 {
		return 0
	}
	if e := floorLog10(m); e < -3 || e >= 6 {
		return e
	}
	return 0
}

// floorLog10 returns ⌊log10 x⌋ for x > 0, exactly.
func floorLog10(x *big.Rat) int {
	if x.Sign() <= 0 {
		panic("report: floorLog10 of a non-positive number")
	}
	// A guess from the sizes of numerator and denominator, then exact
	// correction: 10^e ≤ x < 10^(e+1).
	e := int(float64(x.Num().BitLen()-x.Denom().BitLen()) * 0.30102999566398120)
	for pow10Rat(e).Cmp(x) > 0 {
		e--
	}
	for pow10Rat(e+1).Cmp(x) <= 0 {
		e++
	}
	return e
}

// floorDiv returns ⌊x/10^q⌋ and ceilDiv ⌈x/10^q⌉, exactly.
func floorDiv(x *big.Rat, q int) *big.Int {
	y := new(big.Rat).Quo(x, pow10Rat(q))
	return new(big.Int).Div(y.Num(), y.Denom()) // Euclidean division by a positive denominator is the floor
}

func ceilDiv(x *big.Rat, q int) *big.Int {
	n := floorDiv(new(big.Rat).Neg(x), q)
	return n.Neg(n)
}

// pow10Rat returns 10^e as a rational.
func pow10Rat(e int) *big.Rat {
	p := new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(abs(e))), nil)
	if e >= 0 {
		return new(big.Rat).SetInt(p)
	}
	return new(big.Rat).SetFrac(big.NewInt(1), p)
}

func abs(e int) int {
	if e < 0 {
		return -e
	}
	return e
}

// place writes n·10^shift as a plain decimal ("-0.0125", "12300").
func place(n *big.Int, shift int) string {
	neg := n.Sign() < 0
	ds := new(big.Int).Abs(n).String()
	var out string
	switch {
	case shift >= 0:
		out = ds
		if ds != "0" {
			out += strings.Repeat("0", shift)
		}
	default:
		frac := -shift
		if len(ds) <= frac {
			ds = strings.Repeat("0", frac-len(ds)+1) + ds
		}
		out = ds[:len(ds)-frac] + "." + ds[len(ds)-frac:]
	}
	if neg {
		out = "-" + out
	}
	return out
}

// commonLead returns the length of the common leading part of lo and hi
// usable for the compact notation, or 0 (see Shown.Common).
func commonLead(lo, hi string) int {
	if len(lo) != len(hi) {
		return 0
	}
	n := 0
	for n < len(lo) && lo[n] == hi[n] {
		n++
	}
	if n == len(lo) || !strings.ContainsAny(lo[:n], "123456789") || strings.Contains(lo[n:], ".") {
		return 0
	}
	return n
}
