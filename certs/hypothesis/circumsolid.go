package hypothesis

import (
	"fmt"
	"math/big"

	"gapcert/certs"
	"gapcert/fem/claim/named"
	"gapcert/fem/problem"
	"gapcert/interval"
)

// Names under which the circumsolid decisions are recorded.
const (
	// TangentialPolygon: the polygon is convex and one circle touches
	// every side (see Tangential).
	TangentialPolygon = "tangential_polygon"
	// CircumsolidProduct: the domain is a product of circumsolids (see
	// ProductOfCircumsolids).
	CircumsolidProduct = named.CircumsolidProduct
)

// Tangential decides whether the polygon is tangential: convex, with a
// circle that touches every side, that is, the circle is tangent to the
// line L_i of each side S_i at a point of the closed segment S_i. (This
// is the usual definition of a tangential polygon, common practice: a
// convex polygon circumscribed about a disc, the two-dimensional
// circumsolid of ProductOfCircumsolids.)
//
// Characterisation used. Let P be convex with counterclockwise vertices
// v_0, …, v_{n−1}, n ≥ 3, no three consecutive collinear (fem/problem
// guarantees the last), e_i = v_{i+1} − v_i, ℓ_i = |e_i|, and
// d_i(c) = e_i × (c − v_i)/ℓ_i the signed distance of c from L_i,
// positive on the side of P. Then
//
//	P is tangential ⇔ the linear system e_i × c − ℓ_i·r = e_i × v_i
//	(i = 0, …, n−1) in the unknowns c ∈ R², r ∈ R has a solution,
//
// and the solution is then the incentre c and the inradius r = 2|P|/ℓ
// (ℓ the perimeter). Proof. (⇒) Let the circle C (centre c, radius
// ρ > 0) touch L_i at t_i ∈ S_i for every i. If the closed disc D̄ of C
// lay on the outer side of some L_i, then D̄ ∩ P ⊆ D̄ ∩ L_i = {t_i}; every
// t_j lies in D̄ ∩ P, so t_j = t_i for all j, and L_j, the tangent of C at
// t_j, would equal L_i for all j, which is false for the non-collinear
// sides S_0, S_1. So D̄ is on the inner side of every L_i, d_i(c) = ρ for
// all i, and (c, ρ) solves the system. (⇐) Summing ℓ_i·d_i(c) =
// Σ e_i × (c − v_i) = (Σ e_i) × c + Σ v_i × v_{i+1} = 2|P| (the first sum
// vanishes around a closed polygon, the second is the shoelace formula)
// for every c, so a solution has r = 2|P|/ℓ > 0. Then d_i(c) = r for all
// i: the closed disc B of radius r about c lies in every inner half-plane
// and so in P (a convex polygon is the intersection of the inner
// half-planes of its sides), and the foot t_i = c − r·ñ_i (ñ_i the inner
// unit normal) lies on L_i and in B ⊆ P, hence in P ∩ L_i = S_i. ∎
//
// Deciding the system. Any three distinct sides of a convex polygon have
// a non-singular 3×3 system: row i is ℓ_i·(ñ_i, −1), and
// det[(ñ_i, −1)] = −det[(ñ_i, 1)] is minus twice the signed area of the
// triangle with corners ñ_0, ñ_1, ñ_2 on the unit circle, which is not 0
// because the inner normals of the sides of a convex polygon are pairwise
// distinct (the directions of e_0, …, e_{n−1} turn strictly and by 2π in
// all) and three distinct points of a circle are not collinear. So sides
// 0, 1, 2 fix (c, r), and side j ≥ 3 is satisfied if and only if the 4×4
// determinant D_j of rows 0, 1, 2, j of the augmented matrix
// [−e_y, e_x, −ℓ, e × v] vanishes (by the Schur complement, D_j is
// det(rows 0, 1, 2) times the residual of row j). Expanding along the
// ℓ column, D_j = Σ_p (−1)^{p+1}·ℓ_{k_p}·M_p over the rows k_0, …, k_3 =
// 0, 1, 2, j, with M_p the 3×3 minor of the columns −e_y, e_x, e × v
// without row p. Every triangle is tangential (its incircle: Euclid,
// Elements IV.4); for n ≥ 4 the verdict is "proven" if every D_j is 0 and
// "disproven" with the witness side j if some D_j is not.
//
// Exactness. The coordinates are read exactly (package algebraic), as
// surds if every one is (surdVertices: rationals, √ of rationals, cos and
// sin of multiples of π/12, …), else in one cyclotomic field Q(ζ_m) if
// every one is (cycVertices: cos and sin of any rational multiple of π,
// rationals, √(s²k) for k ∈ {1, 2, 3, 6}; φ(m) ≤ 240, which covers every
// regular polygon that fem/problem accepts). The minors M_p and the
// squared lengths ℓ_k² are then field elements with an exact zero test.
// The terms whose ℓ_k is seen to lie in the field (ℓ_k² rational, and for
// Q(ζ_m) the square of a rational) form one field element; the others are
// grouped by ℓ_k² up to rational square factors (ℓ_k = w·ℓ_g, w
// rational). D_j = 0 is concluded only when that element and every
// group's coefficient vanish exactly; D_j ≠ 0 is concluded exactly when
// there is no group, or one group and a vanishing first part (D_j = C·ℓ_g
// with C ≠ 0 and ℓ_g > 0). Otherwise, and for coordinates that are read in
// neither way, only the interval enclosure of D_j is used, which can show
// D_j ≠ 0 but never D_j = 0: a tangential polygon with such coordinates
// is "undecided", never guessed.
// A polygon that is not convex is "disproven" (a tangential polygon is
// convex by definition) with its re-entrant vertex as the witness.
func Tangential(p *problem.Problem) certs.Hypothesis {
	h := certs.Hypothesis{Name: TangentialPolygon}
	if p.Dim == 1 {
		return undecidedAt(h, "the domain is an interval, not a polygon")
	}
	switch c := ConvexDomain(p); c.Verdict {
	case certs.Disproven:
		return disproven(h, "not convex, and a tangential polygon is convex by definition: "+c.Detail, c.Witness)
	case certs.Undecided:
		return undecidedAt(h, "cannot decide convexity: "+c.Detail)
	}
	n := len(p.Vertices)
	if n == 3 {
		return proven(h, "every triangle has an incircle")
	}
	residual := func(j int) (zero, ok bool) { return tangencyResidualZeroInterval(p.Vertices, [4]int{0, 1, 2, j}) }
	if v, ok := surdVertices(planarPoints(p.Vertices)); ok {
		residual = newTangencyTest(v).residualZero
	} else if v, ok := cycVertices(planarPoints(p.Vertices)); ok {
		residual = newTangencyTest(v).residualZero
	}
	undecided := -1
	for j := 3; j < n; j++ {
		zero, ok := residual(j)
		switch {
		case ok && !zero:
			return disproven(h, fmt.Sprintf("the line of side %d is not tangent to the circle tangent to the lines of sides 0, 1 and 2 on the polygon's side", j), &certs.Witness{Side: intPtr(j)})
		case !ok && undecided < 0:
			undecided = j
		}
	}
	if undecided >= 0 {
		why := "cannot decide whether the line of side %d is tangent to the circle tangent to the lines of sides 0, 1 and 2: an equality, which enclosures cannot show (coordinates built from rationals, square roots of rationals and cos, sin of rational multiples of pi are decided exactly)"
		return undecidedAt(h, fmt.Sprintf(why, undecided))
	}
	return proven(h, fmt.Sprintf("convex, and the circle tangent to the lines of sides 0, 1 and 2 is tangent to the lines of all %d sides (decided exactly)", n))
}

// ProductOfCircumsolids decides whether the domain is a product of
// circumsolids.
//
// Andrews, Clutterbuck and Hauer (§8, "Quadratic solutions and
// circumsolids") prove that on a convex polyhedral domain the Robin ground
// state is not log-concave for small Robin parameter unless the domain is
// in a special class, which they classify through circumsolids and their
// products. We use the notion as we recall it from that section (the
// exact wording of the definition was not checked against the paper): a
// convex polytope is a circumsolid when it is circumscribed about a ball,
// every facet touching one inscribed ball, and the special class consists
// of the products of circumsolids, after a rigid motion. In one
// dimension the convex domains are intervals, and an interval is
// circumscribed about itself, so every interval is a circumsolid. In two dimensions a product
// of circumsolids is either one two-dimensional circumsolid, which for a
// polygon is a tangential polygon (see Tangential), or the product of two
// intervals, a rectangle (see Rectangle: four right angles, so a rotated
// rectangle counts, being a product after a rotation). Hence a polygon is
// a product of circumsolids if and only if it is tangential or a
// rectangle (a square is both); an interval is one. A polyhedron is
// decided by polyhedronProduct (a circumsolid, or a right prism over a
// tangential polygon or a rectangle), a product of intervals and polygons
// from its factors (decideProduct).
//
// The verdict is "proven" if either decision is proven, "disproven" if
// both are disproven (the witness is that of Tangential, with the vertex
// of Rectangle's witness), and "undecided" otherwise. Where Rectangle
// cannot decide a right angle from enclosures, the corners of a
// quadrilateral whose coordinates are read exactly (as for Tangential) are
// decided by the exact zero test of (v_{i−1} − v_i)·(v_{i+1} − v_i).
//
// References:
//
//	B. Andrews, J. Clutterbuck and D. Hauer, Non-concavity of the Robin
//	ground state, Camb. J. Math. 8 (2020), 243–310, arXiv:1711.02779.
func ProductOfCircumsolids(p *problem.Problem) certs.Hypothesis {
	h := certs.Hypothesis{Name: CircumsolidProduct}
	if p.Polyhedron != nil {
		return polyhedronProduct(h, p)
	}
	if p.Dim == 1 {
		return proven(h, "an interval is a one-dimensional circumsolid")
	}
	t, r := Tangential(p), Rectangle(p)
	if r.Verdict == certs.Undecided {
		r = rectangleExact(p, r)
	}
	switch {
	case t.Verdict == certs.Proven:
		return proven(h, "a tangential polygon, a two-dimensional circumsolid: "+t.Detail)
	case r.Verdict == certs.Proven:
		return proven(h, "a rectangle, the product of two intervals: "+r.Detail)
	case t.Verdict == certs.Disproven && r.Verdict == certs.Disproven:
		w := *t.Witness
		if w.Vertex == nil && r.Witness.Vertex != nil {
			w.Vertex, w.Point = r.Witness.Vertex, r.Witness.Point
		}
		return disproven(h, fmt.Sprintf("neither tangential (%s) nor a rectangle (%s)", t.Detail, r.Detail), &w)
	}
	return undecidedAt(h, fmt.Sprintf("tangential: %s (%s); rectangle: %s (%s)", t.Verdict, t.Detail, r.Verdict, r.Detail))
}

// rectangleExact decides the right angles of a quadrilateral whose
// coordinates are read exactly (surds, else a cyclotomic field); it
// returns undecided unchanged otherwise.
func rectangleExact(p *problem.Problem, undecided certs.Hypothesis) certs.Hypothesis {
	if len(p.Vertices) != 4 {
		return undecided
	}
	corner := -1
	if v, ok := surdVertices(planarPoints(p.Vertices)); ok {
		corner = firstObliqueCorner(v)
	} else if v, ok := cycVertices(planarPoints(p.Vertices)); ok {
		corner = firstObliqueCorner(v)
	} else {
		return undecided
	}
	h := certs.Hypothesis{Name: undecided.Name}
	if corner >= 0 {
		q := p.Vertices[corner]
		return disproven(h, fmt.Sprintf("the corner at vertex %d is not a right angle (decided exactly)", corner),
			&certs.Witness{Vertex: intPtr(corner), Point: []string{q[0].Text, q[1].Text}})
	}
	return proven(h, "four vertices, every corner a right angle (decided exactly)")
}

// firstObliqueCorner returns the first vertex i of the polygon v (points
// of any number of coordinates) with (v_{i−1} − v_i)·(v_{i+1} − v_i) ≠ 0,
// or −1 if every corner is right.
func firstObliqueCorner[T exactField[T]](v [][]T) int {
	n := len(v)
	for i := range n {
		a, b, c := v[(i+n-1)%n], v[i], v[(i+1)%n]
		d := a[0].Sub(b[0]).Mul(c[0].Sub(b[0]))
		for k := 1; k < len(b); k++ {
			d = d.Add(a[k].Sub(b[k]).Mul(c[k].Sub(b[k])))
		}
		if !d.IsZero() {
			return i
		}
	}
	return -1
}

// exactField is an exact field of real numbers with a zero test: the
// surds or a cyclotomic field of package algebraic.
type exactField[T any] interface {
	Add(T) T
	Sub(T) T
	Mul(T) T
	Neg() T
	Scale(*big.Rat) T
	IsZero() bool
	// Rat returns the value if it is rational.
	Rat() (*big.Rat, bool)
	// RatioSquare returns w > 0 with x = w²·y, if x is such a multiple of y.
	RatioSquare(T) (*big.Rat, bool)
	// SqrtRat returns √q as an element of the field, if it is one.
	SqrtRat(*big.Rat) (T, bool)
	Enclose() interval.I
}

// sideRow returns the exact entries −e_y, e_x, e × v and ℓ² of the row of
// side i.
func sideRow[T exactField[T]](v [][]T, i int) (a, b, h, l2 T) {
	p, q := v[i], v[(i+1)%len(v)]
	ex, ey := q[0].Sub(p[0]), q[1].Sub(p[1])
	return ey.Neg(), ex, ex.Mul(p[1]).Sub(ey.Mul(p[0])), ex.Mul(ex).Add(ey.Mul(ey))
}

// ring is the arithmetic of determinants and vector products: the exact
// fields (exactField) and the enclosures of package interval.
type ring[T any] interface {
	Add(T) T
	Sub(T) T
	Mul(T) T
	Neg() T
}

// cross returns the cross product x × y of 3-vectors.
func cross[T ring[T]](x, y [3]T) [3]T {
	return [3]T{x[1].Mul(y[2]).Sub(x[2].Mul(y[1])), x[2].Mul(y[0]).Sub(x[0].Mul(y[2])), x[0].Mul(y[1]).Sub(x[1].Mul(y[0]))}
}

func dot[T ring[T]](x, y [3]T) T { return x[0].Mul(y[0]).Add(x[1].Mul(y[1])).Add(x[2].Mul(y[2])) }

// tangencyTest decides D_j for the sides j ≥ 3 of one polygon. The minor
// of rows r, s, j is the triple product det[r; s; j] = row_j · (r × s),
// so the cross products of rows 0, 1, 2 are computed once.
type tangencyTest[T exactField[T]] struct {
	v             [][]T
	l2            [3]T
	x01, x02, x12 [3]T
	m3            T // det[row 0; row 1; row 2]
}

func newTangencyTest[T exactField[T]](v [][]T) *tangencyTest[T] {
	t := &tangencyTest[T]{v: v}
	var r [3][3]T
	for k := range 3 {
		a, b, h, l2 := sideRow(v, k)
		r[k], t.l2[k] = [3]T{a, b, h}, l2
	}
	t.x01, t.x02, t.x12 = cross(r[0], r[1]), cross(r[0], r[2]), cross(r[1], r[2])
	t.m3 = dot(r[2], t.x01)
	return t
}

// residualZero decides whether D_j = Σ_p (−1)^{p+1} ℓ_{k_p} M_p over the
// rows k = 0, 1, 2, j is 0, exactly where the rules of Tangential allow
// and else by the enclosure of D_j (which decides only D_j ≠ 0).
func (t *tangencyTest[T]) residualZero(j int) (zero, ok bool) {
	a, b, h, l2j := sideRow(t.v, j)
	rj := [3]T{a, b, h}
	// M_p without row p: p = 0, 1, 2 involve row j; p = 3 is m3. The sign
	// (−1)^{p+1} is applied here.
	minors := [4]T{dot(rj, t.x12).Neg(), dot(rj, t.x02), dot(rj, t.x01).Neg(), t.m3}
	l2 := [4]T{t.l2[0], t.l2[1], t.l2[2], l2j}
	return sqrtSumZero(minors[:], l2[:])
}

// sqrtSumZero decides whether Σ_p c_p·√s_p = 0 for field elements c_p and
// s_p ≥ 0: exactly where the rules of Tangential allow (the terms whose
// √s_p lies in the field form one element; the others are grouped by s_p
// up to rational square factors, √s_p = w·√s_g with w rational), and else
// by the enclosure of the sum (which decides only ≠ 0).
func sqrtSumZero[T exactField[T]](c, s []T) (zero, ok bool) {
	exact := c[0].Sub(c[0]) // the terms whose square root is in the field
	type group struct{ l2, coef T }
	var groups []group // coef·√l2 with √l2 outside the field, one per class
	for p, mp := range c {
		if q, isRat := s[p].Rat(); isRat {
			if l, inField := mp.SqrtRat(q); inField {
				exact = exact.Add(mp.Mul(l))
				continue
			}
		}
		placed := false
		for g := range groups {
			if w, ok := s[p].RatioSquare(groups[g].l2); ok {
				groups[g].coef = groups[g].coef.Add(mp.Scale(w))
				placed = true
				break
			}
		}
		if !placed {
			groups = append(groups, group{l2: s[p], coef: mp})
		}
	}
	allZero := exact.IsZero()
	for _, g := range groups {
		allZero = allZero && g.coef.IsZero()
	}
	switch {
	case allZero:
		return true, true
	case len(groups) == 0:
		return false, true // a nonzero element of the field
	case len(groups) == 1 && exact.IsZero():
		return false, true // coef ≠ 0 times √l2 with l2 > 0
	}
	d := exact.Enclose()
	for _, g := range groups {
		l, _ := g.l2.Enclose().Sqrt()
		d = d.Add(g.coef.Enclose().Mul(l))
	}
	if d.ContainsZero() {
		return false, false
	}
	return false, true
}

// tangencyResidualZeroInterval encloses D from the coordinate enclosures;
// it decides only D ≠ 0.
func tangencyResidualZeroInterval(v [][2]problem.Number, rows [4]int) (zero, ok bool) {
	var cols [4][3]interval.I
	var l [4]interval.I
	for p, k := range rows {
		a, b := v[k], v[(k+1)%len(v)]
		ex, ey := b[0].Val.Sub(a[0].Val), b[1].Val.Sub(a[1].Val)
		cols[p] = [3]interval.I{ey.Neg(), ex, ex.Mul(a[1].Val).Sub(ey.Mul(a[0].Val))}
		l[p], _ = ex.Sqr().Add(ey.Sqr()).Sqrt() // a sum of squares
	}
	var d interval.I
	for p := range 4 {
		var m [3][3]interval.I
		r := 0
		for q := range 4 {
			if q != p {
				m[r] = cols[q]
				r++
			}
		}
		t := det3(m).Mul(l[p])
		if p%2 == 0 {
			t = t.Neg()
		}
		d = d.Add(t)
	}
	if d.ContainsZero() {
		return false, false
	}
	return false, true
}

// det3 returns the determinant of m (the rule of Sarrus).
func det3[T ring[T]](m [3][3]T) T {
	t := func(i, j, k int) T { return m[0][i].Mul(m[1][j]).Mul(m[2][k]) }
	return t(0, 1, 2).Add(t(1, 2, 0)).Add(t(2, 0, 1)).Sub(t(2, 1, 0)).Sub(t(0, 2, 1)).Sub(t(1, 0, 2))
}
