package formula

import (
	"math"
	"math/big"
	"sort"
	"strings"

	"gapcert/interval"
	"gapcert/interval/decimalio"
)

// kind is the node type of an expression tree.
type kind uint8

const (
	kNum      kind = iota // number literal: text, rat
	kConst                // named constant pi or e
	kInterval             // interval(lo, hi), also made by Const and Bind
	kVar                  // free variable: name
	kNeg                  // −a
	kAdd                  // a + b
	kSub                  // a − b
	kMul                  // a · b
	kDiv                  // a / b
	kPow                  // a ^ b
	kCall                 // fn(a) or fn(a, b)
)

// fnID names a function of the grammar.
type fnID uint8

const (
	fExp fnID = iota
	fLog
	fSin
	fCos
	fTan
	fAtan
	fSinh
	fCosh
	fTanh
	fSqrt
	fAbs
	fMin
	fMax
	nFuncs
)

var fnNames = [nFuncs]string{"exp", "log", "sin", "cos", "tan", "atan", "sinh", "cosh", "tanh", "sqrt", "abs", "min", "max"}

// fnArity gives the number of arguments of each function.
var fnArity = [nFuncs]int{1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 2, 2}

// maxRatBits bounds the size of exactly folded rational constants; larger
// constant sub-expressions are enclosed by interval evaluation instead.
const maxRatBits = 4096

// maxIntPow is the largest exponent treated as an exact integer power.
const maxIntPow = 1 << 20

var bigMaxIntPow = big.NewInt(maxIntPow)

// node is one vertex of an immutable expression tree.
type node struct {
	kind   kind
	fn     fnID
	name   string     // kVar, kConst
	text   string     // kNum: literal text as written
	rat    *big.Rat   // exact value if the subtree is a rational constant
	intExp int        // kPow: exponent if b is an exact integer constant in [0, maxIntPow], else −1
	a, b   *node      // operands
	isC    bool       // the subtree has no free variable
	val    interval.I // isC: enclosure of the value (valid if cerr == nil)
	cerr   error      // isC: why the constant cannot be enclosed
}

// Expr is an immutable parsed expression in the variables x, y and named
// parameters. The zero Expr is not valid; build one with Parse or the
// builders.
type Expr struct {
	root *node
}

func ratSmall(r *big.Rat) bool {
	return r.Num().BitLen() <= maxRatBits && r.Denom().BitLen() <= maxRatBits
}

// finish computes the constant data of n from its children.
func finish(n *node) *node {
	switch n.kind {
	case kNum:
		n.isC = true
		n.val = decimalio.FromRat(n.rat)
		return n
	case kConst:
		n.isC = true
		if n.name == "pi" {
			n.val = interval.Pi()
		} else {
			n.val = interval.E()
		}
		return n
	case kInterval:
		n.isC = true
		return n
	case kVar:
		return n
	}
	n.isC = n.a.isC && (n.b == nil || n.b.isC)
	if n.kind == kPow {
		n.intExp = -1
		if r := n.b.rat; r != nil && r.IsInt() && r.Sign() >= 0 && r.Num().Cmp(bigMaxIntPow) <= 0 {
			n.intExp = int(r.Num().Int64())
		}
	}
	if !n.isC {
		return n
	}
	n.rat = foldRat(n)
	if n.rat != nil {
		n.val = decimalio.FromRat(n.rat)
		return n
	}
	n.val, n.cerr = evalNode(n, nil)
	return n
}

// foldRat returns the exact rational value of a constant node whose
// operands are exact rationals, or nil.
func foldRat(n *node) *big.Rat {
	a := n.a.rat
	if a == nil {
		return nil
	}
	var b *big.Rat
	if n.b != nil {
		if b = n.b.rat; b == nil {
			return nil
		}
	}
	r := new(big.Rat)
	switch n.kind {
	case kNeg:
		r.Neg(a)
	case kAdd:
		r.Add(a, b)
	case kSub:
		r.Sub(a, b)
	case kMul:
		r.Mul(a, b)
	case kDiv:
		if b.Sign() == 0 {
			return nil
		}
		r.Quo(a, b)
	case kPow:
		if n.intExp < 0 {
			return nil
		}
		bits := a.Num().BitLen() + a.Denom().BitLen()
		if bits*n.intExp > 2*maxRatBits {
			return nil
		}
		e := big.NewInt(int64(n.intExp))
		r.SetFrac(new(big.Int).Exp(a.Num(), e, nil), new(big.Int).Exp(a.Denom(), e, nil))
	default:
		return nil
	}
	if !ratSmall(r) {
		return nil
	}
	return r
}

func wrap(n *node) *Expr { return &Expr{root: n} }

// Const returns the constant expression with value c (every value of c:
// evaluation encloses the whole interval). A point prints as its exact
// decimal, any other interval as interval(lo, hi) with exact decimal ends.
// Const panics if c is unbounded.
func Const(c interval.I) *Expr {
	return wrap(constNode(c))
}

func constNode(c interval.I) *node {
	if math.IsInf(c.Lo, 0) || math.IsInf(c.Hi, 0) || math.IsNaN(c.Lo) || math.IsNaN(c.Hi) || c.Lo > c.Hi {
		panic("formula: Const of an unbounded or invalid interval")
	}
	lo := numNode(c.Lo)
	if c.IsPoint() {
		return lo
	}
	return finish(&node{kind: kInterval, a: lo, b: numNode(c.Hi), val: c})
}

// numNode returns the exact literal of a finite float (negated literal
// for negative values).
func numNode(f float64) *node {
	if f < 0 {
		return finish(&node{kind: kNeg, a: numNode(-f)})
	}
	if f == 0 {
		f = 0 // drop the sign of −0
	}
	return finish(&node{kind: kNum, text: decimalio.FormatExact(f), rat: new(big.Rat).SetFloat64(f)})
}

// Var returns the expression consisting of the variable name. It panics if
// name is not an identifier or is reserved (pi, e, a function name).
func Var(name string) *Expr {
	if !isIdent(name) || reserved(name) {
		panic("formula: invalid variable name " + name)
	}
	return wrap(&node{kind: kVar, name: name})
}

func isIdent(s string) bool {
	if s == "" {
		return false
	}
	for i := 0; i < len(s); i++ {
		c := s[i]
		if !(c == '_' || 'a' <= c && c <= 'z' || 'A' <= c && c <= 'Z' || i > 0 && '0' <= c && c <= '9') {
			return false
		}
	}
	return true
}

func reserved(name string) bool {
	if name == "pi" || name == "e" || name == "interval" || name == "pow" {
		return true
	}
	_, ok := lookupFn(name)
	return ok
}

func lookupFn(name string) (fnID, bool) {
	for i, s := range fnNames {
		if s == name {
			return fnID(i), true
		}
	}
	return 0, false
}

func bin(k kind, a, b *Expr) *Expr {
	if a == nil || b == nil || a.root == nil || b.root == nil {
		panic("formula: nil operand")
	}
	return wrap(finish(&node{kind: k, a: a.root, b: b.root}))
}

// Add returns a + b.
func Add(a, b *Expr) *Expr { return bin(kAdd, a, b) }

// Sub returns a − b.
func Sub(a, b *Expr) *Expr { return bin(kSub, a, b) }

// Mul returns a · b.
func Mul(a, b *Expr) *Expr { return bin(kMul, a, b) }

// Div returns a / b.
func Div(a, b *Expr) *Expr { return bin(kDiv, a, b) }

// Vars returns the sorted names of the free variables of e (the constants
// pi and e are not variables).
func (e *Expr) Vars() []string {
	set := map[string]bool{}
	var walk func(n *node)
	walk = func(n *node) {
		if n == nil || n.isC {
			return
		}
		if n.kind == kVar {
			set[n.name] = true
		}
		walk(n.a)
		walk(n.b)
	}
	walk(e.root)
	out := make([]string, 0, len(set))
	for s := range set {
		out = append(out, s)
	}
	sort.Strings(out)
	return out
}

// Bind returns e with each variable named in vals replaced by the constant
// interval vals[name] (see Const; the values must be bounded). Names that
// do not occur in e are ignored.
func (e *Expr) Bind(vals map[string]interval.I) *Expr {
	consts := map[string]*node{}
	for k, v := range vals {
		consts[k] = constNode(v)
	}
	return e.substitute(consts)
}

// substitute returns e with every variable named in by replaced by the
// node by[name], all at once (Bind, Rename); unchanged subtrees are
// shared.
func (e *Expr) substitute(by map[string]*node) *Expr {
	var walk func(n *node) *node
	walk = func(n *node) *node {
		if n == nil || n.isC {
			return n
		}
		if n.kind == kVar {
			if v, ok := by[n.name]; ok {
				return v
			}
			return n
		}
		a, b := walk(n.a), walk(n.b)
		if a == n.a && b == n.b {
			return n
		}
		return finish(&node{kind: n.kind, fn: n.fn, a: a, b: b})
	}
	return wrap(walk(e.root))
}

// Precedence levels for printing: a child printed at a position that
// requires level p gets parentheses if its own level is lower.
const (
	precSum   = 1
	precProd  = 2
	precUnary = 3
	precPow   = 4
	precAtom  = 5
)

func (n *node) prec() int {
	switch n.kind {
	case kAdd, kSub:
		return precSum
	case kMul, kDiv:
		return precProd
	case kNeg:
		return precUnary
	case kPow:
		return precPow
	}
	return precAtom
}

// String returns the canonical text of e: minimal parentheses under the
// grammar's precedences (a child on the right of −, *, /, on the left of ^
// and after unary minus is parenthesised unless it binds tighter), number
// literals as written, one space after each comma and none elsewhere.
// Parse(e.String()).String() == e.String().
func (e *Expr) String() string {
	var sb strings.Builder
	e.root.write(&sb)
	return sb.String()
}

func (n *node) String() string {
	var sb strings.Builder
	n.write(&sb)
	return sb.String()
}

func (n *node) child(sb *strings.Builder, c *node, need int) {
	if c.prec() < need {
		sb.WriteByte('(')
		c.write(sb)
		sb.WriteByte(')')
		return
	}
	c.write(sb)
}

func (n *node) write(sb *strings.Builder) {
	switch n.kind {
	case kNum:
		sb.WriteString(n.text)
	case kConst, kVar:
		sb.WriteString(n.name)
	case kInterval:
		sb.WriteString("interval(")
		n.a.write(sb)
		sb.WriteString(", ")
		n.b.write(sb)
		sb.WriteByte(')')
	case kNeg:
		sb.WriteByte('-')
		n.child(sb, n.a, precPow)
	case kAdd, kSub:
		n.child(sb, n.a, precSum)
		if n.kind == kAdd {
			sb.WriteByte('+')
		} else {
			sb.WriteByte('-')
		}
		if n.b.kind == kNeg { // a+(-b), not a+-b
			n.child(sb, n.b, precPow)
		} else {
			n.child(sb, n.b, precProd)
		}
	case kMul, kDiv:
		n.child(sb, n.a, precProd)
		if n.kind == kMul {
			sb.WriteByte('*')
		} else {
			sb.WriteByte('/')
		}
		n.child(sb, n.b, precPow)
	case kPow:
		n.child(sb, n.a, precAtom)
		sb.WriteByte('^')
		n.child(sb, n.b, precPow)
	case kCall:
		sb.WriteString(fnNames[n.fn])
		sb.WriteByte('(')
		n.a.write(sb)
		if n.b != nil {
			sb.WriteString(", ")
			n.b.write(sb)
		}
		sb.WriteByte(')')
	}
}
