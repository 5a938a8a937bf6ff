// Package temple implements the Lehmann–Goerisch lower bounds for the
// lowest eigenvalues of a selfadjoint eigenvalue problem, given the small
// interval matrices that a discretisation assembles for it.
//
// Guarantee: LehmannGoerisch returns floats that are lower bounds of the
// eigenvalues Λ_1 ≤ … ≤ Λ_N of the (shifted) problem for every member of the
// interval matrices it is given, provided the caller's hypothesis on the
// shift ρ̂ holds (ρ̂ ≤ Λ_{N+1}). Positive definiteness of the Lehmann matrix
// is verified here, never assumed; every arithmetic step that leads to a
// bound is outward rounded (package interval), and the matrix eigenvalues are
// enclosed by package enclose.
//
// Temple's inequality is the case N = 1 of the same theorem: with one trial
// function ũ and ρ̂·b(ũ,ũ) > M(ũ,ũ) (that is μ_1 < 0; otherwise no bound,
// −∞), LehmannGoerisch returns a float below
//
//	(ρ̂·b(ũ,ũ) − M(ũ,ũ)) / (ρ̂·‖w‖²_X − b(ũ,ũ)),
//
// an algebraic rearrangement of ρ̂ − ρ̂/(1 − μ_1) for the 1×1 pencil. It is
// Temple's inequality for the largest eigenvalue 1/Λ_1 of the solution
// operator K below (with 1/ρ̂ ≥ 1/Λ_2), with ‖Kũ‖²_M replaced by its upper
// bound ‖w‖²_X. There is therefore no separate entry point for it.
//
// # The theorem
//
// Setting. (H, M) is a real Hilbert space, b a bounded symmetric form on H
// with b(u, u) > 0 for u ≠ 0, and the operator K defined by M(φ, Ku) =
// b(φ, u) for all φ (Riesz) is compact. (For the problems of gapcert, H ⊂
// H¹ on a bounded domain, b the L² product and M ≥ const·‖·‖²_(H¹), so the
// embedding into L² is compact.) Then K is selfadjoint and positive with
// trivial kernel, and H has an M-orthogonal basis of eigenfunctions φ_k,
// b(φ_k, φ_l) = δ_kl, M(φ_k, φ_l) = Λ_k δ_kl, 0 < Λ_1 ≤ Λ_2 ≤ … → ∞. X is
// a Hilbert space and T: H → X linear with (Tu, Tv)_X = M(u, v). Given
// ũ_1..ũ_N ∈ H and w_1..w_N ∈ X with
//
//	(Tφ, w_i)_X = b(φ, ũ_i) for every φ ∈ H,                          (★)
//
// let A0 = (M(ũ_i, ũ_j)), A1 = (b(ũ_i, ũ_j)), A2 = ((w_i, w_j)_X).
//
// Theorem (Lehmann; Goerisch; in this form Behnke–Goerisch 1994, Plum
// 1991). Let 0 < ρ ≤ Λ_(N+1), B = A0 − 2ρA1 + ρ²A2 positive definite, and
// μ_1 ≤ … ≤ μ_N the eigenvalues of (A0 − ρA1)x = μBx. Then for every i
// with μ_i < 0,
//
//	Λ_(N+1−i) ≥ t_i = ρ − ρ/(1 − μ_i).
//
// Proof. For x ∈ ℝ^N put u = Σ x_j ũ_j, w = Σ x_j w_j. By (★), (Tφ, w −
// TKu)_X = b(φ, u) − M(φ, Ku) = 0 for all φ, so w − TKu ⊥ TKu and ‖w‖² ≥
// ‖TKu‖² = M(Ku, Ku); with b(u, u) = M(u, Ku),
//
//	xᵀBx ≥ M(u, u) − 2ρ M(u, Ku) + ρ² M(Ku, Ku) = M(u − ρKu, u − ρKu),
//	xᵀ(A0 − ρA1)x = M(u, u) − ρ b(u, u).
//
// Let S be the span of the eigenvectors of the pencil for μ_1..μ_i, so
// xᵀ(A0 − ρA1)x ≤ μ_i xᵀBx < 0 for x ∈ S, x ≠ 0; then u ≠ 0 (else the
// left side is 0), so U = {u : x ∈ S} has dimension i. For u ∈ U, u ≠ 0,
// with u = Σ c_k φ_k (so M(u, u) − ρb(u, u) = Σ (Λ_k − ρ)c_k² and
// M(u − ρKu, u − ρKu) = Σ (Λ_k − ρ)² c_k²/Λ_k) and μ = μ_i < 0,
//
//	Σ (Λ_k − ρ) c_k² < 0   and   Σ (Λ_k − ρ) c_k² ≤ μ Σ (Λ_k − ρ)² c_k²/Λ_k,
//
// and the second inequality rearranges to Σ c_k² q(Λ_k) ≤ 0 with
// q(Λ) = (1 − μ)(Λ − ρ)(Λ − t_i)/Λ, where 0 < t_i < ρ. As q > 0 outside
// [t_i, ρ] and q(ρ) = 0, a u ∈ U with c_k = 0 for every Λ_k ∈ [t_i, ρ)
// would have only components with Λ_k = ρ and then Σ (Λ_k − ρ)c_k² = 0, a
// contradiction. So no nonzero u ∈ U is b-orthogonal to the eigenfunctions
// with Λ_k ∈ [t_i, ρ), and since dim U = i there are at least i of them
// (with multiplicity). As ρ ≤ Λ_(N+1), the eigenvalues below ρ are among
// Λ_1..Λ_N, say Λ_1..Λ_m with m ≤ N, and at least i of them are ≥ t_i:
// Λ_(N+1−i) ≥ Λ_(m+1−i) ≥ t_i. ∎
//
// No separation hypothesis beyond ρ ≤ Λ_(N+1) is used. The proof also
// shows what separation buys: at most m of the μ_i are negative (i ≤ m
// above), so all N bounds can appear only if ρ > Λ_N; and xᵀBx ≥
// Σ (Λ_k − ρ)² c_k²/Λ_k shows B positive definite whenever the ũ_i are
// linearly independent and no nonzero u ∈ span{ũ_i} is an eigenfunction
// for the eigenvalue ρ, while ρ near one of Λ_1..Λ_N, whose eigenfunctions
// the ũ_i approximate, makes B nearly singular. For exact eigenpairs ũ_i = φ_i
// (Λ_i ≠ ρ), w_i = Tφ_i/Λ_i gives diagonal matrices, the pencil
// eigenvalues Λ_i/(Λ_i − ρ) and bounds equal to Λ_i (the tests' sanity
// check).
//
// # Second-order problems with Robin terms
//
// For −Δu + Vu = λu on a bounded Ω ⊂ ℝ^d (d = 1, 2), u = 0 on Γ_D and
// ∂_n u + αu = 0 on Γ_R (α ≥ 0; α = 0 is Neumann), with a shift γ such that
// c = V + γ > 0 on Ω:
//
//	H = {u ∈ H¹(Ω): u = 0 on Γ_D},  b(u, v) = (u, v),
//	M(u, v) = (∇u, ∇v) + (cu, v) + ∫_(Γ_R) α u v = a(u, v) + γ b(u, v),  Λ_k = λ_k + γ,
//	X = L²(Ω)^d × L²(Ω) × L²(Γ_R),  Tu = (∇u, √c u, √α u|_(Γ_R)).
//
// For ũ ∈ H and a flux σ ∈ H(div; Ω) with normal trace σ·n ∈ L²(∂Ω), σ·n
// = 0 on Γ_N' (the Neumann sides and the Robin sides where α is not known
// to be > 0) and Γ_R' the Robin sides with α > 0, put
//
//	w = (σ, (ũ + div σ)/√c, −(σ·n)/√α on Γ_R', 0 on Γ_R \ Γ_R').
//
// Green's formula ∫_Ω ∇φ·σ + ∫_Ω φ div σ = ∫_∂Ω φ σ·n gives, for φ ∈ H,
//
//	(Tφ, w)_X = ∫∇φ·σ + ∫φ(ũ + div σ) − ∫_(Γ_R') φ σ·n = (φ, ũ) + ∫_(∂Ω \ Γ_R') φ σ·n = b(φ, ũ),
//
// since φ = 0 on Γ_D and σ·n = 0 on Γ_N'. That is (★), and
//
//	A0 = a(ũ_i, ũ_j) + γ b(ũ_i, ũ_j),  A1 = b(ũ_i, ũ_j),
//	A2 = (σ_i, σ_j) + ((ũ_i + div σ_i)/c, ũ_j + div σ_j) + ∫_(Γ_R') (σ_i·n)(σ_j·n)/α.
//
// Any σ_i is admissible; the minimiser of ‖w_i‖_X (σ_i ≈ ∇u_i/Λ_i for an
// eigenpair) gives the sharpest bounds. The concrete spaces and the
// enclosures of A0, A1, A2 are in packages fem/line (Flux.LGMatrix; d = 1,
// where H(div) = H¹ and the boundary integrals are end-point values) and
// fem/tri (Flux.LGMatrix, Raviart–Thomas fluxes).
//
// # The residual form of B
//
// By (★) with φ = ũ_j ∈ H, (Tũ_j, w_i)_X = b(ũ_j, ũ_i) = A1_ij, so with
// r_i = w_i − Tũ_i/ρ
//
//	ρ²(r_i, r_j)_X = ρ²(w_i, w_j)_X − ρ(Tũ_i, w_j)_X − ρ(w_i, Tũ_j)_X + (Tũ_i, Tũ_j)_X
//	             = ρ²A2_ij − 2ρA1_ij + A0_ij = B_ij,
//
// an identity of the exact entries (b symmetric). For an eigenpair
// approximation w_i ≈ Tũ_i/Λ_i the entries of B are about (ρ − Λ_i)²/Λ_i,
// while those of A0, ρA1 and ρ²A2 are about Λ_i, ρ and ρ²/Λ_i: the
// combination of their enclosures keeps their widths and loses their
// common digits: its relative width is about ((ρ + Λ_i)/(ρ − Λ_i))² times
// theirs. Formed as ρ²(r_i, r_j)_X, with r_i computed in each
// function before integrating, the enclosure of B has about the relative
// width of its own integrals. For the second-order problems below,
//
//	r_i = (σ_i − ∇ũ_i/ρ, (ũ_i + div σ_i − cũ_i/ρ)/√c, Robin parts),
//	B_ij = ρ²[(σ_i − ∇ũ_i/ρ, σ_j − ∇ũ_j/ρ) + ∫(f_i − cũ_i/ρ)(f_j − cũ_j/ρ)/c],  f_i = ũ_i + div σ_i,
//
// without Robin sides (fem/tri, Flux.LehmannMatrix), and
// LehmannGoerischFromB takes that enclosure in place of A2.
//
// # Conditions and who checks them
//
//   - ρ̂ a positive finite float, B positive definite for every member of
//     the interval data, the μ_i enclosed and used only where their upper
//     end is < 0, every step to a bound outward rounded: LehmannGoerisch.
//   - (★) and the formulas for A0, A1, A2, c = V + γ > 0 on every element,
//     the weight 1/c enclosed with its remainder, σ·n = 0 where required:
//     packages fem/line and fem/tri.
//   - ρ̂ ≤ Λ_(N+1), from a verified stage-A lower bound, converted between
//     shifts with directed rounding: package certs/certify.
//
// References:
//
//	H. Behnke, F. Goerisch, Inclusions for eigenvalues of selfadjoint
//	problems, in: J. Herzberger (ed.), Topics in Validated Computations,
//	Elsevier, 1994, 277–322.
//	M. Plum, Bounds for eigenvalues of second-order elliptic differential
//	operators, Z. Angew. Math. Phys. 42 (1991) 848–863.
//	T. Vejchodský, Flux reconstructions in the Lehmann–Goerisch method for
//	lower bounds on eigenvalues, arXiv:1801.02561 (2018).
package temple
