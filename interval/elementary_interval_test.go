package interval

import (
	"errors"
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"testing"
)

// elNearest rounds a reference value to the nearest float64.
func elNearest(v *big.Float) float64 { f, _ := v.Float64(); return f }

// elMin, elMax return the smaller / larger of two references.
func elMinMax(vals []*big.Float) (lo, hi *big.Float) {
	lo, hi = vals[0], vals[0]
	for _, v := range vals[1:] {
		if v.Cmp(lo) < 0 {
			lo = v
		}
		if v.Cmp(hi) > 0 {
			hi = v
		}
	}
	return lo, hi
}

// elCheckRange checks that v contains every sampled reference value and
// that v exceeds the exact range [lo, hi] by at most limit ulps at each end.
func elCheckRange(t *testing.T, name string, x I, v I, samples []*big.Float, lo, hi *big.Float, limit int64) {
	t.Helper()
	for _, s := range samples {
		if !elContains(v, s) {
			t.Fatalf("%s(%v) = %v misses the value %s", name, x, v, s.Text('g', 20))
		}
	}
	if d := elOrd(elNearest(lo)) - elOrd(v.Lo); d > limit {
		t.Errorf("%s(%v) = %v: lower end %d ulps below the range minimum %s", name, x, v, d, lo.Text('g', 20))
	}
	if d := elOrd(v.Hi) - elOrd(elNearest(hi)); d > limit {
		t.Errorf("%s(%v) = %v: upper end %d ulps above the range maximum %s", name, x, v, d, hi.Text('g', 20))
	}
}

// TestIntervalArguments checks interval arguments: the enclosure contains
// the reference values at the ends and at random interior points, and it
// is at most a few ulps wider than the exact range (monotone functions:
// the values at the ends; cosh: 1 when 0 is inside; sin and cos: ±1 at the
// multiples of π/2 inside, located with the 400-bit reference π).
func TestIntervalArguments(t *testing.T) {
	type fcase struct {
		name  string
		f     func(I) I
		ref   func(float64) *big.Float
		a0    float64 // left ends uniform in [a0, a1]
		a1    float64
		limit int64
		kind  int // 0 monotone increasing, 1 cosh, 2 sin, 3 cos
	}
	cases := []fcase{
		{"exp", Exp, refExpF, -700, 700, 3, 0},
		{"log", elMust(Log), refLogF, 1e-9, 1e9, 2, 0},
		{"atan", Atan, func(x float64) *big.Float { return refAtan(x) }, -50, 50, 3, 0},
		{"sinh", Sinh, refSinhF, -50, 50, 6, 0},
		{"tanh", Tanh, refTanhF, -5, 5, 5, 0},
		{"cosh", Cosh, refCoshF, -30, 30, 4, 1},
		{"sin", Sin, refSinF, -100, 100, 2, 2},
		{"cos", Cos, refCosF, -100, 100, 2, 3},
	}
	for ci, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			t.Parallel()
			r := rand.New(rand.NewPCG(uint64(100+ci), 7))
			for range 500 {
				a := elUniform(r, c.a0, c.a1)
				b := a + elLogUniform(r, -40, 2, false)
				if c.name == "log" {
					b = a * (1 + elLogUniform(r, -40, 2, false))
				}
				x := I{a, b}
				v := c.f(x)
				fa, fb := c.ref(a), c.ref(b)
				samples := []*big.Float{fa, fb}
				for range 3 {
					samples = append(samples, c.ref(elUniform(r, a, b)))
				}
				ends := []*big.Float{fa, fb}
				switch c.kind {
				case 1:
					if a <= 0 && 0 <= b {
						ends = append(ends, big.NewFloat(1))
					}
				case 2, 3:
					ends = append(ends, elTrigExtrema(a, b, c.kind == 3)...)
				}
				lo, hi := elMinMax(ends)
				if c.kind == 0 {
					lo, hi = fa, fb
				}
				elCheckRange(t, c.name, x, v, samples, lo, hi, c.limit)
			}
		})
	}
}

// elTrigExtrema returns the values ±1 of sin (or cos) at the multiples of
// π/2 in [a, b], located in math/big.
func elTrigExtrema(a, b float64, cosine bool) []*big.Float {
	hp := new(big.Float).SetMantExp(refPi(400), -1)
	qa := new(big.Float).SetPrec(400).Quo(elBFFloat(a, 400), hp)
	qb := new(big.Float).SetPrec(400).Quo(elBFFloat(b, 400), hp)
	fa, _ := qa.Float64()
	fb, _ := qb.Float64()
	var out []*big.Float
	for m := int64(math.Floor(fa)) - 1; m <= int64(math.Ceil(fb))+1; m++ {
		M := new(big.Float).SetInt64(m)
		if M.Cmp(qa) < 0 || M.Cmp(qb) > 0 {
			continue
		}
		k := m
		if cosine {
			k++
		}
		switch k & 3 {
		case 1:
			out = append(out, big.NewFloat(1))
		case 3:
			out = append(out, big.NewFloat(-1))
		}
	}
	return out
}

// TestTanIntervals checks that Tan reports a *DomainError exactly when an
// odd multiple of π/2 lies in the argument (located in math/big), and is
// narrow and contains the reference values otherwise.
func TestTanIntervals(t *testing.T) {
	r := rand.New(rand.NewPCG(31, 7))
	poles, fine := 0, 0
	hp := new(big.Float).SetMantExp(refPi(400), -1)
	for range 3000 {
		a := elUniform(r, -50, 50)
		b := a + elLogUniform(r, -30, 1, false)
		x := I{a, b}
		v, err := Tan(x)
		qa := new(big.Float).SetPrec(400).Quo(elBFFloat(a, 400), hp)
		qb := new(big.Float).SetPrec(400).Quo(elBFFloat(b, 400), hp)
		pole := false
		fa, _ := qa.Float64()
		for m := int64(math.Floor(fa)) - 1; m <= int64(math.Floor(fa))+4; m++ {
			M := new(big.Float).SetInt64(m)
			if m&1 == 1 && M.Cmp(qa) >= 0 && M.Cmp(qb) <= 0 {
				pole = true
			}
		}
		if pole {
			poles++
			var de *DomainError
			if !errors.As(err, &de) {
				t.Fatalf("Tan(%v) = %v, want a domain error (pole inside)", x, v)
			}
			continue
		}
		fine++
		if err != nil {
			t.Fatalf("Tan(%v): unexpected %v", x, err)
		}
		fa2, fb2 := refTanF(a), refTanF(b)
		samples := []*big.Float{fa2, fb2, refTanF(elUniform(r, a, b))}
		elCheckRange(t, "tan", x, v, samples, fa2, fb2, 5)
	}
	if poles < 100 || fine < 100 {
		t.Fatalf("sampling degenerate: %d with poles, %d without", poles, fine)
	}
}

// TestDomainErrors is the table of arguments partly outside a function's
// domain: each gives a *DomainError with the message
// "<func>: not defined on all of the argument [lo, hi]".
func TestDomainErrors(t *testing.T) {
	inf := math.Inf(1)
	cases := []struct {
		call string
		err  error
		want string
	}{
		{"Log([-1, 2])", elSecond(Log(I{-1, 2})), "log: not defined on all of the argument [-1, 2]"},
		{"Log([0, 1])", elSecond(Log(I{0, 1})), "log: not defined on all of the argument [0, 1]"},
		{"Log(entire)", elSecond(Log(Entire())), "log: not defined on all of the argument [-Inf, +Inf]"},
		{"SqrtE([-1, 4])", elSecond(SqrtE(I{-1, 4})), "sqrt: not defined on all of the argument [-1, 4]"},
		{"Tan([1, 2])", elSecond(Tan(I{1, 2})), "tan: not defined on all of the argument [1, 2]"},
		{"Tan([-2, -1])", elSecond(Tan(I{-2, -1})), "tan: not defined on all of the argument [-2, -1]"},
		{"Tan([0, inf])", elSecond(Tan(I{0, inf})), "tan: not defined on all of the argument [0, +Inf]"},
		{"Tan([1e300, 1e300+ulp])", elSecond(Tan(I{1e300, math.Nextafter(1e300, inf)})), "tan: not defined on all of the argument [1e+300, 1.0000000000000002e+300]"},
		{"Pow([-2, 3], 0.5)", elSecond(Pow(I{-2, 3}, Point(0.5))), "pow: not defined on all of the argument [-2, 3]"},
		{"Pow([-2, -1], [1, 2])", elSecond(Pow(I{-2, -1}, I{1, 2})), "pow: not defined on all of the argument [-2, -1]"},
		{"Pow([0, 1], [-1, 1])", elSecond(Pow(I{0, 1}, I{-1, 1})), "pow: not defined on all of the argument [0, 1]"},
		{"Pow([0, 2], -1)", elSecond(Pow(I{0, 2}, Point(-1))), "pow: not defined on all of the argument [0, 2]"},
		{"Pow([-1, 1], -2)", elSecond(Pow(I{-1, 1}, Point(-2))), "pow: not defined on all of the argument [-1, 1]"},
	}
	for _, c := range cases {
		var de *DomainError
		if !errors.As(c.err, &de) {
			t.Errorf("%s: error %v, want a *DomainError", c.call, c.err)
			continue
		}
		if c.err.Error() != c.want {
			t.Errorf("%s: %q, want %q", c.call, c.err.Error(), c.want)
		}
	}
	// Defined cases next to the table's.
	ok := []struct {
		call string
		got  I
		err  error
		want I
	}{
		{"SqrtE([0, 4])", elFirst(SqrtE(I{0, 4})), elSecond(SqrtE(I{0, 4})), I{0, 2}},
		{"Pow([-2, 3], 2)", elFirst(Pow(I{-2, 3}, Point(2))), elSecond(Pow(I{-2, 3}, Point(2))), I{0, 9}},
		{"Pow([-2, -1], 3)", elFirst(Pow(I{-2, -1}, Point(3))), elSecond(Pow(I{-2, -1}, Point(3))), I{-8, -1}},
		{"Pow([0, 4], 0.5)", elFirst(Pow(I{0, 4}, Point(0.5))), elSecond(Pow(I{0, 4}, Point(0.5))), I{0, 2}},
		{"Pow([-3, 2], 0)", elFirst(Pow(I{-3, 2}, Point(0))), elSecond(Pow(I{-3, 2}, Point(0))), I{1, 1}},
		{"Pow([0, 0], [1, 2])", elFirst(Pow(I{0, 0}, I{1, 2})), elSecond(Pow(I{0, 0}, I{1, 2})), I{0, 0}},
	}
	for _, c := range ok {
		if c.err != nil {
			t.Errorf("%s: unexpected %v", c.call, c.err)
			continue
		}
		// Exact results may be enclosed a few ulps wide (the composition
		// exp(y·ln x) is not exact); check containment and closeness.
		if !c.got.Subset(I{elStep(c.want.Lo, -8), elStep(c.want.Hi, 8)}) || !c.want.Subset(c.got) {
			t.Errorf("%s = %v, want ≈ %v", c.call, c.got, c.want)
		}
	}
}

func elFirst(v I, _ error) I        { return v }
func elSecond(_ I, err error) error { return err }

// TestPow checks x^y for ≥ 10,000 random positive bases and real
// exponents against exp(y ln x) in math/big, and integer exponents of
// signed bases against exact math/big powers, and boxes x × y against
// sampled points. ln x is carried to about 2⁻⁶⁰ relative, so the width
// may grow like |y ln x|·2⁻⁶⁰; it is checked to stay below
// 6 + |y ln x|/16 ulps.
func TestPow(t *testing.T) {
	r := rand.New(rand.NewPCG(41, 7))
	var maxUlps int64
	for range 10000 {
		x := elLogUniform(r, -20, 20, false)
		y := elUniform(r, -30, 30)
		v, err := Pow(Point(x), Point(y))
		if err != nil {
			t.Fatal(err)
		}
		l := refLog(elBFFloat(x, 200), 200) // 200 bits: 60 digits
		yl := new(big.Float).SetPrec(200).Mul(elBFFloat(y, 200), l)
		ref := refExp(yl, 200)
		if !elContains(v, ref) {
			t.Fatalf("Pow(%v, %v) = %v misses %s", x, y, v, ref.Text('g', 20))
		}
		if elMeasurable(ref) {
			w := elUlps(v)
			maxUlps = max(maxUlps, w)
			ylf, _ := yl.Float64()
			if float64(w) > 6+math.Abs(ylf)/16 {
				t.Errorf("Pow(%v, %v) = %v is %d ulps wide", x, y, v, w)
			}
		}
	}
	t.Logf("pow real exponents: max width %d ulps", maxUlps)
	for range 500 {
		x := I{elLogUniform(r, -5, 5, false), 0}
		x.Hi = x.Lo * (1 + elLogUniform(r, -30, 1, false))
		y := I{elUniform(r, -10, 10), 0}
		y.Hi = y.Lo + elLogUniform(r, -30, 2, false)
		v, err := Pow(x, y)
		if err != nil {
			t.Fatal(err)
		}
		for range 4 {
			s, e := elUniform(r, x.Lo, x.Hi), elUniform(r, y.Lo, y.Hi)
			yl := new(big.Float).SetPrec(200).Mul(elBFFloat(e, 200), refLog(elBFFloat(s, 200), 200))
			if ref := refExp(yl, 200); !elContains(v, ref) {
				t.Fatalf("Pow(%v, %v) = %v misses %v^%v = %s", x, y, v, s, e, ref.Text('g', 20))
			}
		}
	}
	for range 2000 {
		x := elUniform(r, -3, 3)
		n := r.IntN(41) - 20
		v, err := Pow(Point(x), Point(float64(n)))
		if err != nil {
			if x == 0 && n < 0 {
				continue
			}
			t.Fatal(err)
		}
		ref := new(big.Float).SetPrec(4000).SetInt64(1)
		xb := new(big.Float).SetPrec(4000).SetFloat64(x)
		for range max(n, -n) {
			ref.Mul(ref, xb) // exact at 4000 bits
		}
		if n < 0 {
			ref.Quo(new(big.Float).SetPrec(4000).SetInt64(1), ref)
		}
		if !elContains(v, ref) {
			t.Fatalf("Pow(%v, %d) = %v misses %s", x, n, v, ref.Text('g', 20))
		}
	}
}

// TestIntervalEndsInfinite checks half-unbounded arguments.
func TestIntervalEndsInfinite(t *testing.T) {
	inf := math.Inf(1)
	l, err := Log(I{1, inf})
	if err != nil || l.Lo != 0 || l.Hi != inf {
		t.Errorf("Log([1, inf]) = %v, %v", l, err)
	}
	if v := Exp(I{-inf, 0}); v != (I{0, 1}) {
		t.Errorf("Exp([-inf, 0]) = %v", v)
	}
	if v := Tanh(I{0, inf}); v != (I{0, 1}) {
		t.Errorf("Tanh([0, inf]) = %v", v)
	}
	if v := Atan(I{0, inf}); v.Lo != 0 || v.Hi != halfPiI.Hi {
		t.Errorf("Atan([0, inf]) = %v", v)
	}
	if v := Cosh(I{-inf, 1}); v.Lo != 1 || v.Hi != inf {
		t.Errorf("Cosh([-inf, 1]) = %v", v)
	}
}

func ExampleExp() {
	fmt.Println(Exp(Point(1)))
	fmt.Println(Exp(Point(710)))
	// Output:
	// [2.718281828459045, 2.7182818284590455]
	// [1.7976931348623157e+308, +Inf]
}

func ExampleLog() {
	_, err := Log(I{-1, 2})
	fmt.Println(err)
	// Output: log: not defined on all of the argument [-1, 2]
}

func ExampleSin() {
	fmt.Println(Sin(I{1, 2})) // contains π/2, so 1 is attained
	// Output: [0.8414709848078964, 1]
}

var elSink I

func elBench(b *testing.B, f func(I) I, x float64) {
	v := Point(x)
	for b.Loop() {
		elSink = f(v)
	}
}

func BenchmarkExp(b *testing.B)     { elBench(b, Exp, 3.7) }
func BenchmarkLog(b *testing.B)     { elBench(b, elMust(Log), 3.7) }
func BenchmarkSin(b *testing.B)     { elBench(b, Sin, 3.7) }
func BenchmarkSinHuge(b *testing.B) { elBench(b, Sin, 1e300) }
func BenchmarkSinRange(b *testing.B) {
	elBench(b, func(x I) I { return Sin(I{x.Lo, x.Lo + 0.5}) }, 3.7)
}
func BenchmarkTan(b *testing.B)  { elBench(b, elMust(elTan), 3.7) }
func BenchmarkAtan(b *testing.B) { elBench(b, Atan, 3.7) }
func BenchmarkSinh(b *testing.B) { elBench(b, Sinh, 3.7) }
func BenchmarkTanh(b *testing.B) { elBench(b, Tanh, 0.7) }
func BenchmarkPow(b *testing.B) {
	elBench(b, func(x I) I { v, _ := Pow(x, Point(0.3)); return v }, 3.7)
}
