package formula

import (
	"fmt"

	"gapcert/interval"
)

// SyntaxError reports text that is not a formula. Col is the 1-based byte
// column in Src where the problem was found.
type SyntaxError struct {
	Src  string
	Col  int
	Msg  string
	Hint string
}

func (e *SyntaxError) Error() string {
	if e.Hint == "" {
		return fmt.Sprintf("col %d: %s", e.Col, e.Msg)
	}
	return fmt.Sprintf("col %d: %s (%s)", e.Col, e.Msg, e.Hint)
}

// EvalError reports that a sub-expression could not be enclosed over the
// given box, usually because it is not defined on all of it. Err is the
// cause, an *interval.DomainError for domain failures (use errors.As).
type EvalError struct {
	Sub string // canonical text of the failing sub-expression
	Err error
}

func (e *EvalError) Error() string { return fmt.Sprintf("formula: in %s: %v", e.Sub, e.Err) }

func (e *EvalError) Unwrap() error { return e.Err }

// UnboundError reports a free variable that has no value.
type UnboundError struct {
	Name string
}

func (e *UnboundError) Error() string {
	return fmt.Sprintf("formula: no value for variable %q", e.Name)
}

// SmoothnessError reports a function that is not differentiable on all of
// its argument box (abs, min, max whose branch is not decided, sqrt at 0),
// so no derivative or Taylor model exists there.
type SmoothnessError struct {
	Func string
	Arg  interval.I
}

func (e *SmoothnessError) Error() string {
	return fmt.Sprintf("%s: not differentiable on all of the argument [%g, %g]", e.Func, e.Arg.Lo, e.Arg.Hi)
}
