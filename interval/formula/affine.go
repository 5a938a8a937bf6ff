package formula

import (
	"errors"

	"gapcert/interval"
)

// Evaluation over a triangle itself (not its bounding box) by affine
// forms in the barycentric-type coordinates of the triangle. Points of the
// triangle T with vertices v0, v1, v2 are p = v0 + ξ(v1 − v0) + η(v2 − v0)
// with (ξ, η) in the reference triangle K = {ξ, η ≥ 0, ξ + η ≤ 1}. An
// affine form {c0, c1, c2, r} of a sub-expression g states: for every
// (ξ, η) ∈ K there are γ_i ∈ c_i and ρ ∈ r with g(p) = γ0 + γ1ξ + γ2η + ρ.
// Since ξ, η ≥ 0 and ξ + η ≤ 1, γ1ξ + γ2η is a convex combination of 0,
// γ1, γ2, so g(T) ⊆ c0 + hull(0, c1, c2) + r. The coordinates x and y
// are exact affine forms (r = 0), so an argument such as 1 − x − y is
// enclosed over T by its values at the vertices, which lets RangeTriangle
// evaluate sqrt(1 − x − y) on a triangle with an edge on x + y = 1.
//
// Each node also carries its natural interval enclosure (from the boxes of
// its operands); the two enclosures are intersected, and domains are
// checked on the intersection. A smooth function f of a form A = a0 + D,
// D = γ1ξ + γ2η + ρ, is linearised by the mean value theorem,
// f(α0 + D) = f(α0) + f′(ζ)·D with ζ between α0 and α0 + D, i.e. in
// X = hull(a0, range of A): the form {f(a0), F·a1, F·a2, F·r} with
// F ⊇ f′(X) (the coefficients may depend on the point, which the
// definition allows). Where f or f′ is not defined on X the form is the
// constant f(range of A).
//
// References:
//
//	L. H. de Figueiredo and J. Stolfi, Affine arithmetic: concepts and
//	applications, Numer. Algorithms 37 (2004) 147–158 (affine forms; here
//	with the two triangle coordinates as noise symbols and an interval
//	remainder).

type aff struct {
	c0, c1, c2, r interval.I
}

// rng returns c0 + hull(0, c1, c2) + r, an enclosure over K.
func (a aff) rng() interval.I { return a.c0.Add(a.lin()).Add(a.r) }

// lin returns the enclosure hull(0, c1, c2) of the linear part on K.
func (a aff) lin() interval.I { return interval.Point(0).Hull(a.c1).Hull(a.c2) }

func constAff(c interval.I) aff { return aff{c0: c} }

func affMul(a, b aff) aff {
	la, lb := a.lin(), b.lin()
	return aff{
		c0: a.c0.Mul(b.c0),
		c1: a.c0.Mul(b.c1).Add(b.c0.Mul(a.c1)),
		c2: a.c0.Mul(b.c2).Add(b.c0.Mul(a.c2)),
		r: la.Mul(lb).Add(la.Mul(b.r)).Add(lb.Mul(a.r)).Add(a.r.Mul(b.r)).
			Add(a.c0.Mul(b.r)).Add(b.c0.Mul(a.r)),
	}
}

// affSqr is affMul(a, a) using that both factors are the same number:
// (L + ρ)² = L² + 2Lρ + ρ².
func affSqr(a aff) aff {
	l := a.lin()
	return aff{
		c0: a.c0.Sqr(),
		c1: a.c0.Mul(a.c1).MulF(2),
		c2: a.c0.Mul(a.c2).MulF(2),
		r:  l.Sqr().Add(l.Mul(a.r).MulF(2)).Add(a.r.Sqr()).Add(a.c0.Mul(a.r).MulF(2)),
	}
}

func affPowInt(a aff, n int) aff {
	r := constAff(interval.Point(1))
	first := true
	for b := a; n > 0; n >>= 1 {
		if n&1 == 1 {
			if first {
				r, first = b, false
			} else {
				r = affMul(r, b)
			}
		}
		if n > 1 {
			b = affSqr(b)
		}
	}
	return r
}

// affLinearise returns the mean value form of f at a (see above) given
// f(a.c0) and F ⊇ f′(hull(a.c0, range)).
func affLinearise(a aff, f0, fp interval.I) aff {
	return aff{c0: f0, c1: fp.Mul(a.c1), c2: fp.Mul(a.c2), r: fp.Mul(a.r)}
}

type affEval struct {
	x, y aff
}

var errEmpty = errors.New("formula: internal error: disjoint enclosures over a triangle")

// affineRange returns an enclosure of e over the triangle v by affine
// forms (see above).
func affineRange(n *node, v [3][2]interval.I) (interval.I, error) {
	c := &affEval{
		x: aff{c0: v[0][0], c1: v[1][0].Sub(v[0][0]), c2: v[2][0].Sub(v[0][0])},
		y: aff{c0: v[0][1], c1: v[1][1].Sub(v[0][1]), c2: v[2][1].Sub(v[0][1])},
	}
	_, box, err := c.eval(n)
	return box, err
}

// eval returns the affine form of n and its enclosure over the triangle.
func (c *affEval) eval(n *node) (aff, interval.I, error) {
	if n.isC {
		return constAff(n.val), n.val, n.cerr
	}
	var a, b aff
	var boxA, boxB interval.I
	var err error
	switch n.kind {
	case kVar:
		switch n.name {
		case "x":
			a = c.x
		case "y":
			a = c.y
		default:
			return aff{}, interval.I{}, &UnboundError{Name: n.name}
		}
		return a, a.rng(), nil
	}
	if a, boxA, err = c.eval(n.a); err != nil {
		return aff{}, interval.I{}, err
	}
	if n.b != nil {
		if b, boxB, err = c.eval(n.b); err != nil {
			return aff{}, interval.I{}, err
		}
	}
	var f aff
	var box interval.I
	switch n.kind {
	case kNeg:
		f, box = aff{a.c0.Neg(), a.c1.Neg(), a.c2.Neg(), a.r.Neg()}, boxA.Neg()
	case kAdd:
		f, box = aff{a.c0.Add(b.c0), a.c1.Add(b.c1), a.c2.Add(b.c2), a.r.Add(b.r)}, boxA.Add(boxB)
	case kSub:
		f, box = aff{a.c0.Sub(b.c0), a.c1.Sub(b.c1), a.c2.Sub(b.c2), a.r.Sub(b.r)}, boxA.Sub(boxB)
	case kMul:
		f, box = affMul(a, b), boxA.Mul(boxB)
	case kDiv:
		if boxB.ContainsZero() {
			return aff{}, interval.I{}, domainErr(n, "/", boxB)
		}
		box = boxA.Div(boxB)
		f = constAff(box)
		if x := b.c0.Hull(boxB); !x.ContainsZero() {
			// 1/B linearised with (1/t)′ = −1/t², then A · (1/B).
			inv := affLinearise(b, interval.Point(1).Div(b.c0), x.Sqr().Recip().Neg())
			f = affMul(a, inv)
		}
	case kPow:
		if n.intExp >= 0 {
			f, box = affPowInt(a, n.intExp), boxA.PowInt(n.intExp)
			break
		}
		if box, err = apply(n, boxA, boxB); err != nil {
			return aff{}, interval.I{}, err
		}
		f = constAff(box)
		if n.b.isC && n.b.cerr == nil {
			cexp := n.b.val
			if x := a.c0.Hull(boxA); x.Lo > 0 {
				f0, err1 := interval.Pow(a.c0, cexp)
				d, err2 := interval.Pow(x, cexp.Sub(interval.Point(1)))
				if err1 == nil && err2 == nil {
					f = affLinearise(a, f0, d.Mul(cexp))
				}
			}
		}
	case kCall:
		if box, err = apply(n, boxA, boxB); err != nil {
			return aff{}, interval.I{}, err
		}
		f = c.linearCall(n, a, b, boxA, boxB, box)
	}
	out, ok := box.Intersection(f.rng())
	if !ok {
		return aff{}, interval.I{}, errEmpty
	}
	return f, out, nil
}

// linearCall returns the mean value form of a one-argument function, the
// branch of a decided abs/min/max, or the constant form box.
func (c *affEval) linearCall(n *node, a, b aff, boxA, boxB, box interval.I) aff {
	x := a.c0.Hull(boxA)
	one := interval.Point(1)
	var f0, fp interval.I
	switch n.fn {
	case fExp:
		f0, fp = interval.Exp(a.c0), interval.Exp(x)
	case fLog:
		if x.Lo <= 0 {
			return constAff(box)
		}
		f0, _ = interval.Log(a.c0)
		fp = x.Recip()
	case fSin:
		f0, fp = interval.Sin(a.c0), interval.Cos(x)
	case fCos:
		f0, fp = interval.Cos(a.c0), interval.Sin(x).Neg()
	case fTan:
		t, err := interval.Tan(x)
		t0, err0 := interval.Tan(a.c0)
		if err != nil || err0 != nil {
			return constAff(box)
		}
		f0, fp = t0, one.Add(t.Sqr())
	case fAtan:
		f0, fp = interval.Atan(a.c0), x.Sqr().AddF(1).Recip()
	case fSinh:
		f0, fp = interval.Sinh(a.c0), interval.Cosh(x)
	case fCosh:
		f0, fp = interval.Cosh(a.c0), interval.Sinh(x)
	case fTanh:
		f0, fp = interval.Tanh(a.c0), one.Sub(interval.Tanh(x).Sqr())
	case fSqrt:
		if x.Lo <= 0 {
			return constAff(box)
		}
		f0, _ = a.c0.Sqrt()
		s, _ := x.Sqrt()
		fp = s.MulF(2).Recip()
	case fAbs:
		// boxA encloses the argument at every point of T, so a sign on
		// boxA, zero included, makes |u| = ±u on all of T.
		switch {
		case boxA.Lo >= 0:
			return a
		case boxA.Hi <= 0:
			return aff{a.c0.Neg(), a.c1.Neg(), a.c2.Neg(), a.r.Neg()}
		}
		return constAff(box)
	case fMin, fMax:
		// The difference of the arguments over T: its affine form
		// (correlations kept) intersected with the difference of the boxes.
		diff := aff{a.c0.Sub(b.c0), a.c1.Sub(b.c1), a.c2.Sub(b.c2), a.r.Sub(b.r)}
		d := boxA.Sub(boxB)
		if s, ok := d.Intersection(diff.rng()); ok {
			d = s
		}
		switch {
		case d.Hi <= 0 && n.fn == fMin, d.Lo >= 0 && n.fn == fMax:
			return a
		case d.Hi <= 0 || d.Lo >= 0:
			return b
		}
		return constAff(box)
	}
	return affLinearise(a, f0, fp)
}
