// Package solvertest is the conformance suite of the large-pencil solvers:
// one table of tests that runs against every storage of symmetric pencils
// (enclose/band, enclose/sparse, and any later one) through what the rest
// of the program uses of them, the approximate LowestEigs and the verified
// enclose.Counter.
//
// A storage's test calls Run(t, impl), where impl builds the storage from
// a list of entries. The suite checks
//
//   - accuracy of the approximate eigenpairs against closed-form spectra
//     (eigenvalues, residuals, M-orthonormality), on the dense and on the
//     iterative path, with a positive definite and an indefinite K and with
//     double eigenvalues, and the refusal of an indefinite M;
//   - the promise of a verified count, #{λ < σ'} ≤ n for every member of
//     the interval pencil, against the closed-form spectrum of a member
//     that is not the midpoint and against random members, together with
//     its narrowness (n is the true count below σ and σ − σ' is of the
//     order of the residual and the interval widths);
//   - bit-identical results for GOMAXPROCS 1 and 2, and for repeated calls;
//   - the misuse panics of a Counter.
package solvertest
