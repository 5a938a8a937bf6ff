package groundstate

import "gapcert/interval"

// InscribedRadius returns a radius R > 0 such that the open disc B_R(x0) lies
// in the closed triangle with vertices v (each an enclosure of the exact
// vertex; the result holds for every choice of exact vertices in them), as
// large as the rounding allows: R is a lower bound of the distance from x0
// to the nearest side line, the largest disc around x0 inside the triangle.
// ok is false, and R is 0, when x0 is not inside the triangle for every
// such choice (on or across a side, or a degenerate triangle).
//
// With the sides taken counterclockwise (the orientation is decided by the
// sign of the enclosed doubled area), the signed distance from x0 to the
// line through p and q is cross(q − p, x0 − p)/|q − p|, positive on the
// inner side; B_R(x0) lies in the triangle iff R ≤ each of the three
// distances. Each is enclosed in interval arithmetic and its lower end
// rounded down is kept.
func InscribedRadius(v [3][2]interval.I, x0 [2]float64) (R float64, ok bool) {
	cross := func(p, q, r [2]interval.I) interval.I {
		return q[0].Sub(p[0]).Mul(r[1].Sub(p[1])).Sub(q[1].Sub(p[1]).Mul(r[0].Sub(p[0])))
	}
	area := cross(v[0], v[1], v[2])
	switch {
	case area.Positive():
	case area.Negative():
		v[1], v[2] = v[2], v[1]
	default:
		return 0, false
	}
	x := [2]interval.I{interval.Point(x0[0]), interval.Point(x0[1])}
	R = 0
	for k := range 3 {
		p, q := v[k], v[(k+1)%3]
		length, _ := q[0].Sub(p[0]).Sqr().Add(q[1].Sub(p[1]).Sqr()).Sqrt()
		d := cross(p, q, x).Div(length)
		if !d.Positive() {
			return 0, false
		}
		if k == 0 || d.Lo < R {
			R = d.Lo
		}
	}
	return R, true
}
