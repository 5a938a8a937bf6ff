// Package certs implements the gapcert certificate: the JSON document that
// records a problem, the enclosures computed for it and the verdicts on the
// claims made about it, so that anyone can re-check them.
//
// Guarantees. Every bound in a certificate is a pair of decimal strings
// (never a JSON number): the lower string is rounded toward −∞ and the upper
// string toward +∞ from a float64 enclosure, so the printed interval
// contains the enclosure (NewBound), and reading it back with Bound.Interval
// gives a float64 interval that contains the printed one. Printing keeps
// signs: a lower end ≥ 0 (> 0) prints as a decimal ≥ 0 (> 0), and likewise
// for upper ends, so a verdict on a claim can be re-derived from its printed
// margin alone (read as exact decimals).
//
// A claim is an inequality "lhs REL rhs" between formulas over certified
// quantities, read by package claim (the one claim grammar of gapcert).
// EvaluateClaim encloses lhs − rhs in interval arithmetic over the
// enclosures it is given and says "holds" only if the inequality is true
// for every value in them, "fails" only if it is false for every value,
// and "undecided" otherwise.
//
// A built-in claim ("@name", catalogue in package fem/claim/named) is recorded
// with the inequality it stands for, the verdict on each hypothesis of its
// theorem (Hypothesis: "proven", "disproven" with a Witness, or
// "undecided", decided by package certs/hypothesis) and, where it compares
// with a separately certified quantity, that quantity's own certificate
// (Reference), which Unmarshal reads strictly as well. The claim's verdict
// is the certified comparison either way: hypotheses that are not proven
// mean that the theorem does not (or is not known to) apply, not that the
// comparison is in doubt.
//
// Marshal writes stable JSON (struct field order, sorted map keys, two-space
// indentation, a trailing newline); Unmarshal is strict (package
// strictjson): keys given twice, keys not spelled exactly as the format
// spells them (case variants included), unknown keys, missing sections,
// unparsable bounds and any format other than Format are errors, at every
// depth and in embedded reference certificates, so that every JSON reader
// that accepts a certificate sees the same values.
package certs
