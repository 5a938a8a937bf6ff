package interval

import (
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"os"
	"testing"
)

// The reference for every check in this file is exact rational arithmetic
// with math/big.Rat (extended by ±∞ with the limit conventions of interval
// arithmetic, IEEE 1788-2015), independent of the code under test.

// scaled returns n, or 20n when GAPCERT_LONG=1 asks for the long campaign.
func scaled(n int) int {
	if os.Getenv("GAPCERT_LONG") == "1" {
		return 20 * n
	}
	return n
}

// ext is an extended real: a finite exact value, ±∞, or undefined (∞ − ∞,
// ∞/∞), for which a sound lower end is −∞ and a sound upper end +∞. Sums
// and products of floats are held exactly as big.Float (precision chosen so
// that no bit is lost, asserted), quotients as big.Rat.
type ext struct {
	inf   int        // +1 or −1 for ±∞, 0 if finite
	f     *big.Float // the finite value, if held as big.Float
	r     *big.Rat   // the finite value, if held as big.Rat
	undef bool
}

func extOf(x float64) ext {
	switch {
	case math.IsNaN(x):
		panic("test: NaN has no exact value")
	case math.IsInf(x, 1):
		return ext{inf: 1}
	case math.IsInf(x, -1):
		return ext{inf: -1}
	}
	return ext{f: new(big.Float).SetFloat64(x)}
}

func extRat(r *big.Rat) ext { return ext{r: r} }

func extZero() ext { return ext{f: new(big.Float)} }

// rat returns the exact rational value of a finite e.
func (e ext) rat() *big.Rat {
	if e.r != nil {
		return e.r
	}
	r, _ := e.f.Rat(nil)
	return r
}

func (e ext) sign() int {
	switch {
	case e.inf != 0:
		return e.inf
	case e.f != nil:
		return e.f.Sign()
	}
	return e.r.Sign()
}

func (e ext) isZero() bool { return !e.undef && e.inf == 0 && e.sign() == 0 }

func (e ext) String() string {
	switch {
	case e.undef:
		return "undefined"
	case e.inf != 0:
		return fmt.Sprintf("%+d·∞", e.inf)
	case e.f != nil:
		return e.f.Text('g', 25)
	}
	return e.r.FloatString(25)
}

// exactAdd returns a + b without rounding.
func exactAdd(a, b *big.Float) *big.Float {
	switch {
	case a.Sign() == 0:
		return new(big.Float).Copy(b)
	case b.Sign() == 0:
		return new(big.Float).Copy(a)
	}
	ea, eb := a.MantExp(nil), b.MantExp(nil)
	lo := min(ea-int(a.MinPrec()), eb-int(b.MinPrec()))
	z := new(big.Float).SetPrec(uint(max(ea, eb)+1-lo)).Add(a, b)
	if z.Acc() != big.Exact {
		panic("test: inexact sum")
	}
	return z
}

// exactMul returns a·b without rounding.
func exactMul(a, b *big.Float) *big.Float {
	z := new(big.Float).SetPrec(max(a.MinPrec()+b.MinPrec(), 1)).Mul(a, b)
	if z.Acc() != big.Exact {
		panic("test: inexact product")
	}
	return z
}

func extNeg(a ext) ext {
	switch {
	case a.undef:
		return a
	case a.inf != 0:
		return ext{inf: -a.inf}
	case a.f != nil:
		return ext{f: new(big.Float).Neg(a.f)}
	}
	return extRat(new(big.Rat).Neg(a.r))
}

func extAdd(a, b ext) ext {
	switch {
	case a.undef || b.undef || (a.inf != 0 && b.inf == -a.inf):
		return ext{undef: true}
	case a.inf != 0:
		return a
	case b.inf != 0:
		return b
	case a.f != nil && b.f != nil:
		return ext{f: exactAdd(a.f, b.f)}
	}
	return extRat(new(big.Rat).Add(a.rat(), b.rat()))
}

func extSub(a, b ext) ext { return extAdd(a, extNeg(b)) }

// extMul uses 0·∞ = 0: an infinite end stands for unbounded finite reals.
func extMul(a, b ext) ext {
	switch {
	case a.undef || b.undef:
		return ext{undef: true}
	case a.isZero() || b.isZero():
		return extZero()
	case a.inf != 0 || b.inf != 0:
		return ext{inf: a.sign() * b.sign()}
	case a.f != nil && b.f != nil:
		return ext{f: exactMul(a.f, b.f)}
	}
	return extRat(new(big.Rat).Mul(a.rat(), b.rat()))
}

// extQuo uses t/±∞ = 0 (limit); ∞/∞ is undefined. b must be nonzero.
func extQuo(a, b ext) ext {
	switch {
	case b.isZero():
		panic("test: division by zero")
	case a.undef || b.undef || (a.inf != 0 && b.inf != 0):
		return ext{undef: true}
	case a.inf != 0:
		return ext{inf: a.inf * b.sign()}
	case b.inf != 0 || a.isZero():
		return extZero()
	}
	return extRat(new(big.Rat).Quo(a.rat(), b.rat()))
}

func extCmp(a, b ext) int {
	if a.inf != 0 || b.inf != 0 {
		switch {
		case a.inf < b.inf:
			return -1
		case a.inf > b.inf:
			return 1
		}
		return 0
	}
	if a.f != nil && b.f != nil {
		return a.f.Cmp(b.f)
	}
	return a.rat().Cmp(b.rat())
}

// cmpF compares the float64 f (±∞ allowed) with the defined value e.
func cmpF(f float64, e ext) int { return extCmp(extOf(f), e) }

// tightDown reports whether f is the largest element of float64 ∪ {±∞}
// that is ≤ e (−∞ if e is undefined).
func tightDown(f float64, e ext) bool {
	if e.undef {
		return math.IsInf(f, -1)
	}
	if cmpF(f, e) > 0 {
		return false
	}
	return math.IsInf(f, 1) || cmpF(math.Nextafter(f, math.Inf(1)), e) > 0
}

// tightUp reports whether f is the smallest element of float64 ∪ {±∞}
// that is ≥ e (+∞ if e is undefined).
func tightUp(f float64, e ext) bool {
	if e.undef {
		return math.IsInf(f, 1)
	}
	if cmpF(f, e) < 0 {
		return false
	}
	return math.IsInf(f, -1) || cmpF(math.Nextafter(f, math.Inf(-1)), e) < 0
}

// ord maps float64 to integers monotonically, ±0 to 0, so that the
// difference of two ords counts the floats between them (ulps).
func ord(x float64) int64 {
	b := math.Float64bits(x)
	if b>>63 == 1 {
		return -int64(b &^ (1 << 63))
	}
	return int64(b)
}

// widthStats records the widths, in ulps, of directed pairs [down, up] of
// single operations on points: 0 when the exact result is a float64, 1
// otherwise (both checked), or unbounded.
type widthStats struct{ n, exact, oneULP, unbounded int }

func (w *widthStats) record(t *testing.T, what string, lo, hi float64, e ext) {
	t.Helper()
	w.n++
	if math.IsInf(lo, 0) || math.IsInf(hi, 0) {
		w.unbounded++
		return
	}
	d := ord(hi) - ord(lo)
	representable := !e.undef && e.inf == 0 && cmpF(lo, e) == 0
	switch {
	case d == 0 && representable:
		w.exact++
	case d == 1 && !representable:
		w.oneULP++
	default:
		t.Errorf("%s: width %d ulp (exact value representable: %v)", what, d, representable)
	}
}

func (w widthStats) String() string {
	return fmt.Sprintf("%d ops: width 0 ulp (exact) %d, 1 ulp %d, unbounded end %d", w.n, w.exact, w.oneULP, w.unbounded)
}

// gen draws float64 arguments, random and adversarial, from a fixed seed.
type gen struct{ r *rand.Rand }

func newGen(seed uint64) *gen { return &gen{rand.New(rand.NewPCG(seed, 0x9e3779b97f4a7c15))} }

var specialFloats = []float64{
	0, math.Copysign(0, -1), 1, -1, 2, 0.5, 3, 0.1, 0.2, 1.0 / 3,
	math.MaxFloat64, -math.MaxFloat64, 0x1p1023, 0x1p1022, 0x1.fffffffffffffp1022,
	0x1p-1022, 0x1p-969, 0x1p-970, 0x1p-968, 0x1p-537, 0x1p-485, 0x1p-484,
	math.SmallestNonzeroFloat64, 3 * math.SmallestNonzeroFloat64,
	0x1.fffffffffffffp-1, 0x1.0000000000001p0, 0x1p-1074 * (1 << 52),
}

func (g *gen) sign(x float64) float64 {
	if g.r.IntN(2) == 0 {
		return -x
	}
	return x
}

// mant returns a random float in [1, 2).
func (g *gen) mant() float64 { return 1 + float64(g.r.Uint64()>>12)*0x1p-52 }

// float returns a finite float64 from a mixture of random and adversarial
// families.
func (g *gen) float() float64 {
	switch k := g.r.IntN(100); {
	case k < 20: // any finite bit pattern
		for {
			x := math.Float64frombits(g.r.Uint64())
			if !math.IsNaN(x) && !math.IsInf(x, 0) {
				return x
			}
		}
	case k < 40: // moderate magnitude
		return g.sign(math.Ldexp(g.mant(), g.r.IntN(81)-40))
	case k < 48: // subnormal
		return g.sign(math.Float64frombits(g.r.Uint64() & (1<<52 - 1)))
	case k < 56: // around 2⁻⁹⁶⁹
		return g.sign(math.Ldexp(g.mant(), -1000+g.r.IntN(61)))
	case k < 64: // near overflow
		return g.sign(math.Ldexp(g.mant(), 1000+g.r.IntN(24)))
	case k < 72: // short mantissas: exact results and ties
		m := g.r.Uint64N(1<<uint(1+g.r.IntN(27))) | 1
		return g.sign(math.Ldexp(float64(m), g.r.IntN(121)-60))
	case k < 80: // powers of two
		return g.sign(math.Ldexp(1, g.r.IntN(2098)-1074))
	case k < 88: // small integers
		return float64(g.r.IntN(2001) - 1000)
	case k < 94:
		return specialFloats[g.r.IntN(len(specialFloats))]
	default: // a few ulps from a special value
		x := specialFloats[g.r.IntN(len(specialFloats))]
		for i := g.r.IntN(4); i >= 0; i-- {
			x = math.Nextafter(x, g.sign(math.Inf(1)))
		}
		if math.IsInf(x, 0) {
			return math.Copysign(math.MaxFloat64, x)
		}
		return x
	}
}

// maybeInf replaces x by ±∞ with probability 1/50.
func (g *gen) maybeInf(x float64) float64 {
	if g.r.IntN(50) == 0 {
		return g.sign(math.Inf(1))
	}
	return x
}

func (g *gen) nonzero() float64 {
	for {
		if x := g.float(); x != 0 {
			return x
		}
	}
}

// addPair favours near ties, cancellation, overflow and the TwoSum
// intermediate-overflow family.
func (g *gen) addPair() (float64, float64) {
	switch k := g.r.IntN(100); {
	case k < 50:
		return g.maybeInf(g.float()), g.maybeInf(g.float())
	case k < 65: // b near half an ulp of a: ties and near ties
		a := g.nonzero()
		_, e := math.Frexp(a)
		m := 1.0
		if g.r.IntN(2) == 0 {
			m = 1 + float64(g.r.IntN(5)-2)*0x1p-52
		}
		return a, g.sign(math.Ldexp(m, e-54+g.r.IntN(5)-2))
	case k < 75: // cancellation
		a := g.float()
		b := -a
		for i := g.r.IntN(3); i > 0; i-- {
			b = math.Nextafter(b, g.sign(math.Inf(1)))
		}
		if math.IsInf(b, 0) {
			b = -a
		}
		return a, b
	case k < 85: // both large, same sign: overflow
		s := g.sign(1)
		return s * math.Ldexp(g.mant(), 1020+g.r.IntN(4)), s * math.Ldexp(g.mant(), 1018+g.r.IntN(6))
	case k < 92: // −(2¹⁰²³ − (2j+1)·2⁹⁷⁰) + (MaxFloat64 − i·2⁹⁷¹)
		j := float64(g.r.IntN(1 << 20))
		i := float64(g.r.IntN(8))
		a := -(0x1p1023 - (2*j+1)*0x1p970)
		b := math.MaxFloat64 - i*0x1p971
		if g.r.IntN(2) == 0 {
			a, b = -a, -b
		}
		if g.r.IntN(2) == 0 {
			a, b = b, a
		}
		return a, b
	default: // both tiny
		return g.sign(math.Ldexp(g.mant(), -1074+g.r.IntN(120))), g.sign(math.Ldexp(g.mant(), -1074+g.r.IntN(120)))
	}
}

// mulPair favours products near 2⁻⁹⁶⁹, in the subnormal range, near
// overflow, and exact or tie products of short mantissas.
func (g *gen) mulPair() (float64, float64) {
	switch k := g.r.IntN(100); {
	case k < 45:
		return g.maybeInf(g.float()), g.maybeInf(g.float())
	case k < 60: // exponent sum near −969
		e1 := g.r.IntN(900) - 800
		return g.sign(math.Ldexp(g.mant(), e1)), g.sign(math.Ldexp(g.mant(), -969-e1+g.r.IntN(11)-6))
	case k < 70: // exponent sum in the subnormal range
		e1 := g.r.IntN(900) - 800
		return g.sign(math.Ldexp(g.mant(), e1)), g.sign(math.Ldexp(g.mant(), -1074-e1+g.r.IntN(60)))
	case k < 75: // all-ones mantissas just below the 2⁻⁹⁶⁹ boundary
		e1 := g.r.IntN(400) - 200
		a := math.Ldexp(0x1.fffffffffffffp0, e1)
		b := math.Ldexp(math.Nextafter(0x1p1, 0)-float64(g.r.IntN(4))*0x1p-51, -969-e1-2)
		return g.sign(a), g.sign(b)
	case k < 85: // near overflow
		e1 := g.r.IntN(1000)
		return g.sign(math.Ldexp(g.mant(), e1)), g.sign(math.Ldexp(g.mant(), 1023-e1+g.r.IntN(5)-3))
	default: // short mantissas: exact products and ties
		m1 := g.r.Uint64N(1<<uint(20+g.r.IntN(14))) | 1
		m2 := g.r.Uint64N(1<<uint(20+g.r.IntN(14))) | 1
		e1 := g.r.IntN(600) - 300
		return g.sign(math.Ldexp(float64(m1), e1)), g.sign(math.Ldexp(float64(m2), g.r.IntN(600)-300))
	}
}

// divPair favours quotients near 2⁻⁹⁶⁹ and in the subnormal range, tiny
// dividends, near-overflow quotients, subnormal divisors and exact
// quotients. The divisor is never zero.
func (g *gen) divPair() (float64, float64) {
	switch k := g.r.IntN(100); {
	case k < 45:
		return g.maybeInf(g.float()), g.maybeInf(g.nonzero())
	case k < 60: // quotient exponent near −969 or subnormal
		eb := g.r.IntN(1800) - 900
		ea := eb - 1074 + g.r.IntN(130)
		if ea < -1074 {
			ea = -1074
		}
		return g.sign(math.Ldexp(g.mant(), ea)), g.sign(math.Ldexp(g.mant(), eb))
	case k < 68: // dividend just around 2⁻⁹⁶⁹
		return g.sign(math.Ldexp(g.mant(), -971+g.r.IntN(5))), g.sign(math.Ldexp(g.mant(), g.r.IntN(41)-20))
	case k < 76: // near overflow
		ea := g.r.IntN(1000) + 23
		return g.sign(math.Ldexp(g.mant(), ea)), g.sign(math.Ldexp(g.mant(), ea-1024+g.r.IntN(5)-2))
	case k < 84: // subnormal divisor
		return g.float(), g.sign(math.Float64frombits(g.r.Uint64()&(1<<52-1) | 1))
	default: // exact quotients a = m1·m2·2^e, b = m2·2^f
		m1 := float64(g.r.Uint64N(1<<26) | 1)
		m2 := float64(g.r.Uint64N(1<<26) | 1)
		e := g.r.IntN(1000) - 500
		f := g.r.IntN(1000) - 500
		return g.sign(math.Ldexp(m1*m2, e)), g.sign(math.Ldexp(m2, f))
	}
}

// sqrtArg favours exact squares, their neighbours, radicands near 2⁻⁹⁶⁹,
// subnormals and huge values.
func (g *gen) sqrtArg() float64 {
	switch k := g.r.IntN(100); {
	case k < 40:
		return math.Abs(g.float())
	case k < 60: // exact squares of short mantissas
		s := float64(g.r.Uint64N(1<<26) | 1)
		return math.Ldexp(s*s, 2*(g.r.IntN(900)-500))
	case k < 75: // neighbours of exact squares
		s := g.mant()
		x := math.Ldexp(s*s, 2*(g.r.IntN(1000)-500))
		for i := g.r.IntN(3); i >= 0; i-- {
			x = math.Nextafter(x, g.sign(math.Inf(1)))
		}
		return math.Abs(x)
	case k < 90:
		return math.Ldexp(g.mant(), -1074+g.r.IntN(140))
	case k < 97:
		return math.Ldexp(g.mant(), 1000+g.r.IntN(24))
	}
	return [...]float64{0, math.Inf(1), math.MaxFloat64, math.SmallestNonzeroFloat64, 0x1p-969}[g.r.IntN(5)]
}

// reporter stops a test after a few dozen failures.
type reporter struct {
	t    *testing.T
	fail int
}

func (r *reporter) errorf(format string, args ...any) {
	r.t.Helper()
	r.fail++
	r.t.Errorf(format, args...)
	if r.fail >= 30 {
		r.t.Fatal("too many failures")
	}
}

// TestDirectedOpsExact checks, for ≥ 120 000 random and adversarial
// argument pairs per operation, that each directed result is the tightest
// float64 on its side of the exact math/big.Rat result, and that the
// down/up pair is 0 ulp wide exactly when the result is a float64 and 1 ulp
// wide otherwise.
func TestDirectedOpsExact(t *testing.T) {
	n := scaled(120_000)
	ops := []struct {
		name     string
		down, up func(a, b float64) float64
		exact    func(a, b ext) ext
		pair     func(g *gen) (float64, float64)
	}{
		{"Add", AddDown, AddUp, extAdd, (*gen).addPair},
		{"Sub", SubDown, SubUp, extSub, (*gen).addPair},
		{"Mul", MulDown, MulUp, extMul, (*gen).mulPair},
		{"Div", DivDown, DivUp, extQuo, (*gen).divPair},
	}
	for i, op := range ops {
		t.Run(op.name, func(t *testing.T) {
			g := newGen(uint64(100 + i))
			rep := &reporter{t: t}
			var w widthStats
			for range n {
				a, b := op.pair(g)
				e := op.exact(extOf(a), extOf(b))
				lo, hi := op.down(a, b), op.up(a, b)
				if !tightDown(lo, e) {
					rep.errorf("%sDown(%x, %x) = %x, exact %v", op.name, a, b, lo, e)
				}
				if !tightUp(hi, e) {
					rep.errorf("%sUp(%x, %x) = %x, exact %v", op.name, a, b, hi, e)
				}
				w.record(t, fmt.Sprintf("%s(%x, %x)", op.name, a, b), lo, hi, e)
			}
			t.Logf("%s: %v", op.name, w)
		})
	}
}

// sqrtTight reports whether lo and hi are the tightest float64 bounds of
// √a, decided by exact comparison of squares with math/big.Rat.
func sqrtTight(a, lo, hi float64) bool {
	if math.IsInf(a, 1) {
		return math.IsInf(lo, 1) && math.IsInf(hi, 1)
	}
	fa := new(big.Float).SetFloat64(a)
	sq := func(f float64) *big.Float { x := new(big.Float).SetFloat64(f); return exactMul(x, x) }
	if !(lo >= 0) || sq(lo).Cmp(fa) > 0 || sq(math.Nextafter(lo, math.Inf(1))).Cmp(fa) <= 0 {
		return false
	}
	if sq(hi).Cmp(fa) < 0 {
		return false
	}
	below := math.Nextafter(hi, math.Inf(-1))
	return hi == 0 || below < 0 || sq(below).Cmp(fa) < 0
}

func TestSqrtDirectedExact(t *testing.T) {
	n := scaled(120_000)
	g := newGen(7)
	rep := &reporter{t: t}
	var exact, one, unbounded int
	for range n {
		a := g.sqrtArg()
		lo, hi := SqrtDown(a), SqrtUp(a)
		if !sqrtTight(a, lo, hi) {
			rep.errorf("Sqrt(%x): [%x, %x] not the tightest enclosure", a, lo, hi)
		}
		switch d := ord(hi) - ord(lo); {
		case math.IsInf(hi, 0):
			unbounded++
		case d == 0:
			exact++
		case d == 1:
			one++
		default:
			rep.errorf("Sqrt(%x): width %d ulp", a, d)
		}
	}
	t.Logf("Sqrt: %d ops: width 0 ulp (exact) %d, 1 ulp %d, infinite %d", n, exact, one, unbounded)
}

// TestDirectedSpecialValues pins the conventions for zeros, infinities,
// overflow and underflow. Expected values follow from the definitions
// (largest float64 ≤ / smallest ≥ the exact value; 0·∞ = 0 and t/∞ = 0 as
// in IEEE 1788-2015) and the float64 format (IEEE 754-2019 binary64).
func TestDirectedSpecialValues(t *testing.T) {
	inf, max, den := math.Inf(1), math.MaxFloat64, math.SmallestNonzeroFloat64
	negZero := math.Copysign(0, -1)
	// 2Sum intermediate overflow: exact sum 2¹⁰²³ + 3·2⁹⁷⁰ lies halfway
	// between 2¹⁰²³ + 2⁹⁷¹ and 2¹⁰²³ + 2⁹⁷² (binade ulp 2⁹⁷¹).
	twoSumA := -(0x1p1023 - 5*0x1p970)
	tests := []struct {
		name string
		got  float64
		want float64
	}{
		{"MulDown(0, +∞)", MulDown(0, inf), 0},
		{"MulUp(−0, −∞)", MulUp(negZero, -inf), 0},
		{"MulDown(+∞, −2)", MulDown(inf, -2), -inf},
		{"MulUp(+∞, den)", MulUp(inf, den), inf},
		{"AddDown(+∞, −∞)", AddDown(inf, -inf), -inf},
		{"AddUp(+∞, −∞)", AddUp(inf, -inf), inf},
		{"AddDown(+∞, 1)", AddDown(inf, 1), inf},
		{"SubUp(−∞, −∞)", SubUp(-inf, -inf), inf},
		{"AddDown(max, max)", AddDown(max, max), max},
		{"AddUp(max, max)", AddUp(max, max), inf},
		{"AddDown(−max, −max)", AddDown(-max, -max), -inf},
		{"AddUp(−max, −max)", AddUp(-max, -max), -max},
		{"AddDown(2Sum overflow)", AddDown(twoSumA, max), 0x1p1023 + 0x1p971},
		{"AddUp(2Sum overflow)", AddUp(twoSumA, max), 0x1p1023 + 0x1p972},
		{"AddDown(1, −den)", AddDown(1, -den), 0x1.fffffffffffffp-1},
		{"AddUp(1, −den)", AddUp(1, -den), 1},
		{"AddDown(0.1, −0.1)", AddDown(0.1, -0.1), 0},
		{"MulDown(max, 2)", MulDown(max, 2), max},
		{"MulUp(max, 2)", MulUp(max, 2), inf},
		{"MulDown(−max, 2)", MulDown(-max, 2), -inf},
		{"MulUp(−max, 2)", MulUp(-max, 2), -max},
		{"MulDown(den, 0.5)", MulDown(den, 0.5), 0},
		{"MulUp(den, 0.5)", MulUp(den, 0.5), den},
		{"MulDown(−den, 0.5)", MulDown(-den, 0.5), -den},
		{"MulUp(−den, 0.5)", MulUp(-den, 0.5), 0},
		{"MulDown(2⁻⁵³⁷, 2⁻⁵³⁷)", MulDown(0x1p-537, 0x1p-537), den},
		{"MulUp(3·2⁻⁵³⁸, 2⁻⁵³⁸)", MulUp(3*0x1p-538, 0x1p-538), den},
		{"MulDown(3·2⁻⁵³⁸, 2⁻⁵³⁸)", MulDown(3*0x1p-538, 0x1p-538), 0},
		{"DivDown(max, 0.5)", DivDown(max, 0.5), max},
		{"DivUp(max, 0.5)", DivUp(max, 0.5), inf},
		{"DivDown(−1, den)", DivDown(-1, den), -inf},
		{"DivUp(−1, den)", DivUp(-1, den), -max},
		{"DivDown(den, 2)", DivDown(den, 2), 0},
		{"DivUp(den, 2)", DivUp(den, 2), den},
		{"DivDown(1, +∞)", DivDown(1, inf), 0},
		{"DivUp(−1, +∞)", DivUp(-1, inf), 0},
		{"DivDown(+∞, +∞)", DivDown(inf, inf), -inf},
		{"DivUp(+∞, −∞)", DivUp(inf, -inf), inf},
		{"DivDown(−∞, 2)", DivDown(-inf, 2), -inf},
		{"DivUp(+∞, −2)", DivUp(inf, -2), -inf},
		{"DivDown(0, −3)", DivDown(0, -3), 0},
		{"DivUp(1, 3)", DivUp(1, 3), 0x1.5555555555556p-2},
		{"DivDown(1, 3)", DivDown(1, 3), 0x1.5555555555555p-2},
		{"SqrtDown(0)", SqrtDown(0), 0},
		{"SqrtUp(+∞)", SqrtUp(inf), inf},
		{"SqrtDown(den)", SqrtDown(den), 0x1p-537},
		{"SqrtUp(den)", SqrtUp(den), 0x1p-537},
		{"SqrtDown(2·den)", SqrtDown(2 * den), 0x1.6a09e667f3bccp-537},
		{"SqrtUp(2·den)", SqrtUp(2 * den), 0x1.6a09e667f3bcdp-537},
		// √2 = 1.41421356237309504880… (OEIS A002193); float64 neighbours
		// 0x1.6a09e667f3bcc908p0 and …bcdp0 bracket it.
		{"SqrtDown(2)", SqrtDown(2), 0x1.6a09e667f3bccp0},
		{"SqrtUp(2)", SqrtUp(2), 0x1.6a09e667f3bcdp0},
		{"SqrtDown(max)", SqrtDown(max), 0x1.fffffffffffffp511},
		{"SqrtUp(max)", SqrtUp(max), 0x1p512},
	}
	for _, tt := range tests {
		if tt.got != tt.want {
			t.Errorf("%s = %x, want %x", tt.name, tt.got, tt.want)
		}
	}
}

// TestNotRoundToNearest fails if the directed roundings are replaced by
// round to nearest: each case has an inexact exact result, so a correct
// enclosure has two different ends and contains the exact rational.
func TestNotRoundToNearest(t *testing.T) {
	rat := func(x float64) *big.Rat { return new(big.Rat).SetFloat64(x) }
	sum := new(big.Rat).Add(rat(0.1), rat(0.2))
	prod := new(big.Rat).Mul(rat(0.1), rat(0.1))
	diff := new(big.Rat).Sub(rat(1), rat(1e-20))
	sqrt2, _ := Point(2).Sqrt()
	tests := []struct {
		name  string
		x     I
		exact *big.Rat
	}{
		{"0.1 + 0.2", Point(0.1).Add(Point(0.2)), sum},
		{"0.1 · 0.1", Point(0.1).Mul(Point(0.1)), prod},
		{"1 − 1e-20", Point(1).Sub(Point(1e-20)), diff},
		{"1 / 3", Point(1).Div(Point(3)), big.NewRat(1, 3)},
		{"−2 / 3", Point(-2).Div(Point(3)), big.NewRat(-2, 3)},
		{"0.1²", Point(0.1).Sqr(), prod},
		{"(1/3)·3 as 1/3 enclosure times 3", Point(1).Div(Point(3)).MulF(3), big.NewRat(1, 1)},
	}
	for _, tt := range tests {
		if !(tt.x.Lo < tt.x.Hi) {
			t.Errorf("%s = %v: an inexact result must have two different ends", tt.name, tt.x)
		}
		if rat(tt.x.Lo).Cmp(tt.exact) > 0 || rat(tt.x.Hi).Cmp(tt.exact) < 0 {
			t.Errorf("%s = %v does not contain %s", tt.name, tt.x, tt.exact.FloatString(30))
		}
	}
	two := big.NewRat(2, 1)
	if !(sqrt2.Lo < sqrt2.Hi) || new(big.Rat).Mul(rat(sqrt2.Lo), rat(sqrt2.Lo)).Cmp(two) >= 0 ||
		new(big.Rat).Mul(rat(sqrt2.Hi), rat(sqrt2.Hi)).Cmp(two) <= 0 {
		t.Errorf("√2 enclosure %v: want Lo² < 2 < Hi²", sqrt2)
	}
	// The round-to-nearest sum 0.30000000000000004 lies above the exact
	// sum, so the lower end must be its predecessor.
	if x := Point(0.1).Add(Point(0.2)); x.Lo != 0x1.3333333333333p-2 || x.Hi != 0x1.3333333333334p-2 {
		t.Errorf("0.1 + 0.2 = [%x, %x], want [0x1.3333333333333p-2, 0x1.3333333333334p-2]", x.Lo, x.Hi)
	}
}

// genEnd returns a positive finite end from the float mixture.
func (g *gen) posEnd() float64 {
	for {
		if x := math.Abs(g.float()); x != 0 {
			return x
		}
	}
}

// interval returns a random interval covering every sign pattern, zero and
// signed-zero ends, points and infinite ends.
func (g *gen) interval() I {
	inf := math.Inf(1)
	p, q := g.posEnd(), g.posEnd()
	if p > q {
		p, q = q, p
	}
	negZero := math.Copysign(0, -1)
	switch g.r.IntN(20) {
	case 0:
		return I{p, p}
	case 1:
		return I{-p, -p}
	case 2:
		return I{0, 0}
	case 3:
		return I{negZero, 0}
	case 4:
		return I{0, q}
	case 5:
		return I{negZero, q}
	case 6:
		return I{-q, 0}
	case 7:
		return I{-q, negZero}
	case 8, 9:
		return I{p, q}
	case 10, 11:
		return I{-q, -p}
	case 12, 13:
		return I{-p, q}
	case 14:
		return I{-inf, g.sign(p)}
	case 15:
		return I{g.sign(p), inf}
	case 16:
		return I{0, inf}
	case 17:
		return I{-inf, 0}
	case 18:
		return Entire()
	}
	return I{-q, p}
}

// sample returns finite reals (floats) in x: its finite ends, 0 if in x,
// and a random member.
func (g *gen) sample(x I) []float64 {
	var s []float64
	if !math.IsInf(x.Lo, 0) {
		s = append(s, x.Lo)
	}
	if !math.IsInf(x.Hi, 0) {
		s = append(s, x.Hi)
	}
	if x.ContainsZero() {
		s = append(s, 0)
	}
	for range 4 {
		if c := g.float(); x.Contains(c) {
			s = append(s, c)
			break
		}
	}
	if x.IsBounded() {
		c := x.Lo + g.r.Float64()*(x.Hi-x.Lo)
		if x.Contains(c) {
			s = append(s, c)
		}
	}
	if len(s) == 0 { // Entire or half-line without a hit
		s = append(s, math.Max(math.Min(1, x.Hi), x.Lo))
	}
	return s
}

// contains reports whether the exact value e lies in x.
func contains(x I, e ext) bool { return cmpF(x.Lo, e) <= 0 && cmpF(x.Hi, e) >= 0 }

// cornerHull returns the exact min and max of f over the corners of x × y,
// skipping undefined corners.
func cornerHull(x, y I, f func(a, b ext) ext) (lo, hi ext, ok bool) {
	for _, a := range []float64{x.Lo, x.Hi} {
		for _, b := range []float64{y.Lo, y.Hi} {
			e := f(extOf(a), extOf(b))
			if e.undef {
				continue
			}
			if !ok || extCmp(e, lo) < 0 {
				lo = e
			}
			if !ok || extCmp(e, hi) > 0 {
				hi = e
			}
			ok = true
		}
	}
	return lo, hi, ok
}

// TestIntervalOpsExact checks Add, Sub, Mul and Div of random intervals of
// every sign pattern (zero, signed-zero and infinite ends included): each end
// is the tightest directed rounding of the exact extreme over the corners
// (the exact range of these operations, IEEE 1788-2015, with 0·∞ = 0
// and ∞/∞ corners contributing nothing beyond the others), and exact
// results for sampled members are contained.
func TestIntervalOpsExact(t *testing.T) {
	n := scaled(100_000)
	ops := []struct {
		name  string
		op    func(x, y I) I
		exact func(a, b ext) ext
	}{
		{"Add", I.Add, extAdd},
		{"Sub", I.Sub, nil},
		{"Mul", I.Mul, extMul},
		{"Div", I.Div, extQuo},
	}
	for i, op := range ops {
		t.Run(op.name, func(t *testing.T) {
			g := newGen(uint64(200 + i))
			rep := &reporter{t: t}
			for range n {
				x, y := g.interval(), g.interval()
				z := op.op(x, y)
				var lo, hi ext
				switch op.name {
				case "Add":
					lo, hi = extAdd(extOf(x.Lo), extOf(y.Lo)), extAdd(extOf(x.Hi), extOf(y.Hi))
				case "Sub":
					lo, hi = extSub(extOf(x.Lo), extOf(y.Hi)), extSub(extOf(x.Hi), extOf(y.Lo))
				case "Div":
					if y.ContainsZero() {
						if z != Entire() {
							rep.errorf("%v / %v = %v, want Entire (0 in divisor)", x, y, z)
						}
						continue
					}
					lo, hi, _ = cornerHull(x, y, op.exact)
				default:
					lo, hi, _ = cornerHull(x, y, op.exact)
				}
				if !(z.Lo <= z.Hi) || !tightDown(z.Lo, lo) || !tightUp(z.Hi, hi) {
					rep.errorf("%s(%v, %v) = [%x, %x], exact range [%v, %v]", op.name, x, y, z.Lo, z.Hi, lo, hi)
				}
				xs, ys := g.sample(x), g.sample(y)
				for range 3 {
					{
						s, u := xs[g.r.IntN(len(xs))], ys[g.r.IntN(len(ys))]
						var e ext
						switch op.name {
						case "Add":
							e = extAdd(extOf(s), extOf(u))
						case "Sub":
							e = extSub(extOf(s), extOf(u))
						case "Mul":
							e = extMul(extOf(s), extOf(u))
						case "Div":
							e = extQuo(extOf(s), extOf(u))
						}
						if !contains(z, e) {
							rep.errorf("%s(%v, %v) = %v misses %x %s %x", op.name, x, y, z, s, op.name, u)
						}
					}
				}
			}
		})
	}
}

// TestSqrSqrtExact checks Sqr and Sqrt of random intervals: tightest ends
// (exact squares with math/big.Rat) and containment of sampled members.
func TestSqrSqrtExact(t *testing.T) {
	n := scaled(100_000)
	g := newGen(300)
	rep := &reporter{t: t}
	for range n {
		x := g.interval()
		sq := x.Sqr()
		lo, hi := extMul(extOf(x.Lo), extOf(x.Lo)), extMul(extOf(x.Hi), extOf(x.Hi))
		if extCmp(lo, hi) > 0 {
			lo, hi = hi, lo
		}
		if x.ContainsZero() {
			lo = extZero()
		}
		if !tightDown(sq.Lo, lo) || !tightUp(sq.Hi, hi) {
			rep.errorf("Sqr(%v) = [%x, %x], exact [%v, %v]", x, sq.Lo, sq.Hi, lo, hi)
		}
		for _, s := range g.sample(x) {
			if e := extMul(extOf(s), extOf(s)); !contains(sq, e) {
				rep.errorf("Sqr(%v) = %v misses %x²", x, sq, s)
			}
		}

		r, ok := x.Sqrt()
		if ok != (x.Lo >= 0) {
			rep.errorf("Sqrt(%v): ok = %v", x, ok)
		}
		a, b := math.Max(x.Lo, 0), math.Max(x.Hi, 0)
		if !sqrtTight(a, r.Lo, SqrtUp(a)) || !sqrtTight(b, SqrtDown(b), r.Hi) {
			rep.errorf("Sqrt(%v) = [%x, %x] not tightest", x, r.Lo, r.Hi)
		}
	}
}

// powErrorFactor returns k such that an end of PowInt(n) is within relative
// distance (1 + 2⁻⁵²)^k − 1 of the exact extreme when no intermediate
// leaves the normal range: any product tree of |n| exact factors with
// directed roundings has relative error below that for k = |n| − 1 (each
// rounding contributes a factor in (1 − 2⁻⁵², 1 + 2⁻⁵²)); the reciprocal
// taken last for n < 0 adds one.
func powErrorFactor(n int) int {
	if n < 0 {
		return -n
	}
	return max(n-1, 0)
}

func extPow(a ext, n int) ext {
	if n < 0 {
		return extQuo(extOf(1), extPow(a, -n))
	}
	r := extOf(1)
	for range n {
		r = extMul(r, a)
	}
	return r
}

// TestPowIntExact checks PowInt for n ∈ [−6, 13] ∪ {16, 21, 32} on random
// intervals: containment of exact powers of sampled members, containment of
// the exact extremes over the ends (and 0), tightness for n ∈ {−1, 0, 1, 2},
// and, where the exact extreme has magnitude in [2⁻¹⁰⁰⁰, 2¹⁰⁰⁰], a relative
// distance at most k·2⁻⁵²·(1 + 2⁻⁴⁰) from it (see powErrorFactor).
func TestPowIntExact(t *testing.T) {
	n := scaled(100_000)
	g := newGen(400)
	rep := &reporter{t: t}
	exps := []int{-6, -5, -4, -3, -2, -1, 0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13, 16, 21, 32}
	lim, limHi := extOf(0x1p-1000), extOf(0x1p1000)
	maxULP := 0.0
	for range n {
		x := g.interval()
		if g.r.IntN(2) == 0 { // keep about half the cases in a moderate range
			x = I{math.Max(x.Lo, -1e6), math.Min(x.Hi, 1e6)}
			if x.Lo > x.Hi {
				x = I{x.Hi, x.Hi}
			}
		}
		k := exps[g.r.IntN(len(exps))]
		z := x.PowInt(k)
		if !(z.Lo <= z.Hi) {
			rep.errorf("PowInt(%v, %d) = [%x, %x] not an interval", x, k, z.Lo, z.Hi)
			continue
		}
		if k < 0 && x.ContainsZero() {
			if z != Entire() {
				rep.errorf("PowInt(%v, %d) = %v, want Entire", x, k, z)
			}
			continue
		}
		var ends []ext
		for _, v := range []float64{x.Lo, x.Hi} {
			ends = append(ends, extPow(extOf(v), k))
		}
		if k > 0 && k%2 == 0 && x.ContainsZero() {
			ends = append(ends, extZero())
		}
		lo, hi := ends[0], ends[0]
		for _, e := range ends[1:] {
			if extCmp(e, lo) < 0 {
				lo = e
			}
			if extCmp(e, hi) > 0 {
				hi = e
			}
		}
		if !contains(z, lo) || !contains(z, hi) {
			rep.errorf("PowInt(%v, %d) = %v misses exact range [%v, %v]", x, k, z, lo, hi)
		}
		if k >= -1 && k <= 2 && (!tightDown(z.Lo, lo) || !tightUp(z.Hi, hi)) {
			rep.errorf("PowInt(%v, %d) = [%x, %x] not tightest, exact [%v, %v]", x, k, z.Lo, z.Hi, lo, hi)
		}
		rounds := powErrorFactor(k)
		for j, e := range []ext{lo, hi} {
			end := z.Lo
			if j == 1 {
				end = z.Hi
			}
			if e.inf != 0 || e.isZero() || math.IsInf(end, 0) {
				continue
			}
			m := e
			if m.sign() < 0 {
				m = extNeg(e)
			}
			if extCmp(m, lim) < 0 || extCmp(m, limHi) > 0 {
				continue
			}
			d := new(big.Rat).Sub(extOf(end).rat(), e.rat())
			d.Abs(d).Quo(d, m.rat())
			rel, _ := d.Float64()
			if u := rel * 0x1p52; u > maxULP {
				maxULP = u
			}
			if rel > float64(rounds)*0x1p-52*(1+0x1p-40) {
				rep.errorf("PowInt(%v, %d): end %x is %g from exact %v, over %d roundings", x, k, end, rel, e, rounds)
			}
		}
		for _, s := range g.sample(x) {
			if s == 0 && k < 0 {
				continue
			}
			if e := extPow(extOf(s), k); !contains(z, e) {
				rep.errorf("PowInt(%v, %d) = %v misses %x^%d", x, k, z, s, k)
			}
		}
	}
	t.Logf("PowInt: %d ops, largest relative distance of an end from the exact extreme: %.2f·2⁻⁵²", n, maxULP)
}

// TestPowIntIdentities checks PowInt against the single operations it must
// agree with, and edge exponents.
func TestPowIntIdentities(t *testing.T) {
	g := newGen(500)
	for range 2000 {
		x := g.interval()
		if got, want := x.PowInt(2), x.Sqr(); got != want {
			t.Errorf("PowInt(%v, 2) = %v, Sqr = %v", x, got, want)
		}
		if got, want := x.PowInt(-1), x.Recip(); got != want {
			t.Errorf("PowInt(%v, −1) = %v, Recip = %v", x, got, want)
		}
		if got := x.PowInt(1); got != x {
			t.Errorf("PowInt(%v, 1) = %v", x, got)
		}
		if got := x.PowInt(0); got != (I{1, 1}) {
			t.Errorf("PowInt(%v, 0) = %v", x, got)
		}
	}
	tests := []struct {
		x    I
		n    int
		want I
	}{
		{I{1, 1}, math.MinInt, I{1, 1}},
		{I{1, 1}, math.MaxInt, I{1, 1}},
		{I{-1, -1}, math.MaxInt, I{-1, -1}}, // MaxInt is odd
		{I{2, 2}, math.MinInt, I{0, math.SmallestNonzeroFloat64}},
		{I{2, 2}, 1023, I{0x1p1023, 0x1p1023}},
		{I{2, 2}, 1024, I{math.MaxFloat64, math.Inf(1)}},
		{I{2, 2}, -1074, I{math.SmallestNonzeroFloat64, math.SmallestNonzeroFloat64}},
		{I{-3, 2}, 3, I{-27, 8}},
		{I{-3, 2}, 4, I{0, 81}},
		{I{-3, 2}, -1, Entire()},
		{I{2, 4}, -2, I{0.0625, 0.25}},
		{I{math.Inf(-1), 2}, 2, I{0, math.Inf(1)}},
		{I{math.Inf(-1), -2}, -1, I{-0.5, 0}},
		{I{math.Inf(-1), -2}, 3, I{math.Inf(-1), -8}},
	}
	for _, tt := range tests {
		if got := tt.x.PowInt(tt.n); got != tt.want {
			t.Errorf("PowInt(%v, %d) = %v, want %v", tt.x, tt.n, got, tt.want)
		}
	}
}

// TestIntervalSpecialCases pins interval results with infinite and zero
// ends (IEEE 1788-2015 ranges) and the Mid/Rad conventions.
func TestIntervalSpecialCases(t *testing.T) {
	inf, max := math.Inf(1), math.MaxFloat64
	tests := []struct {
		name string
		got  I
		want I
	}{
		{"[0,0]·Entire", Point(0).Mul(Entire()), I{0, 0}},
		{"[0,1]·[1,∞]", New(0, 1).Mul(New(1, inf)), I{0, inf}},
		{"[−1,2]·[3,∞]", New(-1, 2).Mul(New(3, inf)), Entire()},
		{"[−∞,−1]·[−∞,−2]", New(-inf, -1).Mul(New(-inf, -2)), I{2, inf}},
		{"Entire·Entire", Entire().Mul(Entire()), Entire()},
		{"[−2,3]·[−5,4]", New(-2, 3).Mul(New(-5, 4)), I{-15, 12}},
		{"[1,2]/[−1,1]", New(1, 2).Div(New(-1, 1)), Entire()},
		{"[1,2]/[0,1]", New(1, 2).Div(New(0, 1)), Entire()},
		{"[1,2]/[1,∞]", New(1, 2).Div(New(1, inf)), I{0, 2}},
		{"[−∞,5]/[−∞,−1]", New(-inf, 5).Div(New(-inf, -1)), I{-5, inf}},
		{"[−∞,−1]/[−∞,−1]", New(-inf, -1).Div(New(-inf, -1)), I{0, inf}},
		{"[−3,6]/[−3,−2]", New(-3, 6).Div(New(-3, -2)), I{-3, 1.5}},
		{"[max,max]+[max,max]", Point(max).Add(Point(max)), I{max, inf}},
		{"[−max,0]−[0,max]", New(-max, 0).Sub(New(0, max)), I{-inf, 0}},
		{"Entire−Entire", Entire().Sub(Entire()), Entire()},
		{"[−3,2]²", New(-3, 2).Sqr(), I{0, 9}},
		{"[−∞,−2]²", New(-inf, -2).Sqr(), I{4, inf}},
		{"[4,9] MulF −2", New(4, 9).MulF(-2), I{-18, -8}},
		{"Entire MulF 0", Entire().MulF(0), I{0, 0}},
		{"[1,2] AddF max", New(1, 2).AddF(max), I{max, inf}},
		{"[1,3] DivF −2", New(1, 3).DivF(-2), I{-1.5, -0.5}},
		{"Recip [2,∞]", New(2, inf).Recip(), I{0, 0.5}},
		{"Abs [−3,2]", New(-3, 2).Abs(), I{0, 3}},
	}
	for _, tt := range tests {
		if tt.got != tt.want {
			t.Errorf("%s = %v, want %v", tt.name, tt.got, tt.want)
		}
	}
	sqrtTests := []struct {
		x    I
		want I
		ok   bool
	}{
		{New(-4, 9), I{0, 3}, false},
		{New(-4, -1), I{0, 0}, false},
		{New(4, inf), I{2, inf}, true},
		{New(math.Copysign(0, -1), 1), I{0, 1}, true},
	}
	for _, tt := range sqrtTests {
		if got, ok := tt.x.Sqrt(); got != tt.want || ok != tt.ok {
			t.Errorf("Sqrt(%v) = %v, %v; want %v, %v", tt.x, got, ok, tt.want, tt.ok)
		}
	}
	midTests := []struct {
		x   I
		mid float64
	}{
		{Entire(), 0},
		{New(-inf, 1), -max},
		{New(1, inf), max},
		{New(-max, max), 0},
		{New(max, max), max},
		{New(math.SmallestNonzeroFloat64, math.SmallestNonzeroFloat64), math.SmallestNonzeroFloat64},
		{New(1, 2), 1.5},
	}
	for _, tt := range midTests {
		if got := tt.x.Mid(); got != tt.mid {
			t.Errorf("Mid(%v) = %x, want %x", tt.x, got, tt.mid)
		}
	}
}

// TestMidRadWid checks on random intervals that Mid lies in x, that
// [Mid − Rad, Mid + Rad] ⊇ x exactly, that Rad is within
// (half width + 2⁻⁵³|Mid|)(1 + 2⁻⁵²) + 2⁻¹⁰⁷³ and that Wid is the tightest
// upper bound of Hi − Lo.
func TestMidRadWid(t *testing.T) {
	g := newGen(600)
	rep := &reporter{t: t}
	for range scaled(50_000) {
		x := g.interval()
		m, r, w := x.Mid(), x.Rad(), x.Wid()
		if !x.Contains(m) {
			rep.errorf("Mid(%v) = %x not in x", x, m)
		}
		if !tightUp(w, extSub(extOf(x.Hi), extOf(x.Lo))) {
			rep.errorf("Wid(%v) = %x not the tightest upper bound", x, w)
		}
		if !x.IsBounded() {
			if !math.IsInf(r, 1) {
				rep.errorf("Rad(%v) = %x, want +∞", x, r)
			}
			continue
		}
		em, er := extOf(m), extOf(r)
		if cmpF(x.Lo, extSub(em, er)) < 0 || cmpF(x.Hi, extAdd(em, er)) > 0 {
			rep.errorf("[Mid − Rad, Mid + Rad] of %v misses an end (Mid %x, Rad %x)", x, m, r)
		}
		hw := extMul(extSub(extOf(x.Hi), extOf(x.Lo)), extOf(0.5))
		bound := extAdd(hw, extMul(extOf(math.Abs(m)), extOf(0x1p-53)))
		bound = extAdd(extMul(bound, extOf(1+0x1p-52)), extOf(0x1p-1073))
		if cmpF(r, bound) > 0 {
			rep.errorf("Rad(%v) = %x too wide", x, r)
		}
	}
}

// TestMisusePanics checks that misuse panics with the package prefix.
func TestMisusePanics(t *testing.T) {
	inf, nan := math.Inf(1), math.NaN()
	tests := []struct {
		name string
		f    func()
	}{
		{"Point(NaN)", func() { Point(nan) }},
		{"Point(+∞)", func() { Point(inf) }},
		{"New(2, 1)", func() { New(2, 1) }},
		{"New(+∞, +∞)", func() { New(inf, inf) }},
		{"New(−∞, −∞)", func() { New(-inf, -inf) }},
		{"New(NaN, 1)", func() { New(nan, 1) }},
		{"DivDown(1, 0)", func() { DivDown(1, 0) }},
		{"DivUp(0, 0)", func() { DivUp(0, 0) }},
		{"SqrtDown(−1)", func() { SqrtDown(-1) }},
		{"SqrtUp(NaN)", func() { SqrtUp(nan) }},
		{"AddDown(NaN, 1)", func() { AddDown(nan, 1) }},
		{"MulUp(2, NaN)", func() { MulUp(2, nan) }},
		{"MulF(+∞)", func() { New(1, 2).MulF(inf) }},
		{"AddF(NaN)", func() { New(1, 2).AddF(nan) }},
		{"HullPoint(NaN)", func() { New(1, 2).HullPoint(nan) }},
	}
	for _, tt := range tests {
		func() {
			defer func() {
				r := recover()
				s, _ := r.(string)
				if len(s) < 10 || s[:10] != "interval: " {
					t.Errorf("%s: recovered %v, want a panic with prefix \"interval: \"", tt.name, r)
				}
			}()
			tt.f()
		}()
	}
}
