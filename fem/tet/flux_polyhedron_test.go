package tet

import (
	"encoding/json"
	"math"
	"sort"
	"strconv"
	"testing"

	"gapcert/fem/boundary"
	"gapcert/fem/mesh3"
	"gapcert/fem/problem"
	"gapcert/interval"
)

// polyhedronMesh3 reads a polyhedron problem (package problem), meshes it
// by the cone tetrahedra (mesh3.FromPolyhedron) and refines it levels
// times.
func polyhedronMesh3(t *testing.T, vertices [][3]string, faces [][]int, levels int) *mesh3.Mesh {
	t.Helper()
	v, _ := json.Marshal(vertices)
	f, _ := json.Marshal(faces)
	p, err := problem.Parse([]byte(`{"domain": {"polyhedron": {"vertices": ` + string(v) + `, "faces": ` + string(f) + `}}, "boundary": "dirichlet"}`))
	if err != nil {
		t.Fatal(err)
	}
	ph := p.Polyhedron
	var bnd []mesh3.BoundaryFace
	for k, tr := range ph.Triangles() {
		bnd = append(bnd, mesh3.BoundaryFace{A: tr[0], B: tr[1], C: tr[2], Face: ph.TriangleFaces()[k]})
	}
	m, err := mesh3.FromPolyhedron(ph.Nodes(), ph.Tetrahedra(), bnd)
	if err != nil {
		t.Fatal(err)
	}
	for range levels {
		m = m.Refine()
	}
	return m
}

// fluxMeshOfMesh3 returns the cells of m with their global faces and, for
// each boundary face, the polyhedron face it lies in (the labels of
// m.Bnd).
func fluxMeshOfMesh3(t *testing.T, m *mesh3.Mesh) (fluxMesh, map[int]int) {
	t.Helper()
	var fm fluxMesh
	faceID := map[[3]int]int{}
	for _, tet := range m.Tets {
		var c RTCell
		for a := range 4 {
			c.Vertices[a] = m.Nodes[tet[a]]
			c.Nodes[a] = tet[a]
		}
		for i := range 4 {
			var key [3]int
			for r, j := range rtFaceVertices[i] {
				key[r] = tet[j]
			}
			sort.Ints(key[:])
			id, ok := faceID[key]
			if !ok {
				id = len(fm.nodes)
				faceID[key] = id
				fm.nodes = append(fm.nodes, key)
				fm.owners = append(fm.owners, 0)
			}
			fm.owners[id]++
			c.Faces[i] = id
		}
		fm.cells = append(fm.cells, c)
	}
	label := map[int]int{}
	for _, b := range m.Bnd {
		key := [3]int{b.A, b.B, b.C}
		sort.Ints(key[:])
		id, ok := faceID[key]
		if !ok || fm.owners[id] != 1 {
			t.Fatalf("boundary triangle %v is not a boundary face of the mesh", b)
		}
		label[id] = b.Face
	}
	if len(label) != len(m.Bnd) {
		t.Fatalf("%d labelled boundary faces for %d boundary triangles", len(label), len(m.Bnd))
	}
	return fm, label
}

// TestFluxLehmannGoerischRotatedCubePolyhedron runs the chain a
// polyhedron file takes (problem.Parse, the cone tetrahedra of
// mesh3.FromPolyhedron, Bey refinement, the boundary labels) into the
// Ritz and Lehmann–Goerisch bounds, on the cube [0, 2]³ moved by the exact
// rational rotation and translation of the mesh3 tests (vertex text in
// rationals). Its eigenvalues are those of the cube of edge 2
// (separation of variables, common practice): with Dirichlet faces 3π²/4,
// then 6π²/4; with Robin α = 1 on face 0 (the image of z = 0) and
// Dirichlet on the others, μ_1 + 2π²/4, μ_a = s_a²/4 with s_a the roots of
// s cos s + 2 sin s = 0 (u = sin(s(2 − ζ)/2) along the rotated z-axis ζ,
// as in TestFluxLehmannGoerischMovedBox with αL = 2), and then
// min(μ_2 + 2π²/4, μ_1 + 5π²/4) = μ_2 + 2π²/4 (≈ 11.40 < 13.65, decided
// below on the enclosures).
func TestFluxLehmannGoerischRotatedCubePolyhedron(t *testing.T) {
	verts, faces := rotatedCubePolyhedron()
	fm, label := fluxMeshOfMesh3(t, polyhedronMesh3(t, verts, faces, 1))
	pi2 := fluxPiSquaredTimes(1)
	s1 := fluxRobinRoot(t, 2, 1.6, 3.1)
	s2 := fluxRobinRoot(t, 2, 4.72, 6.2)
	mu1, mu2 := s1.Sqr().DivF(4), s2.Sqr().DivF(4)
	robinNext := mu2.Add(pi2.MulF(2).DivF(4))
	if !(robinNext.Hi < mu1.Add(pi2.MulF(5).DivF(4)).Lo) {
		t.Fatalf("the order of the Robin eigenvalues is not decided: %v, %v", robinNext, mu1.Add(pi2.MulF(5).DivF(4)))
	}
	robin := boundary.Condition{Kind: boundary.Robin, Alpha: interval.Point(1)}
	for _, c := range []struct {
		name     string
		face0    boundary.Condition
		l1, l2   interval.I
		maxWidth float64 // about twice the width measured when written
	}{
		{"dirichlet", boundary.Condition{Kind: boundary.Dirichlet}, pi2.MulF(3).DivF(4), pi2.MulF(6).DivF(4), 0.06},
		{"robin on face 0", robin, mu1.Add(pi2.MulF(2).DivF(4)), robinNext, 0.04},
	} {
		t.Run(c.name, func(t *testing.T) {
			bnd := map[int]boundary.Condition{}
			for id, f := range label {
				bnd[id] = boundary.Condition{Kind: boundary.Dirichlet}
				if f == 0 {
					bnd[id] = c.face0
				}
			}
			const gamma = 5
			rho := interval.SubDown(c.l2.Lo+gamma, 1e-9*c.l2.Lo)
			res := fluxLGBounds(t, fm, bnd, 3, 2, 1, gamma, rho)
			if !(res.lower[0] <= c.l1.Lo && c.l1.Hi <= res.upper[0]) {
				t.Fatalf("λ_1 ∈ [%.12g, %.12g] misses %v", res.lower[0], res.upper[0], c.l1)
			}
			if w := res.upper[0] - res.lower[0]; w > c.maxWidth || math.IsNaN(w) {
				t.Errorf("λ_1 ∈ [%.12g, %.12g]: width %.3g above %.3g", res.lower[0], res.upper[0], w, c.maxWidth)
			}
			t.Logf("%d cells: λ_1 ∈ [%.10g, %.10g] (exact %.10g), width %.3g, trial %d, flux %d unknowns",
				len(fm.cells), res.lower[0], res.upper[0], c.l1.Mid(), res.upper[0]-res.lower[0], res.trialN, res.fluxN)
		})
	}
}

// rotatedCubePolyhedron returns the vertices (exact rational text) and
// faces of R·[0, 2]³ + (1/3, −2/7, 5), R = r/845 with r as in
// fluxMovedMesh; the vertices are the images of (0,0,0), (2,0,0), (2,2,0),
// (0,2,0), (0,0,2), (2,0,2), (2,2,2), (0,2,2), and face 0 is the image of
// z = 0.
func rotatedCubePolyhedron() ([][3]string, [][]int) {
	r := [3][3]int{{507, -676, 0}, {260, 195, -780}, {624, 468, 325}}
	shift := [3][2]int{{1, 3}, {-2, 7}, {5, 1}}
	corners := [8][3]int{{0, 0, 0}, {2, 0, 0}, {2, 2, 0}, {0, 2, 0}, {0, 0, 2}, {2, 0, 2}, {2, 2, 2}, {0, 2, 2}}
	var verts [][3]string
	for _, p := range corners {
		var w [3]string
		for i := range 3 {
			num := 0
			for j := range 3 {
				num += r[i][j] * p[j]
			}
			w[i] = strconv.Itoa(num*shift[i][1]+845*shift[i][0]) + "/" + strconv.Itoa(845*shift[i][1])
		}
		verts = append(verts, w)
	}
	return verts, [][]int{{0, 3, 2, 1}, {4, 5, 6, 7}, {0, 1, 5, 4}, {1, 2, 6, 5}, {2, 3, 7, 6}, {3, 0, 4, 7}}
}

// TestStageARotatedCubePolyhedron runs the same chain into the CR and ECR
// stage-A lower bounds and the P_3 Ritz upper bounds of the Dirichlet
// eigenvalues 3π²/4 and 6π²/4 of the rotated cube of edge 2 (two levels of
// refinement: 768 cone-descended tetrahedra), through NewMesh with the
// polyhedron faces as sides.
func TestStageARotatedCubePolyhedron(t *testing.T) {
	verts, faces := rotatedCubePolyhedron()
	m3 := polyhedronMesh3(t, verts, faces, 2)
	m, err := NewMesh(m3, len(faces))
	if err != nil {
		t.Fatal(err)
	}
	exact := []interval.I{pi2.MulF(3).DivF(4), pi2.MulF(6).DivF(4)}
	v, err := NewPotential(m, mustExpr(t, "0"), 1)
	if err != nil {
		t.Fatal(err)
	}
	up := ritzBounds(t, NewLagrange(m, 3, allBC(len(faces), dirichlet)), v, 0, 2)
	for name, space := range map[string]func(*Mesh, []boundary.Condition) *Projection{"CR": NewCR, "ECR": NewECR} {
		lo := stageALowerBC(t, space, m, allBC(len(faces), dirichlet), 0, 2)
		for k, e := range exact {
			if lo[k] > e.Lo || up[k].Hi < e.Hi {
				t.Fatalf("%s: λ_%d = %v outside [%v, %v]", name, k+1, e, lo[k], up[k].Hi)
			}
			t.Logf("%s: λ_%d = %.10g ∈ [%.8g, %.10g]", name, k+1, e.Mid(), lo[k], up[k].Hi)
		}
	}
	if r := relErr(up[0].Hi, exact[0]); r > 4e-5 { // 1.6e-5 measured when written
		t.Errorf("Ritz bound of λ_1: relative error %.3g above 4e-5", r)
	}
}
