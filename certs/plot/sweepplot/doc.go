// Package sweepplot implements pictures of the certified results of a
// parameter sweep (package certs/sweep), as PNG or SVG files: for a
// one-parameter sweep, the certified enclosure of a quantity (a formula
// over λ1…λN, the gap, D, area, perimeter and the parameters) against the
// parameter, with a threshold and each point marked by its verdict; for a
// two-parameter sweep, a map of cells coloured by a certified lower bound
// of one claim's margin, undecided and failing cells marked.
//
// Guarantees. The numbers behind a picture are certified: the enclosures
// come from the summary's points, each read back outward from its decimal
// strings (certs.Bound.Interval), and are cross-checked against the
// certificate files beside the summary (file SHA-256, problem hash and
// every enclosure and claim result, string for string); a quantity or a
// threshold is enclosed in interval arithmetic over them
// (formula.Expr.Eval), and its verdict is that of certs.Claim.Evaluate, so
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
