package tet

import (
	"errors"
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"os"
	"sort"
	"testing"

	"gapcert/fem/boundary"
	"gapcert/fem/internal/ritz"
	"gapcert/interval"
)

// This file checks, exactly (math/big) and independently of the way the
// tables were built, the four properties the Lehmann–Goerisch matrix of
// Flux.LGMatrix rests on, for global fluxes of two-cell meshes:
//
//  1. the flux density σ·ν_F on a face is the same from both of its cells
//     and is faceScale times the face Bernstein polynomial (degree k, over
//     the face's sorted global vertices) whose coefficients are the face's
//     global DOFs, in the documented numbering (so σ ∈ H(div; Ω), and the
//     interior functions have no normal component);
//  2. the divergence table is the divergence of the component table, at
//     every point (exact differentiation along the physical axes), and
//     ∫_T div σ = ∫_∂T σ·n on every cell (divergence theorem);
//  3. on a face whose DOFs are removed (Neumann, or Robin with α not
//     verified positive) σ·n = 0;
//  4. the Robin face term of faceTerms encloses ∫_F (σ_i·n)(σ_j·n)/α
//     computed from the point values of σ.
//
// Points are random rationals; the cell geometry is exact (dyadic
// vertices, so the vertex enclosures are points).

// fluxExactMesh is a mesh of dyadic vertices: the cells as NewFlux takes
// them, the exact vertices of each cell, and the boundary conditions.
type fluxExactMesh struct {
	cells []RTCell
	verts [][4][3]*big.Rat
}

// fluxExactPoint returns the exact vector of three floats.
func fluxExactPoint(x [3]float64) [3]*big.Rat {
	return [3]*big.Rat{new(big.Rat).SetFloat64(x[0]), new(big.Rat).SetFloat64(x[1]), new(big.Rat).SetFloat64(x[2])}
}

func ratSub3(a, b [3]*big.Rat) [3]*big.Rat {
	return [3]*big.Rat{new(big.Rat).Sub(a[0], b[0]), new(big.Rat).Sub(a[1], b[1]), new(big.Rat).Sub(a[2], b[2])}
}

func ratCross3(a, b [3]*big.Rat) [3]*big.Rat {
	m := func(x, y, z, w *big.Rat) *big.Rat {
		return new(big.Rat).Sub(new(big.Rat).Mul(x, y), new(big.Rat).Mul(z, w))
	}
	return [3]*big.Rat{m(a[1], b[2], a[2], b[1]), m(a[2], b[0], a[0], b[2]), m(a[0], b[1], a[1], b[0])}
}

func ratDot3(a, b [3]*big.Rat) *big.Rat {
	s := new(big.Rat).Mul(a[0], b[0])
	s.Add(s, new(big.Rat).Mul(a[1], b[1]))
	return s.Add(s, new(big.Rat).Mul(a[2], b[2]))
}

// ratOrientation returns det[b − a, c − a, d − a].
func ratOrientation(a, b, c, d [3]*big.Rat) *big.Rat {
	return ratDot3(ratSub3(b, a), ratCross3(ratSub3(c, a), ratSub3(d, a)))
}

// newFluxExactMesh builds the cells of the tetrahedra tets over the
// points pts (dyadic), with global node numbers nodeOf[j] for point j
// (any distinct integers), and the global face numbers in order of first
// appearance.
func newFluxExactMesh(pts [][3]float64, nodeOf []int, tets [][4]int) fluxExactMesh {
	var m fluxExactMesh
	faceNum := map[[3]int]int{}
	for _, tt := range tets {
		var c RTCell
		var v [4][3]*big.Rat
		for a, j := range tt {
			for x := 0; x < 3; x++ {
				c.Vertices[a][x] = interval.Point(pts[j][x])
			}
			c.Nodes[a] = nodeOf[j]
			v[a] = fluxExactPoint(pts[j])
		}
		for i := 0; i < 4; i++ {
			var key [3]int
			for r, a := range rtFaceVertices[i] {
				key[r] = c.Nodes[a]
			}
			sort.Ints(key[:])
			f, ok := faceNum[key]
			if !ok {
				f = len(faceNum)
				faceNum[key] = f
			}
			c.Faces[i] = f
		}
		m.cells = append(m.cells, c)
		m.verts = append(m.verts, v)
	}
	return m
}

// fluxExactPairs returns the two-cell meshes of the exact checks: the
// reference tetrahedron with a neighbour across its slanted face, and a
// sheared pair with scrambled node numbers whose second cell was given
// negatively oriented and renumbered (two local vertices swapped) before
// use; it also returns, for each mesh, the negatively oriented cells that
// NewFlux must refuse.
func fluxExactPairs(t *testing.T) (meshes []fluxExactMesh, refused [][]RTCell) {
	ref := newFluxExactMesh([][3]float64{{0, 0, 0}, {1, 0, 0}, {0, 1, 0}, {0, 0, 1}, {0.5, 0.625, 0.75}}, []int{0, 1, 2, 3, 4},
		[][4]int{{0, 1, 2, 3}, {4, 1, 3, 2}})
	// Sheared pair: the shared face P Q R, apices S and U on either side.
	pts := [][3]float64{{0.125, 0, 0.25}, {1.25, 0.375, -0.125}, {0.5, 1.125, 0.375}, {0.375, 0.5, 1.375}, {0.875, 0.25, -1}}
	nodeOf := []int{7, 2, 5, 0, 9}
	rp := func(j int) [3]*big.Rat { return fluxExactPoint(pts[j]) }
	sS := ratOrientation(rp(0), rp(1), rp(2), rp(3)).Sign()
	sU := ratOrientation(rp(0), rp(1), rp(2), rp(4)).Sign()
	if sS == 0 || sU != -sS {
		t.Fatalf("sheared pair: apices not on either side of the shared face (%d, %d)", sS, sU)
	}
	a := [4]int{1, 3, 2, 0} // Q S R P
	if ratOrientation(rp(a[0]), rp(a[1]), rp(a[2]), rp(a[3])).Sign() < 0 {
		a[0], a[1] = a[1], a[0]
	}
	b := [4]int{0, 1, 2, 4} // P Q R U, negatively oriented when S is on the positive side
	if ratOrientation(rp(b[0]), rp(b[1]), rp(b[2]), rp(b[3])).Sign() > 0 {
		b[0], b[1] = b[1], b[0]
	}
	neg := newFluxExactMesh(pts, nodeOf, [][4]int{a, b})
	b[1], b[3] = b[3], b[1]
	if ratOrientation(rp(b[0]), rp(b[1]), rp(b[2]), rp(b[3])).Sign() <= 0 {
		t.Fatal("sheared pair: renumbering did not make the second cell positive")
	}
	shear := newFluxExactMesh(pts, nodeOf, [][4]int{a, b})
	return []fluxExactMesh{ref, shear}, [][]RTCell{nil, neg.cells}
}

// fluxExactConditions returns boundary conditions for the boundary faces
// of m: "neumann" (all), "dirichlet" (all: every face keeps its DOFs) or
// "mixed" (Dirichlet, Robin α = 3/2, Neumann, Robin with α ∈ [0, 1/4]
// not verified positive, in turn).
func fluxExactConditions(m fluxExactMesh, kind string) map[int]boundary.Condition {
	owners := map[int]int{}
	for _, c := range m.cells {
		for _, f := range c.Faces {
			owners[f]++
		}
	}
	var faces []int
	for f, o := range owners {
		if o == 1 {
			faces = append(faces, f)
		}
	}
	sort.Ints(faces)
	mixed := []boundary.Condition{
		{Kind: boundary.Dirichlet},
		{Kind: boundary.Robin, Alpha: interval.Point(1.5)},
		{Kind: boundary.Neumann},
		{Kind: boundary.Robin, Alpha: interval.I{Lo: 0, Hi: 0.25}},
	}
	out := map[int]boundary.Condition{}
	for n, f := range faces {
		switch kind {
		case "neumann":
			out[f] = boundary.Condition{Kind: boundary.Neumann}
		case "dirichlet":
			out[f] = boundary.Condition{Kind: boundary.Dirichlet}
		default:
			out[f] = mixed[n%len(mixed)]
		}
	}
	return out
}

// fluxExactField is a global flux restricted to one cell, exactly: the
// Bernstein coefficients of σ̂ (degree k + 1) and of div̂ σ̂ (degree k).
type fluxExactField struct {
	comp [3][]*big.Rat
	div  []*big.Rat
}

// fluxExactLocal returns the exact reference field of the flux vec on
// cell t from the tables of f (compT, divT, the DOF map and signs).
func fluxExactLocal(f *Flux, vec []float64, t int) fluxExactField {
	ref := f.ref
	x := make([]float64, ref.ndof)
	f.local(x, vec, t)
	xr := make([]*big.Rat, len(x))
	for l, v := range x {
		xr[l] = new(big.Rat).SetFloat64(v)
	}
	comb := func(table []float64, rows int) []*big.Rat {
		out := make([]*big.Rat, rows)
		for a := range out {
			s := new(big.Rat)
			for l, v := range xr {
				if e := table[a*ref.ndof+l]; e != 0 && v.Sign() != 0 {
					s.Add(s, new(big.Rat).Mul(new(big.Rat).SetFloat64(e), v))
				}
			}
			out[a] = s
		}
		return out
	}
	var e fluxExactField
	for c := 0; c < 3; c++ {
		e.comp[c] = comb(ref.compT[c], rtDim(ref.n))
	}
	e.div = comb(ref.divT, rtDim(ref.k))
	return e
}

// fluxExactBary returns the barycentric coordinates of x in the cell
// with vertices v (Cramer's rule on J ξ = x − v_0) and det J.
func fluxExactBary(v [4][3]*big.Rat, x [3]*big.Rat) ([4]*big.Rat, *big.Rat) {
	j := [3][3]*big.Rat{ratSub3(v[1], v[0]), ratSub3(v[2], v[0]), ratSub3(v[3], v[0])} // columns
	det := ratDot3(j[0], ratCross3(j[1], j[2]))
	rhs := ratSub3(x, v[0])
	xi := [3]*big.Rat{
		ratDot3(rhs, ratCross3(j[1], j[2])),
		ratDot3(j[0], ratCross3(rhs, j[2])),
		ratDot3(j[0], ratCross3(j[1], rhs)),
	}
	for r := range xi {
		xi[r].Quo(xi[r], det)
	}
	return rtBarycentric(xi), det
}

// fluxExactValue returns σ(x) = J σ̂(ξ)/det J on the cell with vertices v.
func fluxExactValue(e fluxExactField, n int, v [4][3]*big.Rat, x [3]*big.Rat) [3]*big.Rat {
	lam, det := fluxExactBary(v, x)
	var sh [3]*big.Rat
	for c := 0; c < 3; c++ {
		sh[c] = rtEvalRat(e.comp[c], n, lam)
	}
	out := [3]*big.Rat{new(big.Rat), new(big.Rat), new(big.Rat)}
	for r := 0; r < 3; r++ {
		col := ratSub3(v[r+1], v[0])
		for a := 0; a < 3; a++ {
			out[a].Add(out[a], new(big.Rat).Mul(col[a], sh[r]))
		}
	}
	for a := range out {
		out[a].Quo(out[a], det)
	}
	return out
}

// fluxExactFacePoint returns μ_0 A + μ_1 B + μ_2 C.
func fluxExactFacePoint(p [3][3]*big.Rat, mu [3]*big.Rat) [3]*big.Rat {
	var x [3]*big.Rat
	for a := 0; a < 3; a++ {
		x[a] = new(big.Rat)
		for r := 0; r < 3; r++ {
			x[a].Add(x[a], new(big.Rat).Mul(mu[r], p[r][a]))
		}
	}
	return x
}

// fluxExactRandomFace returns random barycentric coordinates on a
// triangle (denominator 97·2).
func fluxExactRandomFace(rng *rand.Rand) [3]*big.Rat {
	a, b := rng.IntN(98), rng.IntN(98)
	if a+b > 97 {
		a, b = 97-a, 97-b
	}
	mu1, mu2 := big.NewRat(int64(a), 97), big.NewRat(int64(b), 97)
	mu0 := new(big.Rat).Sub(big.NewRat(1, 1), new(big.Rat).Add(mu1, mu2))
	return [3]*big.Rat{mu0, mu1, mu2}
}

// fluxExactDefect runs the checks 1–4 of this file on the flux space f of
// the mesh m with conditions bnd, for two random global flux vectors of
// small nonzero integers, and returns the first violation (nil: none).
func fluxExactDefect(f *Flux, m fluxExactMesh, bnd map[int]boundary.Condition, rng *rand.Rand) error {
	ref, k, n := f.ref, f.k, f.ref.n
	nf := ref.nFace
	vecs := make([][]float64, 2)
	for i := range vecs {
		vecs[i] = make([]float64, f.N())
		for g := range vecs[i] {
			vecs[i][g] = float64(rng.IntN(9) + 1)
			if rng.IntN(2) == 0 {
				vecs[i][g] = -vecs[i][g]
			}
		}
	}
	// The documented global numbering: the faces that keep their DOFs,
	// in face order, rtFaceMulti(k) over the sorted global vertices each.
	nFaces := 0
	for _, c := range m.cells {
		for _, fc := range c.Faces {
			nFaces = max(nFaces, fc+1)
		}
	}
	faceBase := make([]int, nFaces)
	next := 0
	for fc := 0; fc < nFaces; fc++ {
		c, ok := bnd[fc]
		if ok && !c.FluxFree() {
			faceBase[fc] = -1
			continue
		}
		faceBase[fc] = next
		next += nf
	}
	if want := next + len(m.cells)*(ref.ndof-4*nf); want != f.N() {
		return fmt.Errorf("flux dimension %d, the documented numbering gives %d", f.N(), want)
	}
	fields := make([][]fluxExactField, len(vecs))
	for i, vec := range vecs {
		for t := range m.cells {
			fields[i] = append(fields[i], fluxExactLocal(f, vec, t))
		}
	}
	fk := rtFaceMulti(k)
	faceScale := new(big.Rat).SetFloat64(ref.faceScale)
	// 1 and 3: flux densities on every face, from every cell that has it.
	for t, c := range m.cells {
		v := m.verts[t]
		for i := 0; i < 4; i++ {
			fc := c.Faces[i]
			// Sorted global vertices of the face and their points.
			type gv struct {
				node int
				p    [3]*big.Rat
			}
			var g [3]gv
			for r, a := range rtFaceVertices[i] {
				g[r] = gv{c.Nodes[a], v[a]}
			}
			sort.Slice(g[:], func(a, b int) bool { return g[a].node < g[b].node })
			pts := [3][3]*big.Rat{g[0].p, g[1].p, g[2].p}
			nu := ratCross3(ratSub3(pts[1], pts[0]), ratSub3(pts[2], pts[0]))
			for trial := 0; trial < 3; trial++ {
				mu := fluxExactRandomFace(rng)
				x := fluxExactFacePoint(pts, mu)
				for iv, vec := range vecs {
					got := ratDot3(fluxExactValue(fields[iv][t], n, v, x), nu)
					want := new(big.Rat)
					if faceBase[fc] >= 0 {
						coef := make([]*big.Rat, nf)
						for mm := range fk.alpha {
							coef[mm] = new(big.Rat).Mul(faceScale, new(big.Rat).SetFloat64(vec[faceBase[fc]+mm]))
						}
						want = rtFaceEvalRat(coef, k, mu)
					}
					if got.Cmp(want) != 0 {
						return fmt.Errorf("k=%d cell %d local face %d (global %d, DOFs kept %v): flux density %s, its face DOFs give %s",
							k, t, i, fc, faceBase[fc] >= 0, got.RatString(), want.RatString())
					}
				}
			}
		}
	}
	// 2: divergence at random interior points by exact differentiation of
	// t ↦ σ_a(x + t e_a) (degree ≤ k + 1) at the nodes 0, 1/50, …, and the
	// divergence theorem per cell.
	nodes := make([]*big.Rat, n+1)
	for mm := range nodes {
		nodes[mm] = big.NewRat(int64(mm), 50)
	}
	dl := make([]*big.Rat, n+1) // L'_m(0)
	for mm := range nodes {
		dl[mm] = new(big.Rat)
		for j := range nodes {
			if j == mm {
				continue
			}
			term := new(big.Rat).Inv(new(big.Rat).Sub(nodes[mm], nodes[j]))
			for q := range nodes {
				if q == mm || q == j {
					continue
				}
				term.Mul(term, new(big.Rat).Quo(new(big.Rat).Neg(nodes[q]), new(big.Rat).Sub(nodes[mm], nodes[q])))
			}
			dl[mm].Add(dl[mm], term)
		}
	}
	qpts, qw := rtGrundmannMoeller(2, (k+1)/2)
	for t := range m.cells {
		v := m.verts[t]
		for iv := range vecs {
			e := fields[iv][t]
			for trial := 0; trial < 2; trial++ {
				var lam [4]*big.Rat
				rest := big.NewRat(1, 1)
				for j := 0; j < 3; j++ {
					lam[j] = big.NewRat(int64(rng.IntN(30)+1), 131)
					rest.Sub(rest, lam[j])
				}
				lam[3] = rest
				var x [3]*big.Rat
				for a := 0; a < 3; a++ {
					x[a] = new(big.Rat)
					for j := 0; j < 4; j++ {
						x[a].Add(x[a], new(big.Rat).Mul(lam[j], v[j][a]))
					}
				}
				diff := new(big.Rat)
				for a := 0; a < 3; a++ {
					for mm, tm := range nodes {
						y := x
						y[a] = new(big.Rat).Add(x[a], tm)
						diff.Add(diff, new(big.Rat).Mul(dl[mm], fluxExactValue(e, n, v, y)[a]))
					}
				}
				l2, det := fluxExactBary(v, x)
				table := rtEvalRat(e.div, k, l2)
				table.Quo(table, det)
				if table.Cmp(diff) != 0 {
					return fmt.Errorf("k=%d cell %d: divergence table %s, differentiation %s", k, t, table.RatString(), diff.RatString())
				}
			}
			// ∫_T div σ = ∫_T̂ div̂ σ̂ = (1/6) mean of its Bernstein
			// coefficients; ∫_F σ·n = Σ_q w_q (σ·ν)(x_q), ν outward times 2|F|
			// and weights summing to 1/2.
			vol := new(big.Rat)
			for _, d := range e.div {
				vol.Add(vol, d)
			}
			vol.Quo(vol, new(big.Rat).SetInt(new(big.Int).Mul(big.NewInt(6), big.NewInt(int64(rtDim(k))))))
			bnd := new(big.Rat)
			for i := 0; i < 4; i++ {
				fv := rtFaceVertices[i]
				p := [3][3]*big.Rat{v[fv[0]], v[fv[1]], v[fv[2]]}
				nu := ratCross3(ratSub3(p[1], p[0]), ratSub3(p[2], p[0]))
				if ratDot3(ratSub3(v[i], p[0]), nu).Sign() > 0 {
					for a := range nu {
						nu[a].Neg(nu[a])
					}
				}
				for q, mu := range qpts {
					x := fluxExactFacePoint(p, [3]*big.Rat{mu[0], mu[1], mu[2]})
					bnd.Add(bnd, new(big.Rat).Mul(qw[q], ratDot3(fluxExactValue(e, n, v, x), nu)))
				}
			}
			if vol.Cmp(bnd) != 0 {
				return fmt.Errorf("k=%d cell %d: ∫ div σ = %s, ∫ σ·n = %s", k, t, vol.RatString(), bnd.RatString())
			}
		}
	}
	// 4: the Robin face terms against ∫_F (σ_i·n)(σ_j·n)/α = S/(α|ν|),
	// S = Σ_q w_q (σ_i·ν)(σ_j·ν)(x_q) (σ·n = σ·ν/|ν|, dA = |ν| dμ over a
	// reference triangle of area 1/2), compared in 200-bit floats.
	acc := ritz.NewAccumulator(len(vecs))
	xs := make([][]float64, len(vecs))
	for i := range xs {
		xs[i] = make([]float64, ref.ndof)
	}
	f.faceTerms(acc, vecs, xs)
	got := acc.Sym()
	want := [2][2]*big.Float{}
	for i := range want {
		for j := range want[i] {
			want[i][j] = new(big.Float).SetPrec(200)
		}
	}
	fpts, fw := rtGrundmannMoeller(2, k+1)
	for _, rf := range f.robin {
		v := m.verts[rf.t]
		fv := rtFaceVertices[rf.i]
		p := [3][3]*big.Rat{v[fv[0]], v[fv[1]], v[fv[2]]}
		nu := ratCross3(ratSub3(p[1], p[0]), ratSub3(p[2], p[0]))
		alpha := bnd[m.cells[rf.t].Faces[rf.i]].Alpha
		if alpha.Lo != alpha.Hi {
			return fmt.Errorf("Robin face with α = %v in the flux norm; the check needs an exact α", alpha)
		}
		var s [2][2]*big.Rat
		for i := range s {
			for j := range s[i] {
				s[i][j] = new(big.Rat)
			}
		}
		for q, mu := range fpts {
			x := fluxExactFacePoint(p, [3]*big.Rat{mu[0], mu[1], mu[2]})
			var g [2]*big.Rat
			for iv := range vecs {
				g[iv] = ratDot3(fluxExactValue(fields[iv][rf.t], n, v, x), nu)
			}
			for i := range s {
				for j := range s[i] {
					s[i][j].Add(s[i][j], new(big.Rat).Mul(fw[q], new(big.Rat).Mul(g[i], g[j])))
				}
			}
		}
		norm := new(big.Float).SetPrec(200).SetRat(ratDot3(nu, nu))
		norm.Sqrt(norm)
		norm.Mul(norm, new(big.Float).SetPrec(200).SetFloat64(alpha.Lo))
		for i := range s {
			for j := range s[i] {
				want[i][j].Add(want[i][j], new(big.Float).SetPrec(200).Quo(new(big.Float).SetPrec(200).SetRat(s[i][j]), norm))
			}
		}
	}
	for i := range want {
		for j := 0; j <= i; j++ {
			e := got.At(i, j)
			w, _ := want[i][j].Float64()
			lo, hi := new(big.Float).SetPrec(200).SetFloat64(e.Lo), new(big.Float).SetPrec(200).SetFloat64(e.Hi)
			if lo.Cmp(want[i][j]) > 0 || hi.Cmp(want[i][j]) < 0 {
				return fmt.Errorf("k=%d: Robin face term (%d, %d) enclosed in %v, exact %.17g", k, i, j, e, w)
			}
			if e.Hi-e.Lo > 1e-12*(1+math.Abs(w)) {
				return fmt.Errorf("k=%d: Robin face term (%d, %d) enclosure %v too wide for %.17g", k, i, j, e, w)
			}
		}
	}
	return nil
}

// TestFluxExactTracesDivergenceAndRobinTerms runs fluxExactDefect at
// k = 0..4 (with GAPCERT_LONG=1 also 5..7) on both two-cell meshes of fluxExactPairs with Neumann,
// Dirichlet and mixed (Dirichlet, Robin, Neumann, Robin with α not
// verified positive) boundary faces, and checks that the cell pair given
// negatively oriented is refused before renumbering.
func TestFluxExactTracesDivergenceAndRobinTerms(t *testing.T) {
	kmax := 4
	if os.Getenv("GAPCERT_LONG") == "1" {
		kmax = 7
	}
	meshes, refused := fluxExactPairs(t)
	for mi, m := range meshes {
		if refused[mi] != nil {
			_, err := NewFlux(refused[mi], 1, fluxExactConditions(fluxExactMesh{cells: refused[mi]}, "neumann"))
			var oe *FluxOrientationError
			if !errors.As(err, &oe) || oe.Cell != 1 {
				t.Fatalf("mesh %d: the negatively oriented cell gives %v, want a *FluxOrientationError for cell 1", mi, err)
			}
		}
		for k := 0; k <= kmax; k++ {
			for _, kind := range []string{"neumann", "dirichlet", "mixed"} {
				bnd := fluxExactConditions(m, kind)
				f, err := NewFlux(m.cells, k, bnd)
				if err != nil {
					t.Fatal(err)
				}
				if kind == "mixed" && len(f.robin) == 0 {
					t.Fatalf("mesh %d: no Robin face in the flux norm; the check of the face terms checks nothing", mi)
				}
				rng := rand.New(rand.NewPCG(uint64(mi), uint64(k)))
				if err := fluxExactDefect(f, m, bnd, rng); err != nil {
					t.Fatalf("mesh %d, %s faces: %v", mi, kind, err)
				}
			}
		}
	}
}

// fluxMutatedReference returns a copy of r with its tables copied, for
// one mutation.
func fluxMutatedReference(r *rtRef) *rtRef {
	c := *r
	for x := 0; x < 3; x++ {
		c.compT[x] = append([]float64(nil), r.compT[x]...)
	}
	c.divT = append([]float64(nil), r.divT...)
	return &c
}

// TestFluxExactChecksCatchTableMutations checks that fluxExactDefect
// fails for each of four small defects of the reference tables at k = 2
// (on the sheared pair, every face keeping its DOFs): one face function
// with its sign flipped, one interior function's divergence scaled by
// 1 + 2⁻⁴⁰, one nonzero divergence coefficient of an interior function
// set to 0, two face functions of one face swapped.
func TestFluxExactChecksCatchTableMutations(t *testing.T) {
	meshes, _ := fluxExactPairs(t)
	m := meshes[1]
	const k = 2
	bnd := fluxExactConditions(m, "dirichlet")
	ref := rtReference(k)
	nd, nf, nn, nk := ref.ndof, ref.nFace, rtDim(ref.n), rtDim(k)
	interior := 4*nf + 1
	mutations := map[string]func(r *rtRef){
		"face function sign flipped": func(r *rtRef) {
			l := 2*nf + 1
			for c := 0; c < 3; c++ {
				for a := 0; a < nn; a++ {
					r.compT[c][a*nd+l] = -r.compT[c][a*nd+l]
				}
			}
			for b := 0; b < nk; b++ {
				r.divT[b*nd+l] = -r.divT[b*nd+l]
			}
		},
		"interior divergence scaled by 1 + 2⁻⁴⁰": func(r *rtRef) {
			for b := 0; b < nk; b++ {
				r.divT[b*nd+interior] *= 1 + 0x1p-40
			}
		},
		"interior divergence entry dropped": func(r *rtRef) {
			for b := 0; b < nk; b++ {
				if r.divT[b*nd+interior] != 0 {
					r.divT[b*nd+interior] = 0
					return
				}
			}
			panic("interior function without divergence")
		},
		"face multi-indices swapped": func(r *rtRef) {
			l1, l2 := nf, nf+2
			for c := 0; c < 3; c++ {
				for a := 0; a < nn; a++ {
					r.compT[c][a*nd+l1], r.compT[c][a*nd+l2] = r.compT[c][a*nd+l2], r.compT[c][a*nd+l1]
				}
			}
			for b := 0; b < nk; b++ {
				r.divT[b*nd+l1], r.divT[b*nd+l2] = r.divT[b*nd+l2], r.divT[b*nd+l1]
			}
		},
	}
	names := make([]string, 0, len(mutations))
	for name := range mutations {
		names = append(names, name)
	}
	sort.Strings(names)
	for _, name := range names {
		f, err := NewFlux(m.cells, k, bnd)
		if err != nil {
			t.Fatal(err)
		}
		mut := fluxMutatedReference(ref)
		mutations[name](mut)
		f.ref = mut
		err = fluxExactDefect(f, m, bnd, rand.New(rand.NewPCG(3, 4)))
		if err == nil {
			t.Errorf("%s: not detected", name)
			continue
		}
		t.Logf("%s: %v", name, err)
	}
}
