// Package formula implements expressions in x, y and named parameters:
// parsing, canonical printing, interval evaluation, automatic
// differentiation and Taylor models with interval coefficients.
//
// The grammar is given with Parse. Numbers are exact: "0.1" and "1/3"
// denote those rationals (rational constant sub-expressions are folded
// exactly and enclosed once by the tightest float64 interval), never the
// result of strconv.ParseFloat. x^n for an exact integer constant n ≥ 0 is
// an integer power, defined for negative x; other exponents are real
// powers, defined only for a positive base.
//
// Guarantees. Every enclosure returned by Eval, EvalConst, RangeTriangle,
// Gradient, Hessian, Polynomial, Model1 and Model2 contains the exact real
// value for every point of the given boxes (and every exact vertex in the
// given vertex enclosures), because each step is an outward rounded
// operation of package interval or an interval elementary function. When
// a sub-expression is not defined (or, for derivatives and Taylor models,
// not smooth) on all of its argument box, the functions return an error
// naming the sub-expression instead of clipping the box.
//
// Errors: *SyntaxError (text, with a 1-based column and a hint),
// *EvalError naming the failing sub-expression and wrapping an
// *interval.DomainError (not defined on the box) or a *SmoothnessError
// (not differentiable on the box), and *UnboundError (a variable without
// a value).
//
// Ranges over triangles are computed over the triangle itself, by affine
// forms in the triangle's coordinates intersected with box enclosures, and
// by midpoint subdivision where a domain is not decided (RangeTriangle).
// Taylor coefficients come from truncated Taylor-series arithmetic (jets)
// with interval coefficients in one, two or more variables; see the
// comment in jet.go for the recurrences and Model1, Model2 for the
// remainder theorems.
//
// References:
//
//	A. Griewank and A. Walther, Evaluating Derivatives, 2nd ed., SIAM,
//	2008, §13.
//	R. E. Moore, R. B. Kearfott and M. J. Cloud, Introduction to Interval
//	Analysis, SIAM, 2009, §9.
package formula
