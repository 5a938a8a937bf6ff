package formula

// Summands returns expressions s_1, …, s_n and signs such that
// e = ±s_1 ± … ± s_n as a function (exactly, not only numerically), with
// s_i subtracted where negated[i]: the operands of e's top-level sums and
// differences, a subtracted operand or one under a unary minus with its
// sign flipped. The identities used are a − b = a + (−b), −(a + b) =
// (−a) + (−b), −(a − b) = (−a) + b and −(−a) = a; each summand is defined
// exactly where e's corresponding subexpression is, so the signed sum and
// e have the same domain. A term that is not a sum, difference or
// negation is its own single summand. The order is that of the terms in
// e's text.
func (e *Expr) Summands() (terms []*Expr, negated []bool) {
	var walk func(n *node, neg bool)
	walk = func(n *node, neg bool) {
		switch n.kind {
		case kAdd:
			walk(n.a, neg)
			walk(n.b, neg)
			return
		case kSub:
			walk(n.a, neg)
			walk(n.b, !neg)
			return
		case kNeg:
			walk(n.a, !neg)
			return
		}
		terms, negated = append(terms, wrap(n)), append(negated, neg)
	}
	walk(e.root, false)
	return terms, negated
}

// Neg returns −a.
func Neg(a *Expr) *Expr {
	if a == nil || a.root == nil {
		panic("formula: nil operand")
	}
	return wrap(finish(&node{kind: kNeg, a: a.root}))
}

// Rename returns e with each free variable named in names replaced by the
// variable names[name], all at once (so {x: y, y: x} swaps them). It panics
// if a new name is not a valid variable name (see Var).
func (e *Expr) Rename(names map[string]string) *Expr {
	vars := map[string]*node{}
	for old, name := range names {
		vars[old] = Var(name).root
	}
	return e.substitute(vars)
}
