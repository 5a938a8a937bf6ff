// Package plot implements pictures of certified problems: the mesh of a
// polygon and the first approximate eigenfunctions of an interval or a
// polygon, written as PNG or SVG files.
//
// Everything in this package is floating point at round-to-nearest and
// belongs to the choosing side of gapcert: the pictures show approximations
// and are no part of any proof. Every picture says so in its caption (the
// text in Caption). The certified enclosures appear only as the label text
// the caller passes in; the package never computes or rounds a bound.
//
// Guarantees:
//   - output is deterministic: the same Modes give the same picture sizes,
//     the same PNG pixels and the same SVG bytes (fonts are referenced by
//     name, not embedded);
//   - each mode is normalised on its sample points so that its value of
//     largest magnitude is +1 (which fixes the arbitrary sign of an
//     eigenvector), and 2D pictures use the same diverging colour scale
//     [−1, 1] for every mode (blue negative, red positive, light grey at
//     zero, so nodal lines show as grey curves);
//   - 2D pictures keep the aspect ratio of the domain (one unit of x has the
//     length of one unit of y), and grid points outside the polygon are left
//     blank (an even–odd point-in-polygon test in floating point).
//
// Misuse (a nil Eval, no labels, a degenerate interval or polygon) panics
// with a "plot: " prefix; an unknown format, a mode that is not finite or
// vanishes at every sample point, and I/O failures are returned as errors,
// whose messages are written for the user (no package prefix).
package plot
