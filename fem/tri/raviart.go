package tri

import (
	"fmt"
	"math/big"
	"sync"

	"gapcert/fem/internal/rattable"
)

// The Raviart–Thomas space of degree k on the reference triangle T̂ with
// vertices ξ_0 = (0, 0), ξ_1 = (1, 0), ξ_2 = (0, 1) (barycentric λ_1 = ξ,
// λ_2 = η) is
//
//	RT_k = P_k² + (ξ, η) P̃_k,   dim RT_k = (k + 1)(k + 3),
//
// P̃_k the homogeneous polynomials of degree k (P.-A. Raviart and
// J.-M. Thomas, A mixed finite element method for 2nd order elliptic
// problems, in: Mathematical Aspects of Finite Element Methods, Springer
// LNM 606, 1977; F. Brezzi and
// M. Fortin, Mixed and Hybrid Finite Element Methods, Springer, 1991,
// §III.3). Its members have components of degree ≤ k + 1, divergence in
// P_k and, on each edge, a normal component in P_k (the (ξ, η)P̃_k part is
// tangential up to a constant factor on the edges through the origin and
// has normal component x·ν = const·P̃_k on the third).
//
// Degrees of freedom (unisolvent for RT_k, ibid.; here verified by the
// exact inversion below, which fails loudly otherwise):
//
//   - on local edge i (opposite vertex i, traversed counterclockwise from
//     ξ_(i+1) to ξ_(i+2), t ∈ [0, 1]), the k + 1 Bernstein coefficients of
//     the flux density g_i(t) = σ̂(ξ(t))·ν̂_i, ν̂_i = R(ξ_(i+2) − ξ_(i+1)),
//     R(a, b) = (b, −a) (the outward normal times the edge length);
//   - inside, the k(k + 1) moments ∫_T̂ σ̂_c B^(k−1)_β, c = 1, 2.
//
// Edge DOFs come first (edge 0, 1, 2, each by the exponent of t), then the
// moments. The basis is dual to them, computed once per k in exact
// rational arithmetic, and each basis function is kept, scaled to integer
// coefficients (see rtRef), as the degree-(k+1) Bernstein coefficients of
// its two components and the degree-k coefficients of its divergence.
type rtRef struct {
	k, n  int // degree and component degree n = k + 1
	ndof  int
	nEdge int // k + 1 per edge
	// The stored basis is scaled to integer coefficients: φ'_l = s_l φ_l
	// with s_l = edgeScale for every edge function (one common integer,
	// so that the two triangles at an edge scale its DOFs alike) and the
	// least common denominator of its coefficients for an interior one.
	// compT[c][β·ndof + l]: coefficient β of component c of φ'_l;
	// divT[β·ndof + l]: coefficient β (degree k) of div̂ φ'_l. Every entry
	// is an integer below 2^53, so exactly a float64.
	compT     [2][]float64
	divT      []float64
	edgeScale float64
}

var (
	rtMu    sync.Mutex
	rtCache = map[int]*rtRef{}
)

// rtReference returns the scaled reference basis of RT_k (cached).
func rtReference(k int) *rtRef {
	if k < 0 {
		panic("tri: Raviart–Thomas degree must be ≥ 0")
	}
	rtMu.Lock()
	defer rtMu.Unlock()
	if r, ok := rtCache[k]; ok {
		return r
	}
	comp, div := rtBasisRat(k)
	n := k + 1
	ndof := (k + 1) * (k + 3)
	nn, nk := dim(n), dim(k)
	coefs := func(l int) []*big.Rat {
		return append(append([]*big.Rat(nil), comp[2*l*nn:(2*l+2)*nn]...), div[l*nk:(l+1)*nk]...)
	}
	scale := make([]*big.Int, ndof)
	edge := big.NewInt(1)
	for l := 0; l < ndof; l++ {
		scale[l] = big.NewInt(1)
		for _, v := range coefs(l) {
			scale[l] = lcm(scale[l], v.Denom())
		}
		if l < 3*(k+1) {
			edge = lcm(edge, scale[l])
		}
	}
	for l := 0; l < 3*(k+1); l++ {
		scale[l] = edge
	}
	exact := func(v *big.Rat, l int) float64 {
		x := new(big.Rat).Mul(v, new(big.Rat).SetInt(scale[l]))
		f, isExact := x.Float64()
		if !x.IsInt() || !isExact || x.Num().BitLen() > 53 {
			panic(fmt.Sprintf("tri: scaled Raviart–Thomas coefficient %v of degree %d is not a small integer", x, k))
		}
		return f
	}
	r := &rtRef{k: k, n: n, ndof: ndof, nEdge: k + 1, divT: make([]float64, nk*ndof)}
	r.edgeScale = exact(big.NewRat(1, 1), 0)
	for c := 0; c < 2; c++ {
		r.compT[c] = make([]float64, nn*ndof)
		for l := 0; l < ndof; l++ {
			for b := 0; b < nn; b++ {
				r.compT[c][b*ndof+l] = exact(comp[(2*l+c)*nn+b], l)
			}
		}
	}
	for l := 0; l < ndof; l++ {
		for b := 0; b < nk; b++ {
			r.divT[b*ndof+l] = exact(div[l*nk+b], l)
		}
	}
	rtCache[k] = r
	return r
}

func lcm(a, b *big.Int) *big.Int {
	g := new(big.Int).GCD(nil, nil, a, b)
	return new(big.Int).Mul(a, new(big.Int).Quo(b, g))
}

// ratPoly2 is a pair of Bernstein coefficient vectors of degree n (the two
// components of a vector field on T̂).
type ratPoly2 [2][]*big.Rat

// rtBasisRat returns the component and divergence tables of the dual basis.
func rtBasisRat(k int) (comp, div []*big.Rat) {
	n := k + 1
	nn := dim(n)
	mono := monomialRats(n)
	pairs := monomialPairs(n)
	pos := map[[2]int]int{}
	for i, ij := range pairs {
		pos[ij] = i
	}
	monomial := func(a, b int) []*big.Rat { return mono[pos[[2]int{a, b}]*nn : (pos[[2]int{a, b}]+1)*nn] }
	zero := func() []*big.Rat {
		z := make([]*big.Rat, nn)
		for i := range z {
			z[i] = new(big.Rat)
		}
		return z
	}
	// Spanning set: (m, 0), (0, m) for the monomials m of degree ≤ k, and
	// (ξ h, η h) for the monomials h of degree exactly k.
	var span []ratPoly2
	for a := 0; a <= k; a++ {
		for b := 0; a+b <= k; b++ {
			span = append(span, ratPoly2{monomial(a, b), zero()}, ratPoly2{zero(), monomial(a, b)})
		}
	}
	for a := 0; a <= k; a++ {
		b := k - a
		span = append(span, ratPoly2{monomial(a+1, b), monomial(a, b+1)})
	}
	ndof := (k + 1) * (k + 3)
	if len(span) != ndof {
		panic("tri: Raviart–Thomas spanning set has the wrong size")
	}
	// A[l][m] = L_l(span_m).
	a := make([][]*big.Rat, ndof)
	for l := range a {
		a[l] = make([]*big.Rat, ndof)
	}
	for m, s := range span {
		for l, v := range rtFunctionals(k, s) {
			a[l][m] = v
		}
	}
	x, ok := rattable.Inverse(a)
	if !ok {
		panic(fmt.Sprintf("tri: Raviart–Thomas degrees of freedom of degree %d are not unisolvent", k))
	}
	// Basis function l = Σ_m span_m X[m][l].
	comp = make([]*big.Rat, 0, ndof*2*nn)
	basis := make([]ratPoly2, ndof)
	for l := 0; l < ndof; l++ {
		for c := 0; c < 2; c++ {
			v := zero()
			for m, s := range span {
				if x[m][l].Sign() == 0 {
					continue
				}
				for b := range v {
					v[b].Add(v[b], new(big.Rat).Mul(x[m][l], s[c][b]))
				}
			}
			basis[l][c] = v
			comp = append(comp, v...)
		}
	}
	dp := diffPairs(n)
	nk := dim(k)
	div = make([]*big.Rat, 0, ndof*nk)
	fn := new(big.Rat).SetInt64(int64(n))
	for l := 0; l < ndof; l++ {
		for b := 0; b < nk; b++ {
			// ∂/∂ξ = ∂/∂λ_1 − ∂/∂λ_0 and ∂/∂η = ∂/∂λ_2 − ∂/∂λ_0 (kernel.go).
			d := new(big.Rat).Sub(basis[l][0][dp[0][b][0]], basis[l][0][dp[0][b][1]])
			d.Add(d, basis[l][1][dp[1][b][0]])
			d.Sub(d, basis[l][1][dp[1][b][1]])
			div = append(div, d.Mul(d, fn))
		}
	}
	return comp, div
}

// rtFunctionals returns the degrees of freedom of the vector field s
// (components of degree n = k + 1) in the order of rtRef.
func rtFunctionals(k int, s ratPoly2) []*big.Rat {
	n := k + 1
	var out []*big.Rat
	for i := 0; i < 3; i++ {
		out = append(out, reduceDegree(edgeFlux(s, n, i), n)...)
	}
	if k > 0 {
		g := gramRat(n, k-1)
		nq := dim(k - 1)
		for c := 0; c < 2; c++ {
			for b := 0; b < nq; b++ {
				acc := new(big.Rat)
				for a := range s[c] {
					acc.Add(acc, new(big.Rat).Mul(s[c][a], g[a*nq+b]))
				}
				out = append(out, acc)
			}
		}
	}
	return out
}

// rtEdgeNormal is ν̂_i = R(ξ_(i+2) − ξ_(i+1)) for the reference vertices.
var rtEdgeNormal = [3][2]int64{{1, 1}, {-1, 0}, {0, -1}}

// edgeFlux returns the degree-n Bernstein coefficients, in the exponent of
// t, of g_i(t) = s(ξ(t))·ν̂_i on local edge i, where ξ(t) has λ_i = 0,
// λ_(i+1) = 1 − t, λ_(i+2) = t: the restriction of a Bernstein polynomial
// to that edge has the coefficients with α_i = 0 (tables.go).
func edgeFlux(s ratPoly2, n, i int) []*big.Rat {
	ix := multiIndex(n)
	out := make([]*big.Rat, n+1)
	for m := 0; m <= n; m++ {
		var a [3]int
		a[(i+1)%3], a[(i+2)%3] = n-m, m
		p := ix.pos[a]
		v := new(big.Rat).Mul(s[0][p], new(big.Rat).SetInt64(rtEdgeNormal[i][0]))
		out[m] = v.Add(v, new(big.Rat).Mul(s[1][p], new(big.Rat).SetInt64(rtEdgeNormal[i][1])))
	}
	return out
}

// reduceDegree returns the degree-(n−1) Bernstein coefficients c of a
// univariate polynomial given by degree-n coefficients e, assuming it has
// degree ≤ n − 1. Degree elevation gives e_j = (j/n) c_(j−1) + (1 − j/n) c_j
// (Farouki 2012), so c_0 = e_0 and c_j = (n e_j − j c_(j−1))/(n − j). On
// RT_k the normal traces have degree ≤ k, so these are linear functionals
// equal to the trace's coefficients.
func reduceDegree(e []*big.Rat, n int) []*big.Rat {
	c := make([]*big.Rat, n)
	c[0] = new(big.Rat).Set(e[0])
	for j := 1; j < n; j++ {
		v := new(big.Rat).Mul(e[j], new(big.Rat).SetInt64(int64(n)))
		v.Sub(v, new(big.Rat).Mul(c[j-1], new(big.Rat).SetInt64(int64(j))))
		c[j] = v.Quo(v, new(big.Rat).SetInt64(int64(n-j)))
	}
	return c
}

// gramRat returns ∫_T̂ B^m_α B^q_β dξ (the reference area is 1/2) as
// g[α·dim(q) + β], exactly.
func gramRat(m, q int) []*big.Rat {
	im, iq := multiIndex(m), multiIndex(q)
	out := make([]*big.Rat, 0, len(im.alpha)*len(iq.alpha))
	for _, a := range im.alpha {
		for _, b := range iq.alpha {
			num := new(big.Int).Mul(multinom(a), multinom(b))
			w := baryIntegralRat(add3(a, b)) // ∫_T / |T|
			w.Mul(w, new(big.Rat).SetInt(num))
			out = append(out, w.Quo(w, big.NewRat(2, 1)))
		}
	}
	return out
}
