package plot

import "testing"

func TestMathText(t *testing.T) {
	for _, tc := range []struct{ src, want string }{
		{"D^2*gap/pi^2", "D²·gap/π²"},
		{"lambda1", "λ₁"},
		{"lambda12/lambda2", "λ₁₂/λ₂"},
		{"lambda2 - lambda1 >= 3*pi^2/D^2", "λ₂ − λ₁ ≥ 3·π²/D²"},
		{"D^2*gap >= 75", "D²·gap ≥ 75"},
		{"gap <= 2", "gap ≤ 2"},
		{"3 + c^2/100", "3 + c²/100"},
		{"alpha", "α"},
		{"robin_interval_gap", "robin_interval_gap"}, // a reference name stays
		{"lambda", "lambda"},                         // no index: a plain name
		{"lambda1x", "lambda1x"},                     // another name
		{"alphabet", "alphabet"},
		{"x^10", "x^10"}, // the font has no ⁰: the exponent stays
		{"x^9", "x^9"},   // nor ⁹
		{"x^-1", "x^−1"},
		{"x^2.5", "x^2.5"}, // not an integer literal
		{"x^2e1", "x^2e1"},
		{"x^(2)", "x^(2)"},
		{"x^ 2", "x^ 2"},
		{"2^3^4", "2^3⁴"},        // not 2³⁴, which reads as 2^34
		{"1e-8*gap", "1e-8·gap"}, // a number is kept as written
		{"sqrt(area)", "sqrt(area)"},
		{"", ""},
	} {
		if got := MathText(tc.src); got != tc.want {
			t.Errorf("MathText(%q) = %q, want %q", tc.src, got, tc.want)
		}
		if got := MathText(tc.src); drawable(got) != got {
			t.Errorf("MathText(%q) = %q has runes the font lacks", tc.src, got)
		}
	}
}

func TestLambdaSubscripts(t *testing.T) {
	for _, tc := range []struct{ s, want string }{
		{"λ1 ∈ [9.8696, 9.8697]", "λ₁ ∈ [9.8696, 9.8697]"},
		{"λ12 and λ2", "λ₁₂ and λ₂"},
		{"λ", "λ"},
		{"2π² (sin πx sin πy)", "2π² (sin πx sin πy)"},
	} {
		if got := LambdaSubscripts(tc.s); got != tc.want {
			t.Errorf("LambdaSubscripts(%q) = %q, want %q", tc.s, got, tc.want)
		}
	}
}
