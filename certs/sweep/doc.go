// Package sweep runs a family of problems: a problem template whose numbers
// and formulas use named parameters, expanded over a grid of exact
// parameter values, certified point by point into a directory, resumable,
// split into shards and merged again.
package sweep
