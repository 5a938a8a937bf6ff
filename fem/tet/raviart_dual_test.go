package tet

import (
	"fmt"
	"math/big"
	"runtime"
	"sync"

	"gapcert/fem/internal/rattable"
)

// rtDualBasisRat returns the basis of RT_k dual to the classical degrees
// of freedom (face i: the degree-k Bernstein coefficients of σ̂·ν̂_i;
// interior: the moments ∫_T̂ σ̂_c B^(k−1)_β), built from a spanning set of
// RT_k by exact inversion of the matrix of those functionals: comp[l][c]
// the degree-(k+1) Bernstein coefficients of component c of function l,
// div[l] those of its divergence. It is an independent construction of
// RT_k against which the tests check the basis of rtBasisRat.
func rtDualBasisRat(k int) (comp []rtField, div [][]*big.Rat) {
	n := k + 1
	nn := rtDim(n)
	zero := func() []*big.Rat {
		z := make([]*big.Rat, nn)
		for i := range z {
			z[i] = new(big.Rat)
		}
		return z
	}
	// Spanning set (sparse in Bernstein form): e_c B^k_α for the Bernstein
	// basis of P_k, written in degree n by the elevation B^k_α =
	// Σ_j (α_j + 1)/n · B^n_(α+e_j), and x h for the monomials h = ξ^a η^b ζ^d
	// of degree exactly k, whose components λ_(c+1) h = λ^δ (δ = (0, a, b, d)
	// + e_(c+1), |δ| = n) are B^n_δ/C(n, δ).
	in := rtMulti(n)
	var span []rtField
	for c := 0; c < 3; c++ {
		for _, al := range rtMulti(k).alpha {
			f := rtField{zero(), zero(), zero()}
			for j := 0; j < 4; j++ {
				up := al
				up[j]++
				f[c][in.pos[up]].SetFrac64(int64(al[j]+1), int64(n))
			}
			span = append(span, f)
		}
	}
	for a := 0; a <= k; a++ {
		for b := 0; a+b <= k; b++ {
			d := k - a - b
			f := rtField{zero(), zero(), zero()}
			for c := 0; c < 3; c++ {
				delta := [4]int{0, a, b, d}
				delta[c+1]++
				f[c][in.pos[delta]].SetFrac(big.NewInt(1), rtMultinom(delta[:]...))
			}
			span = append(span, f)
		}
	}
	ndof := RTDim(k)
	if len(span) != ndof {
		panic("tet: Raviart–Thomas spanning set has the wrong size")
	}
	a := make([][]*big.Rat, ndof)
	for l := range a {
		a[l] = make([]*big.Rat, ndof)
	}
	var gram []*big.Rat
	if k > 0 {
		gram = rtTripleRat(0, n, k-1)
	}
	red := rtReduction(k)
	var wg sync.WaitGroup
	workers := runtime.GOMAXPROCS(0)
	for g := range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for m := g; m < len(span); m += workers {
				for l, v := range rtFunctionals(k, span[m], gram, red) {
					a[l][m] = v
				}
			}
		}()
	}
	wg.Wait()
	x, ok := rattable.Inverse(a)
	if !ok {
		panic(fmt.Sprintf("tet: Raviart–Thomas degrees of freedom of degree %d are not unisolvent", k))
	}
	// Basis function l = Σ_m span_m X[m][l], over the nonzero entries of
	// the sparse span.
	type entry struct{ c, b int }
	nz := make([][]entry, ndof)
	for m, s := range span {
		for c := 0; c < 3; c++ {
			for b, v := range s[c] {
				if v.Sign() != 0 {
					nz[m] = append(nz[m], entry{c, b})
				}
			}
		}
	}
	comp = make([]rtField, ndof)
	div = make([][]*big.Rat, ndof)
	// The basis functions are independent: split them among the cores.
	for g := range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			t := new(big.Rat)
			for l := g; l < ndof; l += workers {
				comp[l] = rtField{zero(), zero(), zero()}
				for m, s := range span {
					if x[m][l].Sign() == 0 {
						continue
					}
					for _, e := range nz[m] {
						v := comp[l][e.c][e.b]
						v.Add(v, t.Mul(x[m][l], s[e.c][e.b]))
					}
				}
				div[l] = rtDivergenceRat(comp[l], n)
			}
		}()
	}
	wg.Wait()
	return comp, div
}

// rtFunctionals returns the degrees of freedom of the field s (components
// of degree n = k + 1) in the order of rtRef, with g = rtTripleRat(0, n,
// k − 1) (nil for k = 0) and red = rtReduction(k).
func rtFunctionals(k int, s rtField, g []*big.Rat, red [][]*big.Rat) []*big.Rat {
	n := k + 1
	in := rtMulti(n)
	fn := rtFaceMulti(n)
	var out []*big.Rat
	for i := 0; i < 4; i++ {
		e := make([]*big.Rat, len(fn.alpha))
		for m, b := range fn.alpha {
			e[m] = rtFluxDensity(s, i, b, in)
		}
		for _, row := range red {
			acc := new(big.Rat)
			for m, v := range row {
				if v.Sign() != 0 && e[m].Sign() != 0 {
					acc.Add(acc, new(big.Rat).Mul(v, e[m]))
				}
			}
			out = append(out, acc)
		}
	}
	if k > 0 {
		nq := rtDim(k - 1)
		sixth := big.NewRat(1, 6) // |T̂|: the table is normalised by |T|
		for c := 0; c < 3; c++ {
			for b := 0; b < nq; b++ {
				acc := new(big.Rat)
				for a := range s[c] {
					if s[c][a].Sign() != 0 {
						acc.Add(acc, new(big.Rat).Mul(s[c][a], g[a*nq+b]))
					}
				}
				out = append(out, acc.Mul(acc, sixth))
			}
		}
	}
	return out
}

var (
	rtReductionMu    sync.Mutex
	rtReductionCache = map[int][][]*big.Rat{}
)

// rtReduction returns L = (EᵀE)⁻¹Eᵀ for the elevation E of triangle
// Bernstein coefficients from degree k to k + 1 (E_(αβ) = C(k, β)/C(k+1, α)
// for α − β a unit multi-index, else 0: the elevation identity with
// d − m = 1). E has full column rank (elevation is injective), so L is a
// left inverse: L E c = c, and L maps the degree-(k+1) coefficients of a
// polynomial of degree ≤ k to its degree-k coefficients exactly.
func rtReduction(k int) [][]*big.Rat {
	rtReductionMu.Lock()
	defer rtReductionMu.Unlock()
	if l, ok := rtReductionCache[k]; ok {
		return l
	}
	ik, in := rtFaceMulti(k), rtFaceMulti(k+1)
	e := make([][]*big.Rat, len(in.alpha)) // e[α][β]
	for a, al := range in.alpha {
		e[a] = make([]*big.Rat, len(ik.alpha))
		for b, be := range ik.alpha {
			e[a][b] = new(big.Rat)
			if al[0] >= be[0] && al[1] >= be[1] && al[2] >= be[2] {
				e[a][b].SetFrac(rtMultinom(be[:]...), rtMultinom(al[:]...))
			}
		}
	}
	nk := len(ik.alpha)
	ete := make([][]*big.Rat, nk)
	for i := range ete {
		ete[i] = make([]*big.Rat, nk)
		for j := range ete[i] {
			acc := new(big.Rat)
			for a := range e {
				acc.Add(acc, new(big.Rat).Mul(e[a][i], e[a][j]))
			}
			ete[i][j] = acc
		}
	}
	inv, ok := rattable.Inverse(ete)
	if !ok {
		panic("tet: triangle degree elevation is not injective")
	}
	l := make([][]*big.Rat, nk)
	for i := range l {
		l[i] = make([]*big.Rat, len(in.alpha))
		for a := range in.alpha {
			acc := new(big.Rat)
			for j := 0; j < nk; j++ {
				acc.Add(acc, new(big.Rat).Mul(inv[i][j], e[a][j]))
			}
			l[i][a] = acc
		}
	}
	rtReductionCache[k] = l
	return l
}
