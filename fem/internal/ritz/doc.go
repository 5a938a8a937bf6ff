// Package ritz accumulates interval Ritz matrices: the symmetric matrices
// (a(u_i, u_j))_ij of a bilinear form over a few trial functions u_i,
// summed cell by cell and boundary piece by boundary piece. Each element
// package computes the enclosure of one piece's contribution; this package
// only adds them with outward rounding into the lower triangle and hands
// the result over as an enclose.Sym.
package ritz
