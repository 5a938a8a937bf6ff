package temple

import (
	"errors"
	"fmt"
	"math"

	"gapcert/enclose"
	"gapcert/interval"
)

// ErrNotPositiveDefinite is returned (wrapped) by LehmannGoerisch when the
// matrix A0 − 2ρ̂A1 + ρ̂²A2 could not be verified positive definite for every
// member of the interval data. Typical causes: ρ̂ equal to (or too close to)
// an eigenvalue whose eigenfunction the trial space nearly contains, linearly
// dependent trial functions, or data too wide to decide.
var ErrNotPositiveDefinite = errors.New("temple: A0 − 2ρA1 + ρ²A2 is not verified positive definite")

// LehmannGoerisch returns lower bounds of the N lowest eigenvalues of a
// selfadjoint eigenvalue problem from the N×N interval matrices a0, a1, a2
// and the shift rho.
//
// Setting. H is a real vector space with an inner product M (the shifted
// form, M(u,u) > 0 for u ≠ 0), b is a symmetric nonnegative bilinear form on
// H, and Λ_1 ≤ Λ_2 ≤ … are the min–max values of the Rayleigh quotient
// M(u,u)/b(u,u) (the eigenvalues of M(u,φ) = Λ b(u,φ) below the essential
// spectrum, with multiplicity). X is a Hilbert space and T: H → X is linear
// with (Tu, Tv)_X = M(u,v). For trial functions ũ_1..ũ_N ∈ H and elements
// w_1..w_N ∈ X with (Tφ, w_i)_X = b(φ, ũ_i) for all φ ∈ H, the caller encloses
//
//	a0[i][j] ∋ M(ũ_i, ũ_j),  a1[i][j] ∋ b(ũ_i, ũ_j),  a2[i][j] ∋ (w_i, w_j)_X.
//
// Theorem (Lehmann; Goerisch). Let ρ > 0 with ρ ≤ Λ_{N+1}. If
// B = A0 − 2ρA1 + ρ²A2 is positive definite and μ_1 ≤ … ≤ μ_N are the
// eigenvalues of (A0 − ρA1)x = μBx, then for every i with μ_i < 0
//
//	Λ_{N+1−i} ≥ ρ − ρ/(1 − μ_i).
//
// Why (a sketch of the cited proofs, kept here because the code relies on
// every step; the package doc has a complete proof): with K the solution operator, M(φ, Ku) = b(φ, u), the element
// TKu has the least norm among all w with (Tφ, w) = b(φ, u), so B dominates
// the matrix B* obtained with w_i = TKũ_i, and raising the denominator of
// the Rayleigh quotient xᵀ(A0 − ρA1)x / xᵀBx can only raise its negative
// values; hence μ_i ≥ μ*_i. In an eigenbasis of the problem, the pencil
// (A0 − ρA1, B*) is the Rayleigh–Ritz projection of the operator with
// eigenvalues g(Λ) = Λ/(Λ − ρ), whose negative eigenvalues are g(Λ_k) for
// the m ≤ N eigenvalues Λ_k < ρ (m ≤ N because ρ ≤ Λ_{N+1}). Min–max gives
// g(Λ_{m+1−i}) ≤ μ*_i ≤ μ_i < 0, and g is decreasing on (0, ρ) with inverse
// μ ↦ ρ − ρ/(1 − μ), so Λ_{N+1−i} ≥ Λ_{m+1−i} ≥ ρ − ρ/(1 − μ_i). The
// separation ρ > (an upper bound of) Λ_N that callers usually also meet
// gives m = N, so that all N bounds can appear (at most m of the μ_i are
// negative), and keeps ρ away from the eigenvalues that the trial functions
// approximate, near which B is nearly singular; soundness does not depend
// on it (B positive definite is verified below).
//
// Computation. B and A0 − ρA1 are formed in interval arithmetic with rho an
// exact float; B is verified positive definite with enclose.PositiveDefinite
// (otherwise the error wraps ErrNotPositiveDefinite); the μ_i are enclosed
// with enclose.Eigenvalues, valid for every member of the data. The bound
// ρ − ρ/(1 − μ) decreases as μ rises, so the upper end μ̄_i of each enclosure
// is used: if μ̄_i < 0, then μ_i < 0 and ρ − ρ/(1 − μ̄_i) ≤ ρ − ρ/(1 − μ_i),
// evaluated in interval arithmetic and its lower end returned. Where
// μ̄_i ≥ 0 no bound results and the entry is math.Inf(-1). Finally, since
// Λ_{k+1} ≥ Λ_k, each entry is raised to the largest entry before it (a
// running maximum, sound by monotonicity).
//
// The result lower has length N with lower[k] ≤ Λ_{k+1}. The caller must
// certify ρ̂ ≤ Λ_{N+1} (for example by a verified eigenvalue count); this
// function cannot check it, and a larger rho can produce a false bound.
// LehmannGoerisch returns an error if rho is not a positive finite float.
// It panics if the three matrices do not have the same dimension N ≥ 1.
//
// References:
//
//	N. J. Lehmann, Beiträge zur numerischen Lösung linearer
//	Eigenwertprobleme I, II, Z. Angew. Math. Mech. 29 (1949) and 30 (1950)
//	(volumes recalled from memory).
//	H. Behnke and F. Goerisch, Inclusions for eigenvalues of selfadjoint
//	problems, in: J. Herzberger (ed.), Topics in Validated Computations,
//	Elsevier, 1994, 277–322.
//	M. Plum, Bounds for eigenvalues of second-order elliptic differential
//	operators, Z. Angew. Math. Phys. 42 (1991) 848–863.
//	T. Vejchodský, Flux reconstructions in the Lehmann–Goerisch method for
//	lower bounds on eigenvalues, arXiv:1801.02561.
//	G. Temple, The theory of Rayleigh's principle as applied to continuous
//	systems, Proc. Roy. Soc. London A 119 (1928) (recalled from memory).
func LehmannGoerisch(a0, a1, a2 *enclose.Sym, rho float64) (lower []float64, err error) {
	n := a0.N()
	if a1.N() != n || a2.N() != n {
		panic("temple: dimension mismatch")
	}
	if n < 1 {
		panic("temple: empty trial space")
	}
	if !(rho > 0) || math.IsInf(rho, 1) {
		return nil, fmt.Errorf("temple: shift rho = %g is not a positive finite number", rho)
	}
	r := interval.Point(rho)
	twoR := r.MulF(2) // exact unless it overflows; outward rounded in any case
	r2 := r.Sqr()
	lehmann := enclose.NewSym(n) // A0 − 2ρA1 + ρ²A2
	for i := 0; i < n; i++ {
		for j := 0; j <= i; j++ {
			m, b, w := a0.At(i, j), a1.At(i, j), a2.At(i, j)
			lehmann.Set(i, j, m.Sub(b.Mul(twoR)).Add(w.Mul(r2)))
		}
	}
	return lehmannBounds(a0, a1, lehmann, r)
}

// LehmannGoerischFromB is LehmannGoerisch with the caller's enclosure b
// of B = A0 − 2ρA1 + ρ²A2 in place of a2: the same theorem, the same
// hypothesis ρ̂ ≤ Λ_(N+1) on the caller, the same result. The caller may
// enclose B by any exact identity of its entries; the residual form
// B_ij = ρ²(w_i − Tũ_i/ρ, w_j − Tũ_j/ρ)_X (package doc, The residual form
// of B) cancels in each function before integrating, so its enclosure is
// narrower than the combination of those of A0, A1 and A2. It returns an
// error if rho is not a positive finite float, and panics if the three
// matrices do not have the same dimension N ≥ 1.
func LehmannGoerischFromB(a0, a1, b *enclose.Sym, rho float64) (lower []float64, err error) {
	n := a0.N()
	if a1.N() != n || b.N() != n {
		panic("temple: dimension mismatch")
	}
	if n < 1 {
		panic("temple: empty trial space")
	}
	if !(rho > 0) || math.IsInf(rho, 1) {
		return nil, fmt.Errorf("temple: shift rho = %g is not a positive finite number", rho)
	}
	return lehmannBounds(a0, a1, b, interval.Point(rho))
}

// lehmannBounds returns the bounds of LehmannGoerisch from a0, a1, the
// enclosure lehmann of B and the point interval r = [ρ, ρ] (the
// Computation paragraph of LehmannGoerisch).
func lehmannBounds(a0, a1, lehmann *enclose.Sym, r interval.I) ([]float64, error) {
	n := a0.N()
	shifted := enclose.NewSym(n) // A0 − ρA1
	for i := 0; i < n; i++ {
		for j := 0; j <= i; j++ {
			shifted.Set(i, j, a0.At(i, j).Sub(a1.At(i, j).Mul(r)))
		}
	}
	if !enclose.PositiveDefinite(lehmann) {
		return nil, ErrNotPositiveDefinite
	}
	mu, err := enclose.Eigenvalues(shifted, lehmann)
	if err != nil {
		return nil, fmt.Errorf("temple: enclosing the Lehmann pencil: %w", err)
	}
	lower := make([]float64, n)
	for i := range n {
		lower[n-1-i] = boundFromMu(r, mu[i].Hi)
	}
	for k := 1; k < n; k++ {
		lower[k] = math.Max(lower[k], lower[k-1])
	}
	return lower, nil
}

// boundFromMu returns a float ≤ ρ − ρ/(1 − muHi) if muHi < 0, else −∞.
// For muHi < 0 the divisor 1 − muHi is enclosed in [1, ∞), so the quotient
// is well defined for every member.
func boundFromMu(r interval.I, muHi float64) float64 {
	if !(muHi < 0) {
		return math.Inf(-1)
	}
	den := interval.Point(1).Sub(interval.Point(muHi))
	return r.Sub(r.Div(den)).Lo
}
