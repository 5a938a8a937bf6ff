package mesh3

import (
	"fmt"
	"math"
	"testing"

	"gapcert/interval"
)

// lPrism is the prism [−1,1]²∖[0,1]² × [0,1] (volume 3): the L-shape's
// vertices 0–5 at z = 0 and 6–11 at z = 1; its re-entrant edge joins
// nodes 3 and 9 (dihedral angle 3π/2).
var lPrism = solid{"L-shaped prism", [][3]string{
	{"-1", "-1", "0"}, {"1", "-1", "0"}, {"1", "0", "0"}, {"0", "0", "0"}, {"0", "1", "0"}, {"-1", "1", "0"},
	{"-1", "-1", "1"}, {"1", "-1", "1"}, {"1", "0", "1"}, {"0", "0", "1"}, {"0", "1", "1"}, {"-1", "1", "1"}},
	[][]int{{0, 5, 4, 3, 2, 1}, {6, 7, 8, 9, 10, 11}, {0, 1, 7, 6}, {1, 2, 8, 7}, {2, 3, 9, 8}, {3, 4, 10, 9}, {4, 5, 11, 10}, {5, 0, 6, 11}},
	3}

// fichera is the cube [−1,1]³ without the octant [0,1]³ (volume 7); its
// re-entrant edges join the origin (node 7) to nodes 8, 9 and 10.
var fichera = solid{"Fichera solid", [][3]string{
	{"-1", "-1", "-1"}, {"1", "-1", "-1"}, {"1", "1", "-1"}, {"-1", "1", "-1"}, {"-1", "-1", "1"}, {"1", "-1", "1"}, {"-1", "1", "1"},
	{"0", "0", "0"}, {"1", "0", "0"}, {"0", "1", "0"}, {"0", "0", "1"}, {"1", "1", "0"}, {"1", "0", "1"}, {"0", "1", "1"}},
	[][]int{{0, 3, 2, 1}, {0, 1, 5, 4}, {0, 4, 6, 3}, {1, 2, 11, 8, 12, 5}, {3, 6, 13, 9, 11, 2}, {4, 5, 12, 10, 13, 6},
		{7, 9, 13, 10}, {7, 10, 12, 8}, {7, 8, 11, 9}},
	7}

// distToSegment returns the distance of point x to the segment [a, b]
// (midpoints; for measuring only).
func distToSegment(x, a, b [3]float64) float64 {
	var ab, ax [3]float64
	var ab2, t float64
	for c := range 3 {
		ab[c], ax[c] = b[c]-a[c], x[c]-a[c]
		ab2 += ab[c] * ab[c]
		t += ab[c] * ax[c]
	}
	if ab2 > 0 {
		t = math.Max(0, math.Min(1, t/ab2))
	} else {
		t = 0
	}
	d := 0.0
	for c := range 3 {
		e := ax[c] - t*ab[c]
		d += e * e
	}
	return math.Sqrt(d)
}

func mid3(p [3]interval.I) [3]float64 { return [3]float64{p[0].Mid(), p[1].Mid(), p[2].Mid()} }

// touchingDiam returns the largest diameter (upper bound) of the
// tetrahedra with a node within 1e-12 of one of the segments (measured in
// floating point, independently of RefineToward's exact rule).
func touchingDiam(m *Mesh, segs [][2]int) float64 {
	h := 0.0
	for t, tet := range m.Tets {
		near := false
		for _, k := range tet {
			for _, s := range segs {
				near = near || distToSegment(mid3(m.Nodes[k]), mid3(m.Nodes[s[0]]), mid3(m.Nodes[s[1]])) < 1e-12
			}
		}
		if near {
			h = math.Max(h, m.Geom(t).H)
		}
	}
	return h
}

// TestRefineTowardTiles grades the L-shaped prism toward its re-entrant
// edge and the Fichera solid toward its three re-entrant edges (and the
// unit cube toward a vertex) by up to five levels, on the cone mesh and
// on its red refinement, and checks at every depth: the tiling proof of
// FromPolyhedron on the graded tetrahedra and boundary triangles, the
// volume (exact, elementary geometry), conformity (every face of a
// tetrahedron is shared by exactly two tetrahedra or is one boundary
// triangle; Euler's formula), and that the grading concentrates: the
// tetrahedra touching the targets shrink like 2^(−levels) while the
// largest tetrahedron keeps its size.
func TestRefineTowardTiles(t *testing.T) {
	cases := []struct {
		s     solid
		segs  [][2]int
		maxL  int
		uRefs int
	}{
		{lPrism, [][2]int{{3, 9}}, 5, 0},
		{lPrism, [][2]int{{3, 9}}, 3, 1},
		{fichera, [][2]int{{7, 8}, {7, 9}, {7, 10}}, 4, 0},
		{solids[0], [][2]int{{6, 6}}, 5, 0},
	}
	for _, c := range cases {
		t.Run(fmt.Sprintf("%s/%d uniform", c.s.name, c.uRefs), func(t *testing.T) {
			m0 := fromSolid(t, c.s)
			for range c.uRefs {
				m0 = m0.Refine()
			}
			h0 := touchingDiam(m0, c.segs)
			for levels := 1; levels <= c.maxL; levels++ {
				var ts []Target
				for _, s := range c.segs {
					ts = append(ts, Target{s[0], s[1], levels})
				}
				m, err := m0.RefineToward(ts)
				if err != nil {
					t.Fatalf("levels %d: %v", levels, err)
				}
				if _, err := FromPolyhedron(m.Nodes, m.Tets, m.Bnd); err != nil {
					t.Fatalf("levels %d: the graded mesh fails the tiling proof: %v", levels, err)
				}
				checkVolumeSum(t, m, c.s.volume)
				checkTopology(t, m)
				checkConforming(t, m)
				h := touchingDiam(m, c.segs)
				// Diameters near the targets: ≤ 2·2^(−levels) of the
				// ungraded ones (the inner pieces of a split tetrahedron
				// shrink by 1/√2 in one level and by ½ in two).
				if h > 2*math.Ldexp(h0, -levels) {
					t.Errorf("levels %d: tetrahedra at the targets have diameter %.3g, ungraded %.3g", levels, h, h0)
				}
				// Locality: at 4 levels and more, fewer than a quarter of the
				// tetrahedra of uniform refinement to the same size near the
				// targets, and tetrahedra far from the targets four times as
				// large as those at the targets.
				if uniform := len(m0.Tets) << (3 * levels); levels >= 4 && 4*len(m.Tets) > uniform {
					t.Errorf("levels %d: %d tetrahedra, uniform refinement has %d", levels, len(m.Tets), uniform)
				}
				if hm := m.HMax(); levels >= 4 && hm < 4*h {
					t.Errorf("levels %d: the largest tetrahedron (%.3g) is not much larger than those at the targets (%.3g)", levels, hm, h)
				}
				t.Logf("levels %d: %d tetrahedra (uniform to the same size near the targets: %d), diameter at the targets %.3g (ungraded %.3g)",
					levels, len(m.Tets), len(m0.Tets)<<(3*levels), h, h0)
			}
		})
	}
}

// checkVolumeSum checks that the volume enclosures of m sum, in interval
// arithmetic, to an enclosure of the exact volume (given rounded to
// float64), narrower than 1e-12 or 2e-15 per tetrahedron, relative.
func checkVolumeSum(t *testing.T, m *Mesh, volume float64) {
	t.Helper()
	var sum interval.I
	for k := range m.Tets {
		sum = sum.Add(m.Geom(k).Volume)
	}
	tol := 8 * volume * 0x1p-52
	if !(sum.Lo <= volume+tol && volume-tol <= sum.Hi) || sum.Wid() > math.Max(1e-12, 2e-15*float64(len(m.Tets)))*volume {
		t.Errorf("volumes sum to %v, want a narrow enclosure of %v", sum, volume)
	}
}

// checkConforming checks that every face of a tetrahedron is the face of
// exactly one other tetrahedron, or is a boundary triangle and of no other
// tetrahedron.
func checkConforming(t *testing.T, m *Mesh) {
	t.Helper()
	faces, tetFaces := m.Faces()
	count := make([]int, len(faces))
	for _, tf := range tetFaces {
		for _, f := range tf {
			count[f]++
		}
	}
	bnd := make(map[[3]int]bool, len(m.Bnd))
	for _, b := range m.Bnd {
		k, _ := faceKey(b.A, b.B, b.C)
		bnd[k] = true
	}
	for f, n := range count {
		if want := 2 - btoi(bnd[faces[f]]); n != want {
			t.Fatalf("face %v is in %d tetrahedra, want %d", faces[f], n, want)
		}
	}
	if n := len(faces); len(bnd) != len(m.Bnd) || 4*len(m.Tets) != 2*n-len(bnd) {
		t.Fatalf("%d faces, %d boundary triangles (%d distinct), %d tetrahedra", n, len(m.Bnd), len(bnd), len(m.Tets))
	}
}

func btoi(b bool) int {
	if b {
		return 1
	}
	return 0
}

// TestRefineTowardCorruptedRefused checks that the tiling proof refuses a
// graded mesh of the L-shaped prism with one tetrahedron removed, one
// reflected (two vertices exchanged), one vertex moved to another node,
// or a boundary triangle dropped.
func TestRefineTowardCorruptedRefused(t *testing.T) {
	m, err := fromSolid(t, lPrism).RefineToward([]Target{{3, 9, 3}})
	if err != nil {
		t.Fatal(err)
	}
	tets := func() [][4]int { return append([][4]int(nil), m.Tets...) }
	k := len(m.Tets) / 2
	removed := append(tets()[:k], m.Tets[k+1:]...)
	reflected := tets()
	reflected[k][2], reflected[k][3] = reflected[k][3], reflected[k][2]
	moved := tets()
	for _, n := range []int{m.NumGiven(), m.NumGiven() + 1} {
		if n != moved[k][0] && n != moved[k][1] && n != moved[k][2] && n != moved[k][3] {
			moved[k][0] = n
			break
		}
	}
	for name, c := range map[string]struct {
		tets [][4]int
		bnd  []BoundaryFace
	}{
		"removed tetrahedron":    {removed, m.Bnd},
		"reflected tetrahedron":  {reflected, m.Bnd},
		"moved vertex":           {moved, m.Bnd},
		"dropped boundary piece": {m.Tets, m.Bnd[1:]},
	} {
		if _, err := FromPolyhedron(m.Nodes, c.tets, c.bnd); err == nil {
			t.Errorf("%s: the corrupted graded mesh passed the tiling proof", name)
		}
	}
}

// TestRefineTowardExactMidpoints checks that every new node of a graded
// mesh is enclosed to within 1e-15 of its size (the apex of the cones is
// not dyadic; the other nodes are exact) and that the grading replays: the same
// mesh and targets give the same tetrahedra.
func TestRefineTowardExactMidpoints(t *testing.T) {
	m0 := fromSolid(t, fichera)
	ts := []Target{{7, 8, 3}, {7, 9, 3}, {7, 10, 2}}
	a, err := m0.RefineToward(ts)
	if err != nil {
		t.Fatal(err)
	}
	b, err := m0.RefineToward(ts)
	if err != nil {
		t.Fatal(err)
	}
	if len(a.Tets) != len(b.Tets) || len(a.Nodes) != len(b.Nodes) {
		t.Fatalf("two gradings differ: %d/%d tetrahedra", len(a.Tets), len(b.Tets))
	}
	for k := range a.Tets {
		if a.Tets[k] != b.Tets[k] {
			t.Fatalf("tetrahedron %d: %v and %v", k, a.Tets[k], b.Tets[k])
		}
	}
	for k := a.NumGiven(); k < len(a.Nodes); k++ {
		for c := range 3 {
			if x := a.Nodes[k][c]; x.Wid() > 1e-15*math.Max(1, math.Abs(x.Mid())) {
				t.Fatalf("node %d coordinate %d: %v is wide", k, c, x)
			}
		}
	}
}

// TestRefineTowardMisuse checks the panics on targets that are not given
// nodes and on negative levels.
func TestRefineTowardMisuse(t *testing.T) {
	m := fromSolid(t, solids[0]).Refine()
	for _, ts := range [][]Target{{{0, m.NumGiven(), 1}}, {{-1, 0, 1}}, {{0, 1, -1}}} {
		func() {
			defer func() {
				if recover() == nil {
					t.Errorf("%v: no panic", ts)
				}
			}()
			m.RefineToward(ts)
		}()
	}
}
