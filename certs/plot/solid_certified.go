package plot

import (
	"errors"
	"fmt"

	"gapcert/certs"
	"gapcert/certs/certify"
	"gapcert/fem/problem"
	"gapcert/fem/problem/strictjson"
)

// certifiedModeUnknowns bounds the trial space of the certificate that
// SolidModesFor solves again for a picture (a choice: the sparse
// subspace iteration on the unit cube took 0.3 s for P_5 on one
// refinement, 1729 unknowns, 5 to 9 s for 7471 unknowns (P_4 on two
// refinements, P_8 on one) and 30 s for 14859 (P_5 on two), measured on 2
// shared cores).
const certifiedModeUnknowns = 8000

// SolidModesFor returns the lowest count approximate eigenfunctions of
// the polyhedron problem p certified by c on the certificate's trial space
// (the degree, refinements and grading its method records: SolidModesOn,
// or on a graded certificate its graded mesh built as the certifier builds
// it, certify.PolyhedronTrialMesh), or, when
// that space has more than certifiedModeUnknowns unknowns, on the
// picture's own smaller space (SolidModesOf). own is nil in the first
// case, and in the second the *TooLargeError that says why. It panics if
// p is not a polyhedron problem.
func SolidModesFor(p *problem.Problem, c *certs.Certificate, count int) (modes *SolidModes, own *TooLargeError, err error) {
	if p.Polyhedron == nil {
		panic("plot: SolidModesFor needs a polyhedron problem")
	}
	var m certify.Method
	if err := strictjson.Decode(c.Method, &m); err != nil {
		return nil, nil, fmt.Errorf("the certificate's method: %v", err)
	}
	if m.Kind != certify.KindPolyhedron || m.Degree < 1 || m.Refinements < 0 {
		return nil, nil, fmt.Errorf("the certificate's method (%s, degree %d, %d refinements) is not a trial space on the polyhedron", m.Kind, m.Degree, m.Refinements)
	}
	if m.GradedLevels > 0 {
		mesh, merr := certify.PolyhedronTrialMesh(p, m.Refinements, m.GradedLevels)
		if merr != nil {
			return nil, nil, fmt.Errorf("the certificate's trial mesh: %v", merr)
		}
		modes, err = solidModesOnMesh(p, mesh, m.Degree, count, certifiedModeUnknowns)
		if modes != nil {
			modes.Levels, modes.Graded = m.Refinements, m.GradedLevels
		}
	} else {
		modes, err = SolidModesOn(p, m.Degree, m.Refinements, count, certifiedModeUnknowns)
	}
	if errors.As(err, &own) {
		modes, err = SolidModesOf(p, count)
	}
	return modes, own, err
}
