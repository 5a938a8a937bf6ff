package certify

import (
	"fmt"

	"gapcert/certs"
	"gapcert/fem/line"
	"gapcert/fem/problem"
	"gapcert/fem/tet"
	"gapcert/fem/tri"
	"gapcert/interval/decimalio"
)

// Modes are approximate eigenfunctions of a certified problem, for
// pictures. They are floating-point choices, not part of any proof: the
// trial space of the certificate's method is rebuilt and its lowest
// eigenvectors are computed again in floating point.
type Modes struct {
	Count     int
	Eval      func(k int, x, y float64) float64    // k-th mode (0-based); y is ignored on intervals; nil on polyhedra
	Eval3     func(k int, x, y, z float64) float64 // polyhedra: k-th mode (0-based) at (x, y, z) (tet.Lagrange.Eval)
	Triangles [][3][2]float64                      // the trial mesh (polygons), vertex midpoints
}

// ApproximateModes returns the first count approximate eigenfunctions of
// the problem on the trial space recorded in the certificate's method.
func ApproximateModes(p *problem.Problem, c *certs.Certificate, count int) (*Modes, error) {
	if err := Supported(p); err != nil {
		return nil, err
	}
	m, err := decodeMethod(c.Method)
	if err != nil {
		return nil, err
	}
	gamma, err := decimalio.Parse(m.Gamma)
	if err != nil || !gamma.IsPoint() {
		return nil, fmt.Errorf("method.gamma %q is not an exact float64", m.Gamma)
	}
	r := recipe{degree: m.Degree, taylor: m.TaylorOrder, gamma: gamma.Lo, cells: m.Cells,
		refine: m.Refinements, graded: m.GradedLevels, marks: m.AdaptiveMarks}
	if p.Polyhedron != nil && (r.refine < 0 || r.refine > maxPolyhedronRefine || r.degree < 1 || r.degree > maxPolyhedronDegree) {
		return nil, fmt.Errorf("method: degree %d or refinements %d out of range on polyhedra", r.degree, r.refine)
	}
	if p.Polyhedron != nil {
		if err := polyhedronGradingError(p, r.graded); err != nil {
			return nil, err
		}
	}
	trial, err := discretisationOf(p).trial(r, &outcome{})
	if err != nil {
		return nil, err
	}
	vecs, err := trial.ApproxEigenvectors(count, r.gamma)
	if err != nil {
		return nil, err
	}
	if t, ok := trial.(*line.Trial); ok {
		return &Modes{Count: count, Eval: func(i int, x, _ float64) float64 { return t.Space.Eval(vecs[i], x) }}, nil
	}
	if t, ok := trial.(*tet.Trial); ok {
		return &Modes{Count: count, Eval3: func(i int, x, y, z float64) float64 { return t.Space.Eval(vecs[i], x, y, z) }}, nil
	}
	space := trial.(*tri.Trial).Space
	modes := &Modes{Count: count, Eval: func(i int, x, y float64) float64 { return space.Eval(vecs[i], x, y) }}
	mesh := space.Mesh()
	for t := range mesh.Tris {
		var tr [3][2]float64
		for j, v := range mesh.Vertices(t) {
			tr[j] = [2]float64{v[0].Mid(), v[1].Mid()}
		}
		modes.Triangles = append(modes.Triangles, tr)
	}
	return modes, nil
}
