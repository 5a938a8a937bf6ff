package plot

import (
	"cmp"
	"fmt"
	"math"
	"math/big"
	"slices"
	"strings"

	"gapcert/fem/problem"
	"gapcert/interval"
	"gapcert/interval/decimalio"
)

// axisNames are the coordinates of space, as a slice names its axis.
var axisNames = [3]string{"x", "y", "z"}

// planeAxes are, for a slice across axis a, the two coordinates (u, v) of
// its plane, in the order pictures use as horizontal and vertical axes.
var planeAxes = [3][2]int{{1, 2}, {0, 2}, {0, 1}}

// Slice is the plane {p : p[Axis] = Value} through a solid.
type Slice struct {
	Axis  int      // 0, 1 or 2 for x, y or z
	Value *big.Rat // the exact coordinate of the plane
}

// String returns the plane as an equation, "z = 0.5": the value as a
// decimal when it has at most 12 digits after the point, else as p/q.
func (s Slice) String() string {
	return axisNames[s.Axis] + " = " + ratText(s.Value)
}

// ratText writes r as a decimal when its denominator divides 10^12, else
// as "p/q".
func ratText(r *big.Rat) string {
	ten := big.NewInt(10)
	pow := big.NewInt(1)
	for k := 0; k <= 12; k++ {
		if new(big.Int).Rem(pow, r.Denom()).Sign() == 0 {
			return r.FloatString(k)
		}
		pow.Mul(pow, ten)
	}
	return r.RatString()
}

// ParseSlice reads a slice plane written "AXIS=VALUE" ("z=1/2", "x = 0.25"):
// an axis x, y or z and an exact decimal or rational value (package
// interval/decimalio). The error says what is wrong, with a hint.
func ParseSlice(text string) (Slice, error) {
	name, value, ok := strings.Cut(text, "=")
	name, value = strings.TrimSpace(name), strings.TrimSpace(value)
	axis := slices.Index(axisNames[:], name)
	if !ok || axis < 0 {
		return Slice{}, fmt.Errorf("slice %q: want AXIS=VALUE with AXIS x, y or z (hint: --slice z=1/2)", text)
	}
	r, err := decimalio.ParseRat(value)
	if err != nil {
		return Slice{}, fmt.Errorf("slice %q: the value %q is not an exact decimal or rational number (hint: --slice %s=1/2)", text, value, name)
	}
	return Slice{Axis: axis, Value: r}, nil
}

// MidSection returns the section of ph by a plane z = c about halfway up
// (MidSectionAcross with the z axis).
func MidSection(ph *problem.Polyhedron) (*Section, error) { return MidSectionAcross(ph, 2) }

// MidSectionAcross returns the section of ph by a plane across axis a
// (0, 1, 2 for x, y, z) about halfway (a choice): the plane x[a] = c with
// c the midpoint of the least and greatest vertex coordinates along a,
// rounded to a decimal with a step of a hundredth of the leading power of
// ten of the extent, moved by such steps (+1, −1, +2, …, up to ±10) while
// the plane passes through a vertex. It panics if a is not 0, 1 or 2.
func MidSectionAcross(ph *problem.Polyhedron, a int) (*Section, error) {
	if a < 0 || a > 2 {
		panic(fmt.Sprintf("plot: MidSectionAcross with axis %d", a))
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, v := range ph.Vertices {
		lo, hi = math.Min(lo, v[a].Val.Mid()), math.Max(hi, v[a].Val.Mid())
	}
	// step = 10^e/100 with 10^e ≤ hi − lo, as an exact rational.
	e := int(math.Floor(math.Log10(hi-lo))) - 2
	step := new(big.Rat).SetInt(new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(max(e, -e))), nil))
	if e < 0 {
		step.Inv(step)
	}
	stepF, _ := step.Float64()
	mid := math.Round((lo + hi) / 2 / stepF)
	var err error
	for j := range 21 {
		off := (j + 1) / 2
		if j%2 == 0 {
			off = -off
		}
		c := new(big.Rat).Mul(step, new(big.Rat).SetFloat64(mid+float64(off)))
		var sec *Section
		if sec, err = NewSection(ph, Slice{Axis: a, Value: c}); err == nil {
			return sec, nil
		}
	}
	return nil, err
}

// DefaultSections returns the candidate default sections of ph, for
// PickSection: about halfway across z, x and y in that order
// (MidSectionAcross), those that can be drawn; the error is z's when none
// can.
func DefaultSections(ph *problem.Polyhedron) ([]*Section, error) {
	var out []*Section
	var first error
	for _, a := range []int{2, 0, 1} {
		sec, err := MidSectionAcross(ph, a)
		if err != nil {
			first = cmp.Or(first, err)
			continue
		}
		out = append(out, sec)
	}
	if len(out) == 0 {
		return nil, first
	}
	return out, nil
}

// pickSamples is the grid of PickSection's samples (cells along the
// longer side), and pickNodal the fraction of a mode's largest sampled
// magnitude over all candidates below which a section counts as (nearly)
// a nodal set of that mode (choices).
const (
	pickSamples = 24
	pickNodal   = 0.05
)

// PickSection returns the first of candidates (at least one) on which no
// mode of s (s.Eval, one per label) nearly vanishes, or the first when
// every one does: the modes are sampled on each candidate, and a
// candidate is nodal for mode k when its largest |u_k| is below pickNodal
// times the largest over all candidates. A mode whose nodal set holds the
// default plane (the second Dirichlet mode sin(πx) sin(πy) sin(πz) of the
// box [0, 1]² × [0, 2] at z = 1) would otherwise show the noise of its
// floating-point zeros. A choice; s.Section is not changed.
func PickSection(s *Solid, candidates []*Section) *Section {
	if len(candidates) == 0 {
		panic("plot: PickSection without candidates")
	}
	peaks := make([][]float64, len(candidates))
	top := make([]float64, len(s.Labels))
	for i, sec := range candidates {
		t := *s
		t.Section, t.Samples = sec, pickSamples
		for k := range s.Labels {
			peak := 0.0 // a mode that is not finite here: drawn nowhere (WriteSolid's error)
			if g, err := sectionValues(&t, k); err == nil {
				for _, z := range g.z {
					if !math.IsNaN(z) {
						peak = math.Max(peak, math.Abs(z))
					}
				}
			}
			peaks[i] = append(peaks[i], peak)
			top[k] = math.Max(top[k], peak)
		}
	}
	for i, sec := range candidates {
		nodal := false
		for k, peak := range peaks[i] {
			nodal = nodal || !(peak >= pickNodal*top[k])
		}
		if !nodal {
			return sec
		}
	}
	return candidates[0]
}

// A SliceError reports a slice plane that cannot be drawn: it misses the
// solid's interior, passes through a vertex, or a vertex's side of it
// cannot be decided. It is found before any mode is computed.
type SliceError struct {
	Slice  Slice
	Reason string
	Hint   string
}

func (e *SliceError) Error() string {
	return fmt.Sprintf("slice %s: %s (hint: %s)", e.Slice, e.Reason, e.Hint)
}

// Section is the cross-section of a polyhedron by a slice plane: closed
// polygonal loops in the plane's coordinates (u, v) (planeAxes: y, z for a
// slice across x; x, z across y; x, y across z) whose even–odd interior is
// the section of the solid. Each loop vertex is an enclosure of the exact
// point where an edge of the faces' triangulation crosses the plane;
// consecutive crossings on one face are merged, so that the loop turns at
// every vertex (its corners lie on the polyhedron's edges). Faces[l][i] is
// the polyhedron face that holds the side from loop vertex i to vertex
// i+1 (mod n) of loop l.
type Section struct {
	Slice Slice
	Loops [][][2]interval.I
	Faces [][]int
}

// NewSection returns the section of ph by the plane s, or a *SliceError
// when the plane does not cut the interior or passes through a vertex
// (a section through a vertex is not drawn; any other value near it is).
//
// Which side of the plane each vertex lies on is decided exactly (the
// vertex's rational coordinate against s.Value) or by disjoint enclosures;
// with no vertex on the plane, every triangle of the faces' triangulation
// that has vertices on both sides is crossed by exactly two of its edges,
// and every crossed edge lies in exactly two triangles (the surface is
// closed), so the crossing segments form disjoint closed loops, which are
// found by the shared edges alone. The crossing point of edge (P_i, P_j),
// i < j, is P_i + t (P_j − P_i) with t = (c − P_i[a])/(P_j[a] − P_i[a]),
// enclosed in interval arithmetic from the vertex enclosures.
func NewSection(ph *problem.Polyhedron, s Slice) (*Section, error) {
	a := s.Axis
	if a < 0 || a > 2 || s.Value == nil {
		panic("plot: Slice needs an axis 0, 1 or 2 and a value")
	}
	c := decimalio.FromRat(s.Value)
	side := make([]int, len(ph.Vertices))
	lowest, highest := 0, 0
	below, above := false, false
	for k, v := range ph.Vertices {
		x := v[a]
		switch {
		case x.Rat != nil:
			side[k] = x.Rat.Cmp(s.Value)
		case x.Val.Hi < c.Lo:
			side[k] = -1
		case x.Val.Lo > c.Hi:
			side[k] = 1
		default:
			return nil, &SliceError{Slice: s, Reason: fmt.Sprintf("cannot decide on which side of the plane vertex %d (%s = %s) lies", k, axisNames[a], x.Text),
				Hint: "move the plane a little"}
		}
		below, above = below || side[k] < 0, above || side[k] > 0
		if x.Val.Mid() < ph.Vertices[lowest][a].Val.Mid() {
			lowest = k
		}
		if x.Val.Mid() > ph.Vertices[highest][a].Val.Mid() {
			highest = k
		}
	}
	if !below || !above {
		lo, hi := ph.Vertices[lowest][a].Text, ph.Vertices[highest][a].Text
		return nil, &SliceError{Slice: s, Reason: fmt.Sprintf("the plane misses the solid, whose %s runs from %s to %s", axisNames[a], lo, hi),
			Hint: fmt.Sprintf("give a value strictly between %s and %s", lo, hi)}
	}
	if k := slices.Index(side, 0); k >= 0 {
		return nil, &SliceError{Slice: s, Reason: fmt.Sprintf("the plane passes through vertex %d, where the section is not drawn", k),
			Hint: "move the plane a little off the vertex"}
	}

	// The crossing segments, one per crossed triangle, each from one
	// crossed edge (a sorted vertex pair) to the other.
	type segment struct {
		ends [2][2]int
		face int
	}
	var segs []segment
	bySide := map[[2]int][]int{} // crossed edge → its two segments
	for k, tr := range ph.Triangles() {
		var ends [][2]int
		for i := range 3 {
			p, q := tr[i], tr[(i+1)%3]
			if side[p] != side[q] {
				ends = append(ends, [2]int{min(p, q), max(p, q)})
			}
		}
		if len(ends) == 0 {
			continue
		}
		for _, e := range ends {
			bySide[e] = append(bySide[e], len(segs))
		}
		segs = append(segs, segment{ends: [2][2]int{ends[0], ends[1]}, face: ph.TriangleFaces()[k]})
	}
	for e, ss := range bySide {
		if len(ss) != 2 {
			panic(fmt.Sprintf("plot: edge %v of the faces' triangulation lies in %d crossed triangles, not 2", e, len(ss)))
		}
	}

	sec := &Section{Slice: s}
	used := make([]bool, len(segs))
	for first := range segs {
		if used[first] {
			continue
		}
		// Walk the loop: the edge points in order, and the face of the
		// segment that leaves each.
		var edges [][2]int
		var faces []int
		at, edge := first, segs[first].ends[0]
		for {
			used[at] = true
			edges = append(edges, edge)
			faces = append(faces, segs[at].face)
			if edge = segs[at].ends[1]; edge == edges[len(edges)-1] {
				edge = segs[at].ends[0]
			}
			next := bySide[edge][0]
			if next == at {
				next = bySide[edge][1]
			}
			if used[next] {
				break
			}
			at = next
		}
		// Keep the points where the loop changes face.
		var loop [][2]interval.I
		var loopFaces []int
		n := len(edges)
		for i := range n {
			if faces[(i+n-1)%n] == faces[i] {
				continue
			}
			q, ok := crossing(ph, edges[i], a, c)
			if !ok {
				return nil, &SliceError{Slice: s, Reason: fmt.Sprintf("cannot enclose where the edge from vertex %d to vertex %d crosses the plane (its ends are closer than their enclosures)", edges[i][0], edges[i][1]),
					Hint: "move the plane a little"}
			}
			loop = append(loop, q)
			loopFaces = append(loopFaces, faces[i])
		}
		loop, loopFaces = normalLoop(loop, loopFaces)
		sec.Loops = append(sec.Loops, loop)
		sec.Faces = append(sec.Faces, loopFaces)
	}
	return sec, nil
}

// crossing encloses the point where the edge e = (P_i, P_j), i < j,
// crosses the plane x[a] = c, in the plane's coordinates; ok is false when
// the enclosure of P_j[a] − P_i[a] contains 0 (ends on opposite sides of
// the plane, decided exactly, can still have overlapping enclosures when
// they are closer than the enclosures' widths).
func crossing(ph *problem.Polyhedron, e [2]int, a int, c interval.I) (q [2]interval.I, ok bool) {
	p, r := ph.Vertices[e[0]], ph.Vertices[e[1]]
	den := r[a].Val.Sub(p[a].Val)
	if den.ContainsZero() {
		return q, false
	}
	t := c.Sub(p[a].Val).Div(den)
	for i, b := range planeAxes[a] {
		q[i] = p[b].Val.Add(t.Mul(r[b].Val.Sub(p[b].Val)))
	}
	return q, true
}

// normalLoop orders a loop counterclockwise (by the signed area of its
// midpoints, a choice for drawing) and starts it at its lowest-then-leftmost
// point, so that a section does not depend on the order of the faces.
// faces[i] stays the face of the side from point i to point i+1.
func normalLoop(loop [][2]interval.I, faces []int) ([][2]interval.I, []int) {
	n := len(loop)
	area := 0.0
	for i := range n {
		p, q := loop[i], loop[(i+1)%n]
		area += p[0].Mid()*q[1].Mid() - q[0].Mid()*p[1].Mid()
	}
	if area < 0 {
		rl := make([][2]interval.I, n)
		rf := make([]int, n)
		for i := range n {
			rl[i] = loop[(n-i)%n]
			rf[i] = faces[(2*n-i-1)%n] // the side from rl[i] to rl[i+1] is loop's side from (n−i−1) to (n−i)
		}
		loop, faces = rl, rf
	}
	start := 0
	for i, p := range loop {
		q := loop[start]
		if p[1].Mid() < q[1].Mid() || p[1].Mid() == q[1].Mid() && p[0].Mid() < q[0].Mid() {
			start = i
		}
	}
	return append(loop[start:], loop[:start]...), append(faces[start:], faces[:start]...)
}

// midLoops returns the loops of s at the midpoints of their enclosures.
func (s *Section) midLoops() [][][2]float64 {
	out := make([][][2]float64, len(s.Loops))
	for l, loop := range s.Loops {
		for _, p := range loop {
			out[l] = append(out[l], [2]float64{p[0].Mid(), p[1].Mid()})
		}
	}
	return out
}

// point returns the point of space with plane coordinates (u, v).
func (s *Section) point(u, v float64) [3]float64 {
	var p [3]float64
	a := s.Slice.Axis
	p[a], _ = s.Slice.Value.Float64()
	p[planeAxes[a][0]], p[planeAxes[a][1]] = u, v
	return p
}
