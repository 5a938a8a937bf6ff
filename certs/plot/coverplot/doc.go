// Package coverplot draws the cells of a cover (package certs/cover)
// coloured by their verdict on one claim: for one parameter, the cells as
// intervals along the parameter's axis; for two, as rectangles in the
// parameter plane. Cells where the claim holds, fails or is undecided get
// the Okabe–Ito colours of package certs/plot (bluish green, vermillion,
// orange) and their proportion of the box in the legend; parts of the box
// that no cell of the summary covers (another shard's) are left white.
//
// Guarantees. The verdicts and the coverage fractions are copied from
// the summary, whose rows are cross-checked against the cell certificates
// beside it (the file's SHA-256 and the verdicts it records), each row
// once, and whose fractions must be the exact sums of the measures of
// those rows; a verdict is certified for every parameter value of its
// cell. Drawing is floating
// point: cell bounds are placed at their nearest float, and nothing in
// the picture adds to what the certificates prove.
package coverplot
