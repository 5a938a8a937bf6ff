package plot

import (
	"encoding/json"
	"fmt"
	"math"

	"gapcert/certs"
	"gapcert/certs/certify"
	"gapcert/fem/boundary"
	"gapcert/fem/problem"
	"gapcert/fem/problem/strictjson"
)

// ProductPolyhedron returns the polyhedron problem of the domain of a
// three-dimensional product with a separable potential, for its
// pictures: a box (three intervals) or a prism (a polygon and an
// interval, in either order), with the exact vertices of the factors
// (their texts), one face per facet of a factor times the other factors,
// each with the condition that the product gives it (the factor's
// condition on that facet), the product's name and parameters, and no
// potential (the pictures of a product draw only its domain; its modes
// are ProductModes). Its faces are: the two ends of the prism's axis
// (the interval factor across the polygon, or the last interval of a
// box: its start, then its end), then one per side of the polygon (for a
// box, the rectangle of its first two intervals, counterclockwise from
// its lowest-left corner). The polyhedron reader validates it again.
//
// It returns an error, saying why, for a product that is not three
// dimensional or whose potential is not separable (the factors' problems
// need the split; the problem reader refuses such a product today); it
// panics if p is not a product.
func ProductPolyhedron(p *problem.Problem) (*problem.Problem, error) {
	if !p.IsProduct() {
		panic("plot: ProductPolyhedron needs a product problem")
	}
	if p.Dim != 3 {
		return nil, fmt.Errorf("a product with %d coordinates is not drawn: pictures show three-dimensional products (a box of three intervals, a prism of a polygon and an interval)", p.Dim)
	}
	if ok, why := p.Separable(); !ok {
		return nil, fmt.Errorf("a product whose potential is not separable is not drawn (%s)", why)
	}
	factors := make([]*problem.Problem, p.Factors())
	for i := range factors {
		f, err := problem.Parse(p.FactorFile(i, 2, p.RelWidth.Text))
		if err != nil {
			return nil, fmt.Errorf("factor %d: %v", i, err)
		}
		factors[i] = f
	}
	// The prism over the polygon base (u, v) along w, with axes[c] the
	// coordinate of u, v, w (a cyclic order of x, y, z: right-handed).
	var base [][2]string
	var sides []problem.BC
	var axis *problem.Problem
	var axes [3]int
	switch {
	case len(factors) == 3:
		fx, fy := factors[0], factors[1]
		x, y := fx.Interval, fy.Interval
		base = [][2]string{{x[0].Text, y[0].Text}, {x[1].Text, y[0].Text}, {x[1].Text, y[1].Text}, {x[0].Text, y[1].Text}}
		sides = []problem.BC{fy.Boundary[0], fx.Boundary[1], fy.Boundary[1], fx.Boundary[0]}
		axis, axes = factors[2], [3]int{0, 1, 2}
	case factors[0].Dim == 2:
		base, sides = polygonTexts(factors[0]), factors[0].Boundary
		axis, axes = factors[1], [3]int{0, 1, 2}
	default:
		base, sides = polygonTexts(factors[1]), factors[1].Boundary
		axis, axes = factors[0], [3]int{1, 2, 0}
	}
	n := len(base)
	var vertices [][3]string
	for _, w := range axis.Interval {
		for _, q := range base {
			var v [3]string
			v[axes[0]], v[axes[1]], v[axes[2]] = q[0], q[1], w.Text
			vertices = append(vertices, v)
		}
	}
	faces := [][]int{make([]int, n), make([]int, n)}
	for i := range n {
		faces[0][i] = n - 1 - i // the start of the axis, seen from outside
		faces[1][i] = n + i
		faces = append(faces, []int{i, (i + 1) % n, n + (i+1)%n, n + i})
	}
	var bcs []any
	for _, bc := range append([]problem.BC{axis.Boundary[0], axis.Boundary[1]}, sides...) {
		if bc.Kind == boundary.Robin {
			bcs = append(bcs, map[string]string{"robin": bc.Alpha.Text})
		} else {
			bcs = append(bcs, bc.Kind.String())
		}
	}
	params := map[string]string{}
	for k, v := range p.Params {
		params[k] = v.Text
	}
	data, err := json.Marshal(map[string]any{
		"name":       p.Name,
		"domain":     map[string]any{"polyhedron": map[string]any{"vertices": vertices, "faces": faces}},
		"boundary":   bcs,
		"parameters": params,
	})
	if err != nil {
		panic("plot: " + err.Error())
	}
	ph, err := problem.Parse(data)
	if err != nil {
		return nil, fmt.Errorf("the product as a polyhedron: %v", err)
	}
	return ph, nil
}

// polygonTexts returns the exact texts of the vertices of a polygon
// problem (counterclockwise, as the reader stores them).
func polygonTexts(f *problem.Problem) [][2]string {
	out := make([][2]string, len(f.Vertices))
	for i, v := range f.Vertices {
		out[i] = [2]string{v[0].Text, v[1].Text}
	}
	return out
}

// ProductModes are approximate eigenfunctions of λ1 and λ2 of a certified
// product, for pictures (floating-point choices, never part of a proof).
// With a separable potential they are products of the factors'
// approximate eigenfunctions: the form is exact (separation of variables:
// a product of factor eigenfunctions is an eigenfunction of the product
// with the sum of their eigenvalues), the factors' eigenvectors are
// approximations. A product of two intervals certified as the rectangle it
// is has the rectangle's approximate eigenfunctions.
type ProductModes struct {
	// Second is the factor whose second eigenfunction enters the mode of
	// λ2 (the others give their first): the factor whose certified gap
	// has the least midpoint (a choice; when gaps tie, λ2 is multiple and
	// this is one of its eigenfunctions). It is −1 for a rectangle.
	Second int
	// Triangles is the rectangle's trial mesh (vertex midpoints), nil for
	// products of factor modes.
	Triangles [][3][2]float64

	dims  []int
	modes []*certify.Modes
}

// ProductModesOf returns the approximate eigenfunctions of λ1 and λ2 of
// the product p from its certificate c. For sums of the factors'
// eigenvalues, each factor's certificate (stored in c's method) gives its
// first two approximate eigenfunctions on its certified trial space
// (certify.ApproximateModes); the mode of λ1 is the product of the
// factors' first, the mode of λ2 that with factor Second's second
// eigenfunction instead. For a rectangle, they are the rectangle's, on
// its certified trial space. It panics if p is not a product.
func ProductModesOf(p *problem.Problem, c *certs.Certificate) (*ProductModes, error) {
	if !p.IsProduct() {
		panic("plot: ProductModesOf needs a product problem")
	}
	var pm certify.ProductMethod
	if err := strictjson.Decode(c.Method, &pm); err != nil {
		return nil, fmt.Errorf("the product's method: %v", err)
	}
	rectangle := pm.Combination == certify.CombineRectangle
	if pm.Kind != certify.KindProduct || !rectangle && (pm.Combination != certify.CombineSums || len(pm.Factors) != p.Factors()) ||
		rectangle && len(pm.Factors) != 1 {
		return nil, fmt.Errorf("the product's method is neither a combination of %d factors' eigenvalues nor a rectangle", p.Factors())
	}
	out := &ProductModes{Second: -1}
	best := math.Inf(1)
	for i, f := range pm.Factors {
		fc, err := certs.Unmarshal(f.Certificate)
		if err != nil {
			return nil, fmt.Errorf("factor %d's certificate: %v", i, err)
		}
		fp, err := problem.Parse(fc.Problem)
		if err != nil {
			return nil, fmt.Errorf("factor %d's problem: %v", i, err)
		}
		count := min(2, len(fc.Results.Eigenvalues))
		if count == 2 && !rectangle {
			l1, err1 := fc.Results.Eigenvalues[0].Bound().Interval()
			l2, err2 := fc.Results.Eigenvalues[1].Bound().Interval()
			if err1 == nil && err2 == nil {
				if g := l2.Mid() - l1.Mid(); g < best {
					best, out.Second = g, i
				}
			}
		}
		m, err := certify.ApproximateModes(fp, fc, count)
		if err != nil {
			return nil, fmt.Errorf("factor %d's approximate eigenfunctions: %v", i, err)
		}
		out.dims = append(out.dims, fp.Dim)
		out.modes = append(out.modes, m)
		if rectangle {
			out.Triangles = m.Triangles
		}
	}
	if out.Second < 0 && !rectangle {
		return nil, fmt.Errorf("no factor's certificate has two eigenvalues")
	}
	return out, nil
}

// Eval returns the approximate eigenfunction of λ_{k+1} (k = 0 or 1) at
// (x, y, z) (z is ignored in two dimensions).
func (m *ProductModes) Eval(k int, x, y, z float64) float64 {
	pt := [3]float64{x, y, z}
	v, at := 1.0, 0
	for i, f := range m.modes {
		j := 0
		if k == 1 && i == m.Second {
			j = 1
		}
		if m.dims[i] == 1 {
			v *= f.Eval(j, pt[at], 0)
		} else {
			v *= f.Eval(j, pt[at], pt[at+1])
		}
		at += m.dims[i]
	}
	return v
}
