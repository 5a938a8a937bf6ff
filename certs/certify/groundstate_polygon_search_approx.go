package certify

import (
	"errors"
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
// certified margin (nil if none could be enclosed), how many were tried
// and how many of those were skipped because V could not be modelled on
// one of their discs (a *groundstate.PotentialError: V undefined or
// unbounded on the box around a disc, which may reach outside the
// polygon). Skipping a candidate only makes the answer less useful, never
// false: the block is then decided on the others.
//
// The grid. Step h = 2^k (about polygonSearchCells steps across the
// polygon), coarse points o + h·(i, j) with a dyadic offset o (a fraction
// of h in 1/32ths, so that the points avoid the mesh edges of dyadic
// meshes), fine points o + (h/2)·(i, j). The midpoint of two coarse points
// is a fine point, and every coordinate is a small multiple of h/64, so
// the sums and halvings are exact in float64 (checked again by
// groundstate.CertifyMidpoint).
func (g *polygonGS) bestTriple() (best *triple, tried, skipped int, err error) {
	cands := g.searchTriples()
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
		var pe *groundstate.PotentialError
		if errors.As(err, &pe) {
			skipped++
			continue
		}
		if err != nil {
			return nil, tried, skipped, err
		}
		c.res = res
		if best == nil || (res.Certified && !best.res.Certified) ||
			(res.Certified == best.res.Certified && res.Margin > best.res.Margin) {
			best = c
		}
	}
	return best, tried, skipped, nil
}

// searchTriples returns the polygonCandidates best triples of the
// searches, best first: the triples of triangle centres (searchIncentres),
// one grid over the whole polygon and, around each
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
	all = append(all, g.searchIncentres(math.Max(math.Max(-xmin, xmax), math.Max(-ymin, ymax)), top)...)
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
	e := g.newEvaluator()
	alpha, weight := e.alpha, e.weight
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

// polygonIncentreMax caps the number of points whose pairs
// searchIncentres tries on one level (every k-th triangle above it on
// level 0; finer levels are skipped), so that the search stays well below
// a second on fine meshes.
const polygonIncentreMax = 2048

// polygonIncentreLevels is how many levels of sub-triangles searchIncentres
// takes the centres of: level L splits each mesh triangle into 4^L
// similar ones (red refinement), whose centres are deep inside the mesh
// triangle (at least 2^−L times its inradius from its sides) and form a
// lattice 2^L times finer.
const polygonIncentreLevels = 3

// searchIncentres returns the polygonCandidates best triples x, y, m of
// centres of inscribed circles of the triangles of the mesh, refined
// 0, 1, … polygonIncentreLevels − 1 times (one level at a time; rounded to
// multiples of a power of 2 q about 2^−36·scale, scale ≥ every
// |coordinate|, so that x + y and its half are exact), whose midpoint m is,
// up to 4q, the centre of a third one: on a uniformly refined mesh the
// centres of the triangles of one orientation form a lattice, and the
// three discs of a triple then have radii as large as the mesh allows,
// which grid points, falling anywhere in their triangles, seldom have.
// Values below polygonSearchFloor·top are skipped, as in searchGrid; the
// score is the same.
func (g *polygonGS) searchIncentres(scale, top float64) []triple {
	if !(scale > 0) || math.IsInf(scale, 0) {
		return nil
	}
	m := g.space.Mesh()
	q := math.Exp2(math.Ceil(math.Log2(scale)) - 36)
	ev := g.newEvaluator()
	var best []triple
	for level := range polygonIncentreLevels {
		n := len(m.Tris) << (2 * level)
		if level > 0 && n > polygonIncentreMax {
			break
		}
		stride := max(1, (n+polygonIncentreMax-1)/polygonIncentreMax)
		var cs []incentre
		for t := 0; t < len(m.Tris); t += stride {
			v := m.Vertices(t)
			var tv [3][2]float64
			for k := range 3 {
				tv[k] = [2]float64{v[k][0].Mid(), v[k][1].Mid()}
			}
			for _, sub := range redRefine(tv, level) {
				x := incentreOf(sub)
				x = [2]float64{math.Round(x[0]/q) * q, math.Round(x[1]/q) * q}
				u, dist, ok := ev.at(t, x)
				if !ok || !(u > polygonSearchFloor*top) || !(dist > 4*q) {
					continue
				}
				cs = append(cs, incentre{x: x, u: u, eu: g.errL2 / (math.SqrtPi * (dist - 4*q))})
			}
		}
		best = append(best, g.latticeTriples(cs, q)...)
	}
	sort.SliceStable(best, func(k, l int) bool { return best[k].score > best[l].score })
	return best[:min(len(best), polygonCandidates)]
}

// incentre is a point deep inside a mesh triangle, the value of ũ there
// and the expected half-width of its enclosure.
type incentre struct {
	x     [2]float64
	u, eu float64
}

// latticeTriples returns the polygonCandidates best triples of points of
// cs whose midpoint is within 4q of a third point of cs.
func (g *polygonGS) latticeTriples(cs []incentre, q float64) []triple {
	type key [2]int64
	cell := 64 * q
	cells := make(map[key][]int32, len(cs))
	keyOf := func(x [2]float64) key { return key{int64(math.Floor(x[0] / cell)), int64(math.Floor(x[1] / cell))} }
	for i, c := range cs {
		k := keyOf(c.x)
		cells[k] = append(cells[k], int32(i))
	}
	// find returns a point within 4q of x, or −1: it lies in x's cell or
	// in a neighbour that x is within 4q of.
	find := func(x [2]float64) int {
		k := keyOf(x)
		for dx := int64(-1); dx <= 1; dx++ {
			if (dx == -1 && x[0]-float64(k[0])*cell > 4*q) || (dx == 1 && float64(k[0]+1)*cell-x[0] > 4*q) {
				continue
			}
			for dy := int64(-1); dy <= 1; dy++ {
				if (dy == -1 && x[1]-float64(k[1])*cell > 4*q) || (dy == 1 && float64(k[1]+1)*cell-x[1] > 4*q) {
					continue
				}
				for _, i := range cells[key{k[0] + dx, k[1] + dy}] {
					c := cs[i].x
					if math.Abs(c[0]-x[0]) <= 4*q && math.Abs(c[1]-x[1]) <= 4*q {
						return int(i)
					}
				}
			}
		}
		return -1
	}
	var best []triple
	worst := math.Inf(-1)
	for a := range cs {
		for b := a + 1; b < len(cs); b++ {
			pa, pb := cs[a], cs[b]
			mid := [2]float64{(pa.x[0] + pb.x[0]) / 2, (pa.x[1] + pb.x[1]) / 2}
			c := find(mid)
			if c < 0 {
				continue
			}
			um, em := cs[c].u, cs[c].eu
			loss := pa.eu*pb.u + pb.eu*pa.u + pa.eu*pb.eu + 2*um*em + em*em
			score := (pa.u*pb.u - um*um - loss) / (um * um)
			if len(best) == polygonCandidates && score <= worst {
				continue
			}
			best = append(best, triple{x: pa.x, y: pb.x, m: mid, score: score})
			sort.Slice(best, func(k, l int) bool { return best[k].score > best[l].score })
			if len(best) > polygonCandidates {
				best = best[:polygonCandidates]
			}
			worst = best[len(best)-1].score
		}
	}
	return best
}

// redRefine returns the 4^level triangles of level red refinements of v
// (each triangle split at its side midpoints into four similar ones).
func redRefine(v [3][2]float64, level int) [][3][2]float64 {
	out := [][3][2]float64{v}
	for range level {
		var next [][3][2]float64
		for _, t := range out {
			mid := func(a, b int) [2]float64 { return [2]float64{(t[a][0] + t[b][0]) / 2, (t[a][1] + t[b][1]) / 2} }
			m01, m12, m20 := mid(0, 1), mid(1, 2), mid(2, 0)
			next = append(next, [3][2]float64{t[0], m01, m20}, [3][2]float64{m01, t[1], m12},
				[3][2]float64{m20, m12, t[2]}, [3][2]float64{m12, m20, m01})
		}
		out = next
	}
	return out
}

// incentreOf returns the centre of the inscribed circle of v: the vertices
// weighted by the lengths of the opposite sides.
func incentreOf(v [3][2]float64) [2]float64 {
	var w [3]float64
	for k := range 3 {
		a, b := (k+1)%3, (k+2)%3
		w[k] = math.Hypot(v[b][0]-v[a][0], v[b][1]-v[a][1])
	}
	s := w[0] + w[1] + w[2]
	return [2]float64{(w[0]*v[0][0] + w[1]*v[1][0] + w[2]*v[2][0]) / s, (w[0]*v[0][1] + w[1]*v[1][1] + w[2]*v[2][1]) / s}
}

// evaluator evaluates ũ in floating point by the polynomial of one
// triangle.
type evaluator struct {
	g      *polygonGS
	alpha  [][3]int
	weight []float64
}

// newEvaluator returns an evaluator of ũ with the Bernstein multinomials
// in the order of LocalDofs: α = (p−i−j, i, j).
func (g *polygonGS) newEvaluator() *evaluator {
	p := g.space.Degree()
	e := &evaluator{g: g}
	for i := 0; i <= p; i++ {
		for j := 0; j <= p-i; j++ {
			a := [3]int{p - i - j, i, j}
			e.alpha = append(e.alpha, a)
			f, _ := new(big.Float).SetInt(multinomial(a)).Float64()
			e.weight = append(e.weight, f)
		}
	}
	return e
}

// at returns ũ(x) by the polynomial of triangle t and the distance from x
// to the nearest side of t, in floating point from the vertex midpoints;
// ok is false when x is not strictly inside t.
func (e *evaluator) at(t int, x [2]float64) (u, dist float64, ok bool) {
	s := e.g.space
	v := s.Mesh().Vertices(t)
	var vx, vy [3]float64
	for k := range 3 {
		vx[k], vy[k] = v[k][0].Mid(), v[k][1].Mid()
	}
	det := (vx[1]-vx[0])*(vy[2]-vy[0]) - (vx[2]-vx[0])*(vy[1]-vy[0])
	var l [3]float64
	dist = math.Inf(1)
	for k := range 3 {
		a, b := (k+1)%3, (k+2)%3
		l[k] = ((vx[b]-vx[a])*(x[1]-vy[a]) - (vy[b]-vy[a])*(x[0]-vx[a])) / det
		dist = math.Min(dist, l[k]*math.Abs(det)/math.Hypot(vx[b]-vx[a], vy[b]-vy[a]))
	}
	if math.Min(l[0], math.Min(l[1], l[2])) <= 1e-12 {
		return 0, 0, false
	}
	dofs := s.LocalDofs(t)
	for r, a := range e.alpha {
		if dofs[r] < 0 {
			continue
		}
		b := e.weight[r] * e.g.vec[dofs[r]]
		for k := range 3 {
			for range a[k] {
				b *= l[k]
			}
		}
		u += b
	}
	return u, dist, true
}
