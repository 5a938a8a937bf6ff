package formula

import (
	"errors"

	"gapcert/interval"
)

// Eval returns an enclosure of {f(p) : p ∈ env}: every free variable of e
// is replaced by its interval in env and the tree is evaluated in outward
// rounded interval arithmetic, so the result contains the exact value of e
// at every point of the box (the containment guarantee of package
// interval, applied operation by operation). Rational constant
// sub-expressions such as 1/3 are folded exactly and enclosed once.
//
// Nothing is clipped: if a sub-expression is not defined on all of its
// argument box (log or sqrt of a box reaching ≤ 0 resp. < 0, division by a
// box containing 0, tan across a pole, a non-integer power of a box
// reaching ≤ 0) Eval returns an *EvalError naming that sub-expression and
// wrapping the *interval.DomainError. A variable missing from env gives an
// *UnboundError.
func (e *Expr) Eval(env map[string]interval.I) (interval.I, error) {
	return eval(e.root, env)
}

// EvalConst returns an enclosure of the value of e, which must have no free
// variables (else *UnboundError); domain errors as for Eval.
func (e *Expr) EvalConst() (interval.I, error) {
	return eval(e.root, nil)
}

func eval(n *node, env map[string]interval.I) (interval.I, error) {
	if n.isC {
		return n.val, n.cerr
	}
	return evalNode(n, env)
}

func domainErr(n *node, f string, arg interval.I) error {
	return &EvalError{Sub: n.String(), Err: &interval.DomainError{Func: f, Arg: arg}}
}

// subErr wraps an error of an interval function with the sub-expression.
func subErr(n *node, err error) error { return &EvalError{Sub: n.String(), Err: err} }

// evalNode evaluates the operation at n from the values of its children.
func evalNode(n *node, env map[string]interval.I) (interval.I, error) {
	switch n.kind {
	case kVar:
		v, ok := env[n.name]
		if !ok {
			return interval.I{}, &UnboundError{Name: n.name}
		}
		return v, nil
	case kNum, kConst, kInterval:
		return n.val, n.cerr
	}
	a, err := eval(n.a, env)
	if err != nil {
		return interval.I{}, err
	}
	var b interval.I
	if n.b != nil {
		if b, err = eval(n.b, env); err != nil {
			return interval.I{}, err
		}
	}
	return apply(n, a, b)
}

// apply returns the enclosure of the operation of n (not a leaf) on the
// operand enclosures a and b.
func apply(n *node, a, b interval.I) (interval.I, error) {
	var err error
	switch n.kind {
	case kNeg:
		return a.Neg(), nil
	case kAdd:
		return a.Add(b), nil
	case kSub:
		return a.Sub(b), nil
	case kMul:
		return a.Mul(b), nil
	case kDiv:
		if b.ContainsZero() {
			return interval.I{}, domainErr(n, "/", b)
		}
		return a.Div(b), nil
	case kPow:
		if n.intExp >= 0 {
			return a.PowInt(n.intExp), nil
		}
		r, err := interval.Pow(a, b)
		if err != nil {
			return interval.I{}, subErr(n, err)
		}
		return r, nil
	}
	var r interval.I
	switch n.fn {
	case fExp:
		return interval.Exp(a), nil
	case fLog:
		r, err = interval.Log(a)
	case fSin:
		return interval.Sin(a), nil
	case fCos:
		return interval.Cos(a), nil
	case fTan:
		r, err = interval.Tan(a)
	case fAtan:
		return interval.Atan(a), nil
	case fSinh:
		return interval.Sinh(a), nil
	case fCosh:
		return interval.Cosh(a), nil
	case fTanh:
		return interval.Tanh(a), nil
	case fSqrt:
		r, err = interval.SqrtE(a)
	case fAbs:
		return a.Abs(), nil
	case fMin:
		return a.Min(b), nil
	case fMax:
		return a.Max(b), nil
	}
	if err != nil {
		return interval.I{}, subErr(n, err)
	}
	return r, nil
}

// isDomain reports whether err comes from a function not defined (or not
// smooth) on all of a box, i.e. whether a smaller box might succeed.
func isDomain(err error) bool {
	var d *interval.DomainError
	var s *SmoothnessError
	return errors.As(err, &d) || errors.As(err, &s)
}

// maxDepth is the number of midpoint subdivisions RangeTriangle and Model2
// try (up to 4⁸ sub-triangles where the formula keeps failing).
const maxDepth = 8

// RangeTriangle returns an enclosure of {f(x, y) : (x, y) ∈ T} for the
// closed triangle T whose vertices are the exact points v[k] (each given
// by an enclosure; the result holds for every choice of exact vertices in
// them). It evaluates e over T by affine forms in the triangle's own
// coordinates, intersected node by node with the interval evaluation over
// the bounding box (see affine.go), so domains are checked on enclosures
// of the sub-expressions over T: sqrt(1-x-y) works on a triangle with an
// edge on x + y = 1. If that fails with a domain error it splits the
// triangle at its edge midpoints into four and recurses (depth ≤ 8),
// returning the hull. The four sub-triangles cover T and their vertices
// are enclosures of the exact midpoints, so the hull encloses the range
// over T. Only T and its sub-triangles are evaluated, so e may be
// undefined outside T; it still fails where e is undefined (or a domain is
// not decided) right at T, e.g. log(x) on a triangle touching x = 0, or
// where a nonlinear argument touches the domain's edge at T (sqrt(1-x^2-y^2)
// on a triangle with a vertex on the unit circle): then the error is
// returned. Free variables other than x and y must have been bound (else
// *UnboundError).
func (e *Expr) RangeTriangle(v [3][2]interval.I) (interval.I, error) {
	return rangeTriangle(e.root, v, maxDepth)
}

func bbox(v [3][2]interval.I) map[string]interval.I {
	return map[string]interval.I{
		"x": v[0][0].Hull(v[1][0]).Hull(v[2][0]),
		"y": v[0][1].Hull(v[1][1]).Hull(v[2][1]),
	}
}

func rangeTriangle(n *node, v [3][2]interval.I, depth int) (interval.I, error) {
	r, err := affineRange(n, v)
	if err == nil || depth == 0 || !isDomain(err) {
		return r, err
	}
	var out interval.I
	for i, t := range splitTriangle(v) {
		s, err := rangeTriangle(n, t, depth-1)
		if err != nil {
			return interval.I{}, err
		}
		if i == 0 {
			out = s
		} else {
			out = out.Hull(s)
		}
	}
	return out, nil
}

// splitTriangle returns the four midpoint sub-triangles of v, with
// enclosed midpoints; their union is the triangle of every exact choice of
// vertices.
func splitTriangle(v [3][2]interval.I) [4][3][2]interval.I {
	mid := func(p, q [2]interval.I) [2]interval.I {
		return [2]interval.I{p[0].Add(q[0]).MulF(0.5), p[1].Add(q[1]).MulF(0.5)}
	}
	m01, m12, m20 := mid(v[0], v[1]), mid(v[1], v[2]), mid(v[2], v[0])
	return [4][3][2]interval.I{
		{v[0], m01, m20},
		{m01, v[1], m12},
		{m20, m12, v[2]},
		{m12, m20, m01},
	}
}
