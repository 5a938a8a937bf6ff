// Package interval implements closed intervals of float64 with outward
// rounded arithmetic.
//
// An I is the closed set [Lo, Hi] of real numbers with Lo ≤ Hi; Lo may be
// −∞ and Hi may be +∞ (standing for an unbounded set of reals), the set is
// never empty and never contains NaN. Every operation returns an interval
// that contains every exact result of the operation applied to points of
// its arguments (the containment guarantee). Infinite ends follow the
// limit conventions of IEEE 1788-2015: a zero factor against an unbounded
// factor contributes 0 (0·∞ = 0), a bounded dividend over an unbounded
// divisor contributes 0.
//
// The basic operations +, −, ·, square and √, and / by an interval that
// does not contain 0, return the tightest such interval: each end is the
// exact real result rounded in the outward direction (toward −∞ for Lo,
// toward +∞ for Hi), so on points the width is 0 when the exact result is a
// float64 and one ulp otherwise. The scalar functions AddDown, AddUp, …,
// SqrtUp give these directed roundings. The rounding error of the
// round-to-nearest result is obtained by error-free transformations (TwoSum
// for sums; math.FMA for products, quotients and square roots), and its sign
// decides whether the end is moved one ulp. Where the error term may be
// lost (results below 2⁻⁹⁶⁹ in magnitude) or an intermediate may overflow
// (sums of magnitude ≥ 2¹⁰²³) the ends are computed exactly with math/big
// instead. Each function's doc comment states the inequality it relies on.
// Every product is written float64(a*b) so that the compiler cannot fuse it
// into an FMA. Division by an interval containing 0 returns the whole line.
// PowInt uses repeated squaring and is within a stated relative distance of
// tightest.
//
// Elementary functions (Exp, Log, Sin, Cos, Tan, Atan, Sinh, Cosh, Tanh,
// Pow) are enclosed by range reduction with enclosed constants and Taylor
// polynomials with Lagrange remainder bounds evaluated in this arithmetic;
// they never rely on the unproven accuracy of package math.
//
// Misuse panics with a message starting "interval: ": a NaN or infinite
// point, ends out of order, a NaN operand, a scalar division by zero, a
// scalar square root of a negative number.
//
// Names follow IEEE 1788-2015 where it has one (Inf, Sup, Mid, Rad, Wid,
// Hull, Intersection, Subset, Interior).
//
// References:
//
//	IEEE Std 1788-2015, Standard for Interval Arithmetic.
//	J.-M. Muller et al., Handbook of Floating-Point Arithmetic, 2nd ed.,
//	Birkhäuser, 2018.
//	S. M. Rump, Fast and parallel interval arithmetic, BIT 39 (1999) 534–554.
package interval
