package algebraic

import (
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"testing"

	"gapcert/interval"
)

// This file tries to break the exact zero tests: identities that hold
// (zero) and values that miss zero by little, decided exactly and compared
// with an independent high-precision evaluation in math/big.

// bigPrec is the precision of the reference evaluations, in bits; values
// below bigZero in magnitude count as 0 in them (every nonzero value built
// below exceeds 1e-70, and the references err by less than 1e-100).
const bigPrec = 400

var bigZero = new(big.Float).SetPrec(bigPrec).SetFloat64(1e-80)

// bigComplex is a complex number at bigPrec.
type bigComplex struct{ re, im *big.Float }

func newBigComplex(re, im float64) bigComplex {
	return bigComplex{new(big.Float).SetPrec(bigPrec).SetFloat64(re), new(big.Float).SetPrec(bigPrec).SetFloat64(im)}
}

func (a bigComplex) mul(b bigComplex) bigComplex {
	re := new(big.Float).SetPrec(bigPrec).Mul(a.re, b.re)
	re.Sub(re, new(big.Float).SetPrec(bigPrec).Mul(a.im, b.im))
	im := new(big.Float).SetPrec(bigPrec).Mul(a.re, b.im)
	im.Add(im, new(big.Float).SetPrec(bigPrec).Mul(a.im, b.re))
	return bigComplex{re, im}
}

func (a bigComplex) pow(k int64) bigComplex {
	p := newBigComplex(1, 0)
	for range k {
		p = p.mul(a)
	}
	return p
}

// bigExpIPi returns e^{iπ/n}, refined from its float64 value by Newton's
// method for z^n + 1 = 0, z ← z − (z^n + 1)/(n·z^{n−1}) (common practice):
// the roots of z^n = −1 lie 2π/n apart, far beyond the float64 error, so
// the iteration converges, quadratically, to e^{iπ/n}. The reference
// values so need neither π nor a series.
func bigExpIPi(n int64) bigComplex {
	z := newBigComplex(math.Cos(math.Pi/float64(n)), math.Sin(math.Pi/float64(n)))
	for range 8 {
		zn1 := z.pow(n - 1)
		num := zn1.mul(z)
		num.re.Add(num.re, big.NewFloat(1))
		den := bigComplex{new(big.Float).Mul(zn1.re, big.NewFloat(float64(n))), new(big.Float).Mul(zn1.im, big.NewFloat(float64(n)))}
		// num/den = num·conj(den)/|den|².
		abs2 := new(big.Float).SetPrec(bigPrec).Mul(den.re, den.re)
		abs2.Add(abs2, new(big.Float).SetPrec(bigPrec).Mul(den.im, den.im))
		q := num.mul(bigComplex{den.re, new(big.Float).Neg(den.im)})
		z.re.Sub(z.re, q.re.Quo(q.re, abs2))
		z.im.Sub(z.im, q.im.Quo(q.im, abs2))
	}
	return z
}

// bigCosSinPi returns cos(kπ/n) and sin(kπ/n), the real and imaginary
// parts of (e^{iπ/n})^k with k reduced modulo 2n.
func bigCosSinPi(k, n int64) (cos, sin *big.Float) {
	z := bigExpIPi(n).pow(((k % (2 * n)) + 2*n) % (2 * n))
	return z.re, z.im
}

func bigInt(c int64) *big.Float { return new(big.Float).SetPrec(bigPrec).SetInt64(c) }

// bigMul returns the product of xs at bigPrec.
func bigMul(xs ...*big.Float) *big.Float {
	p := bigInt(1)
	for _, x := range xs {
		p.Mul(p, x)
	}
	return p
}

// exactReading is the verdict of both exact readers on one constant.
type exactReading struct {
	surdRead, surdZero, cycRead, cycZero bool
	enclosures                           []interval.I
}

// readExactly reads the formula src through its canonical text, as a
// surd and in the cyclotomic field that holds it, guarded by formula's
// enclosure (guarded) or not.
func readExactly(t *testing.T, src string, guarded bool) exactReading {
	t.Helper()
	text, val := canonical(t, src)
	if !guarded {
		val = interval.Entire()
	}
	var r exactReading
	if s, ok := ReadSurd(text, val); ok {
		r.surdRead, r.surdZero = true, s.IsZero()
		r.enclosures = append(r.enclosures, s.Enclose())
	}
	if s, ok := ReadRootSum(text, val); ok {
		if f, ok := CyclotomicFieldOf(s); ok {
			c := f.Element(s)
			r.cycRead, r.cycZero = true, c.IsZero()
			r.enclosures = append(r.enclosures, c.Enclose())
		}
	}
	return r
}

// checkAgainst compares the exact verdicts with the reference value ref.
func (r exactReading) checkAgainst(t *testing.T, src string, ref *big.Float) {
	t.Helper()
	zero := new(big.Float).Abs(ref).Cmp(bigZero) < 0
	if r.surdRead && r.surdZero != zero {
		t.Errorf("%s: surd zero test says %v, reference value %.6g", src, r.surdZero, ref)
	}
	if r.cycRead && r.cycZero != zero {
		t.Errorf("%s: cyclotomic zero test says %v, reference value %.6g", src, r.cycZero, ref)
	}
	for _, e := range r.enclosures {
		if zero {
			if !e.ContainsZero() {
				t.Errorf("%s: enclosure %v misses 0", src, e)
			}
			continue
		}
		lo := new(big.Float).SetPrec(bigPrec).SetFloat64(e.Lo)
		hi := new(big.Float).SetPrec(bigPrec).SetFloat64(e.Hi)
		if ref.Cmp(lo.Sub(lo, bigZero)) < 0 || ref.Cmp(hi.Add(hi, bigZero)) > 0 {
			t.Errorf("%s: enclosure %v misses the reference value %.20g", src, e, ref)
		}
	}
}

// TestZeroTestKnownIdentities decides identities of trigonometry and
// radicals that hold, and the same shifted by tiny rationals, which do
// not. Sources: cos(2π/5) = (√5 − 1)/4, cos(π/5) = (1 + √5)/4, sin(π/12)
// = (√6 − √2)/4, cos(π/7) + cos(3π/7) + cos(5π/7) = 1/2, the triple-angle
// and Chebyshev formulas cos 3θ = 4cos³θ − 3cos θ, cos 5θ = 16cos⁵θ −
// 20cos³θ + 5cos θ (common practice); the quadratic Gauss sums
// Σ_k (k/p)·e^{2πik/p} = √p for p ≡ 1 (mod 4) and i√p for p ≡ 3 (mod 4)
// (Gauss 1811; K. Ireland and M. Rosen, A Classical Introduction to Modern
// Number Theory, 2nd ed., Springer 1990, ch. 6 — recalled, not checked),
// written for p = 5, 13 with cosines and p = 7 with sines.
func TestZeroTestKnownIdentities(t *testing.T) {
	identities := []struct {
		src       string
		surd, cyc bool // which readers must read it
	}{
		{"(4*cos(2*pi/5)+1)^2-5", false, true},
		{"(4*cos(pi/5)-1)^2-5", false, true},
		{"sin(pi/12)-(sqrt(6)-sqrt(2))/4", true, true},
		{"cos(pi/7)+cos(3*pi/7)+cos(5*pi/7)-1/2", false, true},
		{"4*cos(pi/9)^3-3*cos(pi/9)-1/2", false, true},
		{"cos(5*pi/11)-(16*cos(pi/11)^5-20*cos(pi/11)^3+5*cos(pi/11))", false, true},
		{"(2*cos(2*pi/5)-2*cos(4*pi/5))^2-5", false, true},
		{"(2*(sin(2*pi/7)+sin(4*pi/7)-sin(6*pi/7)))^2-7", false, true},
		{"(2*(cos(2*pi/13)-cos(4*pi/13)+cos(6*pi/13)+cos(8*pi/13)-cos(10*pi/13)-cos(12*pi/13)))^2-13", false, true},
		{"cos(2*pi/97)^2+sin(2*pi/97)^2-1", false, true},
		{"sin(3*pi/7)-sin(4*pi/7)", false, true},
		{"sqrt(2)*cos(pi/4)-1", true, true},
		{"sqrt(3)*sin(pi/3)-3/2", true, true},
		{"sqrt(12)*sqrt(3/4)-3", true, true},
		{"sqrt(8/3)-2*sqrt(6)/3", true, true},
		{"sqrt(50)/sqrt(2)-5", true, false},
		{"(sqrt(2)+sqrt(3))^2-5-2*sqrt(6)", true, true},
		{"(sqrt(5)+sqrt(7))*(sqrt(7)-sqrt(5))-2", true, false},
		{"cos(pi/12)^2-(2+sqrt(3))/4", true, true},
	}
	for _, id := range identities {
		for _, shift := range []string{"", "+1e-60", "-1/(3*10^60)"} {
			src := id.src + shift
			r := readExactly(t, src, true)
			if r.surdRead != id.surd || r.cycRead != id.cyc {
				t.Errorf("%s: read as surd %v, cyclotomic %v; want %v, %v", src, r.surdRead, r.cycRead, id.surd, id.cyc)
			}
			if (r.surdRead && r.surdZero != (shift == "")) || (r.cycRead && r.cycZero != (shift == "")) {
				t.Errorf("%s: zero as surd %v, cyclotomic %v; want %v", src, r.surdZero, r.cycZero, shift == "")
			}
		}
	}
}

// trigFactor is cos(kπ/n) or sin(kπ/n).
type trigFactor struct {
	sin  bool
	k, n int64
}

func (f trigFactor) text() string {
	name := "cos"
	if f.sin {
		name = "sin"
	}
	return fmt.Sprintf("%s(%d*pi/%d)", name, f.k, f.n)
}

func (f trigFactor) value() *big.Float {
	cos, sin := bigCosSinPi(f.k, f.n)
	if f.sin {
		return sin
	}
	return cos
}

// trigSum is a sum of integer multiples of products of trigFactors, kept
// as its text and its reference value.
type trigSum struct {
	src string
	ref *big.Float
}

func (s *trigSum) add(c int64, fs ...trigFactor) {
	if s.ref == nil {
		s.ref = new(big.Float).SetPrec(bigPrec)
	}
	v := new(big.Float).SetPrec(bigPrec).SetInt64(c)
	s.src += fmt.Sprintf("%+d", c)
	for _, f := range fs {
		v.Mul(v, f.value())
		s.src += "*" + f.text()
	}
	s.ref.Add(s.ref, v)
}

// randomTrigSum returns a random sum built from the product formulas
// 2cos a cos b = cos(a − b) + cos(a + b), 2sin a cos b = sin(a + b) +
// sin(a − b), 2sin a sin b = cos(a − b) − cos(a + b) and from
// sin θ = cos(π/2 − θ), cos θ = cos(−θ) (common practice), at angles
// kπ/n; each rewriting enters as the difference of its two sides, half of
// the time with one side dropped or a tiny rational added, so that about
// half of the sums are 0. The reference value is evaluated term by term
// from the factors, independently of the identities.
func randomTrigSum(rng *rand.Rand) trigSum {
	dens := []int64{3, 5, 7, 8, 9, 12, 15, 20, 24, 30, 60}
	n := dens[rng.IntN(len(dens))]
	angle := func() int64 { return rng.Int64N(4*n) - 2*n }
	coef := func() int64 { return 1 + rng.Int64N(5) }
	var s trigSum
	broken := rng.IntN(2) == 0
	for i := range 1 + rng.IntN(3) {
		a, b, c := angle(), angle(), coef()
		keep := !broken || i > 0
		switch rng.IntN(4) {
		case 0:
			s.add(2*c, trigFactor{false, a, n}, trigFactor{false, b, n})
			s.add(-c, trigFactor{false, a - b, n})
			if keep {
				s.add(-c, trigFactor{false, a + b, n})
			}
		case 1:
			s.add(2*c, trigFactor{true, a, n}, trigFactor{false, b, n})
			s.add(-c, trigFactor{true, a + b, n})
			if keep {
				s.add(-c, trigFactor{true, a - b, n})
			}
		case 2:
			s.add(2*c, trigFactor{true, a, n}, trigFactor{true, b, n})
			s.add(-c, trigFactor{false, a - b, n})
			if keep {
				s.add(c, trigFactor{false, a + b, n})
			}
		default:
			s.add(c, trigFactor{true, a, n}, trigFactor{false, b, n})
			if keep {
				s.add(-c, trigFactor{false, n - 2*a, 2 * n}, trigFactor{false, -b, n})
			}
		}
	}
	if broken && rng.IntN(2) == 0 {
		// Undo the dropped side's effect on exactness: add a tiny rational
		// to a sum that is already exact otherwise.
		k := int64(20 + rng.IntN(40))
		s.src += fmt.Sprintf("+1/10^%d", k)
		q := new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Exp(big.NewInt(10), big.NewInt(k), nil))
		s.ref.Add(s.ref, new(big.Float).SetPrec(bigPrec).SetRat(q))
	}
	return s
}

// TestZeroTestRandomTrig decides random trigonometric sums exactly, as
// surds where they are read as such and in cyclotomic fields, with and
// without the enclosure guard, and compares every verdict and enclosure
// with the reference value. Fixed seed.
func TestZeroTestRandomTrig(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 3))
	zeros, nonzeros, surds := 0, 0, 0
	for range 300 {
		s := randomTrigSum(rng)
		for _, guarded := range []bool{true, false} {
			r := readExactly(t, s.src, guarded)
			if !r.cycRead {
				t.Errorf("%s: not read in a cyclotomic field", s.src)
			}
			r.checkAgainst(t, s.src, s.ref)
			if guarded && r.surdRead {
				surds++
			}
		}
		if new(big.Float).Abs(s.ref).Cmp(bigZero) < 0 {
			zeros++
		} else {
			nonzeros++
		}
	}
	if zeros < 60 || nonzeros < 60 || surds < 30 {
		t.Errorf("%d zero and %d nonzero sums, %d read as surds; want at least 60, 60, 30", zeros, nonzeros, surds)
	}
	t.Logf("%d zero, %d nonzero, %d read as surds", zeros, nonzeros, surds)
}

// TestZeroTestRandomSurds decides random sums c·√a·√b − c·√(ab) and
// c·√(k²r) − c·k·√r with rational a, b, r (so that the normal form must
// merge radicands whose ratio is a rational square, such as √(3/4) and
// √12), half of the time with one term perturbed, against the reference
// value computed with big.Float square roots. Fixed seed.
func TestZeroTestRandomSurds(t *testing.T) {
	rng := rand.New(rand.NewPCG(2, 9))
	ratText := func() (string, *big.Rat) {
		p, q := 1+rng.Int64N(40), 1+rng.Int64N(12)
		return fmt.Sprintf("(%d/%d)", p, q), big.NewRat(p, q)
	}
	sqrtRef := func(x *big.Rat) *big.Float {
		return new(big.Float).SetPrec(bigPrec).Sqrt(new(big.Float).SetPrec(bigPrec).SetRat(x))
	}
	zeros, nonzeros := 0, 0
	for range 300 {
		src := "0"
		ref := new(big.Float).SetPrec(bigPrec)
		broken := rng.IntN(2) == 0
		for i := range 1 + rng.IntN(4) {
			c := 1 + rng.Int64N(7)
			at, a := ratText()
			bt, b := ratText()
			ab := new(big.Rat).Mul(a, b)
			if broken && i == 0 {
				ab.Add(ab, big.NewRat(1, 1000003)) // √(ab + ε) ≠ √a·√b
			}
			if rng.IntN(2) == 0 {
				src += fmt.Sprintf("+%d*sqrt%s*sqrt%s-%d*sqrt(%s)", c, at, bt, c, ab.RatString())
				ref.Add(ref, bigMul(bigInt(c), sqrtRef(a), sqrtRef(b)))
				ref.Sub(ref, bigMul(bigInt(c), sqrtRef(ab)))
				continue
			}
			// √(k²a) − k√a with k = b.
			k2a := new(big.Rat).Mul(new(big.Rat).Mul(b, b), a)
			if broken && i == 0 {
				k2a.Add(k2a, big.NewRat(1, 1000003))
			}
			src += fmt.Sprintf("+%d*sqrt(%s)-%d*%s*sqrt%s", c, k2a.RatString(), c, bt, at)
			ref.Add(ref, bigMul(bigInt(c), sqrtRef(k2a)))
			ref.Sub(ref, bigMul(bigInt(c), new(big.Float).SetPrec(bigPrec).SetRat(b), sqrtRef(a)))
		}
		r := readExactly(t, src, true)
		if !r.surdRead {
			t.Errorf("%s: not read as a surd", src)
		}
		r.checkAgainst(t, src, ref)
		if new(big.Float).Abs(ref).Cmp(bigZero) < 0 {
			zeros++
		} else {
			nonzeros++
		}
	}
	if zeros < 100 || nonzeros < 100 {
		t.Errorf("%d zero and %d nonzero sums; want at least 100 each", zeros, nonzeros)
	}
}

// TestReadConstSizeBounds: values whose exact form would grow beyond the
// bounds (rationals of more than maxRatBits bits, surds of more than
// maxSurdTerms terms, roots of unity of order above
// maxCyclotomicOrder) are refused while they are read, so that a short
// formula cannot make the reader run for minutes or exhaust memory (before
// these bounds, cos(pi*(((1e400)^64)^64)^16) took over a minute to read and
// the root sum below 4 s); the readable neighbours stay readable.
func TestReadConstSizeBounds(t *testing.T) {
	eight := "(sqrt(2)+sqrt(3)+sqrt(5)+sqrt(7)+sqrt(11)+sqrt(13)+sqrt(17)+sqrt(19))"
	three := "(cos(pi/7)+cos(pi/11)+cos(pi/13))"
	for _, tc := range []struct {
		text       string
		surd, root bool
	}{
		{"cos(pi*((1e400)^64)^64)", false, false},
		{"(1e300)^64-(1e300)^64", false, false},
		{eight + "^4-" + eight + "^4", false, false}, // 1 + 28 + 70 terms
		{three + "^12-" + three + "^12", false, false},
		{"cos(pi*(1e400)^2)", true, true},
		{"(sqrt(2)+sqrt(3))^64", true, true},
		{"(sqrt(2)+sqrt(3)+sqrt(5)+sqrt(7)+sqrt(11)+sqrt(13))^2", true, false},
		{"(cos(pi/7)+cos(pi/11))^12", false, true},
	} {
		if _, ok := readConst[Surd](surdAlgebra{}, tc.text, interval.Entire()); ok != tc.surd {
			t.Errorf("%s: read as a surd %v, want %v", tc.text, ok, tc.surd)
		}
		if _, ok := readConst[RootSum](rootAlgebra{}, tc.text, interval.Entire()); ok != tc.root {
			t.Errorf("%s: read as a root sum %v, want %v", tc.text, ok, tc.root)
		}
	}
}
