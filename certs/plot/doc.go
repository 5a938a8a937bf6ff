// Package plot implements pictures of certified problems: the mesh of a
// polygon and the first approximate eigenfunctions of an interval or a
// polygon, the ground-state block of a certificate (GroundState), and a
// polyhedron with approximate eigenfunctions on a plane section (Solid,
// WriteSolid, WriteSolidDir; the section from NewSection; the modes from
// SolidModesOf on a space of the picture's own, from SolidModesFor on a
// certificate's trial space, or for a box or prism given as a product,
// drawn as the polyhedron it is (ProductPolyhedron), from ProductModesOf:
// products of its factors' modes), written as PNG or SVG files.
//
// Everything in this package is floating point at round-to-nearest and
// belongs to the choosing side of gapcert: the pictures of modes show
// approximations and are no part of any proof. Every such picture says so
// in its caption (the text in Caption). The certified enclosures appear
// only as the label text the caller passes in, or, in the ground-state
// picture, as the certificate's enclosures of u read back outward
// (certs.Bound.Interval) and drawn as bars at the problem's points only;
// the package never computes or rounds a bound. Whether the points lie on
// one segment in order is decided exactly on their rational coordinates.
//
// Guarantees:
//   - output is deterministic: the same Modes give the same picture sizes,
//     the same PNG pixels and the same SVG bytes (fonts are referenced by
//     name, not embedded);
//   - each mode is normalised on its sample points so that its value of
//     largest magnitude is +1 (which fixes the arbitrary sign of an
//     eigenvector); a 2D picture colours a mode that changes sign on the
//     diverging scale [−1, 1] (blue negative, red positive, light grey at
//     zero, so nodal lines show as grey curves) and a mode of one sign on
//     the sequential viridis scale over its own range (ScaleFor);
//   - 2D pictures keep the aspect ratio of the domain (one unit of x has the
//     length of one unit of y), and grid points outside the polygon are left
//     blank (an even–odd point-in-polygon test in floating point).
//   - a polyhedron is drawn in one fixed orthographic view; the faces
//     turned toward the viewer are filled in the painter's order (exact
//     for convex solids), the edges behind them dashed. Its section by an
//     axis plane is found from the faces' triangulation: which side of the
//     plane each vertex lies on is decided exactly (or by disjoint
//     enclosures), and the loop corners are interval enclosures, so the
//     outline is the true section up to those enclosures; the modes on it
//     are floating point like every mode here, and their pictures say
//     "approximation, not a bound" (SliceNote).
//
// Pictures a paper can use: axes are labelled (x, y, u / max |u|) and
// ticked at round values (RoundTicks, LogTicks); categories are drawn in
// the Okabe–Ito colours and also told apart by dashes or glyphs; formula
// text is written as mathematics by MathText (D^2*gap/pi^2 as D²·gap/π²);
// the boundary conditions (Modes.Boundary) are drawn on the mesh, each
// side in the style of its kind, with a legend. Package sweepplot uses the
// same ticks, colours and labels.
//
// Misuse (a nil Eval, no labels, a degenerate interval or polygon) panics
// with a "plot: " prefix; an unknown format, a mode that is not finite or
// vanishes at every sample point, and I/O failures are returned as errors,
// whose messages are written for the user (no package prefix).
package plot
