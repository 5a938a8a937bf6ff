package hypothesis

import (
	"fmt"
	"strings"

	"gapcert/certs"
	"gapcert/fem/problem"
	"gapcert/interval"
	"gapcert/interval/algebraic"
)

// CircumsolidPolyhedron is the name under which Circumsolid records its
// decision: the polyhedron is convex and one ball inside it touches every
// face.
const CircumsolidPolyhedron = "circumsolid"

// Circumsolid decides whether the polyhedron of p is a circumsolid: convex,
// with a closed ball B ⊆ P that meets every facet (the three-dimensional
// analogue of a tangential polygon, see Tangential; the faces of the file
// that share a plane are parts of one facet, P ∩ H, H their plane).
//
// Characterisation used. Let P be a convex polyhedron with faces F_f,
// N_f = Σ_i v_i × v_{i+1} over the vertex cycle of F_f (outward, so
// N_f = 2·area(F_f)·n_f with n_f the outward unit normal; the shoelace
// formula in space, common practice), p_f a vertex of F_f, H_f its plane,
// and d_f(c) = N_f·(p_f − c)/|N_f| the signed distance of c from H_f,
// positive on the side of P. Then
//
//	P is a circumsolid ⇔ the linear system N_f·c + |N_f|·r = N_f·p_f
//	(every face f) in the unknowns c ∈ R³, r ∈ R has a solution,
//
// and the solution is then the centre c and the inradius r = 3|P|/|∂P|.
// Proof. (⇒) Let B (centre c, radius ρ) lie in P and meet every facet.
// B lies in the inner half-space of every H_f, so d_f(c) ≥ ρ; a point t
// of B on H_f has d_f(c) ≤ |c − t| ≤ ρ. So d_f(c) = ρ for every f, which
// is the equation of f with r = ρ. (⇐) For every c,
// Σ_f |N_f|·d_f(c) = Σ_f N_f·p_f − (Σ_f N_f)·c = 6|P|: the vector areas
// of a closed surface sum to 0, and Σ_f N_f·p_f = 2∫_∂P x·n dS = 6|P|
// (the divergence theorem for the fields e_k and x, common practice).
// With Σ_f |N_f| = 2|∂P|, a solution has r = 3|P|/|∂P| > 0, and
// d_f(c) = r for every f. The closed ball B of radius r about c lies in
// every inner half-space and so in P (a convex polyhedron is the
// intersection of the inner half-spaces of its faces), and the foot
// t_f = c + r·n_f lies on H_f and in B ⊆ P, so in the facet P ∩ H_f. ∎
//
// Deciding the system. Four faces whose rows (N_f, |N_f|) are linearly
// independent fix (c, r) (they exist for a bounded polyhedron: if every
// (n_f, 1) were orthogonal to some (a, β) ≠ 0, then summing
// area_f·(a·n_f + β) = 0 over the faces gives β|∂P| = 0, so a ≠ 0 is
// orthogonal to every facet normal; but at a point of P where a·x is
// largest, a lies in the cone of the normals of the facets there, so
// |a|² = 0). Four such faces are chosen in floating point and their
// independence is verified by the enclosure of the 4×4 determinant; then
// face j is satisfied if and only if the 5×5 determinant D_j of the
// augmented rows (N_f, |N_f|, N_f·p_f) of the four and of j vanishes
// (by the Schur complement, D_j is the 4×4 determinant times the residual
// of row j). Expanding D_j along the |N| column, D_j = ±Σ_p ±|N_{k_p}|·M_p
// with 4×4 minors M_p of the columns N and N·p: a sum of square roots
// with coefficients in the field of the coordinates, decided as in
// Tangential (sqrtSumZero): exactly for coordinates read as surds or in
// one cyclotomic field, where D_j = 0 proves and D_j ≠ 0 disproves; for
// other coordinates only D_j ≠ 0 is decided, from enclosures, so a
// circumsolid with such coordinates is undecided, never guessed. A
// polyhedron that is not convex is disproven (a circumsolid is convex by
// definition) with the witness of convex_domain.
func Circumsolid(p *problem.Problem) certs.Hypothesis {
	h := certs.Hypothesis{Name: CircumsolidPolyhedron}
	switch c := convexPolyhedron(p); c.Verdict {
	case certs.Disproven:
		return disproven(h, "not convex, and a circumsolid is convex by definition: "+c.Detail, c.Witness)
	case certs.Undecided:
		return undecidedAt(h, "cannot decide convexity: "+c.Detail)
	}
	ph := p.Polyhedron
	var s incentreSolution
	exact := true
	if v, ok := surdVertices(spacePoints(ph.Vertices)); ok {
		s = solveIncentre(faceRows(v, ph.Faces), algebraic.Surd.Enclose, sqrtSumZero)
	} else if v, ok := cycVertices(spacePoints(ph.Vertices)); ok {
		s = solveIncentre(faceRows(v, ph.Faces), algebraic.Cyclotomic.Enclose, sqrtSumZero)
	} else {
		identity := func(x interval.I) interval.I { return x }
		s, exact = solveIncentre(faceRows(enclosedPoints(ph.Vertices), ph.Faces), identity, enclosedSqrtSumZero), false
	}
	basis := fmt.Sprintf("the ball tangent to the planes of faces %d, %d, %d and %d", s.basis[0], s.basis[1], s.basis[2], s.basis[3])
	switch {
	case s.noBasis:
		return undecidedAt(h, "no four faces with verified independent equations were found")
	case s.bad >= 0:
		return disproven(h, fmt.Sprintf("the plane of face %d is not tangent to %s", s.bad, basis), &certs.Witness{Side: intPtr(s.bad)})
	case s.undecided >= 0:
		why := "cannot decide whether the plane of face %d is tangent to %s: an equality, which enclosures cannot show (coordinates built from rationals, square roots of rationals and cos, sin of rational multiples of pi are decided exactly)"
		if exact {
			why = "cannot decide whether the plane of face %d is tangent to %s"
		}
		return undecidedAt(h, fmt.Sprintf(why, s.undecided, basis))
	}
	if len(ph.Faces) == 4 {
		// No equation beyond the four of the basis: nothing was decided,
		// exactly or by enclosures (common practice geometry).
		return proven(h, fmt.Sprintf("a tetrahedron, and every tetrahedron has a ball tangent to the planes of its four faces inside it; its radius 3·volume/surface area ∈ %v", insphereRadius(ph)))
	}
	return proven(h, fmt.Sprintf("convex, and %s is tangent to the planes of all %d faces (decided exactly); its radius 3·volume/surface area ∈ %v", basis, len(ph.Faces), insphereRadius(ph)))
}

// insphereRadius encloses 3|P|/|∂P|, the radius of the inscribed ball of
// a circumsolid (see Circumsolid).
func insphereRadius(ph *problem.Polyhedron) interval.I {
	return ph.Volume().MulF(3).Div(ph.SurfaceArea())
}

// incentreRow is one equation a·c + √s·r = b in the unknowns c ∈ R³ and
// r ∈ R.
type incentreRow[T any] struct {
	a    [3]T
	s, b T
}

// faceRows returns the equation of each face: a = N_f, s = N_f·N_f,
// b = N_f·p_f (see Circumsolid).
func faceRows[T ring[T]](v [][]T, faces [][]int) []incentreRow[T] {
	out := make([]incentreRow[T], len(faces))
	for f, face := range faces {
		n := areaVector(v, face)
		out[f] = incentreRow[T]{a: n, s: dot(n, n), b: dot(n, point3(v[face[0]]))}
	}
	return out
}

// areaVector returns N = Σ_i v_i × v_{i+1} over the cycle face: twice
// the vector area of a planar polygon.
func areaVector[T ring[T]](v [][]T, face []int) [3]T {
	n := cross(point3(v[face[0]]), point3(v[face[1]]))
	for i := 1; i < len(face); i++ {
		c := cross(point3(v[face[i]]), point3(v[face[(i+1)%len(face)]]))
		n = [3]T{n[0].Add(c[0]), n[1].Add(c[1]), n[2].Add(c[2])}
	}
	return n
}

func point3[T any](x []T) [3]T { return [3]T{x[0], x[1], x[2]} }

// enclosedPoints returns the enclosures of the vertices.
func enclosedPoints(vs [][3]problem.Number) [][]interval.I {
	out := make([][]interval.I, len(vs))
	for i, v := range vs {
		out[i] = []interval.I{v[0].Val, v[1].Val, v[2].Val}
	}
	return out
}

// enclosedSqrtSumZero decides from enclosures only that Σ c_p·√s_p ≠ 0.
func enclosedSqrtSumZero(c, s []interval.I) (zero, ok bool) {
	var d interval.I
	for p := range c {
		l, _ := s[p].Max(interval.Point(0)).Sqrt() // s_p ≥ 0 exactly
		d = d.Add(c[p].Mul(l))
	}
	return false, !d.ContainsZero()
}

// incentreSolution is the outcome of solveIncentre: the rows of basis fix
// (c, r); bad is a row that contradicts them (−1 if none), undecided a row
// whose consistency is not decided (−1 if none); noBasis reports that no
// four rows were verified independent.
type incentreSolution struct {
	basis          [4]int
	bad, undecided int
	noBasis        bool
}

// maxBasisTries bounds the 4-subsets of rows tried as a basis.
const maxBasisTries = 20000

// solveIncentre decides whether the rows have a common solution: it
// chooses four rows whose coefficient determinant det[a_k, √s_k] is
// verified ≠ 0 by enclosures, then decides for every other row j whether
// the augmented 5×5 determinant Σ_p c_p·√s_p vanishes (zero). T is an
// exact field or the enclosures of package interval.
func solveIncentre[T ring[T]](rows []incentreRow[T], enclose func(T) interval.I, zero func(c, s []T) (bool, bool)) incentreSolution {
	out := incentreSolution{bad: -1, undecided: -1}
	basis, ok := chooseIncentreBasis(rows, enclose)
	if !ok {
		out.noBasis = true
		return out
	}
	out.basis = basis
	for j := range rows {
		if j == basis[0] || j == basis[1] || j == basis[2] || j == basis[3] {
			continue
		}
		ks := [5]int{basis[0], basis[1], basis[2], basis[3], j}
		var c, s [5]T
		for p := range 5 {
			var m [4][4]T
			r := 0
			for q, k := range ks {
				if q == p {
					continue
				}
				m[r] = [4]T{rows[k].a[0], rows[k].a[1], rows[k].a[2], rows[k].b}
				r++
			}
			c[p], s[p] = det4(m), rows[ks[p]].s
			if p%2 == 1 {
				c[p] = c[p].Neg()
			}
		}
		switch isZero, decided := zero(c[:], s[:]); {
		case decided && !isZero:
			out.bad = j
			return out
		case !decided && out.undecided < 0:
			out.undecided = j
		}
	}
	return out
}

// chooseIncentreBasis returns the first four rows, in lexicographic order
// of their indices, whose coefficient determinant det[a_k, √s_k] has an
// enclosure without 0.
func chooseIncentreBasis[T ring[T]](rows []incentreRow[T], enclose func(T) interval.I) ([4]int, bool) {
	n := len(rows)
	e := make([][4]interval.I, n)
	for k, r := range rows {
		l, _ := enclose(r.s).Max(interval.Point(0)).Sqrt() // s ≥ 0 exactly
		e[k] = [4]interval.I{enclose(r.a[0]), enclose(r.a[1]), enclose(r.a[2]), l}
	}
	tries := 0
	for i := 0; i < n; i++ {
		for j := i + 1; j < n; j++ {
			for k := j + 1; k < n; k++ {
				for l := k + 1; l < n; l++ {
					if tries++; tries > maxBasisTries {
						return [4]int{}, false
					}
					if !det4([4][4]interval.I{e[i], e[j], e[k], e[l]}).ContainsZero() {
						return [4]int{i, j, k, l}, true
					}
				}
			}
		}
	}
	return [4]int{}, false
}

// det4 returns the determinant of m by expansion along the first row.
func det4[T ring[T]](m [4][4]T) T {
	var out T
	for c := range 4 {
		var minor [3][3]T
		for r := 1; r < 4; r++ {
			k := 0
			for cc := range 4 {
				if cc != c {
					minor[r-1][k] = m[r][cc]
					k++
				}
			}
		}
		t := m[0][c].Mul(det3(minor))
		switch {
		case c == 0:
			out = t
		case c%2 == 1:
			out = out.Sub(t)
		default:
			out = out.Add(t)
		}
	}
	return out
}

// polyhedronProduct is ProductOfCircumsolids on a polyhedron P.
//
// Classification used. After a rigid motion, a product of circumsolids of
// total dimension three is one of: a three-dimensional circumsolid; a
// two-dimensional circumsolid (a tangential polygon, see
// ProductOfCircumsolids) times an interval; or a product of three
// intervals, a box (the dimensions of the factors add up to three:
// 3 = 2 + 1 = 1 + 1 + 1; the one-dimensional circumsolids are the
// intervals). The last two are the right prisms P = Q × [0, h] over a
// polygon Q that is tangential or a rectangle (a box is the right prism
// over a rectangle).
//
// Right prisms, decided exactly. A face A of the convex polyhedron P,
// with no other face in its plane (so A is a facet, a convex polygon), is
// the base of a right prism P = A + [0, 1]t when P has 2n vertices (n
// those of A) and some t with t × N_A = 0 maps each vertex of A to a
// vertex of P outside A: then the vertices of P are those of A and of
// A + t, and P, the convex hull of its vertices (a convex polytope is the
// hull of its extreme points, which are among the vertices of its faces),
// is conv(A ∪ (A + t)) = A + [0, 1]t, a right prism since t ⊥ A. Its
// base A is a rectangle when it has four vertices, all corners right
// (exact zero tests); it is tangential when the system of Circumsolid
// written for the faces whose normals are orthogonal to N_A (the lateral
// faces, whose planes contain the lines of A's sides and the direction t,
// with outward normals the in-plane outward normals of the sides) and the
// equation N_A·c = N_A·p_A of A's plane (s = 0) has a solution: for c on
// that plane the distance to a lateral plane is the distance within the
// plane to the side's line, so the system is Tangential's system of A in
// an orthonormal frame of its plane, solvable if and only if A is
// tangential (every triangle is).
//
// Verdicts. Proven when P is a circumsolid, or the right prism over a
// face that is tangential or a rectangle. Disproven when P is not convex
// (products of convex sets are convex), or when P is not a circumsolid,
// no two faces share a plane, and every face that is a right prism's base
// is decided neither tangential nor a rectangle: with no two faces in one
// plane the faces are the facets and every vertex is an extreme point
// (a corner of a convex facet), so a right prism Q × [0, h] has the
// facets Q × {0}, Q × {h} among the faces and is found by the test above
// with A = Q × {0}. Undecided otherwise, with the reasons.
func polyhedronProduct(h certs.Hypothesis, p *problem.Problem) certs.Hypothesis {
	switch c := convexPolyhedron(p); c.Verdict {
	case certs.Disproven:
		return disproven(h, "not convex, and a product of circumsolids is convex: "+c.Detail, c.Witness)
	case certs.Undecided:
		return undecidedAt(h, "cannot decide convexity: "+c.Detail)
	}
	c := Circumsolid(p)
	if c.Verdict == certs.Proven {
		return proven(h, "a circumsolid: "+c.Detail)
	}
	ph := p.Polyhedron
	var prisms prismFinding
	if v, ok := surdVertices(spacePoints(ph.Vertices)); ok {
		prisms = findPrisms(v, ph.Faces)
	} else if v, ok := cycVertices(spacePoints(ph.Vertices)); ok {
		prisms = findPrisms(v, ph.Faces)
	} else {
		return undecidedAt(h, fmt.Sprintf("circumsolid: %s (%s); right prisms are decided only for coordinates read exactly (rationals, square roots of rationals, cos and sin of rational multiples of pi)", c.Verdict, c.Detail))
	}
	if prisms.product != "" {
		return proven(h, prisms.product)
	}
	switch {
	case c.Verdict != certs.Disproven:
		return undecidedAt(h, fmt.Sprintf("circumsolid: %s (%s); %s", c.Verdict, c.Detail, prisms.summary()))
	case prisms.coplanar != "":
		return undecidedAt(h, fmt.Sprintf("not a circumsolid (%s), and %s: the faces are not the facets, so right prisms are not ruled out", c.Detail, prisms.coplanar))
	case len(prisms.undecided) > 0:
		return undecidedAt(h, fmt.Sprintf("not a circumsolid (%s); %s", c.Detail, prisms.summary()))
	}
	return disproven(h, fmt.Sprintf("not a circumsolid (%s), and not a right prism over a tangential polygon or a rectangle (%s)", c.Detail, prisms.summary()), c.Witness)
}

// prismFinding is what findPrisms learns about the right prisms of P.
type prismFinding struct {
	product   string   // the first proven product structure, "" if none
	neither   []string // bases decided neither tangential nor a rectangle
	undecided []string // bases whose shape is not decided
	coplanar  string   // two faces sharing a plane, "" if none
}

func (f prismFinding) summary() string {
	if len(f.neither)+len(f.undecided) == 0 {
		return "no face is the base of a right prism"
	}
	return strings.Join(append(append([]string(nil), f.neither...), f.undecided...), "; ")
}

// findPrisms tests every face of the convex polyhedron with exact
// vertices v as the base of a right prism (see polyhedronProduct).
func findPrisms[T exactField[T]](v [][]T, faces [][]int) prismFinding {
	var out prismFinding
	normals := make([][3]T, len(faces))
	for f, face := range faces {
		normals[f] = areaVector(v, face)
	}
	coplanar := func(f, g int) bool {
		x := cross(normals[f], normals[g])
		d := sub3(point3(v[faces[g][0]]), point3(v[faces[f][0]]))
		return x[0].IsZero() && x[1].IsZero() && x[2].IsZero() && dot(normals[f], d).IsZero()
	}
	for f := range faces {
		for g := f + 1; g < len(faces) && out.coplanar == ""; g++ {
			if coplanar(f, g) {
				out.coplanar = fmt.Sprintf("faces %d and %d lie in one plane", f, g)
			}
		}
	}
	for a, face := range faces {
		alone := true
		for g := range faces {
			alone = alone && (g == a || !coplanar(a, g))
		}
		if !alone || !isPrismBase(v, face, normals[a]) {
			continue
		}
		rect := len(face) == 4 && firstObliqueCorner(pick(v, face)) < 0
		if rect {
			out.product = fmt.Sprintf("a box: the right prism over the rectangle face %d (decided exactly)", a)
			return out
		}
		if len(face) == 3 {
			out.product = fmt.Sprintf("the right prism over the triangle face %d, a tangential polygon (every triangle has an incircle), times an interval", a)
			return out
		}
		var rows []incentreRow[T]
		for g, n := range normals {
			if dot(n, normals[a]).IsZero() {
				rows = append(rows, faceRows(v, faces[g:g+1])[0])
			}
		}
		n := normals[a]
		zero := n[0].Sub(n[0])
		rows = append(rows, incentreRow[T]{a: n, s: zero, b: dot(n, point3(v[face[0]]))})
		s := solveIncentre(rows, func(x T) interval.I { return x.Enclose() }, sqrtSumZero)
		switch {
		case s.noBasis || s.undecided >= 0 && s.bad < 0:
			out.undecided = append(out.undecided, fmt.Sprintf("face %d is the base of a right prism, but whether it is tangential is not decided", a))
		case s.bad >= 0:
			out.neither = append(out.neither, fmt.Sprintf("face %d is the base of a right prism and neither tangential nor a rectangle (decided exactly)", a))
		default:
			out.product = fmt.Sprintf("the right prism over the tangential polygon face %d times an interval (decided exactly)", a)
			return out
		}
	}
	return out
}

// isPrismBase reports whether P (convex, vertices v) is the right prism
// A + [0, 1]t over the face A (vertex indices face, area vector n), by
// the test of polyhedronProduct.
func isPrismBase[T exactField[T]](v [][]T, face []int, n [3]T) bool {
	if len(v) != 2*len(face) {
		return false
	}
	inA := map[int]bool{}
	for _, k := range face {
		inA[k] = true
	}
	for w := range v {
		if inA[w] {
			continue
		}
		t := sub3(point3(v[w]), point3(v[face[0]]))
		if x := cross(t, n); !x[0].IsZero() || !x[1].IsZero() || !x[2].IsZero() {
			continue
		}
		images := map[int]bool{}
		for _, k := range face {
			img := add3(point3(v[k]), t)
			for u := range v {
				if d := sub3(point3(v[u]), img); !inA[u] && d[0].IsZero() && d[1].IsZero() && d[2].IsZero() {
					images[u] = true
					break
				}
			}
		}
		if len(images) == len(face) {
			return true
		}
	}
	return false
}

func pick[T any](v [][]T, idx []int) [][]T {
	out := make([][]T, len(idx))
	for i, k := range idx {
		out[i] = v[k]
	}
	return out
}

func sub3[T ring[T]](x, y [3]T) [3]T { return [3]T{x[0].Sub(y[0]), x[1].Sub(y[1]), x[2].Sub(y[2])} }
func add3[T ring[T]](x, y [3]T) [3]T { return [3]T{x[0].Add(y[0]), x[1].Add(y[1]), x[2].Add(y[2])} }
