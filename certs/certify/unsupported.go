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
// be certified yet, and nil otherwise. A polyhedron is read and validated
// by package fem/problem (its tetrahedral meshes are package fem/mesh3),
// but the tetrahedral elements that would certify its eigenvalues do not
// exist yet, so Certify, FirstPlan, ApproximateModes and Check refuse it.
func Supported(p *problem.Problem) error {
	if p.Polyhedron != nil {
		return &UnsupportedError{
			Path:   "domain.polyhedron",
			Reason: "polyhedra cannot be certified yet: the tetrahedral elements are not available (the problem file itself is valid)",
			Hint:   "gapcert validate describes the polyhedron; intervals and polygons are certified today",
		}
	}
	return nil
}
