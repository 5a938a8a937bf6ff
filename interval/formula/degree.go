package formula

// PolynomialDegree reports whether e is a polynomial in the variables
// vars and returns an upper bound of its total degree. Accepted are the
// same forms as Polynomial (sums, differences, products, division by a
// constant whose enclosure excludes 0, non-negative integer powers,
// constant sub-expressions); the bound is the degree of the expression
// as written (x·x − x·x counts 2). It needs no expansion, so it serves
// any number of variables (a Taylor model of order ≥ this degree has a
// zero remainder, its jets of higher order being exactly zero).
func (e *Expr) PolynomialDegree(vars ...string) (int, bool) {
	return degreeOf(e.root, vars)
}

func degreeOf(n *node, vars []string) (int, bool) {
	if n.isC {
		return 0, n.cerr == nil
	}
	switch n.kind {
	case kVar:
		for _, v := range vars {
			if n.name == v {
				return 1, true
			}
		}
		return 0, false
	case kNeg:
		return degreeOf(n.a, vars)
	case kAdd, kSub, kMul:
		a, ok := degreeOf(n.a, vars)
		if !ok {
			return 0, false
		}
		b, ok := degreeOf(n.b, vars)
		if !ok {
			return 0, false
		}
		if n.kind == kMul {
			return a + b, a+b <= maxPolyDegree
		}
		return max(a, b), true
	case kDiv:
		if !n.b.isC || n.b.cerr != nil || n.b.val.ContainsZero() {
			return 0, false
		}
		return degreeOf(n.a, vars)
	case kPow:
		if n.intExp < 0 {
			return 0, false
		}
		a, ok := degreeOf(n.a, vars)
		if !ok || a*n.intExp > maxPolyDegree {
			return 0, false
		}
		return a * n.intExp, true
	}
	return 0, false
}
