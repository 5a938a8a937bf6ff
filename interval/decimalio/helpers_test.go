package decimalio

import (
	"math"
	"math/big"
	"os"
	"strings"
	"testing"

	"gapcert/interval"
)

// refRat is the exact value of s computed by the reference library
// math/big (big.Rat.SetString), independently of ParseRat. A fraction is
// split at '/' and each side read as a decimal, because SetString would
// read "010/3" with an octal numerator.
func refRat(t testing.TB, s string) *big.Rat {
	t.Helper()
	num, den, isFrac := strings.Cut(s, "/")
	p, ok := new(big.Rat).SetString(num)
	if !ok {
		t.Fatalf("big.Rat.SetString(%q) failed", num)
	}
	if !isFrac {
		return p
	}
	q, ok := new(big.Rat).SetString(den)
	if !ok || q.Sign() == 0 {
		t.Fatalf("big.Rat.SetString(%q) failed or zero", den)
	}
	return p.Quo(p, q)
}

// cmpFloat compares the float64 f (possibly infinite) with r exactly.
func cmpFloat(f float64, r *big.Rat) int {
	switch {
	case math.IsInf(f, 1):
		return 1
	case math.IsInf(f, -1):
		return -1
	}
	return new(big.Rat).SetFloat64(f).Cmp(r)
}

// checkTight fails unless x is the tightest float64 interval containing r:
// Lo ≤ r ≤ Hi exactly, and either Lo = Hi = r or Lo < r < Hi with no
// float64 strictly between Lo and Hi (Hi = Nextafter(Lo, +Inf)).
func checkTight(t testing.TB, what string, x interval.I, r *big.Rat) {
	t.Helper()
	lo, hi := cmpFloat(x.Lo, r), cmpFloat(x.Hi, r)
	if lo > 0 || hi < 0 {
		t.Fatalf("%s: %v does not contain %s", what, x, r.FloatString(30))
	}
	if x.Lo == x.Hi {
		if lo != 0 {
			t.Fatalf("%s: point %v but value %s", what, x, r.FloatString(30))
		}
		return
	}
	if lo == 0 || hi == 0 {
		t.Fatalf("%s: %v not a point although %s is a float64", what, x, r.FloatString(30))
	}
	if math.Nextafter(x.Lo, math.Inf(1)) != x.Hi {
		t.Fatalf("%s: %v has float64 values inside", what, x)
	}
}

// cases returns n, or 50·n when GAPCERT_LONG=1 asks for the long sweeps.
func cases(n int) int {
	if os.Getenv("GAPCERT_LONG") == "1" {
		return 50 * n
	}
	return n
}
