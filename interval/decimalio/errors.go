package decimalio

import "fmt"

// SyntaxError reports text that is not a number this package reads.
type SyntaxError struct {
	Input string // the whole text given
	Col   int    // 1-based byte column of the first bad byte (len(Input)+1 at a premature end)
	Msg   string // what is wrong
	Hint  string // how to write it instead
}

func (e *SyntaxError) Error() string {
	s := fmt.Sprintf("decimalio: %q: column %d: %s", e.Input, e.Col, e.Msg)
	if e.Hint != "" {
		s += " (hint: " + e.Hint + ")"
	}
	return s
}
