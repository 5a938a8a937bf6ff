// Package sweep runs a family of problems: a problem template whose numbers
// and formulas use named parameters, expanded over a grid of exact
// parameter values, certified point by point into a directory, resumable,
// split into shards and merged again.
//
// # Family files
//
// A family file is one JSON object (UTF-8), read strictly (package
// strictjson): unknown keys, keys spelled in another case, duplicate keys
// at any level and trailing data are errors.
//
//	{
//	  "name": "triangles with base [0, 1]",           optional
//	  "template": {                                    a problem object (package fem/problem)
//	    "domain": {"polygon": [["0", "0"], ["1", "0"], ["a", "b"]]},
//	    "boundary": "dirichlet",
//	    "claims": ["D^2*gap >= 64*pi^2/9"]
//	  },
//	  "parameters": [                                  at least one, in expansion order
//	    {"name": "a", "range": {"lo": "0", "hi": "1", "count": 5}},
//	    {"name": "b", "values": ["1/2", "0.75", "1"]}
//	  ],
//	  "claims": ["gap >= 3*pi^2/D^2"],                 optional, appended to the template's
//	  "relative_width": "0.05",                        optional target of every point
//	  "time_limit": "10s",                             optional budget of every point
//	  "ground_state": true                             optional: certify every point's ground state
//	}
//
// A range gives count evenly spaced exact rationals lo + k(hi − lo)/(count − 1),
// k = 0 … count − 1 (count ≥ 2 with lo < hi, or count = 1 with lo = hi);
// values gives a nonempty list of distinct exact numbers. lo, hi and the
// values are decimals or fractions ("0.25", "-1e-3", "1/3"), as strings or
// JSON numbers, read exactly (package interval/decimalio). A parameter
// may not be swept twice nor also be fixed in the template's own
// "parameters". relative_width lies in (0, 1); time_limit is a Go duration
// ("90s", "2m"). With "ground_state": true every certificate also holds
// results.ground_state (certify.Options.GroundState: the log-concavity
// verdict of the ground state, its witness or best margin, the L2 error
// bound and the values at the problem's points), and a certificate
// without the block is not a certificate of the family (not reused, not
// merged).
//
// # Expansion
//
// The points are the Cartesian product of the parameter values, numbered
// from 0 with the first parameter varying slowest: with n_j values of
// parameter j and value indices i_j, point k = Σ_j i_j·Π_{l>j} n_l. Point k is
// the template with each swept parameter added to its "parameters" object
// as the exact text of its value (problem.RatText: the shortest decimal,
// else the reduced fraction), the family's claims appended to its
// "claims", and its name followed by the values ("triangle [a=1/2,
// b=0.75]"). Every point is parsed by problem.Parse when the family is read,
// before anything runs: a template that names an unknown parameter, or a
// value that makes a point invalid (a degenerate polygon, a negative
// Robin coefficient), makes the whole family invalid.
//
// # Shards
//
// Shard i/n (0-based: 0 ≤ i < n) holds the points k with k mod n = i. The
// shards 0/n … (n−1)/n are disjoint and cover the family; interleaving
// spreads the cheap and the expensive corners of a grid over the shards.
//
// # Directories
//
// A sweep directory holds family.json (a byte copy of the family file; a
// directory holding another family is refused), one certificate per point
// named by CertFileName ("p0007-3fa1c2d4e5f6.cert.json": the point index
// and the first 12 hex digits of the point's problem hash), and per shard
// a summary (Summary, as summary.json and summary.csv, or
// summary-shard-i-of-n.json and .csv). Certificates are written through a
// temporary file and a rename. A rerun keeps each certificate that
// verifies (certify.Check) and records the point's problem, and computes
// the others; a certificate file that does not verify is never
// overwritten: it is reported (StatusRejected), or renamed to
// NAME.rejected with RunOptions.SetAsideInvalid. Summaries of the same
// family and shard are replaced by the rerun's; nothing else is replaced,
// except that RunOptions.RefineUndecided replaces a certificate with an
// undecided claim by a recomputed one that verifies.
//
// Merge gathers the directories of all shards (one shared directory or
// one per shard), demands that every point has exactly one certificate,
// that each belongs to its point and verifies, and makes its output a
// sweep directory of the whole family that stands alone: the verified
// certificates and the family file copied into it, and the merged summary,
// whose file names are plain names in it. SummaryIn finds the summary of
// a sweep directory (summary.json, else a shard's own summary).
//
// Nothing here decides a bound: every number in a summary is copied from
// a certificate, and every certificate kept, merged or replaced has been
// verified by certify.Check (freshly computed ones come from
// certify.Certify).
package sweep
