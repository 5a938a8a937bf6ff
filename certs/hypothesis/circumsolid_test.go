package hypothesis

import (
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"strings"
	"testing"

	"gapcert/certs"
	"gapcert/fem/problem"
)

// polygonProblem returns the Dirichlet problem with V = 0 on the polygon
// with the given coordinate texts.
func polygonProblem(t testing.TB, xy ...string) *problem.Problem {
	t.Helper()
	var b strings.Builder
	b.WriteString(`{"polygon":[`)
	for i := 0; i < len(xy); i += 2 {
		if i > 0 {
			b.WriteByte(',')
		}
		fmt.Fprintf(&b, `[%q,%q]`, xy[i], xy[i+1])
	}
	b.WriteString(`]}`)
	p, err := parseProblem(problemText(b.String(), "0", `"dirichlet"`))
	if err != nil {
		t.Fatalf("%v: %v", xy, err)
	}
	return p
}

// regularPolygon returns the coordinate texts of the regular n-gon with
// vertices (cos(2πk/n), sin(2πk/n)).
func regularPolygon(n int) []string {
	var xy []string
	for k := range n {
		xy = append(xy, fmt.Sprintf("cos(%d*pi/%d)", 2*k, n), fmt.Sprintf("sin(%d*pi/%d)", 2*k, n))
	}
	return xy
}

// TestTangentialCases checks the verdicts on named shapes. Sources of the
// expected verdicts: every triangle has an incircle (Euclid, Elements
// IV.4); a regular polygon has an incircle about its centre (common
// practice); quadrilaterals by Pitot's theorem and its converse — a convex
// quadrilateral with sides a, b, c, d in order is tangential if and only
// if a + c = b + d (Pitot 1725, converse Durrande 1815, as stated in the
// introduction of M. Josefsson and M. Dalcín, More new characterizations
// of tangential quadrilaterals, Int. J. Geom. 10 (2021), no. 3, 21–47) —
// which makes kites and
// rhombi tangential, non-square rectangles not (2a ≠ 2b), the trapezoid
// with sides 3, √2, 1, √2 not (4 ≠ 2√2), and the isosceles trapezoid with
// bases 4, 1 and legs 5/2 tangential (5 = 5).
func TestTangentialCases(t *testing.T) {
	for _, tc := range []struct {
		name    string
		xy      []string
		tangent string
		product string
	}{
		{"right triangle 3-4-5", []string{"0", "0", "3", "0", "0", "4"}, certs.Proven, certs.Proven},
		{"obtuse triangle", []string{"0", "0", "4", "0", "-1", "1"}, certs.Proven, certs.Proven},
		{"equilateral triangle", []string{"0", "0", "1", "0", "1/2", "sqrt(3)/2"}, certs.Proven, certs.Proven},
		{"square", []string{"0", "0", "1", "0", "1", "1", "0", "1"}, certs.Proven, certs.Proven},
		{"rectangle 2 by 1", []string{"0", "0", "2", "0", "2", "1", "0", "1"}, certs.Disproven, certs.Proven},
		{"rectangle rotated, 5 by 10", []string{"0", "0", "4", "3", "-2", "11", "-6", "8"}, certs.Disproven, certs.Proven},
		{"kite", []string{"0", "0", "1", "-1", "3", "0", "1", "1"}, certs.Proven, certs.Proven},
		{"kite, irrational", []string{"0", "0", "1", "-sqrt(2)", "3", "0", "1", "sqrt(2)"}, certs.Proven, certs.Proven},
		{"rhombus", []string{"0", "0", "2", "-1", "4", "0", "2", "1"}, certs.Proven, certs.Proven},
		{"generic trapezoid", []string{"0", "0", "3", "0", "2", "1", "1", "1"}, certs.Disproven, certs.Disproven},
		{"tangential trapezoid", []string{"0", "0", "4", "0", "2.5", "2", "1.5", "2"}, certs.Proven, certs.Proven},
		{"regular hexagon", []string{"1", "0", "1/2", "sqrt(3)/2", "-1/2", "sqrt(3)/2", "-1", "0", "-1/2", "-sqrt(3)/2", "1/2", "-sqrt(3)/2"}, certs.Proven, certs.Proven},
		{"regular octagon", regularPolygon(8), certs.Proven, certs.Proven},
		{"regular dodecagon", regularPolygon(12), certs.Proven, certs.Proven},
		{"regular 24-gon", regularPolygon(24), certs.Proven, certs.Proven},
		{"regular pentagon", regularPolygon(5), certs.Proven, certs.Proven},
		{"regular heptagon", regularPolygon(7), certs.Proven, certs.Proven},
		{"regular 9-gon", regularPolygon(9), certs.Proven, certs.Proven},
		// Inscribed in the unit circle at 0, 2π/5, 2π/3, 5π/4, 7π/4: a
		// cyclic pentagon with unequal sides.
		{"cyclic pentagon", []string{"1", "0", "cos(2*pi/5)", "sin(2*pi/5)", "cos(2*pi/3)", "sin(2*pi/3)", "cos(5*pi/4)", "sin(5*pi/4)", "cos(7*pi/4)", "sin(7*pi/4)"}, certs.Disproven, certs.Disproven},
		// 2 by 1, rotated by π/6 and by 2π/5: not tangential, and a
		// rectangle decided exactly (Rectangle's enclosures cannot).
		{"rectangle 2 by 1 rotated by pi/6", []string{"0", "0", "sqrt(3)", "1", "sqrt(3)-1/2", "1+sqrt(3)/2", "-1/2", "sqrt(3)/2"}, certs.Disproven, certs.Proven},
		{"rectangle 2 by 1 rotated by 2pi/5", []string{"0", "0", "2*cos(2*pi/5)", "2*sin(2*pi/5)", "2*cos(2*pi/5)-sin(2*pi/5)", "2*sin(2*pi/5)+cos(2*pi/5)", "-sin(2*pi/5)", "cos(2*pi/5)"}, certs.Disproven, certs.Proven},
		{"square rotated by pi/12", []string{"0", "0", "cos(pi/12)", "sin(pi/12)", "cos(pi/12)-sin(pi/12)", "sin(pi/12)+cos(pi/12)", "-sin(pi/12)", "cos(pi/12)"}, certs.Proven, certs.Proven},
		// The L-shape of three unit squares is not convex (vertex 3).
		{"L-shape", []string{"0", "0", "2", "0", "2", "1", "1", "1", "1", "2", "0", "2"}, certs.Disproven, certs.Disproven},
	} {
		p := polygonProblem(t, tc.xy...)
		h := Tangential(p)
		requireVerdict(t, tc.name, h, tc.tangent)
		if h.Name != TangentialPolygon {
			t.Errorf("%s: name %q", tc.name, h.Name)
		}
		requireVerdict(t, tc.name+" (product)", ProductOfCircumsolids(p), tc.product)
	}
}

// TestTangentialWitness: the trapezoid's first side off the circle of
// sides 0, 1, 2 is side 3 (the only one checked); the L-shape's witness is
// its re-entrant vertex 3 (1, 1).
func TestTangentialWitness(t *testing.T) {
	h := Tangential(polygonProblem(t, "0", "0", "3", "0", "2", "1", "1", "1"))
	if h.Witness == nil || h.Witness.Side == nil || *h.Witness.Side != 3 {
		t.Errorf("trapezoid witness %+v, want side 3", h.Witness)
	}
	h = Tangential(polygonProblem(t, "0", "0", "2", "0", "2", "1", "1", "1", "1", "2", "0", "2"))
	if h.Witness == nil || h.Witness.Vertex == nil || *h.Witness.Vertex != 3 || !strings.Contains(h.Detail, "convex") {
		t.Errorf("L-shape: %s, witness %+v, want vertex 3 and a word on convexity", h.Detail, h.Witness)
	}
	h = ProductOfCircumsolids(polygonProblem(t, "0", "0", "3", "0", "2", "1", "1", "1"))
	if h.Witness == nil || h.Witness.Side == nil || h.Witness.Vertex == nil {
		t.Errorf("trapezoid product witness %+v, want a side and a vertex", h.Witness)
	}
}

// TestTangentialIntervalsOnly: coordinates not read exactly (exp(0) is 1,
// but exp is not among the exact forms) leave a tangential square
// undecided, never proven, while a non-tangential trapezoid is still
// disproven by the enclosure of its residual; the regular pentagon written
// with the nested radical sin(2π/5) = √(10 + 2√5)/4 (common practice) is
// undecided although tangential. The interval is not a polygon, but it is
// a circumsolid (an interval is its own inscribed ball).
func TestTangentialIntervalsOnly(t *testing.T) {
	requireVerdict(t, "square with exp(0)", Tangential(polygonProblem(t, "0", "0", "exp(0)", "0", "1", "1", "0", "1")), certs.Undecided)
	requireVerdict(t, "trapezoid with exp(0)", Tangential(polygonProblem(t, "0", "0", "3*exp(0)", "0", "2", "1", "1", "1")), certs.Disproven)
	pentagon := regularPolygon(5)
	pentagon[3], pentagon[9] = "sqrt(10+2*sqrt(5))/4", "-sqrt(10+2*sqrt(5))/4"
	requireVerdict(t, "regular pentagon, nested radicals", Tangential(polygonProblem(t, pentagon...)), certs.Undecided)
	requireVerdict(t, "regular pentagon, nested radicals (product)", ProductOfCircumsolids(polygonProblem(t, pentagon...)), certs.Undecided)
	// A unit square with vertex 3 moved by δ = √2 − 1.4142135623730951
	// ≈ −1.2e-17: the enclosures cannot see that corner 0 is oblique, the
	// exact test can; tangency (Pitot defect 1 − δ − √(1 + δ²) ≈ −δ) needs
	// √(1 + δ²), a square root of a surd, and stays undecided.
	nearSquare := polygonProblem(t, "0", "0", "1", "0", "1", "1", "sqrt(2)-1.4142135623730951", "1")
	requireVerdict(t, "near-square, Rectangle", Rectangle(nearSquare), certs.Undecided)
	requireVerdict(t, "near-square", Tangential(nearSquare), certs.Undecided)
	h := ProductOfCircumsolids(nearSquare)
	requireVerdict(t, "near-square (product)", h, certs.Undecided)
	if !strings.Contains(h.Detail, "vertex 0 is not a right angle (decided exactly)") {
		t.Errorf("near-square: %s, want corner 0 decided oblique exactly", h.Detail)
	}
	p := parse(t, problemText(`{"interval":["0","1"]}`, "0", `"dirichlet"`))
	requireVerdict(t, "interval", Tangential(p), certs.Undecided)
	requireVerdict(t, "interval (product)", ProductOfCircumsolids(p), certs.Proven)
}

// tangentPoint returns the rational point ((1 − s²)/(1 + s²), 2s/(1 + s²))
// of the unit circle (the rational parametrisation, common practice).
func tangentPoint(s *big.Rat) [2]*big.Rat {
	s2 := new(big.Rat).Mul(s, s)
	den := new(big.Rat).Add(big.NewRat(1, 1), s2)
	x := new(big.Rat).Quo(new(big.Rat).Sub(big.NewRat(1, 1), s2), den)
	y := new(big.Rat).Quo(new(big.Rat).Mul(big.NewRat(2, 1), s), den)
	return [2]*big.Rat{x, y}
}

// randomTangential returns the polygon circumscribed about the unit
// circle, tangent to it at n rational points at angles spread around the
// circle with gaps below π: the tangents at p and q on the unit circle
// meet at (p + q)/(1 + p·q) (common practice), a rational point.
func randomTangential(rng *rand.Rand, n int) [][2]*big.Rat {
	var ts [][2]*big.Rat
	for k := range n {
		// An angle in the k-th of n equal arcs (gaps < 2·2π/n ≤ π for
		// n ≥ 4), written through s = tan(θ/2), rounded to a rational.
		theta := 2 * math.Pi * (float64(k) + 0.2 + 0.6*rng.Float64()) / float64(n)
		s := new(big.Rat).SetFrac64(int64(math.Round(math.Tan(theta/2)*1000)), 1000)
		if math.Abs(theta-math.Pi) < 1e-3 {
			s = big.NewRat(1000, 1)
		}
		ts = append(ts, tangentPoint(s))
	}
	var v [][2]*big.Rat
	for k := range n {
		p, q := ts[(k+n-1)%n], ts[k]
		dot := new(big.Rat).Add(new(big.Rat).Mul(p[0], q[0]), new(big.Rat).Mul(p[1], q[1]))
		den := dot.Add(dot, big.NewRat(1, 1))
		v = append(v, [2]*big.Rat{
			new(big.Rat).Quo(new(big.Rat).Add(p[0], q[0]), den),
			new(big.Rat).Quo(new(big.Rat).Add(p[1], q[1]), den),
		})
	}
	return v
}

func ratTexts(v [][2]*big.Rat) []string {
	var xy []string
	for _, p := range v {
		xy = append(xy, p[0].RatString(), p[1].RatString())
	}
	return xy
}

// floatResidual returns, in floating point, the largest |d_j(c) − r| over
// the sides, where (c, r) is the circle tangent to the lines of sides 0,
// 1, 2 (solved by Cramer's rule): an oracle independent of the decider's
// determinant expansion, meaningful when its value is far from 0.
func floatResidual(v [][2]*big.Rat) float64 {
	n := len(v)
	f := func(r *big.Rat) float64 { x, _ := r.Float64(); return x }
	line := func(i int) (nx, ny, h float64) { // ñ·c − h = signed distance
		ax, ay, bx, by := f(v[i][0]), f(v[i][1]), f(v[(i+1)%n][0]), f(v[(i+1)%n][1])
		ex, ey := bx-ax, by-ay
		l := math.Hypot(ex, ey)
		nx, ny = -ey/l, ex/l
		return nx, ny, nx*ax + ny*ay
	}
	var m [3][4]float64
	for i := range 3 {
		nx, ny, h := line(i)
		m[i] = [4]float64{nx, ny, -1, h}
	}
	det := func(c0, c1, c2 int) float64 {
		return m[0][c0]*(m[1][c1]*m[2][c2]-m[1][c2]*m[2][c1]) -
			m[0][c1]*(m[1][c0]*m[2][c2]-m[1][c2]*m[2][c0]) +
			m[0][c2]*(m[1][c0]*m[2][c1]-m[1][c1]*m[2][c0])
	}
	d := det(0, 1, 2)
	cx, cy, r := det(3, 1, 2)/d, det(0, 3, 2)/d, det(0, 1, 3)/d
	worst := 0.0
	for j := range n {
		nx, ny, h := line(j)
		worst = math.Max(worst, math.Abs(nx*cx+ny*cy-h-r))
	}
	return worst
}

// TestTangentialRandom: polygons circumscribed about the unit circle by
// construction (tangent lines at rational points) are proven tangential;
// moving one vertex by 1/100 along a side's normal breaks tangency (the
// float residual of the circle through sides 0, 1, 2, an independent
// oracle, is checked to exceed 1e-6) and is disproven. Fixed seed.
func TestTangentialRandom(t *testing.T) {
	rng := rand.New(rand.NewPCG(12, 4))
	for trial := range 60 {
		n := 4 + trial%6
		v := randomTangential(rng, n)
		p := polygonProblem(t, ratTexts(v)...)
		if p.Convex() != "convex" {
			t.Fatalf("trial %d: constructed polygon not convex", trial)
		}
		requireVerdict(t, fmt.Sprintf("trial %d, %d-gon, tangential", trial, n), Tangential(p), certs.Proven)
		k := 3 + rng.IntN(n-3)
		v[k][0] = new(big.Rat).Add(v[k][0], big.NewRat(1, 100))
		if floatResidual(v) < 1e-6 {
			continue
		}
		q, err := parseProblem(problemText(`{"polygon":`+polygonJSON(v)+`}`, "0", `"dirichlet"`))
		if err != nil || q.Convex() != "convex" {
			continue // the move made it non-convex; covered by other tests
		}
		requireVerdict(t, fmt.Sprintf("trial %d, %d-gon, moved vertex %d", trial, n, k), Tangential(q), certs.Disproven)
	}
}

func polygonJSON(v [][2]*big.Rat) string {
	var parts []string
	for _, p := range v {
		parts = append(parts, fmt.Sprintf(`[%q,%q]`, p[0].RatString(), p[1].RatString()))
	}
	return "[" + strings.Join(parts, ",") + "]"
}

// TestTangentialPitot compares the decider on random convex rational
// quadrilaterals with Pitot's theorem and its converse (see
// TestTangentialCases): tangential exactly when a + c = b + d, evaluated
// in floating point, which separates the cases here because the
// constructed tangential ones satisfy it to rounding error and the random
// ones miss by more than 1e-6 (checked).
func TestTangentialPitot(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 1))
	tangential, other := 0, 0
	for trial := range 200 {
		var v [][2]*big.Rat
		if trial%2 == 0 {
			v = randomTangential(rng, 4)
		} else {
			for k := range 4 { // a point in each quadrant: convex for these radii
				a := math.Pi/2*float64(k) + rng.Float64()*math.Pi/2*0.8 + 0.1
				r := 1 + rng.Float64()
				v = append(v, [2]*big.Rat{
					new(big.Rat).SetFrac64(int64(math.Round(r*math.Cos(a)*1e4)), 1e4),
					new(big.Rat).SetFrac64(int64(math.Round(r*math.Sin(a)*1e4)), 1e4),
				})
			}
		}
		q, err := parseProblem(problemText(`{"polygon":`+polygonJSON(v)+`}`, "0", `"dirichlet"`))
		if err != nil || q.Convex() != "convex" {
			continue
		}
		side := func(i int) float64 {
			a, b := q.Vertices[i], q.Vertices[(i+1)%4]
			return math.Hypot(b[0].Val.Mid()-a[0].Val.Mid(), b[1].Val.Mid()-a[1].Val.Mid())
		}
		pitot := side(0) + side(2) - side(1) - side(3)
		want := certs.Disproven
		switch {
		case math.Abs(pitot) < 1e-12:
			want = certs.Proven
			tangential++
		case math.Abs(pitot) > 1e-6:
			other++
		default:
			continue
		}
		requireVerdict(t, fmt.Sprintf("trial %d (Pitot defect %.3g)", trial, pitot), Tangential(q), want)
	}
	if tangential < 50 || other < 50 {
		t.Errorf("%d tangential and %d other quadrilaterals checked, want at least 50 of each", tangential, other)
	}
}
