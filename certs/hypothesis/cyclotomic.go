package hypothesis

import (
	"math/big"

	"gapcert/fem/problem"
	"gapcert/interval"
	"gapcert/interval/decimalio"
)

// This file holds exact arithmetic in cyclotomic fields Q(ζ_m), ζ_m =
// e^{2πi/m}, which hold cos and sin of every rational multiple of π (as
// (ζ^a + ζ^{−a})/2 and (ζ^a − ζ^{−a})/(2i)), hence the vertices of regular
// polygons written with cos(2*k*pi/n), sin(2*k*pi/n).
//
// Reading. A constant formula is first read as a formal sum Σ c·e^{iπq}
// (rootSum, rational c and q ∈ [0, 2)); once every coordinate of a polygon
// is read, m is the least common multiple of the orders 2·den(q), and each
// sum becomes an element of Q(ζ_m) (e^{iπq} = ζ_m^{qm/2}).
//
// Zero test. An element is kept as its coefficient vector in the basis
// 1, ζ, …, ζ^{d−1}, d = φ(m), reduced modulo the cyclotomic polynomial
// Φ_m, which is the minimal polynomial of ζ_m over Q (Φ_m is irreducible
// over Q: Gauss for prime m, Dedekind in general; see e.g. S. Lang,
// Algebra, rev. 3rd ed., Springer 2002, ch. VI §3 — the theorem number is
// recalled, not checked). So the basis is
// linearly independent over Q, the vector is unique, and an element is 0
// if and only if every coefficient is 0. Φ_m is computed exactly as
// (x^m − 1)/Π_{d | m, d < m} Φ_d (common practice).
//
// Values. Every element built here from real formulas is real, so its
// value is its real part Σ c_j cos(2πj/m), which is enclosed with the
// interval cosine.

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

// rootSum is a formal sum of rootTerms with distinct q and nonzero c;
// e^{iπ} is written −1, so a sum with the single exponent 0 is rational.
type rootSum []rootTerm

// rootAlgebra is the algebra of formal root sums for readConst.
type rootAlgebra struct{}

func (rootAlgebra) fromRat(x *big.Rat) rootSum {
	return mergeRoots(rootSum{{q: new(big.Rat), c: new(big.Rat).Set(x)}})
}

func (rootAlgebra) add(a, b rootSum) rootSum {
	return mergeRoots(append(append(rootSum{}, a...), b...))
}

func (rootAlgebra) neg(a rootSum) rootSum {
	out := make(rootSum, len(a))
	for i, t := range a {
		out[i] = rootTerm{q: t.q, c: new(big.Rat).Neg(t.c)}
	}
	return out
}

func (rootAlgebra) mul(a, b rootSum) rootSum {
	var out rootSum
	for _, s := range a {
		for _, t := range b {
			out = append(out, rootTerm{q: new(big.Rat).Add(s.q, t.q), c: new(big.Rat).Mul(s.c, t.c)})
		}
	}
	return mergeRoots(out)
}

func (rootAlgebra) rat(a rootSum) (*big.Rat, bool) {
	switch {
	case len(a) == 0:
		return new(big.Rat), true
	case len(a) == 1 && a[0].q.Sign() == 0:
		return new(big.Rat).Set(a[0].c), true
	}
	return nil, false
}

// inv inverts nonzero rationals only.
func (alg rootAlgebra) inv(a rootSum) (rootSum, bool) {
	x, ok := alg.rat(a)
	if !ok || x.Sign() == 0 {
		return nil, false
	}
	return alg.fromRat(new(big.Rat).Inv(x)), true
}

// sqrtRat returns √x for x = s²·k with rational s and k ∈ {1, 2, 3, 6},
// using √2 = 2cos(π/4) and √3 = 2cos(π/6).
func (alg rootAlgebra) sqrtRat(x *big.Rat) (rootSum, bool) {
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
func (rootAlgebra) cosPi(t *big.Rat) (rootSum, bool) {
	half := big.NewRat(1, 2)
	return mergeRoots(rootSum{{q: new(big.Rat).Set(t), c: half}, {q: new(big.Rat).Neg(t), c: new(big.Rat).Set(half)}}), true
}

func (rootAlgebra) enclose(a rootSum) interval.I {
	var v interval.I
	for _, t := range a {
		v = v.Add(decimalio.FromRat(t.c).Mul(interval.Cos(interval.Pi().Mul(decimalio.FromRat(t.q)))))
	}
	return v
}

// fits bounds the order of the roots of unity (rootOrder ≤
// maxCyclotomicOrder, which also bounds the number of terms) and the size
// of every coefficient.
func (rootAlgebra) fits(a rootSum) bool {
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
func rootOrder(a rootSum) *big.Int {
	m := big.NewInt(1)
	for _, t := range a {
		order := new(big.Int).Mul(big.NewInt(2), t.q.Denom())
		m.Div(new(big.Int).Mul(m, order), new(big.Int).GCD(nil, nil, m, order))
	}
	return m
}

// mergeRoots reduces exponents to [0, 2), writes e^{iπ} as −1, merges
// equal exponents and drops zero coefficients.
func mergeRoots(a rootSum) rootSum {
	two := big.NewRat(2, 1)
	var out rootSum
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
	k := 0
	for _, t := range out {
		if t.c.Sign() != 0 {
			out[k] = t
			k++
		}
	}
	return out[:k]
}

// cycField is Q(ζ_m) with the tables used by its arithmetic.
type cycField struct {
	m, deg int
	phi    []*big.Rat   // Φ_m, monic, coefficients from x^0 to x^deg
	pow    [][]*big.Rat // x^a mod Φ_m for 0 ≤ a < m
	cos    []interval.I // enclosures of cos(2πj/m), 0 ≤ j < deg
}

// cyc is an element of a cycField: Σ c[j] ζ^j, len(c) = deg.
type cyc struct {
	f *cycField
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
func newCycField(m int) (*cycField, bool) {
	if m < 1 || m > maxCyclotomicOrder {
		return nil, false
	}
	pi := cyclotomicPoly(m, map[int][]*big.Int{})
	deg := len(pi) - 1
	if deg > maxCyclotomicDegree {
		return nil, false
	}
	f := &cycField{m: m, deg: deg}
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

func (f *cycField) zeroVec() []*big.Rat {
	v := make([]*big.Rat, f.deg)
	for i := range v {
		v[i] = new(big.Rat)
	}
	return v
}

// element returns the element of f equal to the root sum a; every
// exponent q of a must satisfy qm/2 ∈ Z.
func (f *cycField) element(a rootSum) cyc {
	v := f.zeroVec()
	for _, t := range a {
		e := new(big.Rat).Mul(t.q, big.NewRat(int64(f.m), 2))
		if !e.IsInt() {
			panic("hypothesis: root of unity outside the field")
		}
		p := f.pow[e.Num().Int64()]
		for j := range v {
			v[j].Add(v[j], new(big.Rat).Mul(t.c, p[j]))
		}
	}
	return cyc{f: f, c: v}
}

func (a cyc) combine(b cyc, sign int) cyc {
	v := a.f.zeroVec()
	for j := range v {
		if sign > 0 {
			v[j].Add(a.c[j], b.c[j])
		} else {
			v[j].Sub(a.c[j], b.c[j])
		}
	}
	return cyc{f: a.f, c: v}
}

func (a cyc) add(b cyc) cyc { return a.combine(b, 1) }
func (a cyc) sub(b cyc) cyc { return a.combine(b, -1) }
func (a cyc) neg() cyc      { return a.scale(big.NewRat(-1, 1)) }

func (a cyc) scale(s *big.Rat) cyc {
	v := a.f.zeroVec()
	for j := range v {
		v[j].Mul(a.c[j], s)
	}
	return cyc{f: a.f, c: v}
}

func (a cyc) mul(b cyc) cyc {
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
	return cyc{f: a.f, c: r[:d]}
}

func (a cyc) isZero() bool {
	for _, x := range a.c {
		if x.Sign() != 0 {
			return false
		}
	}
	return true
}

func (a cyc) rat() (*big.Rat, bool) {
	for _, x := range a.c[1:] {
		if x.Sign() != 0 {
			return nil, false
		}
	}
	return new(big.Rat).Set(a.c[0]), true
}

// ratioSquare returns a rational w > 0 with a = w²·b and true, if there
// is one (b ≠ 0).
func (a cyc) ratioSquare(b cyc) (*big.Rat, bool) {
	for j, y := range b.c {
		if y.Sign() == 0 {
			continue
		}
		c := new(big.Rat).Quo(a.c[j], y)
		if c.Sign() <= 0 || !a.sub(b.scale(c)).isZero() {
			return nil, false
		}
		return ratSqrt(c)
	}
	return nil, false
}

// sqrtRat returns √x when x is the square of a rational.
func (a cyc) sqrtRat(x *big.Rat) (cyc, bool) {
	s, ok := ratSqrt(x)
	if !ok {
		return cyc{}, false
	}
	v := a.f.zeroVec()
	v[0].Set(s)
	return cyc{f: a.f, c: v}, true
}

// enclose encloses the value of a real element: Σ c_j cos(2πj/m).
func (a cyc) enclose() interval.I {
	var v interval.I
	for j, x := range a.c {
		if x.Sign() != 0 {
			v = v.Add(decimalio.FromRat(x).Mul(a.f.cos[j]))
		}
	}
	return v
}

// cycVertices reads every coordinate as a root sum (readConst with
// rootAlgebra) and returns the vertices in the smallest cyclotomic field
// holding them all; ok is false if some coordinate is not read or the
// field's degree exceeds maxCyclotomicDegree.
func cycVertices(vs [][2]problem.Number) (v [][2]cyc, ok bool) {
	sums := make([][2]rootSum, len(vs))
	m := big.NewInt(1)
	for i, p := range vs {
		for k := range 2 {
			var s rootSum
			if p[k].Rat != nil {
				s = rootAlgebra{}.fromRat(p[k].Rat)
			} else if s, ok = readConst[rootSum](rootAlgebra{}, p[k].Text, p[k].Val); !ok {
				return nil, false
			}
			order := rootOrder(s)
			m.Div(new(big.Int).Mul(m, order), new(big.Int).GCD(nil, nil, m, order))
			sums[i][k] = s
		}
	}
	if !m.IsInt64() || m.Int64() > maxCyclotomicOrder {
		return nil, false
	}
	f, ok := newCycField(int(m.Int64()))
	if !ok {
		return nil, false
	}
	v = make([][2]cyc, len(vs))
	for i := range sums {
		for k := range 2 {
			v[i][k] = f.element(sums[i][k])
		}
	}
	return v, true
}
