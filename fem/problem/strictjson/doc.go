// Package strictjson reads JSON documents strictly, the way every file
// gapcert reads (problems, families, certificates, summaries) must be read.
//
// encoding/json matches object keys to struct fields without regard to
// case and lets the last of two equal keys win, while other JSON readers
// keep the first key, or match keys exactly. A document with "eigenvalues"
// next to "EigenValues", or with a key given twice, therefore means
// different things to different readers. This package refuses such
// documents, so that every reader that accepts a gapcert file sees the
// same values:
//
//   - a key given twice in one object is an error, at every depth
//     (including inside values that are decoded later, such as
//     json.RawMessage fields);
//   - a key of an object decoded into a struct must be spelled exactly as
//     one of the struct's JSON field names; any other key, a case variant
//     of a field name included, is an error;
//   - the value of a key must have the JSON kind of the field it fills
//     (null only for pointers, slices, maps, interfaces and raw messages;
//     integers in range for integer fields);
//   - nothing but white space may follow the document, and nesting is
//     bounded by MaxDepth.
//
// Errors are *Error and carry the JSON path of the offending key or value,
// written like claims[0].reference.certificate.method.n, or the line and
// column of a syntax error. Numbers keep their literal text: Parse stores
// it as a json.Number, and Decode fills interface values with json.Number,
// so no number is rounded by reading it.
//
// Parse returns the document as a tree (object keys in file order) for
// readers that report many defects at once, such as the problem file
// reader; Decode fills a Go value, checking the document against the
// value's type first.
//
// The package depends on the standard library alone, so that every reader
// of the module, the problem reader of fem/problem at the bottom of the
// package graph included, can use it without importing upward; it sits
// under fem/problem, the lowest package that reads a file, so that the
// readers above it (certs, certs/sweep, certs/report, the plots) share it.
package strictjson
