package formula

import (
	"math/big"
	"sort"
)

// Kinks returns, in increasing order and without repeats, the points x
// (exact float64 values) where e has a kink that a mesh node can carry: x
// is a zero of the argument u of an abs(u), or of the difference u − v of
// the arguments of a min(u, v) or max(u, v), where that argument is an
// affine function p·x + q of the variable x with exact rational p ≠ 0 and
// q (built from x, rational constants, +, −, ·, / by constants), and the
// zero −q/p is exactly a float64. Other kinks (non-affine arguments,
// irrational or non-float zeros, kinks in y) are not listed; their cells
// need another model. With a node at each listed point, every closed cell
// has the argument ≥ 0 or ≤ 0, so Model1 takes one branch there.
func (e *Expr) Kinks() []float64 {
	set := map[float64]bool{}
	var walk func(n *node)
	walk = func(n *node) {
		if n == nil || n.isC {
			return
		}
		if n.kind == kCall {
			var p, q *big.Rat
			var ok bool
			switch n.fn {
			case fAbs:
				p, q, ok = affineRat(n.a)
			case fMin, fMax:
				var pb, qb *big.Rat
				if p, q, ok = affineRat(n.a); ok {
					if pb, qb, ok = affineRat(n.b); ok {
						p, q = new(big.Rat).Sub(p, pb), new(big.Rat).Sub(q, qb)
					}
				}
			}
			if ok && p.Sign() != 0 {
				r := new(big.Rat).Quo(q, p)
				r.Neg(r)
				if f, exact := r.Float64(); exact {
					set[f] = true
				}
			}
		}
		walk(n.a)
		walk(n.b)
	}
	walk(e.root)
	out := make([]float64, 0, len(set))
	for f := range set {
		out = append(out, f+0) // +0 turns −0 into 0
	}
	sort.Float64s(out)
	return out
}

// affineRat returns p, q with n = p·x + q exactly, for n built from x,
// exact rational constants and +, −, ·, / by a nonzero constant; ok is
// false otherwise.
func affineRat(n *node) (p, q *big.Rat, ok bool) {
	if n.isC {
		if n.rat == nil {
			return nil, nil, false
		}
		return new(big.Rat), new(big.Rat).Set(n.rat), true
	}
	switch n.kind {
	case kVar:
		if n.name != "x" {
			return nil, nil, false
		}
		return big.NewRat(1, 1), new(big.Rat), true
	case kNeg:
		p, q, ok := affineRat(n.a)
		if !ok {
			return nil, nil, false
		}
		return p.Neg(p), q.Neg(q), true
	case kAdd, kSub, kMul, kDiv:
		pa, qa, ok := affineRat(n.a)
		if !ok {
			return nil, nil, false
		}
		pb, qb, ok := affineRat(n.b)
		if !ok {
			return nil, nil, false
		}
		switch n.kind {
		case kAdd:
			return pa.Add(pa, pb), qa.Add(qa, qb), true
		case kSub:
			return pa.Sub(pa, pb), qa.Sub(qa, qb), true
		case kMul:
			switch {
			case pa.Sign() == 0:
				return pb.Mul(pb, qa), qb.Mul(qb, qa), true
			case pb.Sign() == 0:
				return pa.Mul(pa, qb), qa.Mul(qa, qb), true
			}
			return nil, nil, false
		case kDiv:
			if pb.Sign() != 0 || qb.Sign() == 0 {
				return nil, nil, false
			}
			return pa.Quo(pa, qb), qa.Quo(qa, qb), true
		}
	}
	return nil, nil, false
}
