package sparse

import (
	"errors"
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"runtime"
	"slices"
	"sort"
	"testing"

	"gapcert/interval"
)

// The tests of this file compare the a-priori residual bound r of
// roundoffBound with the exact residual norm ‖Pᵀ(K − σM)P − LDLᵀ‖∞ (the
// supremum over the members of an interval pencil) on pencils large
// enough for the multifrontal algorithm to do what small ones never make
// it do: fronts wider than a panel (updates between panels), fronts whose
// updates are split over several CPUs, many children's update matrices
// added into one front, and long rows, besides mixed scales, subnormal
// and huge entries and tiny pivots. The exact norm is computed in
// big.Float arithmetic with a precision that keeps every operation exact
// (checked after each one), only on the pattern of L + Lᵀ (outside it the
// factors contribute nothing, which is checked too).

// exactPrec is the precision of the exact residual: products of three
// doubles (159 significant bits) between 2⁻³²²² and 2³⁰⁷², and sums of
// them, fit in fewer bits; every operation checks that it was exact.
const exactPrec = 1 << 14

var errInexact = errors.New("big.Float operation was not exact")

// exactFloat is big.Float arithmetic that records whether any result was
// rounded.
type exactFloat struct{ inexact bool }

func (e *exactFloat) new() *big.Float { return new(big.Float).SetPrec(exactPrec) }

func (e *exactFloat) of(x float64) *big.Float { return e.new().SetFloat64(x) }

func (e *exactFloat) check(z *big.Float) *big.Float {
	if z.Acc() != big.Exact {
		e.inexact = true
	}
	return z
}

// exactResidualNorm returns max_i Σ_j sup |R_ij| over the members (K, M)
// of the interval pencil of c, R = Pᵀ(K − σM)P − L D Lᵀ with the factors
// c.f, exactly. For a fixed row the entries depend on different entries
// of [K] and [M] and |k − σm − x| is convex in (k, m), so the supremum of
// each entry is at a corner of [K_ij] × [M_ij] and the row sums add the
// entries' suprema. It returns an error if an entry of LDLᵀ falls outside
// the pattern of L (the symbolic analysis would be wrong) or an operation
// was inexact.
func exactResidualNorm(c *Counter, sigma float64) (*big.Float, error) {
	f := &c.f
	n := len(f.D)
	lp := f.Sym.colPtr
	var e exactFloat
	// ldl[j][0] = (LDLᵀ)_jj, ldl[j][1+t] = (LDLᵀ)_{i,j} for the t-th row i
	// of column j of L.
	ldl := make([][]*big.Float, n)
	for j := range ldl {
		ldl[j] = make([]*big.Float, 1+lp[j+1]-lp[j])
		for t := range ldl[j] {
			ldl[j][t] = e.new()
		}
	}
	slot := func(i, j int) (int, bool) {
		if i == j {
			return 0, true
		}
		col := f.Row[lp[j]:lp[j+1]]
		t := sort.Search(len(col), func(t int) bool { return int(col[t]) >= i })
		return 1 + t, t < len(col) && int(col[t]) == i
	}
	tmp := e.new()
	for k := 0; k < n; k++ {
		rows := append([]int{k}, make([]int, 0, lp[k+1]-lp[k])...)
		vals := []*big.Float{e.of(1)}
		for q := lp[k]; q < lp[k+1]; q++ {
			rows = append(rows, int(f.Row[q]))
			vals = append(vals, e.of(f.Val[q]))
		}
		dk := e.of(f.D[k])
		for b, j := range rows {
			ldj := e.check(e.new().Mul(dk, vals[b]))
			for a := b; a < len(rows); a++ {
				s, ok := slot(rows[a], j)
				if !ok {
					return nil, fmt.Errorf("L D Lᵀ has an entry (%d, %d) outside the pattern of L", rows[a], j)
				}
				e.check(tmp.Mul(ldj, vals[a]))
				e.check(ldl[j][s].Add(ldl[j][s], tmp))
			}
		}
	}
	// The interval entries of Pᵀ[K]P and Pᵀ[M]P on the same slots.
	kv, mv := make([][]interval.I, n), make([][]interval.I, n)
	for j := range kv {
		kv[j], mv[j] = make([]interval.I, len(ldl[j])), make([]interval.I, len(ldl[j]))
	}
	for _, src := range []struct {
		low *lowerColumns
		dst [][]interval.I
	}{{c.kLow, kv}, {c.mLow, mv}} {
		for j := 0; j < n; j++ {
			for q := src.low.ptr[j]; q < src.low.ptr[j+1]; q++ {
				s, ok := slot(int(src.low.row[q]), j)
				if !ok {
					return nil, fmt.Errorf("the pencil has an entry (%d, %d) outside the pattern of L", src.low.row[q], j)
				}
				src.dst[j][s] = src.dst[j][s].Add(src.low.val[q])
			}
		}
	}
	s := e.of(sigma)
	rowSum := make([]*big.Float, n)
	for i := range rowSum {
		rowSum[i] = e.new()
	}
	for j := 0; j < n; j++ {
		for t := range ldl[j] {
			i := j
			if t > 0 {
				i = int(f.Row[lp[j]+t-1])
			}
			worst := e.new()
			for _, a := range [2]float64{kv[j][t].Lo, kv[j][t].Hi} {
				for _, b := range [2]float64{mv[j][t].Lo, mv[j][t].Hi} {
					if math.IsInf(a, 0) || math.IsInf(b, 0) {
						return nil, errors.New("infinite pencil entry")
					}
					x := e.check(e.new().Mul(s, e.of(b)))
					x = e.check(x.Sub(e.of(a), x))
					x = e.check(x.Sub(x, ldl[j][t]))
					x.Abs(x)
					if x.Cmp(worst) > 0 {
						worst = x
					}
				}
			}
			e.check(rowSum[i].Add(rowSum[i], worst))
			if i != j {
				e.check(rowSum[j].Add(rowSum[j], worst))
			}
		}
	}
	if e.inexact {
		return nil, errInexact
	}
	norm := e.new()
	for _, x := range rowSum {
		if x.Cmp(norm) > 0 {
			norm = x
		}
	}
	return norm, nil
}

// exactCase is one pencil, shift and order whose roundoffBound is checked
// against the exact residual.
type exactCase struct {
	name  string
	k, m  *ISym
	sigma float64
	perm  []int // nil: the Counter's nested dissection
}

// exactRatio factors the case with the algorithm on procs CPUs and
// returns r/‖R‖∞ (+∞ if R = 0) and the factors, or ok = false if the
// factorization failed or r = +∞ (which claims nothing). It reports an
// error if r is below the exact residual norm.
func exactRatio(t *testing.T, tc exactCase, alg factorAlgorithm, procs int) (ratio float64, f *LDL, ok bool) {
	t.Helper()
	defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(procs))
	c := roundoffCounter(tc.k, tc.m)
	c.f.algorithm = alg
	if !factorForBound(c, tc.sigma, tc.perm) {
		return 0, nil, false
	}
	if tc.perm != nil { // the permuted pencil in the new order
		inv := make([]int, len(tc.perm))
		for q, v := range tc.perm {
			inv[v] = q
		}
		c.kLow, c.mLow = permutedLower(c.k, inv), permutedLower(c.m, inv)
	}
	r := c.roundoffBound(tc.sigma)
	if math.IsInf(r, 1) {
		return 0, nil, false
	}
	norm, err := exactResidualNorm(c, tc.sigma)
	if err != nil {
		t.Errorf("%s: %v", tc.name, err)
		return 0, nil, false
	}
	if new(big.Float).SetFloat64(r).Cmp(norm) < 0 {
		nf, _ := norm.Float64()
		t.Errorf("%s (algorithm %d, GOMAXPROCS %d): r = %g below the exact residual norm %g", tc.name, alg, procs, r, nf)
	}
	nf, _ := norm.Float64()
	return r / nf, &c.f, true
}

// grid27 returns the 27-point stencil (26, −1, …) on the m³ nodes of a
// cube: the fill of a 3D mesh with larger separators than the 7-point
// one, like higher-degree elements.
func grid27(m int) *Sym {
	b := NewBuilder(m * m * m)
	idx := func(x, y, z int) int { return (z*m+y)*m + x }
	for z := 0; z < m; z++ {
		for y := 0; y < m; y++ {
			for x := 0; x < m; x++ {
				i := idx(x, y, z)
				b.Add(i, i, 26)
				for dz := -1; dz <= 1; dz++ {
					for dy := -1; dy <= 1; dy++ {
						for dx := -1; dx <= 1; dx++ {
							X, Y, Z := x+dx, y+dy, z+dz
							if X < 0 || Y < 0 || Z < 0 || X >= m || Y >= m || Z >= m {
								continue
							}
							if j := idx(X, Y, Z); j < i {
								b.Add(i, j, -1)
							}
						}
					}
				}
			}
		}
	}
	return b.Build()
}

// diagonallyScaled returns D s D, D = diag(2^e_i), exactly (the callers
// keep the entries in the normal range).
func diagonallyScaled(s *Sym, e []int) *Sym {
	v := make([]float64, len(s.Val))
	for j := 0; j < s.N(); j++ {
		for q := s.Pat.colPtr[j]; q < s.Pat.colPtr[j+1]; q++ {
			v[q] = math.Ldexp(s.Val[q], e[s.Pat.rowIdx[q]]+e[j])
		}
	}
	return &Sym{Pat: s.Pat, Val: v}
}

// thickened returns [s] = s·[1 − ρ, 1 + ρ] entrywise (outward rounded).
func thickened(s *Sym, rho float64) *ISym {
	v := make([]interval.I, len(s.Val))
	w := interval.I{Lo: 1 - rho, Hi: 1 + rho}
	for q, x := range s.Val {
		v[q] = interval.Point(x).Mul(w)
	}
	return &ISym{Pat: s.Pat, Val: v}
}

// withHubs returns s plus h dense rows and columns (the last h indices),
// coupled to every other index with entries in ±[0, 1/2), diagonal hubs
// of size hubDiag: rows of L as long as the matrix.
func withHubs(s *Sym, h int, hubDiag float64, r *rand.Rand) *Sym {
	n := s.N()
	b := NewBuilder(n + h)
	for j := 0; j < n; j++ {
		for q := s.Pat.colPtr[j]; q < s.Pat.colPtr[j+1]; q++ {
			b.Add(int(s.Pat.rowIdx[q]), j, s.Val[q])
		}
	}
	for a := 0; a < h; a++ {
		b.Add(n+a, n+a, hubDiag)
		for j := 0; j < n+a; j++ {
			b.Add(n+a, j, r.Float64()-0.5)
		}
	}
	return b.Build()
}

// exactCases returns the pencils of TestRoundoffBoundExactResidualLarge.
func exactCases(t *testing.T) []exactCase {
	rnd := rand.New(rand.NewPCG(141, 142))
	var cases []exactCase
	point := func(name string, k *Sym, sigma float64, perm []int) {
		cases = append(cases, exactCase{name, toISym(k), toISym(identity(k.N())), sigma, perm})
	}
	// A 3D grid under nested dissection, between eigenvalues and at a
	// shift 1e-13 relatively above one (a tiny pivot, growth in L).
	g := perturbed(grid7(8), 0.2, rnd)
	eig := denseGeneralizedEigs(t, g, identity(g.N()))
	point("grid7 8³ between λ_4 and λ_5", g, 0.5*(eig[3]+eig[4]), nil)
	point("grid7 8³ next to λ_20", g, eig[19]*(1+1e-13), nil)
	// The 27-point stencil: fronts of more than 100 rows.
	g27 := perturbed(grid27(6), 0.1, rnd)
	eig27 := denseGeneralizedEigs(t, g27, identity(g27.N()))
	point("grid27 6³ between λ_30 and λ_31", g27, 0.5*(eig27[29]+eig27[30]), nil)
	point("grid27 6³ next to λ_3", g27, eig27[2]*(1-1e-14), nil)
	// Mixed scales: D(K − σI)D with D = diag(2^e), e ∈ [−250, 250], so
	// entries from about 2⁻⁵⁰⁰ to 2⁵⁰⁰ in one matrix (σ = 0 after the
	// scaling; the shift is in the entries).
	g6 := perturbed(grid7(6), 0.2, rnd)
	eig6 := denseGeneralizedEigs(t, g6, identity(g6.N()))
	sh := shifted(g6, identity(g6.N()), 0.5*(eig6[5]+eig6[6]))
	e := make([]int, sh.N())
	for i := range e {
		e[i] = rnd.IntN(501) - 250
	}
	point("grid7 6³ shifted, scales 2^±500", diagonallyScaled(sh, e), 0, nil)
	// Subnormal and huge entries.
	point("grid7 6³ shifted, scaled by 2⁻¹⁰⁶⁰", scaled(sh, -1060), 0, nil)
	point("grid7 6³ shifted, scaled by 2⁹⁹⁰", scaled(sh, 990), 0, nil)
	// A dense indefinite matrix in natural order: one front of 200 rows,
	// seven panels, trailing updates above parallelFrontWork (split over
	// the CPUs when there are several); a tiny leading pivot.
	d := randomScaledSym(rnd, 200, 1, -2, 2)
	d.Val[d.Pat.colPtr[0]] = 1e-12
	point("dense 200, leading pivot 1e-12", d, 0, naturalOrderOf(200))
	// Long rows: a grid with three hubs coupled to everything.
	hub := withHubs(perturbed(grid7(6), 0.2, rnd), 3, 2, rnd)
	point("grid7 6³ + 3 hubs, natural order", hub, 1, naturalOrderOf(hub.N()))
	point("grid7 6³ + 3 hubs, nested dissection", hub, 1, nil)
	// A thick interval pencil, [K] and [M] with relative widths 1e-9.
	mass := perturbed(identity(g6.N()), 0.3, rnd)
	eigM := denseGeneralizedEigs(t, g6, mass)
	cases = append(cases, exactCase{"grid7 6³ thick pencil between λ_8 and λ_9", thickened(g6, 1e-9),
		thickened(mass, 1e-9), 0.5 * (eigM[7] + eigM[8]), nil})
	return cases
}

// TestRoundoffBoundExactResidualLarge: on 3D grids under nested
// dissection (7- and 27-point), a dense matrix of seven panels, hubs
// (long rows), mixed scales 2^±500, subnormal and huge entries, tiny
// pivots and a thick interval pencil, roundoffBound's r is at least the
// exact residual norm for the factors of both algorithms, and the
// multifrontal factors on 1, 2 and 8 CPUs are the same bits. It logs the
// smallest ratio r/‖R‖∞ of each algorithm.
func TestRoundoffBoundExactResidualLarge(t *testing.T) {
	if testing.Short() {
		t.Skip("exact arithmetic on pencils of up to 516 unknowns")
	}
	cases := exactCases(t)
	// The smallest ratios over the point pencils (where r is the
	// factorization's rounding-error bound alone) and over all.
	minRatio := map[factorAlgorithm]float64{upLooking: math.Inf(1), multifrontal: math.Inf(1)}
	minPoint := map[factorAlgorithm]float64{upLooking: math.Inf(1), multifrontal: math.Inf(1)}
	checked := map[factorAlgorithm]int{}
	for _, tc := range cases {
		for _, alg := range []factorAlgorithm{upLooking, multifrontal} {
			ratio, f, ok := exactRatio(t, tc, alg, 1)
			if !ok {
				t.Logf("%s (algorithm %d): factorization failed or r = +∞", tc.name, alg)
				continue
			}
			checked[alg]++
			minRatio[alg] = math.Min(minRatio[alg], ratio)
			if isPoint(tc.k) && isPoint(tc.m) {
				minPoint[alg] = math.Min(minPoint[alg], ratio)
			}
			t.Logf("%s (algorithm %d): r/‖R‖∞ = %.4g", tc.name, alg, ratio)
			if alg != multifrontal {
				continue
			}
			for _, procs := range []int{2, 8} {
				ratioP, g, ok := exactRatio(t, tc, alg, procs)
				if !ok || ratioP != ratio || !slices.Equal(f.D, g.D) || !slices.Equal(f.Val, g.Val) {
					t.Errorf("%s: the multifrontal factors on %d CPUs differ from those on 1", tc.name, procs)
				}
			}
		}
	}
	for _, alg := range []factorAlgorithm{upLooking, multifrontal} {
		t.Logf("algorithm %d: %d of %d cases checked, smallest r/‖R‖∞ %.4g (point pencils %.4g)", alg, checked[alg], len(cases), minRatio[alg], minPoint[alg])
		if checked[alg] < len(cases)-1 {
			t.Errorf("algorithm %d: only %d of %d cases checked", alg, checked[alg], len(cases))
		}
	}
}

// isPoint reports whether every entry of s is a point interval.
func isPoint(s *ISym) bool {
	for _, v := range s.Val {
		if v.Lo != v.Hi {
			return false
		}
	}
	return true
}
