// Package named is the catalogue of built-in claims: inequalities from
// published theorems (and one open conjecture) that a problem file names
// instead of writing them out.
//
// A problem's "claims" list may hold, besides inequalities "lhs REL rhs",
// the name of a built-in claim with the prefix "@", e.g.
// "@fundamental_gap". Names are read case-insensitively, with '-' read as
// '_' and surrounding spaces ignored (Lookup); Claim.Text is the canonical text
// ("@fundamental_gap") that the problem's canonical form records.
//
// Each Claim has an inequality in the grammar of package claim over
// certified quantities (claim.Quantities, and for some claims a Reference
// quantity that is certified separately, with ReferenceResult naming the
// result of the separate certificate it denotes and ReferenceProblem the
// problem that certificate certifies: this catalogue is the one place that
// says so, for the certifier and for the pictures of sweeps), the
// dimensions it applies to, and the names of the
// hypotheses of its theorem (decided per problem by package
// certs/hypothesis). The catalogue:
//
//	@fundamental_gap    gap >= 3*pi^2/D^2         intervals and polygons
//	@triangle_gap       D^2*gap >= 64*pi^2/9      polygons
//	@payne_weinberger   lambda2 >= pi^2/D^2       intervals and polygons
//	@robin_comparison   gap >= robin_interval_gap polygons
//
// A problem file may name a built-in claim when the claim applies to its
// dimension (Claim.CheckScope). Whether the theorem's hypotheses hold is
// decided and recorded, not required; likewise a reference quantity that
// cannot be stated for the problem (@robin_comparison on sides without one
// Robin coefficient) leaves the claim undecided with that reason, decided
// by package certs/certify.
//
// Sources are given with each entry in catalogue.go. The package sits
// below fem/problem, which looks names up when it reads a problem file.
package named
