package certs

import (
	"strings"
	"testing"

	"gapcert/fem/claim"
	"gapcert/interval"
)

// enclosure returns a float interval containing [lo, hi] widened by one ulp
// on each side (test data, chosen to contain the stated exact values).
func enclosure(lo, hi float64) interval.I {
	return interval.I{Lo: interval.SubDown(lo, 1e-300), Hi: interval.AddUp(hi, 1e-300)}
}

func sqrt2() interval.I {
	r, _ := interval.Point(2).Sqrt()
	return r
}

func TestEvaluateClaimVerdicts(t *testing.T) {
	// Unit square, Dirichlet: λ_{m,n} = π²(m² + n²) (separation of
	// variables; common practice), so λ1 = 2π² = 19.7392088…, λ2 = 5π² =
	// 49.3480220…, gap = 3π² = 29.6088132…, D = √2 and 3π²/D² = 1.5π² =
	// 14.8044066… (digits of π: 3.14159265358979…, common practice).
	square := map[string]interval.I{
		"lambda1": enclosure(19.7392, 19.7393),
		"lambda2": enclosure(49.3480, 49.3481),
		"D":       sqrt2(),
	}
	// Interval (0, 1), Dirichlet: λ_k = k²π², gap = 3π² = 3π²/D², the
	// equality case of gap ≥ 3π²/D² (Lavine, Proc. Amer. Math. Soc. 121,
	// 1994): no enclosure can decide "≥" there.
	unit := map[string]interval.I{
		"lambda1": enclosure(9.8696, 9.8697),
		"lambda2": enclosure(39.4784, 39.4785),
		"D":       interval.Point(1),
	}
	point := map[string]interval.I{"x": interval.Point(0.1)}
	wide := map[string]interval.I{"x": interval.New(1, 2)}
	tests := []struct {
		claim string
		env   map[string]interval.I
		want  string
	}{
		{"pi > 3.14159", nil, Holds},
		{"pi < 3.14159", nil, Fails},
		{"pi >= 3.14159", nil, Holds},
		{"pi <= 3.1416", nil, Holds},
		{"3.14159 < pi", nil, Holds},
		{"e > 2.71828", nil, Holds}, // e = 2.718281828… (common practice)
		{"pi ≥ 3.15", nil, Fails},
		{"pi ≤ 3.15", nil, Holds},
		{"lambda2 - lambda1 >= 3*pi^2/D^2", square, Holds},
		{"lambda2 - lambda1 <= 3*pi^2/D^2", square, Fails},
		{"(lambda2 - lambda1)*D^2/pi^2 > 2.9", square, Holds},
		{"(lambda2 - lambda1)*D^2/pi^2 > 6.1", square, Fails},
		{"lambda2 - lambda1 >= 3*pi^2/D^2", unit, Undecided},
		{"lambda2 - lambda1 > 29.6", unit, Holds},
		{"x >= x", point, Holds},
		{"x <= x", point, Holds},
		{"x > x", point, Fails},
		{"x < x", point, Fails},
		{"x >= x", wide, Undecided},
		{"x > x", wide, Undecided},
		{"x < x", wide, Undecided},
		{"x >= 1", wide, Holds},
		{"x > 1", wide, Undecided},
		{"x <= 2", wide, Holds},
		{"x < 2", wide, Undecided},
		{"x > 2", wide, Fails},
		{"x < 1", wide, Fails},
	}
	for _, tc := range tests {
		c, err := claim.Parse(tc.claim)
		if err != nil {
			t.Fatalf("%q: %v", tc.claim, err)
		}
		r := EvaluateClaim(c, tc.env)
		if r.Verdict != tc.want {
			t.Errorf("%q: verdict %q, margin [%s, %s], reason %q; want %q", tc.claim, r.Verdict, r.Margin.Lower, r.Margin.Upper, r.Reason, tc.want)
		}
		if r.Text != tc.claim {
			t.Errorf("%q: text %q", tc.claim, r.Text)
		}
		m, err := r.Margin.Interval()
		if err != nil {
			t.Fatalf("%q: margin %v", tc.claim, err)
		}
		// The printed margin must carry the verdict on its own.
		holds, fails := c.Decide(m)
		got := map[[2]bool]string{{true, false}: Holds, {false, true}: Fails, {false, false}: Undecided}[[2]bool{holds, fails}]
		if r.Verdict != Undecided && got != r.Verdict {
			t.Errorf("%q: verdict from the printed margin is %q, want %q", tc.claim, got, r.Verdict)
		}
	}
}

// TestMarginEnclosesDifference: for the square the margin of
// "lambda2 - lambda1 >= 3*pi^2/D^2" must contain 3π² − 1.5π² = 1.5π² =
// 14.8044066016… (exact for the true eigenvalues) and be narrow.
func TestMarginEnclosesDifference(t *testing.T) {
	env := map[string]interval.I{
		"lambda1": enclosure(19.739208802178716, 19.739208802178720),
		"lambda2": enclosure(49.348022005446790, 49.348022005446796),
		"D":       sqrt2(),
	}
	c, err := claim.Parse("lambda2 - lambda1 >= 3*pi^2/D^2")
	if err != nil {
		t.Fatal(err)
	}
	r := EvaluateClaim(c, env)
	m, err := r.Margin.Interval()
	if err != nil {
		t.Fatal(err)
	}
	const halfPi2x3 = 14.804406601634037 // 1.5π², from π = 3.14159265358979323846 (common practice)
	if !m.Contains(halfPi2x3) {
		t.Errorf("margin %v does not contain 1.5π² = %v", m, halfPi2x3)
	}
	if m.Wid() > 1e-13 {
		t.Errorf("margin %v has width %g, want ≤ 1e-13", m, m.Wid())
	}
}

func TestEvaluateUndecidedWithReason(t *testing.T) {
	tests := []struct {
		claim  string
		env    map[string]interval.I
		reason string
	}{
		{"lambda3 > 1", map[string]interval.I{"lambda1": interval.Point(1)}, "lambda3"},
		{"log(x) > 0", map[string]interval.I{"x": interval.New(-1, 2)}, "log"},
	}
	for _, tc := range tests {
		c, err := claim.Parse(tc.claim)
		if err != nil {
			t.Fatal(err)
		}
		r := EvaluateClaim(c, tc.env)
		if r.Verdict != Undecided || !strings.Contains(r.Reason, tc.reason) {
			t.Errorf("%q: verdict %q reason %q; want undecided naming %q", tc.claim, r.Verdict, r.Reason, tc.reason)
		}
		if r.Margin.Lower != "-Infinity" || r.Margin.Upper != "Infinity" {
			t.Errorf("%q: margin %v, want the whole line", tc.claim, r.Margin)
		}
	}
}

// TestResultsQuantity: the quantities a certificate's results record, by
// their claim names.
func TestResultsQuantity(t *testing.T) {
	r := Results{
		Eigenvalues: []Eigen{{Index: 1, Lower: "1", Upper: "2"}, {Index: 2, Lower: "3", Upper: "4"}},
		Gap:         Bound{Lower: "1", Upper: "3"},
		Diameter:    Bound{Lower: "5", Upper: "5"},
	}
	for name, want := range map[string]Bound{"lambda1": {"1", "2"}, "lambda2": {"3", "4"}, "gap": {"1", "3"}, "D": {"5", "5"}} {
		if got, ok := r.Quantity(name); !ok || got != want {
			t.Errorf("%s = %v, %v; want %v", name, got, ok, want)
		}
	}
	for _, name := range []string{"lambda3", "area", "alpha", "x"} {
		if _, ok := r.Quantity(name); ok {
			t.Errorf("%s recorded", name)
		}
	}
}
