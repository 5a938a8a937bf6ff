package decimalio

import (
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"strconv"
	"strings"
	"testing"
)

// sigDigits returns the significand digits of a decimal string s written
// by this package with d significant digits (sign, point, leading zeros and
// exponent removed) and the place value exponent of its last digit:
// |value| = digits·10^last. A plain integer such as "1200" carries zeros
// beyond its d digits as padding; they are dropped (all trailing zeros
// are, if d = 0).
func sigDigits(t testing.TB, s string, d int) (digits string, last int) {
	t.Helper()
	s = strings.TrimPrefix(s, "-")
	mant, exp, hasExp := strings.Cut(s, "e")
	e := 0
	if hasExp {
		var err error
		if e, err = strconv.Atoi(exp); err != nil {
			t.Fatalf("bad exponent in %q", s)
		}
	}
	intPart, frac, hasPoint := strings.Cut(mant, ".")
	all := strings.TrimLeft(intPart+frac, "0")
	last = e - len(frac)
	if !hasPoint && !hasExp {
		keep := len(strings.TrimRight(all, "0"))
		if d > 0 {
			keep = max(keep, min(d, len(all)))
		}
		last += len(all) - keep
		all = all[:keep]
	}
	return all, last
}

// nextDecimal returns the D-digit decimal adjacent to v (D = number of
// significant digits of v's text s) in direction up or down: the step is
// one unit of v's last digit, except when |v| = 10^k·1.00…0 moves toward
// zero, where the D-digit neighbour 9.99…9·10^(k−1) is a tenth of a step
// away.
func nextDecimal(t testing.TB, s string, d int, up bool) *big.Rat {
	t.Helper()
	v := refRat(t, s)
	ds, last := sigDigits(t, s, d)
	step := new(big.Rat).SetInt(pow10(abs(last)))
	if last < 0 {
		step.Inv(step)
	}
	towardZero := (v.Sign() > 0) != up
	if towardZero && strings.Trim(ds[1:], "0") == "" && ds[0] == '1' {
		step.Quo(step, big.NewRat(10, 1))
	}
	if up {
		return v.Add(v, step)
	}
	return v.Sub(v, step)
}

// checkDirected checks FormatLower/FormatUpper(x, d): exactly d
// significant digits, lower ≤ x ≤ upper exactly (big.Rat), tightness (the
// next d-digit decimal toward x lies on the wrong side), agreement with
// the correctly rounded strconv.FormatFloat(x, 'e', d−1) (standard library)
// which must be one of the two, and lower = upper iff x has ≤ d digits.
func checkDirected(t testing.TB, x float64, d int) {
	t.Helper()
	lo, hi := FormatLower(x, d), FormatUpper(x, d)
	xr := new(big.Rat).SetFloat64(x)
	lr, hr := refRat(t, lo), refRat(t, hi)
	if lr.Cmp(xr) > 0 || hr.Cmp(xr) < 0 {
		t.Fatalf("x=%g d=%d: %s, %s do not bracket x", x, d, lo, hi)
	}
	for _, s := range []string{lo, hi} {
		if ds, _ := sigDigits(t, s, d); len(ds) != d {
			t.Fatalf("x=%g d=%d: %q has %d significant digits", x, d, s, len(ds))
		}
	}
	if nextDecimal(t, lo, d, true).Cmp(xr) <= 0 {
		t.Fatalf("x=%g d=%d: lower %s is not the largest", x, d, lo)
	}
	if nextDecimal(t, hi, d, false).Cmp(xr) >= 0 {
		t.Fatalf("x=%g d=%d: upper %s is not the smallest", x, d, hi)
	}
	nearest := refRat(t, strconv.FormatFloat(x, 'e', d-1, 64))
	if nearest.Cmp(lr) != 0 && nearest.Cmp(hr) != 0 {
		t.Fatalf("x=%g d=%d: strconv nearest %s is neither %s nor %s", x, d, nearest.FloatString(25), lo, hi)
	}
	if (lr.Cmp(hr) == 0) != (lr.Cmp(xr) == 0) {
		t.Fatalf("x=%g d=%d: lower %s, upper %s", x, d, lo, hi)
	}
}

func TestFormatDirectedRandom(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	n := 0
	for n < cases(24000) {
		var x float64
		switch rng.IntN(4) {
		case 0: // any finite float64, subnormals included
			x = math.Float64frombits(rng.Uint64())
		case 1: // short decimals, often exactly representable
			x = float64(rng.IntN(20001)-10000) / float64(int(1)<<rng.IntN(12))
		case 2: // near powers of ten, where the exponent changes
			x = math.Pow(10, float64(rng.IntN(40)-20))
			x = math.Float64frombits(math.Float64bits(x) + uint64(rng.IntN(5)) - 2)
		default: // moderate magnitudes
			x = (rng.Float64() - 0.5) * math.Pow(10, float64(rng.IntN(30)-15))
		}
		if math.IsInf(x, 0) || math.IsNaN(x) || x == 0 {
			continue
		}
		checkDirected(t, x, 1+rng.IntN(20))
		n++
	}
}

func TestFormatTable(t *testing.T) {
	tests := []struct {
		x      float64
		d      int
		lo, hi string
	}{
		// float64(π)² rounded = 9.86960440108935799230… (math/big).
		{math.Pi * math.Pi, 11, "9.8696044010", "9.8696044011"},
		{1234.5, 2, "1200", "1300"},
		{1234.5, 6, "1234.50", "1234.50"},
		{-1234.5, 2, "-1300", "-1200"},
		{0.5, 1, "0.5", "0.5"},
		{-9.99, 1, "-10", "-9"},
		{9.99, 2, "9.9", "10"},
		{-1.25e-7, 3, "-1.25e-7", "-1.24e-7"}, // float64(-1.25e-7) = -1.24999999999999994343…e-7 (math/big)
		{1e16, 1, "1e+16", "1e+16"},
		{1e15, 3, "1000000000000000", "1000000000000000"},
		{1.5e-5, 2, "0.000015", "0.000016"}, // float64(1.5e-5) = 1.50000000000000003800…e-5 (math/big)
		{1.5e-6, 2, "1.5e-6", "1.6e-6"},     // float64(1.5e-6) = 1.50000000000000003800…e-6 (math/big)
		{0.1, 20, "0.10000000000000000555", "0.10000000000000000556"},
		{math.MaxFloat64, 3, "1.79e+308", "1.80e+308"},
		{0x1p-1074, 2, "4.9e-324", "5.0e-324"},
		{0, 5, "0", "0"},
		{math.Copysign(0, -1), 5, "0", "0"},
		{math.Inf(1), 3, "Infinity", "Infinity"},
		{math.Inf(-1), 3, "-Infinity", "-Infinity"},
	}
	for _, tt := range tests {
		lo, hi := FormatLower(tt.x, tt.d), FormatUpper(tt.x, tt.d)
		if lo != tt.lo || hi != tt.hi {
			t.Errorf("Format(%g, %d) = %s, %s; want %s, %s", tt.x, tt.d, lo, hi, tt.lo, tt.hi)
		}
		if !math.IsInf(tt.x, 0) && tt.x != 0 {
			checkDirected(t, tt.x, tt.d)
		}
	}
}

func TestFormatStyle(t *testing.T) {
	// Plain for leading-digit exponents −5..15, scientific outside.
	tests := []struct {
		x    float64
		want string
	}{
		{0x1p-16, "0.0000152587890625"}, // powers of two: exact expansions by hand
		{0x1p-17, "7.62939453125e-6"},
		{1.25e15, "1250000000000000"},
		{1.25e16, "1.25e+16"},
		{-3, "-3"},
		{2.5, "2.5"},
		{0x1p80, "1.208925819614629174706176e+24"},
		{0.1, "0.1000000000000000055511151231257827021181583404541015625"}, // 0.1 = 3602879701896397/2^55
	}
	for _, tt := range tests {
		if got := FormatExact(tt.x); got != tt.want {
			t.Errorf("FormatExact(%g) = %s, want %s", tt.x, got, tt.want)
		}
	}
}

func TestFormatExactRandom(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 10))
	for i := 0; i < cases(3000); i++ {
		x := math.Float64frombits(rng.Uint64())
		if math.IsInf(x, 0) || math.IsNaN(x) || x == 0 {
			continue
		}
		s := FormatExact(x)
		if refRat(t, s).Cmp(new(big.Rat).SetFloat64(x)) != 0 {
			t.Fatalf("FormatExact(%g) = %s is not exact", x, s)
		}
		ds, _ := sigDigits(t, s, 0)
		if strings.HasSuffix(ds, "0") || len(ds) > 767 {
			t.Fatalf("FormatExact(%g): %d digits, trailing zero or too many", x, len(ds))
		}
		// Exact expansion = FormatLower with that many digits.
		if lo := FormatLower(x, len(ds)); refRat(t, lo).Cmp(refRat(t, s)) != 0 {
			t.Fatalf("FormatExact(%g) = %s but FormatLower = %s", x, s, lo)
		}
	}
	for _, tt := range []struct {
		x    float64
		want string
	}{{math.Inf(1), "Infinity"}, {math.Inf(-1), "-Infinity"}, {0, "0"}, {math.Copysign(0, -1), "0"}} {
		if got := FormatExact(tt.x); got != tt.want {
			t.Errorf("FormatExact(%g) = %s, want %s", tt.x, got, tt.want)
		}
	}
}

func TestFormatInterval(t *testing.T) {
	x, _ := Parse("1/3")
	lo, hi := FormatInterval(x, 5)
	if lo != "0.33333" || hi != "0.33334" {
		t.Errorf("FormatInterval(1/3, 5) = %s, %s", lo, hi)
	}
	// Round trip through ParseLower/ParseUpper stays outward.
	rng := rand.New(rand.NewPCG(11, 12))
	for i := 0; i < cases(2000); i++ {
		a := math.Float64frombits(rng.Uint64())
		if math.IsNaN(a) {
			continue
		}
		d := 1 + rng.IntN(17)
		l, err1 := ParseLower(FormatLower(a, d))
		u, err2 := ParseUpper(FormatUpper(a, d))
		if err1 != nil || err2 != nil || l > a || u < a {
			t.Fatalf("round trip of %g at %d digits: %g, %g (%v, %v)", a, d, l, u, err1, err2)
		}
	}
}

func TestFormatPanics(t *testing.T) {
	for _, f := range []func(){
		func() { FormatLower(1, 0) },
		func() { FormatUpper(math.NaN(), 3) },
		func() { FormatExact(math.NaN()) },
	} {
		func() {
			defer func() {
				if r := recover(); r == nil || !strings.HasPrefix(fmt.Sprint(r), "decimalio: ") {
					t.Errorf("panic = %v, want a decimalio: message", r)
				}
			}()
			f()
		}()
	}
}
