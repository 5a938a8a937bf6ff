package hypothesis

import (
	"fmt"
	"math"
	"math/big"
	"testing"

	"gapcert/fem/problem"
	"gapcert/interval/formula"
)

func sq(a, b int64) surd { return sqrtRatSurd(big.NewRat(a, b)) }

func rat(a, b int64) surd { return ratSurd(big.NewRat(a, b)) }

// TestSurdZero checks identities of square roots (elementary algebra,
// common practice) and non-identities that differ by little.
func TestSurdZero(t *testing.T) {
	for _, tc := range []struct {
		name string
		s    surd
		zero bool
	}{
		{"√8 − 2√2", sq(8, 1).sub(sq(2, 1).scale(big.NewRat(2, 1))), true},
		{"√2·√3 − √6", sq(2, 1).mul(sq(3, 1)).sub(sq(6, 1)), true},
		{"2√(1/2) − √2", sq(1, 2).scale(big.NewRat(2, 1)).sub(sq(2, 1)), true},
		{"(√3 + √2)(√3 − √2) − 1", sq(3, 1).add(sq(2, 1)).mul(sq(3, 1).sub(sq(2, 1))).sub(rat(1, 1)), true},
		{"√(9/4) − 3/2", sq(9, 4).sub(rat(3, 2)), true},
		{"(√6 + √2)²/16 − (2 + √3)/4", sq(6, 1).add(sq(2, 1)).mul(sq(6, 1).add(sq(2, 1))).scale(big.NewRat(1, 16)).sub(rat(2, 4).add(sq(3, 1).scale(big.NewRat(1, 4)))), true},
		{"√2 + √3 − √10", sq(2, 1).add(sq(3, 1)).sub(sq(10, 1)), false},
		{"√(10^40 + 1) − 10^20", sqrtRatSurd(new(big.Rat).SetFrac(new(big.Int).Add(new(big.Int).Exp(big.NewInt(10), big.NewInt(40), nil), big.NewInt(1)), big.NewInt(1))).sub(ratSurd(new(big.Rat).SetFrac(new(big.Int).Exp(big.NewInt(10), big.NewInt(20), nil), big.NewInt(1)))), false},
		{"1/3 − 0.333", rat(1, 3).sub(rat(333, 1000)), false},
	} {
		if got := tc.s.isZero(); got != tc.zero {
			t.Errorf("%s: zero %v, want %v (%v)", tc.name, got, tc.zero, tc.s)
		}
		if e := tc.s.enclose(); tc.zero && !e.ContainsZero() {
			t.Errorf("%s: enclosure %v excludes 0", tc.name, e)
		}
	}
}

// TestSurdRatioSquare: 8(2 + √3) = (2√2)²·(2 + √3); 3(2 + √3) is not a
// rational square times 2 + √3, nor is 2 − √3.
func TestSurdRatioSquare(t *testing.T) {
	base := rat(2, 1).add(sq(3, 1))
	if w, ok := base.scale(big.NewRat(8, 1)).ratioSquare(base); ok {
		t.Errorf("8(2 + √3): ratio square %v, want none (√8 is irrational)", w)
	}
	if w, ok := base.scale(big.NewRat(9, 4)).ratioSquare(base); !ok || w.Cmp(big.NewRat(3, 2)) != 0 {
		t.Errorf("(9/4)(2 + √3): %v %v, want 3/2", w, ok)
	}
	if _, ok := base.scale(big.NewRat(3, 1)).ratioSquare(base); ok {
		t.Error("3(2 + √3) accepted")
	}
	if _, ok := rat(2, 1).sub(sq(3, 1)).ratioSquare(base); ok {
		t.Error("2 − √3 accepted as a square multiple of 2 + √3")
	}
}

// TestNumberSurd reads exact constants and compares with the interval
// evaluation of the same formula (package interval/formula); cos and sin
// of kπ/12 for k from −30 to 30 must match the formula's enclosure.
func TestNumberSurd(t *testing.T) {
	for _, tc := range []struct {
		text string
		want surd // nil: compare with the enclosure only
		read bool
	}{
		{"sqrt(3)/2", sq(3, 4), true},
		{"2^(-1)", rat(1, 2), true},
		{"-(3)", rat(-3, 1), true},
		{"sqrt(2)^2", rat(2, 1), true},
		{"(1+sqrt(2))^3", rat(7, 1).add(sq(2, 1).scale(big.NewRat(5, 1))), true},
		{"1.5e-3*sqrt(8)", sq(2, 1).scale(big.NewRat(3, 1000)), true},
		{"cos(pi/12)", sq(6, 16).add(sq(2, 16)), true},
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
		s, ok := numberSurd(constNumber(t, tc.text))
		if ok != tc.read {
			t.Errorf("%s: read %v, want %v", tc.text, ok, tc.read)
			continue
		}
		if ok && !s.sub(tc.want).isZero() {
			t.Errorf("%s: %v, want %v", tc.text, s, tc.want)
		}
	}
	for k := -30; k <= 30; k++ {
		for _, f := range []string{"cos", "sin"} {
			text := fmt.Sprintf("%s(%d*pi/12)", f, k)
			n := constNumber(t, text)
			s, ok := numberSurd(n)
			if !ok {
				t.Errorf("%s not read", text)
				continue
			}
			want := math.Cos(float64(k) * math.Pi / 12)
			if f == "sin" {
				want = math.Sin(float64(k) * math.Pi / 12)
			}
			e := s.enclose()
			if _, meet := e.Intersection(n.Val); !meet || math.Abs(e.Mid()-want) > 1e-14 {
				t.Errorf("%s: %v (enclosure %v), want ≈ %v, formula enclosure %v", text, s, e, want, n.Val)
			}
		}
	}
}

// constNumber reads text as the x coordinate of a vertex of a problem,
// so that it carries the canonical text and enclosure fem/problem gives.
func constNumber(t *testing.T, text string) problem.Number {
	t.Helper()
	if _, err := formula.Parse(text); err != nil {
		t.Fatalf("%s: %v", text, err)
	}
	p := polygonProblem(t, "-10", "-1", text, "-2", "10", "3")
	for _, v := range p.Vertices {
		if v[1].Text == "-2" {
			return v[0]
		}
	}
	t.Fatalf("%s: vertex not found", text)
	return problem.Number{}
}
