package proof

import (
	"fmt"
	"slices"

	"gapcert/interval"
)

// MaxProductSums bounds the number of index tuples ProductSums combines.
const MaxProductSums = 1 << 20

// ProductSums encloses the m lowest eigenvalues of a product domain
// Ω = Ω_1 × … × Ω_F whose problem separates (V = V_1 + … + V_F, V_i a
// function of Ω_i's coordinates, each face carrying the condition of the
// factor side it comes from), from certified data of the factors:
// factors[i][j] encloses λ_{j+1}(Ω_i) (j < m_i = len(factors[i]), in
// increasing index order) and next[i] ≤ λ_{m_i+1}(Ω_i).
//
// Separation of variables. The eigenvalues of the product, counted with
// multiplicity, are exactly the sums λ_{j_1}(Ω_1) + … + λ_{j_F}(Ω_F) over
// all index tuples (j_1, …, j_F), each tuple counted once. This is the
// spectrum of the tensor sum H = H_1 ⊗ I ⊗ … + … + I ⊗ … ⊗ H_F of
// self-adjoint operators with compact resolvent (M. Reed, B. Simon,
// Methods of Modern Mathematical Physics I, §VIII.10, Theorem VIII.33:
// σ(A ⊗ I + I ⊗ B) is the closure of σ(A) + σ(B); recalled, not looked
// up). For compact resolvents the statement with multiplicities is
// elementary: if u^i_j is an orthonormal basis of L²(Ω_i) of eigenfunctions
// of H_i, the products u = u^1_{j_1} ⊗ … ⊗ u^F_{j_F} form an orthonormal
// basis of L²(Ω) (Reed–Simon I, §II.4, Proposition 2), each lies in the
// form domain of H (the H¹ functions vanishing on the Dirichlet faces:
// each factor vanishes on its own Dirichlet sides) and, by Fubini, the
// form of H, ∫|∇u|² + V u² + Σ_faces α ∫_face u², splits as Σ_i of the
// form of H_i in the i-th variable times the L² products of the others.
// So q(u, w) = (Σ_i λ_{j_i}(Ω_i))(u, w) for every w that is a finite sum
// of products of form-domain functions of the factors, and such sums are
// dense in the form domain of H in the form norm (on Lipschitz factors,
// by smoothing and cut-offs; common practice, not proved here), so the
// identity holds for every w of the form domain and u is an eigenfunction
// of H with eigenvalue Σ_i λ_{j_i}(Ω_i). An
// orthonormal basis of eigenfunctions leaves no room for other
// eigenvalues, and the multiplicity of a value is the number of tuples
// with that sum (R. Courant, D. Hilbert, Methods of Mathematical Physics
// I, 1953, Ch. V: separation of variables for rectangles and boxes;
// chapter recalled, not looked up).
//
// Order statistics. Let S be the certified tuples (j_i ≤ m_i for every
// i), with sum enclosures [l_s, u_s], and let L_(k) and U_(k) be the k-th
// smallest lower and upper ends over S (ties counted). Every tuple outside
// S has some j_i > m_i, so its sum is at least
// T_i = next[i] + Σ_{l≠i} lower(λ_1(Ω_l)) (every λ_j(Ω_l) ≥ λ_1(Ω_l)).
// Let T = min_i T_i. If T ≥ L_(m), then for k ≤ m
//
//	L_(k) ≤ λ_k(Ω) ≤ U_(k).
//
// Upper: the k tuples of S with the smallest upper ends give k
// eigenvalues (distinct tuples, so counted with multiplicity) each
// ≤ U_(k), so λ_k ≤ U_(k). Lower: λ_k ≥ L_(k) iff fewer than k
// eigenvalues lie below L_(k). A tuple outside S has sum ≥ T ≥ L_(m) ≥
// L_(k), so only tuples of S can lie below L_(k), and such a tuple has
// l_s ≤ its sum < L_(k); at most k − 1 tuples have l_s < L_(k), by the
// definition of L_(k). Ties (multiple eigenvalues, the triple λ_2 of a
// cube) need nothing more: both arguments count tuples. The rule is
// sound whatever the overlaps of the enclosures.
//
// ProductSums returns λ_1..λ_m so enclosed, each end rounded outward,
// and T. When T < L_(m), short lists the factors i with T_i < L_(m):
// the tuples beyond their certified eigenvalues may lie below the m-th
// eigenvalue, and more eigenvalues of those factors must be certified.
// It panics on empty factors or lists, m < 1, or more than
// MaxProductSums tuples (misuse), and returns an error, without
// enclosures, when S has fewer than m tuples.
func ProductSums(factors [][]interval.I, next []float64, m int) (lambda []interval.I, omitted float64, short []int, err error) {
	if len(factors) == 0 || len(next) != len(factors) || m < 1 {
		panic("proof: ProductSums needs one list and one next bound per factor and m ≥ 1")
	}
	count := 1
	for _, f := range factors {
		if len(f) == 0 {
			panic("proof: ProductSums: a factor without certified eigenvalues")
		}
		count *= len(f)
		if count > MaxProductSums {
			panic("proof: ProductSums: too many tuples")
		}
	}
	if count < m {
		return nil, 0, nil, fmt.Errorf("the certified factor eigenvalues give %d sums, fewer than the %d eigenvalues asked for", count, m)
	}
	lows := make([]float64, 0, count)
	highs := make([]float64, 0, count)
	idx := make([]int, len(factors))
	for {
		lo, hi := 0.0, 0.0
		for i, j := range idx {
			lo = interval.AddDown(lo, factors[i][j].Lo)
			hi = interval.AddUp(hi, factors[i][j].Hi)
		}
		lows, highs = append(lows, lo), append(highs, hi)
		k := 0
		for ; k < len(idx); k++ {
			idx[k]++
			if idx[k] < len(factors[k]) {
				break
			}
			idx[k] = 0
		}
		if k == len(idx) {
			break
		}
	}
	slices.Sort(lows)
	slices.Sort(highs)
	omitted = 0
	for i := range factors {
		t := next[i]
		for l, f := range factors {
			if l != i {
				t = interval.AddDown(t, f[0].Lo)
			}
		}
		if i == 0 || t < omitted {
			omitted = t
		}
		if !(t >= lows[m-1]) {
			short = append(short, i)
		}
	}
	if len(short) > 0 {
		return nil, omitted, short, nil
	}
	for k := range m {
		l := interval.I{Lo: lows[k], Hi: highs[k]}
		if l.Lo > l.Hi {
			return nil, omitted, nil, fmt.Errorf("internal inconsistency (please report it): lower bound %g above upper bound %g for lambda%d of the product", l.Lo, l.Hi, k+1)
		}
		lambda = append(lambda, l)
	}
	return lambda, omitted, nil, nil
}

// ProductGap encloses the gap λ_2 − λ_1 of a product with a separable
// problem (as in ProductSums) from enclosures gaps[i] of the factors' gaps
// λ_2(Ω_i) − λ_1(Ω_i): it is [min_i lo_i, min_i hi_i].
//
// Proof. The eigenvalues of the product are the sums over index tuples
// (ProductSums). Every factor's λ_1 is its least eigenvalue, so the least
// sum is Σ_i λ_1(Ω_i) = λ_1(Ω). Any other tuple has some j_i ≥ 2, and
// its sum is at least λ_2(Ω_i) + Σ_{l≠i} λ_1(Ω_l), which the tuple with 2
// at i and 1 elsewhere attains; so the second least sum, counted with
// multiplicity, is λ_2(Ω) = min_i (λ_2(Ω_i) + Σ_{l≠i} λ_1(Ω_l)), and
// λ_2(Ω) − λ_1(Ω) = min_i (λ_2(Ω_i) − λ_1(Ω_i)). The minimum is
// increasing in each argument, so the minima of the ends enclose it. Its
// width is at most the largest of the factors' gap widths, where the
// difference of the enclosures of λ_2(Ω) and λ_1(Ω) would add the widths
// of all factors.
func ProductGap(gaps []interval.I) interval.I {
	if len(gaps) == 0 {
		panic("proof: ProductGap without factors")
	}
	g := gaps[0]
	for _, x := range gaps[1:] {
		g = interval.I{Lo: min(g.Lo, x.Lo), Hi: min(g.Hi, x.Hi)}
	}
	return g
}
