package algebraic

import (
	"math/big"

	"gapcert/interval"
	"gapcert/interval/decimalio"
)

// This file reads the exact value of a constant formula (in the canonical
// text of package formula, as problem files store it) in an exact algebra:
// the surds (surd.go) or the sums of rational multiples of roots of unity
// (cyclotomic.go). The text is read in the grammar of package
// interval/formula:
//
//	expr  = term { ("+" | "-") term }
//	term  = unary { ("*" | "/") unary }
//	unary = ("-" | "+") unary | power
//	power = atom [ "^" unary ]
//	atom  = number | name | name "(" expr ")" | "(" expr ")"
//
// with decimal literals, π, +, −, ·, division and integer powers where the
// algebra allows them, sqrt, and cos, sin of rational multiples of π
// (sin tπ = cos((1/2 − t)π)). Anything else (parameters, e, exp, log,
// other functions) is not read, and the caller falls back to the number's
// interval enclosure. Values that outgrow the algebra's size bounds
// (fits; rationals of more than maxRatBits bits) are not read either, so
// that a short formula such as ((1e400)^64)^64 cannot make the reader run
// for minutes or exhaust memory. As a guard against a misreading, a value
// is returned only when its enclosure meets the enclosure of the same
// text by package formula.

// constAlgebra is an exact algebra of real numbers the reader evaluates
// in; an operation whose result is not in the algebra reports false.
type constAlgebra[T any] interface {
	fromRat(q *big.Rat) T
	add(a, b T) T
	mul(a, b T) T
	neg(a T) T
	// rat returns a's value if a is known to be rational.
	rat(a T) (*big.Rat, bool)
	inv(a T) (T, bool)
	// sqrtRat returns √q for a rational q ≥ 0.
	sqrtRat(q *big.Rat) (T, bool)
	// cosPi returns cos(tπ).
	cosPi(t *big.Rat) (T, bool)
	enclose(a T) interval.I
	// fits reports whether a is within the algebra's size bounds.
	fits(a T) bool
}

// maxRatBits bounds the size of the rationals the reader builds: the bit
// lengths of numerator and denominator together.
const maxRatBits = 4096

// ratFits reports whether q is within maxRatBits.
func ratFits(q *big.Rat) bool { return q.Num().BitLen()+q.Denom().BitLen() <= maxRatBits }

// bounded returns v, ok, with ok false if v outgrows the size bounds.
func (r *constReader[T]) bounded(v piVal[T], ok bool) (piVal[T], bool) {
	switch {
	case !ok:
		return v, false
	case v.pi != nil:
		return v, ratFits(v.pi)
	}
	return v, r.alg.fits(v.v)
}

// readConst reads text in the algebra alg and returns its value, and
// whether it could be read and its enclosure meets val.
func readConst[T any](alg constAlgebra[T], text string, val interval.I) (T, bool) {
	r := &constReader[T]{alg: alg, src: text}
	v, ok := r.expr()
	if !ok || r.pos != len(r.src) || v.pi != nil {
		var zero T
		return zero, false
	}
	if _, meet := alg.enclose(v.v).Intersection(val); !meet {
		return v.v, false
	}
	return v.v, true
}

// piVal is a value v of the algebra or, when pi is not nil, the number
// pi·π.
type piVal[T any] struct {
	v  T
	pi *big.Rat
}

type constReader[T any] struct {
	alg constAlgebra[T]
	src string
	pos int
}

func (r *constReader[T]) peek() byte {
	if r.pos < len(r.src) {
		return r.src[r.pos]
	}
	return 0
}

func (r *constReader[T]) expr() (piVal[T], bool) {
	v, ok := r.term()
	for ok && (r.peek() == '+' || r.peek() == '-') {
		op := r.peek()
		r.pos++
		var w piVal[T]
		if w, ok = r.term(); !ok {
			break
		}
		if op == '-' {
			w = r.neg(w)
		}
		v, ok = r.bounded(r.add(v, w))
	}
	return v, ok
}

func (r *constReader[T]) term() (piVal[T], bool) {
	v, ok := r.unary()
	for ok && (r.peek() == '*' || r.peek() == '/') {
		op := r.peek()
		r.pos++
		var w piVal[T]
		if w, ok = r.unary(); !ok {
			break
		}
		if op == '/' {
			if w, ok = r.inv(w); !ok {
				break
			}
		}
		v, ok = r.bounded(r.mul(v, w))
	}
	return v, ok
}

func (r *constReader[T]) unary() (piVal[T], bool) {
	switch r.peek() {
	case '-':
		r.pos++
		v, ok := r.unary()
		return r.neg(v), ok
	case '+':
		r.pos++
		return r.unary()
	}
	return r.power()
}

// maxPower bounds the integer exponents read, which keeps values small.
const maxPower = 64

func (r *constReader[T]) power() (piVal[T], bool) {
	v, ok := r.atom()
	if !ok || r.peek() != '^' {
		return v, ok
	}
	r.pos++
	e, ok := r.unary()
	if !ok || e.pi != nil || v.pi != nil {
		return piVal[T]{}, false
	}
	n, isRat := r.alg.rat(e.v)
	if !isRat || !n.IsInt() || n.Num().CmpAbs(big.NewInt(maxPower)) > 0 {
		return piVal[T]{}, false
	}
	k := n.Num().Int64()
	base := v
	if k < 0 {
		if base, ok = r.inv(v); !ok {
			return piVal[T]{}, false
		}
		k = -k
	}
	out := piVal[T]{v: r.alg.fromRat(big.NewRat(1, 1))}
	for range k {
		if out, ok = r.bounded(piVal[T]{v: r.alg.mul(out.v, base.v)}, true); !ok {
			return piVal[T]{}, false
		}
	}
	return out, true
}

func (r *constReader[T]) atom() (piVal[T], bool) {
	c := r.peek()
	switch {
	case c == '(':
		r.pos++
		v, ok := r.expr()
		if !ok || r.peek() != ')' {
			return piVal[T]{}, false
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
				return piVal[T]{pi: big.NewRat(1, 1)}, true
			}
			return piVal[T]{}, false // e or a parameter
		}
		r.pos++
		arg, ok := r.expr()
		if !ok || r.peek() != ')' {
			return piVal[T]{}, false
		}
		r.pos++
		return r.bounded(r.apply(name, arg))
	}
	return piVal[T]{}, false
}

func isLetter(c byte) bool { return c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c == '_' }

// number reads digits ["." [digits]] | "." digits, then an optional
// exponent, exactly.
func (r *constReader[T]) number() (piVal[T], bool) {
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
		return piVal[T]{}, false
	}
	return r.bounded(piVal[T]{v: r.alg.fromRat(q)}, true)
}

func (r *constReader[T]) neg(v piVal[T]) piVal[T] {
	if v.pi != nil {
		return piVal[T]{pi: new(big.Rat).Neg(v.pi)}
	}
	return piVal[T]{v: r.alg.neg(v.v)}
}

// isZero reports whether v is known to be the rational 0.
func (r *constReader[T]) isZero(v piVal[T]) bool {
	q, ok := r.alg.rat(v.v)
	return v.pi == nil && ok && q.Sign() == 0
}

func (r *constReader[T]) add(v, w piVal[T]) (piVal[T], bool) {
	switch {
	case v.pi == nil && w.pi == nil:
		return piVal[T]{v: r.alg.add(v.v, w.v)}, true
	case v.pi != nil && w.pi != nil:
		return piVal[T]{pi: new(big.Rat).Add(v.pi, w.pi)}, true
	case v.pi != nil && r.isZero(w):
		return v, true
	case w.pi != nil && r.isZero(v):
		return w, true
	}
	return piVal[T]{}, false
}

func (r *constReader[T]) mul(v, w piVal[T]) (piVal[T], bool) {
	switch {
	case v.pi == nil && w.pi == nil:
		return piVal[T]{v: r.alg.mul(v.v, w.v)}, true
	case v.pi != nil && w.pi != nil:
		return piVal[T]{}, false
	case v.pi != nil:
		v, w = w, v
	}
	c, ok := r.alg.rat(v.v)
	if !ok {
		return piVal[T]{}, false
	}
	return piVal[T]{pi: new(big.Rat).Mul(c, w.pi)}, true
}

// inv returns 1/w; a multiple of π is inverted only as a divisor of
// nothing, so it is refused.
func (r *constReader[T]) inv(w piVal[T]) (piVal[T], bool) {
	if w.pi != nil {
		return piVal[T]{}, false
	}
	x, ok := r.alg.inv(w.v)
	return piVal[T]{v: x}, ok
}

func (r *constReader[T]) apply(name string, arg piVal[T]) (piVal[T], bool) {
	switch name {
	case "sqrt":
		q, ok := r.alg.rat(arg.v)
		if arg.pi != nil || !ok || q.Sign() < 0 {
			return piVal[T]{}, false
		}
		v, ok := r.alg.sqrtRat(q)
		return piVal[T]{v: v}, ok
	case "cos", "sin":
		var t *big.Rat // the angle in units of π
		switch {
		case arg.pi != nil:
			t = arg.pi
		case r.isZero(arg):
			t = new(big.Rat)
		default:
			return piVal[T]{}, false
		}
		if name == "sin" {
			t = new(big.Rat).Sub(big.NewRat(1, 2), t) // sin tπ = cos((1/2 − t)π)
		}
		v, ok := r.alg.cosPi(t)
		return piVal[T]{v: v}, ok
	}
	return piVal[T]{}, false
}
