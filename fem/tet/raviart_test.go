package tet

import (
	"math/big"
	"math/rand/v2"
	"os"
	"testing"

	"gapcert/fem/internal/rattable"
)

// rtCheckedDegrees lists the degrees k ≥ from at which the exact
// Raviart–Thomas tables are checked by point values (face traces,
// divergence): up to 3, and with GAPCERT_LONG=1 also
// 9, the first degree past 8 the polyhedron driver uses (the construction
// is the same at every degree, and rtReference refuses a scaled
// coefficient that is not an integer of at most 53 bits; the tables of
// every k ≤ 12 are checked modulo a prime in raviart_membership_test.go).
func rtCheckedDegrees(from int) []int {
	var ks []int
	for k := from; k <= 3; k++ {
		ks = append(ks, k)
	}
	if os.Getenv("GAPCERT_LONG") == "1" {
		ks = append(ks, 9)
	}
	return ks
}

// rtEvalRat returns Σ_α c_α B^n_α(λ) exactly (λ the four barycentric
// coordinates), by the definition B^n_α = C(n, α) λ^α.
func rtEvalRat(c []*big.Rat, n int, lam [4]*big.Rat) *big.Rat {
	out := new(big.Rat)
	for m, a := range rtMulti(n).alpha {
		if c[m].Sign() == 0 {
			continue
		}
		t := new(big.Rat).SetInt(rtMultinom(a[:]...))
		for j := 0; j < 4; j++ {
			for e := 0; e < a[j]; e++ {
				t.Mul(t, lam[j])
			}
		}
		out.Add(out, t.Mul(t, c[m]))
	}
	return out
}

// rtFaceEvalRat returns Σ_β c_β B^k_β(μ) on a face.
func rtFaceEvalRat(c []*big.Rat, k int, mu [3]*big.Rat) *big.Rat {
	out := new(big.Rat)
	for m, b := range rtFaceMulti(k).alpha {
		if c[m].Sign() == 0 {
			continue
		}
		t := new(big.Rat).SetInt(rtMultinom(b[:]...))
		for j := 0; j < 3; j++ {
			for e := 0; e < b[j]; e++ {
				t.Mul(t, mu[j])
			}
		}
		out.Add(out, t.Mul(t, c[m]))
	}
	return out
}

// rtBarycentric returns the barycentric coordinates of the point x of T̂.
func rtBarycentric(x [3]*big.Rat) [4]*big.Rat {
	l0 := big.NewRat(1, 1)
	for _, v := range x {
		l0.Sub(l0, v)
	}
	return [4]*big.Rat{l0, x[0], x[1], x[2]}
}

// rtRandomRat returns a random rational in [0, 1) with denominator 97.
func rtRandomRat(rng *rand.Rand) *big.Rat { return big.NewRat(int64(rng.IntN(97)), 97) }

// TestRTBasisFaceTracesAgainstPointValues checks the normal traces of the
// basis on every face by exact evaluation: at random rational points of
// face i the flux density σ̂·ν̂_i of basis function l, computed from its
// component coefficients, equals the degree-k face Bernstein polynomial
// with coefficient 1 at l (face function of face i) or is 0 (every other
// function, the interior ones included), and the scaled table holds
// faceScale times the same coefficients. So the face DOFs are the
// Bernstein coefficients of the flux density, checked independently of
// the trace check inside rtBasisRat.
func TestRTBasisFaceTracesAgainstPointValues(t *testing.T) {
	rng := rand.New(rand.NewPCG(14, 1))
	for _, k := range rtCheckedDegrees(0) {
		comp, _ := rtBasisRat(k)
		ref := rtReference(k)
		nf := ref.nFace
		for trial := 0; trial < 3; trial++ {
			// A random point of each face: barycentric μ over the face's vertices.
			a, b := rtRandomRat(rng), rtRandomRat(rng)
			mu := [3]*big.Rat{new(big.Rat).Sub(big.NewRat(1, 1), new(big.Rat).Add(new(big.Rat).Mul(a, big.NewRat(1, 2)), new(big.Rat).Mul(b, big.NewRat(1, 2)))), new(big.Rat).Mul(a, big.NewRat(1, 2)), new(big.Rat).Mul(b, big.NewRat(1, 2))}
			for i := 0; i < 4; i++ {
				var lam [4]*big.Rat
				lam[i] = new(big.Rat)
				for r, j := range rtFaceVertices[i] {
					lam[j] = mu[r]
				}
				for l := range comp {
					flux := new(big.Rat)
					for c := 0; c < 3; c++ {
						v := rtEvalRat(comp[l][c], k+1, lam)
						flux.Add(flux, v.Mul(v, new(big.Rat).SetInt64(rtRefNormal[i][c])))
					}
					want := new(big.Rat)
					if l >= i*nf && l < (i+1)*nf {
						e := make([]*big.Rat, nf)
						for m := range e {
							e[m] = new(big.Rat)
						}
						e[l-i*nf].SetInt64(1)
						want = rtFaceEvalRat(e, k, mu)
					}
					if flux.Cmp(want) != 0 {
						t.Fatalf("k=%d face %d function %d: flux density %s, want %s", k, i, l, flux.RatString(), want.RatString())
					}
				}
			}
		}
		// The scaled tables hold the same functions: compT = faceScale·comp
		// for face functions.
		for l := 0; l < 4*nf; l++ {
			for a := range comp[l][0] {
				got := new(big.Rat).SetFloat64(ref.compT[0][a*ref.ndof+l])
				want := new(big.Rat).Mul(comp[l][0][a], new(big.Rat).SetFloat64(ref.faceScale))
				if got.Cmp(want) != 0 {
					t.Fatalf("k=%d: scaled table entry %d of function %d is %s, want %s", k, a, l, got.RatString(), want.RatString())
				}
			}
		}
	}
}

// rtGrundmannMoeller returns the points (barycentric coordinates) and
// weights of the Grundmann–Möller rule of index s on the reference
// n-simplex (volume 1/n!), exact for polynomials of degree ≤ 2s + 1
// (A. Grundmann, H. M. Möller, Invariant integration formulas for the
// n-simplex by combinatorial methods, SIAM J. Numer. Anal. 15 (1978)
// 282–290; the formula is recalled from memory, so the test first checks
// it against the exact monomial integrals). With m_i = n + 1 + 2(s − i):
//
//	Q f = Σ_(i=0..s) (−1)^i 2^(−2s) m_i^(2s+1)/(i! (n + 2s + 1 − i)!) Σ_(β ∈ N^(n+1), |β|=s−i) f((2β_j + 1)/m_i, j = 0..n).
func rtGrundmannMoeller(n, s int) (pts [][]*big.Rat, w []*big.Rat) {
	for i := 0; i <= s; i++ {
		m := int64(n + 1 + 2*(s-i))
		num := new(big.Int).Exp(big.NewInt(m), big.NewInt(int64(2*s+1)), nil)
		den := new(big.Int).Mul(rtFactorial(i), rtFactorial(n+2*s+1-i))
		den.Lsh(den, uint(2*s))
		wi := new(big.Rat).SetFrac(num, den)
		if i%2 == 1 {
			wi.Neg(wi)
		}
		var betas [][]int
		if n == 3 {
			for _, b := range rtMulti(s - i).alpha {
				betas = append(betas, b[:])
			}
		} else {
			for _, b := range rtFaceMulti(s - i).alpha {
				betas = append(betas, b[:])
			}
		}
		for _, b := range betas {
			p := make([]*big.Rat, n+1)
			for j := range p {
				p[j] = big.NewRat(int64(2*b[j]+1), m)
			}
			pts = append(pts, p)
			w = append(w, wi)
		}
	}
	return pts, w
}

// rtBary4 returns the first four entries of p as an array.
func rtBary4(p []*big.Rat) [4]*big.Rat { return [4]*big.Rat{p[0], p[1], p[2], p[3]} }

// TestRTQuadratureRuleAgainstMonomials checks the recalled rule: it must
// reproduce ∫_T̂ λ^a = a_0! a_1! a_2! a_3!/(|a| + 3)! on the tetrahedron
// and ∫ μ^a = a_0! a_1! a_2!/(|a| + 2)! on the triangle exactly for
// |a| ≤ 2s + 1 (the classical barycentric integrals, Eisenberg–Malvern
// 1973).
func TestRTQuadratureRuleAgainstMonomials(t *testing.T) {
	for s := 0; s <= 3; s++ {
		pts, w := rtGrundmannMoeller(3, s)
		for deg := 0; deg <= 2*s+1; deg++ {
			for _, a := range rtMulti(deg).alpha {
				got := new(big.Rat)
				for q, p := range pts {
					v := new(big.Rat).Set(w[q])
					for j := 0; j < 4; j++ {
						for e := 0; e < a[j]; e++ {
							v.Mul(v, p[j])
						}
					}
					got.Add(got, v)
				}
				want := new(big.Rat).Mul(rtBaryIntegral(a), big.NewRat(1, 6))
				if got.Cmp(want) != 0 {
					t.Fatalf("s=%d monomial %v: rule gives %s, want %s", s, a, got.RatString(), want.RatString())
				}
			}
		}
		pts, w = rtGrundmannMoeller(2, s)
		for deg := 0; deg <= 2*s+1; deg++ {
			for _, a := range rtFaceMulti(deg).alpha {
				got := new(big.Rat)
				for q, p := range pts {
					v := new(big.Rat).Set(w[q])
					for j := 0; j < 3; j++ {
						for e := 0; e < a[j]; e++ {
							v.Mul(v, p[j])
						}
					}
					got.Add(got, v)
				}
				want := new(big.Rat).Mul(rtFaceIntegral(a), big.NewRat(1, 2))
				if got.Cmp(want) != 0 {
					t.Fatalf("triangle s=%d monomial %v: rule gives %s, want %s", s, a, got.RatString(), want.RatString())
				}
			}
		}
	}
}

// TestRTBasisSpansRaviartThomas checks that the basis of rtBasisRat is a
// basis of RT_k, against the independent construction rtDualBasisRat (the
// basis dual to the classical degrees of freedom, built by exact
// inversion from a spanning set of RT_k): each function f equals
// Σ_l DOF_l(f) ψ_l exactly, ψ the dual basis, which holds only for f in
// RT_k (the degrees of freedom are unisolvent on RT_k, not on all of
// P_(k+1)³), and the matrix of the degrees of freedom of the ndof
// functions is invertible, so they are independent. Degrees 0 to 3, and
// 6 with GAPCERT_LONG=1.
func TestRTBasisSpansRaviartThomas(t *testing.T) {
	ks := []int{0, 1, 2, 3}
	if os.Getenv("GAPCERT_LONG") == "1" {
		ks = append(ks, 6)
	}
	for _, k := range ks {
		comp, _ := rtBasisRat(k)
		dual, _ := rtDualBasisRat(k)
		n := k + 1
		var gram []*big.Rat
		if k > 0 {
			gram = rtTripleRat(0, n, k-1)
		}
		red := rtReduction(k)
		nd := len(comp)
		dofs := make([][]*big.Rat, nd) // dofs[l][m]: DOF l of function m
		for l := range dofs {
			dofs[l] = make([]*big.Rat, nd)
		}
		for m, f := range comp {
			d := rtFunctionals(k, f, gram, red)
			for l, v := range d {
				dofs[l][m] = v
			}
			for c := 0; c < 3; c++ {
				for a := range f[c] {
					g := new(big.Rat)
					for l, v := range d {
						g.Add(g, new(big.Rat).Mul(v, dual[l][c][a]))
					}
					if g.Cmp(f[c][a]) != 0 {
						t.Fatalf("k=%d function %d component %d coefficient %d: %s, but its expansion in the dual basis gives %s", k, m, c, a, f[c][a].RatString(), g.RatString())
					}
				}
			}
		}
		if _, ok := rattable.Inverse(dofs); !ok {
			t.Fatalf("k=%d: the basis functions are linearly dependent", k)
		}
	}
}

// TestRTBasisIndependentModPrime checks at the degrees the polyhedron
// driver uses past 6 (GAPCERT_LONG=1: 7 to 12) that the ndof basis
// functions are linearly independent: the integer matrix of their scaled
// Bernstein coefficients has full row rank modulo the prime 2³¹ − 1, so
// over the rationals too (a nonzero minor mod p is a nonzero integer).
func TestRTBasisIndependentModPrime(t *testing.T) {
	if os.Getenv("GAPCERT_LONG") != "1" {
		t.Skip("set GAPCERT_LONG=1")
	}
	for k := 7; k <= 12; k++ {
		if r, nd := rtScaledRankModPrime(k); r != nd {
			t.Fatalf("k=%d: rank %d mod p, want %d", k, r, nd)
		}
	}
}

// rtScaledRankModPrime returns the rank modulo rtModPrime of the integer
// matrix of the scaled Bernstein coefficients of the basis of RT_k (one
// row per basis function), and the number of rows.
func rtScaledRankModPrime(k int) (rank, rows int) {
	ref := rtReference(k)
	nd, nn := ref.ndof, rtDim(ref.n)
	m := make([][]uint64, nd)
	for l := range m {
		m[l] = make([]uint64, 3*nn)
		for c := 0; c < 3; c++ {
			for a := 0; a < nn; a++ {
				m[l][c*nn+a] = rtModP(ref.compT[c][a*nd+l])
			}
		}
	}
	return rankModPrime(m, rtModPrime), nd
}

// rankModPrime returns the rank of the matrix modulo the prime p < 2³²
// by Gaussian elimination (the rows are overwritten).
func rankModPrime(rows [][]uint64, p uint64) int {
	inv := func(a uint64) uint64 { // a^(p−2) mod p
		r, e := uint64(1), p-2
		for ; e > 0; e >>= 1 {
			if e&1 == 1 {
				r = r * a % p
			}
			a = a * a % p
		}
		return r
	}
	rank := 0
	cols := len(rows[0])
	for c := 0; c < cols && rank < len(rows); c++ {
		piv := -1
		for r := rank; r < len(rows); r++ {
			if rows[r][c] != 0 {
				piv = r
				break
			}
		}
		if piv < 0 {
			continue
		}
		rows[rank], rows[piv] = rows[piv], rows[rank]
		iv := inv(rows[rank][c])
		for j := c; j < cols; j++ {
			rows[rank][j] = rows[rank][j] * iv % p
		}
		for r := rank + 1; r < len(rows); r++ {
			f := rows[r][c]
			if f == 0 {
				continue
			}
			for j := c; j < cols; j++ {
				rows[r][j] = (rows[r][j] + (p-f)*rows[rank][j]) % p
			}
		}
		rank++
	}
	return rank
}

// TestRTBasisIsBernsteinTimesWhitney checks the basis functions at random
// rational points against their definition, evaluated independently of
// the coefficient formula: face function β of face i is
// B^k_α φ_F/(φ_F·ν̂_i) and interior function (c, γ) is B^k_(γ+e_(c+1)) φ_F
// (F the face opposite vertex c + 1), with the Whitney field φ_F =
// 2(λ_a ∇λ_b × ∇λ_c + λ_b ∇λ_c × ∇λ_a + λ_c ∇λ_a × ∇λ_b), F = {a < b < c}
// (D. N. Arnold, R. S. Falk, R. Winther, Finite element exterior
// calculus, homological techniques, and applications, Acta Numer. 15
// (2006) 1–155, §4, recalled from memory), and B^k_α = C(k, α) λ^α.
func TestRTBasisIsBernsteinTimesWhitney(t *testing.T) {
	rng := rand.New(rand.NewPCG(14, 3))
	for _, k := range rtCheckedDegrees(0) {
		comp, _ := rtBasisRat(k)
		nf := rtFaceDim(k)
		for trial := 0; trial < 2; trial++ {
			x := [3]*big.Rat{rtRandomRat(rng), rtRandomRat(rng), rtRandomRat(rng)}
			lam := rtBarycentric(x)
			whitney := func(i int) [3]*big.Rat {
				v := rtFaceVertices[i]
				var out [3]*big.Rat
				for c := range out {
					out[c] = new(big.Rat)
				}
				for r := 0; r < 3; r++ {
					w := rtCross(rtGradLambda[v[(r+1)%3]], rtGradLambda[v[(r+2)%3]])
					for c := 0; c < 3; c++ {
						out[c].Add(out[c], new(big.Rat).Mul(lam[v[r]], big.NewRat(2*w[c], 1)))
					}
				}
				return out
			}
			bern := func(al [4]int) *big.Rat {
				e := make([]*big.Rat, rtDim(k))
				for m := range e {
					e[m] = new(big.Rat)
				}
				e[rtMulti(k).pos[al]].SetInt64(1)
				return rtEvalRat(e, k, lam)
			}
			check := func(l int, want [3]*big.Rat) {
				for c := 0; c < 3; c++ {
					if got := rtEvalRat(comp[l][c], k+1, lam); got.Cmp(want[c]) != 0 {
						t.Fatalf("k=%d function %d component %d: %s, want %s", k, l, c, got.RatString(), want[c].RatString())
					}
				}
			}
			for i := 0; i < 4; i++ {
				phi := whitney(i)
				flux := new(big.Rat).SetInt64(rtWhitneyFlux(i))
				for m, b := range rtFaceMulti(k).alpha {
					var al [4]int
					for r, j := range rtFaceVertices[i] {
						al[j] = b[r]
					}
					f := new(big.Rat).Quo(bern(al), flux)
					check(i*nf+m, [3]*big.Rat{new(big.Rat).Mul(f, phi[0]), new(big.Rat).Mul(f, phi[1]), new(big.Rat).Mul(f, phi[2])})
				}
			}
			if k == 0 {
				continue
			}
			nq := rtDim(k - 1)
			for c := 0; c < 3; c++ {
				phi := whitney(c + 1)
				for m, g := range rtMulti(k - 1).alpha {
					al := g
					al[c+1]++
					f := bern(al)
					check(4*nf+c*nq+m, [3]*big.Rat{new(big.Rat).Mul(f, phi[0]), new(big.Rat).Mul(f, phi[1]), new(big.Rat).Mul(f, phi[2])})
				}
			}
		}
	}
}

// TestRTDivergenceTablesByDifferentiation checks div̂ of every basis
// function against exact differentiation: along each axis the restriction
// t ↦ σ̂_c(x + t e_c) is a polynomial of degree ≤ k + 1, whose derivative
// at 0 is Σ_m L'_m(0) σ̂_c(x + t_m e_c) for k + 2 distinct nodes t_m
// (Lagrange interpolation, exact in math/big), compared with the stored
// divergence coefficients evaluated at x.
func TestRTDivergenceTablesByDifferentiation(t *testing.T) {
	rng := rand.New(rand.NewPCG(14, 2))
	for _, k := range rtCheckedDegrees(0) {
		comp, div := rtBasisRat(k)
		n := k + 1
		nodes := make([]*big.Rat, n+1)
		for m := range nodes {
			nodes[m] = big.NewRat(int64(m), 50)
		}
		// L'_m(0) = Σ_(j≠m) 1/(t_m − t_j) Π_(i≠m,j) (0 − t_i)/(t_m − t_i).
		dl := make([]*big.Rat, n+1)
		for m := range nodes {
			dl[m] = new(big.Rat)
			for j := range nodes {
				if j == m {
					continue
				}
				term := new(big.Rat).Inv(new(big.Rat).Sub(nodes[m], nodes[j]))
				for i := range nodes {
					if i == m || i == j {
						continue
					}
					f := new(big.Rat).Quo(new(big.Rat).Neg(nodes[i]), new(big.Rat).Sub(nodes[m], nodes[i]))
					term.Mul(term, f)
				}
				dl[m].Add(dl[m], term)
			}
		}
		for trial := 0; trial < 2; trial++ {
			x := [3]*big.Rat{big.NewRat(int64(rng.IntN(20)), 97), big.NewRat(int64(rng.IntN(20)), 97), big.NewRat(int64(rng.IntN(20)), 97)}
			for l := range comp {
				sum := new(big.Rat)
				for c := 0; c < 3; c++ {
					for m, tm := range nodes {
						y := x
						y[c] = new(big.Rat).Add(x[c], tm)
						v := rtEvalRat(comp[l][c], n, rtBarycentric(y))
						sum.Add(sum, v.Mul(v, dl[m]))
					}
				}
				got := rtEvalRat(div[l], k, rtBarycentric(x))
				if got.Cmp(sum) != 0 {
					t.Fatalf("k=%d function %d: divergence table gives %s, differentiation %s", k, l, got.RatString(), sum.RatString())
				}
			}
		}
	}
}

// TestRTDimensions checks the sizes against dim RT_k = (k + 1)(k + 2)(k + 4)/2
// (Nédélec 1980): 4, 15, 36, 70 for k = 0..3.
func TestRTDimensions(t *testing.T) {
	for k, want := range []int{4, 15, 36, 70} {
		if r := rtReference(k); r.ndof != want || RTDim(k) != want || 4*r.nFace+3*rtDim(k-1) != want {
			t.Errorf("k=%d: ndof %d, RTDim %d, want %d", k, r.ndof, RTDim(k), want)
		}
	}
}
