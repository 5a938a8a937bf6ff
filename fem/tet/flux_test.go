package tet

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"gapcert/fem/boundary"
	"gapcert/interval"
)

// fluxValue encloses σ(x) = J σ̂(ξ)/det J on cell t at the point with
// barycentric coordinates lam (exact floats), for the flux with global
// coefficients vec.
func fluxValue(f *Flux, vec []float64, t int, lam [4]float64) [3]interval.I {
	ref := f.ref
	x := make([]float64, ref.ndof)
	f.local(x, vec, t)
	ix := rtMulti(ref.n)
	var sh [3]interval.I
	coef := make([]interval.I, len(ix.alpha))
	for c := 0; c < 3; c++ {
		fluxExactCombination(coef, ref.compT[c], x)
		for m, a := range ix.alpha {
			b := interval.Point(float64(rtMultinom(a[:]...).Int64()))
			for j := 0; j < 4; j++ {
				for e := 0; e < a[j]; e++ {
					b = b.MulF(lam[j])
				}
			}
			sh[c] = sh[c].Add(b.Mul(coef[m]))
		}
	}
	cell := f.cells[t]
	det := f.geom[t].det
	var out [3]interval.I
	for r := 0; r < 3; r++ {
		for a := 0; a < 3; a++ {
			out[a] = out[a].Add(cell.Vertices[r+1][a].Sub(cell.Vertices[0][a]).Mul(sh[r]))
		}
	}
	for a := range out {
		out[a] = out[a].Div(det)
	}
	return out
}

// fluxFaceDensity encloses σ·ν_F at the point of face fc with barycentric
// coordinates mu over its sorted global vertices, seen from cell t, with
// ν_F = (P_b − P_a) × (P_c − P_a) from the cell's vertex enclosures.
func fluxFaceDensity(f *Flux, vec []float64, t int, nodes [3]int, mu [3]float64) interval.I {
	cell := f.cells[t]
	var lam [4]float64
	var p [3][3]interval.I
	for r, g := range nodes {
		for j := 0; j < 4; j++ {
			if cell.Nodes[j] == g {
				lam[j] = mu[r]
				p[r] = cell.Vertices[j]
			}
		}
	}
	var e1, e2 [3]interval.I
	for a := 0; a < 3; a++ {
		e1[a], e2[a] = p[1][a].Sub(p[0][a]), p[2][a].Sub(p[0][a])
	}
	nu := fluxCross(e1, e2)
	s := fluxValue(f, vec, t, lam)
	return s[0].Mul(nu[0]).Add(s[1].Mul(nu[1])).Add(s[2].Mul(nu[2]))
}

// TestFluxNormalContinuityAcrossFaces checks H(div) conformity on
// perturbed Kuhn meshes (interior grid points moved at random, vertex
// numbers and local vertex orders scrambled, fixed seeds): for random
// global coefficients, the flux density σ·ν_F at points of every
// interior face, enclosed from each of its two cells,
// agrees (the enclosures intersect, and are narrow, so a sign or
// permutation error of the face orientation would show), and on Neumann
// faces σ·n = 0.
func TestFluxNormalContinuityAcrossFaces(t *testing.T) {
	pts := [][3]float64{{0.25, 0.375, 0.375}, {0.625, 0.125, 0.25}, {0.0625, 0.5, 0.4375}, {1, 0, 0}}
	for k := 0; k <= 3; k++ {
		for seed := uint64(1); seed <= 2; seed++ {
			m := fluxScrambled(fluxKuhnMesh(2+int(seed)%2, nil, fluxJitter(seed, 0.04)), seed)
			f, err := NewFlux(m.cells, k, m.boundaryAll(boundary.Condition{Kind: boundary.Neumann}))
			if err != nil {
				t.Fatal(err)
			}
			rng := rand.New(rand.NewPCG(seed, uint64(k)))
			vec := make([]float64, f.N())
			for i := range vec {
				vec[i] = rng.NormFloat64()
			}
			cellsOf := make([][]int, len(m.owners))
			for c, cell := range m.cells {
				for _, fc := range cell.Faces {
					cellsOf[fc] = append(cellsOf[fc], c)
				}
			}
			nonzero := 0
			for fc, cs := range cellsOf {
				for _, mu := range pts {
					a := fluxFaceDensity(f, vec, cs[0], m.nodes[fc], mu)
					if len(cs) == 1 {
						if !a.ContainsZero() || a.Wid() > 1e-9 {
							t.Fatalf("k=%d: Neumann face %d has flux density %v", k, fc, a)
						}
						continue
					}
					b := fluxFaceDensity(f, vec, cs[1], m.nodes[fc], mu)
					if _, ok := a.Intersection(b); !ok {
						t.Fatalf("k=%d seed %d: face %d flux density %v from cell %d, %v from cell %d", k, seed, fc, a, cs[0], b, cs[1])
					}
					if a.Wid() > 1e-9*(1+a.Mag()) {
						t.Fatalf("k=%d: face %d flux density %v too wide", k, fc, a)
					}
					if a.Mag() > 1e-3 {
						nonzero++
					}
				}
			}
			if nonzero == 0 {
				t.Fatalf("k=%d: every interior flux density vanished; the test checks nothing", k)
			}
		}
	}
}

// TestFluxRefusesUnverifiedOrientation checks that a negatively oriented
// cell (two vertices swapped) stops the construction with a
// *FluxOrientationError naming the cell.
func TestFluxRefusesUnverifiedOrientation(t *testing.T) {
	m := fluxKuhnMesh(1, nil, nil)
	c := &m.cells[3]
	c.Vertices[2], c.Vertices[3] = c.Vertices[3], c.Vertices[2]
	c.Nodes[2], c.Nodes[3] = c.Nodes[3], c.Nodes[2]
	c.Faces[2], c.Faces[3] = c.Faces[3], c.Faces[2]
	_, err := NewFlux(m.cells, 1, m.boundaryAll(boundary.Condition{Kind: boundary.Dirichlet}))
	var oe *FluxOrientationError
	if !errors.As(err, &oe) || oe.Cell != 3 || !(oe.Det.Hi < 0) {
		t.Fatalf("NewFlux on a negatively oriented cell 3: %v, want a *FluxOrientationError for cell 3", err)
	}
}

// The unit cube (0, 1)³ with Dirichlet conditions has the eigenvalues
// π²(a² + b² + c²), a, b, c ≥ 1 (separation of variables, common
// practice): λ_1 = 3π², λ_2 = 6π² (triple). With Neumann conditions a, b,
// c ≥ 0: 0, π² (triple), 2π² (triple).

// TestFluxLehmannGoerischUnitCubeDirichlet checks that the lower bound of λ_1
// from RT_k fluxes contains 3π² with the Ritz upper bound, and that the
// width falls under refinement in h and in the degrees (ρ = 6π² + γ from
// the closed form, lowered by a relative 1e-9).
func TestFluxLehmannGoerischUnitCubeDirichlet(t *testing.T) {
	truth := fluxPiSquaredTimes(3)
	const gamma = 10
	rho := (6*math.Pi*math.Pi + gamma) * (1 - 1e-9)
	cases := []struct {
		n, p, k int
		maxRel  float64 // the width measured when written, times about 2
	}{
		{2, 2, 1, 0.8},
		{3, 2, 1, 0.2},
		{4, 2, 1, 0.07},
		{2, 3, 2, 0.06},
		{4, 3, 2, 1.4e-3},
		{3, 4, 3, 1.6e-4},
		// k = p: the Lehmann–Goerisch error falls to about 1.3 times the
		// Ritz error (k = p − 1: about 4 times), at twice the flux unknowns.
		{3, 3, 3, 3.2e-3},
	}
	// The bounds do not depend on the numbering: a scrambled mesh (random
	// vertex numbers and local vertex orders) gives the same enclosure up
	// to rounding.
	m := fluxKuhnMesh(3, nil, nil)
	a := fluxLGBounds(t, m, fluxDirichletAll(m), 3, 2, 1, gamma, rho)
	ms := fluxScrambled(m, 5)
	b := fluxLGBounds(t, ms, fluxDirichletAll(ms), 3, 2, 1, gamma, rho)
	if !(b.lower[0] <= truth.Lo && truth.Hi <= b.upper[0]) || math.Abs(a.lower[0]-b.lower[0]) > 1e-9*truth.Mid() {
		t.Fatalf("scrambled mesh: λ1 ∈ [%.12g, %.12g], unscrambled [%.12g, %.12g]", b.lower[0], b.upper[0], a.lower[0], a.upper[0])
	}
	prev := math.Inf(1)
	for _, c := range cases {
		r := fluxLGBounds(t, fluxKuhnMesh(c.n, nil, nil), fluxDirichletAll(fluxKuhnMesh(c.n, nil, nil)), c.p, c.k, 1, gamma, rho)
		lo, hi := r.lower[0], r.upper[0]
		if !(lo <= truth.Lo && truth.Hi <= hi) {
			t.Fatalf("n=%d p=%d k=%d: [%.12g, %.12g] misses 3π² = %v", c.n, c.p, c.k, lo, hi, truth)
		}
		rel := (hi - lo) / truth.Mid()
		t.Logf("n=%d p=%d k=%d: trial %d, flux %d unknowns, λ1 ∈ [%.10g, %.10g], relative width %.3g, lower error %.3g",
			c.n, c.p, c.k, r.trialN, r.fluxN, lo, hi, rel, truth.Mid()-lo)
		if rel > c.maxRel {
			t.Errorf("n=%d p=%d k=%d: relative width %.3g above %.3g", c.n, c.p, c.k, rel, c.maxRel)
		}
		if c.p == 2 && rel >= prev {
			t.Errorf("n=%d p=2: width %.3g did not fall under refinement (previous %.3g)", c.n, rel, prev)
		}
		if c.p == 2 {
			prev = rel
		}
	}
}

// TestFluxLehmannGoerischUnitCubeNeumann checks the four lowest Neumann
// eigenvalues 0, π², π², π² (N = 4, ρ = 2π² + γ from the closed form).
func TestFluxLehmannGoerischUnitCubeNeumann(t *testing.T) {
	const gamma = 1
	rho := (2*math.Pi*math.Pi + gamma) * (1 - 1e-9)
	pi2 := fluxPiSquaredTimes(1)
	for _, c := range []struct {
		n, p, k  int
		maxWidth float64
	}{{2, 3, 2, 0.04}, {4, 3, 2, 7e-4}} {
		r := fluxLGBounds(t, fluxKuhnMesh(c.n, nil, nil), fluxKuhnMesh(c.n, nil, nil).boundaryAll(boundary.Condition{Kind: boundary.Neumann}), c.p, c.k, 4, gamma, rho)
		if !(r.lower[0] <= 0 && 0 <= r.upper[0]) || r.lower[0] < -1e-9 {
			t.Fatalf("n=%d: λ_1 ∈ [%g, %g], want 0 inside and a narrow enclosure", c.n, r.lower[0], r.upper[0])
		}
		for i := 1; i < 4; i++ {
			if !(r.lower[i] <= pi2.Lo && pi2.Hi <= r.upper[i]) {
				t.Fatalf("n=%d: λ_%d ∈ [%.12g, %.12g] misses π²", c.n, i+1, r.lower[i], r.upper[i])
			}
			if w := r.upper[i] - r.lower[i]; w > c.maxWidth {
				t.Errorf("n=%d: λ_%d width %.3g above %.3g", c.n, i+1, w, c.maxWidth)
			}
		}
		t.Logf("n=%d p=%d k=%d: trial %d, flux %d unknowns, λ_2..4 widths %.3g %.3g %.3g",
			c.n, c.p, c.k, r.trialN, r.fluxN, r.upper[1]-r.lower[1], r.upper[2]-r.lower[2], r.upper[3]-r.lower[3])
	}
}

// The orthoscheme T = {0 ≤ x ≤ y ≤ z ≤ 1} with Dirichlet conditions.
// Its eigenvalues follow by reflection in the cube Q = (0, 1)³ (common
// practice; derived here). The planes x = y and y = z, reflections s_1,
// s_2 that generate the group S_3 of coordinate permutations, cut Q into
// the six images P(T), P ∈ S_3 (Kuhn's subdivision); the faces of T are
// x = 0, z = 1 (parts of ∂Q) and the mirrors x = y, y = z.
//
//   - An eigenfunction u of T (u = 0 on ∂T) extends to Q by
//     ũ(Px) = sgn(P) u(x). ũ is continuous (u vanishes on the mirrors),
//     in H¹_0(Q) (its trace on ∂Q is an image of u on x = 0 or z = 1),
//     and −Δũ = λũ weakly on Q: for φ ∈ H¹_0(Q) write φ's antisymmetric
//     part φ_a = (1/6) Σ_P sgn(P) φ∘P; ∫_Q ∇ũ·∇φ = ∫_Q ∇ũ·∇φ_a =
//     6 ∫_T ∇u·∇φ_a = 6λ ∫_T u φ_a = λ ∫_Q ũ φ (φ_a vanishes on the mirrors,
//     so φ_a|_T ∈ H¹_0(T); the symmetric parts integrate to 0 against the
//     antisymmetric ũ). So λ is a Dirichlet eigenvalue of Q with an
//     antisymmetric eigenfunction.
//   - Conversely an antisymmetric eigenfunction of Q vanishes on the
//     mirrors, and its restriction is an eigenfunction of T.
//
// The eigenspace of Q for π²m is spanned by the products
// Π_j sin(a_j π x_j) with a_1² + a_2² + a_3² = m, a_j ≥ 1, and its
// antisymmetric part by det[sin(a_i π x_j)], nonzero exactly when the a_j
// are distinct. So the spectrum of T is π²(a_1² + a_2² + a_3²),
// 0 < a_1 < a_2 < a_3: 14π² (1, 2, 3), 21π² (1, 2, 4), 26π² (1, 3, 4),
// each simple (no other triple of distinct squares has these sums).

// TestFluxLehmannGoerischOrthoscheme checks λ_1 = 14π² and λ_2 = 21π² of the
// orthoscheme (N = 2, ρ = 26π² + γ), meshed by the Kuhn cells of the n³
// subcubes whose centroid has x < y < z (the Freudenthal triangulation
// is cut by the planes x = y and y = z, so these cells tile T exactly).
func TestFluxLehmannGoerischOrthoscheme(t *testing.T) {
	keep := func(c [3]float64) bool { return c[0] < c[1] && c[1] < c[2] }
	truth := []interval.I{fluxPiSquaredTimes(14), fluxPiSquaredTimes(21)}
	const gamma = 100
	rho := (26*math.Pi*math.Pi + gamma) * (1 - 1e-9)
	for _, c := range []struct {
		n, p, k int
		maxRel  [2]float64
	}{{4, 3, 2, [2]float64{0.04, 0.4}}, {4, 4, 3, [2]float64{2e-3, 0.03}}, {6, 3, 2, [2]float64{5e-3, 0.06}}} {
		m := fluxKuhnMesh(c.n, keep, nil)
		if len(m.cells) != c.n*c.n*c.n {
			t.Fatalf("n=%d: %d cells in the orthoscheme, want n³", c.n, len(m.cells))
		}
		r := fluxLGBounds(t, m, fluxDirichletAll(m), c.p, c.k, 2, gamma, rho)
		for i, tr := range truth {
			if !(r.lower[i] <= tr.Lo && tr.Hi <= r.upper[i]) {
				t.Fatalf("n=%d p=%d k=%d: λ_%d ∈ [%.12g, %.12g] misses %v", c.n, c.p, c.k, i+1, r.lower[i], r.upper[i], tr)
			}
			rel := (r.upper[i] - r.lower[i]) / tr.Mid()
			if rel > c.maxRel[i] {
				t.Errorf("n=%d p=%d k=%d: λ_%d relative width %.3g above %.3g", c.n, c.p, c.k, i+1, rel, c.maxRel[i])
			}
		}
		t.Logf("n=%d p=%d k=%d: trial %d, flux %d unknowns, λ_1 ∈ [%.8g, %.8g], λ_2 ∈ [%.8g, %.8g]",
			c.n, c.p, c.k, r.trialN, r.fluxN, r.lower[0], r.upper[0], r.lower[1], r.upper[1])
	}
}

// TestFluxPanicsOnMismatchedBoundary checks the misuse panics of NewFlux:
// a boundary face without a condition, a condition on an interior face,
// and a condition on a face that does not exist.
func TestFluxPanicsOnMismatchedBoundary(t *testing.T) {
	m := fluxKuhnMesh(1, nil, nil)
	dir := boundary.Condition{Kind: boundary.Dirichlet}
	interior := -1
	for f, o := range m.owners {
		if o == 2 {
			interior = f
			break
		}
	}
	cases := map[string]func(map[int]boundary.Condition){
		"missing boundary face": func(b map[int]boundary.Condition) {
			for f := range b {
				delete(b, f)
				return
			}
		},
		"interior face":    func(b map[int]boundary.Condition) { b[interior] = dir },
		"nonexistent face": func(b map[int]boundary.Condition) { b[len(m.owners)+5] = dir },
	}
	for name, edit := range cases {
		t.Run(name, func(t *testing.T) {
			b := m.boundaryAll(dir)
			edit(b)
			defer func() {
				if recover() == nil {
					t.Errorf("NewFlux accepted boundary conditions with a %s", name)
				}
			}()
			NewFlux(m.cells, 0, b)
		})
	}
}

// fluxRobinRoot encloses the root in (lo, hi) of g(s) = s cos s + α sin s,
// where g changes sign between lo and hi, by float bisection with every
// sign decided in interval arithmetic (package interval's Sin and Cos):
// the result [a, b] has g(a) and g(b) of verified opposite signs, so a
// root lies inside by continuity.
func fluxRobinRoot(t *testing.T, alpha, lo, hi float64) interval.I {
	g := func(s float64) interval.I {
		x := interval.Point(s)
		return x.Mul(interval.Cos(x)).Add(interval.Sin(x).MulF(alpha))
	}
	sign := g(lo).Sign()
	if sign == 0 || g(hi).Sign() != -sign {
		t.Fatalf("fluxRobinRoot: no verified sign change on [%g, %g]", lo, hi)
	}
	for i := 0; i < 200 && hi-lo > 1e-14*hi; i++ {
		mid := lo + (hi-lo)/2
		switch v := g(mid).Sign(); v {
		case sign:
			lo = mid
		case -sign:
			hi = mid
		default:
			return interval.I{Lo: lo, Hi: hi}
		}
	}
	return interval.I{Lo: lo, Hi: hi}
}

// TestFluxLehmannGoerischUnitCubeMixedAndRobin checks faces of three kinds.
// Separation of variables (common practice) on (0, 1)³ with Dirichlet
// conditions on every face but x = 1 gives λ = μ + π²(b² + c²), b, c ≥ 1,
// with μ the eigenvalues of −u″ = μu on (0, 1), u(0) = 0 and at x = 1:
//
//   - Neumann, u′(1) = 0: u = sin((a − ½)πx), μ = (a − ½)²π², so λ_1 =
//     2.25π² and λ_2 = 4.25π² (then 5.25π²);
//   - Robin, u′(1) + αu(1) = 0 with α = 1: u = sin(sx) with
//     g(s) = s cos s + α sin s = 0, μ = s². On ((j − ½)π, jπ) tan s + s/α
//     increases from −∞ to jπ/α > 0, so there is exactly one root s_j there,
//     and none on (0, π/2) (tan s > 0 > −s/α) or ((j − 1)π, (j − ½)π)
//     (likewise): λ_1 = s_1² + 2π², λ_2 = min(s_2² + 2π², s_1² + 5π²) =
//     s_2² + 2π² (s_2 < 5 gives s_2² < 25 < s_1² + 3π²). s_1 and s_2 are
//     enclosed by fluxRobinRoot.
//
// The flux norm carries ∫(σ·n)²/α on the Robin face and σ·n = 0 on the
// Neumann face; the trial space carries α∫_F uv.
func TestFluxLehmannGoerischUnitCubeMixedAndRobin(t *testing.T) {
	const gamma = 10
	pi2 := fluxPiSquaredTimes(1)
	s1 := fluxRobinRoot(t, 1, 1.6, 3.1)
	s2 := fluxRobinRoot(t, 1, 4.72, 6.2)
	for _, c := range []struct {
		name     string
		cond     boundary.Condition
		l1, l2   interval.I
		maxWidth float64
	}{
		{"neumann", boundary.Condition{Kind: boundary.Neumann}, fluxPiSquaredTimes(2.25), fluxPiSquaredTimes(4.25), 0.015},
		{"robin", boundary.Condition{Kind: boundary.Robin, Alpha: interval.Point(1)}, s1.Sqr().Add(pi2.MulF(2)), s2.Sqr().Add(pi2.MulF(2)), 0.015},
	} {
		m := fluxKuhnMesh(4, nil, nil)
		bnd := m.boundaryWhere(func(x [3]float64) boundary.Condition {
			if x[0] == 1 {
				return c.cond
			}
			return boundary.Condition{Kind: boundary.Dirichlet}
		})
		rho := interval.SubDown(c.l2.Lo+gamma, 1e-9*c.l2.Lo)
		r := fluxLGBounds(t, m, bnd, 3, 2, 1, gamma, rho)
		if !(r.lower[0] <= c.l1.Lo && c.l1.Hi <= r.upper[0]) {
			t.Fatalf("%s: λ_1 ∈ [%.12g, %.12g] misses %v", c.name, r.lower[0], r.upper[0], c.l1)
		}
		if w := r.upper[0] - r.lower[0]; w > c.maxWidth {
			t.Errorf("%s: λ_1 width %.3g above %.3g", c.name, w, c.maxWidth)
		}
		t.Logf("%s at x = 1, n=4 p=3 k=2: λ_1 ∈ [%.10g, %.10g] (exact %.10g), trial %d, flux %d unknowns",
			c.name, r.lower[0], r.upper[0], c.l1.Mid(), r.trialN, r.fluxN)
	}
}
