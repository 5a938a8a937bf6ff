package algebraic

import (
	"math/big"
	"slices"

	"gapcert/interval"
	"gapcert/interval/decimalio"
)

// This file holds the formal root sums read from formulas and the
// arithmetic of cyclotomic fields; the zero test rests on the
// irreducibility of Φ_m (see the package documentation).

// Bounds on the cyclotomic fields used, which keep the tables small: the
// vertices of a regular n-gon, cos(2πk/n) and sin(2πk/n), lie in Q(ζ_m)
// with m | 4n, so n ≤ 100 (fem/problem's limit) needs m ≤ 400 and
// φ(m) ≤ 160.
const (
	maxCyclotomicOrder  = 1000
	maxCyclotomicDegree = 240
)

// rootTerm is c·e^{iπq}, q ∈ [0, 2).
type rootTerm struct{ q, c *big.Rat }

// RootSum is a formal sum Σ c·e^{iπq} with rational c ≠ 0 and distinct
// rational q ∈ [0, 2); e^{iπ} is written −1, so a sum with the single
// exponent 0 is rational. It is not a normal form (1 + ζ_3 + ζ_3² is a
// nonzero RootSum of value 0); zero tests belong to CyclotomicField.
type RootSum []rootTerm

// rootAlgebra is the algebra of formal root sums for readConst.
type rootAlgebra struct{}

func (rootAlgebra) fromRat(x *big.Rat) RootSum {
	return mergeRoots(RootSum{{q: new(big.Rat), c: new(big.Rat).Set(x)}})
}

func (rootAlgebra) add(a, b RootSum) RootSum {
	return mergeRoots(append(append(RootSum{}, a...), b...))
}

func (rootAlgebra) neg(a RootSum) RootSum {
	out := make(RootSum, len(a))
	for i, t := range a {
		out[i] = rootTerm{q: t.q, c: new(big.Rat).Neg(t.c)}
	}
	return out
}

func (rootAlgebra) mul(a, b RootSum) RootSum {
	var out RootSum
	for _, s := range a {
		for _, t := range b {
			out = append(out, rootTerm{q: new(big.Rat).Add(s.q, t.q), c: new(big.Rat).Mul(s.c, t.c)})
		}
	}
	return mergeRoots(out)
}

func (rootAlgebra) rat(a RootSum) (*big.Rat, bool) {
	switch {
	case len(a) == 0:
		return new(big.Rat), true
	case len(a) == 1 && a[0].q.Sign() == 0:
		return new(big.Rat).Set(a[0].c), true
	}
	return nil, false
}

// inv inverts nonzero rationals only.
func (alg rootAlgebra) inv(a RootSum) (RootSum, bool) {
	x, ok := alg.rat(a)
	if !ok || x.Sign() == 0 {
		return nil, false
	}
	return alg.fromRat(new(big.Rat).Inv(x)), true
}

// sqrtRat returns √x for x = s²·k with rational s and k ∈ {1, 2, 3, 6},
// using √2 = 2cos(π/4) and √3 = 2cos(π/6).
func (alg rootAlgebra) sqrtRat(x *big.Rat) (RootSum, bool) {
	for _, k := range []int64{1, 2, 3, 6} {
		s, ok := ratSqrt(new(big.Rat).Quo(x, big.NewRat(k, 1)))
		if !ok {
			continue
		}
		v := alg.fromRat(s)
		if k%2 == 0 {
			r2, _ := alg.cosPi(big.NewRat(1, 4))
			v = alg.mul(v, alg.mul(alg.fromRat(big.NewRat(2, 1)), r2))
		}
		if k%3 == 0 {
			r3, _ := alg.cosPi(big.NewRat(1, 6))
			v = alg.mul(v, alg.mul(alg.fromRat(big.NewRat(2, 1)), r3))
		}
		return v, true
	}
	return nil, false
}

// cosPi returns cos(tπ) = (e^{iπt} + e^{−iπt})/2.
func (rootAlgebra) cosPi(t *big.Rat) (RootSum, bool) {
	half := big.NewRat(1, 2)
	return mergeRoots(RootSum{{q: new(big.Rat).Set(t), c: half}, {q: new(big.Rat).Neg(t), c: new(big.Rat).Set(half)}}), true
}

func (rootAlgebra) enclose(a RootSum) interval.I {
	var v interval.I
	for _, t := range a {
		v = v.Add(decimalio.FromRat(t.c).Mul(interval.Cos(interval.Pi().Mul(decimalio.FromRat(t.q)))))
	}
	return v
}

// fits bounds the order of the roots of unity (rootOrder ≤
// maxCyclotomicOrder, which also bounds the number of terms) and the size
// of every coefficient.
func (rootAlgebra) fits(a RootSum) bool {
	if rootOrder(a).Cmp(big.NewInt(maxCyclotomicOrder)) > 0 {
		return false
	}
	for _, t := range a {
		if !ratFits(t.c) {
			return false
		}
	}
	return true
}

// rootOrder returns the least common multiple of the orders 2·den(q) of
// the roots of unity e^{iπq} of a (1 for a rational).
func rootOrder(a RootSum) *big.Int {
	m := big.NewInt(1)
	for _, t := range a {
		order := new(big.Int).Mul(big.NewInt(2), t.q.Denom())
		m.Div(new(big.Int).Mul(m, order), new(big.Int).GCD(nil, nil, m, order))
	}
	return m
}

// mergeRoots reduces exponents to [0, 2), writes e^{iπ} as −1, merges
// equal exponents and drops zero coefficients.
func mergeRoots(a RootSum) RootSum {
	two := big.NewRat(2, 1)
	var out RootSum
	for _, t := range a {
		q := new(big.Rat).Set(t.q)
		// q mod 2 in [0, 2): subtract 2·floor(q/2).
		f := new(big.Rat).Quo(q, two)
		fl := new(big.Int).Div(f.Num(), f.Denom()) // Euclidean: floor for positive denominators
		q.Sub(q, new(big.Rat).Mul(two, new(big.Rat).SetInt(fl)))
		c := new(big.Rat).Set(t.c)
		if q.Cmp(big.NewRat(1, 1)) == 0 {
			q.SetInt64(0)
			c.Neg(c)
		}
		merged := false
		for i := range out {
			if out[i].q.Cmp(q) == 0 {
				out[i].c.Add(out[i].c, c)
				merged = true
				break
			}
		}
		if !merged {
			out = append(out, rootTerm{q: q, c: c})
		}
	}
	return slices.DeleteFunc(out, func(t rootTerm) bool { return t.c.Sign() == 0 })
}

// CyclotomicField is Q(ζ_m) with the tables used by its arithmetic.
type CyclotomicField struct {
	m, deg int
	phi    []*big.Rat   // Φ_m, monic, coefficients from x^0 to x^deg
	pow    [][]*big.Rat // x^a mod Φ_m for 0 ≤ a < m
	cos    []interval.I // enclosures of cos(2πj/m), 0 ≤ j < deg
}

// Cyclotomic is an element of a CyclotomicField: Σ c[j] ζ^j, len(c) = deg.
type Cyclotomic struct {
	f *CyclotomicField
	c []*big.Rat
}

// cyclotomicPoly returns Φ_m with integer coefficients from x^0 up.
func cyclotomicPoly(m int, memo map[int][]*big.Int) []*big.Int {
	if p, ok := memo[m]; ok {
		return p
	}
	p := make([]*big.Int, m+1)
	for i := range p {
		p[i] = new(big.Int)
	}
	p[0].SetInt64(-1)
	p[m].SetInt64(1)
	for d := 1; d < m; d++ {
		if m%d != 0 {
			continue
		}
		q := cyclotomicPoly(d, memo)
		dq := len(q) - 1
		quo := make([]*big.Int, len(p)-dq)
		for k := len(p) - 1; k >= dq; k-- { // long division by the monic q
			c := new(big.Int).Set(p[k])
			quo[k-dq] = c
			for i := 0; i <= dq; i++ {
				p[k-dq+i].Sub(p[k-dq+i], new(big.Int).Mul(c, q[i]))
			}
		}
		p = quo
	}
	memo[m] = p
	return p
}

// newCycField returns Q(ζ_m), or false if m or φ(m) exceeds its bound.
func newCycField(m int) (*CyclotomicField, bool) {
	if m < 1 || m > maxCyclotomicOrder {
		return nil, false
	}
	pi := cyclotomicPoly(m, map[int][]*big.Int{})
	deg := len(pi) - 1
	if deg > maxCyclotomicDegree {
		return nil, false
	}
	f := &CyclotomicField{m: m, deg: deg}
	for _, c := range pi {
		f.phi = append(f.phi, new(big.Rat).SetInt(c))
	}
	x := f.zeroVec()
	x[0].SetInt64(1)
	for range m {
		f.pow = append(f.pow, x)
		// x·(current), reduced: shift up, then remove the x^deg term.
		next := f.zeroVec()
		top := x[deg-1]
		for j := deg - 1; j > 0; j-- {
			next[j].Set(x[j-1])
		}
		for j := 0; j < deg; j++ {
			next[j].Sub(next[j], new(big.Rat).Mul(top, f.phi[j]))
		}
		x = next
	}
	for j := range deg {
		angle := interval.Pi().Mul(interval.Point(float64(2 * j))).Div(interval.Point(float64(m)))
		f.cos = append(f.cos, interval.Cos(angle))
	}
	return f, true
}

func (f *CyclotomicField) zeroVec() []*big.Rat {
	v := make([]*big.Rat, f.deg)
	for i := range v {
		v[i] = new(big.Rat)
	}
	return v
}

// Element returns the element of f equal to the root sum a; every
// exponent q of a must satisfy qm/2 ∈ Z.
func (f *CyclotomicField) Element(a RootSum) Cyclotomic {
	v := f.zeroVec()
	for _, t := range a {
		e := new(big.Rat).Mul(t.q, big.NewRat(int64(f.m), 2))
		if !e.IsInt() {
			panic("algebraic: root of unity outside the field")
		}
		p := f.pow[e.Num().Int64()]
		for j := range v {
			v[j].Add(v[j], new(big.Rat).Mul(t.c, p[j]))
		}
	}
	return Cyclotomic{f: f, c: v}
}

func (a Cyclotomic) combine(b Cyclotomic, sign int) Cyclotomic {
	v := a.f.zeroVec()
	for j := range v {
		if sign > 0 {
			v[j].Add(a.c[j], b.c[j])
		} else {
			v[j].Sub(a.c[j], b.c[j])
		}
	}
	return Cyclotomic{f: a.f, c: v}
}

// Add returns a + b (both of one field).
func (a Cyclotomic) Add(b Cyclotomic) Cyclotomic { return a.combine(b, 1) }

// Sub returns a − b.
func (a Cyclotomic) Sub(b Cyclotomic) Cyclotomic { return a.combine(b, -1) }

// Neg returns −a.
func (a Cyclotomic) Neg() Cyclotomic { return a.Scale(big.NewRat(-1, 1)) }

// Scale returns s·a for a rational s.
func (a Cyclotomic) Scale(s *big.Rat) Cyclotomic {
	v := a.f.zeroVec()
	for j := range v {
		v[j].Mul(a.c[j], s)
	}
	return Cyclotomic{f: a.f, c: v}
}

// Mul returns a·b, reduced modulo Φ_m.
func (a Cyclotomic) Mul(b Cyclotomic) Cyclotomic {
	d := a.f.deg
	r := make([]*big.Rat, 2*d-1)
	for i := range r {
		r[i] = new(big.Rat)
	}
	var t big.Rat
	for i, x := range a.c {
		if x.Sign() == 0 {
			continue
		}
		for j, y := range b.c {
			if y.Sign() != 0 {
				r[i+j].Add(r[i+j], t.Mul(x, y))
			}
		}
	}
	for k := 2*d - 2; k >= d; k-- { // x^k = x^{k−d}·(x^d − Φ_m)
		if r[k].Sign() == 0 {
			continue
		}
		for i := range d {
			r[k-d+i].Sub(r[k-d+i], t.Mul(r[k], a.f.phi[i]))
		}
	}
	return Cyclotomic{f: a.f, c: r[:d]}
}

// IsZero reports whether a is 0, exactly.
func (a Cyclotomic) IsZero() bool {
	for _, x := range a.c {
		if x.Sign() != 0 {
			return false
		}
	}
	return true
}

// Rat returns the value of a and true when a is rational.
func (a Cyclotomic) Rat() (*big.Rat, bool) {
	for _, x := range a.c[1:] {
		if x.Sign() != 0 {
			return nil, false
		}
	}
	return new(big.Rat).Set(a.c[0]), true
}

// RatioSquare returns a rational w > 0 with a = w²·b and true, if there
// is one (b ≠ 0).
func (a Cyclotomic) RatioSquare(b Cyclotomic) (*big.Rat, bool) {
	for j, y := range b.c {
		if y.Sign() == 0 {
			continue
		}
		c := new(big.Rat).Quo(a.c[j], y)
		if c.Sign() <= 0 || !a.Sub(b.Scale(c)).IsZero() {
			return nil, false
		}
		return ratSqrt(c)
	}
	return nil, false
}

// SqrtRat returns √x as an element of a's field when x is the square of
// a rational.
func (a Cyclotomic) SqrtRat(x *big.Rat) (Cyclotomic, bool) {
	s, ok := ratSqrt(x)
	if !ok {
		return Cyclotomic{}, false
	}
	v := a.f.zeroVec()
	v[0].Set(s)
	return Cyclotomic{f: a.f, c: v}, true
}

// Enclose encloses the value of a real element: Σ c_j cos(2πj/m).
func (a Cyclotomic) Enclose() interval.I {
	var v interval.I
	for j, x := range a.c {
		if x.Sign() != 0 {
			v = v.Add(decimalio.FromRat(x).Mul(a.f.cos[j]))
		}
	}
	return v
}

// NewRootSum returns the root sum of the rational q.
func NewRootSum(q *big.Rat) RootSum { return rootAlgebra{}.fromRat(q) }

// ReadRootSum reads the constant formula text (in the canonical form of
// package formula) as a root sum, exactly; ok is false if some step leaves
// the root sums (see the package documentation), or if the value's
// enclosure misses val, the enclosure of the same text by package formula.
func ReadRootSum(text string, val interval.I) (s RootSum, ok bool) {
	return readConst[RootSum](rootAlgebra{}, text, val)
}

// CyclotomicFieldOf returns the smallest cyclotomic field Q(ζ_m) that
// holds every one of sums (m is the least common multiple of their orders,
// and at least 2); ok is false if m exceeds 1000 or φ(m) exceeds 240.
func CyclotomicFieldOf(sums ...RootSum) (f *CyclotomicField, ok bool) {
	m := big.NewInt(2)
	for _, s := range sums {
		order := rootOrder(s)
		m.Div(new(big.Int).Mul(m, order), new(big.Int).GCD(nil, nil, m, order))
		if m.Cmp(big.NewInt(maxCyclotomicOrder)) > 0 {
			return nil, false
		}
	}
	return newCycField(int(m.Int64()))
}
