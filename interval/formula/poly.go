package formula

import (
	"sort"

	"gapcert/interval"
)

// maxPolyDegree bounds the total degree Polynomial expands.
const maxPolyDegree = 64

// Poly is Σ Coef[{i, j}] x^i y^j with interval coefficients: for every
// choice of exact coefficients in them the sum is a polynomial, and the
// exact polynomial denoted by the expression is one of these choices.
type Poly struct {
	Coef map[[2]int]interval.I
}

// Degree returns the total degree (largest i + j with a coefficient other
// than [0, 0]); 0 for a constant, −1 for the zero polynomial.
func (p Poly) Degree() int {
	d := -1
	for k, c := range p.Coef {
		if (c.Lo != 0 || c.Hi != 0) && k[0]+k[1] > d {
			d = k[0] + k[1]
		}
	}
	return d
}

// Terms returns the exponents of the coefficients in a fixed order
// (by total degree, then by descending power of x).
func (p Poly) Terms() [][2]int {
	out := make([][2]int, 0, len(p.Coef))
	for k := range p.Coef {
		out = append(out, k)
	}
	sort.Slice(out, func(a, b int) bool {
		da, db := out[a][0]+out[a][1], out[b][0]+out[b][1]
		if da != db {
			return da < db
		}
		return out[a][0] > out[b][0]
	})
	return out
}

// Polynomial reports whether e is a polynomial in x and y and returns it.
// Accepted are sums, differences, products, division by a constant whose
// enclosure excludes 0, non-negative integer powers, and constant
// sub-expressions (pi, sqrt(2), …) as enclosed coefficients; any other
// free variable, a variable divisor or exponent, or a function of x or y
// gives false. Coefficients are computed in interval arithmetic, so each
// contains the exact coefficient. Total degree is limited to 64.
func (e *Expr) Polynomial() (Poly, bool) {
	c, ok := polyOf(e.root)
	if !ok {
		return Poly{}, false
	}
	return Poly{Coef: c}, true
}

type poly = map[[2]int]interval.I

func polyDeg(p poly) int {
	d := 0
	for k := range p {
		d = max(d, k[0]+k[1])
	}
	return d
}

func polyMul(p, q poly) (poly, bool) {
	if polyDeg(p)+polyDeg(q) > maxPolyDegree {
		return nil, false
	}
	r := poly{}
	for kp, cp := range p {
		for kq, cq := range q {
			k := [2]int{kp[0] + kq[0], kp[1] + kq[1]}
			r[k] = r[k].Add(cp.Mul(cq))
		}
	}
	return r, true
}

func polyOf(n *node) (poly, bool) {
	if n.isC {
		if n.cerr != nil {
			return nil, false
		}
		return poly{{0, 0}: n.val}, true
	}
	switch n.kind {
	case kVar:
		switch n.name {
		case "x":
			return poly{{1, 0}: interval.Point(1)}, true
		case "y":
			return poly{{0, 1}: interval.Point(1)}, true
		}
		return nil, false
	case kNeg, kAdd, kSub, kMul:
		a, ok := polyOf(n.a)
		if !ok {
			return nil, false
		}
		if n.kind == kNeg {
			r := poly{}
			for k, c := range a {
				r[k] = c.Neg()
			}
			return r, true
		}
		b, ok := polyOf(n.b)
		if !ok {
			return nil, false
		}
		if n.kind == kMul {
			return polyMul(a, b)
		}
		r := poly{}
		for k, c := range a {
			r[k] = c
		}
		for k, c := range b {
			if n.kind == kAdd {
				r[k] = r[k].Add(c)
			} else {
				r[k] = r[k].Sub(c)
			}
		}
		return r, true
	case kDiv:
		if !n.b.isC || n.b.cerr != nil || n.b.val.ContainsZero() {
			return nil, false
		}
		a, ok := polyOf(n.a)
		if !ok {
			return nil, false
		}
		r := poly{}
		for k, c := range a {
			r[k] = c.Div(n.b.val)
		}
		return r, true
	case kPow:
		if n.intExp < 0 {
			return nil, false
		}
		a, ok := polyOf(n.a)
		if !ok || polyDeg(a)*n.intExp > maxPolyDegree {
			return nil, false
		}
		r := poly{{0, 0}: interval.Point(1)}
		for i := 0; i < n.intExp; i++ {
			if r, ok = polyMul(r, a); !ok {
				return nil, false
			}
		}
		return r, true
	}
	return nil, false
}
