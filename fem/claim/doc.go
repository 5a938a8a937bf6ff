// Package claim implements the claims of gapcert problem files: the one
// grammar of a claim, the quantities a claim may name, and the check that
// a problem provides every quantity its claims name.
//
// # Grammar
//
// A claim is "lhs REL rhs": exactly one relation, outside all
// parentheses, between two formulas in the syntax of package
// gapcert/interval/formula. REL is one of
//
//	>=  or  ≥     at least
//	<=  or  ≤     at most
//	>             greater than
//	<             less than
//
// The Unicode signs ≥ and ≤ are the same relations as >= and <= (a problem
// file is UTF-8, and a claim copied from a paper keeps its signs); Rel
// records the ASCII form. Equalities and inequations ("=", "==", "!=",
// "≠"), the reversed spellings "=>" and "=<", and signs that only look
// like ≥ and ≤ ("⩾", "⩽", "≧", "≦") are refused with a hint: an equality
// cannot be decided by enclosures, and the others are more likely typos
// than relations. A claim is at most MaxLen bytes long. Parse
// reports every defect as an *Error with the 1-based byte column in the
// claim's text and a hint.
//
// # Quantities
//
// Besides pi, e and the problem's parameters a claim may name
//
//	lambda1 … lambda20   the certified eigenvalues (up to the problem's "eigenvalues")
//	gap                  lambda2 − lambda1
//	D                    the diameter (the length of an interval)
//	area, perimeter      polygons only
//	volume, surface_area polyhedra and products of three or four coordinates
//	inradius             triangles: 2·area/perimeter; tetrahedra: 3·volume/surface_area
//	alpha                the Robin coefficient, when the problem has Robin
//	                     sides (faces in three dimensions) and all of them
//	                     have one coefficient
//	shape_margin         polygons only: u(x)u(y) − u(m)² for the midpoint
//	                     triple x, y, m = (x + y)/2 of the ground state u
//	                     (unit L² norm) recorded in results.ground_state
//
// shape_margin is a value of the certificate, not of the problem alone:
// its enclosure is the witness's margin when results.ground_state has a
// witness of failed log-concavity, else the margin of the best candidate
// triple of the search (package certs/certify). The problem file cannot
// say whether the ground-state block will be computed, so Scope provides
// shape_margin on every polygon; the certifier refuses, before computing,
// a claim that names it when the ground state is not asked for, and a
// claim whose certificate has a block with neither margin is undecided
// with that reason. "shape_margin > 0" holding shows a triple with
// u(m)² < u(x)u(y); it failing says only that the recorded triple is not
// such a witness, nothing about log-concavity.
//
// Whether a quantity has a value depends on the problem: Scope describes
// what a problem provides, and Claim.CheckScope names the first quantity of
// a claim that the problem does not provide, with its column and a hint. A
// parameter of the problem is always available, and a parameter named
// alpha is that parameter (a problem may not give a parameter the name of
// another quantity; package fem/problem refuses it).
//
// # Layers
//
// This package depends only on interval and interval/formula, so that
// package fem/problem checks claims when it reads a problem file (syntax,
// names and availability, each defect with its JSON path), and the
// certificate side (certs, certs/certify, certs/plot/sweepplot) parses and
// evaluates the same claims with the same grammar. A claim that names a
// quantity the problem does not provide is thereby an invalid problem,
// refused before any computation by every command that reads problems.
// The catalogue of built-in claims ("@name") is package fem/claim/named, which
// writes its inequalities in this grammar.
package claim
