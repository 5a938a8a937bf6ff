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
//	inradius             triangles only: 2·area/perimeter
//	alpha                the Robin coefficient, when the problem has Robin
//	                     sides and all of them have one coefficient
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
