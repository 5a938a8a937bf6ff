package tet

import (
	"math/big"
	"math/rand/v2"
	"os"
	"testing"
)

// rtCheckedDegrees lists the degrees k ≥ from at which the exact
// Raviart–Thomas tables are checked by point values (face traces,
// divergence): up to 3, and with GAPCERT_LONG=1 also
// 9, the first degree past 8 the polyhedron driver uses (the construction
// is the same at every degree; its rational entries grow with k, and
// rtReference refuses a scaled coefficient that is not an integer of at
// most 53 bits).
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

// TestRTBasisFaceTracesAgainstPointValues checks the dual basis on every
// face by exact evaluation: at random rational points of face i the flux
// density σ̂·ν̂_i of the scaled basis function l, computed from its
// component coefficients, equals faceScale times the degree-k face
// Bernstein polynomial with coefficient 1 at l (face DOF of face i) or
// is 0 (every other function). This is unisolvence and duality for the
// face functionals, evaluated independently of the degree reduction used
// to build the basis.
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

// TestRTBasisInteriorMomentsByQuadrature checks the interior functionals
// of the dual basis with the exact Grundmann–Möller rule (independent of
// the triple tables that built the basis): ∫_T̂ φ_(l,c) B^(k−1)_β is 1 for
// the moment (c, β) of l and 0 otherwise.
func TestRTBasisInteriorMomentsByQuadrature(t *testing.T) {
	// Degrees 1 to 3 only: at k = 9 the exact quadrature ran for more than
	// 50 minutes.
	for k := 1; k <= 3; k++ {
		comp, _ := rtBasisRat(k)
		pts, w := rtGrundmannMoeller(3, k) // degree (k + 1) + (k − 1) = 2k ≤ 2k + 1
		nf := rtFaceDim(k)
		nq := rtDim(k - 1)
		unit := func(m int) []*big.Rat {
			e := make([]*big.Rat, nq)
			for i := range e {
				e[i] = new(big.Rat)
			}
			e[m].SetInt64(1)
			return e
		}
		for l := range comp {
			for c := 0; c < 3; c++ {
				for b := 0; b < nq; b++ {
					got := new(big.Rat)
					eb := unit(b)
					for q, p := range pts {
						v := rtEvalRat(comp[l][c], k+1, rtBary4(p))
						v.Mul(v, rtEvalRat(eb, k-1, rtBary4(p)))
						got.Add(got, v.Mul(v, w[q]))
					}
					want := new(big.Rat)
					if l == 4*nf+c*nq+b {
						want.SetInt64(1)
					}
					if got.Cmp(want) != 0 {
						t.Fatalf("k=%d function %d component %d moment %d: %s, want %s", k, l, c, b, got.RatString(), want.RatString())
					}
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
