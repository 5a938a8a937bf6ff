// Package bernstein holds the interval kernels of the Bernstein calculus
// that every element package uses on a cell (an interval or a triangle):
// exact rational tables applied to float or interval coefficient vectors,
// interval dot products, the weighted Gram matrix of a polynomial weight,
// and the bound of the remainder term of a Taylor model.
//
// The kernels do not know the dimension: a table is a flat row-major
// array whose exact entries the caller has enclosed (package rattable),
// and a basis is described only by its size. Every function encloses the
// exact value of its result for every choice of exact inputs inside its
// interval arguments (outward rounding of package interval); exact float
// inputs are taken as they are.
//
// # Remainders
//
// Where a function V is carried on a cell K as a polynomial P plus a
// remainder interval R = [r_mid − r_rad, r_mid + r_rad] (V(x) − P(x) ∈ R
// for every x ∈ K), an integral splits as
//
//	∫_K V u v = ∫_K (P + r_mid) u v + ∫_K (V − P − r_mid) u v,
//	|∫_K (V − P − r_mid) u v| ≤ r_rad ‖u‖_K ‖v‖_K,
//
// because |V − P − r_mid| ≤ r_rad pointwise and ∫_K |uv| ≤ ‖u‖_K ‖v‖_K
// (Cauchy–Schwarz). The first integral is exact (WeightedGram with the
// shift r_mid); the second is enclosed by ±RemainderBound(r_rad, x, y)
// with x ≥ ‖u‖²_K and y ≥ ‖v‖²_K from exact Gram matrices.
package bernstein
