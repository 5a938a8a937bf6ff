package certs

import (
	"errors"
	"fmt"
	"slices"
	"strconv"
	"strings"

	"gapcert/interval"
	"gapcert/interval/formula"
)

// MarginDigits is the number of significant digits of a printed claim
// margin.
const MarginDigits = 17

// MaxEigenvalueName is the largest k for which "lambdak" is a claim name.
const MaxEigenvalueName = 20

// Claim is a parsed inequality LHS Rel RHS. Rel is one of ">=", "<=", ">",
// "<" (the Unicode "≥" and "≤" are read as ">=" and "<=").
type Claim struct {
	Text     string
	LHS, RHS *formula.Expr
	Rel      string
}

// ClaimError reports a claim that cannot be read or names an unknown
// quantity. Col is the 1-based byte column in Text.
type ClaimError struct {
	Text string
	Col  int
	Msg  string
	Hint string
}

func (e *ClaimError) Error() string {
	s := fmt.Sprintf("claim %q, col %d: %s", e.Text, e.Col, e.Msg)
	if e.Hint != "" {
		s += " (" + e.Hint + ")"
	}
	return s
}

const claimHint = "write a claim as lhs REL rhs with REL one of >=, <=, >, <, e.g. lambda2 - lambda1 >= 3*pi^2/D^2"

// relations in the order they are matched (two-byte and Unicode forms
// before the one-byte ones).
var relations = []struct{ text, rel string }{
	{">=", ">="}, {"<=", "<="}, {"≥", ">="}, {"≤", "<="}, {">", ">"}, {"<", "<"},
}

// ParseClaim reads "lhs REL rhs": the text must contain exactly one
// relation, outside all parentheses, and each side must be a formula.
// Errors are *ClaimError with the column of the problem in text.
func ParseClaim(text string) (*Claim, error) {
	fail := func(i int, msg, hint string) error {
		return &ClaimError{Text: text, Col: i + 1, Msg: msg, Hint: hint}
	}
	pos, width, rel := -1, 0, ""
	depth := 0
	for i := 0; i < len(text); {
		switch text[i] {
		case '(':
			depth++
		case ')':
			depth--
		case '=', '!':
			if text[i] == '!' && !strings.HasPrefix(text[i:], "!=") {
				break
			}
			return nil, fail(i, fmt.Sprintf("%q is not a relation of a claim", relAt(text[i:])), "an equality or inequation cannot be certified by enclosures; use >=, <=, > or <")
		}
		matched := false
		for _, r := range relations {
			if !strings.HasPrefix(text[i:], r.text) {
				continue
			}
			if depth != 0 {
				return nil, fail(i, "relation inside parentheses", claimHint)
			}
			if pos >= 0 {
				return nil, fail(i, "more than one relation", "write a chain a < b < c as two claims")
			}
			if strings.HasPrefix(text[i+len(r.text):], "=") {
				return nil, fail(i, fmt.Sprintf("%q is not a relation", r.text+"="), claimHint)
			}
			pos, width, rel = i, len(r.text), r.rel
			i += len(r.text)
			matched = true
			break
		}
		if !matched {
			i++
		}
	}
	if pos < 0 {
		return nil, fail(0, "no relation", claimHint)
	}
	side := func(start, end int) (*formula.Expr, error) {
		src := text[start:end]
		if strings.TrimSpace(src) == "" {
			at := start
			if start == 0 {
				at = pos
			}
			return nil, fail(at, "missing expression", claimHint)
		}
		e, err := formula.Parse(src)
		if err != nil {
			var se *formula.SyntaxError
			if errors.As(err, &se) {
				return nil, &ClaimError{Text: text, Col: start + se.Col, Msg: se.Msg, Hint: se.Hint}
			}
			return nil, fail(start, err.Error(), "")
		}
		return e, nil
	}
	lhs, err := side(0, pos)
	if err != nil {
		return nil, err
	}
	rhs, err := side(pos+width, len(text))
	if err != nil {
		return nil, err
	}
	return &Claim{Text: text, LHS: lhs, RHS: rhs, Rel: rel}, nil
}

// relAt returns the relation-like token at the start of s ("=", "==",
// "=>", "=<" or "!=").
func relAt(s string) string {
	if len(s) >= 2 && strings.ContainsAny(s[1:2], "=<>") {
		return s[:2]
	}
	return s[:1]
}

// Vars returns the sorted free names of both sides (not pi or e).
func (c *Claim) Vars() []string {
	v := append(c.LHS.Vars(), c.RHS.Vars()...)
	slices.Sort(v)
	return slices.Compact(v)
}

// StandardNames returns the names every claim may use besides pi, e and the
// problem's parameters: lambda1..lambda20, gap, D, area, perimeter,
// inradius (triangles: 2·area/perimeter), alpha.
func StandardNames() []string {
	names := make([]string, 0, MaxEigenvalueName+6)
	for k := 1; k <= MaxEigenvalueName; k++ {
		names = append(names, "lambda"+strconv.Itoa(k))
	}
	return append(names, "gap", "D", "area", "perimeter", "inradius", "alpha")
}

// Check returns a *ClaimError for the first name of the claim that is
// neither a standard name (StandardNames) nor one of params, with its column
// in the claim text; nil if every name is known. Whether a known name has a
// value for a given problem is decided by Evaluate.
func (c *Claim) Check(params []string) error {
	known := StandardNames()
	for _, v := range c.Vars() {
		if slices.Contains(known, v) || slices.Contains(params, v) {
			continue
		}
		hint := "known names: lambda1..lambda20, gap, D, area, perimeter, inradius, alpha, pi, e"
		if len(params) > 0 {
			hint += " and the parameters " + strings.Join(params, ", ")
		}
		return &ClaimError{Text: c.Text, Col: nameColumn(c.Text, v), Msg: fmt.Sprintf("unknown name %q", v), Hint: hint}
	}
	return nil
}

// nameColumn returns the 1-based column of the first occurrence of name as
// a whole identifier in text (1 if not found).
func nameColumn(text, name string) int {
	isIdent := func(b byte) bool {
		return b == '_' || '0' <= b && b <= '9' || 'a' <= b && b <= 'z' || 'A' <= b && b <= 'Z'
	}
	for i := 0; i+len(name) <= len(text); i++ {
		if text[i:i+len(name)] != name {
			continue
		}
		if (i == 0 || !isIdent(text[i-1])) && (i+len(name) == len(text) || !isIdent(text[i+len(name)])) {
			return i + 1
		}
	}
	return 1
}

// Evaluate encloses d = lhs − rhs over the box env (interval arithmetic,
// package interval/formula) and decides the claim for every point of env:
//
//	>=: holds if d ≥ 0 on all of it (Lo ≥ 0), fails if d < 0 (Hi < 0)
//	>:  holds if Lo > 0, fails if Hi ≤ 0
//	<=: holds if Hi ≤ 0, fails if Lo > 0
//	<:  holds if Hi < 0, fails if Lo ≥ 0
//
// and "undecided" otherwise. Sound because the enclosure contains the value
// of lhs − rhs at every point of env. Evaluate is total: a side that cannot
// be enclosed (a name without a value, a function outside its domain) gives
// "undecided" with Margin (−Infinity, Infinity) and the cause in Reason.
func (c *Claim) Evaluate(env map[string]interval.I) ClaimResult {
	res := ClaimResult{Text: c.Text, Verdict: Undecided}
	l, err := c.LHS.Eval(env)
	if err == nil {
		var r interval.I
		r, err = c.RHS.Eval(env)
		if err == nil {
			d := l.Sub(r)
			res.Margin = NewBound(d, MarginDigits)
			res.Verdict = decide(c.Rel, d)
			return res
		}
	}
	res.Margin = NewBound(interval.Entire(), MarginDigits)
	res.Reason = err.Error()
	return res
}

func decide(rel string, d interval.I) string {
	var holds, fails bool
	switch rel {
	case ">=":
		holds, fails = d.Lo >= 0, d.Hi < 0
	case ">":
		holds, fails = d.Lo > 0, d.Hi <= 0
	case "<=":
		holds, fails = d.Hi <= 0, d.Lo > 0
	case "<":
		holds, fails = d.Hi < 0, d.Lo >= 0
	default:
		panic("certs: unknown relation " + rel)
	}
	switch {
	case holds:
		return Holds
	case fails:
		return Fails
	}
	return Undecided
}
