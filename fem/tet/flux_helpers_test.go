package tet

import (
	"math"
	"math/rand/v2"
	"sort"
	"testing"

	"gapcert/enclose"
	"gapcert/enclose/sparse"
	"gapcert/fem/boundary"
	"gapcert/fem/internal/bernstein"
	"gapcert/fem/internal/ritz"
	"gapcert/interval"
	"gapcert/temple"
)

// This file drives the flux tests: tetrahedral meshes of the unit cube
// (Kuhn's subdivision of n³ subcubes into six tetrahedra each: the
// subcube with corner c holds, for each permutation π of the axes, the
// tetrahedron c, c + e_π(0), c + e_π(0) + e_π(1), c + e_1 + e_2 + e_3 —
// common practice, H. W. Kuhn, Some combinatorial lemmas in topology, IBM
// J. Res. Dev. 4 (1960) 518–524, details recalled from memory; it is also
// the Freudenthal triangulation, cut by the planes x_i = j/n and
// x_i − x_j = l/n) and a minimal
// conforming P_p trial space in Bernstein form (test-only: global DOFs by
// domain point, Dirichlet DOFs removed, float assembly and interval Ritz
// matrices).

// fluxMesh is a list of cells with the global face table.
type fluxMesh struct {
	cells  []RTCell
	owners []int    // cells per face
	nodes  [][3]int // sorted vertex numbers per face
}

// fluxKuhnMesh returns the Kuhn subdivision of n³ subcubes of [0, 1]³,
// keeping the cells whose centroid satisfies keep (nil: all), with the
// interior grid points moved by jitter(node) (nil: none; exact floats).
func fluxKuhnMesh(n int, keep func(c [3]float64) bool, jitter func(i, j, l int) [3]float64) fluxMesh {
	node := func(i, j, l int) int { return (i*(n+1)+j)*(n+1) + l }
	coord := func(g [3]int) [3]interval.I {
		var x [3]interval.I
		var d [3]float64
		if jitter != nil && g[0] > 0 && g[0] < n && g[1] > 0 && g[1] < n && g[2] > 0 && g[2] < n {
			d = jitter(g[0], g[1], g[2])
		}
		for a := 0; a < 3; a++ {
			x[a] = interval.Point(float64(g[a])).DivF(float64(n))
			if d[a] != 0 {
				x[a] = x[a].AddF(d[a])
			}
		}
		return x
	}
	perms := [6][3]int{{0, 1, 2}, {0, 2, 1}, {1, 0, 2}, {1, 2, 0}, {2, 0, 1}, {2, 1, 0}}
	var m fluxMesh
	faceID := map[[3]int]int{}
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			for l := 0; l < n; l++ {
				for _, pi := range perms {
					var g [4][3]int
					g[0] = [3]int{i, j, l}
					for s := 0; s < 3; s++ {
						g[s+1] = g[s]
						g[s+1][pi[s]]++
					}
					var cen [3]float64
					for _, v := range g {
						for a := 0; a < 3; a++ {
							cen[a] += float64(v[a]) / float64(4*n)
						}
					}
					if keep != nil && !keep(cen) {
						continue
					}
					// det[e_π0, e_π0 + e_π1, e_1 + e_2 + e_3] = sgn π: swap
					// the last two vertices of odd permutations.
					if (pi[0] == 0 && pi[1] == 2) || (pi[0] == 1 && pi[1] == 0) || (pi[0] == 2 && pi[1] == 1) {
						g[2], g[3] = g[3], g[2]
					}
					var c RTCell
					for v := 0; v < 4; v++ {
						c.Vertices[v] = coord(g[v])
						c.Nodes[v] = node(g[v][0], g[v][1], g[v][2])
					}
					for f := 0; f < 4; f++ {
						var key [3]int
						for r, v := range rtFaceVertices[f] {
							key[r] = c.Nodes[v]
						}
						sort.Ints(key[:])
						id, ok := faceID[key]
						if !ok {
							id = len(m.nodes)
							faceID[key] = id
							m.nodes = append(m.nodes, key)
							m.owners = append(m.owners, 0)
						}
						m.owners[id]++
						c.Faces[f] = id
					}
					m.cells = append(m.cells, c)
				}
			}
		}
	}
	return m
}

// boundaryWhere returns, on every boundary face, the condition cond(x) of
// the centroid x of the face (computed from the vertex midpoints).
func (m fluxMesh) boundaryWhere(cond func(x [3]float64) boundary.Condition) map[int]boundary.Condition {
	out := map[int]boundary.Condition{}
	for _, c := range m.cells {
		for i, f := range c.Faces {
			if m.owners[f] != 1 {
				continue
			}
			var x [3]float64
			for _, j := range rtFaceVertices[i] {
				for a := 0; a < 3; a++ {
					x[a] += c.Vertices[j][a].Mid() / 3
				}
			}
			out[f] = cond(x)
		}
	}
	return out
}

// boundaryAll returns the condition c on every boundary face.
func (m fluxMesh) boundaryAll(c boundary.Condition) map[int]boundary.Condition {
	out := map[int]boundary.Condition{}
	for f, o := range m.owners {
		if o == 1 {
			out[f] = c
		}
	}
	return out
}

// fluxTestTrial is conforming P_p in Bernstein form on a fluxMesh: one global
// DOF per domain point, identified by its vertices and their exponents
// (so neighbours agree without orientation), with the DOFs of domain
// points on Dirichlet faces removed, and the Robin faces with their α.
type fluxTestTrial struct {
	m     fluxMesh
	p, n  int
	dofs  [][]int
	robin []fluxFace
}

func newFluxTestTrial(m fluxMesh, p int, bnd map[int]boundary.Condition) *fluxTestTrial {
	type key [4][2]int
	onBoundary := map[key]bool{}
	{
		for f, o := range m.owners {
			if o != 1 || !bnd[f].Essential() {
				continue
			}
			v := m.nodes[f]
			for mask := 1; mask < 8; mask++ {
				var k key
				q := 0
				for r := 0; r < 3; r++ {
					if mask&(1<<r) != 0 {
						k[q] = [2]int{v[r], 1}
						q++
					}
				}
				for ; q < 4; q++ {
					k[q] = [2]int{-1, 0}
				}
				onBoundary[k] = true
			}
		}
	}
	ix := rtMulti(p)
	s := &fluxTestTrial{m: m, p: p, dofs: make([][]int, len(m.cells))}
	ids := map[key]int{}
	for t, c := range m.cells {
		d := make([]int, len(ix.alpha))
		for q, a := range ix.alpha {
			var k, supp key
			nz := 0
			for j := 0; j < 4; j++ {
				if a[j] > 0 {
					k[nz] = [2]int{c.Nodes[j], a[j]}
					nz++
				}
			}
			for r := nz; r < 4; r++ {
				k[r] = [2]int{-1, 0}
			}
			sort.Slice(k[:nz], func(x, y int) bool { return k[x][0] < k[y][0] })
			for r := 0; r < 4; r++ {
				supp[r] = [2]int{k[r][0], 0}
				if k[r][0] >= 0 {
					supp[r][1] = 1
				}
			}
			if onBoundary[supp] {
				d[q] = -1
				continue
			}
			id, ok := ids[k]
			if !ok {
				id = s.n
				ids[k] = id
				s.n++
			}
			d[q] = id
		}
		s.dofs[t] = d
		for i, f := range c.Faces {
			if cond, ok := bnd[f]; ok && cond.HasTerm() {
				s.robin = append(s.robin, fluxFace{t: t, i: i, alpha: cond.WeakAlpha(), area: fluxFaceArea(c, i)})
			}
		}
	}
	return s
}

// fluxFaceRestriction returns, for local face i, the local index of each face
// multi-index of degree p (the domain points with α_i = 0).
func fluxFaceRestriction(p, i int) []int {
	ix := rtMulti(p)
	var out []int
	for _, b := range rtFaceMulti(p).alpha {
		var a [4]int
		for r, j := range rtFaceVertices[i] {
			a[j] = b[r]
		}
		out = append(out, ix.pos[a])
	}
	return out
}

func (s *fluxTestTrial) N() int                 { return s.n }
func (s *fluxTestTrial) Degree() int            { return s.p }
func (s *fluxTestTrial) MultiIndices() [][4]int { return rtMulti(s.p).alpha }
func (s *fluxTestTrial) Local(dst, vec []float64, t int) {
	for q, g := range s.dofs[t] {
		dst[q] = 0
		if g >= 0 {
			dst[q] = vec[g]
		}
	}
}

// fluxBaryGradients encloses ∇λ_j (rows of J⁻¹: row r = (e_(r+1) × e_(r+2))/det J,
// indices mod 3, and ∇λ_0 = −Σ) and |T| = det J/6.
func fluxBaryGradients(c RTCell) ([4][3]interval.I, interval.I) {
	var e [3][3]interval.I
	for r := 0; r < 3; r++ {
		for x := 0; x < 3; x++ {
			e[r][x] = c.Vertices[r+1][x].Sub(c.Vertices[0][x])
		}
	}
	g := fluxGeometry(c)
	var out [4][3]interval.I
	for r := 0; r < 3; r++ {
		cr := fluxCross(e[(r+1)%3], e[(r+2)%3])
		for x := 0; x < 3; x++ {
			out[r+1][x] = cr[x].Div(g.det)
			out[0][x] = out[0][x].Sub(out[r+1][x])
		}
	}
	return out, g.det.DivF(6)
}

// assembleApprox returns the float matrices of a + shift·b and b (−Δ,
// V = 0, with the Robin face terms α|F| G_F): per cell ∫∇B_α·∇B_β = p²|T| Σ_(j,l) ∇λ_j·∇λ_l
// G^(p−1)[α − e_j, β − e_l] and ∫B_αB_β = |T| G^p[α, β].
func (s *fluxTestTrial) assembleApprox(shift float64) (k, m *sparse.Sym) {
	p := s.p
	ix, im := rtMulti(p), rtMulti(p-1)
	gp, gq := rtTriple(0, p, p).FL, rtTriple(0, p-1, p-1).FL
	np, nq := len(ix.alpha), len(im.alpha)
	kb, mb := sparse.NewBuilder(s.n), sparse.NewBuilder(s.n)
	for t, c := range s.m.cells {
		gr, vol := fluxBaryGradients(c)
		var gg [4][4]float64
		for j := 0; j < 4; j++ {
			for l := 0; l < 4; l++ {
				for x := 0; x < 3; x++ {
					gg[j][l] += gr[j][x].Mid() * gr[l][x].Mid()
				}
			}
		}
		v := vol.Mid()
		d := s.dofs[t]
		for a, al := range ix.alpha {
			if d[a] < 0 {
				continue
			}
			for b := 0; b <= a; b++ {
				if d[b] < 0 {
					continue
				}
				be := ix.alpha[b]
				st := 0.0
				for j := 0; j < 4; j++ {
					if al[j] == 0 {
						continue
					}
					aj := al
					aj[j]--
					for l := 0; l < 4; l++ {
						if be[l] == 0 {
							continue
						}
						bl := be
						bl[l]--
						st += gg[j][l] * gq[im.pos[aj]*nq+im.pos[bl]]
					}
				}
				ms := v * gp[a*np+b]
				kb.Add(d[a], d[b], float64(p*p)*v*st+shift*ms)
				mb.Add(d[a], d[b], ms)
			}
		}
	}
	gf := rtFaceGram(p).FL
	for _, rf := range s.robin {
		loc := fluxFaceRestriction(p, rf.i)
		d := s.dofs[rf.t]
		sc := rf.alpha.Mid() * rf.area.Mid()
		for a, la := range loc {
			for b := 0; b <= a; b++ {
				if lb := loc[b]; d[la] >= 0 && d[lb] >= 0 {
					kb.Add(d[la], d[lb], sc*gf[a*len(loc)+b])
				}
			}
		}
	}
	return kb.Build(), mb.Build()
}

// ritzMatrices encloses a0 = (∫∇u_i·∇u_j + Σ_Robin α∫_F u_iu_j + γ∫u_iu_j) and a1 = (∫u_iu_j)
// for the functions with coefficients vecs (exact floats), with the same
// identities as assembleApprox in interval arithmetic.
func (s *fluxTestTrial) ritzMatrices(vecs [][]float64, gamma interval.I) (a0, a1 *enclose.Sym) {
	p, nv := s.p, len(vecs)
	ix, im := rtMulti(p), rtMulti(p-1)
	gp, gq := rtTriple(0, p, p).IV, rtTriple(0, p-1, p-1).IV
	np, nq := len(ix.alpha), len(im.alpha)
	acc0, acc1 := ritz.NewAccumulator(nv), ritz.NewAccumulator(nv)
	c := make([][]float64, nv)
	gc := make([][]interval.I, nv)
	dc := make([][4][]interval.I, nv)
	gdc := make([][4][]interval.I, nv)
	for i := range c {
		c[i], gc[i] = make([]float64, np), make([]interval.I, np)
		for j := 0; j < 4; j++ {
			dc[i][j], gdc[i][j] = make([]interval.I, nq), make([]interval.I, nq)
		}
	}
	for t, cell := range s.m.cells {
		gr, vol := fluxBaryGradients(cell)
		var gg [4][4]interval.I
		for j := 0; j < 4; j++ {
			for l := 0; l < 4; l++ {
				for x := 0; x < 3; x++ {
					gg[j][l] = gg[j][l].Add(gr[j][x].Mul(gr[l][x]))
				}
			}
		}
		for i := range vecs {
			s.Local(c[i], vecs[i], t)
			bernstein.ApplyF(gc[i], gp, c[i])
			for j := 0; j < 4; j++ {
				for b, be := range im.alpha {
					up := be
					up[j]++
					dc[i][j][b] = interval.Point(c[i][ix.pos[up]]).MulF(float64(p))
				}
				bernstein.ApplyI(gdc[i][j], gq, dc[i][j])
			}
		}
		for i := 0; i < nv; i++ {
			for k := 0; k <= i; k++ {
				mass := vol.Mul(bernstein.DotF(c[k], gc[i]))
				st := interval.I{}
				for j := 0; j < 4; j++ {
					for l := 0; l < 4; l++ {
						st = st.Add(gg[j][l].Mul(bernstein.DotI(dc[k][l], gdc[i][j])))
					}
				}
				acc0.Add(i, k, vol.Mul(st).Add(gamma.Mul(mass)))
				acc1.Add(i, k, mass)
			}
		}
	}
	// Robin faces: α ∫_F u_i u_k = α |F| c_iᵀ G_F c_k on the face's domain points.
	gf := rtFaceGram(p).IV
	for _, rf := range s.robin {
		loc := fluxFaceRestriction(p, rf.i)
		ci := make([][]float64, nv)
		for i := range vecs {
			s.Local(c[i], vecs[i], rf.t)
			ci[i] = make([]float64, len(loc))
			for a, la := range loc {
				ci[i][a] = c[i][la]
			}
		}
		sc := rf.alpha.Mul(rf.area)
		g := make([]interval.I, len(loc))
		for i := 0; i < nv; i++ {
			bernstein.ApplyF(g, gf, ci[i])
			for k := 0; k <= i; k++ {
				acc0.Add(i, k, sc.Mul(bernstein.DotF(ci[k], g)))
			}
		}
	}
	return acc0.Sym(), acc1.Sym()
}

// fluxLGResult holds the bounds of one Lehmann–Goerisch computation.
type fluxLGResult struct {
	lower, upper  []float64 // bounds of λ_1..λ_N
	trialN, fluxN int
}

// fluxLGBounds computes Ritz upper bounds and Lehmann–Goerisch
// lower bounds of λ_1..λ_N of −Δ on the mesh with the boundary conditions
// bnd, trial space P_p, fluxes RT_k, shift γ and ρ ≤ Λ_(N+1) = λ_(N+1) + γ
// given by the caller (a closed form in the tests).
func fluxLGBounds(t testing.TB, m fluxMesh, bnd map[int]boundary.Condition, p, k, nTrial int, gamma, rho float64) fluxLGResult {
	t.Helper()
	s := newFluxTestTrial(m, p, bnd)
	kk, mm := s.assembleApprox(gamma)
	_, vecs, err := sparse.LowestEigs(kk, mm, nTrial)
	if err != nil {
		t.Fatalf("approximate eigenvectors: %v", err)
	}
	g := interval.Point(gamma)
	a0, a1 := s.ritzMatrices(vecs, g)
	f, err := NewFlux(m.cells, k, bnd)
	if err != nil {
		t.Fatal(err)
	}
	fs, err := NewFluxSpaceFree(s, f, g)
	if err != nil {
		t.Fatal(err)
	}
	fl, err := fs.Choose(vecs)
	if err != nil {
		t.Fatal(err)
	}
	a2, err := fs.LGMatrix(vecs, fl)
	if err != nil {
		t.Fatal(err)
	}
	lg, err := temple.LehmannGoerisch(a0, a1, a2, rho)
	if err != nil {
		t.Fatalf("Lehmann–Goerisch: %v", err)
	}
	ev, err := enclose.Eigenvalues(a0, a1)
	if err != nil {
		t.Fatalf("Ritz values: %v", err)
	}
	r := fluxLGResult{trialN: s.n, fluxN: f.N()}
	for i := range lg {
		r.lower = append(r.lower, interval.SubDown(lg[i], gamma))
		r.upper = append(r.upper, interval.SubUp(ev[i].Hi, gamma))
	}
	return r
}

// fluxPiSquaredTimes encloses c·π² (interval π of package interval).
func fluxPiSquaredTimes(c float64) interval.I { return interval.Pi().Sqr().MulF(c) }

// fluxJitter returns a fixed-seed jitter of at most amp per coordinate.
func fluxJitter(seed uint64, amp float64) func(i, j, l int) [3]float64 {
	rng := rand.New(rand.NewPCG(seed, 3))
	cache := map[[3]int][3]float64{}
	return func(i, j, l int) [3]float64 {
		k := [3]int{i, j, l}
		if d, ok := cache[k]; ok {
			return d
		}
		var d [3]float64
		for a := range d {
			d[a] = math.Ldexp(math.Round(math.Ldexp((2*rng.Float64()-1)*amp, 30)), -30)
		}
		cache[k] = d
		return d
	}
}

// fluxDirichletAll returns Dirichlet conditions on every boundary face of m.
func fluxDirichletAll(m fluxMesh) map[int]boundary.Condition {
	return m.boundaryAll(boundary.Condition{Kind: boundary.Dirichlet})
}

// fluxScrambled returns m with its global vertex numbers relabelled by a
// random permutation and the local vertices of every cell reordered by a
// random even permutation (which keeps the orientation), so that the
// faces meet in every relative orientation (fixed seed).
func fluxScrambled(m fluxMesh, seed uint64) fluxMesh {
	rng := rand.New(rand.NewPCG(seed, 11))
	maxNode := 0
	for _, c := range m.cells {
		for _, v := range c.Nodes {
			maxNode = max(maxNode, v+1)
		}
	}
	relabel := rng.Perm(maxNode)
	var even [][4]int
	for _, q := range [][4]int{
		{0, 1, 2, 3}, {0, 1, 3, 2}, {0, 2, 1, 3}, {0, 2, 3, 1}, {0, 3, 1, 2}, {0, 3, 2, 1},
		{1, 0, 2, 3}, {1, 0, 3, 2}, {1, 2, 0, 3}, {1, 2, 3, 0}, {1, 3, 0, 2}, {1, 3, 2, 0},
		{2, 0, 1, 3}, {2, 0, 3, 1}, {2, 1, 0, 3}, {2, 1, 3, 0}, {2, 3, 0, 1}, {2, 3, 1, 0},
		{3, 0, 1, 2}, {3, 0, 2, 1}, {3, 1, 0, 2}, {3, 1, 2, 0}, {3, 2, 0, 1}, {3, 2, 1, 0},
	} {
		inv := 0
		for a := 0; a < 4; a++ {
			for b := a + 1; b < 4; b++ {
				if q[a] > q[b] {
					inv++
				}
			}
		}
		if inv%2 == 0 {
			even = append(even, q)
		}
	}
	out := fluxMesh{owners: m.owners, cells: make([]RTCell, len(m.cells)), nodes: make([][3]int, len(m.nodes))}
	for t, c := range m.cells {
		q := even[rng.IntN(len(even))]
		var d RTCell
		for a := 0; a < 4; a++ {
			d.Vertices[a] = c.Vertices[q[a]]
			d.Nodes[a] = relabel[c.Nodes[q[a]]]
			d.Faces[a] = c.Faces[q[a]]
		}
		out.cells[t] = d
	}
	for f, v := range m.nodes {
		w := [3]int{relabel[v[0]], relabel[v[1]], relabel[v[2]]}
		sort.Ints(w[:])
		out.nodes[f] = w
	}
	return out
}
