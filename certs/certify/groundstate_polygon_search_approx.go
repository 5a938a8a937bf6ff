package certify

import (
	"math"
	"math/big"
	"sort"

	"gapcert/temple/groundstate"
)

// This file only chooses: where to look for a witness that the ground
// state of a polygon is not log-concave, in floating point. The triples it
// returns are then certified (or not) by groundstate.CertifyMidpoint.

// polygonSearchCells is about how many coarse grid steps span the larger
// side of the bounding box of the polygon.
const polygonSearchCells = 40

// polygonSearchFloor drops grid points where ũ is below this fraction of
// its largest grid value: near a Dirichlet side the discs are small and
// the relative enclosures wide, so no witness can be certified there.
const polygonSearchFloor = 0.1

// triple is a candidate x, y, m = (x + y)/2 (m exact) and, once certified,
// its result.
type triple struct {
	x, y, m [2]float64
	score   float64
	res     groundstate.MidpointResult
}

// orient negates the vector (exactly) if ũ is mostly negative, so that
// the search sees ũ > 0 inside.
func (g *polygonGS) orient() {
	s := 0.0
	for _, c := range g.vec {
		s += c
	}
	if s >= 0 {
		return
	}
	neg := make([]float64, len(g.vec))
	for i, c := range g.vec {
		neg[i] = -c
	}
	g.vec = neg
}

// bestTriple searches a dyadic grid for the triples where log ũ is least
// concave, with room for the enclosures (largest (ũ(x)ũ(y) − ũ(m)² −
// expected loss)/ũ(m)² in floating point, the loss from the mean term of
// the disc enclosures at the three points), certifies
// the polygonCandidates best ones and returns the one with the largest
// certified margin (nil if none could be enclosed) and how many were tried.
//
// The grid. Step h = 2^k (about polygonSearchCells steps across the
// polygon), coarse points o + h·(i, j) with a dyadic offset o (a fraction
// of h in 1/32ths, so that the points avoid the mesh edges of dyadic
// meshes), fine points o + (h/2)·(i, j). The midpoint of two coarse points
// is a fine point, and every coordinate is a small multiple of h/64, so
// the sums and halvings are exact in float64 (checked again by
// groundstate.CertifyMidpoint).
func (g *polygonGS) bestTriple() (*triple, int, error) {
	cands := g.searchTriples()
	var best *triple
	tried := 0
	for i := range cands {
		c := &cands[i]
		if m, ok := groundstate.ExactMidpoint(c.x, c.y); !ok || m != c.m {
			continue // far from the origin the grid sums may round
		}
		dx, okx := g.disc(c.x)
		dy, oky := g.disc(c.y)
		dm, okm := g.disc(c.m)
		if !okx || !oky || !okm {
			continue
		}
		tried++
		res, err := groundstate.CertifyMidpoint(g.v, g.lambda, g.errL2, dx, dy, dm, groundstate.DiscOptions{})
		if err != nil {
			return nil, tried, err
		}
		c.res = res
		if best == nil || (res.Certified && !best.res.Certified) ||
			(res.Certified == best.res.Certified && res.Margin > best.res.Margin) {
			best = c
		}
	}
	return best, tried, nil
}

// searchTriples returns the polygonCandidates best triples of the grid
// searches, best first: one grid over the whole polygon and, around each
// corner of the polygon, grids with steps h/4, h/16, h/64 (log u may fail
// to be concave only near a corner: at a corner of angle θ > π/2 the
// ground state has a term r^(π/θ) whose Hessian is unbounded).
func (g *polygonGS) searchTriples() []triple {
	m := g.space.Mesh()
	xmin, ymin := math.Inf(1), math.Inf(1)
	xmax, ymax := math.Inf(-1), math.Inf(-1)
	for t := range m.Tris {
		for _, v := range m.Vertices(t) {
			xmin, xmax = math.Min(xmin, v[0].Mid()), math.Max(xmax, v[0].Mid())
			ymin, ymax = math.Min(ymin, v[1].Mid()), math.Max(ymax, v[1].Mid())
		}
	}
	span := math.Max(xmax-xmin, ymax-ymin)
	if !(span > 0) || math.IsInf(span, 0) {
		return nil
	}
	h := math.Exp2(math.Floor(math.Log2(span / polygonSearchCells)))
	top, all := g.searchGrid(xmin, ymin, xmax, ymax, h, 0)
	for c := range m.NumCorners() {
		cx, cy := m.Nodes[c][0].Mid(), m.Nodes[c][1].Mid()
		for s := h / 4; s >= h/64; s /= 4 {
			r := polygonCornerCells * s
			_, near := g.searchGrid(cx-r, cy-r, cx+r, cy+r, s, top)
			all = append(all, near...)
		}
	}
	sort.SliceStable(all, func(k, l int) bool { return all[k].score > all[l].score })
	return all[:min(len(all), polygonCandidates)]
}

// polygonCornerCells is the half side, in steps, of a grid about a corner.
const polygonCornerCells = 12

// searchGrid searches the grid of step h (coarse points, h/2 fine points)
// over the box [x0, x1]×[y0, y1] and returns the largest grid value of ũ
// and the polygonCandidates best triples whose values are above
// polygonSearchFloor·max(top, that largest value).
func (g *polygonGS) searchGrid(x0, y0, x1, y1, h, top float64) (float64, []triple) {
	hf := h / 2
	ox := math.Floor(x0/h)*h + h*13/32
	oy := math.Floor(y0/h)*h + h*7/32
	nx := int((x1-ox)/hf) + 1
	ny := int((y1-oy)/hf) + 1
	if nx <= 0 || ny <= 0 {
		return top, nil
	}
	val := make([]float64, nx*ny)
	dist := make([]float64, nx*ny)
	for i := range val {
		val[i] = math.NaN()
	}
	g.sample(ox, oy, hf, nx, ny, val, dist)
	// The expected half-width of an enclosure at a grid point: the mean
	// term E/(√π R) of the disc enclosure, which dominates.
	spread := func(k int) float64 { return g.errL2 / (math.SqrtPi * dist[k]) }
	for _, u := range val {
		if u > top {
			top = u
		}
	}
	floor := polygonSearchFloor * top
	type pt struct {
		i, j  int
		u, eu float64
	}
	var coarse []pt
	for j := 0; j < ny; j += 2 {
		for i := 0; i < nx; i += 2 {
			if u := val[j*nx+i]; u > floor {
				coarse = append(coarse, pt{i, j, u, spread(j*nx + i)})
			}
		}
	}
	var best []triple
	worst := math.Inf(-1)
	for a := range coarse {
		for b := a + 1; b < len(coarse); b++ {
			pa, pb := coarse[a], coarse[b]
			mi, mj := (pa.i+pb.i)/2, (pa.j+pb.j)/2
			um := val[mj*nx+mi]
			if !(um > floor) {
				continue
			}
			// The float margin less what the enclosures are expected to
			// lose, relative to ũ(m)².
			em := spread(mj*nx + mi)
			loss := pa.eu*pb.u + pb.eu*pa.u + pa.eu*pb.eu + 2*um*em + em*em
			score := (pa.u*pb.u - um*um - loss) / (um * um)
			if len(best) == polygonCandidates && score <= worst {
				continue
			}
			at := func(i, j int) [2]float64 { return [2]float64{ox + float64(i)*hf, oy + float64(j)*hf} }
			best = append(best, triple{x: at(pa.i, pa.j), y: at(pb.i, pb.j), m: at(mi, mj), score: score})
			sort.Slice(best, func(k, l int) bool { return best[k].score > best[l].score })
			if len(best) > polygonCandidates {
				best = best[:polygonCandidates]
			}
			worst = best[len(best)-1].score
		}
	}
	return top, best
}

// sample sets val[j*nx+i] to ũ(ox + i·hf, oy + j·hf) in floating point for
// the grid points strictly inside a triangle (by float barycentric
// coordinates of the vertex midpoints), NaN elsewhere, and dist[j*nx+i] to
// the distance from the point to the nearest side of its triangle (the
// radius of its disc).
func (g *polygonGS) sample(ox, oy, hf float64, nx, ny int, val, dist []float64) {
	s := g.space
	m := s.Mesh()
	p := s.Degree()
	// The Bernstein multinomials in the order of LocalDofs: α = (p−i−j, i, j).
	var alpha [][3]int
	var weight []float64
	for i := 0; i <= p; i++ {
		for j := 0; j <= p-i; j++ {
			a := [3]int{p - i - j, i, j}
			alpha = append(alpha, a)
			f, _ := new(big.Float).SetInt(multinomial(a)).Float64()
			weight = append(weight, f)
		}
	}
	for t := range m.Tris {
		v := m.Vertices(t)
		var vx, vy [3]float64
		for k := range 3 {
			vx[k], vy[k] = v[k][0].Mid(), v[k][1].Mid()
		}
		det := (vx[1]-vx[0])*(vy[2]-vy[0]) - (vx[2]-vx[0])*(vy[1]-vy[0])
		i0 := max(0, int(math.Floor((min3(vx)-ox)/hf)))
		i1 := min(nx-1, int(math.Ceil((max3(vx)-ox)/hf)))
		j0 := max(0, int(math.Floor((min3(vy)-oy)/hf)))
		j1 := min(ny-1, int(math.Ceil((max3(vy)-oy)/hf)))
		var height [3]float64 // λ_k = 1 at v_k: distance = λ_k·height_k
		for k := range 3 {
			a, b := (k+1)%3, (k+2)%3
			height[k] = math.Abs(det) / math.Hypot(vx[b]-vx[a], vy[b]-vy[a])
		}
		dofs := s.LocalDofs(t)
		for j := j0; j <= j1; j++ {
			y := oy + float64(j)*hf
			for i := i0; i <= i1; i++ {
				x := ox + float64(i)*hf
				var l [3]float64
				for k := range 3 {
					a, b := (k+1)%3, (k+2)%3
					l[k] = ((vx[b]-vx[a])*(y-vy[a]) - (vy[b]-vy[a])*(x-vx[a])) / det
				}
				if math.Min(l[0], math.Min(l[1], l[2])) <= 1e-12 {
					continue
				}
				u := 0.0
				for r, a := range alpha {
					if dofs[r] < 0 {
						continue
					}
					b := weight[r] * g.vec[dofs[r]]
					for k := range 3 {
						for range a[k] {
							b *= l[k]
						}
					}
					u += b
				}
				val[j*nx+i] = u
				dist[j*nx+i] = math.Min(l[0]*height[0], math.Min(l[1]*height[1], l[2]*height[2]))
			}
		}
	}
}

// multinomial returns |α|!/(α_0! α_1! α_2!).
func multinomial(a [3]int) *big.Int {
	r := new(big.Int).MulRange(1, int64(a[0]+a[1]+a[2]))
	for _, k := range a {
		r.Quo(r, new(big.Int).MulRange(1, int64(k)))
	}
	return r
}

func min3(x [3]float64) float64 { return math.Min(x[0], math.Min(x[1], x[2])) }
func max3(x [3]float64) float64 { return math.Max(x[0], math.Max(x[1], x[2])) }
