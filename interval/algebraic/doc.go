// Package algebraic implements exact arithmetic in two kinds of fields of
// real algebraic numbers, with an exact zero test, for deciding geometric
// equalities (tangency, right angles) that interval enclosures can refute
// but never prove:
//
//   - Surd: finite sums Σ q_i·√r_i with rational q_i and positive rational
//     r_i, the numbers of the multiquadratic fields Q(√r_1, …, √r_k);
//   - Cyclotomic: the elements of a cyclotomic field Q(ζ_m), ζ_m = e^{2πi/m},
//     which hold cos and sin of every rational multiple of π, hence the
//     vertices of regular polygons written with cos(2*k*pi/n), sin(2*k*pi/n).
//
// ReadSurd and ReadRootSum read constant formulas, in the canonical text of
// package interval/formula, exactly in these fields. Every value also has
// an outward-rounded enclosure (Enclose) for the decisions that need a
// sign.
//
// Zero test for surds. Call r and s equivalent when r/s is the square of a
// rational. A Surd is kept normalised: terms with equivalent radicands are
// merged (q√r + q'√s = (q + q'·√(s/r))·√r, with √(s/r) rational) and zero
// coefficients dropped. A normalised surd is zero if and only if it has no
// term, because square roots of positive rationals from distinct classes
// are linearly independent over Q: r = a/b ↦ √r = √(ab)/b maps the classes
// one-to-one onto the squarefree parts of the integers ab, and the square
// roots of distinct squarefree positive integers are linearly independent
// over Q (Besicovitch 1940). Equivalence is decided by exact integer square
// roots, so no factoring is needed. Radicands are positive: √ of a negative
// rational is not a surd (SqrtSurd panics, the reader refuses it).
//
// Zero test in Q(ζ_m). An element is kept as its coefficient vector in the
// basis 1, ζ, …, ζ^{d−1}, d = φ(m), reduced modulo the cyclotomic
// polynomial Φ_m, which is the minimal polynomial of ζ_m over Q (Φ_m is
// irreducible over Q: Gauss for prime m, Dedekind in general; Lang, ch. VI
// §3 — the section is recalled, not checked). So the basis is linearly
// independent over Q, the vector is unique, and an element is 0 if and only
// if every coefficient is 0. Φ_m is computed exactly as
// (x^m − 1)/Π_{d | m, d < m} Φ_d (common practice). Formulas are first read
// as formal sums Σ c·e^{iπq} (RootSum, rational c and q ∈ [0, 2)), with
// cos tπ = (e^{iπt} + e^{−iπt})/2 and sin tπ = cos((1/2 − t)π), so the
// imaginary unit is never needed; CyclotomicFieldOf then takes m as the
// least common multiple of the orders 2·den(q) (e^{iπq} = ζ_m^{qm/2}), and
// CyclotomicField.Element maps each sum into Q(ζ_m). Every element so
// built is real, so its value is its real part Σ c_j·cos(2πj/m), which
// Enclose encloses with the interval cosine.
//
// Size bounds keep every operation cheap: the reader refuses rationals of
// more than 4096 bits, surds of more than 64 terms and roots of unity of
// order above 1000; CyclotomicFieldOf refuses m > 1000 and φ(m) > 240 (the
// vertices of a regular n-gon lie in Q(ζ_m) with m | 4n, so n ≤ 100 needs
// m ≤ 400 and φ(m) ≤ 160).
//
// References:
//
//	A. S. Besicovitch, On the linear independence of fractional powers of
//	integers, J. London Math. Soc. 15 (1940), 3–6.
//	S. Lang, Algebra, rev. 3rd ed., Springer, 2002, ch. VI §3.
package algebraic
