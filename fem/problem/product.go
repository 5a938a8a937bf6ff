package problem

import (
	"encoding/json"
	"fmt"
	"math/big"
	"slices"
	"strings"

	"gapcert/fem/boundary"
	"gapcert/interval"
	"gapcert/interval/decimalio"
	"gapcert/interval/formula"
)

// This file reads product domains, Ω = Ω_1 × … × Ω_F with each factor an
// interval or a polygon, and gives their geometry and the problems of the
// factors (separation of variables; the theorem is in package
// gapcert/certs/certify, which certifies products).
//
// The coordinates of Ω are those of the factors, concatenated in order: a
// polygon (x, y) × an interval gives (x, y, z); three intervals give a box
// (x, y, z); at most four coordinates (x, y, z, w). The faces of Ω are the
// sets ∂Ω_i-side × (the other factors): every side of every factor gives
// one face, and Problem.Boundary lists them factor by factor (sides of
// factor 1, then of factor 2, …), except that a product of two intervals,
// a rectangle, is also stored as the polygon it is (Vertices
// counterclockwise from (a1, a2), Boundary in its edge order: bottom,
// right, top, left), so that every polygon routine applies to it.

// maxCoordinates is the largest number of coordinates of a product.
const maxCoordinates = 4

// coordinateNames are the names of the coordinates, in order.
var coordinateNames = []string{"x", "y", "z", "w"}

// Coordinates returns the names of the coordinates of a domain with dim
// coordinates (1 ≤ dim ≤ 4): x; x, y; x, y, z; x, y, z, w. It panics
// outside that range.
func Coordinates(dim int) []string {
	if dim < 1 || dim > maxCoordinates {
		panic(fmt.Sprintf("problem: no coordinates for dimension %d", dim))
	}
	return slices.Clone(coordinateNames[:dim])
}

// isCoordinate reports whether name is a coordinate of a domain with dim
// coordinates (x and y when dim is unknown, 0).
func isCoordinate(name string, dim int) bool {
	if dim < 2 {
		return name == "x" || name == "y" && dim == 0
	}
	return slices.Contains(coordinateNames[:min(dim, maxCoordinates)], name)
}

// product is the product structure of a Problem.
type product struct {
	// factors are the factors as lone problems: Dim, Interval or
	// Vertices (counterclockwise) and Boundary; their Params are the
	// product's and their Potential is unset.
	factors []*Problem
	paths   []string // each factor's JSON path, "domain.product[i]"
	// parts are the canonical texts of V_i, the part of V of each factor
	// in the factor's own coordinates (x, or x and y), parameters
	// unbound, such that V = V_1(factor 1's coordinates) + … exactly
	// (formula.Summands); nil when V is not such a sum, and then mixed
	// names a term that mixes the coordinates of two factors.
	parts []string
	mixed string
}

const productHint = `write "product": [{"polygon": [["0","0"], ["1","0"], ["0","1"]]}, {"interval": ["0","1"]}]`

// product reads "domain.product": a list of at least two factors, each
// {"interval": …} or {"polygon": …}, with at most four coordinates in all.
func (r *reader) product(n *node, p *Problem) bool {
	const path = "domain.product"
	if n.kind != kindArray {
		r.iss.add(path, "a product is a list of factors, not "+n.kind.String(), productHint)
		return false
	}
	if len(n.vals) < 2 {
		r.iss.addf(path, "a product needs at least two factors; give a lone interval or polygon as the domain itself", "product has %d factor(s)", len(n.vals))
		return false
	}
	if len(n.vals) > maxCoordinates {
		r.iss.addf(path, "a product has at most four coordinates", "product has %d factors", len(n.vals))
		return false
	}
	pr := &product{}
	p.product = pr
	ok := true
	dim := 0
	for i, f := range n.vals {
		fp := fmt.Sprintf("%s[%d]", path, i)
		sub := &Problem{Params: p.Params, Eigenvalues: DefaultEigenvalues}
		pr.factors = append(pr.factors, sub)
		pr.paths = append(pr.paths, fp)
		if f.kind != kindObject {
			r.iss.add(fp, "a factor is an object, not "+f.kind.String(), `write {"interval": ["0", "1"]} or {"polygon": […]}`)
			ok = false
			continue
		}
		r.checkKeys(f, fp, []string{"interval", "polygon"})
		iv, pg := f.get("interval"), f.get("polygon")
		switch {
		case iv != nil && pg != nil:
			r.iss.add(fp, "a factor has both an interval and a polygon", "give exactly one of them")
			ok = false
		case iv == nil && pg == nil:
			if len(f.keys) == 0 {
				r.iss.add(fp, "empty factor", `write {"interval": ["0", "1"]} or {"polygon": […]}`)
			}
			ok = false
		case iv != nil:
			ok = r.interval(iv, sub, fp+".interval") && ok
		default:
			ok = r.vertices(pg, sub, fp+".polygon") && ok
		}
		if sub.Dim == 0 {
			sub.Dim = -1 // unknown: not read
		}
		dim += sub.Dim
	}
	for _, f := range pr.factors {
		if f.Dim < 0 {
			return false
		}
	}
	if dim > maxCoordinates {
		r.iss.addf(path, "a product has at most four coordinates (x, y, z, w)", "product has %d coordinates", dim)
		return false
	}
	p.Dim = dim
	return ok
}

// productBoundary reads "boundary" of a product: one condition for every
// face, or a list with one entry per factor, each that factor's own
// boundary as a lone interval or polygon takes it. factorsOK reports that
// the factors were read.
func (r *reader) productBoundary(n *node, p *Problem, factorsOK bool) bool {
	const hint = `a product's boundary is a list with one entry per factor, each as the factor alone takes it: ["dirichlet", ["neumann", "dirichlet"]]`
	if n == nil {
		r.iss.add("boundary", "missing boundary conditions", hint)
		return false
	}
	fs := p.product.factors
	if n.kind != kindArray {
		// One condition for every face.
		bc, ok := r.bc(n, "boundary", p.Params)
		if !ok || !factorsOK {
			return false
		}
		for _, f := range fs {
			sides := 2
			if f.Dim == 2 {
				sides = len(f.Vertices)
			}
			f.Boundary = make([]BC, sides)
			for k := range f.Boundary {
				f.Boundary[k] = bc
			}
		}
		return true
	}
	if len(n.vals) != len(fs) {
		r.iss.addf("boundary", hint, "boundary list has %d entries for %d factors", len(n.vals), len(fs))
		return false
	}
	ok := true
	for i, e := range n.vals {
		ok = r.boundaryAt(e, fs[i], factorsOK && fs[i].Dim > 0, fmt.Sprintf("boundary[%d]", i)) && ok
	}
	return ok && factorsOK
}

// productGeometry validates each polygon factor (as a lone polygon, with
// its errors at its own path), then lists the faces' conditions and, for a
// product of two intervals, stores the rectangle as a polygon.
func (r *reader) productGeometry(p *Problem, bcOK bool) bool {
	pr := p.product
	ok := true
	for i, f := range pr.factors {
		if f.Dim == 2 {
			ok = r.polygonAt(f, bcOK, pr.paths[i]+".polygon") && ok
		}
	}
	if !ok {
		return false
	}
	if p.Dim == 2 {
		x, y := pr.factors[0], pr.factors[1]
		p.Vertices = [][2]Number{{x.Interval[0], y.Interval[0]}, {x.Interval[1], y.Interval[0]}, {x.Interval[1], y.Interval[1]}, {x.Interval[0], y.Interval[1]}}
		p.convex = "convex"
		p.triangles = [][3]int{{0, 1, 2}, {0, 2, 3}}
		if bcOK {
			p.Boundary = []BC{y.Boundary[0], x.Boundary[1], y.Boundary[1], x.Boundary[0]}
		}
		return true
	}
	if bcOK {
		for _, f := range pr.factors {
			p.Boundary = append(p.Boundary, f.Boundary...)
		}
	}
	return true
}

// productPotential splits V into the parts of the factors (Separable) and
// checks that each part is defined and finite on its factor (by reading
// the factor's problem). A potential that is not such a sum is refused on
// products of three or four coordinates, which have no element method.
func (r *reader) productPotential(p *Problem) {
	pr := p.product
	e, err := formula.Parse(p.potentialText)
	if err != nil {
		panic("problem: the canonical potential does not parse: " + err.Error())
	}
	owner := map[string]int{} // coordinate name → factor
	c := 0
	for i, f := range pr.factors {
		for range f.Dim {
			owner[coordinateNames[c]] = i
			c++
		}
	}
	terms := make([][]*formula.Expr, len(pr.factors))
	negs := make([][]bool, len(pr.factors))
	summands, negated := e.Summands()
	for k, t := range summands {
		who := -1
		for _, v := range t.Vars() {
			i, coord := owner[v]
			if !coord {
				continue // a parameter
			}
			if who >= 0 && who != i {
				pr.mixed = t.String()
				break
			}
			who = i
		}
		if pr.mixed != "" {
			break
		}
		i := max(who, 0) // constants go to the first factor
		terms[i], negs[i] = append(terms[i], t), append(negs[i], negated[k])
	}
	if pr.mixed != "" {
		if p.Dim > 2 {
			r.iss.addf("potential", "write V as a sum of terms that each use one factor's coordinates (e.g. x^2 + y^2 + z^2), which separates the variables; a non-separable V needs tetrahedral elements, which gapcert does not have yet",
				"the potential is not a sum of functions of each factor's coordinates: the term %s mixes coordinates of two factors", pr.mixed)
		}
		return
	}
	c = 0
	for i, f := range pr.factors {
		local := map[string]string{}
		for k := range f.Dim {
			local[coordinateNames[c]] = coordinateNames[k]
			c++
		}
		part := "0"
		if ts := terms[i]; len(ts) > 0 {
			sum := ts[0]
			if negs[i][0] {
				sum = formula.Neg(sum)
			}
			for k, t := range ts[1:] {
				if negs[i][k+1] {
					sum = formula.Sub(sum, t)
				} else {
					sum = formula.Add(sum, t)
				}
			}
			part = sum.Rename(local).String()
		}
		pr.parts = append(pr.parts, part)
	}
	for i := range pr.factors {
		if _, err := Parse(p.FactorFile(i, DefaultEigenvalues, p.RelWidth.Text)); err != nil {
			pe := err.(*Error)
			for _, is := range pe.Issues {
				r.iss.addf("potential", is.Hint, "the part %s of the potential on factor %d (%s): %s", pr.parts[i], i, pr.paths[i], is.Msg)
			}
		}
	}
}

// IsProduct reports whether the domain is a product of intervals and
// polygons (Factors).
func (p *Problem) IsProduct() bool { return p.product != nil }

// Factors returns the number of factors of a product domain (0 for an
// interval or a polygon).
func (p *Problem) Factors() int {
	if p.product == nil {
		return 0
	}
	return len(p.product.factors)
}

// FactorDim returns the number of coordinates of factor i (1: interval,
// 2: polygon). It panics if p is not a product or i is out of range.
func (p *Problem) FactorDim(i int) int { return p.product.factors[i].Dim }

// Separable reports whether V is a sum V_1 + … + V_F of functions of each
// factor's coordinates, decided exactly from the formula as written: every
// summand of its top-level sums and differences (formula.Summands) uses
// the coordinates of at most one factor (parameters and constants
// anywhere; constant summands go to the first factor). When it is not,
// why names a term that mixes two factors. A polygon or interval is not
// a product and is not separable in this sense (why says so).
func (p *Problem) Separable() (ok bool, why string) {
	switch {
	case p.product == nil:
		return false, "the domain is not a product"
	case p.product.parts == nil:
		return false, fmt.Sprintf("the term %s of the potential mixes coordinates of two factors", p.product.mixed)
	}
	return true, ""
}

// FactorFile returns the problem file (JSON) of factor i of a product with
// a separable potential: the factor's domain and boundary as written in the
// canonical form, its part V_i of the potential in its own coordinates
// (x, or x and y), the product's parameters, the given number of
// eigenvalues (2 … 20) and target relative width (exact text), and the
// name "NAME, factor i". It panics if p is not a separable product.
func (p *Problem) FactorFile(i, eigenvalues int, relWidth string) []byte {
	if p.product == nil || p.product.parts == nil {
		panic("problem: FactorFile of a problem that is not a separable product")
	}
	f := p.product.factors[i]
	return p.loneFile(fmt.Sprintf("%s, factor %d", p.Name, i), f.domainJSON(), bcJSON(f.Boundary), p.product.parts[i], eigenvalues, relWidth)
}

// RectangleFile returns the problem file (JSON) of a product of two
// intervals as the rectangle it is: a polygon counterclockwise from
// (a1, a2) with the conditions of its edges (bottom, right, top, left),
// the same potential, parameters, eigenvalues and target. It panics if p
// is not a product of two intervals.
func (p *Problem) RectangleFile() []byte {
	if p.product == nil || p.Dim != 2 {
		panic("problem: RectangleFile of a problem that is not a product of two intervals")
	}
	var vs [][]string
	for _, v := range p.Vertices {
		vs = append(vs, []string{v[0].Text, v[1].Text})
	}
	return p.loneFile(p.Name+", as a polygon", map[string]any{"polygon": vs}, bcJSON(p.Boundary), p.potentialText, p.Eigenvalues, p.RelWidth.Text)
}

// loneFile writes a problem file from its parts and p's parameters.
func (p *Problem) loneFile(name string, domain map[string]any, bcs []any, potential string, eigenvalues int, relWidth string) []byte {
	params := map[string]string{}
	for k, v := range p.Params {
		params[k] = v.Text
	}
	data, err := json.Marshal(map[string]any{
		"name": name, "domain": domain, "boundary": bcs, "potential": potential,
		"parameters": params, "eigenvalues": eigenvalues,
		"target": map[string]string{"relative_width": relWidth},
	})
	if err != nil {
		panic("problem: " + err.Error())
	}
	return data
}

// domainJSON is the domain of a lone interval or polygon as its canonical
// form writes it.
func (p *Problem) domainJSON() map[string]any {
	if p.Dim == 1 {
		return map[string]any{"interval": []string{p.Interval[0].Text, p.Interval[1].Text}}
	}
	var vs [][]string
	for _, v := range p.Vertices {
		vs = append(vs, []string{v[0].Text, v[1].Text})
	}
	return map[string]any{"polygon": vs}
}

// bcJSON is a list of conditions as the canonical form writes them.
func bcJSON(bcs []BC) []any {
	out := make([]any, len(bcs))
	for i, bc := range bcs {
		if bc.Kind == boundary.Robin {
			out[i] = map[string]string{"robin": bc.Alpha.Text}
		} else {
			out[i] = bc.Kind.String()
		}
	}
	return out
}

// productCanonical returns the JSON value of a part of a product's
// canonical form: "boundary" (one explicit list per factor) or "domain".
func (p *Problem) productCanonical(part string) []byte {
	var v any
	switch part {
	case "boundary":
		var lists []any
		for _, f := range p.product.factors {
			lists = append(lists, bcJSON(f.Boundary))
		}
		v = lists
	default:
		var fs []any
		for _, f := range p.product.factors {
			fs = append(fs, f.domainJSON())
		}
		v = map[string]any{"product": fs}
	}
	data, err := json.Marshal(v)
	if err != nil {
		panic("problem: " + err.Error())
	}
	return data
}

// productPotentialRange encloses the range of V over a product of three
// or four coordinates: the hull of interval evaluations over boxes that
// cover it, each a product of one cell per factor (an interval factor cut
// into rangePieces equal pieces, a polygon factor's triangles by their
// bounding boxes). The hull of enclosures over sets covering the domain
// encloses the range over the domain.
func productPotentialRange(p *Problem) (interval.I, string) {
	var cells [][][]interval.I // per factor, its cells, each one interval per coordinate
	for _, f := range p.product.factors {
		var fc [][]interval.I
		if f.Dim == 1 {
			lo, hi := f.Interval[0].Val.Lo, f.Interval[1].Val.Hi
			edges := []float64{lo}
			for k := 1; k < rangePieces; k++ {
				t := lo + (hi-lo)*float64(k)/rangePieces // a choice: any increasing cut points cover
				if t > edges[len(edges)-1] && t < hi {
					edges = append(edges, t)
				}
			}
			edges = append(edges, hi)
			for k := 0; k+1 < len(edges); k++ {
				fc = append(fc, []interval.I{{Lo: edges[k], Hi: edges[k+1]}})
			}
		} else {
			for _, t := range f.triangles {
				var bx, by interval.I
				for j, q := range t {
					v := f.Vertices[q]
					if j == 0 {
						bx, by = v[0].Val, v[1].Val
					} else {
						bx, by = bx.Hull(v[0].Val), by.Hull(v[1].Val)
					}
				}
				fc = append(fc, []interval.I{bx, by})
			}
		}
		cells = append(cells, fc)
	}
	var rng interval.I
	first := true
	idx := make([]int, len(cells))
	for {
		env := map[string]interval.I{}
		c := 0
		for i, k := range idx {
			for _, v := range cells[i][k] {
				env[coordinateNames[c]] = v
				c++
			}
		}
		r, err := p.Potential.Eval(env)
		if err != nil {
			return interval.I{}, fmt.Sprintf("the potential may be undefined on the box %s: %s", boxText(env, p.Dim), evalReason(err))
		}
		if msg := unbounded(r); msg != "" {
			return interval.I{}, msg + " on the box " + boxText(env, p.Dim)
		}
		if first {
			rng, first = r, false
		} else {
			rng = rng.Hull(r)
		}
		k := 0
		for ; k < len(idx); k++ {
			idx[k]++
			if idx[k] < len(cells[k]) {
				break
			}
			idx[k] = 0
		}
		if k == len(idx) {
			return rng, ""
		}
	}
}

// rangePieces is the number of pieces of an interval factor in
// productPotentialRange.
const rangePieces = 8

func boxText(env map[string]interval.I, dim int) string {
	var parts []string
	for _, c := range coordinateNames[:dim] {
		parts = append(parts, fmt.Sprintf("[%g, %g]", env[c].Lo, env[c].Hi))
	}
	return strings.Join(parts, " × ")
}

// productMeasures returns the enclosures of each factor's measure
// (length, area) and boundary measure (2 for an interval, the number of its
// end points; the perimeter of a polygon) and diameter.
func (p *Problem) productMeasures() (meas, bdry, diam []interval.I) {
	for _, f := range p.product.factors {
		meas = append(meas, f.Area())
		bdry = append(bdry, f.Perimeter())
		diam = append(diam, f.Diameter())
	}
	return meas, bdry, diam
}

// productDiameter encloses the diameter of a product: the distance of two
// points is √(Σ_i |a_i − b_i|²) over the factors' components, and each
// |a_i − b_i| ≤ D_i with equality for some pair, so the diameter is
// √(Σ D_i²).
func (p *Problem) productDiameter() interval.I {
	var s interval.I
	for _, f := range p.product.factors {
		if f.Dim == 1 && f.Interval[0].Rat != nil && f.Interval[1].Rat != nil {
			l := new(big.Rat).Sub(f.Interval[1].Rat, f.Interval[0].Rat)
			s = s.Add(decimalio.FromRat(new(big.Rat).Mul(l, l)))
			continue
		}
		s = s.Add(f.Diameter().Sqr())
	}
	d, _ := s.Sqrt() // s ≥ 0
	return d
}

// Volume encloses the measure of a product of three or four coordinates:
// the product of the factors' lengths and areas (Fubini). It panics on
// other domains (Area is the measure of an interval or a polygon).
func (p *Problem) Volume() interval.I {
	if p.product == nil || p.Dim < 3 {
		panic("problem: Volume of a domain that is not a product of 3 or 4 coordinates")
	}
	meas, _, _ := p.productMeasures()
	v := meas[0]
	for _, m := range meas[1:] {
		v = v.Mul(m)
	}
	return v
}

// SurfaceArea encloses the measure of the boundary of a product of three
// or four coordinates: ∂(A × B) = (∂A × B) ∪ (A × ∂B), which meet in a
// set of lower dimension, so |∂(A × B)| = |∂A|·|B| + |A|·|∂B| (the product
// rule), with |∂I| = 2 for an interval (two end points) and the perimeter
// for a polygon; by induction |∂Ω| = Σ_i |∂Ω_i| Π_{j≠i} |Ω_j|. It panics
// on other domains.
func (p *Problem) SurfaceArea() interval.I {
	if p.product == nil || p.Dim < 3 {
		panic("problem: SurfaceArea of a domain that is not a product of 3 or 4 coordinates")
	}
	meas, bdry, _ := p.productMeasures()
	var s interval.I
	for i := range meas {
		t := bdry[i]
		for j, m := range meas {
			if j != i {
				t = t.Mul(m)
			}
		}
		s = s.Add(t)
	}
	return s
}

// productConvex is the convexity verdict of a product: a product of convex
// sets is convex (for points a, b of the product, each component of
// (1 − t)a + tb lies in its factor), and a product with a non-convex factor
// is not (a segment of that factor leaving it, with the other components
// fixed, leaves the product).
func (p *Problem) productConvex() string {
	verdict := "convex"
	for _, f := range p.product.factors {
		switch f.Convex() {
		case "not convex":
			return "not convex"
		case "undecided":
			verdict = "undecided"
		}
	}
	return verdict
}
