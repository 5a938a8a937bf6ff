package formula

import (
	"fmt"
	"math/big"
	"strings"
	"unicode/utf8"

	"gapcert/interval/decimalio"
)

type tokKind uint8

const (
	tEOF tokKind = iota
	tNum
	tName
	tOp // one of + - * / ^ ( ) ,
)

type token struct {
	kind tokKind
	text string
	pos  int // 0-based byte offset
	rat  *big.Rat
}

const funcHint = "known functions: exp, log, sin, cos, tan, atan, sinh, cosh, tanh, sqrt, abs, min, max, pow, interval"

type parser struct {
	src  string
	toks []token
	i    int
}

func (p *parser) fail(pos int, msg, hint string) error {
	return &SyntaxError{Src: p.src, Col: pos + 1, Msg: msg, Hint: hint}
}

func isDigit(c byte) bool { return '0' <= c && c <= '9' }

func isNameStart(c byte) bool { return c == '_' || 'a' <= c && c <= 'z' || 'A' <= c && c <= 'Z' }

// lex splits src into tokens.
func (p *parser) lex() error {
	s := p.src
	for i := 0; i < len(s); {
		c := s[i]
		switch {
		case c == ' ' || c == '\t' || c == '\n' || c == '\r':
			i++
		case isDigit(c) || c == '.':
			j := i
			for j < len(s) && isDigit(s[j]) {
				j++
			}
			if j < len(s) && s[j] == '.' {
				j++
				for j < len(s) && isDigit(s[j]) {
					j++
				}
			}
			if j == i+1 && c == '.' {
				return p.fail(i, "bad number '.'", "write a number such as 0.5 or .5")
			}
			if j < len(s) && (s[j] == 'e' || s[j] == 'E') {
				k := j + 1
				if k < len(s) && (s[k] == '+' || s[k] == '-') {
					k++
				}
				if k < len(s) && isDigit(s[k]) {
					for k < len(s) && isDigit(s[k]) {
						k++
					}
					j = k
				} else if k > j+1 {
					return p.fail(i, fmt.Sprintf("bad number %q", s[i:k]), "an exponent needs digits: 1e-3")
				}
			}
			if j < len(s) && (s[j] == '.' || isDigit(s[j])) {
				return p.fail(i, fmt.Sprintf("bad number %q", s[i:j+1]), "write one '.' at most: 1.25")
			}
			r, err := decimalio.ParseRat(s[i:j])
			if err != nil {
				hint := "write a decimal such as 2.5e-3"
				if se, ok := err.(*decimalio.SyntaxError); ok {
					hint = se.Msg
				}
				return p.fail(i, fmt.Sprintf("bad number %q", s[i:j]), hint)
			}
			p.toks = append(p.toks, token{kind: tNum, text: s[i:j], pos: i, rat: r})
			i = j
		case isNameStart(c):
			j := i + 1
			for j < len(s) && (isNameStart(s[j]) || isDigit(s[j])) {
				j++
			}
			p.toks = append(p.toks, token{kind: tName, text: s[i:j], pos: i})
			i = j
		case strings.IndexByte("+-*/^(),", c) >= 0:
			p.toks = append(p.toks, token{kind: tOp, text: s[i : i+1], pos: i})
			i++
		default:
			r, _ := utf8.DecodeRuneInString(s[i:])
			hint := "formulas use + - * / ^, parentheses, numbers, names and function calls"
			switch r {
			case '−':
				hint = "use the ASCII hyphen-minus '-'"
			case '×', '·':
				hint = "write * for a product"
			case '[', ']', '{', '}':
				hint = "use round parentheses ( )"
			}
			return p.fail(i, fmt.Sprintf("unexpected character %q", r), hint)
		}
	}
	p.toks = append(p.toks, token{kind: tEOF, pos: len(s)})
	return nil
}

func (p *parser) peek() token { return p.toks[p.i] }

func (p *parser) isOp(op string) bool {
	t := p.toks[p.i]
	return t.kind == tOp && t.text == op
}

// Parse parses the formula src.
//
// The grammar (ASCII; spaces, tabs and newlines separate tokens) is
//
//	expr   = term { ("+" | "-") term }
//	term   = unary { ("*" | "/") unary }
//	unary  = ("-" | "+") unary | power
//	power  = atom [ "^" unary ]                 (right-associative)
//	atom   = number | name | name "(" expr { "," expr } ")" | "(" expr ")"
//	number = digits ["." [digits]] | "." digits, then [("e"|"E") [sign] digits]
//	name   = [a-zA-Z_][a-zA-Z0-9_]*
//
// so -x^2 = −(x²) and 2^-1 = 1/2. Numbers are exact decimals (their exact
// rational value is kept); pi and e are the constants. Functions: exp log
// sin cos tan atan sinh cosh tanh sqrt abs (one argument), min max pow (two
// arguments), and interval(lo, hi) with exact rational constant ends: the
// constant standing for every value in [lo, hi].
//
// Errors are *SyntaxError with the 1-based byte column of the problem and
// a hint.
func Parse(src string) (*Expr, error) {
	p := &parser{src: src}
	if err := p.lex(); err != nil {
		return nil, err
	}
	if p.peek().kind == tEOF {
		return nil, p.fail(len(src), "empty formula", "write an expression such as x^2 + 1")
	}
	n, err := p.expr()
	if err != nil {
		return nil, err
	}
	if t := p.peek(); t.kind != tEOF {
		return nil, p.unexpected(t)
	}
	return wrap(n), nil
}

// MustParse is Parse that panics on error; for formulas written in code.
func MustParse(src string) *Expr {
	e, err := Parse(src)
	if err != nil {
		panic("formula: " + err.Error())
	}
	return e
}

// unexpected reports token t where an operator or the end was expected.
func (p *parser) unexpected(t token) error {
	switch {
	case t.kind == tNum || t.kind == tName || t.kind == tOp && t.text == "(":
		prev := p.toks[p.i-1]
		hint := fmt.Sprintf("write %s*%s for a product", prev.text, t.text)
		if prev.text == ")" || t.text == "(" {
			hint = "write * between the factors"
		}
		return p.fail(t.pos, fmt.Sprintf("missing operator before %q", t.text), hint)
	case t.kind == tOp && t.text == ")":
		return p.fail(t.pos, "unmatched ')'", "remove it or add the matching '('")
	}
	return p.fail(t.pos, fmt.Sprintf("unexpected %q", t.text), "")
}

func (p *parser) expr() (*node, error) {
	a, err := p.term()
	if err != nil {
		return nil, err
	}
	for p.isOp("+") || p.isOp("-") {
		k := kAdd
		if p.peek().text == "-" {
			k = kSub
		}
		p.i++
		b, err := p.term()
		if err != nil {
			return nil, err
		}
		a = finish(&node{kind: k, a: a, b: b})
	}
	return a, nil
}

func (p *parser) term() (*node, error) {
	a, err := p.unary()
	if err != nil {
		return nil, err
	}
	for p.isOp("*") || p.isOp("/") {
		k := kMul
		if p.peek().text == "/" {
			k = kDiv
		}
		p.i++
		b, err := p.unary()
		if err != nil {
			return nil, err
		}
		a = finish(&node{kind: k, a: a, b: b})
	}
	return a, nil
}

func (p *parser) unary() (*node, error) {
	if p.isOp("-") || p.isOp("+") {
		neg := p.peek().text == "-"
		p.i++
		a, err := p.unary()
		if err != nil {
			return nil, err
		}
		if neg {
			return finish(&node{kind: kNeg, a: a}), nil
		}
		return a, nil
	}
	return p.power()
}

func (p *parser) power() (*node, error) {
	a, err := p.atom()
	if err != nil {
		return nil, err
	}
	if p.isOp("^") {
		p.i++
		b, err := p.unary()
		if err != nil {
			return nil, err
		}
		return finish(&node{kind: kPow, a: a, b: b}), nil
	}
	return a, nil
}

func (p *parser) atom() (*node, error) {
	t := p.peek()
	switch t.kind {
	case tEOF:
		return nil, p.fail(t.pos, "unexpected end of formula", "an operand is missing")
	case tNum:
		p.i++
		return finish(&node{kind: kNum, text: t.text, rat: t.rat}), nil
	case tName:
		p.i++
		if p.isOp("(") {
			return p.call(t)
		}
		switch {
		case t.text == "pi" || t.text == "e":
			return finish(&node{kind: kConst, name: t.text}), nil
		case reserved(t.text):
			return nil, p.fail(t.pos, fmt.Sprintf("function '%s' needs arguments", t.text),
				fmt.Sprintf("write %s(...)", t.text))
		}
		return &node{kind: kVar, name: t.text}, nil
	}
	if t.text == "(" {
		p.i++
		n, err := p.expr()
		if err != nil {
			return nil, err
		}
		if !p.isOp(")") {
			if q := p.peek(); q.kind != tEOF && q.text != "," {
				return nil, p.unexpected(q)
			}
			return nil, p.fail(t.pos, "unmatched '('", "add the closing ')'")
		}
		p.i++
		return n, nil
	}
	return nil, p.fail(t.pos, fmt.Sprintf("unexpected %q", t.text), "an operand is missing")
}

// call parses the argument list of the function named by t (p is at "(").
func (p *parser) call(t token) (*node, error) {
	open := p.peek()
	p.i++
	var args []*node
	if p.isOp(")") {
		return nil, p.fail(open.pos, fmt.Sprintf("%s() without arguments", t.text), "write the argument inside the parentheses")
	}
	for {
		a, err := p.expr()
		if err != nil {
			return nil, err
		}
		args = append(args, a)
		if p.isOp(",") {
			p.i++
			continue
		}
		if p.isOp(")") {
			p.i++
			break
		}
		if q := p.peek(); q.kind != tEOF {
			return nil, p.unexpected(q)
		}
		return nil, p.fail(open.pos, "unmatched '('", "add the closing ')'")
	}
	arity := func(n int) error {
		if len(args) == n {
			return nil
		}
		s := "s"
		if n == 1 {
			s = ""
		}
		return p.fail(t.pos, fmt.Sprintf("%s takes %d argument%s, got %d", t.text, n, s, len(args)), "")
	}
	switch t.text {
	case "pow":
		if err := arity(2); err != nil {
			return nil, err
		}
		return finish(&node{kind: kPow, a: args[0], b: args[1]}), nil
	case "interval":
		if err := arity(2); err != nil {
			return nil, err
		}
		lo, hi := args[0].rat, args[1].rat
		if lo == nil || hi == nil {
			return nil, p.fail(t.pos, "interval ends must be exact rational constants", "write interval(1/3, 0.5)")
		}
		if lo.Cmp(hi) > 0 {
			return nil, p.fail(t.pos, "interval with lower end above upper end", "write interval(lo, hi) with lo ≤ hi")
		}
		v := decimalio.FromRat(lo).Hull(decimalio.FromRat(hi))
		return finish(&node{kind: kInterval, a: args[0], b: args[1], val: v}), nil
	}
	f, ok := lookupFn(t.text)
	if !ok {
		return nil, p.fail(t.pos, fmt.Sprintf("unknown function '%s'", t.text),
			fmt.Sprintf("%s; for a product write %s*(...)", funcHint, t.text))
	}
	if err := arity(fnArity[f]); err != nil {
		return nil, err
	}
	n := &node{kind: kCall, fn: f, a: args[0]}
	if len(args) == 2 {
		n.b = args[1]
	}
	return finish(n), nil
}
