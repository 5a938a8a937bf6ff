package plot

import "math"

// lineSamples holds the modes of a 1D problem at common sample points,
// each normalised so that its value of largest magnitude is +1.
type lineSamples struct {
	x []float64
	u [][]float64 // u[k][i] is mode k at x[i]
}

// sampleLine evaluates every mode of m at equally spaced points of
// m.Interval, ends included.
func sampleLine(m *Modes) (lineSamples, error) {
	n := m.Samples
	if n == 0 {
		n = DefaultSamples1D
	}
	a, b := m.Interval[0], m.Interval[1]
	s := lineSamples{x: make([]float64, n), u: make([][]float64, len(m.Labels))}
	for i := range n {
		s.x[i] = a + (b-a)*float64(i)/float64(n-1)
	}
	s.x[n-1] = b
	for k := range s.u {
		u := make([]float64, n)
		for i, x := range s.x {
			v := m.Eval(k, x, 0)
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return lineSamples{}, &ModeError{Mode: k, At: [2]float64{x, 0}, Value: v, oneD: true}
			}
			u[i] = v
		}
		if !normalise(u) {
			return lineSamples{}, &ModeError{Mode: k, oneD: true}
		}
		s.u[k] = u
	}
	return s, nil
}

// grid is a mode sampled at the centres of a rectangular grid of cells
// covering the polygon's bounding box; cells whose centre lies outside the
// polygon hold NaN. It implements plotter.GridXYZ.
type grid struct {
	x0, y0, dx, dy float64 // lower-left corner and cell sizes
	nx, ny         int
	z              []float64 // z[r*nx+c] is the value at cell (c, r)
}

func (g *grid) Dims() (c, r int)   { return g.nx, g.ny }
func (g *grid) Z(c, r int) float64 { return g.z[r*g.nx+c] }
func (g *grid) X(c int) float64    { return g.x0 + (float64(c)+0.5)*g.dx }
func (g *grid) Y(r int) float64    { return g.y0 + (float64(r)+0.5)*g.dy }

// sampleGrid evaluates mode k of m at the cell centres inside m.Polygon
// and normalises it.
func sampleGrid(m *Modes, k int) (*grid, error) {
	n := m.Samples
	if n == 0 {
		n = DefaultSamples2D
	}
	x0, x1, y0, y1 := boundingBox(m.Polygon)
	w, h := x1-x0, y1-y0
	cell := math.Max(w, h) / float64(n)
	g := &grid{x0: x0, y0: y0}
	g.nx = max(1, int(math.Round(w/cell)))
	g.ny = max(1, int(math.Round(h/cell)))
	g.dx, g.dy = w/float64(g.nx), h/float64(g.ny)
	g.z = make([]float64, g.nx*g.ny)
	for r := range g.ny {
		y := g.Y(r)
		for c := range g.nx {
			x := g.X(c)
			v := math.NaN()
			if inside(m.Polygon, x, y) {
				v = m.Eval(k, x, y)
				if math.IsNaN(v) || math.IsInf(v, 0) {
					return nil, &ModeError{Mode: k, At: [2]float64{x, y}, Value: v}
				}
			}
			g.z[r*g.nx+c] = v
		}
	}
	if !normalise(g.z) {
		return nil, &ModeError{Mode: k}
	}
	return g, nil
}

// normalise divides u by its entry of largest magnitude (the first one,
// on ties), so that this entry becomes +1 and every other lies in
// [−1, 1]; NaN entries are skipped and stay NaN. It reports false, leaving
// u unchanged, when no entry is nonzero. Dividing (rather than multiplying
// by a reciprocal) keeps |u_i/peak| ≤ 1 exactly, since correctly rounded
// division is monotone.
func normalise(u []float64) (ok bool) {
	peak := 0.0
	for _, v := range u {
		if math.Abs(v) > math.Abs(peak) {
			peak = v
		}
	}
	if peak == 0 {
		return false
	}
	for i := range u {
		u[i] /= peak
	}
	return true
}

// inside reports whether (x, y) lies inside the polygon by the even–odd
// rule (a horizontal ray crossing count). Points on the boundary may go
// either way; this decides only which grid cells are painted.
func inside(poly [][2]float64, x, y float64) bool {
	in := false
	j := len(poly) - 1
	for i := range poly {
		xi, yi := poly[i][0], poly[i][1]
		xj, yj := poly[j][0], poly[j][1]
		if (yi > y) != (yj > y) && x < xi+(y-yi)*(xj-xi)/(yj-yi) {
			in = !in
		}
		j = i
	}
	return in
}

// boundingBox returns the smallest box [x0, x1] × [y0, y1] holding pts.
func boundingBox(pts [][2]float64) (x0, x1, y0, y1 float64) {
	x0, y0 = math.Inf(1), math.Inf(1)
	x1, y1 = math.Inf(-1), math.Inf(-1)
	for _, p := range pts {
		x0, x1 = math.Min(x0, p[0]), math.Max(x1, p[0])
		y0, y1 = math.Min(y0, p[1]), math.Max(y1, p[1])
	}
	return x0, x1, y0, y1
}
