// Package cover decides the claims of a family of problems for every
// parameter value of a box, not only at sample points: it splits the
// parameter box into cells with exact rational bounds, encloses the
// eigenvalues over each whole cell from two certified problems (the cell's
// low and high corners) or, when the parameters move a triangle's
// vertices, from one (the triangle at the cell's centre), decides the
// claims on each cell, and bisects the cells where a claim is undecided,
// down to a smallest width.
//
// # Family files
//
// A cover family is a sweep family (package certs/sweep) whose every
// parameter has a range and a smallest cell width, read strictly (package
// strictjson: unknown, repeated or case-variant keys are errors):
//
//	{
//	  "name": "harmonic",                               optional
//	  "template": {"domain": {"interval": ["0", "1"]},  a problem object
//	               "potential": "c*x^2", "boundary": "dirichlet"},
//	  "parameters": [
//	    {"name": "c", "range": {"lo": "0", "hi": "5", "count": 4}, "min_cell": "1/256"}
//	  ],
//	  "claims": ["gap >= 3*pi^2/D^2"],                  optional, appended to the template's
//	  "relative_width": "1e-9",                         optional target of every corner
//	  "time_limit": "30s"                               optional budget of every corner
//	}
//
// lo < hi, min_cell and the bounds are exact decimals or fractions, read
// exactly; 0 < min_cell ≤ hi − lo; count (default 1) cuts the range into
// that many equal parts first. Before anything is certified, every corner
// of the box is parsed as a problem, and every parameter's use in the
// template is accounted for by a rule (Rules) or refused with the reason:
// a dependence whose sign is not decided, dependences of opposite signs,
// a moving domain that is not a triangle, or a moving triangle with a
// Robin side, a potential that is not constant, or a degenerate triangle
// in the box.
//
// # The comparison lemma
//
// Let a₁ ≤ a₂ be two closed quadratic forms, bounded below, on the same
// form domain H (a₁(u,u) ≤ a₂(u,u) for every u ∈ H), each with compact
// resolvent, and λ_k(a) their eigenvalues in increasing order with
// multiplicity. Then λ_k(a₁) ≤ λ_k(a₂) for every k.
//
// Proof: by the min–max principle, λ_k(a) = min over k-dimensional
// subspaces S ⊂ H of max over u ∈ S, ‖u‖ = 1, of a(u,u) (R. Courant and
// D. Hilbert, Methods of Mathematical Physics I, 1953, Ch. VI §1; M. Reed
// and B. Simon, Methods of Modern Mathematical Physics IV, 1978, Thm
// XIII.1–2). For every S, max_S a₁ ≤ max_S a₂ pointwise in u, so the
// minimum over S keeps the inequality. ∎
//
// The forms here are a(u,u) = ∫_Ω |∇u|² + V u² + Σ_i α_i ∫_{Γ_i} u² on
// H¹(Ω) with the Dirichlet sides' traces zero (the domain H is fixed by
// the geometry and the boundary kinds, which no covered parameter
// changes). If V(x; p) ≤ V(x; q) for every x ∈ Ω and α_i(p) ≤ α_i(q) for
// every side, then a_p ≤ a_q on H, so λ_k(p) ≤ λ_k(q).
//
// # Rules
//
// RobinRule: a Robin coefficient α_i(p) (a side's own, or one shared by
// sides) with ∂α_i/∂p of one sign s on the box (interval evaluation of
// the derivative, formula.Gradient, on a subdivision of the box) is
// monotone in p with sign s. PotentialRule: V(x; p) with ∂V/∂p of one
// sign s on the domain's bounding box × the parameter box is pointwise
// monotone in p on Ω with sign s (mean value theorem; the enclosure of the
// derivative exists only where V is differentiable in p, so V is defined
// on the whole cell). A parameter's direction is the common sign of all
// its uses (uses of opposite signs are refused); with several parameters
// the order is the product order: for p in a cell [lo, hi], write low for
// the corner taking lo in each nondecreasing parameter and hi in each
// nonincreasing one, and high for the opposite corner (a parameter the
// operator does not depend on, one that enters only claims or the width
// target, takes the box's lower end at both). Moving one
// parameter at a time from low to p and from p to high, each step raises
// every coefficient, so
//
//	λ_k(low) ≤ λ_k(p) ≤ λ_k(high)   for every p in the cell and every k,
//
// and the certified lower bound at low and upper bound at high enclose
// λ_k over the whole cell: λ_k ∈ [ℓ_k(low), u_k(high)].
//
// The gap on a cell: λ₂(p) − λ₁(p) ≥ ℓ₂(low) − u₁(high) and ≤ u₂(high) −
// ℓ₁(low) for every p in the cell. Claim quantities over a cell: the
// eigenvalues and the gap as above; D, area, perimeter, inradius are
// those of the fixed geometry; alpha, when every Robin side has the same
// coefficient formula, is [α(low), α(high)]; each covered parameter is
// its cell range. A claim is decided by the interval enclosure of
// lhs − rhs over these (certs.EvaluateClaim): "holds" on a cell means it
// holds at every parameter value of the cell. A built-in claim's reference
// quantity written with alpha and D (the Robin interval of
// @robin_comparison) obeys the same order and is enclosed by the
// reference certificates of the two corners in the same way. The
// hypotheses of a built-in claim are decided over the cell from the
// corners' verdicts (cellHypotheses).
//
// # Geometry
//
// GeometryRule covers parameters in the vertices of a triangle (template
// part "domain"), with Dirichlet and Neumann sides and V = 0 (a constant
// V ≡ c shifts every eigenvalue by c, below). It proves
// no order: the cell's one certified problem is the triangle Ω at the
// cell's centre (exact rational parameter values), and for every p in the
// cell the affine map Φ(x) = A x + b taking Ω's vertices to the vertices
// at p satisfies, by the change of variables v = u∘Φ in the min–max
// characterisation (proved in GeometryRule's documentation),
//
//	λ_k(Ω)/σ_max(A)² ≤ λ_k(Φ(Ω)) ≤ λ_k(Ω)/σ_min(A)².
//
// Over the cell, σ_min ≥ 1 − r and σ_max ≤ 1 + r with r ≥ ‖A − I‖_F
// enclosed by interval evaluation of the vertex formulas on the cell
// (A = I at the centre), so
//
//	λ_k ∈ [ℓ_k/(1 + r)², u_k/(1 − r)²]   (r < 1),
//
// (with V ≡ c: λ_k ∈ ([ℓ_k, u_k] − c)·[1/(1 + r)², 1/(1 − r)²] + c),
// the gap lies in [λ₂'s lower end − λ₁'s upper end, λ₂'s upper end − λ₁'s
// lower end], and D, area, perimeter and inradius are enclosed from the
// vertex formulas over the cell. When r ≥ 1 (the cell may hold a
// degenerate triangle) the claims naming eigenvalues are undecided with
// that reason and the cell is split. Since r → 0 as a cell shrinks, the
// cell's enclosures tend to the reference's. A triangle family is refused
// before computing when its signed area is not proved of one sign on the
// box, or when it has a Robin side (α ≠ 0) or a potential that varies in
// x, y or a covered parameter, which the affine change of variables does
// not scale by the same factor.
//
// # The cover
//
// The first split cuts parameter j's range into count_j equal boxes (the
// roots, numbered with the first parameter varying slowest). A box whose
// claims are not all decided is bisected at the midpoint of the parameter
// with the largest ratio width/min_cell among those wider than their
// min_cell; a box in which every width is at most its min_cell is a cell
// with its undecided claims. So the cells are the leaves of one bisection
// tree per root, fixed by the family and the verdicts. A cell costs two
// corner certificates; corners shared by neighbouring cells are certified
// once (by problem hash). A cell of a moving triangle costs one, at its
// centre (recorded as both its low and its high corner).
//
// # Directories
//
// A cover directory holds family.json (a byte copy of the family file),
// one certificate per corner (CornerFileName), one cell certificate per
// cell (CellFileName: its bounds, the family file, the order, the corners
// by file and SHA-256, the enclosures of the claim quantities and the
// verdicts), and per shard the summary (Summary, summary.json, the
// coverage table summary.csv and the cell table summary-cells.csv).
// Shard i/n covers the roots k with k mod n = i. A rerun keeps every cell
// certificate that verifies (CheckCell) and never overwrites one that does
// not. Merge gathers shards and proves that the cells tile the box.
//
// # Tiling
//
// Merge proves that the cells tile the box (their union is the box and
// their interiors are pairwise disjoint) by showing that they are exactly
// the leaves of the bisection trees of the roots (Tile): the roots tile
// the box (a product of equal partitions), a box is the union of its two
// halves, whose interiors are disjoint, so by induction the leaves of a
// finite bisection tree tile its root; Tile matches, with exact rational
// comparisons, every cell to one leaf and every leaf to one cell. The sum
// of the cells' measures equals the box's measure as a consequence, and is
// recorded.
package cover
