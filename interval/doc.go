// Package interval implements closed intervals of float64 with outward
// rounded arithmetic.
//
// An I is the closed set [Lo, Hi] of real numbers with Lo ≤ Hi; either end
// may be infinite, the set is never empty and never contains NaN. Every
// operation returns an interval that contains every exact result of the
// operation applied to points of its arguments (the containment guarantee).
//
// The basic operations +, −, ·, /, square and √ return the tightest such
// interval: each end is the exact real result rounded in the outward
// direction (toward −∞ for Lo, toward +∞ for Hi). The rounding error of the
// round-to-nearest result is obtained exactly by error-free transformations
// (TwoSum for sums; math.FMA for products, quotients and square roots, see
// Muller et al., Handbook of Floating-Point Arithmetic, 2nd ed., 2018,
// §4.3–4.4), and its sign decides whether the end is moved one ulp with
// math.Nextafter. Where the error term itself may be inexact (results below
// 2⁻⁹⁶⁹ in magnitude, where subnormal error terms lose bits) the ends are
// computed exactly with math/big instead. Every product is written
// float64(a*b) so that the compiler cannot fuse it into an FMA.
//
// Elementary functions (Exp, Log, Sin, Cos, Tan, Atan, Sinh, Cosh, Tanh,
// Pow) are enclosed by range reduction with enclosed constants and Taylor
// polynomials with Lagrange remainder bounds evaluated in this arithmetic;
// they never rely on the unproven accuracy of package math.
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
