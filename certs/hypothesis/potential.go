package hypothesis

import (
	"fmt"
	"strings"

	"gapcert/certs"
	"gapcert/fem/claim/named"
	"gapcert/fem/problem"
	"gapcert/interval"
	"gapcert/interval/decimalio"
	"gapcert/interval/formula"
)

// Limits of the subdivisions of ConvexPotential: they keep a decision to a
// fraction of a second (measured when the budget is spent: 55 to 61 ms on
// a polygon, BenchmarkConvexPotentialBudget; 0.32 s on a polyhedron,
// where each Hessian has nine entries, BenchmarkConvexPotentialPolyhedronBudget).
const (
	intervalCells    = 16   // first subdivision of an interval
	maxBisections    = 12   // per cell of the first subdivision
	maxIntervalCells = 4096 // Hessian enclosures on an interval
	maxSplits        = 5    // midpoint subdivisions per triangle or tetrahedron
	maxSimplices     = 8192 // Hessian enclosures on a polygon or a polyhedron
)

// ZeroPotential decides whether V ≡ 0: proven when V is a polynomial whose
// every coefficient encloses exactly 0; disproven with a point of the
// domain where the enclosure of V excludes 0; undecided otherwise.
func ZeroPotential(p *problem.Problem) certs.Hypothesis {
	h := certs.Hypothesis{Name: named.ZeroPotential}
	if poly, ok := p.Potential.Polynomial(); ok && poly.Degree() < 0 {
		return proven(h, "V is the zero polynomial")
	}
	for _, pt := range samplePoints(p) {
		v, err := p.Potential.Eval(pointEnv(pt))
		if err == nil && (v.Lo > 0 || v.Hi < 0) {
			return disproven(h, fmt.Sprintf("V ≠ 0 at the witness point (V ∈ %v there)", v), &certs.Witness{Point: pointText(pt[:])})
		}
	}
	return undecidedAt(h, "V is not the zero polynomial, and no point with V ≠ 0 was found")
}

// ConvexPotential decides whether V is convex on the domain.
//
// Proven: V is a polynomial of degree ≤ 1 (its Hessian is 0), or the
// Hessian enclosure over every cell of a subdivision covering the domain
// is positive semidefinite (intervals: V″ ≥ 0; polygons and polyhedra:
// every principal minor of the Hessian ≥ 0 — H11, H22 and
// H11·H22 − H12² in two dimensions; H11, H22, H33, the three principal
// 2×2 minors and the determinant in three — each enclosure evaluated in
// interval arithmetic, so the inequality holds at every point of the
// cell; on a polyhedron, where the 3×3 determinant's interval expansion
// cancels badly, a cell also passes when its Hessian enclosure is verified
// positive definite by positiveDefiniteByShift). A symmetric matrix is
// positive semidefinite if and only if all
// its principal minors are ≥ 0 (Sylvester's criterion for
// semidefiniteness; R. A. Horn and C. R. Johnson, Matrix Analysis,
// Cambridge University Press 1985, Theorem 7.2.5, recalled from memory);
// the leading minors alone do not suffice. The cells are the simplices
// of topSimplices (the triangles of problem.Triangles; the cone
// tetrahedra of problem.Polyhedron.Tetrahedra), split by midpoint
// subdivision where undecided (four triangles, or Bey's eight
// tetrahedra), each evaluated over its coordinate box. A
// successful enclosure on a closed cell also shows V to be C² there: the
// Taylor recurrences of formula.Hessian demand a decided branch of every
// abs, min and max (argument, or difference of arguments, bounded away
// from 0) and arguments > 0 of sqrt, log and real powers. With such
// decisions on every cell of a cover of the connected domain, each of
// these arguments is continuous and nonzero on the domain, hence of one
// sign, and V is one smooth expression there. A C² function with a
// positive semidefinite Hessian on a convex set is convex (common
// practice); on a non-convex polygon or polyhedron the proven statement
// is that the Hessian is positive semidefinite at every point.
//
// Disproven: a float point verified inside the closed domain at which the
// point enclosure of the Hessian is verified not positive semidefinite
// (V″ < 0; or some principal minor < 0, strictly).
//
// Otherwise undecided, naming the first cell where the subdivision (at
// most maxBisections halvings per cell on an interval, maxSplits midpoint
// subdivisions per triangle or tetrahedron, within a total budget)
// stopped.
func ConvexPotential(p *problem.Problem) certs.Hypothesis {
	h := certs.Hypothesis{Name: named.ConvexPotential}
	if poly, ok := p.Potential.Polynomial(); ok && poly.Degree() <= 1 {
		return proven(h, "V is a polynomial of degree at most 1 (its Hessian is 0)")
	}
	if p.Dim == 1 {
		return convexOnInterval(h, p)
	}
	return convexOnSimplices(h, p)
}

// cell is one piece of a subdivision with its remaining depth.
type cell struct {
	lo, hi  float64 // intervals
	simplex simplex // polygons and polyhedra: a sub-simplex
	top     int     // polygons and polyhedra: index of the simplex of topSimplices it lies in
	depth   int
}

func convexOnInterval(h certs.Hypothesis, p *problem.Problem) certs.Hypothesis {
	a, b := p.Interval[0].Val, p.Interval[1].Val
	lo, hi := a.Lo, b.Hi // [lo, hi] ⊇ the closed domain
	var queue []cell
	for k := range intervalCells {
		l := lo + (hi-lo)*float64(k)/intervalCells // choices: any increasing floats from lo to hi
		r := hi
		if k+1 < intervalCells {
			r = lo + (hi-lo)*float64(k+1)/intervalCells
		}
		queue = append(queue, cell{lo: l, hi: r, depth: maxBisections})
	}
	evaluated := 0
	stuck := ""
	for len(queue) > 0 {
		c := queue[0]
		queue = queue[1:]
		evaluated++
		d2, err := secondDerivative(p.Potential, interval.I{Lo: c.lo, Hi: c.hi})
		if err == nil && d2.Lo >= 0 {
			continue
		}
		m := c.lo/2 + c.hi/2 // a choice
		if a.Hi <= m && m <= b.Lo {
			if dm, err := secondDerivative(p.Potential, interval.Point(m)); err == nil && dm.Hi < 0 {
				return disproven(h, fmt.Sprintf("V'' < 0 at the witness point (V'' ∈ %v there)", dm), &certs.Witness{Point: []string{decimalio.FormatExact(m)}})
			}
		}
		if c.depth > 0 && c.lo < m && m < c.hi && evaluated+len(queue)+2 <= maxIntervalCells {
			queue = append(queue, cell{lo: c.lo, hi: m, depth: c.depth - 1}, cell{lo: m, hi: c.hi, depth: c.depth - 1})
			continue
		}
		if stuck == "" {
			stuck = fmt.Sprintf("[%g, %g]", c.lo, c.hi)
			if err != nil {
				stuck += ": " + err.Error()
			} else {
				stuck += fmt.Sprintf(" (V'' ∈ %v)", d2)
			}
		}
	}
	if stuck != "" {
		return undecidedAt(h, "could not decide the sign of V'' on the cell "+stuck)
	}
	return proven(h, fmt.Sprintf("V'' ≥ 0 on %d cells covering the interval", evaluated))
}

func secondDerivative(v *formula.Expr, x interval.I) (interval.I, error) {
	hs, err := v.Hessian(map[string]interval.I{"x": x}, []string{"x"})
	if err != nil {
		return interval.I{}, err
	}
	return hs[0][0], nil
}

// principalMinors returns enclosures of the principal minors of the
// Hessian of V over the box of d coordinates, in the order of
// minorNames(d).
func principalMinors(v *formula.Expr, box map[string]interval.I, d int) ([]interval.I, error) {
	hs, err := v.Hessian(box, coordinateNames[:d])
	if err != nil {
		return nil, err
	}
	return minorsOf(hs, d), nil
}

// minorsOf returns the principal minors of the Hessian enclosure hs of
// dimension d, in the order of minorNames.
func minorsOf(hs [][]interval.I, d int) []interval.I {
	if d == 2 {
		det := hs[0][0].Mul(hs[1][1]).Sub(hs[0][1].Sqr())
		return []interval.I{hs[0][0], hs[1][1], det}
	}
	minor2 := func(i, j int) interval.I { return hs[i][i].Mul(hs[j][j]).Sub(hs[i][j].Sqr()) }
	var m [3][3]interval.I
	for i := range 3 {
		copy(m[i][:], hs[i])
	}
	return []interval.I{hs[0][0], hs[1][1], hs[2][2], minor2(0, 1), minor2(0, 2), minor2(1, 2), det3(m)}
}

// minorNames names the principal minors of principalMinors in dimension d.
func minorNames(d int) []string {
	if d == 2 {
		return []string{"H11", "H22", "det"}
	}
	return []string{"H11", "H22", "H33", "H11·H22 − H12²", "H11·H33 − H13²", "H22·H33 − H23²", "det"}
}

// describeMinors writes "name ∈ enclosure" for each principal minor of
// dimension d.
func describeMinors(m []interval.I, d int) string {
	names := minorNames(d)
	parts := make([]string, len(m))
	for i, x := range m {
		parts[i] = fmt.Sprintf("%s ∈ %v", names[i], x)
	}
	return strings.Join(parts, ", ")
}

// convexOnSimplices decides the convexity of V on a polygon or a
// polyhedron over the simplices of topSimplices, split where undecided.
func convexOnSimplices(h certs.Hypothesis, p *problem.Problem) certs.Hypothesis {
	tops := topSimplices(p)
	d := tops[0].dim()
	shape, shapes, domain := "triangle", "triangles", "polygon"
	if d == 3 {
		shape, shapes, domain = "tetrahedron", "tetrahedra", "polyhedron"
	}
	var queue []cell
	for k, t := range tops {
		queue = append(queue, cell{simplex: t, top: k, depth: maxSplits})
	}
	evaluated := 0
	stuck := ""
	for len(queue) > 0 {
		c := queue[0]
		queue = queue[1:]
		evaluated++
		hs, err := p.Potential.Hessian(c.simplex.box(), coordinateNames[:d])
		var m []interval.I
		if err == nil {
			m = minorsOf(hs, d)
		}
		if err == nil && (allNonnegative(m) || d == 3 && positiveDefiniteByShift(hs)) {
			continue
		}
		if pt, ok := centroidInside(c.simplex, tops[c.top]); ok {
			if mp, err := principalMinors(p.Potential, pointEnv(pt), d); err == nil && someNegative(mp) {
				return disproven(h, fmt.Sprintf("the Hessian is not positive semidefinite at the witness point (%s there)", describeMinors(mp, d)),
					&certs.Witness{Point: pointText(pt)})
			}
		}
		if c.depth > 0 && evaluated+len(queue)+children(d) <= maxSimplices {
			for _, s := range c.simplex.split() {
				queue = append(queue, cell{simplex: s, top: c.top, depth: c.depth - 1})
			}
			continue
		}
		if stuck == "" {
			box := c.simplex.box()
			var coords []string
			for _, name := range coordinateNames[:d] {
				coords = append(coords, fmt.Sprintf("%s ∈ %v", name, box[name]))
			}
			stuck = strings.Join(coords, ", ")
			if err != nil {
				stuck += ": " + err.Error()
			} else {
				stuck += " (" + describeMinors(m, d) + ")"
			}
		}
	}
	if stuck != "" {
		return undecidedAt(h, fmt.Sprintf("could not decide that the Hessian is positive semidefinite on the %s with %s", shape, stuck))
	}
	return proven(h, fmt.Sprintf("the Hessian is positive semidefinite on %d %s covering the %s", evaluated, shapes, domain))
}

func allNonnegative(m []interval.I) bool {
	for _, x := range m {
		if x.Lo < 0 {
			return false
		}
	}
	return true
}

func someNegative(m []interval.I) bool {
	for _, x := range m {
		if x.Hi < 0 {
			return true
		}
	}
	return false
}

// pointText prints the exact values of the float coordinates.
func pointText(pt []float64) []string {
	out := make([]string, len(pt))
	for i, x := range pt {
		out[i] = decimalio.FormatExact(x)
	}
	return out
}
