package algebraic

import (
	"fmt"
	"math"
	"math/big"
	"testing"
)

// TestCyclotomicPoly checks Φ_m against known polynomials (common
// practice): Φ_1 = x − 1, Φ_2 = x + 1, Φ_4 = x² + 1, Φ_6 = x² − x + 1,
// Φ_12 = x⁴ − x² + 1, Φ_8 = x⁴ + 1; degree φ(m); and Φ_105, the first
// with a coefficient −2, at x^7 and x^41 (A. Migotti, 1883; common
// practice).
func TestCyclotomicPoly(t *testing.T) {
	memo := map[int][]*big.Int{}
	for m, want := range map[int][]int64{
		1: {-1, 1}, 2: {1, 1}, 4: {1, 0, 1}, 6: {1, -1, 1}, 8: {1, 0, 0, 0, 1}, 12: {1, 0, -1, 0, 1},
	} {
		got := cyclotomicPoly(m, memo)
		if len(got) != len(want) {
			t.Errorf("Φ_%d = %v, want %v", m, got, want)
			continue
		}
		for i := range want {
			if got[i].Int64() != want[i] {
				t.Errorf("Φ_%d = %v, want %v", m, got, want)
				break
			}
		}
	}
	p := cyclotomicPoly(105, memo)
	if len(p)-1 != 48 || p[7].Int64() != -2 || p[41].Int64() != -2 {
		t.Errorf("Φ_105: degree %d, x^7: %v, x^41: %v; want 48, −2, −2", len(p)-1, p[7], p[41])
	}
	for _, m := range []int{5, 7, 9, 10, 20, 28, 36, 100} {
		phi := 0
		for k := 1; k <= m; k++ {
			if new(big.Int).GCD(nil, nil, big.NewInt(int64(k)), big.NewInt(int64(m))).Int64() == 1 {
				phi++
			}
		}
		if d := len(cyclotomicPoly(m, memo)) - 1; d != phi {
			t.Errorf("deg Φ_%d = %d, want φ = %d", m, d, phi)
		}
	}
}

// cycOf reads text as a root sum and maps it into Q(ζ_m).
func cycOf(t *testing.T, f *CyclotomicField, text string) Cyclotomic {
	t.Helper()
	s, ok := ReadRootSum(canonical(t, text))
	if !ok {
		t.Fatalf("%s not read", text)
	}
	return f.Element(s)
}

// TestCyclotomicIdentities checks identities of trigonometry and roots of
// unity (common practice) exactly in Q(ζ_120) and the enclosures against
// math.Cos, math.Sin.
func TestCyclotomicIdentities(t *testing.T) {
	f, ok := newCycField(120)
	if !ok {
		t.Fatal("Q(ζ_120) refused")
	}
	one := cycOf(t, f, "1")
	for _, k := range []int{1, 2, 3, 7, 11, 29} {
		c := cycOf(t, f, fmt.Sprintf("cos(%d*pi/30)", k))
		s := cycOf(t, f, fmt.Sprintf("sin(%d*pi/30)", k))
		if !c.Mul(c).Add(s.Mul(s)).Sub(one).IsZero() {
			t.Errorf("cos² + sin² ≠ 1 at %dπ/30", k)
		}
		if e := c.Enclose(); math.Abs(e.Mid()-math.Cos(float64(k)*math.Pi/30)) > 1e-14 {
			t.Errorf("cos(%dπ/30) enclosure %v", k, e)
		}
		if e := s.Enclose(); math.Abs(e.Mid()-math.Sin(float64(k)*math.Pi/30)) > 1e-14 {
			t.Errorf("sin(%dπ/30) enclosure %v", k, e)
		}
	}
	// 4cos²(2π/5) + 2cos(2π/5) − 1 = 0, since 2cos(2π/5) = (√5 − 1)/2.
	c := cycOf(t, f, "2*cos(2*pi/5)")
	if !c.Mul(c).Add(c).Sub(one).IsZero() {
		t.Error("(2cos(2π/5))² + 2cos(2π/5) − 1 ≠ 0")
	}
	// Σ_k cos(2πk/5) = 0 (the fifth roots of unity sum to 0), and
	// (√2·√3)² = 6.
	sum := cycOf(t, f, "0")
	for k := range 5 {
		sum = sum.Add(cycOf(t, f, fmt.Sprintf("cos(%d*pi/5)", 2*k)))
	}
	if !sum.IsZero() {
		t.Error("Σ cos(2πk/5) ≠ 0")
	}
	r6 := cycOf(t, f, "sqrt(2)*sqrt(3)")
	if !r6.Mul(r6).Sub(one.Scale(big.NewRat(6, 1))).IsZero() || r6.Enclose().Mid() < 2.449 {
		t.Errorf("√2·√3: square ≠ 6 or value %v", r6.Enclose())
	}
	if c.IsZero() || !c.Sub(c).IsZero() {
		t.Error("zero test")
	}
	if _, ok := ReadRootSum(canonical(t, "sqrt(5)")); ok {
		t.Error("sqrt(5) read, but only √(s²k), k ∈ {1, 2, 3, 6}, is")
	}
}
