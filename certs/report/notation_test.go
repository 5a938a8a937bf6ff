package report

import (
	"fmt"
	"math/big"
	"math/rand/v2"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"gapcert/interval/decimalio"
)

func rat(t *testing.T, s string) *big.Rat {
	t.Helper()
	r, err := decimalio.ParseRat(s)
	if err != nil {
		t.Fatalf("%q: %v", s, err)
	}
	return r
}

// The example of the package documentation and cases of each layout; the
// expected strings are worked out by hand from the rounding rule (lower end
// toward −∞, upper end toward +∞ at the place 10^q of the width's second
// significant digit).
func TestShortenCases(t *testing.T) {
	cases := []struct {
		lo, hi         string
		digits         int
		wantLo, wantHi string
		exp, common    int
	}{
		// Common leading digits 9.86960440, tails 1 and 3.
		{"9.869604401", "9.869604403", 0, "9.869604401", "9.869604403", 0, 10},
		{"9.869604401", "9.869604403", 1, "9.869604401", "9.869604403", 0, 10},
		// Rounded outward at 10^-16 (width 4.1e-15) and at 10^-15 (width 1.1e-14).
		{"9.8696044010893580", "9.8696044010893621", 0, "9.8696044010893580", "9.8696044010893621", 0, 15},
		{"9.8696044010893580", "9.8696044010893691", 0, "9.869604401089358", "9.869604401089370", 0, 15},
		// Trailing zeros shared by both ends are dropped.
		{"2.5", "2.7", 0, "2.5", "2.7", 0, 2},
		// Negative ends: the subscript is still the lower end.
		{"-0.11024881699230882", "-0.11024881699207167", 0, "-0.11024881699231", "-0.11024881699207", 0, 15},
		// The ends differ in the first digit: bracket form.
		{"0.99999999999955324", "1.0000000000000107", 0, "0.99999999999955", "1.00000000000002", 0, 0},
		// Opposite signs: bracket form.
		{"-9.2637009174723062e-13", "4.7206683007061657e-13", 0, "-1.0", "0.5", -12, 0},
		// Small and large magnitudes get a factor 10^Exp.
		{"1.2345e-7", "1.2349e-7", 0, "1.2345", "1.2349", -7, 5},
		{"6.02214076e+23", "6.02214077e+23", 0, "6.02214076", "6.02214077", 23, 9},
		// Digits of the tails before the point: bracket form.
		{"123.5", "124.5", 0, "123.5", "124.5", 0, 0},
		// Exact values are printed once.
		{"4", "4", 0, "4", "4", 0, 1},
		{"0.000125", "0.000125", 0, "1.25", "1.25", -4, 4},
		// Unbounded ends.
		{"-Infinity", "Infinity", 0, "-Infinity", "Infinity", 0, 0},
		{"0.30102999566398120", "Infinity", 0, "0.30102999", "Infinity", 0, 0},
	}
	for _, c := range cases {
		s, err := Shorten(c.lo, c.hi, c.digits)
		if err != nil {
			t.Errorf("Shorten(%s, %s): %v", c.lo, c.hi, err)
			continue
		}
		if s.Lo != c.wantLo || s.Hi != c.wantHi || s.Exp != c.exp || s.Common != c.common {
			t.Errorf("Shorten(%s, %s, %d) = %+v, want Lo %s Hi %s Exp %d Common %d", c.lo, c.hi, c.digits, s, c.wantLo, c.wantHi, c.exp, c.common)
		}
	}
}

func TestShortenRejects(t *testing.T) {
	for _, c := range [][2]string{{"2", "1"}, {"abc", "1"}, {"1", "0x10"}, {"Infinity", "Infinity"}, {"-Infinity", "-Infinity"}, {"1", ""}} {
		if s, err := Shorten(c[0], c[1], 0); err == nil {
			t.Errorf("Shorten(%q, %q) = %+v, want an error", c[0], c[1], s)
		}
	}
}

// randomDecimal returns a decimal string with 1–19 significant digits and
// a decimal exponent in [−40, 40], in plain or scientific notation.
func randomDecimal(rng *rand.Rand) string {
	n := rng.Uint64N(10_000_000_000_000_000_000-1) >> rng.UintN(64)
	s := strconv.FormatUint(n, 10)
	if rng.IntN(2) == 0 {
		s = "-" + s
	}
	e := rng.IntN(81) - 40
	if rng.IntN(2) == 0 {
		return s + "e" + strconv.Itoa(e)
	}
	if e < 0 && -e < len(strings.TrimPrefix(s, "-")) {
		t := strings.TrimPrefix(s, "-")
		cut := len(t) + e
		return strings.TrimSuffix(s, t) + t[:cut] + "." + t[cut:]
	}
	return s + "e" + strconv.Itoa(e)
}

var (
	latexCompact  = regexp.MustCompile(`^\$(-?[0-9.]+)_\{([0-9.]+)\}\^\{([0-9.]+)\}(?:\\times 10\^\{(-?[0-9]+)\})?\$$`)
	latexBracket  = regexp.MustCompile(`^\$\[(-?[0-9.]+), (-?[0-9.]+)\](?:\\times 10\^\{(-?[0-9]+)\})?\$$`)
	latexPoint    = regexp.MustCompile(`^\$(-?[0-9.]+)(?:\\times 10\^\{(-?[0-9]+)\})?\$$`)
	markdownTails = regexp.MustCompile(`^(-?[0-9.]+)<sub>([0-9.]+)</sub><sup>([0-9.]+)</sup>(?: × 10<sup>(-?[0-9]+)</sup>)?$`)
)

// readLaTeX reads the exact ends back from the LaTeX text of an enclosure
// (the test's own parser of the printed notation).
func readLaTeX(t *testing.T, text string) (lo, hi *big.Rat) {
	t.Helper()
	scale := func(s string) *big.Rat {
		if s == "" {
			return big.NewRat(1, 1)
		}
		e, _ := strconv.Atoi(s)
		return pow10Rat(e)
	}
	if m := latexCompact.FindStringSubmatch(text); m != nil {
		f := scale(m[4])
		return new(big.Rat).Mul(rat(t, m[1]+m[2]), f), new(big.Rat).Mul(rat(t, m[1]+m[3]), f)
	}
	if m := latexBracket.FindStringSubmatch(text); m != nil {
		f := scale(m[3])
		return new(big.Rat).Mul(rat(t, m[1]), f), new(big.Rat).Mul(rat(t, m[2]), f)
	}
	if m := latexPoint.FindStringSubmatch(text); m != nil {
		v := new(big.Rat).Mul(rat(t, m[1]), scale(m[2]))
		return v, v
	}
	t.Fatalf("cannot read the enclosure %q", text)
	return nil, nil
}

// TestShortenEncloses checks, for many random pairs of decimal bounds, that
// the printed ends read back from the LaTeX and Markdown text enclose the
// certified ends exactly (math/big comparisons), and that the printed
// width stays within the bound of the package documentation.
func TestShortenEncloses(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	count := 20000
	for i := range count {
		lo := rat(t, randomDecimal(rng))
		var hi *big.Rat
		switch i % 4 {
		case 0: // independent ends
			hi = rat(t, randomDecimal(rng))
		case 1: // a narrow enclosure: width 10^-k relative
			w := rat(t, randomDecimal(rng))
			w.Abs(w)
			w.Mul(w, new(big.Rat).Abs(lo))
			w.Mul(w, pow10Rat(-rng.IntN(25)))
			hi = new(big.Rat).Add(lo, w)
		case 2: // an exact value
			hi = new(big.Rat).Set(lo)
		case 3: // ends around a power of ten (carries through the digits)
			p := pow10Rat(rng.IntN(21) - 10)
			eps := new(big.Rat).Mul(p, pow10Rat(-rng.IntN(18)-1))
			lo = new(big.Rat).Sub(p, new(big.Rat).Mul(eps, big.NewRat(int64(rng.IntN(9)+1), 1)))
			hi = new(big.Rat).Add(p, new(big.Rat).Mul(eps, big.NewRat(int64(rng.IntN(9)), 1)))
		}
		if lo.Cmp(hi) > 0 {
			lo, hi = hi, lo
		}
		loText, hiText := exactText(lo), exactText(hi)
		digits := 1 + i%4
		s, err := Shorten(loText, hiText, digits)
		if err != nil {
			t.Fatalf("Shorten(%s, %s): %v", loText, hiText, err)
		}
		for _, compact := range []bool{true, false} {
			pl, ph := readLaTeX(t, latexStyle{}.number(s, compact))
			if pl.Cmp(lo) > 0 || ph.Cmp(hi) < 0 {
				t.Fatalf("[%s, %s] printed as %s does not enclose it", loText, hiText, latexStyle{}.number(s, compact))
			}
			if s.LoRat().Cmp(pl) != 0 || s.HiRat().Cmp(ph) != 0 {
				t.Fatalf("[%s, %s]: LoRat/HiRat differ from the printed %s", loText, hiText, latexStyle{}.number(s, compact))
			}
			w := new(big.Rat).Sub(hi, lo)
			limit := new(big.Rat).Mul(w, new(big.Rat).Add(big.NewRat(1, 1), new(big.Rat).Mul(big.NewRat(2, 1), pow10Rat(1-digits))))
			if pw := new(big.Rat).Sub(ph, pl); pw.Cmp(limit) > 0 {
				t.Fatalf("[%s, %s] printed as %s is wider than %s", loText, hiText, latexStyle{}.number(s, compact), limit.FloatString(30))
			}
		}
		if s.Common > 0 && !s.Point {
			md := markdownStyle{}.number(s, true)
			m := markdownTails.FindStringSubmatch(md)
			if m == nil {
				t.Fatalf("Markdown %q is not in the compact form", md)
			}
			f := big.NewRat(1, 1)
			if m[4] != "" {
				e, _ := strconv.Atoi(m[4])
				f = pow10Rat(e)
			}
			if new(big.Rat).Mul(rat(t, m[1]+m[2]), f).Cmp(lo) > 0 || new(big.Rat).Mul(rat(t, m[1]+m[3]), f).Cmp(hi) < 0 {
				t.Fatalf("[%s, %s] printed as %s does not enclose it", loText, hiText, md)
			}
		}
	}
}

// exactText writes a rational with a terminating decimal expansion exactly.
func exactText(r *big.Rat) string {
	n, q := exactDigits(r)
	return fmt.Sprintf("%se%d", n.String(), q)
}

func ExampleShorten() {
	s, _ := Shorten("9.869604401", "9.869604403", 0)
	fmt.Printf("%s_{%s}^{%s}\n", s.Lo[:s.Common], s.Lo[s.Common:], s.Hi[s.Common:])
	// Output: 9.86960440_{1}^{3}
}
