package tri

import "gapcert/interval"

// baryApprox returns the barycentric coordinates of (x, y) in the triangle
// with the midpoints of the vertex enclosures v, in floating point (a
// choice: point location for plots and interpolation).
func baryApprox(v [3][2]interval.I, x, y float64) [3]float64 {
	x0, y0 := v[0][0].Mid(), v[0][1].Mid()
	x1, y1 := v[1][0].Mid()-x0, v[1][1].Mid()-y0
	x2, y2 := v[2][0].Mid()-x0, v[2][1].Mid()-y0
	det := x1*y2 - x2*y1
	px, py := x-x0, y-y0
	l1 := (px*y2 - x2*py) / det
	l2 := (x1*py - px*y1) / det
	return [3]float64{1 - l1 - l2, l1, l2}
}
