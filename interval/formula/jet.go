package formula

import (
	"fmt"
	"sync"

	"gapcert/interval"
)

// Truncated Taylor series ("jets") in nv variables up to total degree q
// with interval coefficients. A jet h stores the coefficients of the
// monomials t^α, |α| ≤ q, grouped by degree: the homogeneous part h_k of
// degree k occupies h[off[k]:off[k+1]].
//
// The series of the elementary functions follow from the Euler operator
// E = Σ t_i ∂/∂t_i, which multiplies a homogeneous part of degree k by k
// and obeys the product and chain rules. For h = exp(u), E h = h·E u gives
//
//	k h_k = Σ_{j=1..k} j u_j h_{k−j},
//
// the same recurrence as in one variable with the scalar coefficients
// replaced by homogeneous polynomials (products of parts of degree j and
// k − j have degree k). In the same way (u_0, h_0 the constant terms):
//
//	h = u/v:      v_0 h_k = u_k − Σ_{j=1..k} v_j h_{k−j}
//	h = log u:    k u_0 h_k = k u_k − Σ_{j=1..k−1} j h_j u_{k−j}
//	h = √u:       2 h_0 h_k = u_k − Σ_{j=1..k−1} h_j h_{k−j}
//	s, c = sin u, cos u:  k s_k = Σ j u_j c_{k−j},  k c_k = −Σ j u_j s_{k−j}
//	s, c = sinh u, cosh u: the same with + in both
//	h = tan u:    k h_k = Σ j u_j w_{k−j},  w = 1 + h²;  tanh: w = 1 − h²
//	h = atan u:   k w_0 h_k = k u_k − Σ_{j=1..k−1} j h_j w_{k−j},  w = 1 + u²
//	h = u^c:      k u_0 h_k = Σ_{j=1..k} (c j − (k − j)) u_j h_{k−j}   (u_0 > 0)
//
// Every coefficient is computed in outward rounded interval arithmetic
// from enclosures of the previous ones and the constant terms are enclosed
// by the interval elementary functions, so by induction on k each computed
// coefficient contains the exact Taylor coefficient for every point of the
// input boxes. A jet is only formed where the function is analytic on the
// whole box of its argument's constant term (log, √ and non-integer powers
// need u_0 > 0, division v_0 ∌ 0, tan no pole, abs/min/max a decided
// branch), which is checked before the recurrence is used.
//
// References:
//
//	A. Griewank and A. Walther, Evaluating Derivatives, 2nd ed., SIAM,
//	2008, §13.2 (Taylor arithmetic for the elementary functions).
//	R. E. Moore, R. B. Kearfott and M. J. Cloud, Introduction to Interval
//	Analysis, SIAM, 2009, §9.2 (recursive Taylor coefficients in interval
//	arithmetic).

// layout describes the monomials of nv variables up to total degree q.
type layout struct {
	nv, q int
	m     int     // number of monomials
	off   []int   // degree-k monomials have indices off[k] ≤ i < off[k+1]
	exps  [][]int // exponent vector of each monomial
	mul   []int32 // index of the product of monomials a and b (m×m), −1 beyond degree q
	index map[string]int
}

var layouts sync.Map // [2]int{nv, q} → *layout

func key(e []int) string { return fmt.Sprint(e) }

func getLayout(nv, q int) *layout {
	k := [2]int{nv, q}
	if l, ok := layouts.Load(k); ok {
		return l.(*layout)
	}
	l := &layout{nv: nv, q: q, off: make([]int, q+2), index: map[string]int{}}
	var gen func(prefix []int, left, deg int)
	gen = func(prefix []int, left, deg int) {
		if left == 1 {
			e := append(append([]int(nil), prefix...), deg)
			l.index[key(e)] = len(l.exps)
			l.exps = append(l.exps, e)
			return
		}
		for d := deg; d >= 0; d-- {
			gen(append(prefix, d), left-1, deg-d)
		}
	}
	for d := 0; d <= q; d++ {
		l.off[d] = len(l.exps)
		gen(nil, nv, d)
	}
	l.m = len(l.exps)
	l.off[q+1] = l.m
	l.mul = make([]int32, l.m*l.m)
	s := make([]int, nv)
	for a, ea := range l.exps {
		for b, eb := range l.exps {
			deg := 0
			for i := range s {
				s[i] = ea[i] + eb[i]
				deg += s[i]
			}
			if deg > q {
				l.mul[a*l.m+b] = -1
			} else {
				l.mul[a*l.m+b] = int32(l.index[key(s)])
			}
		}
	}
	v, _ := layouts.LoadOrStore(k, l)
	return v.(*layout)
}

// jetEval evaluates expression trees in jets of one layout.
type jetEval struct {
	l    *layout
	vars map[string][]interval.I
	w    []interval.I // weights, length q+1

	// closed lets abs, min and max take a branch whose argument (or
	// argument difference) is ≥ 0 or ≤ 0 on the box, zero included: on
	// such a box the function equals the smooth branch (|u| = −u where
	// u ≤ 0), so the jets are those of a smooth function that agrees with
	// f at every point of the box. That is what a Taylor model of values on
	// one box needs, but not a derivative (|u| has none where u = 0), so
	// only the one-box remainder jets of Model1 and Model2 set it; the
	// centre jets keep the strict rule, which makes their branch agree with
	// the box's (a strict sign at a point of the box excludes the other
	// closed sign).
	closed bool

	// derivatives marks jets of Gradient and Hessian, whose integer powers
	// are taken by the chain rule (powChain) so that even powers keep
	// their sign.
	derivatives bool

	// forced holds branches of abs, min and max nodes decided on the
	// whole triangle of a Model2 (kinkBranches): on the triangle f equals
	// the function with these branches, which is smooth wherever its
	// arguments are, so every jet of that function (at the centre, over the
	// bounding box or sub-boxes) serves the model of f on the triangle.
	forced map[*node]int
}

func newJetEval(l *layout, vars map[string][]interval.I) *jetEval {
	return &jetEval{l: l, vars: vars, w: make([]interval.I, l.q+1)}
}

// branch decides the sign of the argument d of abs (or of the difference
// of the arguments of min, max) on the box: 1 or −1 when it is decided,
// 0 when not. The strict rule needs d > 0 or d < 0 on the box; the closed
// rule (c.closed) also takes d ≥ 0 and d ≤ 0.
func (c *jetEval) branch(d interval.I) int {
	if s := d.Sign(); s != 0 || !c.closed {
		return s
	}
	switch {
	case d.Lo >= 0:
		return 1
	case d.Hi <= 0:
		return -1
	}
	return 0
}

func (c *jetEval) zero() []interval.I { return make([]interval.I, c.l.m) }

func (c *jetEval) constant(v interval.I) []interval.I {
	h := c.zero()
	h[0] = v
	return h
}

// acc adds Σ_{j=jlo..jhi} w_j · (p_j ⊗ q_{k−j}) to the degree-k part of
// dst (weights c.w if weighted, else 1). dst may be p or q only if the
// parts read are of degree < k.
func (c *jetEval) acc(dst, p, q []interval.I, k, jlo, jhi int, weighted bool) {
	l := c.l
	for j := jlo; j <= jhi; j++ {
		for a := l.off[j]; a < l.off[j+1]; a++ {
			pa := p[a]
			if pa.Lo == 0 && pa.Hi == 0 {
				continue
			}
			if weighted {
				pa = pa.Mul(c.w[j])
			}
			row := l.mul[a*l.m:]
			for b := l.off[k-j]; b < l.off[k-j+1]; b++ {
				i := row[b]
				dst[i] = dst[i].Add(pa.Mul(q[b]))
			}
		}
	}
}

// setWeights sets c.w[j] = j.
func (c *jetEval) setWeights() {
	for j := range c.w {
		c.w[j] = interval.Point(float64(j))
	}
}

func (c *jetEval) block(h []interval.I, k int) []interval.I { return h[c.l.off[k]:c.l.off[k+1]] }

func (c *jetEval) mul(u, v []interval.I) []interval.I {
	h := c.zero()
	for k := 0; k <= c.l.q; k++ {
		c.acc(h, u, v, k, 0, k, false)
	}
	return h
}

// powChain returns the jet of u^n, n ≥ 0, for jets of order ≤ 2 by the
// chain rule (Faà di Bruno at order two; common practice calculus): with
// f(s) = s^n and u = u₀ + Σ u_i t_i + Σ u_ij t_i t_j + …,
//
//	f(u) = f(u₀) + f′(u₀)(Σ u_i t_i + Σ u_ij t_i t_j) + ½f″(u₀)(Σ u_i t_i)² + O(t³),
//
// f′(u₀) = n·u₀^(n−1) and ½f″(u₀) = n(n−1)/2·u₀^(n−2) enclosed by
// interval.PowInt (even powers never negative), the square's diagonal
// coefficients u_i² by interval Sqr and its others by 2·u_i·u_j. Repeated
// multiplication (powInt) encloses the same coefficients, but through
// products like x·x on a box around 0 that lose the sign: on [−1, 1] it
// gives ∂²x⁴/∂x² ∈ [−12, 12], this [0, 12]. Used for Gradient and Hessian,
// whose signs decide convexity; models of values keep powInt.
func (c *jetEval) powChain(u []interval.I, n int) []interval.I {
	l := c.l
	h := c.zero()
	u0 := u[0]
	h[0] = u0.PowInt(n)
	if n == 0 || l.q == 0 {
		return h
	}
	d1 := u0.PowInt(n - 1).MulF(float64(n))
	for a := l.off[1]; a < l.off[l.q+1]; a++ {
		h[a] = d1.Mul(u[a])
	}
	if l.q < 2 || n < 2 {
		return h
	}
	d2 := u0.PowInt(n - 2).Mul(interval.Point(float64(n)).MulF(float64(n - 1)).MulF(0.5))
	for a := l.off[1]; a < l.off[2]; a++ {
		row := l.mul[a*l.m:]
		for b := a; b < l.off[2]; b++ {
			sq := u[a].Sqr()
			if b != a {
				sq = u[a].Mul(u[b]).MulF(2)
			}
			h[row[b]] = h[row[b]].Add(d2.Mul(sq))
		}
	}
	return h
}

func (c *jetEval) powInt(u []interval.I, n int) []interval.I {
	r := c.constant(interval.Point(1))
	b := u
	first := true
	for n > 0 {
		if n&1 == 1 {
			if first {
				r, first = b, false
			} else {
				r = c.mul(r, b)
			}
		}
		n >>= 1
		if n > 0 {
			b = c.mul(b, b)
		}
	}
	return r
}

func (c *jetEval) div(n *node, u, v []interval.I) ([]interval.I, error) {
	if v[0].ContainsZero() {
		return nil, domainErr(n, "/", v[0])
	}
	h := c.zero()
	h[0] = u[0].Div(v[0])
	for k := 1; k <= c.l.q; k++ {
		c.acc(h, v, h, k, 1, k, false)
		bu, bh := c.block(u, k), c.block(h, k)
		for i := range bh {
			bh[i] = bu[i].Sub(bh[i]).Div(v[0])
		}
	}
	return h, nil
}

// scaleBlock divides the degree-k part of h by s.
func (c *jetEval) scaleBlock(h []interval.I, k int, s interval.I) {
	b := c.block(h, k)
	for i := range b {
		b[i] = b[i].Div(s)
	}
}

func (c *jetEval) negBlock(h []interval.I, k int) {
	b := c.block(h, k)
	for i := range b {
		b[i] = b[i].Neg()
	}
}

// eval returns the jet of the subtree n.
func (c *jetEval) eval(n *node) ([]interval.I, error) {
	if n.isC {
		if n.cerr != nil {
			return nil, n.cerr
		}
		return c.constant(n.val), nil
	}
	switch n.kind {
	case kVar:
		v, ok := c.vars[n.name]
		if !ok {
			return nil, &UnboundError{Name: n.name}
		}
		return v, nil
	case kPow:
		return c.pow(n)
	}
	u, err := c.eval(n.a)
	if err != nil {
		return nil, err
	}
	var v []interval.I
	if n.b != nil {
		if v, err = c.eval(n.b); err != nil {
			return nil, err
		}
	}
	q := c.l.q
	switch n.kind {
	case kNeg:
		h := c.zero()
		for i := range h {
			h[i] = u[i].Neg()
		}
		return h, nil
	case kAdd, kSub:
		h := c.zero()
		for i := range h {
			if n.kind == kAdd {
				h[i] = u[i].Add(v[i])
			} else {
				h[i] = u[i].Sub(v[i])
			}
		}
		return h, nil
	case kMul:
		return c.mul(u, v), nil
	case kDiv:
		return c.div(n, u, v)
	}
	u0 := u[0]
	h := c.zero()
	c.setWeights()
	switch n.fn {
	case fExp:
		h[0] = interval.Exp(u0)
		for k := 1; k <= q; k++ {
			c.acc(h, u, h, k, 1, k, true)
			c.scaleBlock(h, k, interval.Point(float64(k)))
		}
	case fLog:
		if h[0], err = interval.Log(u0); err != nil {
			return nil, subErr(n, err)
		}
		for k := 1; k <= q; k++ {
			c.acc(h, h, u, k, 1, k-1, true)
			fk := interval.Point(float64(k))
			bu, bh := c.block(u, k), c.block(h, k)
			for i := range bh {
				bh[i] = bu[i].Mul(fk).Sub(bh[i]).Div(u0.Mul(fk))
			}
		}
	case fSqrt:
		if u0.Lo <= 0 {
			if u0.Lo < 0 {
				return nil, domainErr(n, "sqrt", u0)
			}
			return nil, subErr(n, &SmoothnessError{Func: "sqrt", Arg: u0})
		}
		h[0], _ = u0.Sqrt()
		two := h[0].MulF(2)
		for k := 1; k <= q; k++ {
			c.acc(h, h, h, k, 1, k-1, false)
			bu, bh := c.block(u, k), c.block(h, k)
			for i := range bh {
				bh[i] = bu[i].Sub(bh[i]).Div(two)
			}
		}
	case fSin, fCos, fSinh, fCosh:
		s, co := h, c.zero()
		hyper := n.fn == fSinh || n.fn == fCosh
		if hyper {
			s[0], co[0] = interval.Sinh(u0), interval.Cosh(u0)
		} else {
			s[0], co[0] = interval.Sin(u0), interval.Cos(u0)
		}
		for k := 1; k <= q; k++ {
			fk := interval.Point(float64(k))
			c.acc(s, u, co, k, 1, k, true)
			c.scaleBlock(s, k, fk)
			c.acc(co, u, s, k, 1, k, true)
			c.scaleBlock(co, k, fk)
			if !hyper {
				c.negBlock(co, k)
			}
		}
		if n.fn == fCos || n.fn == fCosh {
			return co, nil
		}
		return s, nil
	case fTan, fTanh:
		if n.fn == fTan {
			if h[0], err = interval.Tan(u0); err != nil {
				return nil, subErr(n, err)
			}
		} else {
			h[0] = interval.Tanh(u0)
		}
		one := interval.Point(1)
		w := c.zero()
		if n.fn == fTan {
			w[0] = one.Add(h[0].Sqr())
		} else {
			w[0] = one.Sub(h[0].Sqr())
		}
		for k := 1; k <= q; k++ {
			c.acc(h, u, w, k, 1, k, true)
			c.scaleBlock(h, k, interval.Point(float64(k)))
			c.acc(w, h, h, k, 0, k, false)
			if n.fn == fTanh {
				c.negBlock(w, k)
			}
		}
	case fAtan:
		h[0] = interval.Atan(u0)
		w := c.mul(u, u)
		w[0] = u0.Sqr().AddF(1)
		for k := 1; k <= q; k++ {
			c.acc(h, h, w, k, 1, k-1, true)
			fk := interval.Point(float64(k))
			bu, bh := c.block(u, k), c.block(h, k)
			for i := range bh {
				bh[i] = bu[i].Mul(fk).Sub(bh[i]).Div(w[0].Mul(fk))
			}
		}
	case fAbs:
		b, ok := c.forced[n]
		if !ok {
			b = c.branch(u0)
		}
		switch b {
		case 1:
			return u, nil
		case -1:
			for i := range h {
				h[i] = u[i].Neg()
			}
			return h, nil
		}
		return nil, subErr(n, &SmoothnessError{Func: "abs", Arg: u0})
	case fMin, fMax:
		d := u0.Sub(v[0])
		b, ok := c.forced[n]
		if !ok {
			b = c.branch(d)
		}
		if b == 0 {
			return nil, subErr(n, &SmoothnessError{Func: fnNames[n.fn], Arg: d})
		}
		if (b < 0) == (n.fn == fMin) {
			return u, nil
		}
		return v, nil
	}
	return h, nil
}

// pow returns the jet of a^b: an exact non-negative integer exponent by
// repeated multiplication (any base), a negative integer constant as the
// reciprocal of a positive power, another constant exponent c by the
// recurrence for u^c (base > 0), a variable exponent as exp(b·log a).
func (c *jetEval) pow(n *node) ([]interval.I, error) {
	u, err := c.eval(n.a)
	if err != nil {
		return nil, err
	}
	if n.intExp >= 0 {
		if c.derivatives && c.l.q <= 2 {
			return c.powChain(u, n.intExp), nil
		}
		return c.powInt(u, n.intExp), nil
	}
	if r := n.b.rat; r != nil && r.IsInt() && r.Sign() < 0 && r.Num().CmpAbs(bigMaxIntPow) <= 0 {
		p := c.powInt(u, int(-r.Num().Int64()))
		return c.div(n, c.constant(interval.Point(1)), p)
	}
	u0 := u[0]
	if u0.Lo <= 0 {
		return nil, domainErr(n, "pow", u0)
	}
	if n.b.isC {
		if n.b.cerr != nil {
			return nil, n.b.cerr
		}
		e := n.b.val
		h := c.zero()
		if h[0], err = interval.Pow(u0, e); err != nil {
			return nil, subErr(n, err)
		}
		for k := 1; k <= c.l.q; k++ {
			fk := interval.Point(float64(k))
			for j := 1; j <= k; j++ {
				c.w[j] = e.MulF(float64(j)).Sub(interval.Point(float64(k - j)))
			}
			c.acc(h, u, h, k, 1, k, true)
			c.scaleBlock(h, k, u0.Mul(fk))
		}
		return h, nil
	}
	// a^b = exp(b · log a) with a > 0 on the box.
	lg := &node{kind: kCall, fn: fLog, a: n.a}
	ex := &node{kind: kCall, fn: fExp, a: &node{kind: kMul, a: n.b, b: lg}}
	return c.eval(ex)
}
