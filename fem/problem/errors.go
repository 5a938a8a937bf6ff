package problem

import (
	"fmt"
	"strings"
)

// Issue is one defect of a problem file: where it is (a JSON path such as
// "domain.polygon[2]" or "boundary[1].robin"; empty for the file as a
// whole), what is wrong, and a hint on how to fix it.
type Issue struct {
	Path string
	Msg  string
	Hint string
}

// String formats the issue as "path: msg (hint: hint)".
func (is Issue) String() string {
	var b strings.Builder
	if is.Path != "" {
		b.WriteString(is.Path)
		b.WriteString(": ")
	}
	b.WriteString(is.Msg)
	if is.Hint != "" {
		fmt.Fprintf(&b, " (hint: %s)", is.Hint)
	}
	return b.String()
}

// Error is returned by Parse when a problem file is invalid. It lists every
// defect found, grouped by the part of the file it concerns (keys, name,
// parameters, domain, boundary, polygon geometry, potential, eigenvalues,
// target, claims).
type Error struct {
	Issues []Issue
}

// Error returns the issues, one per line.
func (e *Error) Error() string {
	lines := make([]string, len(e.Issues))
	for i, is := range e.Issues {
		lines[i] = is.String()
	}
	return strings.Join(lines, "\n")
}

// issues collects defects while a file is read.
type issues struct {
	list []Issue
}

func (s *issues) add(path, msg, hint string) {
	s.list = append(s.list, Issue{Path: path, Msg: msg, Hint: hint})
}

func (s *issues) addf(path, hint, format string, args ...any) {
	s.add(path, fmt.Sprintf(format, args...), hint)
}

func (s *issues) count() int { return len(s.list) }
