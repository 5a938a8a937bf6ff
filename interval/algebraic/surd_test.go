package algebraic

import (
	"fmt"
	"math"
	"math/big"
	"testing"

	"gapcert/interval"
	"gapcert/interval/formula"
)

func sq(a, b int64) Surd { return SqrtSurd(big.NewRat(a, b)) }

func rat(a, b int64) Surd { return NewSurd(big.NewRat(a, b)) }

// TestSurdZero checks identities of square roots (elementary algebra,
// common practice) and non-identities that differ by little.
func TestSurdZero(t *testing.T) {
	for _, tc := range []struct {
		name string
		s    Surd
		zero bool
	}{
		{"√8 − 2√2", sq(8, 1).Sub(sq(2, 1).Scale(big.NewRat(2, 1))), true},
		{"√2·√3 − √6", sq(2, 1).Mul(sq(3, 1)).Sub(sq(6, 1)), true},
		{"2√(1/2) − √2", sq(1, 2).Scale(big.NewRat(2, 1)).Sub(sq(2, 1)), true},
		{"(√3 + √2)(√3 − √2) − 1", sq(3, 1).Add(sq(2, 1)).Mul(sq(3, 1).Sub(sq(2, 1))).Sub(rat(1, 1)), true},
		{"√(9/4) − 3/2", sq(9, 4).Sub(rat(3, 2)), true},
		{"(√6 + √2)²/16 − (2 + √3)/4", sq(6, 1).Add(sq(2, 1)).Mul(sq(6, 1).Add(sq(2, 1))).Scale(big.NewRat(1, 16)).Sub(rat(2, 4).Add(sq(3, 1).Scale(big.NewRat(1, 4)))), true},
		{"√2 + √3 − √10", sq(2, 1).Add(sq(3, 1)).Sub(sq(10, 1)), false},
		{"√(10^40 + 1) − 10^20", SqrtSurd(new(big.Rat).SetFrac(new(big.Int).Add(new(big.Int).Exp(big.NewInt(10), big.NewInt(40), nil), big.NewInt(1)), big.NewInt(1))).Sub(NewSurd(new(big.Rat).SetFrac(new(big.Int).Exp(big.NewInt(10), big.NewInt(20), nil), big.NewInt(1)))), false},
		{"1/3 − 0.333", rat(1, 3).Sub(rat(333, 1000)), false},
	} {
		if got := tc.s.IsZero(); got != tc.zero {
			t.Errorf("%s: zero %v, want %v (%v)", tc.name, got, tc.zero, tc.s)
		}
		if e := tc.s.Enclose(); tc.zero && !e.ContainsZero() {
			t.Errorf("%s: enclosure %v excludes 0", tc.name, e)
		}
	}
}

// TestSurdRatioSquare: 8(2 + √3) = (2√2)²·(2 + √3); 3(2 + √3) is not a
// rational square times 2 + √3, nor is 2 − √3.
func TestSurdRatioSquare(t *testing.T) {
	base := rat(2, 1).Add(sq(3, 1))
	if w, ok := base.Scale(big.NewRat(8, 1)).RatioSquare(base); ok {
		t.Errorf("8(2 + √3): ratio square %v, want none (√8 is irrational)", w)
	}
	if w, ok := base.Scale(big.NewRat(9, 4)).RatioSquare(base); !ok || w.Cmp(big.NewRat(3, 2)) != 0 {
		t.Errorf("(9/4)(2 + √3): %v %v, want 3/2", w, ok)
	}
	if _, ok := base.Scale(big.NewRat(3, 1)).RatioSquare(base); ok {
		t.Error("3(2 + √3) accepted")
	}
	if _, ok := rat(2, 1).Sub(sq(3, 1)).RatioSquare(base); ok {
		t.Error("2 − √3 accepted as a square multiple of 2 + √3")
	}
}

// TestReadSurd reads exact constants and compares with the interval
// evaluation of the same formula (package interval/formula); cos and sin
// of kπ/12 for k from −30 to 30 must match the formula's enclosure.
func TestReadSurd(t *testing.T) {
	for _, tc := range []struct {
		text string
		want Surd // nil: compare with the enclosure only
		read bool
	}{
		{"sqrt(3)/2", sq(3, 4), true},
		{"2^(-1)", rat(1, 2), true},
		{"-(3)", rat(-3, 1), true},
		{"sqrt(2)^2", rat(2, 1), true},
		{"(1+sqrt(2))^3", rat(7, 1).Add(sq(2, 1).Scale(big.NewRat(5, 1))), true},
		{"1.5e-3*sqrt(8)", sq(2, 1).Scale(big.NewRat(3, 1000)), true},
		{"cos(pi/12)", sq(6, 16).Add(sq(2, 16)), true},
		{"sin(-pi/6)", rat(-1, 2), true},
		{"cos(0)", rat(1, 1), true},
		{"cos(pi/5)", nil, false},
		{"exp(0)", nil, false},
		{"1/sqrt(2)", sq(1, 2), true},
		{"3/(2*sqrt(3))", sq(3, 4), true},
		{"1/(1+sqrt(2))", nil, false},
		{"sqrt(sqrt(2))", nil, false},
		{"e", nil, false},
		{"pi", nil, false},
	} {
		s, ok := ReadSurd(canonical(t, tc.text))
		if ok != tc.read {
			t.Errorf("%s: read %v, want %v", tc.text, ok, tc.read)
			continue
		}
		if ok && !s.Sub(tc.want).IsZero() {
			t.Errorf("%s: %v, want %v", tc.text, s, tc.want)
		}
	}
	for k := -30; k <= 30; k++ {
		for _, f := range []string{"cos", "sin"} {
			text := fmt.Sprintf("%s(%d*pi/12)", f, k)
			text, val := canonical(t, text)
			s, ok := ReadSurd(text, val)
			if !ok {
				t.Errorf("%s not read", text)
				continue
			}
			want := math.Cos(float64(k) * math.Pi / 12)
			if f == "sin" {
				want = math.Sin(float64(k) * math.Pi / 12)
			}
			e := s.Enclose()
			if _, meet := e.Intersection(val); !meet || math.Abs(e.Mid()-want) > 1e-14 {
				t.Errorf("%s: %v (enclosure %v), want ≈ %v, formula enclosure %v", text, s, e, want, val)
			}
		}
	}
}

// canonical returns the canonical text of the constant formula src and
// its enclosure, as package formula gives them (and fem/problem stores
// them).
func canonical(t *testing.T, src string) (string, interval.I) {
	t.Helper()
	e, err := formula.Parse(src)
	if err != nil {
		t.Fatalf("%s: %v", src, err)
	}
	val, err := e.EvalConst()
	if err != nil {
		t.Fatalf("%s: %v", src, err)
	}
	return e.String(), val
}
