package tet

import (
	"math"
	"testing"

	"gapcert/enclose"
	"gapcert/enclose/sparse"
	"gapcert/fem/boundary"
	"gapcert/fem/mesh3"
	"gapcert/interval"
	"gapcert/interval/formula"
)

// kuhnCells returns the Kuhn subdivision of the n³ subcubes of the unit
// cube [0, 1]³ (each subcube cut into the 6 tetrahedra of the paths from
// its lowest to its highest corner that raise one coordinate at a time,
// one per permutation of the axes; the same cut in every subcube, so the
// tetrahedra of neighbouring subcubes meet face to face: common practice,
// H. W. Kuhn 1960, "Some combinatorial lemmas in topology", recalled from
// memory) that satisfy
// keep (on the integer coordinates of their vertex sum, 4× the centroid),
// as integer node coordinates 0..n and positively oriented tetrahedra.
func kuhnCells(n int, keep func(c4 [3]int) bool) (pts [][3]int, tets [][4]int) {
	id := func(p [3]int) int { return (p[0]*(n+1)+p[1])*(n+1) + p[2] }
	pts = make([][3]int, (n+1)*(n+1)*(n+1))
	for i := 0; i <= n; i++ {
		for j := 0; j <= n; j++ {
			for k := 0; k <= n; k++ {
				pts[id([3]int{i, j, k})] = [3]int{i, j, k}
			}
		}
	}
	perms := [6][3]int{{0, 1, 2}, {0, 2, 1}, {1, 0, 2}, {1, 2, 0}, {2, 0, 1}, {2, 1, 0}}
	odd := [6]bool{false, true, true, false, false, true}
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			for k := 0; k < n; k++ {
				for q, s := range perms {
					p := [3]int{i, j, k}
					var tt [4]int
					var c4 [3]int
					tt[0] = id(p)
					for c := 0; c < 3; c++ {
						c4[c] += p[c]
					}
					for step := 0; step < 3; step++ {
						p[s[step]]++
						tt[step+1] = id(p)
						for c := 0; c < 3; c++ {
							c4[c] += p[c]
						}
					}
					if odd[q] {
						tt[1], tt[2] = tt[2], tt[1]
					}
					if keep == nil || keep(c4) {
						tets = append(tets, tt)
					}
				}
			}
		}
	}
	return pts, tets
}

// meshOf builds the Mesh of integer nodes scaled by 1/n (enclosed), with
// the boundary faces found as the faces of exactly one tetrahedron and
// their side given by side (on the integer coordinates of the face's
// three nodes).
func meshOf(t testing.TB, n int, pts [][3]int, tets [][4]int, sides int, side func(f [3][3]int) int) *Mesh {
	t.Helper()
	return meshMoved(t, n, pts, tets, sides, side, nil)
}

// meshMoved is meshOf with each node moved by move (on its integer
// coordinates; nil: not moved), the moved coordinates enclosed.
func meshMoved(t testing.TB, n int, pts [][3]int, tets [][4]int, sides int, side func(f [3][3]int) int, move func(p [3]int) [3]float64) *Mesh {
	t.Helper()
	// Keep only the nodes of some tetrahedron, renumbered in order.
	used := make([]int, len(pts))
	for i := range used {
		used[i] = -1
	}
	var kept [][3]int
	newTets := make([][4]int, len(tets))
	for k, tt := range tets {
		for i, a := range tt {
			if used[a] < 0 {
				used[a] = len(kept)
				kept = append(kept, pts[a])
			}
			newTets[k][i] = used[a]
		}
	}
	pts, tets = kept, newTets
	nodes := make([][3]interval.I, len(pts))
	for i, p := range pts {
		var d [3]float64
		if move != nil {
			d = move(p)
		}
		for c := 0; c < 3; c++ {
			nodes[i][c] = interval.Point(float64(p[c])).DivF(float64(n)).AddF(d[c])
		}
	}
	return meshOfTets(t, nodes, tets, sides, func(f [3]int) int { return side([3][3]int{pts[f[0]], pts[f[1]], pts[f[2]]}) })
}

// meshOfTets returns the mesh of the positively oriented tetrahedra tets
// over nodes (mesh3.FromPolyhedron, which proves the tiling), with the
// boundary triangles found as the faces of exactly one tetrahedron
// (outward: mesh3.LocalFaces) and the side of each given by side.
func meshOfTets(t testing.TB, nodes [][3]interval.I, tets [][4]int, sides int, side func(f [3]int) int) *Mesh {
	t.Helper()
	count := map[[3]int]int{}
	for _, tt := range tets {
		for i := 0; i < 4; i++ {
			count[sort3(faceNodes(tt, i))]++
		}
	}
	var bnd []mesh3.BoundaryFace
	for _, tt := range tets {
		for _, lf := range mesh3.LocalFaces {
			f := [3]int{tt[lf[0]], tt[lf[1]], tt[lf[2]]}
			if count[sort3(f)] == 1 {
				bnd = append(bnd, mesh3.BoundaryFace{A: f[0], B: f[1], C: f[2], Face: side(f)})
			}
		}
	}
	m3, err := mesh3.FromPolyhedron(nodes, tets, bnd)
	if err != nil {
		t.Fatal(err)
	}
	m, err := NewMesh(m3, sides)
	if err != nil {
		t.Fatal(err)
	}
	return m
}

// cubeSide numbers the cube's faces x = 0, x = 1, y = 0, y = 1, z = 0,
// z = 1 as 0..5.
func cubeSide(n int) func(f [3][3]int) int {
	return func(f [3][3]int) int {
		for c := 0; c < 3; c++ {
			if f[0][c] == f[1][c] && f[1][c] == f[2][c] && (f[0][c] == 0 || f[0][c] == n) {
				if f[0][c] == 0 {
					return 2 * c
				}
				return 2*c + 1
			}
		}
		panic("face not on the cube's boundary")
	}
}

// unitCube returns the Kuhn mesh of [0, 1]³ with n³ subcubes (6n³
// tetrahedra).
func unitCube(t testing.TB, n int) *Mesh {
	pts, tets := kuhnCells(n, nil)
	return meshOf(t, n, pts, tets, 6, cubeSide(n))
}

// orthoscheme returns the mesh of 0 ≤ x ≤ y ≤ z ≤ 1 made of the Kuhn
// tetrahedra of the n³ subcubes inside it (the planes x = y and y = z cut
// a subcube only along its Kuhn faces, so it is a union of them), sides
// x = 0, x = y, y = z, z = 1 numbered 0..3.
func orthoscheme(t testing.TB, n int) *Mesh {
	pts, tets := kuhnCells(n, func(c [3]int) bool { return c[0] <= c[1] && c[1] <= c[2] })
	return meshOf(t, n, pts, tets, 4, func(f [3][3]int) int {
		all := func(ok func(p [3]int) bool) bool { return ok(f[0]) && ok(f[1]) && ok(f[2]) }
		switch {
		case all(func(p [3]int) bool { return p[0] == 0 }):
			return 0
		case all(func(p [3]int) bool { return p[0] == p[1] }):
			return 1
		case all(func(p [3]int) bool { return p[1] == p[2] }):
			return 2
		case all(func(p [3]int) bool { return p[2] == n }):
			return 3
		}
		panic("face not on the orthoscheme's boundary")
	})
}

func allBC(n int, c boundary.Condition) []boundary.Condition {
	out := make([]boundary.Condition, n)
	for i := range out {
		out[i] = c
	}
	return out
}

var (
	dirichlet = boundary.Condition{Kind: boundary.Dirichlet}
	neumann   = boundary.Condition{Kind: boundary.Neumann}
)

func mustExpr(t testing.TB, s string) *formula.Expr {
	t.Helper()
	e, err := formula.Parse(s)
	if err != nil {
		t.Fatal(err)
	}
	return e
}

// ritzBounds returns enclosures of the lowest count Ritz values of
// (a + γb, b) on s with potential src (approximate eigenvectors at
// round-to-nearest, then the interval Ritz pencil).
func ritzBounds(t testing.TB, s *Lagrange, v *Potential, gamma float64, count int) []interval.I {
	t.Helper()
	k, m := s.AssembleApprox(v, gamma)
	_, vecs, err := sparse.LowestEigs(k, m, count)
	if err != nil {
		t.Fatal(err)
	}
	a0, a1, err := s.RitzMatrices(vecs, v, interval.Point(gamma))
	if err != nil {
		t.Fatal(err)
	}
	mu, err := enclose.Eigenvalues(a0, a1)
	if err != nil {
		t.Fatal(err)
	}
	return mu
}

// pi2 encloses π².
var pi2 = interval.Pi().Sqr()

func relErr(upper float64, exact interval.I) float64 {
	return math.Abs(upper-exact.Mid()) / exact.Mid()
}

// testVolume encloses det(v_1 − v_0, v_2 − v_0, v_3 − v_0)/6, the signed
// volume of the tetrahedron with vertex enclosures v.
func testVolume(v [][3]interval.I) interval.I {
	var d [3][3]interval.I
	for k := 0; k < 3; k++ {
		for c := 0; c < 3; c++ {
			d[k][c] = v[k+1][c].Sub(v[0][c])
		}
	}
	return dot(d[0], cross(d[1], d[2])).DivF(6)
}
