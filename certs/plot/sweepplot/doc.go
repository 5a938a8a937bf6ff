// Package sweepplot implements pictures of the certified results of a
// parameter sweep (package certs/sweep), as PNG or SVG files: for a
// one-parameter sweep, the certified enclosure of a quantity (a formula
// over λ1…λN, the gap, D, area, perimeter (polygons), volume and
// surface_area (products of three or four coordinates), the parameters and the
// reference quantities of built-in claims) against the parameter, with an
// optional second certified band (a reference), a threshold, and each
// point marked by its verdict; for a two-parameter sweep, a map of cells
// coloured by a certified lower bound of one claim's margin, undecided and
// failing cells marked; for a one-parameter sweep whose family asks for
// the ground state, the certified log-concavity verdict of the ground
// state at each point (Sweep.Shape). Under a band, a second panel (Panel) may show the
// width of each enclosure on a logarithmic axis, or the enclosure of
// quantity − threshold on its own axis, for enclosures too narrow to see
// against the range of the quantity. A map's colour scale is diverging
// about 0 only when its bounds have both signs, else sequential over their
// range (plot.ScaleFor).
//
// Reference quantities. A built-in claim with a reference (package
// fem/claim/named) stores in its claim result the certificate of that
// reference (certs.ClaimResult.Reference), and formulas may name the
// quantity it certifies:
//
//	robin_interval_gap   the gap of −u″ = λu on (0, D), D the polygon's
//	                     diameter, with the polygon's Robin coefficient at
//	                     both ends: the gap enclosure of the reference
//	                     certificate of @robin_comparison
//
// It is read from the point's certificate file (never from the summary);
// a formula naming it at a point without it (no such claim, a claim whose
// reference could not be stated, no certificate file) is an error saying
// which.
//
// Guarantees. The numbers behind a picture are certified: the enclosures
// come from the summary's points, each read back outward from its decimal
// strings (certs.Bound.Interval), and are cross-checked against the
// certificate files beside the summary (file SHA-256, problem hash and
// every enclosure, claim result and ground-state block, string for
// string); reference
// quantities are the decimal strings of the reference certificates,
// read back outward likewise; a quantity, reference or threshold is
// enclosed in interval arithmetic over them
// (formula.Expr.Eval), and its verdict is that of certs.EvaluateClaim, so
// "holds" and "fails" are true for every value in the enclosures. Map
// margins are the certificate's margin ends read back in the safe
// direction (decimalio.ParseLower, or minus decimalio.ParseUpper).
// Drawing is floating point and adds nothing certified: parameter values
// are placed at their nearest float, and the shading that joins the bars
// of a band is labelled as not certified. Every picture says what is
// certified in its title, legend and caption, and how many points had no
// certificate or no certificate file.
//
// Output is deterministic (the same data give the same PNG pixels and SVG
// bytes). Inputs that cannot be drawn (an unknown parameter or name, a
// formula that does not parse or has no finite enclosure at a point, a
// sweep of the wrong dimension or without certified points) are errors.
package sweepplot
