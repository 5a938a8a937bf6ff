package hypothesis

import (
	"math/big"

	"gapcert/fem/problem"
	"gapcert/interval/decimalio"
)

// This file reads the exact value of a constant number of a problem file
// as a surd, when the number's canonical formula text (problem.Number.Text)
// is built from decimal literals, π, +, −, ·, /, integer powers, √ and
// cos, sin of integer multiples of π/12, and each step stays among the
// surds: a divisor must be a single nonzero term q·√r, √ and a negative
// power need a rational argument (≥ 0, resp. ≠ 0). Anything else (parameters,
// e, exp, log, other angles) is not read, and the caller falls back to
// the number's interval enclosure. The text is read in the grammar of
// package interval/formula:
//
//	expr  = term { ("+" | "-") term }
//	term  = unary { ("*" | "/") unary }
//	unary = ("-" | "+") unary | power
//	power = atom [ "^" unary ]
//	atom  = number | name | name "(" expr ")" | "(" expr ")"
//
// As a guard against a misreading, the surd is used only when its
// enclosure meets the number's own enclosure problem.Number.Val.

// numberSurd returns the exact value of n as a surd, and whether it could
// be read.
func numberSurd(n problem.Number) (surd, bool) {
	if n.Rat != nil {
		return ratSurd(n.Rat), true
	}
	r := &surdReader{src: n.Text}
	v, ok := r.expr()
	if !ok || r.pos != len(r.src) || v.pi != nil {
		return nil, false
	}
	if _, meet := v.s.enclose().Intersection(n.Val); !meet {
		return nil, false
	}
	return v.s, true
}

// piSurd is a surd, or, when pi is not nil, the number pi·π.
type piSurd struct {
	s  surd
	pi *big.Rat
}

type surdReader struct {
	src string
	pos int
}

func (r *surdReader) peek() byte {
	if r.pos < len(r.src) {
		return r.src[r.pos]
	}
	return 0
}

func (r *surdReader) expr() (piSurd, bool) {
	v, ok := r.term()
	for ok && (r.peek() == '+' || r.peek() == '-') {
		op := r.peek()
		r.pos++
		var w piSurd
		if w, ok = r.term(); !ok {
			break
		}
		if op == '-' {
			w = negPiSurd(w)
		}
		v, ok = addPiSurd(v, w)
	}
	return v, ok
}

func (r *surdReader) term() (piSurd, bool) {
	v, ok := r.unary()
	for ok && (r.peek() == '*' || r.peek() == '/') {
		op := r.peek()
		r.pos++
		var w piSurd
		if w, ok = r.unary(); !ok {
			break
		}
		if op == '*' {
			v, ok = mulPiSurd(v, w)
		} else {
			v, ok = divPiSurd(v, w)
		}
	}
	return v, ok
}

func (r *surdReader) unary() (piSurd, bool) {
	switch r.peek() {
	case '-':
		r.pos++
		v, ok := r.unary()
		return negPiSurd(v), ok
	case '+':
		r.pos++
		return r.unary()
	}
	return r.power()
}

// maxPower bounds the integer exponents read, which keeps the surds small.
const maxPower = 64

func (r *surdReader) power() (piSurd, bool) {
	v, ok := r.atom()
	if !ok || r.peek() != '^' {
		return v, ok
	}
	r.pos++
	e, ok := r.unary()
	if !ok || e.pi != nil || v.pi != nil {
		return piSurd{}, false
	}
	n, isRat := e.s.rat()
	if !isRat || !n.IsInt() || n.Num().CmpAbs(big.NewInt(maxPower)) > 0 {
		return piSurd{}, false
	}
	k := n.Num().Int64()
	base := v.s
	if k < 0 {
		b, isRat := v.s.rat()
		if !isRat || b.Sign() == 0 {
			return piSurd{}, false
		}
		base, k = ratSurd(new(big.Rat).Inv(b)), -k
	}
	out := ratSurd(big.NewRat(1, 1))
	for range k {
		out = out.mul(base)
	}
	return piSurd{s: out}, true
}

func (r *surdReader) atom() (piSurd, bool) {
	c := r.peek()
	switch {
	case c == '(':
		r.pos++
		v, ok := r.expr()
		if !ok || r.peek() != ')' {
			return piSurd{}, false
		}
		r.pos++
		return v, true
	case c >= '0' && c <= '9' || c == '.':
		return r.number()
	case isLetter(c):
		start := r.pos
		for r.pos < len(r.src) && (isLetter(r.src[r.pos]) || r.src[r.pos] >= '0' && r.src[r.pos] <= '9') {
			r.pos++
		}
		name := r.src[start:r.pos]
		if r.peek() != '(' {
			if name == "pi" {
				return piSurd{pi: big.NewRat(1, 1)}, true
			}
			return piSurd{}, false // e or a parameter
		}
		r.pos++
		arg, ok := r.expr()
		if !ok || r.peek() != ')' {
			return piSurd{}, false
		}
		r.pos++
		return applySurd(name, arg)
	}
	return piSurd{}, false
}

func isLetter(c byte) bool { return c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c == '_' }

// number reads digits ["." [digits]] | "." digits, then an optional
// exponent, exactly.
func (r *surdReader) number() (piSurd, bool) {
	start := r.pos
	digits := func() {
		for r.pos < len(r.src) && r.src[r.pos] >= '0' && r.src[r.pos] <= '9' {
			r.pos++
		}
	}
	digits()
	if r.peek() == '.' {
		r.pos++
		digits()
	}
	if c := r.peek(); c == 'e' || c == 'E' {
		save := r.pos
		r.pos++
		if c := r.peek(); c == '+' || c == '-' {
			r.pos++
		}
		if c := r.peek(); c >= '0' && c <= '9' {
			digits()
		} else {
			r.pos = save
		}
	}
	q, err := decimalio.ParseRat(r.src[start:r.pos])
	if err != nil {
		return piSurd{}, false
	}
	return piSurd{s: ratSurd(q)}, true
}

func negPiSurd(v piSurd) piSurd {
	if v.pi != nil {
		return piSurd{pi: new(big.Rat).Neg(v.pi)}
	}
	return piSurd{s: v.s.neg()}
}

func addPiSurd(v, w piSurd) (piSurd, bool) {
	switch {
	case v.pi == nil && w.pi == nil:
		return piSurd{s: v.s.add(w.s)}, true
	case v.pi != nil && w.pi != nil:
		return piSurd{pi: new(big.Rat).Add(v.pi, w.pi)}, true
	case v.pi != nil && w.s.isZero():
		return v, true
	case w.pi != nil && v.s.isZero():
		return w, true
	}
	return piSurd{}, false
}

func mulPiSurd(v, w piSurd) (piSurd, bool) {
	switch {
	case v.pi == nil && w.pi == nil:
		return piSurd{s: v.s.mul(w.s)}, true
	case v.pi != nil && w.pi != nil:
		return piSurd{}, false
	case v.pi != nil:
		v, w = w, v
	}
	c, ok := v.s.rat()
	if !ok {
		return piSurd{}, false
	}
	return piSurd{pi: new(big.Rat).Mul(c, w.pi)}, true
}

func divPiSurd(v, w piSurd) (piSurd, bool) {
	if w.pi != nil {
		return piSurd{}, false
	}
	if len(w.s) != 1 {
		return piSurd{}, false // 0, or a sum of two or more terms
	}
	// 1/(q·√r) = √r/(q·r).
	q, r := w.s[0].q, w.s[0].r
	inv := surd{{q: new(big.Rat).Inv(new(big.Rat).Mul(q, r)), r: r}}
	if v.pi != nil {
		c, ok := inv.rat()
		if !ok {
			return piSurd{}, false
		}
		return piSurd{pi: new(big.Rat).Mul(v.pi, c)}, true
	}
	return piSurd{s: v.s.mul(inv)}, true
}

// applySurd evaluates sqrt, cos and sin where the value is a surd.
func applySurd(name string, arg piSurd) (piSurd, bool) {
	switch name {
	case "sqrt":
		x, ok := arg.s.rat()
		if arg.pi != nil || !ok || x.Sign() < 0 {
			return piSurd{}, false
		}
		return piSurd{s: sqrtRatSurd(x)}, true
	case "cos", "sin":
		var t *big.Rat // the angle in units of π
		switch x, ok := arg.s.rat(); {
		case arg.pi != nil:
			t = arg.pi
		case ok && x.Sign() == 0:
			t = new(big.Rat)
		default:
			return piSurd{}, false
		}
		k := new(big.Rat).Mul(t, big.NewRat(12, 1)) // the angle in units of π/12
		if !k.IsInt() {
			return piSurd{}, false
		}
		m := new(big.Int).Mod(k.Num(), big.NewInt(24)).Int64()
		if name == "sin" {
			m = (6 - m + 24) % 24 // sin θ = cos(π/2 − θ)
		}
		return piSurd{s: cosPiTwelfths(m)}, true
	}
	return piSurd{}, false
}

// cosPiTwelfths returns cos(mπ/12) for 0 ≤ m < 24 from the values at
// 0, π/12, …, π/2: 1, (√6 + √2)/4, √3/2, √2/2, 1/2, (√6 − √2)/4, 0 (the
// angles of the 30-60-90 and 45-45-90 triangles and the difference formula
// cos(π/4 − π/6); common practice), with cos(2π − θ) = cos θ and
// cos(π − θ) = −cos θ.
func cosPiTwelfths(m int64) surd {
	if m > 12 {
		m = 24 - m
	}
	sign := int64(1)
	if m > 6 {
		m, sign = 12-m, -1
	}
	sq := func(a int64) surd { return sqrtRatSurd(big.NewRat(a, 1)) }
	var v surd
	switch m {
	case 0:
		v = ratSurd(big.NewRat(1, 1))
	case 1:
		v = sq(6).add(sq(2)).scale(big.NewRat(1, 4))
	case 2:
		v = sq(3).scale(big.NewRat(1, 2))
	case 3:
		v = sq(2).scale(big.NewRat(1, 2))
	case 4:
		v = ratSurd(big.NewRat(1, 2))
	case 5:
		v = sq(6).sub(sq(2)).scale(big.NewRat(1, 4))
	case 6:
		v = nil
	}
	return v.scale(big.NewRat(sign, 1))
}
