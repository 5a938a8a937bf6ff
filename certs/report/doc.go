// Package report implements tables of certified enclosures for papers:
// one row per gapcert certificate (problem name, or for the points of a
// sweep the point index and parameter values; every certified eigenvalue
// λ1 … λN, the gap λ2 − λ1, D²·(λ2 − λ1)/π² and the claim verdicts),
// written as LaTeX (a longtable, which breaks across pages) or Markdown.
//
// Enclosures are printed in the interval notation of the numerical
// literature: the digits the two ends share, followed by the differing
// trailing digits of the lower end as a subscript and of the upper end as a
// superscript, 9.86960440₁³ for [9.869604401, 9.869604403]; or as [lo, hi]
// (Bracket). When the ends share no nonzero leading digit, differ in sign or
// length, or an end is infinite, the bracket form is used for that entry.
//
// Guarantees:
//   - a printed enclosure contains the certified one: the printed lower end
//     is ≤ the certificate's lower string and the printed upper end ≥ its
//     upper string, as exact decimals. Shorten rounds the lower end toward
//     −∞ and the upper end toward +∞ in exact rational arithmetic
//     (math/big) on the certificate's decimal strings, never through
//     float64;
//   - it is narrow: with k = widthDigits significant digits of the width
//     w kept, each end moves by less than w/10^(k−1), so the printed width
//     is below w·(1 + 2/10^(k−1)) (1.2·w for the default k = 2);
//   - the caption names the tools that computed the certificates, says
//     whether they were re-verified before the table was written (the
//     caller's statement, Options.Checked), and gives one digest of all
//     certificate files: the SHA-256 of their HashList, the lines
//     "SHA-256  NAME" sorted bytewise (what "sha256sum FILES | sort"
//     prints), which goes to a side file or after the table.
//
// Read collects certificates from a file or a directory (leaving out, and
// reporting, JSON files that are not certificates); a sweep directory
// (one holding the family file of package certs/sweep) is read as the
// points of its family, each certificate matched to its point by problem
// hash. Re-verifying the certificates is the caller's step
// (certify.Check), so that this package only reads and prints.
package report
