package certify

import (
	"fmt"

	"gapcert/fem/problem"
)

// UnsupportedError is returned, before anything is computed, for a valid
// problem whose kind of domain has no discretisation yet. Path names the
// part of the problem file at fault.
type UnsupportedError struct {
	Path   string
	Reason string
	Hint   string
}

func (e *UnsupportedError) Error() string {
	return fmt.Sprintf("certify: %s: %s (hint: %s)", e.Path, e.Reason, e.Hint)
}

// Supported returns an *UnsupportedError when the problem's domain cannot
// be certified yet, and nil otherwise. Every domain that fem/problem
// accepts (intervals, polygons, polyhedra, products) is certified today; the check
// stays as the one place where a kind of domain without a discretisation
// would be refused before anything is computed.
func Supported(p *problem.Problem) error {
	if p.IsProduct() {
		return nil
	}
	if p.Dim < 1 || p.Dim > 3 || (p.Dim == 3 && p.Polyhedron == nil) {
		return &UnsupportedError{
			Path:   "domain",
			Reason: fmt.Sprintf("a %d-dimensional domain of this kind has no discretisation", p.Dim),
			Hint:   "intervals, polygons and polyhedra are certified",
		}
	}
	return nil
}
