package claim

import (
	"errors"
	"fmt"
	"slices"
	"strings"

	"gapcert/interval"
	"gapcert/interval/formula"
)

// MaxLen is the length in bytes of the longest claim text.
const MaxLen = 4000

// The relations of a claim, as recorded in Claim.Rel.
const (
	AtLeast = ">="
	AtMost  = "<="
	Greater = ">"
	Less    = "<"
)

// Claim is a parsed inequality "lhs REL rhs".
type Claim struct {
	Text     string // as written
	LHS, RHS *formula.Expr
	Rel      string // AtLeast, AtMost, Greater or Less
}

// Error reports a claim that cannot be read or names a quantity that is
// not available. Col is the 1-based byte column in Text.
type Error struct {
	Text string
	Col  int
	Msg  string
	Hint string
}

func (e *Error) Error() string {
	s := fmt.Sprintf("claim %q, col %d: %s", e.Text, e.Col, e.Msg)
	if e.Hint != "" {
		s += " (hint: " + e.Hint + ")"
	}
	return s
}

const grammarHint = "write a claim as lhs REL rhs with REL one of >=, <=, >, < (or ≥, ≤), e.g. lambda2 - lambda1 >= 3*pi^2/D^2"

// relations in the order they are matched: two-byte ASCII forms before
// their one-byte prefixes.
var relations = []struct{ text, rel string }{
	{">=", AtLeast}, {"<=", AtMost}, {"≥", AtLeast}, {"≤", AtMost}, {">", Greater}, {"<", Less},
}

// notRelations are relation-like signs a claim may not use.
var notRelations = []string{"==", "=>", "=<", "!=", "≠", "="}

// lookAlikes are signs that look like ≥ and ≤ but are other characters
// (U+2A7E, U+2A7D, U+2267, U+2266).
var lookAlikes = []string{"⩾", "⩽", "≧", "≦"}

// Parse reads "lhs REL rhs" (see the package documentation): the text must
// contain exactly one relation, outside all parentheses, and each side
// must be a formula. Errors are *Error with the column of the defect.
func Parse(text string) (*Claim, error) {
	fail := func(i int, msg, hint string) error {
		return &Error{Text: text, Col: i + 1, Msg: msg, Hint: hint}
	}
	if len(text) > MaxLen {
		return nil, fail(0, fmt.Sprintf("claim too long (%d bytes, at most %d)", len(text), MaxLen), "split it into several claims")
	}
	pos, width, rel := -1, 0, ""
	depth := 0
	for i := 0; i < len(text); {
		switch text[i] {
		case '(':
			depth++
		case ')':
			depth--
		}
		if bad := prefixIn(text[i:], notRelations); bad != "" {
			return nil, fail(i, fmt.Sprintf("%q is not a relation of a claim", bad), "an equality or inequation cannot be decided by enclosures; use >=, <=, > or <")
		}
		if bad := prefixIn(text[i:], lookAlikes); bad != "" {
			return nil, fail(i, fmt.Sprintf("%q is not a relation of a claim", bad), "write >= or ≥ for at least, <= or ≤ for at most")
		}
		r := -1
		for k := range relations {
			if strings.HasPrefix(text[i:], relations[k].text) {
				r = k
				break
			}
		}
		if r < 0 {
			i++
			continue
		}
		if depth != 0 {
			return nil, fail(i, "relation inside parentheses", grammarHint)
		}
		if pos >= 0 {
			return nil, fail(i, "more than one relation", "write a chain a < b < c as two claims")
		}
		pos, width, rel = i, len(relations[r].text), relations[r].rel
		i += width
	}
	if pos < 0 {
		return nil, fail(0, "no relation", grammarHint)
	}
	side := func(start, end int) (*formula.Expr, error) {
		src := text[start:end]
		if strings.TrimSpace(src) == "" {
			at := start
			if start == 0 {
				at = pos
			}
			return nil, fail(at, "missing expression", grammarHint)
		}
		e, err := formula.Parse(src)
		if err != nil {
			var se *formula.SyntaxError
			if errors.As(err, &se) {
				return nil, &Error{Text: text, Col: start + se.Col, Msg: se.Msg, Hint: se.Hint}
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

// prefixIn returns the first element of list that s starts with, or "".
func prefixIn(s string, list []string) string {
	for _, p := range list {
		if strings.HasPrefix(s, p) {
			return p
		}
	}
	return ""
}

// Vars returns the sorted free names of both sides (not pi or e).
func (c *Claim) Vars() []string {
	v := append(c.LHS.Vars(), c.RHS.Vars()...)
	slices.Sort(v)
	return slices.Compact(v)
}

// Margin encloses lhs − rhs over the box env (interval arithmetic, package
// interval/formula): the result contains the value of lhs − rhs at every
// point of env. The error says why a side cannot be enclosed (a name
// without a value, a function outside its domain).
func (c *Claim) Margin(env map[string]interval.I) (interval.I, error) {
	l, err := c.LHS.Eval(env)
	if err != nil {
		return interval.I{}, err
	}
	r, err := c.RHS.Eval(env)
	if err != nil {
		return interval.I{}, err
	}
	return l.Sub(r), nil
}

// Decide decides the claim for every value in an enclosure d of lhs − rhs
// (Margin):
//
//	>=: holds if d ≥ 0 on all of it (Lo ≥ 0), fails if d < 0 (Hi < 0)
//	>:  holds if Lo > 0, fails if Hi ≤ 0
//	<=: holds if Hi ≤ 0, fails if Lo > 0
//	<:  holds if Hi < 0, fails if Lo ≥ 0
//
// and neither otherwise. Sound because d contains every value of
// lhs − rhs.
func (c *Claim) Decide(d interval.I) (holds, fails bool) {
	switch c.Rel {
	case AtLeast:
		return d.Lo >= 0, d.Hi < 0
	case Greater:
		return d.Lo > 0, d.Hi <= 0
	case AtMost:
		return d.Hi <= 0, d.Lo > 0
	case Less:
		return d.Hi < 0, d.Lo >= 0
	}
	panic("claim: unknown relation " + c.Rel)
}
