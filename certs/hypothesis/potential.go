package hypothesis

import (
	"fmt"
	"math"

	"gapcert/certs"
	"gapcert/fem/claim/named"
	"gapcert/fem/problem"
	"gapcert/interval"
	"gapcert/interval/decimalio"
	"gapcert/interval/formula"
)

// Limits of the subdivisions of ConvexPotential: they keep a decision to a
// fraction of a second (measured: 61 ms when the budget is spent on a
// polygon, BenchmarkConvexPotentialBudget).
const (
	intervalCells    = 16   // first subdivision of an interval
	maxBisections    = 12   // per cell of the first subdivision
	maxIntervalCells = 4096 // Hessian enclosures on an interval
	maxSplits        = 5    // midpoint subdivisions per triangle
	maxTriangles     = 8192 // Hessian enclosures on a polygon
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
// is positive semidefinite (intervals: V″ ≥ 0; polygons: H11 ≥ 0,
// H22 ≥ 0, H11·H22 − H12² ≥ 0, each enclosure evaluated in interval
// arithmetic, so the inequality holds at every point of the cell). A
// successful enclosure on a closed cell also shows V to be C² there: the
// Taylor recurrences of formula.Hessian demand a decided branch of every
// abs, min and max (argument, or difference of arguments, bounded away
// from 0) and arguments > 0 of sqrt, log and real powers. With such
// decisions on every cell of a cover of the connected domain, each of
// these arguments is continuous and nonzero on the domain, hence of one
// sign, and V is one smooth expression there. A C² function with a
// positive semidefinite Hessian on a convex set is convex (common
// practice); on a non-convex polygon the proven statement is that the
// Hessian is positive semidefinite at every point.
//
// Disproven: a float point verified inside the closed domain at which the
// point enclosure of the Hessian is verified not positive semidefinite
// (V″ < 0; or H11 < 0, H22 < 0 or H11·H22 − H12² < 0, strictly).
//
// Otherwise undecided, naming the first cell where the subdivision (at
// most maxBisections halvings per cell on an interval, maxSplits midpoint
// subdivisions per triangle, within a total budget) stopped.
func ConvexPotential(p *problem.Problem) certs.Hypothesis {
	h := certs.Hypothesis{Name: named.ConvexPotential}
	if poly, ok := p.Potential.Polynomial(); ok && poly.Degree() <= 1 {
		return proven(h, "V is a polynomial of degree at most 1 (its Hessian is 0)")
	}
	if p.Dim == 1 {
		return convexOnInterval(h, p)
	}
	return convexOnPolygon(h, p)
}

// cell is one piece of a subdivision with its remaining depth.
type cell struct {
	lo, hi float64          // intervals
	tri    [3][2]interval.I // polygons: vertex enclosures of a sub-triangle
	top    int              // polygons: index of the triangle of p.Triangles it lies in
	depth  int
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

// psd returns the enclosures of H11, H22 and H11·H22 − H12² of V over the
// box.
func psd(v *formula.Expr, box map[string]interval.I) ([3]interval.I, error) {
	hs, err := v.Hessian(box, []string{"x", "y"})
	if err != nil {
		return [3]interval.I{}, err
	}
	det := hs[0][0].Mul(hs[1][1]).Sub(hs[0][1].Sqr())
	return [3]interval.I{hs[0][0], hs[1][1], det}, nil
}

func convexOnPolygon(h certs.Hypothesis, p *problem.Problem) certs.Hypothesis {
	tops := topTriangles(p)
	var queue []cell
	for k, t := range tops {
		queue = append(queue, cell{tri: t, top: k, depth: maxSplits})
	}
	evaluated := 0
	stuck := ""
	for len(queue) > 0 {
		c := queue[0]
		queue = queue[1:]
		evaluated++
		m, err := psd(p.Potential, boundingBox(c.tri))
		if err == nil && m[0].Lo >= 0 && m[1].Lo >= 0 && m[2].Lo >= 0 {
			continue
		}
		if pt, ok := centroidInside(c.tri, tops[c.top]); ok {
			if mp, err := psd(p.Potential, pointEnv(pt[:])); err == nil && (mp[0].Hi < 0 || mp[1].Hi < 0 || mp[2].Hi < 0) {
				return disproven(h, fmt.Sprintf("the Hessian is not positive semidefinite at the witness point (H11 ∈ %v, H22 ∈ %v, det ∈ %v there)", mp[0], mp[1], mp[2]),
					&certs.Witness{Point: pointText(pt[:])})
			}
		}
		if c.depth > 0 && evaluated+len(queue)+4 <= maxTriangles {
			for _, s := range splitTriangle(c.tri) {
				queue = append(queue, cell{tri: s, top: c.top, depth: c.depth - 1})
			}
			continue
		}
		if stuck == "" {
			box := boundingBox(c.tri)
			stuck = fmt.Sprintf("x ∈ %v, y ∈ %v", box["x"], box["y"])
			if err != nil {
				stuck += ": " + err.Error()
			} else {
				stuck += fmt.Sprintf(" (H11 ∈ %v, H22 ∈ %v, det ∈ %v)", m[0], m[1], m[2])
			}
		}
	}
	if stuck != "" {
		return undecidedAt(h, "could not decide that the Hessian is positive semidefinite on the triangle with "+stuck)
	}
	return proven(h, fmt.Sprintf("the Hessian is positive semidefinite on %d triangles covering the polygon", evaluated))
}

// topTriangles returns the vertex enclosures of the triangles of
// p.Triangles (counterclockwise), which tile the polygon.
func topTriangles(p *problem.Problem) [][3][2]interval.I {
	var out [][3][2]interval.I
	for _, t := range p.Triangles() {
		var v [3][2]interval.I
		for j, k := range t {
			v[j] = [2]interval.I{p.Vertices[k][0].Val, p.Vertices[k][1].Val}
		}
		out = append(out, v)
	}
	return out
}

func boundingBox(v [3][2]interval.I) map[string]interval.I {
	return map[string]interval.I{
		"x": v[0][0].Hull(v[1][0]).Hull(v[2][0]),
		"y": v[0][1].Hull(v[1][1]).Hull(v[2][1]),
	}
}

// splitTriangle returns the four midpoint sub-triangles of v
// (counterclockwise if v is) with enclosed midpoints: for every exact
// choice of vertices in v, the exact sub-triangles lie in the enclosures
// and cover the exact triangle.
func splitTriangle(v [3][2]interval.I) [4][3][2]interval.I {
	mid := func(p, q [2]interval.I) [2]interval.I {
		return [2]interval.I{p[0].Add(q[0]).MulF(0.5), p[1].Add(q[1]).MulF(0.5)}
	}
	m01, m12, m20 := mid(v[0], v[1]), mid(v[1], v[2]), mid(v[2], v[0])
	return [4][3][2]interval.I{{v[0], m01, m20}, {m01, v[1], m12}, {m20, m12, v[2]}, {m12, m20, m01}}
}

// centroidInside chooses a float point near the centroid of the
// sub-triangle t and returns it if it is verified to lie in the closed
// triangle top (a triangle of the polygon's triangulation, given by
// enclosures of its exact vertices): every orientation
// (top_{j+1} − top_j) × (q − top_j) is enclosed and ≥ 0.
func centroidInside(t, top [3][2]interval.I) ([2]float64, bool) {
	var q [2]float64
	for i := range q {
		q[i] = (t[0][i].Mid() + t[1][i].Mid() + t[2][i].Mid()) / 3 // a choice
	}
	if math.IsNaN(q[0]) || math.IsNaN(q[1]) {
		return q, false
	}
	return q, insideTriangle(top, q)
}

// insideTriangle reports whether the point q is verified to lie in the
// closed counterclockwise triangle with vertex enclosures v.
func insideTriangle(v [3][2]interval.I, q [2]float64) bool {
	qx, qy := interval.Point(q[0]), interval.Point(q[1])
	for j := range 3 {
		a, b := v[j], v[(j+1)%3]
		o := b[0].Sub(a[0]).Mul(qy.Sub(a[1])).Sub(b[1].Sub(a[1]).Mul(qx.Sub(a[0])))
		if o.Lo < 0 {
			return false
		}
	}
	return true
}

// samplePoints chooses float points verified inside the closed domain:
// on an interval its midpoint and quarter points, on a polygon points near
// the centroids of its triangles.
func samplePoints(p *problem.Problem) [][]float64 {
	var out [][]float64
	if p.Dim == 1 {
		a, b := p.Interval[0].Val, p.Interval[1].Val
		for _, s := range []float64{0.5, 0.25, 0.75} {
			x := a.Mid() + s*(b.Mid()-a.Mid()) // a choice
			if a.Hi <= x && x <= b.Lo {
				out = append(out, []float64{x})
			}
		}
		return out
	}
	for _, t := range topTriangles(p) {
		if q, ok := centroidInside(t, t); ok {
			out = append(out, q[:])
		}
	}
	return out
}

func pointEnv(pt []float64) map[string]interval.I {
	env := map[string]interval.I{"x": interval.Point(pt[0])}
	if len(pt) > 1 {
		env["y"] = interval.Point(pt[1])
	}
	return env
}

// pointText prints the exact values of the float coordinates.
func pointText(pt []float64) []string {
	out := make([]string, len(pt))
	for i, x := range pt {
		out[i] = decimalio.FormatExact(x)
	}
	return out
}
