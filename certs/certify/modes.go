package certify

import (
	"fmt"

	"gapcert/certs"
	"gapcert/enclose/band"
	"gapcert/enclose/sparse"
	"gapcert/fem/line"
	"gapcert/fem/problem"
	"gapcert/fem/tri"
	"gapcert/interval/decimalio"
)

// Modes are approximate eigenfunctions of a certified problem, for
// pictures. They are floating-point choices, not part of any proof: the
// trial space of the certificate's method is rebuilt and its lowest
// eigenvectors are computed again in floating point.
type Modes struct {
	Count     int
	Eval      func(k int, x, y float64) float64 // k-th mode (0-based); y is ignored on intervals
	Triangles [][3][2]float64                   // the trial mesh (polygons), vertex midpoints
}

// ApproximateModes returns the first count approximate eigenfunctions of
// the problem on the trial space recorded in the certificate's method.
func ApproximateModes(p *problem.Problem, c *certs.Certificate, count int) (*Modes, error) {
	m, err := decodeMethod(c.Method)
	if err != nil {
		return nil, err
	}
	gamma, err := decimalio.Parse(m.Gamma)
	if err != nil || !gamma.IsPoint() {
		return nil, fmt.Errorf("method.gamma %q is not an exact float64", m.Gamma)
	}
	r := recipe{degree: m.Degree, taylor: m.TaylorOrder, gamma: gamma.Lo, cells: m.Cells,
		refine: m.Refinements, graded: m.GradedLevels}
	if p.Dim == 1 {
		mesh := intervalMesh(p, r.cells)
		pot, err := line.FromExpr(mesh, p.Potential, r.taylor)
		if err != nil {
			return nil, err
		}
		left, right := ends(p)
		space := line.NewLagrange(mesh, r.degree, left, right)
		k, mm := space.AssembleApprox(pot, r.gamma)
		_, vecs, err := band.LowestEigs(k, mm, count)
		if err != nil {
			return nil, err
		}
		return &Modes{Count: count, Eval: func(i int, x, _ float64) float64 { return space.Eval(vecs[i], x) }}, nil
	}
	r.marks = m.AdaptiveMarks
	mesh, err := trialMesh(p, r)
	if err != nil {
		return nil, err
	}
	pot, err := tri.NewPotential(mesh, p.Potential, r.taylor)
	if err != nil {
		return nil, err
	}
	space := tri.NewLagrange(mesh, r.degree, sideConditions(p))
	k, mm := space.AssembleApprox(pot, r.gamma)
	_, vecs, err := sparse.LowestEigs(k, mm, count)
	if err != nil {
		return nil, err
	}
	modes := &Modes{Count: count, Eval: func(i int, x, y float64) float64 { return space.Eval(vecs[i], x, y) }}
	for t := range mesh.Tris {
		var tr [3][2]float64
		for j, v := range mesh.Vertices(t) {
			tr[j] = [2]float64{v[0].Mid(), v[1].Mid()}
		}
		modes.Triangles = append(modes.Triangles, tr)
	}
	return modes, nil
}
