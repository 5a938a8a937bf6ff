package tet

import (
	"fmt"
	"math/big"
	"sync"
)

// rtFaceVertices lists, for each local face i, its local vertices in
// increasing order.
var rtFaceVertices = [4][3]int{{1, 2, 3}, {0, 2, 3}, {0, 1, 3}, {0, 1, 2}}

// rtRefNormal is ν̂_i, the outward normal of reference face i times twice
// its area.
var rtRefNormal = [4][3]int64{{1, 1, 1}, {-1, 0, 0}, {0, -1, 0}, {0, 0, -1}}

// rtRef is the reference basis of RT_k, scaled to integer coefficients:
// φ'_l = s_l φ_l with s_l = faceScale for every face function (one common
// integer, so that the two cells at a face scale its DOFs alike) and the
// least common denominator of its coefficients for an interior one.
// Local DOFs are ordered face 0, 1, 2, 3 (each by rtFaceMulti(k)), then
// the interior functions (c = 0, 1, 2: those of the face opposite vertex
// c + 1, each by rtMulti(k − 1); see rtBasisRat).
type rtRef struct {
	k, n  int // degree and component degree n = k + 1
	ndof  int
	nFace int // DOFs per face, (k + 1)(k + 2)/2
	// compT[c][α·ndof + l]: coefficient α (degree n) of component c of φ'_l;
	// divT[β·ndof + l]: coefficient β (degree k) of div̂ φ'_l. Every entry
	// is an integer of at most 53 bits, so exactly a float64.
	compT     [3][]float64
	divT      []float64
	faceScale float64
	// compCols[c][l] and divCols[l] list the nonzero entries of column l
	// of compT[c] and divT: each component has at most three, each
	// divergence few (rtBasisRat), which the float tables of the flux
	// choice use.
	compCols [3][][]rtEntry
	divCols  [][]rtEntry
}

// rtEntry is a nonzero entry of a column of the reference tables: the
// coefficient index and its value.
type rtEntry struct {
	row int
	v   float64
}

// rtColumns returns the nonzero entries of each column of the row-major
// table t with nd columns.
func rtColumns(t []float64, nd int) [][]rtEntry {
	out := make([][]rtEntry, nd)
	for a := 0; a*nd < len(t); a++ {
		for l, v := range t[a*nd : (a+1)*nd] {
			if v != 0 {
				out[l] = append(out[l], rtEntry{a, v})
			}
		}
	}
	return out
}

var (
	rtRefMu    sync.Mutex
	rtRefCache = map[int]*rtRef{}
)

// RTDim returns the dimension (k + 1)(k + 2)(k + 4)/2 of RT_k on one
// tetrahedron.
func RTDim(k int) int { return (k + 1) * (k + 2) * (k + 4) / 2 }

// rtReference returns the scaled reference basis of RT_k (cached). It
// panics for k < 0 or when a scaled coefficient is not an integer of at
// most 53 bits.
func rtReference(k int) *rtRef {
	if k < 0 {
		panic("tet: Raviart–Thomas degree must be ≥ 0")
	}
	rtRefMu.Lock()
	defer rtRefMu.Unlock()
	if r, ok := rtRefCache[k]; ok {
		return r
	}
	comp, div := rtBasisRat(k)
	ndof := RTDim(k)
	nFace := rtFaceDim(k)
	scale := make([]*big.Int, ndof)
	face := big.NewInt(1)
	for l := 0; l < ndof; l++ {
		scale[l] = big.NewInt(1)
		for c := 0; c < 3; c++ {
			for _, v := range comp[l][c] {
				scale[l] = rtLCM(scale[l], v.Denom())
			}
		}
		for _, v := range div[l] {
			scale[l] = rtLCM(scale[l], v.Denom())
		}
		if l < 4*nFace {
			face = rtLCM(face, scale[l])
		}
	}
	for l := 0; l < 4*nFace; l++ {
		scale[l] = face
	}
	exact := func(v *big.Rat, l int) float64 {
		if v.Sign() == 0 {
			return 0
		}
		x := new(big.Rat).Mul(v, new(big.Rat).SetInt(scale[l]))
		f, isExact := x.Float64()
		if !x.IsInt() || !isExact || x.Num().BitLen() > 53 {
			panic(fmt.Sprintf("tet: scaled Raviart–Thomas coefficient %v of degree %d is not a small integer", x, k))
		}
		return f
	}
	n := k + 1
	nn, nk := rtDim(n), rtDim(k)
	r := &rtRef{k: k, n: n, ndof: ndof, nFace: nFace, divT: make([]float64, nk*ndof)}
	r.faceScale = exact(big.NewRat(1, 1), 0)
	for c := 0; c < 3; c++ {
		r.compT[c] = make([]float64, nn*ndof)
		for l := 0; l < ndof; l++ {
			for a := 0; a < nn; a++ {
				r.compT[c][a*ndof+l] = exact(comp[l][c][a], l)
			}
		}
	}
	for l := 0; l < ndof; l++ {
		for b := 0; b < nk; b++ {
			r.divT[b*ndof+l] = exact(div[l][b], l)
		}
	}
	for c := 0; c < 3; c++ {
		r.compCols[c] = rtColumns(r.compT[c], ndof)
	}
	r.divCols = rtColumns(r.divT, ndof)
	rtRefCache[k] = r
	return r
}

func rtLCM(a, b *big.Int) *big.Int {
	g := new(big.Int).GCD(nil, nil, a, b)
	return new(big.Int).Mul(a, new(big.Int).Quo(b, g))
}

// rtField is a vector field on T̂: the Bernstein coefficients (degree n)
// of its three components.
type rtField [3][]*big.Rat

// rtBasisRat returns the reference basis of RT_k (ordered as rtRef):
// comp[l][c] the degree-(k+1) Bernstein coefficients of component c of
// basis function l, div[l] the degree-k coefficients of its divergence,
// exactly. The functions are Bernstein polynomials times Whitney face
// fields (package doc, Basis):
//
//	face i, multi-index β:   B^k_α φ_F / (φ_F·ν̂_i on F),  F the face i, α = β on F and α_i = 0;
//	interior (c, γ):         B^k_α φ_F,  F the face opposite vertex c + 1, α = γ + e_(c+1), |γ| = k − 1.
//
// With B^k_α λ_a = C(k, α)/C(k + 1, α + e_a) B^(k+1)_(α+e_a) =
// (α_a + 1)/(k + 1) · B^(k+1)_(α+e_a), every coefficient is a small
// rational. The normal traces are checked exactly here (face function l of
// face i: σ̂·ν̂_i has the face Bernstein coefficients of the unit vector at
// its β, and σ̂·ν̂_j = 0 on every other face; interior functions: 0 on
// every face), and rtBasisRat panics if one fails.
func rtBasisRat(k int) (comp []rtField, div [][]*big.Rat) {
	n := k + 1
	in := rtMulti(n)
	nn := rtDim(n)
	fk := rtFaceMulti(k)
	// Most coefficients are 0: they share one value, replaced by a new
	// one where a term is added.
	shared := new(big.Rat)
	zero := func() []*big.Rat {
		z := make([]*big.Rat, nn)
		for i := range z {
			z[i] = shared
		}
		return z
	}
	// whitney adds f·B^k_α φ_F to s, F = rtFaceVertices[i]:
	// φ_F = 2(λ_a ∇λ_b × ∇λ_c + λ_b ∇λ_c × ∇λ_a + λ_c ∇λ_a × ∇λ_b).
	whitney := func(s rtField, i int, al [4]int, f *big.Rat) {
		v := rtFaceVertices[i]
		for r := 0; r < 3; r++ {
			a, b, c := v[r], v[(r+1)%3], v[(r+2)%3]
			w := rtCross(rtGradLambda[b], rtGradLambda[c])
			up := al
			up[a]++
			coef := new(big.Rat).Mul(f, big.NewRat(int64(2*(al[a]+1)), int64(n)))
			for x := 0; x < 3; x++ {
				if w[x] != 0 {
					p := in.pos[up]
					if s[x][p] == shared {
						s[x][p] = new(big.Rat)
					}
					s[x][p].Add(s[x][p], new(big.Rat).Mul(coef, new(big.Rat).SetInt64(w[x])))
				}
			}
		}
	}
	ndof := RTDim(k)
	comp = make([]rtField, 0, ndof)
	for i := 0; i < 4; i++ {
		inv := new(big.Rat).Inv(new(big.Rat).SetInt64(rtWhitneyFlux(i)))
		for _, b := range fk.alpha {
			var al [4]int
			for r, j := range rtFaceVertices[i] {
				al[j] = b[r]
			}
			f := rtField{zero(), zero(), zero()}
			whitney(f, i, al, inv)
			comp = append(comp, f)
		}
	}
	if k > 0 {
		for c := 0; c < 3; c++ {
			for _, g := range rtMulti(k - 1).alpha {
				al := g
				al[c+1]++
				f := rtField{zero(), zero(), zero()}
				whitney(f, c+1, al, big.NewRat(1, 1))
				comp = append(comp, f)
			}
		}
	}
	if len(comp) != ndof {
		panic("tet: Raviart–Thomas basis has the wrong size")
	}
	div = make([][]*big.Rat, ndof)
	for l := range comp {
		rtCheckTraces(k, l, comp[l])
		div[l] = rtDivergenceRat(comp[l], n)
	}
	return comp, div
}

// rtFluxDensity returns the coefficient of σ̂·ν̂_j at the face multi-index
// g (over the vertices of face j in increasing order) from the component
// coefficients s of degree in.n: that of the multi-index with the same
// exponents and 0 at vertex j.
func rtFluxDensity(s rtField, j int, g [3]int, in *rtIndex) *big.Rat {
	var a [4]int
	for r, v := range rtFaceVertices[j] {
		a[v] = g[r]
	}
	p := in.pos[a]
	out := new(big.Rat)
	for c := 0; c < 3; c++ {
		if nu := rtRefNormal[j][c]; nu != 0 {
			out.Add(out, new(big.Rat).Mul(s[c][p], new(big.Rat).SetInt64(nu)))
		}
	}
	return out
}

// rtGradLambda holds ∇λ_j on T̂.
var rtGradLambda = [4][3]int64{{-1, -1, -1}, {1, 0, 0}, {0, 1, 0}, {0, 0, 1}}

// rtCross returns u × v.
func rtCross(u, v [3]int64) [3]int64 {
	return [3]int64{u[1]*v[2] - u[2]*v[1], u[2]*v[0] - u[0]*v[2], u[0]*v[1] - u[1]*v[0]}
}

// rtWhitneyFlux returns the constant value of φ_F·ν̂_i on the face F =
// rtFaceVertices[i]: there φ_F·ν̂_i = 2 Σ_r λ_(v_r) (∇λ_(v_(r+1)) ×
// ∇λ_(v_(r+2)))·ν̂_i, and the three dot products are equal (it panics
// otherwise), so with Σ_r λ_(v_r) = 1 on F the value is twice their common
// value.
func rtWhitneyFlux(i int) int64 {
	v := rtFaceVertices[i]
	var d [3]int64
	for r := 0; r < 3; r++ {
		w := rtCross(rtGradLambda[v[(r+1)%3]], rtGradLambda[v[(r+2)%3]])
		d[r] = w[0]*rtRefNormal[i][0] + w[1]*rtRefNormal[i][1] + w[2]*rtRefNormal[i][2]
	}
	if d[0] != d[1] || d[1] != d[2] || d[0] == 0 {
		panic(fmt.Sprintf("tet: Whitney field of face %d has a non-constant flux %v", i, d))
	}
	return 2 * d[0]
}

// rtCheckTraces panics unless the normal traces of basis function l are
// those of rtBasisRat: on each face j the degree-(k+1) coefficients of
// σ̂·ν̂_j at the multi-indices with α_j = 0 are the trace's coefficients
// (B^(k+1)_α restricted to face j is the face's B^(k+1) of the same
// exponents, and vanishes there if α_j > 0), and they must equal the
// degree elevation to k + 1 of the unit face vector at β (face function l
// of face j) or be 0.
func rtCheckTraces(k, l int, s rtField) {
	n := k + 1
	in, fn, fk := rtMulti(n), rtFaceMulti(n), rtFaceMulti(k)
	nf := len(fk.alpha)
	for j := 0; j < 4; j++ {
		for _, g := range fn.alpha {
			got := rtFluxDensity(s, j, g, in)
			want := new(big.Rat)
			if l >= j*nf && l < (j+1)*nf {
				// Elevation B^k_β = Σ_r C(k, β) C(1, e_r)/C(k+1, β + e_r) B^(k+1)_(β+e_r):
				// the coefficient at g is (β_r + 1)/(k + 1) = g_r/(k + 1) when g − e_r = β.
				b := fk.alpha[l-j*nf]
				for r := 0; r < 3; r++ {
					d := g
					d[r]--
					if d == b {
						want.SetFrac64(int64(g[r]), int64(n))
					}
				}
			}
			if got.Cmp(want) != 0 {
				panic(fmt.Sprintf("tet: Raviart–Thomas basis function %d of degree %d has normal trace coefficient %s on face %d, want %s", l, k, got.RatString(), j, want.RatString()))
			}
		}
	}
}

// rtDivergenceRat returns the degree-(n−1) Bernstein coefficients of
// div̂ s for a field of degree n: ∂/∂ξ_c = ∂/∂λ_(c+1) − ∂/∂λ_0 and
// ∂B^n_α/∂λ_j = n B^(n−1)_(α−e_j), so coefficient β is
// n Σ_c (s_c[β + e_(c+1)] − s_c[β + e_0]).
func rtDivergenceRat(s rtField, n int) []*big.Rat {
	in, ik := rtMulti(n), rtMulti(n-1)
	out := make([]*big.Rat, len(ik.alpha))
	fn := new(big.Rat).SetInt64(int64(n))
	for b, beta := range ik.alpha {
		d := new(big.Rat)
		up0 := beta
		up0[0]++
		for c := 0; c < 3; c++ {
			up := beta
			up[c+1]++
			d.Add(d, s[c][in.pos[up]])
			d.Sub(d, s[c][in.pos[up0]])
		}
		out[b] = d.Mul(d, fn)
	}
	return out
}
